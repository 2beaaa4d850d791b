//! The backrest sweep chart's layout: the core's needed readings by angle
//! scaled into SVG units, with readable axis ticks.
//!
//! Each line gets its own dash and marker shape so lines stay apart
//! without colour.

use plumbline_core::report::Sweep;

use crate::show::rounded;

/// Chart width, SVG units.
pub const WIDTH: f64 = 420.0;
/// Chart height, SVG units.
pub const HEIGHT: f64 = 240.0;
/// The plot area's left edge (room for the y labels).
pub const LEFT: f64 = 48.0;
/// Its right edge.
pub const RIGHT: f64 = WIDTH - 14.0;
/// Its top edge.
pub const TOP: f64 = 14.0;
/// Its bottom edge (room for the x labels).
pub const BOTTOM: f64 = HEIGHT - 40.0;
/// The backrest angles the x axis spans.
const ANGLES: (f64, f64) = (0.0, 90.0);

/// How a line is told apart without colour.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Mark {
    /// Solid line, round markers.
    Circle,
    /// Dashed line, square markers.
    Square,
    /// Dotted line, triangle markers.
    Triangle,
    /// Dash-dot line, diamond markers.
    Diamond,
}

impl Mark {
    const ALL: [Mark; 4] = [Mark::Circle, Mark::Square, Mark::Triangle, Mark::Diamond];

    /// The mark of the i-th line.
    pub fn nth(i: usize) -> Mark {
        Mark::ALL
            .get(i % Mark::ALL.len())
            .copied()
            .unwrap_or(Mark::Circle)
    }

    /// The line's `stroke-dasharray`.
    pub fn dash(self) -> &'static str {
        match self {
            Mark::Circle => "none",
            Mark::Square => "9 5",
            Mark::Triangle => "2 4",
            Mark::Diamond => "10 4 2 4",
        }
    }

    /// The CSS class that colours the line (colour only adds to the shape).
    pub fn class(self) -> &'static str {
        match self {
            Mark::Circle => "series-a",
            Mark::Square => "series-b",
            Mark::Triangle => "series-c",
            Mark::Diamond => "series-d",
        }
    }

    /// An SVG path of the marker centred on (x, y).
    pub fn path(self, x: f64, y: f64) -> String {
        let r = 4.5;
        match self {
            Mark::Circle => format!(
                "M{:.1},{:.1} a{r},{r} 0 1,0 {:.1},0 a{r},{r} 0 1,0 {:.1},0",
                x - r,
                y,
                2.0 * r,
                -2.0 * r
            ),
            Mark::Square => format!(
                "M{:.1},{:.1} h{:.1} v{:.1} h{:.1} z",
                x - r,
                y - r,
                2.0 * r,
                2.0 * r,
                -2.0 * r
            ),
            Mark::Triangle => format!(
                "M{:.1},{:.1} L{:.1},{:.1} L{:.1},{:.1} z",
                x,
                y - r - 1.0,
                x + r + 1.0,
                y + r,
                x - r - 1.0,
                y + r
            ),
            Mark::Diamond => format!(
                "M{:.1},{:.1} L{:.1},{:.1} L{:.1},{:.1} L{:.1},{:.1} z",
                x,
                y - r - 1.0,
                x + r + 1.0,
                y,
                x,
                y + r + 1.0,
                x - r - 1.0,
                y
            ),
        }
    }
}

/// A tick on an axis.
#[derive(Clone, Debug, PartialEq)]
pub struct Tick {
    /// Its position along the axis, SVG units.
    pub at: f64,
    /// Its label.
    pub text: String,
}

/// One sweep drawn.
#[derive(Clone, Debug, PartialEq)]
pub struct Line {
    /// The target and site, in words.
    pub title: String,
    /// How it is told apart.
    pub mark: Mark,
    /// The polyline's `points`.
    pub points: String,
    /// Marker centres, one per 15°.
    pub markers: Vec<(f64, f64)>,
}

/// The chart laid out.
#[derive(Clone, Debug, PartialEq)]
pub struct Chart {
    /// The x ticks (backrest angle).
    pub x_ticks: Vec<Tick>,
    /// The y ticks (needed reading, mmHg).
    pub y_ticks: Vec<Tick>,
    /// The lines.
    pub lines: Vec<Line>,
    /// Where the current backrest angle sits, when it is in range.
    pub now_x: Option<f64>,
}

/// A tick step of 1, 2 or 5 times a power of ten giving about `count` ticks.
pub(crate) fn nice_step(span: f64, count: f64) -> f64 {
    let raw = (span / count).max(1e-9);
    let power = 10f64.powf(raw.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .into_iter()
        .map(|m| m * power)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * power)
}

/// The smallest span a pressure axis shows, mmHg: a few mmHg drawn across
/// the whole height would make a trivial change look steep.
pub(crate) const MIN_SPAN_MMHG: f64 = 20.0;

/// A pressure axis over `lo..hi`: at least [`MIN_SPAN_MMHG`] tall (widened
/// about the middle), ends on round steps giving about `count` ticks.
/// Returns the bottom, the top and the step.
pub(crate) fn axis(lo: f64, hi: f64, count: f64) -> (f64, f64, f64) {
    let (lo, hi) = if hi - lo < MIN_SPAN_MMHG {
        let mid = (lo + hi) / 2.0;
        (mid - MIN_SPAN_MMHG / 2.0, mid + MIN_SPAN_MMHG / 2.0)
    } else {
        (lo, hi)
    };
    let step = nice_step(hi - lo, count);
    let y0 = (lo / step).floor() * step;
    let y1 = ((hi / step).ceil() * step).max(y0 + step);
    (y0, y1, step)
}

fn x_of(deg: f64) -> f64 {
    LEFT + (deg - ANGLES.0) / (ANGLES.1 - ANGLES.0) * (RIGHT - LEFT)
}

impl Chart {
    /// Lays out the sweeps; `now_deg` is the current backrest angle.
    pub fn new(sweeps: &[Sweep], now_deg: Option<f64>) -> Self {
        let values = sweeps
            .iter()
            .flat_map(|s| s.points.iter().map(|p| p.needed_mmhg));
        let (lo, hi) = values.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), v| {
            (lo.min(v), hi.max(v))
        });
        let (lo, hi) = if lo.is_finite() {
            (lo, hi)
        } else {
            (0.0, 100.0)
        };
        let (y0, y1, step) = axis(lo, hi, 5.0);
        let y_of = |v: f64| BOTTOM - (v - y0) / (y1 - y0) * (BOTTOM - TOP);
        let mut y_ticks = Vec::new();
        let mut v = y0;
        while v <= y1 + step / 2.0 {
            y_ticks.push(Tick {
                at: y_of(v),
                text: rounded(v),
            });
            v += step;
        }
        let x_ticks = (0..=6)
            .map(|i| {
                let deg = f64::from(i) * 15.0;
                Tick {
                    at: x_of(deg),
                    text: format!("{deg:.0}°"),
                }
            })
            .collect();
        let lines = sweeps
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let xy: Vec<(f64, f64)> = s
                    .points
                    .iter()
                    .map(|p| (x_of(p.backrest_deg), y_of(p.needed_mmhg)))
                    .collect();
                let component = s.component.map(|c| format!(" {}", c.label()));
                Line {
                    title: format!("{}: {}{}", s.target, s.site, component.unwrap_or_default()),
                    mark: Mark::nth(i),
                    points: xy
                        .iter()
                        .map(|(x, y)| format!("{x:.1},{y:.1}"))
                        .collect::<Vec<_>>()
                        .join(" "),
                    markers: s
                        .points
                        .iter()
                        .zip(xy.iter())
                        .filter(|(p, _)| (p.backrest_deg % 15.0).abs() < 1e-9)
                        .map(|(_, xy)| *xy)
                        .collect(),
                }
            })
            .collect();
        Chart {
            x_ticks,
            y_ticks,
            lines,
            now_x: now_deg
                .filter(|d| (ANGLES.0..=ANGLES.1).contains(d))
                .map(x_of),
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use plumbline_core::check::check_json;
    use plumbline_core::demo::CASE_JSON;

    #[test]
    fn steps_are_round_numbers() {
        assert_eq!(nice_step(28.0, 5.0), 10.0);
        assert_eq!(nice_step(9.0, 5.0), 2.0);
        assert_eq!(nice_step(120.0, 5.0), 50.0);
    }

    #[test]
    fn a_flat_sweep_is_not_drawn_steep() {
        // 64 to 66 mmHg: the axis spans at least 20 mmHg about the middle.
        let (y0, y1, step) = axis(64.0, 66.0, 5.0);
        assert!(y1 - y0 >= MIN_SPAN_MMHG && y0 <= 64.0 && y1 >= 66.0);
        assert_eq!(step, 5.0);
        let (y0, y1, _) = axis(40.0, 110.0, 5.0);
        assert_eq!((y0, y1), (40.0, 120.0));
    }

    #[test]
    fn the_demo_sweeps_fit_the_plot() {
        let report = check_json(CASE_JSON).unwrap();
        let chart = Chart::new(&report.sweeps, Some(65.0));
        assert_eq!(chart.lines.len(), report.sweeps.len());
        for line in &chart.lines {
            assert_eq!(line.markers.len(), 7);
            for (x, y) in &line.markers {
                assert!((LEFT..=RIGHT).contains(x));
                assert!((TOP - 1e-9..=BOTTOM + 1e-9).contains(y), "{y}");
            }
        }
        let first = chart.y_ticks.first().unwrap();
        assert!((first.at - BOTTOM).abs() < 1e-9);
        assert!(chart.now_x.is_some());
        assert_ne!(Mark::nth(0), Mark::nth(1));
    }
}

//! A trend chart's layout: one organ-level series from the core, scaled
//! into SVG units and downsampled per pixel column, with each target's
//! line and the hatched area outside it, the worst point, and the position
//! changes. Scaling only: every value drawn is the core's.
//!
//! The chart's inside is written as SVG markup by [`Trend::svg`]: one
//! string for the page to insert, rather than hundreds of elements to
//! build and compare on every render. Only numbers and fixed words go into
//! it, never text typed by a user.

use plumbline_core::record::{elapsed_words, MetricSeries, TargetExposure};

use crate::chart::{nice_step, Mark, Tick};
use crate::record::envelope::{strip, Strip};
use crate::show::rounded;

/// Chart width, SVG units.
pub const WIDTH: f64 = 640.0;
/// Chart height, SVG units.
pub const HEIGHT: f64 = 250.0;
/// The plot area's left edge (room for the y labels).
pub const LEFT: f64 = 46.0;
/// Its right edge (room for the target labels).
pub const RIGHT: f64 = WIDTH - 62.0;
/// Its top edge.
pub const TOP: f64 = 16.0;
/// Its bottom edge (room for the time labels).
pub const BOTTOM: f64 = HEIGHT - 30.0;

/// Time steps for the x axis, seconds: the first giving at most six ticks.
const TIME_STEPS: [f64; 12] = [
    60.0, 120.0, 300.0, 600.0, 900.0, 1800.0, 3600.0, 7200.0, 10_800.0, 21_600.0, 43_200.0,
    86_400.0,
];

/// A target's line on the chart.
#[derive(Clone, Debug, PartialEq)]
pub struct Limit {
    /// Where the line is, SVG units.
    pub y: f64,
    /// Its label at the right end (`≥ 60`).
    pub text: String,
    /// Whether it is a floor (the area below is outside).
    pub at_least: bool,
    /// The area outside it, as an SVG path; empty when never outside.
    pub shade: String,
    /// How the line is told apart without colour.
    pub mark: Mark,
    /// The worst point, SVG units.
    pub worst: Option<(f64, f64)>,
}

impl Limit {
    /// The CSS class of its hatching: below a floor, above a ceiling.
    pub fn shade_class(&self) -> &'static str {
        if self.at_least {
            "shade-low"
        } else {
            "shade-high"
        }
    }
}

/// One series laid out.
#[derive(Clone, Debug, PartialEq)]
pub struct Trend {
    /// `Brain · CPP`.
    pub title: String,
    /// The chart in words, for screen readers.
    pub description: String,
    /// Time ticks.
    pub x_ticks: Vec<Tick>,
    /// Pressure ticks.
    pub y_ticks: Vec<Tick>,
    /// The curve: one closed path per observed stretch (top and bottom of
    /// each pixel column).
    pub curve: Vec<String>,
    /// The targets' lines.
    pub limits: Vec<Limit>,
    /// Position changes: where, and the position's number (the start is 1).
    pub marks: Vec<(f64, usize)>,
    /// The exposure entries drawn, indices into the exposure's targets.
    pub targets: Vec<usize>,
}

/// Builds a polygon over a run of columns: along `upper` forwards, then
/// along `lower` backwards, each at the column's centre.
fn polygon(first: usize, columns: &[(f64, f64)]) -> String {
    let x = |i: usize| LEFT + (first + i) as f64 + 0.5;
    let mut d = String::with_capacity(columns.len() * 24);
    for (i, (upper, _)) in columns.iter().enumerate() {
        d.push_str(&format!(
            "{}{:.1},{:.1}",
            if i == 0 { 'M' } else { 'L' },
            x(i),
            upper
        ));
    }
    for (i, (_, lower)) in columns.iter().enumerate().rev() {
        d.push_str(&format!("L{:.1},{:.1}", x(i), lower));
    }
    d.push('Z');
    d
}

/// The hatched area outside a line at `y` within a strip: below it
/// (larger y) for a floor, above it for a ceiling.
fn shade(s: &Strip, y: f64, at_least: bool, d: &mut String) {
    let outside = |&(top, bottom): &(f64, f64)| {
        if at_least {
            (bottom > y + 0.05).then_some((y, bottom))
        } else {
            (top < y - 0.05).then_some((top, y))
        }
    };
    let mut group: Vec<(f64, f64)> = Vec::new();
    let mut start = 0;
    for (i, span) in s.spans.iter().enumerate() {
        match outside(span) {
            Some(piece) => {
                if group.is_empty() {
                    start = i;
                }
                group.push(piece);
            }
            None if !group.is_empty() => {
                d.push_str(&polygon(s.first + start, &group));
                group.clear();
            }
            None => {}
        }
    }
    if !group.is_empty() {
        d.push_str(&polygon(s.first + start, &group));
    }
}

fn clock_tick(s: f64) -> String {
    let minutes = (s / 60.0).round() as u64;
    format!("{}:{:02}", minutes / 60, minutes % 60)
}

fn n(v: f64) -> String {
    format!("{v:.1}")
}

impl Trend {
    /// The chart's inside as SVG markup, for an `<svg>` of
    /// `0 0 WIDTH HEIGHT`: grid and ticks, hatched areas, the curve, the
    /// targets' lines with their labels and worst points, position changes.
    /// The time axis is named in the chart's caption.
    pub fn svg(&self) -> String {
        let mut out =
            String::with_capacity(4096 + self.curve.iter().map(String::len).sum::<usize>());
        for k in &self.y_ticks {
            out.push_str(&format!(
                r#"<line x1="{}" x2="{}" y1="{y}" y2="{y}" class="grid"/><text x="{}" y="{}" class="tick tick-y">{}</text>"#,
                n(LEFT),
                n(RIGHT),
                n(LEFT - 6.0),
                n(k.at + 5.0),
                k.text,
                y = n(k.at)
            ));
        }
        for k in &self.x_ticks {
            out.push_str(&format!(
                r#"<text x="{}" y="{}" class="tick tick-x">{}</text>"#,
                n(k.at),
                n(BOTTOM + 20.0),
                k.text
            ));
        }
        for l in &self.limits {
            out.push_str(&format!(
                r#"<path d="{}" class="shade {}"/>"#,
                l.shade,
                l.shade_class()
            ));
        }
        for d in &self.curve {
            out.push_str(&format!(r#"<path d="{d}" class="trend-curve"/>"#));
        }
        for l in &self.limits {
            out.push_str(&format!(
                r#"<line x1="{}" x2="{}" y1="{y}" y2="{y}" class="series {}" stroke-dasharray="{}"/><text x="{}" y="{}" class="limit-label">{}</text>"#,
                n(LEFT),
                n(RIGHT),
                l.mark.class(),
                l.mark.dash(),
                n(RIGHT + 4.0),
                n(l.y + 5.0),
                l.text,
                y = n(l.y)
            ));
            if let Some((x, y)) = l.worst {
                out.push_str(&format!(
                    r#"<circle cx="{}" cy="{}" r="6" class="worst"/>"#,
                    n(x),
                    n(y)
                ));
            }
        }
        for (x, k) in &self.marks {
            out.push_str(&format!(
                r#"<line x1="{x}" x2="{x}" y1="{}" y2="{}" class="now"/><text x="{}" y="{}" class="now-label">{k}</text>"#,
                n(TOP),
                n(BOTTOM),
                n(x + 4.0),
                n(TOP + 2.0),
                x = n(*x)
            ));
        }
        out
    }

    /// Lays out `series` over `window` (seconds from the start), with the
    /// exposure entries `targets` (index and entry) drawn on it and the
    /// position changes at `changes` (seconds).
    pub fn new(
        series: &MetricSeries,
        targets: &[(usize, &TargetExposure)],
        window: (f64, f64),
        changes: &[f64],
    ) -> Trend {
        let (from, to) = (window.0, window.1.max(window.0 + 60.0));
        let values = series.runs.iter().flat_map(|r| r.mmhg.iter().copied());
        let (lo, hi) = values.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), v| {
            (lo.min(v), hi.max(v))
        });
        let observed = lo.is_finite();
        let (v_lo, v_hi) = targets.iter().map(|(_, t)| t.threshold_mmhg).fold(
            if observed { (lo, hi) } else { (0.0, 100.0) },
            |(a, b), t| (a.min(t), b.max(t)),
        );
        let step = nice_step((v_hi - v_lo).max(10.0), 4.0);
        let y0 = (v_lo / step).floor() * step;
        let y1 = ((v_hi / step).ceil() * step).max(y0 + step);
        let y_of = |v: f64| BOTTOM - (v - y0) / (y1 - y0) * (BOTTOM - TOP);
        let x_of = |t: f64| LEFT + (t - from) / (to - from) * (RIGHT - LEFT);

        let mut y_ticks = Vec::new();
        let mut v = y0;
        while v <= y1 + step / 2.0 {
            y_ticks.push(Tick {
                at: y_of(v),
                text: rounded(v),
            });
            v += step;
        }
        let t_step = TIME_STEPS
            .into_iter()
            .find(|s| (to - from) / s <= 6.0)
            .unwrap_or(86_400.0);
        let mut x_ticks = Vec::new();
        let mut t = (from / t_step).ceil() * t_step;
        while t <= to + 1e-6 {
            x_ticks.push(Tick {
                at: x_of(t),
                text: clock_tick(t),
            });
            t += t_step;
        }

        let columns = (RIGHT - LEFT) as usize;
        let strips: Vec<Strip> = series
            .runs
            .iter()
            .filter_map(|r| {
                let points: Vec<(f64, f64)> = r
                    .t_s
                    .iter()
                    .zip(&r.mmhg)
                    .map(|(t, v)| (x_of(*t), y_of(*v)))
                    .collect();
                strip(&points, LEFT, columns)
            })
            .collect();
        let curve = strips.iter().map(|s| polygon(s.first, &s.spans)).collect();
        let limits = targets
            .iter()
            .enumerate()
            .map(|(i, (_, t))| {
                let y = y_of(t.threshold_mmhg);
                let mut d = String::new();
                for s in &strips {
                    shade(s, y, t.at_least, &mut d);
                }
                let sign = if t.at_least { '≥' } else { '≤' };
                Limit {
                    y,
                    text: format!("{sign} {}", rounded(t.threshold_mmhg)),
                    at_least: t.at_least,
                    shade: d,
                    mark: Mark::nth(i + 1),
                    worst: t
                        .worst_at_s
                        .zip(t.worst_mmhg)
                        .map(|(at, v)| (x_of(at), y_of(v))),
                }
            })
            .collect();
        let marks = changes
            .iter()
            .enumerate()
            .filter(|(_, at)| (from..=to).contains(*at))
            .map(|(k, at)| (x_of(*at), k + 2))
            .collect();

        let title = format!("{} · {}", series.organ.label(), series.label);
        let mut description = format!("{title} over {}", elapsed_words(to - from));
        if observed {
            description.push_str(&format!(": from {} to {} mmHg", rounded(lo), rounded(hi)));
        } else {
            description.push_str(": no observed time");
        }
        for (_, t) in targets {
            let side = if t.at_least { "below" } else { "above" };
            description.push_str(&format!(
                "; hatched where {side} {} mmHg",
                rounded(t.threshold_mmhg)
            ));
        }
        description.push_str(". The numbers are beside the chart.");
        Trend {
            title,
            description,
            x_ticks,
            y_ticks,
            curve,
            limits,
            marks,
            targets: targets.iter().map(|(i, _)| *i).collect(),
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use plumbline_core::organ::{Metric, Organ};
    use plumbline_core::record::Run;

    fn exposure(threshold: f64, at_least: bool, worst: Option<(f64, f64)>) -> TargetExposure {
        TargetExposure {
            organ: Organ::WholeBody,
            metric: Metric::Inflow,
            label: "MAP at the heart",
            target: "MAP at the heart at least 65 mmHg".into(),
            status: if at_least {
                plumbline_core::target::Status::Below
            } else {
                plumbline_core::target::Status::Above
            },
            threshold_mmhg: threshold,
            at_least,
            observed_min: 20.0,
            outside_min: 1.0,
            outside_percent: 5.0,
            area_mmhg_min: 2.0,
            twa_mmhg: 0.1,
            longest_episode_min: 1.0,
            episodes: 1,
            ignored_episodes: 0,
            worst_mmhg: worst.map(|w| w.1),
            worst_at_s: worst.map(|w| w.0),
            assumed: Vec::new(),
            words: String::new(),
        }
    }

    /// An eight-hour series at 1 Hz with one stretch unobserved.
    fn long_series() -> MetricSeries {
        let run = |range: std::ops::Range<u32>| Run {
            t_s: range.clone().map(f64::from).collect(),
            mmhg: range
                .map(|t| 70.0 + 10.0 * (f64::from(t) / 900.0).sin())
                .collect(),
        };
        MetricSeries {
            organ: Organ::WholeBody,
            metric: Metric::Inflow,
            label: "MAP at the heart",
            runs: vec![run(0..14_400), run(15_000..28_800)],
        }
    }

    #[test]
    fn a_long_record_draws_in_a_few_hundred_columns() {
        let t = exposure(65.0, true, Some((2827.0, 60.0)));
        let trend = Trend::new(&long_series(), &[(0, &t)], (0.0, 28_799.0), &[3600.0]);
        assert_eq!(trend.curve.len(), 2, "the gap splits the curve");
        let points: usize = trend.curve.iter().map(|d| d.matches('L').count() + 1).sum();
        let columns = (RIGHT - LEFT) as usize;
        assert!(points <= 2 * columns + 4, "{points} points");
        // Below 65 happens, so the floor is hatched; the worst is in the plot.
        let limit = &trend.limits[0];
        assert!(!limit.shade.is_empty());
        assert!(limit.at_least && limit.text == "≥ 65");
        let (x, y) = limit.worst.unwrap();
        assert!((LEFT..=RIGHT).contains(&x) && (TOP..=BOTTOM).contains(&y));
        assert_eq!(trend.marks.len(), 1);
        assert_eq!(trend.marks[0].1, 2);
        assert_eq!(trend.x_ticks.first().unwrap().text, "0:00");
        assert_eq!(trend.x_ticks[1].text, "2:00");
        assert!(trend.description.contains("from 60 to 80 mmHg"));
    }

    #[test]
    fn scales_cover_the_values_and_the_targets() {
        let t = exposure(90.0, true, None);
        let trend = Trend::new(&long_series(), &[(3, &t)], (0.0, 28_799.0), &[]);
        let top = trend.y_ticks.last().unwrap();
        assert!(top.text.parse::<f64>().unwrap() >= 90.0);
        let bottom = trend.y_ticks.first().unwrap();
        assert!((bottom.at - BOTTOM).abs() < 1e-9);
        assert!(bottom.text.parse::<f64>().unwrap() <= 60.0);
        assert_eq!(trend.targets, vec![3]);
        // Always below 90: the hatch spans the whole observed curve.
        assert!(trend.limits[0].shade.matches('M').count() >= 2);
    }

    #[test]
    fn a_ceiling_hatches_above_and_a_met_floor_not_at_all() {
        let series = MetricSeries {
            organ: Organ::Brain,
            metric: Metric::Surrounding,
            label: "ICP",
            runs: vec![Run {
                t_s: vec![0.0, 600.0, 1200.0],
                mmhg: vec![10.0, 30.0, 10.0],
            }],
        };
        let ceiling = exposure(22.0, false, Some((600.0, 30.0)));
        let floor = exposure(5.0, true, None);
        let trend = Trend::new(&series, &[(0, &ceiling), (1, &floor)], (0.0, 1200.0), &[]);
        assert!(!trend.limits[0].shade.is_empty());
        assert!(trend.limits[0].text.starts_with('≤'));
        assert!(trend.limits[1].shade.is_empty());
        assert_ne!(trend.limits[0].mark, trend.limits[1].mark);
        assert_eq!(
            trend
                .x_ticks
                .iter()
                .map(|t| t.text.as_str())
                .collect::<Vec<_>>(),
            vec!["0:00", "0:05", "0:10", "0:15", "0:20"]
        );
    }

    #[test]
    fn the_markup_holds_every_part_once() {
        let t = exposure(65.0, true, Some((2827.0, 60.0)));
        let trend = Trend::new(&long_series(), &[(0, &t)], (0.0, 28_799.0), &[3600.0]);
        let svg = trend.svg();
        assert_eq!(svg.matches("class=\"trend-curve\"").count(), 2);
        assert_eq!(svg.matches("class=\"shade shade-low\"").count(), 1);
        assert_eq!(svg.matches("class=\"worst\"").count(), 1);
        assert_eq!(svg.matches("class=\"now-label\">2<").count(), 1);
        assert!(svg.contains(">≥ 65</text>"));
        assert_eq!(
            svg.matches('<').count(),
            svg.matches("/>").count() + svg.matches("</").count() * 2
        );
    }

    #[test]
    fn an_unobserved_series_still_lays_out() {
        let series = MetricSeries {
            organ: Organ::Brain,
            metric: Metric::Perfusion,
            label: "CPP",
            runs: Vec::new(),
        };
        let trend = Trend::new(&series, &[], (0.0, 0.0), &[]);
        assert!(trend.curve.is_empty());
        assert!(trend.description.contains("no observed time"));
        assert!(!trend.y_ticks.is_empty() && !trend.x_ticks.is_empty());
    }
}

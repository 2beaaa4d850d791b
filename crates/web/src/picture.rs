//! The patient picture's layout: the core's figure (cm in the body's plane)
//! scaled into SVG units, with height labels kept apart so none overlaps.
//!
//! Only drawing geometry lives here; every height shown is the core's.

use std::collections::BTreeSet;

use plumbline_core::geometry::Figure;
use plumbline_core::landmark::Landmark;
use plumbline_core::order::sort_short_by;
use plumbline_core::report::HeightRow;

use crate::show::{short, signed_whole_cm};

/// Width of the whole picture, SVG units.
pub const WIDTH: f64 = 480.0;
/// Width given to the body; the labels take the rest.
pub const BODY_WIDTH: f64 = 220.0;
/// Margin around the body.
const PAD: f64 = 16.0;
/// Vertical distance between two labels.
const LINE: f64 = 22.0;
/// The smallest picture height.
const MIN_HEIGHT: f64 = 170.0;
/// Where the label column starts.
pub const LABEL_X: f64 = BODY_WIDTH + 18.0;

/// A point in SVG units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Xy {
    /// Across, left to right.
    pub x: f64,
    /// Down, top to bottom.
    pub y: f64,
}

/// One polyline of the body.
#[derive(Clone, Debug, PartialEq)]
pub struct Stroke {
    /// Which part (`trunk`, `head`, `left_arm`...).
    pub name: &'static str,
    /// The `points` attribute of its polyline.
    pub points: String,
}

/// One landmark dot.
#[derive(Clone, Debug, PartialEq)]
pub struct Dot {
    /// Which landmark.
    pub landmark: Landmark,
    /// Where it is drawn.
    pub at: Xy,
    /// Whether it carries a label.
    pub labelled: bool,
}

/// One height label with its leader line.
#[derive(Clone, Debug, PartialEq)]
pub struct Label {
    /// The text: the landmark's short name and its height.
    pub text: String,
    /// The full wording, for a tooltip and screen readers.
    pub full: String,
    /// Where the text's baseline sits.
    pub at: Xy,
    /// The dot it points to.
    pub dot: Xy,
}

/// The picture laid out.
#[derive(Clone, Debug, PartialEq)]
pub struct Picture {
    /// Height of the picture, SVG units (its width is [`WIDTH`]).
    pub height: f64,
    /// The body.
    pub strokes: Vec<Stroke>,
    /// The landmarks.
    pub dots: Vec<Dot>,
    /// The labels.
    pub labels: Vec<Label>,
    /// Where the heart reference's level line runs.
    pub heart_y: f64,
    /// The head: its centre and radius, at the end of the `head` stroke.
    pub head: Option<(Xy, f64)>,
}

/// Radius of the drawn head, cm.
const HEAD_RADIUS_CM: f64 = 9.0;

impl Picture {
    /// Lays out `figure`, labelling the landmarks in `labelled` with their
    /// heights from the report's rows (so a measured height wins).
    pub fn new(figure: &Figure, heights: &[HeightRow], labelled: &BTreeSet<Landmark>) -> Self {
        let points = figure
            .limbs
            .iter()
            .flat_map(|l| l.points.iter())
            .chain(figure.landmarks.iter().map(|l| &l.point));
        let (mut a0, mut a1, mut h0, mut h1) = (0.0f64, 0.0f64, 0.0f64, 0.0f64);
        for p in points {
            a0 = a0.min(p.along_cm);
            a1 = a1.max(p.along_cm);
            h0 = h0.min(p.height_cm);
            h1 = h1.max(p.height_cm);
        }
        let scale = (BODY_WIDTH - 2.0 * PAD) / (a1 - a0).max(1.0);
        let body_height = (h1 - h0) * scale + 2.0 * PAD;
        let wanted = labelled.len() as f64 * LINE + 2.0 * PAD;
        let height = body_height.max(wanted).max(MIN_HEIGHT);
        let top = (height - (h1 - h0) * scale) / 2.0;
        let place = |along: f64, up: f64| Xy {
            x: PAD + (along - a0) * scale,
            y: top + (h1 - up) * scale,
        };
        let strokes = figure
            .limbs
            .iter()
            .map(|l| Stroke {
                name: l.name,
                points: l
                    .points
                    .iter()
                    .map(|p| {
                        let xy = place(p.along_cm, p.height_cm);
                        format!("{:.1},{:.1}", xy.x, xy.y)
                    })
                    .collect::<Vec<_>>()
                    .join(" "),
            })
            .collect();
        let dots: Vec<Dot> = figure
            .landmarks
            .iter()
            .map(|l| Dot {
                landmark: l.landmark,
                at: place(l.point.along_cm, l.point.height_cm),
                labelled: labelled.contains(&l.landmark),
            })
            .collect();
        let mut labels: Vec<Label> = dots
            .iter()
            .filter(|d| d.labelled)
            .filter_map(|d| {
                let row = heights.iter().find(|r| r.landmark == d.landmark)?;
                Some(Label {
                    text: if d.landmark == Landmark::Heart {
                        format!("{} 0 cm", short(row.label))
                    } else {
                        format!(
                            "{} {} cm",
                            short(row.label),
                            signed_whole_cm(row.above_heart_cm)
                        )
                    },
                    full: format!(
                        "{}: {:+.1} cm from the heart reference, {}",
                        row.label,
                        row.above_heart_cm,
                        row.provenance.label()
                    ),
                    at: Xy {
                        x: LABEL_X,
                        y: d.at.y,
                    },
                    dot: d.at,
                })
            })
            .collect();
        spread(&mut labels, height);
        let head = figure
            .limbs
            .iter()
            .find(|l| l.name == "head")
            .and_then(|l| match l.points.as_slice() {
                [.., from, to] => {
                    let (da, dh) = (to.along_cm - from.along_cm, to.height_cm - from.height_cm);
                    let length = (da * da + dh * dh).sqrt().max(1e-9);
                    let back = HEAD_RADIUS_CM.min(length) / length;
                    Some((
                        place(to.along_cm - da * back, to.height_cm - dh * back),
                        HEAD_RADIUS_CM * scale,
                    ))
                }
                _ => None,
            });
        Picture {
            height,
            strokes,
            dots,
            labels,
            heart_y: place(0.0, 0.0).y,
            head,
        }
    }
}

/// Moves labels apart so consecutive ones are at least a line apart, and
/// keeps them inside the picture.
fn spread(labels: &mut [Label], height: f64) {
    // Top to bottom, labels at one height kept in order; a dozen labels,
    // so the short sort does.
    sort_short_by(labels, |lower, upper| lower.at.y < upper.at.y);
    let first = PAD;
    let last = height - PAD / 2.0;
    let mut floor = first;
    for l in labels.iter_mut() {
        l.at.y = l.at.y.max(floor);
        floor = l.at.y + LINE;
    }
    let mut ceiling = last;
    for l in labels.iter_mut().rev() {
        l.at.y = l.at.y.min(ceiling);
        ceiling = l.at.y - LINE;
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use plumbline_core::check::check_json;
    use plumbline_core::demo::CASE_JSON;

    fn demo_picture(labelled: &[Landmark]) -> Picture {
        let report = check_json(CASE_JSON).unwrap();
        let set = labelled.iter().copied().collect();
        Picture::new(report.figure.as_ref().unwrap(), &report.heights, &set)
    }

    #[test]
    fn the_body_fits_the_picture() {
        let p = demo_picture(&[Landmark::Heart]);
        for d in &p.dots {
            assert!(d.at.x >= 0.0 && d.at.x <= BODY_WIDTH, "{:?}", d);
            assert!(d.at.y >= 0.0 && d.at.y <= p.height, "{:?}", d);
        }
        assert_eq!(p.dots.len(), Landmark::ALL.len());
    }

    #[test]
    fn higher_landmarks_are_drawn_higher() {
        let p = demo_picture(&[]);
        let y = |l: Landmark| p.dots.iter().find(|d| d.landmark == l).unwrap().at.y;
        assert!(y(Landmark::Tragus) < y(Landmark::Heart));
        assert!(y(Landmark::IliacCrest) > y(Landmark::Heart));
        assert!((p.heart_y - y(Landmark::Heart)).abs() < 1e-9);
        let (head, r) = p.head.unwrap();
        assert!(head.y < y(Landmark::Heart) && r > 0.0);
    }

    #[test]
    fn labels_carry_the_reports_heights_and_never_overlap() {
        let p = demo_picture(&[
            Landmark::Heart,
            Landmark::Tragus,
            Landmark::UpperArmLeft,
            Landmark::CordThoracic,
            Landmark::KidneyLeft,
            Landmark::KidneyRight,
        ]);
        assert!(p.labels.iter().any(|l| l.text == "tragus +32 cm"));
        for pair in p.labels.windows(2) {
            if let [a, b] = pair {
                assert!(b.at.y - a.at.y >= LINE - 1e-9, "{a:?} {b:?}");
            }
        }
        assert!(p.labels.iter().all(|l| l.at.y <= p.height));
    }
}

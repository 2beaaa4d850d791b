//! Posture geometry: landmark heights from the position and the patient's size.
//!
//! Clinicians know the position and roughly the patient's height; they rarely
//! measure every height. This module turns "beach chair at 70°, 176 cm,
//! left arm on the lap" into a height for every landmark, each with an
//! uncertainty that comes from shifting every uncertain input (angles read
//! off the table, proportions, depth offsets) by its plausible error. It also
//! gives the joints in a picture plane so a front end can draw the position;
//! there is no drawing code here.

mod body;
mod chain;
mod position;
pub mod proportions;

use std::collections::BTreeMap;

use serde::Serialize;

pub use body::{
    Body, GeometryParam, Segment, Shift, ASSUMED_HEIGHT_CM, ASSUMED_HEIGHT_SPREAD_CM,
    MEASURED_SEGMENT_CM, PROPORTION_SPREAD, STATED_HEIGHT_CM,
};
pub use chain::{place, Limb, Placement, PlanePoint};
pub use position::{
    Angles, ArmPlacement, Lie, Position, PositionSpec, Posture, ESTIMATED_BACKREST_DEG,
    MEASURED_BACKREST_DEG,
};

use crate::landmark::Landmark;
use crate::order::map_of;
use crate::units::{cm, to_cm, Length};

/// Body heights the proportions are meant for, cm. They are adult ratios.
pub const BODY_HEIGHT_RANGE_CM: (f64, f64) = (120.0, 220.0);

/// An estimated landmark height and how far it may be off.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Estimate {
    /// Height above the heart reference point.
    pub height: Length,
    /// Half-width of the plausible range: the root of the sum of squares of
    /// each parameter's effect.
    pub uncertainty: Length,
    /// The parameter that moves this height most, if any does.
    pub largest: Option<GeometryParam>,
}

/// Every landmark's estimated height in one position.
pub fn estimate(body: &Body, position: &Position) -> BTreeMap<Landmark, Estimate> {
    let nominal = place(body, position, None);
    let mut sums: BTreeMap<Landmark, (f64, Option<(GeometryParam, f64)>)> = BTreeMap::new();
    for param in GeometryParam::all_for(position) {
        let up = place(body, position, Some(Shift { param, sign: 1.0 }));
        let down = place(body, position, Some(Shift { param, sign: -1.0 }));
        for (landmark, h) in &nominal.heights {
            let base = to_cm(*h);
            let effect = |p: &Placement| {
                p.heights
                    .get(landmark)
                    .map_or(0.0, |x| (to_cm(*x) - base).abs())
            };
            let e = effect(&up).max(effect(&down));
            let entry = sums.entry(*landmark).or_insert((0.0, None));
            entry.0 += e * e;
            if e > 1e-9 && entry.1.is_none_or(|(_, best)| e > best) {
                entry.1 = Some((param, e));
            }
        }
    }
    map_of(nominal.heights.iter().map(|(landmark, h)| {
        let (sq, largest) = sums.get(landmark).copied().unwrap_or((0.0, None));
        (
            *landmark,
            Estimate {
                height: *h,
                uncertainty: cm(sq.sqrt()),
                largest: largest.map(|(p, _)| p),
            },
        )
    }))
}

/// The body drawn in a picture plane, for a front end: polylines through the
/// joints and a point per landmark, in cm relative to the heart reference.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Figure {
    /// The body as polylines.
    pub limbs: Vec<Limb>,
    /// Each landmark's place.
    pub landmarks: Vec<FigureLandmark>,
    /// What the picture's horizontal axis is.
    pub view: &'static str,
}

/// A landmark's place in the figure.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct FigureLandmark {
    /// Which landmark.
    pub landmark: Landmark,
    /// Its place.
    pub point: PlanePoint,
}

/// The figure of a body in a position.
pub fn figure(body: &Body, position: &Position) -> Figure {
    let placement = place(body, position, None);
    Figure {
        limbs: placement.limbs,
        landmarks: placement
            .points
            .into_iter()
            .map(|(landmark, point)| FigureLandmark { landmark, point })
            .collect(),
        view: if position.lie.is_lateral() {
            "seen from the patient's front: up is toward the upper side"
        } else {
            "seen from the patient's left: the head end of the table to the right"
        },
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::landmark::Landmark::*;

    fn heights(spec: PositionSpec, body_cm: f64) -> BTreeMap<Landmark, f64> {
        let position = spec.resolve("position").unwrap();
        place(&Body::of_height(cm(body_cm)), &position, None)
            .heights
            .into_iter()
            .map(|(k, v)| (k, to_cm(v)))
            .collect()
    }

    fn spec(posture: Posture) -> PositionSpec {
        PositionSpec::new(posture)
    }

    fn with_backrest(deg: f64) -> PositionSpec {
        let mut s = spec(Posture::HeadUp);
        s.backrest_deg = Some(deg);
        s
    }

    #[test]
    fn supine_trunk_landmarks_sit_at_heart_level_within_their_depth_offsets() {
        let h = heights(spec(Posture::Supine), 176.0);
        assert!(h[&Heart].abs() < 1e-9);
        assert!(h[&IliacCrest].abs() < 1e-9);
        assert!(h[&Tragus].abs() < 1e-9);
        assert!((h[&CordThoracic] - proportions::forward_cm::CORD_THORACIC).abs() < 1e-9);
        assert!((h[&CordLumbar] - proportions::forward_cm::CORD_LUMBAR).abs() < 1e-9);
        assert!((h[&KidneyLeft] - proportions::forward_cm::KIDNEY).abs() < 1e-9);
        assert!((h[&EyeLeft] - proportions::forward_cm::EYE).abs() < 1e-9);
    }

    #[test]
    fn upright_tragus_height_is_the_trunk_distance_from_heart_to_ear() {
        let h = heights(with_backrest(90.0), 176.0);
        let expected = (proportions::TRAGUS - proportions::standing::CHEST) * 176.0;
        assert!((h[&Tragus] - expected).abs() < 1e-9, "{}", h[&Tragus]);
    }

    #[test]
    fn upright_the_vertex_tops_the_head_and_the_shoulders_sit_at_shoulder_height() {
        let h = heights(with_backrest(90.0), 176.0);
        let above_tragus = (proportions::VERTEX - proportions::TRAGUS) * 176.0;
        assert!((h[&Vertex] - h[&Tragus] - above_tragus).abs() < 1e-9);
        assert!(h[&PosteriorFossa] < h[&Tragus]);
        let shoulder = (proportions::standing::SHOULDER - proportions::standing::CHEST) * 176.0;
        assert!((h[&ShoulderLeft] - shoulder).abs() < 1e-9);
        assert!((h[&ShoulderRight] - shoulder).abs() < 1e-9);
        // Supine, the posterior fossa lies below the ear canal by its depth.
        let flat = heights(spec(Posture::Supine), 176.0);
        assert!((flat[&PosteriorFossa] - proportions::forward_cm::POSTERIOR_FOSSA).abs() < 1e-9);
    }

    #[test]
    fn the_heart_rises_above_the_hips_with_the_backrest() {
        let above = |deg: f64| {
            let position = with_backrest(deg).resolve("position").unwrap();
            to_cm(place(&Body::of_height(cm(176.0)), &position, None).heart_above_hips)
        };
        assert!(
            above(0.0).abs() < 1e-9,
            "supine, the heart is level with the hips"
        );
        let trunk = (proportions::standing::CHEST - proportions::standing::HIP) * 176.0;
        assert!((above(90.0) - trunk).abs() < 1e-9);
    }

    #[test]
    fn raising_the_backrest_raises_the_head_steadily() {
        let mut last = f64::NEG_INFINITY;
        for deg in (0..=90).step_by(5) {
            let h = heights(with_backrest(f64::from(deg)), 176.0);
            assert!(h[&Tragus] > last, "at {deg}°");
            last = h[&Tragus];
        }
    }

    #[test]
    fn head_up_and_head_down_tilts_mirror_each_other() {
        let mut up = spec(Posture::ReverseTrendelenburg);
        up.tilt_deg = Some(25.0);
        let mut down = spec(Posture::Trendelenburg);
        down.tilt_deg = Some(-25.0);
        let flat = heights(spec(Posture::Supine), 170.0);
        let (hu, hd) = (heights(up, 170.0), heights(down, 170.0));
        let cos = 25f64.to_radians().cos();
        for landmark in [
            Tragus,
            IliacCrest,
            UpperArmLeft,
            CalfRight,
            AnkleLeft,
            EyeRight,
        ] {
            // The part from depth offsets scales by cos t; the part along the
            // table flips sign.
            let depth = flat[&landmark] * cos;
            assert!(
                ((hu[&landmark] - depth) + (hd[&landmark] - depth)).abs() < 1e-9,
                "{landmark}"
            );
        }
    }

    #[test]
    fn left_and_right_side_lying_mirror_each_other() {
        let left = heights(spec(Posture::LateralLeft), 180.0);
        let right = heights(spec(Posture::LateralRight), 180.0);
        let pairs = [
            (UpperArmLeft, UpperArmRight),
            (EyeLeft, EyeRight),
            (KidneyLeft, KidneyRight),
            (CalfLeft, CalfRight),
        ];
        for (l, r) in pairs {
            assert!((left[&l] - right[&r]).abs() < 1e-9, "{l} vs {r}");
            assert!(left[&l] < 0.0, "{l} is down when lying on the left");
        }
        assert!(
            left[&Tragus].abs() < 1e-9,
            "head on its pillow at heart level"
        );
    }

    #[test]
    fn dependent_arm_is_below_the_heart_by_half_the_chest_width() {
        let h = heights(spec(Posture::LateralRight), 176.0);
        let half = proportions::standing::CHEST_WIDTH / 2.0 * 176.0;
        assert!((h[&UpperArmRight] + half).abs() < 1e-9);
        assert!((h[&UpperArmLeft] - half).abs() < 1e-9);
    }

    #[test]
    fn prone_puts_the_eyes_below_the_ear() {
        let h = heights(spec(Posture::Prone), 176.0);
        assert!(h[&EyeLeft] < h[&Tragus]);
        let lower = heights(spec(Posture::ProneHeadDown), 176.0);
        assert!(lower[&Tragus] < h[&Tragus]);
    }

    #[test]
    fn a_measured_segment_replaces_the_estimate() {
        let position = spec(Posture::BeachChair).resolve("position").unwrap();
        let mut body = Body::of_height(cm(176.0));
        let estimated = place(&body, &position, None).heights[&UpperArmLeft];
        body.measured.insert(Segment::UpperArm, cm(40.0));
        let measured = place(&body, &position, None).heights[&UpperArmLeft];
        assert!(to_cm(measured) < to_cm(estimated));
    }

    #[test]
    fn estimates_carry_an_uncertainty_and_its_main_cause() {
        let position = spec(Posture::BeachChair).resolve("position").unwrap();
        let est = estimate(&Body::of_height(cm(176.0)), &position);
        let tragus = est[&Tragus];
        assert!(to_cm(tragus.uncertainty) > 1.0 && to_cm(tragus.uncertainty) < 10.0);
        assert!(tragus.largest.is_some());
        assert_eq!(to_cm(est[&Heart].uncertainty), 0.0);
    }

    #[test]
    fn figure_has_every_landmark_and_the_limbs() {
        let position = spec(Posture::Lithotomy).resolve("position").unwrap();
        let fig = figure(&Body::of_height(cm(165.0)), &position);
        assert_eq!(fig.landmarks.len(), Landmark::ALL.len());
        assert!(fig.limbs.iter().any(|l| l.name == "left_leg"));
    }

    #[test]
    fn a_backrest_measured_with_a_level_moves_the_head_less() {
        // Half-widths 5° estimated, 2° measured (position.rs, CP and D).
        let body = Body::of_height(cm(176.0));
        let mut spec = with_backrest(45.0);
        let tragus_shift = |spec: &PositionSpec| {
            let position = spec.resolve("position").unwrap();
            let param = GeometryParam::backrest(&position);
            assert!(GeometryParam::all_for(&position).contains(&param));
            let shifted = place(&body, &position, Some(Shift { param, sign: 1.0 }));
            let nominal = place(&body, &position, None);
            to_cm(shifted.heights[&Tragus] - nominal.heights[&Tragus])
        };
        let judged = tragus_shift(&spec);
        spec.backrest_measured = true;
        let measured = tragus_shift(&spec);
        assert!(
            measured > 0.0 && measured < judged / 2.0,
            "{measured} vs {judged}"
        );
        // A flag without a measured angle changes nothing.
        spec.backrest_deg = None;
        let position = spec.resolve("position").unwrap();
        assert_eq!(GeometryParam::backrest(&position), GeometryParam::Backrest);
    }
}

//! The patient's body as the geometry sees it: standing height (stated or
//! assumed), measured segments, and the inputs of the geometry that are not
//! known exactly, each with its half-width.

use std::collections::BTreeMap;

use serde::Serialize;

use super::position::{Lie, Position};
use super::proportions::{self as prop, standing};
use crate::landmark::Side;
use crate::units::{cm, to_cm, Length};

/// A segment whose length can be measured instead of estimated.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Segment {
    /// Hip joint to shoulder joint, along the trunk.
    HipToShoulder,
    /// Shoulder level to the tragus, along the neck and head.
    ShoulderToTragus,
    /// Shoulder joint to elbow.
    UpperArm,
    /// Elbow to wrist.
    Forearm,
    /// Hip joint to knee.
    Thigh,
    /// Knee to ankle.
    LowerLeg,
}

impl Segment {
    /// Every segment.
    pub const ALL: [Segment; 6] = [
        Segment::HipToShoulder,
        Segment::ShoulderToTragus,
        Segment::UpperArm,
        Segment::Forearm,
        Segment::Thigh,
        Segment::LowerLeg,
    ];

    /// The name used in case files.
    pub fn key(self) -> &'static str {
        match self {
            Segment::HipToShoulder => "hip_to_shoulder",
            Segment::ShoulderToTragus => "shoulder_to_tragus",
            Segment::UpperArm => "upper_arm",
            Segment::Forearm => "forearm",
            Segment::Thigh => "thigh",
            Segment::LowerLeg => "lower_leg",
        }
    }

    /// The segment's length as a fraction of body height, from the standing
    /// proportions.
    pub fn fraction(self) -> f64 {
        match self {
            Segment::HipToShoulder => standing::SHOULDER - standing::HIP,
            Segment::ShoulderToTragus => prop::TRAGUS - standing::SHOULDER,
            Segment::UpperArm => standing::SHOULDER - standing::ELBOW,
            Segment::Forearm => standing::ELBOW - standing::WRIST,
            Segment::Thigh => standing::HIP - standing::KNEE,
            Segment::LowerLeg => standing::KNEE - standing::ANKLE,
        }
    }

    /// The segment in words.
    pub fn label(self) -> &'static str {
        match self {
            Segment::HipToShoulder => "hip to shoulder",
            Segment::ShoulderToTragus => "shoulder to tragus",
            Segment::UpperArm => "upper arm",
            Segment::Forearm => "forearm",
            Segment::Thigh => "thigh",
            Segment::LowerLeg => "lower leg",
        }
    }
}

/// The patient's size: standing height and any measured segment lengths.
#[derive(Clone, Debug, PartialEq)]
pub struct Body {
    /// Standing body height.
    pub height: Length,
    /// How far the stated height may be off, cm: 2 when given, the adult
    /// population's spread when assumed.
    pub height_spread_cm: f64,
    /// Whether the height was assumed rather than given.
    pub height_assumed: bool,
    /// Segment lengths measured on this patient; they replace the estimate.
    pub measured: BTreeMap<Segment, Length>,
}

/// Half-width of a stated body height, cm.
pub const STATED_HEIGHT_CM: f64 = 2.0;

/// The height assumed when none is given, cm: about the middle of adult
/// heights (NCD Risk Factor Collaboration, eLife 2016: national mean adult
/// heights from about 150 to 183 cm; from memory).
pub const ASSUMED_HEIGHT_CM: f64 = 170.0;

/// Half-width of the assumed height, cm: most adults lie within it (same
/// source, from memory).
pub const ASSUMED_HEIGHT_SPREAD_CM: f64 = 15.0;

impl Body {
    /// A body of a given height with every segment estimated.
    pub fn of_height(height: Length) -> Self {
        Body {
            height,
            height_spread_cm: STATED_HEIGHT_CM,
            height_assumed: false,
            measured: BTreeMap::new(),
        }
    }

    /// An adult of no stated height: the middle of adult heights, with the
    /// population's spread carried into every range.
    pub fn assumed() -> Self {
        Body {
            height_spread_cm: ASSUMED_HEIGHT_SPREAD_CM,
            height_assumed: true,
            ..Body::of_height(cm(ASSUMED_HEIGHT_CM))
        }
    }

    /// A segment's length in cm: measured if given, else estimated.
    pub fn segment_cm(&self, segment: Segment) -> f64 {
        self.measured
            .get(&segment)
            .map_or(segment.fraction() * to_cm(self.height), |l| to_cm(*l))
    }
}

/// One input of the geometry that is not known exactly.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case", tag = "param", content = "which")]
pub enum GeometryParam {
    /// The stated body height (±2 cm; the adult population's spread when
    /// assumed).
    BodyHeight,
    /// A segment's length (±4% when estimated from proportions, ±1 cm measured).
    Segment(Segment),
    /// The backrest angle as read from the table (±5°).
    Backrest,
    /// The table tilt (±2°).
    Tilt,
    /// Roll about the body's long axis: how far from exactly on the back,
    /// front or side the patient lies (±5°, ±10° on a side).
    Roll,
    /// The neck flexion (±10°).
    NeckFlexion,
    /// The hip flexion (±10°).
    HipFlexion,
    /// The knee flexion (±10°).
    KneeFlexion,
    /// An upper arm's angle (±10°).
    Shoulder(Side),
    /// An elbow's angle (±10°).
    Elbow(Side),
    /// Front-to-back offsets of the eyes and cervical cord (±2 cm).
    HeadOffsets,
    /// Front-to-back offsets of the thoracic and lumbar cord and kidneys (±2 cm).
    SpineOffsets,
    /// Half the chest width, which sets the arms' heights when on a side (±3 cm).
    ChestHalfWidth,
    /// How far the head on its pillow sits off the body's midline when on a side (±3 cm).
    HeadCentring,
}

/// Half-width of a measured segment length, cm.
pub const MEASURED_SEGMENT_CM: f64 = 1.0;

/// Relative half-width of an estimated segment length.
pub const PROPORTION_SPREAD: f64 = 0.04;

impl GeometryParam {
    /// How far the parameter may plausibly be off, in its own unit (cm or °).
    pub fn half_width(self, body: &Body) -> f64 {
        match self {
            GeometryParam::BodyHeight => body.height_spread_cm,
            GeometryParam::Segment(s) if body.measured.contains_key(&s) => MEASURED_SEGMENT_CM,
            GeometryParam::Segment(s) => PROPORTION_SPREAD * body.segment_cm(s),
            GeometryParam::Backrest => 5.0,
            GeometryParam::Tilt => 2.0,
            GeometryParam::Roll => 5.0,
            GeometryParam::NeckFlexion
            | GeometryParam::HipFlexion
            | GeometryParam::KneeFlexion
            | GeometryParam::Shoulder(_)
            | GeometryParam::Elbow(_) => 10.0,
            GeometryParam::HeadOffsets | GeometryParam::SpineOffsets => 2.0,
            GeometryParam::ChestHalfWidth | GeometryParam::HeadCentring => 3.0,
        }
    }

    /// The parameter and its half-width in words.
    pub fn label(self, body: &Body) -> String {
        let hw = self.half_width(body);
        match self {
            GeometryParam::BodyHeight if body.height_assumed => {
                format!("body height ±{hw:.0} cm (ASSUMED: none was given)")
            }
            GeometryParam::BodyHeight => format!("body height ±{hw:.0} cm"),
            GeometryParam::Segment(s) if body.measured.contains_key(&s) => {
                format!("{} length (measured) ±{hw:.0} cm", s.label())
            }
            GeometryParam::Segment(s) => {
                format!("{} length from proportions ±{hw:.1} cm", s.label())
            }
            GeometryParam::Backrest => format!("backrest angle ±{hw:.0}°"),
            GeometryParam::Tilt => format!("table tilt ±{hw:.0}°"),
            GeometryParam::Roll => {
                format!("roll about the long axis ±{hw:.0}° (twice that on a side)")
            }
            GeometryParam::NeckFlexion => format!("neck flexion ±{hw:.0}°"),
            GeometryParam::HipFlexion => format!("hip flexion ±{hw:.0}°"),
            GeometryParam::KneeFlexion => format!("knee flexion ±{hw:.0}°"),
            GeometryParam::Shoulder(side) => {
                format!("{} upper arm angle ±{hw:.0}°", side_word(side))
            }
            GeometryParam::Elbow(side) => format!("{} elbow angle ±{hw:.0}°", side_word(side)),
            GeometryParam::HeadOffsets => format!("eye and neck depth offsets ±{hw:.0} cm"),
            GeometryParam::SpineOffsets => format!("spine and kidney depth offsets ±{hw:.0} cm"),
            GeometryParam::ChestHalfWidth => format!("half chest width ±{hw:.0} cm"),
            GeometryParam::HeadCentring => {
                format!("head off the midline on its pillow ±{hw:.0} cm")
            }
        }
    }

    /// The parameters that move some landmark in this position.
    pub fn all_for(position: &Position) -> Vec<GeometryParam> {
        let mut params = vec![GeometryParam::BodyHeight];
        params.extend(Segment::ALL.map(GeometryParam::Segment));
        if position.lie == Lie::FaceUp {
            params.push(GeometryParam::Backrest);
        }
        params.extend([
            GeometryParam::Tilt,
            GeometryParam::Roll,
            GeometryParam::NeckFlexion,
            GeometryParam::HipFlexion,
            GeometryParam::KneeFlexion,
            GeometryParam::Shoulder(Side::Left),
            GeometryParam::Shoulder(Side::Right),
            GeometryParam::Elbow(Side::Left),
            GeometryParam::Elbow(Side::Right),
            GeometryParam::HeadOffsets,
            GeometryParam::SpineOffsets,
        ]);
        if position.lie.is_lateral() {
            params.extend([GeometryParam::ChestHalfWidth, GeometryParam::HeadCentring]);
        }
        params
    }
}

fn side_word(side: Side) -> &'static str {
    match side {
        Side::Left => "left",
        Side::Right => "right",
    }
}

/// A shift of one geometry parameter by `sign` times its half-width.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Shift {
    /// Which parameter moves.
    pub param: GeometryParam,
    /// How far, in half-widths (usually +1 or -1).
    pub sign: f64,
}

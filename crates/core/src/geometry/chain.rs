//! The chain of rigid segments that places every landmark in space.
//!
//! Body frame, fixed to the table's seat section: `c` runs toward the head
//! along the table, `a` toward the front of the body, `l` to the patient's
//! left. The trunk hinges at the hips by the backrest angle, the head at the
//! neck base by the neck flexion, the limbs at their joints. The whole table
//! then tilts, and the lie (face up, face down, on a side) says which body
//! direction points up. A landmark's height is its position dotted with the
//! up direction, taken relative to the heart reference point.

use std::collections::BTreeMap;

use serde::Serialize;

use super::body::{Body, GeometryParam, Segment, Shift};
use super::position::{ArmPlacement, Lie, Position};
use super::proportions::{self as prop, forward_cm, lateral_cm, standing};
use crate::landmark::{Landmark, Side};
use crate::order::map_of;
use crate::units::{cm, to_cm, Length};

#[derive(Clone, Copy, Debug, Default, PartialEq)]
struct V3 {
    c: f64,
    a: f64,
    l: f64,
}

impl V3 {
    const C: V3 = V3 {
        c: 1.0,
        a: 0.0,
        l: 0.0,
    };
    const A: V3 = V3 {
        c: 0.0,
        a: 1.0,
        l: 0.0,
    };
    const L: V3 = V3 {
        c: 0.0,
        a: 0.0,
        l: 1.0,
    };

    fn add(self, o: V3) -> V3 {
        V3 {
            c: self.c + o.c,
            a: self.a + o.a,
            l: self.l + o.l,
        }
    }

    fn scale(self, k: f64) -> V3 {
        V3 {
            c: self.c * k,
            a: self.a * k,
            l: self.l * k,
        }
    }

    fn dot(self, o: V3) -> f64 {
        self.c * o.c + self.a * o.a + self.l * o.l
    }

    /// `cos θ · self + sin θ · other`: a rotation of `self` toward `other`.
    fn toward(self, other: V3, deg: f64) -> V3 {
        let (s, c) = deg.to_radians().sin_cos();
        self.scale(c).add(other.scale(s))
    }
}

/// A point in the picture plane: along the table (toward the head, cm) and
/// up (cm), both relative to the heart reference point.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PlanePoint {
    /// Horizontal distance toward the head end of the table, cm.
    pub along_cm: f64,
    /// Height above the heart reference point, cm.
    pub height_cm: f64,
}

/// A drawn part of the body: a polyline through joints.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Limb {
    /// Which part (`trunk`, `head`, `left_arm`...).
    pub name: &'static str,
    /// The joints it passes through, in order.
    pub points: Vec<PlanePoint>,
}

/// The placed body: every landmark's height and the joints for a picture.
#[derive(Clone, Debug, PartialEq)]
pub struct Placement {
    /// Each landmark's height above the heart reference point.
    pub heights: BTreeMap<Landmark, Length>,
    /// Each landmark's place in the picture plane.
    pub points: BTreeMap<Landmark, PlanePoint>,
    /// The body as polylines, for drawing.
    pub limbs: Vec<Limb>,
    /// The heart reference's height above the hips' midpoint, the pivot
    /// the backrest turns about: with the seat fixed in the room, what ties
    /// heights in one position to heights in another (a drain's chamber on
    /// its pole).
    pub heart_above_hips: Length,
}

/// The frame and sizes after any shift is applied.
struct Frame {
    up: V3,
    along: V3,
    trunk_c: V3,
    trunk_a: V3,
    head_c: V3,
    head_a: V3,
    height_cm: f64,
    trunk_scale: f64,
    head_scale: f64,
    head_forward: f64,
    spine_forward: f64,
    chest_half: f64,
    head_lateral: f64,
}

fn shift_by(shift: Option<Shift>, param: GeometryParam, body: &Body) -> f64 {
    match shift {
        Some(s) if s.param == param => s.sign * param.half_width(body),
        _ => 0.0,
    }
}

/// Places every landmark of `body` in `position`, with one parameter shifted
/// when `shift` is given (for uncertainty).
pub fn place(body: &Body, position: &Position, shift: Option<Shift>) -> Placement {
    let d = |param| shift_by(shift, param, body);
    let angles = position.angles;
    let tilt = angles.tilt_deg + d(GeometryParam::Tilt);
    let backrest = angles.backrest_deg + d(GeometryParam::backrest(position));
    let neck = angles.neck_flexion_deg + d(GeometryParam::NeckFlexion);
    let height_cm = to_cm(body.height) + d(GeometryParam::BodyHeight);

    let base_up = match position.lie {
        Lie::FaceUp => V3::A,
        Lie::FaceDown => V3::A.scale(-1.0),
        Lie::LeftDown => V3::L.scale(-1.0),
        Lie::RightDown => V3::L,
    };
    // Roll turns the up direction toward the front of the body; on a side a
    // patient is rarely at exactly 90°, so the roll counts double there.
    let roll_scale = if position.lie.is_lateral() { 2.0 } else { 1.0 };
    let base_up = base_up.toward(roll_axis(position.lie), d(GeometryParam::Roll) * roll_scale);
    let up = base_up.toward(V3::C, tilt);
    let along = V3::C.toward(base_up, -tilt);
    let trunk_c = V3::C.toward(V3::A, backrest);
    let trunk_a = V3::A.toward(V3::C, -backrest);
    let head_c = trunk_c.toward(trunk_a, neck);
    let head_a = trunk_a.toward(trunk_c, -neck);

    // A measured segment keeps its length when only the body height moves.
    let segment = |s: Segment| {
        let base = match body.measured.get(&s) {
            Some(l) => to_cm(*l),
            None => s.fraction() * height_cm,
        };
        base + d(GeometryParam::Segment(s))
    };
    let nominal = |s: Segment| s.fraction() * height_cm;
    let frame = Frame {
        up,
        along,
        trunk_c,
        trunk_a,
        head_c,
        head_a,
        height_cm,
        trunk_scale: segment(Segment::HipToShoulder) / nominal(Segment::HipToShoulder),
        head_scale: segment(Segment::ShoulderToTragus) / nominal(Segment::ShoulderToTragus),
        head_forward: d(GeometryParam::HeadOffsets),
        spine_forward: d(GeometryParam::SpineOffsets),
        chest_half: standing::CHEST_WIDTH / 2.0 * height_cm + d(GeometryParam::ChestHalfWidth),
        head_lateral: if position.lie.is_lateral() {
            d(GeometryParam::HeadCentring)
        } else {
            0.0
        },
    };

    let mut world: BTreeMap<Landmark, V3> = BTreeMap::new();
    let neck_base = frame.trunk(standing::SHOULDER, 0.0, 0.0);
    world.insert(Landmark::Heart, frame.trunk(standing::CHEST, 0.0, 0.0));
    world.insert(
        Landmark::CordThoracic,
        frame.trunk(
            prop::CORD_THORACIC,
            forward_cm::CORD_THORACIC + frame.spine_forward,
            0.0,
        ),
    );
    world.insert(
        Landmark::CordLumbar,
        frame.trunk(
            prop::CORD_LUMBAR,
            forward_cm::CORD_LUMBAR + frame.spine_forward,
            0.0,
        ),
    );
    world.insert(
        Landmark::IliacCrest,
        frame.trunk(prop::ILIAC_CREST, 0.0, 0.0),
    );
    for (landmark, sign) in [(Landmark::KidneyLeft, 1.0), (Landmark::KidneyRight, -1.0)] {
        world.insert(
            landmark,
            frame.trunk(
                prop::KIDNEY,
                forward_cm::KIDNEY + frame.spine_forward,
                sign * lateral_cm::KIDNEY,
            ),
        );
    }
    world.insert(
        Landmark::Tragus,
        frame.head(neck_base, prop::TRAGUS, 0.0, 0.0),
    );
    world.insert(
        Landmark::CordCervical,
        frame.head(
            neck_base,
            prop::CORD_CERVICAL,
            forward_cm::CORD_CERVICAL + frame.head_forward,
            0.0,
        ),
    );
    for (landmark, sign) in [(Landmark::EyeLeft, 1.0), (Landmark::EyeRight, -1.0)] {
        world.insert(
            landmark,
            frame.head(
                neck_base,
                standing::EYE,
                forward_cm::EYE + frame.head_forward,
                sign * lateral_cm::EYE,
            ),
        );
    }

    let mut limbs = Vec::new();
    for side in [Side::Left, Side::Right] {
        let arm = arm_joints(&frame, position, side, &segment, &d);
        let leg = leg_joints(&frame, angles, side, &segment, &d);
        let (upper_arm, wrist, thigh, calf, ankle) = match side {
            Side::Left => (
                Landmark::UpperArmLeft,
                Landmark::WristLeft,
                Landmark::ThighLeft,
                Landmark::CalfLeft,
                Landmark::AnkleLeft,
            ),
            Side::Right => (
                Landmark::UpperArmRight,
                Landmark::WristRight,
                Landmark::ThighRight,
                Landmark::CalfRight,
                Landmark::AnkleRight,
            ),
        };
        let shoulder = match side {
            Side::Left => Landmark::ShoulderLeft,
            Side::Right => Landmark::ShoulderRight,
        };
        world.insert(shoulder, arm.shoulder);
        world.insert(upper_arm, arm.mid_upper);
        world.insert(wrist, arm.wrist);
        world.insert(thigh, leg.mid_thigh);
        world.insert(calf, leg.mid_calf);
        world.insert(ankle, leg.ankle);
        limbs.push((arm_name(side), vec![arm.shoulder, arm.elbow, arm.wrist]));
        limbs.push((leg_name(side), vec![leg.hip, leg.knee, leg.ankle]));
    }
    let crown = frame.head(neck_base, prop::VERTEX, 0.0, 0.0);
    world.insert(Landmark::Vertex, crown);
    world.insert(
        Landmark::PosteriorFossa,
        frame.head(
            neck_base,
            prop::POSTERIOR_FOSSA,
            forward_cm::POSTERIOR_FOSSA + frame.head_forward,
            0.0,
        ),
    );
    limbs.push(("trunk", vec![V3::default(), neck_base]));
    limbs.push(("head", vec![neck_base, crown]));

    let heart = world.get(&Landmark::Heart).copied().unwrap_or_default();
    let to_plane = |p: V3| PlanePoint {
        along_cm: p.dot(frame.along) - heart.dot(frame.along),
        height_cm: p.dot(frame.up) - heart.dot(frame.up),
    };
    let points = map_of(world.iter().map(|(k, p)| (*k, to_plane(*p))));
    let heights = map_of(points.iter().map(|(k, p)| (*k, cm(p.height_cm))));
    let limbs = limbs
        .into_iter()
        .map(|(name, joints)| Limb {
            name,
            points: joints.into_iter().map(to_plane).collect(),
        })
        .collect();
    Placement {
        heights,
        points,
        limbs,
        heart_above_hips: cm(heart.dot(frame.up)),
    }
}

impl Frame {
    /// A point on the trunk at standing-height fraction `frac`, with offsets.
    fn trunk(&self, frac: f64, forward: f64, lateral: f64) -> V3 {
        let along = (frac - standing::HIP) * self.height_cm * self.trunk_scale;
        self.trunk_c
            .scale(along)
            .add(self.trunk_a.scale(forward))
            .add(V3::L.scale(lateral))
    }

    /// A point on the head and neck, hinged at the neck base.
    fn head(&self, neck_base: V3, frac: f64, forward: f64, lateral: f64) -> V3 {
        let along = (frac - standing::SHOULDER) * self.height_cm * self.head_scale;
        neck_base
            .add(self.head_c.scale(along))
            .add(self.head_a.scale(forward))
            .add(V3::L.scale(lateral + self.head_lateral))
    }
}

struct ArmJoints {
    shoulder: V3,
    mid_upper: V3,
    elbow: V3,
    wrist: V3,
}

fn arm_joints(
    frame: &Frame,
    position: &Position,
    side: Side,
    segment: &dyn Fn(Segment) -> f64,
    d: &dyn Fn(GeometryParam) -> f64,
) -> ArmJoints {
    let outward = match side {
        Side::Left => 1.0,
        Side::Right => -1.0,
    };
    let shoulder = frame.trunk(standing::SHOULDER, 0.0, outward * frame.chest_half);
    let down_trunk = frame.trunk_c.scale(-1.0);
    let ds = d(GeometryParam::Shoulder(side));
    let de = d(GeometryParam::Elbow(side));
    // Flexion angles in the body's front-to-back plane, from "alongside the trunk".
    let sagittal = |shoulder_deg: f64, elbow_deg: f64| {
        (
            down_trunk.toward(frame.trunk_a, shoulder_deg + ds),
            down_trunk.toward(frame.trunk_a, shoulder_deg + ds + elbow_deg + de),
        )
    };
    let (upper, fore) = match position.arm(side) {
        ArmPlacement::Side => sagittal(0.0, 0.0),
        ArmPlacement::Lap => sagittal(0.0, 90.0),
        ArmPlacement::Raised => sagittal(90.0, 30.0),
        ArmPlacement::Angles {
            shoulder_flexion_deg,
            elbow_flexion_deg,
        } => sagittal(shoulder_flexion_deg, elbow_flexion_deg),
        ArmPlacement::Armboard if position.lie.is_lateral() => sagittal(90.0, 0.0),
        ArmPlacement::Armboard => {
            let out = V3::L.scale(outward);
            (
                out.toward(frame.trunk_a, ds),
                out.toward(frame.trunk_a, ds + de),
            )
        }
    };
    let upper_len = segment(Segment::UpperArm);
    let elbow = shoulder.add(upper.scale(upper_len));
    ArmJoints {
        shoulder,
        mid_upper: shoulder.add(upper.scale(upper_len / 2.0)),
        elbow,
        wrist: elbow.add(fore.scale(segment(Segment::Forearm))),
    }
}

struct LegJoints {
    hip: V3,
    mid_thigh: V3,
    knee: V3,
    mid_calf: V3,
    ankle: V3,
}

fn leg_joints(
    frame: &Frame,
    angles: super::position::Angles,
    side: Side,
    segment: &dyn Fn(Segment) -> f64,
    d: &dyn Fn(GeometryParam) -> f64,
) -> LegJoints {
    let outward = match side {
        Side::Left => 1.0,
        Side::Right => -1.0,
    };
    let hip = V3::L.scale(outward * prop::HIP_HALF_WIDTH * frame.height_cm);
    let hip_deg = angles.hip_flexion_deg + d(GeometryParam::HipFlexion);
    let knee_deg = angles.knee_flexion_deg + d(GeometryParam::KneeFlexion);
    let toward_feet = V3::C.scale(-1.0);
    let thigh_dir = toward_feet.toward(V3::A, hip_deg);
    let calf_dir = toward_feet.toward(V3::A, hip_deg - knee_deg);
    let thigh_len = segment(Segment::Thigh);
    let calf_len = segment(Segment::LowerLeg);
    let knee = hip.add(thigh_dir.scale(thigh_len));
    LegJoints {
        hip,
        mid_thigh: hip.add(thigh_dir.scale(thigh_len / 2.0)),
        knee,
        mid_calf: knee.add(calf_dir.scale(calf_len / 2.0)),
        ankle: knee.add(calf_dir.scale(calf_len)),
    }
}

/// The body direction a roll turns "up" toward: the front when on a side,
/// the left side otherwise.
fn roll_axis(lie: Lie) -> V3 {
    if lie.is_lateral() {
        V3::A
    } else {
        V3::L
    }
}

fn arm_name(side: Side) -> &'static str {
    match side {
        Side::Left => "left_arm",
        Side::Right => "right_arm",
    }
}

fn leg_name(side: Side) -> &'static str {
    match side {
        Side::Left => "left_leg",
        Side::Right => "right_leg",
    }
}

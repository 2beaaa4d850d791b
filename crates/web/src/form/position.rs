//! The position part of the form: posture, angle overrides and arms.
//!
//! An empty angle box means "the posture's preset"; the preset itself comes
//! from the core (`PositionSpec::resolve`), so the screen can show it
//! without knowing any posture's angles.

use plumbline_core::error::{Error, ErrorKind, Errors};
use plumbline_core::geometry::{Angles, ArmPlacement, Lie, PositionSpec, Posture};

use serde::{Deserialize, Serialize};

use super::parts::required_number;
use crate::fields::{number, number_text};

/// One of the five angles a position can override.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum AngleKey {
    /// Backrest raised from the seat section.
    Backrest,
    /// Whole-table tilt, positive head-up.
    Tilt,
    /// Neck flexion.
    Neck,
    /// Hip flexion.
    Hip,
    /// Knee flexion.
    Knee,
}

impl AngleKey {
    /// In the order the screen shows them.
    pub const ALL: [AngleKey; 5] = [
        AngleKey::Backrest,
        AngleKey::Tilt,
        AngleKey::Neck,
        AngleKey::Hip,
        AngleKey::Knee,
    ];

    /// The case file's field name.
    pub fn key(self) -> &'static str {
        match self {
            AngleKey::Backrest => "backrest_deg",
            AngleKey::Tilt => "tilt_deg",
            AngleKey::Neck => "neck_flexion_deg",
            AngleKey::Hip => "hip_flexion_deg",
            AngleKey::Knee => "knee_flexion_deg",
        }
    }

    /// The label beside the box.
    pub fn label(self) -> &'static str {
        match self {
            AngleKey::Backrest => "Backrest",
            AngleKey::Tilt => "Tilt (+ head-up)",
            AngleKey::Neck => "Neck flexion",
            AngleKey::Hip => "Hip flexion",
            AngleKey::Knee => "Knee flexion",
        }
    }

    /// Whether the angle can be negative, so the box needs a keyboard with
    /// a minus sign (a tablet's decimal pad has none).
    pub fn signed(self) -> bool {
        matches!(self, AngleKey::Tilt | AngleKey::Neck | AngleKey::Hip)
    }

    /// The path of the field in the case document.
    pub fn path(self) -> String {
        self.path_in("position")
    }

    /// The path of the field in a position at `prefix`.
    pub fn path_in(self, prefix: &str) -> String {
        format!("{prefix}.{}", self.key())
    }

    fn of(self, angles: &Angles) -> f64 {
        match self {
            AngleKey::Backrest => angles.backrest_deg,
            AngleKey::Tilt => angles.tilt_deg,
            AngleKey::Neck => angles.neck_flexion_deg,
            AngleKey::Hip => angles.hip_flexion_deg,
            AngleKey::Knee => angles.knee_flexion_deg,
        }
    }
}

/// Where an arm is, as the picker offers it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum ArmChoice {
    /// The posture's preset.
    Preset,
    /// Alongside the trunk.
    Side,
    /// On an arm board.
    Armboard,
    /// Forearm across the lap.
    Lap,
    /// In a holder.
    Raised,
    /// Given as shoulder and elbow angles.
    Angles,
}

impl ArmChoice {
    /// In the order the picker shows them.
    pub const ALL: [ArmChoice; 6] = [
        ArmChoice::Preset,
        ArmChoice::Side,
        ArmChoice::Armboard,
        ArmChoice::Lap,
        ArmChoice::Raised,
        ArmChoice::Angles,
    ];

    /// The choice in words; the named placements use the core's words.
    pub fn label(self) -> String {
        match self {
            ArmChoice::Preset => "as the posture sets it".to_owned(),
            ArmChoice::Side => ArmPlacement::Side.label(),
            ArmChoice::Armboard => ArmPlacement::Armboard.label(),
            ArmChoice::Lap => ArmPlacement::Lap.label(),
            ArmChoice::Raised => ArmPlacement::Raised.label(),
            ArmChoice::Angles => "by shoulder and elbow angles".to_owned(),
        }
    }
}

/// One arm.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ArmForm {
    /// The placement chosen.
    pub choice: ArmChoice,
    /// Shoulder flexion as typed, for [`ArmChoice::Angles`].
    pub shoulder: String,
    /// Elbow flexion as typed, for [`ArmChoice::Angles`].
    pub elbow: String,
}

impl ArmForm {
    fn from_placement(placement: Option<ArmPlacement>) -> Self {
        let (choice, shoulder, elbow) = match placement {
            None => (ArmChoice::Preset, String::new(), String::new()),
            Some(ArmPlacement::Side) => (ArmChoice::Side, String::new(), String::new()),
            Some(ArmPlacement::Armboard) => (ArmChoice::Armboard, String::new(), String::new()),
            Some(ArmPlacement::Lap) => (ArmChoice::Lap, String::new(), String::new()),
            Some(ArmPlacement::Raised) => (ArmChoice::Raised, String::new(), String::new()),
            Some(ArmPlacement::Angles {
                shoulder_flexion_deg,
                elbow_flexion_deg,
            }) => (
                ArmChoice::Angles,
                number_text(shoulder_flexion_deg),
                number_text(elbow_flexion_deg),
            ),
        };
        ArmForm {
            choice,
            shoulder,
            elbow,
        }
    }

    fn placement(&self, path: &str, errors: &mut Errors) -> Option<ArmPlacement> {
        match self.choice {
            ArmChoice::Preset => None,
            ArmChoice::Side => Some(ArmPlacement::Side),
            ArmChoice::Armboard => Some(ArmPlacement::Armboard),
            ArmChoice::Lap => Some(ArmPlacement::Lap),
            ArmChoice::Raised => Some(ArmPlacement::Raised),
            ArmChoice::Angles => {
                let s = required_angle(
                    &self.shoulder,
                    &format!("{path}.angles.shoulder_flexion_deg"),
                    errors,
                );
                let e = required_angle(
                    &self.elbow,
                    &format!("{path}.angles.elbow_flexion_deg"),
                    errors,
                );
                Some(ArmPlacement::Angles {
                    shoulder_flexion_deg: s.unwrap_or_default(),
                    elbow_flexion_deg: e.unwrap_or_default(),
                })
            }
        }
    }
}

fn angle_error(path: &str, message: String) -> Error {
    Error::new(path, ErrorKind::Quantity { message })
}

fn required_angle(text: &str, path: &str, errors: &mut Errors) -> Option<f64> {
    required_number(text, path, "the angle in degrees", errors)
}

/// The position as the form holds it.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PositionForm {
    /// The named posture; `None` when the case gives no position.
    pub posture: Option<Posture>,
    angles: [String; 5],
    /// Whether the backrest angle shown was measured with a level; typing
    /// in its box makes it an estimate again.
    #[serde(default)]
    pub measured: bool,
    /// The left arm.
    pub left: ArmForm,
    /// The right arm.
    pub right: ArmForm,
}

impl PositionForm {
    /// The form of a case's position.
    pub fn from_spec(spec: Option<&PositionSpec>) -> Self {
        let text = |v: Option<f64>| v.map(number_text).unwrap_or_default();
        match spec {
            None => PositionForm {
                posture: None,
                angles: Default::default(),
                measured: false,
                left: ArmForm::from_placement(None),
                right: ArmForm::from_placement(None),
            },
            Some(s) => PositionForm {
                posture: Some(s.posture),
                angles: [
                    text(s.backrest_deg),
                    text(s.tilt_deg),
                    text(s.neck_flexion_deg),
                    text(s.hip_flexion_deg),
                    text(s.knee_flexion_deg),
                ],
                measured: s.backrest_measured,
                left: ArmForm::from_placement(s.left_arm),
                right: ArmForm::from_placement(s.right_arm),
            },
        }
    }

    fn slot(key: AngleKey) -> usize {
        match key {
            AngleKey::Backrest => 0,
            AngleKey::Tilt => 1,
            AngleKey::Neck => 2,
            AngleKey::Hip => 3,
            AngleKey::Knee => 4,
        }
    }

    /// The angle text as typed; empty means the preset.
    pub fn angle(&self, key: AngleKey) -> &str {
        self.angles
            .get(Self::slot(key))
            .map(String::as_str)
            .unwrap_or_default()
    }

    /// The angle box, for typing into.
    pub fn angle_mut(&mut self, key: AngleKey) -> Option<&mut String> {
        self.angles.get_mut(Self::slot(key))
    }

    /// The angle the quick path shows with the posture: the table's tilt for
    /// a tilted table, the backrest for other positions on the back, none
    /// for the others (their angles are all in the detail).
    pub fn main_angle(&self) -> Option<AngleKey> {
        match self.posture? {
            Posture::Trendelenburg | Posture::ReverseTrendelenburg => Some(AngleKey::Tilt),
            p if p.lie() == Lie::FaceUp => Some(AngleKey::Backrest),
            _ => None,
        }
    }

    /// The posture's preset angle, from the core.
    pub fn preset(&self, key: AngleKey) -> Option<f64> {
        let spec = PositionSpec::new(self.posture?);
        spec.resolve("position").ok().map(|p| key.of(&p.angles))
    }

    /// A new posture starts from its own presets: overrides of the last
    /// posture rarely fit the next one (a backrest on a prone patient).
    pub fn set_posture(&mut self, posture: Option<Posture>) {
        *self = PositionForm::from_spec(posture.map(PositionSpec::new).as_ref());
    }

    /// Moves an angle by `delta` degrees from what is shown (typed or preset),
    /// for the ± buttons. Unreadable text is left alone for the clinician.
    pub fn step(&mut self, key: AngleKey, delta: f64) {
        let current = match number(self.angle(key)) {
            Ok(Some(v)) => v,
            Ok(None) => self.preset(key).unwrap_or_default(),
            Err(_) => return,
        };
        if let Some(text) = self.angle_mut(key) {
            *text = number_text(current + delta);
        }
        if key == AngleKey::Backrest {
            self.measured = false;
        }
    }

    /// A backrest angle measured with a level: it fills the box, and the
    /// check counts it with the level's smaller uncertainty.
    pub fn measure_backrest(&mut self, deg: f64) {
        if let Some(text) = self.angle_mut(AngleKey::Backrest) {
            *text = number_text(deg);
            self.measured = true;
        }
    }

    /// The position for the case, with every unreadable box named.
    pub fn spec(&self, errors: &mut Errors) -> Option<PositionSpec> {
        self.spec_at("position", errors)
    }

    /// As [`PositionForm::spec`], for a position at `prefix` in the case.
    pub fn spec_at(&self, prefix: &str, errors: &mut Errors) -> Option<PositionSpec> {
        let mut spec = PositionSpec::new(self.posture?);
        spec.backrest_measured = self.measured;
        for key in AngleKey::ALL {
            let value = match number(self.angle(key)) {
                Ok(v) => v,
                Err(e) => {
                    errors.push(angle_error(&key.path_in(prefix), e.to_string()));
                    None
                }
            };
            match key {
                AngleKey::Backrest => spec.backrest_deg = value,
                AngleKey::Tilt => spec.tilt_deg = value,
                AngleKey::Neck => spec.neck_flexion_deg = value,
                AngleKey::Hip => spec.hip_flexion_deg = value,
                AngleKey::Knee => spec.knee_flexion_deg = value,
            }
        }
        spec.left_arm = self.left.placement(&format!("{prefix}.left_arm"), errors);
        spec.right_arm = self.right.placement(&format!("{prefix}.right_arm"), errors);
        Some(spec)
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn demo_spec() -> PositionSpec {
        let mut spec = PositionSpec::new(Posture::BeachChair);
        spec.backrest_deg = Some(65.0);
        spec.left_arm = Some(ArmPlacement::Lap);
        spec.right_arm = Some(ArmPlacement::Angles {
            shoulder_flexion_deg: 30.0,
            elbow_flexion_deg: 90.0,
        });
        spec
    }

    #[test]
    fn a_spec_round_trips_through_the_form() {
        let spec = demo_spec();
        let form = PositionForm::from_spec(Some(&spec));
        let mut errors = Errors::default();
        assert_eq!(form.spec(&mut errors), Some(spec));
        assert!(errors.is_empty());
    }

    #[test]
    fn presets_come_from_the_core_and_steps_start_there() {
        let mut form = PositionForm::from_spec(None);
        form.set_posture(Some(Posture::HeadUp));
        assert_eq!(form.angle(AngleKey::Backrest), "");
        assert_eq!(form.preset(AngleKey::Backrest), Some(30.0));
        form.step(AngleKey::Backrest, 5.0);
        assert_eq!(form.angle(AngleKey::Backrest), "35");
    }

    #[test]
    fn unreadable_angles_are_named_by_their_path() {
        let mut form = PositionForm::from_spec(Some(&demo_spec()));
        *form.angle_mut(AngleKey::Tilt).unwrap() = "1o".into();
        form.right.elbow = String::new();
        let mut errors = Errors::default();
        form.spec(&mut errors);
        assert_eq!(errors.for_field("position.tilt_deg").count(), 1);
        assert_eq!(
            errors
                .for_field("position.right_arm.angles.elbow_flexion_deg")
                .count(),
            1
        );
        form.step(AngleKey::Tilt, 5.0);
        assert_eq!(form.angle(AngleKey::Tilt), "1o");
    }
}

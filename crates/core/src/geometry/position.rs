//! Positions as the clinician names them, and the joint angles they stand for.
//!
//! A [`PositionSpec`] is what a case file holds: a named posture with any
//! angle overridden. [`PositionSpec::resolve`] checks it and turns it into a
//! [`Posture`], the plain angles the chain of segments is built from.

use serde::{Deserialize, Serialize};

use crate::error::{Error, ErrorKind, Errors};
use crate::landmark::Side;

/// Half-width of a backrest angle read off the bed's scale or judged by
/// eye, degrees: bedside estimates of the head-of-bed angle are often
/// several degrees off (common practice).
pub const ESTIMATED_BACKREST_DEG: f64 = 5.0;
/// Half-width of a backrest angle measured with a level laid on the
/// backrest, degrees: the sensor's own error is about a degree; the rest is
/// how the level lies on a padded, possibly curved backrest (derived).
pub const MEASURED_BACKREST_DEG: f64 = 2.0;

fn is_false(b: &bool) -> bool {
    !*b
}

/// Named postures. Each gives default angles; any of them can be overridden.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Posture {
    /// Flat on the back.
    Supine,
    /// Backrest raised (default 30°), as on an ICU bed.
    HeadUp,
    /// Seated for shoulder surgery (backrest 70°, hips and knees bent).
    BeachChair,
    /// Sitting for posterior fossa surgery (backrest 80°, head flexed, legs raised).
    Sitting,
    /// Whole table tilted head-down (default 20°).
    Trendelenburg,
    /// Whole table tilted head-up (default 20°).
    ReverseTrendelenburg,
    /// Lying on the left side (left side down).
    LateralLeft,
    /// Lying on the right side (right side down).
    LateralRight,
    /// Face down, head neutral.
    Prone,
    /// Face down with the head lower than the trunk (neck flexed 20°).
    ProneHeadDown,
    /// On the back with hips and knees flexed 90° in leg holders.
    Lithotomy,
}

impl Posture {
    /// Every posture, in the order a picker shows them.
    pub const ALL: [Posture; 11] = [
        Posture::Supine,
        Posture::HeadUp,
        Posture::BeachChair,
        Posture::Sitting,
        Posture::Trendelenburg,
        Posture::ReverseTrendelenburg,
        Posture::LateralLeft,
        Posture::LateralRight,
        Posture::Prone,
        Posture::ProneHeadDown,
        Posture::Lithotomy,
    ];

    /// The posture in words.
    pub fn label(self) -> &'static str {
        match self {
            Posture::Supine => "supine",
            Posture::HeadUp => "head-up (backrest raised)",
            Posture::BeachChair => "beach chair",
            Posture::Sitting => "sitting (posterior fossa)",
            Posture::Trendelenburg => "Trendelenburg (head down)",
            Posture::ReverseTrendelenburg => "reverse Trendelenburg (head up)",
            Posture::LateralLeft => "lateral, left side down",
            Posture::LateralRight => "lateral, right side down",
            Posture::Prone => "prone",
            Posture::ProneHeadDown => "prone, head lower",
            Posture::Lithotomy => "lithotomy",
        }
    }

    /// The orientation of the body on the table.
    pub fn lie(self) -> Lie {
        match self {
            Posture::LateralLeft => Lie::LeftDown,
            Posture::LateralRight => Lie::RightDown,
            Posture::Prone | Posture::ProneHeadDown => Lie::FaceDown,
            _ => Lie::FaceUp,
        }
    }

    /// Whether the trunk is upright enough that population formulas derived
    /// in seated patients apply.
    pub fn is_seated(self) -> bool {
        matches!(self, Posture::BeachChair | Posture::Sitting)
    }

    fn defaults(self) -> Angles {
        let flat = Angles {
            backrest_deg: 0.0,
            tilt_deg: 0.0,
            neck_flexion_deg: 0.0,
            hip_flexion_deg: 0.0,
            knee_flexion_deg: 0.0,
        };
        match self {
            Posture::Supine | Posture::LateralLeft | Posture::LateralRight | Posture::Prone => flat,
            Posture::HeadUp => Angles {
                backrest_deg: 30.0,
                ..flat
            },
            Posture::BeachChair => Angles {
                backrest_deg: 70.0,
                hip_flexion_deg: 20.0,
                knee_flexion_deg: 40.0,
                ..flat
            },
            Posture::Sitting => Angles {
                backrest_deg: 80.0,
                neck_flexion_deg: 25.0,
                hip_flexion_deg: 30.0,
                knee_flexion_deg: 45.0,
                ..flat
            },
            Posture::Trendelenburg => Angles {
                tilt_deg: -20.0,
                ..flat
            },
            Posture::ReverseTrendelenburg => Angles {
                tilt_deg: 20.0,
                ..flat
            },
            Posture::ProneHeadDown => Angles {
                neck_flexion_deg: 20.0,
                ..flat
            },
            Posture::Lithotomy => Angles {
                hip_flexion_deg: 90.0,
                knee_flexion_deg: 90.0,
                ..flat
            },
        }
    }

    fn default_arm(self) -> ArmPlacement {
        match self {
            Posture::BeachChair | Posture::Sitting => ArmPlacement::Lap,
            Posture::LateralLeft | Posture::LateralRight => ArmPlacement::Armboard,
            Posture::Prone | Posture::ProneHeadDown => ArmPlacement::Armboard,
            _ => ArmPlacement::Side,
        }
    }
}

/// How the body lies on the table: which way is up.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Lie {
    /// Front of the body up (supine, seated, tilted).
    FaceUp,
    /// Front of the body down (prone).
    FaceDown,
    /// Left side down.
    LeftDown,
    /// Right side down.
    RightDown,
}

impl Lie {
    /// Whether the patient lies on a side.
    pub fn is_lateral(self) -> bool {
        matches!(self, Lie::LeftDown | Lie::RightDown)
    }
}

/// Where an arm is.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case", deny_unknown_fields)]
pub enum ArmPlacement {
    /// Alongside the trunk, elbow straight.
    Side,
    /// Out on an arm board: abducted 90° when lying on the back or front;
    /// forward on a board in front of the chest when lying on a side.
    Armboard,
    /// Upper arm alongside the trunk, forearm forward across the lap.
    Lap,
    /// Raised in a holder: upper arm forward 90°, elbow bent 30°.
    Raised,
    /// Given as angles in the body's front-to-back plane.
    Angles {
        /// Upper arm from the trunk: 0° alongside it, 90° pointing forward,
        /// 180° overhead.
        shoulder_flexion_deg: f64,
        /// Forearm from the upper arm: 0° straight.
        elbow_flexion_deg: f64,
    },
}

impl ArmPlacement {
    /// The placement in words.
    pub fn label(self) -> String {
        match self {
            ArmPlacement::Side => "at the side".into(),
            ArmPlacement::Armboard => "on an arm board".into(),
            ArmPlacement::Lap => "on the lap".into(),
            ArmPlacement::Raised => "raised in a holder".into(),
            ArmPlacement::Angles {
                shoulder_flexion_deg,
                elbow_flexion_deg,
            } => format!("shoulder {shoulder_flexion_deg:.0}°, elbow {elbow_flexion_deg:.0}°"),
        }
    }
}

/// The angles a posture stands for, in degrees.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Angles {
    /// Trunk raised from the table's seat section, 0-90°.
    pub backrest_deg: f64,
    /// Whole table tilt, positive head-up, -45 to 45°.
    pub tilt_deg: f64,
    /// Head bent toward the chest (negative: extended), -30 to 60°.
    pub neck_flexion_deg: f64,
    /// Thighs raised from the table's seat section, -30 to 120°.
    pub hip_flexion_deg: f64,
    /// Knees bent, 0-150°.
    pub knee_flexion_deg: f64,
}

/// A position as written in a case file: a named posture, with any angle or
/// arm placement overridden.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PositionSpec {
    /// The named posture.
    pub posture: Posture,
    /// Overrides the posture's backrest angle.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub backrest_deg: Option<f64>,
    /// Whether `backrest_deg` was measured with a level (an inclinometer, or
    /// a tablet's orientation sensor laid on the backrest) rather than read
    /// off the bed's scale or judged by eye: it then carries a smaller
    /// uncertainty ([`MEASURED_BACKREST_DEG`]).
    #[serde(default, skip_serializing_if = "is_false")]
    pub backrest_measured: bool,
    /// Overrides the table tilt (positive head-up).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tilt_deg: Option<f64>,
    /// Overrides the neck flexion.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub neck_flexion_deg: Option<f64>,
    /// Overrides the hip flexion.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub hip_flexion_deg: Option<f64>,
    /// Overrides the knee flexion.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub knee_flexion_deg: Option<f64>,
    /// Where the left arm is.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub left_arm: Option<ArmPlacement>,
    /// Where the right arm is.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub right_arm: Option<ArmPlacement>,
}

impl PositionSpec {
    /// A spec with the posture's defaults throughout.
    pub fn new(posture: Posture) -> Self {
        PositionSpec {
            posture,
            backrest_deg: None,
            backrest_measured: false,
            tilt_deg: None,
            neck_flexion_deg: None,
            hip_flexion_deg: None,
            knee_flexion_deg: None,
            left_arm: None,
            right_arm: None,
        }
    }

    /// The table's angles (backrest, tilt) left out where the posture's
    /// usual value is not zero: each field's name and the angle assumed in
    /// its place. Every height above the heart follows from them, so a
    /// check must say when they were not entered.
    pub fn assumed_table_angles(&self) -> Vec<(&'static str, f64)> {
        let usual = self.posture.defaults();
        [
            ("backrest_deg", self.backrest_deg, usual.backrest_deg),
            ("tilt_deg", self.tilt_deg, usual.tilt_deg),
        ]
        .into_iter()
        .filter(|(_, given, usual)| given.is_none() && *usual != 0.0)
        .map(|(name, _, usual)| (name, usual))
        .collect()
    }

    /// Checks the spec and returns the resolved position.
    ///
    /// `field` is the path of the spec in the document, for messages.
    ///
    /// # Errors
    /// An angle out of its range, a backrest on a position that has none, or
    /// a tilt against the named direction (a head-up tilt on Trendelenburg).
    ///
    /// # Example
    /// ```
    /// use plumbline_core::geometry::{Posture, PositionSpec};
    /// let mut spec = PositionSpec::new(Posture::BeachChair);
    /// assert!(spec.resolve("position").is_ok());
    /// spec.backrest_deg = Some(120.0);
    /// assert!(spec.resolve("position").is_err());
    /// ```
    pub fn resolve(&self, field: &str) -> Result<Position, Errors> {
        let defaults = self.posture.defaults();
        let angles = Angles {
            backrest_deg: self.backrest_deg.unwrap_or(defaults.backrest_deg),
            tilt_deg: self.tilt_deg.unwrap_or(defaults.tilt_deg),
            neck_flexion_deg: self.neck_flexion_deg.unwrap_or(defaults.neck_flexion_deg),
            hip_flexion_deg: self.hip_flexion_deg.unwrap_or(defaults.hip_flexion_deg),
            knee_flexion_deg: self.knee_flexion_deg.unwrap_or(defaults.knee_flexion_deg),
        };
        let mut errors = Errors::default();
        let mut range = |name: &str, value: f64, min: f64, max: f64| {
            if !(value.is_finite() && (min..=max).contains(&value)) {
                errors.push(Error::new(
                    format!("{field}.{name}"),
                    ErrorKind::OutOfRange {
                        value: format!("{value}°"),
                        min: format!("{min}°"),
                        max: format!("{max}°"),
                        hint: None,
                    },
                ));
            }
        };
        range("backrest_deg", angles.backrest_deg, 0.0, 90.0);
        range("tilt_deg", angles.tilt_deg, -45.0, 45.0);
        range("neck_flexion_deg", angles.neck_flexion_deg, -30.0, 60.0);
        range("hip_flexion_deg", angles.hip_flexion_deg, -30.0, 120.0);
        range("knee_flexion_deg", angles.knee_flexion_deg, 0.0, 150.0);
        let arms = [("left_arm", self.left_arm), ("right_arm", self.right_arm)];
        for (name, arm) in arms {
            if let Some(ArmPlacement::Angles {
                shoulder_flexion_deg,
                elbow_flexion_deg,
            }) = arm
            {
                range(
                    &format!("{name}.angles.shoulder_flexion_deg"),
                    shoulder_flexion_deg,
                    0.0,
                    180.0,
                );
                range(
                    &format!("{name}.angles.elbow_flexion_deg"),
                    elbow_flexion_deg,
                    0.0,
                    150.0,
                );
            }
        }
        let lie = self.posture.lie();
        if lie != Lie::FaceUp && angles.backrest_deg != 0.0 {
            errors.push(Error::not_applicable(
                format!("{field}.backrest_deg"),
                format!(
                    "a backrest applies only to positions on the back; {} has none",
                    self.posture.label()
                ),
            ));
        }
        match self.posture {
            Posture::Trendelenburg if angles.tilt_deg > 0.0 => {
                errors.push(Error::inconsistent(
                    format!("{field}.tilt_deg"),
                    "Trendelenburg is head-down: give the tilt as 0 or negative, \
                     or choose reverse_trendelenburg",
                ));
            }
            Posture::ReverseTrendelenburg if angles.tilt_deg < 0.0 => {
                errors.push(Error::inconsistent(
                    format!("{field}.tilt_deg"),
                    "reverse Trendelenburg is head-up: give the tilt as 0 or positive, \
                     or choose trendelenburg",
                ));
            }
            _ => {}
        }
        let default_arm = self.posture.default_arm();
        errors.into_result(Position {
            posture: self.posture,
            lie,
            angles,
            backrest_measured: self.backrest_measured && self.backrest_deg.is_some(),
            left_arm: self.left_arm.unwrap_or(default_arm),
            right_arm: self.right_arm.unwrap_or(default_arm),
        })
    }
}

/// A checked position: the plain angles and arm placements.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Position {
    /// The named posture it came from.
    pub posture: Posture,
    /// Which way is up.
    pub lie: Lie,
    /// The joint and table angles.
    pub angles: Angles,
    /// Whether the backrest angle was measured with a level.
    #[serde(skip_serializing_if = "is_false")]
    pub backrest_measured: bool,
    /// Where the left arm is.
    pub left_arm: ArmPlacement,
    /// Where the right arm is.
    pub right_arm: ArmPlacement,
}

impl Position {
    /// The placement of one arm.
    pub fn arm(&self, side: Side) -> ArmPlacement {
        match side {
            Side::Left => self.left_arm,
            Side::Right => self.right_arm,
        }
    }

    /// The position with a different backrest angle, for sweeps.
    pub fn with_backrest(&self, backrest_deg: f64) -> Position {
        let mut next = self.clone();
        next.angles.backrest_deg = backrest_deg;
        next
    }

    /// A one-line description for tables and summaries.
    pub fn describe(&self) -> String {
        let a = &self.angles;
        let mut parts = vec![self.posture.label().to_owned()];
        if a.backrest_deg != 0.0 {
            parts.push(format!("backrest {:.0}°", a.backrest_deg));
        }
        if a.tilt_deg != 0.0 {
            let way = if a.tilt_deg > 0.0 {
                "head-up"
            } else {
                "head-down"
            };
            parts.push(format!("tilt {:.0}° {way}", a.tilt_deg.abs()));
        }
        if a.neck_flexion_deg != 0.0 {
            parts.push(format!("neck flexed {:.0}°", a.neck_flexion_deg));
        }
        parts.push(format!("left arm {}", self.left_arm.label()));
        parts.push(format!("right arm {}", self.right_arm.label()));
        parts.join(", ")
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn every_posture_resolves_with_its_defaults() {
        for posture in Posture::ALL {
            let position = PositionSpec::new(posture).resolve("position").unwrap();
            assert_eq!(position.posture, posture);
        }
    }

    #[test]
    fn overrides_win_over_defaults() {
        let mut spec = PositionSpec::new(Posture::BeachChair);
        spec.backrest_deg = Some(45.0);
        spec.left_arm = Some(ArmPlacement::Armboard);
        let position = spec.resolve("position").unwrap();
        assert_eq!(position.angles.backrest_deg, 45.0);
        assert_eq!(position.left_arm, ArmPlacement::Armboard);
        assert_eq!(position.right_arm, ArmPlacement::Lap);
    }

    #[test]
    fn errors_name_the_angle() {
        let check = |spec: PositionSpec, field: &str| {
            let errors = spec.resolve("position").unwrap_err();
            assert!(
                errors.iter().any(|e| e.field() == field),
                "expected an error on {field}, got {errors}"
            );
        };
        let mut spec = PositionSpec::new(Posture::Supine);
        spec.tilt_deg = Some(60.0);
        check(spec, "position.tilt_deg");
        let mut spec = PositionSpec::new(Posture::Prone);
        spec.backrest_deg = Some(20.0);
        check(spec, "position.backrest_deg");
        let mut spec = PositionSpec::new(Posture::Trendelenburg);
        spec.tilt_deg = Some(10.0);
        check(spec, "position.tilt_deg");
        let mut spec = PositionSpec::new(Posture::Supine);
        spec.knee_flexion_deg = Some(f64::NAN);
        check(spec, "position.knee_flexion_deg");
        let mut spec = PositionSpec::new(Posture::Supine);
        spec.right_arm = Some(ArmPlacement::Angles {
            shoulder_flexion_deg: 200.0,
            elbow_flexion_deg: 0.0,
        });
        check(spec, "position.right_arm.angles.shoulder_flexion_deg");
    }

    #[test]
    fn arm_placement_reads_names_and_angles() {
        let side: ArmPlacement = serde_json::from_str("\"side\"").unwrap();
        assert_eq!(side, ArmPlacement::Side);
        let angles: ArmPlacement = serde_json::from_str(
            r#"{"angles": {"shoulder_flexion_deg": 30, "elbow_flexion_deg": 90}}"#,
        )
        .unwrap();
        assert!(matches!(angles, ArmPlacement::Angles { .. }));
    }
}

//! Named places on the body whose height matters: where readings are
//! referenced and where organs sit.
//!
//! Heights are vertical, positive upward, measured from the heart reference
//! point, the one datum for the whole patient.

use std::fmt;

use serde::{Deserialize, Serialize};

/// A named landmark. Left and right are kept apart where side-lying makes
/// them differ.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Landmark {
    /// The heart reference point: the phlebostatic axis (4th intercostal
    /// space, mid-axillary line, mid-chest depth). The datum: height 0.
    Heart,
    /// The tragus / external auditory meatus, surface mark of the foramen of
    /// Monro; the reference for ICP and for cerebral perfusion. Taken on the
    /// midline, so in side-lying it is the centre of the head.
    Tragus,
    /// The cranial vertex, the top of the head: the highest point of the
    /// brain in an upright head, where its perfusion pressure is lowest.
    Vertex,
    /// The posterior fossa (the back of the head, below the inion): a
    /// sitting craniotomy's operative site.
    PosteriorFossa,
    /// The left eye (globe centre).
    EyeLeft,
    /// The right eye (globe centre).
    EyeRight,
    /// The cervical cord (about C5).
    CordCervical,
    /// The thoracic cord (about T6).
    CordThoracic,
    /// The lumbar enlargement and conus (about L1).
    CordLumbar,
    /// The left shoulder joint: a shoulder operation's site.
    ShoulderLeft,
    /// The right shoulder joint.
    ShoulderRight,
    /// The mid-axillary line at the iliac crest: the zero for bladder IAP.
    IliacCrest,
    /// The left kidney (hilum).
    KidneyLeft,
    /// The right kidney (hilum).
    KidneyRight,
    /// The middle of the left upper arm, where a cuff sits.
    UpperArmLeft,
    /// The middle of the right upper arm.
    UpperArmRight,
    /// The left wrist (radial artery).
    WristLeft,
    /// The right wrist.
    WristRight,
    /// The middle of the left thigh.
    ThighLeft,
    /// The middle of the right thigh.
    ThighRight,
    /// The middle of the left calf.
    CalfLeft,
    /// The middle of the right calf.
    CalfRight,
    /// The left ankle.
    AnkleLeft,
    /// The right ankle.
    AnkleRight,
}

/// Which side of the body a landmark is on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Side {
    /// The patient's left.
    Left,
    /// The patient's right.
    Right,
}

impl Landmark {
    /// Every landmark, in head-to-foot order.
    pub const ALL: [Landmark; 24] = [
        Landmark::Heart,
        Landmark::Vertex,
        Landmark::Tragus,
        Landmark::PosteriorFossa,
        Landmark::EyeLeft,
        Landmark::EyeRight,
        Landmark::CordCervical,
        Landmark::ShoulderLeft,
        Landmark::ShoulderRight,
        Landmark::CordThoracic,
        Landmark::CordLumbar,
        Landmark::IliacCrest,
        Landmark::KidneyLeft,
        Landmark::KidneyRight,
        Landmark::UpperArmLeft,
        Landmark::UpperArmRight,
        Landmark::WristLeft,
        Landmark::WristRight,
        Landmark::ThighLeft,
        Landmark::ThighRight,
        Landmark::CalfLeft,
        Landmark::CalfRight,
        Landmark::AnkleLeft,
        Landmark::AnkleRight,
    ];

    /// The name used in case files (`"upper_arm_left"`).
    pub fn key(self) -> &'static str {
        match self {
            Landmark::Heart => "heart",
            Landmark::Tragus => "tragus",
            Landmark::Vertex => "vertex",
            Landmark::PosteriorFossa => "posterior_fossa",
            Landmark::ShoulderLeft => "shoulder_left",
            Landmark::ShoulderRight => "shoulder_right",
            Landmark::EyeLeft => "eye_left",
            Landmark::EyeRight => "eye_right",
            Landmark::CordCervical => "cord_cervical",
            Landmark::CordThoracic => "cord_thoracic",
            Landmark::CordLumbar => "cord_lumbar",
            Landmark::IliacCrest => "iliac_crest",
            Landmark::KidneyLeft => "kidney_left",
            Landmark::KidneyRight => "kidney_right",
            Landmark::UpperArmLeft => "upper_arm_left",
            Landmark::UpperArmRight => "upper_arm_right",
            Landmark::WristLeft => "wrist_left",
            Landmark::WristRight => "wrist_right",
            Landmark::ThighLeft => "thigh_left",
            Landmark::ThighRight => "thigh_right",
            Landmark::CalfLeft => "calf_left",
            Landmark::CalfRight => "calf_right",
            Landmark::AnkleLeft => "ankle_left",
            Landmark::AnkleRight => "ankle_right",
        }
    }

    /// The landmark in words, for screens and tables.
    pub fn label(self) -> &'static str {
        match self {
            Landmark::Heart => "heart reference (phlebostatic axis)",
            Landmark::Tragus => "tragus (ear level)",
            Landmark::Vertex => "vertex (top of the head)",
            Landmark::PosteriorFossa => "posterior fossa (back of the head)",
            Landmark::ShoulderLeft => "left shoulder",
            Landmark::ShoulderRight => "right shoulder",
            Landmark::EyeLeft => "left eye",
            Landmark::EyeRight => "right eye",
            Landmark::CordCervical => "cervical cord (C5)",
            Landmark::CordThoracic => "thoracic cord (T6)",
            Landmark::CordLumbar => "lumbar cord (L1)",
            Landmark::IliacCrest => "iliac crest, mid-axillary line",
            Landmark::KidneyLeft => "left kidney",
            Landmark::KidneyRight => "right kidney",
            Landmark::UpperArmLeft => "left upper arm",
            Landmark::UpperArmRight => "right upper arm",
            Landmark::WristLeft => "left wrist",
            Landmark::WristRight => "right wrist",
            Landmark::ThighLeft => "left thigh",
            Landmark::ThighRight => "right thigh",
            Landmark::CalfLeft => "left calf",
            Landmark::CalfRight => "right calf",
            Landmark::AnkleLeft => "left ankle",
            Landmark::AnkleRight => "right ankle",
        }
    }

    /// The side of the body, for paired landmarks.
    pub fn side(self) -> Option<Side> {
        use Landmark::*;
        match self {
            EyeLeft | ShoulderLeft | KidneyLeft | UpperArmLeft | WristLeft | ThighLeft
            | CalfLeft | AnkleLeft => Some(Side::Left),
            EyeRight | ShoulderRight | KidneyRight | UpperArmRight | WristRight | ThighRight
            | CalfRight | AnkleRight => Some(Side::Right),
            Heart | Vertex | Tragus | PosteriorFossa | CordCervical | CordThoracic | CordLumbar
            | IliacCrest => None,
        }
    }

    /// Whether the landmark is on a limb (where a cuff or a compartment
    /// pressure can be taken).
    pub fn is_limb(self) -> bool {
        use Landmark::*;
        matches!(
            self,
            UpperArmLeft
                | UpperArmRight
                | WristLeft
                | WristRight
                | ThighLeft
                | ThighRight
                | CalfLeft
                | CalfRight
                | AnkleLeft
                | AnkleRight
        )
    }

    /// Whether the landmark is an eye.
    pub fn is_eye(self) -> bool {
        matches!(self, Landmark::EyeLeft | Landmark::EyeRight)
    }

    /// Whether the landmark is a cord level.
    pub fn is_cord(self) -> bool {
        matches!(
            self,
            Landmark::CordCervical | Landmark::CordThoracic | Landmark::CordLumbar
        )
    }

    /// Whether the landmark is a kidney.
    pub fn is_kidney(self) -> bool {
        matches!(self, Landmark::KidneyLeft | Landmark::KidneyRight)
    }

    /// Whether the landmark is on an upper arm, where population formulas
    /// for the eye assume the pressure was taken.
    pub fn is_upper_arm(self) -> bool {
        matches!(self, Landmark::UpperArmLeft | Landmark::UpperArmRight)
    }
}

impl fmt::Display for Landmark {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn keys_match_the_case_file_names() {
        for landmark in Landmark::ALL {
            let json = serde_json::to_string(&landmark).unwrap();
            assert_eq!(json, format!("\"{}\"", landmark.key()));
            let back: Landmark = serde_json::from_str(&json).unwrap();
            assert_eq!(back, landmark);
        }
    }

    #[test]
    fn paired_landmarks_have_a_side() {
        for landmark in Landmark::ALL {
            let has_side = landmark.side().is_some();
            let named = landmark.key().ends_with("_left") || landmark.key().ends_with("_right");
            assert_eq!(has_side, named, "{landmark}");
        }
    }
}

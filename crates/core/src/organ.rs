//! The organs the tool checks, and the quantities ("metrics") computed for each.
//!
//! Perfusion pressure is inflow minus outflow, both at the organ's own
//! height. Each organ names the landmark it is checked at, and the metrics
//! that belong to it; the formulas live in [`crate::evaluate`].

use std::fmt;

use serde::{Deserialize, Serialize};

use crate::landmark::Landmark;

/// An organ or region whose perfusion is checked.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Organ {
    /// Brain: CPP = MAP at the tragus − max(ICP, venous pressure there).
    Brain,
    /// Spinal cord: SCPP = MAP at the cord − max(CSF pressure, venous pressure there).
    Cord,
    /// Abdomen: APP = MAP − IAP at the IAP zero, filtration gradient, IAH grade.
    Abdomen,
    /// Kidney: MAP − max(CVP, IAP) at the kidney.
    Kidney,
    /// Heart with a beating circulation: aortic diastolic − LVEDP.
    Heart,
    /// Heart during CPR: aortic − right-atrial relaxation pressure.
    HeartCpr,
    /// Eye: MAP at the eye − IOP; and the seated population formulas.
    Eye,
    /// Limb compartment: diastolic at the compartment − compartment pressure.
    Limb,
    /// Whole body: MAP at the heart, and MAP − CVP.
    WholeBody,
}

impl Organ {
    /// Every organ, in the order results are shown.
    pub const ALL: [Organ; 9] = [
        Organ::Brain,
        Organ::Cord,
        Organ::Eye,
        Organ::Heart,
        Organ::HeartCpr,
        Organ::Abdomen,
        Organ::Kidney,
        Organ::Limb,
        Organ::WholeBody,
    ];

    /// The name used in case files.
    pub fn key(self) -> &'static str {
        match self {
            Organ::Brain => "brain",
            Organ::Cord => "cord",
            Organ::Abdomen => "abdomen",
            Organ::Kidney => "kidney",
            Organ::Heart => "heart",
            Organ::HeartCpr => "heart_cpr",
            Organ::Eye => "eye",
            Organ::Limb => "limb",
            Organ::WholeBody => "whole_body",
        }
    }

    /// The organ in words.
    pub fn label(self) -> &'static str {
        match self {
            Organ::Brain => "Brain",
            Organ::Cord => "Spinal cord",
            Organ::Abdomen => "Abdomen",
            Organ::Kidney => "Kidney",
            Organ::Heart => "Heart",
            Organ::HeartCpr => "Heart during CPR",
            Organ::Eye => "Eye",
            Organ::Limb => "Limb compartment",
            Organ::WholeBody => "Whole body",
        }
    }

    /// The metrics computed for this organ, main one first.
    pub fn metrics(self) -> &'static [Metric] {
        match self {
            Organ::Brain | Organ::Cord => &[Metric::Perfusion, Metric::Inflow, Metric::Surrounding],
            Organ::Abdomen => &[
                Metric::Perfusion,
                Metric::FiltrationGradient,
                Metric::Surrounding,
            ],
            Organ::Kidney | Organ::Heart | Organ::HeartCpr | Organ::Limb => &[Metric::Perfusion],
            Organ::Eye => &[
                Metric::Perfusion,
                Metric::PopulationMean,
                Metric::PopulationDiastolic,
            ],
            Organ::WholeBody => &[Metric::Inflow, Metric::Perfusion],
        }
    }

    /// Which landmarks the organ's level may be set to, when it can move.
    pub fn level_choices(self) -> &'static [Landmark] {
        use Landmark::*;
        match self {
            Organ::Cord => &[CordCervical, CordThoracic, CordLumbar],
            Organ::Kidney => &[KidneyLeft, KidneyRight],
            Organ::Eye => &[EyeLeft, EyeRight],
            Organ::Limb => &[
                UpperArmLeft,
                UpperArmRight,
                WristLeft,
                WristRight,
                ThighLeft,
                ThighRight,
                CalfLeft,
                CalfRight,
                AnkleLeft,
                AnkleRight,
            ],
            Organ::Brain => &[Tragus, Vertex],
            Organ::Abdomen => &[IliacCrest],
            Organ::Heart | Organ::HeartCpr | Organ::WholeBody => &[Heart],
        }
    }

    /// The short name of a metric of this organ, as clinicians say it.
    pub fn metric_label(self, metric: Metric) -> &'static str {
        match (self, metric) {
            (Organ::Brain, Metric::Perfusion) => "CPP",
            (Organ::Brain, Metric::Surrounding) => "ICP",
            (Organ::Cord, Metric::Perfusion) => "SCPP",
            (Organ::Cord, Metric::Surrounding) => "CSF pressure",
            (Organ::Abdomen, Metric::Perfusion) => "APP",
            (Organ::Abdomen, Metric::Surrounding) => "IAP",
            (_, Metric::FiltrationGradient) => "filtration gradient (MAP − 2 × IAP)",
            (Organ::Kidney, Metric::Perfusion) => "renal perfusion pressure",
            (Organ::Heart, Metric::Perfusion) => "coronary perfusion pressure",
            (Organ::HeartCpr, Metric::Perfusion) => "coronary perfusion pressure (CPR)",
            (Organ::Eye, Metric::Perfusion) => "ocular perfusion pressure at eye level",
            (_, Metric::PopulationMean) => "mean OPP, population formula (2/3 MAP − IOP)",
            (_, Metric::PopulationDiastolic) => "diastolic OPP, population formula (DBP − IOP)",
            (Organ::Limb, Metric::Perfusion) => "ΔP (diastolic − compartment)",
            (Organ::WholeBody, Metric::Perfusion) => "MAP − CVP",
            (Organ::WholeBody, Metric::Inflow) => "MAP at the heart",
            (Organ::Brain, Metric::Inflow) => "MAP at brain level",
            (Organ::Cord, Metric::Inflow) => "MAP at cord level",
            (_, Metric::Inflow) => "MAP at organ level",
            (_, Metric::Surrounding) => "surrounding pressure",
        }
    }
}

impl fmt::Display for Organ {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

/// A quantity computed for an organ.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Metric {
    /// Inflow minus outflow at the organ's height (CPP, SCPP, APP, ...).
    Perfusion,
    /// Mean arterial pressure brought to the organ's height.
    Inflow,
    /// The pressure around the organ's veins (ICP, CSF, IAP) at its height.
    Surrounding,
    /// MAP − 2 × IAP (WSACS 2013).
    FiltrationGradient,
    /// 2/3 × MAP at the arm − IOP: the population formula for seated patients.
    PopulationMean,
    /// Diastolic at the arm − IOP: its diastolic companion.
    PopulationDiastolic,
}

impl Metric {
    /// The name used in case files.
    pub fn key(self) -> &'static str {
        match self {
            Metric::Perfusion => "perfusion",
            Metric::Inflow => "inflow",
            Metric::Surrounding => "surrounding",
            Metric::FiltrationGradient => "filtration_gradient",
            Metric::PopulationMean => "population_mean",
            Metric::PopulationDiastolic => "population_diastolic",
        }
    }
}

impl fmt::Display for Metric {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_organ_has_a_main_metric_and_a_level() {
        for organ in Organ::ALL {
            assert!(!organ.metrics().is_empty(), "{organ}");
            assert!(!organ.level_choices().is_empty(), "{organ}");
        }
    }

    #[test]
    fn metric_labels_are_specific() {
        for organ in Organ::ALL {
            for metric in organ.metrics() {
                let label = organ.metric_label(*metric);
                assert_ne!(label, "surrounding pressure", "{organ} {metric}");
            }
        }
    }
}

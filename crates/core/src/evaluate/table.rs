//! The one table of formulas: for every organ and metric, what flows in,
//! which back pressures compete for the outflow, how many times it is
//! subtracted, and where the pressures are referred to before they are
//! combined — at the organ's own height, or at the zeros of the metric's
//! published definition — with the zero each judged value assumes.
//!
//! Definitions belong to their studies: APP and the renal threshold were
//! defined with MAP at the heart in supine patients, the CSF-drain limit of
//! aortic repair at the drain's own zero, CPP with the arterial line at the
//! tragus by one joint statement and at the heart in many units. A metric
//! is judged in the frame of the threshold's own source, and the other
//! frame is shown beside it when the two differ.

use serde::Serialize;

use crate::organ::{Metric, Organ};
use crate::reading::{Component, Quantity};

/// Where a metric's pressures are referred to before they are combined.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Frame {
    /// Every pressure carried to the organ's own height: the physics.
    OrganLevel,
    /// Every pressure at the zero of the metric's published definition:
    /// the arterial pressure at the heart reference, ICP at the tragus,
    /// IAP at the mid-axillary line at the iliac crest, CVP and LVEDP at
    /// the heart, a CSF drain or a tissue pressure as read at its own zero.
    /// What a monitor shows when its lines are zeroed that way.
    Convention,
}

/// What flows in.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Lead {
    /// A component of an arterial source.
    Arterial(Component),
    /// A reading of its own (a surrounding pressure, the aortic relaxation
    /// pressure during CPR).
    Reading(Quantity),
    /// An upper-arm reading as measured in a seated patient, for the eye's
    /// population formulas.
    PopulationArm(Component),
}

/// A metric's formula in one frame: `lead − factor × max(back)`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Formula {
    /// What flows in.
    pub lead: Lead,
    /// The back-pressure candidates, each `true` where the metric needs it.
    pub back: &'static [(Quantity, bool)],
    /// How many times the back pressure is subtracted.
    pub factor: f64,
}

/// One row of the table: an organ's metric in both frames.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Row {
    /// The organ.
    pub organ: Organ,
    /// The metric.
    pub metric: Metric,
    /// The frame its targets are judged in.
    pub judged: Frame,
    /// The formula with every pressure at the organ's height.
    pub at_organ: Formula,
    /// The formula at the definition's zeros, where it differs.
    pub by_convention: Option<Formula>,
    /// The zero the judged value assumes, in words, with its source.
    pub zero: &'static str,
    /// What the value in the other frame is, in words.
    pub beside: &'static str,
}

impl Row {
    /// The formula in `frame`, if the metric has one there.
    pub fn formula(&self, frame: Frame) -> Option<Formula> {
        match frame {
            Frame::OrganLevel => Some(self.at_organ),
            Frame::Convention => self.by_convention,
        }
    }

    /// The frame shown beside the judged one, if any.
    pub fn other_frame(&self) -> Option<Frame> {
        self.by_convention.map(|_| match self.judged {
            Frame::OrganLevel => Frame::Convention,
            Frame::Convention => Frame::OrganLevel,
        })
    }
}

use Component::{Diastolic, Mean};
use Quantity::{Compartment, CprAorticRelaxation, CprRightAtrialRelaxation, Csf, Cvp, Iap, Icp};
use Quantity::{Iop, Lvedp};

const fn f(lead: Lead, back: &'static [(Quantity, bool)], factor: f64) -> Formula {
    Formula { lead, back, factor }
}

const MAP: Lead = Lead::Arterial(Mean);

/// Every organ's metrics, in the order of [`Organ::ALL`] and
/// [`Organ::metrics`].
pub const TABLE: [Row; 18] = [
    Row {
        organ: Organ::Brain,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[(Icp, true), (Cvp, false)], 1.0),
        by_convention: Some(f(MAP, &[(Icp, true)], 1.0)),
        zero: "MAP at the brain's own level (the tragus, or the vertex when chosen), as with the \
               arterial line levelled at the tragus (joint statement of the UK neuro-anaesthesia \
               and neurosurgical societies, Br J Anaesth 2015)",
        beside: "a monitor's MAP − ICP with the line zeroed at the heart",
    },
    Row {
        organ: Organ::Brain,
        metric: Metric::Inflow,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[], 1.0),
        by_convention: None,
        zero: "MAP carried to the brain's own level",
        beside: "",
    },
    Row {
        organ: Organ::Brain,
        metric: Metric::Surrounding,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::Reading(Icp), &[], 1.0),
        by_convention: None,
        zero: "ICP at its zero, the tragus",
        beside: "",
    },
    Row {
        organ: Organ::Cord,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[(Csf, true), (Cvp, false)], 1.0),
        by_convention: Some(f(MAP, &[(Csf, true)], 1.0)),
        zero: "MAP and CSF pressure both carried to the cord",
        beside: "MAP with the line at the heart − CSF pressure as read at the drain",
    },
    Row {
        organ: Organ::Cord,
        metric: Metric::Inflow,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[], 1.0),
        by_convention: None,
        zero: "MAP carried to the cord's own level",
        beside: "",
    },
    Row {
        organ: Organ::Cord,
        metric: Metric::Surrounding,
        judged: Frame::Convention,
        at_organ: f(Lead::Reading(Csf), &[], 1.0),
        by_convention: Some(f(Lead::Reading(Csf), &[], 1.0)),
        zero: "CSF pressure as read at the drain's own zero, as the aortic-repair studies read \
               it (Coselli et al. 2002)",
        beside: "CSF pressure carried to the cord",
    },
    Row {
        organ: Organ::Eye,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[(Iop, true)], 1.0),
        by_convention: None,
        zero: "MAP carried to the eye, IOP as measured there",
        beside: "",
    },
    Row {
        organ: Organ::Eye,
        metric: Metric::PopulationMean,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::PopulationArm(Mean), &[(Iop, true)], 1.0),
        by_convention: None,
        zero: "an upper-arm reading as measured in a seated patient, with no height correction: \
               the population formula allows for it (Tielsch et al. 1995)",
        beside: "",
    },
    Row {
        organ: Organ::Eye,
        metric: Metric::PopulationDiastolic,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::PopulationArm(Diastolic), &[(Iop, true)], 1.0),
        by_convention: None,
        zero: "an upper-arm reading as measured in a seated patient, with no height correction: \
               the population formula allows for it (Tielsch et al. 1995)",
        beside: "",
    },
    Row {
        organ: Organ::Heart,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::Arterial(Diastolic), &[(Lvedp, true)], 1.0),
        by_convention: None,
        zero: "aortic diastolic pressure and LVEDP at the heart reference",
        beside: "",
    },
    Row {
        organ: Organ::HeartCpr,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(
            Lead::Reading(CprAorticRelaxation),
            &[(CprRightAtrialRelaxation, true)],
            1.0,
        ),
        by_convention: None,
        zero: "both relaxation-phase pressures at the heart reference (Paradis et al. 1990)",
        beside: "",
    },
    Row {
        organ: Organ::Abdomen,
        metric: Metric::Perfusion,
        judged: Frame::Convention,
        at_organ: f(MAP, &[(Iap, true)], 1.0),
        by_convention: Some(f(MAP, &[(Iap, true)], 1.0)),
        zero: "MAP at the heart reference − IAP at its zero (mid-axillary line at the iliac \
               crest), as defined for supine patients (Malbrain et al. 2006)",
        beside: "MAP and IAP both at the iliac crest",
    },
    Row {
        organ: Organ::Abdomen,
        metric: Metric::FiltrationGradient,
        judged: Frame::Convention,
        at_organ: f(MAP, &[(Iap, true)], 2.0),
        by_convention: Some(f(MAP, &[(Iap, true)], 2.0)),
        zero: "MAP at the heart reference − 2 × IAP at its zero, as defined (WSACS 2013)",
        beside: "MAP and IAP both at the iliac crest",
    },
    Row {
        organ: Organ::Abdomen,
        metric: Metric::Surrounding,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::Reading(Iap), &[], 1.0),
        by_convention: None,
        zero: "IAP at its zero, the mid-axillary line at the iliac crest (WSACS 2013)",
        beside: "",
    },
    Row {
        organ: Organ::Kidney,
        metric: Metric::Perfusion,
        judged: Frame::Convention,
        at_organ: f(MAP, &[(Cvp, false), (Iap, false)], 1.0),
        by_convention: Some(f(MAP, &[(Cvp, true)], 1.0)),
        zero: "MAP − CVP, both at the heart reference, as in the study behind the threshold \
               (BMC Nephrol 2017)",
        beside: "at the kidney: MAP there − the higher of CVP and IAP there",
    },
    Row {
        organ: Organ::Limb,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(Lead::Arterial(Diastolic), &[(Compartment, true)], 1.0),
        by_convention: Some(f(Lead::Arterial(Diastolic), &[(Compartment, true)], 1.0)),
        zero: "diastolic pressure carried to the compartment, compartment pressure as measured \
               there",
        beside: "diastolic at the heart reference − compartment pressure",
    },
    Row {
        organ: Organ::WholeBody,
        metric: Metric::Inflow,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[], 1.0),
        by_convention: None,
        zero: "MAP at the heart reference",
        beside: "",
    },
    Row {
        organ: Organ::WholeBody,
        metric: Metric::Perfusion,
        judged: Frame::OrganLevel,
        at_organ: f(MAP, &[(Cvp, true)], 1.0),
        by_convention: None,
        zero: "MAP − CVP at the heart reference",
        beside: "",
    },
];

/// The row of an organ's metric; `None` for a metric the organ does not
/// have.
pub fn row(organ: Organ, metric: Metric) -> Option<&'static Row> {
    TABLE
        .iter()
        .find(|r| r.organ == organ && r.metric == metric)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_metric_of_every_organ_has_one_row() {
        let mut rows = 0;
        for organ in Organ::ALL {
            for metric in organ.metrics() {
                let n = TABLE
                    .iter()
                    .filter(|r| r.organ == organ && r.metric == *metric)
                    .count();
                assert_eq!(n, 1, "{organ} {metric}");
                rows += 1;
            }
        }
        assert_eq!(rows, TABLE.len());
    }

    #[test]
    fn a_metric_judged_by_convention_has_a_convention_formula() {
        for r in TABLE {
            assert!(r.formula(r.judged).is_some(), "{} {}", r.organ, r.metric);
            assert_eq!(r.other_frame().is_some(), !r.beside.is_empty());
            assert!(!r.zero.is_empty());
        }
    }
}

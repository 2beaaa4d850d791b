//! Targets: the unit's thresholds, absolute or relative to the patient's
//! baseline, each with the guideline it comes from.
//!
//! The defaults are starting points drawn from published guidance; every
//! unit sets its own, and the screen shows where each one came from.

use serde::{Deserialize, Serialize};

use crate::error::{Error, ErrorKind, Errors};
use crate::organ::{Metric, Organ};
use crate::units::{mmhg, to_mmhg, Pressure, PressureEntry};

/// What a target demands of its metric.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Bound {
    /// The metric must be at least this.
    AtLeast(Pressure),
    /// The metric must be at most this (ICP, CSF pressure).
    AtMost(Pressure),
    /// The metric must be at least this percentage of the same metric at
    /// baseline, both at organ level.
    AtLeastPercentOfBaseline(f64),
}

/// Percentages of baseline a relative target may ask for.
pub const PERCENT_OF_BASELINE_RANGE: (f64, f64) = (50.0, 100.0);

/// One target for one metric of one organ.
#[derive(Clone, Debug, PartialEq)]
pub struct Target {
    /// The organ.
    pub organ: Organ,
    /// The metric the bound applies to.
    pub metric: Metric,
    /// The bound.
    pub bound: Bound,
    /// Where the target comes from: the guideline or study, with its tag.
    pub citation: String,
}

impl Target {
    /// The target in words, e.g. "CPP at least 60 mmHg".
    pub fn describe(&self) -> String {
        let name = self.organ.metric_label(self.metric);
        match self.bound {
            Bound::AtLeast(p) => format!("{name} at least {:.0} mmHg", to_mmhg(p)),
            Bound::AtMost(p) => format!("{name} at most {:.0} mmHg", to_mmhg(p)),
            Bound::AtLeastPercentOfBaseline(pct) => {
                format!("{name} at least {pct:.0}% of baseline")
            }
        }
    }
}

/// A target as written in a case file: exactly one of the three bounds.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TargetSpec {
    /// The organ.
    pub organ: Organ,
    /// The metric; the organ's main metric when left out.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub metric: Option<Metric>,
    /// A lower bound.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub at_least: Option<PressureEntry>,
    /// An upper bound.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub at_most: Option<PressureEntry>,
    /// A lower bound relative to baseline, in percent.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub at_least_percent_of_baseline: Option<f64>,
    /// Where the target comes from (`source` in the document).
    #[serde(default, rename = "source", skip_serializing_if = "Option::is_none")]
    pub citation: Option<String>,
}

impl TargetSpec {
    /// The spec of a resolved target, for writing defaults into a case.
    pub fn from_target(target: &Target) -> Self {
        let mut spec = TargetSpec {
            organ: target.organ,
            metric: Some(target.metric),
            at_least: None,
            at_most: None,
            at_least_percent_of_baseline: None,
            citation: Some(target.citation.clone()),
        };
        match target.bound {
            Bound::AtLeast(p) => spec.at_least = Some(PressureEntry::mmhg(to_mmhg(p))),
            Bound::AtMost(p) => spec.at_most = Some(PressureEntry::mmhg(to_mmhg(p))),
            Bound::AtLeastPercentOfBaseline(pct) => spec.at_least_percent_of_baseline = Some(pct),
        }
        spec
    }

    /// Checks the spec and returns the target.
    ///
    /// # Errors
    /// No bound or more than one, a metric the organ does not have, a bound
    /// outside 0-250 mmHg, or a percentage outside 50-100.
    pub fn resolve(&self, field: &str) -> Result<Target, Errors> {
        let mut errors = Errors::default();
        let metric = self.metric.unwrap_or_else(|| {
            self.organ
                .metrics()
                .first()
                .copied()
                .unwrap_or(Metric::Perfusion)
        });
        if !self.organ.metrics().contains(&metric) {
            errors.push(Error::not_applicable(
                format!("{field}.metric"),
                format!(
                    "{} has no metric '{metric}'; it has {}",
                    self.organ.label(),
                    self.organ
                        .metrics()
                        .iter()
                        .map(|m| m.key())
                        .collect::<Vec<_>>()
                        .join(", ")
                ),
            ));
        }
        let pressure_bound = |name: &str, entry: PressureEntry, errors: &mut Errors| {
            let p = entry.pressure();
            if !(0.0..=250.0).contains(&to_mmhg(p)) {
                errors.push(Error::new(
                    format!("{field}.{name}"),
                    ErrorKind::OutOfRange {
                        value: entry.to_string(),
                        min: "0 mmHg".into(),
                        max: "250 mmHg".into(),
                        hint: None,
                    },
                ));
            }
            p
        };
        let bounds: Vec<Bound> = [
            self.at_least
                .map(|e| Bound::AtLeast(pressure_bound("at_least", e, &mut errors))),
            self.at_most
                .map(|e| Bound::AtMost(pressure_bound("at_most", e, &mut errors))),
            self.at_least_percent_of_baseline.map(|pct| {
                let (lo, hi) = PERCENT_OF_BASELINE_RANGE;
                if !(pct.is_finite() && (lo..=hi).contains(&pct)) {
                    errors.push(Error::new(
                        format!("{field}.at_least_percent_of_baseline"),
                        ErrorKind::OutOfRange {
                            value: format!("{pct}%"),
                            min: format!("{lo}%"),
                            max: format!("{hi}%"),
                            hint: None,
                        },
                    ));
                }
                Bound::AtLeastPercentOfBaseline(pct)
            }),
        ]
        .into_iter()
        .flatten()
        .collect();
        let bound = match bounds.as_slice() {
            [one] => Some(*one),
            [] => {
                errors.push(Error::missing(
                    field,
                    "a target needs one of at_least, at_most or at_least_percent_of_baseline",
                ));
                None
            }
            _ => {
                errors.push(Error::inconsistent(
                    field,
                    "a target takes only one of at_least, at_most or at_least_percent_of_baseline; \
                     write two targets instead",
                ));
                None
            }
        };
        if matches!(bound, Some(Bound::AtLeastPercentOfBaseline(_))) && metric != Metric::Inflow {
            errors.push(Error::not_applicable(
                format!("{field}.metric"),
                "targets relative to baseline apply to the inflow metric (MAP at organ level)",
            ));
        }
        match bound {
            Some(bound) if errors.is_empty() => Ok(Target {
                organ: self.organ,
                metric,
                bound,
                citation: self
                    .citation
                    .clone()
                    .unwrap_or_else(|| "set in the case".to_owned()),
            }),
            _ => Err(errors),
        }
    }
}

fn target(organ: Organ, metric: Metric, bound: Bound, citation: &str) -> Target {
    Target {
        organ,
        metric,
        bound,
        citation: citation.to_owned(),
    }
}

/// The default targets with their sources. Every one is a starting point to
/// be replaced by the unit's own protocol. The brain has a target on its
/// own-level MAP (absolute and relative to baseline) as well as CPP, so it
/// is judged when no ICP is measured, as in the beach chair.
pub fn defaults() -> Vec<Target> {
    use Bound::*;
    use Metric::*;
    vec![
        target(
            Organ::Brain,
            Perfusion,
            AtLeast(mmhg(60.0)),
            "Brain Trauma Foundation guidelines, 4th edition (Carney et al., Neurosurgery \
             2017): CPP 60-70 mmHg",
        ),
        target(
            Organ::Brain,
            Surrounding,
            AtMost(mmhg(22.0)),
            "Brain Trauma Foundation guidelines, 4th edition (Carney et al., Neurosurgery \
             2017): treat ICP above 22 mmHg",
        ),
        target(
            Organ::Brain,
            Inflow,
            AtLeast(mmhg(70.0)),
            "lower limit of cerebral autoregulation probably around 70 mmHg MAP in many adults, \
             with wide individual spread (Drummond, Anesthesiology 1997, editorial; from memory)",
        ),
        target(
            Organ::Brain,
            Inflow,
            AtLeastPercentOfBaseline(80.0),
            "beach-chair safety advice: correct the pressure to head level and limit its fall \
             from baseline (APSF Newsletter 2009 correspondence); the 20% limit is common \
             practice",
        ),
        target(
            Organ::Cord,
            Perfusion,
            AtLeast(mmhg(80.0)),
            "spinal cord protection in aortic repair, ACC/AHA aortic disease guideline (2022, \
             from memory); confirm against local protocol",
        ),
        target(
            Organ::Cord,
            Surrounding,
            AtMost(mmhg(10.0)),
            "Coselli et al., J Vasc Surg 2002: CSF pressure kept at or below 10 mmHg in aortic \
             repair, read at the drain's own zero",
        ),
        target(
            Organ::Abdomen,
            Perfusion,
            AtLeast(mmhg(60.0)),
            "Malbrain et al., Intensive Care Med 2006 (international consensus definitions): \
             APP = MAP − IAP, at least 60 mmHg proposed as an end point; the 2013 update made \
             no recommendation on APP",
        ),
        target(
            Organ::Kidney,
            Perfusion,
            AtLeast(mmhg(60.0)),
            "renal perfusion pressure MAP − CVP below 60 mmHg associated with worsening acute \
             kidney injury (BMC Nephrol 2017;18:146)",
        ),
        target(
            Organ::HeartCpr,
            Perfusion,
            AtLeast(mmhg(15.0)),
            "Paradis et al., JAMA 1990: return of circulation seen only at 15 mmHg or more",
        ),
        target(
            Organ::Eye,
            PopulationMean,
            AtLeast(mmhg(42.0)),
            "Leske et al., Arch Ophthalmol 2002: glaucoma risk about 3-fold at 42 mmHg or below \
             (a population risk marker, not an acute target)",
        ),
        target(
            Organ::Eye,
            PopulationDiastolic,
            AtLeast(mmhg(55.0)),
            "Leske et al., Arch Ophthalmol 2002: glaucoma risk about 3-fold at 55 mmHg or below \
             (a population risk marker, not an acute target)",
        ),
        target(
            Organ::Limb,
            Perfusion,
            AtLeast(mmhg(30.0)),
            "McQueen and Court-Brown, J Bone Joint Surg Br 1996: ΔP below 30 mmHg suggests \
             compartment syndrome",
        ),
        target(
            Organ::WholeBody,
            Inflow,
            AtLeast(mmhg(65.0)),
            "Surviving Sepsis Campaign 2021: initial MAP target 65 mmHg",
        ),
        target(
            Organ::WholeBody,
            Inflow,
            AtLeastPercentOfBaseline(80.0),
            "Salmasi et al., Anesthesiology 2017: MAP more than 20% below baseline linked to \
             kidney and myocardial injury",
        ),
    ]
}

/// How a value, an organ or a stretch of record stands against its
/// targets. Decided once, here in the core; front ends only show it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Status {
    /// Every evaluated bound is met.
    Met,
    /// Below a lower bound.
    Below,
    /// Above an upper bound.
    Above,
    /// A record target whose readings were never observed in the window.
    NotObserved,
    /// Nothing could be evaluated: an input is missing (the reason is given
    /// beside the status).
    NotEvaluated,
}

impl Status {
    /// The status in a sentence: "met", "below", "not evaluated".
    pub fn label(self) -> &'static str {
        match self {
            Status::Met => "met",
            Status::Below => "below",
            Status::Above => "above",
            Status::NotObserved => "not observed",
            Status::NotEvaluated => "not evaluated",
        }
    }

    /// The status as a badge: "MET", "BELOW", "NOT EVALUATED".
    pub fn badge(self) -> &'static str {
        match self {
            Status::Met => "MET",
            Status::Below => "BELOW",
            Status::Above => "ABOVE",
            Status::NotObserved => "NOT OBSERVED",
            Status::NotEvaluated => "NOT EVALUATED",
        }
    }

    /// Whether a bound is missed.
    pub fn is_missed(self) -> bool {
        matches!(self, Status::Below | Status::Above)
    }

    /// Whether the status is a verdict on values (met, below, above) rather
    /// than the absence of one.
    pub fn is_judged(self) -> bool {
        matches!(self, Status::Met | Status::Below | Status::Above)
    }
}

/// The verdict of a value against a threshold.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Verdict {
    /// The status: met, below or above.
    pub status: Status,
    /// How far inside the bound the value is: positive meets, negative fails.
    pub margin: Pressure,
}

/// Margins within this of zero count as on the bound, which meets it. Far
/// below any pressure resolution, it absorbs the rounding of unit
/// conversions: 82 mmHg − 22 mmHg through pascals is 59.99999999999999.
pub const ON_THE_BOUND_MMHG: f64 = 1e-9;

/// The verdict of `value` against a lower (`at_least`) or upper bound. A
/// value on the bound meets it.
pub fn judge(value: Pressure, threshold: Pressure, at_least: bool) -> Verdict {
    let margin = if at_least {
        value - threshold
    } else {
        threshold - value
    };
    let status = if to_mmhg(margin) >= -ON_THE_BOUND_MMHG {
        Status::Met
    } else if at_least {
        Status::Below
    } else {
        Status::Above
    };
    Verdict { status, margin }
}

/// The IAH grade of an IAP (WSACS 2013).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct IahGrade {
    /// 0 for none, else I-IV as 1-4.
    pub grade: u8,
    /// The grade in words with its caveats.
    pub words: String,
}

/// Grades an IAP at its reference level (WSACS consensus, Kirkpatrick et al.
/// 2013): I 12-15, II 16-20, III 21-25, IV above 25 mmHg. Values between the
/// whole numbers of the published bands go to the lower grade (15.5 is I).
pub fn iah_grade(iap: Pressure) -> IahGrade {
    let v = to_mmhg(iap);
    let (grade, band) = if v < 12.0 {
        (0, "below 12 mmHg: no intra-abdominal hypertension")
    } else if v < 16.0 {
        (1, "IAH grade I (12-15 mmHg)")
    } else if v < 21.0 {
        (2, "IAH grade II (16-20 mmHg)")
    } else if v <= 25.0 {
        (3, "IAH grade III (21-25 mmHg)")
    } else {
        (4, "IAH grade IV (above 25 mmHg)")
    };
    let mut words = band.to_owned();
    if grade > 0 {
        words.push_str("; grades apply to a sustained or repeated IAP");
    }
    if v > 20.0 {
        words.push_str(
            "; above 20 mmHg with new organ dysfunction is abdominal compartment syndrome",
        );
    }
    IahGrade { grade, words }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn defaults_resolve_through_their_own_specs() {
        for t in defaults() {
            let spec = TargetSpec::from_target(&t);
            let back = spec.resolve("targets[0]").unwrap();
            assert_eq!(back.organ, t.organ);
            assert_eq!(back.metric, t.metric);
            assert!(t.organ.metrics().contains(&t.metric));
        }
    }

    #[test]
    fn spec_needs_exactly_one_bound() {
        let mut spec = TargetSpec {
            organ: Organ::Brain,
            metric: None,
            at_least: None,
            at_most: None,
            at_least_percent_of_baseline: None,
            citation: None,
        };
        assert!(spec.resolve("t").is_err());
        spec.at_least = Some(PressureEntry::mmhg(60.0));
        assert_eq!(spec.resolve("t").unwrap().metric, Metric::Perfusion);
        spec.at_most = Some(PressureEntry::mmhg(90.0));
        assert!(spec.resolve("t").is_err());
    }

    #[test]
    fn relative_targets_belong_to_inflow() {
        let spec = TargetSpec {
            organ: Organ::Brain,
            metric: Some(Metric::Perfusion),
            at_least: None,
            at_most: None,
            at_least_percent_of_baseline: Some(80.0),
            citation: None,
        };
        let errors = spec.resolve("targets[2]").unwrap_err();
        assert!(errors.iter().any(|e| e.field() == "targets[2].metric"));
    }

    #[test]
    fn judge_gives_margin_with_the_right_sign() {
        let v = judge(mmhg(55.0), mmhg(60.0), true);
        assert_eq!(v.status, Status::Below);
        assert!((to_mmhg(v.margin) + 5.0).abs() < 1e-9);
        let v = judge(mmhg(25.0), mmhg(22.0), false);
        assert_eq!(v.status, Status::Above);
        let v = judge(mmhg(60.0), mmhg(60.0), true);
        assert_eq!(v.status, Status::Met);
    }

    #[test]
    fn a_difference_that_lands_on_the_bound_meets_it() {
        // 82 − 22 and 27 − 12 come back from pascals a few ulps short of 60
        // and 15; a CPP of exactly 60 is not below a floor of 60.
        let cpp = mmhg(82.0) - mmhg(22.0);
        assert!(to_mmhg(cpp) < 60.0, "the rounding this guards against");
        assert_eq!(judge(cpp, mmhg(60.0), true).status, Status::Met);
        let cpr = mmhg(27.0) - mmhg(12.0);
        assert_eq!(judge(cpr, mmhg(15.0), true).status, Status::Met);
        let csf = mmhg(22.0) - mmhg(12.0);
        assert_eq!(judge(csf, mmhg(10.0), false).status, Status::Met);
        assert_eq!(judge(mmhg(59.999), mmhg(60.0), true).status, Status::Below);
        assert_eq!(judge(mmhg(10.001), mmhg(10.0), false).status, Status::Above);
    }
}

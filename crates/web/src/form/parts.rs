//! The repeated parts of the form: levels, arterial sources, other
//! readings, assumed values and targets.
//!
//! Each part turns its boxes into the case document's own spec type and
//! names every unreadable box by its document path, so the message lands
//! beside the box it is about.

use plumbline_core::case::{ArterialSpec, AssumedSpec, ReadingSpec};
use plumbline_core::error::{Error, ErrorKind, Errors};
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::{Level, Method, Quantity};
use plumbline_core::target::TargetSpec;
use plumbline_core::units::{LengthUnit, PressureEntry, PressureUnit, QuantityTextError};
use plumbline_core::usual::{first_level, method_for, unit_for};

use serde::{Deserialize, Serialize};

use crate::fields::{number, number_text, LengthText, PressureText};

/// Records why `result` could not be read, at `path`.
pub fn read<T, E: std::fmt::Display>(
    result: Result<Option<T>, E>,
    path: &str,
    errors: &mut Errors,
) -> Option<T> {
    result.unwrap_or_else(|e| {
        errors.push(Error::new(
            path,
            ErrorKind::Quantity {
                message: e.to_string(),
            },
        ));
        None
    })
}

/// A plain number box that must not be empty; `what` says what to write.
pub fn required_number(text: &str, path: &str, what: &str, errors: &mut Errors) -> Option<f64> {
    let value = number(text)
        .map_err(|e| e.to_string())
        .and_then(|v| v.ok_or_else(|| format!("is empty; write {what}")));
    read(value.map(Some), path, errors)
}

/// As [`read`], for a box that must not be empty.
pub fn required(field: &PressureText, path: &str, errors: &mut Errors) -> Option<PressureEntry> {
    let value = field
        .entry()
        .and_then(|v| v.ok_or(QuantityTextError::Empty));
    read(value.map(Some), path, errors)
}

/// Where a level is, as the picker offers it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum LevelPick {
    /// The quantity's usual reference (assumed values only).
    Usual,
    /// At a landmark.
    At(Landmark),
    /// At a measured height above the heart reference.
    Height,
}

/// A level's picker and, for a measured height, its box.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct LevelForm {
    /// What is picked.
    pub pick: LevelPick,
    /// The measured height, for [`LevelPick::Height`].
    pub height: LengthText,
}

impl LevelForm {
    /// The form of a level; `None` is the usual reference.
    pub fn from_level(level: Option<Level>) -> Self {
        match level {
            None => LevelForm::pick(LevelPick::Usual),
            Some(Level::At(l)) => LevelForm::pick(LevelPick::At(l)),
            Some(Level::Height(h)) => LevelForm {
                pick: LevelPick::Height,
                height: LengthText::from_entry(Some(h), LengthUnit::Cm),
            },
        }
    }

    /// A level at `pick` with an empty height box.
    pub fn pick(pick: LevelPick) -> Self {
        LevelForm {
            pick,
            height: LengthText::empty(LengthUnit::Cm),
        }
    }

    /// The level for the case (`None` for the usual reference).
    pub fn level(&self, path: &str, errors: &mut Errors) -> Option<Option<Level>> {
        match self.pick {
            LevelPick::Usual => Some(None),
            LevelPick::At(l) => Some(Some(Level::At(l))),
            LevelPick::Height => {
                let value = self
                    .height
                    .entry()
                    .and_then(|v| v.ok_or(QuantityTextError::Empty));
                read(value.map(Some), &format!("{path}.height"), errors)
                    .map(|h| Some(Level::Height(h)))
            }
        }
    }
}

/// One arterial source.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct SourceForm {
    /// Its short label, as typed.
    pub id: String,
    /// How it is measured.
    pub method: Method,
    /// Where it reads.
    pub level: LevelForm,
    /// Systolic.
    pub systolic: PressureText,
    /// Diastolic.
    pub diastolic: PressureText,
    /// Mean.
    pub mean: PressureText,
    /// Accuracy instead of the method's default.
    pub accuracy: PressureText,
}

impl SourceForm {
    /// The form of a source in a case.
    pub fn from_spec(spec: &ArterialSpec) -> Self {
        let p = |e: Option<PressureEntry>| PressureText::from_entry(e, PressureUnit::MmHg);
        SourceForm {
            id: spec.id.clone(),
            method: spec.method,
            level: LevelForm::from_level(Some(spec.level)),
            systolic: p(spec.systolic),
            diastolic: p(spec.diastolic),
            mean: p(spec.mean),
            accuracy: p(spec.accuracy),
        }
    }

    /// A new, empty cuff on the left upper arm.
    pub fn new_cuff() -> Self {
        let p = || PressureText::empty(PressureUnit::MmHg);
        SourceForm {
            id: String::new(),
            method: Method::Cuff,
            level: LevelForm::pick(LevelPick::At(Landmark::UpperArmLeft)),
            systolic: p(),
            diastolic: p(),
            mean: p(),
            accuracy: p(),
        }
    }

    /// The source for the case.
    pub fn spec(&self, i: usize, errors: &mut Errors) -> Option<ArterialSpec> {
        let path = format!("arterial[{i}]");
        let systolic = read(self.systolic.entry(), &format!("{path}.systolic"), errors);
        let diastolic = read(self.diastolic.entry(), &format!("{path}.diastolic"), errors);
        let mean = read(self.mean.entry(), &format!("{path}.mean"), errors);
        let accuracy = read(self.accuracy.entry(), &format!("{path}.accuracy"), errors);
        let level = self.level.level(&format!("{path}.level"), errors)??;
        Some(ArterialSpec {
            id: self.id.clone(),
            method: self.method,
            level,
            systolic,
            diastolic,
            mean,
            accuracy,
        })
    }
}

/// One measured reading other than arterial.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ReadingForm {
    /// The value.
    pub value: PressureText,
    /// How it is measured.
    pub method: Method,
    /// Where it reads.
    pub level: LevelForm,
    /// Accuracy instead of the method's default.
    pub accuracy: PressureText,
}

impl ReadingForm {
    /// The form of a reading in a case.
    pub fn from_spec(spec: &ReadingSpec) -> Self {
        ReadingForm {
            value: PressureText::from_entry(Some(spec.value), PressureUnit::MmHg),
            method: spec.method,
            level: LevelForm::from_level(Some(spec.level)),
            accuracy: PressureText::from_entry(spec.accuracy, PressureUnit::MmHg),
        }
    }

    /// A new, empty reading of `quantity`, taken the usual way.
    pub fn new(quantity: Quantity) -> Self {
        let method = method_for(quantity);
        ReadingForm {
            value: PressureText::empty(unit_for(method)),
            method,
            level: LevelForm::pick(LevelPick::At(first_level(quantity))),
            accuracy: PressureText::empty(PressureUnit::MmHg),
        }
    }

    /// The reading for the case.
    pub fn spec(&self, quantity: Quantity, errors: &mut Errors) -> Option<ReadingSpec> {
        let path = format!("readings.{quantity}");
        let value = required(&self.value, &format!("{path}.value"), errors);
        let accuracy = read(self.accuracy.entry(), &format!("{path}.accuracy"), errors);
        let level = self.level.level(&format!("{path}.level"), errors)??;
        Some(ReadingSpec {
            value: value?,
            method: self.method,
            level,
            accuracy,
        })
    }
}

/// One assumed value.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct AssumedForm {
    /// The value assumed.
    pub value: PressureText,
    /// Where it is assumed; [`LevelPick::Usual`] for the usual reference.
    pub level: LevelForm,
}

impl AssumedForm {
    /// The form of an assumed value in a case.
    pub fn from_spec(spec: &AssumedSpec) -> Self {
        AssumedForm {
            value: PressureText::from_entry(Some(spec.value), PressureUnit::MmHg),
            level: LevelForm::from_level(spec.level),
        }
    }

    /// A new, empty assumption of `quantity` at its usual reference (or, for
    /// tissue pressures, at the first landmark they accept).
    pub fn new(quantity: Quantity) -> Self {
        let pick = match quantity.usual_level() {
            Some(_) => LevelPick::Usual,
            None => LevelPick::At(first_level(quantity)),
        };
        AssumedForm {
            value: PressureText::empty(PressureUnit::MmHg),
            level: LevelForm::pick(pick),
        }
    }

    /// The assumption for the case.
    pub fn spec(&self, quantity: Quantity, errors: &mut Errors) -> Option<AssumedSpec> {
        let path = format!("assume.{quantity}");
        let value = required(&self.value, &format!("{path}.value"), errors);
        let level = self.level.level(&format!("{path}.level"), errors)?;
        Some(AssumedSpec {
            value: value?,
            level,
        })
    }
}

/// The kind of bound a target sets.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum BoundKind {
    /// A floor.
    AtLeast,
    /// A ceiling.
    AtMost,
    /// A floor relative to baseline.
    PercentOfBaseline,
}

impl BoundKind {
    /// In the order the picker shows them.
    pub const ALL: [BoundKind; 3] = [
        BoundKind::AtLeast,
        BoundKind::AtMost,
        BoundKind::PercentOfBaseline,
    ];

    /// The kind in words.
    pub fn label(self) -> &'static str {
        match self {
            BoundKind::AtLeast => "at least",
            BoundKind::AtMost => "at most",
            BoundKind::PercentOfBaseline => "at least % of baseline",
        }
    }

    /// The case file's field for this bound, for messages.
    pub fn key(self) -> &'static str {
        match self {
            BoundKind::AtLeast => "at_least",
            BoundKind::AtMost => "at_most",
            BoundKind::PercentOfBaseline => "at_least_percent_of_baseline",
        }
    }
}

/// One target.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TargetForm {
    /// The organ.
    pub organ: Organ,
    /// The metric.
    pub metric: Metric,
    /// The kind of bound.
    pub kind: BoundKind,
    /// The threshold, for absolute bounds.
    pub threshold: PressureText,
    /// The percentage, for relative bounds.
    pub percent: String,
    /// Where the target comes from, as typed.
    pub source: String,
    /// The target as its document wrote it, when it sets no bound or more
    /// than one: the row shows one bound, so the whole target is kept and
    /// handed back to the core, which refuses it in the same words as for
    /// a file, and nothing in it is dropped. A change to the row's bound or
    /// kind is the clinician choosing one bound, and ends it.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub as_written: Option<TargetSpec>,
}

impl TargetForm {
    /// The form of a target spec.
    pub fn from_spec(spec: &TargetSpec) -> Self {
        let metric = spec.metric.unwrap_or_else(|| {
            spec.organ
                .metrics()
                .first()
                .copied()
                .unwrap_or(Metric::Perfusion)
        });
        let (kind, threshold) = match (spec.at_least, spec.at_most) {
            (Some(p), _) => (BoundKind::AtLeast, Some(p)),
            (None, Some(p)) => (BoundKind::AtMost, Some(p)),
            (None, None) => (BoundKind::PercentOfBaseline, None),
        };
        let bounds = usize::from(spec.at_least.is_some())
            + usize::from(spec.at_most.is_some())
            + usize::from(spec.at_least_percent_of_baseline.is_some());
        TargetForm {
            organ: spec.organ,
            metric,
            kind,
            threshold: PressureText::from_entry(threshold, PressureUnit::MmHg),
            percent: spec
                .at_least_percent_of_baseline
                .map(number_text)
                .unwrap_or_default(),
            source: spec.citation.clone().unwrap_or_default(),
            as_written: (bounds != 1).then(|| spec.clone()),
        }
    }

    /// The bound or its kind was changed: the row's one bound is the target.
    pub fn bound_edited(&mut self) {
        self.as_written = None;
    }

    /// The source was changed to `text`; a target kept as written takes it.
    pub fn source_edited(&mut self, text: &str) {
        if let Some(spec) = &mut self.as_written {
            spec.citation = Some(text.to_owned()).filter(|s| !s.trim().is_empty());
        }
        text.clone_into(&mut self.source);
    }

    /// A new floor on `metric` of `organ`, threshold still to be typed.
    pub fn new(organ: Organ, metric: Metric) -> Self {
        TargetForm {
            organ,
            metric,
            kind: BoundKind::AtLeast,
            threshold: PressureText::empty(PressureUnit::MmHg),
            percent: String::new(),
            source: String::new(),
            as_written: None,
        }
    }

    /// The path of the box holding this target's bound.
    pub fn bound_path(&self, i: usize) -> String {
        format!("targets[{i}].{}", self.kind.key())
    }

    /// The target for the case.
    pub fn spec(&self, i: usize, errors: &mut Errors) -> Option<TargetSpec> {
        if let Some(spec) = &self.as_written {
            return Some(spec.clone());
        }
        let path = self.bound_path(i);
        let mut spec = TargetSpec {
            organ: self.organ,
            metric: Some(self.metric),
            at_least: None,
            at_most: None,
            at_least_percent_of_baseline: None,
            citation: Some(self.source.clone()).filter(|s| !s.trim().is_empty()),
        };
        match self.kind {
            BoundKind::AtLeast => spec.at_least = Some(required(&self.threshold, &path, errors)?),
            BoundKind::AtMost => spec.at_most = Some(required(&self.threshold, &path, errors)?),
            BoundKind::PercentOfBaseline => {
                spec.at_least_percent_of_baseline = Some(required_number(
                    &self.percent,
                    &path,
                    "the percentage of baseline",
                    errors,
                )?);
            }
        }
        Some(spec)
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn a_measured_height_level_needs_its_height() {
        let mut level = LevelForm::pick(LevelPick::Height);
        let mut errors = Errors::default();
        assert_eq!(level.level("readings.icp.level", &mut errors), None);
        assert_eq!(errors.for_field("readings.icp.level.height").count(), 1);
        level.height.edit("12".into());
        let mut errors = Errors::default();
        let got = level.level("x", &mut errors).unwrap().unwrap();
        assert_eq!(
            got,
            Level::Height(plumbline_core::units::LengthEntry::cm(12.0))
        );
    }

    #[test]
    fn new_readings_start_the_usual_way() {
        let icp = ReadingForm::new(Quantity::Icp);
        assert_eq!(icp.level.pick, LevelPick::At(Landmark::Tragus));
        let csf = ReadingForm::new(Quantity::Csf);
        assert_eq!(csf.value.unit, PressureUnit::CmH2O);
        let iop = AssumedForm::new(Quantity::Iop);
        assert_eq!(iop.level.pick, LevelPick::At(Landmark::EyeLeft));
        assert_eq!(AssumedForm::new(Quantity::Icp).level.pick, LevelPick::Usual);
    }

    #[test]
    fn an_empty_required_value_gets_the_cores_message() {
        let mut errors = Errors::default();
        ReadingForm::new(Quantity::Cvp).spec(Quantity::Cvp, &mut errors);
        let message = errors
            .for_field("readings.cvp.value")
            .next()
            .unwrap()
            .to_string();
        assert!(message.contains("is empty"), "{message}");
    }

    #[test]
    fn target_specs_round_trip() {
        for target in plumbline_core::target::defaults() {
            let spec = TargetSpec::from_target(&target);
            let mut errors = Errors::default();
            let back = TargetForm::from_spec(&spec).spec(0, &mut errors).unwrap();
            assert_eq!(back, spec);
        }
    }

    #[test]
    fn a_target_with_two_bounds_or_none_is_kept_whole_until_one_is_chosen() {
        let spec: TargetSpec = serde_json::from_str(
            r#"{"organ": "whole_body", "at_least": "60 mmHg", "at_least_percent_of_baseline": 80}"#,
        )
        .unwrap();
        let mut form = TargetForm::from_spec(&spec);
        let mut errors = Errors::default();
        assert_eq!(form.spec(0, &mut errors), Some(spec.clone()));
        // The source follows what is typed; the bounds stay.
        form.source_edited("unit protocol");
        let kept = form.spec(0, &mut errors).unwrap();
        assert_eq!(kept.citation.as_deref(), Some("unit protocol"));
        assert_eq!(kept.at_least_percent_of_baseline, Some(80.0));
        form.bound_edited();
        let chosen = form.spec(0, &mut errors).unwrap();
        assert_eq!(chosen.at_least, spec.at_least);
        assert_eq!(chosen.at_least_percent_of_baseline, None);
        assert!(errors.is_empty());

        let none: TargetSpec = serde_json::from_str(r#"{"organ": "brain"}"#).unwrap();
        assert_eq!(
            TargetForm::from_spec(&none).spec(0, &mut errors),
            Some(none)
        );
    }

    #[test]
    fn a_bad_threshold_is_named_by_its_bound() {
        let mut form = TargetForm::new(Organ::Brain, Metric::Perfusion);
        form.threshold.edit("sixty".into());
        let mut errors = Errors::default();
        assert_eq!(form.spec(3, &mut errors), None);
        assert_eq!(errors.for_field("targets[3].at_least").count(), 1);
    }
}

//! The form: every box on the screen as typed, and the case it stands for.
//!
//! The form edits the parts of a case a clinician changes at the bedside;
//! everything else in the loaded case (baseline, densities, measured
//! heights, segment lengths, organ levels) rides along untouched, so the
//! case document always says everything the check used.

mod parts;
mod position;

use std::collections::BTreeMap;

use plumbline_core::case::Case;
use plumbline_core::error::Errors;
use plumbline_core::geometry::Posture;
use plumbline_core::landmark::Side;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::{Method, Quantity};
use plumbline_core::target::{self, TargetSpec};
use plumbline_core::units::{LengthUnit, PressureUnit};
use serde::{Deserialize, Serialize};

pub use parts::{
    AssumedForm, BoundKind, LevelForm, LevelPick, ReadingForm, SourceForm, TargetForm,
};
pub use position::{AngleKey, ArmChoice, ArmForm, PositionForm};

use crate::fields::{number, number_text, LengthText, PressureText};
use parts::read;

/// A shoulder or an elbow, for arms given by angles.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Joint {
    /// Shoulder flexion.
    Shoulder,
    /// Elbow flexion.
    Elbow,
}

/// A part of an arterial source.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SourcePart {
    /// Its label.
    Id,
    /// Systolic.
    Systolic,
    /// Diastolic.
    Diastolic,
    /// Mean.
    Mean,
    /// Accuracy.
    Accuracy,
    /// The measured height of its level.
    LevelHeight,
}

/// A part of another reading or an assumed value.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ReadingPart {
    /// The value.
    Value,
    /// Accuracy (readings only).
    Accuracy,
    /// The measured height of its level.
    LevelHeight,
}

/// A part of a target.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum TargetPart {
    /// The threshold or percentage.
    Bound,
    /// Where it comes from.
    Source,
}

/// One box on the screen.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Slot {
    /// The patient's height.
    Height,
    /// The haematocrit.
    Haematocrit,
    /// A position angle.
    Angle(AngleKey),
    /// An arm's joint angle.
    ArmAngle(Side, Joint),
    /// A part of the i-th arterial source.
    Source(usize, SourcePart),
    /// A part of a measured reading.
    Reading(Quantity, ReadingPart),
    /// A part of an assumed value.
    Assumed(Quantity, ReadingPart),
    /// A part of the i-th target.
    Target(usize, TargetPart),
}

/// Every change the screen can make to the form.
#[derive(Clone, Debug, PartialEq)]
pub enum Edit {
    /// Text typed into a box.
    Text(Slot, String),
    /// A pressure box shown in another unit.
    PressureUnit(Slot, PressureUnit),
    /// A length box shown in another unit.
    LengthUnit(Slot, LengthUnit),
    /// A new posture (its presets replace the old overrides).
    Posture(Option<Posture>),
    /// An angle moved by the ± buttons.
    Step(AngleKey, f64),
    /// An arm's placement.
    Arm(Side, ArmChoice),
    /// A source's method.
    SourceMethod(usize, Method),
    /// A source's level.
    SourceLevel(usize, LevelPick),
    /// A new, empty arterial source.
    AddSource,
    /// The i-th source removed.
    RemoveSource(usize),
    /// A reading's method.
    ReadingMethod(Quantity, Method),
    /// A reading's level.
    ReadingLevel(Quantity, LevelPick),
    /// An assumed value's level.
    AssumedLevel(Quantity, LevelPick),
    /// A new measured reading.
    AddReading(Quantity),
    /// A measured reading removed.
    RemoveReading(Quantity),
    /// A new assumed value.
    AddAssumed(Quantity),
    /// An assumed value removed.
    RemoveAssumed(Quantity),
    /// A target's kind of bound.
    TargetKind(usize, BoundKind),
    /// A new target.
    AddTarget(Organ, Metric),
    /// The i-th target removed.
    RemoveTarget(usize),
    /// Back to the default targets.
    DefaultTargets,
}

/// The whole form. It is saved on the device as the boxes hold it
/// (`storage`); the case it rides on is saved beside it, as a case document.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Form {
    #[serde(skip)]
    base: Case,
    /// Standing body height.
    pub height: LengthText,
    /// Haematocrit in percent, as typed.
    pub haematocrit: String,
    /// The position.
    pub position: PositionForm,
    /// The arterial sources.
    pub sources: Vec<SourceForm>,
    /// The measured readings.
    pub readings: BTreeMap<Quantity, ReadingForm>,
    /// The assumed values.
    pub assumed: BTreeMap<Quantity, AssumedForm>,
    /// The targets shown (the defaults until one is changed).
    pub targets: Vec<TargetForm>,
    /// Whether the targets are the case's own rather than the defaults.
    pub custom_targets: bool,
}

fn default_targets() -> Vec<TargetForm> {
    target::defaults()
        .iter()
        .map(|t| TargetForm::from_spec(&TargetSpec::from_target(t)))
        .collect()
}

impl Form {
    /// The form showing a case.
    pub fn from_case(case: &Case) -> Self {
        let (targets, custom_targets) = match &case.targets {
            Some(list) => (list.iter().map(TargetForm::from_spec).collect(), true),
            None => (default_targets(), false),
        };
        Form {
            base: case.clone(),
            height: LengthText::from_entry(case.patient.height, LengthUnit::Cm),
            haematocrit: case
                .patient
                .haematocrit_percent
                .map(number_text)
                .unwrap_or_default(),
            position: PositionForm::from_spec(case.position.as_ref()),
            sources: case.arterial.iter().map(SourceForm::from_spec).collect(),
            readings: case
                .readings
                .iter()
                .map(|(q, r)| (*q, ReadingForm::from_spec(r)))
                .collect(),
            assumed: case
                .assume
                .iter()
                .map(|(q, a)| (*q, AssumedForm::from_spec(a)))
                .collect(),
            targets,
            custom_targets,
        }
    }

    /// The case the form was loaded from: everything the boxes do not
    /// edit rides along in it.
    pub fn base(&self) -> &Case {
        &self.base
    }

    /// The form with another case to ride on, for a form read back from
    /// the device without its case.
    pub fn with_base(self, base: Case) -> Self {
        Form { base, ..self }
    }

    /// The case the form stands for.
    ///
    /// # Errors
    /// Every box that cannot be read, each named by its document path.
    pub fn to_case(&self) -> Result<Case, Errors> {
        let mut errors = Errors::default();
        let mut case = self.base.clone();
        case.patient.height = read(self.height.entry(), "patient.height", &mut errors);
        case.patient.haematocrit_percent = read(
            number(&self.haematocrit),
            "patient.haematocrit_percent",
            &mut errors,
        );
        case.position = self.position.spec(&mut errors);
        case.arterial = self
            .sources
            .iter()
            .enumerate()
            .filter_map(|(i, s)| s.spec(i, &mut errors))
            .collect();
        case.readings = self
            .readings
            .iter()
            .filter_map(|(q, r)| Some((*q, r.spec(*q, &mut errors)?)))
            .collect();
        case.assume = self
            .assumed
            .iter()
            .filter_map(|(q, a)| Some((*q, a.spec(*q, &mut errors)?)))
            .collect();
        let targets: Vec<TargetSpec> = self
            .targets
            .iter()
            .enumerate()
            .filter_map(|(i, t)| t.spec(i, &mut errors))
            .collect();
        case.targets = self.custom_targets.then_some(targets);
        errors.into_result(case)
    }

    fn pressure_mut(&mut self, slot: Slot) -> Option<&mut PressureText> {
        match slot {
            Slot::Source(i, part) => {
                let s = self.sources.get_mut(i)?;
                match part {
                    SourcePart::Systolic => Some(&mut s.systolic),
                    SourcePart::Diastolic => Some(&mut s.diastolic),
                    SourcePart::Mean => Some(&mut s.mean),
                    SourcePart::Accuracy => Some(&mut s.accuracy),
                    SourcePart::Id | SourcePart::LevelHeight => None,
                }
            }
            Slot::Reading(q, ReadingPart::Value) => Some(&mut self.readings.get_mut(&q)?.value),
            Slot::Reading(q, ReadingPart::Accuracy) => {
                Some(&mut self.readings.get_mut(&q)?.accuracy)
            }
            Slot::Assumed(q, ReadingPart::Value) => Some(&mut self.assumed.get_mut(&q)?.value),
            Slot::Target(i, TargetPart::Bound) => {
                let t = self.targets.get_mut(i)?;
                (t.kind != BoundKind::PercentOfBaseline).then_some(&mut t.threshold)
            }
            _ => None,
        }
    }

    fn length_mut(&mut self, slot: Slot) -> Option<&mut LengthText> {
        match slot {
            Slot::Height => Some(&mut self.height),
            Slot::Source(i, SourcePart::LevelHeight) => {
                Some(&mut self.sources.get_mut(i)?.level.height)
            }
            Slot::Reading(q, ReadingPart::LevelHeight) => {
                Some(&mut self.readings.get_mut(&q)?.level.height)
            }
            Slot::Assumed(q, ReadingPart::LevelHeight) => {
                Some(&mut self.assumed.get_mut(&q)?.level.height)
            }
            _ => None,
        }
    }

    fn plain_mut(&mut self, slot: Slot) -> Option<&mut String> {
        match slot {
            Slot::Haematocrit => Some(&mut self.haematocrit),
            Slot::Angle(key) => self.position.angle_mut(key),
            Slot::ArmAngle(side, joint) => {
                let arm = match side {
                    Side::Left => &mut self.position.left,
                    Side::Right => &mut self.position.right,
                };
                Some(match joint {
                    Joint::Shoulder => &mut arm.shoulder,
                    Joint::Elbow => &mut arm.elbow,
                })
            }
            Slot::Source(i, SourcePart::Id) => Some(&mut self.sources.get_mut(i)?.id),
            Slot::Target(i, TargetPart::Bound) => Some(&mut self.targets.get_mut(i)?.percent),
            _ => None,
        }
    }

    /// Applies one change.
    pub fn apply(&mut self, edit: Edit) {
        // A change to one default target makes the list the case's own, so
        // the others are kept as they are.
        if matches!(
            edit,
            Edit::Text(Slot::Target(..), _)
                | Edit::PressureUnit(Slot::Target(..), _)
                | Edit::TargetKind(..)
                | Edit::AddTarget(..)
                | Edit::RemoveTarget(..)
        ) {
            self.custom_targets = true;
        }
        match edit {
            Edit::Text(Slot::Target(i, TargetPart::Source), text) => {
                if let Some(t) = self.targets.get_mut(i) {
                    t.source_edited(&text);
                }
            }
            Edit::Text(slot, text) => {
                if let Slot::Target(i, TargetPart::Bound) = slot {
                    if let Some(t) = self.targets.get_mut(i) {
                        t.bound_edited();
                    }
                }
                if let Some(f) = self.pressure_mut(slot) {
                    f.edit(text);
                } else if let Some(f) = self.length_mut(slot) {
                    f.edit(text);
                } else if let Some(f) = self.plain_mut(slot) {
                    *f = text;
                }
            }
            Edit::PressureUnit(slot, unit) => {
                if let Some(f) = self.pressure_mut(slot) {
                    f.switch(unit);
                }
            }
            Edit::LengthUnit(slot, unit) => {
                if let Some(f) = self.length_mut(slot) {
                    f.switch(unit);
                }
            }
            Edit::Posture(posture) => self.position.set_posture(posture),
            Edit::Step(key, delta) => self.position.step(key, delta),
            Edit::Arm(side, choice) => match side {
                Side::Left => self.position.left.choice = choice,
                Side::Right => self.position.right.choice = choice,
            },
            Edit::SourceMethod(i, method) => {
                if let Some(s) = self.sources.get_mut(i) {
                    s.method = method;
                }
            }
            Edit::SourceLevel(i, pick) => {
                if let Some(s) = self.sources.get_mut(i) {
                    s.level.pick = pick;
                }
            }
            Edit::AddSource => self.sources.push(SourceForm::new_cuff()),
            Edit::RemoveSource(i) => {
                if i < self.sources.len() {
                    self.sources.remove(i);
                }
            }
            Edit::ReadingMethod(q, method) => {
                if let Some(r) = self.readings.get_mut(&q) {
                    r.method = method;
                }
            }
            Edit::ReadingLevel(q, pick) => {
                if let Some(r) = self.readings.get_mut(&q) {
                    r.level.pick = pick;
                }
            }
            Edit::AssumedLevel(q, pick) => {
                if let Some(a) = self.assumed.get_mut(&q) {
                    a.level.pick = pick;
                }
            }
            Edit::AddReading(q) => {
                self.readings
                    .entry(q)
                    .or_insert_with(|| ReadingForm::new(q));
            }
            Edit::RemoveReading(q) => {
                self.readings.remove(&q);
            }
            Edit::AddAssumed(q) => {
                self.assumed.entry(q).or_insert_with(|| AssumedForm::new(q));
            }
            Edit::RemoveAssumed(q) => {
                self.assumed.remove(&q);
            }
            Edit::TargetKind(i, kind) => {
                if let Some(t) = self.targets.get_mut(i) {
                    t.bound_edited();
                    t.kind = kind;
                }
            }
            Edit::AddTarget(organ, metric) => self.targets.push(TargetForm::new(organ, metric)),
            Edit::RemoveTarget(i) => {
                if i < self.targets.len() {
                    self.targets.remove(i);
                }
            }
            Edit::DefaultTargets => {
                self.targets = default_targets();
                self.custom_targets = false;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use plumbline_core::demo::CASE_JSON;

    fn demo() -> Form {
        Form::from_case(&Case::from_json(CASE_JSON).unwrap())
    }

    #[test]
    fn the_demo_case_round_trips_unchanged() {
        let case = Case::from_json(CASE_JSON).unwrap();
        assert_eq!(demo().to_case().unwrap(), case);
    }

    #[test]
    fn a_bad_systolic_is_named_and_kept_as_typed() {
        let mut form = demo();
        form.apply(Edit::Text(
            Slot::Source(0, SourcePart::Systolic),
            "1o4".into(),
        ));
        let sources = &form.sources;
        assert_eq!(sources.first().unwrap().systolic.text, "1o4");
        let errors = form.to_case().unwrap_err();
        assert_eq!(errors.for_field("arterial[0].systolic").count(), 1);
    }

    #[test]
    fn a_unit_switch_keeps_the_physical_value() {
        let mut form = demo();
        form.apply(Edit::PressureUnit(
            Slot::Source(0, SourcePart::Mean),
            PressureUnit::KPa,
        ));
        let case = form.to_case().unwrap();
        let mean = case.arterial.first().unwrap().mean.unwrap();
        assert_eq!(mean.unit, PressureUnit::KPa);
        assert!((mean.convert_to(PressureUnit::MmHg).amount - 74.0).abs() < 1e-9);
    }

    #[test]
    fn changing_one_target_keeps_the_other_defaults() {
        let mut form = demo();
        let before = form.targets.len();
        form.apply(Edit::Text(Slot::Target(0, TargetPart::Bound), "65".into()));
        let targets = form.to_case().unwrap().targets.unwrap();
        assert_eq!(targets.len(), before);
        assert_eq!(
            targets.first().unwrap().at_least,
            Some(plumbline_core::units::PressureEntry::mmhg(65.0))
        );
        form.apply(Edit::DefaultTargets);
        assert_eq!(form.to_case().unwrap().targets, None);
    }

    #[test]
    fn a_target_the_core_refuses_is_kept_and_refused_in_the_cores_words() {
        let mut case = Case::from_json(CASE_JSON).unwrap();
        let mut two: TargetSpec = serde_json::from_str(
            r#"{"organ": "whole_body", "metric": "inflow", "at_least": "60 mmHg", "at_least_percent_of_baseline": 80}"#,
        )
        .unwrap();
        case.targets = Some(vec![two.clone()]);
        let mut form = Form::from_case(&case);
        assert_eq!(form.to_case().unwrap(), case, "nothing is dropped");
        // The source typed into the row goes with it.
        form.apply(Edit::Text(
            Slot::Target(0, TargetPart::Source),
            "unit".into(),
        ));
        two.citation = Some("unit".into());
        assert_eq!(form.to_case().unwrap().targets, Some(vec![two]));
        // A unit switch keeps both bounds; choosing a kind keeps one.
        form.apply(Edit::PressureUnit(
            Slot::Target(0, TargetPart::Bound),
            PressureUnit::KPa,
        ));
        let kept = form.to_case().unwrap().targets.unwrap();
        assert!(kept.first().unwrap().at_least_percent_of_baseline.is_some());
        form.apply(Edit::TargetKind(0, BoundKind::PercentOfBaseline));
        let chosen = form.to_case().unwrap().targets.unwrap();
        let chosen = chosen.first().unwrap();
        assert_eq!(chosen.at_least_percent_of_baseline, Some(80.0));
        assert_eq!(chosen.at_least, None);
    }

    #[test]
    fn readings_and_assumptions_come_and_go() {
        let mut form = demo();
        form.apply(Edit::AddReading(Quantity::Icp));
        form.apply(Edit::Text(
            Slot::Reading(Quantity::Icp, ReadingPart::Value),
            "14".into(),
        ));
        form.apply(Edit::RemoveAssumed(Quantity::Icp));
        let case = form.to_case().unwrap();
        assert!(case.readings.contains_key(&Quantity::Icp));
        assert!(case.assume.is_empty());
    }
}

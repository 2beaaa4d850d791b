//! The form: every box on the screen as typed, and the case it stands for.
//!
//! The form edits the parts of a case a clinician changes at the bedside;
//! everything else in the loaded case (baseline, densities, measured
//! heights, segment lengths, organ levels) rides along untouched, so the
//! case document always says everything the check used.

mod blood;
mod demo;
mod parts;
mod position;

use std::collections::BTreeMap;

use plumbline_core::case::{ArterialSpec, Case};
use plumbline_core::error::Errors;
use plumbline_core::geometry::{PositionSpec, Posture};
use plumbline_core::landmark::{Landmark, Side};
use plumbline_core::order::map_of;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::{Level, Method, Quantity};
use plumbline_core::target::{self, TargetSpec};
use plumbline_core::units::{LengthUnit, PressureUnit};
use serde::{Deserialize, Serialize};

pub use blood::Pressures;
pub use parts::{
    sites, AssumedForm, BaselineForm, BoundKind, LevelForm, LevelPick, ReadingForm, SourceForm,
    TargetForm,
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
    /// Systolic, diastolic and mean typed in one box (`100/60 (74)`).
    BloodPressure,
}

/// A part of the baseline.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BaselinePart {
    /// Systolic.
    Systolic,
    /// Diastolic.
    Diastolic,
    /// Mean.
    Mean,
    /// The three typed in one box.
    BloodPressure,
    /// The measured height of its level.
    LevelHeight,
    /// An angle of the position it was taken in.
    Angle(AngleKey),
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
    /// A part of the baseline.
    Baseline(BaselinePart),
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
    /// A source's method and site together, as the quick path offers them.
    SourceSite(usize, Method, Landmark),
    /// A new, empty arterial source (a cuff).
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
    /// A backrest angle measured with a level, degrees.
    MeasuredBackrest(f64),
    /// A baseline to enter.
    AddBaseline,
    /// The baseline removed.
    RemoveBaseline,
    /// The baseline's method and site together.
    BaselineSite(Method, Landmark),
    /// The baseline's method.
    BaselineMethod(Method),
    /// The baseline's level.
    BaselineLevel(LevelPick),
    /// The posture the baseline was taken in.
    BaselinePosture(Option<Posture>),
    /// Every value still as the invented demo case had it cleared, the
    /// clinician's own entries kept.
    ClearDemo,
    /// An organ of concern added, or taken off when it was one.
    Concern(Organ),
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
    /// The patient's baseline blood pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub baseline: Option<BaselineForm>,
    /// The organs of concern, which the core's summary judges (every organ
    /// with a result when none is chosen).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub concern: Vec<Organ>,
    /// Whether the boxes began as the invented demo case: what is still as
    /// the demo had it is invented (`demo`).
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub demo: bool,
    /// The form's own revision, so a form saved by an older build can be
    /// brought up to date ([`Form::with_base`]).
    #[serde(default)]
    revision: u8,
}

/// The form's current revision: 1 added the baseline's boxes.
const REVISION: u8 = 1;

/// The case a new check starts from: flat on the back, one arterial line
/// zeroed at the heart, every value still to be entered, default targets.
pub fn blank_case() -> Case {
    let mut case = Case::new();
    case.position = Some(PositionSpec::new(Posture::Supine));
    case.arterial = vec![ArterialSpec {
        id: "arterial line".to_owned(),
        method: Method::Transducer,
        level: Level::At(Landmark::Heart),
        systolic: None,
        diastolic: None,
        mean: None,
        accuracy: None,
    }];
    case
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
            readings: map_of(
                case.readings
                    .iter()
                    .map(|(q, r)| (*q, ReadingForm::from_spec(r))),
            ),
            assumed: map_of(
                case.assume
                    .iter()
                    .map(|(q, a)| (*q, AssumedForm::from_spec(a))),
            ),
            targets,
            custom_targets,
            baseline: case.baseline.as_ref().map(BaselineForm::from_spec),
            concern: case.concern.clone(),
            demo: false,
            revision: REVISION,
        }
    }

    /// The form showing the invented demo case, marked as such.
    pub fn of_demo(case: &Case) -> Self {
        Form {
            demo: true,
            ..Form::from_case(case)
        }
    }

    /// The case the form was loaded from: everything the boxes do not
    /// edit rides along in it.
    pub fn base(&self) -> &Case {
        &self.base
    }

    /// The form with another case to ride on, for a form read back from
    /// the device without its case. A form saved before the baseline had
    /// boxes takes its baseline from the case, where it rode then.
    pub fn with_base(self, base: Case) -> Self {
        let baseline = if self.revision < 1 {
            base.baseline.as_ref().map(BaselineForm::from_spec)
        } else {
            self.baseline
        };
        Form {
            base,
            baseline,
            revision: REVISION,
            ..self
        }
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
        case.readings = map_of(
            self.readings
                .iter()
                .filter_map(|(q, r)| Some((*q, r.spec(*q, &mut errors)?))),
        );
        case.assume = map_of(
            self.assumed
                .iter()
                .filter_map(|(q, a)| Some((*q, a.spec(*q, &mut errors)?))),
        );
        let targets: Vec<TargetSpec> = self
            .targets
            .iter()
            .enumerate()
            .filter_map(|(i, t)| t.spec(i, &mut errors))
            .collect();
        case.targets = self.custom_targets.then_some(targets);
        case.baseline = self.baseline.as_ref().and_then(|b| b.spec(&mut errors));
        case.concern = self.concern.clone();
        errors.into_result(case)
    }

    fn pressure_mut(&mut self, slot: Slot) -> Option<&mut PressureText> {
        match slot {
            Slot::Source(i, part) => {
                let s = self.sources.get_mut(i)?;
                match part {
                    SourcePart::Systolic => Some(&mut s.pressures.systolic),
                    SourcePart::Diastolic => Some(&mut s.pressures.diastolic),
                    SourcePart::Mean => Some(&mut s.pressures.mean),
                    SourcePart::Accuracy => Some(&mut s.accuracy),
                    SourcePart::Id | SourcePart::LevelHeight | SourcePart::BloodPressure => None,
                }
            }
            Slot::Baseline(part) => {
                let p = &mut self.baseline.as_mut()?.pressures;
                match part {
                    BaselinePart::Systolic => Some(&mut p.systolic),
                    BaselinePart::Diastolic => Some(&mut p.diastolic),
                    BaselinePart::Mean => Some(&mut p.mean),
                    _ => None,
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

    /// The one-box blood pressure at `slot`, if it is one.
    fn pressures_mut(&mut self, slot: Slot) -> Option<&mut Pressures> {
        match slot {
            Slot::Source(i, _) => Some(&mut self.sources.get_mut(i)?.pressures),
            Slot::Baseline(_) => Some(&mut self.baseline.as_mut()?.pressures),
            _ => None,
        }
    }

    /// The other sources' names, for naming the i-th.
    fn taken(&self, i: usize) -> Vec<String> {
        self.sources
            .iter()
            .enumerate()
            .filter(|(k, _)| *k != i)
            .map(|(_, s)| s.id.trim().to_owned())
            .collect()
    }

    /// Changes the i-th source's method or site; its name follows them
    /// unless the clinician gave it one of their own.
    fn change_source(&mut self, i: usize, change: impl FnOnce(&mut SourceForm)) {
        let taken = self.taken(i);
        let taken: Vec<&str> = taken.iter().map(String::as_str).collect();
        if let Some(s) = self.sources.get_mut(i) {
            s.follow(&taken, change);
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
            Slot::Baseline(BaselinePart::LevelHeight) => {
                Some(&mut self.baseline.as_mut()?.level.height)
            }
            _ => None,
        }
    }

    fn plain_mut(&mut self, slot: Slot) -> Option<&mut String> {
        match slot {
            Slot::Haematocrit => Some(&mut self.haematocrit),
            Slot::Angle(key) => self.position.angle_mut(key),
            Slot::Baseline(BaselinePart::Angle(key)) => {
                self.baseline.as_mut()?.position.angle_mut(key)
            }
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
            Edit::Text(
                slot @ (Slot::Source(_, SourcePart::BloodPressure)
                | Slot::Baseline(BaselinePart::BloodPressure)),
                text,
            ) => {
                if let Some(p) = self.pressures_mut(slot) {
                    p.type_in(text);
                }
            }
            Edit::Text(Slot::Reading(q, ReadingPart::Value), text)
                if !self.readings.contains_key(&q) =>
            {
                // The quick path's box: typing a value adds the reading.
                if !text.trim().is_empty() {
                    let mut reading = ReadingForm::new(q);
                    reading.value.edit(text);
                    self.readings.insert(q, reading);
                }
            }
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
                if let Some(p) = self.pressures_mut(slot) {
                    p.box_typed();
                }
                if slot == Slot::Angle(AngleKey::Backrest) {
                    self.position.measured = false;
                }
                if let Some(f) = self.pressure_mut(slot) {
                    f.edit(text);
                } else if let Some(f) = self.length_mut(slot) {
                    f.edit(text);
                } else if let Some(f) = self.plain_mut(slot) {
                    *f = text;
                }
                // A quick-path reading emptied again, never set up, goes.
                if let Slot::Reading(q, ReadingPart::Value) = slot {
                    if self.readings.get(&q) == Some(&ReadingForm::new(q)) {
                        self.readings.remove(&q);
                    }
                }
            }
            Edit::PressureUnit(slot, unit) => {
                if let Some(p) = self.pressures_mut(slot) {
                    p.box_typed();
                }
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
            Edit::SourceMethod(i, method) => self.change_source(i, |s| s.method = method),
            Edit::SourceLevel(i, pick) => self.change_source(i, |s| s.level.pick = pick),
            Edit::SourceSite(i, method, landmark) => self.change_source(i, |s| {
                s.method = method;
                s.level.pick = LevelPick::At(landmark);
            }),
            Edit::AddSource => {
                let taken = self.taken(self.sources.len());
                let taken: Vec<&str> = taken.iter().map(String::as_str).collect();
                self.sources.push(SourceForm::new(Method::Cuff, &taken));
            }
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
            Edit::MeasuredBackrest(deg) => self.position.measure_backrest(deg),
            Edit::AddBaseline => {
                self.baseline.get_or_insert_with(BaselineForm::lying_flat);
            }
            Edit::RemoveBaseline => self.baseline = None,
            Edit::BaselineSite(method, landmark) => {
                if let Some(b) = self.baseline.as_mut() {
                    b.method = method;
                    b.level.pick = LevelPick::At(landmark);
                }
            }
            Edit::BaselineMethod(method) => {
                if let Some(b) = self.baseline.as_mut() {
                    b.method = method;
                }
            }
            Edit::BaselineLevel(pick) => {
                if let Some(b) = self.baseline.as_mut() {
                    b.level.pick = pick;
                }
            }
            Edit::BaselinePosture(posture) => {
                if let Some(b) = self.baseline.as_mut() {
                    b.position.set_posture(posture);
                }
            }
            Edit::ClearDemo => self.clear_demo(),
            Edit::Concern(organ) => {
                if self.concern.contains(&organ) {
                    self.concern.retain(|o| *o != organ);
                } else {
                    self.concern.push(organ);
                    // In the screen's order of organs (taken from that
                    // order: no sort of its own in the download).
                    self.concern = Organ::ALL
                        .into_iter()
                        .filter(|o| self.concern.contains(o))
                        .collect();
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
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
        assert_eq!(sources.first().unwrap().pressures.systolic.text, "1o4");
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

    fn blank() -> Form {
        Form::from_case(&blank_case())
    }

    #[test]
    fn a_source_is_named_by_what_it_is_until_named_by_hand() {
        let mut form = blank();
        assert_eq!(form.sources[0].id, "arterial line");
        form.apply(Edit::SourceMethod(0, Method::Cuff));
        let cuff = &form.sources[0];
        assert_eq!(cuff.id, "L arm cuff");
        assert_eq!(cuff.level.pick, LevelPick::At(Landmark::UpperArmLeft));
        form.apply(Edit::SourceSite(0, Method::Cuff, Landmark::CalfRight));
        assert_eq!(form.sources[0].id, "R calf cuff");
        form.apply(Edit::AddSource);
        assert_eq!(form.sources[1].id, "L arm cuff");
        form.apply(Edit::Text(Slot::Source(0, SourcePart::Id), "leg".into()));
        form.apply(Edit::SourceSite(0, Method::Transducer, Landmark::Heart));
        assert_eq!(form.sources[0].id, "leg", "a name typed by hand stays");
        assert_eq!(
            form.sources[0].site(),
            Some((Method::Transducer, Landmark::Heart))
        );
    }

    #[test]
    fn a_blood_pressure_typed_in_one_box_reaches_the_case() {
        let mut form = blank();
        let slot = Slot::Source(0, SourcePart::BloodPressure);
        form.apply(Edit::Text(slot, "100/60 (74)".into()));
        let line = form.to_case().unwrap().arterial.remove(0);
        assert_eq!(line.systolic.unwrap().amount, 100.0);
        assert_eq!(line.mean.unwrap().amount, 74.0);
        form.apply(Edit::Text(slot, "100/6o".into()));
        let errors = form.to_case().unwrap_err();
        assert_eq!(errors.for_field("arterial[0].blood_pressure").count(), 1);
        form.apply(Edit::Text(Slot::Source(0, SourcePart::Mean), "70".into()));
        assert_eq!(form.sources[0].pressures.text(), "100/60 (70)");
    }

    #[test]
    fn a_quick_reading_comes_with_its_value_and_goes_when_emptied() {
        let mut form = blank();
        let slot = Slot::Reading(Quantity::Icp, ReadingPart::Value);
        form.apply(Edit::Text(slot, "12".into()));
        assert_eq!(form.readings[&Quantity::Icp].value.text, "12");
        form.apply(Edit::Text(slot, String::new()));
        assert!(form.readings.is_empty());
    }

    #[test]
    fn the_baseline_has_boxes_of_its_own() {
        let mut form = blank();
        form.apply(Edit::AddBaseline);
        form.apply(Edit::Text(
            Slot::Baseline(BaselinePart::BloodPressure),
            "130/80".into(),
        ));
        form.apply(Edit::BaselinePosture(Some(Posture::HeadUp)));
        form.apply(Edit::Text(
            Slot::Baseline(BaselinePart::Angle(AngleKey::Backrest)),
            "4x".into(),
        ));
        let errors = form.to_case().unwrap_err();
        assert_eq!(
            errors.for_field("baseline.position.backrest_deg").count(),
            1
        );
        form.apply(Edit::Text(
            Slot::Baseline(BaselinePart::Angle(AngleKey::Backrest)),
            "45".into(),
        ));
        let baseline = form.to_case().unwrap().baseline.unwrap();
        assert_eq!(baseline.method, Method::Cuff);
        assert_eq!(baseline.position.backrest_deg, Some(45.0));
        assert_eq!(baseline.diastolic.unwrap().amount, 80.0);
        // A form saved before the baseline had boxes keeps the case's.
        let demo_case = Case::from_json(CASE_JSON).unwrap();
        let mut old = serde_json::to_value(demo()).unwrap();
        old.as_object_mut().unwrap().remove("revision");
        old.as_object_mut().unwrap().remove("baseline");
        let old: Form = serde_json::from_value(old).unwrap();
        assert_eq!(
            old.with_base(demo_case.clone()).to_case().unwrap(),
            demo_case
        );
    }

    #[test]
    fn organs_of_concern_toggle_and_reach_the_case_in_order() {
        let mut form = blank();
        form.apply(Edit::Concern(Organ::Kidney));
        form.apply(Edit::Concern(Organ::Brain));
        assert_eq!(form.concern, vec![Organ::Brain, Organ::Kidney]);
        form.apply(Edit::Concern(Organ::Kidney));
        form.apply(Edit::Text(Slot::Height, "170".into()));
        form.apply(Edit::Text(
            Slot::Source(0, SourcePart::BloodPressure),
            "120/70".into(),
        ));
        let case = form.to_case().unwrap();
        assert_eq!(case.concern, vec![Organ::Brain]);
        let report = plumbline_core::check::check_case(&case).unwrap();
        let judged: Vec<Organ> = report.summary.organs.iter().map(|o| o.organ).collect();
        assert_eq!(judged, vec![Organ::Brain]);
    }

    #[test]
    fn a_measured_backrest_is_an_estimate_again_once_typed() {
        let mut form = blank();
        form.apply(Edit::Posture(Some(Posture::HeadUp)));
        form.apply(Edit::MeasuredBackrest(37.0));
        let position = form.to_case().unwrap().position.unwrap();
        assert_eq!(position.backrest_deg, Some(37.0));
        assert!(position.backrest_measured);
        form.apply(Edit::Text(Slot::Angle(AngleKey::Backrest), "40".into()));
        assert!(!form.to_case().unwrap().position.unwrap().backrest_measured);
    }
}

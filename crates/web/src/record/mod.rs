//! The case's record over time on the screen: samples and position changes
//! held beside the form, never inside it, so typing in a box never copies,
//! checks or writes out an eight-hour record.
//!
//! The record joins the case only where it is used: for the core's
//! analysis (after a pause in typing, or at once after a record action),
//! for the downloads, and for saving ([`Record::timeline`],
//! [`Record::join`]). A record that arrives riding in the form's case, as
//! one read back from the device does, is moved here by [`Record::adopt`].
//!
//! The record keeps the position it started in (`start`): the position on
//! screen is "now", and each marked change takes it from its time on. The
//! core does every calculation; this module only gathers entries and keeps
//! the last analysis with its charts laid out.

pub mod entry;
pub mod strip;
pub mod trend;
pub mod when;

use std::borrow::Cow;
use std::rc::Rc;

use plumbline_core::case::{Case, RulesSpec, TimelineSpec};
use plumbline_core::error::{Error, Errors};
use plumbline_core::geometry::PositionSpec;
use plumbline_core::record::clock::{clock_words, time_of_day};
use plumbline_core::record::{
    self, csv, elapsed_words, Exposure, Sampling, TargetExposure, Timeline,
};
use plumbline_core::scene::Scene;
use plumbline_core::units::PressureUnit;
use plumbline_core::usual::read_blood_pressure;

use crate::fields::number_text;
use crate::form::Form;
use trend::Trend;
use when::{When, WhenMode};

/// Text with its first letter capitalised (`line 3` as `Line 3`).
pub fn capital(text: &str) -> String {
    let mut chars = text.chars();
    chars
        .next()
        .map(|c| c.to_uppercase().chain(chars).collect())
        .unwrap_or_default()
}

/// One of the exposure rules a user can set.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Rule {
    /// How long an intermittent reading is held.
    Hold,
    /// The longest gap continuous samples are joined across.
    Gap,
    /// The shortest episode counted.
    MinEpisode,
}

impl Rule {
    /// Every rule, in the order shown.
    pub const ALL: [Rule; 3] = [Rule::Hold, Rule::Gap, Rule::MinEpisode];

    /// The rule's field in the case document.
    pub fn path(self) -> &'static str {
        match self {
            Rule::Hold => "timeline.rules.hold_max_s",
            Rule::Gap => "timeline.rules.gap_max_s",
            Rule::MinEpisode => "timeline.rules.min_episode_s",
        }
    }

    /// The rule's box label.
    pub fn label(self) -> &'static str {
        match self {
            Rule::Hold => "Hold a cuff or scale reading for at most",
            Rule::Gap => "Join line or sensor samples across gaps of at most",
            Rule::MinEpisode => "Ignore episodes shorter than",
        }
    }

    /// The core's default, seconds.
    pub fn default_s(self) -> f64 {
        match self {
            Rule::Hold => record::DEFAULT_HOLD_MAX_S,
            Rule::Gap => record::DEFAULT_GAP_MAX_S,
            Rule::MinEpisode => record::DEFAULT_MIN_EPISODE_S,
        }
    }

    fn slot(self) -> usize {
        match self {
            Rule::Hold => 0,
            Rule::Gap => 1,
            Rule::MinEpisode => 2,
        }
    }

    fn get(self, rules: &RulesSpec) -> Option<f64> {
        match self {
            Rule::Hold => rules.hold_max_s,
            Rule::Gap => rules.gap_max_s,
            Rule::MinEpisode => rules.min_episode_s,
        }
    }

    fn set(self, rules: &mut RulesSpec, value: Option<f64>) {
        match self {
            Rule::Hold => rules.hold_max_s = value,
            Rule::Gap => rules.gap_max_s = value,
            Rule::MinEpisode => rules.min_episode_s = value,
        }
    }

    /// Reads the box: empty for the core's default, else seconds.
    ///
    /// # Errors
    /// Text that is not a number, in words; the core checks the range.
    pub fn read(text: &str) -> Result<Option<f64>, String> {
        let text = text.trim();
        if text.is_empty() {
            return Ok(None);
        }
        text.trim_end_matches('s')
            .trim()
            .parse::<f64>()
            .map(Some)
            .map_err(|_| format!("'{text}' is not a number of seconds"))
    }
}

/// The case on screen as the core checked it. The record reuses its scene
/// and gates a case of its own only when the record starts in another
/// position, so an analysis never checks the case the state just checked.
#[derive(Clone, Copy)]
pub struct Basis<'a> {
    /// The checked case.
    pub case: &'a Case,
    /// Its scene, as the state's check gated it.
    pub scene: &'a Scene,
}

/// A channel of the record as analysed.
#[derive(Clone, Debug, PartialEq)]
pub struct ChannelInfo {
    /// Its name (`radial line.mean`).
    pub name: String,
    /// How many samples it has.
    pub samples: usize,
    /// How time between samples is treated.
    pub sampling: Sampling,
    /// Whether the core estimated it (a mean from systolic and diastolic).
    pub estimated: bool,
}

/// The core's analysis of the record, with its charts laid out.
#[derive(Clone, Debug, PartialEq)]
pub struct Analysis {
    /// The exposure outside each target.
    pub exposure: Exposure,
    /// One chart per followed organ and metric.
    pub trends: Vec<Rc<Trend>>,
    /// The channels, with how each fills time.
    pub channels: Vec<ChannelInfo>,
}

/// Problems with a file, which imported nothing.
#[derive(Clone, Debug, PartialEq)]
pub struct FileProblems {
    /// The file's name.
    pub name: String,
    /// Every problem, each with its line and column.
    pub errors: Errors,
}

/// The record on screen.
#[derive(Clone, Debug, Default)]
pub struct Record {
    /// Samples, clock start and position changes; shared, so the state's
    /// copy on every change never copies them. Its rules are kept apart in
    /// `rules`.
    pub spec: Rc<TimelineSpec>,
    /// The position the record starts in.
    pub start: Option<PositionSpec>,
    /// The rules as last read from their boxes.
    pub rules: RulesSpec,
    /// The rule boxes as typed, in [`Rule::ALL`] order.
    pub rule_texts: [String; 3],
    /// The time box.
    pub when: When,
    /// The name of the file the samples came from.
    pub opened: Option<String>,
    /// Problems with the last file opened.
    pub file: Option<FileProblems>,
    /// Why the last entry was refused.
    pub entry: Option<String>,
    /// The ward's entry row: a blood pressure typed with its time.
    pub ward: Ward,
    /// What the last record action did, in words, for the screen reader.
    pub note: Option<String>,
    /// The last good analysis.
    pub analysis: Option<Rc<Analysis>>,
    /// Why the record could not be analysed as it is now; the last good
    /// analysis stays on screen, marked stale.
    pub fit: Errors,
    /// Whether the analysis is older than the case or the record.
    pub pending: bool,
    /// Counts changes awaiting analysis, so a pause after the last one can
    /// start it.
    pub generation: u64,
}

/// Shared parts are the same when they are one (the screen's common case,
/// one pointer compared), else when their contents are equal: comparing an
/// eight-hour record's props on every render must not walk its samples.
fn same<T: PartialEq>(a: &Rc<T>, b: &Rc<T>) -> bool {
    Rc::ptr_eq(a, b) || **a == **b
}

impl PartialEq for Record {
    fn eq(&self, other: &Record) -> bool {
        let analysis = match (&self.analysis, &other.analysis) {
            (Some(a), Some(b)) => same(a, b),
            (a, b) => a.is_none() && b.is_none(),
        };
        same(&self.spec, &other.spec)
            && analysis
            && self.start == other.start
            && self.rules == other.rules
            && self.rule_texts == other.rule_texts
            && self.when == other.when
            && self.opened == other.opened
            && self.file == other.file
            && self.entry == other.entry
            && self.ward == other.ward
            && self.note == other.note
            && self.fit == other.fit
            && self.pending == other.pending
            && self.generation == other.generation
    }
}

/// The ward's entry row as typed: which source, when, and the blood
/// pressure (`100/60` or `100/60 (74)`).
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Ward {
    /// The arterial source the readings belong to, by its place.
    pub source: usize,
    /// The time: empty for now, a clock time (`08:40`), or minutes after
    /// the last entry (`+5`).
    pub time: String,
    /// The blood pressure as typed.
    pub bp: String,
    /// Why the row's last reading, or a change in the list, was refused.
    pub problem: Option<String>,
}

/// Every change to the record.
#[derive(Clone, Debug, PartialEq)]
pub enum RecordAction {
    /// A record file's text was read.
    Open {
        /// The file's name.
        name: String,
        /// Its text.
        text: String,
    },
    /// A file could not be read at all.
    Unreadable {
        /// The file's name.
        name: String,
        /// Why, in words.
        why: String,
    },
    /// How the time box is read.
    WhenMode(WhenMode),
    /// The time box's text.
    WhenText(String),
    /// The readings on screen as a sample; `now_s` is the device's time of
    /// day, seconds after midnight.
    AddSample {
        /// The device's time of day.
        now_s: f64,
    },
    /// The position on screen as a change.
    MarkPosition {
        /// The device's time of day.
        now_s: f64,
    },
    /// The i-th position change removed.
    RemoveChange(usize),
    /// The record starts in the position on screen.
    StartHere,
    /// A rule box's text.
    Rule(Rule, String),
    /// Analyse the record as it is now.
    Analyse,
    /// Close the record: everything in it goes.
    Close,
    /// The ward row's source.
    WardSource(usize),
    /// The ward row's time box.
    WardTime(String),
    /// The ward row's blood pressure box.
    WardBp(String),
    /// A source's readings at one time replaced by a blood pressure typed
    /// in the list under the chart.
    EditReading {
        /// The source's id.
        id: String,
        /// When, seconds from the start.
        t_s: f64,
        /// The blood pressure as typed.
        text: String,
    },
    /// A source's readings at one time taken out.
    RemoveReading {
        /// The source's id.
        id: String,
        /// When, seconds from the start.
        t_s: f64,
    },
}

impl Record {
    /// Whether there is no record.
    pub fn is_empty(&self) -> bool {
        self.spec.channels.is_empty() && self.spec.positions.is_empty()
    }

    /// How many samples the record holds.
    pub fn samples(&self) -> usize {
        self.spec.channels.iter().map(|c| c.t_s.len()).sum()
    }

    /// The last entry's time, seconds from the start.
    pub fn last_s(&self) -> Option<f64> {
        self.spec
            .channels
            .iter()
            .filter_map(|c| c.t_s.last().copied())
            .chain(self.spec.positions.iter().map(|p| p.at_s))
            .reduce(f64::max)
    }

    /// The record's clock start, seconds after midnight.
    pub fn clock_start_s(&self) -> Option<f64> {
        self.spec.clock_start.as_deref().and_then(time_of_day)
    }

    /// The record as it is written in a case, rules included.
    pub fn timeline(&self) -> TimelineSpec {
        TimelineSpec {
            rules: self.rules.clone(),
            ..(*self.spec).clone()
        }
    }

    /// `case` with the record joined in, as the core and the command line
    /// read it: the case's position is the one the record starts in.
    pub fn join(&self, case: &Case) -> Case {
        if self.is_empty() {
            return case.clone();
        }
        Case {
            timeline: Some(self.timeline()),
            ..self.starting(case)
        }
    }

    /// `case` in the position the record starts in, without the record.
    fn starting(&self, case: &Case) -> Case {
        Case {
            position: self.start.clone().or_else(|| case.position.clone()),
            ..case.clone()
        }
    }

    /// Takes a record riding in the form's case into this one, starting in
    /// the position on screen, so the form never carries it.
    pub fn adopt(&mut self, form: &mut Form) {
        if form.base().timeline.is_none() {
            return;
        }
        let mut base = form.base().clone();
        let Some(mut spec) = base.timeline.take() else {
            return;
        };
        *form = form.clone().with_base(base);
        self.start = form.position.spec(&mut Errors::default());
        self.rules = std::mem::take(&mut spec.rules);
        self.rule_texts =
            Rule::ALL.map(|r| r.get(&self.rules).map(number_text).unwrap_or_default());
        self.spec = Rc::new(spec);
        self.opened = None;
        self.file = None;
        self.entry = None;
        self.analysis = None;
        self.case_changed();
    }

    /// The case or the record changed: the analysis is out of date.
    pub fn case_changed(&mut self) {
        if !self.is_empty() {
            self.pending = true;
            self.generation += 1;
        }
    }

    /// The scene the record starts in, with the record checked against it.
    fn checked<'a>(&self, basis: Basis<'a>) -> Result<(Cow<'a, Scene>, Timeline), Errors> {
        let scene = match &self.start {
            Some(start) if basis.case.position.as_ref() != Some(start) => {
                Cow::Owned(Scene::from_case(&self.starting(basis.case))?)
            }
            _ => Cow::Borrowed(basis.scene),
        };
        let timeline = Timeline::from_spec(&self.timeline(), &scene)?;
        Ok((scene, timeline))
    }

    /// The organ-level series as CSV, for download.
    ///
    /// # Errors
    /// A record that does not fit the case.
    pub fn series_csv(&self, basis: Basis<'_>) -> Result<String, Errors> {
        let (scene, timeline) = self.checked(basis)?;
        Ok(record::series_csv(&scene, &timeline))
    }

    fn analyse(&mut self, basis: Option<Basis<'_>>) {
        self.pending = false;
        if self.is_empty() {
            self.analysis = None;
            self.fit = Errors::default();
            return;
        }
        let Some(basis) = basis else {
            return;
        };
        match self.checked(basis) {
            Ok((scene, timeline)) => {
                self.analysis = Some(Rc::new(self.analysed(&scene, &timeline)));
                self.fit = Errors::default();
            }
            Err(errors) => self.fit = errors,
        }
    }

    fn analysed(&self, scene: &Scene, timeline: &Timeline) -> Analysis {
        let exposure = record::analyze(scene, timeline, None);
        let changes: Vec<f64> = self.spec.positions.iter().map(|p| p.at_s).collect();
        // The readings' times, for their marks; a monitor's stream has too
        // many to mark, and is not gathered.
        let mut readings: Vec<f64> = Vec::new();
        if self.samples() <= 3 * trend::MARKED {
            readings.extend(
                self.spec
                    .channels
                    .iter()
                    .flat_map(|c| c.t_s.iter().copied()),
            );
            readings.sort_by(f64::total_cmp);
            readings.dedup();
        }
        let trends = record::series(scene, timeline)
            .iter()
            .map(|s| {
                let drawn: Vec<(usize, &TargetExposure)> = exposure
                    .targets
                    .iter()
                    .enumerate()
                    .filter(|(_, t)| (t.organ, t.metric) == (s.organ, s.metric))
                    .collect();
                Rc::new(Trend::new(
                    s,
                    &drawn,
                    (exposure.from_s, exposure.to_s),
                    &changes,
                    &readings,
                ))
            })
            .collect();
        let channels = timeline
            .channels
            .iter()
            .map(|c| ChannelInfo {
                name: c.name.clone(),
                samples: c.t_s.len(),
                sampling: c.sampling,
                estimated: c.estimated,
            })
            .collect();
        Analysis {
            exposure,
            trends,
            channels,
        }
    }

    /// Reads the time box for an entry, setting the clock start of a
    /// record it begins.
    fn entry_time(&mut self, now_s: f64) -> Option<f64> {
        match self.when.read(self.clock_start_s(), self.last_s(), now_s) {
            Ok(at) => Some(at.t_s),
            Err(why) => {
                self.entry = Some(why);
                None
            }
        }
    }

    /// Applies one change. `basis` is the last good check; `stale` says the
    /// boxes on screen differ from it.
    pub fn apply(&mut self, action: RecordAction, basis: Option<Basis<'_>>, stale: bool) {
        match action {
            RecordAction::Open { name, text } => self.open(name, &text, basis),
            RecordAction::Unreadable { name, why } => {
                self.file = Some(FileProblems {
                    name,
                    errors: Error::missing("", why).into(),
                });
            }
            RecordAction::WhenMode(mode) => {
                self.when.mode = mode;
                self.entry = None;
            }
            RecordAction::WhenText(text) => {
                self.when.text = text;
                self.entry = None;
            }
            RecordAction::AddSample { now_s } => self.add_sample(now_s, basis, stale),
            RecordAction::MarkPosition { now_s } => self.mark_position(now_s, basis, stale),
            RecordAction::RemoveChange(i) => {
                if i < self.spec.positions.len() {
                    Rc::make_mut(&mut self.spec).positions.remove(i);
                    self.analyse(basis);
                }
            }
            RecordAction::StartHere => {
                if let Some(position) = basis.and_then(|b| b.case.position.clone()) {
                    self.start = Some(position);
                    self.analyse(basis);
                }
            }
            RecordAction::Rule(rule, text) => {
                if let Ok(value) = Rule::read(&text) {
                    rule.set(&mut self.rules, value);
                }
                if let Some(slot) = self.rule_texts.get_mut(rule.slot()) {
                    *slot = text;
                }
                self.case_changed();
            }
            RecordAction::Analyse => self.analyse(basis),
            RecordAction::Close => {
                *self = Record {
                    when: self.when.clone(),
                    ward: Ward {
                        bp: String::new(),
                        problem: None,
                        ..self.ward.clone()
                    },
                    ..Record::default()
                }
            }
            RecordAction::WardSource(i) => self.ward.source = i,
            RecordAction::WardTime(text) => {
                self.ward.time = text;
                self.ward.problem = None;
            }
            RecordAction::WardBp(text) => {
                self.ward.bp = text;
                self.ward.problem = None;
            }
            RecordAction::EditReading { id, t_s, text } => {
                let read = read_blood_pressure(&text, PressureUnit::MmHg)
                    .and_then(|bp| entry::fits(&self.spec, &id, t_s, &bp).map(|()| bp));
                match read {
                    Ok(bp) => {
                        entry::set_reading(Rc::make_mut(&mut self.spec), &id, t_s, Some(&bp));
                        self.ward.problem = None;
                        self.note = Some(format!("Reading at {} changed.", elapsed_words(t_s)));
                        self.analyse(basis);
                    }
                    Err(why) => self.ward.problem = Some(why),
                }
            }
            RecordAction::RemoveReading { id, t_s } => {
                entry::set_reading(Rc::make_mut(&mut self.spec), &id, t_s, None);
                self.note = Some(format!("Reading at {} removed.", elapsed_words(t_s)));
                self.analyse(basis);
            }
        }
    }

    fn open(&mut self, name: String, text: &str, basis: Option<Basis<'_>>) {
        let Some(basis) = basis else {
            return;
        };
        let imported = csv::import(text, basis.scene);
        match imported {
            Err(errors) => {
                self.note = Some(format!(
                    "{name} was not opened: {} problems, nothing imported.",
                    errors.iter().count()
                ));
                self.file = Some(FileProblems { name, errors });
            }
            Ok(imported) => {
                if self.is_empty() {
                    self.start = basis.case.position.clone();
                }
                let spec = Rc::make_mut(&mut self.spec);
                spec.channels = imported.channels;
                if imported.clock_start.is_some() {
                    spec.clock_start = imported.clock_start;
                }
                self.note = Some(format!("Opened {name}: {} samples.", self.samples()));
                self.opened = Some(name);
                self.file = None;
                self.entry = None;
                self.analyse(Some(basis));
            }
        }
    }

    fn add_sample(&mut self, now_s: f64, basis: Option<Basis<'_>>, stale: bool) {
        let Some(basis) = basis.filter(|_| !stale) else {
            self.entry = Some(
                "fix the marked entries first: a sample takes the readings of a complete check"
                    .to_owned(),
            );
            return;
        };
        let Some(t_s) = self.entry_time(now_s) else {
            return;
        };
        let readings = entry::readings(basis.case, &self.spec);
        let mut spec = (*self.spec).clone();
        if let Err(why) = entry::add_sample(&mut spec, t_s, &readings) {
            self.entry = Some(why);
            return;
        }
        self.begin(&mut spec, basis.case, now_s);
        self.note = Some(format!(
            "Added {} readings at {}.",
            readings.len(),
            elapsed_words(t_s)
        ));
        self.spec = Rc::new(spec);
        self.analyse(Some(basis));
    }

    fn mark_position(&mut self, now_s: f64, basis: Option<Basis<'_>>, stale: bool) {
        let Some((basis, position)) = basis
            .filter(|_| !stale)
            .and_then(|b| Some((b, b.case.position.clone()?)))
        else {
            self.entry = Some(
                "a position change takes the position of a complete check: set the position \
                 and fix the marked entries first"
                    .to_owned(),
            );
            return;
        };
        let Some(t_s) = self.entry_time(now_s) else {
            return;
        };
        let mut spec = (*self.spec).clone();
        if let Err(why) = entry::add_change(&mut spec, t_s, position) {
            self.entry = Some(why);
            return;
        }
        self.begin(&mut spec, basis.case, now_s);
        self.note = Some(format!("Position change marked at {}.", elapsed_words(t_s)));
        self.spec = Rc::new(spec);
        self.analyse(Some(basis));
    }

    /// Adds a blood pressure from the ward row at `t_s`; a record it begins
    /// starts in the position on screen at `clock_start` (seconds after
    /// midnight).
    ///
    /// # Errors
    /// A source that already has a reading at that time; the record is then
    /// unchanged.
    pub(crate) fn add_ward(
        &mut self,
        t_s: f64,
        clock_start: Option<f64>,
        readings: &[(String, plumbline_core::units::PressureEntry)],
        basis: Basis<'_>,
    ) -> Result<(), String> {
        let mut spec = (*self.spec).clone();
        entry::add_sample(&mut spec, t_s, readings)?;
        self.ward.problem = None;
        if self.is_empty() {
            self.start = basis.case.position.clone();
            spec.clock_start = clock_start.map(clock_words);
        }
        self.note = Some(format!("Added a reading at {}.", elapsed_words(t_s)));
        self.spec = Rc::new(spec);
        self.analyse(Some(basis));
        Ok(())
    }

    /// A record begun by an entry starts in the position on screen and,
    /// when its first entry was timed by a clock, at that clock time.
    fn begin(&mut self, spec: &mut TimelineSpec, case: &Case, now_s: f64) {
        self.entry = None;
        if self.is_empty() {
            self.start = case.position.clone();
            if let Ok(at) = self.when.read(None, None, now_s) {
                spec.clock_start = at.clock_start.map(clock_words);
            }
        }
    }
}

/// The demo case carrying a record of `samples` line means at 1 Hz, all
/// `mean` (in the case's own mmHg text), for the tests of every layer that
/// keeps or restores a record.
#[cfg(test)]
pub(crate) fn demo_with_record(samples: u32, mean: f64) -> Case {
    let mut case = Case::from_json(plumbline_core::demo::CASE_JSON).unwrap_or_default();
    case.timeline = Some(TimelineSpec {
        channels: vec![plumbline_core::case::ChannelSpec {
            channel: "radial line.mean".into(),
            unit: plumbline_core::units::PressureUnit::MmHg,
            t_s: (0..samples).map(f64::from).collect(),
            values: vec![mean; samples as usize],
        }],
        ..TimelineSpec::default()
    });
    case
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use plumbline_core::demo::CASE_JSON;
    use plumbline_core::geometry::Posture;

    const RECORD: &str = include_str!("../../../../examples/beach-chair-record.csv");

    fn demo() -> Case {
        Case::from_json(CASE_JSON).unwrap()
    }

    /// A case with its scene, as the state's check leaves them.
    struct Gated(Case, Scene);

    impl Gated {
        fn basis(&self) -> Basis<'_> {
            Basis {
                case: &self.0,
                scene: &self.1,
            }
        }
    }

    fn gated(case: Case) -> Gated {
        let scene = Scene::from_case(&case).unwrap();
        Gated(case, scene)
    }

    fn opened() -> Record {
        let mut r = Record::default();
        r.apply(
            RecordAction::Open {
                name: "beach-chair-record.csv".into(),
                text: RECORD.into(),
            },
            Some(gated(demo()).basis()),
            false,
        );
        r
    }

    #[test]
    fn an_opened_file_gives_the_clis_exposure() {
        let r = opened();
        assert!(r.file.is_none() && r.fit.is_empty());
        let a = r.analysis.as_ref().unwrap();
        let cli = record::Recorded::import(&demo(), RECORD, &Default::default()).unwrap();
        assert_eq!(a.exposure, cli.exposure());
        assert_eq!(
            a.trends.len(),
            3,
            "CPP, MAP at brain level, MAP at the heart"
        );
        assert_eq!(
            a.trends[1].targets,
            vec![1, 2],
            "two targets on MAP at brain level"
        );
        assert_eq!(
            a.trends[2].targets,
            vec![3, 4],
            "two targets on MAP at the heart"
        );
        assert!(a.channels.iter().any(|c| c.estimated));
        assert_eq!(r.start, demo().position);
        assert_eq!(r.opened.as_deref(), Some("beach-chair-record.csv"));
    }

    #[test]
    fn a_bad_file_imports_nothing_and_names_every_line() {
        let mut r = opened();
        let before = r.spec.clone();
        let bad = "elapsed_s,radial line.mean [mmHg],femoral.mean [mmHg]\n0,74,1\nx,70,\n5,700,\n";
        r.apply(
            RecordAction::Open {
                name: "bad.csv".into(),
                text: bad.into(),
            },
            Some(gated(demo()).basis()),
            false,
        );
        assert_eq!(r.spec, before);
        let fields: Vec<String> = r
            .file
            .unwrap()
            .errors
            .iter()
            .map(|e| e.field().to_owned())
            .collect();
        assert_eq!(
            fields,
            vec!["line 1, column 3", "line 3, column 1", "line 4, column 2"]
        );
    }

    #[test]
    fn same_as_last_adds_a_sample_at_a_new_time() {
        let mut r = opened();
        r.apply(RecordAction::WhenMode(WhenMode::Elapsed), None, false);
        r.apply(RecordAction::WhenText("0:25:00".into()), None, false);
        let before = r.samples();
        r.apply(
            RecordAction::AddSample { now_s: 0.0 },
            Some(gated(demo()).basis()),
            false,
        );
        assert_eq!(r.entry, None);
        // The file's channels only: line mean, cuff systolic and diastolic.
        assert_eq!(r.samples(), before + 3);
        assert_eq!(r.last_s(), Some(1500.0));
        // Again at the same time: refused, nothing added.
        r.apply(
            RecordAction::AddSample { now_s: 0.0 },
            Some(gated(demo()).basis()),
            false,
        );
        assert!(r.entry.as_deref().unwrap().contains("already has"));
        assert_eq!(r.samples(), before + 3);
        // Not while the boxes on screen are not a complete check.
        r.apply(RecordAction::WhenText("+5".into()), None, false);
        r.apply(
            RecordAction::AddSample { now_s: 0.0 },
            Some(gated(demo()).basis()),
            true,
        );
        assert!(r
            .entry
            .as_deref()
            .unwrap()
            .contains("fix the marked entries"));
    }

    #[test]
    fn a_record_started_on_screen_takes_the_devices_clock() {
        let mut r = Record::default();
        let eight = 8.0 * 3600.0;
        r.apply(
            RecordAction::AddSample { now_s: eight },
            Some(gated(demo()).basis()),
            false,
        );
        assert_eq!(r.spec.clock_start.as_deref(), Some("08:00:00"));
        r.apply(
            RecordAction::AddSample {
                now_s: eight + 300.0,
            },
            Some(gated(demo()).basis()),
            false,
        );
        assert_eq!(r.last_s(), Some(300.0));
        assert_eq!(r.samples(), 12);
        assert!(r.analysis.is_some());
    }

    #[test]
    fn the_analysis_reuses_the_checked_scene_unless_the_record_starts_elsewhere() {
        let r = opened();
        let here = gated(demo());
        assert!(matches!(
            r.checked(here.basis()).unwrap().0,
            Cow::Borrowed(_)
        ));
        let mut moved = demo();
        moved.position = Some(PositionSpec::new(Posture::Supine));
        let moved = gated(moved);
        let (scene, _) = r.checked(moved.basis()).unwrap();
        assert!(
            matches!(scene, Cow::Owned(_)),
            "the record starts in the demo's position"
        );
        assert_eq!(scene.position, here.1.position);
    }

    #[test]
    fn a_position_change_changes_the_exposure_as_the_core_says() {
        let mut r = opened();
        let cpp = |r: &Record| r.analysis.as_ref().unwrap().exposure.targets[0].area_mmhg_min;
        let before = cpp(&r);
        let mut supine = demo();
        supine.position = Some(PositionSpec::new(Posture::Supine));
        let supine = gated(supine);
        r.apply(RecordAction::WhenMode(WhenMode::Elapsed), None, false);
        r.apply(RecordAction::WhenText("0:10:00".into()), None, false);
        r.apply(
            RecordAction::MarkPosition { now_s: 0.0 },
            Some(supine.basis()),
            false,
        );
        assert_eq!(r.entry, None);
        assert!(cpp(&r) < before, "lying flat lifts CPP at the tragus");
        let joined = r.join(&supine.0);
        assert_eq!(
            joined.position,
            demo().position,
            "the record starts in beach chair"
        );
        let cli = record::Recorded::of_case(joined).unwrap().exposure();
        assert_eq!(r.analysis.as_ref().unwrap().exposure, cli);
        r.apply(RecordAction::RemoveChange(0), Some(supine.basis()), false);
        assert!((cpp(&r) - before).abs() < 1e-9);
    }

    #[test]
    fn rules_apply_after_a_pause_and_out_of_range_ones_are_named() {
        let mut r = opened();
        let g = r.generation;
        r.apply(
            RecordAction::Rule(Rule::MinEpisode, "60".into()),
            None,
            false,
        );
        assert!(r.pending && r.generation > g);
        r.apply(RecordAction::Analyse, Some(gated(demo()).basis()), false);
        assert!(!r.pending);
        let targets = &r.analysis.as_ref().unwrap().exposure.targets;
        assert!(targets.iter().any(|t| t.ignored_episodes > 0));
        assert!(r
            .analysis
            .as_ref()
            .unwrap()
            .exposure
            .rules
            .contains("shorter than 1 min"));
        r.apply(RecordAction::Rule(Rule::Hold, "5000".into()), None, false);
        r.apply(RecordAction::Analyse, Some(gated(demo()).basis()), false);
        assert_eq!(r.fit.for_field(Rule::Hold.path()).count(), 1);
        assert!(r.analysis.is_some(), "the last good analysis stays");
        assert!(Rule::read("ten").is_err());
        assert_eq!(capital("line 3, column 2"), "Line 3, column 2");
        assert_eq!(capital(""), "");
        assert_eq!(Rule::read(" 30 s"), Ok(Some(30.0)));
        assert_eq!(Rule::read(""), Ok(None));
    }

    #[test]
    fn a_record_riding_in_the_form_moves_out_of_it() {
        let mut case = demo();
        case.timeline = Some(
            record::Recorded::import(&demo(), RECORD, &Default::default())
                .unwrap()
                .case
                .timeline
                .unwrap(),
        );
        let mut form = Form::from_case(&case);
        let mut r = Record::default();
        r.adopt(&mut form);
        assert!(form.base().timeline.is_none());
        assert_eq!(form.to_case().unwrap(), demo());
        assert!(r.pending && !r.is_empty());
        assert_eq!(r.join(&demo()), case);
        r.apply(RecordAction::Close, None, false);
        assert!(r.is_empty() && r.analysis.is_none());
    }
}

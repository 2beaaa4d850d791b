//! The screen's one state and the reducer that changes it.
//!
//! Every change goes through [`State::reduce`]: the form takes the change,
//! then the core checks the case again. Typing is the exception: a
//! keystroke only changes the form and marks the answer as updating, and
//! the check runs once typing pauses ([`Action::Recheck`], sent by the app
//! after [`CHECK_PAUSE_MS`]), or at once when any other action comes first,
//! so a slow tablet never holds a keystroke behind a check and a render of
//! every result. A case that cannot be checked keeps the last good report
//! on screen, marked stale, with every problem named.
//!
//! The reducer is pure: it computes the next state and touches nothing
//! else. Saving on the device, the address's fragment, the clipboard and
//! downloads run outside it (`app`, `persist`, the components). Changes to
//! the whole check (the start, a new check, a link) live in `whole`.

mod start;
mod ward;
mod whole;

use std::collections::BTreeSet;
use std::rc::Rc;

use plumbline_core::case::Case;
use plumbline_core::check;
use plumbline_core::demo::CASE_JSON;
use plumbline_core::error::Errors;
use plumbline_core::landmark::Landmark;
use plumbline_core::reading::Level;
use plumbline_core::report::Report;
use plumbline_core::scene::Scene;
use yew::{Reducible, UseReducerDispatcher, UseReducerHandle};

use crate::form::{Edit, Form};
use crate::record::{Basis, Record, RecordAction};
use crate::session::{Session, SessionAction};
pub use crate::theme::Theme;

/// What components hold to send actions to the state.
pub type Dispatch = UseReducerDispatcher<State>;

/// What panels hold: the state to read, and a way to change it.
pub type Handle = UseReducerHandle<State>;

/// A completed check: the report and the case document it came from.
#[derive(Debug)]
pub struct Checked {
    /// The core's report.
    pub report: Report,
    /// The case checked.
    pub case: Case,
    /// The case as the core gated it, which the record's analysis reuses.
    pub scene: Scene,
    /// The case as JSON, exactly as checked.
    pub case_json: String,
}

/// Everything the screen shows.
#[derive(Clone, Debug, PartialEq)]
pub struct State {
    /// The boxes as typed.
    pub form: Form,
    /// The last completed check.
    pub checked: Option<Rc<Checked>>,
    /// Why the current form could not be checked; empty when it was.
    pub errors: Errors,
    /// The colour theme.
    pub theme: Theme,
    /// The invented demo case, to say so while it is on screen.
    demo: Option<Rc<Case>>,
    /// Saving, links, a check set aside, updates (`session`).
    pub session: Session,
    /// The record over time, held beside the form (`record`).
    pub record: Record,
    /// Whether the form was typed into since the last check.
    pub pending: bool,
    /// Keystrokes so far (wrapping): each one restarts the pause.
    pub keystrokes: u32,
}

/// The pause in typing after which the check runs: short enough to read
/// as at once, long enough that a run of keystrokes costs one check.
pub const CHECK_PAUSE_MS: u32 = 150;

/// Every change to the state.
#[derive(Clone, Debug, PartialEq)]
pub enum Action {
    /// A change to the form.
    Edit(Edit),
    /// The check of what was typed, once typing pauses.
    Recheck,
    /// The demo case, as on start.
    LoadDemo,
    /// Another colour theme.
    Theme(Theme),
    /// A change to the session: a new check, a link, a set-aside check.
    Session(SessionAction),
    /// A change to the record over time.
    Record(RecordAction),
    /// The ward row's blood pressure added to the record (and, when it is
    /// the latest, to the screen); `now_s` is the device's time of day.
    AddReading {
        /// Seconds after midnight.
        now_s: f64,
    },
}

impl State {
    /// The screen on start: the demo case, checked.
    pub fn demo(theme: Theme) -> Self {
        let mut state = State::demo_unchecked(theme);
        if state.errors.is_empty() {
            state.recheck();
        }
        state
    }

    /// The demo case in the form, not yet checked: a start that opens a
    /// saved check or a link instead checks only what it shows.
    pub(super) fn demo_unchecked(theme: Theme) -> Self {
        // The demo is read by the core's own reader, as saved checks and
        // share links are: one reader in the download (a second, plain
        // serde reader of the case cost 17 KB gzip).
        let (form, errors, demo) = match Case::from_json(CASE_JSON) {
            Ok(case) => (Form::of_demo(&case), Errors::default(), Some(Rc::new(case))),
            Err(errors) => (Form::from_case(&Case::new()), errors, None),
        };
        State {
            form,
            checked: None,
            errors,
            theme,
            demo,
            session: Session::default(),
            record: Record::default(),
            pending: false,
            keystrokes: 0,
        }
    }

    /// Checks the form's case with the core.
    pub(crate) fn recheck(&mut self) {
        self.pending = false;
        // A record riding in the form's case moves beside it first, so no
        // keystroke copies or checks it.
        self.record.adopt(&mut self.form);
        match self.form.to_case().and_then(|case| {
            let (scene, report) = check::check_keeping_scene(&case)?;
            Ok((case, scene, report))
        }) {
            Ok((case, scene, report)) => {
                self.checked = Some(Rc::new(Checked {
                    report,
                    case_json: case.to_json(),
                    case,
                    scene,
                }));
                self.errors = Errors::default();
                self.record.case_changed();
            }
            Err(errors) => self.errors = errors,
        }
    }

    /// One sentence for screen readers after every change: what the check
    /// found, or why it could not run.
    pub fn announcement(&self) -> String {
        let n = self.errors.iter().count();
        match (&self.checked, n) {
            (Some(c), 0) => c.report.summary.headline.clone(),
            (Some(_), n) => format!(
                "{}. The results shown are from the last good check.",
                not_checked_words(n)
            ),
            (None, n) => format!("{}.", not_checked_words(n)),
        }
    }

    /// Whether the results on screen are those of the invented demo case,
    /// so nobody mistakes them for a patient's.
    pub fn shows_demo(&self) -> bool {
        match (&self.checked, &self.demo) {
            (Some(c), Some(demo)) => c.case == **demo,
            _ => false,
        }
    }

    /// Whether the report on screen is older than the form.
    pub fn is_stale(&self) -> bool {
        !self.errors.is_empty()
    }

    /// The messages to show beside the box at `path`: its errors, then its
    /// warnings from the last check.
    pub fn messages(&self, path: &str) -> Vec<Message> {
        self.notes().at(path)
    }

    /// The messages of the check on screen, by path: its problems and the
    /// warnings of the last good check.
    pub fn notes(&self) -> std::rc::Rc<crate::notes::Notes> {
        let warnings = self
            .checked
            .as_ref()
            .map(|c| c.report.warnings.clone())
            .unwrap_or_default();
        std::rc::Rc::new(crate::notes::Notes::new(self.errors.clone(), warnings))
    }
}

/// "Not checked" with the number of entries to fix, in words.
pub fn not_checked_words(n: usize) -> String {
    if n == 1 {
        "Not checked: 1 entry needs attention".to_owned()
    } else {
        format!("Not checked: {n} entries need attention")
    }
}

pub use crate::notes::Message;

/// Two checks are the same when their cases are: the scene and the report
/// follow from the case, so comparing the case's text is enough, and panels
/// holding a check compare one string on each render instead of a scene and
/// a whole report.
impl PartialEq for Checked {
    fn eq(&self, other: &Self) -> bool {
        self.case_json == other.case_json
    }
}

impl Checked {
    /// The check as the record's analysis takes it.
    pub fn basis(&self) -> Basis<'_> {
        Basis {
            case: &self.case,
            scene: &self.scene,
        }
    }

    /// The landmarks worth a label in the picture: the heart reference, each
    /// checked organ's level, and every landmark a reading refers to.
    pub fn key_landmarks(&self) -> BTreeSet<Landmark> {
        let mut set = BTreeSet::new();
        set.insert(Landmark::Heart);
        set.extend(self.report.organs.iter().filter_map(|o| o.level));
        let at = |level: &Level| match level {
            Level::At(l) => Some(*l),
            Level::Height(_) => None,
        };
        set.extend(self.case.arterial.iter().filter_map(|a| at(&a.level)));
        set.extend(self.case.readings.values().filter_map(|r| at(&r.level)));
        set.extend(self.case.assume.iter().filter_map(|(q, a)| match &a.level {
            Some(level) => at(level),
            None => q.usual_level(),
        }));
        set
    }

    /// The backrest angle of the checked position, from the core.
    pub fn backrest_deg(&self) -> Option<f64> {
        let position = self.case.position.as_ref()?.resolve("position").ok()?;
        Some(position.angles.backrest_deg)
    }
}

impl Reducible for State {
    type Action = Action;

    fn reduce(self: Rc<Self>, action: Action) -> Rc<Self> {
        // Nothing typed waits (Print asks every time): the same state, so
        // nothing is cloned and the page is not rendered again.
        if action == Action::Recheck && !self.pending {
            return self;
        }
        let mut next = (*self).clone();
        // Anything but typing acts on the form as it is now, checked.
        if next.pending && !matches!(action, Action::Edit(Edit::Text(..) | Edit::Step(..))) {
            next.recheck();
        }
        match action {
            Action::Edit(edit @ (Edit::Text(..) | Edit::Step(..))) => {
                next.form.apply(edit);
                next.pending = true;
                next.keystrokes = next.keystrokes.wrapping_add(1);
            }
            Action::Edit(edit) => {
                next.form.apply(edit);
                next.recheck();
            }
            Action::Recheck => {}
            Action::LoadDemo => next.replace_with_demo(),
            Action::Theme(theme) => next.theme = theme,
            Action::Session(action) => next.apply_session(action),
            Action::Record(action) => {
                let stale = next.is_stale();
                let basis = next.checked.as_deref().map(Checked::basis);
                next.record.apply(action, basis, stale);
            }
            Action::AddReading { now_s } => next.add_reading(now_s),
        }
        Rc::new(next)
    }
}

/// What the state's tests share: acting on a state as the screen does,
/// and a check with a record over time.
#[cfg(test)]
pub(crate) mod testing {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::form::{Slot, SourcePart};

    /// `action` applied by the reducer.
    pub fn act(state: State, action: SessionAction) -> State {
        Rc::try_unwrap(Rc::new(state).reduce(Action::Session(action))).unwrap()
    }

    /// The first source's mean typed as `text`.
    pub fn edit(state: State, text: &str) -> State {
        let slot = Slot::Source(0, SourcePart::Mean);
        let typed = Rc::new(state).reduce(Action::Edit(Edit::Text(slot, text.into())));
        Rc::try_unwrap(typed.reduce(Action::Recheck)).unwrap()
    }

    /// The demo with a record of 600 samples, as the screen holds it.
    pub fn with_record() -> State {
        let case = crate::record::demo_with_record(600, 70.0);
        let mut state = State::demo(Theme::Device);
        state.form = Form::from_case(&case);
        state.recheck();
        assert_eq!(state.record.samples(), 600);
        state
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::form::{Slot, SourcePart};

    /// `action` applied, and the check the pause in typing would bring.
    fn reduce(state: State, action: Action) -> State {
        let next = Rc::new(state).reduce(action).reduce(Action::Recheck);
        Rc::try_unwrap(next).unwrap()
    }

    #[test]
    fn typing_waits_for_the_pause_and_any_other_action_checks_first() {
        let state = State::demo(Theme::Device);
        let before = state.checked.clone().unwrap();
        let slot = Slot::Source(0, SourcePart::Mean);
        let typed = Rc::new(state).reduce(Action::Edit(Edit::Text(slot, "80".into())));
        assert!(typed.pending);
        assert_eq!(typed.checked.as_ref().unwrap(), &before, "not checked yet");
        let again = typed
            .clone()
            .reduce(Action::Edit(Edit::Text(slot, "81".into())));
        assert_ne!(
            again.keystrokes, typed.keystrokes,
            "each key restarts the pause"
        );
        let checked = again.clone().reduce(Action::Recheck);
        assert!(!checked.pending);
        let idle = checked.clone().reduce(Action::Recheck);
        assert!(Rc::ptr_eq(&idle, &checked), "nothing waits: the same state");
        assert!(checked.checked.as_ref().unwrap().case_json.contains("81"));
        // A tap on anything else checks what was typed before acting.
        let themed = again.reduce(Action::Theme(Theme::Dark));
        assert!(!themed.pending);
        assert!(themed.checked.as_ref().unwrap().case_json.contains("81"));
        // A choice (not typing) is checked at once.
        let chosen = themed.reduce(Action::Edit(Edit::AddSource));
        assert!(!chosen.pending);
    }

    #[test]
    fn the_demo_is_checked_on_start() {
        let state = State::demo(Theme::Device);
        assert!(!state.is_stale());
        let report = &state.checked.as_ref().unwrap().report;
        assert!(report.organs.iter().any(|o| o.label == "Brain"));
    }

    #[test]
    fn the_demo_is_named_until_the_case_changes() {
        let state = State::demo(Theme::Device);
        assert!(state.shows_demo());
        let slot = Slot::Source(0, SourcePart::Mean);
        let state = reduce(state, Action::Edit(Edit::Text(slot, "80".into())));
        assert!(!state.shows_demo());
        let state = reduce(state, Action::Edit(Edit::Text(slot, "74".into())));
        assert!(state.shows_demo());
    }

    #[test]
    fn a_bad_entry_keeps_the_last_report_and_marks_it_stale() {
        let state = State::demo(Theme::Device);
        let before = state.checked.clone().unwrap();
        let slot = Slot::Source(0, SourcePart::Mean);
        let state = reduce(state, Action::Edit(Edit::Text(slot, "7 4".into())));
        assert!(state.is_stale());
        assert!(state.announcement().starts_with("Not checked: 1 entry"));
        assert_eq!(state.checked.as_ref().unwrap(), &before);
        assert!(matches!(
            state.messages("arterial[0].mean").first(),
            Some(Message::Error(_))
        ));
        let state = reduce(state, Action::Edit(Edit::Text(slot, "80".into())));
        assert!(!state.is_stale());
        assert_ne!(state.checked.as_ref().unwrap(), &before);
    }

    #[test]
    fn an_out_of_range_value_gets_the_scenes_message() {
        let state = State::demo(Theme::Device);
        let slot = Slot::Source(0, SourcePart::Mean);
        let state = reduce(state, Action::Edit(Edit::Text(slot, "900".into())));
        let messages = state.messages("arterial[0].mean");
        assert!(
            matches!(messages.first(), Some(Message::Error(m)) if m.contains("outside")),
            "{messages:?}"
        );
    }

    #[test]
    fn the_picture_labels_the_landmarks_in_use() {
        let state = State::demo(Theme::Device);
        let checked = state.checked.unwrap();
        let set = checked.key_landmarks();
        for l in [
            Landmark::Heart,
            Landmark::Tragus,
            Landmark::UpperArmLeft,
            Landmark::CordThoracic,
        ] {
            assert!(set.contains(&l), "{l}");
        }
        assert_eq!(checked.backrest_deg(), Some(65.0));
        // CPP (with the demo's assumed ICP), MAP at brain level against its
        // floor and against baseline, and MAP at the heart against baseline.
        assert_eq!(checked.report.summary.missed_targets, 4);
    }
}

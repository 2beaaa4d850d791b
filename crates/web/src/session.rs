//! The check's life on this device: how the screen starts (from what was
//! saved, or a shared link), a new check, a check set aside and brought
//! back, and the notices that say what happened.
//!
//! Nothing here touches the browser: the start takes the saved texts and
//! the address's fragment as plain strings, so every path is a host test.
//! A whole check is never replaced silently: the one on screen, with its
//! record over time, is set aside first (`kept`), saved on the device,
//! until it is brought back or discarded.

use std::rc::Rc;

use plumbline_core::case::{ArterialSpec, Case};
use plumbline_core::error::Errors;
use plumbline_core::geometry::{PositionSpec, Posture};
use plumbline_core::landmark::Landmark;
use plumbline_core::reading::{Level, Method};
use plumbline_core::share;

use crate::form::Form;
use crate::record::Record;
use crate::state::{State, Theme};
use crate::storage::{self, SavedRecord};

/// What happened last to the whole check, for its notice.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Event {
    /// A new, blank check was started.
    NewCheck,
    /// The demo case replaced the check.
    Demo,
    /// A shared link's check was opened.
    LinkOpened,
    /// A link could not be opened; why, in words.
    LinkRefused(String),
    /// The set-aside check was brought back.
    BroughtBack,
}

/// A saved state that could not be read: its raw text, kept for download.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Unreadable {
    /// The text exactly as it was stored.
    pub raw: String,
    /// Why it could not be read.
    pub reason: String,
}

/// A check set aside: its boxes and its record over time.
#[derive(Clone, Debug, PartialEq)]
pub struct Kept {
    /// The boxes as they were.
    pub form: Form,
    /// Its record over time.
    pub record: Record,
}

/// The check's life on this device.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Session {
    /// The check set aside by the last new check, demo or link.
    pub kept: Option<Rc<Kept>>,
    /// A saved state that could not be read, until it is discarded.
    pub unreadable: Option<Rc<Unreadable>>,
    /// What happened last, until the notice is closed.
    pub event: Option<Event>,
    /// Whether the last attempt to save on the device failed.
    pub not_saved: bool,
    /// Whether a new version of the app is ready to use.
    pub update_ready: bool,
}

/// Every change to the session.
#[derive(Clone, Debug, PartialEq)]
pub enum SessionAction {
    /// Start a new, blank check (the one on screen is set aside).
    NewCheck,
    /// Bring the set-aside check back.
    BringBack,
    /// Discard the set-aside check.
    DiscardKept,
    /// Discard the unreadable saved state.
    DiscardUnreadable,
    /// Open a shared link's fragment.
    OpenLink(String),
    /// Close the notice about what happened last.
    CloseEvent,
    /// Whether saving on the device worked.
    Saved(bool),
    /// A new version of the app is waiting.
    UpdateReady,
    /// Not now: the new version is offered again at the next start.
    UpdateLater,
}

/// The texts the device had saved, as read at start.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Stored {
    /// Under [`storage::STATE_KEY`].
    pub state: Option<String>,
    /// Under [`storage::RECORD_KEY`].
    pub record: Option<String>,
    /// Under [`storage::KEPT_KEY`].
    pub kept: Option<String>,
    /// Under [`storage::KEPT_RECORD_KEY`].
    pub kept_record: Option<String>,
    /// Under [`storage::UNREADABLE_KEY`].
    pub unreadable: Option<String>,
}

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

/// Whether a page address's fragment is meant as a shared check (anything
/// but the page's own anchors, `#h-...` and `#f-...`, and an empty one).
pub fn is_link(fragment: &str) -> bool {
    let f = fragment.trim_start_matches('#');
    !(f.is_empty() || f.starts_with("h-") || f.starts_with("f-"))
}

/// A link's problems in words: the first few, each cut to a readable length.
fn refusal(errors: &Errors) -> String {
    let words: Vec<String> = errors
        .iter()
        .take(3)
        .map(|e| {
            let text = if e.field == "link" {
                e.kind.to_string()
            } else {
                e.to_string()
            };
            if text.chars().count() > 160 {
                format!("{}…", text.chars().take(160).collect::<String>())
            } else {
                text
            }
        })
        .collect();
    if words.is_empty() {
        "the link could not be read".to_owned()
    } else {
        words.join("; ")
    }
}

/// Reads a saved record, reporting one that cannot be read.
fn read_record(text: Option<&str>, fail: &mut impl FnMut(&str, String)) -> SavedRecord {
    match text.map(|t| (t, storage::decode_record(t))) {
        Some((_, Ok(record))) => record,
        Some((raw, Err(reason))) => {
            fail(raw, reason);
            SavedRecord::default()
        }
        None => SavedRecord::default(),
    }
}

/// The record on screen for a saved one, under `form`: it is taken in as a
/// record riding in the case is, then starts where it was saved to start.
fn record_of(form: &Form, saved: SavedRecord) -> Record {
    let mut record = Record::default();
    if let Some(timeline) = saved.timeline {
        let mut base = form.base().clone();
        base.timeline = Some(timeline);
        record.adopt(&mut form.clone().with_base(base));
        if saved.start.is_some() {
            record.start = saved.start;
        }
    }
    record
}

impl State {
    /// The screen on start: the saved check (or the demo), then a shared
    /// link's check when the address carries one.
    pub fn start(stored: Stored, fragment: Option<&str>) -> State {
        let mut unreadable = None;
        let mut fail = |raw: &str, reason: String| {
            // The first failure is the one offered for download.
            unreadable.get_or_insert_with(|| Unreadable {
                raw: raw.to_owned(),
                reason,
            });
        };
        let mut state = State::demo(Theme::Device);
        if let Some(raw) = stored.state.as_deref() {
            match storage::decode(raw) {
                Ok(saved) => {
                    state.theme = saved.theme;
                    let record = read_record(stored.record.as_deref(), &mut fail);
                    state.show(saved.form, record);
                }
                Err(reason) => fail(raw, reason),
            }
        }
        if let Some(raw) = stored.kept.as_deref() {
            match storage::decode(raw) {
                Ok(saved) => {
                    let record = read_record(stored.kept_record.as_deref(), &mut fail);
                    let record = record_of(&saved.form, record);
                    state.session.kept = Some(Rc::new(Kept {
                        form: saved.form,
                        record,
                    }));
                }
                Err(reason) => fail(raw, reason),
            }
        }
        // One set aside on an earlier visit, when nothing new failed.
        if let Some(raw) = stored.unreadable.as_deref() {
            let reason = storage::decode(raw)
                .err()
                .unwrap_or_else(|| "it was set aside on an earlier visit".to_owned());
            fail(raw, reason);
        }
        state.session.unreadable = unreadable.map(Rc::new);
        if let Some(fragment) = fragment.filter(|f| is_link(f)) {
            state.open_link(fragment);
        }
        state
    }

    /// Shows `form` and `record` as the whole check.
    fn show(&mut self, form: Form, record: SavedRecord) {
        self.record = record_of(&form, record);
        self.show_form(form);
    }

    /// Shows `form` as the whole check: the last report was of another
    /// check, so it goes, and the form is checked afresh.
    fn show_form(&mut self, form: Form) {
        self.form = form;
        self.checked = None;
        self.recheck();
    }

    /// Whether the check on screen holds anything worth setting aside: a
    /// record, or boxes that are neither blank nor the untouched demo.
    fn worth_keeping(&self) -> bool {
        let untouched_demo = self.shows_demo() && !self.is_stale();
        !self.record.is_empty() || !untouched_demo && self.form != Form::from_case(&blank_case())
    }

    /// Sets the check on screen aside, with its record, when `next` would
    /// replace something worth keeping; an earlier set-aside check stays
    /// otherwise.
    fn set_aside(&mut self, next: &Form) {
        if (*next != self.form || !self.record.is_empty()) && self.worth_keeping() {
            self.session.kept = Some(Rc::new(Kept {
                form: self.form.clone(),
                record: std::mem::take(&mut self.record),
            }));
        }
    }

    /// Replaces the whole check with `form` and no record, setting the one
    /// on screen aside.
    fn replace(&mut self, form: Form, event: Event) {
        self.set_aside(&form);
        self.record = Record::default();
        self.show_form(form);
        self.session.event = Some(event);
    }

    /// The demo case, with the check on screen set aside.
    pub fn replace_with_demo(&mut self) {
        let mut demo = State::demo(self.theme);
        self.set_aside(&demo.form);
        demo.session = Session {
            event: Some(Event::Demo),
            ..std::mem::take(&mut self.session)
        };
        *self = demo;
    }

    /// Opens a shared link's fragment; a link that cannot be read changes
    /// nothing but the notice.
    pub fn open_link(&mut self, fragment: &str) {
        match share::decode(fragment) {
            Ok(case) => self.replace(Form::from_case(&case), Event::LinkOpened),
            Err(errors) => self.session.event = Some(Event::LinkRefused(refusal(&errors))),
        }
    }

    /// Applies one change to the session.
    pub fn apply_session(&mut self, action: SessionAction) {
        match action {
            SessionAction::NewCheck => {
                self.replace(Form::from_case(&blank_case()), Event::NewCheck)
            }
            SessionAction::BringBack => {
                if let Some(kept) = self.session.kept.take() {
                    let Kept { form, record } = Rc::unwrap_or_clone(kept);
                    self.record = record;
                    self.show_form(form);
                    self.session.event = Some(Event::BroughtBack);
                }
            }
            SessionAction::DiscardKept => {
                self.session.kept = None;
                self.session.event = None;
            }
            SessionAction::DiscardUnreadable => self.session.unreadable = None,
            SessionAction::OpenLink(fragment) => self.open_link(&fragment),
            SessionAction::CloseEvent => self.session.event = None,
            SessionAction::Saved(ok) => self.session.not_saved = !ok,
            SessionAction::UpdateReady => self.session.update_ready = true,
            SessionAction::UpdateLater => self.session.update_ready = false,
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::panic)]
    use super::*;
    use crate::form::{Edit, Slot, SourcePart};
    use crate::state::Action;
    use plumbline_core::demo::CASE_JSON;
    use yew::Reducible;

    fn act(state: State, action: SessionAction) -> State {
        Rc::try_unwrap(Rc::new(state).reduce(Action::Session(action))).unwrap()
    }

    fn edit(state: State, text: &str) -> State {
        let slot = Slot::Source(0, SourcePart::Mean);
        Rc::try_unwrap(Rc::new(state).reduce(Action::Edit(Edit::Text(slot, text.into())))).unwrap()
    }

    fn saved(state: &State) -> Stored {
        Stored {
            state: Some(storage::encode(&state.form, state.theme)),
            ..Stored::default()
        }
    }

    #[test]
    fn a_fresh_device_starts_with_the_demo() {
        let state = State::start(Stored::default(), None);
        assert!(state.shows_demo());
        assert_eq!(state.session, Session::default());
    }

    #[test]
    fn the_saved_check_comes_back_as_typed() {
        let before = edit(State::demo(Theme::Dark), "81");
        let state = State::start(saved(&before), Some("#h-verdicts"));
        assert_eq!(state.form, before.form);
        assert_eq!(state.theme, Theme::Dark);
        assert!(!state.shows_demo());
        assert_eq!(state.session.event, None, "a page anchor is no link");
        // A mistake comes back too, marked, with no report of another check.
        let state = State::start(saved(&edit(before, "8l")), None);
        assert!(state.is_stale());
        assert_eq!(state.checked, None);
    }

    #[test]
    fn an_unreadable_save_is_kept_for_download_and_the_demo_starts() {
        let stored = Stored {
            state: Some("{\"format\": \"plumbline-state\", \"vers".into()),
            ..Stored::default()
        };
        let state = State::start(stored, None);
        assert!(state.shows_demo());
        let unreadable = state.session.unreadable.clone().unwrap();
        assert!(unreadable.raw.ends_with("\"vers"));
        assert!(unreadable.reason.contains("incomplete"));
        let state = act(state, SessionAction::DiscardUnreadable);
        assert_eq!(state.session.unreadable, None);
        // Set aside on an earlier visit: still offered.
        let stored = Stored {
            unreadable: Some("garbage".into()),
            ..Stored::default()
        };
        assert!(State::start(stored, None).session.unreadable.is_some());
    }

    #[test]
    fn a_new_check_is_blank_and_can_be_undone() {
        let typed = edit(State::demo(Theme::Device), "90");
        let fresh = act(typed.clone(), SessionAction::NewCheck);
        assert_eq!(fresh.form, Form::from_case(&blank_case()));
        assert_eq!(fresh.checked, None, "no report of the previous patient");
        assert!(fresh.is_stale(), "values are still to be entered");
        assert_eq!(fresh.session.event, Some(Event::NewCheck));
        assert_eq!(
            fresh.session.kept.as_ref().map(|k| &k.form),
            Some(&typed.form)
        );
        let back = act(fresh, SessionAction::BringBack);
        assert_eq!(back.form, typed.form);
        assert_eq!(back.checked, typed.checked);
        assert_eq!(back.session.kept, None);
        // The untouched demo and a blank check are not worth setting aside.
        let fresh = act(State::demo(Theme::Device), SessionAction::NewCheck);
        assert_eq!(fresh.session.kept, None);
        let again = act(fresh, SessionAction::NewCheck);
        assert_eq!(again.session.kept, None);
    }

    #[test]
    fn the_demo_sets_the_check_aside_too() {
        let typed = edit(State::demo(Theme::Dark), "90");
        let demo = Rc::try_unwrap(Rc::new(typed.clone()).reduce(Action::LoadDemo)).unwrap();
        assert!(demo.shows_demo());
        assert_eq!(demo.theme, Theme::Dark);
        assert_eq!(
            demo.session.kept.as_ref().map(|k| &k.form),
            Some(&typed.form)
        );
    }

    #[test]
    fn a_shared_link_opens_its_check_and_keeps_the_saved_one() {
        let typed = edit(State::demo(Theme::Device), "90");
        let mut shared = Case::from_json(CASE_JSON).unwrap();
        shared.patient.height = Some(plumbline_core::units::LengthEntry::cm(180.0));
        let fragment = format!("#{}", share::encode(&shared));
        let state = State::start(saved(&typed), Some(&fragment));
        assert_eq!(state.form.to_case().unwrap(), shared);
        assert!(state.checked.is_some());
        assert_eq!(state.session.event, Some(Event::LinkOpened));
        assert_eq!(
            state.session.kept.as_ref().map(|k| &k.form),
            Some(&typed.form)
        );
        // The same link again keeps nothing more.
        let again = State::start(saved(&state), Some(&fragment));
        assert_eq!(again.session.kept, None);
    }

    #[test]
    fn a_bad_link_changes_nothing_but_the_notice() {
        let typed = edit(State::demo(Theme::Device), "90");
        let good = share::encode(&Case::from_json(CASE_JSON).unwrap());
        let cut = good.get(..good.len() / 2).unwrap().to_owned();
        for fragment in [
            "#<script>window.pwned = 1</script>",
            "#p1.<img src=x onerror=alert(1)>",
            &format!("#{cut}"),
            "#p9.abc",
            "#%3Cscript%3E",
        ] {
            let state = State::start(saved(&typed), Some(fragment));
            assert_eq!(state.form, typed.form, "{fragment}");
            match state.session.event {
                Some(Event::LinkRefused(words)) => {
                    assert!(!words.is_empty() && words.len() < 600, "{words}");
                }
                other => panic!("{fragment}: {other:?}"),
            }
        }
    }

    /// The demo with a record of 600 samples, as the screen holds it.
    fn with_record() -> State {
        let mut case = Case::from_json(CASE_JSON).unwrap();
        case.timeline = Some(plumbline_core::case::TimelineSpec {
            channels: vec![plumbline_core::case::ChannelSpec {
                channel: "radial line.mean".into(),
                unit: plumbline_core::units::PressureUnit::MmHg,
                t_s: (0..600).map(f64::from).collect(),
                values: vec![70.0; 600],
            }],
            ..Default::default()
        });
        let mut state = State::demo(Theme::Device);
        state.show_form(Form::from_case(&case));
        assert_eq!(state.record.samples(), 600);
        state
    }

    #[test]
    fn a_record_goes_aside_with_its_check_and_comes_back() {
        let state = with_record();
        let fresh = act(state.clone(), SessionAction::NewCheck);
        assert!(fresh.record.is_empty(), "a new check has no record");
        assert_eq!(fresh.session.kept.as_ref().unwrap().record.samples(), 600);
        let back = act(fresh, SessionAction::BringBack);
        assert_eq!(back.record.samples(), 600);
        assert_eq!(back.form, state.form);
    }

    #[test]
    fn a_saved_record_comes_back_with_its_start() {
        let mut state = with_record();
        state.record.start = Some(PositionSpec::new(Posture::Supine));
        let stored = Stored {
            record: storage::encode_record(&state.record),
            ..saved(&state)
        };
        let back = State::start(stored, None);
        assert_eq!(back.record.timeline(), state.record.timeline());
        assert_eq!(back.record.start, state.record.start);
        assert_eq!(back.form, state.form);
        // A damaged record is offered for download; the check still opens.
        let stored = Stored {
            record: Some(
                "{\"format\": \"plumbline-case\", \"version\": 1, \"timeline\": 4}".into(),
            ),
            ..saved(&state)
        };
        let back = State::start(stored, None);
        assert!(back.record.is_empty());
        assert_eq!(back.form, state.form);
        assert!(back
            .session
            .unreadable
            .unwrap()
            .reason
            .contains("record over time"));
    }

    #[test]
    fn saving_and_updates_raise_their_flags() {
        let state = act(State::demo(Theme::Device), SessionAction::Saved(false));
        assert!(state.session.not_saved);
        let state = act(state, SessionAction::Saved(true));
        assert!(!state.session.not_saved);
        let state = act(state, SessionAction::UpdateReady);
        assert!(state.session.update_ready);
        assert!(!act(state, SessionAction::UpdateLater).session.update_ready);
    }

    #[test]
    fn page_anchors_are_not_links() {
        assert!(!is_link(""));
        assert!(!is_link("#"));
        assert!(!is_link("#h-verdicts"));
        assert!(!is_link("#f-arterial-0-mean"));
        assert!(is_link("#p1.abc"));
        assert!(is_link("#<b>"));
    }
}

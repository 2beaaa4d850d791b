//! Changes to the whole check: the start from what the device saved (or
//! a shared link), a new check, the demo, a link opened, a check set aside
//! and brought back.
//!
//! The start takes the saved texts and the address's fragment as plain
//! strings, so every path is a host test. A whole check is never replaced
//! silently: the one on screen, with its record over time, is set aside
//! first (`kept`), saved on the device, until it is brought back or
//! discarded.

use std::rc::Rc;

use plumbline_core::share;

use super::{State, Theme};
use crate::form::Form;
use crate::record::Record;
use crate::saved::{self, record_of, SavedRecord};
use crate::session::{
    blank_case, is_link, refusal, Event, Kept, Session, SessionAction, Unreadable,
};
use crate::storage::Stored;

/// Reads a saved record, reporting one that cannot be read.
fn read_record(text: Option<&str>, fail: &mut impl FnMut(&str, String)) -> SavedRecord {
    match text.map(|t| (t, saved::decode_record(t))) {
        Some((_, Ok(record))) => record,
        Some((raw, Err(reason))) => {
            fail(raw, reason);
            SavedRecord::default()
        }
        None => SavedRecord::default(),
    }
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
            match saved::decode(raw) {
                Ok(saved) => {
                    state.theme = saved.theme;
                    let record = read_record(stored.record.as_deref(), &mut fail);
                    state.show(saved.form, record);
                }
                Err(reason) => fail(raw, reason),
            }
        }
        if let Some(raw) = stored.kept.as_deref() {
            match saved::decode(raw) {
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
            let reason = saved::decode(raw)
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
    use plumbline_core::case::Case;
    use plumbline_core::demo::CASE_JSON;
    use plumbline_core::geometry::{PositionSpec, Posture};
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
            state: Some(saved::encode(&state.form, state.theme)),
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
            record: saved::encode_record(&state.record),
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
}

//! Changes to the whole check: a new check, the demo, a link opened, a
//! check set aside and brought back, and the session's other actions.
//!
//! A whole check is never replaced silently: the one on screen, with its
//! record over time, is set aside first (`kept`), saved on the device,
//! until it is brought back or discarded. A link that cannot be opened is
//! kept for download like any text the app could not use.

use std::rc::Rc;

use plumbline_core::share;

use super::State;
use crate::form::Form;
use crate::record::Record;
use crate::saved::{record_of, SavedRecord};
use crate::session::{
    blank_case, refusal, Event, Instead, Kept, Part, Session, SessionAction, Why,
};

impl State {
    /// Shows `form` and `record` as the whole check.
    pub(super) fn show(&mut self, form: Form, record: SavedRecord) {
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
    pub(super) fn worth_keeping(&self) -> bool {
        // Nothing checked and nothing wrong happens only at start, with the
        // demo not yet checked: untouched too.
        let unchecked_start = self.checked.is_none() && self.errors.is_empty();
        let untouched_demo = unchecked_start || self.shows_demo() && !self.is_stale();
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

    /// Opens a shared link's fragment; `false` when it cannot be read:
    /// nothing changes then but its copy kept for download, with why.
    pub fn open_link(&mut self, fragment: &str) -> bool {
        match share::decode(fragment) {
            Ok(case) => {
                self.replace(Form::from_case(&case), Event::LinkOpened);
                true
            }
            Err(errors) => {
                self.session.rescue(
                    Part::Link,
                    Why::Unreadable(refusal(&errors)),
                    Instead::Unchanged,
                    fragment,
                );
                false
            }
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
            SessionAction::DiscardRescued(key) => {
                self.session.rescued.retain(|r| r.key != key);
            }
            SessionAction::OpenLink(fragment) => {
                self.open_link(&fragment);
            }
            SessionAction::CloseEvent => self.session.event = None,
            SessionAction::Saved(ok) => self.session.not_saved = !ok,
            SessionAction::OtherWindowSaved => self.session.other_window = true,
            SessionAction::KeepThisWindow => self.session.other_window = false,
            SessionAction::OpenOtherWindow(stored) => self.open_other_window(stored),
            SessionAction::UpdateReady => self.session.update_ready = true,
            SessionAction::UpdateLater => self.session.update_ready = false,
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::state::testing::{act, edit, with_record};
    use crate::state::{Action, Theme};
    use plumbline_core::case::Case;
    use plumbline_core::demo::CASE_JSON;
    use yew::Reducible;

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
    fn a_bad_link_changes_nothing_and_is_kept_for_download() {
        let typed = edit(State::demo(Theme::Device), "90");
        let good = share::encode(&Case::from_json(CASE_JSON).unwrap());
        let cut = good.get(..good.len() / 2).unwrap().to_owned();
        let long = format!("#p1.{}", "A".repeat(crate::session::MAX_LINK_KEPT + 10));
        for fragment in [
            "#<script>window.pwned = 1</script>",
            "#p1.<img src=x onerror=alert(1)>",
            &format!("#{cut}"),
            "#p9.abc",
            "#%3Cscript%3E",
            &long,
        ] {
            let mut state = typed.clone();
            assert!(!state.open_link(fragment));
            assert_eq!(state.form, typed.form, "{fragment:.40}");
            assert_eq!(state.session.event, None);
            let [rescued] = &state.session.rescued[..] else {
                unreachable!("{:?}", state.session.rescued)
            };
            assert_eq!(rescued.part, Part::Link);
            assert_eq!(rescued.instead, Instead::Unchanged);
            let Why::Unreadable(words) = &rescued.why else {
                unreachable!("{:?}", rescued.why)
            };
            assert!(!words.is_empty() && words.len() < 600, "{words}");
            let kept = rescued.raw.chars().count();
            assert_eq!(
                kept,
                fragment.chars().count().min(crate::session::MAX_LINK_KEPT)
            );
        }
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
    fn saving_updates_and_other_windows_raise_their_flags() {
        let state = act(State::demo(Theme::Device), SessionAction::Saved(false));
        assert!(state.session.not_saved);
        let state = act(state, SessionAction::Saved(true));
        assert!(!state.session.not_saved);
        let state = act(state, SessionAction::UpdateReady);
        assert!(state.session.update_ready);
        let state = act(state, SessionAction::UpdateLater);
        assert!(!state.session.update_ready);
        let state = act(state, SessionAction::OtherWindowSaved);
        assert!(state.session.other_window);
        assert!(
            !act(state, SessionAction::KeepThisWindow)
                .session
                .other_window
        );
    }
}

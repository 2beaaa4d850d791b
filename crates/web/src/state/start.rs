//! How the screen starts from what the device saved (and a shared link),
//! and how it takes in another window's check: nothing the device held is
//! dropped on the way.
//!
//! Every saved part is read on its own: a part that cannot be read is kept
//! for download exactly as it was (`Session::rescued`), beside those of
//! earlier visits, and the rest still opens. A record over time outlives
//! its unreadable check (it opens with a blank one). A saved check or link
//! whose opening did not finish last time (the page froze or was closed:
//! the app's note of what it was opening is still there) is set aside
//! unopened, so one bad document cannot stop every start.

use std::rc::Rc;

use plumbline_core::share;

use super::{State, Theme};
use crate::form::Form;
use crate::saved::{self, record_of, SavedRecord};
use crate::session::{
    blank_case, is_link, refusal, Event, Instead, Kept, Opening, Part, Rescued, Why,
};
use crate::storage::{self, Stored};

/// A rescued text of an earlier visit, as its key names it; an unreadable
/// one says why again by being read again.
fn earlier(key: String, raw: String) -> Option<Rescued> {
    let (part, why) = storage::rescued_names(&key)?;
    let part = Part::from_name(part);
    let why = match why {
        "stalled" => Why::Stalled,
        "held-back" => Why::HeldBack,
        "replaced" => Why::Replaced,
        _ => Why::Unreadable(reason_now(part, &raw)),
    };
    Some(Rescued {
        key,
        part,
        why,
        instead: Instead::Earlier,
        raw,
    })
}

/// Why `raw`, kept as `part`, cannot be used, read again now.
fn reason_now(part: Part, raw: &str) -> String {
    let reason = match part {
        Part::State | Part::Kept => saved::decode(raw).err(),
        Part::Record | Part::KeptRecord => saved::decode_record(raw).err(),
        Part::Link => share::decode(raw).err().map(|e| refusal(&e)),
        Part::Other => Some("it was kept by another version of Plumbline".to_owned()),
    };
    reason.unwrap_or_else(|| "it was set aside on an earlier visit".to_owned())
}

impl State {
    /// The screen on start: the saved check (or the demo), the set-aside
    /// check, the rescued texts of earlier visits, then a shared link's
    /// check when the address carries one.
    ///
    /// `mark` is told what is about to be opened before its check runs,
    /// and what is on screen at the end (`None`: only the demo); the app
    /// keeps that note on the device until the first render is done, and
    /// a note found at start (`stored.opening`) sets its document aside.
    pub fn start(
        stored: Stored,
        fragment: Option<&str>,
        mark: &mut dyn FnMut(Option<&Opening>),
    ) -> State {
        let mut state = State::demo_unchecked(Theme::Device);
        state.session.visit = stored.visit;
        for (key, raw) in stored.rescued {
            if let Some(rescued) = earlier(key, raw) {
                state.session.keep_rescued(rescued);
            }
        }
        let stalled = stored.opening.as_deref().map(saved::decode_opening);
        let mut shown = None;
        if stalled == Some(Opening::Saved) {
            for (part, raw) in [(Part::State, &stored.state), (Part::Record, &stored.record)] {
                if let Some(raw) = raw {
                    state.session.rescue(part, Why::Stalled, Instead::Demo, raw);
                }
            }
        } else if stored.state.is_some() || stored.record.is_some() {
            mark(Some(&Opening::Saved));
            state.restore_open(stored.state.as_deref(), stored.record.as_deref());
            shown = Some(Opening::Saved);
        }
        state.restore_kept(stored.kept.as_deref(), stored.kept_record.as_deref());
        if let Some(Opening::Link(link)) = &stalled {
            state
                .session
                .rescue(Part::Link, Why::Stalled, Instead::Unchanged, link);
        }
        if let Some(fragment) = fragment.filter(|f| is_link(f)) {
            if stalled.as_ref() != Some(&Opening::Link(fragment.to_owned())) {
                let link = Opening::Link(fragment.to_owned());
                mark(Some(&link));
                if state.open_link(fragment) {
                    shown = Some(link);
                }
            }
        }
        // Nothing else was opened: the demo is checked now, once.
        if state.checked.is_none() && state.errors.is_empty() {
            state.recheck();
        }
        mark(shown.as_ref());
        state
    }

    /// Opens the saved check and its record; a part that cannot be read
    /// is rescued, and a record outlives its unreadable check.
    fn restore_open(&mut self, state: Option<&str>, record: Option<&str>) {
        match state.map(|raw| (raw, saved::decode(raw))) {
            Some((_, Ok(saved))) => {
                self.theme = saved.theme;
                let record = self.read_record(record, Part::Record, Instead::CheckWithoutRecord);
                self.show(saved.form, record);
            }
            failed => {
                let blank = Form::from_case(&blank_case());
                let record = self.read_record(record, Part::Record, Instead::Demo);
                let instead = if record.timeline.is_some() {
                    self.show(blank, record);
                    Instead::BlankWithRecord
                } else {
                    Instead::Demo
                };
                if let Some((raw, Err(reason))) = failed {
                    self.session
                        .rescue(Part::State, Why::Unreadable(reason), instead, raw);
                }
            }
        }
    }

    /// Reads the set-aside check and its record back the same way.
    fn restore_kept(&mut self, kept: Option<&str>, record: Option<&str>) {
        let form = match kept.map(|raw| (raw, saved::decode(raw))) {
            Some((_, Ok(saved))) => Some(saved.form),
            Some((raw, Err(reason))) => {
                self.session
                    .rescue(Part::Kept, Why::Unreadable(reason), Instead::Unchanged, raw);
                None
            }
            None => None,
        };
        let instead = if form.is_some() {
            Instead::KeptWithoutRecord
        } else {
            Instead::Unchanged
        };
        let record = self.read_record(record, Part::KeptRecord, instead);
        if form.is_some() || record.timeline.is_some() {
            let form = form.unwrap_or_else(|| Form::from_case(&blank_case()));
            let record = record_of(&form, record);
            self.session.kept = Some(Rc::new(Kept { form, record }));
        }
    }

    /// Reads a saved record, rescuing one that cannot be read.
    fn read_record(&mut self, text: Option<&str>, part: Part, instead: Instead) -> SavedRecord {
        match text.map(|t| (t, saved::decode_record(t))) {
            Some((_, Ok(record))) => record,
            Some((raw, Err(reason))) => {
                self.session
                    .rescue(part, Why::Unreadable(reason), instead, raw);
                SavedRecord::default()
            }
            None => SavedRecord::default(),
        }
    }

    /// Opens the check another window saved, as the device now holds it:
    /// this window's check is set aside (the other window's set-aside
    /// check, which that would replace, is rescued as it was).
    pub(super) fn open_other_window(&mut self, stored: Stored) {
        let worth_keeping = self.worth_keeping();
        let ours = Kept {
            form: self.form.clone(),
            record: std::mem::take(&mut self.record),
        };
        let mut next = State::demo(self.theme);
        next.session = std::mem::take(&mut self.session);
        next.session.other_window = false;
        next.session.kept = None;
        next.restore_open(stored.state.as_deref(), stored.record.as_deref());
        if worth_keeping {
            for (part, raw) in [
                (Part::Kept, &stored.kept),
                (Part::KeptRecord, &stored.kept_record),
            ] {
                if let Some(raw) = raw {
                    next.session
                        .rescue(part, Why::Replaced, Instead::Unchanged, raw);
                }
            }
            next.session.kept = Some(Rc::new(ours));
        } else {
            next.restore_kept(stored.kept.as_deref(), stored.kept_record.as_deref());
        }
        next.session.event = Some(Event::OtherWindowOpened);
        *self = next;
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::session::{Session, SessionAction, MAX_RESCUED};
    use crate::state::testing::{act, edit, with_record};
    use plumbline_core::case::Case;
    use plumbline_core::demo::CASE_JSON;
    use plumbline_core::geometry::{PositionSpec, Posture};

    const BROKEN_STATE: &str = "{\"format\": \"plumbline-state\", \"vers";
    const BROKEN_RECORD: &str = "{\"format\": \"plumbline-case\", \"version\": 1, \"timeline\": 4}";

    fn saved(state: &State) -> Stored {
        Stored {
            state: Some(saved::encode(&state.form, state.theme)),
            record: saved::encode_record(&state.record),
            visit: "v".into(),
            ..Stored::default()
        }
    }

    /// Starts as the app does, keeping every note of what was opening.
    fn start(stored: Stored, fragment: Option<&str>) -> (State, Vec<Option<Opening>>) {
        let mut marks = Vec::new();
        let state = State::start(stored, fragment, &mut |m| marks.push(m.cloned()));
        (state, marks)
    }

    fn parts(state: &State) -> Vec<(Part, &str, Instead)> {
        let session = &state.session;
        session
            .rescued
            .iter()
            .map(|r| (r.part, r.why.name(), r.instead))
            .collect()
    }

    #[test]
    fn a_fresh_device_starts_with_the_demo() {
        let (state, marks) = start(Stored::default(), None);
        assert!(state.shows_demo());
        assert_eq!(state.session, Session::default());
        assert_eq!(marks, [None], "nothing was opened");
    }

    #[test]
    fn a_link_on_a_fresh_device_sets_no_demo_aside() {
        // The demo is not checked before the link replaces it, and is
        // still untouched: nothing to keep.
        let mut shared = Case::from_json(CASE_JSON).unwrap();
        shared.patient.height = Some(plumbline_core::units::LengthEntry::cm(180.0));
        let (state, _) = start(
            Stored::default(),
            Some(&format!("#{}", share::encode(&shared))),
        );
        assert_eq!(state.checked.as_ref().map(|c| &c.case), Some(&shared));
        assert_eq!(state.session.kept, None);
        // A refused link leaves the demo on screen, checked.
        let (refused, _) = start(Stored::default(), Some("#p9.x"));
        assert!(refused.shows_demo());
        assert!(refused.checked.is_some());
    }

    #[test]
    fn the_saved_check_comes_back_as_typed() {
        let before = edit(State::demo(Theme::Dark), "81");
        let (state, marks) = start(saved(&before), Some("#h-verdicts"));
        assert_eq!(state.form, before.form);
        assert_eq!(state.theme, Theme::Dark);
        assert!(!state.shows_demo());
        assert_eq!(state.session.event, None, "a page anchor is no link");
        assert_eq!(marks, [Some(Opening::Saved), Some(Opening::Saved)]);
        // A mistake comes back too, marked, with no report of another check.
        let (state, _) = start(saved(&edit(before, "8l")), None);
        assert!(state.is_stale());
        assert_eq!(state.checked, None);
    }

    #[test]
    fn a_saved_record_comes_back_with_its_start() {
        let mut state = with_record();
        state.record.start = Some(PositionSpec::new(Posture::Supine));
        let (back, _) = start(saved(&state), None);
        assert_eq!(back.record.timeline(), state.record.timeline());
        assert_eq!(back.record.start, state.record.start);
        assert_eq!(back.form, state.form);
        assert!(back.session.rescued.is_empty());
    }

    #[test]
    fn an_unreadable_save_is_kept_for_download_and_the_demo_starts() {
        let stored = Stored {
            state: Some(BROKEN_STATE.into()),
            visit: "v".into(),
            ..Stored::default()
        };
        let (state, _) = start(stored, None);
        assert!(state.shows_demo());
        let rescued = state.session.rescued[0].clone();
        assert_eq!(rescued.raw, BROKEN_STATE, "byte for byte");
        assert_eq!(rescued.key, "plumbline.unreadable.v-0.state.unreadable");
        assert_eq!(rescued.instead, Instead::Demo);
        assert!(matches!(&rescued.why, Why::Unreadable(r) if r.contains("incomplete")));
        let state = act(state, SessionAction::DiscardRescued(rescued.key.clone()));
        assert!(state.session.rescued.is_empty());
    }

    #[test]
    fn the_record_survives_an_unreadable_state() {
        let typed = with_record();
        let stored = Stored {
            state: Some(BROKEN_STATE.into()),
            ..saved(&typed)
        };
        let (state, _) = start(stored, None);
        assert_eq!(state.record.timeline(), typed.record.timeline());
        assert_eq!(state.form.sources.len(), 1, "a blank check");
        assert!(!state.shows_demo());
        assert_eq!(
            parts(&state),
            [(Part::State, "unreadable", Instead::BlankWithRecord)]
        );
    }

    #[test]
    fn a_damaged_record_is_kept_and_the_check_opens_without_it() {
        let typed = edit(State::demo(Theme::Device), "90");
        let stored = Stored {
            record: Some(BROKEN_RECORD.into()),
            ..saved(&typed)
        };
        let (state, _) = start(stored, None);
        assert!(state.record.is_empty());
        assert_eq!(state.form, typed.form);
        assert_eq!(
            parts(&state),
            [(Part::Record, "unreadable", Instead::CheckWithoutRecord)]
        );
        assert!(
            matches!(&state.session.rescued[0].why, Why::Unreadable(r) if r.starts_with("timeline:"))
        );
    }

    #[test]
    fn every_unreadable_part_is_kept_beside_the_earlier_ones() {
        let stored = Stored {
            state: Some(BROKEN_STATE.into()),
            record: Some(BROKEN_RECORD.into()),
            kept: Some("[]".into()),
            kept_record: Some("{".into()),
            rescued: vec![
                ("plumbline.unreadable".into(), "garbage".into()),
                (
                    "plumbline.unreadable.0001.link.unreadable".into(),
                    "#p9.x".into(),
                ),
                (
                    "plumbline.unreadable.0002.state.stalled".into(),
                    "{}".into(),
                ),
                ("plumbline.unreadable.0003.future.thing".into(), "?".into()),
            ],
            visit: "0009".into(),
            ..Stored::default()
        };
        let (state, _) = start(stored, None);
        assert!(state.shows_demo());
        assert_eq!(state.session.kept, None);
        assert_eq!(
            parts(&state),
            [
                (Part::State, "unreadable", Instead::Earlier),
                (Part::Link, "unreadable", Instead::Earlier),
                (Part::State, "stalled", Instead::Earlier),
                (Part::Other, "unreadable", Instead::Earlier),
                (Part::Record, "unreadable", Instead::Demo),
                (Part::State, "unreadable", Instead::Demo),
                (Part::Kept, "unreadable", Instead::Unchanged),
                (Part::KeptRecord, "unreadable", Instead::Unchanged),
            ]
        );
        let keys: std::collections::BTreeSet<_> =
            state.session.rescued.iter().map(|r| &r.key).collect();
        assert_eq!(keys.len(), 8, "each under a key of its own");
        // Read again, an earlier copy says why.
        assert!(
            matches!(&state.session.rescued[0].why, Why::Unreadable(r) if r.contains("incomplete"))
        );
        assert!(
            matches!(&state.session.rescued[1].why, Why::Unreadable(r) if r.contains("version"))
        );
    }

    #[test]
    fn at_most_ten_are_kept_and_the_oldest_goes_first() {
        let rescued = (0..MAX_RESCUED)
            .map(|i| {
                let key = storage::rescued_key(&format!("{i:04}"), "state", "unreadable");
                (key, format!("old {i}"))
            })
            .collect();
        let stored = Stored {
            state: Some(BROKEN_STATE.into()),
            rescued,
            visit: "9999".into(),
            ..Stored::default()
        };
        let (state, _) = start(stored, None);
        let raws: Vec<&str> = state
            .session
            .rescued
            .iter()
            .map(|r| r.raw.as_str())
            .collect();
        assert_eq!(raws.len(), MAX_RESCUED);
        assert_eq!(raws.first(), Some(&"old 1"));
        assert_eq!(raws.last(), Some(&BROKEN_STATE));
    }

    #[test]
    fn a_shared_link_opens_its_check_and_keeps_the_saved_one() {
        let typed = edit(State::demo(Theme::Device), "90");
        let mut shared = Case::from_json(CASE_JSON).unwrap();
        shared.patient.height = Some(plumbline_core::units::LengthEntry::cm(180.0));
        let fragment = format!("#{}", share::encode(&shared));
        let (state, marks) = start(saved(&typed), Some(&fragment));
        assert_eq!(state.form.to_case().unwrap(), shared);
        assert!(state.checked.is_some());
        assert_eq!(state.session.event, Some(Event::LinkOpened));
        assert_eq!(
            state.session.kept.as_ref().map(|k| &k.form),
            Some(&typed.form)
        );
        let link = Some(Opening::Link(fragment.clone()));
        assert_eq!(marks, [Some(Opening::Saved), link.clone(), link]);
        // The same link again keeps nothing more.
        let (again, _) = start(saved(&state), Some(&fragment));
        assert_eq!(again.session.kept, None);
        // A refused link leaves the saved check on screen, and says so.
        let (refused, marks) = start(saved(&typed), Some("#p9.x"));
        assert_eq!(refused.form, typed.form);
        assert_eq!(marks.last(), Some(&Some(Opening::Saved)));
    }

    #[test]
    fn a_saved_check_that_did_not_finish_opening_is_set_aside_unopened() {
        let typed = with_record();
        let stored = Stored {
            opening: Some(saved::encode_opening(&Opening::Saved)),
            ..saved(&typed)
        };
        let raw_state = stored.state.clone().unwrap();
        let (state, marks) = start(stored, None);
        assert!(state.shows_demo());
        assert!(state.record.is_empty());
        assert_eq!(marks, [None], "nothing else was opened");
        assert_eq!(
            parts(&state),
            [
                (Part::State, "stalled", Instead::Demo),
                (Part::Record, "stalled", Instead::Demo)
            ]
        );
        assert_eq!(state.session.rescued[0].raw, raw_state);
        // A damaged note is read the cautious way.
        let stored = Stored {
            opening: Some("{".into()),
            ..saved(&typed)
        };
        assert!(start(stored, None).0.shows_demo());
    }

    #[test]
    fn a_link_that_did_not_finish_opening_is_not_opened_again() {
        let typed = edit(State::demo(Theme::Device), "90");
        let fragment = format!("#{}", share::encode(&Case::from_json(CASE_JSON).unwrap()));
        let stored = Stored {
            opening: Some(saved::encode_opening(&Opening::Link(fragment.clone()))),
            ..saved(&typed)
        };
        let (state, marks) = start(stored.clone(), Some(&fragment));
        assert_eq!(state.form, typed.form, "the saved check, not the link's");
        assert_eq!(parts(&state), [(Part::Link, "stalled", Instead::Unchanged)]);
        assert_eq!(state.session.rescued[0].raw, fragment);
        assert_eq!(marks, [Some(Opening::Saved), Some(Opening::Saved)]);
        // Another link in the address opens as usual.
        let other = format!("#{}", share::encode(&Case::new()));
        let (state, _) = start(stored, Some(&other));
        assert_eq!(state.session.event, Some(Event::LinkOpened));
        assert_eq!(parts(&state), [(Part::Link, "stalled", Instead::Unchanged)]);
    }

    #[test]
    fn the_other_windows_check_opens_and_this_one_is_set_aside() {
        let mine = edit(State::demo(Theme::Device), "90");
        let theirs = edit(State::demo(Theme::Dark), "70");
        let their_kept = saved::encode(&edit(State::demo(Theme::Dark), "60").form, Theme::Dark);
        let stored = Stored {
            kept: Some(their_kept.clone()),
            ..saved(&theirs)
        };
        let state = act(
            act(mine.clone(), SessionAction::OtherWindowSaved),
            SessionAction::OpenOtherWindow(stored.clone()),
        );
        assert_eq!(state.form, theirs.form);
        assert_eq!(state.theme, Theme::Dark);
        assert!(!state.session.other_window);
        assert_eq!(state.session.event, Some(Event::OtherWindowOpened));
        assert_eq!(
            state.session.kept.as_ref().map(|k| &k.form),
            Some(&mine.form)
        );
        assert_eq!(
            parts(&state),
            [(Part::Kept, "replaced", Instead::Unchanged)]
        );
        assert_eq!(state.session.rescued[0].raw, their_kept);
        // Nothing worth keeping here: their set-aside check comes too.
        let state = act(
            State::demo(Theme::Device),
            SessionAction::OpenOtherWindow(stored),
        );
        assert!(state.session.kept.is_some());
        assert!(state.session.rescued.is_empty());
    }
}

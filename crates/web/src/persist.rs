//! Keeps the device's copy in step with the screen: after every change,
//! each part (the open check, its record over time, the set-aside check,
//! an unreadable save) is written only when it changed since the last
//! write.
//!
//! A keystroke rewrites the small envelope (a few kilobytes); a record over
//! time of tens of thousands of samples is written only when the record
//! itself changes (its samples are shared, so "changed" is one pointer
//! comparison).
//!
//! This is one of the effects that run outside the reducer: the app calls
//! [`Persisted::sync`] after each render, and when the page is hidden or
//! closed with the state handle's current value (Yew's handle reads the
//! state as the last action left it, so a change not yet rendered is
//! saved too).

use std::rc::Rc;

use plumbline_core::case::RulesSpec;
use plumbline_core::case::TimelineSpec;
use plumbline_core::geometry::PositionSpec;

use crate::browser;
use crate::form::Form;
use crate::record::Record;
use crate::saved;
use crate::session::{Kept, Unreadable};
use crate::state::{State, Theme};
use crate::storage::{Stored, KEPT_KEY, KEPT_RECORD_KEY, RECORD_KEY, STATE_KEY, UNREADABLE_KEY};

/// Everything the device keeps, read from its storage (nothing when
/// storage is off).
pub fn stored() -> Stored {
    Stored {
        state: browser::read(STATE_KEY),
        record: browser::read(RECORD_KEY),
        kept: browser::read(KEPT_KEY),
        kept_record: browser::read(KEPT_RECORD_KEY),
        unreadable: browser::read(UNREADABLE_KEY),
    }
}

/// Writes `text` under `key`, or removes the key for `None`; `false` when
/// storage is off or full.
fn put(key: &str, text: Option<&str>) -> bool {
    match text {
        Some(text) => browser::write(key, text),
        None => browser::remove(key),
    }
}

/// What identifies a record's content: its shared samples, rules and start.
type RecordMark = Option<(Rc<TimelineSpec>, RulesSpec, Option<PositionSpec>)>;

fn mark(record: &Record) -> RecordMark {
    (!record.is_empty()).then(|| {
        (
            Rc::clone(&record.spec),
            record.rules.clone(),
            record.start.clone(),
        )
    })
}

fn same_mark(a: &RecordMark, b: &RecordMark) -> bool {
    match (a, b) {
        (Some((sa, ra, pa)), Some((sb, rb, pb))) => Rc::ptr_eq(sa, sb) && ra == rb && pa == pb,
        (None, None) => true,
        _ => false,
    }
}

fn same<T>(a: &Option<Rc<T>>, b: &Option<Rc<T>>) -> bool {
    match (a, b) {
        (Some(a), Some(b)) => Rc::ptr_eq(a, b),
        (None, None) => true,
        _ => false,
    }
}

/// What was last written, part by part (`None`: not yet, or it failed).
#[derive(Default)]
pub struct Persisted {
    open: Option<(Form, Theme)>,
    record: Option<RecordMark>,
    kept: Option<Option<Rc<Kept>>>,
    unreadable: Option<Option<Rc<Unreadable>>>,
}

impl Persisted {
    /// Writes what changed in `state`; `false` when a write failed (storage
    /// off or full), to say so on screen. A failed part is tried again
    /// after the next change.
    pub fn sync(&mut self, state: &State) -> bool {
        let mut ok = true;
        // The unreadable copy first: the open check's key is about to be
        // overwritten, and the copy must survive it.
        let unreadable = &state.session.unreadable;
        if !self
            .unreadable
            .as_ref()
            .is_some_and(|u| same(u, unreadable))
        {
            let written = put(UNREADABLE_KEY, unreadable.as_ref().map(|u| u.raw.as_str()));
            ok &= written;
            self.unreadable = written.then(|| unreadable.clone());
        }
        let kept = &state.session.kept;
        if !self.kept.as_ref().is_some_and(|k| same(k, kept)) {
            let form = kept.as_ref().map(|k| saved::encode(&k.form, state.theme));
            let record = kept.as_ref().and_then(|k| saved::encode_record(&k.record));
            let written = put(KEPT_RECORD_KEY, record.as_deref()) & put(KEPT_KEY, form.as_deref());
            ok &= written;
            self.kept = written.then(|| kept.clone());
        }
        let record = mark(&state.record);
        if !self.record.as_ref().is_some_and(|r| same_mark(r, &record)) {
            let written = put(RECORD_KEY, saved::encode_record(&state.record).as_deref());
            ok &= written;
            self.record = written.then_some(record);
        }
        let open = (&state.form, state.theme);
        if self.open.as_ref().map(|(f, t)| (f, *t)) != Some(open) {
            let written = put(STATE_KEY, Some(&saved::encode(&state.form, state.theme)));
            ok &= written;
            self.open = written.then(|| (state.form.clone(), state.theme));
        }
        ok
    }
}

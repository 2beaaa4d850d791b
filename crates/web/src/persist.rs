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
//! The screen writes after each render; the reducer also notes each new
//! state here ([`note`]), so a page hidden or closed between a change and
//! its render (Yew renders a large page in slices) still saves it.

use std::cell::RefCell;
use std::rc::{Rc, Weak};

use plumbline_core::case::RulesSpec;
use plumbline_core::case::TimelineSpec;
use plumbline_core::geometry::PositionSpec;

use crate::browser;
use crate::form::Form;
use crate::record::Record;
use crate::session::{Kept, Unreadable};
use crate::state::{State, Theme};
use crate::storage::{self, KEPT_KEY, KEPT_RECORD_KEY, RECORD_KEY, STATE_KEY, UNREADABLE_KEY};

thread_local! {
    static LATEST: RefCell<Weak<State>> = const { RefCell::new(Weak::new()) };
}

/// Notes the state the reducer just made: a weak reference, no copy (the
/// screen holds the state itself).
pub fn note(state: &Rc<State>) {
    LATEST.with(|latest| *latest.borrow_mut() = Rc::downgrade(state));
}

/// The state last noted, while the screen still holds it.
pub fn latest() -> Option<Rc<State>> {
    LATEST.with(|latest| latest.borrow().upgrade())
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

/// Writes `value` under `key`, or removes the key for `None`.
fn put(key: &str, value: Option<String>) -> bool {
    match value {
        Some(text) => browser::write(key, &text),
        None => browser::remove(key),
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
            let written = put(UNREADABLE_KEY, unreadable.as_ref().map(|u| u.raw.clone()));
            ok &= written;
            self.unreadable = written.then(|| unreadable.clone());
        }
        let kept = &state.session.kept;
        if !self.kept.as_ref().is_some_and(|k| same(k, kept)) {
            let form = kept.as_ref().map(|k| storage::encode(&k.form, state.theme));
            let record = kept
                .as_ref()
                .and_then(|k| storage::encode_record(&k.record));
            let written = put(KEPT_RECORD_KEY, record) & put(KEPT_KEY, form);
            ok &= written;
            self.kept = written.then(|| kept.clone());
        }
        let record = mark(&state.record);
        if !self.record.as_ref().is_some_and(|r| same_mark(r, &record)) {
            let written = put(RECORD_KEY, storage::encode_record(&state.record));
            ok &= written;
            self.record = written.then_some(record);
        }
        let open = (&state.form, state.theme);
        if self.open.as_ref().map(|(f, t)| (f, *t)) != Some(open) {
            let written = browser::write(STATE_KEY, &storage::encode(&state.form, state.theme));
            ok &= written;
            self.open = written.then(|| (state.form.clone(), state.theme));
        }
        ok
    }
}

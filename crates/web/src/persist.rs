//! Keeps the device's copy in step with the screen: after every change,
//! each part (the open check, its record over time, the set-aside check,
//! every rescued text) is written only when it changed; and the note of
//! what the app is opening, until the first render is done.
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
//!
//! Two windows of the app on one device share the saved check. Each
//! remembers what it last read or wrote under each key; a `storage` event
//! from another window with a different text marks that key as changed
//! elsewhere ([`Persisted::changed_elsewhere`]), and this window never
//! writes over it: [`Synced::conflict`] asks the user first, and meanwhile
//! this window's check is kept under keys of its own (held back), so
//! nothing typed in either window is lost.

use std::rc::Rc;

use plumbline_core::case::RulesSpec;
use plumbline_core::case::TimelineSpec;
use plumbline_core::geometry::PositionSpec;

use crate::browser;
use crate::form::Form;
use crate::record::Record;
use crate::saved;
use crate::session::{Kept, Opening, Part, Why};
use crate::state::{State, Theme};
use crate::storage::{
    self, Stored, KEPT_KEY, KEPT_RECORD_KEY, LIVE_KEYS, OPENING_KEY, RECORD_KEY, STATE_KEY,
};

/// Everything the device keeps, read from its storage (nothing when
/// storage is off), and a name for this visit: the time of start with a
/// random tail, unique on the device.
pub fn stored() -> Stored {
    // Oldest first: each in its place as it is read (a general sort
    // would cost the download more than this list of a few).
    let mut rescued: Vec<(String, String)> = Vec::new();
    for key in browser::keys() {
        if storage::rescued_names(&key).is_some() {
            if let Some(text) = browser::read(&key) {
                let at = rescued.partition_point(|(k, _)| *k < key);
                rescued.insert(at, (key, text));
            }
        }
    }
    // Whole numbers, printed as such (float formatting would cost the
    // download several kilobytes).
    let now = js_sys::Date::now() as u64;
    let tail = (js_sys::Math::random() * 1000.0) as u32;
    Stored {
        state: browser::read(STATE_KEY),
        record: browser::read(RECORD_KEY),
        kept: browser::read(KEPT_KEY),
        kept_record: browser::read(KEPT_RECORD_KEY),
        rescued,
        opening: browser::read(OPENING_KEY),
        visit: format!("{now:015}{tail:03}"),
    }
}

/// Notes on the device what the app is about to open (`None`: nothing,
/// the note goes).
pub fn note_opening(opening: Option<&Opening>) {
    // Storage off: there is no note, and nothing saved to set aside either.
    let _ = put(OPENING_KEY, opening.map(saved::encode_opening).as_deref());
}

/// Writes `text` under `key`, or removes the key for `None`; `false` when
/// storage is off or full.
fn put(key: &str, text: Option<&str>) -> bool {
    match text {
        Some(text) => browser::write(key, text),
        None => browser::remove(key),
    }
}

/// A 64-bit FNV-1a hash of a saved text (`None`: no text), to tell one
/// text from another cheaply; not for security (smaller in the download
/// than the standard library's hasher).
fn hash(text: Option<&str>) -> u64 {
    let Some(text) = text else {
        return 0;
    };
    text.bytes().fold(0xcbf2_9ce4_8422_2325, |h, b| {
        (h ^ u64::from(b)).wrapping_mul(0x0000_0100_0000_01b3)
    })
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

/// The live key a rescued part was read from: its copy must be safe on
/// the device before that key is written over.
fn source_key(part: Part) -> Option<&'static str> {
    match part {
        Part::State => Some(STATE_KEY),
        Part::Record => Some(RECORD_KEY),
        Part::Kept => Some(KEPT_KEY),
        Part::KeptRecord => Some(KEPT_RECORD_KEY),
        Part::Link | Part::Other => None,
    }
}

/// Where the four parts are written: the live keys, or this visit's
/// held-back copies while another window's check is in the live ones.
fn keys(state: &State) -> [String; 4] {
    if state.session.other_window {
        [Part::State, Part::Record, Part::Kept, Part::KeptRecord].map(|part| {
            storage::rescued_key(
                &format!("{}-held", state.session.visit),
                part.name(),
                Why::HeldBack.name(),
            )
        })
    } else {
        LIVE_KEYS.map(str::to_owned)
    }
}

/// What one sync did.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Synced {
    /// Every write that was due worked.
    pub ok: bool,
    /// A part was not written because another window changed its key:
    /// the user must choose first.
    pub conflict: bool,
}

/// What a `storage` event from another window changed.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Elsewhere {
    /// The set-aside check: said when this window would write it.
    KeptCheck,
    /// The open check or its record: said at once.
    OpenCheck,
}

/// What was last written, part by part (`None`: not yet, or it failed).
#[derive(Default)]
pub struct Persisted {
    /// A hash of the text the device holds under each key, as far as this
    /// window knows: read at start, written since, or another window's.
    /// (A few keys: plain lists cost the download less than maps.)
    known: Vec<(String, u64)>,
    /// Live keys another window changed since this one last wrote them.
    elsewhere: Vec<&'static str>,
    /// The rescued texts on the device, by key, as far as this window knows.
    rescued: Vec<String>,
    /// The keys the parts were last written under.
    keys: Option<[String; 4]>,
    open: Option<(Form, Theme)>,
    record: Option<RecordMark>,
    kept: Option<Option<Rc<Kept>>>,
}

impl Persisted {
    fn known(&self, key: &str) -> Option<u64> {
        self.known.iter().find(|(k, _)| k == key).map(|(_, h)| *h)
    }

    fn set_known(&mut self, key: &str, hash: u64) {
        match self.known.iter_mut().find(|(k, _)| k == key) {
            Some(entry) => entry.1 = hash,
            None => self.known.push((key.to_owned(), hash)),
        }
    }

    /// Learns what the device held at start.
    pub fn know(&mut self, stored: &Stored) {
        let live = [
            &stored.state,
            &stored.record,
            &stored.kept,
            &stored.kept_record,
        ];
        for (key, text) in LIVE_KEYS.iter().zip(live) {
            self.set_known(key, hash(text.as_deref()));
        }
        self.rescued = stored.rescued.iter().map(|(k, _)| k.clone()).collect();
    }

    /// Takes note of another window's write (a `storage` event: `key`
    /// `None` when it cleared everything); `None` when it changed nothing
    /// this window keeps.
    pub fn changed_elsewhere(
        &mut self,
        key: Option<&str>,
        text: Option<&str>,
    ) -> Option<Elsewhere> {
        let mut changed = None;
        for live in LIVE_KEYS {
            if key.is_some_and(|k| k != live) {
                continue;
            }
            let now = hash(text);
            if self.known(live) == Some(now) {
                continue;
            }
            self.set_known(live, now);
            if !self.elsewhere.contains(&live) {
                self.elsewhere.push(live);
            }
            let what = if live == STATE_KEY || live == RECORD_KEY {
                Elsewhere::OpenCheck
            } else {
                Elsewhere::KeptCheck
            };
            changed = changed.max(Some(what));
        }
        if key.is_none() {
            self.rescued.clear();
        }
        changed
    }

    /// Writes `text` under `key` unless the device already holds it, and
    /// remembers it; `false` when the write failed.
    fn write(&mut self, key: &str, text: Option<&str>) -> bool {
        let now = hash(text);
        if self.known(key) == Some(now) {
            return true;
        }
        let written = put(key, text);
        if written {
            self.set_known(key, now);
        }
        written
    }

    /// Writes what changed in `state`; says whether every write worked (a
    /// failed part is tried again after the next change) and whether a
    /// part was held back for another window's change.
    pub fn sync(&mut self, state: &State) -> Synced {
        let mut ok = true;
        let mut conflict = false;
        // Rescued texts first: the keys they came from are about to be
        // written over, and a copy not safely kept holds its key back.
        let mut blocked = Vec::new();
        for rescued in &state.session.rescued {
            if self.rescued.contains(&rescued.key) {
                continue;
            }
            if put(&rescued.key, Some(&rescued.raw)) {
                self.rescued.push(rescued.key.clone());
            } else {
                ok = false;
                blocked.extend(source_key(rescued.part));
            }
        }
        let wanted = |key: &String| state.session.rescued.iter().any(|r| &r.key == key);
        self.rescued.retain(|key| wanted(key) || !put(key, None));
        // Another window's check held back, or the user chose: write every
        // part afresh under the keys now in use.
        let keys = keys(state);
        if self.keys.as_ref() != Some(&keys) {
            if let Some(old) = self.keys.take().filter(|old| old[0] != STATE_KEY) {
                for key in old {
                    let _ = put(&key, None);
                }
            }
            if !state.session.other_window {
                self.elsewhere.clear();
            }
            self.open = None;
            self.record = None;
            self.kept = None;
            self.keys = Some(keys.clone());
        }
        let [state_key, record_key, kept_key, kept_record_key] = &keys;
        // A part whose key another window changed waits for the user's
        // choice; one whose rescued copy is not safe yet waits too.
        let mut free = |keys: &[&String]| {
            let elsewhere = keys.iter().any(|k| self.elsewhere.contains(&k.as_str()));
            let held = keys.iter().any(|k| blocked.contains(&k.as_str()));
            conflict |= elsewhere;
            ok &= !held;
            !elsewhere && !held
        };
        let kept = &state.session.kept;
        let kept_due = !self.kept.as_ref().is_some_and(|k| same(k, kept))
            && free(&[kept_key, kept_record_key]);
        let record = mark(&state.record);
        let record_due =
            !self.record.as_ref().is_some_and(|r| same_mark(r, &record)) && free(&[record_key]);
        let open = (&state.form, state.theme);
        let open_due = self.open.as_ref().map(|(f, t)| (f, *t)) != Some(open) && free(&[state_key]);
        if kept_due {
            let form = kept.as_ref().map(|k| saved::encode(&k.form, state.theme));
            let record = kept.as_ref().and_then(|k| saved::encode_record(&k.record));
            let written = self.write(kept_record_key, record.as_deref())
                & self.write(kept_key, form.as_deref());
            ok &= written;
            self.kept = written.then(|| kept.clone());
        }
        if record_due {
            let written = self.write(record_key, saved::encode_record(&state.record).as_deref());
            ok &= written;
            self.record = written.then_some(record);
        }
        if open_due {
            let written = self.write(state_key, Some(&saved::encode(&state.form, state.theme)));
            ok &= written;
            self.open = written.then(|| (state.form.clone(), state.theme));
        }
        Synced { ok, conflict }
    }
}

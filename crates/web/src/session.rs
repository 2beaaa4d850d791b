//! The check's life on this device as data: a check set aside and its way
//! back, a saved text that could not be read, what happened last (for its
//! notice), and the actions that change them; the blank case a new check
//! starts from, and what counts as a shared link.
//!
//! The state applies these (`state::whole`); nothing here touches the
//! browser or the state, so the state depends on this and not the other
//! way round.

use std::rc::Rc;

use plumbline_core::error::Errors;

use crate::form::Form;
use crate::record::Record;
use crate::storage::{self, Stored};

/// What happened last to the whole check, for its notice.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Event {
    /// A new, blank check was started.
    NewCheck,
    /// The demo case replaced the check.
    Demo,
    /// A shared link's check was opened.
    LinkOpened,
    /// The set-aside check was brought back.
    BroughtBack,
    /// The other window's check was opened here.
    OtherWindowOpened,
}

/// Which saved text a rescued copy was.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Part {
    /// The open check (boxes and theme).
    State,
    /// The open check's record over time.
    Record,
    /// The set-aside check.
    Kept,
    /// The set-aside check's record over time.
    KeptRecord,
    /// A shared link's fragment.
    Link,
    /// Something this version does not know (kept by a newer one).
    Other,
}

impl Part {
    const NAMES: [(Part, &'static str); 6] = [
        (Part::State, "state"),
        (Part::Record, "record"),
        (Part::Kept, "kept"),
        (Part::KeptRecord, "kept-record"),
        (Part::Link, "link"),
        (Part::Other, "other"),
    ];

    /// The part's name in a storage key.
    pub fn name(self) -> &'static str {
        Part::NAMES
            .iter()
            .find(|(p, _)| *p == self)
            .map_or("other", |(_, n)| n)
    }

    /// The part a storage key names; [`Part::Other`] for anything else.
    pub fn from_name(name: &str) -> Part {
        Part::NAMES
            .iter()
            .find(|(_, n)| *n == name)
            .map_or(Part::Other, |(p, _)| *p)
    }
}

/// Why a text was set aside rather than used.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Why {
    /// It could not be read; why, in words.
    Unreadable(String),
    /// Opening it did not finish: the page froze or was closed meanwhile.
    Stalled,
    /// Entered in a window that held back its saving while another window
    /// had saved a different check.
    HeldBack,
    /// Another window's set-aside check, replaced here when that window's
    /// open check was brought into this one.
    Replaced,
}

impl Why {
    /// The reason's name in a storage key (an unreadable text's reason is
    /// found again by reading it).
    pub fn name(&self) -> &'static str {
        match self {
            Why::Unreadable(_) => "unreadable",
            Why::Stalled => "stalled",
            Why::HeldBack => "held-back",
            Why::Replaced => "replaced",
        }
    }
}

/// What the screen shows in place of a text that was set aside as it
/// was met, for its notice.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Instead {
    /// The demo case (the open check could not be used).
    Demo,
    /// A blank check with the saved record over time.
    BlankWithRecord,
    /// The check opened without its record over time.
    CheckWithoutRecord,
    /// The set-aside check kept its boxes without its record over time.
    KeptWithoutRecord,
    /// Nothing on screen changed.
    Unchanged,
    /// It was set aside on an earlier visit.
    Earlier,
}

/// The most rescued copies kept on the device: a newer one replaces the
/// oldest, so storage cannot fill up with them.
pub const MAX_RESCUED: usize = 10;

/// The longest link text kept, characters: four times the longest link
/// the app makes; a longer one is kept cut to this length.
pub const MAX_LINK_KEPT: usize = 4 * plumbline_core::share::MAX_FRAGMENT_CHARS;

/// A text that could not be used, kept on the device exactly as it was
/// for download, until it is discarded.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Rescued {
    /// Where the device keeps it.
    pub key: String,
    /// What it was.
    pub part: Part,
    /// Why it was set aside.
    pub why: Why,
    /// What the screen shows instead.
    pub instead: Instead,
    /// The text exactly as it was stored (a link's, cut at
    /// [`MAX_LINK_KEPT`]).
    pub raw: String,
}

/// What the app was opening when the page last stopped, as the device
/// keeps it until the first render is done.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Opening {
    /// The saved check and its record over time.
    Saved,
    /// A shared link's fragment.
    Link(String),
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
    /// Texts that could not be used, oldest first, at most
    /// [`MAX_RESCUED`], each until it is discarded.
    pub rescued: Vec<Rc<Rescued>>,
    /// This visit's name, unique on the device: new rescued copies and
    /// held-back saves are kept under keys made from it.
    pub visit: String,
    /// How many copies this visit has rescued, for their keys.
    pub rescued_count: u32,
    /// Whether another window saved a different check: this one then
    /// holds its saves back until the user chooses.
    pub other_window: bool,
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
    /// Discard the rescued copy kept under this key.
    DiscardRescued(String),
    /// Open a shared link's fragment.
    OpenLink(String),
    /// Close the notice about what happened last.
    CloseEvent,
    /// Whether saving on the device worked.
    Saved(bool),
    /// Another window saved a different check: hold saves back and ask.
    OtherWindowSaved,
    /// Keep this window's check: save it over the other window's.
    KeepThisWindow,
    /// Open the other window's check, as the device now holds it (this
    /// window's check is set aside).
    OpenOtherWindow(Stored),
    /// A new version of the app is waiting.
    UpdateReady,
    /// Not now: the new version is offered again at the next start.
    UpdateLater,
}

impl Session {
    /// Keeps `raw` for download as the `part` set aside for `why`: under a
    /// new key of this visit, the oldest copy going when there are more
    /// than [`MAX_RESCUED`].
    pub fn rescue(&mut self, part: Part, why: Why, instead: Instead, raw: &str) {
        let raw = match (part, raw.char_indices().nth(MAX_LINK_KEPT)) {
            (Part::Link, Some((cut, _))) => raw.get(..cut).unwrap_or(raw),
            _ => raw,
        };
        let key = storage::rescued_key(
            &format!("{}-{}", self.visit, self.rescued_count),
            part.name(),
            why.name(),
        );
        self.rescued_count += 1;
        self.keep_rescued(Rescued {
            key,
            part,
            why,
            instead,
            raw: raw.to_owned(),
        });
    }

    /// Adds a rescued copy, the oldest going beyond [`MAX_RESCUED`].
    pub fn keep_rescued(&mut self, rescued: Rescued) {
        self.rescued.push(Rc::new(rescued));
        let over = self.rescued.len().saturating_sub(MAX_RESCUED);
        self.rescued.drain(..over);
    }
}

pub use crate::form::blank_case;

/// Whether a page address's fragment is meant as a shared check (anything
/// but the page's own anchors, `#h-...` and `#f-...`, and an empty one).
pub fn is_link(fragment: &str) -> bool {
    let f = fragment.trim_start_matches('#');
    !(f.is_empty() || f.starts_with("h-") || f.starts_with("f-"))
}

/// A link's problems in words: the first few, each cut to a readable length.
pub fn refusal(errors: &Errors) -> String {
    let words: Vec<String> = errors
        .iter()
        .take(3)
        .map(|e| {
            let text = if e.field() == "link" {
                e.kind().to_string()
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

#[cfg(test)]
mod tests {
    use super::*;

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

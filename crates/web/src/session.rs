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

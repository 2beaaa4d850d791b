//! What the screen says beside each box: the core's problems with it, its
//! warnings from the last check, and what is still to be entered, said
//! calmly. Pages make the notes once per render; leaf components receive
//! them as a value and never hold the state.

use plumbline_core::error::{ErrorKind, Errors, Warning};

/// A message shown beside a box.
#[derive(Clone, Debug, PartialEq)]
pub enum Message {
    /// The box cannot be used as it is.
    Error(String),
    /// Worth a second look.
    Warning(String),
    /// Still to be entered: said calmly, not as a mistake, so a new check
    /// opens without alarms.
    Needed(String),
}

/// The messages of one check, by the path of the box they are about.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Notes {
    errors: Errors,
    warnings: Vec<Warning>,
}

impl Notes {
    /// The notes of a check: its problems, and the warnings of the last
    /// good check.
    pub fn new(errors: Errors, warnings: Vec<Warning>) -> Notes {
        Notes { errors, warnings }
    }

    /// The messages beside the box at `path`: its problems (what is missing
    /// said as still to enter), then its warnings.
    pub fn at(&self, path: &str) -> Vec<Message> {
        let mut out: Vec<Message> = self
            .errors
            .for_field(path)
            .map(|e| match e.kind() {
                ErrorKind::Missing { .. } => Message::Needed(e.kind().to_string()),
                _ => Message::Error(e.kind().to_string()),
            })
            .collect();
        out.extend(
            self.warnings
                .iter()
                .filter(|w| w.field == path)
                .map(|w| Message::Warning(w.message.clone())),
        );
        out
    }
}

//! What the device keeps between visits, as text: the keys, the versioned
//! envelope every saved part is sealed in, and the texts read back at
//! start.
//!
//! This layer knows nothing of what the texts hold (`saved` maps the
//! check to and from them), and touches no browser (`persist` reads and
//! writes the keys). An envelope is `{"format": ..., "version":
//! ..., ...fields}`; opening one checks its header and hands back the
//! other fields, or says in words why it cannot be used. Opening never
//! panics, and holds a text to the core's caps (`limits`: its bytes and
//! nesting) before it is parsed, so a stored text never stalls a start.

use plumbline_core::limits;
use serde::Serialize;
use serde_json::{Map, Value};

/// Where the open check and the theme are kept.
pub const STATE_KEY: &str = "plumbline.state";
/// Where the check set aside by a new check, the demo or a link is kept.
pub const KEPT_KEY: &str = "plumbline.kept";
/// Where texts that could not be used are kept for download: each under a
/// key of its own, `plumbline.unreadable.<id>.<part>.<why>` (an earlier
/// version kept one, under this key alone).
pub const RESCUED_PREFIX: &str = "plumbline.unreadable";
/// What the app is opening (the saved check, or a link), from just before
/// its check until the first render is done: found at the next start, it
/// says the page froze or was closed while opening it.
pub const OPENING_KEY: &str = "plumbline.opening";
/// Where the open check's record over time is kept.
pub const RECORD_KEY: &str = "plumbline.record";
/// Where the set-aside check's record over time is kept.
pub const KEPT_RECORD_KEY: &str = "plumbline.kept.record";

/// The live keys: the open check and the set-aside one, each with its
/// record over time. Another window writing one of them is a conflict.
pub const LIVE_KEYS: [&str; 4] = [STATE_KEY, RECORD_KEY, KEPT_KEY, KEPT_RECORD_KEY];

/// The key a rescued text `id` of `part`, set aside for `why`, is kept
/// under (names without dots).
pub fn rescued_key(id: &str, part: &str, why: &str) -> String {
    format!("{RESCUED_PREFIX}.{id}.{part}.{why}")
}

/// The part and reason named by a rescued text's key (`None` for a key
/// that is not one); the earlier version's single key is an unreadable
/// saved state.
pub fn rescued_names(key: &str) -> Option<(&str, &str)> {
    if key == RESCUED_PREFIX {
        return Some(("state", "unreadable"));
    }
    let rest = key.strip_prefix(RESCUED_PREFIX)?.strip_prefix('.')?;
    let mut names = rest.rsplitn(3, '.');
    let why = names.next()?;
    let part = names.next()?;
    names.next().filter(|id| !id.is_empty())?;
    Some((part, why))
}

/// The longest text read back, bytes: far above any check, and a guard
/// against a store filled by something else.
pub const MAX_CHARS: usize = limits::MAX_SAVED_STATE_BYTES;

/// One kind of envelope: its `format` and `version` fields, and what it
/// holds in words, for the reasons given when it cannot be opened.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Kind {
    /// The `format` field.
    pub format: &'static str,
    /// The version this build writes and reads.
    pub version: u64,
    /// What it holds, with its article ("a check").
    pub what: &'static str,
}

#[derive(Serialize)]
struct Sealed<'a, T> {
    format: &'static str,
    version: u64,
    #[serde(flatten)]
    fields: &'a T,
}

impl Kind {
    /// `fields` (a struct or map) sealed in this kind's envelope; empty
    /// when they cannot be written as JSON.
    pub fn seal<T: Serialize>(self, fields: &T) -> String {
        let sealed = Sealed {
            format: self.format,
            version: self.version,
            fields,
        };
        serde_json::to_string(&sealed).unwrap_or_default()
    }

    /// The fields of an envelope of this kind, header removed.
    ///
    /// # Errors
    /// Why it cannot be used, in words: too long, cut short, not of this
    /// kind, from a newer version, or with no version.
    pub fn open(self, text: &str) -> Result<Map<String, Value>, String> {
        if text.len() > MAX_CHARS {
            return Err(format!(
                "it is {} bytes long; {} saved by Plumbline is at most {MAX_CHARS}",
                text.len(),
                self.what
            ));
        }
        limits::check_nesting(text).map_err(|e| format!("it cannot be read ({e})"))?;
        let value: Value = serde_json::from_str(text)
            .map_err(|_| "it is incomplete, perhaps cut short or changed".to_owned())?;
        let Value::Object(mut fields) = value else {
            return Err(self.not_ours());
        };
        if fields.remove("format").as_ref().and_then(Value::as_str) != Some(self.format) {
            return Err(self.not_ours());
        }
        match fields.remove("version").as_ref().and_then(Value::as_u64) {
            Some(v) if v == self.version => Ok(fields),
            Some(v) if v > self.version => Err(format!(
                "it was saved by a newer version of Plumbline (version {v}); this one reads version {}",
                self.version
            )),
            _ => Err("its version is missing or unknown".to_owned()),
        }
    }

    fn not_ours(self) -> String {
        format!("it is not {} saved by Plumbline", self.what)
    }
}

/// The texts the device had saved, as read at start.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Stored {
    /// Under [`STATE_KEY`].
    pub state: Option<String>,
    /// Under [`RECORD_KEY`].
    pub record: Option<String>,
    /// Under [`KEPT_KEY`].
    pub kept: Option<String>,
    /// Under [`KEPT_RECORD_KEY`].
    pub kept_record: Option<String>,
    /// Every rescued text, `(key, text)`, oldest first (keys sort by the
    /// time of the visit that made them).
    pub rescued: Vec<(String, String)>,
    /// Under [`OPENING_KEY`]: what the last start was still opening.
    pub opening: Option<String>,
    /// This visit's name, unique on the device.
    pub visit: String,
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    const KIND: Kind = Kind {
        format: "plumbline-test",
        version: 2,
        what: "a test",
    };

    #[derive(Serialize)]
    struct Body {
        a: u32,
        b: &'static str,
    }

    #[test]
    fn the_header_comes_first_and_is_taken_off_again() {
        let text = KIND.seal(&Body { a: 1, b: "x" });
        assert_eq!(
            text,
            r#"{"format":"plumbline-test","version":2,"a":1,"b":"x"}"#
        );
        let fields = KIND.open(&text).unwrap();
        assert_eq!(fields.keys().collect::<Vec<_>>(), ["a", "b"]);
    }

    #[test]
    fn rescued_keys_name_their_part_and_reason() {
        let key = rescued_key("0001764712345678042-3", "kept-record", "unreadable");
        assert_eq!(
            key,
            "plumbline.unreadable.0001764712345678042-3.kept-record.unreadable"
        );
        assert_eq!(rescued_names(&key), Some(("kept-record", "unreadable")));
        assert_eq!(rescued_names(RESCUED_PREFIX), Some(("state", "unreadable")));
        for not_one in [
            "plumbline.unreadablex",
            "plumbline.unreadable.",
            "plumbline.unreadable.a.b",
            "plumbline.unreadable..b.c",
            "plumbline.state",
        ] {
            assert_eq!(rescued_names(not_one), None, "{not_one}");
        }
    }

    #[test]
    fn what_cannot_be_opened_says_why() {
        let good = KIND.seal(&Body { a: 1, b: "x" });
        let check = |text: &str, expected: &str| {
            let reason = KIND.open(text).unwrap_err();
            assert!(reason.contains(expected), "{text:.60}: {reason}");
        };
        check(&good[..good.len() / 2], "incomplete");
        check("", "incomplete");
        check("[1, 2]", "not a test saved by Plumbline");
        check(r#"{"format": "other", "version": 2}"#, "not a test");
        check(
            &good.replace(r#""version":2"#, r#""version":7"#),
            "newer version of Plumbline (version 7); this one reads version 2",
        );
        check(&good.replace(r#""version":2"#, r#""version":1"#), "unknown");
        check(r#"{"format": "plumbline-test"}"#, "version is missing");
        check(&" ".repeat(MAX_CHARS + 1), "bytes long");
        check(
            &format!("{}{}", "[".repeat(300), "]".repeat(300)),
            "300 levels of nesting; at most 32 are accepted",
        );
    }
}

/// Property tests (host only: proptest does not run in the browser).
#[cfg(all(test, not(target_arch = "wasm32")))]
mod properties {
    use super::*;
    use proptest::prelude::*;

    proptest! {
        #[test]
        fn any_text_opens_or_says_why_without_panic(text in ".{0,300}") {
            let kind = Kind { format: "f", version: 1, what: "x" };
            let _ = kind.open(&text);
        }
    }
}

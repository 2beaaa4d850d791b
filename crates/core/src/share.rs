//! Share links: a case carried in a URL fragment, so a colleague's device
//! opens the same check with no server in between.
//!
//! The fragment is `p1.` (format and version) followed by the case's compact
//! JSON, deflated and base64url-encoded. Only the case travels: not the
//! record over time (too long for a link), nothing about the device. The
//! fragment never reaches a web server, and decoding a hostile or damaged
//! one gives a message, never a panic: sizes are capped before and after
//! inflating (`limits`), a link that would unpack to more is refused as
//! too large, and the result goes through the same reader as any case file.

use base64::engine::general_purpose::URL_SAFE_NO_PAD;
use base64::Engine as _;

use miniz_oxide::inflate::TINFLStatus;

use crate::case::Case;
use crate::error::{Error, ErrorKind, Errors};
pub use crate::limits::{MAX_FRAGMENT_CHARS, MAX_INFLATED_BYTES};

/// The fragment's prefix: format marker and version.
pub const PREFIX: &str = "p1.";

fn damaged(message: impl Into<String>) -> Errors {
    Error::new(
        "link",
        ErrorKind::Shape {
            message: message.into(),
        },
    )
    .into()
}

/// The fragment (without `#`) that carries `case`; its record over time is
/// left out.
///
/// # Example
/// ```
/// use plumbline_core::{case::Case, share};
/// let case = Case::from_json(plumbline_core::demo::CASE_JSON).unwrap();
/// let fragment = share::encode(&case);
/// assert!(fragment.starts_with("p1."));
/// assert_eq!(share::decode(&fragment).unwrap(), case);
/// ```
pub fn encode(case: &Case) -> String {
    let json = serde_json::to_vec(&case.without_timeline()).unwrap_or_default();
    let deflated = miniz_oxide::deflate::compress_to_vec(&json, 9);
    format!("{PREFIX}{}", URL_SAFE_NO_PAD.encode(deflated))
}

/// A full link: `base` (any fragment of it dropped) with the case's fragment.
pub fn link(base: &str, case: &Case) -> String {
    let base = base.split('#').next().unwrap_or(base);
    format!("{base}#{}", encode(case))
}

/// Reads a fragment (with or without its `#`) back into a case.
///
/// # Errors
/// A fragment of another kind or a newer version, one that is damaged or
/// truncated, one too large, or a case with problems (each naming its field).
pub fn decode(fragment: &str) -> Result<Case, Errors> {
    let fragment = fragment.trim().trim_start_matches('#');
    let chars = fragment.chars().count();
    if chars > MAX_FRAGMENT_CHARS {
        return Err(damaged(format!(
            "the link is {chars} characters long; at most {MAX_FRAGMENT_CHARS} are accepted, \
             so it is not one this tool made"
        )));
    }
    let Some(body) = fragment.strip_prefix(PREFIX) else {
        let newer = fragment
            .strip_prefix('p')
            .and_then(|rest| rest.split('.').next())
            .and_then(|v| v.parse::<u32>().ok())
            .filter(|v| *v > 1);
        return Err(damaged(match newer {
            Some(v) => format!(
                "the link was made by a newer version (format {v}); this build reads format 1"
            ),
            None => "the link does not carry a Plumbline case".to_owned(),
        }));
    };
    let bytes = URL_SAFE_NO_PAD
        .decode(body)
        .map_err(|_| damaged("the link is damaged: it was cut short or changed on the way"))?;
    let json = miniz_oxide::inflate::decompress_to_vec_with_limit(&bytes, MAX_INFLATED_BYTES)
        .map_err(|e| {
            damaged(if e.status == TINFLStatus::HasMoreOutput {
                format!(
                    "the link is too large when unpacked: more than {MAX_INFLATED_BYTES} bytes, \
                     where a case is at most that; it is not one this tool made"
                )
            } else {
                "the link is damaged or incomplete: it was cut short on the way".to_owned()
            })
        })?;
    let text = String::from_utf8(json).map_err(|_| damaged("the link is damaged"))?;
    Case::from_json(&text)
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use proptest::prelude::*;

    fn demo() -> Case {
        Case::from_json(crate::demo::CASE_JSON).unwrap()
    }

    #[test]
    fn round_trip_and_compact() {
        let fragment = encode(&demo());
        assert_eq!(decode(&fragment).unwrap(), demo());
        assert_eq!(decode(&format!("#{fragment}")).unwrap(), demo());
        // Short enough for a QR code a tablet camera reads off a screen.
        assert!(fragment.len() < 700, "{} characters", fragment.len());
    }

    #[test]
    fn links_replace_any_old_fragment() {
        let link = link("https://example.invalid/tools/plumbline/#p1.old", &demo());
        assert!(link.starts_with("https://example.invalid/tools/plumbline/#p1."));
        assert!(!link.contains("old"));
    }

    #[test]
    fn the_record_is_not_carried() {
        let mut case = demo();
        case.timeline = Some(crate::case::TimelineSpec::default());
        assert!(decode(&encode(&case)).unwrap().timeline.is_none());
    }

    #[test]
    fn damaged_truncated_and_foreign_links_say_so() {
        let fragment = encode(&demo());
        let check = |text: &str, expected: &str| {
            let message = decode(text).unwrap_err().to_string();
            assert!(message.contains(expected), "{text:?}: {message}");
        };
        check(&fragment[..fragment.len() / 2], "damaged");
        check("p1.!!!!", "damaged");
        check("p2.abc", "newer version");
        check("<script>alert(1)</script>", "does not carry");
        check("", "does not carry");
        check(
            &"p1.".repeat(10_000),
            "30000 characters long; at most 16384",
        );
        // A valid deflate stream of something that is not a case.
        let other = URL_SAFE_NO_PAD.encode(miniz_oxide::deflate::compress_to_vec(
            br#"{"format": "plumbline-case", "version": 1, "arterial": [{"id": "<img src=x onerror=alert(1)>"}]}"#,
            6,
        ));
        check(&format!("p1.{other}"), "arterial[0]");
    }

    #[test]
    fn a_deflate_bomb_is_refused_as_too_large() {
        let huge = vec![b' '; MAX_INFLATED_BYTES * 4];
        let bomb = URL_SAFE_NO_PAD.encode(miniz_oxide::deflate::compress_to_vec(&huge, 9));
        let message = decode(&format!("p1.{bomb}")).unwrap_err().to_string();
        assert!(
            message.contains("too large when unpacked") && !message.contains("cut short"),
            "{message}"
        );
        // One byte under the cap unpacks, and is read as the case it is.
        let spaces = vec![b' '; MAX_INFLATED_BYTES - 2];
        let mut near = b"{}".to_vec();
        near.splice(1..1, spaces);
        let near = URL_SAFE_NO_PAD.encode(miniz_oxide::deflate::compress_to_vec(&near, 9));
        let message = decode(&format!("p1.{near}")).unwrap_err().to_string();
        assert!(message.contains("format"), "{message}");
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(2000))]

        #[test]
        fn any_text_decodes_or_errs_without_panic(text in ".{0,400}") {
            let _ = decode(&text);
            let _ = decode(&format!("p1.{text}"));
        }

        #[test]
        fn corrupted_links_never_panic(flips in prop::collection::vec((0usize..600, any::<u8>()), 1..8)) {
            let mut bytes = encode(&demo()).into_bytes();
            for (at, b) in flips {
                let len = bytes.len();
                if let Some(x) = bytes.get_mut(at % len) {
                    *x = b'-' + (b % 64);
                }
            }
            let _ = decode(&String::from_utf8_lossy(&bytes));
        }
    }
}

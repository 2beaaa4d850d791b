//! The check as the device keeps it: the boxes and the theme mapped to and
//! from a `storage` envelope, and a record over time to and from its own
//! text.
//!
//! The check's envelope is `{"format": "plumbline-state", "version": 1,
//! "theme": ..., "case": ..., "form": ...}`: the case the form rides on is
//! a case document (read back by the core's own reader, so a damaged one
//! names its field), the boxes are saved exactly as typed, mistakes
//! included. A record over time never goes in the envelope: it is kept
//! under its own key, as a case document holding only the timeline and
//! the position the record starts in, and written only when it changes.
//! Reading never panics: anything it cannot use gives a reason in words,
//! and the saved boxes are held to a case's caps (as many sources and
//! targets, as long a text) before they are read.

use plumbline_core::case::{Case, TimelineSpec, FORMAT as CASE_FORMAT, VERSION as CASE_VERSION};
use plumbline_core::error::{Error, Errors};
use plumbline_core::geometry::PositionSpec;
use plumbline_core::limits::{self, MAX_ARTERIAL, MAX_TARGETS, MAX_TEXT_CHARS};
use serde::Serialize;
use serde_json::Value;

use crate::form::Form;
use crate::record::Record;
use crate::session::Opening;
use crate::storage::Kind;
use crate::theme::Theme;

/// The check's envelope: `plumbline-state`, version 1.
pub const CHECK: Kind = Kind {
    format: "plumbline-state",
    version: 1,
    what: "a check",
};

/// The first line of the note of what the app is opening; a link's
/// fragment follows on the second. Plain text: the note is ours alone
/// and lives only from a start to its first render.
pub const OPENING_HEAD: &str = "plumbline-opening 1";

/// The note kept while `opening` is opened.
pub fn encode_opening(opening: &Opening) -> String {
    match opening {
        Opening::Saved => OPENING_HEAD.to_owned(),
        Opening::Link(fragment) => format!("{OPENING_HEAD}\n{fragment}"),
    }
}

/// What a note says was opening; a damaged note counts as the saved check
/// (the cautious reading: it is set aside, kept for download).
pub fn decode_opening(text: &str) -> Opening {
    match text
        .strip_prefix(OPENING_HEAD)
        .and_then(|rest| rest.strip_prefix('\n'))
    {
        Some(fragment) => Opening::Link(fragment.to_owned()),
        None => Opening::Saved,
    }
}

/// A check read back from the device.
#[derive(Clone, Debug, PartialEq)]
pub struct Saved {
    /// The boxes as they were.
    pub form: Form,
    /// The theme chosen.
    pub theme: Theme,
}

#[derive(Serialize)]
struct CheckFields<'a> {
    theme: &'static str,
    case: &'a Case,
    form: &'a Form,
}

/// A record over time read back from the device.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct SavedRecord {
    /// The samples, position changes and rules.
    pub timeline: Option<TimelineSpec>,
    /// The position the record starts in.
    pub start: Option<PositionSpec>,
}

#[derive(Serialize)]
struct RecordDocument<'a> {
    format: &'static str,
    version: u32,
    #[serde(skip_serializing_if = "Option::is_none")]
    position: Option<&'a PositionSpec>,
    timeline: &'a TimelineSpec,
}

/// The envelope for `form` and `theme`; the record over time is left out.
pub fn encode(form: &Form, theme: Theme) -> String {
    let base = form.base();
    let lean;
    let case = if base.timeline.is_some() {
        lean = base.without_timeline();
        &lean
    } else {
        base
    };
    CHECK.seal(&CheckFields {
        theme: theme.key(),
        case,
        form,
    })
}

/// Reads a check's envelope back.
///
/// # Errors
/// Why it cannot be used, in words: not an envelope of ours, from a newer
/// version, cut short, or a case or box that cannot be read.
pub fn decode(text: &str) -> Result<Saved, String> {
    let mut fields = CHECK.open(text)?;
    let theme = fields
        .get("theme")
        .and_then(Value::as_str)
        .map_or(Theme::Device, Theme::from_key);
    let case = Case::from_value(fields.remove("case").unwrap_or(Value::Null))
        .map_err(|e| format!("its case cannot be read ({})", first_words(&e)))?;
    let form = fields.remove("form").unwrap_or(Value::Null);
    form_within_limits(&form).map_err(|e| format!("its boxes cannot be read ({e})"))?;
    let form: Form =
        serde_json::from_value(form).map_err(|e| format!("its boxes cannot be read ({e})"))?;
    Ok(Saved {
        form: form.with_base(case),
        theme,
    })
}

/// The saved boxes against the caps a case has: as many sources and
/// targets, and no box longer than a case's longest text.
fn form_within_limits(form: &Value) -> Result<(), Error> {
    for (key, what, max) in [
        ("sources", "arterial sources", MAX_ARTERIAL),
        ("targets", "targets", MAX_TARGETS),
    ] {
        let n = form.get(key).and_then(Value::as_array).map_or(0, Vec::len);
        if n > max {
            return Err(limits::over(format!("form.{key}"), n, what, max));
        }
    }
    longest_text(form, "form")
}

/// The first text in `value` longer than a case's longest, by its path.
fn longest_text(value: &Value, path: &str) -> Result<(), Error> {
    match value {
        Value::String(text) if text.len() > MAX_TEXT_CHARS => {
            let chars = text.chars().count();
            if chars > MAX_TEXT_CHARS {
                return Err(limits::over(path, chars, "characters", MAX_TEXT_CHARS));
            }
            Ok(())
        }
        Value::Array(items) => items
            .iter()
            .enumerate()
            .try_for_each(|(i, v)| longest_text(v, &format!("{path}[{i}]"))),
        Value::Object(map) => map
            .iter()
            .try_for_each(|(k, v)| longest_text(v, &format!("{path}.{k}"))),
        _ => Ok(()),
    }
}

/// A record over time as a case document holding only the timeline and
/// the position it starts in; `None` for no record.
pub fn encode_record(record: &Record) -> Option<String> {
    if record.is_empty() {
        return None;
    }
    let timeline = record.timeline();
    let document = RecordDocument {
        format: CASE_FORMAT,
        version: CASE_VERSION,
        position: record.start.as_ref(),
        timeline: &timeline,
    };
    serde_json::to_string(&document).ok()
}

/// Reads a record over time back.
///
/// # Errors
/// Why it cannot be used, in words.
pub fn decode_record(text: &str) -> Result<SavedRecord, String> {
    Case::from_json(text)
        .map(|case| SavedRecord {
            timeline: case.timeline,
            start: case.position,
        })
        .map_err(|e| first_words(&e))
}

/// The first problem of a list, for a notice.
fn first_words(errors: &Errors) -> String {
    errors
        .iter()
        .next()
        .map_or_else(|| "unknown problem".to_owned(), ToString::to_string)
}

/// The record on screen for a saved one, under `form`: it is taken in as a
/// record riding in the case is, then starts where it was saved to start.
pub fn record_of(form: &Form, saved: SavedRecord) -> Record {
    let mut record = Record::default();
    if let Some(timeline) = saved.timeline {
        let mut base = form.base().clone();
        base.timeline = Some(timeline);
        record.adopt(&mut form.clone().with_base(base));
        if saved.start.is_some() {
            record.start = saved.start;
        }
    }
    record
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::form::{Edit, Slot, SourcePart};
    use plumbline_core::demo::CASE_JSON;
    use plumbline_core::units::PressureUnit;

    fn demo_form() -> Form {
        Form::from_case(&Case::from_json(CASE_JSON).unwrap())
    }

    #[test]
    fn a_state_past_the_caps_says_which() {
        let mut value: Value = serde_json::from_str(&encode(&demo_form(), Theme::Light)).unwrap();
        let source = value["form"]["sources"][0].clone();
        value["form"]["sources"] = Value::Array(vec![source; MAX_ARTERIAL + 1]);
        assert_eq!(
            decode(&value.to_string()).unwrap_err(),
            "its boxes cannot be read (form.sources: 65 arterial sources; at most 64 are accepted)"
        );
        let mut value: Value = serde_json::from_str(&encode(&demo_form(), Theme::Light)).unwrap();
        value["form"]["haematocrit"] = Value::from("4".repeat(MAX_TEXT_CHARS + 1));
        assert_eq!(
            decode(&value.to_string()).unwrap_err(),
            "its boxes cannot be read (form.haematocrit: 1001 characters; at most 1000 are accepted)"
        );
    }

    /// A record of 1000 samples riding in the demo's case.
    fn demo_with_record() -> Case {
        crate::record::demo_with_record(1000, 74.0)
    }

    #[test]
    fn a_form_comes_back_exactly_as_typed_mistakes_included() {
        let mut form = demo_form();
        form.apply(Edit::Text(Slot::Source(0, SourcePart::Mean), "7o".into()));
        form.apply(Edit::PressureUnit(
            Slot::Source(0, SourcePart::Systolic),
            PressureUnit::KPa,
        ));
        let text = encode(&form, Theme::Dark);
        assert!(
            text.starts_with(r#"{"format":"plumbline-state","version":1,"theme":"dark","case":{"#)
        );
        let saved = decode(&text).unwrap();
        assert_eq!(saved.form, form);
        assert_eq!(saved.theme, Theme::Dark);
        // Switching back still gives the typed original.
        let mut back = saved.form;
        back.apply(Edit::PressureUnit(
            Slot::Source(0, SourcePart::Systolic),
            PressureUnit::MmHg,
        ));
        assert_eq!(back.sources[0].pressures.systolic.text, "104");
    }

    #[test]
    fn the_record_over_time_stays_out_of_the_envelope() {
        let case = demo_with_record();
        let text = encode(&Form::from_case(&case), Theme::Device);
        assert!(text.len() < 8000, "{} characters", text.len());
        assert!(decode(&text).unwrap().form.base().timeline.is_none());
    }

    #[test]
    fn a_record_keeps_its_samples_rules_and_start() {
        let mut form = Form::from_case(&demo_with_record());
        let mut record = Record::default();
        record.adopt(&mut form);
        record.rules.gap_max_s = Some(30.0);
        record.start = Some(PositionSpec::new(plumbline_core::geometry::Posture::Supine));
        let text = encode_record(&record).unwrap();
        let saved = decode_record(&text).unwrap();
        assert_eq!(saved.timeline, Some(record.timeline()));
        assert_eq!(saved.start, record.start);
        assert_eq!(encode_record(&Record::default()), None);
        let back = record_of(&form, saved);
        assert_eq!(back.timeline(), record.timeline());
        assert_eq!(back.start, record.start);
    }

    #[test]
    fn what_cannot_be_read_says_why() {
        let good = encode(&demo_form(), Theme::Light);
        let check = |text: &str, expected: &str| {
            let reason = decode(text).unwrap_err();
            assert!(reason.contains(expected), "{text:.60}: {reason}");
        };
        check(&good[..good.len() / 2], "incomplete");
        check("[1, 2]", "not a check saved by Plumbline");
        check(
            &good.replace(r#""version":1"#, r#""version":7"#),
            "newer version of Plumbline (version 7)",
        );
        check(
            &good.replace(r#""format":"plumbline-case""#, r#""format":"x""#),
            "its case cannot be read (format:",
        );
        check(
            r#"{"format": "plumbline-state", "version": 1, "case": {"format": "plumbline-case", "version": 1}, "form": 3}"#,
            "its boxes cannot be read",
        );
        assert!(decode_record("{").is_err());
    }

    #[test]
    fn the_opening_note_names_the_link_or_the_saved_check() {
        for opening in [Opening::Saved, Opening::Link("#p1.abc\"<".into())] {
            assert_eq!(decode_opening(&encode_opening(&opening)), opening);
        }
        assert_eq!(decode_opening("{"), Opening::Saved);
        assert_eq!(
            decode_opening(r#"{"format":"plumbline-opening","version":1,"link":3}"#),
            Opening::Saved
        );
        assert_eq!(decode_opening("plumbline-opening 9\n#p1.x"), Opening::Saved);
    }

    #[test]
    fn an_unknown_theme_is_the_devices() {
        let text = encode(&demo_form(), Theme::Dark).replace(r#""dark""#, r#""neon""#);
        assert_eq!(decode(&text).unwrap().theme, Theme::Device);
    }
}

/// Property tests of the loader (host only: proptest does not run in the
/// browser): no input, damaged or random, makes it panic.
#[cfg(all(test, not(target_arch = "wasm32")))]
mod properties {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::form::Edit;
    use plumbline_core::demo::CASE_JSON;
    use proptest::prelude::*;

    fn demo_form() -> Form {
        Form::from_case(&Case::from_json(CASE_JSON).unwrap())
    }

    fn json() -> impl Strategy<Value = Value> {
        let leaf = prop_oneof![
            Just(Value::Null),
            any::<bool>().prop_map(Value::from),
            any::<f64>().prop_map(Value::from),
            any::<i64>().prop_map(Value::from),
            ".{0,12}".prop_map(Value::from),
        ];
        leaf.prop_recursive(4, 48, 6, |inner| {
            prop_oneof![
                prop::collection::vec(inner.clone(), 0..6).prop_map(Value::from),
                prop::collection::btree_map(".{0,10}", inner, 0..6)
                    .prop_map(|m| Value::Object(m.into_iter().collect())),
            ]
        })
    }

    /// Names the loader looks for, so random documents reach deep code.
    fn field() -> impl Strategy<Value = String> {
        prop::sample::select(vec![
            "format", "version", "theme", "case", "form", "height", "position", "sources",
            "readings", "assumed", "targets", "text", "unit", "typed", "pick", "level", "method",
            "kind", "posture", "angles", "left", "right", "choice",
        ])
        .prop_map(str::to_owned)
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(3000))]

        #[test]
        fn any_text_reads_or_says_why_without_panic(text in ".{0,300}") {
            let _ = decode(&text);
            let _ = decode_record(&text);
        }

        #[test]
        fn damaged_envelopes_never_panic(
            cut in 0usize..6000,
            flips in prop::collection::vec((0usize..6000, any::<u8>()), 0..10),
        ) {
            let mut bytes = encode(&demo_form(), Theme::Dark).into_bytes();
            let len = bytes.len();
            for (at, b) in flips {
                if let Some(x) = bytes.get_mut(at % len) {
                    *x = b' ' + (b % 95);
                }
            }
            bytes.truncate(cut.max(1));
            let _ = decode(&String::from_utf8_lossy(&bytes));
        }

        #[test]
        fn swapped_parts_never_panic(
            path in prop::collection::vec(field(), 1..4),
            replacement in json(),
        ) {
            let mut value: Value = serde_json::from_str(&encode(&demo_form(), Theme::Dark)).unwrap();
            let mut at = &mut value;
            for key in &path {
                let Value::Object(map) = at else { break };
                at = map.entry(key.clone()).or_insert(Value::Null);
            }
            *at = replacement;
            if let Ok(saved) = decode(&value.to_string()) {
                // Whatever reads back can be used: checked, edited, saved again.
                let _ = saved.form.to_case();
                let mut form = saved.form.clone();
                form.apply(Edit::AddSource);
                let _ = decode(&encode(&form, saved.theme));
            }
        }

        #[test]
        fn random_documents_never_panic(value in json()) {
            let _ = decode(&value.to_string());
            let wrapped = serde_json::json!({"format": CHECK.format, "version": 1, "case": value.clone(), "form": value});
            let _ = decode(&wrapped.to_string());
        }
    }
}

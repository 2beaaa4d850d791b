//! Caps on what drives the cost of one input, in one place, so no document
//! can stall a bedside tablet and every refusal says which cap it met.
//!
//! Every document this tool reads (a case file with its record over time,
//! a share link, a record CSV file, the screen's saved state) is bounded
//! before any expensive work: its bytes, its nesting, how many arterial
//! sources, targets, record channels, samples and position changes it
//! holds, and how long its texts are. Each cap sits far above any real
//! bedside use (one to four arterial sources, a dozen targets, a few
//! channels over at most 72 hours), so it only ever meets a damaged or
//! hostile document. The semantic rules (an id of 1-40 characters, a
//! target source of at most 240) stay with the scene; the caps here are
//! looser and are only about cost. `docs/case-format.md` and
//! `docs/record-format.md` list them.

use crate::case::Case;
use crate::error::{Error, ErrorKind, Errors};

pub use crate::record::{MAX_SAMPLES, MAX_SPAN_S};

/// The largest document read, bytes: a case file with its record, a
/// record CSV file. An eight-hour record at 1 Hz is about 1 MB as CSV and
/// 3 MB as a case; a 72-hour record at 1 Hz about 6 MB as CSV.
pub const MAX_DOCUMENT_BYTES: usize = 16 * 1024 * 1024;
/// The deepest nesting of arrays and objects in a JSON document. A case
/// nests at most 7 levels (a position change's arm angles); the JSON
/// reader's own limit (128) is never reached.
pub const MAX_NESTING: usize = 32;
/// The most arterial sources in a case. A patient has one to four (a line,
/// a cuff, a second line for a cross-check); 64 leaves room for any
/// imaginable set-up and for the benchmark over sources.
pub const MAX_ARTERIAL: usize = 64;
/// The most targets in a case. The defaults are twelve.
pub const MAX_TARGETS: usize = 64;
/// The longest text in a case (a source's id, a target's source, a
/// channel name, a clock time), characters. The scene's own rules are
/// stricter (ids 40, target sources 240).
pub const MAX_TEXT_CHARS: usize = 1_000;
/// The most channels in a record over time: every component of every
/// arterial source and every other reading fits (64 × 3 + the readings).
pub const MAX_CHANNELS: usize = 256;
/// The most position changes in a record over time: one every five
/// minutes for 72 hours is 864.
pub const MAX_POSITION_CHANGES: usize = 1_000;
/// The longest share link fragment accepted, characters. The demo's is
/// about 700; a case with 64 sources fits.
pub const MAX_FRAGMENT_CHARS: usize = 16 * 1024;
/// The largest case a share link may unpack to, bytes (deflate bombs stop
/// here). The demo unpacks to about 1.5 KB.
pub const MAX_INFLATED_BYTES: usize = 128 * 1024;
/// The most rows in a record CSV file after its header: a sample a row at
/// the most samples a record holds.
pub const MAX_CSV_ROWS: usize = MAX_SAMPLES;
/// The most columns in a record CSV file: the time and every channel.
pub const MAX_CSV_COLUMNS: usize = 1 + MAX_CHANNELS;
/// The longest line in a record CSV file, bytes: a header naming every
/// channel fits.
pub const MAX_CSV_LINE_BYTES: usize = 64 * 1024;
/// The most problems a record CSV import lists before it gives up.
pub const MAX_CSV_PROBLEMS: usize = 100;
/// The largest saved state the screen reads back, bytes (its record over
/// time is kept apart, as a case document).
pub const MAX_SAVED_STATE_BYTES: usize = 8 * 1024 * 1024;

/// The error for `found` of `what` where at most `max` are accepted, about
/// `field`: `arterial: 130 arterial sources; at most 64 are accepted`.
pub fn over(field: impl Into<String>, found: usize, what: &str, max: usize) -> Error {
    Error::new(
        field,
        ErrorKind::OverLimit {
            found,
            what: what.to_owned(),
            max,
        },
    )
}

/// Refuses a text of more than [`MAX_DOCUMENT_BYTES`].
///
/// # Errors
/// The document's size and the cap.
pub fn check_bytes(field: &str, bytes: usize) -> Result<(), Errors> {
    if bytes > MAX_DOCUMENT_BYTES {
        return Err(over(field, bytes, "bytes", MAX_DOCUMENT_BYTES).into());
    }
    Ok(())
}

/// How deeply a JSON text nests arrays and objects, in one pass over its
/// bytes. Strings are skipped, escapes included; the text need not be
/// valid JSON.
pub fn json_nesting(text: &str) -> usize {
    let mut depth = 0usize;
    let mut deepest = 0usize;
    let mut in_string = false;
    let mut escaped = false;
    for b in text.bytes() {
        if in_string {
            match b {
                _ if escaped => escaped = false,
                b'\\' => escaped = true,
                b'"' => in_string = false,
                _ => {}
            }
            continue;
        }
        match b {
            b'"' => in_string = true,
            b'[' | b'{' => {
                depth += 1;
                deepest = deepest.max(depth);
            }
            b']' | b'}' => depth = depth.saturating_sub(1),
            _ => {}
        }
    }
    deepest
}

/// Refuses JSON text nested deeper than [`MAX_NESTING`] before it is parsed.
///
/// # Errors
/// The depth found and the cap.
pub fn check_nesting(text: &str) -> Result<(), Errors> {
    let depth = json_nesting(text);
    if depth > MAX_NESTING {
        return Err(over("", depth, "levels of nesting", MAX_NESTING).into());
    }
    Ok(())
}

fn text(errors: &mut Errors, field: impl FnOnce() -> String, value: &str) {
    // Bytes bound characters from above: count only when it may matter.
    if value.len() > MAX_TEXT_CHARS {
        let chars = value.chars().count();
        if chars > MAX_TEXT_CHARS {
            errors.push(over(field(), chars, "characters", MAX_TEXT_CHARS));
        }
    }
}

fn count(errors: &mut Errors, field: &str, found: usize, what: &str, max: usize) -> bool {
    if found > max {
        errors.push(over(field, found, what, max));
        return false;
    }
    true
}

/// Checks a case read from a document against every cap, before the scene
/// or any formula sees it. Costs one pass over its lists, never over its
/// samples.
///
/// # Errors
/// Every cap met, each naming its field and the cap in one sentence.
pub fn check_case(case: &Case) -> Result<(), Errors> {
    let mut errors = Errors::default();
    if count(
        &mut errors,
        "arterial",
        case.arterial.len(),
        "arterial sources",
        MAX_ARTERIAL,
    ) {
        for (i, source) in case.arterial.iter().enumerate() {
            text(&mut errors, || format!("arterial[{i}].id"), &source.id);
        }
    }
    if let Some(primary) = &case.primary_arterial {
        text(&mut errors, || "primary_arterial".to_owned(), primary);
    }
    if let Some(targets) = &case.targets {
        if count(
            &mut errors,
            "targets",
            targets.len(),
            "targets",
            MAX_TARGETS,
        ) {
            for (i, target) in targets.iter().enumerate() {
                if let Some(source) = &target.citation {
                    text(&mut errors, || format!("targets[{i}].source"), source);
                }
            }
        }
    }
    if let Some(timeline) = &case.timeline {
        if let Some(clock) = &timeline.clock_start {
            text(&mut errors, || "timeline.clock_start".to_owned(), clock);
        }
        count(
            &mut errors,
            "timeline.positions",
            timeline.positions.len(),
            "position changes",
            MAX_POSITION_CHANGES,
        );
        if count(
            &mut errors,
            "timeline.channels",
            timeline.channels.len(),
            "channels",
            MAX_CHANNELS,
        ) {
            for (i, channel) in timeline.channels.iter().enumerate() {
                text(
                    &mut errors,
                    || format!("timeline.channels[{i}].channel"),
                    &channel.channel,
                );
            }
            let samples = timeline
                .channels
                .iter()
                .map(|c| c.t_s.len().max(c.values.len()))
                .fold(0usize, usize::saturating_add);
            count(
                &mut errors,
                "timeline.channels",
                samples,
                "samples",
                MAX_SAMPLES,
            );
        }
    }
    errors.into_result(())
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::case::{ArterialSpec, ChannelSpec, TimelineSpec};
    use crate::demo::CASE_JSON;
    use crate::units::PressureUnit;

    fn demo() -> Case {
        Case::from_json(CASE_JSON).unwrap()
    }

    fn messages(case: &Case) -> Vec<String> {
        check_case(case)
            .unwrap_err()
            .iter()
            .map(ToString::to_string)
            .collect()
    }

    fn source(i: usize) -> ArterialSpec {
        let mut s = demo().arterial.first().unwrap().clone();
        s.id = format!("line {i}");
        s
    }

    #[test]
    fn the_demo_and_every_cap_exactly_are_accepted() {
        assert_eq!(check_case(&demo()), Ok(()));
        let mut case = demo();
        case.arterial = (0..MAX_ARTERIAL).map(source).collect();
        assert_eq!(check_case(&case), Ok(()));
    }

    #[test]
    fn one_past_a_cap_is_refused_in_one_plain_sentence() {
        let mut case = demo();
        case.arterial = (0..130).map(source).collect();
        assert_eq!(
            messages(&case),
            ["arterial: 130 arterial sources; at most 64 are accepted"]
        );
        let mut case = demo();
        let target = crate::target::TargetSpec::from_target(&crate::target::defaults()[0]);
        case.targets = Some(vec![target; MAX_TARGETS + 1]);
        assert_eq!(
            messages(&case),
            ["targets: 65 targets; at most 64 are accepted"]
        );
    }

    #[test]
    fn long_texts_name_their_field() {
        let mut case = demo();
        case.arterial[0].id = "x".repeat(MAX_TEXT_CHARS + 1);
        assert_eq!(
            messages(&case),
            ["arterial[0].id: 1001 characters; at most 1000 are accepted"]
        );
        // Characters, not bytes: 1000 two-byte letters are accepted.
        case.arterial[0].id = "é".repeat(MAX_TEXT_CHARS);
        assert_eq!(check_case(&case), Ok(()));
    }

    #[test]
    fn a_record_is_capped_by_channels_samples_and_position_changes() {
        let channel = |n: usize| ChannelSpec {
            channel: "radial line.mean".into(),
            unit: PressureUnit::MmHg,
            t_s: vec![0.0; n],
            values: vec![70.0; n],
        };
        let mut case = demo();
        case.timeline = Some(TimelineSpec {
            channels: vec![channel(MAX_SAMPLES / 2), channel(MAX_SAMPLES / 2 + 1)],
            ..TimelineSpec::default()
        });
        assert_eq!(
            messages(&case),
            ["timeline.channels: 2000001 samples; at most 2000000 are accepted"]
        );
        case.timeline = Some(TimelineSpec {
            channels: vec![channel(1); MAX_CHANNELS + 1],
            ..TimelineSpec::default()
        });
        assert_eq!(
            messages(&case),
            ["timeline.channels: 257 channels; at most 256 are accepted"]
        );
    }

    #[test]
    fn nesting_is_counted_outside_strings_only() {
        assert_eq!(json_nesting(r#"{"a": [1, {"b": "[[[{{{"}]}"#), 3);
        assert_eq!(json_nesting(r#"["\"[[", [[]]]"#), 3);
        assert_eq!(json_nesting(&"[".repeat(10_000)), 10_000);
        assert_eq!(json_nesting("]]]}}"), 0);
        let deep = format!("{}{}", "[".repeat(40), "]".repeat(40));
        assert_eq!(
            check_nesting(&deep).unwrap_err().to_string(),
            "40 levels of nesting; at most 32 are accepted"
        );
        assert_eq!(check_nesting(CASE_JSON), Ok(()));
    }
}

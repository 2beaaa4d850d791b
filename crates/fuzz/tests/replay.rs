//! The fuzzing corpus replayed (run by `scripts/test.sh`): every input of
//! `fuzz/corpus/` and every seed goes through its decoder and all that
//! follows under `catch_unwind`, and none may panic; the regression
//! inputs, each once slow or hostile, are refused at the cap they meet,
//! with the words that name it. How long they take is measured by
//! `benches/corpus.rs`, never asserted here.

#![allow(clippy::unwrap_used, clippy::expect_used, clippy::indexing_slicing)]

use plumbline_core::case::Case;
use plumbline_core::{demo, record, share};
use plumbline_fuzz::{replay, root, Decoder, Reached};

fn corpus(decoder: Decoder, name: &str) -> String {
    std::fs::read_to_string(decoder.corpus_dir(&root()).join(name)).unwrap()
}

#[test]
fn every_corpus_input_and_seed_runs_without_a_panic() {
    for decoder in Decoder::ALL {
        let seeds = decoder.seeds(&root());
        let corpus = plumbline_fuzz::files(&decoder.corpus_dir(&root())).len();
        assert!(corpus >= 7, "{}: {corpus} corpus inputs", decoder.name());
        let report = replay(decoder, &seeds);
        assert_eq!(report.executions as usize, seeds.len());
        let panics: Vec<&String> = report.panics.iter().map(|(m, _)| m).collect();
        assert!(panics.is_empty(), "{}: {panics:?}", decoder.name());
        // Both sides of every decoder are exercised.
        let [_, refused, read, checked] = report.reached;
        assert!(
            refused > 0 && read + checked > 0,
            "{}",
            report.summary(decoder)
        );
    }
}

/// The first problem the reader names for a case file.
fn case_refusal(text: &str) -> String {
    Case::from_json(text).unwrap_err().to_string()
}

#[test]
fn once_slow_cases_are_refused_at_their_caps() {
    let cases = [
        (
            "sources-120.json",
            "arterial: 120 arterial sources; at most 64 are accepted",
        ),
        (
            "nesting-200.json",
            "201 levels of nesting; at most 32 are accepted",
        ),
        (
            "channels-300.json",
            "timeline.channels: 300 channels; at most 256 are accepted",
        ),
        (
            "position-changes-1001.json",
            "timeline.positions: 1001 position changes; at most 1000",
        ),
        (
            "targets-70.json",
            "targets: 70 targets; at most 64 are accepted",
        ),
        (
            "long-id-5000.json",
            "arterial[0].id: 5000 characters; at most 1000 are accepted",
        ),
    ];
    for (name, expected) in cases {
        let message = case_refusal(&corpus(Decoder::Case, name));
        assert!(message.starts_with(expected), "{name}: {message}");
    }
}

#[test]
fn once_slow_links_are_refused_at_their_caps() {
    let links = [
        (
            "sources-120.txt",
            "arterial: 120 arterial sources; at most 64 are accepted",
        ),
        (
            "long-link-65-sources.txt",
            "arterial: 65 arterial sources; at most 64",
        ),
        (
            "over-the-cap.txt",
            "16385 characters long; at most 16384 are accepted",
        ),
        ("bomb-1mib.txt", "too large when unpacked"),
        ("nesting-200.txt", "201 levels of nesting"),
    ];
    for (name, expected) in links {
        let message = share::decode(&corpus(Decoder::Share, name))
            .unwrap_err()
            .to_string();
        assert!(message.contains(expected), "{name}: {message}");
        assert!(!message.contains("cut short"), "{name}: {message}");
    }
    // Exactly at the cap it unpacks and is read as the case it is.
    let at_cap = share::decode(&corpus(Decoder::Share, "unpacks-to-the-cap.txt"));
    assert!(at_cap
        .unwrap_err()
        .to_string()
        .starts_with("x: unknown field"));
}

#[test]
fn once_slow_records_are_refused_at_their_caps() {
    let case = Case::from_json(demo::CASE_JSON).unwrap();
    let files = [
        (
            "huge-line.csv",
            "line 2: 100005 bytes in one line; at most 65536 are accepted",
        ),
        (
            "columns-300.csv",
            "line 1: 301 columns; at most 257 are accepted",
        ),
        ("fields-20000.csv", "line 2: 20001 fields, the header has 3"),
    ];
    for (name, expected) in files {
        let message =
            record::Recorded::import(&case, &corpus(Decoder::Csv, name), &Default::default())
                .unwrap_err()
                .to_string();
        assert!(message.starts_with(expected), "{name}: {message}");
    }
}

#[test]
fn once_slow_saved_states_are_refused_at_their_caps() {
    let states = [
        (
            "sources-130.json",
            "its boxes cannot be read (form.sources: 130 arterial sources; at most 64 are accepted)",
        ),
        (
            "long-box.json",
            "its boxes cannot be read (form.haematocrit: 5000 characters; at most 1000 are accepted)",
        ),
        (
            "nesting-300.json",
            "it cannot be read (301 levels of nesting; at most 32 are accepted)",
        ),
    ];
    for (name, expected) in states {
        let reason = plumbline_web::saved::decode(&corpus(Decoder::SavedState, name)).unwrap_err();
        assert_eq!(reason, expected, "{name}");
    }
    // A target kept as written comes back and is refused by the check.
    let text = corpus(Decoder::SavedState, "two-bounds-target.json");
    assert_eq!(Decoder::SavedState.run(text.as_bytes()), Reached::Read);
}

//! One reader, one answer: every document of `tests/documents.rs` goes
//! through the command line (`plumbline check -`), the JavaScript face's
//! reader (`api::check_text`, what `check` runs once the browser has
//! written the object out as JSON) and the page's two ways of opening a
//! check (a share link, and the saved state it reopens from), and all of
//! them accept and refuse the same documents with the same messages and,
//! when they accept, the same report.

#![allow(
    clippy::unwrap_used,
    clippy::expect_used,
    clippy::indexing_slicing,
    clippy::panic
)]

#[path = "../../../tests/documents.rs"]
mod documents;
#[path = "../../../tests/same_report.rs"]
mod same_report;

use std::io::Write;
use std::path::PathBuf;
use std::process::{Command, Stdio};

use base64::engine::general_purpose::URL_SAFE_NO_PAD;
use base64::Engine as _;
use documents::DOCUMENTS;
use plumbline_core::case::Case;
use plumbline_web::api;
use plumbline_web::form::Form;
use plumbline_web::saved;
use plumbline_web::session::{Event, Part, Why};
use plumbline_web::state::{State, Theme};
use plumbline_web::storage::Stored;
use same_report::differ;
use serde_json::Value;

/// A face's answer: the report as JSON, or the problems as the command
/// line prints them (`field: message`).
#[derive(Debug)]
enum Answer {
    Report(Value),
    Refused(Vec<String>),
}

/// Whether two faces gave the same answer; the first difference if not.
fn same(a: &Answer, b: &Answer) -> Result<(), String> {
    match (a, b) {
        (Answer::Report(x), Answer::Report(y)) => differ(x, y, "report").map_or(Ok(()), Err),
        (Answer::Refused(x), Answer::Refused(y)) if x == y => Ok(()),
        _ => Err(format!(
            "{:.400}\nagainst\n{:.400}",
            format!("{a:?}"),
            format!("{b:?}")
        )),
    }
}

fn cli(text: &str) -> Answer {
    let mut child = Command::new(env!("CARGO_BIN_EXE_plumbline"))
        .args(["check", "-", "--json"])
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    child
        .stdin
        .take()
        .unwrap()
        .write_all(text.as_bytes())
        .unwrap();
    let out = child.wait_with_output().unwrap();
    if out.status.success() {
        return Answer::Report(serde_json::from_slice(&out.stdout).unwrap());
    }
    assert_eq!(out.status.code(), Some(2));
    let stderr = String::from_utf8(out.stderr).unwrap();
    let mut lines = stderr.lines();
    assert_eq!(
        lines.next(),
        Some("plumbline: standard input could not be checked:")
    );
    Answer::Refused(
        lines
            .map(|l| l.strip_prefix("  ").unwrap().to_owned())
            .collect(),
    )
}

fn javascript_face(text: &str) -> Answer {
    let answer = serde_json::to_value(api::check_text(text)).unwrap();
    if answer["ok"] == Value::Bool(true) {
        return Answer::Report(answer["report"].clone());
    }
    Answer::Refused(
        answer["errors"]
            .as_array()
            .unwrap()
            .iter()
            .map(|e| {
                let (field, message) =
                    (e["field"].as_str().unwrap(), e["message"].as_str().unwrap());
                if field.is_empty() {
                    message.to_owned()
                } else {
                    format!("{field}: {message}")
                }
            })
            .collect(),
    )
}

/// What the screen shows once it has opened a check: its report, or the
/// problems it lists.
fn on_screen(state: &State) -> Answer {
    match &state.checked {
        Some(checked) if state.errors.is_empty() => {
            Answer::Report(serde_json::to_value(&checked.report).unwrap())
        }
        _ => Answer::Refused(state.errors.iter().map(ToString::to_string).collect()),
    }
}

/// The page opening `text` from a link, as a hostile or damaged link
/// would carry it (deflated and encoded, whatever it holds). A link that
/// cannot be read is refused in a notice naming its first problems.
fn page_link(text: &str) -> Result<State, String> {
    let packed = miniz_oxide::deflate::compress_to_vec(text.as_bytes(), 9);
    let fragment = format!("#p1.{}", URL_SAFE_NO_PAD.encode(packed));
    let state = State::start(Stored::default(), Some(&fragment), &mut |_| {});
    if state.session.event == Some(Event::LinkOpened) {
        return Ok(state);
    }
    // Refused: the link is kept for download, with why.
    match state.session.rescued.last().map(|r| (r.part, &r.why)) {
        Some((Part::Link, Why::Unreadable(words))) => Err(words.clone()),
        other => panic!("{other:?}"),
    }
}

/// The page reopening the check it had saved on the device.
fn page_saved(case: &Case) -> State {
    let stored = Stored {
        state: Some(saved::encode(&Form::from_case(case), Theme::Device)),
        ..Stored::default()
    };
    let state = State::start(stored, None, &mut |_| {});
    assert_eq!(state.session.rescued, []);
    state
}

#[test]
fn every_face_accepts_and_refuses_the_same_documents_in_the_same_words() {
    let (mut accepted, mut refused) = (0, 0);
    for (name, text) in DOCUMENTS {
        let cli = cli(text);
        let agree = |face: &str, answer: Answer| {
            if let Err(difference) = same(&answer, &cli) {
                panic!("{name}, {face} against the command line: {difference}");
            }
        };
        agree("the JavaScript face", javascript_face(text));
        match (Case::from_json(text), page_link(text)) {
            (Ok(case), Ok(state)) => {
                agree("opened from a link", on_screen(&state));
                agree("the saved state", on_screen(&page_saved(&case)));
                // Nothing in the document is lost on the way into the boxes.
                let form = Form::from_case(&case);
                assert_eq!(
                    form.to_case().map(|c| c.to_json()),
                    Ok(case.to_json()),
                    "{name}"
                );
            }
            (Err(_), Err(words)) => {
                // The notice names the first problems, in the same words.
                let Answer::Refused(messages) = &cli else {
                    panic!("{name}: the command line accepted what the link refused");
                };
                for message in messages.iter().take(3) {
                    let shown: String = message.chars().take(160).collect();
                    assert!(words.contains(&shown), "{name}: {words}\nmissing: {shown}");
                }
            }
            (read, link) => panic!("{name}: the reader said {read:?}, the link {link:?}"),
        }
        match cli {
            Answer::Report(_) => accepted += 1,
            Answer::Refused(_) => refused += 1,
        }
    }
    assert!(
        accepted >= 9 && refused >= 12,
        "{accepted} accepted, {refused} refused"
    );
}

#[test]
fn a_target_with_two_bounds_is_refused_everywhere_in_the_cores_words() {
    let text = include_str!("../../../tests/fixtures/two-bounds-target.json");
    let expected = Answer::Refused(vec![
        "targets[0]: a target takes only one of at_least, at_most or at_least_percent_of_baseline; \
         write two targets instead"
            .to_owned(),
    ]);
    assert_eq!(same(&cli(text), &expected), Ok(()));
    assert_eq!(
        same(&on_screen(&page_link(text).unwrap()), &expected),
        Ok(())
    );
}

#[test]
fn every_example_and_fixture_is_in_the_list() {
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..");
    for (folder, prefix) in [("examples", "examples/"), ("tests/fixtures", "fixtures/")] {
        for entry in std::fs::read_dir(root.join(folder)).unwrap() {
            let name = entry.unwrap().file_name().into_string().unwrap();
            if name.ends_with(".json") {
                let listed = format!("{prefix}{name}");
                assert!(
                    DOCUMENTS.iter().any(|(n, _)| *n == listed),
                    "{listed} is not in tests/documents.rs"
                );
            }
        }
    }
}

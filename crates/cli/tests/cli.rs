//! Runs the `plumbline` binary on good and bad case files and checks its
//! output, exit status and messages.

#![allow(clippy::unwrap_used, clippy::expect_used, clippy::indexing_slicing)]

use std::io::Write;
use std::path::PathBuf;
use std::process::{Command, Output, Stdio};

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..")
}

fn plumbline(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_plumbline"))
        .args(args)
        .current_dir(root())
        .output()
        .expect("the binary runs")
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

/// A bad file exits 2, prints nothing on stdout, and names `field` on stderr.
fn rejects(file: &str, field: &str) {
    let out = plumbline(&["check", file]);
    assert_eq!(out.status.code(), Some(2), "{file}: {}", text(&out.stderr));
    assert!(out.stdout.is_empty(), "{file}");
    let err = text(&out.stderr);
    assert!(err.contains(field), "{file}: expected '{field}' in\n{err}");
}

#[test]
fn demo_prints_the_table_with_the_caution() {
    let out = plumbline(&["demo"]);
    assert!(out.status.success());
    let stdout = text(&out.stdout);
    for expected in [
        "Brain",
        "CPP",
        "Whole body",
        "Heights above the heart",
        "clinical judgement",
    ] {
        assert!(stdout.contains(expected), "missing '{expected}'");
    }
    assert!(
        stdout.contains("ASSUMED ICP"),
        "the demo's assumed ICP is flagged"
    );
}

#[test]
fn demo_json_is_the_same_as_checking_the_example_file() {
    let demo = plumbline(&["demo", "--json"]);
    let file = plumbline(&["check", "examples/beach-chair.json", "--json"]);
    assert!(demo.status.success() && file.status.success());
    let demo: serde_json::Value = serde_json::from_slice(&demo.stdout).unwrap();
    let file: serde_json::Value = serde_json::from_slice(&file.stdout).unwrap();
    assert_eq!(demo, file);
    assert_eq!(demo["format"], "plumbline-result");
    assert!(demo["organs"].as_array().is_some_and(|o| !o.is_empty()));
}

#[test]
fn check_reads_standard_input() {
    let case = std::fs::read_to_string(root().join("examples/beach-chair.json")).unwrap();
    let mut child = Command::new(env!("CARGO_BIN_EXE_plumbline"))
        .args(["check", "-", "--json"])
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .spawn()
        .unwrap();
    child
        .stdin
        .take()
        .unwrap()
        .write_all(case.as_bytes())
        .unwrap();
    let out = child.wait_with_output().unwrap();
    assert!(out.status.success());
    let report: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(report["format"], "plumbline-result");
}

#[test]
fn a_completed_check_exits_0_even_when_a_target_is_missed() {
    let out = plumbline(&["check", "examples/beach-chair.json"]);
    assert!(out.status.success());
    assert!(text(&out.stdout).contains("BELOW target"));
}

#[test]
fn malformed_files_exit_2_and_name_the_field() {
    rejects("tests/fixtures/bad-unit.json", "arterial[0].systolic");
    rejects("tests/fixtures/bad-unit.json", "has no unit");
    rejects("tests/fixtures/bad-syntax.json", "line");
    rejects(
        "tests/fixtures/newer-version.json",
        "version 7 is not supported",
    );
    rejects("tests/fixtures/inconsistent.json", "arterial[0].mean");
    rejects("tests/fixtures/inconsistent.json", "readings.icp.value");
    rejects("tests/fixtures/unknown-landmark.json", "heights.elbow");
    rejects("tests/fixtures/no-height.json", "arterial[0].level");
}

#[test]
fn a_missing_file_exits_2() {
    rejects("tests/fixtures/there-is-no-such-file.json", "cannot read");
}

#[test]
fn every_command_has_help() {
    for args in [&["--help"][..], &["check", "--help"], &["demo", "--help"]] {
        let out = plumbline(args);
        assert!(out.status.success(), "{args:?}");
        assert!(text(&out.stdout).contains("Usage"), "{args:?}");
    }
}

#[test]
fn usage_errors_do_not_pass_as_checks() {
    let out = plumbline(&["check"]);
    assert!(!out.status.success());
}

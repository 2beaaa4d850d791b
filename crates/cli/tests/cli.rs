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
    for args in [
        &["--help"][..],
        &["check", "--help"],
        &["demo", "--help"],
        &["record", "--help"],
    ] {
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

#[test]
fn record_prints_exposure_and_json_and_series() {
    let args = [
        "record",
        "examples/beach-chair-record.csv",
        "--case",
        "examples/beach-chair.json",
    ];
    let table = plumbline(&args);
    assert!(table.status.success(), "{}", text(&table.stderr));
    let stdout = text(&table.stdout);
    assert!(stdout.contains("CPP below 60 mmHg"), "{stdout}");
    assert!(stdout.contains("ASSUMED ICP"));

    let json = plumbline(&[&args[..], &["--json"]].concat());
    let exposure: serde_json::Value = serde_json::from_slice(&json.stdout).unwrap();
    let targets = exposure["targets"].as_array().unwrap();
    assert!(!targets.is_empty());
    for t in targets {
        assert!(t["outside_min"].as_f64().unwrap() <= t["observed_min"].as_f64().unwrap());
    }

    let series = plumbline(&[&args[..], &["--series"]].concat());
    let csv = text(&series.stdout);
    assert!(csv.starts_with("elapsed_s,brain.perfusion [mmHg]"), "{csv}");
    assert!(csv.lines().count() > 1000);
}

#[test]
fn record_rules_come_from_the_command_line() {
    let base = [
        "record",
        "examples/beach-chair-record.csv",
        "--case",
        "examples/beach-chair.json",
        "--json",
    ];
    let all = plumbline(&base);
    let strict = plumbline(&[&base[..], &["--min-episode-s", "600"]].concat());
    let all: serde_json::Value = serde_json::from_slice(&all.stdout).unwrap();
    let strict: serde_json::Value = serde_json::from_slice(&strict.stdout).unwrap();
    let outside = |v: &serde_json::Value| {
        v["targets"]
            .as_array()
            .unwrap()
            .iter()
            .map(|t| t["outside_min"].as_f64().unwrap())
            .sum::<f64>()
    };
    assert!(outside(&strict) < outside(&all));
    assert!(strict["rules"]
        .as_str()
        .unwrap()
        .contains("shorter than 10 min ignored"));
}

#[test]
fn a_bad_record_exits_2_with_every_line_and_column() {
    let out = plumbline(&[
        "record",
        "tests/fixtures/bad-record.csv",
        "--case",
        "examples/beach-chair.json",
    ]);
    assert_eq!(out.status.code(), Some(2));
    let err = text(&out.stderr);
    for where_ in ["line 1, column 3", "line 3, column 2", "line 4, column 2"] {
        assert!(err.contains(where_), "missing {where_} in\n{err}");
    }
}

#[test]
fn record_can_write_the_case_with_its_record() {
    let dir = std::env::temp_dir().join(format!("plumbline-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let out_case = dir.join("with-record.json");
    let out = plumbline(&[
        "record",
        "examples/beach-chair-record.csv",
        "--case",
        "examples/beach-chair.json",
        "--write-case",
        out_case.to_str().unwrap(),
    ]);
    assert!(out.status.success());
    let again = plumbline(&["check", out_case.to_str().unwrap(), "--json"]);
    assert!(again.status.success(), "{}", text(&again.stderr));
    let written: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&out_case).unwrap()).unwrap();
    assert_eq!(written["timeline"]["channels"].as_array().unwrap().len(), 3);
    std::fs::remove_dir_all(&dir).ok();
}

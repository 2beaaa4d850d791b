//! Shared helpers: build a case document, run it through the whole pipeline
//! (`check::check_json`), find fields in the report, and one `check` helper
//! so tables of expected values read as tables.
//!
//! The hydrostatic helper here is the tests' own, written from the constants
//! in REFERENCES.md §1, not taken from the core: expected values built with
//! it are independent of the code under test.

use plumbline_core::check::check_json;
use plumbline_core::error::Errors;
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::report::{HeightRow, MetricReport, Report, TargetReport};
use serde_json::{json, Value};

/// Standard gravity, m/s² (3rd CGPM 1901; ISO 80000-3) (V2).
pub const G: f64 = 9.80665;
/// Pascals per conventional mmHg (NIST SP 811, App. B.8) (V2).
pub const PA_PER_MMHG: f64 = 133.322_387_415;
/// The core's default whole-blood density: specific gravity 1.0506
/// (Trudnowski and Rico 1974) (V), as kg/m³.
pub const BLOOD: f64 = 1050.6;

/// The pressure, mmHg, of a column `height_cm` tall of a fluid of density
/// `rho` kg/m³: rho · g · h / 133.322387415.
pub fn column(rho: f64, height_cm: f64) -> f64 {
    rho * G * height_cm / 100.0 / PA_PER_MMHG
}

/// One row of a table of checks: `what` names the check and its source.
#[track_caller]
pub fn check(what: &str, actual: f64, expected: f64, tolerance: f64) {
    assert!(
        actual.is_finite() && (actual - expected).abs() <= tolerance,
        "{what}: got {actual}, expected {expected} ± {tolerance}"
    );
}

/// A row that must fall inside a published range, ends included.
#[track_caller]
pub fn check_within(what: &str, actual: f64, low: f64, high: f64) {
    assert!(
        actual.is_finite() && (low..=high).contains(&actual),
        "{what}: got {actual}, expected within {low} to {high}"
    );
}

/// A case document: the header plus the fields of `body`.
pub fn case(body: Value) -> String {
    let mut doc = json!({ "format": "plumbline-case", "version": 1 });
    if let (Some(doc), Value::Object(fields)) = (doc.as_object_mut(), body) {
        doc.extend(fields);
    }
    doc.to_string()
}

/// Runs a case through `check_json`; a refused case fails the test with
/// every error the core gave.
#[track_caller]
pub fn run(body: Value) -> Report {
    let text = case(body);
    match check_json(&text) {
        Ok(report) => report,
        Err(errors) => panic!("case refused:\n{errors}\n{text}"),
    }
}

/// Runs a case that must be refused, and returns its errors.
#[track_caller]
pub fn refuse(body: Value) -> Errors {
    let text = case(body);
    match check_json(&text) {
        Ok(_) => panic!("case accepted, expected an error:\n{text}"),
        Err(errors) => errors,
    }
}

/// The metric of an organ, if it was computed.
pub fn try_metric(report: &Report, organ: Organ, metric: Metric) -> Option<&MetricReport> {
    report
        .organs
        .iter()
        .find(|o| o.organ == organ)
        .and_then(|o| o.metrics.iter().find(|m| m.metric == metric))
}

/// The metric of an organ; the test fails if it was not computed.
#[track_caller]
pub fn metric(report: &Report, organ: Organ, metric: Metric) -> &MetricReport {
    match try_metric(report, organ, metric) {
        Some(m) => m,
        None => panic!("{organ} {metric} was not computed: {report:#?}"),
    }
}

/// A metric's value, mmHg.
#[track_caller]
pub fn value(report: &Report, organ: Organ, which: Metric) -> f64 {
    metric(report, organ, which).value_mmhg
}

/// A landmark's row in the heights table.
#[track_caller]
pub fn height(report: &Report, landmark: Landmark) -> &HeightRow {
    match report.heights.iter().find(|h| h.landmark == landmark) {
        Some(h) => h,
        None => panic!("no height for {landmark}"),
    }
}

/// A landmark's height above the heart, cm.
#[track_caller]
pub fn above_heart(report: &Report, landmark: Landmark) -> f64 {
    height(report, landmark).above_heart_cm
}

/// The target of a metric whose description contains `words`.
#[track_caller]
pub fn target<'a>(m: &'a MetricReport, words: &str) -> &'a TargetReport {
    match m.targets.iter().find(|t| t.target.contains(words)) {
        Some(t) => t,
        None => panic!("no target '{words}' on {}: {:#?}", m.label, m.targets),
    }
}

/// An arterial source with the given mean and its level.
pub fn line(id: &str, level: Value, mean: &str) -> Value {
    json!({ "id": id, "method": "transducer", "level": level, "mean": mean })
}

/// A reading of the given method and level.
pub fn reading(value: &str, method: &str, level: Value) -> Value {
    json!({ "value": value, "method": method, "level": level })
}

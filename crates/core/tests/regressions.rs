//! Regression tests for the core bugs the reference suites found, named
//! after what went wrong.

use plumbline_core::organ::{Metric, Organ};
use plumbline_core::target::Status;
use serde_json::json;

use crate::util::{line, metric, reading, run, target};

/// A perfusion pressure exactly on its floor was judged below it: 82 − 22
/// mmHg through pascals is 59.99999999999999, "BELOW target by 0 mmHg".
#[test]
fn a_pressure_exactly_on_its_floor_meets_it() {
    let report = run(json!({
        "heights": { "tragus": "0 cm" },
        "arterial": [line("line", json!("tragus"), "82 mmHg")],
        "readings": { "icp": reading("22 mmHg", "probe", json!("tragus")) },
    }));
    let cpp = metric(&report, Organ::Brain, Metric::Perfusion);
    let t = target(cpp, "at least 60");
    assert_eq!(t.status, Status::Met, "{}", t.words);
    assert!(!t.words.contains("BELOW"), "{}", t.words);
}

/// The reading asked for was rounded up by conversion noise: aortic
/// relaxation 20, right atrium 2, floor 15 needs exactly 17, shown as "at
/// least 18".
#[test]
fn a_required_reading_is_not_rounded_up_by_conversion_noise() {
    let report = run(json!({
        "readings": {
            "cpr_aortic_relaxation": reading("20 mmHg", "transducer", json!("heart")),
            "cpr_right_atrial_relaxation": reading("2 mmHg", "transducer", json!("heart")),
        },
    }));
    let m = metric(&report, Organ::HeartCpr, Metric::Perfusion);
    let required = &target(m, "at least 15").defend[0];
    assert!(
        required.words.ends_with("at least 17 mmHg"),
        "{}",
        required.words
    );
}

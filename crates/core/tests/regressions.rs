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

/// A head-up angle measured with a level (issue 10) narrows every range
/// the backrest drives, and the contributor says it was measured; a judged
/// angle keeps its wider range.
#[test]
fn a_measured_backrest_narrows_the_range_it_drives() {
    let case = |measured: bool| {
        run(json!({
            "patient": { "height": "176 cm" },
            "position": { "posture": "head_up", "backrest_deg": 40, "backrest_measured": measured },
            "arterial": [line("line", json!("heart"), "80 mmHg")],
            "readings": { "icp": reading("12 mmHg", "probe", json!("tragus")) },
        }))
    };
    let width = |report: &plumbline_core::report::Report| {
        let cpp = metric(report, Organ::Brain, Metric::Perfusion);
        let backrest = cpp
            .contributions
            .iter()
            .find(|c| c.input.starts_with("backrest angle"))
            .map(|c| (c.up_mmhg - c.down_mmhg, c.input.clone()));
        (cpp.value_mmhg, backrest)
    };
    let (judged_value, judged) = width(&case(false));
    let (measured_value, measured) = width(&case(true));
    let (judged, measured) = (judged.unwrap(), measured.unwrap());
    assert_eq!(
        judged_value, measured_value,
        "the value itself does not move"
    );
    assert!(measured.0 < judged.0 / 2.0, "{measured:?} vs {judged:?}");
    assert!(
        measured.1.contains("measured with a level"),
        "{}",
        measured.1
    );
}

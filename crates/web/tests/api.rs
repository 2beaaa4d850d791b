//! The JavaScript face in headless Chromium (`wasm-bindgen-test`): `check`
//! and `shareFragment` called with plain objects, as another page calls
//! them, against the core's own `check::check_case` and `share::decode`,
//! and the shared documents of `tests/documents.rs` answered as the file
//! reader answers them (the command line's `one_answer` test holds the
//! file reader to the command line and the page).

#![cfg(target_arch = "wasm32")]
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::indexing_slicing)]

use plumbline_core::case::Case;
use plumbline_core::demo::CASE_JSON;
use plumbline_core::{check, share};
use plumbline_web::api::{check_js, check_text, share_fragment_js};
use serde_json::Value;
use wasm_bindgen::JsValue;
use wasm_bindgen_test::{wasm_bindgen_test, wasm_bindgen_test_configure};

wasm_bindgen_test_configure!(run_in_browser);

#[path = "../../../tests/documents.rs"]
mod documents;
#[path = "../../../tests/same_report.rs"]
mod same_report;

use same_report::differ;

/// A plain JavaScript object, as another page would build it.
fn object(json: &str) -> JsValue {
    js_sys::JSON::parse(json).unwrap()
}

/// What JavaScript would see, as JSON.
fn seen(value: &JsValue) -> Value {
    let text: String = js_sys::JSON::stringify(value).unwrap().into();
    serde_json::from_str(&text).unwrap()
}

#[wasm_bindgen_test]
fn check_gives_the_cores_report_for_a_case_object() {
    let answer = seen(&check_js(object(CASE_JSON)));
    assert_eq!(answer["ok"], Value::Bool(true));
    assert_eq!(answer["errors"], Value::Array(vec![]));
    let case = Case::from_json(CASE_JSON).unwrap();
    let expected = serde_json::to_value(check::check_case(&case).unwrap()).unwrap();
    assert_eq!(differ(&answer["report"], &expected, "report"), None);
    assert!(answer["report"]["organs"]
        .as_array()
        .is_some_and(|o| !o.is_empty()));
}

#[wasm_bindgen_test]
fn every_problem_comes_back_with_its_field() {
    let text = r#"{"format": "plumbline-case", "version": 1,
        "arterial": [{"id": "a", "method": "cuff", "level": "heart", "systolic": "120"}]}"#;
    let answer = seen(&check_js(object(text)));
    assert_eq!(answer["ok"], Value::Bool(false));
    assert!(answer.get("report").is_none());
    let core = Case::from_json(text).unwrap_err();
    let first = core.iter().next().unwrap();
    assert_eq!(answer["errors"][0]["field"], Value::from(first.field()));
    assert_eq!(answer["errors"][0]["message"], Value::from(first.message()));

    // A case the core's scene refuses (diastolic above systolic) names it too.
    let text = r#"{"format": "plumbline-case", "version": 1,
        "arterial": [{"id": "line", "method": "transducer", "level": "heart",
                      "systolic": "80 mmHg", "diastolic": "120 mmHg"}]}"#;
    let answer = seen(&check_js(object(text)));
    let core = check::check_json(text).unwrap_err();
    let fields: Vec<&str> = core.iter().map(|e| e.field()).collect();
    let got: Vec<&str> = answer["errors"]
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|e| e["field"].as_str())
        .collect();
    assert_eq!(got, fields);
}

#[wasm_bindgen_test]
fn what_is_not_a_case_object_is_refused_in_words() {
    for value in [
        JsValue::from_str("a case"),
        JsValue::NULL,
        JsValue::UNDEFINED,
        object("[1, 2]"),
        object(r#"{"format": "plumbline-case", "version": 7}"#),
    ] {
        let answer = seen(&check_js(value));
        assert_eq!(answer["ok"], Value::Bool(false));
        let message = answer["errors"][0]["message"].as_str().unwrap();
        assert!(!message.is_empty());
    }
}

#[wasm_bindgen_test]
fn every_shared_document_gets_the_file_readers_answer() {
    let mut objects = 0;
    for (name, text) in documents::DOCUMENTS {
        // A document that is not JSON cannot be an object to pass.
        let Ok(value) = js_sys::JSON::parse(text) else {
            continue;
        };
        objects += 1;
        let got = seen(&check_js(value));
        let expected = serde_json::to_value(check_text(text)).unwrap();
        assert_eq!(got["ok"], expected["ok"], "{name}");
        assert_eq!(got["errors"], expected["errors"], "{name}");
        let report = (got.get("report"), expected.get("report"));
        if let (Some(got), Some(expected)) = report {
            assert_eq!(differ(got, expected, name), None);
        } else {
            assert!(report.0.is_none() && report.1.is_none(), "{name}");
        }
    }
    assert!(objects >= 20, "{objects}");
}

#[wasm_bindgen_test]
fn a_cyclic_or_bottomless_object_is_refused_in_words() {
    let cyclic = object(r#"{"format": "plumbline-case", "version": 1}"#);
    js_sys::Reflect::set(&cyclic, &JsValue::from_str("patient"), &cyclic).unwrap();
    let answer = seen(&check_js(cyclic));
    assert_eq!(answer["ok"], Value::Bool(false));
    let message = answer["errors"][0]["message"].as_str().unwrap();
    assert!(message.contains("cannot be written as JSON"), "{message}");

    let deep = format!(
        r#"{{"format": "plumbline-case", "version": 1, "patient": {}{}}}"#,
        "[".repeat(5000),
        "]".repeat(5000)
    );
    let answer = seen(&check_js(object(&deep)));
    assert_eq!(
        answer["errors"][0]["message"],
        Value::from("5001 levels of nesting; at most 32 are accepted")
    );
}

#[wasm_bindgen_test]
fn share_fragment_carries_the_case() {
    let answer = seen(&share_fragment_js(object(CASE_JSON)));
    assert_eq!(answer["ok"], Value::Bool(true));
    let fragment = answer["fragment"].as_str().unwrap();
    assert!(fragment.starts_with(share::PREFIX));
    assert_eq!(
        share::decode(fragment).unwrap(),
        Case::from_json(CASE_JSON).unwrap()
    );
    let refused = seen(&share_fragment_js(object("{}")));
    assert_eq!(refused["ok"], Value::Bool(false));
}

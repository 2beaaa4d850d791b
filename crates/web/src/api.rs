//! The module's face for other pages: the core's check and share link,
//! callable from JavaScript with plain objects.
//!
//! ```js
//! import init, { check, shareFragment } from './plumbline.js';
//! await init();
//! const out = check({ format: 'plumbline-case', version: 1, ... });
//! if (out.ok) use(out.report); else show(out.errors); // [{ field, message }]
//! ```
//!
//! The object is written out as JSON text by the browser (`JSON.stringify`,
//! which refuses a cyclic object in words rather than recursing without
//! end) and read by the core's own reader for case files
//! (`Case::from_json`): the same caps, the same path for every problem, the
//! same messages as the command line and the screen. The answer is built
//! with serde-wasm-bindgen as plain objects (maps as objects, as JSON would
//! give them). Nothing is thrown: the answer says `ok` or lists the
//! problems.

use plumbline_core::case::Case;
use plumbline_core::check;
use plumbline_core::error::{Error, ErrorKind, Errors};
use plumbline_core::report::Report;
use plumbline_core::share;
use serde::Serialize;
use wasm_bindgen::prelude::wasm_bindgen;
use wasm_bindgen::JsValue;

/// One problem, as JavaScript receives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Problem {
    /// The field's path in the case (`arterial[0].mean`); empty for the
    /// case as a whole.
    pub field: String,
    /// What is wrong, in words.
    pub message: String,
}

/// An answer: `{ok: true, report}` / `{ok: true, fragment}`, or
/// `{ok: false, errors: [...]}`.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Answer<T> {
    /// Whether it worked.
    pub ok: bool,
    /// The report, for `check`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub report: Option<T>,
    /// The fragment, for `shareFragment`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub fragment: Option<String>,
    /// Every problem, in the order of the case.
    pub errors: Vec<Problem>,
}

fn problems(errors: &Errors) -> Vec<Problem> {
    errors
        .iter()
        .map(|e| Problem {
            field: e.field().to_owned(),
            message: e.kind().to_string(),
        })
        .collect()
}

fn refused<T>(errors: &Errors) -> Answer<T> {
    Answer {
        ok: false,
        report: None,
        fragment: None,
        errors: problems(errors),
    }
}

/// The case in a JavaScript value, written out as JSON text and read as a
/// case file is.
fn case_of(value: &JsValue) -> Result<Case, Errors> {
    let text = js_sys::JSON::stringify(value)
        .ok()
        .and_then(|text| text.as_string())
        .ok_or_else(|| {
            Errors::from(Error::new(
                "",
                ErrorKind::Shape {
                    message: "not a plain object of a case: it cannot be written as JSON \
                              (a cycle, a BigInt, or nothing at all)"
                        .to_owned(),
                },
            ))
        })?;
    Case::from_json(&text)
}

/// The check of a case given as JSON text, as `check` reads a JavaScript
/// object once the browser has written it out: the report, or every problem.
pub fn check_text(text: &str) -> Answer<Report> {
    answer(Case::from_json(text))
}

fn answer(case: Result<Case, Errors>) -> Answer<Report> {
    match case.and_then(|case| check::check_case(&case)) {
        Ok(report) => Answer {
            ok: true,
            report: Some(report),
            fragment: None,
            errors: Vec::new(),
        },
        Err(errors) => refused(&errors),
    }
}

fn to_js<T: Serialize>(answer: &T) -> JsValue {
    answer
        .serialize(&serde_wasm_bindgen::Serializer::json_compatible())
        .unwrap_or(JsValue::NULL)
}

/// `check(case)`: the core's check of a case object.
#[wasm_bindgen(js_name = check)]
pub fn check_js(case: JsValue) -> JsValue {
    to_js(&answer(case_of(&case)))
}

/// `shareFragment(case)`: the link fragment (`p1....`, without `#`) that
/// opens the case on another device.
#[wasm_bindgen(js_name = shareFragment)]
pub fn share_fragment_js(case: JsValue) -> JsValue {
    let answer: Answer<()> = match case_of(&case) {
        Ok(case) => Answer {
            ok: true,
            report: None,
            fragment: Some(share::encode(&case)),
            errors: Vec::new(),
        },
        Err(errors) => refused(&errors),
    };
    to_js(&answer)
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use plumbline_core::demo::CASE_JSON;

    #[test]
    fn a_good_case_gives_the_cores_report() {
        let answer = check_text(CASE_JSON);
        assert!(answer.ok);
        assert_eq!(answer.report, Some(check::check_json(CASE_JSON).unwrap()));
    }

    #[test]
    fn a_bad_case_lists_its_problems_by_field() {
        let value = serde_json::json!({
            "format": "plumbline-case", "version": 1,
            "arterial": [{"id": "a", "method": "cuff", "level": "heart", "systolic": "120"}]
        });
        let answer = check_text(&value.to_string());
        assert!(!answer.ok);
        assert_eq!(answer.report, None);
        let first = answer.errors.first().unwrap();
        assert_eq!(first.field, "arterial[0].systolic");
        assert!(first.message.contains("unit"), "{}", first.message);
    }
}

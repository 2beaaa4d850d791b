//! Where two reports, as JSON, first differ: numbers compared as numbers
//! (JavaScript writes `0` where serde writes `0.0`) and to within the last
//! bits serde_json's fast float reading may miss when it reads a report
//! printed as text. Included by `crates/cli/tests/one_answer.rs` and
//! `crates/web/tests/api.rs`, which hold different faces to one answer.

use serde_json::Value;

/// Whether two numbers are the same f64 but for the last bits.
fn close(x: Option<f64>, y: Option<f64>) -> bool {
    matches!((x, y), (Some(x), Some(y)) if (x - y).abs() <= 4.0 * f64::EPSILON * x.abs().max(1.0))
}

/// Where `a` and `b` first differ, by path from `at`; `None` when equal.
pub fn differ(a: &Value, b: &Value, at: &str) -> Option<String> {
    match (a, b) {
        (Value::Number(x), Value::Number(y)) if close(x.as_f64(), y.as_f64()) => None,
        (Value::Array(x), Value::Array(y)) if x.len() == y.len() => x
            .iter()
            .zip(y)
            .enumerate()
            .find_map(|(i, (x, y))| differ(x, y, &format!("{at}[{i}]"))),
        (Value::Object(x), Value::Object(y)) if x.len() == y.len() => {
            x.iter().find_map(|(k, v)| {
                y.get(k).map_or_else(
                    || Some(format!("{at}.{k} missing")),
                    |w| differ(v, w, &format!("{at}.{k}")),
                )
            })
        }
        _ if a == b => None,
        _ => Some(format!("{at}: {a} against {b}")),
    }
}

//! Robustness: `Case::from_json`, `Case::from_value` and `check::check_json`
//! never panic, whatever they are given, and every error they return says
//! something. When a case is accepted, every number in its report is finite.
//!
//! Inputs: arbitrary text, token soup that looks like JSON, arbitrary JSON
//! values (bare and behind a valid header), and the example cases mutated
//! (numbers made huge, tiny or negative, strings with markup, control and
//! right-to-left characters, unit-like nonsense, deep nesting, deleted and
//! unknown fields), both as a fixed corpus and at random.

use plumbline_core::case::{Case, MAX_BYTES};
use plumbline_core::check::{check_case, check_json};
use plumbline_core::error::{ErrorKind, Errors};
use plumbline_core::report::Report;
use proptest::prelude::*;
use serde_json::{json, Map, Value};

use crate::examples::{text, NAMES};

fn config(cases: u32) -> ProptestConfig {
    ProptestConfig {
        cases,
        max_shrink_iters: 500,
        ..ProptestConfig::default()
    }
}

/// Every error names what is wrong in words.
fn well_formed(errors: &Errors) -> Result<(), String> {
    if errors.is_empty() {
        return Err("an error result with no error in it".into());
    }
    if errors.to_string().trim().is_empty() {
        return Err("the errors print as nothing".into());
    }
    for e in errors.iter() {
        if e.kind().to_string().trim().is_empty() || e.to_string().trim().is_empty() {
            return Err(format!(
                "an empty message on field '{}': {:?}",
                e.field(),
                e.kind()
            ));
        }
    }
    Ok(())
}

/// Every number a report carries is finite, and it serializes.
fn finite(report: &Report) -> Result<(), String> {
    let mut numbers: Vec<(String, f64)> = Vec::new();
    for h in &report.heights {
        numbers.push((format!("height {}", h.landmark), h.above_heart_cm));
        numbers.push((format!("uncertainty {}", h.landmark), h.uncertainty_cm));
    }
    for a in &report.arterial {
        let values = [
            a.systolic_mmhg,
            a.diastolic_mmhg,
            a.mean_mmhg,
            a.mean_at_heart_mmhg,
            a.level_height_cm,
        ];
        numbers.extend(
            values
                .into_iter()
                .flatten()
                .map(|v| (format!("source {}", a.id), v)),
        );
        numbers.push((format!("accuracy {}", a.id), a.accuracy_mmhg));
    }
    for o in &report.organs {
        numbers.push((format!("{} level", o.organ), o.level_height_cm));
        for m in &o.metrics {
            let name = format!("{} {}", o.organ, m.metric);
            numbers.extend([m.value_mmhg, m.lower_mmhg, m.upper_mmhg].map(|v| (name.clone(), v)));
            numbers.extend(
                m.steps
                    .iter()
                    .map(|s| (format!("{name} step"), s.value_mmhg)),
            );
            for t in &m.targets {
                numbers.extend(
                    [t.threshold_mmhg, t.margin_mmhg]
                        .into_iter()
                        .flatten()
                        .map(|v| (format!("{name} target"), v)),
                );
                numbers.extend(
                    t.defend
                        .iter()
                        .map(|r| (format!("{name} required"), r.needed_mmhg)),
                );
            }
        }
    }
    for c in &report.cross_checks {
        numbers
            .extend([c.difference_mmhg, c.tolerance_mmhg].map(|v| ("cross-check".to_owned(), v)));
    }
    for s in &report.sweeps {
        numbers.extend(s.points.iter().map(|p| ("sweep".to_owned(), p.needed_mmhg)));
    }
    if let Some((what, v)) = numbers.into_iter().find(|(_, v)| !v.is_finite()) {
        return Err(format!("{what} is {v}"));
    }
    serde_json::to_string(report)
        .map(|_| ())
        .map_err(|e| e.to_string())
}

/// Runs the text every way in and checks the outcome is well formed.
fn survives(text: &str) -> Result<(), String> {
    let direct = check_json(text);
    let stepwise = Case::from_json(text).and_then(|case| check_case(&case));
    match (&direct, &stepwise) {
        (Ok(a), Ok(b)) if a == b => finite(a),
        (Err(a), Err(b)) if a == b => well_formed(a),
        _ => Err("check_json and from_json + check_case disagree".into()),
    }
    .map_err(|e| {
        format!(
            "{e}\ninput: {}",
            text.chars().take(2000).collect::<String>()
        )
    })
}

fn survives_value(value: Value) -> Result<(), String> {
    let text = value.to_string();
    survives(&text)?;
    if let Err(errors) = Case::from_value(value) {
        well_formed(&errors)?;
    }
    Ok(())
}

fn fail(message: String) -> TestCaseError {
    TestCaseError::fail(message)
}

// ---------------------------------------------------------------------------
// Building blocks
// ---------------------------------------------------------------------------

/// Strings chosen to hurt: markup, control and direction characters, unit
/// lookalikes, numbers that do not fit, the empty string.
const NASTY: [&str; 32] = [
    "",
    " ",
    "<script>alert(1)</script>",
    "<b>80</b> mmHg",
    "80 mmHg<img src=x onerror=alert(1)>",
    "\u{0}",
    "80\u{0} mmHg",
    "\u{202e}gHmm 08",
    "80 mmHg\u{200b}",
    "\u{feff}80 mmHg",
    "NaN mmHg",
    "inf cm",
    "-inf mmHg",
    "1e999 mmHg",
    "1e-999 cm",
    "999999999999999999999999999999 mmHg",
    "-0 cm",
    "0x50 mmHg",
    "８０ mmHg",
    "80 mmhg mmHg",
    "80 psi",
    "80",
    "mmHg",
    "- mmHg",
    "+ cm",
    "., mmHg",
    "1,2,3 cm",
    "1.2.3 cm",
    "12 cm cm",
    "tragus; DROP TABLE cases;--",
    "%s%n%x",
    "💉🩸",
];

/// Numbers chosen to hurt.
fn nasty_number() -> impl Strategy<Value = Value> {
    prop_oneof![
        Just(json!(1e308)),
        Just(json!(-1e308)),
        Just(json!(5e-324)),
        Just(json!(-0.0)),
        Just(json!(0)),
        Just(json!(-1)),
        Just(json!(1e15)),
        Just(json!(u64::MAX)),
        Just(json!(i64::MIN)),
        Just(json!(0.5)),
        Just(json!(90.000_000_001)),
        any::<f64>().prop_filter_map("finite", |v| serde_json::Number::from_f64(v)
            .map(Value::Number)),
        any::<i64>().prop_map(Value::from),
    ]
}

fn nasty_string() -> impl Strategy<Value = String> {
    prop_oneof![
        3 => prop::sample::select(NASTY.to_vec()).prop_map(str::to_owned),
        2 => (any::<f64>(), prop::sample::select(vec!["mmHg", "cmH2O", "kPa", "cm", "in", "kg/m3", "g/mL", "torr", "°", ""]))
            .prop_map(|(v, u)| format!("{v} {u}")),
        1 => any::<String>(),
        1 => "[a-z_]{0,20}",
        1 => Just("x".repeat(20_000)),
    ]
}

/// Field names a case uses, at any level, so random objects reach deep into
/// the reader.
const KEYS: &[&str] = &[
    "format",
    "version",
    "patient",
    "height",
    "haematocrit_percent",
    "position",
    "posture",
    "backrest_deg",
    "tilt_deg",
    "neck_flexion_deg",
    "hip_flexion_deg",
    "knee_flexion_deg",
    "left_arm",
    "right_arm",
    "angles",
    "shoulder_flexion_deg",
    "elbow_flexion_deg",
    "segments",
    "heights",
    "uncertainty",
    "densities",
    "blood",
    "csf",
    "mean_rule",
    "arterial",
    "id",
    "method",
    "level",
    "systolic",
    "diastolic",
    "mean",
    "accuracy",
    "primary_arterial",
    "readings",
    "assume",
    "value",
    "organ_levels",
    "targets",
    "baseline",
    "tragus",
    "timeline",
    "channels",
    "channel",
    "unit",
    "t_s",
    "values",
    "positions",
    "at_s",
    "rules",
];

/// Names a case uses as values.
const NAMES_AS_VALUES: [&str; 16] = [
    "plumbline-case",
    "beach_chair",
    "supine",
    "lateral_left",
    "prone",
    "cuff",
    "transducer",
    "drain_scale",
    "tragus",
    "heart",
    "upper_arm_left",
    "eye_left",
    "calf_left",
    "icp",
    "brain",
    "form_factor_0412",
];

fn key() -> impl Strategy<Value = String> {
    prop_oneof![
        4 => prop::sample::select(KEYS).prop_map(str::to_owned),
        1 => "[a-z_]{1,12}",
        1 => nasty_string(),
    ]
}

fn leaf() -> impl Strategy<Value = Value> {
    prop_oneof![
        Just(Value::Null),
        any::<bool>().prop_map(Value::Bool),
        nasty_number(),
        nasty_string().prop_map(Value::String),
        prop::sample::select(NAMES_AS_VALUES.to_vec()).prop_map(|s| json!(s)),
        Just(json!("80 mmHg")),
        Just(json!("20 cm")),
    ]
}

fn any_json() -> impl Strategy<Value = Value> {
    leaf().prop_recursive(5, 96, 8, |inner| {
        prop_oneof![
            prop::collection::vec(inner.clone(), 0..6).prop_map(Value::Array),
            prop::collection::vec((key(), inner), 0..8)
                .prop_map(|fields| Value::Object(fields.into_iter().collect::<Map<_, _>>())),
        ]
    })
}

/// An object with a valid header and random fields, so the reader gets past
/// the format check.
fn headed_json() -> impl Strategy<Value = Value> {
    prop::collection::vec((key(), any_json()), 0..8).prop_map(|fields| {
        let mut object: Map<String, Value> = fields.into_iter().collect();
        object.insert("format".into(), json!("plumbline-case"));
        object.insert("version".into(), json!(1));
        Value::Object(object)
    })
}

/// Text that is nearly JSON: a soup of its tokens.
fn token_soup() -> impl Strategy<Value = String> {
    let token = prop::sample::select(vec![
        "{",
        "}",
        "[",
        "]",
        ":",
        ",",
        "\"format\"",
        "\"plumbline-case\"",
        "\"version\"",
        "1",
        "-1",
        "1e400",
        "\"arterial\"",
        "\"heights\"",
        "\"tragus\"",
        "\"80 mmHg\"",
        "null",
        "true",
        "\"",
        "\\",
        "\\u0000",
        "\\ud800",
        " ",
        "\n",
        "0.0000001",
        "18446744073709551616",
    ]);
    prop::collection::vec(token, 0..60).prop_map(|t| t.concat())
}

// ---------------------------------------------------------------------------
// Mutations of the examples
// ---------------------------------------------------------------------------

/// Every JSON pointer in a document, containers included.
fn pointers(value: &Value, at: String, out: &mut Vec<String>) {
    match value {
        Value::Object(map) => {
            for (k, v) in map {
                pointers(
                    v,
                    format!("{at}/{}", k.replace('~', "~0").replace('/', "~1")),
                    out,
                );
            }
        }
        Value::Array(items) => {
            for (i, v) in items.iter().enumerate() {
                pointers(v, format!("{at}/{i}"), out);
            }
        }
        _ => {}
    }
    out.push(at);
}

#[derive(Clone, Debug)]
enum Mutation {
    Replace(Value),
    Delete,
    Nest { depth: usize, in_array: bool },
    Duplicate,
    AddField(String, Value),
}

fn mutation() -> impl Strategy<Value = Mutation> {
    prop_oneof![
        3 => nasty_number().prop_map(Mutation::Replace),
        3 => nasty_string().prop_map(|s| Mutation::Replace(Value::String(s))),
        1 => leaf().prop_map(Mutation::Replace),
        1 => Just(Mutation::Delete),
        1 => (1..200_usize, any::<bool>()).prop_map(|(depth, in_array)| Mutation::Nest { depth, in_array }),
        1 => Just(Mutation::Duplicate),
        1 => (key(), any_json()).prop_map(|(k, v)| Mutation::AddField(k, v)),
    ]
}

fn nest(value: Value, depth: usize, in_array: bool) -> Value {
    (0..depth).fold(value, |v, _| {
        if in_array {
            json!([v])
        } else {
            json!({ "x": v })
        }
    })
}

fn apply(doc: &mut Value, pointer: &str, mutation: &Mutation) {
    match mutation {
        Mutation::Delete => {
            let Some((parent, key)) = pointer.rsplit_once('/') else {
                return;
            };
            match doc.pointer_mut(parent) {
                Some(Value::Object(map)) => {
                    map.remove(&key.replace("~1", "/").replace("~0", "~"));
                }
                Some(Value::Array(items)) => {
                    if let Ok(i) = key.parse::<usize>() {
                        if i < items.len() {
                            items.remove(i);
                        }
                    }
                }
                _ => {}
            }
        }
        Mutation::AddField(k, v) => {
            if let Some(Value::Object(map)) = doc.pointer_mut(pointer) {
                map.insert(k.clone(), v.clone());
            }
        }
        _ => {
            if let Some(slot) = doc.pointer_mut(pointer) {
                let old = slot.take();
                *slot = match mutation {
                    Mutation::Replace(v) => v.clone(),
                    Mutation::Nest { depth, in_array } => nest(old, *depth, *in_array),
                    Mutation::Duplicate => json!([old.clone(), old]),
                    _ => old,
                };
            }
        }
    }
}

fn example(name: &str) -> Value {
    serde_json::from_str(&text(name)).expect("examples are JSON")
}

// ---------------------------------------------------------------------------
// Fixed corpus
// ---------------------------------------------------------------------------

#[test]
fn every_example_survives_every_single_nasty_replacement() {
    let replacements = [
        json!(1e308),
        json!(-1e308),
        json!(-1),
        json!(null),
        json!("<script>alert(1)</script>"),
        json!("1e999 mmHg"),
        json!("-0 cm"),
        json!({}),
    ];
    let mut accepted = 0;
    let mut refused = 0;
    for name in NAMES {
        let doc = example(name);
        let mut all = Vec::new();
        pointers(&doc, String::new(), &mut all);
        for pointer in all.iter().filter(|p| !p.is_empty()) {
            for replacement in &replacements {
                let mut mutated = doc.clone();
                apply(
                    &mut mutated,
                    pointer,
                    &Mutation::Replace(replacement.clone()),
                );
                let text = mutated.to_string();
                if let Err(e) = survives(&text) {
                    panic!("{name} {pointer} = {replacement}: {e}");
                }
                if check_json(&text).is_ok() {
                    accepted += 1;
                } else {
                    refused += 1;
                }
            }
        }
    }
    // The corpus exercises both sides of the gate.
    assert!(
        accepted > 50 && refused > 500,
        "accepted {accepted}, refused {refused}"
    );
}

#[test]
fn hostile_documents_are_refused_with_a_message() {
    let deep_array = format!("{}{}", "[".repeat(100_000), "]".repeat(100_000));
    let deep_field = format!(
        r#"{{"format": "plumbline-case", "version": 1, "arterial": {}1{}}}"#,
        "[".repeat(5_000),
        "]".repeat(5_000)
    );
    let oversized = format!(
        r#"{{"format": "plumbline-case", "version": 1, "x": "{}"}}"#,
        "a".repeat(MAX_BYTES)
    );
    let texts = [
        String::new(),
        " ".into(),
        "null".into(),
        "\u{feff}{}".into(),
        deep_array,
        deep_field,
        oversized,
        r#"{"format": "plumbline-case", "version": 1} trailing"#.into(),
        r#"{"format": "plumbline-case", "version": 1e400}"#.into(),
        r#"{"format": "plumbline-case", "version": 1.5}"#.into(),
        r#"{"format": "plumbline-case", "version": -1}"#.into(),
        r#"{"format": "plumbline-case", "version": 18446744073709551616}"#.into(),
        r#"{"format": "plumbline-case", "version": 4294967296}"#.into(),
        r#"{"format": "plumbline-case", "format": "other", "version": 1}"#.into(),
        "{\"format\": \"plumbline-case\", \"version\": 1, \"patient\": {\"height\": \"\\ud800 cm\"}}".into(),
    ];
    for text in &texts {
        if let Err(e) = survives(text) {
            panic!("{e}");
        }
        let errors = check_json(text).expect_err("refused");
        assert!(!errors.is_empty());
    }
    // A version far beyond u32 is still reported as a version problem.
    let errors =
        check_json(r#"{"format": "plumbline-case", "version": 4294967296}"#).expect_err("refused");
    assert!(
        errors
            .iter()
            .any(|e| matches!(e.kind(), ErrorKind::UnsupportedVersion { .. })),
        "{errors}"
    );
}

// ---------------------------------------------------------------------------
// Random inputs
// ---------------------------------------------------------------------------

proptest! {
    #![proptest_config(config(2048))]

    #[test]
    fn arbitrary_text_never_panics(text in prop_oneof![any::<String>(), "\\PC{0,300}", token_soup()]) {
        survives(&text).map_err(fail)?;
    }
}

proptest! {
    #![proptest_config(config(1024))]

    #[test]
    fn arbitrary_json_never_panics(value in any_json()) {
        survives_value(value).map_err(fail)?;
    }
}

proptest! {
    #![proptest_config(config(512))]

    #[test]
    fn arbitrary_json_behind_a_valid_header_never_panics(value in headed_json()) {
        survives_value(value).map_err(fail)?;
    }

    #[test]
    fn mutated_examples_never_panic(
        which in 0..NAMES.len(),
        mutations in prop::collection::vec((any::<prop::sample::Index>(), mutation()), 1..5),
    ) {
        let mut doc = example(NAMES[which]);
        for (index, m) in &mutations {
            let mut all = Vec::new();
            pointers(&doc, String::new(), &mut all);
            let pointer = index.get(&all).clone();
            apply(&mut doc, &pointer, m);
        }
        survives_value(doc).map_err(fail)?;
    }
}

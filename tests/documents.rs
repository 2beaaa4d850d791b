//! The documents every face of the tool must read alike: the examples, the
//! fixtures and the edge cases of the caps and the targets, by name. The
//! command line's cross-check (`crates/cli/tests/one_answer.rs`) and the
//! JavaScript face's browser test (`crates/web/tests/api.rs`) both include
//! this file, so the two run the same list.

/// `(name, text)` of each document.
pub const DOCUMENTS: &[(&str, &str)] = &[
    (
        "examples/aortic-repair.json",
        include_str!("../examples/aortic-repair.json"),
    ),
    (
        "examples/beach-chair.json",
        include_str!("../examples/beach-chair.json"),
    ),
    ("examples/cpr.json", include_str!("../examples/cpr.json")),
    (
        "examples/icu-abdomen.json",
        include_str!("../examples/icu-abdomen.json"),
    ),
    (
        "examples/lateral-thoracotomy.json",
        include_str!("../examples/lateral-thoracotomy.json"),
    ),
    (
        "examples/limb-compartment.json",
        include_str!("../examples/limb-compartment.json"),
    ),
    (
        "examples/measured-heights.json",
        include_str!("../examples/measured-heights.json"),
    ),
    (
        "examples/prone-spine.json",
        include_str!("../examples/prone-spine.json"),
    ),
    (
        "examples/sitting-craniotomy.json",
        include_str!("../examples/sitting-craniotomy.json"),
    ),
    (
        "fixtures/bad-syntax.json",
        include_str!("fixtures/bad-syntax.json"),
    ),
    (
        "fixtures/bad-unit.json",
        include_str!("fixtures/bad-unit.json"),
    ),
    (
        "fixtures/deep-nesting.json",
        include_str!("fixtures/deep-nesting.json"),
    ),
    (
        "fixtures/inconsistent.json",
        include_str!("fixtures/inconsistent.json"),
    ),
    (
        "fixtures/long-id.json",
        include_str!("fixtures/long-id.json"),
    ),
    (
        "fixtures/newer-version.json",
        include_str!("fixtures/newer-version.json"),
    ),
    (
        "fixtures/no-height.json",
        include_str!("fixtures/no-height.json"),
    ),
    (
        "fixtures/pressure-bounds-and-none.json",
        include_str!("fixtures/pressure-bounds-and-none.json"),
    ),
    (
        "fixtures/too-many-sources.json",
        include_str!("fixtures/too-many-sources.json"),
    ),
    (
        "fixtures/two-bounds-target.json",
        include_str!("fixtures/two-bounds-target.json"),
    ),
    (
        "fixtures/unknown-landmark.json",
        include_str!("fixtures/unknown-landmark.json"),
    ),
    ("not an object", "[1, 2, 3]"),
    (
        "another format",
        r#"{"format": "plumbline-state", "version": 1}"#,
    ),
    (
        "misspelt field",
        r#"{"format": "plumbline-case", "version": 1, "arterail": []}"#,
    ),
];

//! The demo case that ships with the project: an invented beach-chair
//! shoulder operation, with nothing from any real patient.

/// The demo case as JSON (the same file as `examples/beach-chair.json`).
pub const CASE_JSON: &str = include_str!("../../../examples/beach-chair.json");

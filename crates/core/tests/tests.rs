//! The core's integration tests, built as one test binary (one link, one
//! run): `cargo test -p plumbline-core --test tests`.
//!
//! The sources behind the reference checks, with their tags, are listed in
//! `README.md` beside this file.

// The workspace denies these for library code; a failing test should fail
// loudly, so the tests may unwrap, index and panic.
#![allow(
    clippy::unwrap_used,
    clippy::expect_used,
    clippy::indexing_slicing,
    clippy::panic
)]

// Shared helpers: case building, report lookup, the `check` table helper and
// the tests' own hydrostatic column.
mod util;

// Published values from REFERENCES.md §1-§4 and §6 (constants, densities,
// mean rules, reference levels, definitions, default targets, device
// accuracy), each with its source and tag.
mod reference;

// The nine worked examples of REFERENCES.md §7 and our own, derived by hand.
mod worked;

// Issue 3: geometry references (proportions, supine and upright landmarks,
// mirror symmetries, seated measurements of REFERENCES.md §5, measured
// heights, out-of-range input).
mod geometry_reference;

// Every case file under examples/: it reads, it checks, and its key numbers
// match a hand derivation.
mod examples;

// Property tests: datum shift, monotone inflow, required readings fed back,
// unit round trips, geometry over its whole input range.
mod properties;

// Regression tests for core bugs found by these suites, named after the bug.
mod regressions;

// Safe by default: verdicts with missing inputs, the brain without ICP, the
// zero each target assumes, a cuff's per-reading spread, operative-site
// venous pressure, a drain's level, the vertex, no body height.
mod safety;

// The invariants of DEVELOPERS.md: //! lines, uom only in units, no pressure
// arithmetic in the screen, the core's allowed dependencies, file sizes.
mod tidy;

// Robustness: arbitrary text, arbitrary JSON and mutated example cases never
// panic, and every error says something.
mod robustness;

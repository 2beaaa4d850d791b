//! Plumbline core: organ perfusion pressure with hydrostatic correction for
//! the patient's posture.
//!
//! Pure computation, no I/O and no web dependencies; it builds for the host
//! and for `wasm32-unknown-unknown`. Nothing reachable from input panics:
//! bad input comes back as [`error::Errors`] naming each field.

#![deny(missing_docs)]

#[macro_use]
extern crate uom;

pub mod case;
pub mod check;
pub mod demo;
pub mod error;
pub mod evaluate;
pub mod fluid;
pub mod geometry;
mod keyed;
pub mod landmark;
pub mod limits;
pub mod order;
pub mod organ;
pub mod reading;
pub mod record;
pub mod report;
pub mod scene;
pub mod share;
pub mod target;
pub mod text;
pub mod units;
pub mod usual;

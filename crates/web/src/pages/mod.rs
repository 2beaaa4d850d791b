//! Screens. Plumbline has one: the check.

pub mod check_page;

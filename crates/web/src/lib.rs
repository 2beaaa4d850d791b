//! Plumbline's bedside screen: the check as a Yew app in the browser.
//!
//! Pure logic lives on data types (`fields`, `form`, `state`, `picture`,
//! `chart`, `show`); components only gather input and show the core's
//! report. The front end never does arithmetic on a pressure.

pub mod app;
pub mod chart;
pub mod components;
pub mod fields;
pub mod form;
pub mod pages;
pub mod picture;
pub mod show;
pub mod state;

/// Mounts the app on the page's body.
pub fn start() {
    yew::Renderer::<app::App>::new().render();
}

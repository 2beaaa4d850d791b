//! Plumbline's bedside screen: the check as a Yew app in the browser.
//!
//! Pure logic lives on data types (`fields`, `form`, `state`, `picture`,
//! `chart`, `show`, `theme`, `session`, `saved`, `qr`, `record`);
//! components only gather input and show the core's report. The front end
//! never does arithmetic on a pressure. The state's reducer is pure; its
//! effects run outside it: `browser` is the thin layer over the page's
//! storage, address and clipboard, `storage` the device's texts and their
//! envelopes, `persist` keeps the device's copy in step, and `api` is the
//! module's face for other pages.

pub mod api;
pub mod app;
pub mod browser;
pub mod chart;
pub mod components;
pub mod fields;
pub mod form;
pub mod level;
pub mod notes;
pub mod pages;
pub mod persist;
pub mod picture;
pub mod qr;
pub mod record;
pub mod saved;
pub mod session;
pub mod show;
pub mod state;
pub mod storage;
pub mod theme;

/// Mounts the app on the page's body; the page's `boot.js` calls it once
/// the module is loaded. A page that only wants the check (`api`) never does.
#[wasm_bindgen::prelude::wasm_bindgen]
pub fn start() {
    yew::Renderer::<app::App>::new().render();
}

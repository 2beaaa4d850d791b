//! The app: owns the state (a reducer), applies the theme to the page, and
//! shows the check screen.

use gloo::storage::{LocalStorage, Storage};
use yew::prelude::*;

use crate::pages::check_page::CheckPage;
use crate::state::{State, Theme};

/// Where the chosen theme is kept on the device (nothing about a patient).
const THEME_KEY: &str = "plumbline.theme";

/// Props of [`App`].
#[derive(Properties, PartialEq, Default)]
pub struct AppProps {}

/// The app.
#[component]
pub fn App(_props: &AppProps) -> Html {
    let state = use_reducer(|| {
        let saved: Option<String> = LocalStorage::get(THEME_KEY).ok();
        State::demo(saved.as_deref().map_or(Theme::Device, Theme::from_key))
    });
    let theme = state.theme;
    use_effect_with(theme, move |theme| {
        if let Some(root) = gloo::utils::document().document_element() {
            // An attribute that cannot be set leaves the device's theme.
            let _ = root.set_attribute("data-theme", theme.key());
        }
        // Storage may be off (private browsing); the theme then lasts the visit.
        let _ = LocalStorage::set(THEME_KEY, theme.key());
    });
    html! { <CheckPage state={state} /> }
}

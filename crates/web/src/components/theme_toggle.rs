//! The theme switch: as the device prefers, dark, or light.

use yew::prelude::*;

use crate::state::{Action, Handle};

/// Props of [`ThemeToggle`].
#[derive(Properties, PartialEq)]
pub struct ThemeToggleProps {
    /// The state.
    pub state: Handle,
}

/// The theme switch.
#[component]
pub fn ThemeToggle(props: &ThemeToggleProps) -> Html {
    let theme = props.state.theme;
    let onclick = {
        let d = props.state.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Theme(theme.next())))
    };
    html! {
        <button type="button" class="tool" {onclick}
            aria-label={format!("Theme: {}. Switch to {}", theme.label(), theme.next().label())}>
            <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                <circle cx="12" cy="12" r="8" class="theme-ring" />
                <path d="M12 4 A8 8 0 0 1 12 20 Z" class="theme-half" />
            </svg>
            <span class="theme-word">{ format!("Theme: {}", theme.label()) }</span>
        </button>
    }
}

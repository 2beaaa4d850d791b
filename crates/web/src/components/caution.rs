//! The caution: always on screen, always in the printout.

use plumbline_core::report::CAUTION;
use yew::prelude::*;

/// Props of [`Caution`].
#[derive(Properties, PartialEq)]
pub struct CautionProps {}

/// The caution bar, fixed to the foot of the screen.
#[component]
pub fn Caution(_props: &CautionProps) -> Html {
    html! {
        <aside class="caution" aria-label="Caution">
            <svg class="caution-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                <path d="M12 2 L23 21 H1 Z" />
                <rect x="11" y="8" width="2" height="7" class="glyph" />
                <rect x="11" y="17" width="2" height="2" class="glyph" />
            </svg>
            <p><strong>{ "Caution. " }</strong>{ CAUTION }</p>
        </aside>
    }
}

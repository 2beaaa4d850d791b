//! A target's status as a word and a shape: a ring with a tick for meets,
//! a downward triangle for below, an upward triangle for above, an open ring
//! when nothing could be judged. Colour only adds to them.

use plumbline_core::target::Status;
use yew::prelude::*;

use crate::show::status_class;

/// Props of [`StatusBadge`].
#[derive(Properties, PartialEq)]
pub struct StatusBadgeProps {
    /// The status, as the core decided it.
    pub status: Status,
}

/// The status badge.
#[component]
pub fn StatusBadge(props: &StatusBadgeProps) -> Html {
    let shape = match props.status {
        Status::Met => html! {
            <>
                <circle cx="12" cy="12" r="10" class="shape" />
                <path d="M7 12.5 L10.5 16 L17 8.5" class="glyph-line" />
            </>
        },
        Status::Below => html! {
            <>
                <path d="M2 4 H22 L12 21 Z" class="shape" />
                <rect x="11" y="7" width="2" height="6" class="glyph" />
            </>
        },
        Status::Above => html! {
            <>
                <path d="M12 3 L22 20 H2 Z" class="shape" />
                <rect x="11" y="10" width="2" height="6" class="glyph" />
            </>
        },
        Status::NotObserved | Status::NotEvaluated => {
            html! { <circle cx="12" cy="12" r="9" class="shape-open" /> }
        }
    };
    html! {
        <span class={classes!("status", status_class(props.status))}>
            <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false">{ shape }</svg>
            <span class="status-word">{ props.status.badge() }</span>
        </span>
    }
}

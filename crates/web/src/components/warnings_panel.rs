//! The cross-check between arterial sources and the warnings: things worth
//! a second look that do not stop the check.

use plumbline_core::error::Warning;
use plumbline_core::report::CrossCheck;
use yew::prelude::*;

/// Props of [`WarningsPanel`].
#[derive(Properties, PartialEq)]
pub struct WarningsPanelProps {
    /// Source pairs compared at heart level.
    pub cross_checks: Vec<CrossCheck>,
    /// The warnings.
    pub warnings: Vec<Warning>,
}

/// Cross-checks and warnings.
#[component]
pub fn WarningsPanel(props: &WarningsPanelProps) -> Html {
    if props.cross_checks.is_empty() && props.warnings.is_empty() {
        return html! {};
    }
    html! {
        <section class="panel warnings" aria-labelledby="h-warnings">
            <h3 id="h-warnings">{ "Second look" }</h3>
            <ul>
                { for props.cross_checks.iter().map(|c| html! {
                    <li class={if c.agree { "cross-check agree" } else { "cross-check disagree" }}>
                        <span class="msg-mark" aria-hidden="true">{ if c.agree { "=" } else { "≠" } }</span>
                        <span>{ c.words.clone() }</span>
                    </li>
                }) }
                { for props.warnings.iter().map(|w| html! {
                    <li class="warning">
                        <span class="msg-mark" aria-hidden="true">{ "!" }</span>
                        <span>{ w.message.clone() }</span>
                    </li>
                }) }
            </ul>
        </section>
    }
}

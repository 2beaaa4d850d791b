//! The answer first: the core's summary over the organs of concern — each
//! organ's verdict with its deciding value and the reading to defend — under
//! the core's headline, which never calls an organ fine that could not be
//! judged.

use plumbline_core::report::Summary;
use yew::prelude::*;

use crate::components::status_badge::StatusBadge;

/// Props of [`Verdicts`].
#[derive(Properties, PartialEq)]
pub struct VerdictsProps {
    /// The core's summary.
    pub summary: Summary,
    /// Whether the report is older than the form.
    pub stale: bool,
}

/// The summary list.
#[component]
pub fn Verdicts(props: &VerdictsProps) -> Html {
    let s = &props.summary;
    html! {
        <section class={classes!("verdicts", props.stale.then_some("stale"))}
            aria-labelledby="h-verdicts">
            <h2 id="h-verdicts">{ "At the organs' own height" }</h2>
            <p class="headline">
                if props.stale { { "Last good check: " } }
                { s.headline.clone() }
            </p>
            <ul>
                { for s.organs.iter().map(|line| html! {
                    <li class="verdict">
                        <span class="verdict-name">{ line.label }</span>
                        <span class="verdict-status">
                            <StatusBadge status={line.status} />
                        </span>
                        if let Some(v) = &line.value {
                            <span class="verdict-value">{ v.clone() }</span>
                        }
                        <span class="verdict-words">{ line.words.clone() }</span>
                        if let Some(d) = &line.defend {
                            <span class="defend">{ format!("Defend {d}") }</span>
                        }
                    </li>
                }) }
            </ul>
        </section>
    }
}

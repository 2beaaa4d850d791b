//! The answer first: each checked organ's main number, its status against
//! each target, and the site reading to defend where a target is missed.

use plumbline_core::report::OrganReport;
use plumbline_core::target::Status;
use yew::prelude::*;

use crate::components::status_badge::StatusBadge;
use crate::show::rounded;

/// Props of [`Verdicts`].
#[derive(Properties, PartialEq)]
pub struct VerdictsProps {
    /// The organs checked.
    pub organs: Vec<OrganReport>,
    /// The headline: how many targets are missed.
    pub headline: AttrValue,
    /// Whether the report is older than the form.
    pub stale: bool,
}

/// The summary list.
#[component]
pub fn Verdicts(props: &VerdictsProps) -> Html {
    html! {
        <section class={classes!("verdicts", props.stale.then_some("stale"))}
            aria-labelledby="h-verdicts">
            <h2 id="h-verdicts">{ "At the organs' own height" }</h2>
            <p class="headline">
                if props.stale { { "Last good check: " } }
                { props.headline.clone() }
            </p>
            <ul>
                { for props.organs.iter().filter_map(|o| {
                    let m = o.metrics.first()?;
                    Some(html! {
                        <li class="verdict">
                            <span class="verdict-name">{ format!("{} · {}", o.label, m.label) }</span>
                            <span class="verdict-value">
                                <strong>{ rounded(m.value_mmhg) }</strong>{ " mmHg" }
                                <span class="range">
                                    { format!(" ({}–{})", rounded(m.lower_mmhg), rounded(m.upper_mmhg)) }
                                </span>
                            </span>
                            { for m.assumed.iter().map(|q| html! {
                                <span class="verdict-assumed">
                                    { format!("uses an ASSUMED {}, not a measurement", q.label()) }
                                </span>
                            }) }
                            <span class="verdict-status">
                                { for m.targets.iter().map(|t| html! {
                                    <span class="verdict-target">
                                        <StatusBadge status={t.status} />
                                        <span class="target-name">{ t.target.clone() }</span>
                                    </span>
                                }) }
                            </span>
                            { for m.targets.iter()
                                .filter(|t| matches!(t.status, Some(Status::Below | Status::Above)))
                                .filter_map(|t| t.required.first())
                                .map(|r| html! {
                                    <span class="defend">{ format!("Defend {}", r.words) }</span>
                                }) }
                        </li>
                    })
                }) }
            </ul>
        </section>
    }
}

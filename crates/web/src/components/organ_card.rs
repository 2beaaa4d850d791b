//! One organ's results at its own height.

use plumbline_core::report::OrganReport;
use yew::prelude::*;

use crate::components::metric_details::MetricDetails;
use crate::components::status_badge::StatusBadge;
use crate::show::signed_cm;

/// Props of [`OrganCard`].
#[derive(Properties, PartialEq)]
pub struct OrganCardProps {
    /// The organ's report.
    pub organ: OrganReport,
}

/// One organ.
#[component]
pub fn OrganCard(props: &OrganCardProps) -> Html {
    let o = &props.organ;
    let id = format!("h-organ-{}", o.organ);
    html! {
        <section class="organ" aria-labelledby={id.clone()}>
            <h3 id={id}>{ o.label }</h3>
            <p class="organ-verdict">
                <StatusBadge status={o.verdict.status} />
                <span>{ o.verdict.words.clone() }</span>
            </p>
            <p class="level">
                { format!("checked at the {} ({} cm from the heart reference)", o.level_label, signed_cm(o.level_height_cm)) }
            </p>
            { for o.metrics.iter().map(|m| html! { <MetricDetails metric={m.clone()} /> }) }
            { for o.missing.iter().map(|m| html! {
                <p class="missing">{ format!("{}: needs {}", m.label, m.needs.join("; ")) }</p>
            }) }
        </section>
    }
}

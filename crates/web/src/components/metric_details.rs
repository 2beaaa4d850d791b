//! One result that opens to show how the core got it: the derivation steps,
//! each input's pull on the range, the waterfall's choice and the targets.

use plumbline_core::report::MetricReport;
use plumbline_core::target::Status;
use yew::prelude::*;

use crate::components::fold::use_open;
use crate::components::status_badge::StatusBadge;
use crate::show::rounded;

/// Props of [`MetricDetails`].
#[derive(Properties, PartialEq)]
pub struct MetricDetailsProps {
    /// The metric.
    pub metric: MetricReport,
}

fn signed(v: f64) -> String {
    if v > 0.0 {
        format!("+{:.1}", v)
    } else {
        format!("{:.1}", v + 0.0)
    }
}

/// One metric.
#[component]
pub fn MetricDetails(props: &MetricDetailsProps) -> Html {
    let m = &props.metric;
    // The derivation is built only while it is open (a plain function
    // here, not a component of its own: one less in the download).
    let (open, ontoggle) = use_open(false);
    html! {
        <div class="metric" role="group" aria-label={m.label}>
            <div class="metric-head">
                <span class="metric-name">{ m.label }</span>
                <span class="metric-value">
                    <strong class="value">{ rounded(m.value_mmhg) }</strong>{ " mmHg" }
                </span>
                <span class="range">
                    { format!("range {} to {} mmHg", rounded(m.lower_mmhg), rounded(m.upper_mmhg)) }
                </span>
            </div>
            if let Some(b) = &m.beside {
                <p class="beside">{ b.words.clone() }</p>
            }
            { for m.assumed.iter().map(|q| html! {
                <p class="assumed-flag">
                    <span class="tag tag-assumed">{ "ASSUMED" }</span>
                    { format!(" uses an assumed {}, not a measurement", q.label()) }
                </p>
            }) }
            { for m.targets.iter().map(|t| html! {
                <div class="target-result">
                    <p class="verdict-line">
                        <StatusBadge status={t.status} />
                        <span>{ format!("{}: {}", t.target, t.words) }</span>
                    </p>
                    { for t.defend.iter().map(|r| html! {
                        <p class={if t.status == Status::Met { "defend-ok" } else { "defend" }}>
                            { format!("To meet it now: {}", r.words) }
                        </p>
                    }) }
                    <p class="source">{ format!("Target source: {}", t.citation) }</p>
                    <p class="source">{ format!("Zero it assumes: {}", t.zero) }</p>
                </div>
            }) }
            if let Some(grade) = &m.grade {
                <p class="grade">{ grade.words.clone() }</p>
            }
            <details class="more" open={*open} {ontoggle}>
                <summary>{ format!("How {} = {} mmHg was found", m.label, rounded(m.value_mmhg)) }</summary>
                if *open {
                    { derivation(m) }
                }
            </details>
        </div>
    }
}

/// How the metric was found: its steps, the waterfall's choice, the
/// targets' thresholds and what moves its range.
fn derivation(m: &MetricReport) -> Html {
    html! {
        <>
            <ol class="steps">
                { for m.steps.iter().map(|s| html! { <li>{ s.what.clone() }</li> }) }
            </ol>
            if let Some(o) = &m.outflow {
                <p>
                    { format!("Outflow (waterfall): the higher of {}, so {} at {} mmHg.",
                        o.candidates.iter()
                            .map(|c| format!("{} {} mmHg", c.quantity.label(), rounded(c.value_mmhg)))
                            .collect::<Vec<_>>().join(", "),
                        o.winner.label(), rounded(o.value_mmhg)) }
                </p>
            }
            { for m.targets.iter().filter(|t| !t.threshold_steps.is_empty()).map(|t| html! {
                <>
                    <p>{ format!("Threshold of “{}”:", t.target) }</p>
                    <ol class="steps">
                        { for t.threshold_steps.iter().map(|s| html! { <li>{ s.what.clone() }</li> }) }
                    </ol>
                </>
            }) }
            if !m.contributions.is_empty() {
                <table>
                    <caption>{ "What moves the range (mmHg)" }</caption>
                    <thead>
                        <tr><th scope="col">{ "Input" }</th><th scope="col">{ "Down" }</th>
                            <th scope="col">{ "Up" }</th></tr>
                    </thead>
                    <tbody>
                        { for m.contributions.iter().map(|c| html! {
                            <tr><th scope="row">{ c.input.clone() }</th>
                                <td class="num">{ signed(c.down_mmhg) }</td>
                                <td class="num">{ signed(c.up_mmhg) }</td></tr>
                        }) }
                    </tbody>
                </table>
            }
            if !m.assumed.is_empty() {
                <p class="hint">{ "An assumed value's own error is not part of the range." }</p>
            }
        </>
    }
}

//! The answer, always in view: the core's headline over the organs of
//! concern, each organ's verdict with its deciding value and the reading to
//! defend, and what the record over time adds. Pinned as a bar at the top
//! of a phone and as a column beside the inputs on a tablet. The core
//! decides every verdict; this only lays them out.

use plumbline_core::record::{headline, TargetExposure};
use plumbline_core::report::Summary;
use plumbline_core::text::minutes;
use yew::prelude::*;

use crate::components::status_badge::StatusBadge;

/// Props of [`Verdicts`].
#[derive(Properties, PartialEq)]
pub struct VerdictsProps {
    /// The core's summary.
    pub summary: Summary,
    /// Whether the report is older than the form.
    pub stale: bool,
    /// Whether invented demo values are still in the check.
    pub invented: bool,
    /// The record's exposure for the organs of concern, when there is a
    /// record analysed.
    pub record: Option<Vec<TargetExposure>>,
    /// What is still to be entered before the answer can be updated.
    pub needed: Vec<String>,
}

/// The record's part of the answer, from the core's statuses.
fn record_lines(record: &[TargetExposure]) -> Html {
    let missed: Vec<&TargetExposure> = record.iter().filter(|t| t.status.is_missed()).collect();
    if missed.is_empty() {
        return Html::default();
    }
    html! {
        <ul class="answer-record">
            { for missed.iter().map(|t| html! {
                <li>
                    <StatusBadge status={t.status} />
                    { format!(" Over the record, {}: {} for {} of {} observed",
                        t.target, t.status.label(), minutes(t.outside_min), minutes(t.observed_min)) }
                </li>
            }) }
        </ul>
    }
}

/// The pinned answer.
#[component]
pub fn Verdicts(props: &VerdictsProps) -> Html {
    let s = &props.summary;
    html! {
        <section class={classes!("verdicts", props.stale.then_some("stale"))}
            aria-labelledby="h-verdicts">
            <h2 id="h-verdicts">{ "At the organs' own height" }</h2>
            <p class="headline">
                if props.invented {
                    <span class="tag tag-demo" title="uses invented demo values">{ "DEMO" }</span>{ " " }
                }
                if props.stale { <span class="tag tag-stale">{ "STALE" }</span>{ " last good check: " } }
                { s.headline.clone() }
                if let Some(record) = &props.record {
                    { " " }{ headline(record) }
                }
            </p>
            if props.stale && !props.needed.is_empty() {
                <p class="answer-needed">{ format!("To update it, enter: {}.", props.needed.join("; ")) }</p>
            }
            <ul>
                { for s.organs.iter().map(|line| {
                    // The core's sentence repeats the value shown beside it.
                    let words = line
                        .value
                        .as_deref()
                        .and_then(|v| line.words.strip_prefix(v))
                        .map_or(line.words.as_str(), |rest| rest.trim_start_matches(": "));
                    html! {
                        <li class="verdict">
                            <span class="verdict-head">
                                <StatusBadge status={line.status} />
                                <span class="verdict-name">{ line.label }</span>
                                if let Some(v) = &line.value {
                                    <span class="verdict-value">{ v.clone() }</span>
                                }
                            </span>
                            if let Some(d) = &line.defend {
                                <span class="defend">{ format!("Defend {d}") }</span>
                            }
                            <span class="verdict-words">{ words.to_owned() }</span>
                        </li>
                    }
                }) }
            </ul>
            if let Some(record) = &props.record {
                { record_lines(record) }
            }
            <a class="answer-more" href="#h-organs">{ "Each organ in detail" }</a>
        </section>
    }
}

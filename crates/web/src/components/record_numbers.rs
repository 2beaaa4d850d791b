//! One target's exposure over the record, as the core counted it: time
//! outside, its share of the observed time, area, time-weighted average,
//! longest episode, the worst value and when, and any assumed value used.
//! Numbers are written with the decimals of the core's own summary (one for
//! minutes and averages, none for the rest), so they read exactly as
//! `plumbline record` prints them.

use plumbline_core::record::clock::clock_words;
use plumbline_core::record::{elapsed_words, TargetExposure};
use plumbline_core::target::Status;
use yew::prelude::*;

use crate::components::status_badge::StatusBadge;

/// Props of [`RecordNumbers`].
#[derive(Properties, PartialEq)]
pub struct RecordNumbersProps {
    /// The core's exposure for one target.
    pub exposure: TargetExposure,
    /// The record's clock start, seconds after midnight.
    pub clock_start: Option<f64>,
}

/// The numbers.
#[component]
pub fn RecordNumbers(props: &RecordNumbersProps) -> Html {
    let t = &props.exposure;
    let side = if t.at_least { "below" } else { "above" };
    let status = t.status;
    let headline = match status {
        Status::Met => format!("never {side} it"),
        Status::Below | Status::Above => format!("for {:.1} min", t.outside_min),
        Status::NotObserved | Status::NotEvaluated => "no observed time".to_owned(),
    };
    let worst = t.worst_at_s.zip(t.worst_mmhg).map(|(at, v)| {
        let clock = props
            .clock_start
            .map(|c| format!(" ({})", clock_words(c + at)))
            .unwrap_or_default();
        format!("{v:.0} mmHg at {}{clock}", elapsed_words(at))
    });
    let episodes = match (t.episodes, t.ignored_episodes) {
        (1, 0) => "1 episode".to_owned(),
        (n, 0) => format!("{n} episodes"),
        (n, k) => format!("{n} episodes; {k} shorter ignored"),
    };
    html! {
        <div class="exposure" role="group" aria-label={t.target.clone()}>
            <p class="exposure-head">
                <StatusBadge status={status} />
                <span class="exposure-target">{ t.target.clone() }</span>
                <span class="exposure-headline">{ headline }</span>
            </p>
            <dl class="numbers">
                <div>
                    <dt>{ format!("Time {side}") }</dt>
                    <dd class="x-outside">
                        { format!("{:.1} min of {:.1} min observed ({:.0}%)", t.outside_min, t.observed_min, t.outside_percent) }
                    </dd>
                </div>
                <div>
                    <dt>{ format!("Area {side}") }</dt>
                    <dd class="x-area">{ format!("{:.0} mmHg·min", t.area_mmhg_min) }</dd>
                </div>
                <div>
                    <dt>{ "Time-weighted average" }</dt>
                    <dd class="x-twa">{ format!("{:.1} mmHg", t.twa_mmhg) }</dd>
                </div>
                <div>
                    <dt>{ "Longest episode" }</dt>
                    <dd class="x-longest">{ format!("{:.1} min ({episodes})", t.longest_episode_min) }</dd>
                </div>
                if let Some(w) = worst {
                    <div>
                        <dt>{ if t.at_least { "Lowest" } else { "Highest" } }</dt>
                        <dd class="x-worst">{ w }</dd>
                    </div>
                }
            </dl>
            { for t.assumed.iter().map(|q| html! {
                <p class="verdict-assumed">{ format!("Uses an ASSUMED {}, held throughout: not a measurement", q.label()) }</p>
            }) }
        </div>
    }
}

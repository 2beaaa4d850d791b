//! The record over time: a blood pressure and its time added at the
//! bedside in one row, right above the trends and the readings they come
//! from; or a monitor export opened, or the screen's readings taken as a
//! sample. Then the core's exposure outside each target, organ by organ,
//! with a trend chart, the rules in force and the downloads.
//!
//! The analysis runs at once after a record action, and after a short
//! pause in typing elsewhere, so a long record never slows a keystroke.

use std::rc::Rc;

use gloo::timers::callback::Timeout;
use plumbline_core::record::{elapsed_words, Sampling};
use yew::prelude::*;

use crate::components::box_group;
use crate::components::record_entry::RecordEntry;
use crate::components::record_exports::RecordExports;
use crate::components::record_file::RecordFile;
use crate::components::record_positions::RecordPositions;
use crate::components::record_readings::{RecordReadings, SHOWN};
use crate::components::record_rules::RecordRules;
use crate::components::record_trend::RecordTrend;
use crate::components::ward_entry::WardEntry;
use crate::record::entry::{reading_rows, readings};
use crate::record::{capital, Record, RecordAction};
use crate::show::path_words;
use crate::state::{Action, Checked, Dispatch};

/// How long typing must pause before the record is analysed again, ms.
const PAUSE_MS: u32 = 300;

/// Props of [`RecordPanel`].
#[derive(Properties, PartialEq)]
pub struct RecordPanelProps {
    /// The record.
    pub record: Record,
    /// The last complete check.
    pub checked: Option<Rc<Checked>>,
    /// Whether the boxes differ from the last complete check.
    pub stale: bool,
    /// The arterial sources' names, in order.
    pub sources: Vec<AttrValue>,
    /// Where changes go.
    pub dispatch: Dispatch,
}

/// The record panel.
#[component]
pub fn RecordPanel(props: &RecordPanelProps) -> Html {
    let r = &props.record;
    {
        let d = props.dispatch.clone();
        use_effect_with((r.pending, r.generation), move |(pending, _)| {
            let timer = pending.then(|| {
                Timeout::new(PAUSE_MS, move || {
                    d.dispatch(Action::Record(RecordAction::Analyse))
                })
            });
            move || drop(timer)
        });
    }
    let onclose = {
        let d = props.dispatch.clone();
        Callback::from(move |_: MouseEvent| {
            let sure = web_sys::window().is_some_and(|w| {
                w.confirm_with_message(
                    "Close the record? Its samples and position changes leave this screen.",
                )
                .unwrap_or(false)
            });
            if sure {
                d.dispatch(Action::Record(RecordAction::Close));
            }
        })
    };
    let clock = r.clock_start_s();
    let a = r.analysis.clone();
    let summary = match (&a, r.is_empty()) {
        (_, true) => "No record yet: add a blood pressure with its time above, or open a monitor export. A record keeps no date.".to_owned(),
        (None, false) => format!("{} samples.", r.samples()),
        (Some(a), false) => {
            let e = &a.exposure;
            let mut words = format!(
                "{} samples in {} channels, {} to {} elapsed",
                r.samples(),
                a.channels.len(),
                elapsed_words(e.from_s),
                elapsed_words(e.to_s)
            );
            if let Some(start) = &r.spec.clock_start {
                words.push_str(&format!(" (clock start {start})"));
            }
            words.push_str(&match r.spec.positions.len() {
                0 => "; no position change marked.".to_owned(),
                1 => "; 1 position change.".to_owned(),
                n => format!("; {n} position changes."),
            });
            words
        }
    };
    let stale = props.stale || !r.fit.is_empty();
    let onrecord = {
        let d = props.dispatch.clone();
        Callback::from(move |a: RecordAction| d.dispatch(Action::Record(a)))
    };
    let onadd = {
        let d = props.dispatch.clone();
        Callback::from(move |now_s: f64| d.dispatch(Action::AddReading { now_s }))
    };
    let ward_id = props
        .sources
        .get(r.ward.source)
        .cloned()
        .unwrap_or_default();
    let (total, rows) = reading_rows(&r.spec, &ward_id, SHOWN);
    let adds: Vec<String> = props
        .checked
        .as_ref()
        .map(|c| readings(&c.case, &r.spec))
        .unwrap_or_default()
        .iter()
        .map(|(name, v)| format!("{name} {v}"))
        .collect();
    html! {
        <section class={classes!("pane", "pane-record", (!r.is_empty()).then_some("has-record"))} aria-labelledby="h-record">
            <svg class="defs" width="0" height="0" aria-hidden="true" focusable="false">
                <defs>
                    <pattern id="hatch-low" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
                        <line x1="0" y1="0" x2="0" y2="7" class="hatch hatch-low" />
                    </pattern>
                    <pattern id="hatch-high" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
                        <line x1="0" y1="0" x2="0" y2="7" class="hatch hatch-high" />
                    </pattern>
                </defs>
            </svg>
            <h2 id="h-record">{ "Record over time" }</h2>
            <p class="record-summary">{ summary }</p>
            <p class="sr-only" role="status">{ r.note.clone().unwrap_or_default() }</p>
            <WardEntry sources={props.sources.clone()} ward={r.ward.clone()}
                problem={r.ward.problem.clone().map(AttrValue::from)} onchange={onrecord.clone()} onadd={onadd}
                samples={r.samples()} />
            <details class="more record-more" open={r.file.is_some()}>
                <summary>{ "Open a monitor export, or take every reading on screen as a sample" }</summary>
                <div class="record-tools">
                    { box_group(html! {
                        <>
                            <RecordFile dispatch={props.dispatch.clone()} problems={r.file.clone()}
                                opened={r.opened.clone().map(AttrValue::from)} />
                            <RecordEntry record={r.clone()} adds={adds} dispatch={props.dispatch.clone()} />
                        </>
                    }) }
                </div>
            </details>
            if !r.is_empty() {
                if !r.fit.is_empty() {
                    <section class="problems" aria-labelledby="h-record-fit">
                        <h3 id="h-record-fit">
                            <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                            { "The record cannot be analysed with the check as it is now" }
                        </h3>
                        <ul>
                            { for r.fit.iter().map(|e| html! {
                                <li>{ format!("{}: {}", capital(&path_words(e.field())), e.kind()) }</li>
                            }) }
                        </ul>
                    </section>
                }
                if let Some(a) = &a {
                    <div class={classes!("record-analysis", stale.then_some("stale"))} aria-busy={if r.pending { "true" } else { "false" }}>
                        { for a.trends.iter().enumerate().map(|(i, t)| {
                            let exposures = t.targets.iter().filter_map(|k| a.exposure.targets.get(*k).cloned()).collect::<Vec<_>>();
                            html! { <RecordTrend trend={t.clone()} exposures={exposures} clock_start={clock} index={i} /> }
                        }) }
                        if a.trends.is_empty() {
                            <p>{ "No target could be followed through this record." }</p>
                        }
                        <details class="more">
                            <summary>{ format!("Targets not followed ({})", a.exposure.not_analysed.len()) }</summary>
                            <ul>
                                { for a.exposure.not_analysed.iter().map(|n| html! { <li>{ format!("{}: {}", n.target, n.why) }</li> }) }
                            </ul>
                        </details>
                        <details class="more">
                            <summary>{ format!("Channels and how time between samples counts ({})", a.channels.len()) }</summary>
                            <ul>
                                { for a.channels.iter().map(|c| html! {
                                    <li>{ format!("{}: {} samples, {}{}", c.name, c.samples,
                                        match c.sampling {
                                            Sampling::Held => "each held until the next (intermittent)",
                                            Sampling::Interpolated => "joined by straight lines (continuous)",
                                        },
                                        if c.estimated { "; estimated from systolic and diastolic" } else { "" }) }</li>
                                }) }
                            </ul>
                        </details>
                    </div>
                }
                { box_group(html! {
                    <RecordReadings id={ward_id.clone()} rows={rows} total={total} clock_start={clock}
                        onchange={onrecord.clone()} />
                }) }
                <RecordPositions start={r.start.clone()} changes={r.spec.positions.clone()}
                    dispatch={props.dispatch.clone()} />
                { box_group(html! {
                    <RecordRules texts={r.rule_texts.clone()}
                        in_force={a.as_ref().map(|a| AttrValue::from(a.exposure.rules.clone()))}
                        definitions={a.as_ref().map(|a| AttrValue::from(a.exposure.definitions))}
                        fit={r.fit.clone()} dispatch={props.dispatch.clone()} />
                }) }
                <RecordExports record={r.clone()} checked={props.checked.clone()} />
                <button type="button" class="remove" onclick={onclose}>{ "Close the record" }</button>
            }
        </section>
    }
}

//! The targets: the defaults with their guideline sources until the unit's
//! own are set; add, change or remove any.

use std::rc::Rc;

use plumbline_core::organ::{Metric, Organ};
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::target_row::TargetRow;
use crate::form::{Edit, TargetForm};
use crate::notes::Notes;

/// Props of [`TargetsPanel`].
#[derive(Properties, PartialEq)]
pub struct TargetsPanelProps {
    /// The targets' boxes.
    pub targets: Vec<TargetForm>,
    /// Whether they are the case's own rather than the defaults.
    pub custom: bool,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// Every organ's metrics as (organ, metric) pairs, for the add picker.
fn pairs() -> Vec<(Organ, Metric)> {
    Organ::ALL
        .into_iter()
        .flat_map(|o| o.metrics().iter().map(move |m| (o, *m)))
        .collect()
}

/// The targets.
#[component]
pub fn TargetsPanel(props: &TargetsPanelProps) -> Html {
    let chosen = use_state(|| 0usize);
    let onchoose = {
        let chosen = chosen.clone();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Ok(i) = key.parse::<usize>() {
                chosen.set(i);
            }
        })
    };
    let pick = pairs().get(*chosen).copied();
    let onadd = crate::components::picked(&props.onedit, move |_: MouseEvent| {
        pick.map(|(o, m)| Edit::AddTarget(o, m))
    });
    let ondefaults = props.onedit.reform(|_: MouseEvent| Edit::DefaultTargets);
    html! {
        <section class="panel" aria-labelledby="h-targets">
            <h2 id="h-targets">{ "Targets" }</h2>
            <p class="hint">
                if props.custom {
                    { "This case's own targets. " }
                } else {
                    { "Default targets from published guidance: starting points only. " }
                }
                { "Targets are patient-specific; the unit's protocol comes first." }
            </p>
            <details class="more" open={props.custom}>
                <summary>{ format!("Change, add or remove targets ({})", props.targets.len()) }</summary>
            <ul class="targets">
                { for props.targets.iter().enumerate().map(|(i, t)| html! {
                    <TargetRow index={i} target={t.clone()} notes={props.notes.clone()}
                        onedit={props.onedit.clone()} />
                }) }
            </ul>
            <div class="adder">
                <div class="field">
                    <label for="f-add-target">{ "Target to add" }</label>
                    <select id="f-add-target" onchange={onchoose}>
                        { for pairs().into_iter().enumerate().map(|(i, (o, m))| html! {
                            <option value={i.to_string()} selected={i == *chosen}>
                                { format!("{}: {}", o.label(), o.metric_label(m)) }
                            </option>
                        }) }
                    </select>
                </div>
                <button type="button" class="add" onclick={onadd}>{ "Add target" }</button>
                if props.custom {
                    <button type="button" class="add" onclick={ondefaults}>{ "Restore default targets" }</button>
                }
            </div>
            </details>
        </section>
    }
}

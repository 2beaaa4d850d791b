//! The other pressures: measured readings, assumed values, and the picker
//! to add one.

use std::collections::BTreeMap;
use std::rc::Rc;

use plumbline_core::reading::Quantity;
use yew::prelude::*;

use crate::components::assumed_card::AssumedCard;
use crate::components::quantity_select::QuantitySelect;
use crate::components::reading_card::ReadingCard;
use crate::form::{AssumedForm, Edit, ReadingForm};
use crate::notes::Notes;

/// Props of [`ReadingsPanel`].
#[derive(Properties, PartialEq)]
pub struct ReadingsPanelProps {
    /// The measured readings' boxes.
    pub readings: BTreeMap<Quantity, ReadingForm>,
    /// The assumed values' boxes.
    pub assumed: BTreeMap<Quantity, AssumedForm>,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// The other pressures.
#[component]
pub fn ReadingsPanel(props: &ReadingsPanelProps) -> Html {
    let chosen = use_state(|| Quantity::Icp);
    let onpick = {
        let chosen = chosen.clone();
        Callback::from(move |q: Quantity| chosen.set(q))
    };
    let add = |edit: fn(Quantity) -> Edit| {
        let q = *chosen;
        props.onedit.reform(move |_: MouseEvent| edit(q))
    };
    let has_reading = props.readings.contains_key(&*chosen);
    let has_assumed = props.assumed.contains_key(&*chosen);
    html! {
        <section class="panel" aria-labelledby="h-readings">
            <h3 id="h-readings">{ "Other pressures" }</h3>
            if props.readings.is_empty() && props.assumed.is_empty() {
                <p class="hint">{ "None entered." }</p>
            }
            { for props.readings.iter().map(|(q, r)| html! {
                <ReadingCard quantity={*q} reading={r.clone()} notes={props.notes.clone()}
                    onedit={props.onedit.clone()} />
            }) }
            { for props.assumed.iter().map(|(q, a)| html! {
                <AssumedCard quantity={*q} assumed={a.clone()} notes={props.notes.clone()}
                    onedit={props.onedit.clone()} />
            }) }
            <div class="adder">
                <QuantitySelect id="f-add-quantity" label="Pressure to add" chosen={*chosen} {onpick} />
                <button type="button" class="add" onclick={add(Edit::AddReading)} disabled={has_reading}>
                    { "Add measured" }
                </button>
                <button type="button" class="add" onclick={add(Edit::AddAssumed)} disabled={has_assumed}>
                    { "Add assumed" }
                </button>
            </div>
        </section>
    }
}

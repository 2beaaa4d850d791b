//! The other pressures: measured readings, assumed values, and the picker
//! to add one.

use plumbline_core::reading::Quantity;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::assumed_card::AssumedCard;
use crate::components::reading_card::ReadingCard;
use crate::form::Edit;
use crate::state::{Action, Handle};

/// Props of [`ReadingsPanel`].
#[derive(Properties, PartialEq)]
pub struct ReadingsPanelProps {
    /// The state.
    pub state: Handle,
}

/// The other pressures.
#[component]
pub fn ReadingsPanel(props: &ReadingsPanelProps) -> Html {
    let s = &props.state;
    let chosen = use_state(|| Quantity::Icp);
    let onchoose = {
        let chosen = chosen.clone();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(q) = Quantity::ALL.into_iter().find(|q| q.key() == key) {
                chosen.set(q);
            }
        })
    };
    let add = |edit: fn(Quantity) -> Edit| {
        let d = s.dispatcher();
        let q = *chosen;
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(edit(q))))
    };
    let has_reading = s.form.readings.contains_key(&*chosen);
    let has_assumed = s.form.assumed.contains_key(&*chosen);
    html! {
        <section class="panel" aria-labelledby="h-readings">
            <h3 id="h-readings">{ "Other pressures" }</h3>
            if s.form.readings.is_empty() && s.form.assumed.is_empty() {
                <p class="hint">{ "None entered." }</p>
            }
            { for s.form.readings.iter().map(|(q, r)| html! {
                <ReadingCard quantity={*q} reading={r.clone()} state={s.clone()} />
            }) }
            { for s.form.assumed.iter().map(|(q, a)| html! {
                <AssumedCard quantity={*q} assumed={a.clone()} state={s.clone()} />
            }) }
            <div class="adder">
                <div class="field">
                    <label for="f-add-quantity">{ "Pressure to add" }</label>
                    <select id="f-add-quantity" onchange={onchoose}>
                        { for Quantity::ALL.into_iter().map(|q| html! {
                            <option value={q.key()} selected={q == *chosen}>{ q.label() }</option>
                        }) }
                    </select>
                </div>
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

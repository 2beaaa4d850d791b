//! One measured pressure other than arterial: value, method and level.

use std::rc::Rc;

use plumbline_core::reading::{Method, Quantity};
use plumbline_core::usual::levels_for;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::level_picker::LevelPicker;
use crate::components::pressure_input::PressureInput;
use crate::form::{Edit, ReadingForm, ReadingPart, Slot};
use crate::notes::Notes;

/// Props of [`ReadingCard`].
#[derive(Properties, PartialEq)]
pub struct ReadingCardProps {
    /// Which pressure.
    pub quantity: Quantity,
    /// Its boxes.
    pub reading: ReadingForm,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// One measured reading.
#[component]
pub fn ReadingCard(props: &ReadingCardProps) -> Html {
    let q = props.quantity;
    let path = format!("readings.{q}");
    let method_id = format!("f-readings-{q}-method");
    let onmethod = crate::components::picked(&props.onedit, move |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        Method::ALL
            .into_iter()
            .find(|m| m.label() == key)
            .map(|m| Edit::ReadingMethod(q, m))
    });
    let onpick = props.onedit.reform(move |pick| Edit::ReadingLevel(q, pick));
    let onremove = props
        .onedit
        .reform(move |_: MouseEvent| Edit::RemoveReading(q));
    let value_path = format!("{path}.value");
    let accuracy_path = format!("{path}.accuracy");
    html! {
        <fieldset class="card" id={format!("f-readings-{q}")}>
            <legend>{ format!("{} (measured)", q.label()) }</legend>
            <div class="row">
                <PressureInput label={q.label()} path={value_path.clone()}
                    slot={Slot::Reading(q, ReadingPart::Value)} field={props.reading.value.clone()}
                    messages={props.notes.at(&value_path)} onedit={props.onedit.clone()} />
                <div class="field">
                    <label for={method_id.clone()}>{ "Method" }</label>
                    <select id={method_id} onchange={onmethod}>
                        { for Method::ALL.into_iter().map(|m| html! {
                            <option value={m.label()} selected={m == props.reading.method}>{ m.label() }</option>
                        }) }
                    </select>
                </div>
            </div>
            <LevelPicker path={format!("{path}.level")} level={props.reading.level.clone()}
                choices={levels_for(q)} height_slot={Slot::Reading(q, ReadingPart::LevelHeight)}
                onpick={onpick} notes={props.notes.clone()} onedit={props.onedit.clone()} />
            <details class="more" open={!props.reading.accuracy.text.trim().is_empty()
                || !props.notes.at(&accuracy_path).is_empty()}>
                <summary>{ "Accuracy (optional)" }</summary>
                <PressureInput label={format!("{} accuracy ±", q.label())} path={accuracy_path.clone()}
                    slot={Slot::Reading(q, ReadingPart::Accuracy)} field={props.reading.accuracy.clone()}
                    messages={props.notes.at(&accuracy_path)} onedit={props.onedit.clone()} />
            </details>
            <button type="button" class="remove" onclick={onremove}>
                { format!("Remove measured {}", q.label()) }
            </button>
        </fieldset>
    }
}

//! One measured pressure other than arterial: value, method and level.

use plumbline_core::reading::{Method, Quantity};
use plumbline_core::usual::levels_for;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::level_picker::LevelPicker;
use crate::components::pressure_input::PressureInput;
use crate::form::{Edit, LevelPick, ReadingForm, ReadingPart, Slot};
use crate::state::{Action, Handle};

/// Props of [`ReadingCard`].
#[derive(Properties, PartialEq)]
pub struct ReadingCardProps {
    /// Which pressure.
    pub quantity: Quantity,
    /// Its boxes.
    pub reading: ReadingForm,
    /// The state.
    pub state: Handle,
}

/// One measured reading.
#[component]
pub fn ReadingCard(props: &ReadingCardProps) -> Html {
    let s = &props.state;
    let q = props.quantity;
    let path = format!("readings.{q}");
    let method_id = format!("f-readings-{q}-method");
    let onmethod = {
        let d = s.dispatcher();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(m) = Method::ALL.into_iter().find(|m| m.label() == key) {
                d.dispatch(Action::Edit(Edit::ReadingMethod(q, m)));
            }
        })
    };
    let onpick = {
        let d = s.dispatcher();
        Callback::from(move |pick: LevelPick| d.dispatch(Action::Edit(Edit::ReadingLevel(q, pick))))
    };
    let onremove = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::RemoveReading(q))))
    };
    let value_path = format!("{path}.value");
    let accuracy_path = format!("{path}.accuracy");
    html! {
        <fieldset class="card" id={format!("f-readings-{q}")}>
            <legend>{ format!("{} (measured)", q.label()) }</legend>
            <div class="row">
                <PressureInput label={q.label()} path={value_path.clone()}
                    slot={Slot::Reading(q, ReadingPart::Value)} field={props.reading.value.clone()}
                    messages={s.messages(&value_path)} dispatch={s.dispatcher()} />
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
                onpick={onpick} state={s.clone()} dispatch={s.dispatcher()} />
            <details class="more" open={!props.reading.accuracy.text.trim().is_empty()
                || !s.messages(&accuracy_path).is_empty()}>
                <summary>{ "Accuracy (optional)" }</summary>
                <PressureInput label={format!("{} accuracy ±", q.label())} path={accuracy_path.clone()}
                    slot={Slot::Reading(q, ReadingPart::Accuracy)} field={props.reading.accuracy.clone()}
                    messages={s.messages(&accuracy_path)} dispatch={s.dispatcher()} />
            </details>
            <button type="button" class="remove" onclick={onremove}>
                { format!("Remove measured {}", q.label()) }
            </button>
        </fieldset>
    }
}

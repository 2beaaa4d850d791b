//! A number box with a unit switch beside it and the core's messages about
//! it: the part pressure and length boxes share.

use web_sys::{HtmlInputElement, HtmlSelectElement};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::form::{Edit, Slot};
use crate::show::dom_id;
use crate::state::Message;

/// Props of [`UnitInput`].
#[derive(Properties, PartialEq)]
pub struct UnitInputProps {
    /// The visible label.
    pub label: AttrValue,
    /// The box's path in the case document.
    pub path: AttrValue,
    /// Which box it is.
    pub slot: Slot,
    /// The text in the box.
    pub text: AttrValue,
    /// The symbol of the unit chosen.
    pub unit: &'static str,
    /// The symbols the switch offers.
    pub units: Vec<&'static str>,
    /// Called with the symbol chosen in the switch.
    pub on_unit: Callback<String>,
    /// The on-screen keyboard to ask for (`decimal`, `text`).
    pub inputmode: &'static str,
    /// The core's messages about it.
    pub messages: Vec<Message>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
    /// What an empty box means.
    #[prop_or_default]
    pub placeholder: Option<AttrValue>,
    /// The element id, when the box is shown twice (the quick path's copy);
    /// else one made from the path.
    #[prop_or_default]
    pub id: Option<AttrValue>,
}

/// A number box with its unit switch.
#[component]
pub fn UnitInput(props: &UnitInputProps) -> Html {
    let id = props
        .id
        .as_ref()
        .map_or_else(|| dom_id(&props.path), |id| id.to_string());
    let msg_id = format!("{id}-msg");
    let slot = props.slot;
    let oninput = props.onedit.reform(move |e: InputEvent| {
        Edit::Text(slot, e.target_unchecked_into::<HtmlInputElement>().value())
    });
    let onchange = props
        .on_unit
        .reform(|e: Event| e.target_unchecked_into::<HtmlSelectElement>().value());
    let invalid = props
        .messages
        .iter()
        .any(|m| matches!(m, Message::Error(_)));
    html! {
        <div class={classes!("field", invalid.then_some("field-invalid"))}>
            <label for={id.clone()}>{ &props.label }</label>
            <div class="entry">
                <input id={id.clone()} type="text" inputmode={props.inputmode} autocomplete="off"
                    spellcheck="false"
                    value={props.text.clone()} {oninput} placeholder={props.placeholder.clone()}
                    aria-invalid={if invalid { "true" } else { "false" }}
                    aria-describedby={(!props.messages.is_empty()).then(|| msg_id.clone())} />
                <select id={format!("{id}-unit")} class="unit"
                    aria-label={format!("{} unit", props.label)} {onchange}>
                    { for props.units.iter().map(|u| html! {
                        <option value={*u} selected={*u == props.unit}>{ *u }</option>
                    }) }
                </select>
            </div>
            <FieldMessages id={msg_id} messages={props.messages.clone()} />
        </div>
    }
}

//! A length box: the number as typed, its unit beside it, and the core's
//! messages about it.

use plumbline_core::units::LengthUnit;
use web_sys::{HtmlInputElement, HtmlSelectElement};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::fields::LengthText;
use crate::form::{Edit, Slot};
use crate::show::dom_id;
use crate::state::{Action, Dispatch, Message};

/// Props of [`LengthInput`].
#[derive(Properties, PartialEq)]
pub struct LengthInputProps {
    /// The visible label.
    pub label: AttrValue,
    /// The box's path in the case document.
    pub path: AttrValue,
    /// Which box it is.
    pub slot: Slot,
    /// Its content.
    pub field: LengthText,
    /// The core's messages about it.
    pub messages: Vec<Message>,
    /// Where changes go.
    pub dispatch: Dispatch,
}

/// A length box with its unit switch.
#[component]
pub fn LengthInput(props: &LengthInputProps) -> Html {
    let id = dom_id(&props.path);
    let msg_id = format!("{id}-msg");
    let slot = props.slot;
    let oninput = {
        let d = props.dispatch.clone();
        Callback::from(move |e: InputEvent| {
            let text = e.target_unchecked_into::<HtmlInputElement>().value();
            d.dispatch(Action::Edit(Edit::Text(slot, text)));
        })
    };
    let onchange = {
        let d = props.dispatch.clone();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(unit) = LengthUnit::ALL.into_iter().find(|u| u.symbol() == key) {
                d.dispatch(Action::Edit(Edit::LengthUnit(slot, unit)));
            }
        })
    };
    let invalid = props
        .messages
        .iter()
        .any(|m| matches!(m, Message::Error(_)));
    html! {
        <div class={classes!("field", invalid.then_some("field-invalid"))}>
            <label for={id.clone()}>{ &props.label }</label>
            <div class="entry">
                <input id={id.clone()} type="text" inputmode="text" autocomplete="off"
                    spellcheck="false"
                    value={props.field.text.clone()} {oninput}
                    aria-invalid={if invalid { "true" } else { "false" }}
                    aria-describedby={(!props.messages.is_empty()).then(|| msg_id.clone())} />
                <select id={format!("{id}-unit")} class="unit"
                    aria-label={format!("{} unit", props.label)} {onchange}>
                    { for LengthUnit::ALL.into_iter().map(|u| html! {
                        <option value={u.symbol()} selected={u == props.field.unit}>{ u.symbol() }</option>
                    }) }
                </select>
            </div>
            <FieldMessages id={msg_id} messages={props.messages.clone()} />
        </div>
    }
}

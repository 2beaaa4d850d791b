//! A length box: the number as typed, its unit beside it, and the core's
//! messages about it.

use plumbline_core::units::LengthUnit;
use yew::prelude::*;

use crate::components::unit_input::UnitInput;
use crate::fields::LengthText;
use crate::form::{Edit, Slot};
use crate::state::Message;

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
    pub onedit: Callback<Edit>,
    /// What an empty box means.
    #[prop_or_default]
    pub placeholder: Option<AttrValue>,
}

/// A length box with its unit switch.
#[component]
pub fn LengthInput(props: &LengthInputProps) -> Html {
    let slot = props.slot;
    let on_unit = crate::components::picked(&props.onedit, move |symbol: String| {
        LengthUnit::ALL
            .into_iter()
            .find(|u| u.symbol() == symbol)
            .map(|u| Edit::LengthUnit(slot, u))
    });
    html! {
        <UnitInput label={props.label.clone()} path={props.path.clone()} slot={props.slot}
            text={AttrValue::from(props.field.text.clone())}
            unit={props.field.unit.symbol()}
            units={LengthUnit::ALL.map(LengthUnit::symbol).to_vec()}
            {on_unit} inputmode="text"
            messages={props.messages.clone()} onedit={props.onedit.clone()}
            placeholder={props.placeholder.clone()} />
    }
}

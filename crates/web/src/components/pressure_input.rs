//! A pressure box: the number as typed, its unit beside it, and the core's
//! messages about it.

use plumbline_core::units::PressureUnit;
use yew::prelude::*;

use crate::components::unit_input::UnitInput;
use crate::fields::PressureText;
use crate::form::{Edit, Slot};
use crate::state::Message;

/// Props of [`PressureInput`].
#[derive(Properties, PartialEq)]
pub struct PressureInputProps {
    /// The visible label.
    pub label: AttrValue,
    /// The box's path in the case document.
    pub path: AttrValue,
    /// Which box it is.
    pub slot: Slot,
    /// Its content.
    pub field: PressureText,
    /// The core's messages about it.
    pub messages: Vec<Message>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
    /// What an empty box means.
    #[prop_or_default]
    pub placeholder: Option<AttrValue>,
    /// The element id, when the box is shown twice.
    #[prop_or_default]
    pub id: Option<AttrValue>,
}

/// A pressure box with its unit switch.
#[component]
pub fn PressureInput(props: &PressureInputProps) -> Html {
    let slot = props.slot;
    let on_unit = crate::components::picked(&props.onedit, move |symbol: String| {
        PressureUnit::ALL
            .into_iter()
            .find(|u| u.symbol() == symbol)
            .map(|u| Edit::PressureUnit(slot, u))
    });
    html! {
        <UnitInput label={props.label.clone()} path={props.path.clone()} slot={props.slot}
            text={AttrValue::from(props.field.text.clone())}
            unit={props.field.unit.symbol()}
            units={PressureUnit::ALL.map(PressureUnit::symbol).to_vec()}
            {on_unit} inputmode="decimal"
            messages={props.messages.clone()} onedit={props.onedit.clone()}
            placeholder={props.placeholder.clone()} id={props.id.clone()} />
    }
}

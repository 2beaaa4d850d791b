//! A pressure box: the number as typed, its unit beside it, and the core's
//! messages about it.

use plumbline_core::units::PressureUnit;
use yew::prelude::*;

use crate::components::unit_input::UnitInput;
use crate::fields::PressureText;
use crate::form::{Edit, Slot};
use crate::state::{Action, Dispatch, Message};

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
    pub dispatch: Dispatch,
}

/// A pressure box with its unit switch.
#[component]
pub fn PressureInput(props: &PressureInputProps) -> Html {
    let on_unit = {
        let (d, slot) = (props.dispatch.clone(), props.slot);
        Callback::from(move |symbol: String| {
            if let Some(u) = PressureUnit::ALL.into_iter().find(|u| u.symbol() == symbol) {
                d.dispatch(Action::Edit(Edit::PressureUnit(slot, u)));
            }
        })
    };
    html! {
        <UnitInput label={props.label.clone()} path={props.path.clone()} slot={props.slot}
            text={AttrValue::from(props.field.text.clone())}
            unit={props.field.unit.symbol()}
            units={PressureUnit::ALL.map(PressureUnit::symbol).to_vec()}
            {on_unit} inputmode="decimal"
            messages={props.messages.clone()} dispatch={props.dispatch.clone()} />
    }
}

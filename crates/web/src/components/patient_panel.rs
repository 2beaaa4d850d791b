//! The patient's size: body height (for the geometry) and haematocrit
//! (for blood density). Nothing that identifies the patient is asked for.

use yew::prelude::*;

use crate::components::length_input::LengthInput;
use crate::components::plain_input::PlainInput;
use crate::form::Slot;
use crate::state::Handle;

/// Props of [`PatientPanel`].
#[derive(Properties, PartialEq)]
pub struct PatientPanelProps {
    /// The state.
    pub state: Handle,
}

/// The patient's size.
#[component]
pub fn PatientPanel(props: &PatientPanelProps) -> Html {
    let s = &props.state;
    html! {
        <fieldset class="group" id="f-patient">
            <legend>{ "Patient size" }</legend>
            <div class="row">
                <LengthInput label="Body height" path="patient.height" slot={Slot::Height}
                    field={s.form.height.clone()} messages={s.messages("patient.height")}
                    dispatch={s.dispatcher()} />
                <PlainInput label="Haematocrit (optional)" path="patient.haematocrit_percent"
                    slot={Slot::Haematocrit} text={s.form.haematocrit.clone()}
                    messages={s.messages("patient.haematocrit_percent")}
                    inputmode="decimal" suffix="%" placeholder="not given"
                    dispatch={s.dispatcher()} />
            </div>
        </fieldset>
    }
}

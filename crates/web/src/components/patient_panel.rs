//! The patient's blood: haematocrit, for blood density. Nothing that
//! identifies the patient is asked for; the body height is in the quick
//! path.

use std::rc::Rc;

use yew::prelude::*;

use crate::components::plain_input::PlainInput;
use crate::form::{Edit, Slot};
use crate::notes::Notes;

/// Props of [`PatientPanel`].
#[derive(Properties, PartialEq)]
pub struct PatientPanelProps {
    /// The haematocrit as typed.
    pub haematocrit: AttrValue,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// The haematocrit.
#[component]
pub fn PatientPanel(props: &PatientPanelProps) -> Html {
    html! {
        <PlainInput label="Haematocrit (optional)" path="patient.haematocrit_percent"
            slot={Slot::Haematocrit} text={props.haematocrit.clone()}
            messages={props.notes.at("patient.haematocrit_percent")}
            inputmode="decimal" suffix="%" placeholder="not given"
            onedit={props.onedit.clone()} />
    }
}

//! The quick path's first step: the posture with its usual angles (the one
//! that matters most shown, typed, stepped or measured with the device),
//! and the body height the geometry needs.

use std::rc::Rc;

use plumbline_core::geometry::Posture;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::angle_input::AngleInput;
use crate::components::device_level::DeviceLevel;
use crate::components::field_messages::FieldMessages;
use crate::components::length_input::LengthInput;
use crate::fields::{number, number_text, LengthText};
use crate::form::{AngleKey, Edit, PositionForm, Slot};
use crate::notes::{Message, Notes};

/// Props of [`QuickPosition`].
#[derive(Properties, PartialEq)]
pub struct QuickPositionProps {
    /// The position's boxes.
    pub position: PositionForm,
    /// The body height box.
    pub height: LengthText,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

fn posture_key(p: Posture) -> String {
    Posture::ALL
        .iter()
        .position(|q| *q == p)
        .map(|i| i.to_string())
        .unwrap_or_default()
}

/// The posture, its main angle and the body height.
#[component]
pub fn QuickPosition(props: &QuickPositionProps) -> Html {
    let position = &props.position;
    let onposture = props.onedit.reform(|e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        Edit::Posture(
            key.parse::<usize>()
                .ok()
                .and_then(|i| Posture::ALL.get(i).copied()),
        )
    });
    let main = position.main_angle();
    let tilt = match number(position.angle(AngleKey::Tilt)) {
        Ok(Some(v)) => v,
        _ => position.preset(AngleKey::Tilt).unwrap_or_default(),
    };
    let onmeasure = |key: AngleKey| {
        props.onedit.reform(move |deg: f64| match key {
            AngleKey::Backrest => Edit::MeasuredBackrest(deg),
            _ => Edit::Text(Slot::Angle(key), number_text(deg)),
        })
    };
    let measured = position.measured && !position.angle(AngleKey::Backrest).is_empty();
    // An empty angle box says "usual, assumed" in itself; the core's warning
    // of it is listed with the others, which keeps the quick path short.
    let angle_messages = |key: AngleKey| {
        let mut messages = props.notes.at(&key.path());
        if position.angle(key).is_empty() {
            messages.retain(|m| !matches!(m, Message::Warning(_)));
        }
        messages
    };
    html! {
        <fieldset class="group quick-position" id="f-position">
            <legend>{ "Position and size" }</legend>
            <div class="field">
                <label for="f-position-posture">{ "Posture" }</label>
                <select id="f-position-posture" onchange={onposture}>
                    <option value="none" selected={position.posture.is_none()}>{ "not given" }</option>
                    { for Posture::ALL.iter().map(|p| html! {
                        <option value={posture_key(*p)} selected={position.posture == Some(*p)}>
                            { p.label() }
                        </option>
                    }) }
                </select>
                <FieldMessages id="f-position-msg" messages={props.notes.at("position")} />
            </div>
            if let Some(key) = main {
                <AngleInput angle={key} text={position.angle(key).to_owned()}
                    preset={position.preset(key).map(|v| AttrValue::from(number_text(v)))}
                    messages={angle_messages(key)} onedit={props.onedit.clone()} />
                if key == AngleKey::Backrest && measured {
                    <p class="measured-note">{ "Measured with the device: counted as ±2° in the ranges." }</p>
                }
                <DeviceLevel angle={key} tilt_deg={tilt} onmeasure={onmeasure(key)} />
            }
            <LengthInput label="Body height" path="patient.height" slot={Slot::Height}
                field={props.height.clone()} messages={props.notes.at("patient.height")}
                placeholder="not given: assumed" onedit={props.onedit.clone()} />
        </fieldset>
    }
}

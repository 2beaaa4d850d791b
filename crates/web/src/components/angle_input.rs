//! An angle box: typed, or stepped by 5° with the arrow keys (the −5/+5
//! buttons are for touch and stay out of the tab order, so the keyboard
//! crosses a position in one stop per angle).

use yew::prelude::*;

use crate::components::plain_input::PlainInput;
use crate::form::{AngleKey, Edit, Slot};
use crate::state::Message;

/// Props of [`AngleInput`].
#[derive(Properties, PartialEq)]
pub struct AngleInputProps {
    /// Which angle of the position.
    pub angle: AngleKey,
    /// Its text as typed; empty for the posture's preset.
    pub text: AttrValue,
    /// The posture's preset, shown in an empty box as the usual angle the
    /// check then uses, so an empty box never reads as zero or as typed.
    pub preset: Option<AttrValue>,
    /// The messages about it.
    pub messages: Vec<Message>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
    /// Anything after the steppers (the device level).
    #[prop_or_default]
    pub children: Html,
}

/// An angle box with its steppers.
#[component]
pub fn AngleInput(props: &AngleInputProps) -> Html {
    let key = props.angle;
    let step = |delta: f64| {
        props
            .onedit
            .reform(move |_: MouseEvent| Edit::Step(key, delta))
    };
    let onkeydown = crate::components::picked(&props.onedit, move |e: KeyboardEvent| {
        let delta = match e.key().as_str() {
            "ArrowUp" => 5.0,
            "ArrowDown" => -5.0,
            _ => return None,
        };
        e.prevent_default();
        Some(Edit::Step(key, delta))
    });
    let usual = props
        .preset
        .as_ref()
        .map(|p| AttrValue::from(format!("{p} (usual, assumed)")));
    html! {
        <PlainInput label={key.label()} path={key.path()} slot={Slot::Angle(key)}
            text={props.text.clone()} messages={props.messages.clone()}
            inputmode={if key.signed() { "text" } else { "decimal" }} suffix="°"
            placeholder={usual} onedit={props.onedit.clone()}
            onkeydown={onkeydown} keys="ArrowUp ArrowDown">
            <button type="button" class="step" tabindex="-1" onclick={step(-5.0)}
                aria-label={format!("{} 5 degrees less", key.label())}>{ "−5" }</button>
            <button type="button" class="step" tabindex="-1" onclick={step(5.0)}
                aria-label={format!("{} 5 degrees more", key.label())}>{ "+5" }</button>
            { props.children.clone() }
        </PlainInput>
    }
}

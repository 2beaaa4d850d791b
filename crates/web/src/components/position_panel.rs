//! The position picker: posture, the angles it sets (each can be typed or
//! stepped), and where each arm is.

use plumbline_core::geometry::{Lie, Posture};
use plumbline_core::landmark::Side;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::plain_input::PlainInput;
use crate::fields::number_text;
use crate::form::{AngleKey, ArmChoice, ArmForm, Edit, Joint, Slot};
use crate::state::{Action, Handle};

/// Props of [`PositionPanel`].
#[derive(Properties, PartialEq)]
pub struct PositionPanelProps {
    /// The state.
    pub state: Handle,
}

fn posture_key(p: Posture) -> String {
    Posture::ALL
        .iter()
        .position(|q| *q == p)
        .map(|i| i.to_string())
        .unwrap_or_default()
}

fn arm(state: &Handle, side: Side, form: &ArmForm) -> Html {
    let (name, path) = match side {
        Side::Left => ("Left arm", "position.left_arm"),
        Side::Right => ("Right arm", "position.right_arm"),
    };
    let id = format!("f-{}", path.replace('.', "-"));
    let onchange = {
        let d = state.dispatcher();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            let choice = key
                .parse::<usize>()
                .ok()
                .and_then(|i| ArmChoice::ALL.get(i).copied());
            if let Some(choice) = choice {
                d.dispatch(Action::Edit(Edit::Arm(side, choice)));
            }
        })
    };
    let joint = |joint: Joint, label: &'static str, text: &str| {
        let key = match joint {
            Joint::Shoulder => "shoulder_flexion_deg",
            Joint::Elbow => "elbow_flexion_deg",
        };
        let p = format!("{path}.angles.{key}");
        html! {
            <PlainInput label={format!("{name}: {label}")} path={p.clone()}
                slot={Slot::ArmAngle(side, joint)} text={text.to_owned()}
                messages={state.messages(&p)} inputmode="decimal" suffix="°"
                dispatch={state.dispatcher()} />
        }
    };
    html! {
        <div class="arm">
            <div class="field">
                <label for={id.clone()}>{ name }</label>
                <select id={id} {onchange}>
                    { for ArmChoice::ALL.iter().enumerate().map(|(i, c)| html! {
                        <option value={i.to_string()} selected={*c == form.choice}>{ c.label() }</option>
                    }) }
                </select>
                <FieldMessages id={format!("f-{}-msg", path.replace('.', "-"))}
                    messages={state.messages(path)} />
            </div>
            if form.choice == ArmChoice::Angles {
                <div class="row">
                    { joint(Joint::Shoulder, "shoulder flexion", &form.shoulder) }
                    { joint(Joint::Elbow, "elbow flexion", &form.elbow) }
                </div>
            }
        </div>
    }
}

/// The position picker.
#[component]
pub fn PositionPanel(props: &PositionPanelProps) -> Html {
    let s = &props.state;
    let position = &s.form.position;
    let onposture = {
        let d = s.dispatcher();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            let posture = key
                .parse::<usize>()
                .ok()
                .and_then(|i| Posture::ALL.get(i).copied());
            d.dispatch(Action::Edit(Edit::Posture(posture)));
        })
    };
    let on_back = position.posture.is_none_or(|p| p.lie() == Lie::FaceUp);
    let angle = |key: AngleKey| {
        let path = key.path();
        let step = |delta: f64| {
            let d = s.dispatcher();
            Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::Step(key, delta))))
        };
        let placeholder = position.preset(key).map(number_text);
        html! {
            <PlainInput label={key.label()} path={path.clone()} slot={Slot::Angle(key)}
                text={position.angle(key).to_owned()} messages={s.messages(&path)}
                inputmode={if key.signed() { "text" } else { "decimal" }} suffix="°"
                placeholder={placeholder}
                dispatch={s.dispatcher()}>
                <button type="button" class="step" onclick={step(-5.0)}
                    aria-label={format!("{} 5 degrees less", key.label())}>{ "−5" }</button>
                <button type="button" class="step" onclick={step(5.0)}
                    aria-label={format!("{} 5 degrees more", key.label())}>{ "+5" }</button>
            </PlainInput>
        }
    };
    html! {
        <fieldset class="group" id="f-position">
            <legend>{ "Position" }</legend>
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
                <FieldMessages id="f-position-msg" messages={s.messages("position")} />
            </div>
            if position.posture.is_some() {
                <p class="hint">{ "Grey numbers are the posture's presets; type to override, or step by 5°." }</p>
                <div class="angles">
                    { for AngleKey::ALL.into_iter()
                        .filter(|k| on_back || *k != AngleKey::Backrest)
                        .map(angle) }
                </div>
                <div class="row">
                    { arm(s, Side::Left, &position.left) }
                    { arm(s, Side::Right, &position.right) }
                </div>
            }
        </fieldset>
    }
}

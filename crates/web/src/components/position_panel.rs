//! The position in detail: every angle the posture sets besides the one
//! the quick path shows (each typed, or stepped with the arrow keys), and
//! where each arm is.

use std::rc::Rc;

use plumbline_core::landmark::Side;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::angle_input::AngleInput;
use crate::components::field_messages::FieldMessages;
use crate::components::plain_input::PlainInput;
use crate::fields::number_text;
use crate::form::{AngleKey, ArmChoice, ArmForm, Edit, Joint, PositionForm, Slot};
use crate::notes::Notes;

/// Props of [`PositionPanel`].
#[derive(Properties, PartialEq)]
pub struct PositionPanelProps {
    /// The position's boxes.
    pub position: PositionForm,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

fn arm(props: &PositionPanelProps, side: Side, form: &ArmForm) -> Html {
    let (name, path) = match side {
        Side::Left => ("Left arm", "position.left_arm"),
        Side::Right => ("Right arm", "position.right_arm"),
    };
    let id = format!("f-{}", path.replace('.', "-"));
    let onchange = crate::components::picked(&props.onedit, move |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        let choice = key
            .parse::<usize>()
            .ok()
            .and_then(|i| ArmChoice::ALL.get(i).copied());
        choice.map(|c| Edit::Arm(side, c))
    });
    let joint = |joint: Joint, label: &'static str, text: &str| {
        let key = match joint {
            Joint::Shoulder => "shoulder_flexion_deg",
            Joint::Elbow => "elbow_flexion_deg",
        };
        let p = format!("{path}.angles.{key}");
        html! {
            <PlainInput label={format!("{name}: {label}")} path={p.clone()}
                slot={Slot::ArmAngle(side, joint)} text={text.to_owned()}
                messages={props.notes.at(&p)} inputmode="decimal" suffix="°"
                onedit={props.onedit.clone()} />
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
                    messages={props.notes.at(path)} />
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

/// The position in detail.
#[component]
pub fn PositionPanel(props: &PositionPanelProps) -> Html {
    let position = &props.position;
    if position.posture.is_none() {
        return html! { <p class="hint">{ "Choose a posture first." }</p> };
    }
    let on_back = position
        .posture
        .is_some_and(|p| p.lie() == plumbline_core::geometry::Lie::FaceUp);
    let main = position.main_angle();
    html! {
        <div class="position-detail" id="f-position-detail">
            <p class="hint">{ "Grey numbers are the posture's presets: type to override, or step by 5° with the arrow keys." }</p>
            <div class="angles">
                { for AngleKey::ALL.into_iter()
                    .filter(|k| Some(*k) != main && (on_back || *k != AngleKey::Backrest))
                    .map(|k| html! {
                        <AngleInput angle={k} text={position.angle(k).to_owned()}
                            preset={position.preset(k).map(|v| AttrValue::from(number_text(v)))}
                            messages={props.notes.at(&k.path())} onedit={props.onedit.clone()} />
                    }) }
            </div>
            <div class="row">
                { arm(props, Side::Left, &position.left) }
                { arm(props, Side::Right, &position.right) }
            </div>
        </div>
    }
}

//! The patient's baseline blood pressure, with where and how it was taken
//! and the position the patient was in: what targets relative to baseline
//! are measured against, brought to each organ's height by the core.

use std::rc::Rc;

use plumbline_core::geometry::{Lie, Posture};
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::plain_input::PlainInput;
use crate::components::site_select::SiteSelect;
use crate::form::{AngleKey, BaselineForm, BaselinePart, Edit, LevelPick, Slot};
use crate::notes::Notes;
use crate::state::Message;

/// Props of [`BaselinePanel`].
#[derive(Properties, PartialEq)]
pub struct BaselinePanelProps {
    /// The baseline's boxes, when one is entered.
    pub baseline: Option<BaselineForm>,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// The baseline.
#[component]
pub fn BaselinePanel(props: &BaselinePanelProps) -> Html {
    let Some(b) = &props.baseline else {
        return html! {
            <div class="baseline" id="f-baseline">
                <p class="hint">{ "Targets relative to baseline (a percentage of it) need the patient's usual blood pressure." }</p>
                <button type="button" class="add" onclick={props.onedit.reform(|_: MouseEvent| Edit::AddBaseline)}>
                    { "Add the baseline" }
                </button>
            </div>
        };
    };
    let site = match b.level.pick {
        LevelPick::At(l) => crate::form::sites()
            .into_iter()
            .find(|s| *s == (b.method, l)),
        _ => None,
    };
    let onposture = props.onedit.reform(|e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        Edit::BaselinePosture(
            key.parse::<usize>()
                .ok()
                .and_then(|i| Posture::ALL.get(i).copied()),
        )
    });
    let posture = b.position.posture;
    let on_back = posture.is_some_and(|p| p.lie() == Lie::FaceUp);
    let messages: Vec<Message> = [
        "baseline",
        "baseline.blood_pressure",
        "baseline.systolic",
        "baseline.diastolic",
        "baseline.mean",
        "baseline.level",
        "baseline.position",
    ]
    .iter()
    .flat_map(|p| props.notes.at(p))
    .collect();
    let angle_path = AngleKey::Backrest.path_in("baseline.position");
    html! {
        <div class="baseline" id="f-baseline">
            <div class="row">
                <SiteSelect id="f-baseline-site" label="Baseline taken with" site={site}
                    onpick={props.onedit.reform(|(m, l)| Edit::BaselineSite(m, l))} />
                <PlainInput label="Baseline blood pressure" path="baseline.blood_pressure"
                    slot={Slot::Baseline(BaselinePart::BloodPressure)} text={b.pressures.text()}
                    messages={Vec::new()} placeholder="sys/dia (mean), e.g. 130/80"
                    onedit={props.onedit.clone()} />
            </div>
            <FieldMessages id="f-baseline-msg" messages={messages} />
            <div class="row">
                <div class="field">
                    <label for="f-baseline-posture">{ "Position it was taken in" }</label>
                    <select id="f-baseline-posture" onchange={onposture}>
                        <option value="none" selected={posture.is_none()}>{ "not given" }</option>
                        { for Posture::ALL.iter().enumerate().map(|(i, p)| html! {
                            <option value={i.to_string()} selected={posture == Some(*p)}>{ p.label() }</option>
                        }) }
                    </select>
                </div>
                if on_back {
                    <PlainInput label="Its backrest angle" path={angle_path.clone()}
                        slot={Slot::Baseline(BaselinePart::Angle(AngleKey::Backrest))}
                        text={b.position.angle(AngleKey::Backrest).to_owned()}
                        placeholder={b.position.preset(AngleKey::Backrest).map(|v| AttrValue::from(v.to_string()))}
                        messages={props.notes.at(&angle_path)} inputmode="decimal" suffix="°"
                        onedit={props.onedit.clone()} />
                }
            </div>
            <button type="button" class="remove" onclick={props.onedit.reform(|_: MouseEvent| Edit::RemoveBaseline)}>
                { "Remove the baseline" }
            </button>
        </div>
    }
}

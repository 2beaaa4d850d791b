//! Where a reading refers to: a landmark, a measured height above the
//! heart reference, or (for assumed values) the usual reference.

use plumbline_core::landmark::Landmark;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::length_input::LengthInput;
use crate::form::{Edit, LevelForm, LevelPick, Slot};
use crate::notes::Notes;
use crate::show::dom_id;
use crate::state::Message;

/// Props of [`LevelPicker`].
#[derive(Properties, PartialEq)]
pub struct LevelPickerProps {
    /// The level's path in the case document (`readings.icp.level`).
    pub path: AttrValue,
    /// The level.
    pub level: LevelForm,
    /// The landmarks offered.
    pub choices: Vec<Landmark>,
    /// Whether "the usual reference" is offered, and its words.
    #[prop_or_default]
    pub usual: Option<AttrValue>,
    /// The height box, for a measured height.
    pub height_slot: Slot,
    /// Sends the pick.
    pub onpick: Callback<LevelPick>,
    /// The messages of the check.
    pub notes: std::rc::Rc<Notes>,
    /// Where changes to the height box go.
    pub onedit: Callback<Edit>,
}

const USUAL: &str = "usual";
const HEIGHT: &str = "height";

/// The level picker.
#[component]
pub fn LevelPicker(props: &LevelPickerProps) -> Html {
    let id = dom_id(&props.path);
    let msg_id = format!("{id}-msg");
    let onchange = {
        let onpick = props.onpick.clone();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            let pick = match key.as_str() {
                USUAL => Some(LevelPick::Usual),
                HEIGHT => Some(LevelPick::Height),
                other => Landmark::ALL
                    .into_iter()
                    .find(|l| l.key() == other)
                    .map(LevelPick::At),
            };
            if let Some(pick) = pick {
                onpick.emit(pick);
            }
        })
    };
    let messages: Vec<Message> = props.notes.at(&props.path);
    let pick = props.level.pick;
    html! {
        <>
            <div class="field">
                <label for={id.clone()}>{ "Level (where it reads)" }</label>
                <select id={id.clone()} {onchange}
                    aria-describedby={(!messages.is_empty()).then(|| msg_id.clone())}>
                    if let Some(words) = &props.usual {
                        <option value={USUAL} selected={pick == LevelPick::Usual}>{ words }</option>
                    }
                    { for props.choices.iter().map(|l| html! {
                        <option value={l.key()} selected={pick == LevelPick::At(*l)}>{ l.label() }</option>
                    }) }
                    <option value={HEIGHT} selected={pick == LevelPick::Height}>
                        { "a measured height above the heart reference" }
                    </option>
                </select>
                <FieldMessages id={msg_id} messages={messages} />
            </div>
            if pick == LevelPick::Height {
                <LengthInput label="Height above the heart reference (negative below)"
                    path={format!("{}.height", props.path)}
                    slot={props.height_slot} field={props.level.height.clone()}
                    messages={props.notes.at(&format!("{}.height", props.path))}
                    onedit={props.onedit.clone()} />
            }
        </>
    }
}

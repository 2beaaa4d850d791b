//! A plain box: a label, text as typed (an angle, a percentage, a short
//! name), and the messages about it.

use web_sys::{HtmlInputElement, HtmlTextAreaElement};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::form::{Edit, Slot};
use crate::show::dom_id;
use crate::state::Message;

/// Props of [`PlainInput`].
#[derive(Properties, PartialEq)]
pub struct PlainInputProps {
    /// The visible label.
    pub label: AttrValue,
    /// The box's path in the case document.
    pub path: AttrValue,
    /// Which box it is.
    pub slot: Slot,
    /// Its text.
    pub text: AttrValue,
    /// The core's messages about it.
    pub messages: Vec<Message>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
    /// The keyboard to offer (`decimal`, `text`).
    #[prop_or(AttrValue::Static("text"))]
    pub inputmode: AttrValue,
    /// What an empty box means.
    #[prop_or_default]
    pub placeholder: Option<AttrValue>,
    /// A unit written after the box (°, %).
    #[prop_or_default]
    pub suffix: Option<AttrValue>,
    /// The longest text accepted.
    #[prop_or_default]
    pub maxlength: Option<usize>,
    /// A box of several lines that wraps long text (a guideline's name).
    #[prop_or_default]
    pub multiline: bool,
    /// Keys pressed in the box (arrow keys stepping an angle).
    #[prop_or_default]
    pub onkeydown: Option<Callback<KeyboardEvent>>,
    /// What the arrow keys do, for assistive technology.
    #[prop_or_default]
    pub keys: Option<AttrValue>,
    /// Extra content after the box (± buttons).
    #[prop_or_default]
    pub children: Html,
}

/// A plain box.
#[component]
pub fn PlainInput(props: &PlainInputProps) -> Html {
    let id = dom_id(&props.path);
    let msg_id = format!("{id}-msg");
    let slot = props.slot;
    let multiline = props.multiline;
    let oninput = props.onedit.reform(move |e: InputEvent| {
        let text = if multiline {
            e.target_unchecked_into::<HtmlTextAreaElement>().value()
        } else {
            e.target_unchecked_into::<HtmlInputElement>().value()
        };
        Edit::Text(slot, text)
    });
    let invalid = props
        .messages
        .iter()
        .any(|m| matches!(m, Message::Error(_)));
    html! {
        <div class={classes!("field", invalid.then_some("field-invalid"))}>
            <label for={id.clone()}>{ &props.label }</label>
            <div class="entry">
                if multiline {
                    <textarea id={id.clone()} rows="2" spellcheck="false"
                        value={props.text.clone()} oninput={oninput.clone()}
                        placeholder={props.placeholder.clone()}
                        maxlength={props.maxlength.map(|m| m.to_string())}
                        aria-invalid={if invalid { "true" } else { "false" }}
                        aria-describedby={(!props.messages.is_empty()).then(|| msg_id.clone())} />
                } else {
                    <input id={id.clone()} type="text" inputmode={props.inputmode.clone()}
                        autocomplete="off" spellcheck="false"
                        value={props.text.clone()} {oninput}
                        onkeydown={props.onkeydown.clone()}
                        aria-keyshortcuts={props.keys.clone()}
                        placeholder={props.placeholder.clone()}
                        maxlength={props.maxlength.map(|m| m.to_string())}
                        aria-invalid={if invalid { "true" } else { "false" }}
                        aria-describedby={(!props.messages.is_empty()).then(|| msg_id.clone())} />
                }
                if let Some(suffix) = &props.suffix {
                    <span class="suffix" aria-hidden="true">{ suffix }</span>
                }
                { props.children.clone() }
            </div>
            <FieldMessages id={msg_id} messages={props.messages.clone()} />
        </div>
    }
}

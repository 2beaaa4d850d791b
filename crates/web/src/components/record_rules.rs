//! The exposure rules: in force, in the core's own words, and the three
//! that can be set (hold, gap, shortest episode) with the core's messages.

use plumbline_core::error::Errors;
use web_sys::HtmlInputElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::record::{capital, RecordAction, Rule};
use crate::show::dom_id;
use crate::state::{Action, Dispatch, Message};

/// Props of [`RecordRules`].
#[derive(Properties, PartialEq)]
pub struct RecordRulesProps {
    /// The boxes as typed, in [`Rule::ALL`] order.
    pub texts: [String; 3],
    /// The rules in force, in words (from the last analysis).
    pub in_force: Option<AttrValue>,
    /// Where the definitions come from.
    pub definitions: Option<AttrValue>,
    /// The core's problems with the record, some about the rules.
    pub fit: Errors,
    /// Where changes go.
    pub dispatch: Dispatch,
}

/// The rules.
#[component]
pub fn RecordRules(props: &RecordRulesProps) -> Html {
    html! {
        <section class="record-rules" aria-labelledby="h-record-rules">
            <h3 id="h-record-rules">{ "Rules in force" }</h3>
            if let Some(words) = &props.in_force {
                <p class="rules-words">{ capital(words) }{ "." }</p>
            }
            if let Some(d) = &props.definitions {
                <p class="hint">{ format!("Definitions: {d}.") }</p>
            }
            <details class="more">
                <summary>{ "Change the rules (hold, gap, shortest episode)" }</summary>
                <div class="row row-3">
                    { for Rule::ALL.iter().zip(props.texts.iter()).map(|(rule, text)| {
                        let rule = *rule;
                        let id = dom_id(rule.path());
                        let mut messages: Vec<Message> = Rule::read(text).err().map(Message::Error).into_iter().collect();
                        messages.extend(props.fit.for_field(rule.path()).map(|e| Message::Error(e.kind().to_string())));
                        let d = props.dispatch.clone();
                        let oninput = Callback::from(move |e: InputEvent| {
                            let text = e.target_unchecked_into::<HtmlInputElement>().value();
                            d.dispatch(Action::Record(RecordAction::Rule(rule, text)));
                        });
                        let msg_id = format!("{id}-msg");
                        html! {
                            <div class={classes!("field", (!messages.is_empty()).then_some("field-invalid"))}>
                                <label for={id.clone()}>{ rule.label() }</label>
                                <div class="entry">
                                    <input id={id} type="text" inputmode="decimal" autocomplete="off"
                                        value={text.clone()} {oninput} placeholder={format!("{} (default)", rule.default_s())}
                                        aria-invalid={if messages.is_empty() { "false" } else { "true" }}
                                        aria-describedby={(!messages.is_empty()).then(|| msg_id.clone())} />
                                    <span class="suffix" aria-hidden="true">{ "s" }</span>
                                </div>
                                <FieldMessages id={msg_id} messages={messages} />
                            </div>
                        }
                    }) }
                </div>
                <p class="hint">{ "Seconds; an empty box takes the core's default." }</p>
            </details>
        </section>
    }
}

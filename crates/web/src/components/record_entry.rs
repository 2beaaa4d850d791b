//! Adding to the record at the bedside: one tap takes the readings on
//! screen as a sample at a new time ("same as last, new time"), another
//! marks the position on screen as a change; the time is now, an elapsed
//! time, or a clock time.

use web_sys::{HtmlInputElement, HtmlSelectElement};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::ward_entry::time_of_day;
use crate::record::when::WhenMode;
use crate::record::{Record, RecordAction};
use crate::state::{Action, Dispatch, Message};

/// Props of [`RecordEntry`].
#[derive(Properties, PartialEq)]
pub struct RecordEntryProps {
    /// The record.
    pub record: Record,
    /// What one sample adds: each channel with its value, in words.
    pub adds: Vec<String>,
    /// Where changes go.
    pub dispatch: Dispatch,
}

/// The entry controls.
#[component]
pub fn RecordEntry(props: &RecordEntryProps) -> Html {
    let r = &props.record;
    let act = |make: fn(f64) -> RecordAction| {
        let d = props.dispatch.clone();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Record(make(time_of_day()))))
    };
    let onadd = act(|now_s| RecordAction::AddSample { now_s });
    let onmark = act(|now_s| RecordAction::MarkPosition { now_s });
    let onmode = {
        let d = props.dispatch.clone();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(mode) = WhenMode::from_key(&key) {
                d.dispatch(Action::Record(RecordAction::WhenMode(mode)));
            }
        })
    };
    let ontext = {
        let d = props.dispatch.clone();
        Callback::from(move |e: InputEvent| {
            let text = e.target_unchecked_into::<HtmlInputElement>().value();
            d.dispatch(Action::Record(RecordAction::WhenText(text)));
        })
    };
    let mode = r.when.mode;
    let adds = &props.adds;
    let messages: Vec<Message> = r.entry.iter().cloned().map(Message::Error).collect();
    let placeholder = match (mode, r.last_s()) {
        (WhenMode::Clock, _) => "08:40".to_owned(),
        (_, Some(last)) => format!(
            "after {}, e.g. +5",
            plumbline_core::record::elapsed_words(last)
        ),
        _ => "0:00:00".to_owned(),
    };
    html! {
        <fieldset class="group record-entry">
            <legend>{ "Add to the record" }</legend>
            <div class="row">
                <div class="field">
                    <label for="f-record-when-mode">{ "Time of the entry" }</label>
                    <select id="f-record-when-mode" onchange={onmode}>
                        { for WhenMode::ALL.iter().map(|m| html! {
                            <option value={m.key()} selected={*m == mode}>{ m.label() }</option>
                        }) }
                    </select>
                </div>
                if mode != WhenMode::Now {
                    <div class={classes!("field", (!messages.is_empty()).then_some("field-invalid"))}>
                        <label for="f-record-when">
                            { if mode == WhenMode::Clock { "Clock time" } else { "Elapsed time" } }
                        </label>
                        <input id="f-record-when" type="text" inputmode="numeric" autocomplete="off"
                            spellcheck="false" value={r.when.text.clone()} oninput={ontext}
                            placeholder={placeholder}
                            aria-invalid={if messages.is_empty() { "false" } else { "true" }}
                            aria-describedby={(!messages.is_empty()).then_some("f-record-when-msg")} />
                    </div>
                }
            </div>
            <div class="entry-actions">
                <button type="button" class="act" onclick={onadd}>
                    <strong>{ "Same as last, new time" }</strong>
                    <span>{ "adds the readings on screen as a sample" }</span>
                </button>
                <button type="button" class="act" onclick={onmark}>
                    <strong>{ "Mark position change" }</strong>
                    <span>{ "the position on screen from this time" }</span>
                </button>
            </div>
            <FieldMessages id="f-record-when-msg" messages={messages} />
            <p class="hint">
                if adds.is_empty() {
                    { "The check on screen has no readings for this record's channels." }
                } else {
                    { format!("A sample adds: {}.", adds.join(" · ")) }
                }
            </p>
        </fieldset>
    }
}

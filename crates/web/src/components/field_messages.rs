//! The one place that shows the core's problems and warnings about a box,
//! in the core's own words, beside the box; what is merely still to be
//! entered is said calmly, not as a mistake.

use yew::prelude::*;

use crate::state::Message;

/// Props of [`FieldMessages`].
#[derive(Properties, PartialEq)]
pub struct FieldMessagesProps {
    /// The element id the box points at with `aria-describedby`.
    pub id: AttrValue,
    /// The messages.
    pub messages: Vec<Message>,
}

/// The messages about one box.
#[component]
pub fn FieldMessages(props: &FieldMessagesProps) -> Html {
    if props.messages.is_empty() {
        return html! {};
    }
    html! {
        <div id={props.id.clone()} class="messages">
            { for props.messages.iter().map(|m| match m {
                Message::Error(text) => html! {
                    <p class="msg msg-error">
                        <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                        <span class="sr-only">{ "Problem: " }</span>
                        { text }
                    </p>
                },
                Message::Needed(text) => html! {
                    <p class="msg msg-needed">
                        <span class="sr-only">{ "Still to enter: " }</span>
                        { text }
                    </p>
                },
                Message::Warning(text) => html! {
                    <p class="msg msg-warning">
                        <span class="msg-mark" aria-hidden="true">{ "!" }</span>
                        <span class="sr-only">{ "Check: " }</span>
                        { text }
                    </p>
                },
            }) }
        </div>
    }
}

//! The organs that could not be checked, collapsed, each with what it needs.

use plumbline_core::report::NotChecked;
use yew::prelude::*;

/// Props of [`NotCheckedList`].
#[derive(Properties, PartialEq)]
pub struct NotCheckedListProps {
    /// The organs not checked.
    pub organs: Vec<NotChecked>,
}

/// The list, collapsed.
#[component]
pub fn NotCheckedList(props: &NotCheckedListProps) -> Html {
    if props.organs.is_empty() {
        return html! {};
    }
    html! {
        <details class="more not-checked">
            <summary>{ format!("Not checked ({}): what each needs", props.organs.len()) }</summary>
            <ul>
                { for props.organs.iter().map(|o| html! {
                    <li><strong>{ o.label }</strong>{ format!(": needs {}", o.needs.join("; ")) }</li>
                }) }
            </ul>
        </details>
    }
}

//! Why the form could not be checked: every problem the core found, each
//! linked to its box, and a plain statement that the results are stale.

use plumbline_core::error::Errors;
use yew::prelude::*;

use crate::show::{dom_id, path_words};
use crate::state::not_checked_words;

/// Props of [`Problems`].
#[derive(Properties, PartialEq)]
pub struct ProblemsProps {
    /// The problems.
    pub errors: Errors,
    /// Whether a last good check is on screen.
    pub has_results: bool,
}

/// The problem banner; nothing when the check went through.
#[component]
pub fn Problems(props: &ProblemsProps) -> Html {
    if props.errors.is_empty() {
        return html! {};
    }
    let count = props.errors.iter().count();
    html! {
        <section class="problems" aria-labelledby="h-problems">
            <h2 id="h-problems">
                <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                { not_checked_words(count) }
            </h2>
            <p>
                if props.has_results {
                    { "The results below are STALE: they are from the last complete entry, not from what is typed now." }
                } else {
                    { "No results until these are fixed." }
                }
            </p>
            <ul>
                { for props.errors.iter().map(|e| {
                    let words = path_words(e.field());
                    let text = if words.is_empty() { e.kind().to_string() } else { format!("{words}: {}", e.kind()) };
                    if e.field().is_empty() {
                        html! { <li>{ text }</li> }
                    } else {
                        html! { <li><a href={format!("#{}", dom_id(e.field()))}>{ text }</a></li> }
                    }
                }) }
            </ul>
        </section>
    }
}

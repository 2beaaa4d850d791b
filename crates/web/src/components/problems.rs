//! Why the form could not be checked: every real problem, in red, each
//! linked to its box, with a plain statement that the results are stale.
//! What is merely still to be entered is not a problem: the pinned answer
//! says it calmly in the answer's place.

use plumbline_core::error::{Error, ErrorKind, Errors};
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

fn item(e: &Error) -> Html {
    let words = path_words(e.field());
    let text = if words.is_empty() {
        e.kind().to_string()
    } else {
        format!("{words}: {}", e.kind())
    };
    if e.field().is_empty() {
        html! { <li>{ text }</li> }
    } else {
        html! { <li><a href={format!("#{}", dom_id(e.field()))}>{ text }</a></li> }
    }
}

/// The problem banner; nothing when nothing is wrong.
#[component]
pub fn Problems(props: &ProblemsProps) -> Html {
    let wrong: Vec<&Error> = props
        .errors
        .iter()
        .filter(|e| !matches!(e.kind(), ErrorKind::Missing { .. }))
        .collect();
    if wrong.is_empty() {
        return html! {};
    }
    html! {
        <section class="problems" aria-labelledby="h-problems">
            <h2 id="h-problems">
                <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                { not_checked_words(wrong.len()) }
            </h2>
            <p>
                if props.has_results {
                    { "The results are STALE: they are from the last complete entry, not from what is typed now." }
                } else {
                    { "No results until these are fixed." }
                }
            </p>
            <ul>{ for wrong.iter().map(|e| item(e)) }</ul>
        </section>
    }
}

//! Why the form could not be checked: what is still to be entered, said
//! calmly (a new check is not a mistake), and every real problem, in red,
//! each linked to its box, with a plain statement that the results are
//! stale.

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
    let words = path_words(&e.field);
    let text = if words.is_empty() {
        e.kind.to_string()
    } else {
        format!("{words}: {}", e.kind)
    };
    if e.field.is_empty() {
        html! { <li>{ text }</li> }
    } else {
        html! { <li><a href={format!("#{}", dom_id(&e.field))}>{ text }</a></li> }
    }
}

/// The problem banner; nothing when the check went through.
#[component]
pub fn Problems(props: &ProblemsProps) -> Html {
    let (needed, wrong): (Vec<&Error>, Vec<&Error>) = props
        .errors
        .iter()
        .partition(|e| matches!(e.kind, ErrorKind::Missing { .. }));
    if wrong.is_empty() && needed.is_empty() {
        return html! {};
    }
    let stale = if props.has_results {
        "The results are STALE: they are from the last complete entry, not from what is typed now."
    } else {
        "No results until then."
    };
    html! {
        <>
            if !wrong.is_empty() {
                <section class="problems" aria-labelledby="h-problems">
                    <h2 id="h-problems">
                        <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                        { not_checked_words(wrong.len()) }
                    </h2>
                    <p>{ stale }</p>
                    <ul>{ for wrong.iter().map(|e| item(e)) }</ul>
                </section>
            }
            if !needed.is_empty() {
                <section class="needed" aria-labelledby="h-needed">
                    <h2 id="h-needed">{ "To check, enter" }</h2>
                    if wrong.is_empty() { <p>{ stale }</p> }
                    <ul>{ for needed.iter().map(|e| item(e)) }</ul>
                </section>
            }
        </>
    }
}

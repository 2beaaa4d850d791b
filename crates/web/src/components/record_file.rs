//! Opening a record file from the device: a file picker (nothing leaves
//! the device), and every problem of a refused file with its line and
//! column, in the core's words.

use plumbline_core::case::MAX_BYTES;
use wasm_bindgen::JsCast;
use web_sys::HtmlInputElement;
use yew::platform::spawn_local;
use yew::prelude::*;

use crate::record::{capital, FileProblems, RecordAction};
use crate::state::{Action, Dispatch};

/// Props of [`RecordFile`].
#[derive(Properties, PartialEq)]
pub struct RecordFileProps {
    /// Where the file's text goes.
    pub dispatch: Dispatch,
    /// Problems with the last file, if it was refused.
    pub problems: Option<FileProblems>,
    /// The file the record's samples came from.
    pub opened: Option<AttrValue>,
}

/// Reads the chosen file's text, then hands it to the state.
fn read(input: &HtmlInputElement, d: Dispatch) {
    let Some(file) = input.files().and_then(|list| list.get(0)) else {
        return;
    };
    // The same file can be chosen again after a fix.
    input.set_value("");
    let name = file.name();
    if file.size() > MAX_BYTES as f64 {
        d.dispatch(Action::Record(RecordAction::Unreadable {
            name,
            why: format!(
                "the file is larger than {} MB; a record file is at most that",
                MAX_BYTES >> 20
            ),
        }));
        return;
    }
    spawn_local(async move {
        let text = js_sys::futures::JsFuture::from(file.text()).await;
        let action = match text.ok().and_then(|t| t.as_string()) {
            Some(text) => RecordAction::Open { name, text },
            None => RecordAction::Unreadable {
                name,
                why: "this device could not read the file".to_owned(),
            },
        };
        d.dispatch(Action::Record(action));
    });
}

/// The file picker and its problems.
#[component]
pub fn RecordFile(props: &RecordFileProps) -> Html {
    let onchange = {
        let d = props.dispatch.clone();
        Callback::from(move |e: Event| {
            if let Some(input) = e
                .target()
                .and_then(|t| t.dyn_into::<HtmlInputElement>().ok())
            {
                read(&input, d.clone());
            }
        })
    };
    html! {
        <div class="record-file">
            <label class="file-pick" for="f-record-file">
                <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                    <path d="M4 3 H14 L20 9 V21 H4 Z M14 3 V9 H20" class="icon-line" />
                    <path d="M12 19 V12 M8.5 15 L12 11.5 L15.5 15" class="icon-line" />
                </svg>
                <span>{ "Open a record file (CSV)" }</span>
                <input id="f-record-file" class="file-input" type="file"
                    accept=".csv,.tsv,.txt,text/csv,text/plain" {onchange}
                    aria-describedby="f-record-file-hint" />
            </label>
            <p id="f-record-file-hint" class="hint">
                { "A monitor export read on this device; nothing is sent anywhere. Opening a file replaces the samples; position changes and rules stay." }
                if let Some(name) = &props.opened {
                    { format!(" Samples now from {name}.") }
                }
            </p>
            if let Some(p) = &props.problems {
                <section class="problems file-problems" aria-labelledby="h-file-problems">
                    <h3 id="h-file-problems">
                        <span class="msg-mark" aria-hidden="true">{ "✕" }</span>
                        { format!("{} was not opened: nothing imported", p.name) }
                    </h3>
                    <p>{ format!("{} to fix, each with its line and column:", problems_words(p.errors.iter().count())) }</p>
                    <ul>
                        { for p.errors.iter().map(|e| html! {
                            <li>{ if e.field().is_empty() { e.kind().to_string() } else { format!("{}: {}", capital(e.field()), e.kind()) } }</li>
                        }) }
                    </ul>
                </section>
            }
        </div>
    }
}

fn problems_words(n: usize) -> String {
    if n == 1 {
        "1 problem".to_owned()
    } else {
        format!("{n} problems")
    }
}

//! The case document as checked, read-only: for handover, and for anyone
//! who wants to run the same case through the command line.

use yew::prelude::*;

use crate::components::fold::Fold;

/// Props of [`CaseJson`].
#[derive(Properties, PartialEq)]
pub struct CaseJsonProps {
    /// The case as JSON.
    pub json: AttrValue,
    /// Whether the form has changed since (the JSON is the last good case).
    pub stale: bool,
}

/// The case as JSON.
#[component]
pub fn CaseJson(props: &CaseJsonProps) -> Html {
    html! {
        <section class="panel case-json" aria-labelledby="h-json">
            <Fold title="Case as JSON (for handover)" title_id="h-json">
                <p class="hint">
                    if props.stale {
                        { "The case of the last good check; the marked boxes are not in it yet. " }
                    }
                    { "Nothing in it identifies the patient. The same file runs with: plumbline check FILE" }
                </p>
                <textarea readonly=true aria-label="Case as JSON" rows="16" spellcheck="false"
                    value={props.json.clone()} />
            </Fold>
        </section>
    }
}

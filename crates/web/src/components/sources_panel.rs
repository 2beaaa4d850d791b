//! The arterial sources in detail: cuffs and lines, each at its own level.
//! The first is the one the quick path edits.

use std::rc::Rc;

use plumbline_core::report::SourceRow;
use yew::prelude::*;

use crate::components::source_card::SourceCard;
use crate::form::{Edit, SourceForm};
use crate::notes::Notes;

/// Props of [`SourcesPanel`].
#[derive(Properties, PartialEq)]
pub struct SourcesPanelProps {
    /// The sources' boxes.
    pub sources: Vec<SourceForm>,
    /// What the last check made of each, while it matches the boxes.
    pub rows: Vec<SourceRow>,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// The arterial sources.
#[component]
pub fn SourcesPanel(props: &SourcesPanelProps) -> Html {
    let onadd = props.onedit.reform(|_: MouseEvent| Edit::AddSource);
    html! {
        <section class="panel" aria-labelledby="h-arterial">
            <h3 id="h-arterial">{ "Arterial pressure" }</h3>
            { for props.sources.iter().enumerate().map(|(i, src)| {
                let row = props.rows.get(i).filter(|r| r.id == src.id.trim()).cloned();
                html! { <SourceCard index={i} source={src.clone()} row={row}
                    notes={props.notes.clone()} onedit={props.onedit.clone()} /> }
            }) }
            <button type="button" class="add" onclick={onadd}>{ "Add a cuff or line" }</button>
        </section>
    }
}

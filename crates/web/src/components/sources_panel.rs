//! The arterial sources: cuffs and lines, each at its own level.

use yew::prelude::*;

use crate::components::source_card::SourceCard;
use crate::form::Edit;
use crate::state::{Action, Handle};

/// Props of [`SourcesPanel`].
#[derive(Properties, PartialEq)]
pub struct SourcesPanelProps {
    /// The state.
    pub state: Handle,
}

/// The arterial sources.
#[component]
pub fn SourcesPanel(props: &SourcesPanelProps) -> Html {
    let s = &props.state;
    // What the core made of each source, only while it matches the boxes.
    let rows = s
        .checked
        .as_ref()
        .filter(|_| !s.is_stale())
        .map(|c| c.report.arterial.clone())
        .unwrap_or_default();
    let onadd = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::AddSource)))
    };
    html! {
        <section class="panel" aria-labelledby="h-arterial">
            <h3 id="h-arterial">{ "Arterial pressure" }</h3>
            { for s.form.sources.iter().enumerate().map(|(i, src)| {
                let row = rows.get(i).filter(|r| r.id == src.id.trim()).cloned();
                html! { <SourceCard index={i} source={src.clone()} row={row} state={s.clone()} /> }
            }) }
            <button type="button" class="add" onclick={onadd}>{ "Add a cuff or line" }</button>
        </section>
    }
}

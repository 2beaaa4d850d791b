//! The positions in the record: the one it starts in, then each marked
//! change from its time, numbered as on the charts.

use plumbline_core::case::PositionChangeSpec;
use plumbline_core::geometry::PositionSpec;
use plumbline_core::record::elapsed_words;
use yew::prelude::*;

use crate::record::RecordAction;
use crate::state::{Action, Dispatch};

/// Props of [`RecordPositions`].
#[derive(Properties, PartialEq)]
pub struct RecordPositionsProps {
    /// The position the record starts in.
    pub start: Option<PositionSpec>,
    /// The marked changes.
    pub changes: Vec<PositionChangeSpec>,
    /// Where changes go.
    pub dispatch: Dispatch,
}

/// A position in words, by the core.
fn words(p: &PositionSpec) -> String {
    p.resolve("position")
        .map(|p| p.describe())
        .unwrap_or_else(|_| p.posture.label().to_owned())
}

/// The list of positions.
#[component]
pub fn RecordPositions(props: &RecordPositionsProps) -> Html {
    let onstart = {
        let d = props.dispatch.clone();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Record(RecordAction::StartHere)))
    };
    html! {
        <section class="record-positions" aria-labelledby="h-record-positions">
            <h3 id="h-record-positions">{ "Positions in the record" }</h3>
            <ol class="positions">
                <li>
                    <span class="position-no" aria-hidden="true">{ "1" }</span>
                    <span class="position-words">
                        <strong>{ "From the start: " }</strong>
                        { props.start.as_ref().map_or_else(|| "no position".to_owned(), words) }
                    </span>
                    <button type="button" onclick={onstart}>{ "Start in the position on screen" }</button>
                </li>
                { for props.changes.iter().enumerate().map(|(i, c)| {
                    let d = props.dispatch.clone();
                    let onremove = Callback::from(move |_: MouseEvent| {
                        d.dispatch(Action::Record(RecordAction::RemoveChange(i)));
                    });
                    html! {
                        <li>
                            <span class="position-no" aria-hidden="true">{ i + 2 }</span>
                            <span class="position-words">
                                <strong>{ format!("From {}: ", elapsed_words(c.at_s)) }</strong>
                                { words(&c.position) }
                            </span>
                            <button type="button" onclick={onremove}
                                aria-label={format!("Remove position change {} at {}", i + 2, elapsed_words(c.at_s))}>
                                { "Remove" }
                            </button>
                        </li>
                    }
                }) }
            </ol>
        </section>
    }
}

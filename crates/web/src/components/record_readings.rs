//! A source's readings in the record, listed under the chart with their
//! times: each can be corrected (typed again as `100/60 (74)`) or taken
//! out. A long monitor record lists its latest readings only.

use plumbline_core::record::clock::clock_words;
use plumbline_core::record::elapsed_words;
use web_sys::HtmlInputElement;
use yew::prelude::*;

use crate::record::entry::ReadingRow;
use crate::record::RecordAction;

/// The most readings listed: a ward record's worth.
pub const SHOWN: usize = 24;

/// Props of [`RecordReadings`].
#[derive(Properties, PartialEq)]
pub struct RecordReadingsProps {
    /// The source's id.
    pub id: AttrValue,
    /// Its latest readings, in time order.
    pub rows: Vec<ReadingRow>,
    /// How many readings it has in all.
    pub total: usize,
    /// The record's clock start, seconds after midnight.
    pub clock_start: Option<f64>,
    /// Changes to the record.
    pub onchange: Callback<RecordAction>,
}

/// The readings table.
#[component]
pub fn RecordReadings(props: &RecordReadingsProps) -> Html {
    if props.rows.is_empty() {
        return html! {};
    }
    let skipped = props.total.saturating_sub(props.rows.len());
    let when = |t: f64| match props.clock_start {
        Some(c) => format!("{} ({})", clock_words(c + t), elapsed_words(t)),
        None => elapsed_words(t),
    };
    html! {
        // A monitor's stream is in the chart; the list prints for a ward's few.
        <section class={classes!("record-readings", (skipped > 0).then_some("truncated"))}
            aria-labelledby="h-record-readings">
            <h3 id="h-record-readings">{ format!("Readings of {}", props.id) }</h3>
            if skipped > 0 {
                <p class="hint">{ format!("The latest {} of {} readings; the samples download holds them all.", props.rows.len(), props.total) }</p>
            }
            <table>
                <thead>
                    <tr><th scope="col">{ "Time" }</th><th scope="col">{ "Blood pressure, mmHg" }</th><th scope="col"><span class="sr-only">{ "Remove" }</span></th></tr>
                </thead>
                <tbody>
                    { for props.rows.iter().map(|row| {
                        let (id, t_s) = (props.id.to_string(), row.t_s);
                        let onedit = {
                            let id = id.clone();
                            props.onchange.reform(move |e: Event| RecordAction::EditReading {
                                id: id.clone(),
                                t_s,
                                text: e.target_unchecked_into::<HtmlInputElement>().value(),
                            })
                        };
                        let onremove = props.onchange.reform(move |_: MouseEvent| RecordAction::RemoveReading {
                            id: id.clone(),
                            t_s,
                        });
                        let at = when(t_s);
                        html! {
                            <tr>
                                <th scope="row">{ at.clone() }</th>
                                <td>
                                    <input type="text" class="reading-text" value={row.text.clone()}
                                        aria-label={format!("Reading at {at}")} onchange={onedit}
                                        autocomplete="off" spellcheck="false" />
                                    <span class="print-only">{ row.text.clone() }</span>
                                </td>
                                <td>
                                    <button type="button" class="remove-reading" onclick={onremove}
                                        aria-label={format!("Remove the reading at {at}")}>{ "Remove" }</button>
                                </td>
                            </tr>
                        }
                    }) }
                </tbody>
            </table>
        </section>
    }
}

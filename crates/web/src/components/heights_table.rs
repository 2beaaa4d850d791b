//! Every landmark's height with its range and where it came from.

use plumbline_core::report::HeightRow;
use yew::prelude::*;

use crate::show::signed_cm;

/// Props of [`HeightsTable`].
#[derive(Properties, PartialEq)]
pub struct HeightsTableProps {
    /// The report's rows.
    pub rows: Vec<HeightRow>,
}

/// The heights, collapsed.
#[component]
pub fn HeightsTable(props: &HeightsTableProps) -> Html {
    html! {
        <details class="more">
            <summary>{ format!("All landmark heights ({})", props.rows.len()) }</summary>
            <table>
                <caption>{ "Height above the heart reference, cm" }</caption>
                <thead>
                    <tr><th scope="col">{ "Landmark" }</th><th scope="col">{ "Height" }</th>
                        <th scope="col">{ "Source" }</th></tr>
                </thead>
                <tbody>
                    { for props.rows.iter().map(|r| html! {
                        <tr>
                            <th scope="row">{ r.label }</th>
                            <td class="num">{ format!("{} ± {:.1}", signed_cm(r.above_heart_cm), r.uncertainty_cm) }</td>
                            <td>
                                { r.provenance.label() }
                                if let Some(c) = &r.largest_contributor {
                                    { format!(", mostly {c}") }
                                }
                            </td>
                        </tr>
                    }) }
                </tbody>
            </table>
        </details>
    }
}

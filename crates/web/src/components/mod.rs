//! Reusable parts of the screen, one component per file.

pub mod angle_input;
pub mod assumed_card;
pub mod baseline_panel;
pub mod case_json;
pub mod caution;
pub mod concern_picker;
pub mod demo_notice;
pub mod device_level;
pub mod field_messages;
pub mod figure_view;
pub mod fold;
pub mod hazards_panel;
pub mod heights_table;
pub mod length_input;
pub mod level_picker;
pub mod metric_details;
pub mod not_checked;
pub mod organ_card;
pub mod patient_panel;
pub mod plain_input;
pub mod position_panel;
pub mod pressure_input;
pub mod problems;
pub mod qr_code;
pub mod quantity_select;
pub mod quick_position;
pub mod quick_pressures;
pub mod reading_card;
pub mod readings_panel;
pub mod readings_summary;
pub mod record_entry;
pub mod record_exports;
pub mod record_file;
pub mod record_numbers;
pub mod record_panel;
pub mod record_positions;
pub mod record_readings;
pub mod record_rules;
pub mod record_trend;
pub mod session_notices;
pub mod share_dialog;
pub mod site_select;
pub mod source_card;
pub mod sources_panel;
pub mod status_badge;
pub mod sweep_chart;
pub mod target_row;
pub mod targets_panel;
pub mod theme_toggle;
pub mod unit_input;
pub mod verdicts;
pub mod ward_entry;
pub mod warnings_panel;

use yew::{html, Callback, Html, SubmitEvent};

/// A callback that passes on what `pick` makes of an event, when it makes
/// something (a select whose value names nothing sends nothing).
pub fn picked<T: 'static, E: 'static>(
    to: &Callback<E>,
    pick: impl Fn(T) -> Option<E> + 'static,
) -> Callback<T> {
    let to = to.clone();
    Callback::from(move |t: T| {
        if let Some(e) = pick(t) {
            to.emit(e);
        }
    })
}

/// Boxes that belong together, in a form of their own. After each keystroke
/// Chromium's autofill reads every box of the form typed into, and boxes in
/// no form count as one form spanning the page: on a slow tablet that read
/// of some 120 boxes held up every keystroke's paint. A form per group keeps
/// it to the group's few boxes. It lays out as if absent and never submits
/// (Enter in a lone box stays put).
pub fn box_group(body: Html) -> Html {
    let stay = Callback::from(|e: SubmitEvent| e.prevent_default());
    html! { <form class="box-group" onsubmit={stay}>{ body }</form> }
}

//! The ward's entry row: a blood pressure and its time (now unless typed),
//! added with one tap or the Enter key, beside the trend and under the
//! answer, so five readings need no scrolling between them.

use web_sys::{HtmlInputElement, HtmlSelectElement};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::record::{RecordAction, Ward};
use crate::state::Message;

/// This device's time of day, seconds after midnight.
pub fn time_of_day() -> f64 {
    let now = js_sys::Date::new_0();
    f64::from(now.get_hours()) * 3600.0
        + f64::from(now.get_minutes()) * 60.0
        + f64::from(now.get_seconds())
}

/// Props of [`WardEntry`].
#[derive(Properties, PartialEq)]
pub struct WardEntryProps {
    /// The arterial sources' names, in order.
    pub sources: Vec<AttrValue>,
    /// The row as typed.
    pub ward: Ward,
    /// Why the last entry was refused.
    pub problem: Option<AttrValue>,
    /// Changes to the row.
    pub onchange: Callback<RecordAction>,
    /// Adds the row's reading, at the device's time of day (seconds).
    pub onadd: Callback<f64>,
    /// How many samples the record holds: when it grows, the row is kept
    /// in view under the pinned answer.
    pub samples: usize,
}

/// Scrolls the page just enough that `row` is in view between the pinned
/// answer and the caution bar, whatever grew above it.
fn keep_in_view(row: &web_sys::Element) {
    let document = gloo::utils::document();
    let bottom_of = |selector: &str| {
        document
            .query_selector(selector)
            .ok()
            .flatten()
            .map(|e| e.get_bounding_client_rect())
    };
    let top = bottom_of(".answer-pin").map_or(0.0, |r| r.bottom().max(0.0));
    let window = gloo::utils::window();
    let height = window
        .inner_height()
        .ok()
        .and_then(|h| h.as_f64())
        .unwrap_or_default();
    let floor = bottom_of(".caution").map_or(height, |r| r.top());
    let r = row.get_bounding_client_rect();
    if r.top() < top {
        window.scroll_by_with_x_and_y(0.0, r.top() - top - 8.0);
    } else if r.bottom() > floor {
        window.scroll_by_with_x_and_y(0.0, r.bottom() - floor + 8.0);
    }
}

/// The entry row.
#[component]
pub fn WardEntry(props: &WardEntryProps) -> Html {
    let form = use_node_ref();
    {
        let form = form.clone();
        use_effect_with(props.samples, move |_| {
            if let Some(row) = form.cast::<web_sys::Element>() {
                // Only after this device's own entry: a row that has focus.
                let focused = gloo::utils::document()
                    .active_element()
                    .is_some_and(|a| row.contains(Some(&a)));
                if focused {
                    keep_in_view(&row);
                }
            }
        });
    }
    let onsubmit = props.onadd.reform(|e: SubmitEvent| {
        e.prevent_default();
        time_of_day()
    });
    let text = |make: fn(String) -> RecordAction| {
        props.onchange.reform(move |e: InputEvent| {
            make(e.target_unchecked_into::<HtmlInputElement>().value())
        })
    };
    let onsource = crate::components::picked(&props.onchange, |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        key.parse::<usize>().ok().map(RecordAction::WardSource)
    });
    let messages: Vec<Message> = props
        .problem
        .iter()
        .map(|p| Message::Error(p.to_string()))
        .collect();
    let name = props
        .sources
        .get(props.ward.source)
        .cloned()
        .unwrap_or_default();
    html! {
        <form class="ward" ref={form} {onsubmit} aria-label="Add a blood pressure to the record">
            if props.sources.len() > 1 {
                <div class="field ward-source">
                    <label for="f-ward-source">{ "Source" }</label>
                    <select id="f-ward-source" onchange={onsource}>
                        { for props.sources.iter().enumerate().map(|(i, s)| html! {
                            <option value={i.to_string()} selected={i == props.ward.source}>{ s.clone() }</option>
                        }) }
                    </select>
                </div>
            }
            <div class="field ward-time">
                <label for="f-ward-time">{ "Time" }</label>
                <input id="f-ward-time" type="text" inputmode="numeric" autocomplete="off"
                    spellcheck="false" placeholder="now" value={props.ward.time.clone()}
                    oninput={text(RecordAction::WardTime)} />
            </div>
            <div class={classes!("field", "ward-bp", (!messages.is_empty()).then_some("field-invalid"))}>
                <label for="f-ward-bp">{ format!("Blood pressure, {name}") }</label>
                <input id="f-ward-bp" type="text" autocomplete="off" spellcheck="false"
                    placeholder="sys/dia (mean)" value={props.ward.bp.clone()}
                    oninput={text(RecordAction::WardBp)}
                    aria-invalid={if messages.is_empty() { "false" } else { "true" }}
                    aria-describedby={(!messages.is_empty()).then_some("f-ward-msg")} />
            </div>
            <button type="submit" class="ward-add">{ "Add" }</button>
            <FieldMessages id="f-ward-msg" messages={messages} />
        </form>
    }
}

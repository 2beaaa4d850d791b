//! One arterial source: its short label, method, level and pressures, and
//! what the core made of it.

use plumbline_core::landmark::Landmark;
use plumbline_core::reading::Method;
use plumbline_core::report::SourceRow;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::level_picker::LevelPicker;
use crate::components::plain_input::PlainInput;
use crate::components::pressure_input::PressureInput;
use crate::form::{Edit, LevelPick, Slot, SourceForm, SourcePart};
use crate::show::rounded;
use crate::state::{Action, Handle};

/// Props of [`SourceCard`].
#[derive(Properties, PartialEq)]
pub struct SourceCardProps {
    /// Its place in the list.
    pub index: usize,
    /// Its boxes.
    pub source: SourceForm,
    /// What the last check made of it, when it matches.
    pub row: Option<SourceRow>,
    /// The state.
    pub state: Handle,
}

/// One arterial source.
#[component]
pub fn SourceCard(props: &SourceCardProps) -> Html {
    let s = &props.state;
    let i = props.index;
    let path = format!("arterial[{i}]");
    let src = &props.source;
    let method_id = format!("f-arterial-{i}-method");
    let onmethod = {
        let d = s.dispatcher();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(m) = Method::ALL.into_iter().find(|m| m.label() == key) {
                d.dispatch(Action::Edit(Edit::SourceMethod(i, m)));
            }
        })
    };
    let onpick = {
        let d = s.dispatcher();
        Callback::from(move |pick: LevelPick| d.dispatch(Action::Edit(Edit::SourceLevel(i, pick))))
    };
    let onremove = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::RemoveSource(i))))
    };
    let pressure = |part: SourcePart, label: &'static str, key: &str, field| {
        let p = format!("{path}.{key}");
        html! {
            <PressureInput label={label} path={p.clone()} slot={Slot::Source(i, part)}
                field={field} messages={s.messages(&p)} dispatch={s.dispatcher()} />
        }
    };
    let name = if src.id.trim().is_empty() {
        "unnamed".to_owned()
    } else {
        src.id.clone()
    };
    let primary = props.row.as_ref().is_some_and(|r| r.primary);
    html! {
        <fieldset class="card" id={format!("f-arterial-{i}")}>
            <legend>
                { format!("Arterial source {}: {name}", i + 1) }
                if primary { <span class="tag">{ "drives the results" }</span> }
            </legend>
            <FieldMessages id={format!("f-arterial-{i}-msg")} messages={s.messages(&path)} />
            <div class="row">
                <PlainInput label="Short label (no names)" path={format!("{path}.id")}
                    slot={Slot::Source(i, SourcePart::Id)} text={src.id.clone()}
                    messages={s.messages(&format!("{path}.id"))} maxlength={40}
                    placeholder="e.g. radial line" dispatch={s.dispatcher()} />
                <div class="field">
                    <label for={method_id.clone()}>{ "Method" }</label>
                    <select id={method_id} onchange={onmethod}>
                        { for Method::ALL.into_iter().map(|m| html! {
                            <option value={m.label()} selected={m == src.method}>{ m.label() }</option>
                        }) }
                    </select>
                </div>
            </div>
            <LevelPicker path={format!("{path}.level")} level={src.level.clone()}
                choices={Landmark::ALL.to_vec()} height_slot={Slot::Source(i, SourcePart::LevelHeight)}
                onpick={onpick} state={s.clone()} dispatch={s.dispatcher()} />
            <div class="row row-3">
                { pressure(SourcePart::Systolic, "Systolic", "systolic", src.pressures.systolic.clone()) }
                { pressure(SourcePart::Diastolic, "Diastolic", "diastolic", src.pressures.diastolic.clone()) }
                { pressure(SourcePart::Mean, "Mean", "mean", src.pressures.mean.clone()) }
            </div>
            <details class="more" open={!src.accuracy.text.trim().is_empty()
                || !s.messages(&format!("{path}.accuracy")).is_empty()}>
                <summary>{ "Accuracy (optional)" }</summary>
                { pressure(SourcePart::Accuracy, "Accuracy ±", "accuracy", src.accuracy.clone()) }
            </details>
            if let Some(row) = &props.row {
                <p class="derived">
                    { format!("Level {}", row.level) }
                    if let Some(h) = row.level_height_cm { { format!(" ({h:+.1} cm)") } }
                    if let Some(basis) = &row.mean_basis { { format!("; mean {basis}") } }
                    if let Some(m) = row.mean_at_heart_mmhg {
                        { format!("; mean at heart level {} mmHg", rounded(m)) }
                    }
                    { format!("; accuracy ±{} mmHg ({})", rounded(row.accuracy_mmhg), row.accuracy_source) }
                </p>
            }
            <button type="button" class="remove" onclick={onremove}>
                { format!("Remove source {}", i + 1) }
            </button>
        </fieldset>
    }
}

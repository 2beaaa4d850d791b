//! One arterial source in detail: its short label, method, level, the blood
//! pressure in one box or in three, the accuracy, and what the core made of
//! it.

use std::rc::Rc;

use plumbline_core::landmark::Landmark;
use plumbline_core::reading::Method;
use plumbline_core::report::SourceRow;
use plumbline_core::text::{signed_cm, whole_mmhg};
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::level_picker::LevelPicker;
use crate::components::plain_input::PlainInput;
use crate::components::pressure_input::PressureInput;
use crate::form::{Edit, Slot, SourceForm, SourcePart};
use crate::notes::Notes;

/// Props of [`SourceCard`].
#[derive(Properties, PartialEq)]
pub struct SourceCardProps {
    /// Its place in the list.
    pub index: usize,
    /// Its boxes.
    pub source: SourceForm,
    /// What the last check made of it, when it matches.
    pub row: Option<SourceRow>,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// One arterial source.
#[component]
pub fn SourceCard(props: &SourceCardProps) -> Html {
    let i = props.index;
    let path = format!("arterial[{i}]");
    let src = &props.source;
    let method_id = format!("f-arterial-{i}-method");
    let onmethod = crate::components::picked(&props.onedit, move |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        Method::ALL
            .into_iter()
            .find(|m| m.label() == key)
            .map(|m| Edit::SourceMethod(i, m))
    });
    let onpick = props.onedit.reform(move |pick| Edit::SourceLevel(i, pick));
    let onremove = props
        .onedit
        .reform(move |_: MouseEvent| Edit::RemoveSource(i));
    let pressure = |part: SourcePart, label: &'static str, key: &str, field| {
        let p = format!("{path}.{key}");
        html! {
            <PressureInput label={label} path={p.clone()} slot={Slot::Source(i, part)}
                field={field} messages={props.notes.at(&p)} onedit={props.onedit.clone()} />
        }
    };
    let bp_path = format!("{path}.blood_pressure");
    let primary = props.row.as_ref().is_some_and(|r| r.primary);
    let p = &src.pressures;
    html! {
        <fieldset class="card" id={format!("f-arterial-{i}")}>
            <legend>
                { format!("Arterial source {}: {}", i + 1, if src.id.trim().is_empty() { "unnamed" } else { src.id.as_str() }) }
                if primary { <span class="tag">{ "drives the results" }</span> }
            </legend>
            <FieldMessages id={format!("f-arterial-{i}-msg")} messages={props.notes.at(&path)} />
            <div class="row">
                <PlainInput label="Short label (no names)" path={format!("{path}.id")}
                    slot={Slot::Source(i, SourcePart::Id)} text={src.id.clone()}
                    messages={props.notes.at(&format!("{path}.id"))} maxlength={40}
                    placeholder="e.g. radial line" onedit={props.onedit.clone()} />
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
                onpick={onpick} notes={props.notes.clone()} onedit={props.onedit.clone()} />
            if i > 0 {
                <PlainInput label="Blood pressure" path={bp_path.clone()}
                    slot={Slot::Source(i, SourcePart::BloodPressure)} text={p.text()}
                    messages={props.notes.at(&bp_path)} placeholder="sys/dia (mean), e.g. 100/60 (74)"
                    onedit={props.onedit.clone()} />
            }
            <details class="more" open={!src.accuracy.text.trim().is_empty()
                || !props.notes.at(&format!("{path}.accuracy")).is_empty()}>
                <summary>{ "Systolic, diastolic and mean in separate boxes; accuracy" }</summary>
                <div class="row row-3">
                    { pressure(SourcePart::Systolic, "Systolic", "systolic", p.systolic.clone()) }
                    { pressure(SourcePart::Diastolic, "Diastolic", "diastolic", p.diastolic.clone()) }
                    { pressure(SourcePart::Mean, "Mean", "mean", p.mean.clone()) }
                </div>
                { pressure(SourcePart::Accuracy, "Accuracy ±", "accuracy", src.accuracy.clone()) }
            </details>
            if let Some(row) = &props.row {
                <p class="derived">
                    { format!("Level {}", row.level) }
                    if let Some(h) = row.level_height_cm { { format!(" ({} cm)", signed_cm(h)) } }
                    if let Some(basis) = &row.mean_basis { { format!("; mean {basis}") } }
                    if let Some(m) = row.mean_at_heart_mmhg {
                        { format!("; mean at heart level {} mmHg", whole_mmhg(m)) }
                    }
                    { format!("; accuracy ±{} mmHg ({})", whole_mmhg(row.accuracy_mmhg), row.accuracy_source) }
                </p>
            }
            <button type="button" class="remove" onclick={onremove}>
                { format!("Remove source {}", i + 1) }
            </button>
        </fieldset>
    }
}

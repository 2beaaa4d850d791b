//! One target: its bound, editable, and the guideline it comes from.

use std::rc::Rc;

use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::plain_input::PlainInput;
use crate::components::pressure_input::PressureInput;
use crate::form::{BoundKind, Edit, Slot, TargetForm, TargetPart};
use crate::notes::Notes;

/// Props of [`TargetRow`].
#[derive(Properties, PartialEq)]
pub struct TargetRowProps {
    /// Its place in the list.
    pub index: usize,
    /// Its boxes.
    pub target: TargetForm,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// One target.
#[component]
pub fn TargetRow(props: &TargetRowProps) -> Html {
    let i = props.index;
    let t = &props.target;
    let title = format!("{}: {}", t.organ.label(), t.organ.metric_label(t.metric));
    let kind_id = format!("f-targets-{i}-kind");
    let onkind = crate::components::picked(&props.onedit, move |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        BoundKind::ALL
            .into_iter()
            .find(|k| k.key() == key)
            .map(|k| Edit::TargetKind(i, k))
    });
    let onremove = props
        .onedit
        .reform(move |_: MouseEvent| Edit::RemoveTarget(i));
    let bound_path = t.bound_path(i);
    let source_path = format!("targets[{i}].source");
    let bound = if t.kind == BoundKind::PercentOfBaseline {
        html! {
            <PlainInput label="Percent of baseline" path={bound_path.clone()}
                slot={Slot::Target(i, TargetPart::Bound)} text={t.percent.clone()}
                messages={props.notes.at(&bound_path)} inputmode="decimal" suffix="%"
                onedit={props.onedit.clone()} />
        }
    } else {
        html! {
            <PressureInput label="Threshold" path={bound_path.clone()}
                slot={Slot::Target(i, TargetPart::Bound)} field={t.threshold.clone()}
                messages={props.notes.at(&bound_path)} onedit={props.onedit.clone()} />
        }
    };
    html! {
        <li class="target">
            <fieldset class="card" id={format!("f-targets-{i}")}>
                <legend>{ format!("Target {}: {title}", i + 1) }</legend>
                <div class="row">
                    <div class="field">
                        <label for={kind_id.clone()}>{ "Kind" }</label>
                        <select id={kind_id} onchange={onkind}>
                            { for BoundKind::ALL.into_iter().map(|k| html! {
                                <option value={k.key()} selected={k == t.kind}>{ k.label() }</option>
                            }) }
                        </select>
                    </div>
                    { bound }
                </div>
                <PlainInput label="Source" path={source_path.clone()}
                    slot={Slot::Target(i, TargetPart::Source)} text={t.source.clone()}
                    messages={props.notes.at(&source_path)} maxlength={240} multiline=true
                    placeholder="guideline or unit protocol" onedit={props.onedit.clone()} />
                <button type="button" class="remove" onclick={onremove}>
                    { format!("Remove target {}", i + 1) }
                </button>
            </fieldset>
        </li>
    }
}

//! One target: its bound, editable, and the guideline it comes from.

use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::components::plain_input::PlainInput;
use crate::components::pressure_input::PressureInput;
use crate::form::{BoundKind, Edit, Slot, TargetForm, TargetPart};
use crate::state::{Action, Handle};

/// Props of [`TargetRow`].
#[derive(Properties, PartialEq)]
pub struct TargetRowProps {
    /// Its place in the list.
    pub index: usize,
    /// Its boxes.
    pub target: TargetForm,
    /// The state.
    pub state: Handle,
}

/// One target.
#[component]
pub fn TargetRow(props: &TargetRowProps) -> Html {
    let s = &props.state;
    let i = props.index;
    let t = &props.target;
    let title = format!("{}: {}", t.organ.label(), t.organ.metric_label(t.metric));
    let kind_id = format!("f-targets-{i}-kind");
    let onkind = {
        let d = s.dispatcher();
        Callback::from(move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            if let Some(k) = BoundKind::ALL.into_iter().find(|k| k.key() == key) {
                d.dispatch(Action::Edit(Edit::TargetKind(i, k)));
            }
        })
    };
    let onremove = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::RemoveTarget(i))))
    };
    let bound_path = t.bound_path(i);
    let source_path = format!("targets[{i}].source");
    let bound = if t.kind == BoundKind::PercentOfBaseline {
        html! {
            <PlainInput label="Percent of baseline" path={bound_path.clone()}
                slot={Slot::Target(i, TargetPart::Bound)} text={t.percent.clone()}
                messages={s.messages(&bound_path)} inputmode="decimal" suffix="%"
                dispatch={s.dispatcher()} />
        }
    } else {
        html! {
            <PressureInput label="Threshold" path={bound_path.clone()}
                slot={Slot::Target(i, TargetPart::Bound)} field={t.threshold.clone()}
                messages={s.messages(&bound_path)} dispatch={s.dispatcher()} />
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
                    messages={s.messages(&source_path)} maxlength={240} multiline=true
                    placeholder="guideline or unit protocol" dispatch={s.dispatcher()} />
                <button type="button" class="remove" onclick={onremove}>
                    { format!("Remove target {}", i + 1) }
                </button>
            </fieldset>
        </li>
    }
}

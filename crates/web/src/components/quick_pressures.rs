//! The quick path's readings: one blood pressure with its site, typed as
//! the monitor shows it (`100/60` or `100/60 (74)`), and one other pressure
//! (an ICP, a drain, a CVP...) whose box adds the reading when typed in.

use std::rc::Rc;

use plumbline_core::reading::Quantity;
use plumbline_core::usual::{method_for, unit_for};
use yew::prelude::*;

use crate::components::field_messages::FieldMessages;
use crate::components::plain_input::PlainInput;
use crate::components::pressure_input::PressureInput;
use crate::components::quantity_select::QuantitySelect;
use crate::components::site_select::SiteSelect;
use crate::fields::PressureText;
use crate::form::{Edit, ReadingForm, ReadingPart, Slot, SourceForm, SourcePart};
use crate::notes::Notes;
use crate::state::Message;

/// Props of [`QuickPressures`].
#[derive(Properties, PartialEq)]
pub struct QuickPressuresProps {
    /// The first arterial source, which the quick path edits.
    pub source: Option<SourceForm>,
    /// The other readings entered, by quantity.
    pub readings: Vec<(Quantity, ReadingForm)>,
    /// The messages of the check.
    pub notes: Rc<Notes>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// The blood pressure and one other reading.
#[component]
pub fn QuickPressures(props: &QuickPressuresProps) -> Html {
    let first = props.readings.first().map_or(Quantity::Icp, |(q, _)| *q);
    let chosen = use_state(|| first);
    let onpick = {
        let chosen = chosen.clone();
        Callback::from(move |q: Quantity| chosen.set(q))
    };
    let q = *chosen;
    let reading = props.readings.iter().find(|(k, _)| *k == q).map(|(_, r)| r);
    let value = reading.map_or_else(
        || PressureText::empty(unit_for(method_for(q))),
        |r| r.value.clone(),
    );
    let value_path = format!("readings.{q}.value");
    let bp_messages: Vec<Message> = ["", ".blood_pressure", ".systolic", ".diastolic", ".mean"]
        .iter()
        .flat_map(|k| props.notes.at(&format!("arterial[0]{k}")))
        .collect();
    let onsite = props.onedit.reform(|(m, l)| Edit::SourceSite(0, m, l));
    let onadd = props.onedit.reform(|_: MouseEvent| Edit::AddSource);
    html! {
        <fieldset class="group quick-pressures">
            <legend>{ "Pressures now" }</legend>
            if let Some(s) = &props.source {
                <div class="row">
                    <SiteSelect id="f-arterial-0-site" label="Taken with"
                        site={s.site()} onpick={onsite} />
                    <PlainInput label="Blood pressure" path="arterial[0].blood_pressure"
                        slot={Slot::Source(0, SourcePart::BloodPressure)} text={s.pressures.text()}
                        messages={Vec::new()} placeholder="sys/dia (mean), e.g. 100/60 (74)"
                        onedit={props.onedit.clone()} />
                </div>
                <FieldMessages id="f-arterial-0-bp-msg" messages={bp_messages} />
            } else {
                <button type="button" class="add" onclick={onadd}>{ "Add a blood pressure" }</button>
            }
            <div class="row">
                <QuantitySelect id="f-quick-quantity" label="Other pressure" chosen={q} {onpick} />
                <PressureInput label={q.label()} path={value_path.clone()}
                    slot={Slot::Reading(q, ReadingPart::Value)} field={value}
                    messages={props.notes.at(&value_path)} placeholder="if measured"
                    id={format!("f-quick-{q}")}
                    onedit={props.onedit.clone()} />
            </div>
        </fieldset>
    }
}

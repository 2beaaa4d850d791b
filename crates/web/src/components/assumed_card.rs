//! One assumed value: marked as an assumption wherever it appears, because
//! every result that uses it is only as good as the assumption.

use plumbline_core::reading::Quantity;
use plumbline_core::usual::levels_for;
use yew::prelude::*;

use crate::components::level_picker::LevelPicker;
use crate::components::pressure_input::PressureInput;
use crate::form::{AssumedForm, Edit, LevelPick, ReadingPart, Slot};
use crate::state::{Action, Handle};

/// Props of [`AssumedCard`].
#[derive(Properties, PartialEq)]
pub struct AssumedCardProps {
    /// Which pressure.
    pub quantity: Quantity,
    /// Its boxes.
    pub assumed: AssumedForm,
    /// The state.
    pub state: Handle,
}

/// One assumed value.
#[component]
pub fn AssumedCard(props: &AssumedCardProps) -> Html {
    let s = &props.state;
    let q = props.quantity;
    let path = format!("assume.{q}");
    let onpick = {
        let d = s.dispatcher();
        Callback::from(move |pick: LevelPick| d.dispatch(Action::Edit(Edit::AssumedLevel(q, pick))))
    };
    let onremove = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Edit(Edit::RemoveAssumed(q))))
    };
    let usual = q
        .usual_level()
        .map(|l| AttrValue::from(format!("its usual reference: {}", l.label())));
    let value_path = format!("{path}.value");
    html! {
        <fieldset class="card card-assumed" id={format!("f-assume-{q}")}>
            <legend>
                <span class="tag tag-assumed">{ "ASSUMED" }</span>
                { format!(" {} (not measured)", q.label()) }
            </legend>
            <p class="hint">{ "Only used while no measured value is entered; every result that uses it says so." }</p>
            <PressureInput label={format!("Assumed {}", q.label())} path={value_path.clone()}
                slot={Slot::Assumed(q, ReadingPart::Value)} field={props.assumed.value.clone()}
                messages={s.messages(&value_path)} dispatch={s.dispatcher()} />
            <LevelPicker path={format!("{path}.level")} level={props.assumed.level.clone()}
                choices={levels_for(q)} usual={usual}
                height_slot={Slot::Assumed(q, ReadingPart::LevelHeight)}
                onpick={onpick} state={s.clone()} dispatch={s.dispatcher()} />
            <button type="button" class="remove" onclick={onremove}>
                { format!("Remove assumed {}", q.label()) }
            </button>
        </fieldset>
    }
}

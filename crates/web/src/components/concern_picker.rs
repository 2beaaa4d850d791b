//! The organs of concern: the ones the answer at the top judges and names
//! the reading to defend for. None chosen: every organ with a result.

use plumbline_core::organ::Organ;
use yew::prelude::*;

use crate::form::Edit;

/// Props of [`ConcernPicker`].
#[derive(Properties, PartialEq)]
pub struct ConcernPickerProps {
    /// The organs chosen.
    pub concern: Vec<Organ>,
    /// Where changes go.
    pub onedit: Callback<Edit>,
}

/// One toggle per organ.
#[component]
pub fn ConcernPicker(props: &ConcernPickerProps) -> Html {
    html! {
        <fieldset class="group concern">
            <legend>{ "Organ of concern" }</legend>
            <div class="chips">
                { for Organ::ALL.into_iter().map(|o| {
                    let on = props.concern.contains(&o);
                    html! {
                        <button type="button" class={classes!("chip", on.then_some("chip-on"))}
                            aria-pressed={if on { "true" } else { "false" }}
                            onclick={props.onedit.reform(move |_: MouseEvent| Edit::Concern(o))}>
                            { o.label() }
                        </button>
                    }
                }) }
            </div>
            if props.concern.is_empty() {
                <p class="hint">{ "None chosen: the answer judges every organ with a result." }</p>
            }
        </fieldset>
    }
}

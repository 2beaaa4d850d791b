//! A picker of the pressures other than arterial, by the core's names: the
//! one the quick path shows, the one the detail adds.

use plumbline_core::reading::Quantity;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

/// Props of [`QuantitySelect`].
#[derive(Properties, PartialEq)]
pub struct QuantitySelectProps {
    /// The select's element id.
    pub id: AttrValue,
    /// Its label.
    pub label: AttrValue,
    /// The pressure chosen.
    pub chosen: Quantity,
    /// Called with the pressure picked.
    pub onpick: Callback<Quantity>,
}

/// The picker.
#[component]
pub fn QuantitySelect(props: &QuantitySelectProps) -> Html {
    let onchange = crate::components::picked(&props.onpick, |e: Event| {
        let key = e.target_unchecked_into::<HtmlSelectElement>().value();
        Quantity::ALL.into_iter().find(|q| q.key() == key)
    });
    html! {
        <div class="field">
            <label for={props.id.clone()}>{ &props.label }</label>
            <select id={props.id.clone()} {onchange}>
                { for Quantity::ALL.into_iter().map(|q| html! {
                    <option value={q.key()} selected={q == props.chosen}>{ q.label() }</option>
                }) }
            </select>
        </div>
    }
}

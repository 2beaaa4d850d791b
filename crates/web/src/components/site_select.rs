//! Where and how a blood pressure is taken, in one choice: a cuff on a
//! limb, or a line's transducer at the heart or at ear level, each named as
//! the core names a source ("L arm cuff"). Anything else is set in the
//! source's detail.

use plumbline_core::landmark::Landmark;
use plumbline_core::reading::{Level, Method};
use plumbline_core::usual::source_name;
use web_sys::HtmlSelectElement;
use yew::prelude::*;

use crate::form::sites;
use crate::show::short;

/// Props of [`SiteSelect`].
#[derive(Properties, PartialEq)]
pub struct SiteSelectProps {
    /// The select's element id.
    pub id: AttrValue,
    /// Its label.
    pub label: AttrValue,
    /// The site chosen, when it is one the list offers.
    pub site: Option<(Method, Landmark)>,
    /// Called with the site picked.
    pub onpick: Callback<(Method, Landmark)>,
}

/// A site in words.
fn words(method: Method, landmark: Landmark) -> String {
    let name = source_name(method, Level::At(landmark), &[]);
    match method {
        Method::Cuff => name,
        _ => format!("{name} at {}", short(landmark.label())),
    }
}

/// The site picker.
#[component]
pub fn SiteSelect(props: &SiteSelectProps) -> Html {
    let list = sites();
    let onchange = {
        let list = list.clone();
        crate::components::picked(&props.onpick, move |e: Event| {
            let key = e.target_unchecked_into::<HtmlSelectElement>().value();
            key.parse::<usize>().ok().and_then(|i| list.get(i).copied())
        })
    };
    html! {
        <div class="field">
            <label for={props.id.clone()}>{ &props.label }</label>
            <select id={props.id.clone()} {onchange}>
                if props.site.is_none() {
                    <option value="other" selected=true disabled=true>{ "as set in the detail below" }</option>
                }
                { for list.iter().enumerate().map(|(i, (m, l))| html! {
                    <option value={i.to_string()} selected={props.site == Some((*m, *l))}>{ words(*m, *l) }</option>
                }) }
            </select>
        </div>
    }
}

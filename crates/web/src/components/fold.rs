//! A folded section of the inputs, one tap away. It opens by itself when a
//! real problem lies inside, and only the clinician closes it again: a fold
//! never shuts under the finger because a mistake was just put right.

use web_sys::HtmlDetailsElement;
use yew::prelude::*;

/// Props of [`Fold`].
#[derive(Properties, PartialEq)]
pub struct FoldProps {
    /// The title, always in view.
    pub title: AttrValue,
    /// Whether a problem lies inside (the fold then opens).
    pub problem: bool,
    /// What it holds.
    pub children: Html,
}

/// The fold.
#[component]
pub fn Fold(props: &FoldProps) -> Html {
    let open = use_state_eq(|| props.problem);
    {
        let open = open.clone();
        use_effect_with(props.problem, move |problem| {
            if *problem {
                open.set(true);
            }
        });
    }
    let ontoggle = {
        let open = open.clone();
        Callback::from(move |e: Event| {
            open.set(e.target_unchecked_into::<HtmlDetailsElement>().open());
        })
    };
    html! {
        <details class="more fold" open={*open} {ontoggle}>
            <summary>{ &props.title }</summary>
            { props.children.clone() }
        </details>
    }
}

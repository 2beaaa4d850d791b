//! A section folded away, one tap from view: the inputs' folds, an organ's
//! derivation, the case as JSON. What it holds is built and put in the page
//! only while it is open, so a keystroke elsewhere does not re-render (nor
//! the browser lay out) the many boxes and words nobody is looking at.
//!
//! It opens by itself when `open_when` becomes true (a real problem inside,
//! a value entered), and only the clinician closes it again: a fold never
//! shuts under the finger because a mistake was just put right.

use web_sys::HtmlDetailsElement;
use yew::prelude::*;

/// Props of [`Fold`].
#[derive(Properties, PartialEq)]
pub struct FoldProps {
    /// The title, always in view.
    pub title: AttrValue,
    /// Opens the fold when it becomes true (at the start, or later).
    #[prop_or_default]
    pub open_when: bool,
    /// Classes beside `more`.
    #[prop_or_default]
    pub class: Classes,
    /// The title's id, for a section labelled by it.
    #[prop_or_default]
    pub title_id: Option<AttrValue>,
    /// What it holds.
    pub children: Html,
}

/// Whether a `<details>` is open, starting as `initially`, and the handler
/// for its `toggle` event that follows the clinician's taps: what builds
/// its body only while open (the fold, an organ's derivation) shares it.
#[hook]
pub fn use_open(initially: bool) -> (UseStateHandle<bool>, Callback<Event>) {
    let open = use_state_eq(|| initially);
    let ontoggle = {
        let open = open.clone();
        Callback::from(move |e: Event| {
            open.set(e.target_unchecked_into::<HtmlDetailsElement>().open());
        })
    };
    (open, ontoggle)
}

/// The fold.
#[component]
pub fn Fold(props: &FoldProps) -> Html {
    let (open, ontoggle) = use_open(props.open_when);
    {
        let open = open.clone();
        use_effect_with(props.open_when, move |when| {
            if *when {
                open.set(true);
            }
        });
    }
    html! {
        <details class={classes!("more", props.class.clone())} open={*open} {ontoggle}>
            <summary id={props.title_id.clone()}>{ &props.title }</summary>
            if *open {
                { props.children.clone() }
            }
        </details>
    }
}

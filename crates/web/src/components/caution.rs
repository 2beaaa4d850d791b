//! The caution: always on screen, always in the printout. On a phone it
//! keeps to one line (the core's first sentence) with the full text one tap
//! away; wider screens and the printout show it whole.

use plumbline_core::report::CAUTION;
use yew::prelude::*;

/// Props of [`Caution`].
#[derive(Properties, PartialEq)]
pub struct CautionProps {}

/// The caution's first sentence: what it is before anything else.
fn first_sentence(text: &str) -> &str {
    text.find(". ")
        .map_or(text, |end| text.get(..=end).unwrap_or(text))
}

/// The caution bar, fixed to the foot of the screen.
#[component]
pub fn Caution(_props: &CautionProps) -> Html {
    let open = use_state(|| false);
    let ontoggle = {
        let open = open.clone();
        Callback::from(move |_: MouseEvent| open.set(!*open))
    };
    html! {
        <aside class={classes!("caution", open.then_some("caution-open"))} aria-label="Caution">
            <svg class="caution-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                <path d="M12 2 L23 21 H1 Z" />
                <rect x="11" y="8" width="2" height="7" class="glyph" />
                <rect x="11" y="17" width="2" height="2" class="glyph" />
            </svg>
            <p class="caution-short" aria-hidden="true"><strong>{ "Caution. " }</strong>{ first_sentence(CAUTION) }</p>
            <p class="caution-full"><strong>{ "Caution. " }</strong>{ CAUTION }</p>
            <button type="button" class="caution-more" onclick={ontoggle}
                aria-expanded={if *open { "true" } else { "false" }}>
                { if *open { "Less" } else { "More" } }
            </button>
        </aside>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_short_line_is_the_cautions_first_sentence() {
        let short = first_sentence(CAUTION);
        assert!(CAUTION.starts_with(short) && short.ends_with('.'));
        assert!(short.len() < CAUTION.len());
        assert_eq!(first_sentence("One only"), "One only");
    }
}

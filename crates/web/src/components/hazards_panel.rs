//! What the same physics warns of beyond perfusion, as the core found it:
//! the venous pressure at the operative site (air entrainment when it is
//! below atmospheric) and where a ventricular drain drains once the bed
//! moves under its chamber.

use plumbline_core::report::{DrainReport, VenousSite};
use yew::prelude::*;

/// Props of [`HazardsPanel`].
#[derive(Properties, PartialEq)]
pub struct HazardsPanelProps {
    /// The operative site's venous pressure, if the core gave one.
    pub venous_site: Option<VenousSite>,
    /// The drain's opening pressure, if the case has a drain.
    pub drain: Option<DrainReport>,
}

/// The panel; nothing when there is nothing to say.
#[component]
pub fn HazardsPanel(props: &HazardsPanelProps) -> Html {
    if props.venous_site.is_none() && props.drain.is_none() {
        return html! {};
    }
    let alarm = props.venous_site.as_ref().is_some_and(|s| s.alarm);
    html! {
        <section class="hazards" aria-labelledby="h-hazards">
            <h3 id="h-hazards">{ "Venous pressure and drains" }</h3>
            if let Some(site) = &props.venous_site {
                <p class={classes!("hazard", alarm.then_some("hazard-warn"))}>{ site.words.clone() }</p>
            }
            if let Some(drain) = &props.drain {
                <p class="hazard">{ drain.words.clone() }</p>
            }
        </section>
    }
}

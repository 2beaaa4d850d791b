//! The readings the check used, as read: each arterial source and other
//! pressure with its method, unit and level, assumed values marked. It is
//! the handover's record of the inputs.

use yew::prelude::*;

use crate::show::rounded;
use crate::state::Checked;

/// Props of [`ReadingsSummary`].
#[derive(Properties, PartialEq)]
pub struct ReadingsSummaryProps {
    /// The last completed check.
    pub checked: std::rc::Rc<Checked>,
}

/// The readings used.
#[component]
pub fn ReadingsSummary(props: &ReadingsSummaryProps) -> Html {
    let c = &props.checked;
    let part = |name: &str, v: Option<f64>| v.map(|v| format!("{name} {}", rounded(v)));
    html! {
        <section class="readings-summary" aria-labelledby="h-used">
            <h3 id="h-used">{ "Readings used" }</h3>
            <ul>
                { for c.report.arterial.iter().map(|a| {
                    let values = [part("sys", a.systolic_mmhg), part("dia", a.diastolic_mmhg), part("mean", a.mean_mmhg)]
                        .into_iter().flatten().collect::<Vec<_>>().join(" / ");
                    html! {
                        <li>
                            <strong>{ a.id.clone() }</strong>
                            { format!(" ({}; level: {}): {values} mmHg", a.method.label(), a.level) }
                            if a.primary { <span class="tag">{ "drives the results" }</span> }
                        </li>
                    }
                }) }
                { for c.case.readings.iter().map(|(q, r)| html! {
                    <li>
                        <strong>{ q.label() }</strong>
                        { format!(" ({}; level: {}): {}", r.method.label(), r.level.describe(), r.value) }
                    </li>
                }) }
                { for c.case.assume.iter().map(|(q, a)| html! {
                    <li>
                        <span class="tag tag-assumed">{ "ASSUMED" }</span>
                        <strong>{ format!(" {}", q.label()) }</strong>
                        { format!(" (not measured; level: {}): {}",
                            a.level.map(|l| l.describe())
                                .or_else(|| q.usual_level().map(|l| l.label().to_owned()))
                                .unwrap_or_default(),
                            a.value) }
                    </li>
                }) }
            </ul>
        </section>
    }
}

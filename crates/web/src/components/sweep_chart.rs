//! The site reading each target needs across backrest angles, as a chart
//! and, for screen readers and print, as a table.

use plumbline_core::report::Sweep;
use yew::prelude::*;

use crate::chart::{Chart, Mark, BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
use crate::show::rounded;

/// Props of [`SweepChart`].
#[derive(Properties, PartialEq)]
pub struct SweepChartProps {
    /// The sweeps.
    pub sweeps: Vec<Sweep>,
    /// The current backrest angle.
    pub now_deg: Option<f64>,
}

fn swatch(mark: Mark) -> Html {
    html! {
        <svg class="swatch" viewBox="0 0 40 16" aria-hidden="true" focusable="false">
            <line x1="2" y1="8" x2="38" y2="8" class={classes!("series", mark.class())}
                stroke-dasharray={mark.dash()} />
            <path d={mark.path(20.0, 8.0)} class={classes!("marker", mark.class())} />
        </svg>
    }
}

/// The chart.
#[component]
pub fn SweepChart(props: &SweepChartProps) -> Html {
    if props.sweeps.is_empty() {
        return html! {
            <section class="panel" aria-labelledby="h-sweep">
                <h3 id="h-sweep">{ "Needed reading by backrest angle" }</h3>
                <p class="hint">{ "Shown for positions on the back with a body height, for targets driven by an arterial source." }</p>
            </section>
        };
    }
    let chart = Chart::new(&props.sweeps, props.now_deg);
    let angles: Vec<f64> = props
        .sweeps
        .first()
        .map(|s| {
            s.points
                .iter()
                .map(|p| p.backrest_deg)
                .filter(|d| d % 15.0 == 0.0)
                .collect()
        })
        .unwrap_or_default();
    html! {
        <section class="panel" aria-labelledby="h-sweep">
            <h3 id="h-sweep">{ "Needed reading by backrest angle" }</h3>
            <figure class="chart">
                <svg viewBox={format!("0 0 {WIDTH} {HEIGHT}")} role="img"
                    aria-label="Chart of the site reading each target needs at backrest angles 0 to 90 degrees; the same values are in the table below.">
                    { for chart.y_ticks.iter().map(|t| html! {
                        <>
                            <line x1={LEFT.to_string()} x2={RIGHT.to_string()}
                                y1={format!("{:.1}", t.at)} y2={format!("{:.1}", t.at)} class="grid" />
                            <text x={format!("{:.1}", LEFT - 6.0)} y={format!("{:.1}", t.at + 5.0)}
                                class="tick tick-y">{ t.text.clone() }</text>
                        </>
                    }) }
                    { for chart.x_ticks.iter().map(|t| html! {
                        <text x={format!("{:.1}", t.at)} y={format!("{:.1}", BOTTOM + 20.0)}
                            class="tick tick-x">{ t.text.clone() }</text>
                    }) }
                    <text x={format!("{:.1}", (LEFT + RIGHT) / 2.0)} y={format!("{:.1}", HEIGHT - 4.0)}
                        class="axis-title">{ "backrest angle" }</text>
                    <text x="12" y={format!("{:.1}", (TOP + BOTTOM) / 2.0)} class="axis-title"
                        transform={format!("rotate(-90 12 {:.1})", (TOP + BOTTOM) / 2.0)}>{ "mmHg" }</text>
                    if let Some(x) = chart.now_x {
                        <line x1={format!("{x:.1}")} x2={format!("{x:.1}")} y1={TOP.to_string()}
                            y2={BOTTOM.to_string()} class="now" />
                        <text x={format!("{:.1}", x + 4.0)} y={format!("{:.1}", TOP + 14.0)} class="now-label">
                            { "now" }
                        </text>
                    }
                    { for chart.lines.iter().map(|l| html! {
                        <>
                            <polyline points={l.points.clone()} class={classes!("series", l.mark.class())}
                                stroke-dasharray={l.mark.dash()} />
                            { for l.markers.iter().map(|(x, y)| html! {
                                <path d={l.mark.path(*x, *y)} class={classes!("marker", l.mark.class())} />
                            }) }
                        </>
                    }) }
                </svg>
                <figcaption>
                    <ul class="legend">
                        { for chart.lines.iter().map(|l| html! {
                            <li>{ swatch(l.mark) }<span>{ l.title.clone() }</span></li>
                        }) }
                    </ul>
                    { props.sweeps.first().map(|s| s.note.clone()).unwrap_or_default() }
                </figcaption>
            </figure>
            <details class="more">
                <summary>{ "The same as a table" }</summary>
                <table>
                    <caption>{ "Site reading needed, mmHg, by backrest angle" }</caption>
                    <thead>
                        <tr>
                            <th scope="col">{ "Target (site)" }</th>
                            { for angles.iter().map(|a| html! { <th scope="col">{ format!("{a:.0}°") }</th> }) }
                        </tr>
                    </thead>
                    <tbody>
                        { for props.sweeps.iter().zip(chart.lines.iter()).map(|(s, l)| html! {
                            <tr>
                                <th scope="row">{ l.title.clone() }</th>
                                { for s.points.iter().filter(|p| p.backrest_deg % 15.0 == 0.0).map(|p| html! {
                                    <td class="num">{ rounded(p.needed_mmhg) }</td>
                                }) }
                            </tr>
                        }) }
                    </tbody>
                </table>
            </details>
        </section>
    }
}

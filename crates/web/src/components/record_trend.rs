//! One organ's trend over the record: the organ-level value drawn from the
//! core's series, each target's line with the time outside it hatched, the
//! worst point ringed, position changes numbered; the exposure numbers
//! beside it, so nothing depends on reading the picture.

use std::rc::Rc;

use plumbline_core::record::TargetExposure;
use yew::prelude::*;

use crate::components::record_numbers::RecordNumbers;
use crate::record::trend::{Trend, HEIGHT, WIDTH};

/// Props of [`RecordTrend`].
#[derive(Properties, PartialEq)]
pub struct RecordTrendProps {
    /// The chart laid out.
    pub trend: Rc<Trend>,
    /// The exposure of each target drawn, in the chart's order.
    pub exposures: Vec<TargetExposure>,
    /// The record's clock start, seconds after midnight.
    pub clock_start: Option<f64>,
    /// The chart's number on the page, for unique ids.
    pub index: usize,
}

/// The chart and its numbers.
#[component]
pub fn RecordTrend(props: &RecordTrendProps) -> Html {
    let t = &props.trend;
    let heading = format!("h-trend-{}", props.index);
    html! {
        <section class="trend" aria-labelledby={heading.clone()}>
            <h3 id={heading}>{ t.title.clone() }</h3>
            <div class="trend-body">
                <figure class="chart trend-chart">
                    <svg viewBox={format!("0 0 {WIDTH} {HEIGHT}")} role="img" aria-label={t.description.clone()}>
                        { Html::from_html_unchecked(AttrValue::from(t.svg())) }
                    </svg>
                    <figcaption>
                        <ul class="legend">
                            <li><span class="key key-curve" aria-hidden="true"></span>
                                { format!("{} over time, at the organ's own height; times are h:mm from the start", t.title) }</li>
                            { for t.limits.iter().zip(&props.exposures).map(|(l, x)| html! {
                                <li>
                                    <svg class="swatch" viewBox="0 0 40 16" aria-hidden="true" focusable="false">
                                        <rect x="1" y="2" width="38" height="12" class={classes!("shade", l.shade_class())} />
                                        <line x1="1" y1="2" x2="39" y2="2" class={classes!("series", l.mark.class())}
                                            stroke-dasharray={l.mark.dash()} />
                                    </svg>
                                    { format!("{}: hatched where {}", x.target, if l.at_least { "below" } else { "above" }) }
                                </li>
                            }) }
                            <li><span class="key key-worst" aria-hidden="true"></span>{ "ringed: the worst value" }</li>
                            if !t.marks.is_empty() {
                                <li><span class="key key-mark" aria-hidden="true"></span>{ "numbered line: a position change (see Positions)" }</li>
                            }
                        </ul>
                    </figcaption>
                </figure>
                <div class="trend-numbers">
                    { for props.exposures.iter().map(|x| html! {
                        <RecordNumbers exposure={x.clone()} clock_start={props.clock_start} />
                    }) }
                </div>
            </div>
        </section>
    }
}

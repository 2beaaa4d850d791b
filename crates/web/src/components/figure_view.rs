//! The patient in position, drawn from the core's figure, with the heights
//! that matter labelled.

use yew::prelude::*;

use crate::picture::{Picture, BODY_WIDTH, LABEL_X, WIDTH};
use crate::state::Checked;

/// Props of [`FigureView`].
#[derive(Properties, PartialEq)]
pub struct FigureViewProps {
    /// The last completed check.
    pub checked: std::rc::Rc<Checked>,
    /// Whether the form has changed since (the picture is then of the last
    /// good check, not of what the boxes say).
    pub stale: bool,
}

/// The picture.
#[component]
pub fn FigureView(props: &FigureViewProps) -> Html {
    let report = &props.checked.report;
    let Some(figure) = report.figure.as_ref() else {
        return html! {
            <p class="hint">{ "No picture: give the posture and the body height." }</p>
        };
    };
    let picture = Picture::new(figure, &report.heights, &props.checked.key_landmarks());
    let description = picture
        .labels
        .iter()
        .map(|l| l.full.clone())
        .collect::<Vec<_>>()
        .join("; ");
    html! {
        <figure class={classes!("picture", props.stale.then_some("stale"))}>
            if props.stale {
                <p class="stale-note">{ "STALE: the position of the last good check" }</p>
            }
            <svg viewBox={format!("0 0 {WIDTH} {:.0}", picture.height)} role="img"
                aria-labelledby="picture-title picture-desc">
                <title id="picture-title">
                    { format!("The patient: {}", report.position.clone().unwrap_or_default()) }
                </title>
                <desc id="picture-desc">{ description }</desc>
                <line x1="0" x2={(BODY_WIDTH + 6.0).to_string()} y1={format!("{:.1}", picture.heart_y)}
                    y2={format!("{:.1}", picture.heart_y)} class="heart-line" />
                { for picture.strokes.iter().map(|s| html! {
                    <polyline points={s.points.clone()} class={classes!("limb", format!("limb-{}", s.name))} />
                }) }
                if let Some((c, r)) = picture.head {
                    <circle cx={format!("{:.1}", c.x)} cy={format!("{:.1}", c.y)} r={format!("{r:.1}")}
                        class="head" />
                }
                { for picture.labels.iter().map(|l| html! {
                    <line x1={format!("{:.1}", l.dot.x)} y1={format!("{:.1}", l.dot.y)}
                        x2={format!("{:.1}", LABEL_X - 4.0)} y2={format!("{:.1}", l.at.y - 4.0)}
                        class="leader" />
                }) }
                { for picture.dots.iter().map(|d| html! {
                    <circle cx={format!("{:.1}", d.at.x)} cy={format!("{:.1}", d.at.y)}
                        r={if d.labelled { "4.5" } else { "2.5" }}
                        class={if d.labelled { "dot dot-key" } else { "dot" }} />
                }) }
                { for picture.labels.iter().map(|l| html! {
                    <text x={format!("{:.1}", l.at.x)} y={format!("{:.1}", l.at.y)} class="label">
                        <title>{ l.full.clone() }</title>
                        { l.text.clone() }
                    </text>
                }) }
            </svg>
            <figcaption>
                { format!("{}; dashed line: heart reference level. Heights in cm above (+) or below (−) it.", figure.view) }
            </figcaption>
        </figure>
    }
}

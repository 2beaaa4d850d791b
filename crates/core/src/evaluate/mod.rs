//! The formulas: each organ metric from a scene, with the steps that
//! produced it written out in words and numbers.
//!
//! Every pressure is first carried through its own fluid (the hydrostatic
//! equation) to where the metric refers it — the organ's own height, or the
//! zero of the metric's published definition ([`table`]) — then combined.
//! Outflow follows the waterfall rule: the higher of the venous pressure
//! and the pressure around the veins wins, and the result says which. A
//! metric that cannot be computed says what is missing instead.
//!
//! A [`Ctx`] made with [`Ctx::quiet`] writes no words: shifted scenes and
//! sweeps need only the number.

mod baseline;
mod ctx;
mod linear;
mod population;
pub mod table;

pub use baseline::baseline_inflow;
pub use ctx::Ctx;
use ctx::{missing_reading, mm};
pub use linear::{Input, Linear, Term};
pub use table::{Frame, Lead, Row};

use crate::error::{Error, Errors};
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::Quantity;
use crate::scene::Place;
use crate::units::{cm, to_cm, to_mmhg, Length, Pressure};

/// One step of a derivation: what was done, and the value it gave.
#[derive(Clone, Debug, PartialEq)]
pub struct Step {
    /// The step in words, with its numbers.
    pub what: String,
    /// The value it produced.
    pub value: Pressure,
}

/// Which outflow won the waterfall.
#[derive(Clone, Debug, PartialEq)]
pub struct Outflow {
    /// The effective back pressure.
    pub value: Pressure,
    /// The pressure that set it.
    pub winner: Quantity,
    /// Every candidate where the metric refers it.
    pub candidates: Vec<(Quantity, Pressure)>,
}

/// A computed metric.
#[derive(Clone, Debug, PartialEq)]
pub struct Value {
    /// The value.
    pub value: Pressure,
    /// How it was computed (empty from a quiet context).
    pub steps: Vec<Step>,
    /// Whether a site reading can bring it to a target: false for a
    /// surrounding pressure (ICP, CSF, IAP), which no arterial reading moves.
    pub adjustable: bool,
    /// The waterfall's choice, for perfusion metrics.
    pub outflow: Option<Outflow>,
    /// Assumed values it used.
    pub assumed: Vec<Quantity>,
    /// The metric as a formula of its inputs, for this position.
    pub linear: Linear,
}

impl Value {
    /// The reading a site would have to change to move the metric, with
    /// the metric's change per unit of it (`scale`): its lead term.
    pub fn driver(&self) -> Option<Term> {
        self.adjustable.then_some(self.linear.lead)
    }
}

/// What a metric lacks, as one `Missing` error naming the field to fill.
pub(crate) fn need(field: impl Into<String>, what: impl Into<String>) -> Errors {
    Errors::from(Error::missing(field, what))
}

/// What a metric lacks, in words, once each: the `needs` of a report.
pub fn needs(errors: &Errors) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for e in errors.iter() {
        let m = e.message();
        if !out.contains(&m) {
            out.push(m);
        }
    }
    out
}

/// A place and its height in the scene: where an organ is checked, or
/// where a pressure is referred to.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Spot {
    /// The landmark or explicit height.
    pub place: Place,
    /// Its height above the heart reference.
    pub height: Length,
}

impl Spot {
    /// The heart reference itself.
    pub fn heart() -> Spot {
        Spot {
            place: Place::At(Landmark::Heart),
            height: cm(0.0),
        }
    }

    /// The spot in words, after "at": "the tragus (ear level)", "a point
    /// 12.0 cm above the heart reference".
    pub fn words(&self) -> String {
        match self.place {
            Place::At(landmark) => format!("the {}", landmark.label()),
            Place::Height { height, .. } => format!(
                "a point {:.1} cm {} the heart reference",
                to_cm(height).abs(),
                if to_cm(height) < 0.0 {
                    "below"
                } else {
                    "above"
                }
            ),
        }
    }
}

/// Where an organ is checked in this scene: its landmark (the tragus or the
/// vertex for the brain, the chosen cord segment or kidney), or where IOP
/// or compartment pressure was taken.
///
/// # Errors
/// The eye and limb are checked where IOP and compartment pressure were
/// taken; without those readings there is no level.
pub fn organ_place(ctx: &Ctx<'_>, organ: Organ) -> Result<Place, Errors> {
    let scene = ctx.scene();
    let local = |q: Quantity| {
        scene
            .readings
            .get(&q)
            .map(|r| r.place)
            .ok_or_else(|| need(format!("readings.{q}"), missing_reading(q)))
    };
    let chosen =
        |default: Landmark| Place::At(scene.organ_levels.get(&organ).copied().unwrap_or(default));
    Ok(match organ {
        Organ::Brain => chosen(Landmark::Tragus),
        Organ::Abdomen => Place::At(Landmark::IliacCrest),
        Organ::Heart | Organ::HeartCpr | Organ::WholeBody => Place::At(Landmark::Heart),
        Organ::Cord => chosen(Landmark::CordThoracic),
        Organ::Kidney => match scene.organ_levels.get(&organ) {
            Some(l) => Place::At(*l),
            // The higher kidney is the worse perfused one: check that one.
            None => Place::At(
                match (
                    ctx.height(Landmark::KidneyLeft),
                    ctx.height(Landmark::KidneyRight),
                ) {
                    (Some(l), Some(r)) if r > l => Landmark::KidneyRight,
                    (None, Some(_)) => Landmark::KidneyRight,
                    _ => Landmark::KidneyLeft,
                },
            ),
        },
        Organ::Eye => local(Quantity::Iop)?,
        Organ::Limb => local(Quantity::Compartment)?,
    })
}

/// Computes one metric of one organ in the frame its targets are judged in,
/// with inflow from arterial source `source` (the primary source when
/// `None`).
///
/// # Errors
/// What is missing, in words: a reading, a height, a component.
pub fn metric(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    source: Option<usize>,
) -> Result<Value, Errors> {
    let frame = table::row(organ, metric).map_or(Frame::OrganLevel, |r| r.judged);
    metric_in(ctx, organ, metric, source, frame)
}

/// Computes one metric of one organ in `frame`.
///
/// # Errors
/// What is missing, in words; a metric the organ does not have, or has
/// in no such frame.
pub fn metric_in(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    source: Option<usize>,
    frame: Frame,
) -> Result<Value, Errors> {
    let formula = table::row(organ, metric)
        .and_then(|r| r.formula(frame))
        .ok_or_else(|| need("", format!("{} has no {metric}", organ.label())))?;
    let here = ctx.spot(organ_place(ctx, organ)?)?;
    let mut steps = Vec::new();
    let mut assumed = Vec::new();
    let lead = match formula.lead {
        Lead::PopulationArm(component) => {
            return population::population(
                ctx,
                component,
                source,
                formula.back,
                here,
                (steps, assumed),
            )
        }
        Lead::Arterial(component) => {
            let to = match frame {
                Frame::OrganLevel => here,
                Frame::Convention => Spot::heart(),
            };
            ctx.source(source)
                .and_then(|i| ctx.arterial_at(&mut steps, i, component, Some(to)))
                .map(|lead| (lead, true))
        }
        Lead::Reading(q) => ctx
            .reading_needed(&mut steps, &mut assumed, q, frame, here)
            .map(|lead| (lead, q == Quantity::CprAorticRelaxation)),
    };
    if formula.back.is_empty() {
        let ((value, lead), adjustable) = lead?;
        return Ok(Value {
            value,
            steps,
            adjustable,
            outflow: None,
            assumed,
            linear: Linear::single(lead),
        });
    }
    let outflow = waterfall(ctx, &mut steps, &mut assumed, formula.back, frame, here);
    let (((inflow, lead), adjustable), (outflow, back)) = both(lead, outflow)?;
    let value = inflow - outflow.value * formula.factor;
    ctx.note(
        &mut steps,
        || {
            let times = if formula.factor == 1.0 {
                String::new()
            } else {
                format!("{} × ", formula.factor)
            };
            format!(
                "{} = {} − {times}{} = {}",
                organ.metric_label(metric),
                mm(inflow),
                mm(outflow.value),
                mm(value)
            )
        },
        value,
    );
    Ok(Value {
        value,
        steps,
        adjustable,
        outflow: Some(outflow),
        assumed,
        linear: Linear {
            lead,
            subtract: back,
            factor: formula.factor,
        },
    })
}

/// Both results, or everything either is missing.
fn both<A, B>(a: Result<A, Errors>, b: Result<B, Errors>) -> Result<(A, B), Errors> {
    match (a, b) {
        (Ok(a), Ok(b)) => Ok((a, b)),
        (a, b) => Err([a.err(), b.err()].into_iter().flatten().flatten().collect()),
    }
}

/// The effective back pressure: the highest candidate. Needed candidates
/// must be present; of optional-only lists, at least one.
fn waterfall(
    ctx: &Ctx<'_>,
    steps: &mut Vec<Step>,
    assumed: &mut Vec<Quantity>,
    candidates: &[(Quantity, bool)],
    frame: Frame,
    organ: Spot,
) -> Result<(Outflow, Vec<Term>), Errors> {
    let mut found = Vec::new();
    let mut terms = Vec::new();
    let mut missing = Errors::default();
    for (q, needed) in candidates {
        match ctx.reading_at(steps, assumed, *q, frame, organ) {
            Ok(Some((p, term))) => {
                found.push((*q, p));
                terms.push(term);
            }
            Ok(None) if *needed => {
                missing.push(Error::missing(format!("readings.{q}"), missing_reading(*q)))
            }
            Ok(None) => {}
            Err(m) => missing.extend(m),
        }
    }
    if found.is_empty() && missing.is_empty() {
        let first = candidates
            .first()
            .map_or(String::new(), |(q, _)| format!("readings.{q}"));
        missing.push(Error::missing(
            first,
            format!(
                "at least one of {}",
                candidates
                    .iter()
                    .map(|(q, _)| missing_reading(*q))
                    .collect::<Vec<_>>()
                    .join(" or ")
            ),
        ));
    }
    if !missing.is_empty() {
        return Err(missing);
    }
    let Some(&(winner, value)) = found
        .iter()
        .max_by(|a, b| to_mmhg(a.1).total_cmp(&to_mmhg(b.1)))
    else {
        return Err(missing);
    };
    if found.len() > 1 {
        ctx.note(
            steps,
            || {
                let listed = found
                    .iter()
                    .map(|(q, p)| format!("{} {}", q.label(), mm(*p)))
                    .collect::<Vec<_>>()
                    .join(", ");
                let collapse = if found
                    .iter()
                    .any(|(q, p)| *q == Quantity::Cvp && to_mmhg(*p) < 0.0)
                {
                    " (venous pressure below zero here: the veins collapse)"
                } else {
                    ""
                };
                format!(
                    "outflow: the higher of {listed}{collapse} → {} {}",
                    winner.label(),
                    mm(value)
                )
            },
            value,
        );
    }
    Ok((
        Outflow {
            value,
            winner,
            candidates: found,
        },
        terms,
    ))
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::case::Case;
    use crate::scene::Scene;

    /// The linear form of every metric, in both frames, fed the scene's own
    /// readings, gives the value computed step by step; a quiet context
    /// gives the same value without words.
    #[test]
    fn linear_forms_reproduce_their_values() {
        let scenes = [
            crate::demo::CASE_JSON,
            r#"{"format": "plumbline-case", "version": 1,
                "patient": {"height": "170 cm"}, "position": {"posture": "sitting"},
                "arterial": [{"id": "arm", "method": "cuff", "level": "upper_arm_left",
                              "systolic": "120 mmHg", "diastolic": "70 mmHg"}],
                "readings": {"icp": {"value": "15 cmH2O", "method": "drain_scale", "level": "tragus"},
                             "cvp": {"value": "9 mmHg", "method": "transducer", "level": "heart"},
                             "iap": {"value": "13 mmHg", "method": "transducer", "level": "iliac_crest"},
                             "csf": {"value": "11 mmHg", "method": "transducer", "level": {"height": "-8 cm"}},
                             "iop": {"value": "17 mmHg", "method": "tonometer", "level": "eye_right"}}}"#,
        ];
        let mut checked = 0;
        for text in scenes {
            let scene = Scene::from_case(&Case::from_json(text).unwrap()).unwrap();
            let ctx = Ctx::new(&scene);
            let quiet = Ctx::quiet(&scene);
            let reading = |input: Input| match input {
                Input::Arterial(i, c) => scene.arterial.get(i)?.component(c),
                Input::Reading(q) => scene.readings.get(&q).map(|r| r.value),
            };
            for row in table::TABLE {
                for frame in [Frame::OrganLevel, Frame::Convention] {
                    let Ok(v) = metric_in(&ctx, row.organ, row.metric, None, frame) else {
                        continue;
                    };
                    let again = v.linear.eval(reading).unwrap();
                    assert!(
                        (to_mmhg(again) - to_mmhg(v.value)).abs() < 1e-9,
                        "{} {} {frame:?}: {} vs {}",
                        row.organ,
                        row.metric,
                        to_mmhg(again),
                        to_mmhg(v.value)
                    );
                    assert!(!v.steps.is_empty());
                    let q = metric_in(&quiet, row.organ, row.metric, None, frame).unwrap();
                    assert_eq!(q.value, v.value);
                    assert!(q.steps.is_empty());
                    checked += 1;
                }
            }
        }
        assert!(checked > 20, "only {checked} metrics checked");
    }
}

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
mod linear;
mod population;
pub mod table;

use std::collections::BTreeMap;

pub use baseline::baseline_inflow;
pub use linear::{Input, Linear, Term};
pub use table::{Frame, Lead, Row};

use crate::fluid::Fluid;
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, Quantity};
use crate::scene::{Place, Scene};
use crate::units::{cm, column, to_cm, to_kg_per_m3, to_mmhg, Length, Pressure};

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

/// Why a metric could not be computed: the things to add, in words.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Missing(pub Vec<String>);

impl Missing {
    fn one(what: impl Into<String>) -> Self {
        Missing(vec![what.into()])
    }
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

/// A scene with its landmark heights worked out, ready for formulas.
pub struct Ctx<'a> {
    scene: &'a Scene,
    heights: BTreeMap<Landmark, Length>,
    explain: bool,
}

fn mm(p: Pressure) -> String {
    format!("{:.1} mmHg", to_mmhg(p))
}

impl<'a> Ctx<'a> {
    /// Works out the heights of `scene` (with any shift in force); its
    /// values come with their derivations.
    pub fn new(scene: &'a Scene) -> Self {
        Ctx {
            scene,
            heights: scene.heights(),
            explain: true,
        }
    }

    /// As [`Ctx::new`], without derivations: numbers only.
    pub fn quiet(scene: &'a Scene) -> Self {
        Ctx {
            explain: false,
            ..Ctx::new(scene)
        }
    }

    /// The scene.
    pub fn scene(&self) -> &Scene {
        self.scene
    }

    /// A landmark's height, if known.
    pub fn height(&self, landmark: Landmark) -> Option<Length> {
        self.heights.get(&landmark).copied()
    }

    /// Adds a step to a derivation, writing its words only when asked to.
    fn note(&self, steps: &mut Vec<Step>, what: impl FnOnce() -> String, value: Pressure) {
        if self.explain {
            steps.push(Step {
                what: what(),
                value,
            });
        }
    }

    fn landmark_height(&self, landmark: Landmark) -> Result<Length, Missing> {
        self.height(landmark).ok_or_else(|| {
            Missing::one(format!(
                "the height of the {} (measure it or give the position and patient height)",
                landmark.label()
            ))
        })
    }

    /// A place's height in this scene.
    ///
    /// # Errors
    /// A landmark with no height (no position and no measurement).
    pub fn place_height(&self, place: Place) -> Result<Length, Missing> {
        match place {
            Place::At(landmark) => self.landmark_height(landmark),
            Place::Height { height, .. } => Ok(height),
        }
    }

    fn spot(&self, place: Place) -> Result<Spot, Missing> {
        Ok(Spot {
            place,
            height: self.place_height(place)?,
        })
    }

    /// `value`, read at `from`, carried through `fluid` to `to`; taken as
    /// read when `to` is `None`. Returns the value there and the term.
    #[allow(clippy::too_many_arguments)]
    fn carry(
        &self,
        steps: &mut Vec<Step>,
        name: &str,
        input: Input,
        value: Pressure,
        fluid: Fluid,
        from: Spot,
        to: Option<Spot>,
    ) -> (Pressure, Term) {
        let Some(to) = to else {
            self.note(
                steps,
                || format!("{name} taken as read at its own zero, {}", from.words()),
                value,
            );
            return (
                value,
                Term {
                    input,
                    scale: 1.0,
                    offset: Pressure::default(),
                    carried: None,
                },
            );
        };
        let dh = to.height - from.height;
        let shift = column(self.scene.density(fluid), dh);
        let result = value - shift;
        self.note(
            steps,
            || {
                if to_cm(dh).abs() < 1e-9 {
                    format!("{name} at {}: same height, no correction", to.words())
                } else {
                    format!(
                        "{name} at {}: {} − {} column of {:.1} cm at {:.0} kg/m³ ({}) = {}",
                        to.words(),
                        mm(value),
                        fluid.label(),
                        to_cm(dh),
                        to_kg_per_m3(self.scene.density(fluid)),
                        mm(shift),
                        mm(result)
                    )
                }
            },
            result,
        );
        (
            result,
            Term {
                input,
                scale: 1.0,
                offset: -shift,
                carried: Some(fluid),
            },
        )
    }

    fn source(&self, requested: Option<usize>) -> Result<usize, Missing> {
        requested
            .or(self.scene.primary)
            .filter(|i| *i < self.scene.arterial.len())
            .ok_or_else(|| Missing::one("an arterial pressure (a line or a cuff)"))
    }

    /// An arterial component of source `i`, carried to `to`.
    fn arterial_at(
        &self,
        steps: &mut Vec<Step>,
        i: usize,
        component: Component,
        to: Option<Spot>,
    ) -> Result<(Pressure, Term), Missing> {
        let a = self
            .scene
            .arterial
            .get(i)
            .ok_or_else(|| Missing::one("an arterial pressure (a line or a cuff)"))?;
        let value = a.component(component).ok_or_else(|| {
            Missing::one(format!("the {} pressure of {}", component.label(), a.id))
        })?;
        let from = self.spot(a.place)?;
        self.note(
            steps,
            || {
                let basis = match (component, a.mean) {
                    (Component::Mean, Some((_, b))) => format!(", {}", b.describe()),
                    _ => String::new(),
                };
                format!(
                    "{} at {} ({}, {}, {:+.1} cm){basis}: {}",
                    component.label(),
                    a.id,
                    a.method.label(),
                    a.place.describe(),
                    to_cm(from.height),
                    mm(value)
                )
            },
            value,
        );
        Ok(self.carry(
            steps,
            component.label(),
            Input::Arterial(i, component),
            value,
            Fluid::Blood,
            from,
            to,
        ))
    }

    /// A reading carried to where the frame refers it; `Ok(None)` when
    /// absent.
    fn reading_at(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        frame: Frame,
        organ: Spot,
    ) -> Result<Option<(Pressure, Term)>, Missing> {
        let Some(r) = self.scene.readings.get(&quantity) else {
            return Ok(None);
        };
        if r.is_assumed() {
            assumed.push(quantity);
        }
        let from = self.spot(r.place)?;
        self.note(
            steps,
            || {
                let how = r.method.map_or("ASSUMED, not measured", |m| m.label());
                format!(
                    "{} ({how}, {}, {:+.1} cm): {}",
                    quantity.label(),
                    r.place.describe(),
                    to_cm(from.height),
                    mm(r.value)
                )
            },
            r.value,
        );
        let input = Input::Reading(quantity);
        let Some(fluid) = quantity.fluid() else {
            // A tissue pressure exists only where it is taken.
            return if frame == Frame::Convention || r.place == organ.place {
                let term = Term {
                    input,
                    scale: 1.0,
                    offset: Pressure::default(),
                    carried: None,
                };
                Ok(Some((r.value, term)))
            } else {
                Err(Missing::one(format!(
                    "{} taken at {}",
                    quantity.label(),
                    organ.words()
                )))
            };
        };
        let to = match frame {
            Frame::OrganLevel => Some(organ),
            Frame::Convention => self.conventional_zero(quantity)?,
        };
        Ok(Some(self.carry(
            steps,
            quantity.label(),
            input,
            r.value,
            fluid,
            from,
            to,
        )))
    }

    /// Where a pressure is referred to by convention: its usual zero (the
    /// tragus for ICP, the iliac crest for IAP, the heart for CVP); a CSF
    /// drain as read at its own zero.
    fn conventional_zero(&self, quantity: Quantity) -> Result<Option<Spot>, Missing> {
        match quantity.usual_level() {
            Some(_) if quantity == Quantity::Csf => Ok(None),
            Some(landmark) => self.spot(Place::At(landmark)).map(Some),
            None => Ok(None),
        }
    }

    fn required(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        frame: Frame,
        organ: Spot,
    ) -> Result<(Pressure, Term), Missing> {
        self.reading_at(steps, assumed, quantity, frame, organ)?
            .ok_or_else(|| Missing::one(missing_reading(quantity)))
    }
}

fn missing_reading(quantity: Quantity) -> String {
    let assumable = matches!(
        quantity,
        Quantity::Icp | Quantity::Csf | Quantity::Cvp | Quantity::Iap | Quantity::Lvedp
    );
    if assumable {
        format!(
            "{} (readings.{quantity}, or an assumed value in assume.{quantity})",
            quantity.label()
        )
    } else {
        format!("{} (readings.{quantity})", quantity.label())
    }
}

/// Where an organ is checked in this scene: its landmark (the tragus or the
/// vertex for the brain, the chosen cord segment or kidney), or where IOP
/// or compartment pressure was taken.
///
/// # Errors
/// The eye and limb are checked where IOP and compartment pressure were
/// taken; without those readings there is no level.
pub fn organ_place(ctx: &Ctx<'_>, organ: Organ) -> Result<Place, Missing> {
    let scene = ctx.scene;
    let local = |q: Quantity| {
        scene
            .readings
            .get(&q)
            .map(|r| r.place)
            .ok_or_else(|| Missing::one(missing_reading(q)))
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
) -> Result<Value, Missing> {
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
) -> Result<Value, Missing> {
    let formula = table::row(organ, metric)
        .and_then(|r| r.formula(frame))
        .ok_or_else(|| Missing::one(format!("{} has no {metric}", organ.label())))?;
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
            .required(&mut steps, &mut assumed, q, frame, here)
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
fn both<A, B>(a: Result<A, Missing>, b: Result<B, Missing>) -> Result<(A, B), Missing> {
    match (a, b) {
        (Ok(a), Ok(b)) => Ok((a, b)),
        (a, b) => Err(Missing(
            [a.err(), b.err()]
                .into_iter()
                .flatten()
                .flat_map(|m| m.0)
                .collect(),
        )),
    }
}

/// The effective back pressure: the highest candidate. Required candidates
/// must be present; of optional-only lists, at least one.
fn waterfall(
    ctx: &Ctx<'_>,
    steps: &mut Vec<Step>,
    assumed: &mut Vec<Quantity>,
    candidates: &[(Quantity, bool)],
    frame: Frame,
    organ: Spot,
) -> Result<(Outflow, Vec<Term>), Missing> {
    let mut found = Vec::new();
    let mut terms = Vec::new();
    let mut missing = Vec::new();
    for (q, required) in candidates {
        match ctx.reading_at(steps, assumed, *q, frame, organ) {
            Ok(Some((p, term))) => {
                found.push((*q, p));
                terms.push(term);
            }
            Ok(None) if *required => missing.push(missing_reading(*q)),
            Ok(None) => {}
            Err(m) => missing.extend(m.0),
        }
    }
    if found.is_empty() && missing.is_empty() {
        missing.push(format!(
            "at least one of {}",
            candidates
                .iter()
                .map(|(q, _)| missing_reading(*q))
                .collect::<Vec<_>>()
                .join(" or ")
        ));
    }
    if !missing.is_empty() {
        return Err(Missing(missing));
    }
    let Some(&(winner, value)) = found
        .iter()
        .max_by(|a, b| to_mmhg(a.1).total_cmp(&to_mmhg(b.1)))
    else {
        return Err(Missing(missing));
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

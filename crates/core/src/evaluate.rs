//! The formulas: each organ metric from a scene, with the steps that
//! produced it written out in words and numbers.
//!
//! Every pressure is first carried to the organ's height through its own
//! fluid (the hydrostatic equation), then combined. Outflow follows the
//! waterfall rule: the higher of the venous pressure and the pressure around
//! the veins wins, and the result says which. A metric that cannot be
//! computed says what is missing instead.

use std::collections::BTreeMap;

use crate::fluid::Fluid;
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, MeanBasis, Quantity};
use crate::scene::{Place, Scene};
use crate::units::{column, to_cm, to_kg_per_m3, to_mmhg, Length, Pressure};

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
    /// Every candidate at the organ's height.
    pub candidates: Vec<(Quantity, Pressure)>,
}

/// An input reading a metric depends on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Input {
    /// A component of an arterial source, by index.
    Arterial(usize, Component),
    /// A non-arterial reading.
    Reading(Quantity),
}

/// One input as it enters a metric: `scale × reading + offset`, where the
/// offset is the fluid column between the reading's level and the organ's.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Term {
    /// Which reading.
    pub input: Input,
    /// Its multiplier (2/3 in the population formula, else 1).
    pub scale: f64,
    /// The height correction added to it.
    pub offset: Pressure,
}

impl Term {
    fn plain(input: Input, offset: Pressure) -> Self {
        Term {
            input,
            scale: 1.0,
            offset,
        }
    }

    fn at(self, reading: Pressure) -> Pressure {
        reading * self.scale + self.offset
    }
}

/// A metric as a formula of its inputs for a fixed position:
/// `lead − factor × max(subtract...)`. Produced by the same code that
/// computes the value, so a long record can be evaluated sample by sample
/// without placing the body or writing the derivation again.
#[derive(Clone, Debug, PartialEq)]
pub struct Form {
    /// The term the others are taken from (the inflow, or the reading itself).
    pub lead: Term,
    /// The candidates for the back pressure; the highest is subtracted.
    pub subtract: Vec<Term>,
    /// How many times the back pressure is subtracted (2 for the filtration
    /// gradient).
    pub factor: f64,
}

impl Form {
    /// The metric for the given readings; `None` if a reading it needs is
    /// missing. Of optional back-pressure candidates, those present count.
    pub fn eval(&self, reading: impl Fn(Input) -> Option<Pressure>) -> Option<Pressure> {
        let lead = self.lead.at(reading(self.lead.input)?);
        let mut back: Option<Pressure> = None;
        for term in &self.subtract {
            let v = term.at(reading(term.input)?);
            back = Some(match back {
                Some(b) if b >= v => b,
                _ => v,
            });
        }
        Some(match back {
            Some(b) => lead - b * self.factor,
            None => lead,
        })
    }

    /// Every input the metric reads.
    pub fn inputs(&self) -> impl Iterator<Item = Input> + '_ {
        std::iter::once(self.lead.input).chain(self.subtract.iter().map(|t| t.input))
    }
}

/// A computed metric.
#[derive(Clone, Debug, PartialEq)]
pub struct Value {
    /// The value.
    pub value: Pressure,
    /// How it was computed.
    pub steps: Vec<Step>,
    /// Whether a site reading can bring it to a target: false for a
    /// surrounding pressure (ICP, CSF, IAP), which no arterial reading moves.
    pub adjustable: bool,
    /// The waterfall's choice, for perfusion metrics.
    pub outflow: Option<Outflow>,
    /// Assumed values it used.
    pub assumed: Vec<Quantity>,
    /// The metric as a formula of its inputs, for this position.
    pub form: Form,
}

impl Value {
    /// The reading a site would have to change to move the metric, with
    /// the metric's change per unit of it (`scale`): its form's lead term.
    pub fn driver(&self) -> Option<Term> {
        self.adjustable.then_some(self.form.lead)
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

/// A scene with its landmark heights worked out, ready for formulas.
pub struct Ctx<'a> {
    scene: &'a Scene,
    heights: BTreeMap<Landmark, Length>,
}

fn mm(p: Pressure) -> String {
    format!("{:.1} mmHg", to_mmhg(p))
}

impl<'a> Ctx<'a> {
    /// Works out the heights of `scene` (with any shift in force).
    pub fn new(scene: &'a Scene) -> Self {
        Ctx {
            scene,
            heights: scene.heights(),
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

    fn landmark_height(&self, landmark: Landmark) -> Result<Length, Missing> {
        self.height(landmark).ok_or_else(|| {
            Missing::one(format!(
                "the height of the {} (measure it or give the position and patient height)",
                landmark.label()
            ))
        })
    }

    fn place_height(&self, place: Place) -> Result<Length, Missing> {
        match place {
            Place::At(landmark) => self.landmark_height(landmark),
            Place::Height { height, .. } => Ok(height),
        }
    }

    /// `value`, read at `from`, carried through `fluid` to `to`.
    fn carry(
        &self,
        steps: &mut Vec<Step>,
        name: &str,
        value: Pressure,
        fluid: Fluid,
        from: Length,
        to: (Landmark, Length),
    ) -> (Pressure, Pressure) {
        let dh = to.1 - from;
        let shift = column(self.scene.density(fluid), dh);
        let result = value - shift;
        let what = if to_cm(dh).abs() < 1e-9 {
            format!("{name} at the {}: same height, no correction", to.0.label())
        } else {
            format!(
                "{name} at the {}: {} − {} column of {:.1} cm at {:.0} kg/m³ ({}) = {}",
                to.0.label(),
                mm(value),
                fluid.label(),
                to_cm(dh),
                to_kg_per_m3(self.scene.density(fluid)),
                mm(shift),
                mm(result)
            )
        };
        steps.push(Step {
            what,
            value: result,
        });
        (result, -shift)
    }

    fn source(&self, requested: Option<usize>) -> Result<usize, Missing> {
        requested
            .or(self.scene.primary)
            .filter(|i| *i < self.scene.arterial.len())
            .ok_or_else(|| Missing::one("an arterial pressure (a line or a cuff)"))
    }

    /// An arterial component of source `i` at the organ's level.
    fn arterial_at(
        &self,
        steps: &mut Vec<Step>,
        i: usize,
        component: Component,
        level: (Landmark, Length),
    ) -> Result<(Pressure, Term), Missing> {
        let a = self
            .scene
            .arterial
            .get(i)
            .ok_or_else(|| Missing::one("an arterial pressure (a line or a cuff)"))?;
        let value = a.component(component).ok_or_else(|| {
            Missing::one(format!("the {} pressure of {}", component.label(), a.id))
        })?;
        let from = self.place_height(a.place)?;
        let basis = match (component, a.mean) {
            (Component::Mean, Some((_, b))) => format!(", {}", b.describe()),
            _ => String::new(),
        };
        steps.push(Step {
            what: format!(
                "{} at {} ({}, {}, {:+.1} cm){basis}: {}",
                component.label(),
                a.id,
                a.method.label(),
                a.place.describe(),
                to_cm(from),
                mm(value)
            ),
            value,
        });
        let (at, offset) = self.carry(steps, component.label(), value, Fluid::Blood, from, level);
        Ok((at, Term::plain(Input::Arterial(i, component), offset)))
    }

    /// A reading carried to the organ's level; `Ok(None)` when absent.
    fn reading_at(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        level: (Landmark, Length),
    ) -> Result<Option<(Pressure, Term)>, Missing> {
        let Some(r) = self.scene.readings.get(&quantity) else {
            return Ok(None);
        };
        let how = match r.method {
            Some(m) => m.label().to_owned(),
            None => {
                assumed.push(quantity);
                "ASSUMED, not measured".to_owned()
            }
        };
        let from = self.place_height(r.place)?;
        steps.push(Step {
            what: format!(
                "{} ({how}, {}, {:+.1} cm): {}",
                quantity.label(),
                r.place.describe(),
                to_cm(from),
                mm(r.value)
            ),
            value: r.value,
        });
        let input = Input::Reading(quantity);
        match quantity.fluid() {
            Some(fluid) => {
                let (at, offset) = self.carry(steps, quantity.label(), r.value, fluid, from, level);
                Ok(Some((at, Term::plain(input, offset))))
            }
            None if r.place == Place::At(level.0) => {
                Ok(Some((r.value, Term::plain(input, Pressure::default()))))
            }
            None => Err(Missing::one(format!(
                "{} taken at the {}",
                quantity.label(),
                level.0.label()
            ))),
        }
    }

    fn required(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        level: (Landmark, Length),
    ) -> Result<(Pressure, Term), Missing> {
        self.reading_at(steps, assumed, quantity, level)?
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

/// The landmark an organ is checked at in this scene.
///
/// # Errors
/// The eye and limb are checked where IOP and compartment pressure were
/// taken; without those readings there is no level.
pub fn organ_level(ctx: &Ctx<'_>, organ: Organ) -> Result<Landmark, Missing> {
    let scene = ctx.scene;
    let local = |q: Quantity| match scene.readings.get(&q).map(|r| r.place) {
        Some(Place::At(landmark)) => Ok(landmark),
        _ => Err(Missing::one(missing_reading(q))),
    };
    Ok(match organ {
        Organ::Brain => Landmark::Tragus,
        Organ::Abdomen => Landmark::IliacCrest,
        Organ::Heart | Organ::HeartCpr | Organ::WholeBody => Landmark::Heart,
        Organ::Cord => scene
            .organ_levels
            .get(&organ)
            .copied()
            .unwrap_or(Landmark::CordThoracic),
        Organ::Kidney => match scene.organ_levels.get(&organ) {
            Some(l) => *l,
            // The higher kidney is the worse perfused one: check that one.
            None => match (
                ctx.height(Landmark::KidneyLeft),
                ctx.height(Landmark::KidneyRight),
            ) {
                (Some(l), Some(r)) if r > l => Landmark::KidneyRight,
                (None, Some(_)) => Landmark::KidneyRight,
                _ => Landmark::KidneyLeft,
            },
        },
        Organ::Eye => local(Quantity::Iop)?,
        Organ::Limb => local(Quantity::Compartment)?,
    })
}

/// Computes one metric of one organ, with inflow from arterial source
/// `source` (the primary source when `None`).
///
/// # Errors
/// What is missing, in words: a reading, a height, a component.
pub fn metric(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    source: Option<usize>,
) -> Result<Value, Missing> {
    let landmark = organ_level(ctx, organ)?;
    let level = (landmark, ctx.landmark_height(landmark)?);
    let mut steps = Vec::new();
    let mut assumed = Vec::new();
    let label = organ.metric_label(metric);
    let single = |lead: Term| Form {
        lead,
        subtract: Vec::new(),
        factor: 1.0,
    };

    match (organ, metric) {
        (_, Metric::Inflow) => {
            let i = ctx.source(source)?;
            let (value, lead) = ctx.arterial_at(&mut steps, i, Component::Mean, level)?;
            Ok(Value {
                value,
                steps,
                adjustable: true,
                outflow: None,
                assumed,
                form: single(lead),
            })
        }
        (Organ::Brain | Organ::Cord | Organ::Abdomen, Metric::Surrounding) => {
            let q = surrounding_of(organ);
            let (value, lead) = ctx.required(&mut steps, &mut assumed, q, level)?;
            Ok(Value {
                value,
                steps,
                adjustable: false,
                outflow: None,
                assumed,
                form: single(lead),
            })
        }
        (Organ::Eye, Metric::PopulationMean | Metric::PopulationDiastolic) => {
            population(ctx, metric, source, level, steps, assumed)
        }
        (Organ::HeartCpr, Metric::Perfusion) => {
            let aortic = ctx.required(
                &mut steps,
                &mut assumed,
                Quantity::CprAorticRelaxation,
                level,
            );
            let atrial = ctx.required(
                &mut steps,
                &mut assumed,
                Quantity::CprRightAtrialRelaxation,
                level,
            );
            let ((aortic, lead), (atrial, back)) = both(aortic, atrial)?;
            let value = aortic - atrial;
            steps.push(Step {
                what: format!("{label} = {} − {} = {}", mm(aortic), mm(atrial), mm(value)),
                value,
            });
            Ok(Value {
                value,
                steps,
                adjustable: true,
                outflow: None,
                assumed,
                form: Form {
                    lead,
                    subtract: vec![back],
                    factor: 1.0,
                },
            })
        }
        (_, Metric::Perfusion | Metric::FiltrationGradient) => {
            let (component, outflows, factor) = difference_terms(organ, metric);
            let inflow = ctx.source(source).and_then(|i| {
                ctx.arterial_at(&mut steps, i, component, level)
                    .map(|v| (i, v))
            });
            let outflow = waterfall(ctx, &mut steps, &mut assumed, outflows, level);
            let ((_, (inflow, lead)), (outflow, back)) = both(inflow, outflow)?;
            let value = inflow - outflow.value * factor;
            let times = if factor == 1.0 {
                String::new()
            } else {
                format!("{factor} × ")
            };
            steps.push(Step {
                what: format!(
                    "{label} = {} − {times}{} = {}",
                    mm(inflow),
                    mm(outflow.value),
                    mm(value)
                ),
                value,
            });
            Ok(Value {
                value,
                steps,
                adjustable: true,
                outflow: Some(outflow),
                assumed,
                form: Form {
                    lead,
                    subtract: back,
                    factor,
                },
            })
        }
        (_, Metric::Surrounding | Metric::PopulationMean | Metric::PopulationDiastolic) => {
            Err(Missing::one(format!("{} has no {metric}", organ.label())))
        }
    }
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

fn surrounding_of(organ: Organ) -> Quantity {
    match organ {
        Organ::Cord => Quantity::Csf,
        Organ::Abdomen => Quantity::Iap,
        _ => Quantity::Icp,
    }
}

/// An outflow candidate and whether the metric needs it.
type Candidate = (Quantity, bool);

/// The arterial component, outflow candidates and outflow factor of a
/// pressure-difference metric.
fn difference_terms(organ: Organ, metric: Metric) -> (Component, &'static [Candidate], f64) {
    use Quantity::*;
    match (organ, metric) {
        (Organ::Abdomen, Metric::FiltrationGradient) => (Component::Mean, &[(Iap, true)], 2.0),
        (Organ::Brain, _) => (Component::Mean, &[(Icp, true), (Cvp, false)], 1.0),
        (Organ::Cord, _) => (Component::Mean, &[(Csf, true), (Cvp, false)], 1.0),
        (Organ::Abdomen, _) => (Component::Mean, &[(Iap, true)], 1.0),
        (Organ::Kidney, _) => (Component::Mean, &[(Cvp, false), (Iap, false)], 1.0),
        (Organ::Heart, _) => (Component::Diastolic, &[(Lvedp, true)], 1.0),
        (Organ::Eye, _) => (Component::Mean, &[(Iop, true)], 1.0),
        (Organ::Limb, _) => (Component::Diastolic, &[(Compartment, true)], 1.0),
        (Organ::WholeBody | Organ::HeartCpr, _) => (Component::Mean, &[(Cvp, true)], 1.0),
    }
}

/// The effective back pressure: the highest candidate at the organ's height.
/// Required candidates must be present; of optional-only lists, at least one.
fn waterfall(
    ctx: &Ctx<'_>,
    steps: &mut Vec<Step>,
    assumed: &mut Vec<Quantity>,
    candidates: &[Candidate],
    level: (Landmark, Length),
) -> Result<(Outflow, Vec<Term>), Missing> {
    let mut found = Vec::new();
    let mut terms = Vec::new();
    let mut missing = Vec::new();
    for (q, required) in candidates {
        match ctx.reading_at(steps, assumed, *q, level) {
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
        steps.push(Step {
            what: format!(
                "outflow: the higher of {listed}{collapse} → {} {}",
                winner.label(),
                mm(value)
            ),
            value,
        });
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

/// The population formulas, applied to an upper-arm reading as measured in
/// a seated patient. No hydrostatic correction is added: the formula's 2/3
/// already stands for the eye's height above the arm, so correcting too
/// would count the column twice.
fn population(
    ctx: &Ctx<'_>,
    metric: Metric,
    source: Option<usize>,
    level: (Landmark, Length),
    mut steps: Vec<Step>,
    mut assumed: Vec<Quantity>,
) -> Result<Value, Missing> {
    let scene = ctx.scene;
    let mut missing = Vec::new();
    if !scene
        .position
        .as_ref()
        .is_some_and(|p| p.posture.is_seated())
    {
        missing.push(
            "a seated position (beach chair or sitting): the population formula was derived in \
             seated patients"
                .to_owned(),
        );
    }
    let on_arm = |i: &usize| {
        scene
            .arterial
            .get(*i)
            .is_some_and(|a| matches!(a.place, Place::At(l) if l.is_upper_arm()))
    };
    let arm = source
        .filter(on_arm)
        .or_else(|| (0..scene.arterial.len()).find(on_arm));
    if arm.is_none() {
        missing.push("an arterial reading taken on an upper arm".to_owned());
    }
    let iop = ctx.required(&mut steps, &mut assumed, Quantity::Iop, level);
    let (Some(i), Ok((iop, back)), true) = (arm, iop.clone(), missing.is_empty()) else {
        if let Err(m) = iop {
            missing.extend(m.0);
        }
        return Err(Missing(missing));
    };
    let (component, factor) = match metric {
        Metric::PopulationMean => (Component::Mean, 2.0 / 3.0),
        _ => (Component::Diastolic, 1.0),
    };
    let a = scene
        .arterial
        .get(i)
        .ok_or_else(|| Missing::one("an arterial reading taken on an upper arm"))?;
    let value_at_arm = a
        .component(component)
        .ok_or_else(|| Missing::one(format!("the {} pressure of {}", component.label(), a.id)))?;
    let basis = match (component, a.mean) {
        (Component::Mean, Some((_, MeanBasis::Estimated(rule)))) => {
            format!(" (estimated: {})", rule.label())
        }
        _ => String::new(),
    };
    let value = value_at_arm * factor - iop;
    let times = if component == Component::Mean {
        "2/3 × "
    } else {
        ""
    };
    steps.push(Step {
        what: format!(
            "{} at {} as measured{basis}, no height correction (the formula already allows for it): \
             {times}{} − IOP {} = {}",
            component.label(),
            a.id,
            mm(value_at_arm),
            mm(iop),
            mm(value)
        ),
        value,
    });
    Ok(Value {
        value,
        steps,
        adjustable: true,
        outflow: None,
        assumed,
        form: Form {
            lead: Term {
                input: Input::Arterial(i, component),
                scale: factor,
                offset: Pressure::default(),
            },
            subtract: vec![back],
            factor: 1.0,
        },
    })
}

/// The baseline's mean arterial pressure carried to a landmark's height in
/// the baseline position.
///
/// # Errors
/// No baseline, or a height that cannot be worked out.
pub fn baseline_inflow(ctx: &Ctx<'_>, landmark: Landmark) -> Result<Step, Missing> {
    let scene = ctx.scene;
    let baseline = scene
        .baseline
        .as_ref()
        .ok_or_else(|| Missing::one("a baseline (baseline) for targets relative to it"))?;
    let heights = scene
        .baseline_heights()
        .ok_or_else(|| Missing::one("the patient's height, to place the baseline's position"))?;
    let height = |l: Landmark| {
        heights
            .get(&l)
            .copied()
            .ok_or_else(|| Missing::one(format!("the height of the {}", l.label())))
    };
    let from = match baseline.place {
        Place::At(l) => height(l)?,
        Place::Height { height, .. } => height,
    };
    let to = height(landmark)?;
    let (mean, basis) = baseline.mean;
    let shift = column(scene.density(Fluid::Blood), to - from);
    let value = mean - shift;
    Ok(Step {
        what: format!(
            "baseline mean {} ({}, {}, {}) carried to the {} in that position: {} − {} = {}",
            mm(mean),
            basis.describe(),
            baseline.place.describe(),
            baseline.position.posture.label(),
            landmark.label(),
            mm(mean),
            mm(shift),
            mm(value)
        ),
        value,
    })
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::case::Case;

    /// The form of every metric, fed the scene's own readings, gives the
    /// value computed step by step.
    #[test]
    fn forms_reproduce_their_values() {
        let scenes = [
            crate::demo::CASE_JSON,
            r#"{"format": "plumbline-case", "version": 1,
                "patient": {"height": "170 cm"}, "position": {"posture": "sitting"},
                "arterial": [{"id": "arm", "method": "cuff", "level": "upper_arm_left",
                              "systolic": "120 mmHg", "diastolic": "70 mmHg"}],
                "readings": {"icp": {"value": "15 cmH2O", "method": "drain_scale", "level": "tragus"},
                             "cvp": {"value": "9 mmHg", "method": "transducer", "level": "heart"},
                             "iap": {"value": "13 mmHg", "method": "transducer", "level": "iliac_crest"},
                             "iop": {"value": "17 mmHg", "method": "tonometer", "level": "eye_right"}}}"#,
        ];
        let mut checked = 0;
        for text in scenes {
            let scene = Scene::from_case(&Case::from_json(text).unwrap()).unwrap();
            let ctx = Ctx::new(&scene);
            let reading = |input: Input| match input {
                Input::Arterial(i, c) => scene.arterial.get(i)?.component(c),
                Input::Reading(q) => scene.readings.get(&q).map(|r| r.value),
            };
            for organ in Organ::ALL {
                for m in organ.metrics() {
                    let Ok(v) = metric(&ctx, organ, *m, None) else {
                        continue;
                    };
                    let again = v.form.eval(reading).unwrap();
                    assert!(
                        (to_mmhg(again) - to_mmhg(v.value)).abs() < 1e-9,
                        "{organ} {m}: {} vs {}",
                        to_mmhg(again),
                        to_mmhg(v.value)
                    );
                    checked += 1;
                }
            }
        }
        assert!(checked > 12, "only {checked} metrics checked");
    }
}

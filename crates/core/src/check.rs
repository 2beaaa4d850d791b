//! The check: every organ's metrics with their ranges, targets, required
//! site readings, the two-site cross-check and the backrest sweep.
//!
//! Ranges come from shifting each uncertain input of the scene to both ends
//! of its range and recomputing: a metric's range is its value plus and
//! minus the root of the sum of squares of those effects, one side at a
//! time. The same shifted scenes serve every metric, so the work is done
//! once per input.

use crate::case::{Case, VERSION};
use crate::error::{Errors, Warning};
use crate::evaluate::{self, baseline_inflow, organ_level, Ctx, Input, Missing, Term, Value};
use crate::geometry::{self, Lie};
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, MeanBasis};
use crate::report::{
    Contribution, CrossCheck, HeightRow, MetricReport, MissingMetric, NotChecked, OrganReport,
    OutflowCandidate, OutflowReport, Provenance, Report, Required, SourceRow, StepReport, Sweep,
    SweepPoint, TargetReport, CAUTION, RESULT_FORMAT,
};
use crate::scene::{Param, Place, Scene};
use crate::target::{self, judge, Bound, Status, Target};
use crate::units::{to_cm, to_mmhg, Pressure, PressureUnit};

/// Reads, checks and evaluates a case given as JSON text.
///
/// # Errors
/// Every problem with the document, each naming its field.
///
/// # Example
/// ```
/// let demo = plumbline_core::demo::CASE_JSON;
/// let report = plumbline_core::check::check_json(demo).unwrap();
/// assert!(!report.organs.is_empty());
/// assert!(plumbline_core::check::check_json("{}").is_err());
/// ```
pub fn check_json(text: &str) -> Result<Report, Errors> {
    check_case(&Case::from_json(text)?)
}

/// Checks and evaluates a case.
///
/// # Errors
/// Every problem with the case, each naming its field.
pub fn check_case(case: &Case) -> Result<Report, Errors> {
    crate::limits::check_case(case)?;
    Ok(check(&Scene::from_case(case)?))
}

/// One input's shifted scenes, both ways.
struct Shifted<'a> {
    label: String,
    up: Ctx<'a>,
    down: Ctx<'a>,
}

/// Evaluates a checked scene.
pub fn check(scene: &Scene) -> Report {
    let params = scene.params();
    let shifted_scenes: Vec<(Param, Scene, Scene)> = params
        .iter()
        .map(|p| (*p, scene.shifted(*p, 1.0), scene.shifted(*p, -1.0)))
        .collect();
    let shifted: Vec<Shifted<'_>> = shifted_scenes
        .iter()
        .map(|(p, up, down)| Shifted {
            label: scene.param_label(*p),
            up: Ctx::new(up),
            down: Ctx::new(down),
        })
        .collect();
    let ctx = Ctx::new(scene);

    let mut organs = Vec::new();
    let mut not_checked = Vec::new();
    let mut warnings = scene.warnings.clone();
    for organ in Organ::ALL {
        let level = organ_level(&ctx, organ);
        let (level, height) = match level.map(|l| (l, ctx.height(l))) {
            Ok((l, Some(h))) => (l, h),
            Ok((l, None)) => {
                not_checked.push(NotChecked {
                    organ,
                    label: organ.label(),
                    needs: vec![format!(
                        "the height of the {} (measure it or give the position)",
                        l.label()
                    )],
                });
                continue;
            }
            Err(Missing(needs)) => {
                not_checked.push(NotChecked {
                    organ,
                    label: organ.label(),
                    needs,
                });
                continue;
            }
        };
        let mut metrics = Vec::new();
        let mut missing = Vec::new();
        for &metric in organ.metrics() {
            match evaluate::metric(&ctx, organ, metric, None) {
                Ok(value) => {
                    metrics.push(metric_report(&ctx, &shifted, organ, metric, level, value))
                }
                Err(Missing(needs)) => missing.push(MissingMetric {
                    metric,
                    label: organ.metric_label(metric),
                    needs,
                }),
            }
        }
        if metrics.is_empty() {
            let mut needs: Vec<String> = missing.into_iter().flat_map(|m| m.needs).collect();
            needs.dedup();
            not_checked.push(NotChecked {
                organ,
                label: organ.label(),
                needs,
            });
            continue;
        }
        for m in &metrics {
            for q in &m.assumed {
                let text = format!(
                    "{} uses an ASSUMED {}, not a measurement: the result is only as good as \
                     the assumption",
                    organ.label(),
                    q.label()
                );
                if !warnings.iter().any(|w| w.message == text) {
                    warnings.push(Warning::new(format!("assume.{q}"), text));
                }
            }
        }
        organs.push(OrganReport {
            organ,
            label: organ.label(),
            level,
            level_label: level.label(),
            level_height_cm: to_cm(height),
            metrics,
            missing,
        });
    }

    Report {
        format: RESULT_FORMAT,
        version: VERSION,
        position: scene.position.as_ref().map(|p| p.describe()),
        heights: height_rows(scene),
        arterial: source_rows(&ctx),
        organs,
        not_checked,
        cross_checks: cross_checks(&ctx, &shifted),
        sweeps: sweeps(&ctx),
        figure: match (&scene.body, &scene.position) {
            (Some(body), Some(position)) => Some(geometry::figure(body, position)),
            _ => None,
        },
        warnings,
        caution: CAUTION,
    }
}

/// The spread of a quantity over every shifted input: contributions
/// (largest first) and the root-sum-square pull down and push up.
fn spread<F>(shifted: &[Shifted<'_>], nominal: Pressure, f: F) -> (Vec<Contribution>, f64, f64)
where
    F: Fn(&Ctx<'_>) -> Option<Pressure>,
{
    let base = to_mmhg(nominal);
    let mut contributions = Vec::new();
    let (mut down_sq, mut up_sq) = (0.0, 0.0);
    for s in shifted {
        let effect = |c: &Ctx<'_>| f(c).map_or(0.0, |v| to_mmhg(v) - base);
        let (a, b) = (effect(&s.up), effect(&s.down));
        let down = a.min(b).min(0.0);
        let up = a.max(b).max(0.0);
        down_sq += down * down;
        up_sq += up * up;
        if down.abs().max(up) > 0.05 {
            contributions.push(Contribution {
                input: s.label.clone(),
                down_mmhg: down,
                up_mmhg: up,
            });
        }
    }
    contributions.sort_by(|x, y| {
        let size = |c: &Contribution| c.down_mmhg.abs().max(c.up_mmhg);
        size(y).total_cmp(&size(x))
    });
    (contributions, down_sq.sqrt(), up_sq.sqrt())
}

fn steps_report(steps: &[evaluate::Step]) -> Vec<StepReport> {
    steps
        .iter()
        .map(|s| StepReport {
            what: s.what.clone(),
            value_mmhg: to_mmhg(s.value),
        })
        .collect()
}

fn metric_report(
    ctx: &Ctx<'_>,
    shifted: &[Shifted<'_>],
    organ: Organ,
    metric: Metric,
    level: Landmark,
    value: Value,
) -> MetricReport {
    let scene = ctx.scene();
    let source = match value.driver().map(|t| t.input) {
        Some(Input::Arterial(source, _)) => Some(source),
        _ => None,
    };
    let (contributions, down, up) = spread(shifted, value.value, |c| {
        evaluate::metric(c, organ, metric, source)
            .ok()
            .map(|v| v.value)
    });
    let v = to_mmhg(value.value);
    let (lower, upper) = (v - down, v + up);
    let targets = scene
        .targets
        .iter()
        .filter(|t| t.organ == organ && t.metric == metric)
        .map(|t| target_report(ctx, organ, metric, level, &value, (lower, upper), t))
        .collect();
    let grade = (organ == Organ::Abdomen && metric == Metric::Surrounding)
        .then(|| target::iah_grade(value.value));
    MetricReport {
        metric,
        label: organ.metric_label(metric),
        value_mmhg: v,
        lower_mmhg: lower,
        upper_mmhg: upper,
        largest_contributor: contributions.first().map(|c| c.input.clone()),
        contributions,
        inflow_source: source
            .and_then(|i| scene.arterial.get(i))
            .map(|a| a.id.clone()),
        outflow: value.outflow.as_ref().map(|o| OutflowReport {
            value_mmhg: to_mmhg(o.value),
            winner: o.winner,
            candidates: o
                .candidates
                .iter()
                .map(|(q, p)| OutflowCandidate {
                    quantity: *q,
                    value_mmhg: to_mmhg(*p),
                })
                .collect(),
        }),
        assumed: value.assumed.clone(),
        steps: steps_report(&value.steps),
        targets,
        grade,
    }
}

/// A target's threshold in mmHg, resolving relative targets through the
/// baseline at the organ's level.
pub(crate) fn threshold(
    ctx: &Ctx<'_>,
    level: Landmark,
    target: &Target,
) -> Result<(Pressure, bool, Vec<StepReport>), Missing> {
    match target.bound {
        Bound::AtLeast(p) => Ok((p, true, Vec::new())),
        Bound::AtMost(p) => Ok((p, false, Vec::new())),
        Bound::AtLeastPercentOfBaseline(pct) => {
            let base = baseline_inflow(ctx, level)?;
            let value = base.value * (pct / 100.0);
            let steps = vec![
                StepReport {
                    what: base.what,
                    value_mmhg: to_mmhg(base.value),
                },
                StepReport {
                    what: format!(
                        "{pct:.0}% of {:.1} mmHg = {:.1} mmHg",
                        to_mmhg(base.value),
                        to_mmhg(value)
                    ),
                    value_mmhg: to_mmhg(value),
                },
            ];
            Ok((value, true, steps))
        }
    }
}

fn whole(v: f64) -> String {
    format!("{:.0}", v.abs().round())
}

/// A shortfall in whole mmHg, never "0": a value just outside a bound is
/// still outside it.
fn shortfall(v: f64) -> String {
    if v.abs() < 0.5 {
        "less than 1".to_owned()
    } else {
        whole(v)
    }
}

fn target_report(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    level: Landmark,
    value: &Value,
    range: (f64, f64),
    target: &Target,
) -> TargetReport {
    let (thr, at_least, threshold_steps) = match threshold(ctx, level, target) {
        Ok(t) => t,
        Err(Missing(needs)) => {
            return TargetReport {
                target: target.describe(),
                source: target.source.clone(),
                threshold_mmhg: None,
                threshold_steps: Vec::new(),
                status: None,
                margin_mmhg: None,
                range_crosses: false,
                words: format!("not evaluated: needs {}", needs.join("; ")),
                required: Vec::new(),
            }
        }
    };
    let verdict = judge(value.value, thr, at_least);
    let t = to_mmhg(thr);
    let margin = to_mmhg(verdict.margin);
    let range_crosses = range.0 < t && t < range.1;
    let words = match verdict.status {
        Status::Meets if range_crosses => format!(
            "meets by {} mmHg, but the plausible range reaches {} the target",
            whole(margin),
            if at_least { "below" } else { "above" }
        ),
        Status::Meets => format!(
            "meets: {} mmHg {} the target",
            whole(margin),
            if at_least { "above" } else { "below" }
        ),
        Status::Below => format!("BELOW target by {} mmHg", shortfall(margin)),
        Status::Above => format!("ABOVE limit by {} mmHg", shortfall(margin)),
    };
    TargetReport {
        target: target.describe(),
        source: target.source.clone(),
        threshold_mmhg: Some(t),
        threshold_steps,
        status: Some(verdict.status),
        margin_mmhg: Some(margin),
        range_crosses,
        words,
        required: required(ctx, organ, metric, value, thr, at_least),
    }
}

/// What `site` must read for the metric to equal `thr`: the metric is
/// linear in the driving reading (`scale` per unit of it), so one
/// evaluation per site suffices.
fn needed(current: Pressure, value: Pressure, thr: Pressure, scale: f64) -> Pressure {
    current + (thr - value) / scale
}

fn required(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    value: &Value,
    thr: Pressure,
    at_least: bool,
) -> Vec<Required> {
    let scene = ctx.scene();
    let mut out = Vec::new();
    match value.driver() {
        None => {}
        Some(Term {
            input: Input::Reading(quantity),
            scale,
            ..
        }) => {
            if let Some(r) = scene.readings.get(&quantity) {
                let need = needed(r.value, value.value, thr, scale);
                out.push(required_row(
                    quantity.label().to_owned(),
                    None,
                    r.value,
                    need,
                    at_least,
                    r.unit,
                ));
            }
        }
        Some(Term {
            input: Input::Arterial(..),
            ..
        }) => {
            for (i, a) in scene.arterial.iter().enumerate() {
                let Ok(v) = evaluate::metric(ctx, organ, metric, Some(i)) else {
                    continue;
                };
                let Some(Term {
                    input: Input::Arterial(source, component),
                    scale,
                    ..
                }) = v.driver()
                else {
                    continue;
                };
                let Some(current) = a.component(component).filter(|_| source == i) else {
                    continue;
                };
                let need = needed(current, v.value, thr, scale);
                out.push(required_row(
                    a.id.clone(),
                    Some(component),
                    current,
                    need,
                    at_least,
                    a.unit,
                ));
            }
        }
    }
    out
}

/// Rounds the safe way: up for a floor to defend, down for a ceiling.
fn safe_words(need: Pressure, at_least: bool, unit: PressureUnit) -> String {
    let decimals = if unit == PressureUnit::KPa { 1 } else { 0 };
    let scale = 10f64.powi(decimals);
    let v = unit.value(need) * scale;
    // Unit conversion leaves noise (17 mmHg comes back as 17.000000000000004);
    // rounding that up would ask for a whole step more than is needed.
    let v = if (v - v.round()).abs() < 1e-9 {
        v.round()
    } else {
        v
    };
    let rounded = if at_least { v.ceil() } else { v.floor() } / scale;
    let word = if at_least { "at least" } else { "at most" };
    format!("{word} {rounded:.prec$} {unit}", prec = decimals as usize)
}

fn required_row(
    site: String,
    component: Option<Component>,
    current: Pressure,
    need: Pressure,
    at_least: bool,
    unit: PressureUnit,
) -> Required {
    let part = component.map_or(String::new(), |c| format!("{} ", c.label()));
    let mut words = format!("{site}: {part}{}", safe_words(need, at_least, unit));
    if let Some(c) = component {
        let (lo, hi) = c.range_mmhg();
        if !(lo..=hi).contains(&to_mmhg(need)) {
            words.push_str(" (outside any reachable pressure: the target cannot be met this way)");
        }
    }
    Required {
        site,
        component,
        current_mmhg: to_mmhg(current),
        needed_mmhg: to_mmhg(need),
        at_least,
        words,
    }
}

fn height_rows(scene: &Scene) -> Vec<HeightRow> {
    let estimates = match (&scene.body, &scene.position) {
        (Some(body), Some(position)) => geometry::estimate(body, position),
        _ => Default::default(),
    };
    let body = scene.body.clone();
    Landmark::ALL
        .into_iter()
        .filter_map(|landmark| {
            let row = |h: f64, u: f64, provenance, largest| HeightRow {
                landmark,
                label: landmark.label(),
                above_heart_cm: h,
                uncertainty_cm: u,
                provenance,
                largest_contributor: largest,
            };
            if landmark == Landmark::Heart {
                return Some(row(0.0, 0.0, Provenance::Datum, None));
            }
            if let Some(m) = scene.measured.get(&landmark) {
                return Some(row(
                    to_cm(m.height),
                    to_cm(m.uncertainty),
                    Provenance::Measured,
                    None,
                ));
            }
            estimates.get(&landmark).map(|e| {
                row(
                    to_cm(e.height),
                    to_cm(e.uncertainty),
                    Provenance::Estimated,
                    e.largest.zip(body.as_ref()).map(|(p, b)| p.label(b)),
                )
            })
        })
        .collect()
}

fn source_rows(ctx: &Ctx<'_>) -> Vec<SourceRow> {
    let scene = ctx.scene();
    scene
        .arterial
        .iter()
        .enumerate()
        .map(|(i, a)| {
            let reference = a
                .component(Component::Mean)
                .or(a.diastolic)
                .unwrap_or_default();
            let level_height = match a.place {
                Place::At(l) => ctx.height(l),
                Place::Height { height, .. } => Some(height),
            };
            SourceRow {
                id: a.id.clone(),
                method: a.method,
                level: a.place.describe(),
                level_height_cm: level_height.map(to_cm),
                systolic_mmhg: a.systolic.map(to_mmhg),
                diastolic_mmhg: a.diastolic.map(to_mmhg),
                mean_mmhg: a.mean.map(|(p, _)| to_mmhg(p)),
                mean_basis: a.mean.map(|(_, b): (Pressure, MeanBasis)| b.describe()),
                mean_at_heart_mmhg: evaluate::metric(
                    ctx,
                    Organ::WholeBody,
                    Metric::Inflow,
                    Some(i),
                )
                .ok()
                .map(|v| to_mmhg(v.value)),
                accuracy_mmhg: to_mmhg(a.accuracy_of(reference)),
                accuracy_source: if a.accuracy.is_some() {
                    "entered in the case".to_owned()
                } else {
                    a.method.accuracy_source().to_owned()
                },
                primary: scene.primary == Some(i),
            }
        })
        .collect()
}

/// Every pair of arterial sources with a mean, compared at heart level; the
/// tolerance is the spread of their difference over every uncertain input.
fn cross_checks(ctx: &Ctx<'_>, shifted: &[Shifted<'_>]) -> Vec<CrossCheck> {
    let scene = ctx.scene();
    let at_heart = |c: &Ctx<'_>, i: usize| {
        evaluate::metric(c, Organ::WholeBody, Metric::Inflow, Some(i))
            .ok()
            .map(|v| v.value)
    };
    let mut out = Vec::new();
    let n = scene.arterial.len();
    for i in 0..n {
        for j in (i + 1)..n {
            let (Some(a), Some(b)) = (at_heart(ctx, i), at_heart(ctx, j)) else {
                continue;
            };
            let diff = a - b;
            let (_, down, up) = spread(shifted, diff, |c| Some(at_heart(c, i)? - at_heart(c, j)?));
            let tolerance = down.max(up);
            let d = to_mmhg(diff);
            let agree = d.abs() <= tolerance;
            let (name_a, name_b) = (
                scene.source_name(crate::scene::Source::Arterial(i)),
                scene.source_name(crate::scene::Source::Arterial(j)),
            );
            let words = if agree {
                format!(
                    "{name_a} and {name_b} agree once both are at heart level: {} mmHg apart, \
                     within their combined accuracy of {} mmHg",
                    whole(d),
                    whole(tolerance)
                )
            } else {
                format!(
                    "{name_a} and {name_b} DISAGREE at heart level: {} mmHg apart, more than \
                     their combined accuracy of {} mmHg. Check levels, zeroing, damping and cuff size",
                    whole(d),
                    whole(tolerance)
                )
            };
            out.push(CrossCheck {
                first: name_a,
                second: name_b,
                first_at_heart_mmhg: to_mmhg(a),
                second_at_heart_mmhg: to_mmhg(b),
                difference_mmhg: d,
                tolerance_mmhg: tolerance,
                agree,
                words,
            });
        }
    }
    out
}

/// Backrest angles the sweep visits, degrees.
pub const SWEEP_ANGLES_DEG: [f64; 19] = [
    0.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0, 45.0, 50.0, 55.0, 60.0, 65.0, 70.0, 75.0,
    80.0, 85.0, 90.0,
];

/// The site reading each arterial-driven target needs at every backrest
/// angle, for positions on the back.
fn sweeps(ctx: &Ctx<'_>) -> Vec<Sweep> {
    let scene = ctx.scene();
    let Some(position) = scene.position.as_ref().filter(|p| p.lie == Lie::FaceUp) else {
        return Vec::new();
    };
    if scene.body.is_none() {
        return Vec::new();
    }
    let variants: Vec<(f64, Scene)> = SWEEP_ANGLES_DEG
        .iter()
        .map(|deg| {
            let mut s = scene.clone();
            s.position = Some(position.with_backrest(*deg));
            s.measured.clear();
            (*deg, s)
        })
        .collect();
    let contexts: Vec<(f64, Ctx<'_>)> = variants.iter().map(|(d, s)| (*d, Ctx::new(s))).collect();
    let mut out = Vec::new();
    for target in &scene.targets {
        let Ok(level) = organ_level(ctx, target.organ) else {
            continue;
        };
        let Ok(now) = evaluate::metric(ctx, target.organ, target.metric, None) else {
            continue;
        };
        let Some(Input::Arterial(source, component)) = now.driver().map(|t| t.input) else {
            continue;
        };
        let Ok((thr, at_least, _)) = threshold(ctx, level, target) else {
            continue;
        };
        let Some(a) = scene.arterial.get(source) else {
            continue;
        };
        let Some(current) = a.component(component) else {
            continue;
        };
        let points: Vec<SweepPoint> = contexts
            .iter()
            .filter_map(|(deg, c)| {
                let v = evaluate::metric(c, target.organ, target.metric, Some(source)).ok()?;
                let scale = v.driver()?.scale;
                Some(SweepPoint {
                    backrest_deg: *deg,
                    needed_mmhg: to_mmhg(needed(current, v.value, thr, scale)),
                })
            })
            .collect();
        if points.len() == SWEEP_ANGLES_DEG.len() {
            out.push(Sweep {
                organ: target.organ,
                metric: target.metric,
                target: target.describe(),
                site: a.id.clone(),
                component: Some(component),
                at_least,
                points,
                note: "other readings held as entered at their own levels; heights from the \
                       position only (measured heights apply to the current angle alone)"
                    .to_owned(),
            });
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::mmhg;

    #[test]
    fn safe_rounding_ignores_conversion_noise() {
        // Aortic relaxation 20, right atrium 2, floor 15: the need 20 + (15 −
        // 18) comes back from pascals a few ulps above 17: still "at least 17".
        let need = mmhg(20.0) + (mmhg(15.0) - (mmhg(20.0) - mmhg(2.0)));
        assert!(
            crate::units::to_mmhg(need) > 17.0,
            "the noise this guards against"
        );
        assert_eq!(
            safe_words(need, true, PressureUnit::MmHg),
            "at least 17 mmHg"
        );
        assert_eq!(
            safe_words(mmhg(17.2), true, PressureUnit::MmHg),
            "at least 18 mmHg"
        );
        assert_eq!(
            safe_words(mmhg(17.8), false, PressureUnit::MmHg),
            "at most 17 mmHg"
        );
        assert_eq!(
            safe_words(mmhg(22.0), false, PressureUnit::MmHg),
            "at most 22 mmHg"
        );
        let kpa = PressureUnit::KPa.pressure(8.0);
        assert_eq!(safe_words(kpa, true, PressureUnit::KPa), "at least 8.0 kPa");
    }

    #[test]
    fn a_shortfall_under_half_a_mmhg_is_not_called_zero() {
        assert_eq!(shortfall(-0.3), "less than 1");
        assert_eq!(shortfall(-0.6), "1");
        assert_eq!(shortfall(-12.4), "12");
    }
}

//! The check: every organ's metrics with their ranges, targets and
//! verdicts, the summary over the organs of concern, the value each site
//! must show, the two-site cross-check and the backrest sweep.
//!
//! The stages: [`spread`] moves every uncertain input, [`targets`] judges
//! each target and inverts the metric for the site readings, [`verdict`]
//! decides each organ and the summary, [`cross`] compares sources and
//! [`sweep`] follows the needed reading across backrest angles.

mod cross;
mod hazards;
mod spread;
mod sweep;
mod targets;
mod verdict;

pub use sweep::SWEEP_ANGLES_DEG;
pub(crate) use targets::threshold;

use crate::case::{Case, VERSION};
use crate::error::{Errors, Warning};
use crate::evaluate::{self, metric_in, needs, organ_place, table, Ctx, Input, Value};
use crate::fluid::Fluid;
use crate::geometry;
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, MeanBasis, Method};
use crate::report::{
    Beside, HeightRow, MetricReport, MissingMetric, NotChecked, OrganReport, OutflowCandidate,
    OutflowReport, PatientHeight, Provenance, Report, SourceRow, StepReport, CAUTION,
    RESULT_FORMAT,
};
use crate::scene::{Place, Scene};
use crate::target;
use crate::text::{mmhg_with_range, whole};
use crate::units::{cm, column, to_cm, to_kg_per_m3, to_mmhg, Pressure};
use spread::{shifted_scenes, Shifts};
use targets::{not_evaluated, target_report, Judged};

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
    Ok(check_keeping_scene(case)?.1)
}

/// Checks and evaluates a case, and hands back its scene too, so further
/// work on the same case (a record's analysis) need not gate it again.
///
/// # Errors
/// Every problem with the case, each naming its field.
pub fn check_keeping_scene(case: &Case) -> Result<(Scene, Report), Errors> {
    crate::limits::check_case(case)?;
    let scene = Scene::from_case(case)?;
    let report = check(&scene);
    Ok((scene, report))
}

/// Evaluates a checked scene.
pub fn check(scene: &Scene) -> Report {
    let copies = shifted_scenes(scene);
    let shifts = Shifts::new(scene, &copies);
    let ctx = Ctx::new(scene);

    let mut organs = Vec::new();
    let mut not_checked = Vec::new();
    let mut warnings = scene.warnings.clone();
    for organ in Organ::ALL {
        let place = organ_place(&ctx, organ);
        let (place, height) = match place.map(|p| (p, ctx.place_height(p))) {
            Ok((p, Ok(h))) => (p, h),
            Ok((_, Err(errors))) | Err(errors) => {
                not_checked.push(NotChecked {
                    organ,
                    label: organ.label(),
                    needs: needs(&errors),
                });
                continue;
            }
        };
        let mut metrics = Vec::new();
        let mut missing = Vec::new();
        for &metric in organ.metrics() {
            match evaluate::metric(&ctx, organ, metric, None) {
                Ok(value) => {
                    metrics.push(metric_report(&ctx, &shifts, organ, metric, place, value))
                }
                Err(errors) => missing.push(MissingMetric {
                    metric,
                    label: organ.metric_label(metric),
                    targets: scene
                        .targets
                        .iter()
                        .filter(|t| t.organ == organ && t.metric == metric)
                        .map(|t| t.describe())
                        .collect(),
                    needs: needs(&errors),
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
        let verdict = verdict::organ_verdict(organ, &metrics, &missing, scene);
        let (level, level_label) = match place {
            Place::At(l) => (Some(l), l.label().to_owned()),
            Place::Height { .. } => (None, place.describe()),
        };
        organs.push(OrganReport {
            organ,
            label: organ.label(),
            level,
            level_label,
            level_height_cm: to_cm(height),
            verdict,
            metrics,
            missing,
        });
    }

    let venous_site = hazards::venous_site(&ctx);
    Report {
        format: RESULT_FORMAT,
        version: VERSION,
        position: scene.position.as_ref().map(|p| p.describe()),
        heights: height_rows(scene),
        arterial: source_rows(&ctx),
        summary: verdict::summary(&organs, &not_checked, scene),
        organs,
        not_checked,
        cross_checks: cross::cross_checks(&ctx, &shifts),
        sweeps: sweep::sweeps(&ctx),
        patient_height: scene.body.as_ref().map(|b| PatientHeight {
            height_cm: to_cm(b.height),
            uncertainty_cm: b.height_spread_cm,
            assumed: b.height_assumed,
        }),
        venous_site,
        drain: hazards::drain(scene),
        figure: match (&scene.body, &scene.position) {
            (Some(body), Some(position)) => Some(geometry::figure(body, position)),
            _ => None,
        },
        warnings,
        caution: CAUTION,
    }
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

/// The metric in the frame it is not judged in, when the two differ by half
/// a mmHg or more.
fn beside(
    ctx: &Ctx<'_>,
    organ: Organ,
    metric: Metric,
    source: Option<usize>,
    place: Place,
    value: Pressure,
) -> Option<Beside> {
    let row = table::row(organ, metric)?;
    let frame = row.other_frame()?;
    let other = metric_in(ctx, organ, metric, source, frame).ok()?;
    let d = to_mmhg(other.value) - to_mmhg(value);
    if d.abs() < 0.5 {
        return None;
    }
    let judged = match row.judged {
        evaluate::Frame::OrganLevel => match place {
            Place::At(l) => format!("the value at the {}", l.label()),
            Place::Height { .. } => "the value at the organ's level".to_owned(),
        },
        evaluate::Frame::Convention => "the value by its definition".to_owned(),
    };
    Some(Beside {
        frame,
        what: row.beside,
        value_mmhg: to_mmhg(other.value),
        words: format!(
            "{}: {} mmHg here, {} {} {judged}",
            row.beside,
            whole(to_mmhg(other.value)),
            whole(d.abs()),
            if d > 0.0 { "above" } else { "below" },
        ),
    })
}

fn metric_report(
    ctx: &Ctx<'_>,
    shifts: &Shifts<'_>,
    organ: Organ,
    metric: Metric,
    place: Place,
    value: Value,
) -> MetricReport {
    let scene = ctx.scene();
    let source = match value.driver().map(|t| t.input) {
        Some(Input::Arterial(source, _)) => Some(source),
        _ => None,
    };
    let (contributions, down, up) = shifts.spread(value.value, &[(1.0, &value.linear)], |c| {
        evaluate::metric(c, organ, metric, source)
            .ok()
            .map(|v| v.value)
    });
    let v = to_mmhg(value.value);
    let (lower, upper) = (v - down, v + up);
    let row = table::row(organ, metric);
    let zero = row.map_or("", |r| r.zero);
    let judged = Judged {
        organ,
        metric,
        place,
        value: &value,
        range: (lower, upper),
        zero,
    };
    let targets = scene
        .targets
        .iter()
        .filter(|t| t.organ == organ && t.metric == metric)
        .map(|t| match row {
            Some(_) => target_report(ctx, &judged, t),
            None => not_evaluated(t, zero, "the metric has no formula".to_owned()),
        })
        .collect();
    let grade = (organ == Organ::Abdomen && metric == Metric::Surrounding)
        .then(|| target::iah_grade(value.value));
    MetricReport {
        metric,
        label: organ.metric_label(metric),
        value_mmhg: v,
        lower_mmhg: lower,
        upper_mmhg: upper,
        display: mmhg_with_range(v, lower, upper),
        frame: row.map_or(evaluate::Frame::OrganLevel, |r| r.judged),
        zero,
        beside: beside(ctx, organ, metric, source, place, value.value),
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
                note: (a.method == Method::Transducer).then(|| tubing_note(scene)),
                primary: scene.primary == Some(i),
            }
        })
        .collect()
}

/// The saline in a transducer's tubing, stated with its size: the column
/// between the catheter tip and the transducer is saline, not blood, and
/// the tip's height is not in the case, so it is taken as blood.
fn tubing_note(scene: &Scene) -> String {
    let per_cm = to_mmhg(column(
        scene.density(Fluid::Blood) - scene.density(Fluid::Saline),
        cm(1.0),
    ));
    format!(
        "the tubing from the catheter tip to the transducer holds saline ({:.0} kg/m³), taken \
         as blood ({:.0} kg/m³): each cm the tip lies below the transducer adds {:.3} mmHg of \
         error ({:.1} mmHg over 30 cm)",
        to_kg_per_m3(scene.density(Fluid::Saline)),
        to_kg_per_m3(scene.density(Fluid::Blood)),
        per_cm,
        per_cm * 30.0
    )
}

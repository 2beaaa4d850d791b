//! Targets against a metric: the threshold (relative targets through the
//! baseline at the same level), the status and margin, and the reading each
//! site must show to meet it now, rounded the safe way.

use crate::error::Errors;
use crate::evaluate::{self, baseline_inflow, needs, Ctx, Input, Term, Value};
use crate::organ::{Metric, Organ};
use crate::reading::Component;
use crate::report::{Defend, StepReport, TargetReport};
use crate::scene::Place;
use crate::target::{judge, Bound, Status, Target};
use crate::text::{shortfall_mmhg, whole};
use crate::units::{to_mmhg, Pressure, PressureUnit};

/// A target's threshold, whether it is a floor, and how a relative one was
/// found (through the baseline carried to `place` in its own position).
///
/// # Errors
/// A relative target without a baseline, or a height that cannot be found.
pub(crate) fn threshold(
    ctx: &Ctx<'_>,
    place: Place,
    target: &Target,
) -> Result<(Pressure, bool, Vec<StepReport>), Errors> {
    match target.bound {
        Bound::AtLeast(p) => Ok((p, true, Vec::new())),
        Bound::AtMost(p) => Ok((p, false, Vec::new())),
        Bound::AtLeastPercentOfBaseline(pct) => {
            let base = baseline_inflow(ctx, place)?;
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

/// What `target` is about, for a target report.
pub(crate) struct Judged<'v> {
    pub(crate) organ: Organ,
    pub(crate) metric: Metric,
    pub(crate) place: Place,
    pub(crate) value: &'v Value,
    pub(crate) range: (f64, f64),
    pub(crate) zero: &'static str,
}

/// One target against a computed metric.
pub(crate) fn target_report(ctx: &Ctx<'_>, j: &Judged<'_>, target: &Target) -> TargetReport {
    let (thr, at_least, threshold_steps) = match threshold(ctx, j.place, target) {
        Ok(t) => t,
        Err(errors) => {
            return not_evaluated(
                target,
                j.zero,
                format!("needs {}", needs(&errors).join("; ")),
            );
        }
    };
    let verdict = judge(j.value.value, thr, at_least);
    let t = to_mmhg(thr);
    let margin = to_mmhg(verdict.margin);
    let range_crosses = j.range.0 < t && t < j.range.1;
    let words = match verdict.status {
        Status::Met if range_crosses => format!(
            "met by {} mmHg, but the plausible range reaches {} the target",
            whole(margin.abs()),
            if at_least { "below" } else { "above" }
        ),
        Status::Met => format!(
            "met: {} mmHg {} the target",
            whole(margin.abs()),
            if at_least { "above" } else { "below" }
        ),
        Status::Above => format!("ABOVE limit by {} mmHg", shortfall_mmhg(margin)),
        _ => format!("BELOW target by {} mmHg", shortfall_mmhg(margin)),
    };
    TargetReport {
        target: target.describe(),
        citation: target.citation.clone(),
        zero: j.zero,
        threshold_mmhg: Some(t),
        threshold_steps,
        status: verdict.status,
        margin_mmhg: Some(margin),
        range_crosses,
        words,
        defend: defend(ctx, j, thr, at_least),
    }
}

/// A target that could not be evaluated, and why.
pub(crate) fn not_evaluated(target: &Target, zero: &'static str, why: String) -> TargetReport {
    TargetReport {
        target: target.describe(),
        citation: target.citation.clone(),
        zero,
        threshold_mmhg: None,
        threshold_steps: Vec::new(),
        status: Status::NotEvaluated,
        margin_mmhg: None,
        range_crosses: false,
        words: format!("not evaluated: {why}"),
        defend: Vec::new(),
    }
}

/// What a site must read for the metric to equal `thr`: the metric is
/// linear in the driving reading (`scale` per unit of it), so one
/// evaluation per site suffices.
pub(crate) fn needed(current: Pressure, value: Pressure, thr: Pressure, scale: f64) -> Pressure {
    current + (thr - value) / scale
}

fn defend(ctx: &Ctx<'_>, j: &Judged<'_>, thr: Pressure, at_least: bool) -> Vec<Defend> {
    let scene = ctx.scene();
    let mut out = Vec::new();
    match j.value.driver() {
        None => {}
        Some(Term {
            input: Input::Reading(quantity),
            scale,
            ..
        }) => {
            if let Some(r) = scene.readings.get(&quantity) {
                let need = needed(r.value, j.value.value, thr, scale);
                out.push(defend_row(
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
                let Ok(v) = evaluate::metric(ctx, j.organ, j.metric, Some(i)) else {
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
                out.push(defend_row(
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
pub(crate) fn safe_words(need: Pressure, at_least: bool, unit: PressureUnit) -> String {
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
    let rounded = if at_least { v.ceil() } else { v.floor() } / scale + 0.0;
    let word = if at_least { "at least" } else { "at most" };
    format!("{word} {rounded:.prec$} {unit}", prec = decimals as usize)
}

fn defend_row(
    site: String,
    component: Option<Component>,
    current: Pressure,
    need: Pressure,
    at_least: bool,
    unit: PressureUnit,
) -> Defend {
    let part = component.map_or(String::new(), |c| format!("{} ", c.label()));
    let mut words = format!("{site}: {part}{}", safe_words(need, at_least, unit));
    if let Some(c) = component {
        let (lo, hi) = c.range_mmhg();
        if !(lo..=hi).contains(&to_mmhg(need)) {
            words.push_str(" (outside any reachable pressure: the target cannot be met this way)");
        }
    }
    Defend {
        site,
        component,
        current_mmhg: to_mmhg(current),
        needed_mmhg: to_mmhg(need),
        at_least,
        words,
    }
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
        assert!(to_mmhg(need) > 17.0, "the noise this guards against");
        let check = |need: Pressure, at_least: bool, unit: PressureUnit, expected: &str| {
            assert_eq!(safe_words(need, at_least, unit), expected);
        };
        check(need, true, PressureUnit::MmHg, "at least 17 mmHg");
        check(mmhg(17.2), true, PressureUnit::MmHg, "at least 18 mmHg");
        check(mmhg(17.8), false, PressureUnit::MmHg, "at most 17 mmHg");
        check(mmhg(22.0), false, PressureUnit::MmHg, "at most 22 mmHg");
        check(mmhg(-0.2), false, PressureUnit::MmHg, "at most -1 mmHg");
        check(mmhg(-0.7), true, PressureUnit::MmHg, "at least 0 mmHg");
        let kpa = PressureUnit::KPa.pressure(8.0);
        check(kpa, true, PressureUnit::KPa, "at least 8.0 kPa");
    }
}

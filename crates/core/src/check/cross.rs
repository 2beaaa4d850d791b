//! The two-site cross-check: every other arterial source compared with the
//! primary one once both are at heart level, against the spread of their
//! difference over every uncertain input. One comparison per source keeps
//! the work linear in the number of sources.

use super::spread::Shifts;
use crate::evaluate::{self, Ctx, Value};
use crate::organ::{Metric, Organ};
use crate::report::CrossCheck;
use crate::scene::Owner;
use crate::text::whole;
use crate::units::{to_mmhg, Pressure};

fn at_heart(c: &Ctx<'_>, i: usize) -> Option<Value> {
    evaluate::metric(c, Organ::WholeBody, Metric::Inflow, Some(i)).ok()
}

fn value_at_heart(c: &Ctx<'_>, i: usize) -> Option<Pressure> {
    at_heart(c, i).map(|v| v.value)
}

/// Each source with a mean against the primary source (the first with a
/// mean when the primary has none).
pub(super) fn cross_checks(ctx: &Ctx<'_>, shifts: &Shifts<'_>) -> Vec<CrossCheck> {
    let scene = ctx.scene();
    let n = scene.arterial.len();
    let with_mean: Vec<(usize, Value)> = (0..n)
        .filter_map(|i| at_heart(ctx, i).map(|v| (i, v)))
        .collect();
    let anchor = scene
        .primary
        .and_then(|p| with_mean.iter().position(|(i, _)| *i == p))
        .unwrap_or(0);
    let Some((first, a)) = with_mean.get(anchor) else {
        return Vec::new();
    };
    let mut pairs: Vec<(usize, &Value, usize, &Value)> = Vec::new();
    for (k, (j, b)) in with_mean.iter().enumerate() {
        if k == anchor {
            continue;
        }
        // Keep the case's order within each pair, as the sources were listed.
        if first < j {
            pairs.push((*first, a, *j, b));
        } else {
            pairs.push((*j, b, *first, a));
        }
    }
    pairs
        .into_iter()
        .map(|(i, a, j, b)| {
            let diff = a.value - b.value;
            let (_, down, up) = shifts.spread(diff, &[(1.0, &a.linear), (-1.0, &b.linear)], |c| {
                Some(value_at_heart(c, i)? - value_at_heart(c, j)?)
            });
            let tolerance = down.max(up);
            let d = to_mmhg(diff);
            let agree = d.abs() <= tolerance;
            let (name_a, name_b) = (
                scene.owner_name(Owner::Arterial(i)),
                scene.owner_name(Owner::Arterial(j)),
            );
            let words = if agree {
                format!(
                    "{name_a} and {name_b} agree once both are at heart level: {} mmHg apart, \
                     within their combined accuracy of {} mmHg",
                    whole(d.abs()),
                    whole(tolerance)
                )
            } else {
                format!(
                    "{name_a} and {name_b} DISAGREE at heart level: {} mmHg apart, more than \
                     their combined accuracy of {} mmHg. Check levels, zeroing, damping and cuff size",
                    whole(d.abs()),
                    whole(tolerance)
                )
            };
            CrossCheck {
                first: name_a,
                second: name_b,
                first_at_heart_mmhg: to_mmhg(a.value),
                second_at_heart_mmhg: to_mmhg(b.value),
                difference_mmhg: d,
                tolerance_mmhg: tolerance,
                agree,
                words,
            }
        })
        .collect()
}

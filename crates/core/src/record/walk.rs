//! The walk through a record: every target a record can follow, its
//! linear form in each position, and the values of each at both ends of
//! every interval between consecutive events.

use super::channel::{Channel, Sampling};
use super::exposure::NotAnalysed;
use super::rules::Rules;
use super::timeline::Timeline;
use crate::evaluate::{self, organ_place, Ctx, Input, Linear};
use crate::order::sort_short;
use crate::reading::Quantity;
use crate::scene::Scene;
use crate::target::Target;
use crate::units::Pressure;

/// A target followed through the record: its forms per position segment.
pub(super) struct Followed<'t> {
    pub(super) target: &'t Target,
    pub(super) threshold: Pressure,
    pub(super) at_least: bool,
    pub(super) forms: Vec<Option<Linear>>,
    pub(super) assumed: Vec<Quantity>,
}

/// The targets of a scene that a record can follow, with their forms in
/// each position, and those it cannot with the reason.
pub(super) struct Plan<'t> {
    pub(super) starts: Vec<f64>,
    pub(super) followed: Vec<Followed<'t>>,
    pub(super) not_analysed: Vec<NotAnalysed>,
}

pub(super) fn plan<'t>(scene: &'t Scene, timeline: &Timeline) -> Plan<'t> {
    let segments: Vec<(f64, Scene)> = if timeline.positions.is_empty() {
        vec![(0.0, scene.clone())]
    } else {
        timeline
            .positions
            .iter()
            .enumerate()
            .map(|(k, (at, p))| {
                let mut s = scene.clone();
                s.position = Some(p.clone());
                // Measured heights belong to the position they were taken in.
                if k > 0 {
                    s.measured.clear();
                }
                (*at, s)
            })
            .collect()
    };
    let contexts: Vec<Ctx<'_>> = segments.iter().map(|(_, s)| Ctx::new(s)).collect();
    let base = Ctx::new(scene);
    let has_channel = |input: Input| timeline.channels.iter().any(|c| c.input == input);
    let mut followed = Vec::new();
    let mut not_analysed = Vec::new();
    for target in &scene.targets {
        let not = |why: String| NotAnalysed::new(target, why);
        let place = match organ_place(&base, target.organ) {
            Ok(place) => place,
            Err(m) => {
                not_analysed.push(not(format!("needs {}", evaluate::needs(&m).join("; "))));
                continue;
            }
        };
        if let Err(m) = evaluate::metric(&base, target.organ, target.metric, None) {
            not_analysed.push(not(format!("needs {}", evaluate::needs(&m).join("; "))));
            continue;
        }
        let (threshold, at_least) = match crate::check::threshold(&base, place, target) {
            Ok((t, at_least, _)) => (t, at_least),
            Err(m) => {
                not_analysed.push(not(format!("needs {}", evaluate::needs(&m).join("; "))));
                continue;
            }
        };
        let mut assumed = Vec::new();
        let forms: Vec<Option<Linear>> = contexts
            .iter()
            .map(|ctx| {
                let (form, used) = form_for(ctx, target, &has_channel)?;
                assumed.extend(used);
                Some(form)
            })
            .collect();
        sort_short(&mut assumed);
        assumed.dedup();
        let uses_record = forms.iter().flatten().any(|f| f.inputs().any(has_channel));
        if uses_record {
            followed.push(Followed {
                target,
                threshold,
                at_least,
                forms,
                assumed,
            });
        } else {
            not_analysed.push(not(
                "none of its readings has samples in the record".to_owned()
            ));
        }
    }
    Plan {
        starts: segments.iter().map(|(t, _)| *t).collect(),
        followed,
        not_analysed,
    }
}

/// Visits every interval between consecutive events in `[from, to]` with
/// each followed metric's values at its two ends (`None` where unobserved).
pub(super) fn walk<F>(
    scene: &Scene,
    timeline: &Timeline,
    plan: &Plan<'_>,
    from: f64,
    to: f64,
    mut visit: F,
) where
    F: FnMut(f64, f64, &[Option<(Pressure, Pressure)>]),
{
    let rules = timeline.rules;
    let mut times: Vec<f64> = vec![from, to];
    for ch in &timeline.channels {
        times.extend(ch.t_s.iter().copied());
        if ch.sampling == Sampling::Held {
            times.extend(ch.t_s.iter().map(|t| t + rules.hold_max_s));
        }
    }
    times.extend(plan.starts.iter().copied());
    times.retain(|t| *t >= from && *t <= to);
    times.sort_by(f64::total_cmp);
    times.dedup_by(|a, b| (*a - *b).abs() < 1e-9);

    let channel_of = |input: Input| timeline.channels.iter().position(|c| c.input == input);
    let mut segment = 0;
    let mut values_a: Vec<Option<Pressure>> = vec![None; timeline.channels.len()];
    let mut values_b = values_a.clone();
    let mut ends: Vec<Option<(Pressure, Pressure)>> = vec![None; plan.followed.len()];
    for pair in times.windows(2) {
        let &[a, b] = pair else { continue };
        while plan.starts.get(segment + 1).is_some_and(|t| *t <= a) {
            segment += 1;
        }
        let mid = (a + b) / 2.0;
        for (k, ch) in timeline.channels.iter().enumerate() {
            if let (Some(va), Some(vb)) = (values_a.get_mut(k), values_b.get_mut(k)) {
                *va = sample(ch, &rules, mid, a);
                *vb = sample(ch, &rules, mid, b);
            }
        }
        let lookup = |values: &[Option<Pressure>], input: Input| match channel_of(input) {
            Some(k) => values.get(k).copied().flatten(),
            None => fallback(scene, input),
        };
        for (f, end) in plan.followed.iter().zip(ends.iter_mut()) {
            *end = f
                .forms
                .get(segment)
                .and_then(Option::as_ref)
                .and_then(|form| {
                    Some((
                        form.eval(|i| lookup(&values_a, i))?,
                        form.eval(|i| lookup(&values_b, i))?,
                    ))
                });
        }
        visit(a, b, &ends);
    }
}

/// Each followed metric's value at the instant `t`, with every channel's
/// latest sample at or before it in force: a held reading taken at `t`
/// counts, though it has no duration yet.
pub(super) fn values_at(
    scene: &Scene,
    timeline: &Timeline,
    plan: &Plan<'_>,
    t: f64,
) -> Vec<Option<Pressure>> {
    let rules = timeline.rules;
    let segment = plan
        .starts
        .iter()
        .rposition(|s| *s <= t)
        .unwrap_or_default();
    let value = |input: Input| match timeline.channels.iter().find(|c| c.input == input) {
        Some(ch) => {
            let k = ch.t_s.partition_point(|x| *x <= t).checked_sub(1)?;
            if ch.t_s.get(k) == Some(&t) {
                ch.values.get(k).copied()
            } else {
                sample(ch, &rules, t, t)
            }
        }
        None => fallback(scene, input),
    };
    plan.followed
        .iter()
        .map(|f| f.forms.get(segment)?.as_ref()?.eval(value))
        .collect()
}

/// The value of a channel over the interval around `mid`, at `x`; `None`
/// when the interval is unobserved for it.
fn sample(ch: &Channel, rules: &Rules, mid: f64, x: f64) -> Option<Pressure> {
    let k = ch.t_s.partition_point(|t| *t <= mid).checked_sub(1)?;
    let (t0, v0) = (*ch.t_s.get(k)?, *ch.values.get(k)?);
    match ch.sampling {
        Sampling::Held => (mid - t0 <= rules.hold_max_s).then_some(v0),
        Sampling::Interpolated => {
            let (t1, v1) = (*ch.t_s.get(k + 1)?, *ch.values.get(k + 1)?);
            if t1 - t0 > rules.gap_max_s {
                return None;
            }
            let w = (x - t0) / (t1 - t0);
            Some(v0 + (v1 - v0) * w)
        }
    }
}

/// The static value of an input in the case, used when it has no channel.
/// Arterial inputs never fall back: a record is about how they changed.
fn fallback(scene: &Scene, input: Input) -> Option<Pressure> {
    match input {
        Input::Arterial(..) => None,
        Input::Reading(q) => scene.readings.get(&q).map(|r| r.value),
    }
}

/// The form of a target's metric in one position, and the assumed values
/// it uses, driven by an arterial source that has samples: the primary one
/// if it does, else the first.
fn form_for(
    ctx: &Ctx<'_>,
    target: &Target,
    has_channel: &dyn Fn(Input) -> bool,
) -> Option<(Linear, Vec<Quantity>)> {
    let scene = ctx.scene();
    let primary = evaluate::metric(ctx, target.organ, target.metric, None).ok()?;
    let Input::Arterial(_, component) = primary.linear.lead.input else {
        return Some((primary.linear, primary.assumed));
    };
    if has_channel(primary.linear.lead.input) {
        return Some((primary.linear, primary.assumed));
    }
    (0..scene.arterial.len())
        .filter(|i| has_channel(Input::Arterial(*i, component)))
        .find_map(|i| evaluate::metric(ctx, target.organ, target.metric, Some(i)).ok())
        .filter(|v| has_channel(v.linear.lead.input))
        .map(|v| (v.linear, v.assumed))
}

//! The backrest sweep: the site reading each arterial-driven target needs
//! at every backrest angle, for positions on the back.

use super::targets::{needed, threshold};
use crate::evaluate::{self, organ_place, Ctx, Input};
use crate::geometry::Lie;
use crate::report::{Sweep, SweepPoint};
use crate::scene::Scene;
use crate::units::to_mmhg;

/// Backrest angles the sweep visits, degrees.
pub const SWEEP_ANGLES_DEG: [f64; 19] = [
    0.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0, 45.0, 50.0, 55.0, 60.0, 65.0, 70.0, 75.0,
    80.0, 85.0, 90.0,
];

/// One sweep per target whose metric a site reading drives.
pub(super) fn sweeps(ctx: &Ctx<'_>) -> Vec<Sweep> {
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
    let contexts: Vec<(f64, Ctx<'_>)> = variants.iter().map(|(d, s)| (*d, Ctx::quiet(s))).collect();
    let mut out = Vec::new();
    for target in &scene.targets {
        let Ok(place) = organ_place(ctx, target.organ) else {
            continue;
        };
        let Ok(now) = evaluate::metric(ctx, target.organ, target.metric, None) else {
            continue;
        };
        let Some(Input::Arterial(source, component)) = now.driver().map(|t| t.input) else {
            continue;
        };
        let Ok((thr, at_least, _)) = threshold(ctx, place, target) else {
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

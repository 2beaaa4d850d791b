//! Ranges: every uncertain input moved to both ends of its range, and each
//! result's plausible range the root sum of squares of the effects, one
//! side at a time.
//!
//! Inputs that move the whole scene (the geometry, a measured height, a
//! density) are evaluated in a shifted copy of the scene, once for every
//! result. Inputs that move one reading (a device's accuracy, a transducer's
//! height, a mean's estimation rule) change only the results that read it,
//! through their linear forms: the work per result does not grow with the
//! number of other sources.

use std::collections::BTreeMap;

use crate::evaluate::{Ctx, Input, Linear, Term};
use crate::order::{sort_short, sort_short_by};
use crate::report::Contribution;
use crate::scene::{input_owner, Owner, Param, Scene};
use crate::units::{to_mmhg, Pressure};

/// A shifted copy of the scene, both ways, for one scene-wide input.
pub(crate) struct SceneShift<'a> {
    order: usize,
    label: String,
    up: Ctx<'a>,
    down: Ctx<'a>,
}

/// Every uncertain input of a check, ready to move.
pub(crate) struct Shifts<'a> {
    scene: &'a Scene,
    scene_wide: Vec<SceneShift<'a>>,
    by_owner: BTreeMap<Owner, Vec<(usize, String, Param)>>,
}

/// The shifted copies the scene-wide inputs need: made once per check.
pub(crate) fn shifted_scenes(scene: &Scene) -> Vec<(usize, Param, Scene, Scene)> {
    scene
        .params()
        .into_iter()
        .enumerate()
        .filter(|(_, p)| Scene::moves_the_scene(*p))
        .map(|(k, p)| (k, p, scene.shifted(p, 1.0), scene.shifted(p, -1.0)))
        .collect()
}

impl<'a> Shifts<'a> {
    /// The inputs of `scene`, with the shifted copies from
    /// [`shifted_scenes`].
    pub(crate) fn new(scene: &'a Scene, copies: &'a [(usize, Param, Scene, Scene)]) -> Self {
        let scene_wide = copies
            .iter()
            .map(|(k, p, up, down)| SceneShift {
                order: *k,
                label: scene.param_label(*p),
                up: Ctx::quiet(up),
                down: Ctx::quiet(down),
            })
            .collect();
        let mut by_owner: BTreeMap<Owner, Vec<(usize, String, Param)>> = BTreeMap::new();
        for (k, p) in scene.params().into_iter().enumerate() {
            if let Some(owner) = Scene::owner_of(p) {
                by_owner
                    .entry(owner)
                    .or_default()
                    .push((k, scene.param_label(p), p));
            }
        }
        Shifts {
            scene,
            scene_wide,
            by_owner,
        }
    }

    fn reading(&self, input: Input) -> Option<Pressure> {
        match input {
            Input::Arterial(i, c) => self.scene.arterial.get(i)?.component(c),
            Input::Reading(q) => self.scene.readings.get(&q).map(|r| r.value),
        }
    }

    /// The spread of a quantity `Σ coefficient × linear form` whose nominal
    /// value is `nominal` and whose value in a shifted scene `at` gives:
    /// contributions (largest first) and the root-sum-square pull down and
    /// push up, mmHg.
    pub(crate) fn spread<F>(
        &self,
        nominal: Pressure,
        parts: &[(f64, &Linear)],
        at: F,
    ) -> (Vec<Contribution>, f64, f64)
    where
        F: Fn(&Ctx<'_>) -> Option<Pressure>,
    {
        let base = to_mmhg(nominal);
        let mut effects: Vec<(usize, &str, f64, f64)> = Vec::new();
        for s in &self.scene_wide {
            let effect = |c: &Ctx<'_>| at(c).map_or(0.0, |v| to_mmhg(v) - base);
            effects.push((s.order, &s.label, effect(&s.up), effect(&s.down)));
        }
        let mut owners: Vec<Owner> = parts
            .iter()
            .flat_map(|(_, l)| l.inputs())
            .map(input_owner)
            .collect();
        sort_short(&mut owners);
        owners.dedup();
        for owner in owners {
            for (k, label, param) in self.by_owner.get(&owner).into_iter().flatten() {
                let delta = |t: &Term| self.scene.reading_shift(*param, t.input, t.carried);
                let moves = parts
                    .iter()
                    .any(|(_, l)| l.terms().any(|t| delta(t).is_some()));
                if !moves {
                    continue;
                }
                let value = |sign: f64| {
                    parts
                        .iter()
                        .map(|(coefficient, l)| {
                            l.eval_terms(|t| {
                                Some(self.reading(t.input)? + delta(t).unwrap_or_default() * sign)
                            })
                            .map(|v| to_mmhg(v) * coefficient)
                        })
                        .sum::<Option<f64>>()
                };
                let effect = |sign: f64| value(sign).map_or(0.0, |v| v - base);
                effects.push((*k, label, effect(1.0), effect(-1.0)));
            }
        }
        sort_short_by(&mut effects, |a, b| a.0 < b.0);
        let (mut down_sq, mut up_sq) = (0.0, 0.0);
        let mut contributions = Vec::new();
        for (_, label, a, b) in effects {
            let down = a.min(b).min(0.0);
            let up = a.max(b).max(0.0);
            down_sq += down * down;
            up_sq += up * up;
            if down.abs().max(up) > 0.05 {
                contributions.push(Contribution {
                    input: label.to_owned(),
                    down_mmhg: down,
                    up_mmhg: up,
                });
            }
        }
        // Largest first.
        let size = |c: &Contribution| c.down_mmhg.abs().max(c.up_mmhg);
        sort_short_by(&mut contributions, |x, y| {
            size(y).total_cmp(&size(x)).is_lt()
        });
        (contributions, down_sq.sqrt(), up_sq.sqrt())
    }
}

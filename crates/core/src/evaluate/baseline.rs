//! The baseline brought to an organ's level: relative targets compare the
//! organ's pressure now with the same pressure at the same landmark in the
//! position the baseline was taken in.

use super::{mm, need, Ctx, Step};
use crate::error::Errors;
use crate::fluid::Fluid;
use crate::scene::Place;
use crate::units::column;

/// The baseline's mean arterial pressure carried to `to` in the baseline
/// position: a landmark's height there, or an explicit height.
///
/// # Errors
/// No baseline, or a height that cannot be worked out.
pub fn baseline_inflow(ctx: &Ctx<'_>, to: Place) -> Result<Step, Errors> {
    let scene = ctx.scene();
    let baseline = scene.baseline.as_ref().ok_or_else(|| {
        need(
            "baseline",
            "a baseline (baseline) for targets relative to it",
        )
    })?;
    let heights = scene.baseline_heights().ok_or_else(|| {
        need(
            "patient.height",
            "the patient's height, to place the baseline's position",
        )
    })?;
    let height = |place: Place| match place {
        Place::At(l) => heights.get(&l).copied().ok_or_else(|| {
            need(
                format!("heights.{l}"),
                format!("the height of the {}", l.label()),
            )
        }),
        Place::Height { height, .. } => Ok(height),
    };
    let from = height(baseline.place)?;
    let dest = height(to)?;
    let (mean, basis) = baseline.mean;
    let shift = column(scene.density(Fluid::Blood), dest - from);
    let value = mean - shift;
    let where_to = match to {
        Place::At(l) => l.label().to_owned(),
        Place::Height { .. } => to.describe(),
    };
    Ok(Step {
        what: format!(
            "baseline mean {} ({}, {}, {}) carried to the {where_to} in that position: {} − {} = {}",
            mm(mean),
            basis.describe(),
            baseline.place.describe(),
            baseline.position.posture.label(),
            mm(mean),
            mm(shift),
            mm(value)
        ),
        value,
    })
}

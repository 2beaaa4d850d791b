//! The eye's population formulas (mean OPP = 2/3 MAP − IOP, diastolic OPP
//! = DBP − IOP), applied to an upper-arm reading as measured in a seated
//! patient. No hydrostatic correction is added: the formulas' arm reading
//! already stands for the eye's height above the arm, so correcting too
//! would count the column twice.

use super::{mm, need, Ctx, Frame, Input, Linear, Spot, Step, Term, Value};
use crate::error::{Error, Errors};
use crate::reading::{Component, MeanBasis, Quantity};
use crate::scene::Place;
use crate::units::Pressure;

/// The population metric of `component` (mean or diastolic).
///
/// # Errors
/// No seated position, no upper-arm reading, no IOP.
pub(super) fn population(
    ctx: &Ctx<'_>,
    component: Component,
    source: Option<usize>,
    back: &[(Quantity, bool)],
    eye: Spot,
    (mut steps, mut assumed): (Vec<Step>, Vec<Quantity>),
) -> Result<Value, Errors> {
    let scene = ctx.scene();
    let mut missing = Errors::default();
    if !scene
        .position
        .as_ref()
        .is_some_and(|p| p.posture.is_seated())
    {
        missing.push(Error::missing(
            "position",
            "a seated position (beach chair or sitting): the population formula was derived in \
             seated patients",
        ));
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
        missing.push(Error::missing(
            "arterial",
            "an arterial reading taken on an upper arm",
        ));
    }
    let iop = back.first().map_or(Quantity::Iop, |(q, _)| *q);
    let iop = ctx.reading_needed(&mut steps, &mut assumed, iop, Frame::OrganLevel, eye);
    let (Some(i), Ok((iop, back)), true) = (arm, iop.clone(), missing.is_empty()) else {
        if let Err(m) = iop {
            missing.extend(m);
        }
        return Err(missing);
    };
    let factor = match component {
        Component::Mean => 2.0 / 3.0,
        _ => 1.0,
    };
    let a = scene
        .arterial
        .get(i)
        .ok_or_else(|| need("arterial", "an arterial reading taken on an upper arm"))?;
    let value_at_arm = a.component(component).ok_or_else(|| {
        need(
            format!("arterial[{i}].{}", component.label()),
            format!("the {} pressure of {}", component.label(), a.id),
        )
    })?;
    let value = value_at_arm * factor - iop;
    ctx.note(
        &mut steps,
        || {
            let basis = match (component, a.mean) {
                (Component::Mean, Some((_, MeanBasis::Estimated(rule)))) => {
                    format!(" (estimated: {})", rule.label())
                }
                _ => String::new(),
            };
            let times = if component == Component::Mean {
                "2/3 × "
            } else {
                ""
            };
            format!(
                "{} at {} as measured{basis}, no height correction (the formula already allows \
                 for it): {times}{} − IOP {} = {}",
                component.label(),
                a.id,
                mm(value_at_arm),
                mm(iop),
                mm(value)
            )
        },
        value,
    );
    Ok(Value {
        value,
        steps,
        adjustable: true,
        outflow: None,
        assumed,
        linear: Linear {
            lead: Term {
                input: Input::Arterial(i, component),
                scale: factor,
                offset: Pressure::default(),
                carried: None,
            },
            subtract: vec![back],
            factor: 1.0,
        },
    })
}

//! Hazards that follow from the same physics: the venous pressure at an
//! operative site above the heart (below atmospheric, an open vein can
//! entrain air), and where an external ventricular drain drains once the
//! bed has moved under its chamber.

use super::sweep::SWEEP_ANGLES_DEG;
use crate::evaluate::Ctx;
use crate::fluid::Fluid;
use crate::geometry::{self, Lie};
use crate::landmark::Landmark;
use crate::reading::Quantity;
use crate::report::{DrainPoint, DrainReport, VenousSite};
use crate::scene::{Place, Scene};
use crate::text::whole;
use crate::units::{column, to_cm, to_mmhg, Length, PressureUnit};

/// Venous air embolism: the gradient that can entrain air, in words.
const AIR_ENTRY: &str = "a gradient of about 5 cmH2O to the right atrium is enough; Mirski \
    et al., Anesthesiology 2007, from memory";

/// The venous pressure at the operative site from CVP, or what CVP would
/// keep it at atmospheric, with an alarm when the site may be below it.
pub(super) fn venous_site(ctx: &Ctx<'_>) -> Option<VenousSite> {
    let scene = ctx.scene();
    let (site, chosen) = scene.operative_site?;
    let height = ctx.height(site)?;
    let h = to_cm(height);
    let blood = scene.density(Fluid::Blood);
    let cvp_for_zero = to_mmhg(column(blood, height));
    let label = site.label();
    let note = if chosen {
        ""
    } else {
        " (no operative site given)"
    };
    let which = format!("the {label}{note}");
    let cvp = scene.readings.get(&Quantity::Cvp).and_then(|r| {
        let from: Length = match r.place {
            Place::At(l) => ctx.height(l)?,
            Place::Height { height, .. } => height,
        };
        Some((
            to_mmhg(r.value - column(blood, height - from)),
            r.is_assumed(),
        ))
    });
    let above = format!("the {label}, {h:.0} cm above the heart{note}");
    let (venous, below, words) = match cvp {
        Some((v, assumed)) => {
            let how = if assumed { "ASSUMED CVP" } else { "CVP" };
            let words = if v < 0.0 {
                format!(
                    "Venous pressure at {above}: {} mmHg from the {how}, BELOW atmospheric: an \
                     open vein there can entrain air ({AIR_ENTRY}). A CVP of {} mmHg would bring \
                     it to zero.",
                    whole(v),
                    whole(cvp_for_zero)
                )
            } else {
                format!(
                    "Venous pressure at {}: {} mmHg from the {how}, above atmospheric.",
                    if h > 0.0 {
                        above.clone()
                    } else {
                        which.clone()
                    },
                    whole(v)
                )
            };
            (Some(v), Some(v < 0.0), words)
        }
        None if h > 0.0 => (
            None,
            None,
            format!(
                "{}: venous pressure there is below atmospheric unless CVP exceeds {} mmHg ({} \
                 cmH2O), and an open vein there can entrain air ({AIR_ENTRY}).",
                capital(&above),
                whole(cvp_for_zero),
                whole(PressureUnit::CmH2O.value(column(blood, height)))
            ),
        ),
        None => (
            None,
            None,
            format!(
                "{} is at or below the heart: its venous pressure is at least the CVP.",
                capital(&which)
            ),
        ),
    };
    Some(VenousSite {
        site,
        label,
        chosen,
        above_heart_cm: h,
        venous_mmhg: venous,
        cvp_for_zero_mmhg: cvp_for_zero,
        below_atmospheric: below,
        alarm: below == Some(true) || (venous.is_none() && h > 5.0),
        words,
    })
}

fn capital(text: &str) -> String {
    let mut chars = text.chars();
    chars.next().map_or(String::new(), |c| {
        c.to_uppercase().chain(chars).collect::<String>()
    })
}

/// The tragus's height above the hips' midpoint at a backrest angle: the
/// seat stays where it is while the backrest turns.
fn tragus_in_room(scene: &Scene, backrest_deg: Option<f64>) -> Option<f64> {
    let body = scene.body.as_ref()?;
    let position = scene.position.as_ref()?;
    let position = match backrest_deg {
        Some(deg) => position.with_backrest(deg),
        None => position.clone(),
    };
    let placed = geometry::place(body, &position, None);
    let tragus = placed.heights.get(&Landmark::Tragus).copied()?;
    Some(to_cm(tragus + placed.heart_above_hips))
}

/// Where an open drain drains now, and at every backrest angle if the
/// chamber stays on its pole (common practice: re-level after any change).
pub(super) fn drain(scene: &Scene) -> Option<DrainReport> {
    let (entry, open) = scene.drain?;
    let set_cmh2o = PressureUnit::CmH2O.value(entry.pressure());
    let mmhg = |cmh2o: f64| to_mmhg(PressureUnit::CmH2O.pressure(cmh2o));
    let now = tragus_in_room(scene, None);
    let face_up = scene
        .position
        .as_ref()
        .is_some_and(|p| p.lie == Lie::FaceUp);
    let by_backrest: Vec<DrainPoint> = match now.filter(|_| face_up) {
        Some(now) => SWEEP_ANGLES_DEG
            .iter()
            .filter_map(|deg| {
                let then = tragus_in_room(scene, Some(*deg))?;
                Some(DrainPoint {
                    backrest_deg: *deg,
                    opens_above_cmh2o: set_cmh2o - (then - now),
                })
            })
            .collect(),
        None => Vec::new(),
    };
    let at = |deg: f64| {
        by_backrest
            .iter()
            .find(|p| (p.backrest_deg - deg).abs() < 1e-9)
            .map(|p| p.opens_above_cmh2o)
    };
    let state = if open {
        format!(
            "Drain open: CSF drains whenever ICP at the tragus exceeds {} cmH2O ({} mmHg).",
            whole(set_cmh2o),
            whole(mmhg(set_cmh2o))
        )
    } else {
        format!(
            "Drain clamped: it does not drain; opened at this setting it would drain above {} \
             cmH2O ({} mmHg) at the tragus.",
            whole(set_cmh2o),
            whole(mmhg(set_cmh2o))
        )
    };
    let moves = match (at(0.0), at(90.0)) {
        (Some(flat), Some(upright)) => {
            let mut w = format!(
                " The chamber stays on its pole when the bed moves: with the backrest at 0° it \
                 would drain above {} cmH2O, at 90° above {} cmH2O, until re-levelled to the \
                 tragus (common practice).",
                whole(flat),
                whole(upright)
            );
            if let Some(p) = by_backrest.iter().find(|p| p.opens_above_cmh2o < 0.0) {
                w.push_str(&format!(
                    " From {:.0}° up the chamber is below the tragus: it would drain even at \
                     an ICP of zero.",
                    p.backrest_deg
                ));
            }
            w
        }
        _ => " Re-level the chamber to the tragus after any change of position (common \
               practice)."
            .to_owned(),
    };
    Some(DrainReport {
        open,
        opens_above_cmh2o: set_cmh2o,
        opens_above_mmhg: mmhg(set_cmh2o),
        by_backrest,
        words: format!("{state}{moves}"),
    })
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use crate::case::Case;

    fn scene(extra: &str) -> Scene {
        let text = format!(
            r#"{{"format": "plumbline-case", "version": 1, "patient": {{"height": "170 cm"}},
                "position": {{"posture": "head_up", "backrest_deg": 30}} {extra}}}"#
        );
        Scene::from_case(&Case::from_json(&text).unwrap()).unwrap()
    }

    #[test]
    fn a_drain_set_at_the_tragus_opens_at_its_setting_and_moves_with_the_bed() {
        let s = scene(r#", "ventricular_drain": {"set_at": "15 cmH2O"}"#);
        let d = drain(&s).unwrap();
        assert!((d.opens_above_cmh2o - 15.0).abs() < 1e-9);
        // 15 cmH2O = 11.03 mmHg (NIST SP 811 conventional units, D).
        assert!((d.opens_above_mmhg - 11.033).abs() < 1e-3);
        let at = |deg: f64| {
            d.by_backrest
                .iter()
                .find(|p| p.backrest_deg == deg)
                .unwrap()
                .opens_above_cmh2o
        };
        assert!((at(30.0) - 15.0).abs() < 1e-9, "the current angle");
        // Raising the head toward the chamber lowers the opening pressure.
        assert!(at(60.0) < at(30.0) && at(30.0) < at(0.0));
        assert!(d.words.contains("re-levelled"));
    }

    #[test]
    fn a_clamped_drain_says_so() {
        let s = scene(r#", "ventricular_drain": {"set_at": "10 mmHg", "open": false}"#);
        let d = drain(&s).unwrap();
        assert!(!d.open);
        assert!(d.words.starts_with("Drain clamped"));
        assert!((d.opens_above_mmhg - 10.0).abs() < 1e-9);
    }

    #[test]
    fn heights_in_the_room_keep_the_seat_fixed() {
        let s = scene("");
        let flat = tragus_in_room(&s, Some(0.0)).unwrap();
        let up = tragus_in_room(&s, Some(90.0)).unwrap();
        assert!(up - flat > 40.0, "{flat} → {up}");
    }
}

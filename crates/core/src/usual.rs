//! The usual way readings are taken, so a front end can start a new box the
//! way a clinician would and name a source by what it is: the method each
//! pressure is usually read by, the landmarks it may refer to, the unit its
//! scale is marked in, a source's short name from its method and site, and a
//! blood pressure typed as one text (`100/60`, `100/60 (74)`).
//!
//! These are conventions of the trade (common practice), kept here so that
//! no front end carries clinical rules of its own.

use crate::landmark::{Landmark, Side};
use crate::reading::{Level, Method, Quantity};
use crate::units::{PressureEntry, PressureUnit};

/// The method a new reading of `quantity` starts with.
///
/// # Example
/// ```
/// use plumbline_core::reading::{Method, Quantity};
/// use plumbline_core::usual::method_for;
/// assert_eq!(method_for(Quantity::Iop), Method::Tonometer);
/// assert_eq!(method_for(Quantity::Csf), Method::DrainScale);
/// ```
pub fn method_for(quantity: Quantity) -> Method {
    match quantity {
        Quantity::Icp => Method::Probe,
        Quantity::Csf => Method::DrainScale,
        Quantity::Iop => Method::Tonometer,
        Quantity::Compartment => Method::Needle,
        Quantity::Cvp
        | Quantity::Iap
        | Quantity::Lvedp
        | Quantity::CprAorticRelaxation
        | Quantity::CprRightAtrialRelaxation => Method::Transducer,
    }
}

/// The unit a method's reading is usually written in: cmH2O for a scale
/// read by eye, mmHg for a monitor.
pub fn unit_for(method: Method) -> PressureUnit {
    if method.reads_a_water_column() {
        PressureUnit::CmH2O
    } else {
        PressureUnit::MmHg
    }
}

/// The landmarks a reading of `quantity` may refer to: an eye for IOP, a
/// limb for compartment pressure (both are taken in the tissue itself),
/// any landmark for the others.
pub fn levels_for(quantity: Quantity) -> Vec<Landmark> {
    Landmark::ALL
        .into_iter()
        .filter(|l| match quantity {
            Quantity::Iop => l.is_eye(),
            Quantity::Compartment => l.is_limb(),
            _ => true,
        })
        .collect()
}

/// The level a new reading of `quantity` starts at: its conventional
/// reference, else the first landmark it may refer to.
pub fn first_level(quantity: Quantity) -> Landmark {
    quantity.usual_level().unwrap_or(match quantity {
        Quantity::Iop => Landmark::EyeLeft,
        _ => Landmark::CalfLeft,
    })
}

/// The level a new arterial source of `method` starts at: the left upper
/// arm for a cuff, the heart reference for a transducer.
pub fn first_arterial_level(method: Method) -> Landmark {
    match method {
        Method::Cuff => Landmark::UpperArmLeft,
        _ => Landmark::Heart,
    }
}

/// A short name for an arterial source from what it is: "L arm cuff", "R
/// calf cuff", "arterial line". A transducer's level is where the
/// transducer sits, not the artery, so a line is named by its method alone.
/// A name already in `taken` gets a number.
///
/// # Example
/// ```
/// use plumbline_core::landmark::Landmark;
/// use plumbline_core::reading::{Level, Method};
/// use plumbline_core::usual::source_name;
/// let arm = Level::At(Landmark::UpperArmLeft);
/// assert_eq!(source_name(Method::Cuff, arm, &[]), "L arm cuff");
/// assert_eq!(source_name(Method::Cuff, arm, &["L arm cuff"]), "L arm cuff 2");
/// assert_eq!(source_name(Method::Transducer, Level::At(Landmark::Heart), &[]), "arterial line");
/// ```
pub fn source_name(method: Method, level: Level, taken: &[&str]) -> String {
    let base = match (method, level) {
        (Method::Cuff, Level::At(landmark)) => match limb_word(landmark) {
            Some(limb) => format!("{} {limb} cuff", side_letter(landmark.side())),
            None => "cuff".to_owned(),
        },
        (Method::Cuff, Level::Height(_)) => "cuff".to_owned(),
        (Method::Transducer, _) => "arterial line".to_owned(),
        (Method::Probe, _) => "arterial tip sensor".to_owned(),
        _ => format!("arterial {}", method.label()),
    };
    let base = base.trim().to_owned();
    if !taken.contains(&base.as_str()) {
        return base;
    }
    (2..)
        .map(|n| format!("{base} {n}"))
        .find(|name| !taken.contains(&name.as_str()))
        .unwrap_or(base)
}

fn side_letter(side: Option<Side>) -> &'static str {
    match side {
        Some(Side::Left) => "L",
        Some(Side::Right) => "R",
        None => "",
    }
}

fn limb_word(landmark: Landmark) -> Option<&'static str> {
    use Landmark::*;
    Some(match landmark {
        UpperArmLeft | UpperArmRight => "arm",
        WristLeft | WristRight => "wrist",
        ThighLeft | ThighRight => "thigh",
        CalfLeft | CalfRight => "calf",
        AnkleLeft | AnkleRight => "ankle",
        _ => return None,
    })
}

/// A blood pressure typed as one text: systolic, diastolic and, if given,
/// the device's mean.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BloodPressure {
    /// Systolic.
    pub systolic: PressureEntry,
    /// Diastolic.
    pub diastolic: PressureEntry,
    /// The mean shown by the device, when typed.
    pub mean: Option<PressureEntry>,
}

/// Reads `100/60`, `100/60 (74)`, `100/60/74`, `100 / 60 mmHg` or
/// `13.3/8 kPa`: systolic, diastolic and an optional mean, in `unit` unless
/// the text names one. Checks only the shape; ranges and order are the
/// scene's to check, with the field they belong to.
///
/// # Errors
/// A plain sentence saying what was expected, quoting the text as typed.
///
/// # Example
/// ```
/// use plumbline_core::units::PressureUnit;
/// use plumbline_core::usual::read_blood_pressure;
/// let bp = read_blood_pressure("100/60 (74)", PressureUnit::MmHg).unwrap();
/// assert_eq!(bp.mean.map(|m| m.amount), Some(74.0));
/// assert!(read_blood_pressure("100/", PressureUnit::MmHg).is_err());
/// ```
pub fn read_blood_pressure(text: &str, unit: PressureUnit) -> Result<BloodPressure, String> {
    let typed = text.trim();
    let (numbers, unit) = match PressureUnit::ALL
        .into_iter()
        .find_map(|u| strip_suffix_ignoring_case(typed, u.symbol()).map(|rest| (rest, u)))
    {
        Some((rest, u)) => (rest.trim_end(), u),
        None => (typed, unit),
    };
    let flat = numbers.replace(['(', ')'], " / ");
    let parts: Vec<&str> = flat
        .split('/')
        .map(str::trim)
        .filter(|p| !p.is_empty())
        .collect();
    let expected = || {
        format!(
            "'{typed}' is not a blood pressure; type systolic/diastolic, e.g. 100/60, or with \
             the device's mean, 100/60 (74)"
        )
    };
    let opened = numbers.matches('(').count();
    let balanced = opened == numbers.matches(')').count() && opened <= 1;
    let separators = numbers.matches('/').count() + opened;
    if !balanced || separators + 1 != parts.len() {
        return Err(expected());
    }
    let number = |p: &str| {
        p.parse::<f64>()
            .ok()
            .filter(|v| v.is_finite())
            .map(|amount| PressureEntry { amount, unit })
    };
    match parts.as_slice() {
        [s, d] => Ok(BloodPressure {
            systolic: number(s).ok_or_else(expected)?,
            diastolic: number(d).ok_or_else(expected)?,
            mean: None,
        }),
        [s, d, m] => Ok(BloodPressure {
            systolic: number(s).ok_or_else(expected)?,
            diastolic: number(d).ok_or_else(expected)?,
            mean: Some(number(m).ok_or_else(expected)?),
        }),
        _ => Err(expected()),
    }
}

fn strip_suffix_ignoring_case<'t>(text: &'t str, suffix: &str) -> Option<&'t str> {
    let cut = text.len().checked_sub(suffix.len())?;
    let (head, tail) = (text.get(..cut)?, text.get(cut..)?);
    tail.eq_ignore_ascii_case(suffix).then_some(head)
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn bp(text: &str) -> Option<(f64, f64, Option<f64>, PressureUnit)> {
        read_blood_pressure(text, PressureUnit::MmHg).ok().map(|b| {
            (
                b.systolic.amount,
                b.diastolic.amount,
                b.mean.map(|m| m.amount),
                b.systolic.unit,
            )
        })
    }

    #[test]
    fn blood_pressures_as_typed_at_the_bedside() {
        use PressureUnit::*;
        assert_eq!(bp("100/60"), Some((100.0, 60.0, None, MmHg)));
        assert_eq!(bp(" 100 / 60 "), Some((100.0, 60.0, None, MmHg)));
        assert_eq!(bp("100/60 (74)"), Some((100.0, 60.0, Some(74.0), MmHg)));
        assert_eq!(bp("100/60(74)"), Some((100.0, 60.0, Some(74.0), MmHg)));
        assert_eq!(bp("100/60/74"), Some((100.0, 60.0, Some(74.0), MmHg)));
        assert_eq!(bp("100/60 mmHg"), Some((100.0, 60.0, None, MmHg)));
        assert_eq!(bp("13.3/8 kPa"), Some((13.3, 8.0, None, KPa)));
        for bad in [
            "",
            "100",
            "100/",
            "/60",
            "100/60/",
            "100//60",
            "a/b",
            "100/60 (74",
            "1/2/3/4",
        ] {
            assert_eq!(bp(bad), None, "{bad:?}");
        }
    }

    #[test]
    fn a_bad_blood_pressure_quotes_what_was_typed_without_adding_a_unit() {
        let e = read_blood_pressure("100/6o", PressureUnit::MmHg).unwrap_err();
        assert!(e.starts_with("'100/6o' is not a blood pressure"), "{e}");
    }

    #[test]
    fn sources_are_named_by_what_they_are() {
        let at = Level::At;
        assert_eq!(
            source_name(Method::Cuff, at(Landmark::CalfRight), &[]),
            "R calf cuff"
        );
        assert_eq!(
            source_name(Method::Cuff, at(Landmark::WristLeft), &[]),
            "L wrist cuff"
        );
        assert_eq!(source_name(Method::Cuff, at(Landmark::Heart), &[]), "cuff");
        assert_eq!(
            source_name(Method::Transducer, at(Landmark::Tragus), &["arterial line"]),
            "arterial line 2"
        );
    }

    #[test]
    fn new_readings_start_the_usual_way() {
        for q in Quantity::ALL {
            assert!(levels_for(q).contains(&first_level(q)), "{q}");
        }
        assert_eq!(unit_for(method_for(Quantity::Csf)), PressureUnit::CmH2O);
        assert_eq!(unit_for(method_for(Quantity::Cvp)), PressureUnit::MmHg);
        assert_eq!(first_arterial_level(Method::Cuff), Landmark::UpperArmLeft);
    }
}

//! Readings: what was measured, how, and at which level.
//!
//! Every pressure is read at one place. A fluid-filled transducer reads the
//! pressure at its own current height; a cuff reads the artery under it; an
//! ICP probe is referenced to the tragus. A reading therefore always carries
//! a [`Level`] and a [`Method`], and the method carries its accuracy.

use std::fmt;

use serde::{Deserialize, Deserializer, Serialize, Serializer};

use crate::fluid::Fluid;
use crate::landmark::Landmark;
use crate::units::{mmhg, to_mmhg, LengthEntry, Pressure};

/// The spread of one cuff reading, mmHg: a device at the limits of the
/// validation standard (ISO 81060-2: mean difference within 5 mmHg *and*
/// its SD within 8 mmHg) has a root-mean-square error of √(5² + 8²) for a
/// single reading. The standard validates systolic and diastolic; the
/// device's oscillometric mean is given the same spread (docs/DESIGN.md).
pub const CUFF_PER_READING_MMHG: f64 = 9.433_981_132_056_603;

/// How a pressure was measured; each method has a default accuracy.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Method {
    /// Oscillometric or auscultatory cuff.
    Cuff,
    /// Fluid-filled line to an electronic transducer: reads the pressure at
    /// the transducer's own height.
    Transducer,
    /// Solid-state or fibre-optic tip sensor (parenchymal ICP, some IAP kits).
    Probe,
    /// A fluid level read by eye on a drain's or manometer's scale.
    DrainScale,
    /// Tonometer on the eye.
    Tonometer,
    /// Needle or catheter manometer in a limb compartment.
    Needle,
}

impl Method {
    /// Every method.
    pub const ALL: [Method; 6] = [
        Method::Cuff,
        Method::Transducer,
        Method::Probe,
        Method::DrainScale,
        Method::Tonometer,
        Method::Needle,
    ];

    /// The method in words.
    pub fn label(self) -> &'static str {
        match self {
            Method::Cuff => "cuff",
            Method::Transducer => "fluid-filled transducer",
            Method::Probe => "tip sensor",
            Method::DrainScale => "drain or manometer scale",
            Method::Tonometer => "tonometer",
            Method::Needle => "compartment needle",
        }
    }

    /// The default accuracy (half-width) of a reading of `value` by this
    /// method.
    pub fn accuracy(self, value: Pressure) -> Pressure {
        match self {
            Method::Cuff => mmhg(CUFF_PER_READING_MMHG),
            Method::Transducer => mmhg(4.0_f64.max(0.04 * to_mmhg(value).abs())),
            Method::Probe | Method::DrainScale | Method::Tonometer => mmhg(2.0),
            Method::Needle => mmhg(5.0),
        }
    }

    /// Where the default accuracy comes from.
    pub fn accuracy_source(self) -> &'static str {
        match self {
            Method::Cuff => {
                "one reading of a cuff validated to ISO 81060-2 (mean error within 5 mmHg and SD \
                 within 8 mmHg): root mean square error up to √(5² + 8²) = 9.4 mmHg"
            }
            Method::Transducer => "IEC 60601-2-34: ±4 mmHg or ±4% (from memory)",
            Method::Probe => "typical tip-sensor specification ±2 mmHg (from memory)",
            Method::DrainScale => "reading a fluid level by eye, about ±2 mmHg (assumed)",
            Method::Tonometer => "tonometry, about ±2 mmHg (from memory)",
            Method::Needle => "compartment manometry, about ±5 mmHg (assumed)",
        }
    }

    /// Whether the method reads a water column, where cmH2O is the natural unit.
    pub fn reads_a_water_column(self) -> bool {
        matches!(self, Method::DrainScale)
    }
}

/// The pressures other than arterial that a case can hold.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Quantity {
    /// Central venous pressure.
    Cvp,
    /// Intracranial pressure.
    Icp,
    /// Intra-abdominal pressure (bladder).
    Iap,
    /// CSF pressure from a lumbar drain.
    Csf,
    /// Intra-ocular pressure.
    Iop,
    /// Limb compartment pressure.
    Compartment,
    /// Left ventricular end-diastolic pressure, or pulmonary wedge pressure.
    Lvedp,
    /// Aortic relaxation-phase pressure during CPR.
    CprAorticRelaxation,
    /// Right-atrial relaxation-phase pressure during CPR.
    CprRightAtrialRelaxation,
}

impl Quantity {
    /// Every quantity.
    pub const ALL: [Quantity; 9] = [
        Quantity::Cvp,
        Quantity::Icp,
        Quantity::Iap,
        Quantity::Csf,
        Quantity::Iop,
        Quantity::Compartment,
        Quantity::Lvedp,
        Quantity::CprAorticRelaxation,
        Quantity::CprRightAtrialRelaxation,
    ];

    /// The name used in case files.
    pub fn key(self) -> &'static str {
        match self {
            Quantity::Cvp => "cvp",
            Quantity::Icp => "icp",
            Quantity::Iap => "iap",
            Quantity::Csf => "csf",
            Quantity::Iop => "iop",
            Quantity::Compartment => "compartment",
            Quantity::Lvedp => "lvedp",
            Quantity::CprAorticRelaxation => "cpr_aortic_relaxation",
            Quantity::CprRightAtrialRelaxation => "cpr_right_atrial_relaxation",
        }
    }

    /// The short clinical name.
    pub fn label(self) -> &'static str {
        match self {
            Quantity::Cvp => "CVP",
            Quantity::Icp => "ICP",
            Quantity::Iap => "IAP",
            Quantity::Csf => "CSF pressure",
            Quantity::Iop => "IOP",
            Quantity::Compartment => "compartment pressure",
            Quantity::Lvedp => "LVEDP / wedge",
            Quantity::CprAorticRelaxation => "aortic relaxation pressure",
            Quantity::CprRightAtrialRelaxation => "right-atrial relaxation pressure",
        }
    }

    /// The fluid the pressure is carried through to other heights; `None`
    /// for pressures that exist only where they are measured (IOP,
    /// compartment).
    pub fn fluid(self) -> Option<Fluid> {
        match self {
            Quantity::Cvp
            | Quantity::Lvedp
            | Quantity::CprAorticRelaxation
            | Quantity::CprRightAtrialRelaxation => Some(Fluid::Blood),
            Quantity::Icp | Quantity::Csf => Some(Fluid::Csf),
            Quantity::Iap => Some(Fluid::Saline),
            Quantity::Iop | Quantity::Compartment => None,
        }
    }

    /// The landmark this pressure is conventionally referenced to: the
    /// tragus for ICP, the iliac crest (mid-axillary line) for bladder IAP,
    /// the heart reference for the others; `None` for pressures that exist
    /// only in the tissue where they are taken (IOP, compartment), whose
    /// level must be given.
    ///
    /// # Example
    /// ```
    /// use plumbline_core::landmark::Landmark;
    /// use plumbline_core::reading::Quantity;
    /// assert_eq!(Quantity::Icp.usual_level(), Some(Landmark::Tragus));
    /// assert_eq!(Quantity::Iop.usual_level(), None);
    /// ```
    pub fn usual_level(self) -> Option<Landmark> {
        match self {
            Quantity::Icp => Some(Landmark::Tragus),
            Quantity::Iap => Some(Landmark::IliacCrest),
            Quantity::Iop | Quantity::Compartment => None,
            Quantity::Cvp
            | Quantity::Csf
            | Quantity::Lvedp
            | Quantity::CprAorticRelaxation
            | Quantity::CprRightAtrialRelaxation => Some(Landmark::Heart),
        }
    }

    /// The accepted range in mmHg: wide enough for any living patient,
    /// narrow enough to catch a slip of the finger or the unit.
    pub fn range_mmhg(self) -> (f64, f64) {
        match self {
            Quantity::Cvp => (-10.0, 50.0),
            Quantity::Icp => (-20.0, 100.0),
            Quantity::Iap => (-5.0, 80.0),
            Quantity::Csf => (-20.0, 80.0),
            Quantity::Iop => (0.0, 80.0),
            Quantity::Compartment => (0.0, 150.0),
            Quantity::Lvedp => (0.0, 60.0),
            Quantity::CprAorticRelaxation => (0.0, 150.0),
            Quantity::CprRightAtrialRelaxation => (-10.0, 100.0),
        }
    }
}

impl fmt::Display for Quantity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

/// The parts of an arterial pressure.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Component {
    /// Systolic.
    Systolic,
    /// Diastolic.
    Diastolic,
    /// Mean.
    Mean,
}

impl Component {
    /// The component in words.
    pub fn label(self) -> &'static str {
        match self {
            Component::Systolic => "systolic",
            Component::Diastolic => "diastolic",
            Component::Mean => "mean",
        }
    }

    /// The accepted range in mmHg.
    pub fn range_mmhg(self) -> (f64, f64) {
        match self {
            Component::Systolic => (30.0, 300.0),
            Component::Diastolic => (10.0, 200.0),
            Component::Mean => (15.0, 250.0),
        }
    }
}

/// The level a reading refers to.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Level {
    /// At a named landmark: a cuff on the upper arm, a transducer levelled
    /// at the tragus.
    At(Landmark),
    /// At a height above the heart reference point: where a transducer is
    /// now, measured with a level.
    Height(LengthEntry),
}

impl Level {
    /// The level in words.
    pub fn describe(self) -> String {
        match self {
            Level::At(landmark) => landmark.label().to_owned(),
            Level::Height(h) => format!("{h} above the heart reference"),
        }
    }
}

#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct LevelHeight {
    height: LengthEntry,
}

impl Serialize for Level {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        match self {
            Level::At(landmark) => landmark.serialize(serializer),
            Level::Height(height) => LevelHeight { height: *height }.serialize(serializer),
        }
    }
}

impl<'de> Deserialize<'de> for Level {
    /// Reads `"tragus"` or `{"height": "12 cm"}`.
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        use serde::de::Error as _;
        match serde_json::Value::deserialize(deserializer)? {
            serde_json::Value::String(name) => {
                serde_json::from_value(serde_json::Value::String(name.clone()))
                    .map(Level::At)
                    .map_err(|_| {
                        D::Error::custom(format!(
                    "'{name}' is not a landmark; use one of {}, or {{\"height\": \"12 cm\"}}",
                    Landmark::ALL.map(Landmark::key).join(", ")
                ))
                    })
            }
            value @ serde_json::Value::Object(_) => serde_json::from_value::<LevelHeight>(value)
                .map(|l| Level::Height(l.height))
                .map_err(|e| D::Error::custom(format!("a level given as a height: {e}"))),
            _ => Err(D::Error::custom(
                "a level is a landmark name such as \"heart\" or {\"height\": \"12 cm\"}",
            )),
        }
    }
}

/// How a mean pressure is estimated when only systolic and diastolic are known.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum MeanRule {
    /// Diastolic plus a third of the pulse pressure (common practice).
    #[default]
    OneThird,
    /// Diastolic plus 0.412 of the pulse pressure (Meaney et al., Heart 2000).
    #[serde(rename = "form_factor_0412")]
    FormFactor,
}

impl MeanRule {
    /// The fraction of the pulse pressure added to diastolic.
    pub fn fraction(self) -> f64 {
        match self {
            MeanRule::OneThird => 1.0 / 3.0,
            MeanRule::FormFactor => 0.412,
        }
    }

    /// The other rule, whose disagreement measures the estimate's uncertainty.
    pub fn other(self) -> MeanRule {
        match self {
            MeanRule::OneThird => MeanRule::FormFactor,
            MeanRule::FormFactor => MeanRule::OneThird,
        }
    }

    /// The rule in words.
    pub fn label(self) -> &'static str {
        match self {
            MeanRule::OneThird => "diastolic + (systolic − diastolic)/3",
            MeanRule::FormFactor => "diastolic + 0.412 × (systolic − diastolic) (Meaney 2000)",
        }
    }

    /// The estimated mean.
    ///
    /// # Example
    /// ```
    /// use plumbline_core::reading::MeanRule;
    /// use plumbline_core::units::{mmhg, to_mmhg};
    /// let map = MeanRule::OneThird.estimate(mmhg(120.0), mmhg(80.0));
    /// assert!((to_mmhg(map) - 93.333).abs() < 1e-3);
    /// ```
    pub fn estimate(self, systolic: Pressure, diastolic: Pressure) -> Pressure {
        diastolic + (systolic - diastolic) * self.fraction()
    }
}

/// Where a mean pressure came from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case", tag = "basis", content = "rule")]
pub enum MeanBasis {
    /// Read from the device (the cuff's oscillometric mean, the line's mean).
    Measured,
    /// Estimated from systolic and diastolic.
    Estimated(MeanRule),
}

impl MeanBasis {
    /// The basis in words.
    pub fn describe(self) -> String {
        match self {
            MeanBasis::Measured => "measured".into(),
            MeanBasis::Estimated(rule) => format!("estimated: {}", rule.label()),
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn level_reads_a_landmark_or_a_height() {
        let at: Level = serde_json::from_str("\"upper_arm_left\"").unwrap();
        assert_eq!(at, Level::At(Landmark::UpperArmLeft));
        let h: Level = serde_json::from_str(r#"{"height": "-12 cm"}"#).unwrap();
        assert_eq!(h, Level::Height(LengthEntry::cm(-12.0)));
        let bad = serde_json::from_str::<Level>("\"elbow\"").unwrap_err();
        assert!(bad.to_string().contains("not a landmark"));
        assert!(serde_json::from_str::<Level>("12").is_err());
        assert!(serde_json::from_str::<Level>(r#"{"height": "12"}"#).is_err());
    }

    #[test]
    fn transducer_accuracy_grows_with_the_reading() {
        assert_eq!(to_mmhg(Method::Transducer.accuracy(mmhg(50.0))), 4.0);
        assert!((to_mmhg(Method::Transducer.accuracy(mmhg(200.0))) - 8.0).abs() < 1e-9);
    }

    #[test]
    fn usual_levels_follow_the_trade_conventions() {
        let check = |q: Quantity, expected: Option<Landmark>| assert_eq!(q.usual_level(), expected);
        check(Quantity::Icp, Some(Landmark::Tragus));
        check(Quantity::Iap, Some(Landmark::IliacCrest));
        check(Quantity::Cvp, Some(Landmark::Heart));
        check(Quantity::Csf, Some(Landmark::Heart));
        check(Quantity::Lvedp, Some(Landmark::Heart));
        check(Quantity::Iop, None);
        check(Quantity::Compartment, None);
    }

    #[test]
    fn every_quantity_range_is_ordered() {
        for q in Quantity::ALL {
            let (lo, hi) = q.range_mmhg();
            assert!(lo < hi, "{q}");
        }
    }
}

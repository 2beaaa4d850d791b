//! The fluid columns a pressure is carried through, and their densities.
//!
//! A pressure moves to another height through the fluid it is in: arterial
//! and venous pressures through blood, ICP and lumbar drain pressures through
//! CSF, bladder pressure through the abdomen's contents (taken as saline).
//! Each density carries a range; the range feeds the uncertainty of every
//! result that moves a pressure.

use serde::{Deserialize, Serialize};

use crate::units::{kg_per_m3, to_kg_per_m3, Density};

/// A fluid a column of pressure passes through.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Fluid {
    /// Whole blood.
    Blood,
    /// Cerebrospinal fluid.
    Csf,
    /// Saline: transducer lines, bladder instillate, and the abdominal
    /// contents for IAP (an approximation of ours, stated in results).
    Saline,
}

impl Fluid {
    /// Every fluid.
    pub const ALL: [Fluid; 3] = [Fluid::Blood, Fluid::Csf, Fluid::Saline];

    /// The fluid in words.
    pub fn label(self) -> &'static str {
        match self {
            Fluid::Blood => "blood",
            Fluid::Csf => "CSF",
            Fluid::Saline => "saline",
        }
    }
}

/// A density with the range it may plausibly take, and where it comes from.
#[derive(Clone, Debug, PartialEq)]
pub struct DensityRange {
    /// The value used.
    pub nominal: Density,
    /// The lowest plausible value.
    pub low: Density,
    /// The highest plausible value.
    pub high: Density,
    /// Where the value comes from, in words.
    pub source: String,
    /// Where the range comes from, in words, for wherever it is shown.
    pub range_source: &'static str,
}

impl DensityRange {
    fn from_kg_per_m3(
        (nominal, low, high): (f64, f64, f64),
        source: &str,
        range_source: &'static str,
    ) -> Self {
        DensityRange {
            nominal: kg_per_m3(nominal),
            low: kg_per_m3(low),
            high: kg_per_m3(high),
            source: source.to_owned(),
            range_source,
        }
    }

    /// A density the user gave. The range is kept narrow (±5 kg/m³) because
    /// a measured density is trusted over a population value.
    pub fn entered(value: Density) -> Self {
        let v = to_kg_per_m3(value);
        DensityRange::from_kg_per_m3(
            (v, v - 5.0, v + 5.0),
            "entered in the case",
            "±5 kg/m³ around the value entered",
        )
    }
}

/// Whole-blood specific gravity at 37 °C, 1.0506 (Trudnowski and Rico,
/// Clin Chem 1974;20:615), as kg/m³.
pub const BLOOD_KG_PER_M3: f64 = 1050.6;
/// The whole-blood density range 1043-1057 kg/m³ (Hinghofer-Szalkay and
/// Greenleaf, J Appl Physiol 1987;63:1003).
pub const BLOOD_RANGE_KG_PER_M3: (f64, f64) = (1043.0, 1057.0);
/// Plasma specific gravity 1.0205 (Trudnowski and Rico 1974), as kg/m³.
pub const PLASMA_KG_PER_M3: f64 = 1020.5;
/// Packed red-cell density, kg/m³. From memory (commonly quoted 1.09-1.10);
/// the haematocrit option is checked only against the published whole-blood
/// range, never against this figure alone.
pub const RED_CELL_KG_PER_M3: f64 = 1093.0;

/// Haematocrit fractions the blood-density option accepts.
pub const HAEMATOCRIT_RANGE: (f64, f64) = (0.10, 0.70);

/// The densities used by one check.
#[derive(Clone, Debug, PartialEq)]
pub struct Densities {
    /// Whole blood.
    pub blood: DensityRange,
    /// CSF.
    pub csf: DensityRange,
    /// Saline.
    pub saline: DensityRange,
}

impl Default for Densities {
    fn default() -> Self {
        Densities {
            blood: DensityRange::from_kg_per_m3(
                (
                    BLOOD_KG_PER_M3,
                    BLOOD_RANGE_KG_PER_M3.0,
                    BLOOD_RANGE_KG_PER_M3.1,
                ),
                "whole blood at 37 °C, specific gravity 1.0506 (Trudnowski and Rico 1974); \
                 range 1043-1057 kg/m³ (Hinghofer-Szalkay and Greenleaf 1987)",
                "the published whole-blood range, Hinghofer-Szalkay and Greenleaf 1987",
            ),
            csf: DensityRange::from_kg_per_m3(
                (1006.5, 1003.0, 1010.0),
                "CSF, about 1005-1008 kg/m³ (from memory)",
                "from memory",
            ),
            saline: DensityRange::from_kg_per_m3(
                (1005.0, 1000.0, 1008.0),
                "0.9% saline near body temperature (from memory)",
                "from memory",
            ),
        }
    }
}

impl Densities {
    /// The density range of a fluid.
    pub fn get(&self, fluid: Fluid) -> &DensityRange {
        match fluid {
            Fluid::Blood => &self.blood,
            Fluid::Csf => &self.csf,
            Fluid::Saline => &self.saline,
        }
    }

    /// Mutable access, for overrides and perturbations.
    pub fn get_mut(&mut self, fluid: Fluid) -> &mut DensityRange {
        match fluid {
            Fluid::Blood => &mut self.blood,
            Fluid::Csf => &mut self.csf,
            Fluid::Saline => &mut self.saline,
        }
    }
}

/// Whole-blood density from the haematocrit (a fraction, 0.10-0.70),
/// linear between plasma and packed cells as Hinghofer-Szalkay et al. (Klin
/// Wochenschr 1979) found it to be. The range is ±4 kg/m³ around it, the
/// scatter of the plasma and cell values.
///
/// Returns `None` outside the accepted haematocrit range.
///
/// # Example
/// ```
/// use plumbline_core::fluid::blood_from_haematocrit;
/// assert!(blood_from_haematocrit(0.42).is_some());
/// assert!(blood_from_haematocrit(42.0).is_none()); // a percentage, not a fraction
/// ```
pub fn blood_from_haematocrit(haematocrit: f64) -> Option<DensityRange> {
    if !(HAEMATOCRIT_RANGE.0..=HAEMATOCRIT_RANGE.1).contains(&haematocrit) {
        return None;
    }
    let rho = PLASMA_KG_PER_M3 + haematocrit * (RED_CELL_KG_PER_M3 - PLASMA_KG_PER_M3);
    Some(DensityRange::from_kg_per_m3(
        (rho, rho - 4.0, rho + 4.0),
        &format!(
            "whole blood from haematocrit {:.0}%: plasma 1020.5 kg/m³ (Trudnowski and Rico 1974) \
             plus the cell fraction times (1093 - 1020.5) kg/m³ (cell density from memory)",
            haematocrit * 100.0
        ),
        "±4 kg/m³ around the haematocrit estimate (assumed)",
    ))
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn haematocrit_density_rises_with_the_cell_fraction() {
        let low = blood_from_haematocrit(0.30).unwrap();
        let high = blood_from_haematocrit(0.50).unwrap();
        assert!(to_kg_per_m3(high.nominal) > to_kg_per_m3(low.nominal));
    }

    #[test]
    fn haematocrit_outside_range_is_refused() {
        assert!(blood_from_haematocrit(0.05).is_none());
        assert!(blood_from_haematocrit(f64::NAN).is_none());
    }

    #[test]
    fn default_ranges_bracket_their_nominal() {
        let d = Densities::default();
        for fluid in Fluid::ALL {
            let r = d.get(fluid);
            assert!(r.low < r.nominal && r.nominal < r.high, "{fluid:?}");
        }
    }
}

//! Physical quantities with their units: the one place that knows about `uom`.
//!
//! Everything else in the crate speaks in [`Pressure`], [`Length`] and
//! [`Density`] and converts with the helpers here, so a bare `f64` never has
//! to carry a unit in a reader's head. Entered values keep the unit the
//! clinician typed ([`PressureEntry`], [`LengthEntry`]) so a case round-trips
//! exactly as written.

use std::fmt;
use std::str::FromStr;

use serde::{Deserialize, Deserializer, Serialize, Serializer};
use uom::si::acceleration::standard_gravity;
use uom::si::length::{centimeter, inch};
use uom::si::mass_density::{gram_per_cubic_centimeter, kilogram_per_cubic_meter};
use uom::si::pressure::{centimeter_of_water, kilopascal, pascal};

/// A pressure. Internally SI; read it with [`to_mmhg`] and friends.
pub type Pressure = uom::si::f64::Pressure;
/// A length or a height. Internally SI; read it with [`to_cm`].
pub type Length = uom::si::f64::Length;
/// A mass density of a fluid column.
pub type Density = uom::si::f64::MassDensity;

mod custom {
    //! The conventional millimetre of mercury, defined exactly.
    //!
    //! `uom` rounds it to 133.3224 Pa; NIST SP 811 (appendix B.8) gives
    //! 133.322387415 Pa, the value clinical standards use.

    #![allow(missing_docs, clippy::indexing_slicing)]

    unit! {
        system: uom::si;
        quantity: uom::si::pressure;

        @mmhg: 133.322_387_415; "mmHg", "millimetre of mercury", "millimetres of mercury";
    }
}

pub use custom::mmhg as mmhg_unit;

/// Pascals in one conventional millimetre of mercury (NIST SP 811, B.8).
pub const PA_PER_MMHG: f64 = 133.322_387_415;

/// A pressure from a value in mmHg.
pub fn mmhg(value: f64) -> Pressure {
    Pressure::new::<custom::mmhg>(value)
}

/// The value of a pressure in mmHg.
pub fn to_mmhg(p: Pressure) -> f64 {
    p.get::<custom::mmhg>()
}

/// A length from a value in centimetres.
pub fn cm(value: f64) -> Length {
    Length::new::<centimeter>(value)
}

/// The value of a length in centimetres.
pub fn to_cm(l: Length) -> f64 {
    l.get::<centimeter>()
}

/// A density from a value in kg/m³.
pub fn kg_per_m3(value: f64) -> Density {
    Density::new::<kilogram_per_cubic_meter>(value)
}

/// The value of a density in kg/m³.
pub fn to_kg_per_m3(d: Density) -> f64 {
    d.get::<kilogram_per_cubic_meter>()
}

/// The hydrostatic equation: the pressure difference across a static fluid
/// column of density `density` and vertical extent `height` (rho · g₀ · h).
pub fn column(density: Density, height: Length) -> Pressure {
    let g = uom::si::f64::Acceleration::new::<standard_gravity>(1.0);
    density * g * height
}

/// The units a pressure can be entered and shown in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum PressureUnit {
    /// Millimetres of mercury (conventional, 133.322387415 Pa).
    #[serde(rename = "mmHg")]
    MmHg,
    /// Kilopascals.
    #[serde(rename = "kPa")]
    KPa,
    /// Centimetres of water (conventional, 98.0665 Pa), as on drain scales.
    #[serde(rename = "cmH2O")]
    CmH2O,
}

impl PressureUnit {
    /// Every pressure unit, in the order a picker shows them.
    pub const ALL: [PressureUnit; 3] = [PressureUnit::MmHg, PressureUnit::KPa, PressureUnit::CmH2O];

    /// The unit's symbol as written in a case file and on screen.
    pub fn symbol(self) -> &'static str {
        match self {
            PressureUnit::MmHg => "mmHg",
            PressureUnit::KPa => "kPa",
            PressureUnit::CmH2O => "cmH2O",
        }
    }

    /// A pressure from a value in this unit.
    pub fn pressure(self, value: f64) -> Pressure {
        match self {
            PressureUnit::MmHg => mmhg(value),
            PressureUnit::KPa => Pressure::new::<kilopascal>(value),
            PressureUnit::CmH2O => Pressure::new::<centimeter_of_water>(value),
        }
    }

    /// The value of a pressure in this unit.
    pub fn value(self, p: Pressure) -> f64 {
        match self {
            PressureUnit::MmHg => to_mmhg(p),
            PressureUnit::KPa => p.get::<kilopascal>(),
            PressureUnit::CmH2O => p.get::<centimeter_of_water>(),
        }
    }

    fn parse(text: &str) -> Option<PressureUnit> {
        let folded: String = text.chars().filter(|c| !c.is_whitespace()).collect();
        match folded.to_ascii_lowercase().as_str() {
            "mmhg" | "torr" => Some(PressureUnit::MmHg),
            "kpa" => Some(PressureUnit::KPa),
            "cmh2o" | "cmh₂o" | "cmwater" => Some(PressureUnit::CmH2O),
            _ => None,
        }
    }
}

impl fmt::Display for PressureUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

/// The units a length can be entered and shown in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum LengthUnit {
    /// Centimetres.
    #[serde(rename = "cm")]
    Cm,
    /// Inches (exactly 2.54 cm).
    #[serde(rename = "in")]
    Inch,
}

impl LengthUnit {
    /// Every length unit, in the order a picker shows them.
    pub const ALL: [LengthUnit; 2] = [LengthUnit::Cm, LengthUnit::Inch];

    /// The unit's symbol as written in a case file and on screen.
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Cm => "cm",
            LengthUnit::Inch => "in",
        }
    }

    /// A length from a value in this unit.
    pub fn length(self, value: f64) -> Length {
        match self {
            LengthUnit::Cm => cm(value),
            LengthUnit::Inch => Length::new::<inch>(value),
        }
    }

    /// The value of a length in this unit.
    pub fn value(self, l: Length) -> f64 {
        match self {
            LengthUnit::Cm => to_cm(l),
            LengthUnit::Inch => l.get::<inch>(),
        }
    }

    fn parse(text: &str) -> Option<LengthUnit> {
        match text.trim().to_ascii_lowercase().as_str() {
            "cm" => Some(LengthUnit::Cm),
            "in" | "inch" | "inches" | "\"" => Some(LengthUnit::Inch),
            _ => None,
        }
    }
}

impl fmt::Display for LengthUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

/// Why a piece of text is not a quantity. The caller adds the field's name.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum QuantityTextError {
    /// Nothing was written.
    Empty,
    /// A number without a unit, e.g. `"75"`.
    MissingUnit {
        /// What was written.
        text: String,
        /// The units that would be accepted.
        expected: &'static str,
    },
    /// A unit this field does not take, e.g. `"75 psi"` or `"20 mmHg"` for a height.
    UnknownUnit {
        /// The unit as written.
        unit: String,
        /// The units that would be accepted.
        expected: &'static str,
    },
    /// The number part cannot be read.
    NotANumber {
        /// What was written.
        text: String,
    },
}

impl fmt::Display for QuantityTextError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            QuantityTextError::Empty => f.write_str("is empty; write a number and a unit"),
            QuantityTextError::MissingUnit { text, expected } => {
                write!(f, "'{text}' has no unit; write it with one of {expected}")
            }
            QuantityTextError::UnknownUnit { unit, expected } => {
                write!(
                    f,
                    "'{unit}' is not a unit this field takes; use one of {expected}"
                )
            }
            QuantityTextError::NotANumber { text } => write!(f, "'{text}' is not a number"),
        }
    }
}

impl std::error::Error for QuantityTextError {}

/// The error for unit text no unit matches: a mistyped number ("1o4 mmHg"
/// leaves "o4 mmHg") when digits remain in it, else an unknown unit.
fn unknown_unit(text: &str, unit_text: &str, expected: &'static str) -> QuantityTextError {
    if unit_text.chars().any(|c| c.is_ascii_digit()) {
        QuantityTextError::NotANumber {
            text: text.trim().to_owned(),
        }
    } else {
        QuantityTextError::UnknownUnit {
            unit: unit_text.to_owned(),
            expected,
        }
    }
}

/// Splits `"-12.5 cm"` into the number and the unit text. A decimal comma is
/// accepted (`"12,5 mmHg"`) because bedside devices in many countries show one.
fn split_number(text: &str) -> Result<(f64, &str), QuantityTextError> {
    let text = text.trim();
    if text.is_empty() {
        return Err(QuantityTextError::Empty);
    }
    let end = text
        .char_indices()
        .find(|&(i, c)| {
            !(c.is_ascii_digit() || c == '.' || c == ',' || ((c == '-' || c == '+') && i == 0))
        })
        .map_or(text.len(), |(i, _)| i);
    let (number, rest) = text.split_at(end);
    let value: f64 =
        number
            .replace(',', ".")
            .parse()
            .map_err(|_| QuantityTextError::NotANumber {
                text: text.to_owned(),
            })?;
    if !value.is_finite() {
        return Err(QuantityTextError::NotANumber {
            text: text.to_owned(),
        });
    }
    Ok((value, rest.trim()))
}

/// A pressure as the clinician entered it: the number and the unit they used.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PressureEntry {
    /// The number as entered.
    pub amount: f64,
    /// The unit it was entered in.
    pub unit: PressureUnit,
}

impl PressureEntry {
    const EXPECTED: &'static str = "mmHg, kPa, cmH2O";

    /// An entry from a number and a unit.
    pub fn new(amount: f64, unit: PressureUnit) -> Self {
        PressureEntry { amount, unit }
    }

    /// An entry in mmHg.
    pub fn mmhg(amount: f64) -> Self {
        PressureEntry::new(amount, PressureUnit::MmHg)
    }

    /// The physical pressure.
    pub fn pressure(self) -> Pressure {
        self.unit.pressure(self.amount)
    }

    /// The same pressure written in another unit, for a unit switch on screen.
    pub fn convert_to(self, unit: PressureUnit) -> Self {
        PressureEntry::new(unit.value(self.pressure()), unit)
    }
}

impl FromStr for PressureEntry {
    type Err = QuantityTextError;

    /// Reads `"118 mmHg"`, `"15.5 kPa"`, `"14 cmH2O"`.
    ///
    /// # Errors
    /// A missing or unknown unit, or a number that cannot be read.
    ///
    /// # Example
    /// ```
    /// use plumbline_core::units::PressureEntry;
    /// assert!("80 mmHg".parse::<PressureEntry>().is_ok());
    /// assert!("80".parse::<PressureEntry>().is_err());
    /// ```
    fn from_str(text: &str) -> Result<Self, Self::Err> {
        let (amount, unit_text) = split_number(text)?;
        if unit_text.is_empty() {
            return Err(QuantityTextError::MissingUnit {
                text: text.trim().to_owned(),
                expected: Self::EXPECTED,
            });
        }
        let unit = PressureUnit::parse(unit_text)
            .ok_or_else(|| unknown_unit(text, unit_text, Self::EXPECTED))?;
        Ok(PressureEntry { amount, unit })
    }
}

impl fmt::Display for PressureEntry {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} {}", self.amount, self.unit)
    }
}

/// A length as the clinician entered it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LengthEntry {
    /// The number as entered.
    pub amount: f64,
    /// The unit it was entered in.
    pub unit: LengthUnit,
}

impl LengthEntry {
    const EXPECTED: &'static str = "cm, in";

    /// An entry from a number and a unit.
    pub fn new(amount: f64, unit: LengthUnit) -> Self {
        LengthEntry { amount, unit }
    }

    /// An entry in centimetres.
    pub fn cm(amount: f64) -> Self {
        LengthEntry::new(amount, LengthUnit::Cm)
    }

    /// The physical length.
    pub fn length(self) -> Length {
        self.unit.length(self.amount)
    }

    /// The same length written in another unit, for a unit switch on screen.
    pub fn convert_to(self, unit: LengthUnit) -> Self {
        LengthEntry::new(unit.value(self.length()), unit)
    }
}

impl FromStr for LengthEntry {
    type Err = QuantityTextError;

    /// Reads `"24 cm"`, `"-7.5 cm"`, `"10 in"`.
    ///
    /// # Errors
    /// A missing or unknown unit, or a number that cannot be read.
    ///
    /// # Example
    /// ```
    /// use plumbline_core::units::LengthEntry;
    /// assert!("24 cm".parse::<LengthEntry>().is_ok());
    /// assert!("24 mmHg".parse::<LengthEntry>().is_err());
    /// ```
    fn from_str(text: &str) -> Result<Self, Self::Err> {
        let (amount, unit_text) = split_number(text)?;
        if unit_text.is_empty() {
            return Err(QuantityTextError::MissingUnit {
                text: text.trim().to_owned(),
                expected: Self::EXPECTED,
            });
        }
        let unit = LengthUnit::parse(unit_text)
            .ok_or_else(|| unknown_unit(text, unit_text, Self::EXPECTED))?;
        Ok(LengthEntry { amount, unit })
    }
}

impl fmt::Display for LengthEntry {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} {}", self.amount, self.unit)
    }
}

/// A fluid density as entered: `"1055 kg/m3"` or `"1.055 g/mL"`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DensityEntry(pub Density);

impl FromStr for DensityEntry {
    type Err = QuantityTextError;

    fn from_str(text: &str) -> Result<Self, Self::Err> {
        const EXPECTED: &str = "kg/m3, g/mL";
        let (amount, unit_text) = split_number(text)?;
        let folded: String = unit_text
            .chars()
            .filter(|c| !c.is_whitespace())
            .collect::<String>()
            .to_ascii_lowercase();
        let density = match folded.as_str() {
            "" => {
                return Err(QuantityTextError::MissingUnit {
                    text: text.trim().to_owned(),
                    expected: EXPECTED,
                })
            }
            "kg/m3" | "kg/m³" => kg_per_m3(amount),
            "g/ml" | "g/cm3" | "g/cm³" => Density::new::<gram_per_cubic_centimeter>(amount),
            _ => return Err(unknown_unit(text, unit_text, EXPECTED)),
        };
        Ok(DensityEntry(density))
    }
}

impl fmt::Display for DensityEntry {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} kg/m3", to_kg_per_m3(self.0))
    }
}

macro_rules! text_serde {
    ($($ty:ty),*) => {$(
        impl Serialize for $ty {
            fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
                serializer.collect_str(self)
            }
        }

        impl<'de> Deserialize<'de> for $ty {
            fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
                let text = String::deserialize(deserializer)?;
                text.parse().map_err(serde::de::Error::custom)
            }
        }
    )*};
}

text_serde!(PressureEntry, LengthEntry, DensityEntry);

/// Serializes a pressure as a plain number of mmHg, for result fields whose
/// names end in `_mmhg`.
pub fn serialize_mmhg<S: Serializer>(p: &Pressure, serializer: S) -> Result<S::Ok, S::Error> {
    serializer.serialize_f64(to_mmhg(*p))
}

/// Serializes a length as a plain number of centimetres, for result fields
/// whose names end in `_cm`.
pub fn serialize_cm<S: Serializer>(l: &Length, serializer: S) -> Result<S::Ok, S::Error> {
    serializer.serialize_f64(to_cm(*l))
}

/// Pascals in a pressure.
pub fn to_pa(p: Pressure) -> f64 {
    p.get::<pascal>()
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn parses_pressures_in_every_unit() {
        let check = |text: &str, mmhg_expected: f64| {
            let entry: PressureEntry = text.parse().unwrap();
            assert!(
                close(to_mmhg(entry.pressure()), mmhg_expected, 1e-3),
                "{text}: {}",
                to_mmhg(entry.pressure())
            );
        };
        check("80 mmHg", 80.0);
        check("80mmHg", 80.0);
        check("  80   mm Hg ", 80.0);
        check("10.0 kPa", 75.006);
        check("10 cmH2O", 7.356);
        check("12,5 mmHg", 12.5);
        check("-3 mmHg", -3.0);
    }

    #[test]
    fn rejects_pressures_without_a_usable_unit() {
        assert!(matches!(
            "80".parse::<PressureEntry>(),
            Err(QuantityTextError::MissingUnit { .. })
        ));
        assert!(matches!(
            "80 psi".parse::<PressureEntry>(),
            Err(QuantityTextError::UnknownUnit { .. })
        ));
        assert!(matches!(
            "eighty mmHg".parse::<PressureEntry>(),
            Err(QuantityTextError::NotANumber { .. })
        ));
        assert!(matches!(
            "".parse::<PressureEntry>(),
            Err(QuantityTextError::Empty)
        ));
        assert!("1e999 mmHg".parse::<PressureEntry>().is_err());
        assert!(matches!(
            "1o4 mmHg".parse::<PressureEntry>(),
            Err(QuantityTextError::NotANumber { .. })
        ));
        assert!("- mmHg".parse::<PressureEntry>().is_err());
    }

    #[test]
    fn lengths_in_inches_are_exact() {
        let entry: LengthEntry = "10 in".parse().unwrap();
        assert!(close(to_cm(entry.length()), 25.4, 1e-12));
        assert!("10 mmHg".parse::<LengthEntry>().is_err());
    }

    #[test]
    fn densities_in_both_units() {
        let a: DensityEntry = "1055 kg/m3".parse().unwrap();
        let b: DensityEntry = "1.055 g/mL".parse().unwrap();
        assert!(close(to_kg_per_m3(a.0), to_kg_per_m3(b.0), 1e-9));
        assert!("1055".parse::<DensityEntry>().is_err());
    }

    #[test]
    fn conversion_keeps_the_physical_value() {
        let entry = PressureEntry::new(20.0, PressureUnit::MmHg).convert_to(PressureUnit::CmH2O);
        assert!(close(entry.amount, 27.19, 0.01));
        let back = entry.convert_to(PressureUnit::MmHg);
        assert!(close(back.amount, 20.0, 1e-9));
        let inches = LengthEntry::cm(25.4).convert_to(LengthUnit::Inch);
        assert!(close(inches.amount, 10.0, 1e-12));
    }

    #[test]
    fn entries_round_trip_through_text() {
        let entry = PressureEntry::new(14.5, PressureUnit::CmH2O);
        let back: PressureEntry = entry.to_string().parse().unwrap();
        assert_eq!(entry, back);
    }
}

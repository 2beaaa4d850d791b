//! Entry fields as the clinician typed them: text, a unit, and what a unit
//! switch converted.
//!
//! A field never rewrites what was typed. A unit switch shows the same
//! quantity in the new unit (converted by the core's `convert_to`) while it
//! remembers the typed original, so switching back restores the typed text
//! exactly and the results never move by a rounding step.

use plumbline_core::units::{
    LengthEntry, LengthUnit, PressureEntry, PressureUnit, QuantityTextError,
};
use serde::{Deserialize, Serialize};

/// Decimals shown after a unit switch: enough to read like a monitor, never
/// used for the check itself (the exact conversion is).
fn decimals(symbol: &str) -> usize {
    match symbol {
        "kPa" => 2,
        _ => 1,
    }
}

/// A converted amount written for the field, trailing zeros trimmed.
fn shown(amount: f64, symbol: &str) -> String {
    let text = format!("{amount:.prec$}", prec = decimals(symbol));
    let text = if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_owned()
    } else {
        text
    };
    if text == "-0" {
        "0".to_owned()
    } else {
        text
    }
}

macro_rules! quantity_text {
    ($name:ident, $entry:ty, $unit:ty, $doc:literal) => {
        #[doc = $doc]
        #[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
        pub struct $name {
            /// The text in the box.
            pub text: String,
            /// The unit chosen beside it.
            pub unit: $unit,
            /// What was typed, and in which unit, when the box shows a
            /// conversion of it.
            #[serde(default, skip_serializing_if = "Option::is_none")]
            typed: Option<(String, $unit)>,
        }

        impl $name {
            /// An empty field in `unit`.
            pub fn empty(unit: $unit) -> Self {
                $name {
                    text: String::new(),
                    unit,
                    typed: None,
                }
            }

            /// A field showing an entry from a case, or empty in `unit`.
            pub fn from_entry(entry: Option<$entry>, unit: $unit) -> Self {
                match entry {
                    Some(e) => $name {
                        text: e.amount.to_string(),
                        unit: e.unit,
                        typed: None,
                    },
                    None => $name::empty(unit),
                }
            }

            /// The clinician typed `text`: it becomes the field's own value.
            pub fn edit(&mut self, text: String) {
                self.text = text;
                self.typed = None;
            }

            /// A number takes the box's unit; text with a unit of its own
            /// (`15 cmH2O`) keeps it. A message quotes the text as typed,
            /// never with the box's unit added to it.
            fn parse(text: &str, unit: $unit) -> Result<$entry, QuantityTextError> {
                let text = text.trim();
                if let Ok(Some(amount)) = number(text) {
                    return Ok(<$entry>::new(amount, unit));
                }
                text.parse::<$entry>().map_err(|e| match e {
                    QuantityTextError::UnknownUnit { .. } | QuantityTextError::Empty => e,
                    _ => QuantityTextError::NotANumber {
                        text: text.to_owned(),
                    },
                })
            }

            /// Shows the field in another unit. A readable value is converted
            /// by the core; unreadable text stays exactly as typed.
            pub fn switch(&mut self, unit: $unit) {
                let (text, from) = self
                    .typed
                    .clone()
                    .unwrap_or_else(|| (self.text.clone(), self.unit));
                if unit == from {
                    self.text = text;
                    self.unit = unit;
                    self.typed = None;
                    return;
                }
                match Self::parse(&text, from) {
                    Ok(entry) if !text.trim().is_empty() => {
                        self.text = shown(entry.convert_to(unit).amount, unit.symbol());
                        self.typed = Some((text, from));
                    }
                    _ => {}
                }
                self.unit = unit;
            }

            /// The entry, `None` for an empty box.
            ///
            /// # Errors
            /// The core's reason the text is not a quantity.
            pub fn entry(&self) -> Result<Option<$entry>, QuantityTextError> {
                if let Some((text, from)) = &self.typed {
                    return Self::parse(text, *from).map(|e| Some(e.convert_to(self.unit)));
                }
                if self.text.trim().is_empty() {
                    return Ok(None);
                }
                Self::parse(&self.text, self.unit).map(Some)
            }
        }
    };
}

quantity_text!(
    PressureText,
    PressureEntry,
    PressureUnit,
    "A pressure field: the number as typed and its unit."
);
quantity_text!(
    LengthText,
    LengthEntry,
    LengthUnit,
    "A length field: the number as typed and its unit."
);

/// Why a plain number field cannot be read.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NotANumber(pub String);

impl std::fmt::Display for NotANumber {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "'{}' is not a number", self.0)
    }
}

/// A plain number (an angle in degrees, a percentage) as typed. A decimal
/// comma reads like a point, as the core's quantity fields do.
pub fn number(text: &str) -> Result<Option<f64>, NotANumber> {
    let trimmed = text.trim();
    if trimmed.is_empty() {
        return Ok(None);
    }
    trimmed
        .replace(',', ".")
        .parse::<f64>()
        .ok()
        .filter(|v| v.is_finite())
        .map(Some)
        .ok_or_else(|| NotANumber(trimmed.to_owned()))
}

/// A number written for a field: whole numbers without a decimal point.
pub fn number_text(value: f64) -> String {
    value.to_string()
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn typed_text_is_kept_exactly() {
        let mut f = PressureText::empty(PressureUnit::MmHg);
        f.edit(" 12,5 ".into());
        assert_eq!(f.text, " 12,5 ");
        assert_eq!(f.entry().unwrap().unwrap().amount, 12.5);
        f.edit("12x".into());
        assert_eq!(f.text, "12x");
        assert!(f.entry().is_err());
        f.edit("  ".into());
        assert_eq!(f.entry().unwrap(), None);
    }

    #[test]
    fn switching_converts_and_switching_back_restores_the_typed_text() {
        let mut f = PressureText::from_entry(Some(PressureEntry::mmhg(104.0)), PressureUnit::MmHg);
        f.switch(PressureUnit::KPa);
        assert_eq!(f.text, "13.87");
        let exact = f.entry().unwrap().unwrap();
        assert_eq!(exact.unit, PressureUnit::KPa);
        assert!((exact.convert_to(PressureUnit::MmHg).amount - 104.0).abs() < 1e-9);
        f.switch(PressureUnit::CmH2O);
        assert_eq!(f.text, "141.4");
        f.switch(PressureUnit::MmHg);
        assert_eq!(f.text, "104");
        assert_eq!(f.entry().unwrap(), Some(PressureEntry::mmhg(104.0)));
    }

    #[test]
    fn editing_after_a_switch_takes_the_new_text_in_the_new_unit() {
        let mut f = PressureText::from_entry(Some(PressureEntry::mmhg(10.0)), PressureUnit::MmHg);
        f.switch(PressureUnit::CmH2O);
        f.edit("14".into());
        assert_eq!(
            f.entry().unwrap(),
            Some(PressureEntry::new(14.0, PressureUnit::CmH2O))
        );
    }

    #[test]
    fn messages_quote_the_text_as_typed_and_a_typed_unit_is_kept() {
        let mut f = PressureText::empty(PressureUnit::MmHg);
        f.edit("100/60".into());
        assert_eq!(
            f.entry().unwrap_err().to_string(),
            "'100/60' is not a number"
        );
        f.edit("15 cmH2O".into());
        assert_eq!(
            f.entry().unwrap(),
            Some(PressureEntry::new(15.0, PressureUnit::CmH2O))
        );
        f.edit("15 psi".into());
        assert!(f.entry().unwrap_err().to_string().contains("'psi'"));
    }

    #[test]
    fn unreadable_text_survives_a_switch() {
        let mut f = LengthText::empty(LengthUnit::Cm);
        f.edit("abc".into());
        f.switch(LengthUnit::Inch);
        assert_eq!(f.text, "abc");
        assert_eq!(f.unit, LengthUnit::Inch);
        let mut g = LengthText::from_entry(Some(LengthEntry::cm(25.4)), LengthUnit::Cm);
        g.switch(LengthUnit::Inch);
        assert_eq!(g.text, "10");
    }

    #[test]
    fn numbers_read_like_the_core_reads_them() {
        assert_eq!(number("65").unwrap(), Some(65.0));
        assert_eq!(number("-12,5").unwrap(), Some(-12.5));
        assert_eq!(number("").unwrap(), None);
        assert!(number("6o").is_err());
        assert!(number("inf").is_err());
        assert_eq!(number_text(65.0), "65");
    }
}

//! A blood pressure typed as one text (`100/60`, `100/60 (74)`) over the
//! three boxes it fills: the core reads the text (`usual::read_blood_pressure`),
//! the boxes take its parts, and the text stays as typed while it is the
//! last thing typed, so a half-typed `100/` never jumps under the finger.

use plumbline_core::error::{Error, ErrorKind, Errors};
use plumbline_core::units::PressureEntry;
use plumbline_core::usual::read_blood_pressure;
use serde::{Deserialize, Serialize};

use crate::fields::PressureText;

/// Systolic, diastolic and mean boxes, and the one-box text typed over them.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Pressures {
    /// Systolic.
    pub systolic: PressureText,
    /// Diastolic.
    pub diastolic: PressureText,
    /// Mean.
    pub mean: PressureText,
    /// The blood pressure as typed in one box, while it is the last entry.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub typed: Option<String>,
}

impl Pressures {
    /// Three boxes showing a case's values (empty in mmHg where none).
    pub fn of(
        systolic: Option<PressureEntry>,
        diastolic: Option<PressureEntry>,
        mean: Option<PressureEntry>,
    ) -> Self {
        let p = |e| PressureText::from_entry(e, plumbline_core::units::PressureUnit::MmHg);
        Pressures {
            systolic: p(systolic),
            diastolic: p(diastolic),
            mean: p(mean),
            typed: None,
        }
    }

    /// The one-box text: as typed, else the boxes' texts joined the way a
    /// monitor shows them (`104/58 (74)`); empty while systolic or
    /// diastolic is.
    pub fn text(&self) -> String {
        if let Some(typed) = &self.typed {
            return typed.clone();
        }
        let (s, d, m) = (
            self.systolic.text.trim(),
            self.diastolic.text.trim(),
            self.mean.text.trim(),
        );
        match (s.is_empty() || d.is_empty(), m.is_empty()) {
            (true, _) => String::new(),
            (false, true) => format!("{s}/{d}"),
            (false, false) => format!("{s}/{d} ({m})"),
        }
    }

    /// Takes a blood pressure typed in one box: when the core reads it, its
    /// parts fill the boxes (a mean left out empties the mean box); the
    /// text is kept as typed either way.
    pub fn type_in(&mut self, text: String) {
        if let Ok(bp) = read_blood_pressure(&text, self.systolic.unit) {
            let unit = bp.systolic.unit;
            self.systolic = PressureText::from_entry(Some(bp.systolic), unit);
            self.diastolic = PressureText::from_entry(Some(bp.diastolic), unit);
            self.mean = PressureText::from_entry(bp.mean, unit);
        } else if text.trim().is_empty() {
            let unit = self.systolic.unit;
            for f in [&mut self.systolic, &mut self.diastolic, &mut self.mean] {
                *f = PressureText::empty(unit);
            }
        }
        self.typed = Some(text);
    }

    /// A box of its own was typed in: the one-box text follows the boxes.
    pub fn box_typed(&mut self) {
        self.typed = None;
    }

    /// The three entries, each unreadable box named under `path`; a
    /// one-box text the core cannot read is named at `path.blood_pressure`.
    pub fn entries(&self, path: &str, errors: &mut Errors) -> [Option<PressureEntry>; 3] {
        if let Some(typed) = self.typed.as_deref().filter(|t| !t.trim().is_empty()) {
            if let Err(message) = read_blood_pressure(typed, self.systolic.unit) {
                errors.push(Error::new(
                    format!("{path}.blood_pressure"),
                    ErrorKind::Quantity { message },
                ));
            }
        }
        let read = |f: &PressureText, key: &str, errors: &mut Errors| {
            super::parts::read(f.entry(), &format!("{path}.{key}"), errors)
        };
        [
            read(&self.systolic, "systolic", errors),
            read(&self.diastolic, "diastolic", errors),
            read(&self.mean, "mean", errors),
        ]
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;
    use plumbline_core::units::PressureUnit;

    #[test]
    fn one_box_fills_three_and_keeps_the_text_as_typed() {
        let mut p = Pressures::of(None, None, None);
        p.type_in("100/60 (74)".into());
        assert_eq!(
            (
                p.systolic.text.as_str(),
                p.diastolic.text.as_str(),
                p.mean.text.as_str()
            ),
            ("100", "60", "74")
        );
        assert_eq!(p.text(), "100/60 (74)");
        p.type_in("110/70".into());
        assert_eq!(p.mean.text, "", "a mean left out is not kept from before");
        let mut errors = Errors::default();
        let [s, _, m] = p.entries("arterial[0]", &mut errors);
        assert!(errors.is_empty());
        assert_eq!((s, m), (Some(PressureEntry::mmhg(110.0)), None));
    }

    #[test]
    fn half_typed_text_stays_and_is_named_without_a_unit_added() {
        let mut p = Pressures::of(Some(PressureEntry::mmhg(120.0)), None, None);
        p.type_in("100/".into());
        assert_eq!(p.text(), "100/");
        assert_eq!(p.systolic.text, "120", "the boxes wait for a readable text");
        let mut errors = Errors::default();
        p.entries("baseline", &mut errors);
        let message = errors
            .for_field("baseline.blood_pressure")
            .next()
            .unwrap()
            .to_string();
        assert!(
            message.contains("'100/' is not a blood pressure"),
            "{message}"
        );
        assert!(!message.contains("mmHg'"), "{message}");
    }

    #[test]
    fn the_boxes_show_as_one_text_until_it_is_typed() {
        let mut p = Pressures::of(
            Some(PressureEntry::mmhg(104.0)),
            Some(PressureEntry::mmhg(58.0)),
            Some(PressureEntry::mmhg(74.0)),
        );
        assert_eq!(p.text(), "104/58 (74)");
        p.mean.edit(String::new());
        assert_eq!(p.text(), "104/58");
        p.type_in("13.3/8 kPa".into());
        assert_eq!(p.systolic.unit, PressureUnit::KPa);
        p.box_typed();
        assert_eq!(p.text(), "13.3/8");
        p.type_in(String::new());
        assert_eq!(p.systolic.text, "");
    }
}

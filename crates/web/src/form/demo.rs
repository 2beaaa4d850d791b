//! What is still invented after the demo case was changed: every box that
//! still holds the demo's value, named in words, and cleared in one step
//! while the clinician's own entries stay. Nothing invented is ever judged
//! unseen: the screen lists these until they are cleared or replaced.

use plumbline_core::case::Case;
use plumbline_core::demo::CASE_JSON;

use super::{ArmChoice, Form, PositionForm, SourceForm};
use crate::fields::PressureText;

thread_local! {
    /// The demo case's boxes, read once: the screen asks on every render.
    static DEMO: Option<Form> = Case::from_json(CASE_JSON).ok().map(|c| Form::from_case(&c));
}

/// The demo case's boxes, as the screen first showed them.
fn demo_form() -> Option<Form> {
    DEMO.with(Clone::clone)
}

/// A box still as the demo had it, and not empty.
fn same(a: &PressureText, b: &PressureText) -> bool {
    !a.text.trim().is_empty() && a.text == b.text && a.unit == b.unit
}

/// A source's values still as the demo had them: the boxes, in words.
fn source_words(s: &SourceForm, demo: &SourceForm) -> Vec<String> {
    let p = (&s.pressures, &demo.pressures);
    [
        ("systolic", &p.0.systolic, &p.1.systolic),
        ("diastolic", &p.0.diastolic, &p.1.diastolic),
        ("mean", &p.0.mean, &p.1.mean),
    ]
    .into_iter()
    .filter(|(_, a, b)| same(a, b))
    .map(|(name, a, _)| format!("{} {name} {} {}", s.id, a.text, a.unit.symbol()))
    .collect()
}

fn position_words(p: &PositionForm) -> String {
    let posture = p.posture.map_or("no posture", |p| p.label());
    match p.angle(super::AngleKey::Backrest) {
        "" => format!("position {posture}"),
        deg => format!("position {posture}, backrest {deg}°"),
    }
}

impl Form {
    /// The values still as the invented demo case had them, in words;
    /// empty when the form did not begin as the demo.
    pub fn invented(&self) -> Vec<String> {
        let Some(demo) = demo_form().filter(|_| self.demo) else {
            return Vec::new();
        };
        let mut out = Vec::new();
        let note = |out: &mut Vec<String>, yes: bool, words: String| {
            if yes {
                out.push(words);
            }
        };
        note(
            &mut out,
            self.height.text.trim() != "" && self.height == demo.height,
            format!(
                "body height {} {}",
                self.height.text,
                self.height.unit.symbol()
            ),
        );
        note(
            &mut out,
            !self.haematocrit.trim().is_empty() && self.haematocrit == demo.haematocrit,
            format!("haematocrit {}%", self.haematocrit),
        );
        note(
            &mut out,
            self.position.posture == demo.position.posture
                && self.position.angle(super::AngleKey::Backrest)
                    == demo.position.angle(super::AngleKey::Backrest),
            position_words(&self.position),
        );
        for (side, arm, demo_arm) in [
            ("left", &self.position.left, &demo.position.left),
            ("right", &self.position.right, &demo.position.right),
        ] {
            note(
                &mut out,
                arm.choice != ArmChoice::Preset && arm == demo_arm,
                format!("{side} arm {}", arm.choice.label()),
            );
        }
        for (s, d) in self.sources.iter().zip(&demo.sources) {
            out.extend(source_words(s, d));
        }
        for (q, a) in &self.assumed {
            note(
                &mut out,
                demo.assumed.get(q) == Some(a),
                format!(
                    "assumed {} {} {}",
                    q.label(),
                    a.value.text,
                    a.value.unit.symbol()
                ),
            );
        }
        for (q, r) in &self.readings {
            note(
                &mut out,
                demo.readings.get(q) == Some(r),
                format!("{} {} {}", q.label(), r.value.text, r.value.unit.symbol()),
            );
        }
        if let Some(b) = &self.baseline {
            note(
                &mut out,
                Some(b) == demo.baseline.as_ref(),
                format!("baseline {}", b.pressures.text()),
            );
        }
        note(
            &mut out,
            self.custom_targets && self.targets == demo.targets,
            "the targets".to_owned(),
        );
        let base = self.base();
        note(
            &mut out,
            !base.heights.is_empty() && base.heights == demo.base().heights,
            "measured heights".to_owned(),
        );
        note(
            &mut out,
            !base.segments.is_empty() && base.segments == demo.base().segments,
            "measured segment lengths".to_owned(),
        );
        out
    }

    /// Clears every value still as the demo had it; what the clinician
    /// typed or chose stays. The form is then the clinician's own.
    pub(super) fn clear_demo(&mut self) {
        let Some(demo) = demo_form().filter(|_| self.demo) else {
            return;
        };
        let blank = Form::from_case(&super::blank_case());
        if self.height == demo.height {
            self.height = blank.height.clone();
        }
        if self.haematocrit == demo.haematocrit {
            self.haematocrit.clear();
        }
        if self.position.posture == demo.position.posture
            && self.position.angle(super::AngleKey::Backrest)
                == demo.position.angle(super::AngleKey::Backrest)
        {
            self.position = blank.position.clone();
        }
        for (arm, demo_arm) in [
            (&mut self.position.left, &demo.position.left),
            (&mut self.position.right, &demo.position.right),
        ] {
            if arm == demo_arm {
                arm.choice = ArmChoice::Preset;
            }
        }
        let mut kept = Vec::new();
        for (k, mut s) in std::mem::take(&mut self.sources).into_iter().enumerate() {
            if let Some(d) = demo.sources.get(k) {
                if s == *d {
                    continue;
                }
                let unit = s.pressures.systolic.unit;
                let p = &mut s.pressures;
                for (f, g) in [
                    (&mut p.systolic, &d.pressures.systolic),
                    (&mut p.diastolic, &d.pressures.diastolic),
                    (&mut p.mean, &d.pressures.mean),
                ] {
                    if same(f, g) {
                        *f = PressureText::empty(unit);
                    }
                }
                p.typed = None;
            }
            kept.push(s);
        }
        self.sources = if kept.is_empty() {
            blank.sources.clone()
        } else {
            kept
        };
        self.assumed.retain(|q, a| demo.assumed.get(q) != Some(a));
        self.readings.retain(|q, r| demo.readings.get(q) != Some(r));
        if self.baseline.is_some() && self.baseline == demo.baseline {
            self.baseline = None;
        }
        if self.custom_targets && self.targets == demo.targets {
            self.targets = blank.targets.clone();
            self.custom_targets = false;
        }
        let mut base = blank.base().clone();
        base.timeline = self.base().timeline.clone();
        *self = Form {
            demo: false,
            ..std::mem::replace(self, blank).with_base(base)
        };
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::super::{Edit, Slot, SourcePart};
    use super::*;

    fn demo() -> Form {
        Form {
            demo: true,
            ..demo_form().unwrap()
        }
    }

    #[test]
    fn the_untouched_demo_is_all_invented() {
        let words = demo().invented().join("; ");
        for part in [
            "body height 172 cm",
            "haematocrit 38%",
            "beach chair, backrest 65°",
            "radial line mean 74 mmHg",
            "left arm cuff systolic 114 mmHg",
            "assumed ICP 10 mmHg",
            "baseline 136/80",
        ] {
            assert!(words.contains(part), "{part} in {words}");
        }
        let mut mine = demo_form().unwrap();
        mine.demo = false;
        assert!(
            mine.invented().is_empty(),
            "a form of one's own invents nothing"
        );
    }

    #[test]
    fn clearing_keeps_what_was_typed_and_nothing_invented() {
        let mut form = demo();
        form.apply(Edit::Text(
            Slot::Source(0, SourcePart::BloodPressure),
            "100/60".into(),
        ));
        form.apply(Edit::Text(super::super::Slot::Height, "180".into()));
        assert!(!form.invented().is_empty());
        form.apply(Edit::ClearDemo);
        assert!(form.invented().is_empty() && !form.demo);
        let case = form.to_case().unwrap();
        assert_eq!(case.patient.height.unwrap().amount, 180.0);
        assert_eq!(case.patient.haematocrit_percent, None);
        assert_eq!(case.arterial.len(), 1, "the untouched cuff goes");
        let line = case.arterial.first().unwrap();
        assert_eq!(line.systolic.unwrap().amount, 100.0);
        assert_eq!(line.mean, None);
        assert!(case.assume.is_empty() && case.baseline.is_none());
        assert_eq!(case.position, super::super::blank_case().position);
    }
}

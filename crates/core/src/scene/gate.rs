//! The gate from case to scene: every value converted to SI, ranges and
//! consistency checked, every problem gathered with its field before any
//! formula runs.

use super::*;

struct Checker {
    errors: Errors,
    warnings: Vec<Warning>,
}

impl Checker {
    fn error(&mut self, error: Error) {
        self.errors.push(error);
    }

    fn warn(&mut self, field: impl Into<String>, message: impl Into<String>) {
        self.warnings.push(Warning::new(field, message));
    }

    /// A pressure within `range` mmHg, or an error suggesting the unit that
    /// would put it in range.
    fn pressure(
        &mut self,
        field: &str,
        entry: PressureEntry,
        range: (f64, f64),
    ) -> Option<Pressure> {
        let p = entry.pressure();
        let v = to_mmhg(p);
        if v.is_finite() && (range.0..=range.1).contains(&v) {
            return Some(p);
        }
        let hint = PressureUnit::ALL
            .into_iter()
            .filter(|u| *u != entry.unit)
            .find(|u| (range.0..=range.1).contains(&to_mmhg(u.pressure(entry.amount))))
            .map(|u| {
                format!(
                    "as {} {} it would be in range; check the unit",
                    entry.amount, u
                )
            });
        self.error(Error::new(
            field,
            ErrorKind::OutOfRange {
                value: entry.to_string(),
                min: format!("{} mmHg", range.0),
                max: format!("{} mmHg", range.1),
                hint,
            },
        ));
        None
    }

    fn length(&mut self, field: &str, entry: LengthEntry, range_cm: (f64, f64)) -> Option<Length> {
        let l = entry.length();
        let v = to_cm(l);
        if v.is_finite() && (range_cm.0..=range_cm.1).contains(&v) {
            Some(l)
        } else {
            self.error(Error::new(
                field,
                ErrorKind::OutOfRange {
                    value: entry.to_string(),
                    min: format!("{} cm", range_cm.0),
                    max: format!("{} cm", range_cm.1),
                    hint: None,
                },
            ));
            None
        }
    }

    fn accuracy(&mut self, field: &str, entry: Option<PressureEntry>) -> Option<Pressure> {
        entry.and_then(|e| self.pressure(field, e, (0.0, 30.0)))
    }

    fn place(&mut self, field: &str, level: Level) -> Option<Place> {
        match level {
            Level::At(landmark) => Some(Place::At(landmark)),
            Level::Height(entry) => self
                .length(&format!("{field}.height"), entry, HEIGHT_RANGE_CM)
                .map(|height| Place::Height {
                    height,
                    uncertainty: cm(MEASURED_HEIGHT_CM),
                }),
        }
    }

    /// Warns when the unit does not fit the method: a drain scale read in
    /// mmHg, a monitor value entered as cmH2O.
    fn unit_fit(&mut self, field: &str, entry: PressureEntry, method: Method, arterial: bool) {
        let cmh2o_as_mmhg = to_mmhg(PressureUnit::CmH2O.pressure(entry.amount));
        if method.reads_a_water_column() && entry.unit == PressureUnit::MmHg {
            self.warn(
                field,
                format!(
                    "drain and manometer scales are usually marked in cmH2O; if {} was read off \
                     the scale, enter it as {} cmH2O ({:.1} mmHg)",
                    entry.amount, entry.amount, cmh2o_as_mmhg
                ),
            );
        } else if entry.unit == PressureUnit::CmH2O && (arterial || !method.reads_a_water_column())
        {
            self.warn(
                field,
                format!(
                    "monitors show this pressure in mmHg; {} cmH2O is only {:.1} mmHg: check the unit",
                    entry.amount, cmh2o_as_mmhg
                ),
            );
        }
    }

    fn mean_of(
        &mut self,
        field: &str,
        systolic: Option<Pressure>,
        diastolic: Option<Pressure>,
        mean: Option<Pressure>,
        rule: MeanRule,
        entered: [Option<PressureEntry>; 3],
    ) -> Option<(Pressure, MeanBasis)> {
        let show = |e: Option<PressureEntry>| e.map(|e| e.to_string()).unwrap_or_default();
        let [se, de, me] = entered;
        if let (Some(s), Some(d)) = (systolic, diastolic) {
            if d >= s {
                self.error(Error::inconsistent(
                    format!("{field}.diastolic"),
                    format!("diastolic {} is not below systolic {}", show(de), show(se)),
                ));
                return None;
            }
        }
        if let Some(m) = mean {
            if systolic.is_some_and(|s| m > s) {
                self.error(Error::inconsistent(
                    format!("{field}.mean"),
                    format!("mean {} is above systolic {}", show(me), show(se)),
                ));
                return None;
            }
            if diastolic.is_some_and(|d| m < d) {
                self.error(Error::inconsistent(
                    format!("{field}.mean"),
                    format!("mean {} is below diastolic {}", show(me), show(de)),
                ));
                return None;
            }
            return Some((m, MeanBasis::Measured));
        }
        match (systolic, diastolic) {
            (Some(s), Some(d)) => Some((rule.estimate(s, d), MeanBasis::Estimated(rule))),
            _ => None,
        }
    }

    fn arterial(&mut self, i: usize, spec: &ArterialSpec, rule: MeanRule) -> Option<Arterial> {
        let field = format!("arterial[{i}]");
        let before = self.errors.0.len();
        let id = spec.id.trim();
        if id.is_empty() || id.chars().count() > MAX_ID_CHARS {
            self.error(Error::new(
                format!("{field}.id"),
                ErrorKind::Shape {
                    message: format!("a source needs a short name of 1-{MAX_ID_CHARS} characters"),
                },
            ));
        }
        let mut component = |name: &str, entry: Option<PressureEntry>, c: Component| {
            entry.and_then(|e| {
                self.unit_fit(&format!("{field}.{name}"), e, spec.method, true);
                self.pressure(&format!("{field}.{name}"), e, c.range_mmhg())
            })
        };
        let systolic = component("systolic", spec.systolic, Component::Systolic);
        let diastolic = component("diastolic", spec.diastolic, Component::Diastolic);
        let mean = component("mean", spec.mean, Component::Mean);
        let accuracy = self.accuracy(&format!("{field}.accuracy"), spec.accuracy);
        let place = self.place(&format!("{field}.level"), spec.level);
        if spec.mean.is_none() && spec.diastolic.is_none() {
            self.error(Error::missing(
                field.clone(),
                "an arterial source needs a mean, a diastolic (enough for a limb compartment's \
                 ΔP), or both systolic and diastolic",
            ));
        }
        if spec.method == Method::Cuff {
            if let Level::At(landmark) = spec.level {
                if !landmark.is_limb() {
                    self.warn(
                        format!("{field}.level"),
                        format!(
                            "a cuff reads the artery under it; '{landmark}' is not a limb: \
                             give the landmark the cuff is on"
                        ),
                    );
                }
            }
        }
        let mean = self.mean_of(
            &field,
            systolic,
            diastolic,
            mean,
            rule,
            [spec.systolic, spec.diastolic, spec.mean],
        );
        if self.errors.0.len() > before {
            return None;
        }
        let unit = spec
            .mean
            .or(spec.systolic)
            .or(spec.diastolic)
            .map_or(PressureUnit::MmHg, |e| e.unit);
        Some(Arterial {
            id: id.to_owned(),
            method: spec.method,
            place: place?,
            systolic,
            diastolic,
            mean,
            accuracy,
            unit,
        })
    }

    fn local_place(&mut self, field: &str, quantity: Quantity, place: Place) -> bool {
        let ok = match (quantity, place) {
            (Quantity::Iop, Place::At(l)) => l.is_eye(),
            (Quantity::Compartment, Place::At(l)) => l.is_limb(),
            // A compartment pressure may be taken at a measured height on a
            // limb between the landmarks.
            (Quantity::Compartment, Place::Height { .. }) => true,
            (Quantity::Iop, Place::Height { .. }) => false,
            _ => true,
        };
        if !ok {
            let what = if quantity == Quantity::Iop {
                "an eye (eye_left or eye_right)"
            } else {
                "the limb landmark of the compartment (calf_left, thigh_right, ...) or its \
                 measured height"
            };
            self.error(Error::not_applicable(
                field,
                format!(
                    "{} is measured in the tissue itself: its level is {what}",
                    quantity.label()
                ),
            ));
        }
        ok
    }

    fn reading(&mut self, quantity: Quantity, spec: &ReadingSpec) -> Option<Reading> {
        let field = format!("readings.{quantity}");
        self.unit_fit(&format!("{field}.value"), spec.value, spec.method, false);
        let value = self.pressure(&format!("{field}.value"), spec.value, quantity.range_mmhg());
        let accuracy = self.accuracy(&format!("{field}.accuracy"), spec.accuracy);
        let place = self.place(&format!("{field}.level"), spec.level)?;
        if !self.local_place(&format!("{field}.level"), quantity, place) {
            return None;
        }
        let value = value?;
        Some(Reading {
            quantity,
            value,
            method: Some(spec.method),
            place,
            accuracy: accuracy.unwrap_or_else(|| spec.method.accuracy(value)),
            unit: spec.value.unit,
        })
    }

    fn assumed(
        &mut self,
        quantity: Quantity,
        value: PressureEntry,
        level: Option<Level>,
    ) -> Option<Reading> {
        let field = format!("assume.{quantity}");
        let p = self.pressure(&format!("{field}.value"), value, quantity.range_mmhg());
        let default = quantity.usual_level();
        let place = match (level, default) {
            (Some(level), _) => self.place(&format!("{field}.level"), level)?,
            (None, Some(landmark)) => Place::At(landmark),
            (None, None) => {
                self.error(Error::missing(
                    format!("{field}.level"),
                    format!(
                        "an assumed {} needs the landmark it applies to",
                        quantity.label()
                    ),
                ));
                return None;
            }
        };
        if !self.local_place(&format!("{field}.level"), quantity, place) {
            return None;
        }
        Some(Reading {
            quantity,
            value: p?,
            method: None,
            place,
            accuracy: mmhg(0.0),
            unit: value.unit,
        })
    }

    fn baseline(&mut self, spec: &BaselineSpec, rule: MeanRule) -> Option<Baseline> {
        let field = "baseline";
        let before = self.errors.0.len();
        let mut component = |name: &str, entry: Option<PressureEntry>, c: Component| {
            entry.and_then(|e| self.pressure(&format!("{field}.{name}"), e, c.range_mmhg()))
        };
        let systolic = component("systolic", spec.systolic, Component::Systolic);
        let diastolic = component("diastolic", spec.diastolic, Component::Diastolic);
        let mean = component("mean", spec.mean, Component::Mean);
        let place = self.place(&format!("{field}.level"), spec.level);
        let position = match spec.position.resolve(&format!("{field}.position")) {
            Ok(p) => Some(p),
            Err(errors) => {
                self.errors.0.extend(errors.0);
                None
            }
        };
        let mean = self.mean_of(
            field,
            systolic,
            diastolic,
            mean,
            rule,
            [spec.systolic, spec.diastolic, spec.mean],
        );
        if mean.is_none() && self.errors.0.len() == before {
            self.error(Error::missing(
                field,
                "a baseline needs a mean, or both systolic and diastolic",
            ));
        }
        Some(Baseline {
            method: spec.method,
            place: place?,
            position: position?,
            systolic,
            diastolic,
            mean: mean?,
        })
    }
}

impl Scene {
    /// Checks a case and builds the scene.
    ///
    /// # Errors
    /// Every problem found, each naming its field: values out of range
    /// (with a unit hint when another unit fits), contradictions (diastolic
    /// above systolic), missing pieces (a landmark with no height), settings
    /// that do not apply.
    pub fn from_case(case: &Case) -> Result<Scene, Errors> {
        let mut c = Checker {
            errors: Errors::default(),
            warnings: Vec::new(),
        };
        let body_height = case
            .patient
            .height
            .and_then(|h| c.length("patient.height", h, BODY_HEIGHT_RANGE_CM));
        let mut densities = Densities::default();
        if let Some(pct) = case.patient.haematocrit_percent {
            match blood_from_haematocrit(pct / 100.0) {
                Some(range) => densities.blood = range,
                None => c.error(Error::new(
                    "patient.haematocrit_percent",
                    ErrorKind::OutOfRange {
                        value: format!("{pct}%"),
                        min: "10%".into(),
                        max: "70%".into(),
                        hint: (0.1..=0.7)
                            .contains(&pct)
                            .then(|| "give it in percent: 42 for a haematocrit of 0.42".into()),
                    },
                )),
            }
        }
        for (fluid, entry) in [
            (Fluid::Blood, case.densities.blood),
            (Fluid::Csf, case.densities.csf),
            (Fluid::Saline, case.densities.saline),
        ] {
            let Some(entry) = entry else { continue };
            let v = to_kg_per_m3(entry.0);
            if (900.0..=1200.0).contains(&v) {
                *densities.get_mut(fluid) = DensityRange::entered(kg_per_m3(v));
            } else {
                c.error(Error::new(
                    format!("densities.{}", fluid_key(fluid)),
                    ErrorKind::OutOfRange {
                        value: entry.to_string(),
                        min: "900 kg/m3".into(),
                        max: "1200 kg/m3".into(),
                        hint: None,
                    },
                ));
            }
        }

        let position = case
            .position
            .as_ref()
            .and_then(|spec| match spec.resolve("position") {
                Ok(p) => Some(p),
                Err(errors) => {
                    c.errors.0.extend(errors.0);
                    None
                }
            });
        let needs_a_body = case.position.is_some() || case.baseline.is_some();
        let mut body = match (body_height, case.patient.height) {
            (Some(h), _) => Some(Body::of_height(h)),
            // A height was typed but is out of range: its error stands.
            (None, Some(_)) => None,
            (None, None) if needs_a_body => {
                c.warn(
                    "patient.height",
                    format!(
                        "no body height given: an adult of {:.0} cm ±{:.0} cm is ASSUMED (the \
                         spread of adult heights; NCD Risk Factor Collaboration 2016, from \
                         memory), so every range is wider: enter the patient's height",
                        geometry::ASSUMED_HEIGHT_CM,
                        geometry::ASSUMED_HEIGHT_SPREAD_CM
                    ),
                );
                Some(Body::assumed())
            }
            (None, None) => None,
        };
        if !case.segments.is_empty() && case.patient.height.is_none() {
            c.error(Error::missing(
                "patient.height",
                "measured segments refine the position's estimate, which needs the patient's \
                 standing height",
            ));
        }
        for (segment, entry) in &case.segments {
            let field = format!("segments.{}", segment.key());
            if let (Some(len), Some(body)) = (c.length(&field, *entry, (5.0, 100.0)), body.as_mut())
            {
                let expected = segment.fraction() * to_cm(body.height);
                let ratio = to_cm(len) / expected;
                if !(0.7..=1.3).contains(&ratio) {
                    c.warn(
                        field.clone(),
                        format!(
                            "{} of {:.0} cm is {:.0}% of what the body height suggests ({:.0} cm): \
                             check the measurement",
                            segment.label(),
                            to_cm(len),
                            ratio * 100.0,
                            expected
                        ),
                    );
                }
                body.measured.insert(*segment, len);
            }
        }
        if position.as_ref().is_some_and(|p| p.lie.is_lateral()) {
            c.warn(
                "position",
                "in side-lying the phlebostatic axis is not defined (Kee et al. 1993); heights are \
                 taken from the centre of the chest at the 4th intercostal space: level transducers \
                 there, or enter measured heights",
            );
        }

        if case.readings.contains_key(&Quantity::Iap) {
            if let Some(p) = position.as_ref().filter(|p| {
                p.lie != geometry::Lie::FaceUp
                    || p.angles.backrest_deg != 0.0
                    || p.angles.tilt_deg != 0.0
            }) {
                c.warn(
                    "readings.iap",
                    format!(
                        "IAP is standardised supine and flat, at end-expiration (WSACS 2013); \
                         in this position ({}) the reading differs (head-up raises it): \
                         compare it with supine values with care",
                        p.posture.label()
                    ),
                );
            }
        }

        let mut measured = BTreeMap::new();
        for (landmark, spec) in &case.heights {
            if let Some(m) = measured_height(&mut c, *landmark, spec) {
                measured.insert(*landmark, m);
            }
        }

        let mean_rule = case.mean_rule.unwrap_or_default();
        let mut arterial = Vec::new();
        let mut ids: Vec<&str> = Vec::new();
        for (i, spec) in case.arterial.iter().enumerate() {
            let id = spec.id.trim();
            if ids.contains(&id) {
                c.error(Error::new(
                    format!("arterial[{i}].id"),
                    ErrorKind::Duplicate {
                        name: id.to_owned(),
                    },
                ));
            }
            ids.push(id);
            if let Some(a) = c.arterial(i, spec, mean_rule) {
                arterial.push(a);
            }
        }
        let primary = match &case.primary_arterial {
            Some(id) => {
                let found = arterial.iter().position(|a| a.id == id.trim());
                if found.is_none() && ids.len() == case.arterial.len() && !ids.contains(&id.trim())
                {
                    c.error(Error::new(
                        "primary_arterial",
                        ErrorKind::UnknownReference { name: id.clone() },
                    ));
                }
                found
            }
            None => arterial
                .iter()
                .position(|a| a.method != Method::Cuff)
                .or(if arterial.is_empty() { None } else { Some(0) }),
        };

        let mut readings = BTreeMap::new();
        for (quantity, spec) in &case.readings {
            if let Some(r) = c.reading(*quantity, spec) {
                readings.insert(*quantity, r);
            }
        }
        for (quantity, spec) in &case.assume {
            if case.readings.contains_key(quantity) {
                c.warn(
                    format!("assume.{quantity}"),
                    format!(
                        "{} was measured, so the assumed value is not used",
                        quantity.label()
                    ),
                );
                continue;
            }
            if let Some(r) = c.assumed(*quantity, spec.value, spec.level) {
                readings.insert(*quantity, r);
            }
        }

        let mut concern: Vec<Organ> = Vec::new();
        for organ in &case.concern {
            if !concern.contains(organ) {
                concern.push(*organ);
            }
        }

        let mut organ_levels = BTreeMap::new();
        for (organ, landmark) in &case.organ_levels {
            let field = format!("organ_levels.{organ}");
            match organ {
                Organ::Brain | Organ::Cord | Organ::Kidney
                    if organ.level_choices().contains(landmark) =>
                {
                    organ_levels.insert(*organ, *landmark);
                }
                Organ::Brain | Organ::Cord | Organ::Kidney => c.error(Error::not_applicable(
                    field,
                    format!(
                        "{} can be checked at {}",
                        organ.label(),
                        organ
                            .level_choices()
                            .iter()
                            .map(|l| l.key())
                            .collect::<Vec<_>>()
                            .join(" or ")
                    ),
                )),
                Organ::Eye => c.error(Error::not_applicable(
                    field,
                    "the eye is checked where IOP was measured (readings.iop.level)",
                )),
                Organ::Limb => c.error(Error::not_applicable(
                    field,
                    "the limb is checked where compartment pressure was measured \
                     (readings.compartment.level)",
                )),
                _ => c.error(Error::not_applicable(
                    field,
                    format!("{} is always checked at its fixed landmark", organ.label()),
                )),
            }
        }

        let targets = match &case.targets {
            None => target::defaults(),
            Some(specs) => {
                let mut targets = Vec::new();
                for (i, spec) in specs.iter().enumerate() {
                    let field = format!("targets[{i}]");
                    if spec
                        .citation
                        .as_ref()
                        .is_some_and(|s| s.chars().count() > MAX_SOURCE_CHARS)
                    {
                        c.error(Error::new(
                            format!("{field}.source"),
                            ErrorKind::Shape {
                                message: format!("at most {MAX_SOURCE_CHARS} characters"),
                            },
                        ));
                    }
                    match spec.resolve(&field) {
                        Ok(t) => targets.push(t),
                        Err(errors) => c.errors.0.extend(errors.0),
                    }
                }
                targets
            }
        };

        let baseline = case
            .baseline
            .as_ref()
            .and_then(|b| c.baseline(b, mean_rule));

        let operative_site = match case.operative_site {
            Some(site) => Some((site, true)),
            None => position
                .as_ref()
                .filter(|p| p.posture.is_seated())
                .map(|_| (Landmark::Vertex, false)),
        };
        let drain = case.ventricular_drain.as_ref().and_then(|d| {
            // A chamber from 20 cmH2O below the tragus to 60 above it.
            c.pressure("ventricular_drain.set_at", d.set_at, DRAIN_RANGE_MMHG)
                .map(|_| (d.set_at, d.open))
        });

        let scene = Scene {
            body,
            position,
            operative_site,
            drain,
            measured,
            densities,
            mean_rule,
            arterial,
            primary,
            readings,
            concern,
            organ_levels,
            targets,
            baseline,
            warnings: Vec::new(),
            shift: None,
        };
        scene.check_places(&mut c);
        let Checker { errors, warnings } = c;
        errors.into_result(Scene { warnings, ..scene })
    }

    /// Every landmark a reading refers to must have a height.
    fn check_places(&self, c: &mut Checker) {
        let mut need = |field: String, place: Place| {
            if let Place::At(landmark) = place {
                if !self.has_height(landmark) {
                    c.error(Error::missing(
                        field,
                        format!(
                            "the height of the {} is not known: measure it (heights.{landmark}) \
                             or give the position and patient height",
                            landmark.label()
                        ),
                    ));
                }
            }
        };
        for (i, a) in self.arterial.iter().enumerate() {
            need(format!("arterial[{i}].level"), a.place);
        }
        for (q, r) in &self.readings {
            let section = if r.is_assumed() { "assume" } else { "readings" };
            need(format!("{section}.{q}.level"), r.place);
        }
    }
}

fn measured_height(c: &mut Checker, landmark: Landmark, spec: &HeightSpec) -> Option<Measured> {
    let field = format!("heights.{landmark}");
    let height = c.length(&field, spec.height, HEIGHT_RANGE_CM);
    let uncertainty = match spec.uncertainty {
        Some(u) => c.length(&format!("{field}.uncertainty"), u, (0.0, 30.0)),
        None => Some(cm(MEASURED_HEIGHT_CM)),
    };
    if landmark == Landmark::Heart && height.is_some_and(|h| to_cm(h) != 0.0) {
        c.error(Error::inconsistent(
            field,
            "the heart reference is the datum: its height is 0 by definition",
        ));
        return None;
    }
    Some(Measured {
        height: height?,
        uncertainty: uncertainty?,
    })
}

fn fluid_key(fluid: Fluid) -> &'static str {
    match fluid {
        Fluid::Blood => "blood",
        Fluid::Csf => "csf",
        Fluid::Saline => "saline",
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn scene(body: &str) -> Result<Scene, Errors> {
        let text = format!(r#"{{"format": "plumbline-case", "version": 1, {body}}}"#);
        Scene::from_case(&Case::from_json(&text).unwrap())
    }

    #[test]
    fn segments_need_a_body_and_implausible_ones_are_flagged() {
        let errors = scene(r#""segments": {"upper_arm": "30 cm"}"#).unwrap_err();
        assert!(errors.iter().any(|e| e.field == "patient.height"));
        let s = scene(
            r#""patient": {"height": "170 cm"}, "position": {"posture": "supine"},
               "segments": {"upper_arm": "60 cm", "forearm": "25 cm"}"#,
        )
        .unwrap();
        let flagged: Vec<&str> = s.warnings.iter().map(|w| w.field.as_str()).collect();
        assert_eq!(flagged, vec!["segments.upper_arm"]);
    }
}

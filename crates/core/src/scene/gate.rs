//! The gate from case to scene: every section of the case read in turn,
//! every value converted to SI with its range and consistency checked, and
//! every problem gathered with its field before any formula runs.

use super::checker::{measured_height, Checker};
use super::*;

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
        let densities = densities(&mut c, case);
        let position = case
            .position
            .as_ref()
            .and_then(|spec| match spec.resolve("position") {
                Ok(p) => Some(p),
                Err(errors) => {
                    c.errors.extend(errors);
                    None
                }
            });
        let body = body(&mut c, case);
        position_warnings(&mut c, case, position.as_ref());
        let mut measured = BTreeMap::new();
        for (landmark, spec) in &case.heights {
            if let Some(m) = measured_height(&mut c, *landmark, spec) {
                measured.insert(*landmark, m);
            }
        }
        let mean_rule = case.mean_rule.unwrap_or_default();
        let (arterial, primary) = sources(&mut c, case, mean_rule);
        let readings = readings(&mut c, case);
        let mut concern: Vec<Organ> = Vec::new();
        for organ in &case.concern {
            if !concern.contains(organ) {
                concern.push(*organ);
            }
        }
        let organ_levels = organ_levels(&mut c, case);
        let targets = targets(&mut c, case);
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

/// The fluids' densities: published defaults, the haematocrit estimate, or
/// values entered in the case.
fn densities(c: &mut Checker, case: &Case) -> Densities {
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
    densities
}

/// The patient's size: the stated height, or an assumed adult when a
/// position or baseline needs one; measured segments on top.
fn body(c: &mut Checker, case: &Case) -> Option<Body> {
    let body_height = case
        .patient
        .height
        .and_then(|h| c.length("patient.height", h, BODY_HEIGHT_RANGE_CM));
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
        if let (Some(len), Some(body)) = (c.length(&field, *entry, (5.0, 100.0)), body.as_mut()) {
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
    body
}

/// What a position changes about the readings' conventions: side-lying has
/// no phlebostatic axis, IAP is standardised flat; and a table angle the
/// check assumed because none was entered.
fn position_warnings(c: &mut Checker, case: &Case, position: Option<&Position>) {
    if let Some(spec) = case.position.as_ref().filter(|_| position.is_some()) {
        for (name, usual) in spec.assumed_table_angles() {
            // Short: it stands beside the angle's box on the quick path.
            c.warn(
                format!("position.{name}"),
                format!("not entered: the usual {usual:.0}° is ASSUMED; enter the angle as set"),
            );
        }
    }
    if position.is_some_and(|p| p.lie.is_lateral()) {
        c.warn(
            "position",
            "in side-lying the phlebostatic axis is not defined (Kee et al. 1993); heights are \
             taken from the centre of the chest at the 4th intercostal space: level transducers \
             there, or enter measured heights",
        );
    }
    if case.readings.contains_key(&Quantity::Iap) {
        if let Some(p) = position.filter(|p| {
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
}

/// The arterial sources, with unique names, and the one that drives the
/// organ results.
fn sources(c: &mut Checker, case: &Case, mean_rule: MeanRule) -> (Vec<Arterial>, Option<usize>) {
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
            if found.is_none() && ids.len() == case.arterial.len() && !ids.contains(&id.trim()) {
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
    (arterial, primary)
}

/// The other readings, and the assumed values where nothing was measured.
fn readings(c: &mut Checker, case: &Case) -> BTreeMap<Quantity, Reading> {
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
    readings
}

/// Where organs with a choice are checked.
fn organ_levels(c: &mut Checker, case: &Case) -> BTreeMap<Organ, Landmark> {
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
    organ_levels
}

/// The case's targets, or the defaults.
fn targets(c: &mut Checker, case: &Case) -> Vec<Target> {
    let Some(specs) = &case.targets else {
        return target::defaults();
    };
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
                ErrorKind::Length {
                    what: "a target's source".to_owned(),
                    min: 0,
                    max: MAX_SOURCE_CHARS,
                },
            ));
        }
        match spec.resolve(&field) {
            Ok(t) => targets.push(t),
            Err(errors) => c.errors.extend(errors),
        }
    }
    targets
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
        assert!(errors.iter().any(|e| e.field() == "patient.height"));
        let s = scene(
            r#""patient": {"height": "170 cm"}, "position": {"posture": "supine"},
               "segments": {"upper_arm": "60 cm", "forearm": "25 cm"}"#,
        )
        .unwrap();
        let flagged: Vec<&str> = s.warnings.iter().map(|w| w.field.as_str()).collect();
        assert_eq!(flagged, vec!["segments.upper_arm"]);
    }

    #[test]
    fn a_table_angle_left_to_its_usual_value_is_said() {
        let warned = |position: &str| -> Vec<String> {
            let s = scene(&format!(
                r#""patient": {{"height": "170 cm"}}, "position": {position}"#
            ))
            .unwrap();
            s.warnings.iter().map(|w| w.field.clone()).collect()
        };
        assert_eq!(
            warned(r#"{"posture": "beach_chair"}"#),
            ["position.backrest_deg"]
        );
        let s = scene(r#""patient": {"height": "170 cm"}, "position": {"posture": "sitting"}"#)
            .unwrap();
        assert!(
            s.warnings
                .first()
                .unwrap()
                .message
                .contains("usual 80° is ASSUMED"),
            "{:?}",
            s.warnings
        );
        assert_eq!(
            warned(r#"{"posture": "reverse_trendelenburg"}"#),
            ["position.tilt_deg"]
        );
        assert!(warned(r#"{"posture": "beach_chair", "backrest_deg": 60}"#).is_empty());
        assert!(
            warned(r#"{"posture": "supine"}"#).is_empty(),
            "flat is no assumption"
        );
    }
}

//! The checks of single values as a case is read: ranges with a unit hint,
//! units that do not fit a method, levels, means against systolic and
//! diastolic, and each kind of reading, each problem gathered with its
//! field.

use super::*;

/// Gathers every problem and warning while a case is read.
pub(super) struct Checker {
    pub(super) errors: Errors,
    pub(super) warnings: Vec<Warning>,
}

impl Checker {
    pub(super) fn error(&mut self, error: Error) {
        self.errors.push(error);
    }

    pub(super) fn warn(&mut self, field: impl Into<String>, message: impl Into<String>) {
        self.warnings.push(Warning::new(field, message));
    }

    /// A pressure within `range` mmHg, or an error suggesting the unit that
    /// would put it in range.
    pub(super) fn pressure(
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

    pub(super) fn length(
        &mut self,
        field: &str,
        entry: LengthEntry,
        range_cm: (f64, f64),
    ) -> Option<Length> {
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

    pub(super) fn accuracy(
        &mut self,
        field: &str,
        entry: Option<PressureEntry>,
    ) -> Option<Pressure> {
        entry.and_then(|e| self.pressure(field, e, (0.0, 30.0)))
    }

    pub(super) fn place(&mut self, field: &str, level: Level) -> Option<Place> {
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
    pub(super) fn unit_fit(
        &mut self,
        field: &str,
        entry: PressureEntry,
        method: Method,
        arterial: bool,
    ) {
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

    pub(super) fn mean_of(
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

    pub(super) fn arterial(
        &mut self,
        i: usize,
        spec: &ArterialSpec,
        rule: MeanRule,
    ) -> Option<Arterial> {
        let field = format!("arterial[{i}]");
        let before = self.errors.len();
        let id = spec.id.trim();
        if id.is_empty() || id.chars().count() > MAX_ID_CHARS {
            self.error(Error::new(
                format!("{field}.id"),
                ErrorKind::Length {
                    what: "a source's short name".to_owned(),
                    min: 1,
                    max: MAX_ID_CHARS,
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
        if self.errors.len() > before {
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

    pub(super) fn local_place(&mut self, field: &str, quantity: Quantity, place: Place) -> bool {
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

    pub(super) fn reading(&mut self, quantity: Quantity, spec: &ReadingSpec) -> Option<Reading> {
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

    pub(super) fn assumed(
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

    pub(super) fn baseline(&mut self, spec: &BaselineSpec, rule: MeanRule) -> Option<Baseline> {
        let field = "baseline";
        let before = self.errors.len();
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
                self.errors.extend(errors);
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
        if mean.is_none() && self.errors.len() == before {
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

pub(super) fn measured_height(
    c: &mut Checker,
    landmark: Landmark,
    spec: &HeightSpec,
) -> Option<Measured> {
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

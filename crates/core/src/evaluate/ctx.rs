//! The context formulas run in: a scene with its heights worked out, and
//! how each reading is carried through its fluid to where a metric refers
//! it (the organ's height, the definition's zero, or as read), writing the
//! derivation only when asked to.

use std::collections::BTreeMap;

use super::{need, Frame, Input, Spot, Step, Term};
use crate::error::Errors;
use crate::fluid::Fluid;
use crate::landmark::Landmark;
use crate::reading::{Component, Quantity};
use crate::scene::{Place, Scene};
use crate::units::{column, to_cm, to_kg_per_m3, to_mmhg, Length, Pressure};

/// A scene with its landmark heights worked out, ready for formulas.
pub struct Ctx<'a> {
    scene: &'a Scene,
    heights: BTreeMap<Landmark, Length>,
    explain: bool,
}

pub(super) fn mm(p: Pressure) -> String {
    format!("{:.1} mmHg", to_mmhg(p))
}

impl<'a> Ctx<'a> {
    /// Works out the heights of `scene` (with any shift in force); its
    /// values come with their derivations.
    pub fn new(scene: &'a Scene) -> Self {
        Ctx {
            scene,
            heights: scene.heights(),
            explain: true,
        }
    }

    /// As [`Ctx::new`], without derivations: numbers only.
    pub fn quiet(scene: &'a Scene) -> Self {
        Ctx {
            explain: false,
            ..Ctx::new(scene)
        }
    }

    /// The scene.
    pub fn scene(&self) -> &Scene {
        self.scene
    }

    /// A landmark's height, if known.
    pub fn height(&self, landmark: Landmark) -> Option<Length> {
        self.heights.get(&landmark).copied()
    }

    /// Adds a step to a derivation, writing its words only when asked to.
    pub(super) fn note(
        &self,
        steps: &mut Vec<Step>,
        what: impl FnOnce() -> String,
        value: Pressure,
    ) {
        if self.explain {
            steps.push(Step {
                what: what(),
                value,
            });
        }
    }

    pub(super) fn landmark_height(&self, landmark: Landmark) -> Result<Length, Errors> {
        self.height(landmark).ok_or_else(|| {
            need(
                format!("heights.{landmark}"),
                format!(
                    "the height of the {} (measure it or give the position and patient height)",
                    landmark.label()
                ),
            )
        })
    }

    /// A place's height in this scene.
    ///
    /// # Errors
    /// A landmark with no height (no position and no measurement).
    pub fn place_height(&self, place: Place) -> Result<Length, Errors> {
        match place {
            Place::At(landmark) => self.landmark_height(landmark),
            Place::Height { height, .. } => Ok(height),
        }
    }

    pub(super) fn spot(&self, place: Place) -> Result<Spot, Errors> {
        Ok(Spot {
            place,
            height: self.place_height(place)?,
        })
    }

    /// `value`, read at `from`, carried through `fluid` to `to`; taken as
    /// read when `to` is `None`. Returns the value there and the term.
    #[allow(clippy::too_many_arguments)]
    pub(super) fn carry(
        &self,
        steps: &mut Vec<Step>,
        name: &str,
        input: Input,
        value: Pressure,
        fluid: Fluid,
        from: Spot,
        to: Option<Spot>,
    ) -> (Pressure, Term) {
        let Some(to) = to else {
            self.note(
                steps,
                || format!("{name} taken as read at its own zero, {}", from.words()),
                value,
            );
            return (
                value,
                Term {
                    input,
                    scale: 1.0,
                    offset: Pressure::default(),
                    carried: None,
                },
            );
        };
        let dh = to.height - from.height;
        let shift = column(self.scene.density(fluid), dh);
        let result = value - shift;
        self.note(
            steps,
            || {
                if to_cm(dh).abs() < 1e-9 {
                    format!("{name} at {}: same height, no correction", to.words())
                } else {
                    format!(
                        "{name} at {}: {} − {} column of {:.1} cm at {:.0} kg/m³ ({}) = {}",
                        to.words(),
                        mm(value),
                        fluid.label(),
                        to_cm(dh),
                        to_kg_per_m3(self.scene.density(fluid)),
                        mm(shift),
                        mm(result)
                    )
                }
            },
            result,
        );
        (
            result,
            Term {
                input,
                scale: 1.0,
                offset: -shift,
                carried: Some(fluid),
            },
        )
    }

    pub(super) fn source(&self, requested: Option<usize>) -> Result<usize, Errors> {
        requested
            .or(self.scene.primary)
            .filter(|i| *i < self.scene.arterial.len())
            .ok_or_else(|| need("arterial", "an arterial pressure (a line or a cuff)"))
    }

    /// An arterial component of source `i`, carried to `to`.
    pub(super) fn arterial_at(
        &self,
        steps: &mut Vec<Step>,
        i: usize,
        component: Component,
        to: Option<Spot>,
    ) -> Result<(Pressure, Term), Errors> {
        let a = self
            .scene
            .arterial
            .get(i)
            .ok_or_else(|| need("arterial", "an arterial pressure (a line or a cuff)"))?;
        let value = a.component(component).ok_or_else(|| {
            need(
                format!("arterial[{i}].{}", component.label()),
                format!("the {} pressure of {}", component.label(), a.id),
            )
        })?;
        let from = self.spot(a.place)?;
        self.note(
            steps,
            || {
                let basis = match (component, a.mean) {
                    (Component::Mean, Some((_, b))) => format!(", {}", b.describe()),
                    _ => String::new(),
                };
                format!(
                    "{} at {} ({}, {}, {:+.1} cm){basis}: {}",
                    component.label(),
                    a.id,
                    a.method.label(),
                    a.place.describe(),
                    to_cm(from.height),
                    mm(value)
                )
            },
            value,
        );
        Ok(self.carry(
            steps,
            component.label(),
            Input::Arterial(i, component),
            value,
            Fluid::Blood,
            from,
            to,
        ))
    }

    /// A reading carried to where the frame refers it; `Ok(None)` when
    /// absent.
    pub(super) fn reading_at(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        frame: Frame,
        organ: Spot,
    ) -> Result<Option<(Pressure, Term)>, Errors> {
        let Some(r) = self.scene.readings.get(&quantity) else {
            return Ok(None);
        };
        if r.is_assumed() {
            assumed.push(quantity);
        }
        let from = self.spot(r.place)?;
        self.note(
            steps,
            || {
                let how = r.method.map_or("ASSUMED, not measured", |m| m.label());
                format!(
                    "{} ({how}, {}, {:+.1} cm): {}",
                    quantity.label(),
                    r.place.describe(),
                    to_cm(from.height),
                    mm(r.value)
                )
            },
            r.value,
        );
        let input = Input::Reading(quantity);
        let Some(fluid) = quantity.fluid() else {
            // A tissue pressure exists only where it is taken.
            return if frame == Frame::Convention || r.place == organ.place {
                let term = Term {
                    input,
                    scale: 1.0,
                    offset: Pressure::default(),
                    carried: None,
                };
                Ok(Some((r.value, term)))
            } else {
                Err(need(
                    format!("readings.{quantity}.level"),
                    format!("{} taken at {}", quantity.label(), organ.words()),
                ))
            };
        };
        let to = match frame {
            Frame::OrganLevel => Some(organ),
            Frame::Convention => self.conventional_zero(quantity)?,
        };
        Ok(Some(self.carry(
            steps,
            quantity.label(),
            input,
            r.value,
            fluid,
            from,
            to,
        )))
    }

    /// Where a pressure is referred to by convention: its usual zero (the
    /// tragus for ICP, the iliac crest for IAP, the heart for CVP); a CSF
    /// drain as read at its own zero.
    pub(super) fn conventional_zero(&self, quantity: Quantity) -> Result<Option<Spot>, Errors> {
        match quantity.usual_level() {
            Some(_) if quantity == Quantity::Csf => Ok(None),
            Some(landmark) => self.spot(Place::At(landmark)).map(Some),
            None => Ok(None),
        }
    }

    pub(super) fn reading_needed(
        &self,
        steps: &mut Vec<Step>,
        assumed: &mut Vec<Quantity>,
        quantity: Quantity,
        frame: Frame,
        organ: Spot,
    ) -> Result<(Pressure, Term), Errors> {
        self.reading_at(steps, assumed, quantity, frame, organ)?
            .ok_or_else(|| need(format!("readings.{quantity}"), missing_reading(quantity)))
    }
}

pub(super) fn missing_reading(quantity: Quantity) -> String {
    let assumable = matches!(
        quantity,
        Quantity::Icp | Quantity::Csf | Quantity::Cvp | Quantity::Iap | Quantity::Lvedp
    );
    if assumable {
        format!(
            "{} (readings.{quantity}, or an assumed value in assume.{quantity})",
            quantity.label()
        )
    } else {
        format!("{} (readings.{quantity})", quantity.label())
    }
}

//! The checked inputs of one check: every value in SI with its level,
//! accuracy and provenance, ready for the formulas.
//!
//! [`Scene::from_case`] is the one gate between what was typed and what is
//! computed: it converts units, checks ranges and consistency, and gathers
//! every problem with its field. A scene can also be *shifted*: one
//! uncertain input moved to the edge of its range, which is how every
//! result's range is found.

mod checker;
mod gate;
mod params;

pub use params::input_owner;

use std::collections::BTreeMap;

use crate::case::{ArterialSpec, BaselineSpec, Case, HeightSpec, ReadingSpec};
use crate::error::{Error, ErrorKind, Errors, Warning};
use crate::fluid::{blood_from_haematocrit, Densities, DensityRange, Fluid};
use crate::geometry::{self, Body, GeometryParam, Position, Shift, BODY_HEIGHT_RANGE_CM};
use crate::landmark::Landmark;
use crate::organ::Organ;
use crate::reading::{Component, Level, MeanBasis, MeanRule, Method, Quantity};
use crate::target::{self, Target};
use crate::units::{
    cm, kg_per_m3, mmhg, to_cm, to_kg_per_m3, to_mmhg, Length, LengthEntry, Pressure,
    PressureEntry, PressureUnit,
};

/// Heights a reading level or measurement may have, cm from the heart.
pub const HEIGHT_RANGE_CM: (f64, f64) = (-120.0, 120.0);
/// Drain chamber settings accepted, mmHg: 20 cmH2O below the tragus to 60
/// above it.
pub const DRAIN_RANGE_MMHG: (f64, f64) = (-14.7, 44.2);
/// Default half-width of a measured height, cm.
pub const MEASURED_HEIGHT_CM: f64 = 1.0;
/// Longest id of an arterial source.
pub const MAX_ID_CHARS: usize = 40;
/// Longest target source text.
pub const MAX_SOURCE_CHARS: usize = 240;

/// Where a reading refers to, resolved.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Place {
    /// At a landmark, whose height comes from measurement or geometry.
    At(Landmark),
    /// At an explicit height above the heart reference.
    Height {
        /// The height.
        height: Length,
        /// How far it may be off.
        uncertainty: Length,
    },
}

impl Place {
    /// The place in words.
    pub fn describe(self) -> String {
        match self {
            Place::At(landmark) => landmark.label().to_owned(),
            Place::Height { height, .. } => {
                format!("{:+.1} cm from the heart reference", to_cm(height))
            }
        }
    }
}

/// An arterial source, checked.
#[derive(Clone, Debug, PartialEq)]
pub struct Arterial {
    /// Its name.
    pub id: String,
    /// How it is measured.
    pub method: Method,
    /// Where it refers to.
    pub place: Place,
    /// Systolic, if given.
    pub systolic: Option<Pressure>,
    /// Diastolic, if given.
    pub diastolic: Option<Pressure>,
    /// Mean, measured or estimated.
    pub mean: Option<(Pressure, MeanBasis)>,
    /// Accuracy half-width, if given instead of the method's.
    pub accuracy: Option<Pressure>,
    /// The unit it was entered in, for showing the values to defend the same way.
    pub unit: PressureUnit,
}

impl Arterial {
    /// One component's value.
    pub fn component(&self, component: Component) -> Option<Pressure> {
        match component {
            Component::Systolic => self.systolic,
            Component::Diastolic => self.diastolic,
            Component::Mean => self.mean.map(|(p, _)| p),
        }
    }

    /// The accuracy half-width of a component's reading.
    pub fn accuracy_of(&self, value: Pressure) -> Pressure {
        self.accuracy.unwrap_or_else(|| self.method.accuracy(value))
    }

    /// Every component moved by the same amount, as when the site reading
    /// changes with a shift of the whole waveform.
    pub fn shifted_by(&self, delta: Pressure) -> Arterial {
        let mut next = self.clone();
        next.systolic = self.systolic.map(|p| p + delta);
        next.diastolic = self.diastolic.map(|p| p + delta);
        next.mean = self.mean.map(|(p, basis)| (p + delta, basis));
        next
    }
}

/// A pressure reading other than arterial, checked; or an assumed value.
#[derive(Clone, Debug, PartialEq)]
pub struct Reading {
    /// Which pressure.
    pub quantity: Quantity,
    /// Its value.
    pub value: Pressure,
    /// How it is measured; `None` when assumed.
    pub method: Option<Method>,
    /// Where it refers to.
    pub place: Place,
    /// Accuracy half-width (zero for assumed values: their error is the
    /// user's assumption and is not in any range).
    pub accuracy: Pressure,
    /// The unit it was entered in.
    pub unit: PressureUnit,
}

impl Reading {
    /// Whether the value is assumed rather than measured.
    pub fn is_assumed(&self) -> bool {
        self.method.is_none()
    }
}

/// The baseline arterial pressure, checked.
#[derive(Clone, Debug, PartialEq)]
pub struct Baseline {
    /// How it was measured.
    pub method: Method,
    /// Where it refers to.
    pub place: Place,
    /// The position it was taken in.
    pub position: Position,
    /// Systolic, if given.
    pub systolic: Option<Pressure>,
    /// Diastolic, if given.
    pub diastolic: Option<Pressure>,
    /// The mean, measured or estimated.
    pub mean: (Pressure, MeanBasis),
}

/// A measured landmark height.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Measured {
    /// Height above the heart reference.
    pub height: Length,
    /// How far it may be off.
    pub uncertainty: Length,
}

/// Which input an uncertain value belongs to.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Owner {
    /// An arterial source, by index.
    Arterial(usize),
    /// A non-arterial reading.
    Reading(Quantity),
    /// The baseline.
    Baseline,
}

/// One uncertain input of a check.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Param {
    /// A geometry input (angle, proportion, offset).
    Geometry(GeometryParam),
    /// A measured landmark height.
    Measured(Landmark),
    /// The explicit transducer height of a reading.
    Place(Owner),
    /// A fluid's density.
    Density(Fluid),
    /// A device's accuracy.
    Device(Owner),
    /// The rule used to estimate a mean from systolic and diastolic.
    MeanRule(Owner),
}

/// Everything one check computes from, checked and in SI.
#[derive(Clone, Debug, PartialEq)]
pub struct Scene {
    /// The patient's size, when given.
    pub body: Option<Body>,
    /// The position, when given.
    pub position: Option<Position>,
    /// Measured landmark heights.
    pub measured: BTreeMap<Landmark, Measured>,
    /// Fluid densities.
    pub densities: Densities,
    /// The mean-estimation rule.
    pub mean_rule: MeanRule,
    /// Arterial sources, in case order.
    pub arterial: Vec<Arterial>,
    /// The index of the source that drives organ results.
    pub primary: Option<usize>,
    /// Other readings, measured or assumed.
    pub readings: BTreeMap<Quantity, Reading>,
    /// The organs of concern, in case order without repeats; empty for
    /// every organ with a result.
    pub concern: Vec<Organ>,
    /// Organ levels chosen in the case.
    pub organ_levels: BTreeMap<Organ, Landmark>,
    /// Targets.
    pub targets: Vec<Target>,
    /// The operative site whose venous pressure is watched, and whether the
    /// case chose it (else the vertex of a seated patient).
    pub operative_site: Option<(Landmark, bool)>,
    /// An external ventricular drain: its chamber's setting above the
    /// tragus (as entered), and whether it is open.
    pub drain: Option<(PressureEntry, bool)>,
    /// Baseline, when given.
    pub baseline: Option<Baseline>,
    /// Warnings found while checking the inputs.
    pub warnings: Vec<Warning>,
    /// A geometry shift in force (for uncertainty); `None` normally.
    pub shift: Option<Shift>,
}

impl Scene {
    /// Whether a landmark's height is known (measured, estimated, or the datum).
    pub fn has_height(&self, landmark: Landmark) -> bool {
        landmark == Landmark::Heart
            || self.measured.contains_key(&landmark)
            || (self.position.is_some() && self.body.is_some())
    }

    /// Every landmark's height in the current position, with any shift in
    /// force: measured heights win, the geometry fills the rest.
    pub fn heights(&self) -> BTreeMap<Landmark, Length> {
        let mut heights = match (&self.body, &self.position) {
            (Some(body), Some(position)) => geometry::place(body, position, self.shift).heights,
            _ => BTreeMap::new(),
        };
        heights.insert(Landmark::Heart, cm(0.0));
        for (landmark, m) in &self.measured {
            heights.insert(*landmark, m.height);
        }
        heights
    }

    /// Every landmark's height in the baseline's position.
    pub fn baseline_heights(&self) -> Option<BTreeMap<Landmark, Length>> {
        let baseline = self.baseline.as_ref()?;
        let body = self.body.as_ref()?;
        let mut heights = geometry::place(body, &baseline.position, self.shift).heights;
        heights.insert(Landmark::Heart, cm(0.0));
        Some(heights)
    }

    /// The name of an input source in words.
    pub fn owner_name(&self, owner: Owner) -> String {
        match owner {
            Owner::Arterial(i) => self
                .arterial
                .get(i)
                .map_or_else(|| "arterial source".to_owned(), |a| a.id.clone()),
            Owner::Reading(q) => q.label().to_owned(),
            Owner::Baseline => "baseline".to_owned(),
        }
    }

    /// The density of a fluid in force.
    pub fn density(&self, fluid: Fluid) -> crate::units::Density {
        self.densities.get(fluid).nominal
    }
}

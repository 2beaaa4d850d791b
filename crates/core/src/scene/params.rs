//! The uncertain inputs of a scene, and the scene with one of them moved to
//! the edge of its range: how every result's range is found.

use super::*;
use crate::evaluate::Input;
use crate::order::sort_short;
use crate::units::column;

impl Scene {
    /// The uncertain inputs of this scene, each to be shifted in turn.
    pub fn params(&self) -> Vec<Param> {
        let mut geometry: Vec<GeometryParam> = Vec::new();
        if self.body.is_some() {
            let positions = self
                .position
                .iter()
                .chain(self.baseline.iter().map(|b| &b.position));
            for position in positions {
                geometry.extend(GeometryParam::all_for(position));
            }
        }
        sort_short(&mut geometry);
        geometry.dedup();
        let mut params: Vec<Param> = geometry.into_iter().map(Param::Geometry).collect();
        params.extend(self.measured.keys().map(|l| Param::Measured(*l)));
        params.extend(Fluid::ALL.map(Param::Density));
        for (i, a) in self.arterial.iter().enumerate() {
            let owner = Owner::Arterial(i);
            params.push(Param::Device(owner));
            if matches!(a.place, Place::Height { .. }) {
                params.push(Param::Place(owner));
            }
            if matches!(a.mean, Some((_, MeanBasis::Estimated(_)))) {
                params.push(Param::MeanRule(owner));
            }
        }
        for (q, r) in &self.readings {
            if r.is_assumed() {
                continue;
            }
            params.push(Param::Device(Owner::Reading(*q)));
            if matches!(r.place, Place::Height { .. }) {
                params.push(Param::Place(Owner::Reading(*q)));
            }
        }
        if let Some(b) = &self.baseline {
            params.push(Param::Device(Owner::Baseline));
            if matches!(b.mean.1, MeanBasis::Estimated(_)) {
                params.push(Param::MeanRule(Owner::Baseline));
            }
        }
        params
    }

    /// A copy with one input moved by `sign` (±1) times its half-width.
    pub fn shifted(&self, param: Param, sign: f64) -> Scene {
        let mut next = self.clone();
        match param {
            Param::Geometry(p) => next.shift = Some(Shift { param: p, sign }),
            Param::Measured(landmark) => {
                if let Some(m) = next.measured.get_mut(&landmark) {
                    m.height += m.uncertainty * sign;
                }
            }
            Param::Density(fluid) => {
                let range = next.densities.get_mut(fluid);
                range.nominal = if sign > 0.0 { range.high } else { range.low };
            }
            Param::Place(owner) => {
                if let Some(Place::Height {
                    height,
                    uncertainty,
                }) = next.place_mut(owner)
                {
                    *height += *uncertainty * sign;
                }
            }
            Param::Device(Owner::Arterial(i)) => {
                if let Some(a) = next.arterial.get_mut(i) {
                    let reference = a
                        .component(Component::Mean)
                        .or(a.diastolic)
                        .unwrap_or_default();
                    *a = a.shifted_by(a.accuracy_of(reference) * sign);
                }
            }
            Param::Device(Owner::Reading(q)) => {
                if let Some(r) = next.readings.get_mut(&q) {
                    r.value += r.accuracy * sign;
                }
            }
            Param::Device(Owner::Baseline) => {
                if let Some(b) = next.baseline.as_mut() {
                    b.mean.0 += b.method.accuracy(b.mean.0) * sign;
                }
            }
            Param::MeanRule(Owner::Arterial(i)) => {
                if let Some(a) = next.arterial.get_mut(i) {
                    if let Some((m, basis)) = a.mean {
                        a.mean = Some((m + rule_gap(a.systolic, a.diastolic, basis) * sign, basis));
                    }
                }
            }
            Param::MeanRule(Owner::Baseline) => {
                if let Some(b) = next.baseline.as_mut() {
                    b.mean.0 += rule_gap(b.systolic, b.diastolic, b.mean.1) * sign;
                }
            }
            Param::MeanRule(Owner::Reading(_)) => {}
        }
        next
    }

    fn place_mut(&mut self, owner: Owner) -> Option<&mut Place> {
        match owner {
            Owner::Arterial(i) => self.arterial.get_mut(i).map(|a| &mut a.place),
            Owner::Reading(q) => self.readings.get_mut(&q).map(|r| &mut r.place),
            Owner::Baseline => self.baseline.as_mut().map(|b| &mut b.place),
        }
    }

    /// Whether moving `param` changes the heights or densities of the whole
    /// scene (and so needs a shifted scene), rather than one reading.
    pub fn moves_the_scene(param: Param) -> bool {
        matches!(
            param,
            Param::Geometry(_) | Param::Measured(_) | Param::Density(_)
        )
    }

    /// The reading or baseline a reading-level input belongs to.
    pub fn owner_of(param: Param) -> Option<Owner> {
        match param {
            Param::Place(o) | Param::Device(o) | Param::MeanRule(o) => Some(o),
            Param::Geometry(_) | Param::Measured(_) | Param::Density(_) => None,
        }
    }

    /// How far moving a reading-level `param` up by one half-width moves
    /// `input` as it enters a metric (`carried` through a fluid, or taken as
    /// read); `None` when it does not move it. Equal to what
    /// [`Scene::shifted`] does, without copying the scene.
    pub fn reading_shift(
        &self,
        param: Param,
        input: Input,
        carried: Option<Fluid>,
    ) -> Option<Pressure> {
        match (param, input) {
            (Param::Device(Owner::Arterial(i)), Input::Arterial(j, _)) if i == j => {
                let a = self.arterial.get(i)?;
                let reference = a
                    .component(Component::Mean)
                    .or(a.diastolic)
                    .unwrap_or_default();
                Some(a.accuracy_of(reference))
            }
            (Param::Device(Owner::Reading(q)), Input::Reading(r)) if q == r => {
                self.readings.get(&q).map(|r| r.accuracy)
            }
            (Param::Place(owner), _) if owner == input_owner(input) => {
                let place = match input {
                    Input::Arterial(i, _) => self.arterial.get(i)?.place,
                    Input::Reading(q) => self.readings.get(&q)?.place,
                };
                match (place, carried) {
                    (Place::Height { uncertainty, .. }, Some(fluid)) => {
                        Some(column(self.density(fluid), uncertainty))
                    }
                    _ => None,
                }
            }
            (Param::MeanRule(Owner::Arterial(i)), Input::Arterial(j, Component::Mean))
                if i == j =>
            {
                let a = self.arterial.get(i)?;
                let (_, basis) = a.mean?;
                Some(rule_gap(a.systolic, a.diastolic, basis))
            }
            _ => None,
        }
    }

    /// The uncertain input in words, with its half-width.
    pub fn param_label(&self, param: Param) -> String {
        let body = self
            .body
            .clone()
            .unwrap_or_else(|| Body::of_height(cm(170.0)));
        match param {
            Param::Geometry(p) => p.label(&body),
            Param::Measured(landmark) => format!(
                "measured height of the {} ±{:.0} cm",
                landmark.label(),
                self.measured
                    .get(&landmark)
                    .map_or(0.0, |m| to_cm(m.uncertainty))
            ),
            Param::Density(fluid) => {
                let r = self.densities.get(fluid);
                format!(
                    "{} density {:.0}-{:.0} kg/m³ ({})",
                    fluid.label(),
                    to_kg_per_m3(r.low),
                    to_kg_per_m3(r.high),
                    r.range_source
                )
            }
            Param::Place(owner) => format!("{} transducer height ±1 cm", self.owner_name(owner)),
            Param::Device(owner) => format!("{} device accuracy", self.owner_name(owner)),
            Param::MeanRule(owner) => {
                format!(
                    "{} mean estimated from systolic and diastolic",
                    self.owner_name(owner)
                )
            }
        }
    }
}

/// How far the other estimation rule would put the mean: the spread of an
/// estimated mean. Zero for a measured mean.
fn rule_gap(systolic: Option<Pressure>, diastolic: Option<Pressure>, basis: MeanBasis) -> Pressure {
    match (systolic, diastolic, basis) {
        (Some(s), Some(d), MeanBasis::Estimated(rule)) => {
            (rule.other().estimate(s, d) - rule.estimate(s, d)).abs()
        }
        _ => mmhg(0.0),
    }
}

/// The owner of a metric's input.
pub fn input_owner(input: Input) -> Owner {
    match input {
        Input::Arterial(i, _) => Owner::Arterial(i),
        Input::Reading(q) => Owner::Reading(q),
    }
}

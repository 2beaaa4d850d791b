//! The uncertain inputs of a scene, and the scene with one of them moved to
//! the edge of its range: how every result's range is found.

use super::*;

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
        geometry.sort();
        geometry.dedup();
        let mut params: Vec<Param> = geometry.into_iter().map(Param::Geometry).collect();
        params.extend(self.measured.keys().map(|l| Param::Measured(*l)));
        params.extend(Fluid::ALL.map(Param::Density));
        for (i, a) in self.arterial.iter().enumerate() {
            let source = Source::Arterial(i);
            params.push(Param::Device(source));
            if matches!(a.place, Place::Height { .. }) {
                params.push(Param::Place(source));
            }
            if matches!(a.mean, Some((_, MeanBasis::Estimated(_)))) {
                params.push(Param::MeanRule(source));
            }
        }
        for (q, r) in &self.readings {
            if r.is_assumed() {
                continue;
            }
            params.push(Param::Device(Source::Reading(*q)));
            if matches!(r.place, Place::Height { .. }) {
                params.push(Param::Place(Source::Reading(*q)));
            }
        }
        if let Some(b) = &self.baseline {
            params.push(Param::Device(Source::Baseline));
            if matches!(b.mean.1, MeanBasis::Estimated(_)) {
                params.push(Param::MeanRule(Source::Baseline));
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
            Param::Place(source) => {
                if let Some(Place::Height {
                    height,
                    uncertainty,
                }) = next.place_mut(source)
                {
                    *height += *uncertainty * sign;
                }
            }
            Param::Device(Source::Arterial(i)) => {
                if let Some(a) = next.arterial.get_mut(i) {
                    let reference = a
                        .component(Component::Mean)
                        .or(a.diastolic)
                        .unwrap_or_default();
                    *a = a.shifted_by(a.accuracy_of(reference) * sign);
                }
            }
            Param::Device(Source::Reading(q)) => {
                if let Some(r) = next.readings.get_mut(&q) {
                    r.value += r.accuracy * sign;
                }
            }
            Param::Device(Source::Baseline) => {
                if let Some(b) = next.baseline.as_mut() {
                    b.mean.0 += b.method.accuracy(b.mean.0) * sign;
                }
            }
            Param::MeanRule(Source::Arterial(i)) => {
                if let Some(a) = next.arterial.get_mut(i) {
                    if let Some((m, basis)) = a.mean {
                        a.mean = Some((m + rule_gap(a.systolic, a.diastolic, basis) * sign, basis));
                    }
                }
            }
            Param::MeanRule(Source::Baseline) => {
                if let Some(b) = next.baseline.as_mut() {
                    b.mean.0 += rule_gap(b.systolic, b.diastolic, b.mean.1) * sign;
                }
            }
            Param::MeanRule(Source::Reading(_)) => {}
        }
        next
    }

    fn place_mut(&mut self, source: Source) -> Option<&mut Place> {
        match source {
            Source::Arterial(i) => self.arterial.get_mut(i).map(|a| &mut a.place),
            Source::Reading(q) => self.readings.get_mut(&q).map(|r| &mut r.place),
            Source::Baseline => self.baseline.as_mut().map(|b| &mut b.place),
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
                    "{} density {:.0}-{:.0} kg/m³",
                    fluid.label(),
                    to_kg_per_m3(r.low),
                    to_kg_per_m3(r.high)
                )
            }
            Param::Place(source) => format!("{} transducer height ±1 cm", self.source_name(source)),
            Param::Device(source) => format!("{} device accuracy", self.source_name(source)),
            Param::MeanRule(source) => {
                format!(
                    "{} mean estimated from systolic and diastolic",
                    self.source_name(source)
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

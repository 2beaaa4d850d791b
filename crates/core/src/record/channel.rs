//! Channels: what a column or channel of a record refers to in the case,
//! how its samples fill time, and means estimated from systolic and
//! diastolic.

use serde::Serialize;

use crate::case::Case;
use crate::error::ErrorKind;
use crate::evaluate::Input;
use crate::order::map_of;
use crate::reading::{Component, Method, Quantity};
use crate::scene::Scene;
use crate::units::{Pressure, PressureEntry, PressureUnit};

/// How a channel's samples fill the time between them.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Sampling {
    /// Each reading holds until the next, up to the hold limit.
    Held,
    /// Samples are joined by straight lines, up to the gap limit.
    Interpolated,
}

/// One channel's samples, checked.
#[derive(Clone, Debug, PartialEq)]
pub struct Channel {
    /// Which reading.
    pub input: Input,
    /// Its name as written (`"radial line.mean"`).
    pub name: String,
    /// The unit it was written in.
    pub unit: PressureUnit,
    /// How samples fill the gaps.
    pub sampling: Sampling,
    /// Sample times, seconds from the start, strictly increasing.
    pub t_s: Vec<f64>,
    /// Sample values.
    pub values: Vec<Pressure>,
    /// Whether the channel was estimated from others (a mean from
    /// systolic and diastolic).
    pub estimated: bool,
}

/// The name of an input as a channel name.
pub fn channel_name(scene: &Scene, input: Input) -> String {
    match input {
        Input::Arterial(i, c) => {
            arterial_channel(scene.arterial.get(i).map_or("?", |a| a.id.as_str()), c)
        }
        Input::Reading(q) => q.key().to_owned(),
    }
}

/// The channel name of one component of an arterial source:
/// `"radial line.mean"`.
pub fn arterial_channel(id: &str, component: Component) -> String {
    format!("{id}.{}", component.label())
}

/// Every reading a case holds, as channel name and value as entered: what
/// one sample of the case adds to a record.
pub fn case_readings(case: &Case) -> Vec<(String, PressureEntry)> {
    let mut all = Vec::new();
    for a in &case.arterial {
        for (component, value) in [
            (Component::Systolic, a.systolic),
            (Component::Diastolic, a.diastolic),
            (Component::Mean, a.mean),
        ] {
            if let Some(v) = value {
                all.push((arterial_channel(&a.id, component), v));
            }
        }
    }
    for (q, r) in &case.readings {
        all.push((q.key().to_owned(), r.value));
    }
    all
}

/// The input a channel name refers to in this case.
///
/// # Errors
/// A reading's name with no reading in the case to give its method and
/// level (`Missing`), or a name that is neither `<arterial id>.<systolic|
/// diastolic|mean>` nor a reading's name, with the names the case offers
/// (`UnknownChannel`).
pub fn channel_input(scene: &Scene, name: &str) -> Result<Input, ErrorKind> {
    let name = name.trim();
    if let Some(q) = Quantity::ALL.into_iter().find(|q| q.key() == name) {
        return if scene.readings.contains_key(&q) {
            Ok(Input::Reading(q))
        } else {
            Err(ErrorKind::Missing {
                message: format!(
                    "'{name}' has no reading in the case to give its method and level; add \
                     readings.{name} (its value there is used where the record has no sample)"
                ),
            })
        };
    }
    if let Some((id, part)) = name.rsplit_once('.') {
        let component = match part.trim() {
            "systolic" => Some(Component::Systolic),
            "diastolic" => Some(Component::Diastolic),
            "mean" => Some(Component::Mean),
            _ => None,
        };
        let source = scene.arterial.iter().position(|a| a.id == id.trim());
        if let (Some(c), Some(i)) = (component, source) {
            return Ok(Input::Arterial(i, c));
        }
    }
    let ids: Vec<String> = scene
        .arterial
        .iter()
        .map(|a| format!("'{}.mean'", a.id))
        .collect();
    Err(ErrorKind::UnknownChannel {
        name: name.to_owned(),
        offered: format!(
            "use an arterial source's id with .systolic, .diastolic or .mean ({}), or a \
             reading's name ({})",
            if ids.is_empty() {
                "the case has no arterial source".to_owned()
            } else {
                ids.join(", ")
            },
            Quantity::ALL.map(Quantity::key).join(", ")
        ),
    })
}

/// How a reading's samples fill time: cuffs and values read by eye are
/// intermittent, lines and sensors continuous.
pub fn sampling_of(scene: &Scene, input: Input) -> Sampling {
    let method = match input {
        Input::Arterial(i, _) => scene.arterial.get(i).map(|a| a.method),
        Input::Reading(q) => scene.readings.get(&q).and_then(|r| r.method),
    };
    match method {
        Some(Method::Transducer | Method::Probe) => Sampling::Interpolated,
        _ => Sampling::Held,
    }
}

/// The accepted range of an input, mmHg.
pub fn input_range(input: Input) -> (f64, f64) {
    match input {
        Input::Arterial(_, c) => c.range_mmhg(),
        Input::Reading(q) => q.range_mmhg(),
    }
}

/// A source with systolic and diastolic channels but no mean gets a mean
/// channel estimated at the times both were sampled, by the case's rule.
pub(super) fn add_estimated_means(scene: &Scene, channels: &mut Vec<Channel>) {
    for (i, a) in scene.arterial.iter().enumerate() {
        let find = |c: Component| channels.iter().find(|ch| ch.input == Input::Arterial(i, c));
        if find(Component::Mean).is_some() {
            continue;
        }
        let (Some(s), Some(d)) = (find(Component::Systolic), find(Component::Diastolic)) else {
            continue;
        };
        let diastolic = map_of(d.t_s.iter().zip(&d.values).map(|(t, v)| (t.to_bits(), *v)));
        let (mut t_s, mut values) = (Vec::new(), Vec::new());
        for (t, sys) in s.t_s.iter().zip(&s.values) {
            if let Some(dia) = diastolic.get(&t.to_bits()).filter(|dia| **dia < *sys) {
                t_s.push(*t);
                values.push(scene.mean_rule.estimate(*sys, *dia));
            }
        }
        let channel = Channel {
            input: Input::Arterial(i, Component::Mean),
            name: format!("{}.mean", a.id),
            unit: s.unit,
            sampling: s.sampling,
            t_s,
            values,
            estimated: true,
        };
        channels.push(channel);
    }
}

//! The checked record: its rules, positions over time and channels, read
//! from a case's timeline with every problem named by its field, and written
//! back.

use super::channel::{add_estimated_means, channel_input, input_range, sampling_of, Channel};
use super::clock;
use super::rules::{
    rule, Rules, DEFAULT_GAP_MAX_S, DEFAULT_HOLD_MAX_S, DEFAULT_MIN_EPISODE_S, MAX_SAMPLES,
    MAX_SPAN_S,
};
use crate::case::{ChannelSpec, PositionChangeSpec, RulesSpec, TimelineSpec};
use crate::error::{Error, ErrorKind, Errors};
use crate::geometry::Position;
use crate::scene::Scene;
use crate::units::to_mmhg;

/// A checked record.
#[derive(Clone, Debug, PartialEq)]
pub struct Timeline {
    /// Clock time of the start, `HH:MM:SS`, if known.
    pub clock_start: Option<String>,
    /// Gap and episode rules.
    pub rules: Rules,
    /// Positions from the start: `(from_s, position)`, the first at 0.
    pub positions: Vec<(f64, Position)>,
    /// Sampled channels.
    pub channels: Vec<Channel>,
}

impl Timeline {
    /// Checks a record against its case.
    ///
    /// # Errors
    /// Every problem, naming its field (`timeline.channels[1].values[17]`):
    /// unknown channels, repeated channels, times out of order, values out
    /// of range, position changes without a body height.
    pub fn from_spec(spec: &TimelineSpec, scene: &Scene) -> Result<Timeline, Errors> {
        let mut errors = Errors::default();
        let rules = Rules {
            hold_max_s: rule(
                "timeline.rules.hold_max_s",
                spec.rules.hold_max_s,
                DEFAULT_HOLD_MAX_S,
                3600.0,
                &mut errors,
            ),
            gap_max_s: rule(
                "timeline.rules.gap_max_s",
                spec.rules.gap_max_s,
                DEFAULT_GAP_MAX_S,
                3600.0,
                &mut errors,
            ),
            min_episode_s: rule(
                "timeline.rules.min_episode_s",
                spec.rules.min_episode_s,
                DEFAULT_MIN_EPISODE_S,
                3600.0,
                &mut errors,
            ),
        };
        if let Some(clock) = &spec.clock_start {
            if clock::time_of_day(clock).is_none() {
                errors.push(Error::new(
                    "timeline.clock_start",
                    ErrorKind::ClockTime {
                        text: clock.clone(),
                    },
                ));
            }
        }

        let mut positions = Vec::new();
        if let Some(p) = &scene.position {
            positions.push((0.0, p.clone()));
        }
        let mut last = 0.0;
        for (k, PositionChangeSpec { at_s, position }) in spec.positions.iter().enumerate() {
            let field = format!("timeline.positions[{k}]");
            if scene.body.is_none() || scene.position.is_none() {
                errors.push(Error::missing(
                    field.clone(),
                    "position changes need the case's position and patient height",
                ));
                continue;
            }
            if !(at_s.is_finite() && *at_s > last && *at_s <= MAX_SPAN_S) {
                errors.push(Error::inconsistent(
                    format!("{field}.at_s"),
                    format!(
                        "{at_s} s: position changes come after the start and after each other, \
                         within {MAX_SPAN_S} s"
                    ),
                ));
                continue;
            }
            last = *at_s;
            match position.resolve(&format!("{field}.position")) {
                Ok(p) => positions.push((*at_s, p)),
                Err(e) => errors.extend(e),
            }
        }

        let total: usize = spec.channels.iter().map(|c| c.t_s.len()).sum();
        if total > MAX_SAMPLES {
            errors.push(Error::new(
                "timeline.channels",
                ErrorKind::OverLimit {
                    found: total,
                    what: "samples".to_owned(),
                    max: MAX_SAMPLES,
                },
            ));
            return Err(errors);
        }
        let mut channels: Vec<Channel> = Vec::new();
        for (k, c) in spec.channels.iter().enumerate() {
            if let Some(ch) = check_channel(scene, k, c, &channels, &mut errors) {
                channels.push(ch);
            }
        }
        if errors.is_empty() {
            add_estimated_means(scene, &mut channels);
        }
        errors.into_result(Timeline {
            clock_start: spec.clock_start.clone(),
            rules,
            positions,
            channels,
        })
    }

    /// The record as it is written in a case.
    pub fn to_spec(&self) -> TimelineSpec {
        TimelineSpec {
            clock_start: self.clock_start.clone(),
            rules: RulesSpec {
                hold_max_s: Some(self.rules.hold_max_s),
                gap_max_s: Some(self.rules.gap_max_s),
                min_episode_s: Some(self.rules.min_episode_s),
            },
            positions: self
                .positions
                .iter()
                .skip(1)
                .map(|(at_s, p)| PositionChangeSpec {
                    at_s: *at_s,
                    position: position_spec(p),
                })
                .collect(),
            channels: self
                .channels
                .iter()
                .filter(|c| !c.estimated)
                .map(|c| ChannelSpec {
                    channel: c.name.clone(),
                    unit: c.unit,
                    t_s: c.t_s.clone(),
                    values: c.values.iter().map(|v| c.unit.value(*v)).collect(),
                })
                .collect(),
        }
    }

    /// First and last event time, seconds.
    pub fn span(&self) -> Option<(f64, f64)> {
        let times = self
            .channels
            .iter()
            .flat_map(|c| c.t_s.first().into_iter().chain(c.t_s.last()))
            .chain(self.positions.iter().skip(1).map(|(t, _)| t));
        let mut span: Option<(f64, f64)> = None;
        for t in times {
            span = Some(match span {
                None => (*t, *t),
                Some((a, b)) => (a.min(*t), b.max(*t)),
            });
        }
        span
    }
}

fn position_spec(p: &Position) -> crate::geometry::PositionSpec {
    crate::geometry::PositionSpec {
        posture: p.posture,
        backrest_deg: Some(p.angles.backrest_deg),
        tilt_deg: Some(p.angles.tilt_deg),
        neck_flexion_deg: Some(p.angles.neck_flexion_deg),
        hip_flexion_deg: Some(p.angles.hip_flexion_deg),
        knee_flexion_deg: Some(p.angles.knee_flexion_deg),
        left_arm: Some(p.left_arm),
        right_arm: Some(p.right_arm),
    }
}

fn check_channel(
    scene: &Scene,
    k: usize,
    c: &ChannelSpec,
    earlier: &[Channel],
    errors: &mut Errors,
) -> Option<Channel> {
    let field = format!("timeline.channels[{k}]");
    let input = match channel_input(scene, &c.channel) {
        Ok(input) => input,
        Err(kind) => {
            errors.push(Error::new(format!("{field}.channel"), kind));
            return None;
        }
    };
    if earlier.iter().any(|e| e.input == input) {
        errors.push(Error::new(
            format!("{field}.channel"),
            ErrorKind::Duplicate {
                name: c.channel.clone(),
            },
        ));
        return None;
    }
    if c.t_s.len() != c.values.len() {
        errors.push(Error::inconsistent(
            field,
            format!(
                "{} times but {} values: each sample needs both",
                c.t_s.len(),
                c.values.len()
            ),
        ));
        return None;
    }
    let before = errors.len();
    let mut last = f64::NEG_INFINITY;
    for (j, t) in c.t_s.iter().enumerate() {
        if !(t.is_finite() && *t >= 0.0 && *t <= MAX_SPAN_S && *t > last) {
            errors.push(Error::inconsistent(
                format!("{field}.t_s[{j}]"),
                format!("{t} s: sample times must increase, from 0 to at most {MAX_SPAN_S} s"),
            ));
            break;
        }
        last = *t;
    }
    let (lo, hi) = input_range(input);
    let mut values = Vec::with_capacity(c.values.len());
    for (j, v) in c.values.iter().enumerate() {
        let p = c.unit.pressure(*v);
        if !(to_mmhg(p).is_finite() && (lo..=hi).contains(&to_mmhg(p))) {
            errors.push(Error::new(
                format!("{field}.values[{j}]"),
                ErrorKind::OutOfRange {
                    value: format!("{v} {}", c.unit),
                    min: format!("{lo} mmHg"),
                    max: format!("{hi} mmHg"),
                    hint: None,
                },
            ));
            if errors.len() - before > 20 {
                break;
            }
        }
        values.push(p);
    }
    if errors.len() > before {
        return None;
    }
    Some(Channel {
        input,
        name: c.channel.trim().to_owned(),
        unit: c.unit,
        sampling: sampling_of(scene, input),
        t_s: c.t_s.clone(),
        values,
        estimated: false,
    })
}

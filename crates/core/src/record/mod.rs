//! Records over a case: timestamped readings and position changes, the
//! organ-level series they give, and the exposure outside each target.
//!
//! Intermittent readings (a cuff, a value read off a scale) are held until
//! the next one, for at most `hold_max_s`; continuous samples (a line, a tip
//! sensor) are interpolated across gaps of at most `gap_max_s`. Beyond
//! those the time is unobserved, never assumed. Between two consecutive
//! events every input is constant or linear, so each metric is linear too
//! and time and area outside a threshold are computed exactly per interval.
//! Metrics come from the same formulas as a single check, as [`Form`]s
//! worked out once per position.

pub mod clock;
pub mod csv;

use std::collections::BTreeMap;

use serde::Serialize;

use crate::case::{Case, ChannelSpec, PositionChangeSpec, RulesSpec, TimelineSpec};
use crate::error::{Error, ErrorKind, Errors};
use crate::evaluate::{self, organ_level, Ctx, Form, Input};
use crate::geometry::Position;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, Method, Quantity};
use crate::scene::Scene;
use crate::target::Target;
use crate::units::{to_mmhg, Pressure, PressureUnit};

/// Default hold of an intermittent reading, seconds: a cuff cycling every
/// 2.5-5 minutes, with one missed cycle allowed (common practice, assumed).
pub const DEFAULT_HOLD_MAX_S: f64 = 600.0;
/// Default longest gap interpolated between continuous samples, seconds:
/// a flush or a blood draw (assumed).
pub const DEFAULT_GAP_MAX_S: f64 = 60.0;
/// Default shortest episode counted, seconds: none ignored.
pub const DEFAULT_MIN_EPISODE_S: f64 = 0.0;
/// The longest record accepted, seconds (72 hours).
pub const MAX_SPAN_S: f64 = 72.0 * 3600.0;
/// The most samples accepted in one record.
pub const MAX_SAMPLES: usize = 2_000_000;

/// How gaps and short episodes are treated.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Rules {
    /// How long an intermittent reading is held, seconds.
    pub hold_max_s: f64,
    /// The longest gap continuous samples are interpolated across, seconds.
    pub gap_max_s: f64,
    /// Episodes shorter than this are ignored, seconds.
    pub min_episode_s: f64,
}

impl Default for Rules {
    fn default() -> Self {
        Rules {
            hold_max_s: DEFAULT_HOLD_MAX_S,
            gap_max_s: DEFAULT_GAP_MAX_S,
            min_episode_s: DEFAULT_MIN_EPISODE_S,
        }
    }
}

impl Rules {
    /// The rules in words, for every exposure result.
    pub fn describe(&self) -> String {
        let ignored = if self.min_episode_s > 0.0 {
            format!(
                "episodes shorter than {} ignored",
                duration_words(self.min_episode_s)
            )
        } else {
            "no episode ignored".to_owned()
        };
        format!(
            "intermittent readings (cuff, scale) held until the next for at most {}; continuous \
             samples interpolated across gaps of at most {}; longer gaps are unobserved time, \
             not assumed; readings without samples held at the case's value throughout; {ignored}",
            duration_words(self.hold_max_s),
            duration_words(self.gap_max_s),
        )
    }
}

fn duration_words(s: f64) -> String {
    if s >= 60.0 && (s % 60.0).abs() < 1e-9 {
        format!("{:.0} min", s / 60.0)
    } else {
        format!("{s:.0} s")
    }
}

/// Elapsed seconds as `h:mm:ss`.
pub fn elapsed_words(s: f64) -> String {
    let total = s.max(0.0).round() as u64;
    format!(
        "{}:{:02}:{:02}",
        total / 3600,
        (total / 60) % 60,
        total % 60
    )
}

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

/// The name of an input as a channel name.
pub fn channel_name(scene: &Scene, input: Input) -> String {
    match input {
        Input::Arterial(i, c) => format!(
            "{}.{}",
            scene.arterial.get(i).map_or("?", |a| a.id.as_str()),
            c.label()
        ),
        Input::Reading(q) => q.key().to_owned(),
    }
}

/// The input a channel name refers to in this case.
///
/// # Errors
/// A name that is neither `<arterial id>.<systolic|diastolic|mean>` nor a
/// reading's name, with the names the case offers.
pub fn channel_input(scene: &Scene, name: &str) -> Result<Input, String> {
    let name = name.trim();
    if let Some(q) = Quantity::ALL.into_iter().find(|q| q.key() == name) {
        return if scene.readings.contains_key(&q) {
            Ok(Input::Reading(q))
        } else {
            Err(format!(
                "'{name}' has no reading in the case to give its method and level; add \
                 readings.{name} (its value there is used where the record has no sample)"
            ))
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
    Err(format!(
        "'{name}' is not a channel of this case; use an arterial source's id with .systolic, \
         .diastolic or .mean ({}), or a reading's name ({})",
        if ids.is_empty() {
            "the case has no arterial source".to_owned()
        } else {
            ids.join(", ")
        },
        Quantity::ALL.map(Quantity::key).join(", ")
    ))
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

fn rule(field: &str, value: Option<f64>, default: f64, max: f64, errors: &mut Errors) -> f64 {
    match value {
        None => default,
        Some(v) if v.is_finite() && (0.0..=max).contains(&v) => v,
        Some(v) => {
            errors.push(Error::new(
                field,
                ErrorKind::OutOfRange {
                    value: format!("{v} s"),
                    min: "0 s".into(),
                    max: format!("{max} s"),
                    hint: None,
                },
            ));
            default
        }
    }
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
                    ErrorKind::Shape {
                        message: format!("'{clock}' is not a clock time like 08:15:00"),
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
                Err(e) => errors.0.extend(e.0),
            }
        }

        let total: usize = spec.channels.iter().map(|c| c.t_s.len()).sum();
        if total > MAX_SAMPLES {
            errors.push(Error::new(
                "timeline.channels",
                ErrorKind::Shape {
                    message: format!("{total} samples; a record holds at most {MAX_SAMPLES}"),
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
        Err(message) => {
            errors.push(Error::new(
                format!("{field}.channel"),
                ErrorKind::UnknownReference { name: message },
            ));
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
    let before = errors.0.len();
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
            if errors.0.len() - before > 20 {
                break;
            }
        }
        values.push(p);
    }
    if errors.0.len() > before {
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

/// A source with systolic and diastolic channels but no mean gets a mean
/// channel estimated at the times both were sampled, by the case's rule.
fn add_estimated_means(scene: &Scene, channels: &mut Vec<Channel>) {
    for (i, a) in scene.arterial.iter().enumerate() {
        let find = |c: Component| channels.iter().find(|ch| ch.input == Input::Arterial(i, c));
        if find(Component::Mean).is_some() {
            continue;
        }
        let (Some(s), Some(d)) = (find(Component::Systolic), find(Component::Diastolic)) else {
            continue;
        };
        let diastolic: BTreeMap<u64, Pressure> = d
            .t_s
            .iter()
            .zip(&d.values)
            .map(|(t, v)| (t.to_bits(), *v))
            .collect();
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

/// Exposure outside one target over a record.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TargetExposure {
    /// The organ.
    pub organ: Organ,
    /// The metric.
    pub metric: Metric,
    /// The metric's name.
    pub label: &'static str,
    /// The target in words.
    pub target: String,
    /// The threshold, mmHg.
    pub threshold_mmhg: f64,
    /// `true` for a floor (time below counts), `false` for a ceiling.
    pub at_least: bool,
    /// Time with every needed input observed, minutes.
    pub observed_min: f64,
    /// Time outside the target (below a floor, above a ceiling), minutes.
    pub outside_min: f64,
    /// That time as a percentage of observed time.
    pub outside_percent: f64,
    /// Area between the curve and the threshold while outside, mmHg·min.
    pub area_mmhg_min: f64,
    /// Time-weighted average outside: the area divided by observed time, mmHg.
    pub twa_mmhg: f64,
    /// The longest continuous episode outside, minutes.
    pub longest_episode_min: f64,
    /// How many episodes were counted.
    pub episodes: usize,
    /// How many shorter episodes were ignored.
    pub ignored_episodes: usize,
    /// The worst value observed (lowest for a floor, highest for a ceiling), mmHg.
    pub worst_mmhg: Option<f64>,
    /// When it was, seconds from the start.
    pub worst_at_s: Option<f64>,
    /// Assumed values it used, held throughout.
    pub assumed: Vec<Quantity>,
    /// The summary in words.
    pub words: String,
}

/// A target that could not be followed through the record, and why.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct NotAnalysed {
    /// The target in words.
    pub target: String,
    /// Why.
    pub why: String,
}

/// Exposure over a record.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Exposure {
    /// The rules applied, in words.
    pub rules: String,
    /// Where the definitions come from.
    pub definitions: &'static str,
    /// The analysed window, seconds from the start.
    pub from_s: f64,
    /// Its end.
    pub to_s: f64,
    /// Clock time of the record's start, if known.
    pub clock_start: Option<String>,
    /// One entry per target followed.
    pub targets: Vec<TargetExposure>,
    /// Targets not followed.
    pub not_analysed: Vec<NotAnalysed>,
}

/// The published definitions behind the exposure numbers.
pub const DEFINITIONS: &str = "time and area below a threshold as in studies of intraoperative \
    hypotension (e.g. Salmasi et al., Anesthesiology 2017); time-weighted average = area divided \
    by the observed time";

/// A target followed through the record: its forms per position segment.
struct Followed<'t> {
    target: &'t Target,
    threshold: Pressure,
    at_least: bool,
    forms: Vec<Option<Form>>,
    assumed: Vec<Quantity>,
}

/// The targets of a scene that a record can follow, with their forms in
/// each position, and those it cannot with the reason.
struct Plan<'t> {
    starts: Vec<f64>,
    followed: Vec<Followed<'t>>,
    not_analysed: Vec<NotAnalysed>,
}

fn plan<'t>(scene: &'t Scene, timeline: &Timeline) -> Plan<'t> {
    let segments: Vec<(f64, Scene)> = if timeline.positions.is_empty() {
        vec![(0.0, scene.clone())]
    } else {
        timeline
            .positions
            .iter()
            .enumerate()
            .map(|(k, (at, p))| {
                let mut s = scene.clone();
                s.position = Some(p.clone());
                // Measured heights belong to the position they were taken in.
                if k > 0 {
                    s.measured.clear();
                }
                (*at, s)
            })
            .collect()
    };
    let contexts: Vec<Ctx<'_>> = segments.iter().map(|(_, s)| Ctx::new(s)).collect();
    let base = Ctx::new(scene);
    let has_channel = |input: Input| timeline.channels.iter().any(|c| c.input == input);
    let mut followed = Vec::new();
    let mut not_analysed = Vec::new();
    for target in &scene.targets {
        let not = |why: String| NotAnalysed {
            target: target.describe(),
            why,
        };
        let level = match organ_level(&base, target.organ) {
            Ok(level) => level,
            Err(m) => {
                not_analysed.push(not(format!("needs {}", m.0.join("; "))));
                continue;
            }
        };
        if let Err(m) = evaluate::metric(&base, target.organ, target.metric, None) {
            not_analysed.push(not(format!("needs {}", m.0.join("; "))));
            continue;
        }
        let (threshold, at_least) = match crate::check::threshold(&base, level, target) {
            Ok((t, at_least, _)) => (t, at_least),
            Err(m) => {
                not_analysed.push(NotAnalysed {
                    target: target.describe(),
                    why: format!("needs {}", m.0.join("; ")),
                });
                continue;
            }
        };
        let mut assumed = Vec::new();
        let forms: Vec<Option<Form>> = contexts
            .iter()
            .map(|ctx| {
                let (form, used) = form_for(ctx, target, &has_channel)?;
                assumed.extend(used);
                Some(form)
            })
            .collect();
        assumed.sort();
        assumed.dedup();
        let uses_record = forms.iter().flatten().any(|f| f.inputs().any(has_channel));
        if uses_record {
            followed.push(Followed {
                target,
                threshold,
                at_least,
                forms,
                assumed,
            });
        } else {
            not_analysed.push(NotAnalysed {
                target: target.describe(),
                why: "none of its readings has samples in the record".to_owned(),
            });
        }
    }
    Plan {
        starts: segments.iter().map(|(t, _)| *t).collect(),
        followed,
        not_analysed,
    }
}

/// Visits every interval between consecutive events in `[from, to]` with
/// each followed metric's values at its two ends (`None` where unobserved).
fn walk<F>(scene: &Scene, timeline: &Timeline, plan: &Plan<'_>, from: f64, to: f64, mut visit: F)
where
    F: FnMut(f64, f64, &[Option<(Pressure, Pressure)>]),
{
    let rules = timeline.rules;
    let mut times: Vec<f64> = vec![from, to];
    for ch in &timeline.channels {
        times.extend(ch.t_s.iter().copied());
        if ch.sampling == Sampling::Held {
            times.extend(ch.t_s.iter().map(|t| t + rules.hold_max_s));
        }
    }
    times.extend(plan.starts.iter().copied());
    times.retain(|t| *t >= from && *t <= to);
    times.sort_by(f64::total_cmp);
    times.dedup_by(|a, b| (*a - *b).abs() < 1e-9);

    let channel_of = |input: Input| timeline.channels.iter().position(|c| c.input == input);
    let mut segment = 0;
    let mut values_a: Vec<Option<Pressure>> = vec![None; timeline.channels.len()];
    let mut values_b = values_a.clone();
    let mut ends: Vec<Option<(Pressure, Pressure)>> = vec![None; plan.followed.len()];
    for pair in times.windows(2) {
        let &[a, b] = pair else { continue };
        while plan.starts.get(segment + 1).is_some_and(|t| *t <= a) {
            segment += 1;
        }
        let mid = (a + b) / 2.0;
        for (k, ch) in timeline.channels.iter().enumerate() {
            if let (Some(va), Some(vb)) = (values_a.get_mut(k), values_b.get_mut(k)) {
                *va = sample(ch, &rules, mid, a);
                *vb = sample(ch, &rules, mid, b);
            }
        }
        let lookup = |values: &[Option<Pressure>], input: Input| match channel_of(input) {
            Some(k) => values.get(k).copied().flatten(),
            None => fallback(scene, input),
        };
        for (f, end) in plan.followed.iter().zip(ends.iter_mut()) {
            *end = f
                .forms
                .get(segment)
                .and_then(Option::as_ref)
                .and_then(|form| {
                    Some((
                        form.eval(|i| lookup(&values_a, i))?,
                        form.eval(|i| lookup(&values_b, i))?,
                    ))
                });
        }
        visit(a, b, &ends);
    }
}

/// An episode outside a target: its duration (s) and area (mmHg·s).
type Episode = (f64, f64);

#[derive(Default)]
struct Tally {
    observed_s: f64,
    episodes: Vec<Episode>,
    open: Option<Episode>,
    worst: Option<(f64, f64)>,
}

impl Tally {
    fn close(&mut self) {
        if let Some(e) = self.open.take() {
            self.episodes.push(e);
        }
    }

    /// Adds one linear piece over `d` seconds; `fa` and `fb` say how far
    /// outside the target its ends are (positive outside). An episode
    /// continues into the next piece only if it reaches this piece's end.
    fn add(&mut self, d: f64, fa: f64, fb: f64, worst: (f64, f64)) {
        self.observed_s += d;
        if self.worst.is_none_or(|(w, _)| worst.0 > w) {
            self.worst = Some(worst);
        }
        let (time, area, from_start, to_end) = if fa > 0.0 && fb > 0.0 {
            (d, d * (fa + fb) / 2.0, true, true)
        } else if fa <= 0.0 && fb <= 0.0 {
            (0.0, 0.0, false, false)
        } else if fa > 0.0 {
            let t = d * fa / (fa - fb);
            (t, t * fa / 2.0, true, false)
        } else {
            let t = d * fb / (fb - fa);
            (t, t * fb / 2.0, false, true)
        };
        if !from_start || time <= 0.0 {
            self.close();
        }
        if time > 0.0 {
            let (dur, ar) = self.open.unwrap_or((0.0, 0.0));
            self.open = Some((dur + time, ar + area));
        }
        if !to_end {
            self.close();
        }
    }
}

/// The value of a channel over the interval around `mid`, at `x`; `None`
/// when the interval is unobserved for it.
fn sample(ch: &Channel, rules: &Rules, mid: f64, x: f64) -> Option<Pressure> {
    let k = ch.t_s.partition_point(|t| *t <= mid).checked_sub(1)?;
    let (t0, v0) = (*ch.t_s.get(k)?, *ch.values.get(k)?);
    match ch.sampling {
        Sampling::Held => (mid - t0 <= rules.hold_max_s).then_some(v0),
        Sampling::Interpolated => {
            let (t1, v1) = (*ch.t_s.get(k + 1)?, *ch.values.get(k + 1)?);
            if t1 - t0 > rules.gap_max_s {
                return None;
            }
            let w = (x - t0) / (t1 - t0);
            Some(v0 + (v1 - v0) * w)
        }
    }
}

/// The static value of an input in the case, used when it has no channel.
/// Arterial inputs never fall back: a record is about how they changed.
fn fallback(scene: &Scene, input: Input) -> Option<Pressure> {
    match input {
        Input::Arterial(..) => None,
        Input::Reading(q) => scene.readings.get(&q).map(|r| r.value),
    }
}

/// Follows every target of `scene` through `timeline`, within `window`
/// (seconds from the start; the record's span when `None`).
///
/// # Example
/// ```
/// use plumbline_core::{case::Case, record, scene::Scene};
/// let case = Case::from_json(plumbline_core::demo::CASE_JSON).unwrap();
/// let scene = Scene::from_case(&case).unwrap();
/// let csv = "elapsed_s,radial line.mean [mmHg]\n0,70\n60,60\n";
/// let spec = record::csv::import(csv, &scene).unwrap();
/// let timeline = record::Timeline::from_spec(&spec, &scene).unwrap();
/// let exposure = record::analyze(&scene, &timeline, None);
/// assert!(!exposure.targets.is_empty());
/// ```
pub fn analyze(scene: &Scene, timeline: &Timeline, window: Option<(f64, f64)>) -> Exposure {
    let (from, to) = window.unwrap_or_else(|| timeline.span().unwrap_or((0.0, 0.0)));
    let plan = plan(scene, timeline);
    let mut tallies: Vec<Tally> = plan.followed.iter().map(|_| Tally::default()).collect();
    walk(scene, timeline, &plan, from, to, |a, b, ends| {
        for ((f, tally), end) in plan.followed.iter().zip(tallies.iter_mut()).zip(ends) {
            let Some((ma, mb)) = end else {
                tally.close();
                continue;
            };
            let outside = |m: &Pressure| {
                let v = to_mmhg(*m) - to_mmhg(f.threshold);
                if f.at_least {
                    -v
                } else {
                    v
                }
            };
            let (fa, fb) = (outside(ma), outside(mb));
            let worst = if fa >= fb { (fa, a) } else { (fb, b) };
            tally.add(b - a, fa, fb, worst);
        }
    });
    let targets = plan
        .followed
        .iter()
        .zip(tallies)
        .map(|(f, mut t)| {
            t.close();
            summarize(f, t, &timeline.rules)
        })
        .collect();
    Exposure {
        rules: timeline.rules.describe(),
        definitions: DEFINITIONS,
        from_s: from,
        to_s: to,
        clock_start: timeline.clock_start.clone(),
        targets,
        not_analysed: plan.not_analysed,
    }
}

/// The form of a target's metric in one position, and the assumed values
/// it uses, driven by an arterial source that has samples: the primary one
/// if it does, else the first.
fn form_for(
    ctx: &Ctx<'_>,
    target: &Target,
    has_channel: &dyn Fn(Input) -> bool,
) -> Option<(Form, Vec<Quantity>)> {
    let scene = ctx.scene();
    let primary = evaluate::metric(ctx, target.organ, target.metric, None).ok()?;
    let Input::Arterial(_, component) = primary.form.lead.input else {
        return Some((primary.form, primary.assumed));
    };
    if has_channel(primary.form.lead.input) {
        return Some((primary.form, primary.assumed));
    }
    (0..scene.arterial.len())
        .filter(|i| has_channel(Input::Arterial(*i, component)))
        .find_map(|i| evaluate::metric(ctx, target.organ, target.metric, Some(i)).ok())
        .filter(|v| has_channel(v.form.lead.input))
        .map(|v| (v.form, v.assumed))
}

fn summarize(f: &Followed<'_>, t: Tally, rules: &Rules) -> TargetExposure {
    let (kept, ignored): (Vec<Episode>, Vec<Episode>) = t
        .episodes
        .iter()
        .partition(|(dur, _)| *dur >= rules.min_episode_s);
    // An empty sum of floats is -0.0; adding 0.0 makes it 0, so a target
    // never outside reads "0.0 min", not "-0.0 min".
    let outside_s: f64 = kept.iter().map(|(d, _)| d).sum::<f64>() + 0.0;
    let area_s: f64 = kept.iter().map(|(_, a)| a).sum::<f64>() + 0.0;
    let longest_s = kept.iter().map(|(d, _)| *d).fold(0.0, f64::max);
    let observed_min = t.observed_s / 60.0;
    let outside_min = outside_s / 60.0;
    let area = area_s / 60.0;
    let percent = if t.observed_s > 0.0 {
        100.0 * outside_s / t.observed_s
    } else {
        0.0
    };
    let twa = if observed_min > 0.0 {
        area / observed_min
    } else {
        0.0
    };
    let thr = to_mmhg(f.threshold);
    let worst = t.worst.map(|(excess, at)| {
        let value = if f.at_least {
            thr - excess
        } else {
            thr + excess
        };
        (value, at)
    });
    let side = if f.at_least { "below" } else { "above" };
    let extreme = if f.at_least { "lowest" } else { "highest" };
    let label = f.target.organ.metric_label(f.target.metric);
    let words = if observed_min <= 0.0 {
        format!("{label}: no observed time")
    } else {
        let mut w = format!(
            "{label} {side} {thr:.0} mmHg for {outside_min:.1} min of {observed_min:.1} min \
             observed ({percent:.0}%), area {area:.0} mmHg·min, time-weighted average \
             {twa:.1} mmHg, longest episode {:.1} min",
            longest_s / 60.0
        );
        if let Some((v, at)) = worst {
            w.push_str(&format!("; {extreme} {v:.0} mmHg at {}", elapsed_words(at)));
        }
        for q in &f.assumed {
            w.push_str(&format!("; uses an ASSUMED {}", q.label()));
        }
        w
    };
    TargetExposure {
        organ: f.target.organ,
        metric: f.target.metric,
        label,
        target: f.target.describe(),
        threshold_mmhg: thr,
        at_least: f.at_least,
        observed_min,
        outside_min,
        outside_percent: percent,
        area_mmhg_min: area,
        twa_mmhg: twa,
        longest_episode_min: longest_s / 60.0,
        episodes: kept.len(),
        ignored_episodes: ignored.len(),
        worst_mmhg: worst.map(|(v, _)| v),
        worst_at_s: worst.map(|(_, at)| at),
        assumed: f.assumed.clone(),
        words,
    }
}

/// The organ-level series as CSV: one row per event time, one column per
/// followed target's metric, in mmHg, blank where unobserved. Each row
/// holds the value at the start of the interval that begins there; the last
/// row the value at the end of the last interval.
pub fn series_csv(scene: &Scene, timeline: &Timeline) -> String {
    let (from, to) = timeline.span().unwrap_or((0.0, 0.0));
    let plan = plan(scene, timeline);
    let mut columns: Vec<(Organ, Metric)> = Vec::new();
    for f in &plan.followed {
        let key = (f.target.organ, f.target.metric);
        if !columns.contains(&key) {
            columns.push(key);
        }
    }
    let column_of: Vec<usize> = plan
        .followed
        .iter()
        .map(|f| {
            columns
                .iter()
                .position(|k| *k == (f.target.organ, f.target.metric))
                .unwrap_or(0)
        })
        .collect();
    let mut out = String::from("elapsed_s");
    for (organ, metric) in &columns {
        out.push_str(&format!(",{}.{} [mmHg]", organ.key(), metric.key()));
    }
    out.push('\n');
    let cell = |v: Option<Pressure>| v.map_or(String::new(), |p| format!("{:.2}", to_mmhg(p)));
    let mut last: Option<(f64, Vec<Option<Pressure>>)> = None;
    walk(scene, timeline, &plan, from, to, |a, b, ends| {
        let mut start = vec![None; columns.len()];
        let mut end = vec![None; columns.len()];
        for (k, e) in column_of.iter().zip(ends) {
            if let (Some(s), Some(x), Some((ma, mb))) = (start.get_mut(*k), end.get_mut(*k), e) {
                *s = Some(*ma);
                *x = Some(*mb);
            }
        }
        out.push_str(&format!("{a}"));
        for v in &start {
            out.push(',');
            out.push_str(&cell(*v));
        }
        out.push('\n');
        last = Some((b, end));
    });
    if let Some((b, end)) = last {
        out.push_str(&format!("{b}"));
        for v in &end {
            out.push(',');
            out.push_str(&cell(*v));
        }
        out.push('\n');
    }
    out
}

/// One observed stretch of a metric over a record: points joined by
/// straight lines. A held reading replaced by the next gives a step, two
/// points at one time.
#[derive(Clone, Debug, Default, PartialEq, Serialize)]
pub struct Run {
    /// Times, seconds from the start, never decreasing.
    pub t_s: Vec<f64>,
    /// The metric at those times, mmHg.
    pub mmhg: Vec<f64>,
}

/// A followed metric's organ-level values over a record, for drawing.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MetricSeries {
    /// The organ.
    pub organ: Organ,
    /// The metric.
    pub metric: Metric,
    /// The metric's name (`"CPP"`).
    pub label: &'static str,
    /// The observed stretches, in time order; unobserved time lies between
    /// them.
    pub runs: Vec<Run>,
}

/// The organ-level series as data: one entry per followed organ and
/// metric, in the order of [`series_csv`]'s columns and with the same
/// values, over the record's span. Where [`series_csv`] writes one value per
/// event time, this keeps both ends of every interval, so steps and gaps
/// are exact.
///
/// # Example
/// ```
/// use plumbline_core::{case::Case, record, scene::Scene};
/// let case = Case::from_json(plumbline_core::demo::CASE_JSON).unwrap();
/// let scene = Scene::from_case(&case).unwrap();
/// let csv = "elapsed_s,radial line.mean [mmHg]\n0,70\n60,60\n";
/// let spec = record::csv::import(csv, &scene).unwrap();
/// let timeline = record::Timeline::from_spec(&spec, &scene).unwrap();
/// let series = record::series(&scene, &timeline);
/// let map = series.iter().find(|s| s.label == "MAP at the heart").unwrap();
/// assert_eq!(map.runs[0].t_s, vec![0.0, 60.0]);
/// assert_eq!(map.runs[0].mmhg, vec![70.0, 60.0]);
/// ```
pub fn series(scene: &Scene, timeline: &Timeline) -> Vec<MetricSeries> {
    let (from, to) = timeline.span().unwrap_or((0.0, 0.0));
    let plan = plan(scene, timeline);
    let mut out: Vec<MetricSeries> = Vec::new();
    // For each followed target, the series it feeds if it is the first of
    // its organ and metric (later ones give the same values).
    let mut feeds: Vec<Option<usize>> = Vec::new();
    for f in &plan.followed {
        let (organ, metric) = (f.target.organ, f.target.metric);
        if out.iter().any(|s| (s.organ, s.metric) == (organ, metric)) {
            feeds.push(None);
        } else {
            feeds.push(Some(out.len()));
            out.push(MetricSeries {
                organ,
                metric,
                label: organ.metric_label(metric),
                runs: Vec::new(),
            });
        }
    }
    let mut open = vec![false; out.len()];
    walk(scene, timeline, &plan, from, to, |a, b, ends| {
        for (k, end) in feeds.iter().zip(ends) {
            let Some(k) = *k else { continue };
            let (Some(s), Some(is_open)) = (out.get_mut(k), open.get_mut(k)) else {
                continue;
            };
            let Some((ma, mb)) = end else {
                *is_open = false;
                continue;
            };
            if !*is_open {
                s.runs.push(Run::default());
                *is_open = true;
            }
            let Some(run) = s.runs.last_mut() else {
                continue;
            };
            let (va, vb) = (to_mmhg(*ma), to_mmhg(*mb));
            let joins = run.t_s.last() == Some(&a) && run.mmhg.last() == Some(&va);
            if !joins {
                run.t_s.push(a);
                run.mmhg.push(va);
            }
            run.t_s.push(b);
            run.mmhg.push(vb);
        }
    });
    out
}

/// The case with its record's samples replaced by those of a CSV file;
/// position changes and rules already in the case are kept.
///
/// # Errors
/// Problems with the case, or every problem with the file by line and column.
pub fn import_into(case: &Case, csv_text: &str) -> Result<Case, Errors> {
    let scene = Scene::from_case(case)?;
    let imported = csv::import(csv_text, &scene)?;
    let mut next = case.clone();
    let timeline = next.timeline.get_or_insert_with(TimelineSpec::default);
    timeline.channels = imported.channels;
    if imported.clock_start.is_some() {
        timeline.clock_start = imported.clock_start;
    }
    Timeline::from_spec(timeline, &scene)?;
    Ok(next)
}

/// The exposure over a case's record, and its organ-level series as CSV.
///
/// # Errors
/// Problems with the case or its record; a case without a record.
pub fn exposure_of(case: &Case) -> Result<(Exposure, String), Errors> {
    let scene = Scene::from_case(case)?;
    let spec = case
        .timeline
        .as_ref()
        .ok_or_else(|| Error::missing("timeline", "the case has no record to analyse"))?;
    let timeline = Timeline::from_spec(spec, &scene)?;
    Ok((
        analyze(&scene, &timeline, None),
        series_csv(&scene, &timeline),
    ))
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::case::Case;
    use proptest::prelude::*;

    /// A case with one source at heart level, so the organ-level value is
    /// the reading itself, and one floor of 65 mmHg on MAP at the heart.
    fn scene(method: &str) -> Scene {
        let text = format!(
            r#"{{"format": "plumbline-case", "version": 1,
                "arterial": [{{"id": "a", "method": "{method}", "level": "heart", "mean": "70 mmHg"}}],
                "readings": {{"icp": {{"value": "10 mmHg", "method": "probe", "level": "heart"}}}},
                "heights": {{"tragus": "0 cm"}},
                "targets": [{{"organ": "whole_body", "metric": "inflow", "at_least": "65 mmHg"}},
                            {{"organ": "brain", "metric": "surrounding", "at_most": "22 mmHg"}}]}}"#
        );
        Scene::from_case(&Case::from_json(&text).unwrap()).unwrap()
    }

    fn timeline(scene: &Scene, channel: &str, t: &[f64], v: &[f64], rules: RulesSpec) -> Timeline {
        let spec = TimelineSpec {
            rules,
            channels: vec![ChannelSpec {
                channel: channel.to_owned(),
                unit: PressureUnit::MmHg,
                t_s: t.to_vec(),
                values: v.to_vec(),
            }],
            ..TimelineSpec::default()
        };
        Timeline::from_spec(&spec, scene).unwrap()
    }

    fn first(e: &Exposure) -> &TargetExposure {
        &e.targets[0]
    }

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() < 1e-9
    }

    // Definitions: time and area below a threshold as reported in studies of
    // intraoperative hypotension (Salmasi et al., Anesthesiology 2017);
    // time-weighted average = area / observed time. Expected values by hand.

    #[test]
    fn a_held_step_series() {
        let s = scene("cuff");
        // 70 for 5 min, 60 for 5 min, 70 for 5 min: 5 min below 65,
        // area 5 mmHg × 5 min = 25 mmHg·min over 15 min observed.
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 300.0, 600.0, 900.0],
            &[70.0, 60.0, 70.0, 70.0],
            RulesSpec::default(),
        );
        let e = analyze(&s, &tl, None);
        let x = first(&e);
        assert!(close(x.observed_min, 15.0), "{}", x.observed_min);
        assert!(close(x.outside_min, 5.0));
        assert!(close(x.area_mmhg_min, 25.0));
        assert!(close(x.twa_mmhg, 25.0 / 15.0));
        assert!(close(x.outside_percent, 100.0 / 3.0));
        assert!(close(x.longest_episode_min, 5.0));
        assert_eq!(x.episodes, 1);
        assert_eq!(x.worst_mmhg, Some(60.0));
        assert_eq!(x.worst_at_s, Some(300.0));
    }

    #[test]
    fn a_ramp_crossing_the_threshold() {
        let s = scene("transducer");
        // 75 → 55 over 60 s crosses 65 at 30 s: 30 s below, a triangle of
        // 30 s × 10 mmHg / 2 = 150 mmHg·s = 2.5 mmHg·min.
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 60.0],
            &[75.0, 55.0],
            RulesSpec::default(),
        );
        let x = analyze(&s, &tl, None).targets[0].clone();
        assert!(close(x.outside_min, 0.5));
        assert!(close(x.area_mmhg_min, 2.5));
        assert!(close(x.observed_min, 1.0));
        assert_eq!(x.worst_mmhg, Some(55.0));
    }

    #[test]
    fn a_gap_longer_than_the_limit_is_unobserved() {
        let s = scene("transducer");
        // Samples at 0, 10 and 200 s: the 190 s gap exceeds 60 s, so only
        // the first 10 s are observed, all 5 mmHg below.
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 10.0, 200.0],
            &[60.0, 60.0, 60.0],
            RulesSpec::default(),
        );
        let x = analyze(&s, &tl, None).targets[0].clone();
        assert!(close(x.observed_min, 10.0 / 60.0));
        assert!(close(x.outside_min, 10.0 / 60.0));
        assert!(close(x.area_mmhg_min, 5.0 * 10.0 / 60.0));
        // A held cuff reading past its hold limit is unobserved too.
        let c = scene("cuff");
        let rules = RulesSpec {
            hold_max_s: Some(120.0),
            ..RulesSpec::default()
        };
        let tl = timeline(&c, "a.mean", &[0.0, 600.0], &[60.0, 60.0], rules);
        assert!(close(analyze(&c, &tl, None).targets[0].observed_min, 2.0));
    }

    #[test]
    fn short_episodes_can_be_ignored() {
        let s = scene("cuff");
        let t = [0.0, 30.0, 60.0, 300.0, 600.0, 660.0];
        let v = [70.0, 60.0, 70.0, 60.0, 70.0, 70.0];
        let rules = RulesSpec {
            min_episode_s: Some(60.0),
            ..RulesSpec::default()
        };
        let x = analyze(&s, &timeline(&s, "a.mean", &t, &v, rules), None).targets[0].clone();
        assert_eq!((x.episodes, x.ignored_episodes), (1, 1));
        assert!(close(x.outside_min, 5.0));
    }

    #[test]
    fn a_ceiling_counts_time_above() {
        let s = scene("transducer");
        let spec = TimelineSpec {
            channels: vec![
                ChannelSpec {
                    channel: "a.mean".into(),
                    unit: PressureUnit::MmHg,
                    t_s: vec![0.0, 60.0],
                    values: vec![70.0, 70.0],
                },
                ChannelSpec {
                    channel: "icp".into(),
                    unit: PressureUnit::MmHg,
                    t_s: vec![0.0, 60.0],
                    values: vec![20.0, 26.0],
                },
            ],
            ..TimelineSpec::default()
        };
        let tl = Timeline::from_spec(&spec, &s).unwrap();
        let e = analyze(&s, &tl, None);
        let icp = e.targets.iter().find(|t| !t.at_least).unwrap();
        // 20 → 26 crosses 22 at 20 s: 40 s above, area 40 × 4 / 2 = 80 mmHg·s.
        assert!(close(icp.outside_min, 40.0 / 60.0));
        assert!(close(icp.area_mmhg_min, 80.0 / 60.0));
        assert_eq!(icp.worst_mmhg, Some(26.0));
    }

    #[test]
    fn a_target_never_outside_has_no_negative_zero() {
        let s = scene("transducer");
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 60.0],
            &[80.0, 80.0],
            RulesSpec::default(),
        );
        let x = analyze(&s, &tl, None).targets[0].clone();
        for v in [
            x.outside_min,
            x.outside_percent,
            x.area_mmhg_min,
            x.twa_mmhg,
        ] {
            assert!(v == 0.0 && v.is_sign_positive(), "{v}");
        }
        assert!(!x.words.contains("-0"), "{}", x.words);
    }

    #[test]
    fn unknown_channels_and_bad_samples_are_named() {
        let s = scene("cuff");
        let spec = TimelineSpec {
            channels: vec![ChannelSpec {
                channel: "b.mean".into(),
                unit: PressureUnit::MmHg,
                t_s: vec![0.0],
                values: vec![70.0],
            }],
            ..TimelineSpec::default()
        };
        let errors = Timeline::from_spec(&spec, &s).unwrap_err();
        assert_eq!(errors.0[0].field, "timeline.channels[0].channel");
        let spec = TimelineSpec {
            channels: vec![ChannelSpec {
                channel: "a.mean".into(),
                unit: PressureUnit::MmHg,
                t_s: vec![0.0, 0.0],
                values: vec![70.0, 900.0],
            }],
            ..TimelineSpec::default()
        };
        let fields: Vec<String> = Timeline::from_spec(&spec, &s)
            .unwrap_err()
            .iter()
            .map(|e| e.field.clone())
            .collect();
        assert!(fields.contains(&"timeline.channels[0].t_s[1]".to_owned()));
        assert!(fields.contains(&"timeline.channels[0].values[1]".to_owned()));
    }

    #[test]
    fn systolic_and_diastolic_give_an_estimated_mean() {
        let s = scene("cuff");
        let spec = TimelineSpec {
            channels: ["a.systolic", "a.diastolic"]
                .iter()
                .zip([[120.0, 90.0], [60.0, 45.0]])
                .map(|(name, v)| ChannelSpec {
                    channel: (*name).into(),
                    unit: PressureUnit::MmHg,
                    t_s: vec![0.0, 300.0],
                    values: v.to_vec(),
                })
                .collect(),
            ..TimelineSpec::default()
        };
        let tl = Timeline::from_spec(&spec, &s).unwrap();
        let mean = tl.channels.iter().find(|c| c.estimated).unwrap();
        // One-third rule: 60 + 60/3 = 80; 45 + 45/3 = 60.
        assert!(close(to_mmhg(mean.values[0]), 80.0));
        assert!(close(to_mmhg(mean.values[1]), 60.0));
        assert!(tl
            .to_spec()
            .channels
            .iter()
            .all(|c| !c.channel.ends_with("mean")));
    }

    #[test]
    fn series_csv_has_a_row_per_event_and_blank_gaps() {
        let s = scene("transducer");
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 10.0, 200.0],
            &[60.0, 62.0, 64.0],
            RulesSpec::default(),
        );
        let csv = series_csv(&s, &tl);
        let lines: Vec<&str> = csv.lines().collect();
        assert_eq!(lines[0], "elapsed_s,whole_body.inflow [mmHg]");
        assert_eq!(lines[1], "0,60.00");
        assert_eq!(lines[2], "10,");
        assert_eq!(lines[3], "200,");
    }

    #[test]
    fn series_keeps_steps_and_gaps() {
        // A held cuff: 70 then 60 from 300 s, held at most 600 s, then a
        // sample at 1500 s after an unobserved stretch.
        let s = scene("cuff");
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 300.0, 1500.0, 1560.0],
            &[70.0, 60.0, 65.0, 66.0],
            RulesSpec::default(),
        );
        let series = series(&s, &tl);
        assert_eq!(series.len(), 1);
        let map = &series[0];
        assert_eq!((map.organ, map.metric), (Organ::WholeBody, Metric::Inflow));
        assert_eq!(map.runs.len(), 2, "{:?}", map.runs);
        // 600 s is an event too: the first reading's hold ends there.
        assert_eq!(map.runs[0].t_s, vec![0.0, 300.0, 300.0, 600.0, 900.0]);
        assert_eq!(map.runs[0].mmhg, vec![70.0, 70.0, 60.0, 60.0, 60.0]);
        // The record ends at the last sample: its value holds no time.
        assert_eq!(map.runs[1].t_s, vec![1500.0, 1560.0]);
        assert_eq!(map.runs[1].mmhg, vec![65.0, 65.0]);
    }

    #[test]
    fn series_gives_the_values_of_series_csv() {
        let s = scene("transducer");
        let t = [0.0, 10.0, 20.0, 200.0, 230.0];
        let v = [60.0, 62.0, 61.0, 64.0, 70.0];
        let tl = timeline(&s, "a.mean", &t, &v, RulesSpec::default());
        let csv = series_csv(&s, &tl);
        let rows: Vec<(f64, Option<f64>)> = csv
            .lines()
            .skip(1)
            .map(|l| {
                let (t, v) = l.split_once(',').unwrap();
                (t.parse().unwrap(), v.parse().ok())
            })
            .collect();
        let runs = &series(&s, &tl)[0].runs;
        // Every observed row's value is a point of a run at that time.
        for (t, v) in rows.iter().filter_map(|(t, v)| Some((*t, (*v)?))) {
            let found = runs.iter().any(|r| {
                r.t_s
                    .iter()
                    .zip(&r.mmhg)
                    .any(|(rt, rv)| *rt == t && (rv - v).abs() < 0.005)
            });
            assert!(found, "{t} {v} in {runs:?}");
        }
        // The 180 s gap splits the line in two.
        assert_eq!(runs.len(), 2);
        assert_eq!(runs[1].t_s, vec![200.0, 230.0]);
    }

    fn arbitrary_series() -> impl Strategy<Value = (Vec<f64>, Vec<f64>)> {
        prop::collection::vec((1.0..120.0f64, 40.0..110.0f64), 1..40).prop_map(|steps| {
            let mut t = 0.0;
            let mut times = Vec::new();
            let mut values = Vec::new();
            for (dt, v) in steps {
                times.push(t);
                values.push(v);
                t += dt;
            }
            (times, values)
        })
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(64))]

        #[test]
        fn time_outside_never_exceeds_observed_time(
            (t, v) in arbitrary_series(), held in any::<bool>()
        ) {
            let s = scene(if held { "cuff" } else { "transducer" });
            let x = analyze(&s, &timeline(&s, "a.mean", &t, &v, RulesSpec::default()), None);
            let x = &x.targets[0];
            prop_assert!(x.outside_min <= x.observed_min + 1e-9);
            prop_assert!(x.outside_percent <= 100.0 + 1e-9);
            prop_assert!(x.area_mmhg_min >= 0.0);
        }

        #[test]
        fn raising_every_arterial_reading_never_adds_exposure(
            (t, v) in arbitrary_series(), lift in 0.0..30.0f64, held in any::<bool>()
        ) {
            let s = scene(if held { "cuff" } else { "transducer" });
            let raised: Vec<f64> = v.iter().map(|x| (x + lift).min(250.0)).collect();
            let low = analyze(&s, &timeline(&s, "a.mean", &t, &v, RulesSpec::default()), None);
            let high = analyze(&s, &timeline(&s, "a.mean", &t, &raised, RulesSpec::default()), None);
            prop_assert!(high.targets[0].outside_min <= low.targets[0].outside_min + 1e-9);
            prop_assert!(high.targets[0].area_mmhg_min <= low.targets[0].area_mmhg_min + 1e-9);
        }

        #[test]
        fn splitting_a_record_and_summing_the_parts_gives_the_whole(
            (t, v) in arbitrary_series(), cut in 0.0..1.0f64, held in any::<bool>()
        ) {
            let s = scene(if held { "cuff" } else { "transducer" });
            let tl = timeline(&s, "a.mean", &t, &v, RulesSpec::default());
            let (a, b) = tl.span().unwrap();
            let m = a + (b - a) * cut;
            let whole = analyze(&s, &tl, None);
            let left = analyze(&s, &tl, Some((a, m)));
            let right = analyze(&s, &tl, Some((m, b)));
            let sum = |f: fn(&TargetExposure) -> f64| f(&left.targets[0]) + f(&right.targets[0]);
            prop_assert!((sum(|x| x.observed_min) - whole.targets[0].observed_min).abs() < 1e-6);
            prop_assert!((sum(|x| x.outside_min) - whole.targets[0].outside_min).abs() < 1e-6);
            prop_assert!((sum(|x| x.area_mmhg_min) - whole.targets[0].area_mmhg_min).abs() < 1e-6);
        }
    }
}

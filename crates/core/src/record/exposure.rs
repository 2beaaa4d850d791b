//! Exposure outside each target over a record: time, share of observed
//! time, area, time-weighted average, episodes and the worst value, exact
//! per linear piece.

use serde::Serialize;

use super::rules::{elapsed_words, Rules};
use super::timeline::Timeline;
use super::walk::{plan, walk, Followed};
use crate::organ::{Metric, Organ};
use crate::reading::Quantity;
use crate::scene::Scene;
use crate::target::Status;
use crate::text::minutes;
use crate::units::{to_mmhg, Pressure};

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
    /// Met (observed and never outside), below, above (some time outside),
    /// or not observed (no time with every input observed).
    pub status: Status,
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
    /// Always not evaluated: the record cannot follow it.
    pub status: Status,
    /// Why.
    pub why: String,
}

impl NotAnalysed {
    /// A target the record cannot follow, and why.
    pub(super) fn new(target: &crate::target::Target, why: String) -> Self {
        NotAnalysed {
            target: target.describe(),
            status: Status::NotEvaluated,
            why,
        }
    }
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
    hypotension (e.g. Salmasi et al., Anesthesiology 2017); average depth (time-weighted) = area \
    divided by the observed time";

/// What a record adds to the answer's headline, in one sentence: each organ
/// that missed a followed target over time, with its longest time outside
/// any of them, or that none did. The answer's own headline speaks of the
/// readings now; this keeps ten minutes below target from hiding behind a
/// good last reading.
pub fn headline(targets: &[TargetExposure]) -> String {
    let mut missed: Vec<(Organ, f64, f64)> = Vec::new();
    for t in targets.iter().filter(|t| t.status.is_missed()) {
        match missed.iter_mut().find(|m| m.0 == t.organ) {
            Some(m) if t.outside_min > m.1 => *m = (t.organ, t.outside_min, t.observed_min),
            Some(_) => {}
            None => missed.push((t.organ, t.outside_min, t.observed_min)),
        }
    }
    if missed.is_empty() {
        return if targets.iter().any(|t| t.status == Status::Met) {
            "Over the record: no followed target missed.".to_owned()
        } else {
            "Over the record: no followed target observed.".to_owned()
        };
    }
    let organs: Vec<String> = missed
        .iter()
        .map(|(organ, outside, observed)| {
            format!(
                "{} for {} of {}",
                organ.label(),
                minutes(*outside),
                minutes(*observed)
            )
        })
        .collect();
    format!("Over the record, a target missed: {}.", organs.join("; "))
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
             observed ({percent:.0}%), area {area:.0} mmHg·min, average depth {side} target \
             {twa:.1} mmHg (time-weighted), longest episode {:.1} min",
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
    let status = if observed_min <= 0.0 {
        Status::NotObserved
    } else if outside_s <= 0.0 {
        Status::Met
    } else if f.at_least {
        Status::Below
    } else {
        Status::Above
    };
    TargetExposure {
        organ: f.target.organ,
        metric: f.target.metric,
        label,
        target: f.target.describe(),
        status,
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

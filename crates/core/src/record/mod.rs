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

mod channel;
mod exposure;
mod rules;
mod series;
mod timeline;
mod walk;

pub use channel::{
    arterial_channel, case_readings, channel_input, channel_name, input_range, sampling_of,
    Channel, Sampling,
};
pub use exposure::{analyze, headline, Exposure, NotAnalysed, TargetExposure, DEFINITIONS};
pub use rules::{
    elapsed_words, Rules, DEFAULT_GAP_MAX_S, DEFAULT_HOLD_MAX_S, DEFAULT_MIN_EPISODE_S,
    MAX_SAMPLES, MAX_SPAN_S,
};
pub use series::{series, series_csv, MetricSeries, Run};
pub use timeline::Timeline;

use crate::case::{Case, RulesSpec, TimelineSpec};
use crate::error::{Error, Errors};
use crate::scene::Scene;

/// A case and its record, each checked once: what every analysis of the
/// record reads, so the exposure and the series never check twice.
#[derive(Clone, Debug)]
pub struct Recorded {
    /// The case, carrying its record.
    pub case: Case,
    /// The case, checked.
    pub scene: Scene,
    /// The record, checked against it.
    pub timeline: Timeline,
}

impl Recorded {
    /// Checks a case that carries its record.
    ///
    /// # Errors
    /// Problems with the case or its record; a case without a record.
    pub fn of_case(case: Case) -> Result<Recorded, Errors> {
        let scene = Scene::from_case(&case)?;
        let spec = case
            .timeline
            .as_ref()
            .ok_or_else(|| Error::missing("timeline", "the case has no record to analyse"))?;
        let timeline = Timeline::from_spec(spec, &scene)?;
        Ok(Recorded {
            case,
            scene,
            timeline,
        })
    }

    /// The case with its record's samples replaced by those of a CSV file,
    /// checked once. Position changes already in the case are kept; each
    /// rule in `rules` replaces the case's, the others stay.
    ///
    /// # Errors
    /// Problems with the case, or every problem with the file by line and
    /// column.
    pub fn import(case: &Case, csv_text: &str, rules: &RulesSpec) -> Result<Recorded, Errors> {
        let scene = Scene::from_case(case)?;
        let imported = csv::import(csv_text, &scene)?;
        let mut case = case.clone();
        let spec = case.timeline.get_or_insert_with(TimelineSpec::default);
        spec.channels = imported.channels;
        if imported.clock_start.is_some() {
            spec.clock_start = imported.clock_start;
        }
        let kept = &mut spec.rules;
        kept.hold_max_s = rules.hold_max_s.or(kept.hold_max_s);
        kept.gap_max_s = rules.gap_max_s.or(kept.gap_max_s);
        kept.min_episode_s = rules.min_episode_s.or(kept.min_episode_s);
        let timeline = Timeline::from_spec(spec, &scene)?;
        Ok(Recorded {
            case,
            scene,
            timeline,
        })
    }

    /// The exposure outside each target over the whole record.
    pub fn exposure(&self) -> Exposure {
        analyze(&self.scene, &self.timeline, None)
    }

    /// The organ-level series as CSV, built only when asked for.
    pub fn series_csv(&self) -> String {
        series_csv(&self.scene, &self.timeline)
    }
}

#[cfg(test)]
mod tests;

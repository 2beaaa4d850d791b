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
pub use exposure::{analyze, Exposure, NotAnalysed, TargetExposure, DEFINITIONS};
pub use rules::{
    elapsed_words, Rules, DEFAULT_GAP_MAX_S, DEFAULT_HOLD_MAX_S, DEFAULT_MIN_EPISODE_S,
    MAX_SAMPLES, MAX_SPAN_S,
};
pub use series::{series, series_csv, MetricSeries, Run};
pub use timeline::Timeline;

use crate::case::{Case, TimelineSpec};
use crate::error::{Error, Errors};
use crate::scene::Scene;

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
mod tests;

//! The rules of a record: how long a held reading counts, how wide a gap
//! continuous samples are joined across, which episodes are too short to
//! count; and how durations are written.

use serde::Serialize;

use crate::error::{Error, ErrorKind, Errors};

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

pub(super) fn rule(
    field: &str,
    value: Option<f64>,
    default: f64,
    max: f64,
    errors: &mut Errors,
) -> f64 {
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

//! When a sample or a position change happened, as typed: now by this
//! device's clock, a time elapsed since the record's start, or a clock time.
//!
//! Times are seconds from the record's start, as in the case document. A
//! clock time needs the record's clock start; a record started on screen
//! takes its clock start from its first entry. Passing midnight is
//! understood the way the record files understand it: a clock time more
//! than half a day before the last entry is on the next day.

use plumbline_core::record::clock::time_of_day;
use plumbline_core::record::MAX_SPAN_S;

const DAY_S: f64 = 86_400.0;

/// How the time box is read.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum WhenMode {
    /// This device's clock, at the tap.
    Now,
    /// Elapsed since the record's start.
    Elapsed,
    /// A clock time.
    Clock,
}

impl WhenMode {
    /// Every mode, in the order offered.
    pub const ALL: [WhenMode; 3] = [WhenMode::Now, WhenMode::Elapsed, WhenMode::Clock];

    /// The mode's key, for the picker.
    pub fn key(self) -> &'static str {
        match self {
            WhenMode::Now => "now",
            WhenMode::Elapsed => "elapsed",
            WhenMode::Clock => "clock",
        }
    }

    /// The mode in words.
    pub fn label(self) -> &'static str {
        match self {
            WhenMode::Now => "now, by this device's clock",
            WhenMode::Elapsed => "elapsed since the start",
            WhenMode::Clock => "clock time",
        }
    }

    /// The mode with this key.
    pub fn from_key(key: &str) -> Option<WhenMode> {
        WhenMode::ALL.into_iter().find(|m| m.key() == key)
    }
}

/// The time box as typed.
#[derive(Clone, Debug, PartialEq)]
pub struct When {
    /// How it is read.
    pub mode: WhenMode,
    /// The text in the box (unused for [`WhenMode::Now`]).
    pub text: String,
}

impl Default for When {
    fn default() -> Self {
        When {
            mode: WhenMode::Now,
            text: String::new(),
        }
    }
}

/// A time read from the box.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct At {
    /// Seconds from the record's start.
    pub t_s: f64,
    /// The clock start a record begun by this entry takes, seconds after
    /// midnight.
    pub clock_start: Option<f64>,
}

/// Seconds from the start of a clock time, moved forward past midnight
/// until it is no more than half a day before `last`.
fn forward(clock_s: f64, start_s: f64, last: Option<f64>) -> f64 {
    let mut t = (clock_s - start_s).rem_euclid(DAY_S);
    for _ in 0..4 {
        if last.is_some_and(|l| t < l - DAY_S / 2.0) {
            t += DAY_S;
        }
    }
    t
}

/// An elapsed time: `h:mm:ss`, `h:mm`, whole or decimal minutes (`25`), or
/// minutes after the record's last entry (`+5`).
///
/// # Errors
/// Text that is none of these, in words.
pub fn elapsed(text: &str, last: Option<f64>) -> Result<f64, String> {
    let text = text.trim();
    let bad = || {
        format!(
            "'{text}' is not an elapsed time; write h:mm:ss (0:25:00), h:mm (0:25), \
             minutes (25) or minutes after the last entry (+5)"
        )
    };
    let minutes = |m: &str| {
        m.trim()
            .trim_end_matches("min")
            .trim()
            .parse::<f64>()
            .ok()
            .filter(|v| v.is_finite() && *v >= 0.0)
            .map(|v| v * 60.0)
    };
    let t = if let Some(after) = text.strip_prefix('+') {
        last.unwrap_or(0.0) + minutes(after).ok_or_else(bad)?
    } else if text.contains(':') {
        let parts: Vec<&str> = text.split(':').collect();
        let number = |p: &&str| {
            (!p.is_empty() && p.bytes().all(|b| b.is_ascii_digit()))
                .then(|| p.parse::<f64>().ok())
                .flatten()
        };
        let fields: Vec<f64> = parts.iter().filter_map(number).collect();
        match (parts.len(), fields.as_slice()) {
            (2, [h, m]) if *m < 60.0 => h * 3600.0 + m * 60.0,
            (3, [h, m, s]) if *m < 60.0 && *s < 60.0 => h * 3600.0 + m * 60.0 + s,
            _ => return Err(bad()),
        }
    } else {
        minutes(text).ok_or_else(bad)?
    };
    if t > MAX_SPAN_S {
        return Err(format!(
            "{} is longer than a record can be ({})",
            plumbline_core::record::elapsed_words(t),
            plumbline_core::record::elapsed_words(MAX_SPAN_S)
        ));
    }
    Ok(t)
}

impl When {
    /// Reads the time for a record whose clock starts at `start`
    /// (seconds after midnight, if known) and whose last entry is at `last`
    /// (seconds from the start); `now` is this device's time of day.
    ///
    /// # Errors
    /// A box that cannot be read, or a clock time for a record that has
    /// entries but no clock start, in words.
    pub fn read(&self, start: Option<f64>, last: Option<f64>, now: f64) -> Result<At, String> {
        let clock = match self.mode {
            WhenMode::Elapsed => {
                return Ok(At {
                    t_s: elapsed(&self.text, last)?,
                    clock_start: None,
                })
            }
            WhenMode::Now => now,
            WhenMode::Clock => time_of_day(self.text.trim()).ok_or_else(|| {
                format!(
                    "'{}' is not a clock time; write it as 08:40 or 08:40:30",
                    self.text.trim()
                )
            })?,
        };
        match (start, last) {
            (Some(s), _) => Ok(At {
                t_s: forward(clock, s, last),
                clock_start: None,
            }),
            (None, None) => Ok(At {
                t_s: 0.0,
                clock_start: Some(clock),
            }),
            (None, Some(_)) => Err(
                "this record has no clock time, so a clock time has no place in it; \
                 give the time elapsed since its start instead"
                    .to_owned(),
            ),
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn check(text: &str, last: Option<f64>, expected: Option<f64>) {
        assert_eq!(elapsed(text, last).ok(), expected, "{text}");
    }

    #[test]
    fn elapsed_times_read_as_a_clinician_writes_them() {
        check("0:25:00", None, Some(1500.0));
        check("1:02:03", None, Some(3723.0));
        check(" 0:25 ", None, Some(1500.0));
        check("25", None, Some(1500.0));
        check("2.5 min", None, Some(150.0));
        check("+5", Some(1200.0), Some(1500.0));
        check("+5", None, Some(300.0));
        check("0:61:00", None, None);
        check("0:25:75", None, None);
        check("1:2:3:4", None, None);
        check("-5", None, None);
        check("soon", None, None);
        check(":25", None, None);
        check("100:00:00", None, None);
    }

    #[test]
    fn a_clock_time_counts_from_the_clock_start_and_passes_midnight() {
        let at = |mode, text: &str, start, last, now| {
            When {
                mode,
                text: text.to_owned(),
            }
            .read(start, last, now)
        };
        let eight = 8.0 * 3600.0;
        let r = at(WhenMode::Clock, "08:40", Some(eight), Some(600.0), 0.0).unwrap();
        assert_eq!(r.t_s, 2400.0);
        // 00:10 after a start at 23:50 is 20 minutes in.
        let late = 23.0 * 3600.0 + 50.0 * 60.0;
        let r = at(WhenMode::Now, "", Some(late), Some(60.0), 600.0).unwrap();
        assert_eq!(r.t_s, 1200.0);
        // A record 30 hours long: 09:00 is the one within half a day of its end.
        let r = at(
            WhenMode::Clock,
            "09:00",
            Some(eight),
            Some(30.0 * 3600.0),
            0.0,
        )
        .unwrap();
        assert_eq!(r.t_s, 25.0 * 3600.0);
    }

    #[test]
    fn the_first_entry_of_a_record_started_on_screen_sets_its_clock() {
        let r = When::default().read(None, None, 30_000.0).unwrap();
        assert_eq!(
            r,
            At {
                t_s: 0.0,
                clock_start: Some(30_000.0)
            }
        );
        // A record with entries but no clock cannot place a clock time.
        assert!(When::default().read(None, Some(10.0), 30_000.0).is_err());
        let bad = When {
            mode: WhenMode::Clock,
            text: "8.40".into(),
        };
        assert!(bad
            .read(Some(0.0), None, 0.0)
            .unwrap_err()
            .contains("08:40"));
    }

    #[test]
    fn modes_round_trip_through_their_keys() {
        for m in WhenMode::ALL {
            assert_eq!(WhenMode::from_key(m.key()), Some(m));
        }
        assert_eq!(WhenMode::from_key("later"), None);
    }
}

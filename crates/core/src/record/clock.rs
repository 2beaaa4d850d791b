//! Times in record files: ISO 8601 timestamps and clock times, as seconds.
//!
//! Only what monitor exports use: `2026-03-04T08:15:30`, with optional
//! fractional seconds, a space for the `T`, and `Z` or `±hh:mm`; or a bare
//! clock time `08:15:30`. Dates are used only to order samples and are
//! never kept, so a record carries no calendar date.

/// A parsed time.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Stamp {
    /// A date and time: seconds from 1970-01-01 00:00 (UTC when an offset
    /// was given, the writer's local time otherwise).
    DateTime(f64),
    /// A clock time: seconds after midnight.
    TimeOfDay(f64),
}

fn digits(text: &str, n: usize) -> Option<u32> {
    (text.len() == n && text.bytes().all(|b| b.is_ascii_digit()))
        .then(|| text.parse().ok())
        .flatten()
}

/// Seconds after midnight of `HH:MM`, `HH:MM:SS` or `HH:MM:SS.fff`.
pub fn time_of_day(text: &str) -> Option<f64> {
    let mut parts = text.split(':');
    let h = digits(parts.next()?, 2)?;
    let m = digits(parts.next()?, 2)?;
    let s = match parts.next() {
        None => 0.0,
        Some(sec) => {
            let (whole, frac) = sec.split_once(['.', ',']).unwrap_or((sec, ""));
            let whole = f64::from(digits(whole, 2)?);
            if !frac.bytes().all(|b| b.is_ascii_digit()) || frac.len() > 9 {
                return None;
            }
            let frac = if frac.is_empty() {
                0.0
            } else {
                format!("0.{frac}").parse::<f64>().ok()?
            };
            whole + frac
        }
    };
    if parts.next().is_some() || h > 23 || m > 59 || s >= 61.0 {
        return None;
    }
    Some(f64::from(h) * 3600.0 + f64::from(m) * 60.0 + s)
}

/// Days from 1970-01-01 to a civil date (proleptic Gregorian).
fn days_from_civil(y: i64, m: u32, d: u32) -> i64 {
    let y = if m <= 2 { y - 1 } else { y };
    let era = y.div_euclid(400);
    let yoe = y - era * 400;
    let m = i64::from(m);
    let doy = (153 * (if m > 2 { m - 3 } else { m + 9 }) + 2) / 5 + i64::from(d) - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    era * 146_097 + doe - 719_468
}

fn days_in_month(y: i64, m: u32) -> u32 {
    match m {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        _ if (y % 4 == 0 && y % 100 != 0) || y % 400 == 0 => 29,
        _ => 28,
    }
}

/// Reads a timestamp or a clock time.
///
/// # Example
/// ```
/// use plumbline_core::record::clock::{parse, Stamp};
/// assert_eq!(parse("08:00:30"), Some(Stamp::TimeOfDay(28830.0)));
/// assert!(matches!(parse("2026-03-04T08:00:30Z"), Some(Stamp::DateTime(_))));
/// assert_eq!(parse("2026-02-30T08:00:00"), None);
/// ```
pub fn parse(text: &str) -> Option<Stamp> {
    let text = text.trim();
    if text.len() <= 12 {
        return time_of_day(text).map(Stamp::TimeOfDay);
    }
    let date = text.get(..10)?;
    let sep = text.get(10..11)?;
    if sep != "T" && sep != " " {
        return None;
    }
    let mut d = date.split('-');
    let y = i64::from(digits(d.next()?, 4)?);
    let mo = digits(d.next()?, 2)?;
    let day = digits(d.next()?, 2)?;
    if !(1..=12).contains(&mo) || day == 0 || day > days_in_month(y, mo) {
        return None;
    }
    let rest = text.get(11..)?;
    let (clock, offset_s) = if let Some(clock) = rest.strip_suffix('Z') {
        (clock, 0.0)
    } else if let Some(i) = rest.rfind(['+', '-']) {
        let (clock, off) = rest.split_at(i);
        let sign = if off.starts_with('-') { -1.0 } else { 1.0 };
        let off = off.get(1..)?;
        let (oh, om) = off
            .split_once(':')
            .unwrap_or((off.get(..2)?, off.get(2..)?));
        let (oh, om) = (digits(oh, 2)?, digits(om, 2)?);
        if oh > 14 || om > 59 {
            return None;
        }
        (
            clock,
            sign * (f64::from(oh) * 3600.0 + f64::from(om) * 60.0),
        )
    } else {
        (rest, 0.0)
    };
    let seconds = time_of_day(clock)?;
    let days = days_from_civil(y, mo, day) as f64;
    Some(Stamp::DateTime(days * 86_400.0 + seconds - offset_s))
}

/// A number of seconds after midnight as `HH:MM:SS`.
pub fn clock_words(seconds: f64) -> String {
    let s = seconds.rem_euclid(86_400.0).floor() as u64;
    format!("{:02}:{:02}:{:02}", s / 3600, (s / 60) % 60, s % 60)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn clock_times() {
        assert_eq!(time_of_day("00:00"), Some(0.0));
        assert_eq!(time_of_day("23:59:59.5"), Some(86_399.5));
        assert_eq!(time_of_day("24:00"), None);
        assert_eq!(time_of_day("8:00"), None);
        assert_eq!(time_of_day("08:00:00:00"), None);
    }

    #[test]
    fn civil_days_known_points() {
        // 1970-01-01 is day 0; 2000-03-01 is day 11017 (POSIX date arithmetic).
        assert_eq!(days_from_civil(1970, 1, 1), 0);
        assert_eq!(days_from_civil(2000, 3, 1), 11_017);
        assert_eq!(days_from_civil(1969, 12, 31), -1);
    }

    #[test]
    fn offsets_move_to_utc() {
        let z = parse("2026-03-04T08:00:00Z");
        let plus = parse("2026-03-04T09:00:00+01:00");
        assert_eq!(z, plus);
        assert!(parse("2026-03-04T09:00:00+1:00").is_none());
        assert!(parse("2026-13-04T09:00:00").is_none());
        assert!(parse("2024-02-29 09:00").is_some());
        assert!(parse("2023-02-29 09:00").is_none());
    }

    #[test]
    fn clock_words_wraps_the_day() {
        assert_eq!(clock_words(86_400.0 + 61.0), "00:01:01");
    }
}

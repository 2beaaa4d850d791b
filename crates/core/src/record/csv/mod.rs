//! The record CSV format: monitor exports in, checked line by line.
//!
//! Two layouts, told apart by the header. *Wide*: a time column, then one
//! column per channel with its unit in brackets:
//!
//! ```text
//! elapsed_s,radial line.mean [mmHg],left arm cuff.mean [mmHg],icp [cmH2O]
//! 0,74,,14
//! 1,73.5,79,
//! ```
//!
//! *Long*: one row per reading, the unit written with the value:
//!
//! ```text
//! time,channel,value
//! 08:15:00,radial line.mean,74 mmHg
//! ```
//!
//! The time column is `elapsed_s` (seconds) or `time` (ISO 8601 date-times
//! or clock times, all rows alike). Lines starting with `#` are comments. A
//! comma, semicolon or tab separates fields, whichever the header uses. Every
//! problem is reported with its line and column, and nothing is imported
//! until the file is clean. The file's bytes, rows, columns and line length
//! are capped (`limits`) before a line is split.
//!
//! A 72-hour file at 1 Hz is megabytes, so the reader works at the speed of
//! a library: lines and cells are cut at ASCII bytes and borrowed, plain
//! decimals take an exact fast path, and a wide file's samples go straight
//! into their columns, which its forward-running rows keep in time order.

mod rows;
#[cfg(test)]
mod tests;
mod text;

use std::borrow::Cow;

use super::clock::{self, Stamp};
use super::{channel_input, input_range, MAX_SAMPLES, MAX_SPAN_S};
use crate::case::{ChannelSpec, TimelineSpec};
use crate::error::{Error, ErrorKind, Errors};
use crate::limits::{self, MAX_CSV_COLUMNS, MAX_CSV_LINE_BYTES, MAX_CSV_ROWS};
use crate::scene::Scene;
use crate::units::{mmhg, to_mmhg, PressureEntry, PressureUnit};

use rows::*;
use text::*;

/// Rows read before a wide file's columns are given room for the rest of
/// the file at the rate they filled so far: without it, a long file's
/// columns double as they grow, and each doubling holds the old copy and
/// the new at once (native peak 2.55x the file for 72 hours, 2.27x with).
const RESERVE_AFTER_ROWS: usize = 1024;

/// The most problems listed before the import gives up.
pub const MAX_PROBLEMS: usize = limits::MAX_CSV_PROBLEMS;

/// A header cell `name [unit]`.
fn name_and_unit(cell: &str) -> Result<(String, PressureUnit), String> {
    let cell = cell.trim();
    let Some(open) = cell.rfind('[').filter(|_| cell.ends_with(']')) else {
        return Err(format!(
            "'{cell}' has no unit; write the column as '{cell} [mmHg]' (or kPa, cmH2O)"
        ));
    };
    let unit_text = cell.get(open + 1..cell.len() - 1).unwrap_or_default();
    let unit = format!("0 {unit_text}")
        .parse::<PressureEntry>()
        .map(|e| e.unit)
        .map_err(|_| format!("'{unit_text}' is not a pressure unit; use mmHg, kPa or cmH2O"))?;
    Ok((cell.get(..open).unwrap_or_default().trim().to_owned(), unit))
}

enum TimeKind {
    Elapsed,
    Clock,
}

struct Reader {
    errors: Errors,
    full: bool,
}

impl Reader {
    fn error(&mut self, line: usize, column: usize, kind: ErrorKind) {
        if self.errors.len() >= MAX_PROBLEMS {
            if !self.full {
                self.full = true;
                self.errors.push(Error::new(
                    "",
                    ErrorKind::Shape {
                        message: format!("more problems after the first {MAX_PROBLEMS} not listed"),
                    },
                ));
            }
            return;
        }
        let field = if column == 0 {
            format!("line {line}")
        } else {
            format!("line {line}, column {column}")
        };
        self.errors.push(Error::new(field, kind));
    }

    fn shape(&mut self, line: usize, column: usize, message: String) {
        self.error(line, column, ErrorKind::Shape { message });
    }

    /// A cap met on `line`: `found` of `what` where `max` are accepted.
    fn over(&mut self, line: usize, found: usize, what: &str, max: usize) {
        let kind = limits::over("", found, what, max).kind().clone();
        self.error(line, 0, kind);
    }
}

/// Turns row times into seconds from the first row.
struct Clock {
    kind: TimeKind,
    origin: Option<f64>,
    wraps: f64,
    last_time_of_day: Option<f64>,
    dated: Option<bool>,
    start: Option<f64>,
}

impl Clock {
    fn seconds(&mut self, text: &str) -> Result<f64, String> {
        let raw = match self.kind {
            TimeKind::Elapsed => {
                let v = parse_f64(trim(text))
                    .ok_or_else(|| format!("'{}' is not a number of seconds", text.trim()))?;
                if !(v.is_finite() && v >= 0.0) {
                    return Err(format!("'{}' is not a time from 0 on", text.trim()));
                }
                v
            }
            TimeKind::Clock => {
                let stamp = clock::parse(text).ok_or_else(|| {
                    format!(
                        "'{}' is not an ISO 8601 time (2026-03-04T08:15:00) or a clock time (08:15:00)",
                        text.trim()
                    )
                })?;
                let (dated, v) = match stamp {
                    Stamp::DateTime(v) => (true, v),
                    Stamp::TimeOfDay(v) => (false, v),
                };
                if *self.dated.get_or_insert(dated) != dated {
                    return Err("mixes date-times and bare clock times; use one style".to_owned());
                }
                if !dated {
                    // A clock time that jumps back by half a day has passed midnight.
                    if self
                        .last_time_of_day
                        .is_some_and(|last| v < last - 43_200.0)
                    {
                        self.wraps += 86_400.0;
                    }
                    self.last_time_of_day = Some(v);
                }
                if self.start.is_none() {
                    self.start = Some(v);
                }
                v + self.wraps
            }
        };
        let origin = *self.origin.get_or_insert(raw);
        let t = raw - origin;
        if !(0.0..=MAX_SPAN_S).contains(&t) {
            return Err(format!(
                "is {t:.0} s from the first row; a record runs forward, at most {MAX_SPAN_S:.0} s"
            ));
        }
        Ok(t)
    }
}

/// Reads a record file against a case's sources.
///
/// # Errors
/// Every problem with its line and column: an unknown channel, a missing
/// unit, a time that cannot be read or runs backwards, a value out of range,
/// a row with the wrong number of fields.
pub fn import(text: &str, scene: &Scene) -> Result<TimelineSpec, Errors> {
    let mut r = Reader {
        errors: Errors::default(),
        full: false,
    };
    limits::check_bytes("", text.len())?;
    let mut lines = ContentLines {
        rest: text,
        number: 0,
    };
    let Some((header_line, header)) = lines.next() else {
        r.shape(1, 0, "the file has no header line".to_owned());
        return Err(r.errors);
    };
    if header.len() > MAX_CSV_LINE_BYTES {
        r.over(
            header_line,
            header.len(),
            "bytes in one line",
            MAX_CSV_LINE_BYTES,
        );
        return Err(r.errors);
    }
    let sep = [',', ';', '\t']
        .into_iter()
        .max_by_key(|c| header.matches(*c).count())
        .unwrap_or(',');
    let head = split(header, sep);
    if head.len() > MAX_CSV_COLUMNS {
        r.over(header_line, head.len(), "columns", MAX_CSV_COLUMNS);
        return Err(r.errors);
    }
    let names: Vec<String> = head.iter().map(|h| h.trim().to_ascii_lowercase()).collect();
    let kind = match names.first().map(String::as_str) {
        Some("elapsed_s") => TimeKind::Elapsed,
        Some("time") => TimeKind::Clock,
        _ => {
            r.shape(
                header_line,
                1,
                "the first column is the time: 'elapsed_s' (seconds) or 'time' (ISO 8601)"
                    .to_owned(),
            );
            return Err(r.errors);
        }
    };
    let long = names.get(1..) == Some(&["channel".to_owned(), "value".to_owned()][..]);
    let layout = if long {
        Layout::Long {
            known: Vec::new(),
            channels: Vec::new(),
        }
    } else {
        Layout::Wide {
            columns: wide_columns(&mut r, scene, &head, header_line),
            near: Vec::new(),
            last_row_time: f64::NEG_INFINITY,
        }
    };
    let mut rows = Rows {
        r,
        decimal_comma: sep != ',',
        clock: Clock {
            kind,
            origin: None,
            wraps: 0.0,
            last_time_of_day: None,
            dated: None,
            start: None,
        },
        width: head.len(),
        scene,
        layout,
        samples: 0,
    };
    let sep_byte = u8::try_from(sep).unwrap_or(b',');
    let mut row_bytes = header.len() + 1;
    let whole = text.len();
    for (row, (line, text)) in lines.enumerate() {
        if rows.r.full {
            break;
        }
        if row == RESERVE_AFTER_ROWS {
            let left = whole.saturating_sub(row_bytes) as u64;
            let rows_left = left.saturating_mul(row as u64) / row_bytes.max(1) as u64;
            rows.reserve(row, usize::try_from(rows_left).unwrap_or(MAX_CSV_ROWS));
        }
        row_bytes += text.len() + 1;
        if row == MAX_CSV_ROWS {
            rows.r.over(line, row + 1, "rows (or more)", MAX_CSV_ROWS);
            break;
        }
        if text.len() > MAX_CSV_LINE_BYTES {
            rows.r
                .over(line, text.len(), "bytes in one line", MAX_CSV_LINE_BYTES);
            continue;
        }
        let go_on = match count_cells(text, sep_byte) {
            Some(count) => rows.row(
                line,
                count,
                Cells {
                    line: text,
                    start: 0,
                    sep: sep_byte,
                },
            ),
            None => {
                let cells = split(text, sep);
                rows.row(line, cells.len(), cells.iter().map(String::as_str))
            }
        };
        if !go_on {
            break;
        }
    }
    let channels = rows.channels();
    let mut r = rows.r;
    if channels.iter().all(|c| c.t_s.is_empty()) && r.errors.is_empty() {
        r.shape(header_line, 0, "the file has no samples".to_owned());
    }
    r.errors.into_result(TimelineSpec {
        clock_start: rows.clock.start.map(|s| clock::clock_words(s % 86_400.0)),
        channels,
        ..TimelineSpec::default()
    })
}

/// A wide file's columns after the time, from its header: `None` for a
/// column that names no channel of the case or repeats one (each said).
fn wide_columns(
    r: &mut Reader,
    scene: &Scene,
    head: &[String],
    header_line: usize,
) -> Vec<Option<Column>> {
    let mut columns: Vec<Option<Column>> = Vec::new();
    for (col, cell) in head.iter().enumerate().skip(1) {
        let parsed = name_and_unit(cell)
            .map_err(|message| ErrorKind::Shape { message })
            .and_then(|(name, unit)| {
                let input = channel_input(scene, &name)?;
                Ok((name, unit, input_range(input)))
            });
        match parsed {
            Ok((name, unit, range)) => {
                if columns.iter().flatten().any(|c| c.name == name) {
                    r.error(header_line, col + 1, ErrorKind::Duplicate { name });
                    columns.push(None);
                } else {
                    let (lo, hi) = (unit.value(mmhg(range.0)), unit.value(mmhg(range.1)));
                    let margin = 1e-9 * lo.abs().max(hi.abs()).max(1.0);
                    columns.push(Some(Column {
                        name,
                        unit,
                        range,
                        inside: (lo + margin, hi - margin),
                        t_s: Vec::new(),
                        values: Vec::new(),
                    }));
                }
            }
            Err(kind) => {
                r.error(header_line, col + 1, kind);
                columns.push(None);
            }
        }
    }
    columns
}

fn in_range(
    r: &mut Reader,
    line: usize,
    column: usize,
    entry: PressureEntry,
    range: (f64, f64),
) -> bool {
    let v = to_mmhg(entry.pressure());
    if (range.0..=range.1).contains(&v) {
        return true;
    }
    r.error(
        line,
        column,
        ErrorKind::OutOfRange {
            value: entry.to_string(),
            min: format!("{} mmHg", range.0),
            max: format!("{} mmHg", range.1),
            hint: None,
        },
    );
    false
}

/// Writes a record's channels as a wide CSV file that [`import`] reads back.
pub fn export(spec: &TimelineSpec) -> String {
    let mut times: Vec<f64> = spec
        .channels
        .iter()
        .flat_map(|c| c.t_s.iter().copied())
        .collect();
    times.sort_by(f64::total_cmp);
    times.dedup();
    let mut out = String::from("elapsed_s");
    for c in &spec.channels {
        out.push_str(&format!(",{} [{}]", quote(&c.channel), c.unit));
    }
    out.push('\n');
    let mut cursors = vec![0usize; spec.channels.len()];
    for t in times {
        out.push_str(&format!("{t}"));
        for (c, cursor) in spec.channels.iter().zip(cursors.iter_mut()) {
            out.push(',');
            if c.t_s.get(*cursor) == Some(&t) {
                if let Some(v) = c.values.get(*cursor) {
                    out.push_str(&format!("{v}"));
                }
                *cursor += 1;
            }
        }
        out.push('\n');
    }
    out
}

fn quote(name: &str) -> String {
    if name.contains([',', ';', '"', '\t']) {
        format!("\"{}\"", name.replace('"', "\"\""))
    } else {
        name.to_owned()
    }
}

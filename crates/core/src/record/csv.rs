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

use std::collections::BTreeMap;

use super::clock::{self, Stamp};
use super::{channel_input, input_range, MAX_SAMPLES, MAX_SPAN_S};
use crate::case::{ChannelSpec, TimelineSpec};
use crate::error::{Error, ErrorKind, Errors};
use crate::limits::{self, MAX_CSV_COLUMNS, MAX_CSV_LINE_BYTES, MAX_CSV_ROWS};
use crate::scene::Scene;
use crate::units::{to_mmhg, PressureEntry, PressureUnit};

/// The most problems listed before the import gives up.
pub const MAX_PROBLEMS: usize = limits::MAX_CSV_PROBLEMS;

/// Splits one line into fields, honouring double quotes (`""` inside
/// quotes is a quote).
fn split(line: &str, sep: char) -> Vec<String> {
    let mut fields = Vec::new();
    let mut field = String::new();
    let mut quoted = false;
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '"' if quoted && chars.peek() == Some(&'"') => {
                field.push('"');
                chars.next();
            }
            '"' => quoted = !quoted,
            c if c == sep && !quoted => fields.push(std::mem::take(&mut field)),
            c => field.push(c),
        }
    }
    fields.push(field);
    fields
}

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
                let v: f64 = text
                    .trim()
                    .parse()
                    .map_err(|_| format!("'{}' is not a number of seconds", text.trim()))?;
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

fn number(text: &str, decimal_comma: bool) -> Option<f64> {
    let text = text.trim();
    let text = if decimal_comma {
        text.replace(',', ".")
    } else {
        text.to_owned()
    };
    text.parse::<f64>().ok().filter(|v| v.is_finite())
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
    let mut lines = text
        .lines()
        .enumerate()
        .map(|(i, l)| (i + 1, l.trim_end_matches('\r')))
        .filter(|(_, l)| !l.trim().is_empty() && !l.trim_start().starts_with('#'));
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
    let decimal_comma = sep != ',';
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
    let mut clock = Clock {
        kind,
        origin: None,
        wraps: 0.0,
        last_time_of_day: None,
        dated: None,
        start: None,
    };
    let long = names.get(1..) == Some(&["channel".to_owned(), "value".to_owned()][..]);

    // Channel name → (unit, samples, the line each sample came from).
    type Samples = (PressureUnit, Vec<(f64, f64, usize)>);
    let mut channels: BTreeMap<String, Samples> = BTreeMap::new();
    let mut order: Vec<String> = Vec::new();
    /// A wide file's column: channel name, unit and accepted range in mmHg.
    type Column = (String, PressureUnit, (f64, f64));
    let mut columns: Vec<Option<Column>> = Vec::new();
    if !long {
        for (col, cell) in head.iter().enumerate().skip(1) {
            let parsed = name_and_unit(cell)
                .map_err(|message| ErrorKind::Shape { message })
                .and_then(|(name, unit)| {
                    let input = channel_input(scene, &name)?;
                    Ok((name, unit, input_range(input)))
                });
            match parsed {
                Ok((name, unit, range)) => {
                    if order.contains(&name) {
                        r.error(header_line, col + 1, ErrorKind::Duplicate { name });
                        columns.push(None);
                    } else {
                        order.push(name.clone());
                        channels.insert(name.clone(), (unit, Vec::new()));
                        columns.push(Some((name, unit, range)));
                    }
                }
                Err(kind) => {
                    r.error(header_line, col + 1, kind);
                    columns.push(None);
                }
            }
        }
    }

    let mut samples = 0usize;
    let mut last_row_time = f64::NEG_INFINITY;
    for (row, (line, text)) in lines.enumerate() {
        if r.full {
            break;
        }
        if row == MAX_CSV_ROWS {
            r.over(line, row + 1, "rows (or more)", MAX_CSV_ROWS);
            break;
        }
        if text.len() > MAX_CSV_LINE_BYTES {
            r.over(line, text.len(), "bytes in one line", MAX_CSV_LINE_BYTES);
            continue;
        }
        let fields = split(text, sep);
        if fields.len() != head.len() {
            r.shape(
                line,
                0,
                format!("{} fields, the header has {}", fields.len(), head.len()),
            );
            continue;
        }
        let Some(time_text) = fields.first() else {
            continue;
        };
        let t = match clock.seconds(time_text) {
            Ok(t) => t,
            Err(message) => {
                r.shape(line, 1, message);
                continue;
            }
        };
        if long {
            let (Some(name), Some(value)) = (fields.get(1), fields.get(2)) else {
                continue;
            };
            let name = name.trim().to_owned();
            let range = match channel_input(scene, &name) {
                Ok(input) => input_range(input),
                Err(kind) => {
                    r.error(line, 2, kind);
                    continue;
                }
            };
            let text = if decimal_comma {
                value.replace(',', ".")
            } else {
                value.clone()
            };
            let entry = match text.parse::<PressureEntry>() {
                Ok(e) => e,
                Err(e) => {
                    r.error(
                        line,
                        3,
                        ErrorKind::Quantity {
                            message: e.to_string(),
                        },
                    );
                    continue;
                }
            };
            if !in_range(&mut r, line, 3, entry, range) {
                continue;
            }
            let slot = channels.entry(name.clone()).or_insert_with(|| {
                order.push(name.clone());
                (entry.unit, Vec::new())
            });
            if slot.0 != entry.unit {
                r.shape(
                    line,
                    3,
                    format!(
                        "{name} was given in {} before; keep one unit per channel",
                        slot.0
                    ),
                );
                continue;
            }
            slot.1.push((t, entry.amount, line));
            samples += 1;
        } else {
            if t <= last_row_time {
                r.shape(
                    line,
                    1,
                    "the time does not move forward from the row above".to_owned(),
                );
                continue;
            }
            last_row_time = t;
            for (col, (cell, column)) in fields.iter().skip(1).zip(&columns).enumerate() {
                let Some((name, unit, range)) = column else {
                    continue;
                };
                if cell.trim().is_empty() {
                    continue;
                }
                let Some(v) = number(cell, decimal_comma) else {
                    r.error(
                        line,
                        col + 2,
                        ErrorKind::Quantity {
                            message: format!("'{}' is not a number", cell.trim()),
                        },
                    );
                    continue;
                };
                if !in_range(&mut r, line, col + 2, PressureEntry::new(v, *unit), *range) {
                    continue;
                }
                if let Some(slot) = channels.get_mut(name) {
                    slot.1.push((t, v, line));
                    samples += 1;
                }
            }
        }
        if samples > MAX_SAMPLES {
            r.shape(line, 0, format!("more than {MAX_SAMPLES} samples"));
            break;
        }
    }

    let mut specs = Vec::new();
    for name in &order {
        let Some((unit, mut rows)) = channels.remove(name) else {
            continue;
        };
        rows.sort_by(|a, b| a.0.total_cmp(&b.0));
        for pair in rows.windows(2) {
            if let [a, b] = pair {
                if (b.0 - a.0).abs() < 1e-9 {
                    r.shape(b.2, 1, format!("a second {name} sample at the same time"));
                }
            }
        }
        specs.push(ChannelSpec {
            channel: name.clone(),
            unit,
            t_s: rows.iter().map(|x| x.0).collect(),
            values: rows.iter().map(|x| x.1).collect(),
        });
    }
    if specs.iter().all(|c| c.t_s.is_empty()) && r.errors.is_empty() {
        r.shape(header_line, 0, "the file has no samples".to_owned());
    }
    r.errors.into_result(TimelineSpec {
        clock_start: clock.start.map(|s| clock::clock_words(s % 86_400.0)),
        channels: specs,
        ..TimelineSpec::default()
    })
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

#[cfg(test)]
#[path = "csv_tests.rs"]
mod tests;

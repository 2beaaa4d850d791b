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

use std::borrow::Cow;

use super::clock::{self, Stamp};
use super::{channel_input, input_range, MAX_SAMPLES, MAX_SPAN_S};
use crate::case::{ChannelSpec, TimelineSpec};
use crate::error::{Error, ErrorKind, Errors};
use crate::limits::{self, MAX_CSV_COLUMNS, MAX_CSV_LINE_BYTES, MAX_CSV_ROWS};
use crate::scene::Scene;
use crate::units::{mmhg, to_mmhg, PressureEntry, PressureUnit};

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
        if self.errors.0.len() >= MAX_PROBLEMS {
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
        let kind = limits::over("", found, what, max).kind;
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

/// A trimmed cell as a number; with a decimal comma, `74,5` is 74.5.
fn number(text: &str, decimal_comma: bool) -> Option<f64> {
    let v = if decimal_comma {
        parse_f64(&decimal(text, true))
    } else {
        parse_f64(text)
    };
    v.filter(|v| v.is_finite())
}

/// `text` with a decimal comma made a point, when the file uses them;
/// borrowed unless a comma must change.
fn decimal(text: &str, decimal_comma: bool) -> Cow<'_, str> {
    if decimal_comma && text.contains(',') {
        Cow::Owned(text.replace(',', "."))
    } else {
        Cow::Borrowed(text)
    }
}

/// Whether a byte is ASCII and not white space: a cell or line that starts
/// and ends with one needs no trimming.
fn plain(b: u8) -> bool {
    b.is_ascii() && !matches!(b, b'\t'..=b'\r' | b' ')
}

/// `text.trim()`, without walking characters when both ends are plain.
fn trim(text: &str) -> &str {
    let bytes = text.as_bytes();
    match (bytes.first(), bytes.last()) {
        (Some(&first), Some(&last)) if !(plain(first) && plain(last)) => text.trim(),
        _ => text,
    }
}

/// Exact powers of ten up to 10^15, for [`parse_f64`].
const POWERS_OF_TEN: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// The decimal digits of `bytes` from `at` on, taken into `mantissa`
/// (wrapping past 20 digits, which [`parse_f64`] then leaves to the
/// standard reader); how many there were. Inlined: it is the import's
/// innermost loop, and the release build optimises for size.
#[inline(always)]
fn digits(bytes: &[u8], at: &mut usize, mantissa: &mut u64) -> usize {
    let start = *at;
    while let Some(digit) = bytes.get(*at).map(|b| b.wrapping_sub(b'0')) {
        if digit >= 10 {
            break;
        }
        *mantissa = mantissa.wrapping_mul(10).wrapping_add(u64::from(digit));
        *at += 1;
    }
    *at - start
}

/// `text.parse::<f64>()`, sooner for a plain decimal (`-74.25`): up to 15
/// digits are exact in an f64, as is every power of ten to 10^15, and one
/// correctly rounded division then gives the nearest f64, which is what
/// the standard reader gives. Anything else goes to the standard reader.
fn parse_f64(text: &str) -> Option<f64> {
    let bytes = text.as_bytes();
    let negative = bytes.first() == Some(&b'-');
    let mut at = usize::from(negative);
    let mut mantissa = 0u64;
    let whole = digits(bytes, &mut at, &mut mantissa);
    let decimals = if bytes.get(at) == Some(&b'.') {
        at += 1;
        digits(bytes, &mut at, &mut mantissa)
    } else {
        0
    };
    match POWERS_OF_TEN.get(decimals) {
        Some(scale) if at == bytes.len() && (1..=15).contains(&(whole + decimals)) => {
            // Exact: the mantissa is below 10^15 < 2^53.
            #[allow(clippy::cast_precision_loss)]
            let m = mantissa as f64;
            let v = if decimals == 0 { m } else { m / scale };
            Some(if negative { -v } else { v })
        }
        _ => text.parse().ok(),
    }
}

/// The cells of a line without quotes, cut at an ASCII separator, so every
/// cut falls between characters.
struct Cells<'a> {
    line: &'a str,
    start: usize,
    sep: u8,
}

impl<'a> Iterator for Cells<'a> {
    type Item = &'a str;

    fn next(&mut self) -> Option<&'a str> {
        let bytes = self.line.as_bytes();
        let start = self.start;
        if start > bytes.len() {
            return None;
        }
        let mut end = start;
        while bytes.get(end).is_some_and(|b| *b != self.sep) {
            end += 1;
        }
        self.start = end + 1;
        self.line.get(start..end)
    }
}

/// How many cells a line has, or `None` when it has quotes (and goes
/// through [`split`]).
fn count_cells(line: &str, sep: u8) -> Option<usize> {
    let mut cells = 1;
    for &b in line.as_bytes() {
        if b == sep {
            cells += 1;
        } else if b == b'"' {
            return None;
        }
    }
    Some(cells)
}

/// The lines of a file that hold something, numbered from 1 as
/// `str::lines` numbers them: blank lines and `#` comments left out, line
/// ends (`\n`, `\r\n`, any `\r`s before them) removed.
struct ContentLines<'a> {
    rest: &'a str,
    number: usize,
}

impl<'a> Iterator for ContentLines<'a> {
    type Item = (usize, &'a str);

    fn next(&mut self) -> Option<(usize, &'a str)> {
        while !self.rest.is_empty() {
            let (line, rest) = match self.rest.as_bytes().iter().position(|&b| b == b'\n') {
                Some(end) => (
                    self.rest.get(..end).unwrap_or_default(),
                    self.rest.get(end + 1..).unwrap_or_default(),
                ),
                None => (self.rest, ""),
            };
            self.rest = rest;
            self.number += 1;
            let mut line = line;
            while line.as_bytes().last() == Some(&b'\r') {
                line = line.get(..line.len() - 1).unwrap_or_default();
            }
            let holds_something = match line.as_bytes().first() {
                Some(&b) if plain(b) => b != b'#',
                _ => {
                    let l = line.trim_start();
                    !l.is_empty() && !l.starts_with('#')
                }
            };
            if holds_something {
                return Some((self.number, line));
            }
        }
        None
    }
}

/// A wide file's column: its channel, unit, accepted range in mmHg and
/// samples so far.
struct Column {
    name: String,
    unit: PressureUnit,
    range: (f64, f64),
    /// The range in the column's own unit, narrowed by a billionth: a
    /// value strictly inside is in range whatever the conversion rounds,
    /// so only values at the edges are converted to be sure.
    inside: (f64, f64),
    t_s: Vec<f64>,
    values: Vec<f64>,
}

/// A long file's channel as read so far: its name, its unit (from its
/// first sample) and its samples with the line each came from, in the
/// order of the file.
type Samples = (String, PressureUnit, Vec<(f64, f64, usize)>);

/// A channel name met in a long file: its accepted range in mmHg or why
/// it is none, and its place among the channels once a sample is kept.
type Known = (String, Result<(f64, f64), String>, Option<usize>);

/// How the rows of one layout are read into their channels.
enum Layout {
    /// One column per channel; rows run forward.
    Wide {
        /// `None` for a column that names no channel or repeats one.
        columns: Vec<Option<Column>>,
        /// Samples closer than a nanosecond to the one before in their
        /// column (column, line): said after the rows, column by column,
        /// as the long layout says them.
        near: Vec<(usize, usize)>,
        last_row_time: f64,
    },
    /// One reading per row, any channel, any order.
    Long {
        known: Vec<Known>,
        channels: Vec<Samples>,
    },
}

/// The reading of a file's rows: the problems so far, the separator, the
/// time column's reader, the number of cells a row has, and the layout.
struct Rows<'a> {
    r: Reader,
    decimal_comma: bool,
    clock: Clock,
    width: usize,
    scene: &'a Scene,
    layout: Layout,
    samples: usize,
}

impl Rows<'_> {
    /// Reads one row of `count` cells; `false` when the reading must stop.
    fn row<'c>(
        &mut self,
        line: usize,
        count: usize,
        mut cells: impl Iterator<Item = &'c str>,
    ) -> bool {
        if count != self.width {
            self.r.shape(
                line,
                0,
                format!("{count} fields, the header has {}", self.width),
            );
            return true;
        }
        let Some(time) = cells.next() else {
            return true;
        };
        let t = match self.clock.seconds(time) {
            Ok(t) => t,
            Err(message) => {
                self.r.shape(line, 1, message);
                return true;
            }
        };
        let kept = match &mut self.layout {
            Layout::Wide {
                columns,
                near,
                last_row_time,
            } => {
                if t <= *last_row_time {
                    self.r.shape(
                        line,
                        1,
                        "the time does not move forward from the row above".to_owned(),
                    );
                    return true;
                }
                *last_row_time = t;
                wide_row(
                    &mut self.r,
                    self.decimal_comma,
                    (line, t),
                    cells,
                    columns,
                    near,
                )
            }
            Layout::Long { known, channels } => {
                let (Some(name), Some(value)) = (cells.next(), cells.next()) else {
                    return true;
                };
                let reading = (line, t, name, value);
                let kept = long_row(
                    &mut self.r,
                    self.scene,
                    self.decimal_comma,
                    reading,
                    known,
                    channels,
                );
                if !kept {
                    return true;
                }
                1
            }
        };
        self.samples += kept;
        if self.samples > MAX_SAMPLES {
            self.r
                .shape(line, 0, format!("more than {MAX_SAMPLES} samples"));
            return false;
        }
        true
    }

    /// The channels read, once every row is: a wide file's columns as they
    /// are, a long file's channels sorted by time, each with its problems.
    fn channels(&mut self) -> Vec<ChannelSpec> {
        let mut specs = Vec::new();
        match std::mem::replace(
            &mut self.layout,
            Layout::Long {
                known: Vec::new(),
                channels: Vec::new(),
            },
        ) {
            Layout::Wide { columns, near, .. } => {
                for (col, column) in columns.into_iter().enumerate() {
                    let Some(mut column) = column else {
                        continue;
                    };
                    for (_, line) in near.iter().filter(|(c, _)| *c == col) {
                        let message = format!("a second {} sample at the same time", column.name);
                        self.r.shape(*line, 1, message);
                    }
                    column.t_s.shrink_to_fit();
                    column.values.shrink_to_fit();
                    specs.push(ChannelSpec {
                        channel: column.name,
                        unit: column.unit,
                        t_s: column.t_s,
                        values: column.values,
                    });
                }
            }
            Layout::Long { channels, .. } => {
                for (name, unit, mut kept) in channels {
                    kept.sort_by(|a, b| a.0.total_cmp(&b.0));
                    for pair in kept.windows(2) {
                        if let [a, b] = pair {
                            if (b.0 - a.0).abs() < 1e-9 {
                                self.r.shape(
                                    b.2,
                                    1,
                                    format!("a second {name} sample at the same time"),
                                );
                            }
                        }
                    }
                    specs.push(ChannelSpec {
                        channel: name,
                        unit,
                        t_s: kept.iter().map(|x| x.0).collect(),
                        values: kept.iter().map(|x| x.1).collect(),
                    });
                }
            }
        }
        specs
    }
}

/// The samples of one wide row at time `t`, straight into their columns:
/// rows run forward, so every column is in time order as read. Returns
/// how many were kept.
fn wide_row<'c>(
    r: &mut Reader,
    decimal_comma: bool,
    (line, t): (usize, f64),
    cells: impl Iterator<Item = &'c str>,
    columns: &mut [Option<Column>],
    near: &mut Vec<(usize, usize)>,
) -> usize {
    let mut kept = 0;
    for (col, (cell, column)) in cells.zip(columns.iter_mut()).enumerate() {
        let Some(column) = column else {
            continue;
        };
        let cell = trim(cell);
        if cell.is_empty() {
            continue;
        }
        let Some(v) = number(cell, decimal_comma) else {
            r.error(
                line,
                col + 2,
                ErrorKind::Quantity {
                    message: format!("'{cell}' is not a number"),
                },
            );
            continue;
        };
        let inside = column.inside.0 < v && v < column.inside.1;
        let entry = PressureEntry::new(v, column.unit);
        if !inside && !in_range(r, line, col + 2, entry, column.range) {
            continue;
        }
        if column.t_s.last().is_some_and(|last| t - last < 1e-9) {
            near.push((col, line));
        }
        column.t_s.push(t);
        column.values.push(v);
        kept += 1;
    }
    kept
}

/// The reading of one long row; whether it was kept.
fn long_row(
    r: &mut Reader,
    scene: &Scene,
    decimal_comma: bool,
    (line, t, name, value): (usize, f64, &str, &str),
    known: &mut Vec<Known>,
    channels: &mut Vec<Samples>,
) -> bool {
    let name = name.trim();
    let at = known
        .iter()
        .position(|(n, ..)| n == name)
        .unwrap_or_else(|| {
            let range = channel_input(scene, name).map(input_range);
            known.push((name.to_owned(), range, None));
            known.len() - 1
        });
    let Some((_, range, slot)) = known.get_mut(at) else {
        return false;
    };
    let range = match range {
        Ok(range) => *range,
        Err(message) => {
            r.shape(line, 2, message.clone());
            return false;
        }
    };
    let entry = match decimal(value, decimal_comma).parse::<PressureEntry>() {
        Ok(e) => e,
        Err(e) => {
            r.error(
                line,
                3,
                ErrorKind::Quantity {
                    message: e.to_string(),
                },
            );
            return false;
        }
    };
    if !in_range(r, line, 3, entry, range) {
        return false;
    }
    let index = *slot.get_or_insert_with(|| {
        channels.push((name.to_owned(), entry.unit, Vec::new()));
        channels.len() - 1
    });
    let Some((_, unit, kept)) = channels.get_mut(index) else {
        return false;
    };
    if *unit != entry.unit {
        r.shape(
            line,
            3,
            format!("{name} was given in {unit} before; keep one unit per channel"),
        );
        return false;
    }
    kept.push((t, entry.amount, line));
    true
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
    for (row, (line, text)) in lines.enumerate() {
        if rows.r.full {
            break;
        }
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
        let parsed = name_and_unit(cell).and_then(|(name, unit)| {
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
            Err(message) => {
                r.shape(header_line, col + 1, message);
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

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use crate::case::Case;

    fn scene() -> Scene {
        Scene::from_case(&Case::from_json(crate::demo::CASE_JSON).unwrap()).unwrap()
    }

    fn fields_of(text: &str) -> Vec<String> {
        import(text, &scene())
            .unwrap_err()
            .iter()
            .map(|e| e.field.clone())
            .collect()
    }

    #[test]
    fn wide_file_with_units_and_gaps() {
        let text = "# from a monitor\nelapsed_s,radial line.mean [mmHg],icp [cmH2O]\n0,74,14\n1,73,\n2,,13.5\n";
        let spec = import(text, &scene()).unwrap();
        assert_eq!(spec.channels.len(), 2);
        assert_eq!(spec.channels[0].t_s, vec![0.0, 1.0]);
        assert_eq!(spec.channels[1].unit, PressureUnit::CmH2O);
        assert_eq!(spec.channels[1].values, vec![14.0, 13.5]);
    }

    #[test]
    fn long_file_with_clock_times_crossing_midnight() {
        let text = "time,channel,value\n23:59:30,radial line.mean,74 mmHg\n00:00:30,radial line.mean,70 mmHg\n";
        let spec = import(text, &scene()).unwrap();
        assert_eq!(spec.channels[0].t_s, vec![0.0, 60.0]);
        assert_eq!(spec.clock_start.as_deref(), Some("23:59:30"));
    }

    #[test]
    fn semicolons_take_decimal_commas() {
        let text = "elapsed_s;radial line.mean [mmHg]\n0;74,5\n";
        let spec = import(text, &scene()).unwrap();
        assert_eq!(spec.channels[0].values, vec![74.5]);
    }

    #[test]
    fn every_problem_has_its_line_and_column() {
        let text = "elapsed_s,radial line.mean [mmHg],femoral.mean [mmHg],cvp\n\
                    0,74,1\n\
                    x,70\n\
                    1,700\n\
                    1,70\n";
        let fields = fields_of(text);
        assert!(
            fields.contains(&"line 1, column 3".to_owned()),
            "{fields:?}"
        );
        assert!(
            fields.contains(&"line 1, column 4".to_owned()),
            "{fields:?}"
        );
        assert!(fields.contains(&"line 3".to_owned()), "{fields:?}");
        assert!(fields.contains(&"line 4".to_owned()), "{fields:?}");
    }

    #[test]
    fn values_out_of_range_and_backward_times() {
        let text = "elapsed_s,radial line.mean [mmHg]\n0,74\n5,700\n3,70\n";
        let fields = fields_of(text);
        assert_eq!(fields, vec!["line 3, column 2", "line 4, column 1"]);
    }

    #[test]
    fn samples_a_nanosecond_apart_are_one_time() {
        let text = "elapsed_s,radial line.mean [mmHg],icp [mmHg]\n1,70,\n1.0000000001,71,9\n";
        let errors = import(text, &scene()).unwrap_err().to_string();
        assert_eq!(
            errors,
            "line 3, column 1: a second radial line.mean sample at the same time"
        );
        let text =
            "time,channel,value\n00:00:01,icp,9 mmHg\n00:00:03,icp,8 mmHg\n00:00:01,icp,7 mmHg\n";
        let errors = import(text, &scene()).unwrap_err().to_string();
        assert_eq!(
            errors,
            "line 4, column 1: a second icp sample at the same time"
        );
    }

    #[test]
    fn export_reads_back() {
        let text = "elapsed_s,radial line.mean [mmHg],left arm cuff.mean [mmHg]\n0,74,\n1,73,79\n";
        let spec = import(text, &scene()).unwrap();
        let again = import(&export(&spec), &scene()).unwrap();
        assert_eq!(spec, again);
    }

    proptest::proptest! {
        #![proptest_config(proptest::prelude::ProptestConfig::with_cases(3000))]

        /// The quick number reader gives the standard reader's f64, bit
        /// for bit, or refuses what it refuses.
        #[test]
        fn numbers_read_as_the_standard_reader_reads_them(
            text in "-?[0-9]{0,18}(\\.[0-9]{0,18})?|[-+0-9.eE ,x]{0,12}|(-?[0-9]{1,8}\\.[0-9]{1,8})",
        ) {
            let quick = parse_f64(&text).map(f64::to_bits);
            let standard = text.parse::<f64>().ok().map(f64::to_bits);
            proptest::prop_assert_eq!(quick, standard, "{:?}", text);
        }

        /// Any text is read or refused with messages, never a panic.
        #[test]
        fn any_text_imports_or_errs(text in "(?s).{0,600}") {
            if let Err(errors) = import(&text, &scene()) {
                proptest::prop_assert!(errors.iter().all(|e| !e.to_string().is_empty()));
            }
        }

        /// A valid file with bytes changed anywhere never panics either.
        #[test]
        fn mutated_files_never_panic(
            edits in proptest::collection::vec((0usize..400, proptest::prelude::any::<char>()), 1..12)
        ) {
            let mut chars: Vec<char> = "time,channel,value\n08:00:00,radial line.mean,74 mmHg\n\
                 08:00:01,radial line.mean,73,5 mmHg\n23:59:59,icp,14 cmH2O\n\
                 2026-03-04T08:00:00Z,left arm cuff.systolic,120 mmHg\n"
                .chars()
                .collect();
            for (at, c) in edits {
                let len = chars.len();
                if let Some(x) = chars.get_mut(at % len) {
                    *x = c;
                }
            }
            let text: String = chars.into_iter().collect();
            let _ = import(&text, &scene());
            let wide = text.replace("time,channel,value", "elapsed_s,radial line.mean [mmHg]");
            let _ = import(&wide, &scene());
        }
    }

    #[test]
    fn caps_are_met_before_a_line_is_split() {
        let long = format!("0,{}\n", "7".repeat(MAX_CSV_LINE_BYTES));
        let text = format!("elapsed_s,radial line.mean [mmHg]\n{long}");
        assert_eq!(
            import(&text, &scene()).unwrap_err().to_string(),
            "line 2: 65538 bytes in one line; at most 65536 are accepted"
        );
        let header = format!("elapsed_s{}\n0\n", ",x".repeat(MAX_CSV_COLUMNS));
        assert_eq!(
            import(&header, &scene()).unwrap_err().to_string(),
            "line 1: 258 columns; at most 257 are accepted"
        );
        let big = " ".repeat(limits::MAX_DOCUMENT_BYTES + 1);
        assert_eq!(
            import(&big, &scene()).unwrap_err().to_string(),
            "16777217 bytes; at most 16777216 are accepted"
        );
    }

    #[test]
    fn empty_and_headless_files() {
        assert!(import("", &scene()).is_err());
        assert!(import("# only a comment\n", &scene()).is_err());
        assert!(import("elapsed_s,radial line.mean [mmHg]\n", &scene()).is_err());
        assert!(import("when,radial line.mean [mmHg]\n0,1\n", &scene()).is_err());
    }
}

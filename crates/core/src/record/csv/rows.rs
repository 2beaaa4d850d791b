//! The record CSV reader's rows: the layout the header chose (wide columns
//! or long channel rows) and each row read into its channels, every problem
//! named by line and column.

use super::*;

/// A wide file's column: its channel, unit, accepted range in mmHg and
/// samples so far.
pub(super) struct Column {
    pub(super) name: String,
    pub(super) unit: PressureUnit,
    pub(super) range: (f64, f64),
    /// The range in the column's own unit, narrowed by a billionth: a
    /// value strictly inside is in range whatever the conversion rounds,
    /// so only values at the edges are converted to be sure.
    pub(super) inside: (f64, f64),
    pub(super) t_s: Vec<f64>,
    pub(super) values: Vec<f64>,
}

/// A long file's channel as read so far: its name, its unit (from its
/// first sample) and its samples with the line each came from, in the
/// order of the file.
pub(super) type Samples = (String, PressureUnit, Vec<(f64, f64, usize)>);

/// A channel name met in a long file: its accepted range in mmHg or why
/// it is none, and its place among the channels once a sample is kept.
pub(super) type Known = (String, Result<(f64, f64), ErrorKind>, Option<usize>);

/// How the rows of one layout are read into their channels.
pub(super) enum Layout {
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
pub(super) struct Rows<'a> {
    pub(super) r: Reader,
    pub(super) decimal_comma: bool,
    pub(super) clock: Clock,
    pub(super) width: usize,
    pub(super) scene: &'a Scene,
    pub(super) layout: Layout,
    pub(super) samples: usize,
}

impl Rows<'_> {
    /// Reads one row of `count` cells; `false` when the reading must stop.
    pub(super) fn row<'c>(
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

    /// Gives each wide column room for `rows_left` more rows at the share
    /// of the `rows_read` it filled, and a little more, within the samples
    /// the file may still bring; `shrink_to_fit` at the end returns what
    /// was not used. Room that cannot be had is left to the columns' usual
    /// growth.
    pub(super) fn reserve(&mut self, rows_read: usize, rows_left: usize) {
        let Layout::Wide { columns, .. } = &mut self.layout else {
            return;
        };
        let rows_left = rows_left.min(MAX_CSV_ROWS);
        // Never more room in all than the samples a file may still bring.
        let mut budget = MAX_SAMPLES.saturating_sub(self.samples);
        for column in columns.iter_mut().flatten() {
            let filled = column.t_s.len();
            let more = filled.saturating_mul(rows_left) / rows_read.max(1);
            let more = more
                .saturating_add(more / 50)
                .saturating_add(16)
                .min(budget);
            budget -= more;
            // Only an allocation that fails is refused here, never a panic.
            let _ = column.t_s.try_reserve_exact(more);
            let _ = column.values.try_reserve_exact(more);
        }
    }

    /// The channels read, once every row is: a wide file's columns as they
    /// are, a long file's channels sorted by time, each with its problems.
    pub(super) fn channels(&mut self) -> Vec<ChannelSpec> {
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
pub(super) fn wide_row<'c>(
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
pub(super) fn long_row(
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
        Err(kind) => {
            r.error(line, 2, kind.clone());
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

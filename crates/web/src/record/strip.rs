//! Downsampling for drawing: a polyline of any length reduced to the top
//! and bottom it reaches in each pixel column, so an eight-hour record at
//! 1 Hz draws as a few hundred columns without losing a dip.
//!
//! Works on chart coordinates (SVG units, y downwards), after scaling:
//! where a segment crosses a column edge, its height there is found on the
//! drawn line itself. Nothing here knows what the values mean.

/// A polyline's extent over consecutive pixel columns.
#[derive(Clone, Debug, PartialEq)]
pub struct Strip {
    /// The first column's index.
    pub first: usize,
    /// For each column from `first`: the smallest and largest y the line
    /// reaches in it.
    pub spans: Vec<(f64, f64)>,
}

impl Strip {
    fn touch(&mut self, column: usize, y: f64) {
        let Some(k) = column.checked_sub(self.first) else {
            return;
        };
        while self.spans.len() <= k {
            self.spans.push((y, y));
        }
        if let Some((top, bottom)) = self.spans.get_mut(k) {
            *top = top.min(y);
            *bottom = bottom.max(y);
        }
    }
}

/// The extent of `points` (x never decreasing) over `columns` columns of
/// one unit each, the first starting at `x0`; points outside are clamped to
/// the first or last column. `None` for no points or no columns.
pub fn strip(points: &[(f64, f64)], x0: f64, columns: usize) -> Option<Strip> {
    let last = columns.checked_sub(1)?;
    let column = |x: f64| ((x - x0).floor().max(0.0) as usize).min(last);
    let &(x_first, y_first) = points.first()?;
    let mut out = Strip {
        first: column(x_first),
        spans: Vec::new(),
    };
    out.touch(out.first, y_first);
    for pair in points.windows(2) {
        let &[(xa, ya), (xb, yb)] = pair else {
            continue;
        };
        let (ca, cb) = (column(xa), column(xb));
        // Where the segment crosses each column edge between its ends.
        for c in ca + 1..=cb {
            let edge = x0 + c as f64;
            let y = if xb > xa {
                ya + (yb - ya) * ((edge - xa) / (xb - xa)).clamp(0.0, 1.0)
            } else {
                yb
            };
            out.touch(c - 1, y);
            out.touch(c, y);
        }
        out.touch(cb, yb);
    }
    Some(out)
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;

    #[test]
    fn dense_points_keep_their_extremes_per_column() {
        // 1000 points over 10 columns, with one deep spike in column 7.
        let points: Vec<(f64, f64)> = (0..1000)
            .map(|i| {
                let x = f64::from(i) / 100.0;
                let y = if i == 734 {
                    95.0
                } else {
                    50.0 + (f64::from(i) % 7.0)
                };
                (x, y)
            })
            .collect();
        let s = strip(&points, 0.0, 10).unwrap();
        assert_eq!(s.first, 0);
        assert_eq!(s.spans.len(), 10);
        assert_eq!(s.spans[7], (50.0, 95.0));
        assert_eq!(s.spans[3], (50.0, 56.0));
    }

    #[test]
    fn a_long_segment_is_cut_at_each_column_edge() {
        // From (0.5, 0) to (4.5, 40): 10 per column.
        let s = strip(&[(0.5, 0.0), (4.5, 40.0)], 0.0, 8).unwrap();
        assert_eq!(
            s.spans,
            vec![
                (0.0, 5.0),
                (5.0, 15.0),
                (15.0, 25.0),
                (25.0, 35.0),
                (35.0, 40.0)
            ]
        );
    }

    #[test]
    fn a_step_is_one_column_tall() {
        let s = strip(
            &[(1.2, 10.0), (2.5, 10.0), (2.5, 30.0), (3.5, 30.0)],
            0.0,
            5,
        )
        .unwrap();
        assert_eq!(s.first, 1);
        assert_eq!(s.spans, vec![(10.0, 10.0), (10.0, 30.0), (30.0, 30.0)]);
    }

    #[test]
    fn edges_and_empty_input() {
        assert_eq!(strip(&[], 0.0, 4), None);
        assert_eq!(strip(&[(1.0, 1.0)], 0.0, 0), None);
        let s = strip(&[(-3.0, 1.0), (9.0, 2.0)], 0.0, 4).unwrap();
        assert_eq!(s.first, 0);
        assert_eq!(s.spans.len(), 4);
        let one = strip(&[(2.2, 7.0)], 0.0, 4).unwrap();
        assert_eq!((one.first, one.spans), (2, vec![(7.0, 7.0)]));
    }
}

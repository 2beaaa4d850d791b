//! The organ-level series of a record: as CSV for download, and as data
//! (observed runs of points) for drawing.

use serde::Serialize;

use super::timeline::Timeline;
use super::walk::{plan, walk};
use crate::organ::{Metric, Organ};
use crate::scene::Scene;
use crate::units::{to_mmhg, Pressure};

/// The organ-level series as CSV: one row per event time, one column per
/// followed target's metric, in mmHg, blank where unobserved. Each row
/// holds the value at the start of the interval that begins there; the last
/// row the value at the end of the last interval.
pub fn series_csv(scene: &Scene, timeline: &Timeline) -> String {
    let (from, to) = timeline.span().unwrap_or((0.0, 0.0));
    let plan = plan(scene, timeline);
    let mut columns: Vec<(Organ, Metric)> = Vec::new();
    for f in &plan.followed {
        let key = (f.target.organ, f.target.metric);
        if !columns.contains(&key) {
            columns.push(key);
        }
    }
    let column_of: Vec<usize> = plan
        .followed
        .iter()
        .map(|f| {
            columns
                .iter()
                .position(|k| *k == (f.target.organ, f.target.metric))
                .unwrap_or(0)
        })
        .collect();
    let mut out = String::from("elapsed_s");
    for (organ, metric) in &columns {
        out.push_str(&format!(",{}.{} [mmHg]", organ.key(), metric.key()));
    }
    out.push('\n');
    let cell = |v: Option<Pressure>| v.map_or(String::new(), |p| format!("{:.2}", to_mmhg(p)));
    let mut last: Option<(f64, Vec<Option<Pressure>>)> = None;
    walk(scene, timeline, &plan, from, to, |a, b, ends| {
        let mut start = vec![None; columns.len()];
        let mut end = vec![None; columns.len()];
        for (k, e) in column_of.iter().zip(ends) {
            if let (Some(s), Some(x), Some((ma, mb))) = (start.get_mut(*k), end.get_mut(*k), e) {
                *s = Some(*ma);
                *x = Some(*mb);
            }
        }
        out.push_str(&format!("{a}"));
        for v in &start {
            out.push(',');
            out.push_str(&cell(*v));
        }
        out.push('\n');
        last = Some((b, end));
    });
    if let Some((b, end)) = last {
        out.push_str(&format!("{b}"));
        for v in &end {
            out.push(',');
            out.push_str(&cell(*v));
        }
        out.push('\n');
    }
    out
}

/// One observed stretch of a metric over a record: points joined by
/// straight lines. A held reading replaced by the next gives a step, two
/// points at one time.
#[derive(Clone, Debug, Default, PartialEq, Serialize)]
pub struct Run {
    /// Times, seconds from the start, never decreasing.
    pub t_s: Vec<f64>,
    /// The metric at those times, mmHg.
    pub mmhg: Vec<f64>,
}

/// A followed metric's organ-level values over a record, for drawing.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MetricSeries {
    /// The organ.
    pub organ: Organ,
    /// The metric.
    pub metric: Metric,
    /// The metric's name (`"CPP"`).
    pub label: &'static str,
    /// The observed stretches, in time order; unobserved time lies between
    /// them.
    pub runs: Vec<Run>,
}

/// The organ-level series as data: one entry per followed organ and
/// metric, in the order of [`series_csv`]'s columns and with the same
/// values, over the record's span. Where [`series_csv`] writes one value per
/// event time, this keeps both ends of every interval, so steps and gaps
/// are exact.
///
/// # Example
/// ```
/// use plumbline_core::{case::Case, record, scene::Scene};
/// let case = Case::from_json(plumbline_core::demo::CASE_JSON).unwrap();
/// let scene = Scene::from_case(&case).unwrap();
/// let csv = "elapsed_s,radial line.mean [mmHg]\n0,70\n60,60\n";
/// let spec = record::csv::import(csv, &scene).unwrap();
/// let timeline = record::Timeline::from_spec(&spec, &scene).unwrap();
/// let series = record::series(&scene, &timeline);
/// let map = series.iter().find(|s| s.label == "MAP at the heart").unwrap();
/// assert_eq!(map.runs[0].t_s, vec![0.0, 60.0]);
/// assert_eq!(map.runs[0].mmhg, vec![70.0, 60.0]);
/// ```
pub fn series(scene: &Scene, timeline: &Timeline) -> Vec<MetricSeries> {
    let (from, to) = timeline.span().unwrap_or((0.0, 0.0));
    let plan = plan(scene, timeline);
    let mut out: Vec<MetricSeries> = Vec::new();
    // For each followed target, the series it feeds if it is the first of
    // its organ and metric (later ones give the same values).
    let mut feeds: Vec<Option<usize>> = Vec::new();
    for f in &plan.followed {
        let (organ, metric) = (f.target.organ, f.target.metric);
        if out.iter().any(|s| (s.organ, s.metric) == (organ, metric)) {
            feeds.push(None);
        } else {
            feeds.push(Some(out.len()));
            out.push(MetricSeries {
                organ,
                metric,
                label: organ.metric_label(metric),
                runs: Vec::new(),
            });
        }
    }
    let mut open = vec![false; out.len()];
    walk(scene, timeline, &plan, from, to, |a, b, ends| {
        for (k, end) in feeds.iter().zip(ends) {
            let Some(k) = *k else { continue };
            let (Some(s), Some(is_open)) = (out.get_mut(k), open.get_mut(k)) else {
                continue;
            };
            let Some((ma, mb)) = end else {
                *is_open = false;
                continue;
            };
            if !*is_open {
                s.runs.push(Run::default());
                *is_open = true;
            }
            let Some(run) = s.runs.last_mut() else {
                continue;
            };
            let (va, vb) = (to_mmhg(*ma), to_mmhg(*mb));
            let joins = run.t_s.last() == Some(&a) && run.mmhg.last() == Some(&va);
            if !joins {
                run.t_s.push(a);
                run.mmhg.push(va);
            }
            run.t_s.push(b);
            run.mmhg.push(vb);
        }
    });
    out
}

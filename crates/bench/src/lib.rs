//! The record workload of the benchmarks: an invented eight-hour record at
//! 1 Hz with four sources (28,800 rows), the same record run to the longest
//! accepted, 72 hours (259,200 rows), its case, and the three steps the app
//! runs on it (CSV import, checking the record, exposure analysis).
//!
//! One generator serves the native criterion bench, the native timing
//! binary and the wasm exports, so native and browser numbers measure the
//! same work.

use plumbline_core::case::Case;
use plumbline_core::error::Errors;
use plumbline_core::record::{self, csv, Timeline};
use plumbline_core::scene::Scene;

/// Rows in the eight-hour record.
pub const ROWS: usize = 28_800;
/// Rows in the 72-hour record, the longest a record may run.
pub const ROWS_72H: usize = 259_200;

/// An invented sitting-position case with a line, a cuff, CVP and ICP.
pub const CASE: &str = r#"{
  "format": "plumbline-case", "version": 1,
  "patient": { "height": "178 cm" },
  "position": { "posture": "sitting" },
  "arterial": [
    { "id": "radial line", "method": "transducer", "level": "tragus", "mean": "75 mmHg" },
    { "id": "arm cuff", "method": "cuff", "level": "upper_arm_left", "mean": "95 mmHg" }
  ],
  "readings": {
    "cvp": { "value": "6 mmHg", "method": "transducer", "level": "heart" },
    "icp": { "value": "10 mmHg", "method": "probe", "level": "tragus" }
  }
}"#;

/// The record as CSV: four channels at 1 Hz (the cuff every 3 minutes),
/// smooth and deterministic so every run measures the same work.
pub fn record_csv(rows: usize) -> String {
    let mut out = String::from(
        "elapsed_s,radial line.mean [mmHg],arm cuff.mean [mmHg],cvp [mmHg],icp [mmHg]\n",
    );
    for t in 0..rows {
        let x = t as f64;
        let map = 72.0 + 9.0 * (x / 900.0).sin() + 2.0 * (x / 13.0).sin();
        let cuff = if t % 180 == 0 {
            format!("{:.0}", map + 20.0)
        } else {
            String::new()
        };
        let cvp = 6.0 + 2.0 * (x / 600.0).cos();
        let icp = 11.0 + 4.0 * (x / 1700.0).sin();
        out.push_str(&format!("{t},{map:.1},{cuff},{cvp:.1},{icp:.1}\n"));
    }
    out
}

/// The case's checked scene.
///
/// # Errors
/// Never for the built-in case; the type says so honestly.
pub fn scene() -> Result<Scene, Errors> {
    Scene::from_case(&Case::from_json(CASE)?)
}

/// Imports the CSV; returns the number of samples.
///
/// # Errors
/// Problems with the file.
pub fn import(scene: &Scene, text: &str) -> Result<usize, Errors> {
    let spec = csv::import(text, scene)?;
    Ok(spec.channels.iter().map(|c| c.t_s.len()).sum())
}

/// The CSV read by the `csv` crate into the columns the importer fills
/// (each channel's times and values, empty cells skipped) with none of its
/// checks: the floor of issue 12's "library speed" target, the least a
/// reader built on the library would do. Returns the number of samples.
pub fn csv_crate_columns(text: &str) -> usize {
    let mut reader = ::csv::ReaderBuilder::new().from_reader(text.as_bytes());
    let channels = reader.headers().map_or(0, |h| h.len().saturating_sub(1));
    let mut columns: Vec<(Vec<f64>, Vec<f64>)> = vec![(Vec::new(), Vec::new()); channels];
    let mut record = ::csv::StringRecord::new();
    while let Ok(true) = reader.read_record(&mut record) {
        let mut cells = record.iter().map(str::trim);
        let Some(Ok(t)) = cells.next().map(str::parse::<f64>) else {
            continue;
        };
        for ((times, values), cell) in columns.iter_mut().zip(cells) {
            if let Ok(v) = cell.parse::<f64>() {
                times.push(t);
                values.push(v);
            }
        }
    }
    // The columns are the result: kept, or the pushes could be dropped.
    std::hint::black_box(&columns);
    columns.iter().map(|(times, _)| times.len()).sum()
}

/// The CSV's records read by the `csv` crate, no cell parsed: the bound
/// [`csv_crate_columns`] cannot pass. Returns the number of records.
pub fn csv_crate_records(text: &str) -> usize {
    let mut reader = ::csv::ReaderBuilder::new().from_reader(text.as_bytes());
    let mut record = ::csv::StringRecord::new();
    let mut records = 0;
    while let Ok(true) = reader.read_record(&mut record) {
        std::hint::black_box(&record);
        records += 1;
    }
    records
}

/// Imports and checks the record, ready for analysis.
///
/// # Errors
/// Problems with the file.
pub fn timeline(scene: &Scene, text: &str) -> Result<Timeline, Errors> {
    Timeline::from_spec(&csv::import(text, scene)?, scene)
}

/// Analyses the record; returns the total minutes outside any target, so
/// the work cannot be optimised away.
pub fn analyze(scene: &Scene, timeline: &Timeline) -> f64 {
    record::analyze(scene, timeline, None)
        .targets
        .iter()
        .map(|t| t.outside_min)
        .sum()
}

#[cfg(target_arch = "wasm32")]
mod wasm {
    //! The workload as wasm exports; the browser script times each call.

    use wasm_bindgen::prelude::*;

    fn js(errors: plumbline_core::error::Errors) -> JsValue {
        JsValue::from_str(&errors.to_string())
    }

    /// The record as CSV text.
    #[wasm_bindgen]
    pub fn record_csv(rows: usize) -> String {
        super::record_csv(rows)
    }

    /// Imports the CSV; returns the number of samples.
    #[wasm_bindgen]
    pub fn import_record(text: &str) -> Result<usize, JsValue> {
        let scene = super::scene().map_err(js)?;
        super::import(&scene, text).map_err(js)
    }

    /// A record ready for repeated analysis.
    #[wasm_bindgen]
    pub struct Prepared {
        scene: plumbline_core::scene::Scene,
        timeline: plumbline_core::record::Timeline,
    }

    #[wasm_bindgen]
    impl Prepared {
        /// Imports and checks the record.
        #[wasm_bindgen(constructor)]
        pub fn new(text: &str) -> Result<Prepared, JsValue> {
            let scene = super::scene().map_err(js)?;
            let timeline = super::timeline(&scene, text).map_err(js)?;
            Ok(Prepared { scene, timeline })
        }

        /// Analyses the record; returns total minutes outside targets.
        pub fn analyze(&self) -> f64 {
            super::analyze(&self.scene, &self.timeline)
        }
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    #[test]
    fn the_workload_has_the_stated_size_and_is_analysable() {
        let scene = scene().unwrap();
        let text = record_csv(ROWS);
        // Three channels at 1 Hz and the cuff every 180 s.
        assert_eq!(import(&scene, &text).unwrap(), 3 * ROWS + ROWS / 180);
        let timeline = timeline(&scene, &text).unwrap();
        assert!(analyze(&scene, &timeline).is_finite());
    }

    #[test]
    fn the_csv_crate_reads_every_record_and_sample_the_importer_does() {
        let scene = scene().unwrap();
        let text = record_csv(ROWS);
        assert_eq!(csv_crate_records(&text), ROWS);
        assert_eq!(csv_crate_columns(&text), import(&scene, &text).unwrap());
    }
}

//! An eight-hour record at 1 Hz with four sources (28,800 rows): CSV import,
//! checking the record, and the exposure analysis, each reported as samples
//! per second. Numbers go in DEVELOPERS.md.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use plumbline_core::case::Case;
use plumbline_core::record::{self, csv, Timeline};
use plumbline_core::scene::Scene;
use std::hint::black_box;

const ROWS: usize = 28_800;

/// An invented sitting-position case with a line, a cuff, CVP and ICP.
const CASE: &str = r#"{
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

/// Four channels at 1 Hz (the cuff every 3 minutes), smooth and
/// deterministic so every run measures the same work.
fn record_csv() -> String {
    let mut out = String::from(
        "elapsed_s,radial line.mean [mmHg],arm cuff.mean [mmHg],cvp [mmHg],icp [mmHg]\n",
    );
    for t in 0..ROWS {
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

fn bench(c: &mut Criterion) {
    let Ok(case) = Case::from_json(CASE) else {
        return;
    };
    let Ok(scene) = Scene::from_case(&case) else {
        return;
    };
    let text = record_csv();
    let Ok(spec) = csv::import(&text, &scene) else {
        return;
    };
    let samples: usize = spec.channels.iter().map(|c| c.t_s.len()).sum();
    let Ok(timeline) = Timeline::from_spec(&spec, &scene) else {
        return;
    };
    let mut group = c.benchmark_group("record 8 h at 1 Hz, 4 sources");
    group.throughput(Throughput::Elements(samples as u64));
    group.sample_size(10);
    group.bench_function("csv import", |b| {
        b.iter(|| csv::import(black_box(&text), &scene))
    });
    group.bench_function("check record", |b| {
        b.iter(|| Timeline::from_spec(black_box(&spec), &scene))
    });
    group.bench_function("exposure analysis", |b| {
        b.iter(|| record::analyze(&scene, black_box(&timeline), None))
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);

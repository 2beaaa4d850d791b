//! The eight-hour, 1 Hz, four-source record (28,800 rows) under criterion:
//! CSV import, checking the record, and exposure analysis, reported as
//! samples per second. Numbers go in DEVELOPERS.md.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use plumbline_bench::{analyze, import, record_csv, scene, timeline, ROWS};
use std::hint::black_box;

fn bench(c: &mut Criterion) {
    let (Ok(scene), text) = (scene(), record_csv(ROWS)) else {
        return;
    };
    let (Ok(samples), Ok(tl)) = (import(&scene, &text), timeline(&scene, &text)) else {
        return;
    };
    let mut group = c.benchmark_group("record 8 h at 1 Hz, 4 sources");
    group.throughput(Throughput::Elements(samples as u64));
    group.sample_size(10);
    group.bench_function("csv import", |b| {
        b.iter(|| import(&scene, black_box(&text)))
    });
    group.bench_function("import and check", |b| {
        b.iter(|| timeline(&scene, black_box(&text)))
    });
    group.bench_function("exposure analysis", |b| {
        b.iter(|| analyze(&scene, black_box(&tl)))
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);

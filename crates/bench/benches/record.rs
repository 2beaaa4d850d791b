//! The record workloads under criterion. The eight-hour, 1 Hz, four-source
//! record (28,800 rows): CSV import, checking the record, and exposure
//! analysis, as samples per second. The same record run to 72 hours
//! (259,200 rows, about 5.5 MB): CSV import in bytes per second, beside a
//! reference reading of the same file with the `csv` crate and the
//! standard number reader into the same columns, so the hand-written
//! reader's speed is measured against the library's. Numbers go in
//! DEVELOPERS.md.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use plumbline_bench::{
    analyze, csv_crate_columns, import, record_csv, scene, timeline, ROWS, ROWS_72H,
};
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

    let long = record_csv(ROWS_72H);
    // Both read every sample, or the comparison means nothing.
    if import(&scene, &long).ok() != Some(csv_crate_columns(&long)) {
        eprintln!("record: the reference reading of the 72-hour file differs");
        return;
    }
    let mut group = c.benchmark_group("record 72 h at 1 Hz, 4 sources");
    group.throughput(Throughput::Bytes(long.len() as u64));
    group.sample_size(10);
    group.bench_function("csv import", |b| {
        b.iter(|| import(&scene, black_box(&long)))
    });
    group.bench_function("csv crate reference (no checks)", |b| {
        b.iter(|| csv_crate_columns(black_box(&long)))
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);

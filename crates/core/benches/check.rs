//! How long one full check takes: reading the case, every organ with its
//! range (each uncertain input shifted both ways), targets and the backrest
//! sweep. The screen re-runs it on every keystroke, so it must stay well
//! under a frame.

use criterion::{criterion_group, criterion_main, Criterion};
use plumbline_core::{case::Case, check, demo, scene::Scene};
use std::hint::black_box;

fn bench(c: &mut Criterion) {
    c.bench_function("check_json demo (parse + check)", |b| {
        b.iter(|| check::check_json(black_box(demo::CASE_JSON)))
    });
    if let Ok(scene) = Case::from_json(demo::CASE_JSON).and_then(|case| Scene::from_case(&case)) {
        c.bench_function("check demo scene", |b| {
            b.iter(|| check::check(black_box(&scene)))
        });
    }
}

criterion_group!(benches, bench);
criterion_main!(benches);

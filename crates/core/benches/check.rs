//! How long one full check takes: reading the case, every organ with its
//! range (each uncertain input shifted both ways), targets and the backrest
//! sweep. The screen re-runs it on every keystroke, so it must stay well
//! under a frame. Then the same check as the arterial sources grow: the
//! demo's line repeated to 1, 10, 50 and the cap (`limits::MAX_ARTERIAL`)
//! sources, each with its own id, to show how the cost grows with them.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use plumbline_core::{case::Case, check, demo, limits::MAX_ARTERIAL, scene::Scene};
use std::hint::black_box;

/// The demo case with its line repeated to `n` arterial sources.
fn with_sources(n: usize) -> Option<Case> {
    let mut case = Case::from_json(demo::CASE_JSON).ok()?;
    let line = case.arterial.first()?.clone();
    case.arterial = (1..=n)
        .map(|i| {
            let mut source = line.clone();
            source.id = format!("{} {i}", line.id);
            source
        })
        .collect();
    case.primary_arterial = None;
    Some(case)
}

fn bench(c: &mut Criterion) {
    c.bench_function("check_json demo (parse + check)", |b| {
        b.iter(|| check::check_json(black_box(demo::CASE_JSON)))
    });
    if let Ok(scene) = Case::from_json(demo::CASE_JSON).and_then(|case| Scene::from_case(&case)) {
        c.bench_function("check demo scene", |b| {
            b.iter(|| check::check(black_box(&scene)))
        });
    }
    let mut group = c.benchmark_group("check_case over arterial sources");
    group.sample_size(10);
    for n in [1, 10, 50, MAX_ARTERIAL] {
        let Some(case) = with_sources(n) else {
            continue;
        };
        // A benchmark of refusals would measure nothing.
        if check::check_case(&case).is_err() {
            eprintln!("check: the demo with {n} sources does not check");
            continue;
        }
        group.bench_with_input(BenchmarkId::from_parameter(n), &case, |b, case| {
            b.iter(|| check::check_case(black_box(case)))
        });
    }
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);

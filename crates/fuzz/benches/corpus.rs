//! The slowest input of each decoder's corpus and seeds, under criterion:
//! one replay finds it, then criterion times it. The regression corpus
//! holds the inputs that were slow (120 sources, a long link, deep
//! nesting, a huge CSV line); this is where their cost is measured, never
//! in a test. Numbers go in DEVELOPERS.md.

use criterion::{criterion_group, criterion_main, Criterion};
use plumbline_fuzz::{replay, root, Decoder};
use std::hint::black_box;

fn bench(c: &mut Criterion) {
    let mut group = c.benchmark_group("slowest corpus input");
    group.sample_size(10);
    for decoder in Decoder::ALL {
        let seeds = decoder.seeds(&root());
        let report = replay(decoder, &seeds);
        let Some((_, name, input)) = report.slowest else {
            continue;
        };
        group.bench_function(format!("{}: {name}", decoder.name()), |b| {
            b.iter(|| decoder.run(black_box(&input)))
        });
    }
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);

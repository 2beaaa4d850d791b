//! Times the record workload natively and prints one JSON line, for
//! `scripts/bench.sh` to set beside the browser's numbers.

use std::process::ExitCode;
use std::time::Instant;

use plumbline_bench::{analyze, import, record_csv, scene, timeline, ROWS};

/// The median of `runs` timings of `f`, milliseconds.
fn median_ms(runs: usize, mut f: impl FnMut()) -> f64 {
    let mut times: Vec<f64> = (0..runs)
        .map(|_| {
            let start = Instant::now();
            f();
            start.elapsed().as_secs_f64() * 1000.0
        })
        .collect();
    times.sort_by(f64::total_cmp);
    times.get(runs / 2).copied().unwrap_or(f64::NAN)
}

fn main() -> ExitCode {
    let (Ok(scene), text) = (scene(), record_csv(ROWS)) else {
        eprintln!("bench-native: the built-in case does not read");
        return ExitCode::FAILURE;
    };
    let (Ok(samples), Ok(tl)) = (import(&scene, &text), timeline(&scene, &text)) else {
        eprintln!("bench-native: the built-in record does not read");
        return ExitCode::FAILURE;
    };
    let import_ms = median_ms(15, || {
        let _ = std::hint::black_box(import(&scene, &text));
    });
    let analyze_ms = median_ms(15, || {
        std::hint::black_box(analyze(&scene, &tl));
    });
    println!(
        "{{\"rows\": {ROWS}, \"samples\": {samples}, \"import_ms\": {import_ms:.3}, \"analyze_ms\": {analyze_ms:.3}}}"
    );
    ExitCode::SUCCESS
}

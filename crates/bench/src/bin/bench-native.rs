//! Times the record workload natively and prints one JSON line, for
//! `scripts/bench.sh` to set beside the browser's numbers: the eight-hour
//! record's steps, and the 72-hour file's import in MB/s (by the clock,
//! and by the CPU time it took, which a busy machine inflates less) with
//! the peak memory it takes (Linux: the resident high-water mark, reset
//! before the import), beside the `csv` crate reading the same file, with
//! and without its numbers, as the "library speed" it is held to.

use std::process::ExitCode;
use std::time::Instant;

use plumbline_bench::{
    analyze, csv_crate_columns, csv_crate_records, import, record_csv, scene, timeline, ROWS,
    ROWS_72H,
};

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

/// This thread's time on a CPU so far, ms (Linux; NaN elsewhere): on a
/// machine shared with other work it leaves out the time spent waiting.
fn cpu_ms() -> f64 {
    std::fs::read_to_string("/proc/thread-self/schedstat")
        .ok()
        .and_then(|s| s.split_whitespace().next()?.parse::<f64>().ok())
        .map_or(f64::NAN, |ns| ns / 1e6)
}

/// The median of `runs` CPU times of `f`, milliseconds.
fn median_cpu_ms(runs: usize, mut f: impl FnMut()) -> f64 {
    let mut times: Vec<f64> = (0..runs)
        .map(|_| {
            let start = cpu_ms();
            f();
            cpu_ms() - start
        })
        .collect();
    times.sort_by(f64::total_cmp);
    times.get(runs / 2).copied().unwrap_or(f64::NAN)
}

/// A `kB` line of `/proc/self/status`, in bytes; `None` off Linux.
fn status_bytes(key: &str) -> Option<f64> {
    let status = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = status.lines().find(|l| l.starts_with(key))?;
    let kb: f64 = line.split_whitespace().nth(1)?.parse().ok()?;
    Some(kb * 1024.0)
}

/// The memory one import takes above what the process held before it:
/// the high-water mark is reset (`clear_refs` 5), then read back.
fn import_peak_bytes(scene: &plumbline_core::scene::Scene, text: &str) -> Option<f64> {
    std::fs::write("/proc/self/clear_refs", "5").ok()?;
    let before = status_bytes("VmRSS:")?;
    let spec = std::hint::black_box(plumbline_core::record::csv::import(text, scene));
    let peak = status_bytes("VmHWM:")?;
    drop(spec);
    Some(peak - before)
}

fn main() -> ExitCode {
    let (Ok(scene), text, long) = (scene(), record_csv(ROWS), record_csv(ROWS_72H)) else {
        eprintln!("bench-native: the built-in case does not read");
        return ExitCode::FAILURE;
    };
    let (Ok(samples), Ok(tl), Ok(long_samples)) = (
        import(&scene, &text),
        timeline(&scene, &text),
        import(&scene, &long),
    ) else {
        eprintln!("bench-native: the built-in record does not read");
        return ExitCode::FAILURE;
    };
    // First, while the heap holds little else.
    let peak = import_peak_bytes(&scene, &long).unwrap_or(f64::NAN);
    // The floor reads what the importer keeps, or the comparison means nothing.
    let (floor, records) = (csv_crate_columns(&long), csv_crate_records(&long));
    if (floor, records) != (long_samples, ROWS_72H) {
        eprintln!(
            "bench-native: the csv crate read {floor} samples in {records} records, \
             the importer {long_samples} in {ROWS_72H}"
        );
        return ExitCode::FAILURE;
    }
    let import_ms = median_ms(15, || {
        let _ = std::hint::black_box(import(&scene, &text));
    });
    let analyze_ms = median_ms(15, || {
        std::hint::black_box(analyze(&scene, &tl));
    });
    let long_ms = median_ms(9, || {
        let _ = std::hint::black_box(import(&scene, &long));
    });
    let long_cpu_ms = median_cpu_ms(9, || {
        let _ = std::hint::black_box(import(&scene, &long));
    });
    let csv_parse_ms = median_ms(9, || {
        std::hint::black_box(csv_crate_columns(&long));
    });
    let csv_parse_cpu_ms = median_cpu_ms(9, || {
        std::hint::black_box(csv_crate_columns(&long));
    });
    let csv_read_ms = median_ms(9, || {
        std::hint::black_box(csv_crate_records(&long));
    });
    let csv_read_cpu_ms = median_cpu_ms(9, || {
        std::hint::black_box(csv_crate_records(&long));
    });
    let mb = long.len() as f64 / 1e6;
    println!(
        "{{\"rows\": {ROWS}, \"samples\": {samples}, \"import_ms\": {import_ms:.3}, \"analyze_ms\": {analyze_ms:.3}, \
         \"rows_72h\": {ROWS_72H}, \"samples_72h\": {long_samples}, \"mb_72h\": {mb:.3}, \"import_72h_ms\": {long_ms:.3}, \
         \"import_72h_mb_s\": {:.1}, \"import_72h_cpu_ms\": {long_cpu_ms:.3}, \"import_72h_peak_mb\": {:.1}, \
         \"csv_crate_parse_72h_ms\": {csv_parse_ms:.3}, \"csv_crate_parse_72h_cpu_ms\": {csv_parse_cpu_ms:.3}, \
         \"csv_crate_read_72h_ms\": {csv_read_ms:.3}, \"csv_crate_read_72h_cpu_ms\": {csv_read_cpu_ms:.3}}}",
        mb / long_ms * 1000.0,
        peak / 1e6
    );
    ExitCode::SUCCESS
}

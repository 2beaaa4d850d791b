//! Writes the record workload for the web benchmark (`scripts/bench-web.sh`):
//! with `--case`, the invented case as JSON; otherwise the eight-hour
//! record as CSV. The page then opens the very case and record that the
//! native and wasm timings use.

use std::io::Write;
use std::process::ExitCode;

use plumbline_bench::{record_csv, CASE, ROWS};

fn main() -> ExitCode {
    let text = if std::env::args().any(|a| a == "--case") {
        CASE.to_owned()
    } else {
        record_csv(ROWS)
    };
    match std::io::stdout().write_all(text.as_bytes()) {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("bench-workload: {e}");
            ExitCode::FAILURE
        }
    }
}

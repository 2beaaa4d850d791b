//! `plumbline-fuzz`: replays the fuzzing corpus, or runs a random campaign
//! against one decoder or all of them, each input under `catch_unwind`,
//! and says what it found: executions, panics, how far inputs got, the
//! slowest input. Panicking inputs and each campaign's slowest input (kept
//! current while it runs) are written to `fuzz/artifacts/<decoder>/`.
//!
//! ```text
//! plumbline-fuzz replay [DECODER...]              # the corpus and the seeds, once each
//! plumbline-fuzz run DECODER [EXECUTIONS] [SEED]  # a campaign (default 100000, seed 1)
//! plumbline-fuzz all [EXECUTIONS] [SEED]          # a campaign per decoder, one at a time
//! ```
//!
//! Build it with `--profile fuzz` (release speed, panics that unwind, and
//! overflow checks on, so an overflow counts as the defect it is).

use std::process::ExitCode;

use plumbline_fuzz::{campaign, replay, root, Decoder, Report};

fn artifacts(decoder: Decoder) -> Option<std::path::PathBuf> {
    let dir = root().join("fuzz").join("artifacts").join(decoder.name());
    match std::fs::create_dir_all(&dir) {
        Ok(()) => Some(dir),
        Err(_) => {
            eprintln!("plumbline-fuzz: cannot write {}", dir.display());
            None
        }
    }
}

fn save_panics(decoder: Decoder, report: &Report) {
    let Some(dir) = artifacts(decoder) else {
        return;
    };
    for (i, (message, input)) in report.panics.iter().enumerate() {
        let _ = std::fs::write(dir.join(format!("panic-{i}")), input);
        eprintln!("plumbline-fuzz: {}: panic {i}: {message}", decoder.name());
    }
}

fn save_slowest(decoder: Decoder, report: &Report) {
    if let (Some(dir), Some((_, _, input))) = (artifacts(decoder), &report.slowest) {
        let _ = std::fs::write(dir.join("slowest"), input);
    }
}

fn decoders(names: &[String]) -> Result<Vec<Decoder>, String> {
    if names.is_empty() {
        return Ok(Decoder::ALL.to_vec());
    }
    names
        .iter()
        .map(|n| Decoder::from_name(n).ok_or_else(|| format!("no decoder called '{n}'")))
        .collect()
}

fn number(arg: Option<&String>, default: u64) -> Result<u64, String> {
    arg.map_or(Ok(default), |a| {
        a.replace('_', "")
            .parse()
            .map_err(|_| format!("'{a}' is not a whole number"))
    })
}

fn run(decoder: Decoder, executions: u64, seed: u64) -> bool {
    let seeds = decoder.seeds(&root());
    // The slowest input so far is saved with each progress line, so a
    // campaign stopped early still leaves it behind to replay.
    let report = campaign(decoder, &seeds, executions, seed, |r| {
        eprintln!("  {}", r.summary(decoder));
        save_slowest(decoder, r);
    });
    println!("{}", report.summary(decoder));
    save_panics(decoder, &report);
    save_slowest(decoder, &report);
    report.panics.is_empty()
}

fn main() -> ExitCode {
    // Panics are counted and reported, not printed as they happen.
    std::panic::set_hook(Box::new(|_| {}));
    let args: Vec<String> = std::env::args().skip(1).collect();
    let outcome = match args.split_first() {
        Some((command, rest)) if command == "replay" => decoders(rest).map(|list| {
            let mut clean = true;
            for decoder in list {
                let report = replay(decoder, &decoder.seeds(&root()));
                println!("{}", report.summary(decoder));
                save_panics(decoder, &report);
                clean &= report.panics.is_empty();
            }
            clean
        }),
        Some((command, rest)) if command == "run" => {
            let decoder = rest
                .first()
                .and_then(|n| Decoder::from_name(n))
                .ok_or_else(|| "run needs a decoder: case, share, csv or saved_state".to_owned());
            decoder.and_then(|d| {
                Ok(run(
                    d,
                    number(rest.get(1), 100_000)?,
                    number(rest.get(2), 1)?,
                ))
            })
        }
        Some((command, rest)) if command == "all" => {
            number(rest.first(), 100_000).and_then(|executions| {
                let seed = number(rest.get(1), 1)?;
                let mut clean = true;
                for decoder in Decoder::ALL {
                    clean &= run(decoder, executions, seed);
                }
                Ok(clean)
            })
        }
        _ => Err("usage: plumbline-fuzz replay [DECODER...] | run DECODER [EXECUTIONS] [SEED] | all [EXECUTIONS] [SEED]".to_owned()),
    };
    match outcome {
        Ok(true) => ExitCode::SUCCESS,
        Ok(false) => ExitCode::from(1),
        Err(message) => {
            eprintln!("plumbline-fuzz: {message}");
            ExitCode::from(2)
        }
    }
}

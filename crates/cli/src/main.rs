//! `plumbline`: the command line over plumbline-core.
//!
//! A thin shell: it reads a case, hands it to the core, and prints the
//! core's report as a table or as JSON. Exit status 0 for a completed check
//! whatever its verdicts, 2 for input that could not be checked.

mod table;

use std::io::Read;
use std::path::PathBuf;
use std::process::ExitCode;

use clap::{Parser, Subcommand};
use plumbline_core::case::{Case, RulesSpec};
use plumbline_core::error::Errors;
use plumbline_core::{check, demo, record, report::Report};

/// Organ perfusion pressure with hydrostatic correction for posture.
///
/// Decision support for trained clinicians: local protocols and licensed
/// clinical judgement come first.
#[derive(Parser)]
#[command(name = "plumbline", version, about, long_about = None)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Check a case file (use - to read standard input).
    Check {
        /// The case document (JSON), or - for standard input.
        file: String,
        /// Print the full result as JSON instead of a table.
        #[arg(long)]
        json: bool,
    },
    /// Run the invented demo case that ships with the project.
    Demo {
        /// Print the full result as JSON instead of a table.
        #[arg(long)]
        json: bool,
    },
    /// Exposure outside each target over a monitor record (CSV), with the
    /// case's geometry and targets.
    Record {
        /// The record file (CSV; see docs/record-format.md), or - for standard input.
        file: String,
        /// The case whose sources, position and targets the record belongs to.
        #[arg(long)]
        case: String,
        /// How long an intermittent reading (a cuff) is held, seconds.
        #[arg(long)]
        hold_max_s: Option<f64>,
        /// The longest gap continuous samples are interpolated across, seconds.
        #[arg(long)]
        gap_max_s: Option<f64>,
        /// Ignore episodes outside a target shorter than this, seconds.
        #[arg(long)]
        min_episode_s: Option<f64>,
        /// Print the exposure as JSON instead of a table.
        #[arg(long)]
        json: bool,
        /// Print the organ-level series as CSV instead of the summary.
        #[arg(long, conflicts_with = "json")]
        series: bool,
        /// Also write the case with its record (JSON) to this file.
        #[arg(long)]
        write_case: Option<PathBuf>,
    },
}

/// What `record` is asked for, besides the files.
struct RecordOptions {
    rules: RulesSpec,
    json: bool,
    series: bool,
    write_case: Option<PathBuf>,
}

fn read_input(file: &str) -> Result<String, String> {
    if file == "-" {
        let mut text = String::new();
        std::io::stdin()
            .read_to_string(&mut text)
            .map_err(|e| format!("cannot read standard input: {e}"))?;
        Ok(text)
    } else {
        let path = PathBuf::from(file);
        std::fs::read_to_string(&path).map_err(|e| format!("cannot read {file}: {e}"))
    }
}

fn print(report: &Report, json: bool) -> ExitCode {
    if json {
        match serde_json::to_string_pretty(report) {
            Ok(text) => println!("{text}"),
            Err(e) => {
                eprintln!("plumbline: cannot write the result as JSON: {e}");
                return ExitCode::from(2);
            }
        }
    } else {
        print!("{}", table::render(report));
    }
    ExitCode::SUCCESS
}

fn run(name: &str, text: &str, json: bool) -> ExitCode {
    match check::check_json(text) {
        Ok(report) => print(&report, json),
        Err(errors) => {
            eprintln!("plumbline: {name} could not be checked:");
            for error in errors.iter() {
                eprintln!("  {error}");
            }
            ExitCode::from(2)
        }
    }
}

fn bad(name: &str, errors: &Errors) -> ExitCode {
    eprintln!("plumbline: {name} could not be read:");
    for error in errors.iter() {
        eprintln!("  {error}");
    }
    ExitCode::from(2)
}

fn record(file: &str, case_file: &str, options: RecordOptions) -> ExitCode {
    let (csv, case_text) = match (read_input(file), read_input(case_file)) {
        (Ok(csv), Ok(case)) => (csv, case),
        (Err(message), _) | (_, Err(message)) => {
            eprintln!("plumbline: {message}");
            return ExitCode::from(2);
        }
    };
    let case = match Case::from_json(&case_text) {
        Ok(case) => case,
        Err(errors) => return bad(case_file, &errors),
    };
    let recorded = match record::Recorded::import(&case, &csv, &options.rules) {
        Ok(recorded) => recorded,
        Err(errors) => return bad(file, &errors),
    };
    if let Some(path) = &options.write_case {
        if let Err(e) = std::fs::write(path, recorded.case.to_json()) {
            eprintln!("plumbline: cannot write {}: {e}", path.display());
            return ExitCode::from(2);
        }
    }
    if options.series {
        print!("{}", recorded.series_csv());
    } else if options.json {
        match serde_json::to_string_pretty(&recorded.exposure()) {
            Ok(text) => println!("{text}"),
            Err(e) => {
                eprintln!("plumbline: cannot write the exposure as JSON: {e}");
                return ExitCode::from(2);
            }
        }
    } else {
        print!("{}", table::render_exposure(&recorded.exposure()));
    }
    ExitCode::SUCCESS
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Check { file, json } => match read_input(&file) {
            Ok(text) => {
                let name = if file == "-" { "standard input" } else { &file };
                run(name, &text, json)
            }
            Err(message) => {
                eprintln!("plumbline: {message}");
                ExitCode::from(2)
            }
        },
        Command::Demo { json } => run("the demo case", demo::CASE_JSON, json),
        Command::Record {
            file,
            case,
            hold_max_s,
            gap_max_s,
            min_episode_s,
            json,
            series,
            write_case,
        } => record(
            &file,
            &case,
            RecordOptions {
                rules: RulesSpec {
                    hold_max_s,
                    gap_max_s,
                    min_episode_s,
                },
                json,
                series,
                write_case,
            },
        ),
    }
}

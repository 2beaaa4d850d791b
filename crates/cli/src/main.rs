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
use plumbline_core::{check, demo, report::Report};

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
    }
}

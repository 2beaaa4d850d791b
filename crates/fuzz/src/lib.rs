//! Fuzzing every decoder of untrusted input, on stable Rust: what each
//! target runs, where its inputs come from, and a campaign that counts
//! executions, panics and the slowest input.
//!
//! Four decoders take text from outside: a case file (the command line,
//! the JavaScript face), a share link's fragment, a record CSV file, and
//! the screen's saved state. Each target decodes an input and then does
//! everything the tool does with what it read (the check, the page's
//! boxes, a record's exposure), so a panic or a slow path anywhere behind
//! the decoder counts. The cargo-fuzz targets in `fuzz/` call the same
//! [`Decoder::run`] under libFuzzer; the runner (`src/main.rs`) replays
//! the checked-in corpus and runs random campaigns with the mutations of
//! [`mutate`], each input under `catch_unwind`.

pub mod mutate;

use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::{Path, PathBuf};
use std::sync::OnceLock;
use std::time::{Duration, Instant};

use plumbline_core::case::Case;
use plumbline_core::{check, demo, record, share};
use plumbline_web::form::Form;
use plumbline_web::saved;

/// A decoder of untrusted text, and everything done with what it reads.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Decoder {
    /// A case document (JSON), checked.
    Case,
    /// A share link's fragment, its case checked.
    Share,
    /// A record CSV file imported into the demo case, its exposure analysed.
    Csv,
    /// The screen's saved state and saved record, read back and checked.
    SavedState,
}

/// How far an input got: the campaign keeps inputs that got further as
/// new starting points, which reach deeper code than the seeds alone.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Reached {
    /// Not UTF-8 text: every reader takes text.
    NotText,
    /// Refused by the decoder.
    Refused,
    /// Read, then refused by the check.
    Read,
    /// Read and checked.
    Checked,
}

impl Reached {
    /// Its place in a tally.
    pub fn index(self) -> usize {
        match self {
            Reached::NotText => 0,
            Reached::Refused => 1,
            Reached::Read => 2,
            Reached::Checked => 3,
        }
    }
}

/// The demo case, read once: the CSV target imports into it.
fn demo_case() -> Option<&'static Case> {
    static DEMO: OnceLock<Option<Case>> = OnceLock::new();
    DEMO.get_or_init(|| Case::from_json(demo::CASE_JSON).ok())
        .as_ref()
}

/// Everything the tool does with a case it has read: the check, the
/// page's boxes for it, and its record's exposure when it has one.
fn use_case(case: &Case) -> Reached {
    let _ = Form::from_case(case).to_case();
    let checked = check::check_case(case).is_ok();
    if case.timeline.is_some() {
        if let Ok(recorded) = record::Recorded::of_case(case.clone()) {
            let _ = recorded.exposure();
        }
    }
    if checked {
        Reached::Checked
    } else {
        Reached::Read
    }
}

fn case(text: &str) -> Reached {
    Case::from_json(text).map_or(Reached::Refused, |case| use_case(&case))
}

fn link(text: &str) -> Reached {
    share::decode(text).map_or(Reached::Refused, |case| use_case(&case))
}

fn csv(text: &str) -> Reached {
    let Some(demo) = demo_case() else {
        return Reached::Refused;
    };
    match record::Recorded::import(demo, text, &Default::default()) {
        Ok(recorded) => {
            let _ = recorded.exposure();
            Reached::Checked
        }
        Err(_) => Reached::Refused,
    }
}

/// The text read as a saved state and as a saved record, as the screen
/// reads what it finds on the device at start.
fn saved_state(text: &str) -> Reached {
    let mut reached = Reached::Refused;
    if let Ok(saved) = saved::decode(text) {
        reached = Reached::Read;
        if let Ok(case) = saved.form.to_case() {
            if check::check_case(&case).is_ok() {
                reached = Reached::Checked;
            }
        }
        let _ = saved::encode(&saved.form, saved.theme);
    }
    if let (Ok(saved), Some(demo)) = (saved::decode_record(text), demo_case()) {
        if let Some(timeline) = saved.timeline {
            let mut case = demo.clone();
            case.timeline = Some(timeline);
            if let Ok(recorded) = record::Recorded::of_case(case) {
                let _ = recorded.exposure();
            }
            reached = reached.max(Reached::Read);
        }
    }
    reached
}

impl Decoder {
    /// Every decoder, in the order of reports.
    pub const ALL: [Decoder; 4] = [
        Decoder::Case,
        Decoder::Share,
        Decoder::Csv,
        Decoder::SavedState,
    ];

    /// The name of its cargo-fuzz target and corpus folder.
    pub fn name(self) -> &'static str {
        match self {
            Decoder::Case => "case",
            Decoder::Share => "share",
            Decoder::Csv => "csv",
            Decoder::SavedState => "saved_state",
        }
    }

    /// The decoder called `name`.
    pub fn from_name(name: &str) -> Option<Decoder> {
        Decoder::ALL.into_iter().find(|d| d.name() == name)
    }

    /// Decodes `data` and does with it all the tool does.
    pub fn run(self, data: &[u8]) -> Reached {
        let Ok(text) = std::str::from_utf8(data) else {
            return Reached::NotText;
        };
        match self {
            Decoder::Case => case(text),
            Decoder::Share => link(text),
            Decoder::Csv => csv(text),
            Decoder::SavedState => saved_state(text),
        }
    }

    /// The checked-in regression corpus of this decoder.
    pub fn corpus_dir(self, root: &Path) -> PathBuf {
        root.join("fuzz").join("corpus").join(self.name())
    }

    /// The starting points of a campaign, by name: the corpus, then the
    /// examples and fixtures as this decoder takes them (case files as
    /// they are, as the core's own share links and as saved states; CSV
    /// files as they are).
    pub fn seeds(self, root: &Path) -> Vec<(String, Vec<u8>)> {
        let mut seeds = files(&self.corpus_dir(root));
        let dirs = [root.join("examples"), root.join("tests").join("fixtures")];
        for (name, bytes) in dirs.iter().flat_map(|d| files(d)) {
            let json = name.ends_with(".json");
            let made = match self {
                Decoder::Case if json => Some(bytes),
                Decoder::Csv if name.ends_with(".csv") => Some(bytes),
                Decoder::Share if json => seed_link(&bytes),
                Decoder::SavedState if json => seed_state(&bytes),
                _ => None,
            };
            if let Some(made) = made {
                seeds.push((name, made));
            }
        }
        seeds
    }
}

/// The core's own share link for a case file, or the file deflated as a
/// link would carry it when the core cannot read it.
fn seed_link(bytes: &[u8]) -> Option<Vec<u8>> {
    let text = std::str::from_utf8(bytes).ok()?;
    Some(match Case::from_json(text) {
        Ok(case) => share::encode(&case).into_bytes(),
        Err(_) => mutate::fragment_of(bytes).into_bytes(),
    })
}

/// The saved state the screen would write for a case file.
fn seed_state(bytes: &[u8]) -> Option<Vec<u8>> {
    let case = Case::from_json(std::str::from_utf8(bytes).ok()?).ok()?;
    Some(saved::encode(&Form::from_case(&case), plumbline_web::state::Theme::Dark).into_bytes())
}

/// Every file in `dir`, by `dir/name`, sorted; none when it cannot be read.
pub fn files(dir: &Path) -> Vec<(String, Vec<u8>)> {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return Vec::new();
    };
    let mut out: Vec<(String, Vec<u8>)> = entries
        .flatten()
        .filter(|e| e.path().is_file())
        .filter_map(|e| {
            let name = e.file_name().to_string_lossy().into_owned();
            let bytes = std::fs::read(e.path()).ok()?;
            let folder = dir.file_name().map(|f| f.to_string_lossy().into_owned());
            Some((format!("{}/{name}", folder.unwrap_or_default()), bytes))
        })
        .collect();
    out.sort();
    out
}

/// One execution: how far the input got, or the panic's message.
///
/// # Errors
/// The message of a panic, which is a defect in the tool.
pub fn run_caught(decoder: Decoder, data: &[u8]) -> Result<Reached, String> {
    catch_unwind(AssertUnwindSafe(|| decoder.run(data))).map_err(|payload| {
        payload
            .downcast_ref::<&str>()
            .map(|s| (*s).to_owned())
            .or_else(|| payload.downcast_ref::<String>().cloned())
            .unwrap_or_else(|| "a panic without a message".to_owned())
    })
}

/// What a replay or a campaign found.
#[derive(Clone, Debug, Default)]
pub struct Report {
    /// Inputs run.
    pub executions: u64,
    /// Each panic: its message and the input.
    pub panics: Vec<(String, Vec<u8>)>,
    /// The slowest input: its time, name (for a corpus input) and bytes.
    pub slowest: Option<(Duration, String, Vec<u8>)>,
    /// How many inputs got how far, by [`Reached::index`].
    pub reached: [u64; 4],
    /// The whole run's time.
    pub elapsed: Duration,
}

impl Report {
    /// The slowest input's time so far.
    fn slowest_time(&self) -> Option<Duration> {
        self.slowest.as_ref().map(|(t, ..)| *t)
    }

    /// Counts one execution of `input` (called `name`) that took `took`.
    fn count(
        &mut self,
        name: &str,
        input: &[u8],
        took: Duration,
        outcome: &Result<Reached, String>,
    ) {
        self.executions += 1;
        match outcome {
            Ok(reached) => {
                if let Some(n) = self.reached.get_mut(reached.index()) {
                    *n += 1;
                }
            }
            Err(message) => self.panics.push((message.clone(), input.to_vec())),
        }
        if self.slowest.as_ref().is_none_or(|(t, ..)| took > *t) {
            self.slowest = Some((took, name.to_owned(), input.to_vec()));
        }
    }

    /// One line for a person: executions, panics, how far inputs got, the
    /// slowest input.
    pub fn summary(&self, decoder: Decoder) -> String {
        let [not_text, refused, read, checked] = self.reached;
        let slowest = self
            .slowest
            .as_ref()
            .map_or_else(String::new, |(t, name, bytes)| {
                format!(
                    "; slowest {:.3} ms ({}, {} bytes)",
                    t.as_secs_f64() * 1000.0,
                    if name.is_empty() { "generated" } else { name },
                    bytes.len()
                )
            });
        format!(
            "{}: {} executions in {:.1} s ({:.0}/s), {} panics; not text {not_text}, refused {refused}, \
             read {read}, checked {checked}{slowest}",
            decoder.name(),
            self.executions,
            self.elapsed.as_secs_f64(),
            self.executions as f64 / self.elapsed.as_secs_f64().max(1e-9),
            self.panics.len(),
        )
    }
}

/// One timed execution. On a machine shared with other work a pause can
/// make any input look slow, so an input slower than `slowest` so far is
/// run twice more and its quickest time kept.
fn timed(
    decoder: Decoder,
    input: &[u8],
    slowest: Option<Duration>,
) -> (Duration, Result<Reached, String>) {
    let t = Instant::now();
    let outcome = run_caught(decoder, input);
    let mut took = t.elapsed();
    if outcome.is_ok() && slowest.is_none_or(|s| took > s) {
        for _ in 0..2 {
            let t = Instant::now();
            let _ = run_caught(decoder, input);
            took = took.min(t.elapsed());
        }
    }
    (took, outcome)
}

/// Runs every input once, timing each.
pub fn replay(decoder: Decoder, inputs: &[(String, Vec<u8>)]) -> Report {
    let start = Instant::now();
    let mut report = Report::default();
    for (name, input) in inputs {
        let (took, outcome) = timed(decoder, input, report.slowest_time());
        report.count(name, input, took, &outcome);
    }
    report.elapsed = start.elapsed();
    report
}

/// The largest input a campaign keeps as a starting point.
pub const POOL_INPUT_BYTES: usize = 64 * 1024;

/// A random campaign of `executions` mutated inputs from `seeds`, seeded
/// by `seed` (the same seed gives the same inputs). Inputs that get
/// further than refusal join the pool of starting points (up to a bound,
/// and only those of at most [`POOL_INPUT_BYTES`]: the mutations still
/// build large inputs from them, but a pool left to grow drifts to
/// megabyte records that each take milliseconds, and a campaign of ten
/// million then takes days). `progress` is called about every ten seconds.
pub fn campaign(
    decoder: Decoder,
    seeds: &[(String, Vec<u8>)],
    executions: u64,
    seed: u64,
    mut progress: impl FnMut(&Report),
) -> Report {
    const POOL: usize = 2_000;
    let start = Instant::now();
    let mut last = start;
    let mut rng = mutate::Rng::new(seed);
    let dictionary = mutate::Dictionary::harvest(seeds.iter().map(|(_, b)| b.as_slice()));
    let mut pool: Vec<Vec<u8>> = seeds.iter().map(|(_, b)| b.clone()).collect();
    let fixed = pool.len();
    let mut report = Report::default();
    for _ in 0..executions {
        let input = mutate::mutate(decoder, &mut rng, &dictionary, &pool);
        let (took, outcome) = timed(decoder, &input, report.slowest_time());
        report.count("", &input, took, &outcome);
        if matches!(outcome, Ok(Reached::Read | Reached::Checked))
            && input.len() <= POOL_INPUT_BYTES
            && rng.below(8) == 0
        {
            if pool.len() < fixed + POOL {
                pool.push(input);
            } else if let Some(slot) = pool.get_mut(fixed + rng.below(POOL)) {
                *slot = input;
            }
        }
        if last.elapsed() > Duration::from_secs(10) {
            last = Instant::now();
            report.elapsed = start.elapsed();
            progress(&report);
        }
    }
    report.elapsed = start.elapsed();
    report
}

/// The repository's root, from this crate's folder.
pub fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("..").join("..")
}

//! The invariants of DEVELOPERS.md kept by a test, not by hope: every Rust
//! file says what it holds in a `//!` line, only `units` names the units
//! crate, the screen does no arithmetic on pressures outside chart layout,
//! the core depends only on the crates it is allowed, and no core source
//! file grows past about 600 lines.

use std::fs;
use std::path::{Path, PathBuf};

/// The workspace root, two levels above the core crate.
fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// Every `.rs` file under `dir`, recursively, skipping build output.
fn rust_files(dir: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    let Ok(entries) = fs::read_dir(dir) else {
        return out;
    };
    for entry in entries.flatten() {
        let path = entry.path();
        let name = entry.file_name();
        if name == "target" || name == "node_modules" || name == "corpus" {
            continue;
        }
        if path.is_dir() {
            out.extend(rust_files(&path));
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
    out.sort();
    out
}

fn text(path: &Path) -> String {
    fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

fn relative(path: &Path) -> String {
    path.strip_prefix(root())
        .unwrap_or(path)
        .display()
        .to_string()
}

/// The code of a line without its comment and string literals, so words in
/// messages and docs are not taken for code.
fn code_of(line: &str) -> String {
    let mut out = String::new();
    let mut in_string = false;
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '"' => {
                in_string = !in_string;
                out.push(' ');
            }
            '\\' if in_string => {
                chars.next();
            }
            '/' if !in_string && chars.peek() == Some(&'/') => break,
            _ if in_string => out.push(' '),
            _ => out.push(c),
        }
    }
    out
}

/// Whether a line of code does arithmetic on a value named `*_mmhg`: an
/// arithmetic operator right before or after such a name.
fn arithmetic_on_mmhg(line: &str) -> bool {
    let code = code_of(line);
    let bytes = code.as_bytes();
    let mut from = 0;
    while let Some(at) = code.get(from..).and_then(|rest| rest.find("_mmhg")) {
        let start = from + at;
        let end = start + "_mmhg".len();
        from = end;
        let word_start = code.get(..start).map_or(start, |head| {
            head.rfind(|c: char| !(c.is_alphanumeric() || c == '_' || c == '.'))
                .map_or(0, |k| k + 1)
        });
        let before = code.get(..word_start).map(str::trim_end).unwrap_or("");
        let after = code.get(end..).map(str::trim_start).unwrap_or("");
        let follows_word = bytes
            .get(end)
            .is_some_and(|b| b.is_ascii_alphanumeric() || *b == b'_');
        if follows_word {
            continue;
        }
        let op_before =
            before.ends_with(['+', '*', '/']) || (before.ends_with('-') && !before.ends_with("->"));
        let op_after = after.starts_with(['+', '*', '/'])
            || (after.starts_with('-') && !after.starts_with("->"));
        if op_before || op_after {
            return true;
        }
    }
    false
}

#[test]
fn the_arithmetic_detector_finds_arithmetic_and_nothing_else() {
    assert!(arithmetic_on_mmhg("let d = a.value_mmhg - b;"));
    assert!(arithmetic_on_mmhg("let d = 2.0 * m.lower_mmhg;"));
    assert!(arithmetic_on_mmhg("x += t.threshold_mmhg / 2.0;"));
    assert!(!arithmetic_on_mmhg("rounded(m.value_mmhg)"));
    assert!(!arithmetic_on_mmhg(
        "let f = |v: f64| -> f64 { v.value_mmhg };"
    ));
    assert!(!arithmetic_on_mmhg("format!(\"a - b {}\", m.value_mmhg)"));
    assert!(!arithmetic_on_mmhg("// m.value_mmhg - 2"));
    assert!(!arithmetic_on_mmhg("t.area_mmhg_min"));
}

#[test]
fn every_rust_file_says_what_it_holds() {
    let mut missing = Vec::new();
    for dir in ["crates", "fuzz"] {
        for path in rust_files(&root().join(dir)) {
            if !text(&path).starts_with("//!") {
                missing.push(relative(&path));
            }
        }
    }
    assert!(missing.is_empty(), "files without a //! line: {missing:?}");
}

#[test]
fn only_units_names_the_units_crate() {
    let core = root().join("crates/core/src");
    let mut found = Vec::new();
    for path in rust_files(&root().join("crates")) {
        let name = relative(&path);
        let allowed = path == core.join("units.rs") || path == core.join("lib.rs");
        if !allowed
            && text(&path).lines().any(|l| {
                code_of(l)
                    .split(|c: char| !c.is_alphanumeric() && c != '_')
                    .any(|w| w == "uom")
            })
        {
            found.push(name);
        }
    }
    assert!(found.is_empty(), "uom named outside units: {found:?}");
    assert!(text(&core.join("lib.rs"))
        .lines()
        .filter(|l| l.contains("uom"))
        .all(|l| l.trim() == "extern crate uom;"));
}

#[test]
fn the_screen_does_no_arithmetic_on_pressures_outside_chart_layout() {
    let web = root().join("crates/web/src");
    // Chart layout maps pressures to pixels; it is allowed to.
    let layout = [
        "chart.rs",
        "picture.rs",
        "record/trend.rs",
        "record/strip.rs",
    ];
    let mut found = Vec::new();
    for path in rust_files(&web) {
        if layout.iter().any(|l| path == web.join(l)) {
            continue;
        }
        for (n, line) in text(&path).lines().enumerate() {
            if arithmetic_on_mmhg(line) {
                found.push(format!("{}:{}: {}", relative(&path), n + 1, line.trim()));
            }
        }
    }
    assert!(
        found.is_empty(),
        "arithmetic on pressures in the screen: {found:#?}"
    );
}

#[test]
fn the_core_depends_only_on_what_it_is_allowed() {
    let allowed = [
        "uom",
        "serde",
        "serde_json",
        "serde_path_to_error",
        "miniz_oxide",
        "base64",
        "csv-core",
    ];
    let manifest = text(&root().join("crates/core/Cargo.toml"));
    let mut section = "";
    let mut found = Vec::new();
    for line in manifest.lines() {
        let line = line.trim();
        if line.starts_with('[') {
            section = line;
            continue;
        }
        if section == "[dependencies]" {
            if let Some((name, _)) = line.split_once('=') {
                // `uom.workspace = true` names `uom`.
                let name = name.trim().trim_end_matches(".workspace");
                found.push(name.to_owned());
            }
        }
    }
    assert!(!found.is_empty(), "no [dependencies] section read");
    let extra: Vec<&String> = found
        .iter()
        .filter(|d| !allowed.contains(&d.as_str()))
        .collect();
    assert!(extra.is_empty(), "the core may not depend on {extra:?}");
}

#[test]
fn no_core_source_file_grows_past_about_600_lines() {
    let mut long = Vec::new();
    for path in rust_files(&root().join("crates/core/src")) {
        let lines = text(&path).lines().count();
        if lines > 620 {
            long.push(format!("{} ({lines})", relative(&path)));
        }
    }
    assert!(long.is_empty(), "split these by stage: {long:?}");
}

//! The screen's modules form layers, not circles: a host test that reads
//! every source file of the crate, collects which top-level module names
//! which (`crate::x`), and fails on
//! any cycle, naming it. The state's reducer must stay pure, so it must
//! not reach the layers that write to the device either.

#![cfg(not(target_arch = "wasm32"))]
#![allow(clippy::unwrap_used, clippy::panic, clippy::indexing_slicing)]

use std::collections::{BTreeMap, BTreeSet};
use std::fs;
use std::path::{Path, PathBuf};

fn sources(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            sources(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}

/// The top-level module each file of `src/` belongs to (`lib` for lib.rs).
fn module_of(src: &Path, file: &Path) -> String {
    let rel = file.strip_prefix(src).unwrap();
    let first = rel.components().next().unwrap().as_os_str();
    first.to_string_lossy().trim_end_matches(".rs").to_owned()
}

/// Which top-level module names which, across the crate.
fn graph() -> BTreeMap<String, BTreeSet<String>> {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut files = Vec::new();
    sources(&src, &mut files);
    let mut graph: BTreeMap<String, BTreeSet<String>> = BTreeMap::new();
    for file in files {
        let from = module_of(&src, &file);
        let text = fs::read_to_string(&file).unwrap();
        let edges = graph.entry(from.clone()).or_default();
        for (at, _) in text.match_indices("crate::") {
            let name: String = text[at + "crate::".len()..]
                .chars()
                .take_while(|c| c.is_ascii_alphanumeric() || *c == '_')
                .collect();
            if !name.is_empty() && name != from {
                edges.insert(name);
            }
        }
    }
    graph
}

/// A cycle through `node`, if there is one (depth-first).
fn cycle(
    graph: &BTreeMap<String, BTreeSet<String>>,
    node: &str,
    path: &mut Vec<String>,
    done: &mut BTreeSet<String>,
) -> Option<Vec<String>> {
    if let Some(at) = path.iter().position(|n| n == node) {
        let mut found = path[at..].to_vec();
        found.push(node.to_owned());
        return Some(found);
    }
    if done.contains(node) {
        return None;
    }
    path.push(node.to_owned());
    for next in graph.get(node).into_iter().flatten() {
        if let Some(found) = cycle(graph, next, path, done) {
            return Some(found);
        }
    }
    path.pop();
    done.insert(node.to_owned());
    None
}

#[test]
fn the_modules_have_no_import_cycle() {
    let graph = graph();
    assert!(graph.len() > 10, "the sources were found: {graph:?}");
    let mut done = BTreeSet::new();
    for node in graph.keys() {
        if let Some(found) = cycle(&graph, node, &mut Vec::new(), &mut done) {
            panic!("import cycle: {}", found.join(" -> "));
        }
    }
}

/// Everything `from` reaches, itself excluded.
fn reach(graph: &BTreeMap<String, BTreeSet<String>>, from: &str) -> BTreeSet<String> {
    let mut seen = BTreeSet::new();
    let mut todo = vec![from.to_owned()];
    while let Some(node) = todo.pop() {
        for next in graph.get(&node).into_iter().flatten() {
            if seen.insert(next.clone()) {
                todo.push(next.clone());
            }
        }
    }
    seen
}

#[test]
fn the_state_and_the_storage_stay_apart() {
    let graph = graph();
    let state = reach(&graph, "state");
    for effect in ["browser", "persist", "app", "components", "pages"] {
        assert!(!state.contains(effect), "state reaches {effect}: {state:?}");
    }
    let storage = reach(&graph, "storage");
    for kind in ["state", "session", "form", "record", "theme", "saved"] {
        assert!(
            !storage.contains(kind),
            "storage reaches {kind}: {storage:?}"
        );
    }
}

#[test]
fn a_cycle_is_found_when_there_is_one() {
    let graph: BTreeMap<String, BTreeSet<String>> = [
        ("a", &["b"][..]),
        ("b", &["c"][..]),
        ("c", &["a"][..]),
        ("d", &[][..]),
    ]
    .into_iter()
    .map(|(k, v)| (k.to_owned(), v.iter().map(|s| (*s).to_owned()).collect()))
    .collect();
    let found = cycle(&graph, "a", &mut Vec::new(), &mut BTreeSet::new());
    assert_eq!(found.unwrap(), ["a", "b", "c", "a"]);
    assert_eq!(
        cycle(&graph, "d", &mut Vec::new(), &mut BTreeSet::new()),
        None
    );
}

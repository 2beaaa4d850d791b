#!/usr/bin/env bash
# Where the bytes of the web app's wasm go, by crate and by feature.
#
# Builds a side copy of the release wasm that keeps the names section
# (the same cargo build, wasm-bindgen --keep-debug, wasm-opt -Oz -g),
# lists every function and data segment with twiggy (crates.io; installed
# when missing), and groups their bytes. Prints two Markdown tables for
# DEVELOPERS.md. Raw bytes of the wasm: gzip cannot be split by item, so
# shares are of the raw code and data; the shipped build's gzip size is
# printed beside them. Nothing in dist/ is touched.
set -euo pipefail
cd "$(dirname "$0")/.."

fail() { echo "size-report: $*" >&2; exit 1; }
command -v twiggy >/dev/null || cargo install twiggy --version 0.8.0 --locked
command -v python3 >/dev/null || fail "python3 is missing"
scripts/setup.sh --check --no-browser >/dev/null || scripts/setup.sh --no-browser

target=${CARGO_TARGET_DIR:-target}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

echo "size-report: building the release wasm (cargo, wasm-bindgen, wasm-opt)" >&2
cargo rustc -p plumbline-web --lib --crate-type cdylib --target wasm32-unknown-unknown --release --quiet
# The same names as build-web.sh's, so the shipped copy is byte for byte
# the one in dist/.
wasm-bindgen --target web --no-typescript --keep-debug --out-dir "$work/named" --out-name plumbline \
  "$target/wasm32-unknown-unknown/release/plumbline_web.wasm"
node_modules/.bin/wasm-opt -Oz -g "$work/named/plumbline_bg.wasm" -o "$work/named.wasm"
wasm-bindgen --target web --no-typescript --out-dir "$work/shipped" --out-name plumbline \
  "$target/wasm32-unknown-unknown/release/plumbline_web.wasm"
node_modules/.bin/wasm-opt -Oz "$work/shipped/plumbline_bg.wasm" -o "$work/shipped.wasm"
twiggy top -n 10000000 -f csv "$work/named.wasm" > "$work/items.csv"

python3 - "$work/items.csv" "$work/shipped.wasm" <<'PY'
import csv, re, subprocess, sys
from collections import Counter

items, shipped = sys.argv[1], sys.argv[2]

# By feature: the first rule whose pattern the item's name matches.
FEATURES = [
    ("names and custom sections (side copy only)", r'^"?function names|^custom section|subsection'),
    ("data (texts: labels, messages, sources; tables)", r'^data segment'),
    ("the JSON reader with field paths (serde_json, serde_path_to_error)", r'serde_json|serde_path_to_error'),
    ("serde and its derives (our types' Serialize/Deserialize)", r'serde_core|serde::|serde_wasm_bindgen|Deserialize|Serialize|Visitor'),
    ("uom's generic code (what LTO did not inline)", r'uom::|typenum::'),
    ("float formatting and parsing (core, zmij)", r'fmt::float|flt2dec|dec2flt|<f64 as core[^>]*(fmt|FromStr)|zmij|ryu'),
    ("deflate (share links: miniz_oxide)", r'miniz_oxide'),
    ("QR code (qrcodegen, the screen's qr)", r'qrcodegen|plumbline_web::qr'),
    ("the record engine (core record::, the screen's record/)", r'plumbline_core::record|plumbline_web::record|plumbline_web::components::record'),
    ("the geometry (core geometry::, landmarks, the picture)", r'plumbline_core::geometry|plumbline_core::landmark|plumbline_web::picture'),
    ("the formulas with their derivation words (core evaluate::, organ::)", r'plumbline_core::evaluate|plumbline_core::organ'),
    ("the rest of the core (case, scene, check, units, readings, targets)", r'plumbline_core'),
    ("the screen's component views (Yew instantiated per component)", r'CompStateInner<COMP>|plumbline_web::components|plumbline_web::pages|FunctionProvider'),
    ("the rest of the screen (state, form, saving, session)", r'plumbline_web'),
    ("yew (framework: scheduler, diffing, hooks)", r'yew::|implicit_clone|yew_'),
    ("browser bindings (wasm-bindgen, js-sys, web-sys, gloo, imports)", r'^import |wasm_bindgen|js_sys|web_sys|gloo|externref|__wbg|closure\d*_|\bshim\b'),
    ("std: sorting (a copy per element type)", r'core::slice::sort'),
    ("std: BTreeMap and BTreeSet (a copy per key type)", r'alloc::collections::btree'),
    ("std: math (libm)", r'libm|compiler_builtins::math'),
    ("std: the rest (alloc, fmt, iterators, malloc)", r'\bcore\b|\balloc\b|\bstd\b|dlmalloc|compiler_builtins|hashbrown|memchr'),
    ("other (unnamed code, tables)", r''),
]

# By crate: the crate of the outermost path in the name (`<A as B>` is
# A's); the Yew component views count as the screen's, serde's generic
# code instantiated for our types as serde's.
STD = {"core", "alloc", "std", "compiler_builtins", "dlmalloc", "hashbrown", "memchr"}
PATH = re.compile(r'([a-z_][a-z0-9_]*)(?:\[[0-9a-f]+\])?::')

def crate(name):
    if re.match(r'^"?function names|^custom section|subsection', name):
        return "(names and custom sections, side copy only)"
    if name.startswith("data segment"):
        return "(data: texts and tables)"
    if name.startswith("import "):
        return "wasm_bindgen (imports)"
    if "CompStateInner<COMP>" in name or "FunctionProvider" in name:
        return "plumbline_web"
    m = PATH.search(name)
    if not m:
        return "(unnamed code and glue)"
    c = m.group(1)
    if c in STD:
        if re.search(r'serde_core|serde::', name):
            return "serde_core"
        # Generic std code instantiated for one of our types counts as ours.
        for ours in ("plumbline_web", "plumbline_core"):
            if ours in name:
                return ours
        return "std (core, alloc, malloc, math)"
    return c

feature, by_crate = Counter(), Counter()
with open(items, newline="") as f:
    for row in csv.DictReader(f):
        name, size = row["Name"], int(row["ShallowSize"])
        for label, pattern in FEATURES:
            if re.search(pattern, name):
                feature[label] += size
                break
        by_crate[crate(name)] += size

skip = lambda k: k.startswith("(names") or k.startswith("names")
total = sum(v for k, v in by_crate.items() if not skip(k))
raw = open(shipped, "rb").read()
packed = len(subprocess.run(["gzip", "-9c", shipped], capture_output=True, check=True).stdout)
print(f"Shipped wasm: {len(raw):,} bytes raw, {packed:,} gzip -9; "
      f"the side copy's code and data: {total:,} bytes.\n")
for title, table in (("crate", by_crate), ("feature", feature)):
    print(f"| by {title} | raw bytes | share |")
    print("|---|---:|---:|")
    for k, v in sorted(table.items(), key=lambda kv: -kv[1]):
        if skip(k):
            continue
        print(f"| {k} | {v:,} | {100 * v / total:.1f} % |")
    print()
PY

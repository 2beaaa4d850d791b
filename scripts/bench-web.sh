#!/usr/bin/env bash
# Measures the web app against a bare Yew page built with the same
# pipeline (cargo for wasm32 with the release profile, wasm-bindgen
# --target web, wasm-opt -Oz), in one run in Debian's headless Chromium:
# download of the first screen and of everything (gzip -9, brotli), time
# to the first result cold and warm at 4x CPU throttling, keystroke to
# paint at 1x and 4x with and without the benchmark's eight-hour record
# (crates/bench). Medians of RUNS (default 10) interleaved starts; prints a
# Markdown table with ratios to the bare page. Measures; asserts nothing.
set -euo pipefail
cd "$(dirname "$0")/.."

RUNS=${RUNS:-10}
target=${CARGO_TARGET_DIR:-target}
scripts/setup.sh --check || scripts/setup.sh

scripts/build-web.sh >/dev/null

work="$target/bench-web"
rm -rf "$work"
mkdir -p "$work/bare" "$work/workload"
echo "bench-web: the bare Yew page" >&2
cargo rustc -p plumbline-bare-yew --lib --crate-type cdylib --target wasm32-unknown-unknown --release --quiet
wasm-bindgen --target web --no-typescript --out-dir "$work/bare" --out-name bare \
  "$target/wasm32-unknown-unknown/release/plumbline_bare_yew.wasm"
node_modules/.bin/wasm-opt -Oz "$work/bare/bare_bg.wasm" -o "$work/bare/bare_bg.wasm"
cp crates/bench/bare-yew/web/* "$work/bare/"

echo "bench-web: the workload (crates/bench)" >&2
cargo build --quiet --release -p plumbline-bench --bin bench-workload
"$target/release/bench-workload" --case > "$work/workload/case.json"
"$target/release/bench-workload" > "$work/workload/record.csv"

node tests/bench/web.mjs dist "$work/bare" "$work/workload" "$RUNS"

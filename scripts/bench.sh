#!/usr/bin/env bash
# Measures the record workload (8 h at 1 Hz, four sources, 28,800 rows) in
# one run: natively, then as wasm in Debian's headless Chromium, and prints
# samples per second and the wasm/native ratio. Also runs the criterion
# benches when given --criterion. Needs scripts/setup.sh to have run.
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$PWD/node_modules/.bin:$PATH"

cargo build --quiet --release -p plumbline-bench --bin bench-native
native=$(target/release/bench-native)

cargo build --quiet --release -p plumbline-bench --lib --target wasm32-unknown-unknown
wasm-bindgen --target web --out-dir target/bench-pkg \
  target/wasm32-unknown-unknown/release/plumbline_bench.wasm
browser=$(node tests/bench/browser.mjs)

NATIVE="$native" BROWSER="$browser" python3 - <<'PY'
import json, os
n, b = json.loads(os.environ["NATIVE"]), json.loads(os.environ["BROWSER"])
print(f"record: {n['rows']} rows, {n['samples']} samples (release build, opt-level z)")
print(f"{'step':<20}{'native ms':>12}{'wasm ms':>12}{'native Msamples/s':>20}{'wasm Msamples/s':>18}{'wasm/native':>13}")
for step, key in (("CSV import", "import_ms"), ("exposure analysis", "analyze_ms")):
    rate = lambda r: r["samples"] / r[key] / 1000
    print(f"{step:<20}{n[key]:>12.2f}{b[key]:>12.2f}{rate(n):>20.2f}{rate(b):>18.2f}{b[key] / n[key]:>13.2f}")
PY

if [ "${1:-}" = "--criterion" ]; then
  cargo bench -p plumbline-core --bench check
  cargo bench -p plumbline-bench --bench record
fi

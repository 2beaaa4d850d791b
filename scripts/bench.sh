#!/usr/bin/env bash
# Measures the record workloads in one run: the eight-hour record (1 Hz,
# four sources, 28,800 rows) natively, then as wasm in Debian's headless
# Chromium, with samples per second and the wasm/native ratio; then the
# 72-hour record's CSV import (259,200 rows, about 5.5 MB) in MB/s both
# ways, and natively its peak memory and the csv crate reading the same
# file (records only, and with its numbers into columns: the floor of
# "library speed"). Also runs the criterion benches when
# given --criterion. Needs scripts/setup.sh to have run.
set -euo pipefail
cd "$(dirname "$0")/.."
export PATH="$PWD/node_modules/.bin:$PATH"
target=${CARGO_TARGET_DIR:-target}

cargo build --quiet --release -p plumbline-bench --bin bench-native
native=$("$target/release/bench-native")

cargo build --quiet --release -p plumbline-bench --lib --target wasm32-unknown-unknown
wasm-bindgen --target web --out-dir target/bench-pkg \
  "$target/wasm32-unknown-unknown/release/plumbline_bench.wasm"
browser=$(node tests/bench/browser.mjs)

NATIVE="$native" BROWSER="$browser" python3 - <<'PY'
import json, os
n, b = json.loads(os.environ["NATIVE"]), json.loads(os.environ["BROWSER"])
print(f"record: {n['rows']} rows, {n['samples']} samples (release build, opt-level z)")
print(f"{'step':<20}{'native ms':>12}{'wasm ms':>12}{'native Msamples/s':>20}{'wasm Msamples/s':>18}{'wasm/native':>13}")
for step, key in (("CSV import", "import_ms"), ("exposure analysis", "analyze_ms")):
    rate = lambda r: r["samples"] / r[key] / 1000
    print(f"{step:<20}{n[key]:>12.2f}{b[key]:>12.2f}{rate(n):>20.2f}{rate(b):>18.2f}{b[key] / n[key]:>13.2f}")
mb = n["mb_72h"]
print(f"\nrecord 72 h: {n['rows_72h']} rows, {n['samples_72h']} samples, {mb:.2f} MB")
print(f"{'step':<20}{'native ms':>12}{'wasm ms':>12}{'native MB/s':>20}{'wasm MB/s':>18}{'wasm/native':>13}")
k = "import_72h_ms"
print(f"{'CSV import':<20}{n[k]:>12.2f}{b[k]:>12.2f}{mb / n[k] * 1000:>20.1f}{mb / b[k] * 1000:>18.1f}{b[k] / n[k]:>13.2f}")
ours = mb / n[k] * 1000
read, parse = (mb / n[f"csv_crate_{s}_72h_ms"] * 1000 for s in ("read", "parse"))
print(f"native csv crate, same file: records only {read:.1f} MB/s, records and numbers into columns {parse:.1f} MB/s")
cpu_ratio = n["csv_crate_parse_72h_cpu_ms"] / n["import_72h_cpu_ms"]
print(f"our import / csv crate read + parse: {ours / parse:.2f} x the MB/s ({cpu_ratio:.2f} x by CPU time)")
cpu = n["import_72h_cpu_ms"]
print(f"native CPU time of the import: {cpu:.2f} ms = {mb / cpu * 1000:.1f} MB/s (leaves out time waiting on a busy machine)")
peak = n["import_72h_peak_mb"]
print(f"native peak memory of the import: {peak:.1f} MB = {peak / mb:.2f} x the file")
PY

if [ "${1:-}" = "--criterion" ]; then
  cargo bench -p plumbline-core --bench check
  cargo bench -p plumbline-bench --bench record
fi

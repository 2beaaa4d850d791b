#!/usr/bin/env bash
# Tests the bedside screen: release build, download-size budget, lints for
# wasm32, wasm tests in headless Chromium, then the Playwright browser tests
# against the release build. Prints how long each step took.
set -euo pipefail
cd "$(dirname "$0")/.."

# gzip -9 of everything the browser downloads (wasm, js, css, html).
BUDGET_BYTES=${PLUMBLINE_WEB_BUDGET_BYTES:-532400}

fail() { echo "test-web: $*" >&2; exit 1; }
step() { printf '\n== web: %s\n' "$*"; }
timed() {
  local label=$1 t0=$SECONDS
  shift
  "$@"
  printf 'test-web: %s took %d s\n' "$label" "$((SECONDS - t0))"
}

# Run alone on a fresh machine, it installs what is missing first.
scripts/setup.sh --check || scripts/setup.sh

step "release build into dist/"
timed "release build" scripts/build-web.sh

step "size budget (gzip -9)"
total=0
for f in dist/*.wasm dist/*.js dist/*.css dist/*.html; do
  raw=$(stat -c %s "$f")
  gz=$(gzip -9c "$f" | wc -c)
  total=$((total + gz))
  printf '  %-28s %8d bytes raw %8d gzip\n' "${f#dist/}" "$raw" "$gz"
done
printf '  %-28s %26d gzip (budget %d)\n' "total" "$total" "$BUDGET_BYTES"
[ "$total" -le "$BUDGET_BYTES" ] || fail "the download is $total bytes gzip, over the budget of $BUDGET_BYTES"

step "lints for wasm32"
timed "wasm32 lints" cargo clippy -p plumbline-web --target wasm32-unknown-unknown --all-targets --quiet -- -D warnings

step "wasm tests in headless Chromium"
timed "wasm tests" cargo test -p plumbline-web --target wasm32-unknown-unknown

step "browser tests (Playwright, node --test)"
timed "browser tests" node --test tests/e2e/

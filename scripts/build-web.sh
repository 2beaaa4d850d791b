#!/usr/bin/env bash
# Release build of the bedside screen into dist/: cargo for wasm32,
# wasm-bindgen (--target web), wasm-opt -Oz from the npm binaryen, then the
# page and its assets. No trunk: these three tools are all it needs.
set -euo pipefail
cd "$(dirname "$0")/.."

fail() { echo "build-web: $*" >&2; exit 1; }

# Tools first, so a missing one fails before a long build.
command -v cargo >/dev/null || fail "cargo is missing (install Rust with rustup)"
rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown \
  || fail "the wasm32 target is missing: rustup target add wasm32-unknown-unknown"
want=$(awk '/^name = "wasm-bindgen"$/ { getline; gsub(/version = |"/, ""); print; exit }' Cargo.lock)
command -v wasm-bindgen >/dev/null \
  || fail "wasm-bindgen is missing: cargo install wasm-bindgen-cli --version $want"
have=$(wasm-bindgen --version | awk '{print $2}')
[ "$have" = "$want" ] \
  || fail "wasm-bindgen is $have but Cargo.lock has $want: cargo install wasm-bindgen-cli --version $want"
wasm_opt=node_modules/.bin/wasm-opt
[ -x "$wasm_opt" ] || fail "wasm-opt is missing: run npm ci (package.json pins binaryen)"

step() { printf 'build-web: %s\n' "$*"; }
timed() { local t0=$SECONDS; "$@"; step "  ($((SECONDS - t0)) s)"; }

step "cargo build (wasm32, release)"
timed cargo build -p plumbline-web --target wasm32-unknown-unknown --release --quiet

step "wasm-bindgen --target web"
rm -rf dist
mkdir -p dist
timed wasm-bindgen --target web --no-typescript --out-dir dist --out-name plumbline \
  "${CARGO_TARGET_DIR:-target}/wasm32-unknown-unknown/release/plumbline-web.wasm"

step "wasm-opt -Oz"
timed "$wasm_opt" -Oz dist/plumbline_bg.wasm -o dist/plumbline_bg.wasm

step "page and assets"
cp index.html dist/
cp -r web/. dist/
ls -l dist

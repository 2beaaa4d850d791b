#!/usr/bin/env bash
# Runs every test of the project: the README's test command, and what CI runs.
set -euo pipefail
cd "$(dirname "$0")/.."

step() { printf '\n== %s\n' "$*"; }

step "formatting"
cargo fmt --all -- --check

step "lints (host)"
cargo clippy --workspace --all-targets -- -D warnings

step "unit, reference, property and command-line tests"
cargo test --workspace --exclude plumbline-fuzz

step "fuzzing corpus replay: every corpus input and seed decoded and checked, no panic"
cargo test -p plumbline-fuzz

step "the core builds for wasm32"
cargo build -p plumbline-core --target wasm32-unknown-unknown --quiet

if [ -x scripts/test-web.sh ]; then
  step "web app: build, size budget, wasm tests, browser tests"
  scripts/test-web.sh
fi

step "all tests passed"

#!/usr/bin/env bash
# Runs every test of the project: the README's test command, and what CI runs.
# On a fresh machine it first installs what is missing (scripts/setup.sh, as
# scripts/serve.sh does), so this one command is all a newcomer needs.
set -euo pipefail
cd "$(dirname "$0")/.."

step() { printf '\n== %s\n' "$*"; }

if ! scripts/setup.sh --check; then
  step "installing what is missing (scripts/setup.sh)"
  scripts/setup.sh
fi

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

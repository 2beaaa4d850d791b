#!/usr/bin/env bash
# Installs what a fresh Debian machine lacks to build and test Plumbline, and
# skips whatever is already there at the right version. With --no-browser it
# leaves out Chromium and ChromeDriver, which only the tests need.
set -euo pipefail
cd "$(dirname "$0")/.."

browser=yes
[ "${1:-}" = "--no-browser" ] && browser=no

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; else sudo "$@"; fi
}

if [ "$browser" = yes ] && { ! command -v chromium >/dev/null || ! command -v chromedriver >/dev/null; }; then
  echo "setup: installing Debian chromium and chromium-driver"
  as_root apt-get update -qq
  as_root apt-get install -y -qq --no-install-recommends chromium chromium-driver
fi

if ! rustup target list --installed | grep -qx wasm32-unknown-unknown; then
  echo "setup: adding the wasm32 target"
  rustup target add wasm32-unknown-unknown
fi

# wasm-bindgen-cli must match the wasm-bindgen in Cargo.lock. Its own
# lockfile pins a crate the registry does not serve, so no --locked.
want=$(awk '/^name = "wasm-bindgen"$/ { getline; gsub(/version = |"/, ""); print; exit }' Cargo.lock)
if [ -n "$want" ]; then
  have=$(wasm-bindgen --version 2>/dev/null | awk '{print $2}' || true)
  if [ "$have" != "$want" ]; then
    echo "setup: installing wasm-bindgen-cli $want (found '${have:-none}')"
    cargo install wasm-bindgen-cli --version "$want"
  fi
fi

if [ -f package-lock.json ]; then
  echo "setup: npm ci"
  npm ci --no-audit --no-fund --loglevel=error
fi

cargo fetch --quiet
echo "setup: done"

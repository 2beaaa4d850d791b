#!/usr/bin/env bash
# Installs what a fresh Debian machine lacks to build and test Plumbline, and
# skips whatever is already there at the right version. With --no-browser it
# leaves out Chromium and ChromeDriver, which only the tests need. With
# --check it installs nothing: it names what is missing and exits 1 when
# anything is (scripts/test.sh uses it to decide whether to run this first).
set -euo pipefail
cd "$(dirname "$0")/.."

browser=yes
check=no
for arg in "$@"; do
  case $arg in
    --no-browser) browser=no ;;
    --check) check=yes ;;
    *) echo "setup: unknown option $arg (--no-browser, --check)" >&2; exit 2 ;;
  esac
done

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; else sudo "$@"; fi
}

# What is missing, one need per line: "what|how it is installed".
needs=()
need() { needs+=("$1|$2"); }

command -v cargo >/dev/null && command -v rustup >/dev/null \
  || { echo "setup: Rust is missing: install it with rustup (https://rustup.rs), then run this again" >&2; exit 1; }

apt_packages=()
for tool in node:nodejs npm:npm python3:python3 gzip:gzip; do
  command -v "${tool%%:*}" >/dev/null || { need "${tool%%:*}" apt; apt_packages+=("${tool#*:}"); }
done
if [ "$browser" = yes ]; then
  command -v chromium >/dev/null || { need chromium apt; apt_packages+=(chromium); }
  command -v chromedriver >/dev/null || { need chromedriver apt; apt_packages+=(chromium-driver); }
fi

components=()
for c in clippy rustfmt; do
  rustup component list --installed 2>/dev/null | grep -q "^$c" || { need "rust $c" rustup; components+=("$c"); }
done
rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown \
  || need "the wasm32 target" rustup

# wasm-bindgen-cli must match the wasm-bindgen in Cargo.lock.
want=$(awk '/^name = "wasm-bindgen"$/ { getline; gsub(/version = |"/, ""); print; exit }' Cargo.lock)
have=$(wasm-bindgen --version 2>/dev/null | awk '{print $2}' || true)
[ -z "$want" ] || [ "$have" = "$want" ] || need "wasm-bindgen-cli $want (found '${have:-none}')" cargo

# The npm tools, at package-lock.json's versions (npm records what it
# installed in node_modules/.package-lock.json).
npm_stale=no
if [ -f package-lock.json ]; then
  if [ ! -x node_modules/.bin/wasm-opt ] || [ ! -d node_modules/playwright-core ] \
     || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    need "the npm tools (binaryen, playwright-core)" npm
    npm_stale=yes
  fi
fi

if [ "$check" = yes ]; then
  [ ${#needs[@]} -eq 0 ] && exit 0
  for n in "${needs[@]}"; do echo "setup: missing: ${n%%|*}"; done
  exit 1
fi

if [ ${#apt_packages[@]} -gt 0 ]; then
  echo "setup: installing Debian ${apt_packages[*]}"
  as_root apt-get update -qq
  as_root apt-get install -y -qq --no-install-recommends "${apt_packages[@]}"
fi

if [ ${#components[@]} -gt 0 ]; then
  echo "setup: adding rust ${components[*]}"
  rustup component add "${components[@]}"
fi

if ! rustup target list --installed | grep -qx wasm32-unknown-unknown; then
  echo "setup: adding the wasm32 target"
  rustup target add wasm32-unknown-unknown
fi

# Its own lockfile pins a crate the registry does not serve, so no --locked.
if [ -n "$want" ] && [ "$have" != "$want" ]; then
  echo "setup: installing wasm-bindgen-cli $want (found '${have:-none}')"
  cargo install wasm-bindgen-cli --version "$want"
fi

if [ "$npm_stale" = yes ]; then
  echo "setup: npm ci"
  npm ci --no-audit --no-fund --loglevel=error
fi

cargo fetch --quiet
echo "setup: done"

#!/usr/bin/env bash
# Builds the bedside screen and serves it on this machine only
# (127.0.0.1) with the demo case loaded. Installs what a fresh machine
# lacks first (scripts/setup.sh: the wasm32 target, wasm-bindgen-cli at
# Cargo.lock's version, the npm tools). PORT picks the port (default 8080).
set -euo pipefail
cd "$(dirname "$0")/.."

PORT=${PORT:-8080}

scripts/setup.sh --no-browser
scripts/build-web.sh

echo
echo "serve: Plumbline is at http://127.0.0.1:${PORT}/ (the demo case loads on start; Ctrl-C stops)"
exec python3 -m http.server --bind 127.0.0.1 --directory dist "$PORT"

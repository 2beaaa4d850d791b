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

# The library, built as a cdylib from the command line: the page's boot.js
# calls `start`, and another page can load the same module for the check
# alone (`api`). Cargo.toml keeps the default rlib for the wasm tests; a
# manifest listing both kinds loses most of LTO (42 KB gzip more).
step "cargo rustc (wasm32, release, cdylib)"
timed cargo rustc -p plumbline-web --lib --crate-type cdylib --target wasm32-unknown-unknown --release --quiet

step "wasm-bindgen --target web"
rm -rf dist
mkdir -p dist
timed wasm-bindgen --target web --no-typescript --out-dir dist --out-name plumbline \
  "${CARGO_TARGET_DIR:-target}/wasm32-unknown-unknown/release/plumbline_web.wasm"

step "wasm-opt -Oz"
timed "$wasm_opt" -Oz dist/plumbline_bg.wasm -o dist/plumbline_bg.wasm

step "page and assets"
cp index.html dist/
cp -r web/. dist/
# Our own scripts ship without their comment lines and indentation (the
# sources in web/ keep them): smaller, and still readable.
for js in boot.js sw.js; do
  sed -E -e '/^[[:space:]]*$/d' -e '/^[[:space:]]*(\/\/|\/\*\*|\*\/|\* |\*$)/d' -e 's/^[[:space:]]+//' "web/$js" > "dist/$js"
done
node --check dist/boot.js && node --check dist/sw.js || fail "boot.js or sw.js no longer parses without its comments"
# The style sheet likewise, without its comments (none sits inside a
# string) and indentation: 1.2 KB less gzip. Its braces must still pair.
node -e '
  const fs = require("fs");
  const css = fs.readFileSync("web/style.css", "utf8");
  const out = css.replace(/\/\*[\s\S]*?\*\//g, "").split("\n").map((l) => l.trim()).filter((l) => l).join("\n") + "\n";
  const braces = (s) => [(s.match(/{/g) || []).length, (s.match(/}/g) || []).length].join();
  if (out.includes("/*") || out.includes("*/") || braces(out) !== braces(css)) process.exit(1);
  fs.writeFileSync("dist/style.css", out);
' || fail "style.css did not keep its rules without its comments"

# The offline worker keeps every file of this build, each with the SHA-256
# of its bytes, so it can check its copies at every start and fetch a
# damaged one again. Its cache is named for a hash of that list, so a new
# build is a new worker (and the old cache goes when it takes over). Names
# are relative: the build works from any folder of any static host.
step "offline worker: files, their hashes, and the build hash"
files=$(cd dist && find . -type f ! -name sw.js -printf '%P\n' | LC_ALL=C sort)
for f in $files; do
  case $f in *[!A-Za-z0-9._/-]*) fail "unexpected file name in dist/: $f" ;; esac
done
sums=$(cd dist && sha256sum $files)
build=$(echo "$sums" | sha256sum | cut -c1-16)
list=$(echo "$sums" | awk '{ printf "%s\"%s\": \"%s\"", (NR > 1 ? ", " : ""), $2, $1 }')
sed -i -e "s|^const BUILD = .*|const BUILD = '$build';|" -e "s|^const FILES = .*|const FILES = {$list};|" dist/sw.js
grep -q "^const BUILD = '$build';" dist/sw.js || fail "could not write the build hash into dist/sw.js"
grep -q '^const FILES = {"' dist/sw.js || fail "could not write the file list into dist/sw.js"
step "  build $build, $(echo "$files" | wc -l) files"
ls -l dist

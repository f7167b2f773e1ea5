#!/usr/bin/env bash
# Builds the offline page as ONE self-contained file: wasm-demo/dist/echoline.html.
#   cargo (wasm32, profile wasm-release) → wasm-bindgen --target no-modules
#   → wasm-opt (npm binaryen, pinned in package.json) → tools/inline.mjs
# Usage: bash wasm-demo/build.sh   (from anywhere; needs cargo, node, npm)
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
root="$(cd "$here/.." && pwd)"
TOOLS="${ECHOLINE_TOOLS:-$HOME/.cache/echoline-tools}"
WBG_VERSION="0.2.106" # must equal the pinned wasm-bindgen crate in Cargo.toml
WBG="$TOOLS/bin/wasm-bindgen"
out="$root/target/wasm-demo"

if ! "$WBG" --version 2>/dev/null | grep -qx "wasm-bindgen $WBG_VERSION"; then
  echo "installing wasm-bindgen-cli $WBG_VERSION into $TOOLS (several minutes, once)"
  # No --locked: the registry mirror lacks one of its locked dependencies.
  cargo install wasm-bindgen-cli --version "$WBG_VERSION" --root "$TOOLS"
fi
if command -v rustup >/dev/null; then
  rustup target add wasm32-unknown-unknown >/dev/null 2>&1 || true
fi

cd "$root"
cargo build -p echoline-wasm-demo --target wasm32-unknown-unknown --profile wasm-release
rm -rf "$out/bindgen"
"$WBG" --target no-modules --no-typescript --out-dir "$out/bindgen" \
  target/wasm32-unknown-unknown/wasm-release/echoline_wasm_demo.wasm

cd "$here"
[ -x node_modules/.bin/wasm-opt ] || npm ci --no-audit --no-fund
# The features Rust enables by default for wasm32 must be allowed here.
node_modules/.bin/wasm-opt -Oz --strip-debug --strip-producers \
  --enable-bulk-memory --enable-nontrapping-float-to-int --enable-sign-ext \
  --enable-mutable-globals --enable-reference-types --enable-multivalue \
  "$out/bindgen/echoline_wasm_demo_bg.wasm" -o "$out/echoline.wasm"
node tools/inline.mjs "$out/bindgen/echoline_wasm_demo.js" "$out/echoline.wasm" dist/echoline.html

#!/usr/bin/env bash
# Short fuzz run of every target (CI smoke). Usage: fuzz/smoke.sh [seconds per target]
# Needs a nightly toolchain and cargo-fuzz (installed here if missing).
set -euo pipefail
cd "$(dirname "$0")"
secs="${1:-20}"
TOOLS="${ECHOLINE_TOOLS:-$HOME/.cache/echoline-tools}"
export PATH="$TOOLS/bin:$PATH"
if ! command -v cargo-fuzz >/dev/null; then
  cargo install cargo-fuzz --locked --root "$TOOLS"
fi
rustup toolchain list | grep -q nightly || rustup toolchain install nightly --profile minimal
for t in $(cargo +nightly fuzz list); do
  mkdir -p "corpus/$t"
  # Run on a scratch copy of the committed seeds so the run does not grow them.
  work="$(mktemp -d)"
  cp -r "corpus/$t/." "$work/" 2>/dev/null || true
  echo "-- fuzz $t for ${secs}s"
  cargo +nightly fuzz run "$t" "$work" -- -max_total_time="$secs" 2>&1 | grep -E '^(Done|#[0-9]+ +DONE)|panicked|SUMMARY' || true
  if ls artifacts/"$t"/crash-* >/dev/null 2>&1; then
    echo "FAIL: fuzz target $t found a crash (fuzz/artifacts/$t)" >&2
    exit 1
  fi
  rm -rf "$work"
done

#!/usr/bin/env bash
# CI for the offline page, on a fresh machine: Chromium from Debian if missing,
# the pinned npm packages (npm ci), the single-file build, the browser test.
# Called from the repository's .ci/run; runnable alone: bash wasm-demo/ci.sh
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
cd "$here"
step() { printf '\n==> page: %s (%s)\n' "$*" "$(date +%H:%M:%S)"; }

step "Chromium (Debian package)"
if ! command -v chromium >/dev/null; then
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
fi
chromium --version || true

step "npm packages (pinned by package-lock.json)"
npm ci --no-audit --no-fund

step "build the single file"
bash build.sh

step "browser test (headless, offline, file://)"
node --test --test-concurrency=1 test/

step "done"

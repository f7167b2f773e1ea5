#!/usr/bin/env bash
# Builds the firmware images, proves the no-panic property at link time, checks
# the f32 image for double-precision soft-float routines and float formatting,
# checks the flash / static RAM / stack budgets, runs both images under QEMU
# (Cortex-M4 mps2-an386 and Cortex-M7 mps2-an500) and compares their results
# with the host's, computed from the same source (src/path.rs).
#
# Usage: tests/firmware/run.sh   (needs qemu-system-arm, binutils-arm-none-eabi)
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
root="$(cd "$here/../.." && pwd)"
cd "$here"
out="$here/target/qemu-out"
mkdir -p "$out"
FLASH_BUDGET=$((48 * 1024))
STACK_BUDGET=4096

echo "-- link-time no-panic proof (panic handler cannot link)"
cargo build --release --features no-panic-proof --quiet
echo "   linked: no reachable panic in the firmware path (f32 and f64 images)"

cargo build --release --quiet
bin="$here/target/thumbv7em-none-eabihf/release"

echo "-- symbols"
if arm-none-eabi-nm "$bin/fw-f32" | grep -E '__aeabi_d|__(add|sub|mul|div)df3|__extendsfdf2|__truncdfsf2|__aeabi_f2d|__aeabi_d2f'; then
  echo "FAIL: the f32 image contains double-precision soft-float routines" >&2; exit 1
fi
echo "   f32 image: no double-precision soft-float routines"
n_d=$(arm-none-eabi-nm "$bin/fw-f64" | grep -cE '__aeabi_d' || true)
if [ "$n_d" -eq 0 ]; then
  echo "FAIL: sanity: the f64 image should use soft-float doubles on an M4F; the symbol check is broken" >&2; exit 1
fi
echo "   (sanity: the f64 image does contain them, so the check can fail)"
for p in f32 f64; do
  if arm-none-eabi-nm -C "$bin/fw-$p" | grep -E 'core::fmt::float|float_to_decimal|flt2dec'; then
    echo "FAIL: float formatting linked into fw-$p" >&2; exit 1
  fi
done
echo "   no float formatting in either image"

echo "-- budgets"
for p in f32 f64; do
  read -r text data bss _ < <(arm-none-eabi-size "$bin/fw-$p" | tail -1)
  flash=$((text + data)); ram=$((data + bss))
  if [ "$p" = f32 ]; then
    echo "   fw-$p: flash $flash B (budget $FLASH_BUDGET B: the f32 firmware path), static RAM $ram B"
    [ "$flash" -le "$FLASH_BUDGET" ] || { echo "FAIL: flash budget" >&2; exit 1; }
  else
    echo "   fw-$p: flash $flash B (reported only: doubles are soft-float on an M4F), static RAM $ram B"
  fi
done

echo "-- host reference (same source, x86_64)"
(cd "$root" && cargo run --quiet -p echoline-checks --example firmware_host -- f32) > "$out/host-f32.txt"
(cd "$root" && cargo run --quiet -p echoline-checks --example firmware_host -- f64) > "$out/host-f64.txt"

run_qemu() { # machine cpu elf
  timeout 60 qemu-system-arm -machine "$1" -cpu "$2" -nographic -monitor none \
    -semihosting-config enable=on,target=native -kernel "$3"
}
for m in "mps2-an386 cortex-m4" "mps2-an500 cortex-m7"; do
  set -- $m
  for p in f32 f64; do
    run_qemu "$1" "$2" "$bin/fw-$p" > "$out/$2-$p.txt"
    python3 "$here/compare.py" "$out/host-$p.txt" "$out/$2-$p.txt" "$p" "$STACK_BUDGET" "$2"
  done
done

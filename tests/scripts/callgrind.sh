#!/usr/bin/env bash
# Instruction counts of the hot paths under valgrind's callgrind: a figure that
# does not move with the machine's load (wall-clock times on a shared machine do).
#
#   bash tests/scripts/callgrind.sh          # build core/examples/perf_probe.rs, print the table
#   bash tests/scripts/callgrind.sh --keep   # also keep the callgrind.out files (for callgrind_annotate)
#
# Each workload runs twice under `valgrind --tool=callgrind` with two sizes;
# the figure is (I(n2) - I(n1)) / (n2 - n1), so start-up, set-up and other fixed
# costs cancel. Workloads (see perf_probe.rs):
#   zin     input impedance, 3 constant-RLGC sections + series RLC load, per frequency point
#   zincoax the same through 3 coax sections (skin effect, lossy dielectric), per point
#   detect  event detection on a synthetic step trace, per sample
#   peel    layer peeling: O(n^2), so the figure is per cell-layer update,
#           (I(n2) - I(n1)) / (n2(n2+1)/2 - n1(n1+1)/2)
#   fft     forward complex FFT of 4096 points, per transform: 1 and 3 transforms
#           of the same size (perf_probe's REPEATS argument) are counted instead of two sizes
# Targets from the issues: zin <= 150 instructions per point (f64), detect <= 40 per sample.
set -euo pipefail

root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
keep=0
[[ "${1:-}" == "--keep" ]] && keep=1

command -v valgrind >/dev/null || { echo "valgrind not found (apt-get install valgrind)" >&2; exit 1; }

(cd "$root" && cargo build --release -q -p echoline --example perf_probe)
probe="$root/target/release/examples/perf_probe"
out="$(mktemp -d)"
trap '[[ $keep == 1 ]] || rm -rf "$out"' EXIT

# Total instructions of one run: callgrind's "totals:" line.
count() { # name args...
    local name="$1"; shift
    local f="$out/callgrind.out.$name"
    valgrind --tool=callgrind --callgrind-out-file="$f" "$probe" "$@" >/dev/null 2>&1
    awk '/^totals:/ {print $2}' "$f"
}

printf '%-10s %-5s %10s %10s %14s  %s\n' workload type n1 n2 "instr/item" "(item)"
row() { # workload type n1 n2 divisor-kind item
    local w="$1" t="$2" n1="$3" n2="$4" kind="$5" item="$6"
    local i1 i2 d p="$w${t#f}"
    if [[ $kind == repeat ]]; then
        i1=$(count "$p.r$n1" "$p" 4096 "$n1")
        i2=$(count "$p.r$n2" "$p" 4096 "$n2")
    else
        i1=$(count "$p.$n1" "$p" "$n1")
        i2=$(count "$p.$n2" "$p" "$n2")
    fi
    case $kind in
        linear | repeat) d=$((n2 - n1)) ;;
        triangle) d=$((n2 * (n2 + 1) / 2 - n1 * (n1 + 1) / 2)) ;;
    esac
    printf '%-10s %-5s %10s %10s %14s  %s\n' "$w" "$t" "$n1" "$n2" \
        "$(awk -v a="$i1" -v b="$i2" -v d="$d" 'BEGIN {printf "%.1f", (b - a) / d}')" "$item"
}

for t in f64 f32; do
    row zin "$t" 2000 4000 linear "point"
    row zincoax "$t" 2000 4000 linear "point"
    row detect "$t" 20000 40000 linear "sample"
    row peel "$t" 256 512 triangle "cell-layer update"
    row fft "$t" 1 3 repeat "FFT of 4096 points"
done
[[ $keep == 1 ]] && echo "callgrind.out files kept in $out"
exit 0

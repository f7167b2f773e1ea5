#!/usr/bin/env bash
# Instruction counts of the hot paths under valgrind's callgrind: a figure that
# does not move with the machine's load (wall-clock times on a shared machine do).
#
#   bash tests/scripts/callgrind.sh          # build core/examples/perf_probe.rs, print the table
#   bash tests/scripts/callgrind.sh --keep   # also keep the callgrind.out files (for callgrind_annotate)
#
# Each workload is counted at two sizes n1 < n2, and at each size with the
# workload repeated once and three times inside one process (perf_probe's
# REPEATS argument; set-up such as building the frequency grid or the trace is
# outside the repeated part). With I(n, r) the total instructions,
#   per item = ((I(n2,3) - I(n2,1)) - (I(n1,3) - I(n1,1))) / (2 * (n2 - n1)),
# so start-up, set-up and per-call fixed costs (e.g. the noise floor's 256-point
# median in detection) all cancel. Workloads (see core/examples/perf_probe.rs):
#   zin     input impedance, 3 constant-RLGC sections + series RLC load, per frequency point
#   zincoax the same through 3 coax sections (skin effect, lossy dielectric), per point
#   detect  event detection (Trace::analyse_into) on a synthetic step trace, per sample
#   peel    layer peeling: O(n^2), so the figure is per cell-layer update, with
#           n(n+1)/2 in place of n
#   ms      Microstrip::at, FR-4 (constant dielectric), per point; msdebye: on a wideband Debye FR-4
#   fft     forward complex FFT of 4096 points, per transform: (I(3) - I(1)) / 2 at one size
# Targets from the issues: zin <= 150 instructions per point (f64), detect <= 40 per sample,
# every line model under 300 ns per point.
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
    local p="$w${t#f}" a1 a3 b1 b3 d
    if [[ $kind == repeat ]]; then
        a1=0 a3=0
        b1=$(count "$p.$n2.r1" "$p" "$n2" 1)
        b3=$(count "$p.$n2.r3" "$p" "$n2" 3)
        d=1
    else
        a1=$(count "$p.$n1.r1" "$p" "$n1" 1)
        a3=$(count "$p.$n1.r3" "$p" "$n1" 3)
        b1=$(count "$p.$n2.r1" "$p" "$n2" 1)
        b3=$(count "$p.$n2.r3" "$p" "$n2" 3)
        case $kind in
            linear) d=$((n2 - n1)) ;;
            triangle) d=$((n2 * (n2 + 1) / 2 - n1 * (n1 + 1) / 2)) ;;
        esac
    fi
    printf '%-10s %-5s %10s %10s %14s  %s\n' "$w" "$t" "$n1" "$n2" \
        "$(awk -v a1="$a1" -v a3="$a3" -v b1="$b1" -v b3="$b3" -v d="$d" \
            'BEGIN {printf "%.1f", ((b3 - b1) - (a3 - a1)) / (2 * d)}')" "$item"
}

for t in f64 f32; do
    row zin "$t" 2000 4000 linear "point"
    row zincoax "$t" 2000 4000 linear "point"
    row detect "$t" 20000 40000 linear "sample"
    row peel "$t" 256 512 triangle "cell-layer update"
    row ms "$t" 2000 4000 linear "point"
    row msdebye "$t" 2000 4000 linear "point"
    row fft "$t" - 4096 repeat "FFT of 4096 points"
done
[[ $keep == 1 ]] && echo "callgrind.out files kept in $out"
exit 0

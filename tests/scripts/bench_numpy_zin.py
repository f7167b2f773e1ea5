"""Times the input-impedance sweep of core/benches/zin_sweep.rs in numpy.

Same problem: 10,000 frequencies from 1 MHz to 1 GHz, three constant-RLGC line
sections (Z = R + jwL, Y = G + jwC, gamma = sqrt(Z*Y), Zc = Z/gamma, as the bench's
`echoline::line::rlgc::Rlgc::constant` sections)
ended by a series R-L-C load, input impedance by the reflection recursion
Gamma_in = Gamma_L * exp(-2*gamma*l), Zin = Zc*(1 + Gamma_in)/(1 - Gamma_in).
The numpy code is vectorised over frequency (one array operation per formula step).

    python3 tests/scripts/bench_numpy_zin.py            # numpy only
    python3 tests/scripts/bench_numpy_zin.py --cargo    # also run the cargo bench, print the ratio

tests/scripts/bench_numpy.py holds the identical formulas (`zin_numpy`) and
times them beside event detection and an FFT against core/examples/perf_probe.rs
in one run, with a ratio table.

OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE (which this machine may set) are removed
from the environment for the timing: the script re-executes itself without them.

With --cargo the Rust figure is read from criterion's estimates
(target/criterion/zin_sweep/<f64|f32>/new/sample.json: the fastest sample, comparable
with timeit's best-of; the mean estimate is printed beside it).
"""
import json
import os
import subprocess
import sys
import timeit

import numpy as np

POINTS = 10_000
F_LO_HZ, F_HI_HZ = 1e6, 1e9
# (R ohm/m, L H/m, G S/m, C F/m, length m): must match core/benches/zin_sweep.rs
SECTIONS = [
    (0.5, 250e-9, 1e-5, 100e-12, 2.0),
    (1.2, 370e-9, 2e-5, 66e-12, 5.0),
    (0.8, 180e-9, 5e-6, 120e-12, 3.0),
]
LOAD = (100.0, 10e-9, 5e-12)  # series R, L, C

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))


def zin_numpy(f, dtype=np.complex128):
    w = 2.0 * np.pi * f
    r, l, c = LOAD
    z = (r + 1j * (w * l - 1.0 / (w * c))).astype(dtype)
    for (R, L, G, C, length) in reversed(SECTIONS):
        zs = R + 1j * w * L
        gamma = np.sqrt(zs * (G + 1j * w * C))
        zc = zs / gamma
        g_l = (z - zc) / (z + zc)
        g_in = g_l * np.exp(-2.0 * gamma * length)
        z = zc * (1.0 + g_in) / (1.0 - g_in)
    return z


def time_numpy(f, repeats=20):
    best = min(timeit.repeat(lambda: zin_numpy(f), number=1, repeat=repeats))
    return best / len(f) * 1e9  # ns per point


def cargo_ns_per_point(kind):
    """(best, mean) ns per point from criterion's samples: best is the fastest
    sample (comparable with timeit's best-of), mean is criterion's estimate."""
    base = os.path.join(ROOT, "target", "criterion", "zin_sweep", kind, "new")
    with open(os.path.join(base, "sample.json")) as fh:
        sample = json.load(fh)
    with open(os.path.join(base, "estimates.json")) as fh:
        est = json.load(fh)
    best = min(t / n for t, n in zip(sample["times"], sample["iters"]))
    return best / POINTS, est["mean"]["point_estimate"] / POINTS  # criterion times are ns per iteration


def main():
    drop = ("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE")
    if any(k in os.environ for k in drop):
        env = {k: v for k, v in os.environ.items() if k not in drop}
        os.execve(sys.executable, [sys.executable, os.path.abspath(__file__)] + sys.argv[1:], env)
    f = np.linspace(F_LO_HZ, F_HI_HZ, POINTS)
    ns_np = time_numpy(f)
    print(f"numpy {np.__version__}: {ns_np:.1f} ns per point (best of 20, float64, {POINTS} points, 3 sections)")
    if "--cargo" in sys.argv:
        subprocess.run(["cargo", "bench", "-p", "echoline", "--bench", "zin_sweep"], cwd=ROOT, check=True)
        for kind in ("f64", "f32"):
            best, mean = cargo_ns_per_point(kind)
            print(f"rust {kind}: {best:.1f} ns per point (best sample; mean {mean:.1f}); numpy/rust = {ns_np / best:.1f}x")
        ratio = ns_np / cargo_ns_per_point("f64")[0]
        print("PASS" if ratio >= 8.0 else "FAIL", f"(target: rust f64 >= 8x faster than numpy, got {ratio:.1f}x)")
        return 0 if ratio >= 8.0 else 1
    return 0


if __name__ == "__main__":
    sys.exit(main())

"""Times the distance-to-fault transform of core/benches/sweep.rs in numpy.

Same work: a 1,601-point sweep (2 MHz steps from 2 MHz), a symmetric Hann
window (scipy.signal.windows.hann(N, sym=True), made inside the timed call as
the Rust code does), zero-padding to 4,096 points, numpy.fft.ifft, scaling by
M / sum(w) and the carrier exp(j 2 pi f0 t_k) (numpy applies it as an array
multiply; the Rust code shifts the spectrum by f0/df bins instead).

    python3 tests/scripts/bench_numpy_sweep.py            # numpy only
    python3 tests/scripts/bench_numpy_sweep.py --cargo    # also run the cargo bench, print the ratio

Both figures are medians (numpy: of 400 single runs; Rust: criterion's
median estimate in
target/criterion/sweep_dtf/<f64|f32>/new/estimates.json), since the host
may be shared.
"""
import json
import os
import subprocess
import sys
import timeit

import numpy as np
import scipy.signal

N, M, DF_HZ = 1601, 4096, 2e6  # must match core/benches/sweep.rs
ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))


def sweep():
    f = DF_HZ * np.arange(1, N + 1)
    v = 0.88 * 299_792_458.0
    g = np.zeros(N, complex)
    for rho, d in ((0.15, 12.4), (0.03, 33.0), (0.09, 35.0)):
        g += rho * np.exp(-2j * np.pi * f * 2 * d / v)
    return f, g


def dtf_numpy(f, g):
    w = scipy.signal.windows.hann(len(f), sym=True)
    x = np.fft.ifft(w * g, M) * (M / w.sum())
    t = np.arange(M) / (M * (f[1] - f[0]))
    return x * np.exp(2j * np.pi * f[0] * t)


def time_numpy(f, g, repeats=400):
    # Median of single runs, as criterion's median below (the host is shared).
    return float(np.median(timeit.repeat(lambda: dtf_numpy(f, g), number=1, repeat=repeats))) * 1e6


def cargo_us(kind):
    path = os.path.join(ROOT, "target", "criterion", "sweep_dtf", kind, "new", "estimates.json")
    with open(path) as fh:
        return json.load(fh)["median"]["point_estimate"] / 1e3


def main():
    f, g = sweep()
    us_np = time_numpy(f, g)
    print(f"numpy {np.__version__}: {us_np:.1f} µs per transform (median of 400, float64, {N} -> {M} points)")
    if "--cargo" in sys.argv:
        subprocess.run(["cargo", "bench", "-p", "echoline", "--bench", "sweep", "--", "sweep_dtf"],
                       cwd=ROOT, check=True)
        for kind in ("f64", "f32"):
            us_rs = cargo_us(kind)
            print(f"rust {kind}: {us_rs:.1f} µs; numpy/rust = {us_np / us_rs:.2f}x")
        ratio = us_np / cargo_us("f64")
        ok = ratio >= 1.0 and cargo_us("f64") < 2000.0
        print("PASS" if ok else "FAIL", f"(need rust f64 < 2 ms and no slower than numpy, got {ratio:.2f}x)")
        return 0 if ok else 1
    return 0


if __name__ == "__main__":
    sys.exit(main())

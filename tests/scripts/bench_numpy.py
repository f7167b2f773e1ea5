"""numpy and Rust side by side in one run: input-impedance sweep, trace event
detection and an FFT, with the ratio numpy/Rust per workload.

    python3 tests/scripts/bench_numpy.py            # build the probe, time both, print the table
    python3 tests/scripts/bench_numpy.py --quick    # fewer repetitions
    python3 tests/scripts/bench_numpy.py --native   # also a probe built for this CPU

With --native a second probe is built with RUSTFLAGS="-C target-cpu=native"
(into target/native, so the baseline build is untouched) and its input-impedance
time is printed as an extra row: numpy's loops pick the machine's widest SIMD
at run time, the baseline x86-64 Rust build uses SSE2 only. On a CPU with
AVX-512 a third probe is built (into target/native512) with 512-bit vectors
allowed as well ("-C target-feature=-prefer-256-bit": LLVM's tuning for such
CPUs otherwise keeps to 256-bit vectors; rustc warns that the feature name is
not a stable one and passes it to LLVM), since numpy's own loops dispatch to
AVX-512 there; the SIMD levels numpy found are printed with the table. The
pass/fail verdict is always the baseline build's.

The Rust side is `core/examples/perf_probe.rs` (built here in release mode),
run as `perf_probe WORKLOAD SIZE REPEATS`; it prints the best time per item
over REPEATS runs. The numpy side is timed best-of as well (timeit), in a
child process whose environment has OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE
removed (this machine may set them; they are dropped for the numpy timing
only). Both run on the same machine in the same minute: the load average is
printed with the table, since on a shared machine it moves both figures.

Workloads (the problems are the same on both sides):
* zin: 10,000 frequencies, 1 MHz to 1 GHz, three constant-RLGC sections and a
  series R-L-C load (as core/benches/zin_sweep.rs and bench_numpy_zin.py, whose
  formulas `zin_numpy` is): ns per frequency point.
* detect: event detection on a synthetic 50 Ω step trace of 20,000 samples
  (a 75 Ω section, an open end; invented data, perf_probe's `synthetic_trace`):
  the same algorithm as `echoline::tdr::detect` (noise floor from 256 first
  differences: median, MAD, clipped RMS twice; Haar matched filter of w = 8
  samples per side; minmod creep trend 2w either side; lobes with threshold
  T = max(k·√2·σ_S, ½·ρ_min·V_inc) and hysteresis T/2; levels over w samples a
  gap g outside each lobe), vectorised over samples: ns per sample.
  The trace's time zero, incident level and rise time are given to numpy
  (echoline measures them once in `Trace::new`, outside its timed part too).
* fft: forward complex FFT of 4096 points (numpy.fft.fft against
  `echoline::math::fft::Fft::forward` with a precomputed twiddle table): ns per FFT.
"""
import json
import os
import subprocess
import sys
import timeit

import numpy as np

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
PROBE = os.path.join(ROOT, "target", "release", "examples", "perf_probe")
# Extra probes of --native: (target dir under target/, RUSTFLAGS, row label).
NATIVE_BUILD = ("native", "-C target-cpu=native", "zin, built with target-cpu=native")
WIDE_BUILD = (
    "native512",
    "-C target-cpu=native -C target-feature=-prefer-256-bit",
    "zin, native + 512-bit vectors",
)


def probe_in(target_dir):
    return os.path.join(ROOT, "target", target_dir, "release", "examples", "perf_probe")


def cpu_has_avx512f():
    try:
        with open("/proc/cpuinfo") as f:
            return any(line.startswith("flags") and " avx512f" in line for line in f)
    except OSError:
        return False

# ---- input impedance (must match core/benches/zin_sweep.rs and perf_probe.rs) ----
ZIN_POINTS = 10_000
F_LO_HZ, F_HI_HZ = 1e6, 1e9
# (R ohm/m, L H/m, G S/m, C F/m, length m)
SECTIONS = [
    (0.5, 250e-9, 1e-5, 100e-12, 2.0),
    (1.2, 370e-9, 2e-5, 66e-12, 5.0),
    (0.8, 180e-9, 5e-6, 120e-12, 3.0),
]
LOAD = (100.0, 10e-9, 5e-12)  # series R, L, C


def zin_numpy(f, dtype=np.complex128):
    """The formulas of bench_numpy_zin.py, vectorised over frequency."""
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


# ---- event detection ----
DETECT_SAMPLES = 20_000
W = 8  # filter_samples in perf_probe's detect workload
K_SIGMA, MIN_RHO = 6.0, 0.005
MAD_TO_SIGMA = 1.482_602_218_505_602
NOISE_POINTS = 256


def synthetic_trace(n):
    """perf_probe.rs `synthetic_trace`, sample for sample (same LCG dither)."""
    i = np.arange(n, dtype=np.float64)

    def edge(at):
        x = (i - at) / 4.0
        return np.where(x <= -0.5, 0.0, np.where(x >= 0.5, 1.0, 0.5 - 0.5 * np.cos(np.pi * (x + 0.5))))

    seed = 12345
    seeds = np.empty(n, dtype=np.uint64)
    for k in range(n):
        seed = (seed * 1_664_525 + 1_013_904_223) & 0xFFFF_FFFF
        seeds[k] = seed
    dither = ((seeds >> np.uint64(8)).astype(np.float64) / float(1 << 24) - 0.5) * 2e-3
    launch = edge(n // 20)
    up = 0.2 * edge(n * 3 // 10)
    down = -0.2 * edge(n * 6 // 10)
    opn = 0.8 * edge(n * 85 // 100)
    return 0.5 * launch * (1.0 + up + down + opn) + dither


def detect_numpy(v, t0, vinc, rise_samples, w=W):
    """Matched-filter event detection as echoline::tdr::detect, vectorised.
    Returns (start, end, peak index, rho) per confirmed lobe."""
    n = len(v)
    g = int(np.ceil(0.85 * rise_samples)) + 1
    # Noise floor: 256 evenly spaced first differences, median / MAD / clipped RMS.
    pairs = n - 1
    pts = min(pairs, NOISE_POINTS)
    idx = (np.arange(pts, dtype=np.int64) * pairs) // pts
    d = v[idx + 1] - v[idx]
    dev = np.abs(d - np.median(d))
    s_d = MAD_TO_SIGMA * np.median(dev)
    clip = 4.0 * s_d
    for _ in range(2):
        sel = dev[dev <= clip]
        s_d = np.sqrt(np.mean(sel * sel)) if sel.size else s_d
        clip = 4.0 * s_d
    sigma = s_d / np.sqrt(2.0)
    sigma_s = sigma * np.sqrt(2.0 / w)
    thr = max(K_SIGMA * np.sqrt(2.0) * sigma_s, 0.5 * MIN_RHO * abs(vinc))
    level_thr = max(K_SIGMA * sigma_s, MIN_RHO * abs(vinc))
    # Haar filter S(n) = mean(v[n..n+w)) - mean(v[n-w..n)) for n in [w, n-w].
    c = np.concatenate(([0.0], np.cumsum(v)))
    nn = np.arange(w, n - w + 1)
    s = np.full(n + 1, np.nan)
    s[nn] = (c[nn + w] - 2.0 * c[nn] + c[nn - w]) / w
    n_start = int(np.ceil(t0)) + g + w
    n_end = n - w
    k = np.arange(n_start, n_end)
    left = s[np.clip(k - 2 * w, 0, n)]
    left[k - 2 * w < 0] = np.nan
    right = s[np.clip(k + 2 * w, 0, n)]
    right[k + 2 * w > n] = np.nan
    both = ~np.isnan(left) & ~np.isnan(right)
    minmod = np.where(left * right <= 0.0, 0.0, np.where(np.abs(left) <= np.abs(right), left, right))
    trend = np.where(both, minmod, np.where(np.isnan(left), np.nan_to_num(right), np.nan_to_num(left)))
    x = np.nan_to_num(s[k]) - trend
    ax = np.abs(x)
    sgn = np.sign(x)
    # Runs of same sign above T/2; a lobe starts at the first sample above T in a run.
    lo = ax > 0.5 * thr
    key = np.where(lo, sgn, 0.0)
    change = np.flatnonzero(np.diff(key) != 0) + 1
    bounds = np.concatenate(([0], change, [len(key)]))
    starts, ends = bounds[:-1], bounds[1:]
    runs = key[starts] != 0
    starts, ends = starts[runs], ends[runs]
    hi = ax > thr
    has_hi = np.logical_or.reduceat(hi, starts) if starts.size else np.zeros(0, bool)
    lobes = []
    for a, b in zip(starts[has_hi], ends[has_hi]):
        a0 = a + int(np.argmax(hi[a:b]))
        pk = a0 + int(np.argmax(ax[a0:b]))
        ia, ib = k[a0], k[b - 1] + 1
        if ia == n_start:
            continue  # masked by the dead zone
        before = v[max(ia - g - w, 0): max(ia - g, 0)]
        after = v[ib + g: ib + g + w]
        if before.size == 0 or after.size == 0:
            continue
        dv = after.mean() - before.mean()
        if abs(dv) > level_thr:
            lobes.append((ia, ib, k[pk], dv / vinc))
    return lobes


# ---- FFT ----
FFT_N = 4096


def fft_input(n):
    i = np.arange(n)
    return (i % 7).astype(np.float64) + 1j * (i % 5).astype(np.float64)


def numpy_worker(repeats):
    """Runs in the child process (OPENBLAS_* removed); prints JSON timings."""
    res = {}
    f = np.linspace(F_LO_HZ, F_HI_HZ, ZIN_POINTS)
    res["zin"] = min(timeit.repeat(lambda: zin_numpy(f), number=1, repeat=repeats)) / ZIN_POINTS * 1e9
    v = synthetic_trace(DETECT_SAMPLES)
    t0 = DETECT_SAMPLES // 20
    found = detect_numpy(v, t0, 0.5, 3.2)
    res["detect_events"] = len(found)
    res["detect"] = (
        min(timeit.repeat(lambda: detect_numpy(v, t0, 0.5, 3.2), number=1, repeat=repeats))
        / DETECT_SAMPLES
        * 1e9
    )
    x = fft_input(FFT_N)
    res["fft"] = min(timeit.repeat(lambda: np.fft.fft(x), number=20, repeat=repeats)) / 20 * 1e9
    res["numpy"] = np.__version__
    try:
        from numpy._core._multiarray_umath import __cpu_baseline__, __cpu_dispatch__, __cpu_features__

        res["simd"] = "baseline " + ",".join(__cpu_baseline__) + "; dispatched here: " + ",".join(
            d for d in __cpu_dispatch__ if __cpu_features__.get(d)
        )
    except ImportError:
        res["simd"] = "unknown"
    print(json.dumps(res))


def rust(workload, size, repeats, probe=PROBE):
    out = subprocess.run([probe, workload, str(size), str(repeats)], capture_output=True, text=True, check=True)
    for line in out.stdout.splitlines():
        if line.startswith("ns_per_item"):
            return float(line.split()[1])
    raise RuntimeError(f"no timing from perf_probe {workload}: {out.stdout!r}")


def main():
    if "--numpy-worker" in sys.argv:
        numpy_worker(int(sys.argv[sys.argv.index("--numpy-worker") + 1]))
        return 0
    quick = "--quick" in sys.argv
    repeats = 10 if quick else 40
    subprocess.run(
        ["cargo", "build", "--release", "-q", "-p", "echoline", "--example", "perf_probe"], cwd=ROOT, check=True
    )
    builds = []
    if "--native" in sys.argv:
        builds = [NATIVE_BUILD] + ([WIDE_BUILD] if cpu_has_avx512f() else [])
    for target_dir, flags, _ in builds:
        subprocess.run(
            ["cargo", "build", "--release", "-q", "-p", "echoline", "--example", "perf_probe"]
            + ["--target-dir", os.path.join(ROOT, "target", target_dir)],
            cwd=ROOT,
            check=True,
            env={**os.environ, "RUSTFLAGS": flags},
        )
    env = {k: v for k, v in os.environ.items() if k not in ("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE")}
    load_before = os.getloadavg()[0]
    child = subprocess.run(
        [sys.executable, os.path.abspath(__file__), "--numpy-worker", str(repeats)],
        env=env,
        capture_output=True,
        text=True,
        check=True,
    )
    npres = json.loads(child.stdout)
    rows = [
        ("zin (ns/point, 3 lossy sections)", "zin", ZIN_POINTS),
        ("detect (ns/sample)", "detect", DETECT_SAMPLES),
        ("fft 4096 (ns/FFT)", "fft", FFT_N),
    ]
    print(f"numpy {npres['numpy']}, best of {repeats}; load average {load_before:.2f} (2 cores)")
    print(f"numpy SIMD: {npres.get('simd', 'unknown')}")
    print(f"{'workload':36s} {'numpy f64':>11s} {'rust f64':>10s} {'rust f32':>10s} {'numpy/rust f64':>15s}")
    ratios = {}
    for label, key, size in rows:
        r64 = rust(key + "64", size, repeats)
        r32 = rust(key + "32", size, repeats)
        ratios[key] = npres[key] / r64
        print(f"{label:36s} {npres[key]:11.1f} {r64:10.1f} {r32:10.1f} {ratios[key]:14.1f}x")
    coax64 = rust("zincoax64", ZIN_POINTS, repeats)
    coax32 = rust("zincoax32", ZIN_POINTS, repeats)
    print(f"{'zin, 3 coax sections (Rust only)':36s} {'-':>11s} {coax64:10.1f} {coax32:10.1f}")
    for target_dir, _, label in builds:
        n64 = rust("zin64", ZIN_POINTS, repeats, probe_in(target_dir))
        n32 = rust("zin32", ZIN_POINTS, repeats, probe_in(target_dir))
        print(f"{label:36s} {npres['zin']:11.1f} {n64:10.1f} {n32:10.1f} {npres['zin'] / n64:14.1f}x")
    print(f"load average after: {os.getloadavg()[0]:.2f}")
    ok = ratios["zin"] >= 8.0
    print("PASS" if ok else "FAIL", f"(issue 2 target: rust f64 zin >= 8x faster than numpy; got {ratios['zin']:.1f}x)")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())

"""Reference vectors for core/src/math: FFT (numpy.fft), windows and CZT
(scipy.signal), Bessel/erfc (scipy.special), elliptic K (mpmath, scipy.special).

Random inputs come from numpy.random.default_rng with fixed seeds and are written
to the vector files, so the Rust side transforms exactly the same numbers.
"""
import math

import mpmath
import numpy as np
import scipy.signal
import scipy.special
from scipy.optimize import brentq

import vecfmt


def fft_vectors():
    rng = np.random.default_rng(20261201)
    rows = []
    for n in (1, 2, 8, 1024):
        x = rng.standard_normal(n) + 1j * rng.standard_normal(n)
        X = np.fft.fft(x)
        for i in range(n):
            rows.append((n, i, x[i].real, x[i].imag, X[i].real, X[i].imag))
    vecfmt.write("math_fft", "numpy.fft.fft of seeded complex normal input (rng seed 20261201)",
                 ["n", "idx", "x_re", "x_im", "X_re", "X_im"], rows)


# kind codes: 0 rectangular, 1 Hann, 2 Hamming, 3 Kaiser(beta)
def window_vectors():
    rows = []
    w = scipy.signal.windows
    for n in (1, 2, 7, 8, 64):
        for kind, beta, vals in (
            (0, 0.0, w.boxcar(n, sym=True)),
            (1, 0.0, w.hann(n, sym=True)),
            (2, 0.0, w.hamming(n, sym=True)),
            (3, 3.0 * math.pi, w.kaiser(n, 3.0 * math.pi, sym=True)),
            (3, 0.5, w.kaiser(n, 0.5, sym=True)),
            (3, 40.0, w.kaiser(n, 40.0, sym=True)),
        ):
            for i, v in enumerate(vals):
                rows.append((kind, beta, n, i, v))
    vecfmt.write("math_window", "scipy.signal.windows.{boxcar,hann,hamming,kaiser}(N, sym=True); "
                 "kind 0 rect 1 Hann 2 Hamming 3 Kaiser", ["kind", "beta", "n_len", "idx", "w"], rows)


def czt_vectors():
    rng = np.random.default_rng(1969)
    cases = []
    ins = []
    outs = []

    def add(case, x, m, a_r, a_t, w_r, w_t, X):
        cases.append((case, len(x), m, a_r, a_t, w_r, w_t))
        for i, v in enumerate(x):
            ins.append((case, i, v.real, v.imag))
        for k, v in enumerate(X):
            outs.append((case, k, v.real, v.imag))

    def rand(n):
        return rng.standard_normal(n) + 1j * rng.standard_normal(n)

    # 0, 1: default arguments (= FFT), even and odd N.
    for case, n in ((0, 8), (1, 7)):
        x = rand(n)
        X = scipy.signal.czt(x)
        add(case, x, n, 1.0, 0.0, 1.0, 1.0 / n, X)
    # 2, 3: general unit-circle arcs, odd N / even M and even N / odd M.
    for case, n, m, a_t, w_t in ((2, 7, 12, 0.1, 0.013), (3, 16, 5, -0.2, 0.0371)):
        x = rand(n)
        X = scipy.signal.czt(x, m, np.exp(-2j * np.pi * w_t), np.exp(2j * np.pi * a_t))
        add(case, x, m, 1.0, a_t, 1.0, w_t, X)
    # 4: a spiral contour (|A| != 1, |W| != 1).
    n, m, a_r, a_t, w_r, w_t = 9, 6, 1.01, 0.05, 0.995, 0.02
    x = rand(n)
    X = scipy.signal.czt(x, m, w_r * np.exp(-2j * np.pi * w_t), a_r * np.exp(2j * np.pi * a_t))
    add(4, x, m, a_r, a_t, w_r, w_t, X)
    # 5, 6: frequency zoom (scipy.signal.zoom_fft, endpoint=False), even and odd M.
    for case, n, m, f1, f2, fs in ((5, 64, 33, 100.0, 200.0, 1000.0), (6, 1000, 256, 61.0, 127.0, 500.0)):
        x = rand(n)
        X = scipy.signal.zoom_fft(x, [f1, f2], m=m, fs=fs)
        add(case, x, m, 1.0, f1 / fs, 1.0, (f2 - f1) / (m * fs), X)
    # Direct sums X_k = sum_n x_n exp(-j2pi n (a_t + k w_t)) in mpmath (25 digits)
    # for the zoom cases, with the float64 contour values: an oracle independent
    # of any FFT (scipy's own zoom_fft is good to ~6e-14 relative on case 6).
    mpmath.mp.dps = 25
    exact = []
    for case, n, m, a_r, a_t, w_r, w_t in cases:
        if case < 5:
            continue
        xs = [mpmath.mpc(r[2], r[3]) for r in ins if r[0] == case]
        for k in range(m):
            t = mpmath.mpf(a_t) + k * mpmath.mpf(w_t)
            acc = mpmath.mpc(0)
            for i, xv in enumerate(xs):
                acc += xv * mpmath.expjpi(-2 * i * t)
            exact.append((case, k, float(acc.real), float(acc.imag)))
    vecfmt.write("math_czt_exact", "direct chirp-z sums in mpmath (25 digits) for the zoom cases",
                 ["case", "k", "X_re", "X_im"], exact)
    vecfmt.write("math_czt_cases", "chirp-z cases: A = a_r e^(j2pi a_t), W = w_r e^(-j2pi w_t)",
                 ["case", "n", "m", "a_r", "a_t", "w_r", "w_t"], cases)
    vecfmt.write("math_czt_in", "chirp-z inputs (rng seed 1969)", ["case", "idx", "x_re", "x_im"], ins)
    vecfmt.write("math_czt_out", "scipy.signal.czt / scipy.signal.zoom_fft of math_czt_in",
                 ["case", "k", "X_re", "X_im"], outs)


def special_vectors():
    xs = [0.0, 1e-8, 0.1, 0.5, 1.0, 2.0, 3.75, 5.0, 8.0, 10.0, 15.0, 20.0, 24.9, 25.1, 30.0,
          3.0 * math.pi, 40.0, 50.0, 80.0, 100.0, 700.0]
    vecfmt.write("math_i0", "scipy.special.i0 and i0e", ["x", "i0", "i0e"],
                 [(x, scipy.special.i0(x), scipy.special.i0e(x)) for x in xs])
    xs = [-3.0, -1.0, -0.1, 0.0, 1e-10, 0.3, 0.5, 1.0, 2.0, 3.0, 5.0, 10.0, 20.0, 26.0]
    vecfmt.write("math_erfc", "scipy.special.erfc", ["x", "erfc"], [(x, scipy.special.erfc(x)) for x in xs])
    ys = [1e-300, 1e-100, 1e-30, 1e-10, 1e-3, 0.05, 0.5, 0.9, 1.0, 1.0 + 1e-9, 1.3, 1.9, 1.999999]
    vecfmt.write("math_erfcinv", "scipy.special.erfcinv", ["y", "erfcinv"],
                 [(y, scipy.special.erfcinv(y)) for y in ys])
    xs = [0.1, 0.5, 1.0, 1.8, 2.5, 3.83, 5.0, 7.5, 10.0, 20.0]
    vecfmt.write("math_bessel1", "scipy.special.jv, yv, jvp, yvp at order 1",
                 ["x", "j1", "y1", "j1p", "y1p"],
                 [(x, scipy.special.jv(1, x), scipy.special.yv(1, x), scipy.special.jvp(1, x),
                   scipy.special.yvp(1, x)) for x in xs])

    # Coaxial TE11 cutoff: smallest root x = kc*a of J1'(x)Y1'(rx) - J1'(rx)Y1'(x) = 0,
    # r = b/a. Bracketed by a scan from below, solved with scipy brentq.
    def f(x, r):
        return (scipy.special.jvp(1, x) * scipy.special.yvp(1, r * x)
                - scipy.special.jvp(1, r * x) * scipy.special.yvp(1, x))

    rows = []
    for r in (1.5, 2.3, 3.0, 5.0, 10.0):
        approx = 2.0 / (1.0 + r)
        grid = np.linspace(0.2 * approx, 2.0 * approx, 2000)
        vals = [f(g, r) for g in grid]
        i = next(i for i in range(len(grid) - 1) if vals[i] * vals[i + 1] < 0)
        root = brentq(f, grid[i], grid[i + 1], args=(r,), xtol=1e-15, rtol=1e-15)
        rows.append((r, root, approx, grid[i], grid[i + 1]))
    vecfmt.write("math_te11", "coax TE11 root x=kc*a of J1'(x)Y1'(rx)-J1'(rx)Y1'(x) (scipy brentq on jvp/yvp)",
                 ["b_over_a", "x_root", "x_approx", "lo", "hi"], rows)


def elliptic_vectors():
    mpmath.mp.dps = 50
    rows = []
    for k in (1e-6, 1e-3, 0.01, 0.1, 0.2, 0.3, 0.5, 1.0 / math.sqrt(2.0), 0.8, 0.9, 0.99, 0.999999,
              1.0 - 1e-9):
        kk = mpmath.mpf(k)  # the binary k exactly
        kp2 = (1 - kk) * (1 + kk)
        big_k = mpmath.ellipk(kk * kk)
        big_kp = mpmath.ellipk(kp2)
        rows.append((k, float(big_k), float(big_k / big_kp), scipy.special.ellipk(k * k),
                     scipy.special.ellipkm1(float(kp2))))
    vecfmt.write("math_ellip", "mpmath.ellipk (50 digits) of m = k^2 for the binary k; "
                 "scipy.special.ellipk(k*k) and ellipkm1(1-k^2)",
                 ["k", "K", "ratio", "K_scipy", "K_scipy_m1"], rows)


def main():
    fft_vectors()
    window_vectors()
    czt_vectors()
    special_vectors()
    elliptic_vectors()


if __name__ == "__main__":
    main()

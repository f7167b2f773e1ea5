"""Reference vectors for core/src/timing (edge module).

Wigington & Nahman, "Transient analysis of coaxial cables considering skin
effect", Proc. IRE 45(2):166-174, 1957: step response erfc(a / (2 sqrt(t - Td)))
and the time to reach the fraction p, t_p - Td = a^2 / (4 erfcinv(p)^2).
Values from scipy.special.erfc / erfcinv; erfcinv cross-checked with mpmath.
"""
import mpmath
import numpy as np
from scipy import integrate, optimize, special

import vecfmt

SRC = "Wigington & Nahman, Proc. IRE 45(2):166-174, 1957"


def erfcinv_rows():
    ps = [1e-300, 1e-100, 1e-30, 1e-12, 1e-6, 1e-3, 0.01, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7,
          0.9, 0.99, 0.999999, 1.0, 1.000001, 1.1, 1.5, 1.9, 1.99, 1.999999]
    rows = []
    mpmath.mp.dps = 40
    for p in ps:
        x = float(special.erfcinv(p))
        # Cross-check scipy against mpmath: the root of erfc(x) = p at 40 digits.
        pm = mpmath.mpf(p)
        xm = float(mpmath.findroot(lambda t: mpmath.erfc(t) - pm, mpmath.mpf(x)))
        if not abs(x - xm) <= 1e-13 * max(abs(xm), 1e-300):
            raise ValueError(f"scipy and mpmath disagree at p={p}: {x} vs {xm}")
        rows.append((p, x))
    return rows


def step_rows():
    rows = []
    for a in [1e-5, 1e-4, 3e-4]:
        td50 = a * a / (4 * special.erfcinv(0.5) ** 2)
        for m in [0.05, 0.2, 0.5, 1.0, 2.0, 5.0, 20.0, 100.0, 1000.0]:
            tau = m * td50
            rows.append((a, tau, special.erfc(a / (2 * np.sqrt(tau)))))
    return rows


def fraction_rows():
    rows = []
    for a in [1e-6, 1e-5, 1e-4, 3e-4]:
        for p in [0.01, 0.1, 0.2, 0.5, 0.8, 0.9, 0.95]:
            rows.append((a, p, a * a / (4 * special.erfcinv(p) ** 2)))
    return rows


def skin_rise(a):
    return a * a / (4 * special.erfcinv(0.9) ** 2) - a * a / (4 * special.erfcinv(0.1) ** 2)


def gauss_rows():
    """Skin-effect step convolved with a zero-phase Gaussian instrument edge of
    10-90 % rise time tr (sigma = tr / (2 sqrt(2) erfinv(0.8))), by scipy quad;
    crossings by brentq. Times are after the lossless delay Td."""
    rows = []
    for a, ratio in [(2e-5, 0.3), (2e-5, 1.0), (2e-5, 3.0), (5e-5, 1.0)]:
        tr = ratio * skin_rise(a)
        sig = tr / (2 * np.sqrt(2) * special.erfinv(0.8))

        def v(t):
            def f(s):
                u = t - s
                return (special.erfc(a / (2 * np.sqrt(u))) if u > 0 else 0.0) * np.exp(-0.5 * (s / sig) ** 2)
            lo = -14 * sig
            if t <= lo:
                return 0.0
            pts = [0.0] if lo < 0 < t else None
            r, _ = integrate.quad(f, lo, t, limit=500, epsabs=1e-15, epsrel=1e-12, points=pts)
            return r / (sig * np.sqrt(2 * np.pi))

        ts = [optimize.brentq(lambda t: v(t) - p, -10 * sig, 200 * skin_rise(a) + 10 * sig, xtol=1e-22, rtol=1e-13)
              for p in (0.1, 0.5, 0.9)]
        rows.append((a, tr, ts[0], ts[1], ts[2]))
    return rows


def main():
    vecfmt.write("timing_erfcinv", "scipy.special.erfcinv, checked against the mpmath root of erfc(x) = p",
                 ["p", "x"], erfcinv_rows())
    vecfmt.write("timing_skin_step", SRC + ": v = erfc(a/(2 sqrt(tau))), scipy.special.erfc",
                 ["a_sqrt_s", "tau_s", "v"], step_rows())
    vecfmt.write("timing_skin_fraction", SRC + ": tau_p = a^2/(4 erfcinv(p)^2), scipy.special.erfcinv",
                 ["a_sqrt_s", "p", "tau_s"], fraction_rows())
    vecfmt.write("timing_skin_gauss",
                 SRC + " step convolved with a Gaussian instrument edge; scipy.integrate.quad, optimize.brentq",
                 ["a_sqrt_s", "instrument_rise_s", "t10_s", "t50_s", "t90_s"], gauss_rows())


if __name__ == "__main__":
    main()

"""Reference vectors for the geometry line models (core/src/line/{coax,microstrip,stripline,
cpw,two_wire,waveguide}.rs), each an independent evaluation of a published formula with
scipy / mpmath (not of our Rust code):

* geom_te11: coax TE11 root x = kc*a of J1'(x)Y1'(rx) - J1'(rx)Y1'(x) = 0, r = b/a
  (Marcuvitz, Waveguide Handbook, 1951), scipy.special.jvp/yvp + brentq after a scan from
  below; and the approximation x0 = 2/(1 + r).
* geom_stripline: Cohn (IRE Trans. MTT-2:52-57, 1954) Z0*sqrt(er) = (eta0/4) K(k)/K(k'),
  k = sech(pi W/2b), mpmath.ellipk (which takes m = k^2); and Cohn's 1955 thick-strip form
  (IRE Trans. MTT-3:119-126) Z0*sqrt(er) = 94.15/(W/b/(1 - t/b) + Cf'/(0.0885 er)) with
  Cf'/(0.0885 er) = (1/pi)[2/(1-x) ln(1/(1-x) + 1) - (1/(1-x) - 1) ln(1/(1-x)^2 - 1)],
  x = t/b, valid for W/(b - t) >= 0.35 (form from memory).
* geom_cpw: Wen 1969 / Veyres & Fouad Hanna 1980 / Ghione & Naldi 1984 CPW Z0 and eps_eff
  with mpmath.ellipk (m = k^2), eta0 = mu0*c0.
* geom_microstrip: Hammerstad & Jensen 1980 static Z0, eps_eff with thickness;
  Kirschning & Jansen 1982 eps_eff(f); Jansen & Kirschning 1983 Zc(f) (from memory), all in
  mpmath; and Wheeler's 1977 zero-thickness Z0 (IEEE Trans. MTT-25:631-647, from memory) as an
  independent value.
* geom_two_wire: Z0 = (eta0/(pi sqrt(er))) acosh(D/d) in mpmath.
* geom_waveguide: TE10 beta, Z_TE and wall loss alpha_c = Rs(2b pi^2 + a^3 k^2)/(a^3 b beta k eta)
  (Pozar, Microwave Engineering, 4th ed., 2012, sec. 3.3) in mpmath.
"""
import mpmath as mp
import numpy as np
import scipy.special as sp
from scipy.optimize import brentq

import vecfmt

mp.mp.dps = 30

MU0 = mp.mpf("1.25663706212e-6")  # CODATA 2018, as core/src/scalar.rs
C0 = mp.mpf(299792458)
EPS0 = 1 / (MU0 * C0 * C0)
ETA0 = MU0 * C0


def te11_table():
    def f(x, r):
        return sp.jvp(1, x) * sp.yvp(1, r * x) - sp.jvp(1, r * x) * sp.yvp(1, x)

    rows = []
    for r in (1.01, 1.1, 1.5, 2.0, 2.3, 3.0, 3.5, 5.0, 10.0, 20.0, 100.0, 1000.0):
        x0 = 2.0 / (1.0 + r)
        grid = np.linspace(0.2 * x0, 2.0 * x0, 4000)
        vals = [f(g, r) for g in grid]
        i = next(i for i in range(len(grid) - 1) if vals[i] * vals[i + 1] < 0)
        root = brentq(f, grid[i], grid[i + 1], args=(r,), xtol=1e-16, rtol=1e-15)
        rows.append((r, root, x0))
    vecfmt.write("geom_te11", "coax TE11 root x=kc*a of J1'(x)Y1'(rx)-J1'(rx)Y1'(x) (scipy jvp/yvp, brentq)",
                 ["b_over_a", "x_root", "x_approx"], rows)


def cohn_z(wb):
    x = mp.pi * mp.mpf(wb) / 2
    k = mp.sech(x)
    kp = mp.tanh(x)
    return ETA0 / 4 * mp.ellipk(k * k) / mp.ellipk(kp * kp)


def cohn55(wb, tb):
    x = mp.mpf(tb)
    g = 1 / (1 - x)
    second = (g - 1) * mp.log(g * g - 1) if x > 0 else 0  # (g - 1) ln(g^2 - 1) -> 0 as t -> 0
    cf = (2 * g * mp.log(g + 1) - second) / mp.pi
    return 94.15 / (mp.mpf(wb) * g + cf)


def stripline_table():
    rows = []
    for wb in (0.05, 0.1, 0.2, 0.35, 0.5, 0.8291, 1.0, 2.0, 5.0, 10.0):
        for tb in (0.0, 0.01, 0.05, 0.1):
            ok = mp.mpf(wb) / (1 - mp.mpf(tb)) >= 0.35
            rows.append((wb, tb, cohn_z(wb), cohn55(wb, tb) if ok else -1.0))
    vecfmt.write("geom_stripline", "Cohn 1954 Z0*sqrt(er) by mpmath.ellipk(m=k^2); Cohn 1955 thick strip (-1 outside its range)",
                 ["w_over_b", "t_over_b", "z_cohn", "z_cohn55"], rows)


def kratio(k, kp):
    return mp.ellipk(k * k) / mp.ellipk(kp * kp)


def cpw(s, w, kind, h, er):
    s, w, er = mp.mpf(s), mp.mpf(w), mp.mpf(er)
    k = s / (s + 2 * w)
    kp = mp.sqrt(1 - k * k)
    kk = kratio(k, kp)
    if kind == 0:
        e = (er + 1) / 2
        return ETA0 / 4 / mp.sqrt(e) / kk, e
    h = mp.mpf(h)
    a = mp.pi * s / (4 * h)
    b = mp.pi * (s + 2 * w) / (4 * h)
    if kind == 1:
        k3 = mp.sinh(a) / mp.sinh(b)
        k3r = kratio(k3, mp.sqrt(1 - k3 * k3))
        e = 1 + (er - 1) / 2 * k3r / kk
        return ETA0 / 4 / mp.sqrt(e) / kk, e
    k4 = mp.tanh(a) / mp.tanh(b)
    k4r = kratio(k4, mp.sqrt(1 - k4 * k4))
    q = k4r / (kk + k4r)
    e = 1 + q * (er - 1)
    return ETA0 / 2 / mp.sqrt(e) / (kk + k4r), e


def cpw_table():
    rows = []
    for kind in (0, 1, 2):
        for (s, w, h, er) in ((1.0, 0.5, 1.0, 1.0), (100e-6, 60e-6, 635e-6, 9.8),
                              (100e-6, 60e-6, 100e-6, 12.9), (300e-6, 150e-6, 1.6e-3, 4.4),
                              (50e-6, 200e-6, 200e-6, 3.0), (1e-3, 20e-6, 500e-6, 2.2)):
            z, e = cpw(s, w, kind, h, er)
            rows.append((kind, s, w, h, er, z, e))
    vecfmt.write("geom_cpw", "CPW Z0, eps_eff (Wen 1969; Veyres & Fouad Hanna 1980; Ghione & Naldi 1984) by mpmath.ellipk(m=k^2); kind 0 thick, 1 finite h, 2 backed",
                 ["kind", "s", "w", "h", "eps_r", "z0", "eps_eff"], rows)


def hj_z01(u):
    f = 6 + (2 * mp.pi - 6) * mp.exp(-(mp.mpf("30.666") / u) ** mp.mpf("0.7528"))
    return ETA0 / (2 * mp.pi) * mp.log(f / u + mp.sqrt(1 + (2 / u) ** 2))


def hj_ee(u, er):
    a = 1 + mp.log((u ** 4 + (u / 52) ** 2) / (u ** 4 + mp.mpf("0.432"))) / 49 + mp.log(1 + (u / mp.mpf("18.1")) ** 3) / mp.mpf("18.7")
    b = mp.mpf("0.564") * ((er - mp.mpf("0.9")) / (er + 3)) ** mp.mpf("0.053")
    return (er + 1) / 2 + (er - 1) / 2 * (1 + 10 / u) ** (-a * b)


def hj(u, er, t):
    u, er, t = mp.mpf(u), mp.mpf(er), mp.mpf(t)
    if t == 0:
        e = hj_ee(u, er)
        return hj_z01(u) / mp.sqrt(e), e
    du1 = t / mp.pi * mp.log(1 + 4 * mp.e / (t * mp.coth(mp.sqrt(mp.mpf("6.517") * u)) ** 2))
    dur = du1 / 2 * (1 + mp.sech(mp.sqrt(er - 1)))
    u1, ur = u + du1, u + dur
    er_ = hj_ee(ur, er)
    return hj_z01(ur) / mp.sqrt(er_), er_ * (hj_z01(u1) / hj_z01(ur)) ** 2


def kj_ee(u, er, ee0, fn):
    M = mp.mpf
    p1 = M("0.27488") + (M("0.6315") + M("0.525") / (1 + M("0.0157") * fn) ** 20) * u - M("0.065683") * mp.exp(-M("8.7513") * u)
    p2 = M("0.33622") * (1 - mp.exp(-M("0.03442") * er))
    p3 = M("0.0363") * mp.exp(-M("4.6") * u) * (1 - mp.exp(-(fn / M("38.7")) ** M("4.97")))
    p4 = 1 + M("2.751") * (1 - mp.exp(-(er / M("15.916")) ** 8))
    p = p1 * p2 * ((M("0.1844") + p3 * p4) * fn) ** M("1.5763")
    return er - (er - ee0) / (1 + p)


def jk_z(u, er, z0, ee0, ee, fn):
    M = mp.mpf
    r1 = M("0.03891") * er ** M("1.4")
    r2 = M("0.267") * u ** 7
    r3 = M("4.766") * mp.exp(-M("3.228") * u ** M("0.641"))
    r4 = M("0.016") + (M("0.0514") * er) ** M("4.524")
    r5 = (fn / M("28.843")) ** 12
    r6 = M("22.2") * u ** M("1.92")
    r7 = M("1.206") - M("0.3144") * mp.exp(-r1) * (1 - mp.exp(-r2))
    r8 = 1 + M("1.275") * (1 - mp.exp(-M("0.004625") * r3 * er ** M("1.674") * (fn / M("18.365")) ** M("2.745")))
    r9 = M("5.086") * r4 * r5 / (M("0.3838") + M("0.386") * r4) * mp.exp(-r6) / (1 + M("1.2992") * r5) * (er - 1) ** 6 / (1 + 10 * (er - 1) ** 6)
    r10 = M("0.00044") * er ** M("2.136") + M("0.0184")
    r11 = (fn / M("19.47")) ** 6 / (1 + M("0.0962") * (fn / M("19.47")) ** 6)
    r12 = 1 / (1 + M("0.00245") * u * u)
    r13 = M("0.9408") * ee ** r8 - M("0.9603")
    r14 = (M("0.9408") - r9) * ee0 ** r8 - M("0.9603")
    r15 = M("0.707") * r10 * (fn / M("12.3")) ** M("1.097")
    r16 = 1 + M("0.0503") * er * er * r11 * (1 - mp.exp(-(u / 15) ** 6))
    r17 = r7 * (1 - M("1.1241") * r12 / r16 * mp.exp(-M("0.026") * fn ** M("1.15656") - r15))
    return z0 * (r13 / r14) ** r17


def wheeler77(u, er):
    u, er = mp.mpf(u), mp.mpf(er)
    x = 4 / u
    a = (14 + 8 / er) / 11
    return ETA0 / (2 * mp.pi * mp.sqrt(2 * (er + 1))) * mp.log(1 + x * (a * x + mp.sqrt(a * a * x * x + mp.pi ** 2 * (1 + 1 / er) / 2)))


def microstrip_table():
    rows = []
    for er in (1.0, 2.2, 4.4, 9.8, 12.9):
        for u in (0.1, 0.3, 1.0, 2.0, 5.0, 10.0):
            for t in (0.0, 0.02):
                z0, ee0 = hj(u, er, t)
                for fn in (0.0, 1e-4, 0.01, 0.1, 1.0, 5.0, 10.0, 20.0):
                    if fn == 0:
                        z, ee = z0, ee0
                    else:
                        ee = kj_ee(mp.mpf(u), mp.mpf(er), ee0, mp.mpf(fn))
                        z = jk_z(mp.mpf(u), mp.mpf(er), z0, ee0, ee, mp.mpf(fn))
                    w = wheeler77(u, er) if t == 0 else -1.0
                    rows.append((er, u, t, fn, z0, ee0, z, ee, w))
    vecfmt.write("geom_microstrip", "Hammerstad-Jensen 1980 static, Kirschning-Jansen 1982 eps_eff(f), Jansen-Kirschning 1983 Zc(f), Wheeler 1977 Z0 (t=0; -1 otherwise), mpmath",
                 ["eps_r", "u", "t_over_h", "fn_ghz_mm", "z0_static", "ee_static", "z0_f", "ee_f", "z0_wheeler77"], rows)


def two_wire_table():
    rows = []
    for ratio in (1.001, 1.1, 1.5, 2.0, 3.0, 6.1428, 10.0, 100.0):
        for er in (1.0, 2.3):
            rows.append((ratio, er, ETA0 / (mp.pi * mp.sqrt(er)) * mp.acosh(mp.mpf(ratio))))
    vecfmt.write("geom_two_wire", "two-wire Z0 = eta0/(pi sqrt(er)) acosh(D/d), mpmath",
                 ["d_ratio", "eps_r", "z0"], rows)


def waveguide_table():
    rows = []
    sigma = mp.mpf("5.8e7")
    for (a, b, er) in ((22.86e-3, 10.16e-3, 1.0), (22.86e-3, 10.16e-3, 2.1), (7.112e-3, 3.556e-3, 1.0)):
        a_, b_, er_ = mp.mpf(a), mp.mpf(b), mp.mpf(er)
        fc = C0 / (2 * a_ * mp.sqrt(er_))
        for m in (1.05, 1.25, 1.5, 1.9):
            f = fc * mp.mpf(m)
            k = 2 * mp.pi * f * mp.sqrt(er_) / C0
            beta = mp.sqrt(k * k - (mp.pi / a_) ** 2)
            eta = ETA0 / mp.sqrt(er_)
            rs = mp.sqrt(mp.pi * f * MU0 / sigma)
            ac = rs * (2 * b_ * mp.pi ** 2 + a_ ** 3 * k * k) / (a_ ** 3 * b_ * beta * k * eta)
            rows.append((a, b, er, float(f), beta, k * eta / beta, ac))
    vecfmt.write("geom_waveguide", "rectangular TE10 beta, Z_TE, wall loss (Pozar 2012 sec. 3.3), copper 5.8e7 S/m, mpmath",
                 ["a", "b", "eps_r", "freq_hz", "beta", "z_te", "alpha_c"], rows)


def main():
    te11_table()
    stripline_table()
    cpw_table()
    microstrip_table()
    two_wire_table()
    waveguide_table()


if __name__ == "__main__":
    main()

"""Reference vectors for the frequency-dependent line models (core/src/line/{dielectric,
conductor,rlgc,coax}.rs), evaluated with mpmath at 40 significant digits.

Each table is an independent evaluation of a published formula (not of our Rust code):
* lines_debye: the wideband Debye permittivity of Djordjevic, Biljic, Likar-Smiljanic &
  Sarkar, IEEE Trans. EMC 43(4):662-667, 2001, eps(w) = eps_inf + d_eps*ln[(w2 + jw)/(w1 + jw)]
  /ln(w2/w1), fitted to eps' and tan(delta) at one frequency, with mpmath's complex log.
* lines_rlgc: gamma = sqrt((R + jwL)(G + jwC)), Zc = sqrt((R + jwL)/(G + jwC)) (telegrapher
  equations, Pozar, Microwave Engineering, 4th ed., 2012, sec. 2.1) for constant RLGC sets.
* lines_coax: the full coax RLGC of coax.rs (round-wire and tube internal impedance
  R_dc*sqrt(1 + j f/f_c), constant or wideband Debye dielectric), gamma and Zc, and the
  small-loss closed forms Z0, alpha_c, alpha_d (Pozar 2012, sec. 2.7) for comparison.
* lines_wire: the exact internal impedance of a solid round wire,
  Z = kappa/(2 pi a sigma) * J0(kappa a)/J1(kappa a), kappa = (1 - j)/delta (Ramo, Whinnery &
  Van Duzer, Fields and Waves in Communication Electronics, 3rd ed., 1994), to bound the
  error of the DC-to-skin-effect interpolation.
* lines_airline: Z0 = eta0/(2 pi) ln(D/d) of the IEEE Std 287 7 mm airline (7.000/3.040 mm).
"""
import mpmath as mp

import vecfmt

mp.mp.dps = 40

MU0 = mp.mpf("1.25663706212e-6")  # CODATA 2018, as core/src/scalar.rs
C0 = mp.mpf(299792458)
EPS0 = 1 / (MU0 * C0 * C0)
ETA0 = MU0 * C0


def debye_fit(eps_r, tan_d, f_fit, f1, f2):
    """Returns (eps_inf, d_eps) of the wideband Debye model through eps_r, tan_d at f_fit."""
    L = mp.log(mp.mpf(f2) / f1)
    B = mp.log((f2 + 1j * mp.mpf(f_fit)) / (f1 + 1j * mp.mpf(f_fit)))  # omega ratio = f ratio
    loss = eps_r * tan_d
    d_eps = L * loss / (-B.imag)
    eps_inf = eps_r - d_eps * B.real / L
    return eps_inf, d_eps


def debye_eps(eps_inf, d_eps, f1, f2, f):
    L = mp.log(mp.mpf(f2) / f1)
    return eps_inf + d_eps * mp.log((f2 + 1j * mp.mpf(f)) / (f1 + 1j * mp.mpf(f))) / L


DEBYE_CASES = [
    # eps_r, tan_d, fit_hz, f1_hz, f2_hz  (FR-4-like, PTFE-like, PE-like, ceramic-filled)
    (4.3, 0.02, 1e9, 1e3, 1e12),
    (2.1, 0.0004, 1e10, 1e3, 1e12),
    (2.25, 0.0002, 1e8, 1e2, 1e11),
    (10.2, 0.0023, 1e10, 1e3, 1e12),
]
DEBYE_FREQS = [0.0, 1.0, 1e2, 1e3, 1e4, 1e6, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e15]


def debye_table():
    rows = []
    for case, (er, td, ff, f1, f2) in enumerate(DEBYE_CASES):
        einf, de = debye_fit(mp.mpf(er), mp.mpf(td), ff, mp.mpf(f1), mp.mpf(f2))
        for f in DEBYE_FREQS:
            e = debye_eps(einf, de, mp.mpf(f1), mp.mpf(f2), f)
            rows.append((case, er, td, ff, f1, f2, f, einf, de, e.real, -e.imag))
    vecfmt.write(
        "lines_debye",
        "wideband Debye (Djordjevic et al., IEEE Trans. EMC 43(4):662-667, 2001) by mpmath, 40 digits",
        ["case", "eps_r", "tan_delta", "fit_hz", "f1_hz", "f2_hz", "freq_hz", "eps_inf", "delta_eps",
         "eps_re", "eps_loss"],
        rows,
    )


RLGC_CASES = [
    # R ohm/m, L H/m, G S/m, C F/m
    (0.1, 250e-9, 1e-6, 100e-12),  # 50 ohm, low loss
    (10.0, 500e-9, 1e-4, 50e-12),  # lossy 100 ohm
    (0.0, 250e-9, 0.0, 100e-12),  # lossless
    (0.17, 6e-7, 1e-9, 5e-11),  # telephone-pair-like, diffusive at audio
    (2.0, 4e-7, 0.0, 6.7e-11),  # no leakage
]
RLGC_FREQS = [1.0, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11]


def line(z, y):
    gamma = mp.sqrt(z * y)
    if gamma.real < 0:
        gamma = -gamma
    zc = z / gamma
    return gamma, zc


def rlgc_table():
    rows = []
    for case, (r, l, g, c) in enumerate(RLGC_CASES):
        for f in RLGC_FREQS:
            w = 2 * mp.pi * f
            z = mp.mpf(r) + 1j * w * mp.mpf(l)
            y = mp.mpf(g) + 1j * w * mp.mpf(c)
            gamma, zc = line(z, y)
            rows.append((case, r, l, g, c, f, gamma.real, gamma.imag, zc.real, zc.imag))
    vecfmt.write(
        "lines_rlgc",
        "gamma and Zc of constant RLGC lines (telegrapher equations, Pozar 2012 sec. 2.1) by mpmath, 40 digits",
        ["case", "r", "l", "g", "c", "freq_hz", "gamma_re", "gamma_im", "zc_re", "zc_im"],
        rows,
    )


COAX_CASES = [
    # inner d m, outer D m, eps_r, tan_d, debye (0/1), sigma S/m, shield t m
    (0.9e-3, 2.95e-3, 2.25, 2e-4, 0, 5.8e7, 0.2e-3),
    (0.9e-3, 2.95e-3, 2.25, 2e-4, 1, 5.8e7, 0.2e-3),
    (3.04e-3, 7.0e-3, 1.0, 0.0, 0, 5.8e7, 1.0e-3),
    (0.5e-3, 3.0e-3, 4.3, 0.02, 1, 3.5e7, 0.05e-3),
]
COAX_FREQS = [1.0, 1e2, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 3e10]
DEBYE_FIT_HZ = 1e9


def z_int(r_dc, k_hf, f):
    fc = r_dc * r_dc / (2 * k_hf * k_hf)
    return r_dc * mp.sqrt(1 + 1j * mp.mpf(f) / fc)


def coax_table():
    rows = []
    for case, (d, D, er, td, debye, sigma, t) in enumerate(COAX_CASES):
        d, D, er, td, sigma, t = map(mp.mpf, (d, D, er, td, sigma, t))
        a, b = d / 2, D / 2
        ln = mp.log(D / d)
        l_ext = MU0 / (2 * mp.pi) * ln
        c_vac = 2 * mp.pi * EPS0 / ln
        rs_coeff = mp.sqrt(mp.pi * MU0 / sigma)
        r_in, k_in = 1 / (sigma * mp.pi * a * a), rs_coeff / (2 * mp.pi * a)
        r_out, k_out = 1 / (sigma * mp.pi * t * (2 * b + t)), rs_coeff / (2 * mp.pi * b)
        if debye:
            einf, de = debye_fit(er, td, DEBYE_FIT_HZ, mp.mpf(1e3), mp.mpf(1e12))
        for f in COAX_FREQS:
            w = 2 * mp.pi * f
            if debye:
                eps = debye_eps(einf, de, mp.mpf(1e3), mp.mpf(1e12), f)
            else:
                eps = mp.mpc(er, -er * td)
            z = z_int(r_in, k_in, f) + z_int(r_out, k_out, f) + 1j * w * l_ext
            y = 1j * w * c_vac * eps
            gamma, zc = line(z, y)
            e_re, tan_f = eps.real, -eps.imag / eps.real
            z0 = ETA0 / (2 * mp.pi * mp.sqrt(e_re)) * ln
            rs = rs_coeff * mp.sqrt(f)
            alpha_c = rs * (1 / a + 1 / b) / (2 * (ETA0 / mp.sqrt(e_re)) * ln)
            alpha_d = mp.pi * f * mp.sqrt(e_re) * tan_f / C0
            rows.append((case, f, gamma.real, gamma.imag, zc.real, zc.imag, z0, alpha_c, alpha_d))
    vecfmt.write(
        "lines_coax",
        "coax RLGC (round wire + tube internal impedance, constant or wideband Debye dielectric) "
        "and Pozar 2012 sec. 2.7 closed forms, by mpmath, 40 digits; cases as in vectors_lines.py",
        ["case", "freq_hz", "gamma_re", "gamma_im", "zc_re", "zc_im", "z0_closed", "alpha_c_closed",
         "alpha_d_closed"],
        rows,
    )


def wire_table():
    sigma, a = mp.mpf("5.8e7"), mp.mpf("0.5e-3")
    rows = []
    for k in range(0, 101, 2):
        f = mp.mpf(10) ** (mp.mpf(k) / 10)
        delta = 1 / mp.sqrt(mp.pi * f * MU0 * sigma)
        kappa = (1 - 1j) / delta
        z = kappa / (2 * mp.pi * a * sigma) * mp.besselj(0, kappa * a) / mp.besselj(1, kappa * a)
        rows.append((float(sigma), float(a), f, delta, z.real, z.imag))
    vecfmt.write(
        "lines_wire",
        "exact internal impedance of a round copper wire, kappa/(2 pi a sigma) J0/J1 (Ramo, Whinnery & "
        "Van Duzer 1994), mpmath besselj, 40 digits",
        ["sigma", "radius_m", "freq_hz", "skin_depth_m", "z_re", "z_im"],
        rows,
    )


def airline_table():
    rows = []
    for d, D in [(3.04e-3, 7.0e-3), (1.52e-3, 3.5e-3), (1.042e-3, 2.4e-3)]:
        z0 = ETA0 / (2 * mp.pi) * mp.log(mp.mpf(D) / mp.mpf(d))
        rows.append((d, D, z0))
    vecfmt.write(
        "lines_airline",
        "Z0 = eta0/(2 pi) ln(D/d) of IEEE Std 287 precision airline sizes (dimensions value from memory), mpmath",
        ["inner_diameter_m", "outer_diameter_m", "z0_ohm"],
        rows,
    )


def main():
    debye_table()
    rlgc_table()
    coax_table()
    wire_table()
    airline_table()


if __name__ == "__main__":
    main()

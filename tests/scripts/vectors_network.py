"""Reference vectors for core/src/network (loads, lines, cascades).

network_zin_lossy: input impedance of a terminated lossy line from the textbook
  tanh form Zin = Zc (ZL + Zc tanh(gl)) / (Zc + ZL tanh(gl)) (Pozar, Microwave
  Engineering, 4th ed., 2012, sec. 2.7), with Z = R + jwL, Y = G + jwC,
  gamma = sqrt(Z*Y), Zc = sqrt(Z/Y), evaluated by mpmath at 50 significant digits.
  It is an independent route from the crate's reflection recursion.
network_cascade_s: S-parameters (real reference 50 ohm) and the input impedance
  with a fixed load of a five-element cascade (series R-L, lossy line, shunt C,
  lossy line, ideal 1:n transformer), by numpy from the classic chain matrices
  [cosh, Zc sinh; sinh/Zc, cosh] (Pozar Table 4.1) and the ABCD-to-S table
  (Pozar Table 4.2), S12 from the entries' determinant.
"""
import mpmath
import numpy as np

import vecfmt

mpmath.mp.dps = 50

# (R ohm/m, L H/m, G S/m, C F/m): a 50-ohm-ish lossy line, a lossless line,
# a very lossy (RC-like) line and a 75-ohm-ish line.
LINES = [
    (0.5, 250e-9, 1e-5, 100e-12),
    (0.0, 250e-9, 0.0, 100e-12),
    (50.0, 400e-9, 1e-3, 50e-12),
    (2.0, 370e-9, 2e-5, 66e-12),
]
LOADS = [(30.0, -20.0), (100.0, 0.0), (1e-3, 0.0), (1e6, 5e5), (50.0, 50.0)]
LENGTHS = [0.01, 0.7, 3.0, 25.0]
FREQS = [1e3, 1e5, 1.3e7, 4.4e8, 2.9e9, 3.7e10, 1e11]


def zin_tanh(R, L, G, C, length, f, zl):
    w = 2 * mpmath.pi * mpmath.mpf(f)
    Z = mpmath.mpc(R, w * L)
    Y = mpmath.mpc(G, w * C)
    gamma = mpmath.sqrt(Z * Y)
    if mpmath.re(gamma) < 0:
        gamma = -gamma
    zc = mpmath.sqrt(Z / Y)
    if mpmath.re(zc) < 0:
        zc = -zc
    t = mpmath.tanh(gamma * length)
    return zc * (zl + zc * t) / (zc + zl * t), gamma * length


def lossy_rows():
    rows = []
    for (R, L, G, C) in LINES:
        for length in LENGTHS:
            for f in FREQS:
                for (zr, zi) in LOADS:
                    zin, gl = zin_tanh(mpmath.mpf(R), mpmath.mpf(L), mpmath.mpf(G), mpmath.mpf(C),
                                       mpmath.mpf(length), f, mpmath.mpc(zr, zi))
                    rows.append((R, L, G, C, length, f, zr, zi, float(mpmath.re(zin)), float(mpmath.im(zin)),
                                 float(mpmath.re(gl)), float(mpmath.im(gl))))
    return rows


# Cascade elements, input first. Must match tests/tests/network.rs.
SERIES_R, SERIES_L = 5.0, 20e-9
LINE1 = (0.8, 260e-9, 2e-5, 95e-12, 1.5)
SHUNT_C = 2e-12
LINE2 = (1.5, 330e-9, 1e-5, 70e-12, 0.8)
TURNS = 1.5  # 1:n, input sees Z/n^2
ZREF = 50.0
ZLOAD = 30.0 - 20.0j


def line_abcd(R, L, G, C, length, w):
    Z = R + 1j * w * L
    Y = G + 1j * w * C
    gamma = np.sqrt(Z * Y)
    zc = np.sqrt(Z / Y)
    gl = gamma * length
    return np.array([[np.cosh(gl), zc * np.sinh(gl)], [np.sinh(gl) / zc, np.cosh(gl)]])


def cascade_rows():
    rows = []
    for f in np.logspace(3, 10, 36):
        w = 2 * np.pi * f
        m = np.array([[1, SERIES_R + 1j * w * SERIES_L], [0, 1]], dtype=complex)
        m = m @ line_abcd(*LINE1, w)
        m = m @ np.array([[1, 0], [1j * w * SHUNT_C, 1]], dtype=complex)
        m = m @ line_abcd(*LINE2, w)
        m = m @ np.array([[1 / TURNS, 0], [0, TURNS]], dtype=complex)
        a, b, c, d = m[0, 0], m[0, 1], m[1, 0], m[1, 1]
        delta = a + b / ZREF + c * ZREF + d
        s11 = (a + b / ZREF - c * ZREF - d) / delta
        s21 = 2 / delta
        s12 = 2 * (a * d - b * c) / delta
        s22 = (-a + b / ZREF - c * ZREF + d) / delta
        zin = (a * ZLOAD + b) / (c * ZLOAD + d)
        rows.append((f, s11.real, s11.imag, s12.real, s12.imag, s21.real, s21.imag, s22.real, s22.imag,
                     zin.real, zin.imag))
    return rows


def main():
    vecfmt.write(
        "network_zin_lossy",
        "Zin of a terminated lossy line, tanh form (Pozar 2012 sec. 2.7), mpmath 50 digits",
        ["r_ohm_per_m", "l_h_per_m", "g_s_per_m", "c_f_per_m", "length_m", "freq_hz", "zl_re", "zl_im",
         "zin_re", "zin_im", "gl_re", "gl_im"],
        lossy_rows(),
    )
    vecfmt.write(
        "network_cascade_s",
        "S (Zr 50 ohm) and Zin (load 30-20j) of series R-L, line, shunt C, line, 1:1.5 transformer; "
        "numpy chain matrices (Pozar 2012 Tables 4.1, 4.2)",
        ["freq_hz", "s11_re", "s11_im", "s12_re", "s12_im", "s21_re", "s21_im", "s22_re", "s22_im",
         "zin_re", "zin_im"],
        cascade_rows(),
    )


if __name__ == "__main__":
    main()

"""Writes demo_feeder.s1p: an INVENTED sweep for the sweep_report example.

Scenario (fictional): the antenna feeder of an imaginary hilltop relay site,
35 m of 50-ohm foam-dielectric coax (VF 0.88, about 7 dB/100 m at 1 GHz,
loss rising as sqrt(f)); a connector with water ingress at 12.4 m (5 cm at
38 ohm), a jumper splice at 33.0 m (40 cm at 56 ohm), and an antenna that
is a poor match (68 + j12 ohm). The reflection is computed by the Gamma
recursion of lossy line sections, plus a -65 dB noise floor (numpy rng
seed 2026). Nothing here is a measurement.
"""
import numpy as np

C0 = 299_792_458.0
VF = 0.88
A1G = 7.0 / 100 / 8.685889638  # Np/m at 1 GHz


def main():
    f = 2e6 * np.arange(1, 1602)
    sections = [(50.0, 12.4), (38.0, 0.05), (50.0, 33.0 - 12.45), (56.0, 0.4), (50.0, 35.0 - 33.4)]
    zl = 68.0 + 12j
    beta = 2 * np.pi * f / (VF * C0)
    alpha = A1G * np.sqrt(f / 1e9)
    gam = alpha + 1j * beta
    z = np.full(f.shape, zl, complex)
    for zc, length in reversed(sections):
        g = (z - zc) / (z + zc) * np.exp(-2 * gam * length)
        z = zc * (1 + g) / (1 - g)
    s11 = (z - 50) / (z + 50)
    rng = np.random.default_rng(2026)
    s11 += 10 ** (-65 / 20) * (rng.standard_normal(f.size) + 1j * rng.standard_normal(f.size)) / np.sqrt(2)
    with open("demo_feeder.s1p", "w") as out:
        out.write("! INVENTED demo sweep (not a measurement): fictional relay-site antenna feeder,\n")
        out.write("! 35 m of VF 0.88 foam coax, wet connector at 12.4 m, jumper splice at 33 m,\n")
        out.write("! mismatched antenna at 35 m. Written by make_demo_sweep.py.\n")
        out.write("# MHz S DB R 50\n")
        for fi, s in zip(f, s11):
            out.write(f"{fi / 1e6:.3f} {20 * np.log10(abs(s)):.4f} {np.degrees(np.angle(s)):.3f}\n")


if __name__ == "__main__":
    main()

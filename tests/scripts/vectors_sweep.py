"""Reference vectors for echoline::sweep (distance-to-fault transforms).

Band-pass FFT path: numpy.fft.ifft of the windowed sweep zero-padded to M,
times M / sum(w) and the carrier exp(j 2 pi f0 t_k), t_k = k / (M df).
Zoom path: scipy.signal.czt with A = exp(-j 2 pi df t0), W = exp(+j 2 pi df dt)
(Rabiner, Schafer & Rader 1969), times exp(j 2 pi f0 t_k) / sum(w).
Low-pass impulse: numpy.fft.irfft of the Hermitian spectrum on a harmonic grid
from DC, windowed by the right half of a symmetric window of 2K+1 samples.
Windows: scipy.signal.windows.{boxcar,hann,hamming,kaiser}(n, sym=True).
"""
import numpy as np
import scipy.signal

import vecfmt

C0 = 299_792_458.0


def window(kind, n, beta):
    w = scipy.signal.windows
    return {
        0: lambda: w.boxcar(n, sym=True),
        1: lambda: w.hann(n, sym=True),
        2: lambda: w.hamming(n, sym=True),
        3: lambda: w.kaiser(n, beta, sym=True),
    }[kind]()


def main():
    rng = np.random.default_rng(1978)
    cases, ins, fft_out, zoom_out, lp_out = [], [], [], [], []
    # case, n, f0, df, window kind, beta, vf, M, zoom start, stop, L
    specs = [
        (0, 101, 3e6, 1e6, 1, 0.0, 0.66, 256, 5.0, 40.0, 64),
        (1, 100, 2.5e6, 1e6, 2, 0.0, 0.66, 128, 0.0, 90.0, 51),
        (2, 64, 0.0, 2e6, 3, 6.0, 0.8, 256, 10.0, 30.0, 33),
        (3, 33, 1e6, 1e6, 0, 0.0, 0.7, 64, 1.0, 100.0, 40),
    ]
    for case, n, f0, df, kind, beta, vf, m, d0, d1, l in specs:
        v = vf * C0
        f = f0 + df * np.arange(n)
        # A few reflections plus noise.
        g = np.zeros(n, complex)
        for rho, d in ((0.5, 7.3), (-0.2, 21.9), (0.1, 33.0)):
            g += rho * np.exp(-2j * np.pi * f * 2 * d / v)
        g += 0.01 * (rng.standard_normal(n) + 1j * rng.standard_normal(n))
        w = window(kind, n, beta)
        cases.append((case, n, f0, df, kind, beta, vf, m, d0, d1, l))
        for i in range(n):
            ins.append((case, i, f[i], g[i].real, g[i].imag))
        x = np.fft.ifft(w * g, m) * m / w.sum()
        t = np.arange(m) / (m * df)
        x *= np.exp(2j * np.pi * f0 * t)
        for k in range(m):
            fft_out.append((case, k, x[k].real, x[k].imag))
        t0, dt = 2 * d0 / v, 2 * (d1 - d0) / (l - 1) / v
        X = scipy.signal.czt(w * g, l, np.exp(2j * np.pi * df * dt), np.exp(-2j * np.pi * df * t0))
        tk = t0 + dt * np.arange(l)
        X = X * np.exp(2j * np.pi * f0 * tk) / w.sum()
        for k in range(l):
            zoom_out.append((case, k, X[k].real, X[k].imag))
        if f0 == 0.0:
            kmax = n - 1
            wl = window(kind, 2 * kmax + 1, beta)[kmax:]
            h = w * 0
            spec = np.zeros(m // 2 + 1, complex)
            spec[: kmax + 1] = wl * g
            spec[0] = spec[0].real
            s = wl[0] + 2 * wl[1:].sum()
            h = np.fft.irfft(spec, m) * m / s
            for k in range(m):
                lp_out.append((case, k, h[k]))
    vecfmt.write("sweep_cases", "distance-to-fault cases (numpy rng seed 1978)",
                 ["case", "n", "f0_hz", "df_hz", "window", "beta", "vf", "m", "start_m", "stop_m", "l"],
                 cases)
    vecfmt.write("sweep_in", "sweep inputs: three reflections plus noise", ["case", "idx", "f_hz", "re", "im"], ins)
    vecfmt.write("sweep_fft", "band-pass by numpy.fft.ifft, zero-padded to M, scaled M/sum(w), carrier",
                 ["case", "k", "re", "im"], fft_out)
    vecfmt.write("sweep_zoom", "band-pass zoom by scipy.signal.czt, carrier, 1/sum(w)",
                 ["case", "k", "re", "im"], zoom_out)
    vecfmt.write("sweep_lowpass", "low-pass impulse by numpy.fft.irfft (harmonic grid from DC)",
                 ["case", "k", "h"], lp_out)


if __name__ == "__main__":
    main()

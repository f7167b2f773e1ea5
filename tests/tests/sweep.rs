//! Reference checks of `echoline::sweep`: transforms against numpy / scipy
//! vectors (tests/scripts/vectors_sweep.py), window figures against Harris
//! (1978), round trips through the network cascade, and the readers on
//! hand-written files (tests/data/sweeps/) built from the Touchstone grammar
//! (IBIS Open Forum, Touchstone File Format Specification 1.1, 2002, and 2.0,
//! 2009) and the CSV grammar of `sweep::csv`.

use echoline::line::lossless::Lossless;
use echoline::line::rlgc::Rlgc;
use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::network::{Cascade, Load};
use echoline::sweep::csv::CsvSweep;
use echoline::sweep::dtf::{
    band_pass_fft, band_pass_model, band_pass_zoom, low_pass, zoom_work_len, Config, LowPass,
    ModelOptions,
};
use echoline::sweep::grid::{window_figures, Mapping};
use echoline::sweep::peaks::{peaks_complex, peaks_real, Peaks};
use echoline::sweep::read_reflection;
use echoline::sweep::touchstone::{
    ports_from_file_name, Format, MatrixFormat, Parameter, Record, Touchstone, Version,
};
use echoline::timing::{VelocityKind, VelocityRange};
use echoline::{Error, Real};
use echoline_checks::load;

const C0: f64 = 299_792_458.0;

fn zero<T: Real>() -> Cx<T> {
    Cx::new(T::zero(), T::zero())
}

fn plan_table<T: Real>(m: usize) -> Vec<Cx<T>> {
    let mut t = vec![zero::<T>(); m / 2];
    fill_twiddles(&mut t).unwrap();
    t
}

fn window_of<T: Real>(kind: f64, beta: f64) -> Window<T> {
    match kind as i32 {
        0 => Window::Rectangular,
        1 => Window::Hann,
        2 => Window::Hamming,
        _ => Window::Kaiser { beta: T::lit(beta) },
    }
}

// ---------------------------------------------------------------- vectors

fn vs_scipy<T: Real>(rtol: f64) {
    let cases = load("sweep_cases");
    let ins = load("sweep_in");
    let fft_t = load("sweep_fft");
    let zoom_t = load("sweep_zoom");
    let lp_t = load("sweep_lowpass");
    let mut checked_lp = 0;
    for c in cases.iter() {
        let case = c.get("case");
        let m = c.get("m") as usize;
        let l = c.get("l") as usize;
        let rows: Vec<_> = ins.iter().filter(|r| r.get("case") == case).collect();
        let f: Vec<T> = rows.iter().map(|r| T::lit(r.get("f_hz"))).collect();
        let g: Vec<Cx<T>> = rows
            .iter()
            .map(|r| Cx::new(T::lit(r.get("re")), T::lit(r.get("im"))))
            .collect();
        let cfg = Config {
            window: window_of::<T>(c.get("window"), c.get("beta")),
            velocity: VelocityRange::from_factor(T::lit(c.get("vf")), T::zero()).unwrap(),
        };
        let table = plan_table::<T>(m);
        let plan = Fft::new(&table).unwrap();
        // FFT path.
        let mut out = vec![zero::<T>(); m];
        let grid = band_pass_fft(&f, &g, &cfg, &plan, &mut out).unwrap();
        assert_eq!(grid.len, m);
        let want: Vec<(f64, f64)> = fft_t
            .iter()
            .filter(|r| r.get("case") == case)
            .map(|r| (r.get("re"), r.get("im")))
            .collect();
        let scale = want.iter().map(|w| w.0.hypot(w.1)).fold(0.0, f64::max);
        for (k, (o, w)) in out.iter().zip(&want).enumerate() {
            let e = (o.re.to_f64_lossless() - w.0).hypot(o.im.to_f64_lossless() - w.1);
            assert!(e <= rtol * scale, "case {case} fft k {k}: {o:?} vs {w:?}");
        }
        // Zoom path (chirp-z).
        let mut z = vec![zero::<T>(); l];
        let mut work = vec![zero::<T>(); zoom_work_len(f.len(), l).unwrap()];
        let (a, b) = (T::lit(c.get("start_m")), T::lit(c.get("stop_m")));
        band_pass_zoom(&f, &g, &cfg, a, b, &mut z, &mut work).unwrap();
        let want: Vec<(f64, f64)> = zoom_t
            .iter()
            .filter(|r| r.get("case") == case)
            .map(|r| (r.get("re"), r.get("im")))
            .collect();
        assert_eq!(want.len(), l);
        for (k, (o, w)) in z.iter().zip(&want).enumerate() {
            let e = (o.re.to_f64_lossless() - w.0).hypot(o.im.to_f64_lossless() - w.1);
            assert!(
                e <= rtol * scale * 4.0,
                "case {case} zoom k {k}: {o:?} vs {w:?}"
            );
        }
        // Low-pass impulse where the grid starts at DC.
        let want: Vec<f64> = lp_t
            .iter()
            .filter(|r| r.get("case") == case)
            .map(|r| r.get("h"))
            .collect();
        if !want.is_empty() {
            let mut w = vec![zero::<T>(); m];
            let mut h = vec![T::zero(); m];
            low_pass(&f, &g, &cfg, LowPass::Impulse, &plan, &mut w, &mut h).unwrap();
            let s = want.iter().fold(0.0f64, |a, b| a.max(b.abs()));
            for (k, (o, w)) in h.iter().zip(&want).enumerate() {
                assert!(
                    (o.to_f64_lossless() - w).abs() <= rtol * s,
                    "case {case} low-pass k {k}: {o:?} vs {w}"
                );
            }
            checked_lp += 1;
        }
    }
    assert!(checked_lp >= 1);
}

#[test]
fn fft_czt_and_low_pass_match_numpy_scipy_f64() {
    vs_scipy::<f64>(1e-11);
}

#[test]
fn fft_czt_and_low_pass_match_numpy_scipy_f32() {
    vs_scipy::<f32>(2e-5);
}

// ---------------------------------------------------------------- windows

/// Harris, "On the use of windows for harmonic analysis with the DFT",
/// Proc. IEEE 66(1):51–83, 1978, Table 1 (values recomputed for long
/// windows, methods.md §8): side lobe dB, 3 dB width, 6 dB width (bins).
const HARRIS: [(f64, f64, f64); 4] = [
    (-13.3, 0.886, 1.207),
    (-31.5, 1.441, 2.000),
    (-42.7, 1.303, 1.815),
    (-69.6, 1.705, 2.389),
];

fn harris_windows<T: Real>() -> [Window<T>; 4] {
    [
        Window::Rectangular,
        Window::Hann,
        Window::Hamming,
        Window::Kaiser {
            beta: T::lit(3.0 * std::f64::consts::PI),
        },
    ]
}

#[test]
fn window_figures_match_harris_1978() {
    for (w, (sl, w3, w6)) in harris_windows::<f64>().iter().zip(HARRIS) {
        let f = window_figures(w).unwrap();
        assert!((f.side_lobe_db - sl).abs() < 0.15, "{w:?}: {f:?}");
        assert!((f.main_lobe_3db_bins - w3).abs() < 0.01, "{w:?}: {f:?}");
        assert!((f.main_lobe_6db_bins - w6).abs() < 0.01, "{w:?}: {f:?}");
    }
    for (w, (sl, _, w6)) in harris_windows::<f32>().iter().zip(HARRIS) {
        let f = window_figures(w).unwrap();
        assert!((f.side_lobe_db as f64 - sl).abs() < 0.3, "{w:?}: {f:?}");
        assert!(
            (f.main_lobe_6db_bins as f64 - w6).abs() < 0.02,
            "{w:?}: {f:?}"
        );
    }
}

/// One reflection transformed by the zoom path: the measured 6 dB width of
/// |x| and the highest side lobe against Harris (1978) Table 1, and the
/// reported resolution against the measured width.
fn dtf_width_and_side_lobe<T: Real>(w6_tol: f64, sl_tol: f64) {
    let n = 401;
    let df = 1e6;
    let vf = 0.7;
    let v = vf * C0;
    let d_fault = 40.0;
    let f: Vec<T> = (0..n).map(|i| T::lit(10e6 + df * i as f64)).collect();
    let g: Vec<Cx<T>> = f
        .iter()
        .map(|fi| {
            let ph = -2.0 * fi.to_f64_lossless() * 2.0 * d_fault / v;
            let (s, c) = (std::f64::consts::PI * ph).sin_cos();
            Cx::new(T::lit(c), T::lit(s))
        })
        .collect();
    let span = df * (n - 1) as f64;
    let bin_m = v / (2.0 * span);
    for (w, (sl, _, w6)) in harris_windows::<T>().iter().zip(HARRIS) {
        let cfg = Config {
            window: *w,
            velocity: VelocityRange::from_factor(T::lit(vf), T::zero()).unwrap(),
        };
        let (a, b) = (d_fault - 30.0 * bin_m, d_fault + 30.0 * bin_m);
        let l = 6001;
        let mut z = vec![zero::<T>(); l];
        let mut work = vec![zero::<T>(); zoom_work_len(n, l).unwrap()];
        let grid = band_pass_zoom(&f, &g, &cfg, T::lit(a), T::lit(b), &mut z, &mut work).unwrap();
        let mag: Vec<f64> = z.iter().map(|x| x.norm().to_f64_lossless()).collect();
        let (imax, peak) =
            mag.iter().enumerate().fold(
                (0, 0.0),
                |acc, (i, m)| if *m > acc.1 { (i, *m) } else { acc },
            );
        assert!((peak - 1.0).abs() < 1e-3, "{w:?} peak {peak}");
        let step = grid.step_m.to_f64_lossless();
        let lo = (0..imax).rev().find(|i| mag[*i] < 0.5).unwrap();
        let hi = (imax..l).find(|i| mag[*i] < 0.5).unwrap();
        let width_bins = (hi - lo) as f64 * step / bin_m;
        assert!(
            (width_bins - w6).abs() < w6_tol,
            "{w:?}: 6 dB width {width_bins}"
        );
        // Highest local maximum outside the main lobe.
        let mut hl = lo;
        while hl > 0 && mag[hl - 1] < mag[hl] {
            hl -= 1;
        }
        let mut hh = hi;
        while hh + 1 < l && mag[hh + 1] < mag[hh] {
            hh += 1;
        }
        let side = mag[..hl]
            .iter()
            .chain(&mag[hh..])
            .fold(0.0f64, |a, b| a.max(*b));
        let side_db = 20.0 * (side / peak).log10();
        assert!((side_db - sl).abs() < sl_tol, "{w:?}: side lobe {side_db}");
        let res = grid.resolution_m.to_f64_lossless() / bin_m;
        assert!(
            (res - width_bins).abs() < w6_tol,
            "{w:?}: resolution {res} vs {width_bins}"
        );
    }
}

#[test]
fn dtf_resolution_and_side_lobes_match_harris_f64() {
    dtf_width_and_side_lobe::<f64>(0.02, 0.3);
}

#[test]
fn dtf_resolution_and_side_lobes_match_harris_f32() {
    dtf_width_and_side_lobe::<f32>(0.02, 0.5);
}

// ---------------------------------------------------------------- round trips

/// Γ(f) at the input of a cascade (network::cascade), swept.
fn sweep_cascade<T: Real>(c: &Cascade<'_, T, 8>, load: Load<T>, f: &[T]) -> Vec<Cx<T>> {
    let zr = Cx::new(T::lit(50.0), T::zero());
    f.iter()
        .map(|fi| c.input_reflection(*fi, &load, zr).unwrap())
        .collect()
}

/// A 50 Ω cable with a 75 Ω section from 12 m to 15 m and an open at 25 m
/// (lossless, VF 0.66). Γ of the steps: ±(75 − 50)/(75 + 50) = ±0.2
/// (common practice, no single source).
fn round_trip<T: Real>(n: usize) {
    let vf = T::lit(0.66);
    let l50 = Lossless::new(T::lit(50.0), vf).unwrap();
    let l75 = Lossless::new(T::lit(75.0), vf).unwrap();
    let mut c: Cascade<'_, T, 8> = Cascade::new();
    c.push_line(&l50, T::lit(12.0)).unwrap();
    c.push_line(&l75, T::lit(3.0)).unwrap();
    c.push_line(&l50, T::lit(10.0)).unwrap();
    let df = 1e6;
    let f: Vec<T> = (1..=n).map(|k| T::lit(df) * T::from_usize(k)).collect();
    let g = sweep_cascade(&c, Load::Open, &f);
    let cfg = Config {
        window: Window::Hann,
        velocity: VelocityRange::from_factor(vf, T::lit(0.01)).unwrap(),
    };
    let m = 4096;
    let table = plan_table::<T>(m);
    let plan = Fft::new(&table).unwrap();
    let mut out = vec![zero::<T>(); m];
    let grid = band_pass_fft(&f, &g, &cfg, &plan, &mut out).unwrap();
    let res = grid.resolution_m.to_f64_lossless();
    assert!(grid.range_m.to_f64_lossless() > 25.0);
    assert_eq!(grid.velocity.kind, VelocityKind::Factor);
    let mut peaks: Peaks<T, 8> = Peaks::new();
    peaks_complex(&out, &grid, T::lit(0.1), &mut peaks).unwrap();
    let d: Vec<f64> = peaks
        .iter()
        .map(|p| p.distance.distance_m.to_f64_lossless())
        .collect();
    // The three discontinuities, then the re-reflections between the open and
    // the steps: 25 + (25 − 15) = 35 m and 25 + (25 − 12) = 38 m.
    assert_eq!(d.len(), 5, "n {n}: {d:?}");
    for (got, want) in d.iter().zip([12.0, 15.0, 25.0, 35.0, 38.0]) {
        assert!(
            (got - want).abs() < res / 2.0,
            "n {n}: {got} vs {want} (res {res})"
        );
    }
    for p in &peaks {
        let dm = p.distance.distance_m.to_f64_lossless();
        assert!(p.distance.lo_m.to_f64_lossless() < dm && dm < p.distance.hi_m.to_f64_lossless());
    }
    // The first step: ρ = 0.2 within 10 % (the window's sum of overlapping tails).
    assert!((peaks[0].rho.to_f64_lossless() - 0.2).abs() < 0.02);
    assert!((peaks[0].return_loss_db.to_f64_lossless() - 13.98).abs() < 1.0);

    // Low-pass impulse: signs tell a rise (+) from a fall (−) of impedance.
    let mut w = vec![zero::<T>(); m];
    let mut h = vec![T::zero(); m];
    let grid = low_pass(&f, &g, &cfg, LowPass::Impulse, &plan, &mut w, &mut h).unwrap();
    let mut lp: Peaks<T, 8> = Peaks::new();
    peaks_real(&h, &grid, T::lit(0.1), &mut lp).unwrap();
    let signs: Vec<bool> = lp.iter().take(3).map(|p| p.value > T::zero()).collect();
    assert_eq!(signs, [true, false, true], "{lp:?}");
    let res = grid.resolution_m.to_f64_lossless();
    for (p, want) in lp.iter().zip([12.0, 15.0, 25.0]) {
        assert!((p.distance.distance_m.to_f64_lossless() - want).abs() < res / 2.0);
    }

    // Step response: 0.2 on the 75 Ω section, rise time as requested.
    let tr = 1.0 / (df * n as f64); // f_max·t_r = 1 ≥ 0.35
    let rect = Config {
        window: Window::Rectangular,
        ..cfg
    };
    let step = LowPass::Step {
        rise_time_s: Some(T::lit(tr)),
    };
    let grid = low_pass(&f, &g, &rect, step, &plan, &mut w, &mut h).unwrap();
    let at = |d: f64| h[(d / grid.step_m.to_f64_lossless()).round() as usize].to_f64_lossless();
    assert!((at(13.5) - 0.2).abs() < 0.01, "step level {}", at(13.5));
    assert!(at(6.0).abs() < 0.01);
    // 10–90 % rise of the first step, in round-trip time.
    let dt = grid.t_step_s.to_f64_lossless();
    let i10 = h.iter().position(|x| x.to_f64_lossless() > 0.02).unwrap();
    let i90 = h.iter().position(|x| x.to_f64_lossless() > 0.18).unwrap();
    let rise = (i90 - i10) as f64 * dt;
    assert!((rise / tr - 1.0).abs() < 0.1, "rise {rise} vs {tr}");
}

#[test]
fn round_trip_cascade_finds_each_fault_odd_and_even_n() {
    round_trip::<f64>(301);
    round_trip::<f64>(300);
    round_trip::<f32>(301);
    round_trip::<f32>(300);
}

/// A lossy, dispersive line (constant R = 2 Ω/m, L = 250 nH/m, C = 100 pF/m)
/// open at 20 m, swept 1–101 MHz (where ωL ≈ R: β(f) is far from linear).
/// The dispersion-corrected mapping puts the open within a tenth of the
/// resolution, loss compensation restores ρ ≈ 1; the constant-velocity
/// mapping misplaces or smears it.
fn dispersion<T: Real>() {
    let line = Rlgc::constant(T::lit(2.0), T::lit(250e-9), T::zero(), T::lit(100e-12)).unwrap();
    let zc = T::lit((250e-9f64 / 100e-12).sqrt()); // 50 Ω at high frequency
    let mut c: Cascade<'_, T, 8> = Cascade::new();
    c.push_line(&line, T::lit(20.0)).unwrap();
    let n = 201;
    let f: Vec<T> = (0..n).map(|k| T::lit(1e6 + 0.5e6 * k as f64)).collect();
    let zr = Cx::new(zc, T::zero());
    let g: Vec<Cx<T>> = f
        .iter()
        .map(|fi| c.input_reflection(*fi, &Load::Open, zr).unwrap())
        .collect();
    let cfg = Config {
        window: Window::Hann,
        velocity: VelocityRange::from_line(&line, VelocityKind::PhaseAt(T::lit(51e6)), T::zero())
            .unwrap(),
    };
    let opts = ModelOptions {
        dispersion_corrected: true,
        loss_compensated: true,
    };
    let mut out = vec![zero::<T>(); 801];
    let win = (T::lit(5.0), T::lit(40.0));
    let grid = band_pass_model(&f, &g, &cfg, &line, opts, win, &mut out).unwrap();
    assert_eq!(grid.mapping, Mapping::LineModel);
    assert!(matches!(grid.velocity.kind, VelocityKind::GroupAt(_)));
    let mut pk: Peaks<T, 16> = Peaks::new();
    peaks_complex(&out, &grid, T::lit(0.5), &mut pk).unwrap();
    assert_eq!(pk.len(), 1, "{pk:?}");
    let res = grid.resolution_m.to_f64_lossless();
    let d = pk[0].distance.distance_m.to_f64_lossless();
    assert!((d - 20.0).abs() < 0.1 * res, "{d} (res {res})");
    // |Γ_open| = 1 at Zc ≈ 50 Ω; the line's own Zc deviates at low f, so 10 %.
    assert!(
        (pk[0].rho.to_f64_lossless() - 1.0).abs() < 0.1,
        "{:?}",
        pk[0].rho
    );
    // The constant-velocity mapping (phase velocity at the centre) puts the
    // open further from 20 m than the corrected mapping does, and lower.
    let constant = ModelOptions {
        dispersion_corrected: false,
        loss_compensated: true,
    };
    let g2 = band_pass_model(&f, &g, &cfg, &line, constant, win, &mut out).unwrap();
    assert_eq!(g2.mapping, Mapping::Constant);
    let (imax, pmax) = out
        .iter()
        .enumerate()
        .map(|(i, z)| (i, z.norm().to_f64_lossless()))
        .fold((0, 0.0), |a, b| if b.1 > a.1 { b } else { a });
    let d2 = g2.distance_m(T::from_usize(imax)).to_f64_lossless();
    assert!((d2 - 20.0).abs() > (d - 20.0).abs() || pmax < pk[0].rho.to_f64_lossless());
    // Without loss compensation the open is much weaker (e^(−2αd), α ≈ R/(2Zc)).
    let plain = ModelOptions {
        dispersion_corrected: true,
        loss_compensated: false,
    };
    band_pass_model(&f, &g, &cfg, &line, plain, win, &mut out).unwrap();
    let peak = out
        .iter()
        .map(|z| z.norm().to_f64_lossless())
        .fold(0.0, f64::max);
    let expect = (-2.0 * 2.0 / (2.0 * 50.0) * 20.0f64).exp();
    assert!((peak - expect).abs() < 0.1, "{peak} vs {expect}");
}

#[test]
fn dispersion_corrected_mapping_and_loss_compensation() {
    dispersion::<f64>();
    dispersion::<f32>();
}

#[test]
fn bad_sweeps_are_typed_errors() {
    let cfg = Config::<f64> {
        window: Window::Hann,
        velocity: VelocityRange::from_factor(0.66, 0.0).unwrap(),
    };
    let table = plan_table::<f64>(64);
    let plan = Fft::new(&table).unwrap();
    let mut out = vec![zero::<f64>(); 64];
    let g = vec![Cx::new(0.1, 0.0); 8];
    let mut f: Vec<f64> = (1..=8).map(|k| k as f64 * 1e6).collect();
    f[5] = 5.5e6;
    assert_eq!(
        band_pass_fft(&f, &g, &cfg, &plan, &mut out).unwrap_err(),
        Error::BadIndex {
            what: "freqs_hz",
            index: 5
        }
    );
    f[5] = 4e6; // not above f[4] = 5 MHz
    assert_eq!(
        band_pass_fft(&f, &g, &cfg, &plan, &mut out).unwrap_err(),
        Error::BadIndex {
            what: "freqs_hz",
            index: 5
        }
    );
    assert_eq!(
        band_pass_fft(&f[..1], &g[..1], &cfg, &plan, &mut out).unwrap_err(),
        Error::TooShort {
            what: "freqs_hz",
            needed: 2
        }
    );
    let f: Vec<f64> = (1..=8).map(|k| k as f64 * 1e6).collect();
    let mut short = vec![zero::<f64>(); 4];
    assert_eq!(
        band_pass_fft(&f, &g, &cfg, &plan, &mut short).unwrap_err(),
        Error::TooShort {
            what: "out",
            needed: 8
        }
    );
    // Range 0.66·c/(2·1 MHz) ≈ 98.9 m: a window to 150 m is impossible.
    let mut z = vec![zero::<f64>(); 8];
    let mut w = vec![zero::<f64>(); zoom_work_len(8, 8).unwrap()];
    assert_eq!(
        band_pass_zoom(&f, &g, &cfg, 0.0, 150.0, &mut z, &mut w).unwrap_err(),
        Error::Unreachable("stop_m")
    );
    // 50 ps needs f_max ≥ 0.35/50 ps = 7 GHz; 8 MHz cannot.
    let mut h = vec![0.0; 64];
    let step = LowPass::Step {
        rise_time_s: Some(50e-12),
    };
    assert_eq!(
        low_pass(&f, &g, &cfg, step, &plan, &mut out, &mut h).unwrap_err(),
        Error::Unreachable("rise_time_s")
    );
}

// ---------------------------------------------------------------- readers

fn data(name: &str) -> String {
    let p = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("data")
        .join("sweeps")
        .join(name);
    std::fs::read_to_string(&p).unwrap_or_else(|e| panic!("{}: {e}", p.display()))
}

struct Read<T, const P: usize> {
    net: Vec<echoline::sweep::touchstone::NetworkPoint<T, P>>,
    noise: Vec<echoline::sweep::touchstone::NoisePoint<T>>,
    reader: Touchstone<T, P>,
}

fn touch<T: Real, const P: usize>(name: &str) -> echoline::Result<Read<T, P>> {
    let mut r = Touchstone::<T, P>::new(ports_from_file_name(name));
    let mut net = Vec::new();
    let mut noise = Vec::new();
    r.read_str(&data(name), |rec| {
        match rec {
            Record::Network(p) => net.push(*p),
            Record::Noise(z) => noise.push(z),
        }
        Ok(())
    })?;
    Ok(Read {
        net,
        noise,
        reader: r,
    })
}

fn near(a: Cx<f64>, re: f64, im: f64) -> bool {
    (a.re - re).abs() < 1e-9 && (a.im - im).abs() < 1e-9
}

#[test]
fn touchstone_v1_constructs() {
    let r = touch::<f64, 1>("v1_one_port_ri.s1p").unwrap();
    assert_eq!(r.net.len(), 3);
    assert_eq!(r.net[1].freq_hz, 200e6);
    assert!(near(r.net[1].data[0][0], -0.25, 0.125));
    assert_eq!(r.reader.header().format, Format::Ri);

    let r = touch::<f64, 1>("v1_one_port_db.s1p").unwrap();
    let h = r.reader.header();
    assert_eq!(
        (h.freq_unit_hz, h.r_ohm, h.parameter),
        (1.0, 75.0, Parameter::S)
    );
    assert!(near(r.net[0].data[0][0], 0.0, 0.1)); // −20 dB at 90°
    assert!(near(r.net[1].data[0][0], -0.5, 0.0) || (r.net[1].data[0][0].re + 0.5).abs() < 1e-5);

    // Normalised Z: 2·50 = 100 Ω → Γ = 1/3; 1 → 0; 0.5 → −1/3.
    let r = touch::<f64, 1>("v1_one_port_z.s1p").unwrap();
    let h = *r.reader.header();
    let g: Vec<f64> = r.net.iter().map(|p| h.s11(p, 50.0).unwrap().re).collect();
    assert!(
        (g[0] - 1.0 / 3.0).abs() < 1e-12 && g[1].abs() < 1e-12 && (g[2] + 1.0 / 3.0).abs() < 1e-12
    );
    assert_eq!(r.net[0].freq_hz, 10e3);

    let r = touch::<f64, 1>("v1_defaults.s1p").unwrap();
    assert_eq!(r.net[0].freq_hz, 1e9);
    assert!(near(r.net[0].data[0][0], 0.0, 0.5));

    let r = touch::<f64, 2>("v1_two_port_noise.s2p").unwrap();
    assert_eq!((r.net.len(), r.noise.len()), (3, 2));
    assert!((r.net[0].data[1][0].norm() - 0.9).abs() < 1e-12); // N21 second
    assert!((r.net[0].data[0][1].norm() - 0.01).abs() < 1e-12);
    assert_eq!(r.noise[1].freq_hz, 2.5e9);
    assert_eq!(r.noise[0].nf_min_db, 1.5);
    assert_eq!(r.noise[0].rn, 0.4);

    let r = touch::<f64, 3>("v1_three_port.s3p").unwrap();
    assert_eq!(r.net.len(), 2);
    assert!(near(r.net[1].data[2][1], 32.0, 1.0));
    assert_eq!(r.reader.header().refs_ohm, [50.0, 75.0, 100.0]);

    let r = touch::<f64, 5>("v1_five_port.s5p").unwrap();
    assert!(near(r.net[0].data[4][4], 55.0, 0.0) && near(r.net[0].data[1][4], 25.0, 0.0));
}

#[test]
fn touchstone_v2_constructs() {
    let r = touch::<f64, 2>("v2_two_port.ts").unwrap();
    let h = r.reader.header();
    assert_eq!(h.version, Version::V2);
    assert_eq!(h.refs_ohm, [50.0, 75.0]);
    assert!(!h.order_21_12);
    assert_eq!((r.net.len(), r.noise.len()), (2, 1));
    assert!(near(r.net[0].data[0][1], 0.12, 0.0)); // 12_21: N12 second
    assert!(near(r.net[1].data[1][1], 0.22, 0.1)); // spanning two lines
    assert_eq!(r.noise[0].rn, 25.0); // ohms in 2.0

    let r = touch::<f64, 3>("v2_three_port_lower.ts").unwrap();
    let h = r.reader.header();
    assert_eq!(
        (h.matrix, h.parameter, h.r_ohm),
        (MatrixFormat::Lower, Parameter::Y, 50.0)
    );
    assert!(near(r.net[0].data[0][2], 0.031, 0.0) && near(r.net[0].data[2][0], 0.031, 0.0));

    // 2.0 Z in ohms: 100 Ω → Γ = 1/3 at 50 Ω, 25 Ω → −1/3.
    let r = touch::<f64, 1>("v2_one_port_z.ts").unwrap();
    let h = *r.reader.header();
    let g: Vec<f64> = r.net.iter().map(|p| h.s11(p, 50.0).unwrap().re).collect();
    assert!((g[0] - 1.0 / 3.0).abs() < 1e-12 && (g[1] + 1.0 / 3.0).abs() < 1e-12);
    // and in f32
    let r = touch::<f32, 1>("v2_one_port_z.ts").unwrap();
    let h = *r.reader.header();
    assert!((h.s11(&r.net[0], 50.0).unwrap().re - 1.0 / 3.0).abs() < 1e-6);
}

#[test]
fn csv_constructs() {
    let mut f = [0.0f64; 3];
    let mut g = [zero::<f64>(); 3];
    let n = read_reflection(
        &data("sweep_reim.csv"),
        "sweep_reim.csv",
        50.0,
        &mut f,
        &mut g,
    )
    .unwrap();
    assert_eq!(n, 3);
    assert_eq!(f, [1e6, 2e6, 3e6]);
    assert!(near(g[1], 0.0, 0.5));
    let n = read_reflection(
        &data("sweep_dbdeg.csv"),
        "sweep_dbdeg.csv",
        50.0,
        &mut f,
        &mut g,
    )
    .unwrap();
    assert_eq!(n, 3);
    assert_eq!(f[1], 1.5e9);
    assert!(near(g[1], 0.0, 0.1));
    assert!((g[2].re + 0.5).abs() < 1e-5);
    let mut r = CsvSweep::<f32>::new();
    assert_eq!(r.read_str(&data("sweep_dbdeg.csv"), |_| Ok(())).unwrap(), 3);
    // Too small a buffer is a capacity error, not a truncation.
    let mut f2 = [0.0f64; 2];
    let mut g2 = [zero::<f64>(); 2];
    assert_eq!(
        read_reflection(&data("sweep_reim.csv"), "x.csv", 50.0, &mut f2, &mut g2).unwrap_err(),
        Error::Capacity {
            what: "freqs_hz",
            capacity: 2
        }
    );
}

#[test]
fn malformed_files_name_line_and_column() {
    let cases: [(&str, u32, u32); 16] = [
        ("bad_option.s1p", 1, 9),
        ("bad_number.s1p", 2, 7),
        ("missing_value.s1p", 3, 1),
        ("non_increasing.s1p", 4, 1),
        ("row_not_on_new_line.s3p", 2, 15),
        ("bad_keyword.ts", 4, 2),
        ("missing_end.ts", 6, 1),
        ("wrong_count.ts", 9, 1),
        ("no_order.ts", 4, 1),
        ("reference_short.ts", 6, 1),
        ("version_late.ts", 2, 1),
        ("bad_matrix.ts", 3, 17),
        ("bad_header.csv", 1, 1),
        ("bad_value.csv", 2, 7),
        ("non_increasing.csv", 3, 1),
        ("v1_two_port_noise.s2p", 0, 0), // valid two-port, read as one port: error
    ];
    for (name, line, col) in cases {
        let mut f = [0.0f64; 8];
        let mut g = [zero::<f64>(); 8];
        let file = if name.ends_with(".s2p") {
            "as_one_port.s1p"
        } else {
            name
        };
        let e = read_reflection(&data(name), file, 50.0, &mut f, &mut g).unwrap_err();
        let Error::Parse { pos, expected } = e else {
            panic!("{name}: {e:?}")
        };
        assert!(!expected.is_empty());
        if line > 0 {
            assert_eq!((pos.line, pos.column), (line, col), "{name}: {e}");
        }
        // The message names the line.
        assert!(format!("{e}").starts_with(&format!("line {}", pos.line)));
    }
}

//! Reference checks of the frequency-dependent line models (dielectric, conductor,
//! RLGC, coax) against published formulas evaluated by mpmath
//! (`tests/scripts/vectors_lines.py`), closed forms, and physical invariants.

use echoline::line::coax::Coax;
use echoline::line::conductor::{Conductor, Metal};
use echoline::line::dielectric::{Dielectric, WidebandDebye};
use echoline::line::lossless::Lossless;
use echoline::line::rlgc::Rlgc;
use echoline::line::{properties, LineModel, Warnings};
use echoline::math::complex::Cx;
use echoline::{Error, Impedance, Real};
use echoline_checks::{close, load};

fn f<T: Real>(x: T) -> f64 {
    x.to_f64_lossless()
}

fn cabs(re: f64, im: f64) -> f64 {
    re.hypot(im)
}

/// |a − b| ≤ rtol·|b| + atol for complex values given as parts.
fn close_c(a: Cx<f64>, b: (f64, f64), rtol: f64, atol: f64) -> bool {
    cabs(a.re - b.0, a.im - b.1) <= rtol * cabs(b.0, b.1) + atol
}

fn cx64<T: Real>(z: Cx<T>) -> Cx<f64> {
    Cx::new(f(z.re), f(z.im))
}

/// The coax cases of vectors_lines.py (COAX_CASES), built in precision T.
fn coax_case<T: Real>(case: usize) -> Coax<T> {
    let (d, dd, er, td, debye, sigma, t) = [
        (0.9e-3, 2.95e-3, 2.25, 2e-4, false, 5.8e7, 0.2e-3),
        (0.9e-3, 2.95e-3, 2.25, 2e-4, true, 5.8e7, 0.2e-3),
        (3.04e-3, 7.0e-3, 1.0, 0.0, false, 5.8e7, 1.0e-3),
        (0.5e-3, 3.0e-3, 4.3, 0.02, true, 3.5e7, 0.05e-3),
    ][case];
    let diel = if debye {
        Dielectric::wideband_debye(T::lit(er), T::lit(td), T::lit(1e9)).unwrap()
    } else {
        Dielectric::constant(T::lit(er), T::lit(td)).unwrap()
    };
    Coax::new(T::lit(d), T::lit(dd), diel, T::lit(sigma), T::lit(t)).unwrap()
}

fn log_grid(lo: f64, hi: f64, per_decade: usize) -> Vec<f64> {
    let n = ((hi / lo).log10() * per_decade as f64).round() as usize;
    (0..=n)
        .map(|k| lo * 10f64.powf(k as f64 / per_decade as f64))
        .collect()
}

// ---------------------------------------------------------------------------
// Wideband Debye (Djordjević, Biljić, Likar-Smiljanić & Sarkar, IEEE Trans. EMC
// 43(4):662–667, 2001): vectors from mpmath evaluating the published formula.

fn debye_vs_mpmath<T: Real>(rtol: f64) {
    let t = load("lines_debye");
    for r in t.iter() {
        let d = WidebandDebye::<T>::fit_with_band(
            T::lit(r.get("eps_r")),
            T::lit(r.get("tan_delta")),
            T::lit(r.get("fit_hz")),
            T::lit(r.get("f1_hz")),
            T::lit(r.get("f2_hz")),
        )
        .unwrap();
        assert!(
            close(f(d.eps_inf()), r.get("eps_inf"), rtol, 0.0),
            "eps_inf {:?}",
            f(d.eps_inf())
        );
        assert!(close(
            f(d.delta_eps()),
            r.get("delta_eps"),
            10.0 * rtol,
            0.0
        ));
        let e = Dielectric::from_debye(d)
            .at(T::lit(r.get("freq_hz")))
            .unwrap();
        let (re, loss) = (r.get("eps_re"), r.get("eps_loss"));
        assert!(
            close(f(e.re), re, rtol, 0.0),
            "eps_re at {}: {} vs {re}",
            r.get("freq_hz"),
            f(e.re)
        );
        // The loss is compared relative to itself, with a floor of rtol·ε′ far outside the band.
        assert!(
            close(f(-e.im), loss, 10.0 * rtol, rtol * re),
            "eps_loss at {}: {} vs {loss}",
            r.get("freq_hz"),
            f(-e.im)
        );
        if r.get("freq_hz") == 0.0 {
            assert_eq!(e.im, T::zero(), "exactly real at DC");
        }
    }
}

#[test]
fn debye_matches_mpmath_f64() {
    debye_vs_mpmath::<f64>(1e-12);
}

#[test]
fn debye_matches_mpmath_f32() {
    debye_vs_mpmath::<f32>(1e-5);
}

/// Kramers–Kronig consequence stated by Djordjević et al. (2001): between f1 and
/// f2 tanδ is nearly flat and ε′ falls by about (2/π)·ε″·ln 10 per decade.
fn debye_physics<T: Real>(rtol: f64) {
    let d = Dielectric::<T>::wideband_debye(T::lit(4.3), T::lit(0.02), T::lit(1e9)).unwrap();
    for k in 5..=9 {
        let f1 = 10f64.powi(k);
        let e1 = cx64(d.at(T::lit(f1)).unwrap());
        let e10 = cx64(d.at(T::lit(10.0 * f1)).unwrap());
        let emid = cx64(d.at(T::lit(f1 * 10f64.sqrt())).unwrap());
        let drop = e1.re - e10.re;
        let predicted = 2.0 / core::f64::consts::PI * (-emid.im) * core::f64::consts::LN_10;
        assert!(
            close(drop, predicted, rtol, 0.0),
            "decade {k}: drop {drop} vs {predicted}"
        );
        let (t1, t10) = (-e1.im / e1.re, -e10.im / e10.re);
        assert!(
            (t10 / t1 - 1.0).abs() < 0.04,
            "tanδ per decade {t1} → {t10}"
        );
    }
}

#[test]
fn debye_slope_per_decade() {
    debye_physics::<f64>(0.02);
    debye_physics::<f32>(0.02);
}

// ---------------------------------------------------------------------------
// Constant RLGC lines: γ and Zc against mpmath (telegrapher equations, Pozar,
// *Microwave Engineering*, 4th ed., 2012, §2.1).

fn rlgc_vs_mpmath<T: Real>(rtol: f64) {
    let t = load("lines_rlgc");
    for r in t.iter() {
        let line = Rlgc::<T>::constant(
            T::lit(r.get("r")),
            T::lit(r.get("l")),
            T::lit(r.get("g")),
            T::lit(r.get("c")),
        )
        .unwrap();
        let p = line.at(T::lit(r.get("freq_hz"))).unwrap();
        let g = cx64(p.gamma_per_m);
        let zc = cx64(p.zc_ohm.finite().unwrap());
        let what = format!("case {} at {} Hz", r.get("case"), r.get("freq_hz"));
        assert!(
            close_c(g, (r.get("gamma_re"), r.get("gamma_im")), rtol, 0.0),
            "gamma {what}: {g:?}"
        );
        assert!(
            close_c(zc, (r.get("zc_re"), r.get("zc_im")), rtol, 0.0),
            "zc {what}: {zc:?}"
        );
        // α on its own, relative to itself (it can be 1e-5 of β).
        assert!(
            close(g.re, r.get("gamma_re"), 5.0 * rtol, 1e-30),
            "alpha {what}: {} vs {}",
            g.re,
            r.get("gamma_re")
        );
    }
}

#[test]
fn rlgc_matches_mpmath_f64() {
    rlgc_vs_mpmath::<f64>(1e-13);
}

#[test]
fn rlgc_matches_mpmath_f32() {
    rlgc_vs_mpmath::<f32>(2e-6);
}

// ---------------------------------------------------------------------------
// Coax: the whole RLGC against an mpmath evaluation of the same formulas, then
// against the small-loss closed forms of Pozar (2012, §2.7; value from memory,
// re-derived in vectors_lines.py).

fn coax_vs_mpmath<T: Real>(rtol: f64) {
    let t = load("lines_coax");
    for r in t.iter() {
        let c = coax_case::<T>(r.get("case") as usize);
        let freq = r.get("freq_hz");
        let p = c.at(T::lit(freq)).unwrap();
        let g = cx64(p.gamma_per_m);
        let zc = cx64(p.zc_ohm.finite().unwrap());
        let what = format!("case {} at {freq} Hz", r.get("case"));
        assert!(
            close_c(g, (r.get("gamma_re"), r.get("gamma_im")), rtol, 0.0),
            "gamma {what}: {g:?}"
        );
        assert!(
            close(g.re, r.get("gamma_re"), 5.0 * rtol, 0.0),
            "alpha {what}: {} vs {}",
            g.re,
            r.get("gamma_re")
        );
        assert!(
            close_c(zc, (r.get("zc_re"), r.get("zc_im")), rtol, 0.0),
            "zc {what}: {zc:?}"
        );
        // Our closed forms equal the script's.
        let z0 = f(c.z0_closed_form_ohm(T::lit(freq)).unwrap());
        assert!(close(z0, r.get("z0_closed"), rtol, 0.0), "z0 {what}");
        let ac = f(c
            .alpha_conductor_closed_form_np_per_m(T::lit(freq))
            .unwrap());
        assert!(
            close(ac, r.get("alpha_c_closed"), rtol, 0.0),
            "alpha_c {what}"
        );
        let ad = f(c
            .alpha_dielectric_closed_form_np_per_m(T::lit(freq))
            .unwrap());
        assert!(
            close(ad, r.get("alpha_d_closed"), 10.0 * rtol, 1e-30),
            "alpha_d {what}: {ad}"
        );
    }
}

#[test]
fn coax_matches_mpmath_f64() {
    coax_vs_mpmath::<f64>(1e-12);
}

#[test]
fn coax_matches_mpmath_f32() {
    coax_vs_mpmath::<f32>(2e-5);
}

/// Re γ from the RLGC equals αc + αd in the small-loss limit. Tolerances: the
/// closed forms neglect the internal inductance (≈ R/ωL of Zc) and the
/// round-wire curvature term (≈ δ/2a), both shrinking as 1/√f.
fn coax_alpha_closed_form<T: Real>() {
    let t = load("lines_coax");
    for r in t.iter() {
        let freq = r.get("freq_hz");
        if freq < 1e6 {
            continue;
        }
        let rtol = if freq < 1e7 {
            0.03
        } else if freq < 1e8 {
            0.015
        } else if freq < 1e9 {
            0.006
        } else {
            0.002
        };
        let c = coax_case::<T>(r.get("case") as usize);
        let p = c.at(T::lit(freq)).unwrap();
        let alpha = f(p.alpha_np_per_m());
        let closed = r.get("alpha_c_closed") + r.get("alpha_d_closed");
        if p.warnings.contains(Warnings::THIN_CONDUCTOR) {
            // Wall within 3 skin depths: the surface-resistance closed form does
            // not apply, and the line knows it (case 3 near 1–10 MHz).
            assert!(alpha > closed, "thin wall adds resistance");
            continue;
        }
        assert!(
            close(alpha, closed, rtol, 0.0),
            "case {} {freq} Hz: {alpha} vs {closed}",
            r.get("case")
        );
        if freq >= 1e8 {
            let zc = f(p.zc_ohm.finite().unwrap().re);
            assert!(
                close(zc, r.get("z0_closed"), 0.006, 0.0),
                "Z0 case {} at {freq}: {zc}",
                r.get("case")
            );
        }
    }
}

#[test]
fn coax_alpha_equals_closed_forms() {
    coax_alpha_closed_form::<f64>();
    coax_alpha_closed_form::<f32>();
}

/// IEEE Std 287 7 mm airline, 7.000/3.040 mm in air: Z0 = 50.0085 Ω [calc]
/// (dimensions value from memory; Z0 computed in vectors_lines.py).
#[test]
fn ieee287_airline_z0() {
    let t = load("lines_airline");
    for r in t.iter() {
        let (d, dd, z0) = (
            r.get("inner_diameter_m"),
            r.get("outer_diameter_m"),
            r.get("z0_ohm"),
        );
        let c = Coax::<f64>::new(d, dd, Dielectric::vacuum(), 5.8e7, 1e-3).unwrap();
        assert!(close(c.z0_closed_form_ohm(1e9).unwrap(), z0, 1e-13, 0.0));
        // The lossy line tends to it at high frequency (copper walls, 18 GHz):
        // Zc ≈ Z0·(1 + (X_int − jR)/(2ωL)) with X_int ≈ R, i.e. Zc/Z0 − 1 ≈
        // (1 − j)·αc/β (small-loss expansion of √(Z/Y), common practice, no single source).
        let p = c.at(18e9).unwrap();
        let zc = p.zc_ohm.finite().unwrap();
        let ratio = c.alpha_conductor_closed_form_np_per_m(18e9).unwrap() / p.beta_rad_per_m();
        assert!(
            close(zc.re / z0 - 1.0, ratio, 0.1, 0.0),
            "Re Zc {zc:?} vs {z0}"
        );
        assert!(close(-zc.im / z0, ratio, 0.1, 0.0), "Im Zc {zc:?}");
        let c32 = Coax::<f32>::new(d as f32, dd as f32, Dielectric::vacuum(), 5.8e7, 1e-3).unwrap();
        assert!(close(
            c32.z0_closed_form_ohm(1e9).unwrap() as f64,
            z0,
            1e-6,
            0.0
        ));
    }
    let c = Coax::<f64>::new(3.04e-3, 7.0e-3, Dielectric::vacuum(), 5.8e7, 1e-3).unwrap();
    assert!((c.z0_closed_form_ohm(0.0).unwrap() - 50.0085).abs() < 5e-5);
}

// ---------------------------------------------------------------------------
// Round-wire internal impedance: interpolation vs the exact Bessel form
// (Ramo, Whinnery & Van Duzer, 1994), mpmath.

fn wire_vs_bessel<T: Real>() {
    let t = load("lines_wire");
    let mut worst = 0.0f64;
    for r in t.iter() {
        let w = Conductor::<T>::round_wire(
            Metal::new(T::lit(r.get("sigma"))).unwrap(),
            T::lit(r.get("radius_m")),
        )
        .unwrap();
        let fc = f(w.corner_freq_hz());
        let freq = r.get("freq_hz");
        let z = cx64(w.z_int_ohm_per_m(T::lit(freq)).unwrap());
        let (zr, zi) = (r.get("z_re"), r.get("z_im"));
        let err = cabs(z.re - zr, z.im - zi) / cabs(zr, zi);
        worst = worst.max(err);
        // Measured worst case of the one-corner interpolation: 6.7 % near 3·f_c.
        assert!(err < 0.07, "{freq} Hz: {err}");
        if freq < 0.03 * fc {
            assert!(err < 1e-3, "{freq} Hz (DC side): {err}");
        }
        if freq > 100.0 * fc {
            // Exact R/R_hf ≈ 1 + δ/(2a); the interpolation drops that term.
            let delta_over_a = r.get("skin_depth_m") / r.get("radius_m");
            assert!(
                ((z.re - zr) / zr).abs() < delta_over_a,
                "{freq} Hz (skin side)"
            );
        }
    }
    assert!(worst > 0.03, "the check spans the transition");
}

#[test]
fn round_wire_within_seven_percent_of_bessel() {
    wire_vs_bessel::<f64>();
    wire_vs_bessel::<f32>();
}

// ---------------------------------------------------------------------------
// Invariants over 1 kHz – 100 GHz (passive line: Re Zc > 0, α ≥ 0, G ≥ 0,
// Im γ ≥ 0), f32 against f64 (common practice, no single source).

fn models<T: Real>() -> Vec<Box<dyn LineModel<T>>> {
    let mut v: Vec<Box<dyn LineModel<T>>> = Vec::new();
    for case in 0..4 {
        v.push(Box::new(coax_case::<T>(case)));
    }
    for &(r, l, g, c) in &[
        (0.1, 250e-9, 1e-6, 100e-12),
        (10.0, 500e-9, 1e-4, 50e-12),
        (0.17, 6e-7, 0.0, 5e-11),
    ] {
        v.push(Box::new(
            Rlgc::constant(T::lit(r), T::lit(l), T::lit(g), T::lit(c)).unwrap(),
        ));
    }
    let leaky = Dielectric::wideband_debye(T::lit(3.0), T::lit(0.01), T::lit(1e8))
        .unwrap()
        .with_conductivity(T::lit(1e-6))
        .unwrap();
    v.push(Box::new(
        Coax::new(T::lit(1e-3), T::lit(4e-3), leaky, T::lit(1e7), T::lit(1e-5)).unwrap(),
    ));
    v
}

fn invariants<T: Real>() {
    for (i, m) in models::<T>().iter().enumerate() {
        for &freq in &log_grid(1e3, 1e11, 10) {
            let p = m.at(T::lit(freq)).unwrap();
            let zc = p.zc_ohm.finite().unwrap();
            assert!(zc.re > T::zero(), "model {i} {freq}: Re Zc {zc:?}");
            assert!(
                p.alpha_np_per_m() >= T::zero() && p.beta_rad_per_m() > T::zero(),
                "model {i} {freq}"
            );
            assert!(
                p.y_s_per_m.re >= T::zero() && p.z_ohm_per_m.re > T::zero(),
                "model {i} {freq}"
            );
            assert!(p.gamma_per_m.re.is_finite() && p.gamma_per_m.im.is_finite());
        }
    }
}

#[test]
fn invariants_hold_in_both_precisions() {
    invariants::<f64>();
    invariants::<f32>();
}

/// f32 and f64 agree: γ and Zc to 1e-5 of their modulus, α to 1e-4 of itself.
#[test]
fn f32_agrees_with_f64() {
    let (m64, m32) = (models::<f64>(), models::<f32>());
    for (i, (a, b)) in m64.iter().zip(m32.iter()).enumerate() {
        for &freq in &log_grid(1e3, 1e11, 7) {
            let p = a.at(freq).unwrap();
            let q = b.at(freq as f32).unwrap();
            let (g, g32) = (p.gamma_per_m, cx64(q.gamma_per_m));
            assert!(
                close_c(g32, (g.re, g.im), 1e-5, 0.0),
                "model {i} {freq}: {g32:?} vs {g:?}"
            );
            assert!(close(g32.re, g.re, 1e-4, 0.0), "model {i} {freq}: α");
            let (z, z32) = (p.zc_ohm.finite().unwrap(), cx64(q.zc_ohm.finite().unwrap()));
            assert!(
                close_c(z32, (z.re, z.im), 1e-5, 0.0),
                "model {i} {freq}: Zc"
            );
            assert_eq!(p.warnings, q.warnings, "model {i} {freq}");
        }
    }
}

/// R = G = 0 gives the lossless line exactly (Pozar 2012, §2.1).
fn lossless_limit<T: Real>(rtol: f64) {
    let z0 = T::lit(75.0);
    let vf = T::lit(0.66);
    let ll = Lossless::new(z0, vf).unwrap();
    let v = vf * T::c0();
    let line = Rlgc::constant(T::zero(), z0 / v, T::zero(), T::one() / (z0 * v)).unwrap();
    for &freq in &log_grid(1e3, 1e11, 5) {
        let (a, b) = (line.at(T::lit(freq)).unwrap(), ll.at(T::lit(freq)).unwrap());
        assert_eq!(a.gamma_per_m.re, T::zero());
        assert!(close(f(a.gamma_per_m.im), f(b.gamma_per_m.im), rtol, 0.0));
        let zc = a.zc_ohm.finite().unwrap();
        assert!(close(f(zc.re), 75.0, rtol, 0.0) && zc.im.abs() <= T::lit(rtol));
        assert!(a.warnings.is_empty());
    }
    let dc = line.at(T::zero()).unwrap();
    assert!(close(f(dc.zc_ohm.finite().unwrap().re), 75.0, rtol, 0.0));
    let p = properties(&line, T::zero()).unwrap();
    assert!(close(f(p.velocity_factor), 0.66, 10.0 * rtol, 0.0));
}

#[test]
fn lossless_limit_matches_lossless_model() {
    lossless_limit::<f64>(1e-14);
    lossless_limit::<f32>(1e-6);
}

/// DC: R(0) = R_dc of both conductors, Zc open without leakage, γ = 0,
/// velocities finite (the f → 0⁺ limit documented in `line::properties`).
fn dc_limits<T: Real>(rtol: f64) {
    let c = coax_case::<T>(0);
    let (a, b, t, sigma) = (0.45e-3, 1.475e-3, 0.2e-3, 5.8e7);
    let pi = core::f64::consts::PI;
    let r_dc = 1.0 / (sigma * pi * a * a) + 1.0 / (sigma * pi * t * (2.0 * b + t));
    assert!(close(
        f(c.rlgc().r_ohm_per_m(T::zero()).unwrap()),
        r_dc,
        rtol,
        0.0
    ));
    let p = c.at(T::zero()).unwrap();
    assert_eq!(p.zc_ohm, Impedance::Open);
    assert_eq!(p.gamma_per_m, Cx::new(T::zero(), T::zero()));
    assert!(p.warnings.contains(Warnings::DIFFUSIVE));
    let pr = properties(&c, T::zero()).unwrap();
    assert!(pr.phase_velocity_m_per_s.is_finite() && pr.phase_velocity_m_per_s >= T::zero());
    assert!(pr.phase_velocity_m_per_s < T::c0());
    assert!(pr.group_velocity_m_per_s.is_finite());
    // Internal inductance at DC: μ0/(8π) for the inner wire (Ramo et al. 1994),
    // μ0·t(2b + t)/(8πb²) for the tube (this crate's interpolation, see conductor.rs).
    let mu0 = 1.256_637_062_12e-6;
    let l_ext = mu0 / (2.0 * pi) * (2.95f64 / 0.9).ln();
    let l_int = mu0 / (8.0 * pi) + mu0 * t * (2.0 * b + t) / (8.0 * pi * b * b);
    let l_dc = f(c.rlgc().l_h_per_m(T::zero()).unwrap());
    assert!(
        close(l_dc, l_ext + l_int, rtol, 0.0),
        "{l_dc} vs {}",
        l_ext + l_int
    );
    // With a leaky dielectric Zc at DC is √(R/G), G = σ·C_vac/ε0 = 2πσ/ln(b/a).
    let leaky = Dielectric::vacuum()
        .with_conductivity(T::lit(1e-6))
        .unwrap();
    let cl = Coax::new(
        T::lit(0.9e-3),
        T::lit(2.95e-3),
        leaky,
        T::lit(sigma),
        T::lit(t),
    )
    .unwrap();
    let g = 2.0 * pi * 1e-6 / (2.95f64 / 0.9).ln();
    let zc = cl.at(T::zero()).unwrap().zc_ohm.finite().unwrap();
    assert!(close(f(zc.re), (r_dc / g).sqrt(), 10.0 * rtol, 0.0) && zc.im == T::zero());
}

#[test]
fn dc_limits_both_precisions() {
    dc_limits::<f64>(1e-13);
    dc_limits::<f32>(1e-6);
}

#[test]
fn warnings_follow_the_regime() {
    let c = coax_case::<f64>(0); // constant tanδ: non-causal
    assert!(c
        .at(1e9)
        .unwrap()
        .warnings
        .contains(Warnings::NON_CAUSAL_DIELECTRIC));
    assert!(c.at(100.0).unwrap().warnings.contains(Warnings::DIFFUSIVE));
    assert!(c.at(1e4).unwrap().warnings.contains(Warnings::HIGH_LOSS));
    assert!(!c.at(1e9).unwrap().warnings.contains(Warnings::HIGH_LOSS));
    let d = coax_case::<f64>(1); // wideband Debye: causal
    assert!(!d
        .at(1e9)
        .unwrap()
        .warnings
        .contains(Warnings::NON_CAUSAL_DIELECTRIC));
    let thin = coax_case::<f64>(3); // 50 µm shield: δ = t near 3.6 MHz for σ = 3.5e7
    assert!(thin
        .at(3.6e6)
        .unwrap()
        .warnings
        .contains(Warnings::THIN_CONDUCTOR));
    assert!(!thin
        .at(10e9)
        .unwrap()
        .warnings
        .contains(Warnings::THIN_CONDUCTOR));
}

// ---------------------------------------------------------------------------
// Bad inputs: each returns the typed error naming the parameter.

#[test]
fn bad_inputs_return_named_errors() {
    let vac = Dielectric::<f64>::vacuum();
    for &bad in &[f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
        assert_eq!(
            Coax::new(bad, 3e-3, vac, 5.8e7, 1e-4),
            Err(Error::NonFinite("inner_diameter_m"))
        );
        assert_eq!(
            Coax::new(1e-3, bad, vac, 5.8e7, 1e-4),
            Err(Error::NonFinite("outer_diameter_m"))
        );
        assert_eq!(
            Coax::new(1e-3, 3e-3, vac, bad, 1e-4),
            Err(Error::NonFinite("conductivity_s_per_m"))
        );
        assert_eq!(
            Coax::new(1e-3, 3e-3, vac, 5.8e7, bad),
            Err(Error::NonFinite("shield_thickness_m"))
        );
        assert_eq!(
            Dielectric::<f64>::constant(bad, 0.0),
            Err(Error::NonFinite("eps_r"))
        );
        assert_eq!(
            Dielectric::<f64>::constant(2.0, bad),
            Err(Error::NonFinite("tan_delta"))
        );
        assert_eq!(
            Rlgc::<f64>::constant(bad, 1e-7, 0.0, 1e-10),
            Err(Error::NonFinite("r_ohm_per_m"))
        );
        assert_eq!(
            Conductor::<f64>::generic(1.0, bad),
            Err(Error::NonFinite("hf_coeff_ohm_per_m_sqrt_hz"))
        );
        assert_eq!(
            coax_case::<f64>(0).at(bad),
            Err(Error::NonFinite("freq_hz"))
        );
        assert_eq!(
            WidebandDebye::<f64>::fit_with_band(2.0, 0.01, 1e9, 1e3, bad),
            Err(Error::NonFinite("f2_hz"))
        );
    }
    for &bad in &[0.0, -1e-3] {
        assert_eq!(
            Coax::new(bad, 3e-3, vac, 5.8e7, 1e-4),
            Err(Error::NotPositive("inner_diameter_m"))
        );
        assert_eq!(
            Coax::new(1e-3, 3e-3, vac, 5.8e7, bad),
            Err(Error::NotPositive("shield_thickness_m"))
        );
        assert_eq!(
            Conductor::round_wire(Metal::<f64>::copper(), bad),
            Err(Error::NotPositive("radius_m"))
        );
        assert_eq!(
            Rlgc::<f64>::constant(0.0, 1e-7, 0.0, bad),
            Err(Error::NotPositive("c_f_per_m"))
        );
        assert_eq!(
            WidebandDebye::<f64>::fit(2.0, 0.01, bad),
            Err(Error::NotPositive("fit_freq_hz"))
        );
    }
    assert_eq!(
        Coax::new(3e-3, 1e-3, vac, 5.8e7, 1e-4),
        Err(Error::OutOfRange("inner_diameter_m"))
    );
    assert_eq!(
        Coax::new(3e-3, 3e-3, vac, 5.8e7, 1e-4),
        Err(Error::OutOfRange("inner_diameter_m"))
    );
    assert_eq!(
        Dielectric::<f32>::constant(0.99, 0.0),
        Err(Error::OutOfRange("eps_r"))
    );
    assert_eq!(
        Dielectric::<f32>::wideband_debye(0.5, 0.01, 1e9),
        Err(Error::OutOfRange("eps_r"))
    );
    assert_eq!(
        Dielectric::<f64>::constant(2.0, -1e-3),
        Err(Error::Negative("tan_delta"))
    );
    assert_eq!(
        Rlgc::<f64>::constant(0.0, 1e-7, -1.0, 1e-10),
        Err(Error::Negative("g_s_per_m"))
    );
    assert_eq!(
        coax_case::<f32>(1).at(-1.0),
        Err(Error::Negative("freq_hz"))
    );
    // ε∞ < 1 would be needed: refused.
    assert_eq!(
        Dielectric::<f64>::wideband_debye(1.2, 0.3, 1e9),
        Err(Error::Unreachable("tan_delta"))
    );
    assert_eq!(
        WidebandDebye::<f64>::fit(2.0, 0.01, 2e12),
        Err(Error::OutOfRange("fit_freq_hz"))
    );
}

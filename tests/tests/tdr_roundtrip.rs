//! Round trips: cables with faults at known positions are simulated with the
//! library's own simulator (`tdr::sim::simulate`: frequency-domain evaluation of
//! the terminated cascade, inverse FFT, seeded noise) and analysed with
//! `Trace::new` + `analyse`. For every fault the distance error must lie inside
//! the reported interval and within max(one sample of distance, 0.5 % of the
//! distance) (issue 3's acceptance rule), the kind must be right and ρ within
//! a stated tolerance.
//!
//! Expected values are computed by hand here, not copied from our output:
//! ρ = (Z2 − Z1)/(Z2 + Z1) at each step, and the first arrival of a later
//! discontinuity is scaled by the round-trip transmission Π(1 − ρ_j²) of the
//! earlier ones (lattice / bounce-diagram method, L. V. Bewley, *Traveling
//! Waves on Transmission Systems*, 1933). The lumped C / L values are the ones
//! put into the cascade (the area rule is Johnson & Graham, *High-Speed Digital
//! Design*, 1993, value from memory). The skin-effect edge delay is the erfc
//! law of Wigington & Nahman, Proc. IRE 45(2):166–174, 1957.
//!
//! Honest limits found here (and stated in the assertions):
//! * on a long lossy cable the 50 % reading of a slow far-end edge is late by
//!   ≈ 1.1·a² (skin effect); read with a filter long enough to see the step
//!   (`filter_samples`), the raw distance falls outside tolerance and outside
//!   its own interval, and `timing::edge::correct_skin_delay` brings it back
//!   inside;
//! * with the default filter (tied to the instrument's rise time) the same
//!   edge is read early on its rise (a small step), so the raw distance stays
//!   close but a far open on a very long cable may be reported as an
//!   impedance-up step with the settled level showing the open.

use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::math::complex::Cx;
use echoline::network::cascade::{Cascade, Element};
use echoline::network::load::{Load, Rlc};
use echoline::tdr::sim::{simulate, Noise, Sampling, Source, Terminated};
use echoline::tdr::{
    Analysis, DetectSettings, Event, EventKind, Lumped, TimeZero, Trace, TraceSetup,
};
use echoline::timing::edge::{correct_skin_delay, SkinLoss};
use echoline::timing::{VelocityKind, VelocityRange};
use echoline::{Impedance, Real};

const C0: f64 = 299_792_458.0;

fn f(x: impl Real) -> f64 {
    x.to_f64_lossless()
}

/// Simulated port voltage: 2 V EMF behind 50 Ω (1 V incident into 50 Ω),
/// Gaussian edge of 10–90 % `tr`, launch at max(2 ns, 24 samples).
fn sim<T: Real, const K: usize>(
    c: &Cascade<'_, T, K>,
    load: Load<T>,
    dt: f64,
    tr: f64,
    n: usize,
    noise_v: f64,
    seed: u64,
) -> Vec<T> {
    let src = Source::step(T::lit(2.0), T::lit(tr), T::lit(50.0), T::lit(launch_s(dt))).unwrap();
    let mut out = vec![T::zero(); n];
    // M = 8N: the multiple reflections of a lossless open or short line ring
    // for long; with M = 2N their wrap-around reached 0.7 % (seen here).
    let mut work = vec![Cx::new(T::zero(), T::zero()); (8 * n).next_power_of_two()];
    let nz = (noise_v > 0.0).then(|| Noise {
        rms_v: T::lit(noise_v),
        seed,
    });
    let port = Terminated { cascade: c, load };
    let s = Sampling {
        sample_interval_s: T::lit(dt),
    };
    simulate(&port, &src, &s, nz, &mut out, &mut work).unwrap();
    out
}

fn launch_s(dt: f64) -> f64 {
    (24.0 * dt).max(2e-9)
}

/// One expected fault.
#[derive(Clone, Copy, Debug)]
struct Want {
    d_m: f64,
    kind: EventKind,
    rho: f64,
    /// Lumped C (F) or L (H) put into the cascade, checked within 3 %.
    lumped: Option<f64>,
    /// Impedance after the event (resistive faults), checked within 3 %.
    z_after: Option<f64>,
}

fn want(d_m: f64, kind: EventKind, rho: f64) -> Want {
    Want {
        d_m,
        kind,
        rho,
        lumped: None,
        z_after: None,
    }
}

/// The distance tolerance: max(one sample of distance, 0.5 %).
fn tolerance_m(v_m_per_s: f64, dt: f64, d_m: f64) -> f64 {
    (v_m_per_s * dt / 2.0).max(0.005 * d_m)
}

fn analyse<T: Real>(
    x: &[T],
    dt: f64,
    v: VelocityRange<T>,
    set: &DetectSettings<T>,
) -> Analysis<T, 16> {
    let t = Trace::new(x, TraceSetup::measured(T::lit(dt), T::lit(50.0), v)).unwrap();
    t.analyse::<16>(set).unwrap()
}

fn check_distance<T: Real>(e: &Event<T>, d_true: f64, v: f64, dt: f64, label: &str) {
    let (d, lo, hi) = (
        f(e.distance.distance_m),
        f(e.distance.lo_m),
        f(e.distance.hi_m),
    );
    let tol = tolerance_m(v, dt, d_true);
    assert!(
        lo <= d_true && d_true <= hi,
        "{label}: {d_true} m outside the interval [{lo}, {hi}] (read {d})"
    );
    assert!(
        (d - d_true).abs() <= tol,
        "{label}: read {d} m for {d_true} m, error above {tol} m"
    );
}

/// Checks every wanted fault and that nothing else (but the end-of-trace
/// marker) was reported.
fn check<T: Real>(a: &Analysis<T, 16>, wants: &[Want], v: f64, dt: f64, rho_tol: f64, label: &str) {
    let found: Vec<&Event<T>> = a
        .events
        .iter()
        .filter(|e| e.kind != EventKind::EndOfTrace)
        .collect();
    let kinds: Vec<(EventKind, f64, f64)> = found
        .iter()
        .map(|e| (e.kind, f(e.distance.distance_m), f(e.rho)))
        .collect();
    assert_eq!(found.len(), wants.len(), "{label}: events {kinds:?}");
    for (e, w) in found.iter().zip(wants) {
        let l = format!("{label}, {:?} at {} m", w.kind, w.d_m);
        assert_eq!(e.kind, w.kind, "{l}: kinds {kinds:?}");
        check_distance(e, w.d_m, v, dt, &l);
        let rho_tol = rho_tol.max(6.0 * f(e.rho_sigma));
        assert!(
            (f(e.rho) - w.rho).abs() <= rho_tol,
            "{l}: rho {} vs {}",
            f(e.rho),
            w.rho
        );
        if let Some(x) = w.lumped {
            let got = match e.lumped {
                Lumped::Capacitance { farads } => f(farads),
                Lumped::Inductance { henries } => f(henries),
                Lumped::None => f64::NAN,
            };
            assert!((got / x - 1.0).abs() < 0.03, "{l}: lumped {got} vs {x}");
        }
        if let Some(z) = w.z_after {
            let got = match e.z_after {
                Impedance::Finite(c) => c.re.to_f64_lossless(),
                Impedance::Open => f64::INFINITY,
            };
            assert!((got / z - 1.0).abs() < 0.03, "{l}: Z after {got} vs {z}");
        }
    }
}

fn rho(z1: f64, z2: f64) -> f64 {
    (z2 - z1) / (z2 + z1)
}

/// 50 Ω 6 m → 75 Ω 5 m → 50 Ω 4 m → open, solid-PE velocity (VF 0.66). The
/// multiple reflection inside the 75 Ω section arrives (as from 16 m) after
/// the open end, so exactly three events are expected.
fn steps_and_open<T: Real>(rho_tol: f64) {
    let vf = 0.66;
    let l50 = Lossless::new(T::lit(50.0), T::lit(vf)).unwrap();
    let l75 = Lossless::new(T::lit(75.0), T::lit(vf)).unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&l50, T::lit(6.0)).unwrap();
    c.push_line(&l75, T::lit(5.0)).unwrap();
    c.push_line(&l50, T::lit(4.0)).unwrap();
    let r1 = rho(50.0, 75.0);
    let t1 = 1.0 - r1 * r1;
    let wants = [
        want(6.0, EventKind::ImpedanceUp, r1),
        want(11.0, EventKind::ImpedanceDown, rho(75.0, 50.0) * t1),
        want(15.0, EventKind::OpenEnd, t1 * t1),
    ];
    let dt = 100e-12;
    let v = VelocityRange::from_factor(T::lit(vf), T::lit(0.01)).unwrap();
    for tr in [250e-12, 500e-12, 700e-12] {
        for (noise, seed) in [(0.0, 0), (0.002, 11), (0.005, 12)] {
            let x = sim(&c, Load::Open, dt, tr, 2048, noise, seed);
            let a = analyse(&x, dt, v, &DetectSettings::default());
            let label = format!("steps+open tr {tr} noise {noise}");
            check(&a, &wants, vf * C0, dt, rho_tol, &label);
        }
    }
}

#[test]
fn steps_and_open_end_vf066_f64() {
    steps_and_open::<f64>(0.01);
}

#[test]
fn steps_and_open_end_vf066_f32() {
    steps_and_open::<f32>(0.01);
}

/// 50 Ω 8 m → 35 Ω 6 m → 50 Ω 5 m → short, foam-PE velocity (VF 0.8).
fn steps_and_short<T: Real>(rho_tol: f64) {
    let vf = 0.8;
    let l50 = Lossless::new(T::lit(50.0), T::lit(vf)).unwrap();
    let l35 = Lossless::new(T::lit(35.0), T::lit(vf)).unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&l50, T::lit(8.0)).unwrap();
    c.push_line(&l35, T::lit(6.0)).unwrap();
    c.push_line(&l50, T::lit(5.0)).unwrap();
    let r1 = rho(50.0, 35.0);
    let t1 = 1.0 - r1 * r1;
    let wants = [
        want(8.0, EventKind::ImpedanceDown, r1),
        want(14.0, EventKind::ImpedanceUp, rho(35.0, 50.0) * t1),
        want(19.0, EventKind::Short, -t1 * t1),
    ];
    let dt = 100e-12;
    let v = VelocityRange::from_factor(T::lit(vf), T::lit(0.02)).unwrap();
    for tr in [300e-12, 600e-12] {
        for (noise, seed) in [(0.0, 0), (0.003, 21)] {
            let x = sim(&c, Load::Short, dt, tr, 2048, noise, seed);
            let a = analyse(&x, dt, v, &DetectSettings::default());
            let label = format!("steps+short tr {tr} noise {noise}");
            check(&a, &wants, vf * C0, dt, rho_tol, &label);
        }
    }
}

#[test]
fn steps_and_short_vf08_f64() {
    steps_and_short::<f64>(0.01);
}

#[test]
fn steps_and_short_vf08_f32() {
    steps_and_short::<f32>(0.01);
}

/// Air-spaced line (VF 0.97), 50 Ω, 10 m to a lumped fault, 6 m more, ended
/// in 50 Ω (matched: nothing but the end-of-trace marker after the fault).
fn lumped_and_resistive<T: Real>(rho_tol: f64) {
    let vf = 0.97;
    let line = Lossless::new(T::lit(50.0), T::lit(vf)).unwrap();
    let dt = 100e-12;
    let v = VelocityRange::from_factor(T::lit(vf), T::lit(0.02)).unwrap();
    let cap = 5e-12;
    let ind = 20e-9;
    let faults: [(Element<'_, T>, Want); 3] = [
        (
            Element::Shunt(Load::Series(Rlc::new(None, None, Some(T::lit(cap))))),
            Want {
                lumped: Some(cap),
                // ρ is the peak excursion: not a fixed number (it depends on the
                // edge), so only its sign and size are bounded below.
                ..want(10.0, EventKind::Capacitive, f64::NAN)
            },
        ),
        (
            Element::Series(Load::Series(Rlc::new(None, Some(T::lit(ind)), None))),
            Want {
                lumped: Some(ind),
                ..want(10.0, EventKind::Inductive, f64::NAN)
            },
        ),
        (
            // 100 Ω across the line: 100 ∥ 50 = 33.3 Ω beyond, ρ = −0.2.
            Element::Shunt(Load::Resistor(T::lit(100.0))),
            Want {
                z_after: Some(100.0 * 50.0 / 150.0),
                ..want(10.0, EventKind::Resistive, rho(50.0, 100.0 * 50.0 / 150.0))
            },
        ),
    ];
    for (el, w) in faults {
        let mut c: Cascade<T, 4> = Cascade::new();
        c.push_line(&line, T::lit(10.0)).unwrap();
        c.push(el).unwrap();
        c.push_line(&line, T::lit(6.0)).unwrap();
        for tr in [250e-12, 500e-12] {
            for (noise, seed) in [(0.0, 0), (0.002, 31)] {
                let x = sim(&c, Load::Resistor(T::lit(50.0)), dt, tr, 2048, noise, seed);
                let a = analyse(&x, dt, v, &DetectSettings::default());
                let label = format!("{:?} tr {tr} noise {noise}", w.kind);
                if w.rho.is_nan() {
                    // Lumped: the peak excursion's sign, and a real size.
                    let e = a.events.first().unwrap();
                    let sign = if w.kind == EventKind::Capacitive {
                        -1.0
                    } else {
                        1.0
                    };
                    assert!(f(e.rho) * sign > 0.1, "{label}: rho {}", f(e.rho));
                    let w2 = Want { rho: f(e.rho), ..w };
                    check(&a, &[w2], vf * C0, dt, rho_tol, &label);
                } else {
                    check(&a, &[w], vf * C0, dt, rho_tol, &label);
                }
                // The matched end leaves the level where the fault put it.
                let end = a.events.last().unwrap();
                assert_eq!(end.kind, EventKind::EndOfTrace, "{label}");
            }
        }
    }
}

#[test]
fn lumped_c_series_l_and_shunt_resistance_air_f64() {
    lumped_and_resistive::<f64>(0.01);
}

#[test]
fn lumped_c_series_l_and_shunt_resistance_air_f32() {
    lumped_and_resistive::<f32>(0.01);
}

/// A matched end gives no event but the end-of-trace marker; a 20 Ω end is
/// a resistive end of 20 Ω.
fn matched_and_resistive_end<T: Real>() {
    let vf = 0.66;
    let line = Lossless::new(T::lit(50.0), T::lit(vf)).unwrap();
    let mut c: Cascade<T, 2> = Cascade::new();
    c.push_line(&line, T::lit(12.0)).unwrap();
    let dt = 100e-12;
    let v = VelocityRange::from_factor(T::lit(vf), T::lit(0.01)).unwrap();
    for seed in 1..=5 {
        let x = sim(
            &c,
            Load::Resistor(T::lit(50.0)),
            dt,
            400e-12,
            2048,
            0.004,
            seed,
        );
        let a = analyse(&x, dt, v, &DetectSettings::default());
        check(&a, &[], vf * C0, dt, 0.01, &format!("matched seed {seed}"));
        let end = a.events.last().unwrap();
        assert_eq!(end.kind, EventKind::EndOfTrace);
        assert!(f(end.gamma_after).abs() < 0.01);
        let x = sim(
            &c,
            Load::Resistor(T::lit(20.0)),
            dt,
            400e-12,
            2048,
            0.004,
            seed,
        );
        let a = analyse(&x, dt, v, &DetectSettings::default());
        let w = Want {
            z_after: Some(20.0),
            ..want(12.0, EventKind::Resistive, rho(50.0, 20.0))
        };
        check(
            &a,
            &[w],
            vf * C0,
            dt,
            0.01,
            &format!("20 Ω end seed {seed}"),
        );
    }
}

#[test]
fn matched_end_and_resistive_end_f64() {
    matched_and_resistive_end::<f64>();
}

#[test]
fn matched_end_and_resistive_end_f32() {
    matched_and_resistive_end::<f32>();
}

/// Solid-PE coax with copper conductors and a causal (wideband Debye)
/// dielectric: d = 0.9 mm, D = 3.144 mm (≈ 50 Ω at high frequency).
fn pe_coax<T: Real>(inner_m: f64) -> Coax<T> {
    let pe = Dielectric::wideband_debye(T::lit(2.25), T::lit(2e-4), T::lit(1e9)).unwrap();
    Coax::new(
        T::lit(inner_m),
        T::lit(3.144e-3),
        pe,
        T::lit(5.8e7),
        T::lit(0.2e-3),
    )
    .unwrap()
}

/// A short lossy run: 40 m of 50 Ω coax, 25 m of ≈ 75 Ω coax (thinner inner
/// conductor), open. Read with the default filter the raw distances are
/// inside tolerance; the open end reads Γ ≈ +1 once settled.
fn lossy_coax_short_run<T: Real>() {
    let c50 = pe_coax::<T>(0.9e-3);
    let c75 = pe_coax::<T>(3.144e-3 / (75.0f64 * 1.5 / 59.958).exp());
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&c50, T::lit(40.0)).unwrap();
    c.push_line(&c75, T::lit(25.0)).unwrap();
    let v =
        VelocityRange::from_line(&c50, VelocityKind::PhaseAt(T::lit(1e9)), T::lit(0.005)).unwrap();
    let vn = f(v.nominal_m_per_s);
    let dt = 200e-12;
    let x = sim(&c, Load::Open, dt, 1e-9, 4096, 0.002, 41);
    let a = analyse(&x, dt, v, &DetectSettings::default());
    let found: Vec<&Event<T>> = a
        .events
        .iter()
        .filter(|e| e.kind != EventKind::EndOfTrace)
        .collect();
    let kinds: Vec<EventKind> = found.iter().map(|e| e.kind).collect();
    assert_eq!(
        kinds,
        [EventKind::ImpedanceUp, EventKind::OpenEnd],
        "{kinds:?}"
    );
    check_distance(found[0], 40.0, vn, dt, "lossy step");
    check_distance(found[1], 65.0, vn, dt, "lossy open");
    // The step to ≈ 75 Ω: its edge is slowed by 80 m of path, so the step
    // read over the short default filter is smaller than ρ = 0.2, but the
    // settled level before the open shows it, a little above 0.2: the thin
    // coax's Zc rises at the lower frequencies of the settling tail (internal
    // inductance, R/jωL), 75 Ω being its high-frequency value.
    let r = f(found[0].rho);
    assert!(r > 0.05 && r < 0.2, "rho {r}");
    let gs = f(found[0].gamma_settled);
    assert!(gs > 0.18 && gs < 0.28, "settled {gs}");
    assert!(f(found[1].gamma_settled) > 0.9);
}

#[test]
fn lossy_coax_short_run_f64() {
    lossy_coax_short_run::<f64>();
}

#[test]
fn lossy_coax_short_run_f32() {
    lossy_coax_short_run::<f32>();
}

/// Long lossy runs (100–300 m of the 50 Ω coax, open): with a filter long
/// enough to see the slow edge (150 samples of 250 ps), the raw 50 % reading
/// is late by the skin-effect delay, outside tolerance and outside its own
/// interval; `correct_skin_delay` (a from the line at 1 GHz, ±10 %, read at
/// the fraction p = ½·ρ/(Γ_settled − Γ_before) of the whole step) brings it
/// within tolerance with the truth inside the corrected interval.
fn long_lossy<T: Real>(lengths: &[f64]) {
    let coax = pe_coax::<T>(0.9e-3);
    let v =
        VelocityRange::from_line(&coax, VelocityKind::PhaseAt(T::lit(1e9)), T::lit(0.005)).unwrap();
    let vn = f(v.nominal_m_per_s);
    let loss = SkinLoss::from_line(&coax, T::lit(1e9)).unwrap();
    let dt = 250e-12;
    let set = DetectSettings {
        filter_samples: Some(150),
        ..DetectSettings::default()
    };
    for &len in lengths {
        let mut c: Cascade<T, 2> = Cascade::new();
        c.push_line(&coax, T::lit(len)).unwrap();
        let x = sim(&c, Load::Open, dt, 1e-9, 16384, 0.001, 51);
        let a = analyse(&x, dt, v, &set);
        let e = a.events.first().unwrap();
        assert_eq!(e.kind, EventKind::OpenEnd, "{len} m");
        let tol = tolerance_m(vn, dt, len);
        let raw = f(e.distance.distance_m);
        assert!(
            raw - len > tol && f(e.distance.lo_m) > len,
            "{len} m: the raw reading {raw} should be late beyond {tol} m"
        );
        let before = e.gamma_after - e.rho;
        let p = T::half() * e.rho / (e.gamma_settled - before);
        let cd = correct_skin_delay(e.round_trip_s, e.t_half_width_s, &v, &loss, T::lit(0.1), p)
            .unwrap();
        let d = f(cd.distance.distance_m);
        assert!(
            (d - len).abs() <= tol,
            "{len} m: corrected {d}, tolerance {tol}"
        );
        assert!(
            f(cd.distance.lo_m) <= len && len <= f(cd.distance.hi_m),
            "{len} m: corrected interval"
        );
    }
}

#[test]
fn long_lossy_cable_needs_the_skin_correction_f64() {
    long_lossy::<f64>(&[100.0, 200.0, 300.0]);
}

#[test]
fn long_lossy_cable_needs_the_skin_correction_f32() {
    long_lossy::<f32>(&[200.0]);
}

/// Many noise seeds on the three-step cable: never a made-up event, every
/// distance inside its interval.
#[test]
fn noise_seeds_never_add_or_lose_events() {
    let vf = 0.66;
    let l50 = Lossless::new(50.0f32, vf as f32).unwrap();
    let l75 = Lossless::new(75.0f32, vf as f32).unwrap();
    let mut c: Cascade<f32, 4> = Cascade::new();
    c.push_line(&l50, 6.0).unwrap();
    c.push_line(&l75, 5.0).unwrap();
    c.push_line(&l50, 4.0).unwrap();
    let r1 = rho(50.0, 75.0);
    let t1 = 1.0 - r1 * r1;
    let wants = [
        want(6.0, EventKind::ImpedanceUp, r1),
        want(11.0, EventKind::ImpedanceDown, -r1 * t1),
        want(15.0, EventKind::OpenEnd, t1 * t1),
    ];
    let dt = 100e-12;
    let v = VelocityRange::from_factor(vf as f32, 0.01).unwrap();
    for seed in 100..120 {
        let x = sim(&c, Load::Open, dt, 400e-12, 2048, 0.01, seed);
        let a = analyse(&x, dt, v, &DetectSettings::default());
        check(&a, &wants, vf * C0, dt, 0.02, &format!("seed {seed}"));
    }
}

/// Layer peeling of a simulated trace (finite 250 ps Gaussian edge, 100 ps
/// samples): 50 Ω source → 75 → 35 → 90 → 50 Ω (matched), 40 cells each
/// (a cell is one sample of round trip). Plateau centres read within 2 %
/// (the edge smears each step over a few cells); the naive Z0(1+Γ)/(1−Γ)
/// reading of the 90 Ω section is off by more than 5 %.
fn peel_simulated<T: Real>() {
    let vf = 0.66;
    let cell_m = vf * C0 * 100e-12 / 2.0;
    let secs = [75.0, 35.0, 90.0];
    let lines: Vec<Lossless<T>> = secs
        .iter()
        .map(|z| Lossless::new(T::lit(*z), T::lit(vf)).unwrap())
        .collect();
    let tail = Lossless::new(T::lit(50.0), T::lit(vf)).unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    for l in &lines {
        c.push_line(l, T::lit(40.0 * cell_m)).unwrap();
    }
    c.push_line(&tail, T::lit(60.0 * cell_m)).unwrap();
    let dt = 100e-12;
    let tr = 250e-12;
    let x = sim(&c, Load::Resistor(T::lit(50.0)), dt, tr, 1024, 0.0, 0);
    let i0 = launch_s(dt) / dt;
    let v = VelocityRange::from_factor(T::lit(vf), T::lit(0.01)).unwrap();
    let su = TraceSetup {
        incident_v: Some(T::one()),
        pre_launch_v: Some(T::zero()),
        time_zero: TimeZero::AtIndex(T::lit(i0)),
        rise_time_s: Some(T::lit(tr)),
        ..TraceSetup::measured(T::lit(dt), T::lit(50.0), v)
    };
    let trace = Trace::new(&x[..], su).unwrap();
    let n = 180;
    let (mut d, mut u, mut z) = (vec![T::zero(); n], vec![T::zero(); n], vec![T::zero(); n]);
    let p = trace.peel(T::one(), &mut d, &mut u, &mut z).unwrap();
    let o = p.first_sample - i0.round() as usize;
    for (k, want) in [(20usize, 75.0), (60, 35.0), (100, 90.0), (150, 50.0)] {
        let got = f(z[k - o]);
        assert!((got / want - 1.0).abs() < 0.02, "cell {k}: {got} vs {want}");
    }
    let gamma = f(trace.gamma_at_level(x[i0.round() as usize + 100]));
    let naive = 50.0 * (1.0 + gamma) / (1.0 - gamma);
    assert!((naive / 90.0 - 1.0).abs() > 0.05, "naive {naive}");
}

#[test]
fn layer_peeling_of_a_simulated_four_section_trace_f64() {
    peel_simulated::<f64>();
}

#[test]
fn layer_peeling_of_a_simulated_four_section_trace_f32() {
    peel_simulated::<f32>();
}

/// 30 m of the 50 Ω coax, open, default filter: the far end's slow skin-effect
/// tail must not become a second "open end" tens of metres later (the
/// analysis promotes the step before such a tail to the open end).
fn slow_far_end<T: Real>() {
    // D = 2.95 mm: a 47.5 Ω cable on the 50 Ω instrument.
    let pe = Dielectric::wideband_debye(T::lit(2.25), T::lit(2e-4), T::lit(1e9)).unwrap();
    let coax = Coax::new(
        T::lit(0.9e-3),
        T::lit(2.95e-3),
        pe,
        T::lit(5.8e7),
        T::lit(0.2e-3),
    )
    .unwrap();
    let v =
        VelocityRange::from_line(&coax, VelocityKind::PhaseAt(T::lit(1e9)), T::lit(0.005)).unwrap();
    let vn = f(v.nominal_m_per_s);
    let mut c: Cascade<T, 2> = Cascade::new();
    c.push_line(&coax, T::lit(30.0)).unwrap();
    let dt = 200e-12;
    for seed in [61, 62, 63] {
        let x = sim(&c, Load::Open, dt, 1e-9, 16384, 0.001, seed);
        let a = analyse(&x, dt, v, &DetectSettings::default());
        let kinds: Vec<EventKind> = a.events.iter().map(|e| e.kind).collect();
        assert_eq!(kinds, [EventKind::OpenEnd], "seed {seed}");
        check_distance(&a.events[0], 30.0, vn, dt, "30 m open");
    }
}

#[test]
fn slow_far_end_is_one_open_end_f64() {
    slow_far_end::<f64>();
}

#[test]
fn slow_far_end_is_one_open_end_f32() {
    slow_far_end::<f32>();
}

/// A lossy RLGC cable (per metre: L 250 nH, C 100 pF at DC with a causal
/// wideband-Debye dielectric εr 2.3, tanδ 5e-4; conductors with 0.02 Ω/m DC
/// and a 2e-5 Ω/(m·√Hz) skin term): 15 m of 50 Ω, 8 m of 40 Ω (L 200 nH,
/// C 125 pF), 8 m of 50 Ω, short. ρ = ∓1/9 at the steps, read within 0.02
/// (loss over the path lowers them a little).
fn lossy_rlgc<T: Real>() {
    use echoline::line::conductor::Conductor;
    use echoline::line::rlgc::Rlgc;
    let diel = || Dielectric::wideband_debye(T::lit(2.3), T::lit(5e-4), T::lit(1e9)).unwrap();
    let cond = || Conductor::generic(T::lit(0.02), T::lit(2e-5)).unwrap();
    let mk = |l: f64, c: f64| {
        Rlgc::builder_from_c(T::lit(l), T::lit(c), diel())
            .conductor(cond())
            .build()
            .unwrap()
    };
    let (l50, l40) = (mk(250e-9, 100e-12), mk(200e-9, 125e-12));
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&l50, T::lit(15.0)).unwrap();
    c.push_line(&l40, T::lit(8.0)).unwrap();
    c.push_line(&l50, T::lit(8.0)).unwrap();
    let v =
        VelocityRange::from_line(&l50, VelocityKind::PhaseAt(T::lit(1e9)), T::lit(0.01)).unwrap();
    let vn = f(v.nominal_m_per_s);
    let dt = 100e-12;
    for (tr, noise, seed) in [
        (400e-12, 0.0, 0),
        (400e-12, 0.003, 71),
        (800e-12, 0.003, 72),
    ] {
        let x = sim(&c, Load::Short, dt, tr, 4096, noise, seed);
        let a = analyse(&x, dt, v, &DetectSettings::default());
        let label = format!("rlgc tr {tr} noise {noise}");
        let found: Vec<&Event<T>> = a.events.iter().collect();
        let kinds: Vec<EventKind> = found.iter().map(|e| e.kind).collect();
        assert_eq!(
            kinds,
            [
                EventKind::ImpedanceDown,
                EventKind::ImpedanceUp,
                EventKind::Short
            ],
            "{label}"
        );
        for (e, d) in found.iter().zip([15.0, 23.0, 31.0]) {
            check_distance(*e, d, vn, dt, &label);
        }
        assert!(
            (f(found[0].rho) + 1.0 / 9.0).abs() < 0.02,
            "{label}: {}",
            f(found[0].rho)
        );
        assert!(
            (f(found[1].rho) - 1.0 / 9.0).abs() < 0.02,
            "{label}: {}",
            f(found[1].rho)
        );
    }
}

#[test]
fn lossy_rlgc_steps_and_short_f64() {
    lossy_rlgc::<f64>();
}

#[test]
fn lossy_rlgc_steps_and_short_f32() {
    lossy_rlgc::<f32>();
}

/// The stated limit: 200 m of the lossy coax, open, read with the default
/// filter (tied to the 1 ns instrument edge). The far end's slow edge gives
/// only a small step over the short filter (|ρ| below `resistive_min_rho`),
/// so it is reported as an impedance-up step whose settled level shows the
/// open (Γ_settled ≈ +1); its distance is still within tolerance. With
/// `filter_samples` near the edge's length it is an open end (see
/// `long_lossy_cable_needs_the_skin_correction_*`).
#[test]
fn very_long_lossy_cable_with_the_default_filter_is_a_stated_limit() {
    let coax = pe_coax::<f64>(0.9e-3);
    let v = VelocityRange::from_line(&coax, VelocityKind::PhaseAt(1e9), 0.005).unwrap();
    let mut c: Cascade<f64, 2> = Cascade::new();
    c.push_line(&coax, 200.0).unwrap();
    let dt = 250e-12;
    let x = sim(&c, Load::Open, dt, 1e-9, 16384, 0.001, 81);
    let a = analyse(&x, dt, v, &DetectSettings::default());
    let kinds: Vec<EventKind> = a.events.iter().map(|e| e.kind).collect();
    assert_eq!(kinds, [EventKind::ImpedanceUp, EventKind::EndOfTrace]);
    let e = &a.events[0];
    assert!(e.rho < 0.1 && e.gamma_settled > 0.9, "{e:?}");
    check_distance(e, 200.0, v.nominal_m_per_s, dt, "200 m, default filter");
}

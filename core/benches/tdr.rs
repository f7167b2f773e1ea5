//! Trace benchmarks in f32 and f64 (issue 3's figures):
//!
//! * `analyse_16384`: noise floor + one-pass detection + classification of a
//!   16,384-sample simulated trace (three steps, an open end, 2 mV noise).
//!   Work memory: none per sample beyond the borrowed trace (O(1): filters, a
//!   256-value ring, the 256-point noise array) plus the event list.
//! * `peel_4096`: layer peeling of 4,096 cells of a matched four-section
//!   trace (O(n²/2)). Work memory: D and U buffers plus the output, 3 values
//!   per sample (12 bytes in f32, 24 in f64).
//! * `simulate_4096`: 4,096 samples of a lossy coax cascade (two sections of
//!   foam-PE coax with a wideband-Debye dielectric, a shunt C, an open end),
//!   FFT length 8,192. Memory: the output (1 value per sample) and the complex
//!   work buffer of 2 entries per sample (8 bytes each in f32, 16 in f64):
//!   20 bytes per sample in f32, 40 in f64.
//!
//! ns per sample = reported time / samples (criterion prints it as
//! elements/s through `Throughput::Elements`).
//! Run: `cargo bench -p echoline --bench tdr -- --warm-up-time 1 --measurement-time 3`.

use criterion::{black_box, criterion_group, criterion_main, Criterion, Throughput};
use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::math::complex::Cx;
use echoline::network::cascade::{Cascade, Element};
use echoline::network::load::{Load, Rlc};
use echoline::tdr::sim::{simulate, Noise, Sampling, Source, Terminated};
use echoline::tdr::{DetectSettings, TimeZero, Trace, TraceSetup};
use echoline::timing::VelocityRange;
use echoline::Real;

const DT_S: f64 = 100e-12;

fn sim<T: Real, const K: usize>(
    c: &Cascade<'_, T, K>,
    load: Load<T>,
    out: &mut [T],
    work: &mut [Cx<T>],
    noise: bool,
) {
    let src = Source::step(T::lit(2.0), T::lit(400e-12), T::lit(50.0), T::lit(3e-9)).unwrap();
    let nz = noise.then(|| Noise {
        rms_v: T::lit(2e-3),
        seed: 9,
    });
    let port = Terminated { cascade: c, load };
    let s = Sampling {
        sample_interval_s: T::lit(DT_S),
    };
    simulate(&port, &src, &s, nz, out, work).unwrap();
}

/// 16,384 samples: 50 Ω 40 m, 75 Ω 30 m, 50 Ω 50 m, open (VF 0.66).
fn analysis_trace<T: Real>() -> Vec<T> {
    let l50 = Lossless::new(T::lit(50.0), T::lit(0.66)).unwrap();
    let l75 = Lossless::new(T::lit(75.0), T::lit(0.66)).unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&l50, T::lit(40.0)).unwrap();
    c.push_line(&l75, T::lit(30.0)).unwrap();
    c.push_line(&l50, T::lit(50.0)).unwrap();
    let n = 16_384;
    let mut out = vec![T::zero(); n];
    let mut work = vec![Cx::new(T::zero(), T::zero()); 8 * n];
    sim(&c, Load::Open, &mut out, &mut work, true);
    out
}

fn bench_analyse<T: Real>(cr: &mut Criterion, name: &str) {
    let x = analysis_trace::<T>();
    let v = VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)).unwrap();
    let mut g = cr.benchmark_group("analyse_16384");
    g.throughput(Throughput::Elements(x.len() as u64));
    g.bench_function(name, |b| {
        b.iter(|| {
            let t = Trace::new(
                black_box(&x[..]),
                TraceSetup::measured(T::lit(DT_S), T::lit(50.0), v),
            )
            .unwrap();
            let a = t.analyse::<16>(&DetectSettings::default()).unwrap();
            black_box(a.events.len())
        })
    });
    g.finish();
}

/// 4,096 cells past the launch: 50 Ω source → 75 → 35 → 90 → 50 Ω matched.
fn bench_peel<T: Real>(cr: &mut Criterion, name: &str) {
    let n = 4096;
    let cell_m = 0.66 * 299_792_458.0 * DT_S / 2.0;
    let zs = [75.0, 35.0, 90.0];
    let lines: Vec<Lossless<T>> = zs
        .iter()
        .map(|z| Lossless::new(T::lit(*z), T::lit(0.66)).unwrap())
        .collect();
    let tail = Lossless::new(T::lit(50.0), T::lit(0.66)).unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    for l in &lines {
        c.push_line(l, T::lit(500.0 * cell_m)).unwrap();
    }
    c.push_line(&tail, T::lit(3000.0 * cell_m)).unwrap();
    let len = 4096 + 64;
    let mut x = vec![T::zero(); len];
    let mut work = vec![Cx::new(T::zero(), T::zero()); 4 * len.next_power_of_two()];
    sim(&c, Load::Resistor(T::lit(50.0)), &mut x, &mut work, false);
    let v = VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)).unwrap();
    let su = TraceSetup {
        incident_v: Some(T::one()),
        pre_launch_v: Some(T::zero()),
        time_zero: TimeZero::AtIndex(T::lit(30.0)),
        rise_time_s: Some(T::lit(400e-12)),
        ..TraceSetup::measured(T::lit(DT_S), T::lit(50.0), v)
    };
    let trace = Trace::new(&x[..], su).unwrap();
    let (mut d, mut u, mut z) = (vec![T::zero(); n], vec![T::zero(); n], vec![T::zero(); n]);
    let mut g = cr.benchmark_group("peel_4096");
    g.throughput(Throughput::Elements(n as u64));
    g.bench_function(name, |b| {
        b.iter(|| {
            let p = trace.peel(T::one(), &mut d, &mut u, &mut z).unwrap();
            assert_eq!(p.layers, n);
            black_box(p.layers)
        })
    });
    g.finish();
}

/// 4,096 samples of a lossy foam-PE coax run with a shunt C, open end.
fn bench_simulate<T: Real>(cr: &mut Criterion, name: &str) {
    let foam = Dielectric::wideband_debye(T::lit(1.45), T::lit(1e-4), T::lit(1e9)).unwrap();
    let coax = Coax::new(
        T::lit(2.8e-3),
        T::lit(7.64e-3),
        foam,
        T::lit(5.8e7),
        T::lit(0.3e-3),
    )
    .unwrap();
    let mut c: Cascade<T, 4> = Cascade::new();
    c.push_line(&coax, T::lit(25.0)).unwrap();
    c.push(Element::Shunt(Load::Series(Rlc::new(
        None,
        None,
        Some(T::lit(10e-12)),
    ))))
    .unwrap();
    c.push_line(&coax, T::lit(20.0)).unwrap();
    let n = 4096;
    let mut out = vec![T::zero(); n];
    let mut work = vec![Cx::new(T::zero(), T::zero()); 2 * n];
    let mut g = cr.benchmark_group("simulate_4096");
    g.throughput(Throughput::Elements(n as u64));
    g.bench_function(name, |b| {
        b.iter(|| {
            sim(&c, Load::Open, &mut out, &mut work, true);
            black_box(out[n - 1])
        })
    });
    g.finish();
}

fn all(cr: &mut Criterion) {
    bench_analyse::<f32>(cr, "f32");
    bench_analyse::<f64>(cr, "f64");
    bench_peel::<f32>(cr, "f32");
    bench_peel::<f64>(cr, "f64");
    bench_simulate::<f32>(cr, "f32");
    bench_simulate::<f64>(cr, "f64");
}

criterion_group!(benches, all);
criterion_main!(benches);

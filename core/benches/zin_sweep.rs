//! Input impedance over 10,000 frequencies through a 3-section lossy cascade
//! ended by a series R-L-C load, in f32 and f64. The time includes the line-model
//! evaluation at every frequency. ns per point = reported time / 10,000.
//!
//! * `zin_sweep/f64`, `zin_sweep/f32`: three [`Rlgc::constant`] sections
//!   (Z = R + jωL, Y = G + jωC): the problem of `tests/scripts/bench_numpy.py`
//!   (and `bench_numpy_zin.py`), which time the same formulas vectorised in numpy;
//! * `zin_sweep/coax_f64`, `zin_sweep/coax_f32`: three [`Coax`] sections
//!   (skin effect in both conductors, constant-tanδ dielectric; invented cables).
//!
//! Run: `cargo bench -p echoline --bench zin_sweep`. `tests/scripts/bench_numpy.py`
//! prints the numpy/Rust ratio from the same run.

use criterion::{black_box, criterion_group, criterion_main, Criterion, Throughput};
use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::line::rlgc::Rlgc;
use echoline::network::{Cascade, Load, Rlc};
use echoline::{Impedance, LineModel, Real};

/// Must match tests/scripts/bench_numpy.py and core/examples/perf_probe.rs.
pub const POINTS: usize = 10_000;
const F_LO_HZ: f64 = 1e6;
const F_HI_HZ: f64 = 1e9;
/// (R Ω/m, L H/m, G S/m, C F/m, length m)
const SECTIONS: [(f64, f64, f64, f64, f64); 3] = [
    (0.5, 250e-9, 1e-5, 100e-12, 2.0),
    (1.2, 370e-9, 2e-5, 66e-12, 5.0),
    (0.8, 180e-9, 5e-6, 120e-12, 3.0),
];
/// Invented coax sections: (inner d m, outer D m, εr, tanδ, length m), copper
/// conductors, 0.2 mm shield wall.
const COAX: [(f64, f64, f64, f64, f64); 3] = [
    (0.9e-3, 2.95e-3, 2.25, 2e-4, 2.0),
    (0.5e-3, 2.3e-3, 1.5, 1e-4, 5.0),
    (1.1e-3, 3.6e-3, 2.25, 3e-4, 3.0),
];
/// Load: series R, L, C.
const LOAD: (f64, f64, f64) = (100.0, 10e-9, 5e-12);

fn sweep<T: Real>(c: &mut Criterion, name: &str, lines: &[(&dyn LineModel<T>, T)]) {
    let mut cascade: Cascade<'_, T, 3> = Cascade::new();
    for (m, l) in lines {
        cascade.push_line(*m, *l).expect("capacity 3");
    }
    let load = Load::Series(Rlc::new(
        Some(T::lit(LOAD.0)),
        Some(T::lit(LOAD.1)),
        Some(T::lit(LOAD.2)),
    ));
    let freqs: Vec<T> = (0..POINTS)
        .map(|i| {
            let (lo, hi) = (T::lit(F_LO_HZ), T::lit(F_HI_HZ));
            lo + (hi - lo) * T::from_usize(i) / T::from_usize(POINTS - 1)
        })
        .collect();
    let mut out = vec![Impedance::<T>::Open; POINTS];
    let mut group = c.benchmark_group("zin_sweep");
    group.throughput(Throughput::Elements(POINTS as u64));
    group.bench_function(name, |b| {
        b.iter(|| {
            cascade
                .input_impedance_sweep(black_box(&freqs), black_box(&load), black_box(&mut out))
                .expect("valid sweep");
            black_box(&out);
        })
    });
    group.finish();
}

fn run<T: Real>(c: &mut Criterion, name: &str, coax_name: &str) {
    let models: Vec<Rlgc<T>> = SECTIONS
        .iter()
        .map(|s| {
            Rlgc::constant(T::lit(s.0), T::lit(s.1), T::lit(s.2), T::lit(s.3)).expect("valid line")
        })
        .collect();
    let lines: Vec<(&dyn LineModel<T>, T)> = models
        .iter()
        .zip(SECTIONS.iter())
        .map(|(m, s)| (m as &dyn LineModel<T>, T::lit(s.4)))
        .collect();
    sweep(c, name, &lines);
    let cables: Vec<Coax<T>> = COAX
        .iter()
        .map(|s| {
            let d = Dielectric::constant(T::lit(s.2), T::lit(s.3)).expect("valid dielectric");
            Coax::new(T::lit(s.0), T::lit(s.1), d, T::lit(5.8e7), T::lit(0.2e-3))
                .expect("valid coax")
        })
        .collect();
    let lines: Vec<(&dyn LineModel<T>, T)> = cables
        .iter()
        .zip(COAX.iter())
        .map(|(m, s)| (m as &dyn LineModel<T>, T::lit(s.4)))
        .collect();
    sweep(c, coax_name, &lines);
}

fn benches(c: &mut Criterion) {
    run::<f64>(c, "f64", "coax_f64");
    run::<f32>(c, "f32", "coax_f32");
}

criterion_group!(zin, benches);
criterion_main!(zin);

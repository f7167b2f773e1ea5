//! Cost of the line models: each evaluated at 10 000 log-spaced frequencies
//! (1 kHz to just below its first cutoff), with loss and dispersion, in f64 and
//! f32; and one synthesis of a dimension. Run with
//! `cargo bench -p echoline --bench line_models`; criterion reports the time per
//! batch of 10 000 points (divide by 10 000 for ns per point).

use criterion::{black_box, criterion_group, criterion_main, Criterion, Throughput};
use echoline::line::coax::Coax;
use echoline::line::conductor::Metal;
use echoline::line::cpw::{Cpw, Substrate};
use echoline::line::datasheet::DatasheetCable;
use echoline::line::dielectric::Dielectric;
use echoline::line::microstrip::Microstrip;
use echoline::line::stripline::Stripline;
use echoline::line::synth;
use echoline::line::two_wire::TwoWire;
use echoline::line::waveguide::Waveguide;
use echoline::line::LineModel;
use echoline::Real;

const N: usize = 10_000;

fn grid<T: Real>(lo: f64, hi: f64) -> Vec<T> {
    (0..N)
        .map(|k| T::lit(lo * (hi / lo).powf(k as f64 / (N - 1) as f64)))
        .collect()
}

/// (name, model, lowest and highest frequency of the sweep in Hz).
type Case<T> = (&'static str, Box<dyn LineModel<T>>, f64, f64);

fn models<T: Real>() -> Vec<Case<T>> {
    let l = T::lit;
    let cu = Some(Metal::copper());
    let fr4 = Dielectric::constant(l(4.4), l(0.02)).unwrap();
    vec![
        (
            "microstrip",
            Box::new(
                Microstrip::new(l(3e-3), l(1.6e-3), l(35e-6), fr4, cu)
                    .unwrap()
                    .with_roughness(l(1e-6))
                    .unwrap(),
            ) as Box<dyn LineModel<T>>,
            1e3,
            20e9,
        ),
        (
            "microstrip_debye",
            Box::new(
                Microstrip::new(
                    l(3e-3),
                    l(1.6e-3),
                    l(35e-6),
                    Dielectric::wideband_debye(l(4.4), l(0.02), l(1e9)).unwrap(),
                    cu,
                )
                .unwrap(),
            ),
            1e3,
            20e9,
        ),
        (
            "stripline",
            Box::new(Stripline::new(l(0.8e-3), l(1e-3), l(17e-6), fr4, cu).unwrap()),
            1e3,
            40e9,
        ),
        (
            "cpw_backed",
            Box::new(
                Cpw::new(
                    l(300e-6),
                    l(150e-6),
                    l(17e-6),
                    Substrate::ConductorBacked {
                        height_m: l(1.6e-3),
                    },
                    fr4,
                    cu,
                )
                .unwrap(),
            ),
            1e3,
            20e9,
        ),
        (
            "twisted_pair",
            Box::new(
                TwoWire::twisted_pair(
                    l(0.5e-3),
                    l(0.2e-3),
                    Dielectric::constant(l(2.3), l(3e-4)).unwrap(),
                    l(40.0),
                    cu,
                )
                .unwrap(),
            ),
            1e3,
            1e9,
        ),
        (
            "coax",
            Box::new(
                Coax::new(
                    l(0.9e-3),
                    l(2.95e-3),
                    Dielectric::constant(l(2.25), l(2e-4)).unwrap(),
                    l(5.8e7),
                    l(0.2e-3),
                )
                .unwrap(),
            ),
            1e3,
            30e9,
        ),
        (
            "datasheet",
            Box::new(
                DatasheetCable::builder(l(50.0), l(0.66))
                    .attenuation_db_per_100m(l(100e6), l(16.0))
                    .attenuation_db_per_100m(l(1e9), l(52.0))
                    .dc_resistance_ohm_per_m(l(0.04))
                    .build()
                    .unwrap(),
            ),
            1e3,
            10e9,
        ),
        (
            "waveguide",
            Box::new(Waveguide::new(l(22.86e-3), l(10.16e-3), Dielectric::vacuum(), cu).unwrap()),
            7e9,
            13e9,
        ),
    ]
}

fn bench_models<T: Real>(c: &mut Criterion, prec: &str) {
    let mut g = c.benchmark_group(format!("line_models_{prec}"));
    g.throughput(Throughput::Elements(N as u64));
    for (name, m, lo, hi) in models::<T>() {
        let freqs = grid::<T>(lo, hi);
        g.bench_function(name, |b| {
            b.iter(|| {
                let mut acc = T::zero();
                for &f in &freqs {
                    let p = m.at(black_box(f)).unwrap();
                    acc = acc + p.gamma_per_m.re;
                }
                black_box(acc)
            })
        });
    }
    g.finish();
}

fn bench_synth(c: &mut Criterion) {
    let fr4 = Dielectric::constant(4.4, 0.0).unwrap();
    let mut g = c.benchmark_group("synth_f64");
    g.bench_function("microstrip_width", |b| {
        b.iter(|| synth::microstrip_width_m(black_box(50.0), 5e9, 1.6e-3, 35e-6, fr4).unwrap())
    });
    g.bench_function("stripline_width", |b| {
        b.iter(|| synth::stripline_width_m(black_box(50.0), 1e9, 1e-3, 17e-6, fr4).unwrap())
    });
    g.bench_function("cpw_slot", |b| {
        b.iter(|| {
            synth::cpw_slot_width_m(
                black_box(50.0),
                1e9,
                300e-6,
                Substrate::Finite { height_m: 1.6e-3 },
                fr4,
            )
            .unwrap()
        })
    });
    g.bench_function("twisted_pair_insulation", |b| {
        b.iter(|| {
            synth::twisted_pair_insulation_m(black_box(100.0), 1e6, 0.5e-3, fr4, 40.0).unwrap()
        })
    });
    g.finish();
}

fn all(c: &mut Criterion) {
    bench_models::<f64>(c, "f64");
    bench_models::<f32>(c, "f32");
    bench_synth(c);
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(20).warm_up_time(std::time::Duration::from_millis(300)).measurement_time(std::time::Duration::from_secs(1));
    targets = all
}
criterion_main!(benches);

//! Small release workloads for instruction counting (`tests/scripts/callgrind.sh`)
//! and for wall-clock comparison with numpy (`tests/scripts/bench_numpy.py`).
//!
//! Usage: `cargo run --release -p echoline --example perf_probe -- WORKLOAD SIZE [REPEATS]`
//!
//! Workloads (SIZE is the number of points, samples or cells):
//! * `zin64`, `zin32`: input impedance through the 3-section constant-RLGC
//!   cascade of `core/benches/zin_sweep.rs` (same sections, same load);
//! * `zincoax64`, `zincoax32`: the same through three coax sections
//!   (skin effect, lossy dielectric);
//! * `detect64`, `detect32`: event detection (`Trace::analyse_into`: noise floor,
//!   matched filter, lobes, levels) on a synthetic step trace of SIZE samples
//!   (the trace is validated once, outside the timed part);
//! * `peel64`, `peel32`: layer peeling of an impulse reflection of SIZE cells;
//! * `fft64`, `fft32`: forward complex FFT of SIZE points (a power of two);
//! * `ms64`, `ms32`, `msdebye64`, `msdebye32`: `Microstrip::at` at SIZE
//!   log-spaced points from 1 kHz to 20 GHz, the two microstrips of
//!   `core/benches/line_models.rs` (FR-4 constant, and wideband Debye).
//!
//! With REPEATS > 0 the workload is repeated that many times and the best time
//! per repetition is printed as `ns_per_item <value>` (per point, sample, or
//! FFT; layer peeling per cell), for the numpy comparison. With REPEATS = 0
//! (the default) it runs once untimed. A checksum of the result is printed
//! after the runs (outside the repeated part). Set-up (grids, traces, tables)
//! is outside the repeated part too, so counting instructions at REPEATS = 1
//! and 3 isolates the workload (what `tests/scripts/callgrind.sh` does).

use std::hint::black_box;
use std::time::Instant;

use echoline::line::coax::Coax;
use echoline::line::conductor::Metal;
use echoline::line::dielectric::Dielectric;
use echoline::line::microstrip::Microstrip;
use echoline::line::rlgc::Rlgc;
use echoline::line::LineModel;
use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::network::{Cascade, Load, Rlc};
use echoline::tdr::{peel_impulse, Analysis, DetectSettings, Trace, TraceSetup};
use echoline::timing::VelocityRange;
use echoline::{Impedance, Real};

/// Frequency grid and sections: must match core/benches/zin_sweep.rs and
/// tests/scripts/bench_numpy.py.
const F_LO_HZ: f64 = 1e6;
const F_HI_HZ: f64 = 1e9;
/// (R Ω/m, L H/m, G S/m, C F/m, length m)
const SECTIONS: [(f64, f64, f64, f64, f64); 3] = [
    (0.5, 250e-9, 1e-5, 100e-12, 2.0),
    (1.2, 370e-9, 2e-5, 66e-12, 5.0),
    (0.8, 180e-9, 5e-6, 120e-12, 3.0),
];
/// Load: series R, L, C.
const LOAD: (f64, f64, f64) = (100.0, 10e-9, 5e-12);

fn freq_grid<T: Real>(n: usize) -> Vec<T> {
    let (lo, hi) = (T::lit(F_LO_HZ), T::lit(F_HI_HZ));
    let last = T::from_usize(n.max(2) - 1);
    (0..n)
        .map(|i| lo + (hi - lo) * T::from_usize(i) / last)
        .collect()
}

fn load<T: Real>() -> Load<T> {
    Load::Series(Rlc::new(
        Some(T::lit(LOAD.0)),
        Some(T::lit(LOAD.1)),
        Some(T::lit(LOAD.2)),
    ))
}

/// Runs `f` `repeats` times (at least once) and returns the best time per
/// repetition in ns per item (`None` when `repeats` is 0: a single untimed run).
fn time<F: FnMut()>(mut f: F, items: usize, repeats: usize) -> Option<f64> {
    if repeats == 0 {
        f();
        return None;
    }
    let mut best = f64::INFINITY;
    for _ in 0..repeats {
        let t = Instant::now();
        f();
        best = best.min(t.elapsed().as_secs_f64());
    }
    Some(best * 1e9 / items as f64)
}

fn zin_rlgc<T: Real>(n: usize, repeats: usize) -> (f64, Option<f64>) {
    let models: Vec<Rlgc<T>> = SECTIONS
        .iter()
        .map(|s| Rlgc::constant(T::lit(s.0), T::lit(s.1), T::lit(s.2), T::lit(s.3)).unwrap())
        .collect();
    let mut cascade: Cascade<'_, T, 3> = Cascade::new();
    for (m, s) in models.iter().zip(SECTIONS.iter()) {
        cascade.push_line(m, T::lit(s.4)).unwrap();
    }
    zin_run(&cascade, n, repeats)
}

fn zin_coax<T: Real>(n: usize, repeats: usize) -> (f64, Option<f64>) {
    // Invented cables: (inner d m, outer D m, εr, tanδ, length m).
    let cables = [
        (0.9e-3, 2.95e-3, 2.25, 2e-4, 2.0),
        (0.5e-3, 2.3e-3, 1.5, 1e-4, 5.0),
        (1.1e-3, 3.6e-3, 2.25, 3e-4, 3.0),
    ];
    let models: Vec<Coax<T>> = cables
        .iter()
        .map(|c| {
            let d = Dielectric::constant(T::lit(c.2), T::lit(c.3)).unwrap();
            Coax::new(T::lit(c.0), T::lit(c.1), d, T::lit(5.8e7), T::lit(0.2e-3)).unwrap()
        })
        .collect();
    let mut cascade: Cascade<'_, T, 3> = Cascade::new();
    for (m, c) in models.iter().zip(cables.iter()) {
        cascade.push_line(m, T::lit(c.4)).unwrap();
    }
    zin_run(&cascade, n, repeats)
}

fn zin_run<T: Real>(cascade: &Cascade<'_, T, 3>, n: usize, repeats: usize) -> (f64, Option<f64>) {
    let freqs = freq_grid::<T>(n);
    let ld = load::<T>();
    let mut out = vec![Impedance::<T>::Open; n];
    let ns = time(
        || {
            cascade
                .input_impedance_sweep(black_box(&freqs), black_box(&ld), black_box(&mut out))
                .unwrap();
            black_box(&mut out);
        },
        n,
        repeats,
    );
    let sum = out
        .iter()
        .map(|z| z.finite().map_or(0.0, |z| z.re.to_f64_lossless()))
        .sum();
    (sum, ns)
}

/// `Microstrip::at` over a log grid 1 kHz–20 GHz (models as in
/// core/benches/line_models.rs).
fn microstrip<T: Real>(n: usize, repeats: usize, debye: bool) -> (f64, Option<f64>) {
    let l = T::lit;
    let d = if debye {
        Dielectric::wideband_debye(l(4.4), l(0.02), l(1e9)).unwrap()
    } else {
        Dielectric::constant(l(4.4), l(0.02)).unwrap()
    };
    let m = Microstrip::new(l(3e-3), l(1.6e-3), l(35e-6), d, Some(Metal::copper())).unwrap();
    let m = if debye {
        m
    } else {
        m.with_roughness(l(1e-6)).unwrap()
    };
    let last = (n.max(2) - 1) as f64;
    let freqs: Vec<T> = (0..n)
        .map(|k| l(1e3 * (20e9f64 / 1e3).powf(k as f64 / last)))
        .collect();
    let mut acc = 0.0;
    let ns = time(
        || {
            let mut s = T::zero();
            for &f in &freqs {
                s = s + m.at(black_box(f)).unwrap().gamma_per_m.re;
            }
            acc = black_box(s).to_f64_lossless();
        },
        n,
        repeats,
    );
    (acc, ns)
}

/// Synthetic step trace: 50 Ω launch, a 75 Ω section from 30 % to 60 % of the
/// trace, an open end at 85 %, raised-cosine edges of 4 samples, a small
/// deterministic dither (invented data, for timing only).
pub fn synthetic_trace(n: usize) -> Vec<f64> {
    let edge = |i: usize, at: usize| -> f64 {
        let x = (i as f64 - at as f64) / 4.0;
        if x <= -0.5 {
            0.0
        } else if x >= 0.5 {
            1.0
        } else {
            0.5 - 0.5 * (std::f64::consts::PI * (x + 0.5)).cos()
        }
    };
    let mut seed: u32 = 12345;
    (0..n)
        .map(|i| {
            seed = seed.wrapping_mul(1_664_525).wrapping_add(1_013_904_223);
            let dither = ((seed >> 8) as f64 / (1u32 << 24) as f64 - 0.5) * 2e-3;
            let launch = edge(i, n / 20);
            let up = 0.2 * edge(i, n * 3 / 10);
            let down = -0.2 * edge(i, n * 6 / 10);
            let open = 0.8 * edge(i, n * 85 / 100);
            0.5 * launch * (1.0 + up + down + open) + dither
        })
        .collect()
}

fn detect<T: Real>(n: usize, repeats: usize) -> (f64, Option<f64>) {
    let v: Vec<T> = synthetic_trace(n).into_iter().map(T::lit).collect();
    let velocity = VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)).unwrap();
    let setup = TraceSetup::measured(T::lit(1e-10), T::lit(50.0), velocity);
    let settings = DetectSettings {
        filter_samples: Some(8),
        ..DetectSettings::default()
    };
    let mut found: Box<Analysis<T, 32>> = Box::new(Analysis::empty());
    let trace = Trace::new(&v[..], setup).unwrap();
    let ns = time(
        || {
            black_box(&trace)
                .analyse_into(&settings, &mut found)
                .unwrap();
            black_box(&mut found);
        },
        n,
        repeats,
    );
    (found.events.len() as f64, ns)
}

fn peel<T: Real>(n: usize, repeats: usize) -> (f64, Option<f64>) {
    // Impulse reflection of a few small steps (invented): r[k] = ±0.05 at four cells.
    let mut r = vec![T::zero(); n];
    for (k, s) in [
        (n / 8, 0.05),
        (n / 4, -0.05),
        (n / 2, 0.03),
        (3 * n / 4, -0.02),
    ] {
        if let Some(x) = r.get_mut(k) {
            *x = T::lit(s);
        }
    }
    let mut d = vec![T::zero(); n];
    let mut u = vec![T::zero(); n];
    let mut z = vec![T::zero(); n];
    let mut layers = 0;
    let ns = time(
        || {
            u.copy_from_slice(&r);
            let p =
                peel_impulse(T::lit(50.0), T::one(), &mut d, &mut u, black_box(&mut z)).unwrap();
            layers = p.layers;
        },
        n,
        repeats,
    );
    (
        layers as f64 + z.last().map_or(0.0, |x| x.to_f64_lossless()),
        ns,
    )
}

fn fft<T: Real>(n: usize, repeats: usize) -> (f64, Option<f64>) {
    let mut table = vec![Cx::new(T::zero(), T::zero()); n / 2];
    fill_twiddles(&mut table).unwrap();
    let plan = Fft::new(&table).unwrap();
    let x: Vec<Cx<T>> = (0..n)
        .map(|i| Cx::new(T::from_usize(i % 7), T::from_usize(i % 5)))
        .collect();
    let mut data = x.clone();
    let ns = time(
        || {
            data.copy_from_slice(&x);
            plan.forward(black_box(&mut data)).unwrap();
        },
        1,
        repeats,
    );
    (data.get(1).map_or(0.0, |x| x.re.to_f64_lossless()), ns)
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let usage = "usage: perf_probe WORKLOAD SIZE [REPEATS]";
    let (Some(work), Some(size)) = (args.get(1), args.get(2).and_then(|s| s.parse().ok())) else {
        eprintln!("{usage}");
        std::process::exit(2);
    };
    let repeats = args.get(3).and_then(|s| s.parse().ok()).unwrap_or(0);
    let (sum, ns) = match work.as_str() {
        "zin64" => zin_rlgc::<f64>(size, repeats),
        "zin32" => zin_rlgc::<f32>(size, repeats),
        "zincoax64" => zin_coax::<f64>(size, repeats),
        "zincoax32" => zin_coax::<f32>(size, repeats),
        "detect64" => detect::<f64>(size, repeats),
        "detect32" => detect::<f32>(size, repeats),
        "peel64" => peel::<f64>(size, repeats),
        "peel32" => peel::<f32>(size, repeats),
        "fft64" => fft::<f64>(size, repeats),
        "fft32" => fft::<f32>(size, repeats),
        "ms64" => microstrip::<f64>(size, repeats, false),
        "ms32" => microstrip::<f32>(size, repeats, false),
        "msdebye64" => microstrip::<f64>(size, repeats, true),
        "msdebye32" => microstrip::<f32>(size, repeats, true),
        _ => {
            eprintln!("{usage}");
            std::process::exit(2);
        }
    };
    println!("checksum {sum}");
    if let Some(ns) = ns {
        println!("ns_per_item {ns:.2}");
    }
}

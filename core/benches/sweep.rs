//! Distance-to-fault transform and Touchstone parsing speed.
//!
//! * `sweep_dtf/{f32,f64}`: a 1,601-point sweep (2 MHz steps from 2 MHz)
//!   windowed (Hann), zero-padded and inverse-FFT'd to 4,096 distance points
//!   with the carrier correction ([`band_pass_fft`]); the FFT plan is made once
//!   outside the loop, as firmware would. Target < 2 ms.
//! * `sweep_zoom/f64`: the same sweep onto 4,096 points of a distance window by
//!   the chirp-z path (for comparison).
//! * `sweep_parse/{f32,f64}`: MB/s of the Touchstone reader on a two-port
//!   v1 file of 40,000 points (about 4 MB) generated here. Target ≥ 50 MB/s.
//!
//! Run: `cargo bench -p echoline --bench sweep`. The same transform in numpy:
//! `tests/scripts/bench_numpy_sweep.py` (`--cargo` also runs this bench and
//! prints the ratio).

use std::fmt::Write;

use criterion::{black_box, criterion_group, criterion_main, Criterion, Throughput};
use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::sweep::dtf::{band_pass_fft, band_pass_zoom, zoom_work_len, Config};
use echoline::sweep::touchstone::{Record, Touchstone};
use echoline::timing::VelocityRange;
use echoline::Real;

/// Must match tests/scripts/bench_numpy_sweep.py.
pub const N: usize = 1601;
/// Distance points.
pub const M: usize = 4096;
const DF_HZ: f64 = 2e6;

fn sweep<T: Real>() -> (Vec<T>, Vec<Cx<T>>) {
    let f: Vec<T> = (1..=N).map(|k| T::lit(DF_HZ * k as f64)).collect();
    let v = 0.88 * 299_792_458.0;
    let g = (1..=N)
        .map(|k| {
            let fk = DF_HZ * k as f64;
            let mut z = Cx::new(0.0f64, 0.0);
            for (rho, d) in [(0.15, 12.4), (0.03, 33.0), (0.09, 35.0)] {
                z += Cx::from_polar(rho, -2.0 * std::f64::consts::TAU * fk * d / v);
            }
            Cx::new(T::lit(z.re), T::lit(z.im))
        })
        .collect();
    (f, g)
}

fn dtf<T: Real>(c: &mut Criterion, name: &str) {
    let (f, g) = sweep::<T>();
    let cfg = Config {
        window: Window::Hann,
        velocity: VelocityRange::from_factor(T::lit(0.88), T::zero()).expect("vf"),
    };
    let mut table = vec![Cx::new(T::zero(), T::zero()); M / 2];
    fill_twiddles(&mut table).expect("table");
    let plan = Fft::new(&table).expect("plan");
    let mut out = vec![Cx::new(T::zero(), T::zero()); M];
    let mut group = c.benchmark_group("sweep_dtf");
    group.throughput(Throughput::Elements(M as u64));
    group.bench_function(name, |b| {
        b.iter(|| {
            band_pass_fft(
                black_box(&f),
                black_box(&g),
                &cfg,
                &plan,
                black_box(&mut out),
            )
            .expect("dtf")
        })
    });
    // With a Kaiser window (β = 6): the resolution factor is computed, not tabled.
    let kaiser = Config {
        window: Window::Kaiser { beta: T::lit(6.0) },
        ..cfg
    };
    group.bench_function(format!("{name}_kaiser"), |b| {
        b.iter(|| {
            band_pass_fft(
                black_box(&f),
                black_box(&g),
                &kaiser,
                &plan,
                black_box(&mut out),
            )
            .expect("dtf")
        })
    });
    // The inverse FFT alone, for the share of the transform it takes.
    group.bench_function(format!("{name}_ifft_only"), |b| {
        b.iter(|| plan.inverse(black_box(&mut out)).expect("ifft"))
    });
    group.finish();
    if name == "f64" {
        let mut work = vec![Cx::new(T::zero(), T::zero()); zoom_work_len(N, M).expect("len")];
        let mut group = c.benchmark_group("sweep_zoom");
        group.bench_function(name, |b| {
            b.iter(|| {
                band_pass_zoom(
                    &f,
                    &g,
                    &cfg,
                    T::lit(5.0),
                    T::lit(45.0),
                    black_box(&mut out),
                    &mut work,
                )
                .expect("zoom")
            })
        });
        group.finish();
    }
}

fn big_file() -> String {
    let mut s = String::from("! generated for the benchmark\n# GHz S RI R 50\n");
    for k in 0..40_000u32 {
        let f = 0.001 * f64::from(k + 1);
        let a = (f64::from(k) * 0.37).sin();
        let b = (f64::from(k) * 0.11).cos();
        writeln!(
            s,
            "{f:.6} {a:.9} {b:.9} {:.9} {:.9} {:.9} {:.9} {b:.9} {a:.9}",
            a * 0.5,
            -b,
            -a * 0.25,
            b * 0.75
        )
        .expect("write");
    }
    s
}

fn parse<T: Real>(c: &mut Criterion, name: &str, text: &str) {
    let mut group = c.benchmark_group("sweep_parse");
    group.throughput(Throughput::Bytes(text.len() as u64));
    group.bench_function(name, |b| {
        b.iter(|| {
            let mut r = Touchstone::<T, 2>::new(Some(2));
            let mut acc = T::zero();
            r.read_str(black_box(text), |rec| {
                if let Record::Network(p) = rec {
                    acc = acc + p.data[0][0].re;
                }
                Ok(())
            })
            .expect("parse");
            acc
        })
    });
    group.finish();
}

fn benches(c: &mut Criterion) {
    dtf::<f64>(c, "f64");
    dtf::<f32>(c, "f32");
    let text = big_file();
    parse::<f64>(c, "f64", &text);
    parse::<f32>(c, "f32", &text);
}

criterion_group!(sweep_benches, benches);
criterion_main!(sweep_benches);

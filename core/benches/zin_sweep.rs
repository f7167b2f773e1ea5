//! Input impedance over 10,000 frequencies through a 3-section lossy cascade
//! ended by a series R-L-C load, in f32 and f64. The time includes the line-model
//! evaluation at every frequency. ns per point = reported time / 10,000.
//!
//! Run: `cargo bench -p echoline --bench zin_sweep`. The same problem in numpy:
//! `tests/scripts/bench_numpy_zin.py` (which can also run this bench and print the ratio).

use criterion::{black_box, criterion_group, criterion_main, Criterion, Throughput};
use echoline::line::{LineModel, LinePoint, Warnings};
use echoline::math::complex::Cx;
use echoline::network::{Cascade, Load, Rlc};
use echoline::{error, Impedance, Real, Result};

/// Bench-only line: constant R, L, G, C per metre (Z = R + jωL, Y = G + jωC).
struct ConstRlgc<T> {
    r: T,
    l: T,
    g: T,
    c: T,
}

impl<T: Real> LineModel<T> for ConstRlgc<T> {
    /// γ = √(Z·Y) (principal root, Re γ ≥ 0) and Zc = Z/γ = Z·γ*/|Z·Y|, so the
    /// division by |ZY| runs beside the second square root. For the passive
    /// values here (Z and Y in the first quadrant, |ZY| far from over/underflow)
    /// this is the branch of √Z·√Y and √Z/√Y.
    #[inline]
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let w = T::two_pi() * f;
        let z = Cx::new(self.r, w * self.l);
        let y = Cx::new(self.g, w * self.c);
        let x = z * y;
        let m = (x.re * x.re + x.im * x.im).sqrt(); // |ZY| = |γ|²
        let zero = T::zero();
        let (gamma, zc) = if m == zero {
            (
                Cx::new(zero, zero),
                Impedance::ohms((self.l / self.c).sqrt()),
            )
        } else {
            let inv_m = T::one() / m;
            let t = ((x.re.abs() + m) * T::half()).sqrt();
            let gamma = if x.re >= zero {
                Cx::new(t, x.im / (t + t))
            } else {
                Cx::new(x.im.abs() / (t + t), if x.im < zero { -t } else { t })
            };
            (gamma, Impedance::Finite(z * gamma.conj() * inv_m))
        };
        Ok(LinePoint {
            freq_hz: f,
            z_ohm_per_m: z,
            y_s_per_m: y,
            gamma_per_m: gamma,
            zc_ohm: zc,
            model_loss_split_np_per_m: None,
            warnings: Warnings::NONE,
        })
    }
}

/// Must match tests/scripts/bench_numpy_zin.py.
pub const POINTS: usize = 10_000;
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

fn run<T: Real>(c: &mut Criterion, name: &str) {
    let models: Vec<ConstRlgc<T>> = SECTIONS
        .iter()
        .map(|s| ConstRlgc {
            r: T::lit(s.0),
            l: T::lit(s.1),
            g: T::lit(s.2),
            c: T::lit(s.3),
        })
        .collect();
    let mut cascade: Cascade<'_, T, 3> = Cascade::new();
    for (m, s) in models.iter().zip(SECTIONS.iter()) {
        cascade.push_line(m, T::lit(s.4)).expect("capacity 3");
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
                .expect("valid sweep")
        })
    });
    group.finish();
}

fn benches(c: &mut Criterion) {
    run::<f64>(c, "f64");
    run::<f32>(c, "f32");
}

criterion_group!(zin, benches);
criterion_main!(zin);

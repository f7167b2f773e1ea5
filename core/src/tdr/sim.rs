//! Simulating the trace an instrument would record on a cable.
//!
//! The instrument is a Thévenin source (open-circuit voltage `open_circuit_v`
//! behind `source_impedance_ohm`) driving the cable's input impedance Zin(f); the
//! voltage it samples at its port is
//!
//! V(f) = Vs(f) · H(f),   H(f) = Zin(f) / (Zs + Zin(f)),
//!
//! with Zin(f) from the cascade (line sections with loss and dispersion, lumped
//! discontinuities, the far-end load), so multiple reflections, masking, loss and
//! dispersion are all in it (e.g. Pozar, *Microwave Engineering*, 4th ed., 2012,
//! §2.3–2.5 for the divider and the input impedance). An open at the port
//! (H = 1) is explicit, never NaN.
//!
//! **Source.** A step of 10–90 % rise time t_r with a Gaussian edge (its 10–90 %
//! time is 2·√2·erf⁻¹(0.8)·σ = 2.5631·σ), its 50 % point at `launch_s`; or a
//! pulse of width w (a step minus a step delayed by w). The Gaussian edge is not
//! strictly causal; with `launch_s ≥ 4σ` the part before t = 0 is below 3e-5 of
//! the step (the builder enforces `launch_s ≥ 4σ`).
//!
//! **Time axis.** Sample n is at t_n = n·dt; the incident edge's 50 % point is at
//! `launch_s`, so a reflection from a discontinuity at round-trip delay τ has its
//! 50 % point at `launch_s + τ`.
//!
//! **Evaluation.** The response is split into the part that settles,
//! v(t) = Vs·[H(0)·s(t) + r(t)], s the source waveform, where
//! R(f) = (H(f) − H(0))·S(f) decays to zero once the cable's transients settle,
//! so the inverse FFT of R on M ≥ 2N bins is free of wrap-around when the
//! transients have died down within M·dt (loss and any matched element make them
//! die). The DC bin of R is its exact limit from a one-sided difference. The FFT
//! length M is the caller's buffer length (a power of two, ≥ 2N). A lossless
//! cable with an open or short end behind strong steps rings for long (its
//! multiple reflections decay only by the partial reflections): there M = 2N
//! left a wrap-around step of 0.7 % early in a 2,048-sample trace, and
//! M = 8N removed it (tests/tests/tdr_roundtrip.rs); lossy cables settle
//! within M = 2N.
//!
//! The one-port is evaluated in blocks of 32 frequencies through
//! [`OnePort::input_impedance_block`] (a cascade's block sweep).
//!
//! **Noise.** Optional additive white Gaussian noise of a given RMS, from a
//! seeded generator (xorshift64* with a Box–Muller pair), for tests and demos.
//!
//! Memory: the caller gives the output `&mut [T]` (N samples) and a complex work
//! buffer of M ≥ 2N entries (16 bytes per entry in f64, 8 in f32); nothing else.

use crate::error::{self, Error, Result};
use crate::math::complex::{self, Cx};
use crate::network::{cascade::Cascade, load::Load};
use crate::scalar::Real;
use crate::value::Impedance;

/// Something with an input impedance at a frequency: a cascade ended by its
/// load, or any one-port.
pub trait OnePort<T: Real> {
    /// Input impedance at `freq_hz ≥ 0`.
    fn input_impedance(&self, freq_hz: T) -> Result<Impedance<T>>;

    /// Input impedance at each of `freqs_hz` into `out` (same length). The
    /// default calls [`OnePort::input_impedance`] per frequency; a cascade
    /// overrides it with its block sweep.
    fn input_impedance_block(&self, freqs_hz: &[T], out: &mut [Impedance<T>]) -> Result<()> {
        if freqs_hz.len() != out.len() {
            return Err(Error::LengthMismatch("out"));
        }
        for (f, o) in freqs_hz.iter().zip(out.iter_mut()) {
            *o = self.input_impedance(*f)?;
        }
        Ok(())
    }
}

/// A cascade ended by its load, seen from the instrument.
#[derive(Clone, Copy, Debug)]
pub struct Terminated<'c, 'a, T, const N: usize> {
    /// The cable, input first.
    pub cascade: &'c Cascade<'a, T, N>,
    /// The far-end termination.
    pub load: Load<T>,
}

impl<T: Real, const N: usize> OnePort<T> for Terminated<'_, '_, T, N> {
    fn input_impedance(&self, freq_hz: T) -> Result<Impedance<T>> {
        self.cascade.input_impedance(freq_hz, &self.load)
    }

    fn input_impedance_block(&self, freqs_hz: &[T], out: &mut [Impedance<T>]) -> Result<()> {
        self.cascade
            .input_impedance_sweep(freqs_hz, &self.load, out)
    }
}

/// The waveform the instrument launches.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Shape<T> {
    /// A step.
    Step,
    /// A pulse of the given width (s), measured between the 50 % points.
    Pulse {
        /// Pulse width, s.
        width_s: T,
    },
}

/// The instrument's source.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Source<T> {
    /// Step or pulse.
    pub shape: Shape<T>,
    /// Open-circuit source voltage (EMF), V. Into a matched line the incident
    /// level is half of it.
    pub open_circuit_v: T,
    /// 10–90 % rise time of the edge, s (> 0).
    pub rise_time_s: T,
    /// Source (instrument) impedance, Ω (> 0, real).
    pub source_impedance_ohm: T,
    /// Time of the incident edge's 50 % point, s (≥ 4σ of the edge).
    pub launch_s: T,
}

/// Additive noise for a simulated trace.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Noise<T> {
    /// RMS of the white Gaussian noise, V (≥ 0).
    pub rms_v: T,
    /// Seed of the generator (any value; 0 is remapped).
    pub seed: u64,
}

/// Sampling of the simulated trace.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Sampling<T> {
    /// Sample interval, s (> 0).
    pub sample_interval_s: T,
}

/// 2·√2·erf⁻¹(0.8): the 10–90 % time of a Gaussian edge in units of σ.
const RISE_PER_SIGMA: f64 = 2.563_103_131_0;

impl<T: Real> Source<T> {
    /// A step source with a 50 % point at `launch_s`; validates every field.
    pub fn step(
        open_circuit_v: T,
        rise_time_s: T,
        source_impedance_ohm: T,
        launch_s: T,
    ) -> Result<Self> {
        let s = Source {
            shape: Shape::Step,
            open_circuit_v,
            rise_time_s,
            source_impedance_ohm,
            launch_s,
        };
        s.validate()?;
        Ok(s)
    }

    /// The σ of the Gaussian edge, s.
    pub fn sigma_s(&self) -> T {
        self.rise_time_s / T::lit(RISE_PER_SIGMA)
    }

    /// Checks every field (see the field docs for the ranges).
    pub fn validate(&self) -> Result<()> {
        error::finite(self.open_circuit_v, "open_circuit_v")?;
        let tr = error::positive(self.rise_time_s, "rise_time_s")?;
        error::positive(self.source_impedance_ohm, "source_impedance_ohm")?;
        let launch = error::non_negative(self.launch_s, "launch_s")?;
        if launch < T::lit(4.0) * tr / T::lit(RISE_PER_SIGMA) {
            return Err(Error::OutOfRange("launch_s"));
        }
        if let Shape::Pulse { width_s } = self.shape {
            error::positive(width_s, "width_s")?;
        }
        Ok(())
    }

    /// Spectrum of the unit source waveform s(t) times jω (i.e. of its time
    /// derivative): the Gaussian edge, delayed to the launch, with the pulse's
    /// trailing edge if any.
    fn edge_spectrum(&self, freq_hz: T) -> Cx<T> {
        let sigma = self.sigma_s();
        let w = T::two_pi() * freq_hz;
        let mag = (-(w * sigma) * (w * sigma) * T::half()).exp();
        let delay = complex::phasor_turns(-(freq_hz * self.launch_s));
        let g = Cx::new(mag * delay.re, mag * delay.im);
        match self.shape {
            Shape::Step => g,
            Shape::Pulse { width_s } => {
                let tail = complex::phasor_turns(-(freq_hz * width_s));
                g - g * tail
            }
        }
    }

    /// The unit source waveform s(t) in the time domain (closed form).
    fn waveform(&self, t_s: T) -> T {
        let sigma = self.sigma_s();
        let edge = |t0: T| {
            let x = (t_s - t0) / (sigma * T::SQRT_2());
            T::half() * (T::one() + x.erf())
        };
        match self.shape {
            Shape::Step => edge(self.launch_s),
            Shape::Pulse { width_s } => edge(self.launch_s) - edge(self.launch_s + width_s),
        }
    }
}

/// H(f) = Zin/(Zs + Zin), with an open giving exactly 1.
fn divider<T: Real, P: OnePort<T> + ?Sized>(port: &P, zs: T, freq_hz: T) -> Result<Cx<T>> {
    divider_of(port.input_impedance(freq_hz)?, zs)
}

/// Frequencies evaluated per call of [`OnePort::input_impedance_block`].
const BLOCK: usize = 32;

/// H = Zin/(Zs + Zin) from Zin.
fn divider_of<T: Real>(zin: Impedance<T>, zs: T) -> Result<Cx<T>> {
    match zin {
        Impedance::Open => Ok(Cx::new(T::one(), T::zero())),
        Impedance::Finite(z) => {
            let den = z + Cx::new(zs, T::zero());
            if den.re == T::zero() && den.im == T::zero() {
                return Err(Error::Undefined("input_impedance"));
            }
            Ok(complex::div(z, den))
        }
    }
}

/// Simulates the sampled voltage at the instrument's port.
///
/// * `port`: the cable seen from the instrument (a cascade ended by its load).
/// * `out`: N output samples, t_n = n·`sample_interval_s`.
/// * `work`: complex work buffer; its length M is the FFT length and must be a
///   power of two with M ≥ 2N ([`Error::Capacity`] naming `"work"` otherwise).
///
/// Errors: invalid source or sampling fields (named), a rise time shorter than
/// two samples (`OutOfRange("rise_time_s")`: the edge would alias), and any
/// error of the one-port's evaluation.
pub fn simulate<T: Real, P: OnePort<T> + ?Sized>(
    port: &P,
    source: &Source<T>,
    sampling: &Sampling<T>,
    noise: Option<Noise<T>>,
    out: &mut [T],
    work: &mut [Cx<T>],
) -> Result<()> {
    source.validate()?;
    let dt = error::positive(sampling.sample_interval_s, "sample_interval_s")?;
    let n = out.len();
    if n < 2 {
        return Err(Error::TooShort {
            what: "out",
            needed: 2,
        });
    }
    let m = work.len();
    if m < 2 * n || !m.is_power_of_two() {
        return Err(Error::Capacity {
            what: "work",
            capacity: m,
        });
    }
    if source.rise_time_s < dt + dt {
        return Err(Error::OutOfRange("rise_time_s"));
    }
    let zs = source.source_impedance_ohm;
    let h0 = divider(port, zs, T::zero())?;
    let df = T::one() / (T::from_usize(m) * dt);
    // DC limit of (H(f) − H(0))/(jω): one-sided difference at a tiny frequency.
    let f_eps = df * T::lit(1e-3);
    let h_eps = divider(port, zs, f_eps)?;
    let dc_slope = complex::div(h_eps - h0, Cx::new(T::zero(), T::two_pi() * f_eps));
    let half = m / 2;
    // Bins k = 0..=M/2 of R(f) = (H(f) − H(0))·E(f)/(jω), E the edge spectrum.
    // E(0) = 1 for a step; a pulse has E(0) = 0 and no DC residual.
    let r0 = match source.shape {
        Shape::Step => dc_slope,
        Shape::Pulse { .. } => Cx::new(T::zero(), T::zero()),
    };
    if let Some(slot) = work.get_mut(0) {
        // Continuous-time spectrum → DFT coefficients: divide by dt.
        *slot = Cx::new(r0.re / dt, r0.im / dt);
    }
    // Bins 1..=M/2 in blocks, so that a cascade evaluates its elements across
    // independent frequencies at once.
    let mut k0 = 1;
    while k0 <= half {
        let count = (half + 1 - k0).min(BLOCK);
        let mut freqs = [T::zero(); BLOCK];
        let mut zins = [Impedance::Open; BLOCK];
        for (j, f) in freqs.iter_mut().enumerate().take(count) {
            *f = T::from_usize(k0 + j) * df;
        }
        let fs = freqs.get(..count).unwrap_or(&[]);
        let zs_out = zins.get_mut(..count).unwrap_or(&mut []);
        port.input_impedance_block(fs, zs_out)?;
        let bins = work.get_mut(k0..k0 + count).ok_or(Error::Capacity {
            what: "work",
            capacity: m,
        })?;
        for ((slot, f), zin) in bins.iter_mut().zip(fs).zip(zs_out.iter()) {
            let h = divider_of(*zin, zs)?;
            let e = source.edge_spectrum(*f);
            let r = complex::div((h - h0) * e, Cx::new(T::zero(), T::two_pi() * *f));
            *slot = Cx::new(r.re / dt, r.im / dt);
        }
        k0 += count;
    }
    // Hermitian fill for a real time signal.
    for k in 1..half {
        let v = work.get(k).copied().unwrap_or_default();
        if let Some(slot) = work.get_mut(m - k) {
            *slot = v.conj();
        }
    }
    if let Some(nyq) = work.get_mut(half) {
        nyq.im = T::zero();
    }
    crate::math::fft::ifft(work)?;
    let vs = source.open_circuit_v;
    let mut rng = noise.map(|nz| Gauss::new(nz.seed));
    let rms = noise.map(|nz| nz.rms_v).unwrap_or_else(T::zero);
    error::non_negative(rms, "rms_v")?;
    for (i, (o, w)) in out.iter_mut().zip(work.iter()).enumerate() {
        let t = T::from_usize(i) * dt;
        // ifft scales by 1/M and the bins hold R_k/dt, so this is Σ_k R_k e^{j2πkn/M}·df.
        let settled = h0.re * source.waveform(t);
        let mut v = vs * (settled + w.re);
        if let Some(g) = rng.as_mut() {
            v = v + rms * g.next::<T>();
        }
        *o = v;
    }
    Ok(())
}

/// Deterministic Gaussian generator: xorshift64* and Box–Muller.
struct Gauss {
    state: u64,
    spare: Option<f32>,
}

impl Gauss {
    fn new(seed: u64) -> Self {
        Gauss {
            state: if seed == 0 {
                0x9E37_79B9_7F4A_7C15
            } else {
                seed
            },
            spare: None,
        }
    }
    fn uniform(&mut self) -> f32 {
        let mut x = self.state;
        x ^= x >> 12;
        x ^= x << 25;
        x ^= x >> 27;
        self.state = x;
        let r = x.wrapping_mul(0x2545_F491_4F6C_DD1D);
        // 24 random bits → (0, 1].
        ((r >> 40) as f32 + 1.0) / 16_777_216.0
    }
    fn next<T: Real>(&mut self) -> T {
        if let Some(s) = self.spare.take() {
            return T::from(s).unwrap_or_else(T::zero);
        }
        let u1 = self.uniform();
        let u2 = self.uniform();
        let r = libm::sqrtf(-2.0 * libm::logf(u1));
        let (s, c) = crate::math::special::sin_cos_turns(u2);
        self.spare = Some(r * s);
        T::from(r * c).unwrap_or_else(T::zero)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::lossless::Lossless;
    use crate::line::{LineModel, LinePoint, Warnings};
    use crate::network::cascade::{Cascade, Element};
    use crate::network::load::{Load, Rlc};

    const N: usize = 2048;
    const M: usize = 8192;

    fn run<T: Real, P: OnePort<T>>(port: &P, dt: T, tr: T, launch: T) -> [T; N] {
        let src = Source::step(T::lit(2.0), tr, T::lit(50.0), launch).unwrap();
        let mut out = [T::zero(); N];
        let mut work = [Cx::new(T::zero(), T::zero()); M];
        simulate(
            port,
            &src,
            &Sampling {
                sample_interval_s: dt,
            },
            None,
            &mut out,
            &mut work,
        )
        .unwrap();
        out
    }

    fn idx(t: f64, dt: f64) -> usize {
        (t / dt).round() as usize
    }

    /// A 50 Ω line ended in 50 Ω, driven from 50 Ω: the trace is the incident
    /// step and nothing else (common practice, no single source).
    fn matched_is_flat<T: Real>(tol: f64) {
        let line = Lossless::new(T::lit(50.0), T::lit(0.8)).unwrap();
        let mut c: Cascade<T, 2> = Cascade::new();
        c.push_line(&line, T::lit(10.0)).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Resistor(T::lit(50.0)),
        };
        let dt = 50e-12;
        let v = run(&port, T::lit(dt), T::lit(200e-12), T::lit(2e-9));
        for (i, x) in v.iter().enumerate() {
            let x = x.to_f64_lossless();
            let t = i as f64 * dt;
            if t < 1.5e-9 {
                assert!(x.abs() < tol, "before launch at {i}: {x}");
            } else if t > 2.5e-9 {
                assert!((x - 1.0).abs() < tol, "matched trace not flat at {i}: {x}");
            }
        }
    }

    #[test]
    fn matched_line_gives_a_flat_trace() {
        matched_is_flat::<f64>(1e-6);
        matched_is_flat::<f32>(2e-4);
    }

    /// Open end settles at +1 reflection (V = 2·V_inc), short at −1 (V = 0), at
    /// the round trip 2l/v after the launch (common practice, no single source).
    /// The tolerance is the aliasing of a Gaussian edge of four samples' rise
    /// (its spectrum is e^−12 ≈ 6e-6 at the Nyquist frequency).
    fn open_and_short<T: Real>(tol: f64) {
        let line = Lossless::new(T::lit(50.0), T::lit(0.66)).unwrap();
        let mut c: Cascade<T, 2> = Cascade::new();
        c.push_line(&line, T::lit(6.0)).unwrap();
        let dt = 50e-12;
        let trip = 2.0 * 6.0 / (0.66 * 299_792_458.0);
        for (load, settled) in [(Load::Open, 2.0), (Load::Short, 0.0)] {
            let port = Terminated { cascade: &c, load };
            let v = run(&port, T::lit(dt), T::lit(200e-12), T::lit(2e-9));
            let before = v[idx(2e-9 + trip - 1e-9, dt)].to_f64_lossless();
            assert!(
                (before - 1.0).abs() < tol,
                "{load:?}: incident level {before}"
            );
            let after = v[idx(2e-9 + trip + 2e-9, dt)].to_f64_lossless();
            assert!((after - settled).abs() < tol, "{load:?}: settled {after}");
            // The reflection's 50 % point lies at launch + round trip.
            let mid = v[idx(2e-9 + trip, dt)].to_f64_lossless();
            assert!(
                (mid - (1.0 + settled) / 2.0).abs() < 0.05,
                "{load:?}: 50 % point {mid}"
            );
        }
    }

    #[test]
    fn open_settles_at_plus_one_and_short_at_minus_one() {
        open_and_short::<f64>(2e-5);
        open_and_short::<f32>(5e-4);
    }

    /// Two lossless sections, 50 Ω (τ1) then 75 Ω (τ2), open end, matched
    /// source: the plateaus of the hand-computed lattice (bounce) diagram
    /// (L. V. Bewley, *Traveling Waves on Transmission Systems*, 1933, the lattice
    /// method; the levels below are computed by hand): ρ12 = 0.2, ρ21 = −0.2,
    /// transmission 1.2 into and 0.8 out of the 75 Ω section, so in units of the
    /// EMF the port reads 0.6, then 0.6 + 0.48, then − 0.096, + 0.0192, … → 1.
    #[test]
    fn two_step_line_matches_the_bounce_diagram() {
        let l1 = Lossless::new(50.0f64, 1.0).unwrap();
        let l2 = Lossless::new(75.0f64, 1.0).unwrap();
        let tau1 = 3e-9;
        let tau2 = 4e-9;
        let mut c: Cascade<f64, 4> = Cascade::new();
        c.push_line(&l1, tau1 * 299_792_458.0).unwrap();
        c.push_line(&l2, tau2 * 299_792_458.0).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Open,
        };
        let dt = 25e-12;
        let launch = 1e-9;
        let v = run(&port, dt, 100e-12, launch);
        let level = |t: f64| v[idx(launch + t, dt)] / 2.0; // in units of the EMF (2 V)
        let mut expect = 0.5;
        assert!((level(tau1) - expect).abs() < 1e-6);
        expect = 0.6;
        assert!(
            (level(2.0 * tau1 + tau2) - expect).abs() < 1e-6,
            "{}",
            level(2.0 * tau1 + tau2)
        );
        let mut ret = 0.48;
        for k in 0..4 {
            expect += ret;
            let t = 2.0 * tau1 + (2 * k + 2) as f64 * tau2 + tau2;
            if launch + t < N as f64 * dt {
                assert!(
                    (level(t) - expect).abs() < 1e-6,
                    "bounce {k}: {} vs {expect}",
                    level(t)
                );
            }
            ret *= -0.2;
        }
    }

    /// A line whose propagation is pure skin effect, γ(ω)·l = jωT + a·√(jω), with
    /// a constant real Zc: its step response after the length is
    /// erfc(a / (2√(t − T))) (Wigington & Nahman, "Transient analysis of coaxial
    /// cables considering skin effect", Proc. IRE 45(2):166–174, 1957).
    struct SkinLine {
        a_per_m: f64,
        v: f64,
    }

    impl LineModel<f64> for SkinLine {
        fn at(&self, f: f64) -> Result<LinePoint<f64>> {
            let w = core::f64::consts::TAU * f;
            let root = complex::sqrt(Cx::new(0.0, w));
            let gamma = Cx::new(0.0, w / self.v) + root * self.a_per_m;
            let zc = Cx::new(50.0, 0.0);
            Ok(LinePoint {
                freq_hz: f,
                z_ohm_per_m: gamma * zc,
                y_s_per_m: gamma / zc,
                gamma_per_m: gamma,
                zc_ohm: Impedance::Finite(zc),
                model_loss_split_np_per_m: None,
                warnings: Warnings::NONE,
            })
        }
    }

    #[test]
    fn skin_effect_step_matches_erfc() {
        let len = 20.0;
        let line = SkinLine {
            a_per_m: 2e-6,
            v: 2e8,
        };
        let mut c: Cascade<f64, 2> = Cascade::new();
        c.push_line(&line, len).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Open,
        };
        let dt = 20e-12;
        let launch = 1e-9;
        let v = run(&port, dt, 60e-12, launch);
        // Open end: port = (incident + reflection after 2·len) in units of V_inc = 1.
        let a = 2.0 * len * 2e-6;
        let t_d = 2.0 * len / 2e8;
        let mut worst: f64 = 0.0;
        for (i, vi) in v.iter().enumerate().take(N - 50) {
            let t = i as f64 * dt - launch - t_d;
            if t > 0.5e-9 {
                let want = 1.0 + libm::erfc(a / (2.0 * t.sqrt()));
                worst = worst.max((vi - want).abs());
            }
        }
        assert!(worst < 2e-3, "worst deviation from erfc {worst}");
    }

    /// A shunt C between equal 50 Ω lines: the reflected dip has the area
    /// ∫ρ·V_inc dt = −Z0·C·V_inc/2 (Laplace transform of the step reflection
    /// ρ(t) = −e^(−t/τ), τ = Z0·C/2; H. Johnson & M. Graham, *High-Speed Digital
    /// Design*, 1993, value from memory for the form).
    #[test]
    fn lumped_c_dip_has_the_published_area() {
        let line = Lossless::new(50.0f64, 0.7).unwrap();
        let cap = 3e-12;
        let mut c: Cascade<f64, 4> = Cascade::new();
        c.push_line(&line, 3.0).unwrap();
        c.push(Element::Shunt(Load::Series(Rlc::new(
            None,
            None,
            Some(cap),
        ))))
        .unwrap();
        c.push_line(&line, 3.0).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Resistor(50.0),
        };
        let dt = 20e-12;
        let launch = 1e-9;
        let v = run(&port, dt, 80e-12, launch);
        let area: f64 = v
            .iter()
            .skip(idx(launch + 0.5e-9, dt))
            .map(|x| (x - 1.0) * dt)
            .sum();
        let want = -50.0 * cap * 1.0 / 2.0;
        assert!(
            (area - want).abs() < 0.01 * want.abs(),
            "area {area} vs {want}"
        );
    }

    #[test]
    fn bad_inputs_are_typed_errors() {
        let line = Lossless::new(50.0f64, 0.7).unwrap();
        let mut c: Cascade<f64, 2> = Cascade::new();
        c.push_line(&line, 3.0).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Open,
        };
        let mut out = [0.0f64; 64];
        let mut small = [Cx::new(0.0, 0.0); 100];
        let src = Source::step(2.0, 1e-10, 50.0, 1e-9).unwrap();
        let s = Sampling {
            sample_interval_s: 1e-11,
        };
        assert_eq!(
            simulate(&port, &src, &s, None, &mut out, &mut small),
            Err(Error::Capacity {
                what: "work",
                capacity: 100
            })
        );
        let mut work = [Cx::new(0.0, 0.0); 128];
        let bad = Sampling {
            sample_interval_s: -1.0,
        };
        assert_eq!(
            simulate(&port, &src, &bad, None, &mut out, &mut work),
            Err(Error::NotPositive("sample_interval_s"))
        );
        assert_eq!(
            Source::step(2.0, 0.0, 50.0, 1e-9),
            Err(Error::NotPositive("rise_time_s"))
        );
        assert_eq!(
            Source::step(2.0, 1e-9, 50.0, 0.0),
            Err(Error::OutOfRange("launch_s"))
        );
        assert_eq!(
            Source::step(f64::NAN, 1e-9, 50.0, 1e-8),
            Err(Error::NonFinite("open_circuit_v"))
        );
        let coarse = Sampling {
            sample_interval_s: 1e-10,
        };
        assert_eq!(
            simulate(&port, &src, &coarse, None, &mut out, &mut work),
            Err(Error::OutOfRange("rise_time_s"))
        );
    }

    #[test]
    fn noise_is_seeded_and_has_the_requested_rms() {
        let line = Lossless::new(50.0f64, 0.7).unwrap();
        let mut c: Cascade<f64, 2> = Cascade::new();
        c.push_line(&line, 3.0).unwrap();
        let port = Terminated {
            cascade: &c,
            load: Load::Resistor(50.0),
        };
        let src = Source::step(2.0, 1e-10, 50.0, 1e-9).unwrap();
        let s = Sampling {
            sample_interval_s: 2e-11,
        };
        let mut a = [0.0f64; 1024];
        let mut b = [0.0f64; 1024];
        let mut work = [Cx::new(0.0, 0.0); 2048];
        let nz = Some(Noise {
            rms_v: 0.01,
            seed: 7,
        });
        simulate(&port, &src, &s, nz, &mut a, &mut work).unwrap();
        simulate(&port, &src, &s, nz, &mut b, &mut work).unwrap();
        assert_eq!(a, b);
        let tail = &a[200..];
        let rms =
            (tail.iter().map(|x| (x - 1.0) * (x - 1.0)).sum::<f64>() / tail.len() as f64).sqrt();
        assert!((rms - 0.01).abs() < 0.001, "rms {rms}");
    }
}

//! Dielectric permittivity: constant, or the causal wideband Debye model.
//!
//! **Sign convention.** Time dependence e^(+jωt); the complex relative
//! permittivity is ε(f) = ε′ − jε″ with ε″ ≥ 0 for a lossy (passive) material,
//! and the loss tangent is tanδ = ε″/ε′. A line's shunt admittance is then
//! Y = jωC_vac·ε = ωC_vac·ε″ + jωC_vac·ε′ (C_vac: the capacitance per metre with
//! the dielectric replaced by vacuum), so G = ωC_vac·ε″ ≥ 0.
//!
//! Two models:
//!
//! * [`Dielectric::constant`]: ε′ and tanδ independent of frequency. **Not
//!   causal**: a constant tanδ with a constant ε′ violates the Kramers–Kronig
//!   relations, so the impulse response of a line built on it starts before
//!   t = 0. It is right at the one frequency where the figures were measured and
//!   wrong for a wideband time-domain simulation; line results carry
//!   [`Warnings::NON_CAUSAL_DIELECTRIC`](crate::line::Warnings::NON_CAUSAL_DIELECTRIC)
//!   when tanδ > 0.
//! * [`WidebandDebye`] (Djordjević, Biljić, Likar-Smiljanić & Sarkar, "Wideband
//!   frequency-domain characterization of FR-4 and time-domain causality",
//!   IEEE Trans. EMC 43(4):662–667, 2001, their eq. for the wideband Debye model):
//!
//!   ε(ω) = ε∞ + Δε·ln[(ω2 + jω)/(ω1 + jω)] / ln(ω2/ω1),
//!
//!   a continuous distribution of Debye poles between ω1 and ω2. It is causal;
//!   between f1 and f2 its tanδ is nearly flat and ε′ falls by about
//!   (2/π)·ε″·ln 10 per decade. It is fitted from ε′ and tanδ at one frequency.
//!   Defaults: f1 = 1 kHz, f2 = 1 THz ([`DEFAULT_F1_HZ`], [`DEFAULT_F2_HZ`]);
//!   both can be set. At f = 0 it gives the exact real static value ε∞ + Δε.
//!
//! An optional DC conductivity σ adds −jσ/(ωε0) to ε. It is infinite at DC as a
//! permittivity, so the line models take it instead as a conductance
//! G_dc = σ·C_vac/ε0 (the same admittance, finite at DC); [`Dielectric::at`]
//! returns the polarisation part only and [`Dielectric::conductivity_s_per_m`]
//! gives σ.
//!
//! Evaluation of the logarithm: with b = f/f1 and r = f1/f2 (a constant),
//! ln[(ω2 + jω)/(ω1 + jω)] = ln(ω2/ω1) + ½·ln[(1 + r²b²)/(1 + b²)]
//! − j·atan[b(1 − r)/(1 + r·b²)], written so that nothing overflows for any
//! finite f (b ≥ 10⁹ is rewritten in 1/b) and one `ln`, one `atan` and one or
//! two divisions are needed per frequency.

use crate::error::{self, Error, Result};
use crate::math::complex::Cx;
use crate::scalar::Real;

/// Default lower corner of the wideband Debye model, Hz (1 kHz).
pub const DEFAULT_F1_HZ: f64 = 1e3;
/// Default upper corner of the wideband Debye model, Hz (1 THz).
pub const DEFAULT_F2_HZ: f64 = 1e12;
/// Largest allowed ratio f2/f1 (keeps (f1/f2)² a normal number in `f32`).
pub const MAX_BAND_RATIO: f64 = 1e18;

/// Checks εr ≥ 1 (finite) under the name `eps_r`.
fn check_eps_r<T: Real>(eps_r: T) -> Result<T> {
    let e = error::finite(eps_r, "eps_r")?;
    if e < T::one() {
        return Err(Error::OutOfRange("eps_r"));
    }
    Ok(e)
}

/// Checks 0 ≤ tanδ < 1 under the name `tan_delta`.
fn check_tan_delta<T: Real>(tan_delta: T) -> Result<T> {
    let t = error::non_negative(tan_delta, "tan_delta")?;
    if t >= T::one() {
        return Err(Error::OutOfRange("tan_delta"));
    }
    Ok(t)
}

/// The causal wideband Debye (Djordjević–Sarkar) permittivity.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WidebandDebye<T> {
    eps_inf: T,
    delta_eps: T,
    f1_hz: T,
    f2_hz: T,
    // Precomputed: 1/f1, r = f1/f2, 1 − r, 1 − r², Δε/ln(f2/f1).
    inv_f1: T,
    r: T,
    one_minus_r: T,
    one_minus_r2: T,
    k: T,
}

impl<T: Real> WidebandDebye<T> {
    /// From the model parameters directly: ε∞ ≥ 1 (`eps_inf`), Δε ≥ 0
    /// (`delta_eps`), 0 < f1 < f2 with f2/f1 ≤ [`MAX_BAND_RATIO`].
    pub fn new(eps_inf: T, delta_eps: T, f1_hz: T, f2_hz: T) -> Result<Self> {
        let eps_inf = error::finite(eps_inf, "eps_inf")?;
        if eps_inf < T::one() {
            return Err(Error::OutOfRange("eps_inf"));
        }
        let delta_eps = error::non_negative(delta_eps, "delta_eps")?;
        let f1 = error::positive(f1_hz, "f1_hz")?;
        let f2 = error::positive(f2_hz, "f2_hz")?;
        if f2 <= f1 || f2 / f1 > T::lit(MAX_BAND_RATIO) {
            return Err(Error::OutOfRange("f2_hz"));
        }
        let r = f1 / f2;
        let log_band = (f2 / f1).ln();
        Ok(WidebandDebye {
            eps_inf,
            delta_eps,
            f1_hz: f1,
            f2_hz: f2,
            inv_f1: T::one() / f1,
            r,
            one_minus_r: T::one() - r,
            one_minus_r2: T::one() - r * r,
            k: delta_eps / log_band,
        })
    }

    /// Fits the model to ε′ = `eps_r` and `tan_delta` at `fit_freq_hz`, with the
    /// default corners f1 = 1 kHz and f2 = 1 THz.
    pub fn fit(eps_r: T, tan_delta: T, fit_freq_hz: T) -> Result<Self> {
        Self::fit_with_band(
            eps_r,
            tan_delta,
            fit_freq_hz,
            T::lit(DEFAULT_F1_HZ),
            T::lit(DEFAULT_F2_HZ),
        )
    }

    /// Fits the model to ε′ = `eps_r` (≥ 1) and `tan_delta` (0 ≤ tanδ < 1) at
    /// `fit_freq_hz`, with corners `f1_hz` < `fit_freq_hz` < `f2_hz`.
    ///
    /// With L = ln(f2/f1) and the bracket B(f) = ln[(ω2 + jω)/(ω1 + jω)] = B′ − jB″:
    /// Δε = L·ε″/B″(f_fit), ε∞ = ε′ − Δε·B′(f_fit)/L. A large tanδ at a small εr
    /// can need ε∞ < 1, which is not physical: that fit is refused with
    /// [`Error::Unreachable`]`("tan_delta")`.
    pub fn fit_with_band(
        eps_r: T,
        tan_delta: T,
        fit_freq_hz: T,
        f1_hz: T,
        f2_hz: T,
    ) -> Result<Self> {
        let eps_r = check_eps_r(eps_r)?;
        let tan_delta = check_tan_delta(tan_delta)?;
        let f_fit = error::positive(fit_freq_hz, "fit_freq_hz")?;
        let unit = Self::new(T::one(), T::one(), f1_hz, f2_hz)?;
        if f_fit <= unit.f1_hz || f_fit >= unit.f2_hz {
            return Err(Error::OutOfRange("fit_freq_hz"));
        }
        // With Δε = 1 and ε∞ = 1 the model gives 1 + B′/L − jB″/L.
        let (re1, loss1) = unit.eval(f_fit);
        let shape_re = re1 - T::one(); // B′/L
        let shape_loss = loss1; // B″/L > 0 for f1 < f < f2
        if shape_loss.is_nan() || shape_loss <= T::zero() {
            return Err(Error::OutOfRange("fit_freq_hz"));
        }
        let loss = eps_r * tan_delta;
        let delta_eps = loss / shape_loss;
        let eps_inf = eps_r - delta_eps * shape_re;
        if !eps_inf.is_finite() || eps_inf < T::one() {
            return Err(Error::Unreachable("tan_delta"));
        }
        Self::new(eps_inf, delta_eps, unit.f1_hz, unit.f2_hz)
    }

    /// ε∞, the high-frequency permittivity.
    pub fn eps_inf(&self) -> T {
        self.eps_inf
    }
    /// Δε, the total dispersion (εs − ε∞).
    pub fn delta_eps(&self) -> T {
        self.delta_eps
    }
    /// The static permittivity εs = ε∞ + Δε (the exact value at f = 0).
    pub fn eps_static(&self) -> T {
        self.eps_inf + self.delta_eps
    }
    /// Lower corner f1, Hz.
    pub fn f1_hz(&self) -> T {
        self.f1_hz
    }
    /// Upper corner f2, Hz.
    pub fn f2_hz(&self) -> T {
        self.f2_hz
    }

    /// (ε′, ε″) at f ≥ 0, no checks (callers validate f).
    #[inline]
    pub(crate) fn eval(&self, freq_hz: T) -> (T, T) {
        let one = T::one();
        let b = freq_hz * self.inv_f1;
        // ½·ln[(1 + r²b²)/(1 + b²)] and atan[b(1 − r)/(1 + r b²)], overflow-free.
        // With d1 = 1 + b², d2 = 1 + r·b²: ratio = (1 + r²b²)/d1 and the atan
        // argument b(1 − r)/d2; one division 1/(d1·d2) gives both 1/d1 and 1/d2.
        let (half_log, phase) = if b < one {
            // d1, d2 in [1, 2); ln_1p keeps the small ln(ratio) accurate.
            let b2 = b * b;
            let (d1, d2) = (one + b2, one + self.r * b2);
            let inv = one / (d1 * d2);
            let x = -b2 * self.one_minus_r2 * (d2 * inv);
            (
                T::half() * x.ln_1p(),
                (b * self.one_minus_r * (d1 * inv)).atan(),
            )
        } else if b < T::lit(1e9) {
            // d1·d2 ≤ 10³⁶: finite in f32 too; ratio ∈ [r², 1), no cancellation.
            let b2 = b * b;
            let (d1, d2) = (one + b2, one + self.r * b2);
            let inv = one / (d1 * d2);
            let rb = self.r * b;
            let ratio = (one + rb * rb) * (d2 * inv);
            (
                T::half() * ratio.ln(),
                (b * self.one_minus_r * (d1 * inv)).atan(),
            )
        } else {
            // u = 1/b: ratio = (u² + r²)/(u² + 1), atan argument (1 − r)·u/(u² + r);
            // d1 = u² + 1 ∈ (1, 2], d2 = u² + r ∈ [r, 2]: nothing overflows.
            let u = one / b;
            let u2 = u * u;
            let (d1, d2) = (u2 + one, u2 + self.r);
            let inv = one / (d1 * d2);
            let ratio = (u2 + self.r * self.r) * (d2 * inv);
            (
                T::half() * ratio.ln(),
                (self.one_minus_r * u * (d1 * inv)).atan(),
            )
        };
        // ε = ε∞ + k·(L + half_log − j·phase), k = Δε/L.
        (
            self.eps_inf + self.delta_eps + self.k * half_log,
            self.k * phase,
        )
    }
}

/// A dielectric: its complex relative permittivity versus frequency and an
/// optional DC conductivity.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Dielectric<T> {
    kind: Kind<T>,
    conductivity_s_per_m: T,
}

#[derive(Clone, Copy, Debug, PartialEq)]
enum Kind<T> {
    Constant { eps_re: T, eps_loss: T },
    Debye(WidebandDebye<T>),
}

impl<T: Real> Dielectric<T> {
    /// Vacuum (or air, to the accuracy of this crate): ε = 1.
    pub fn vacuum() -> Self {
        Dielectric {
            kind: Kind::Constant {
                eps_re: T::one(),
                eps_loss: T::zero(),
            },
            conductivity_s_per_m: T::zero(),
        }
    }

    /// Frequency-independent εr ≥ 1 and 0 ≤ tanδ < 1. Not causal when tanδ > 0
    /// (see the module docs).
    pub fn constant(eps_r: T, tan_delta: T) -> Result<Self> {
        let eps_r = check_eps_r(eps_r)?;
        let tan_delta = check_tan_delta(tan_delta)?;
        Ok(Dielectric {
            kind: Kind::Constant {
                eps_re: eps_r,
                eps_loss: eps_r * tan_delta,
            },
            conductivity_s_per_m: T::zero(),
        })
    }

    /// The causal wideband Debye model fitted at one frequency with the default
    /// corners (see [`WidebandDebye::fit`]).
    pub fn wideband_debye(eps_r: T, tan_delta: T, fit_freq_hz: T) -> Result<Self> {
        Ok(Self::from_debye(WidebandDebye::fit(
            eps_r,
            tan_delta,
            fit_freq_hz,
        )?))
    }

    /// Wraps a wideband Debye model.
    pub fn from_debye(model: WidebandDebye<T>) -> Self {
        Dielectric {
            kind: Kind::Debye(model),
            conductivity_s_per_m: T::zero(),
        }
    }

    /// Adds a DC conductivity σ ≥ 0 (S/m), the term −jσ/(ωε0).
    pub fn with_conductivity(self, conductivity_s_per_m: T) -> Result<Self> {
        let s = error::non_negative(conductivity_s_per_m, "conductivity_s_per_m")?;
        Ok(Dielectric {
            conductivity_s_per_m: s,
            ..self
        })
    }

    /// The DC conductivity σ, S/m.
    pub fn conductivity_s_per_m(&self) -> T {
        self.conductivity_s_per_m
    }

    /// The wideband Debye model, if this is one.
    pub fn debye(&self) -> Option<&WidebandDebye<T>> {
        match &self.kind {
            Kind::Debye(d) => Some(d),
            Kind::Constant { .. } => None,
        }
    }

    /// `true` if the model is not causal (constant εr with tanδ > 0).
    pub fn is_non_causal(&self) -> bool {
        matches!(self.kind, Kind::Constant { eps_loss, .. } if eps_loss > T::zero())
    }

    /// The permittivity at DC (the static value; real): εr for the constant
    /// model, ε∞ + Δε for the wideband Debye model.
    pub fn eps_static(&self) -> T {
        match &self.kind {
            Kind::Constant { eps_re, .. } => *eps_re,
            Kind::Debye(d) => d.eps_static(),
        }
    }

    /// (ε′, ε″) at f ≥ 0 without the conductivity term, no checks.
    #[inline]
    pub(crate) fn eval(&self, freq_hz: T) -> (T, T) {
        match &self.kind {
            Kind::Constant { eps_re, eps_loss } => (*eps_re, *eps_loss),
            Kind::Debye(d) => d.eval(freq_hz),
        }
    }

    /// (ε′, ε″) when they do not depend on frequency (the constant model).
    #[inline]
    pub(crate) fn constant_parts(&self) -> Option<(T, T)> {
        match &self.kind {
            Kind::Constant { eps_re, eps_loss } => Some((*eps_re, *eps_loss)),
            Kind::Debye(_) => None,
        }
    }

    /// The complex relative permittivity ε′ − jε″ at `freq_hz` ≥ 0, without the
    /// conductivity term. (For the constant model with tanδ > 0 the value at
    /// f = 0 is the same constant, which is part of why it is not causal.)
    pub fn at(&self, freq_hz: T) -> Result<Cx<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (re, loss) = self.eval(f);
        Ok(Cx::new(re, -loss))
    }

    /// The loss tangent ε″/ε′ at `freq_hz` ≥ 0, without the conductivity term.
    pub fn tan_delta(&self, freq_hz: T) -> Result<T> {
        let e = self.at(freq_hz)?;
        Ok(-e.im / e.re)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn fit_reproduces_its_inputs_in_both_precisions() {
        let d = Dielectric::<f64>::wideband_debye(4.3, 0.02, 1e9).unwrap();
        let e = d.at(1e9).unwrap();
        assert_relative_eq!(e.re, 4.3, max_relative = 1e-13);
        assert_relative_eq!(-e.im / e.re, 0.02, max_relative = 1e-12);
        let d32 = Dielectric::<f32>::wideband_debye(4.3, 0.02, 1e9).unwrap();
        let e32 = d32.at(1e9).unwrap();
        assert_relative_eq!(e32.re, 4.3, max_relative = 1e-5);
        assert_relative_eq!(-e32.im / e32.re, 0.02, max_relative = 1e-4);
    }

    #[test]
    fn dc_value_is_exactly_real_and_static() {
        let d = WidebandDebye::<f64>::new(4.0, 0.5, 1e3, 1e12).unwrap();
        let (re, loss) = d.eval(0.0);
        assert_eq!(loss, 0.0);
        assert_eq!(re, 4.5);
        // Far above f2 the permittivity tends to ε∞.
        let (re, loss) = d.eval(1e18);
        assert_relative_eq!(re, 4.0, max_relative = 1e-9);
        assert!((0.0..1e-6).contains(&loss));
        // No overflow at extreme frequencies in f32.
        let d32 = WidebandDebye::<f32>::new(4.0, 0.5, 1e-3, 1e12).unwrap();
        let (re, loss) = d32.eval(3e38);
        assert!(re.is_finite() && loss.is_finite());
    }

    #[test]
    fn loss_is_positive_and_real_part_falls_across_the_band() {
        let d = WidebandDebye::<f64>::fit(3.5, 0.01, 1e8).unwrap();
        let mut prev = f64::INFINITY;
        for k in 0..40 {
            let f = 10f64.powf(k as f64 * 0.5);
            let (re, loss) = d.eval(f);
            assert!(loss >= 0.0);
            assert!(re <= prev);
            prev = re;
        }
    }

    #[test]
    fn bad_inputs_are_named() {
        type D = Dielectric<f64>;
        assert_eq!(D::constant(0.5, 0.0), Err(Error::OutOfRange("eps_r")));
        assert_eq!(D::constant(f64::NAN, 0.0), Err(Error::NonFinite("eps_r")));
        assert_eq!(D::constant(2.0, -0.1), Err(Error::Negative("tan_delta")));
        assert_eq!(D::constant(2.0, 1.0), Err(Error::OutOfRange("tan_delta")));
        assert_eq!(
            D::wideband_debye(2.0, 0.01, 10.0),
            Err(Error::OutOfRange("fit_freq_hz"))
        );
        assert_eq!(
            D::wideband_debye(2.0, 0.01, 0.0),
            Err(Error::NotPositive("fit_freq_hz"))
        );
        assert_eq!(
            D::wideband_debye(1.01, 0.5, 1e9),
            Err(Error::Unreachable("tan_delta"))
        );
        assert_eq!(
            WidebandDebye::<f64>::fit_with_band(2.0, 0.01, 1e9, 1e6, 1e5),
            Err(Error::OutOfRange("f2_hz"))
        );
        assert_eq!(
            WidebandDebye::<f32>::new(0.9, 1.0, 1e3, 1e6),
            Err(Error::OutOfRange("eps_inf"))
        );
        assert_eq!(
            D::vacuum().with_conductivity(-1.0),
            Err(Error::Negative("conductivity_s_per_m"))
        );
        assert_eq!(D::vacuum().at(-1.0), Err(Error::Negative("freq_hz")));
        assert!(D::constant(2.0, 0.01).unwrap().is_non_causal());
        assert!(!D::constant(2.0, 0.0).unwrap().is_non_causal());
        assert!(!D::wideband_debye(2.0, 0.01, 1e9).unwrap().is_non_causal());
    }
}

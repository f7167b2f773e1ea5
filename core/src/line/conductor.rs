//! Conductors: skin depth, surface resistance, and an internal impedance per
//! metre that runs smoothly from DC into the skin-effect regime.
//!
//! For a metal of conductivity σ (S/m) and relative permeability μr, μ = μr·μ0:
//!
//! * skin depth δ = 1/√(π f μ σ) (infinite at DC);
//! * surface resistance Rs = √(π f μ/σ) = 1/(σδ) (zero at DC).
//!
//! (Ramo, Whinnery & Van Duzer, *Fields and Waves in Communication Electronics*,
//! 3rd ed., 1994, the skin-effect sections.)
//!
//! **Internal impedance.** A bare Rs-based R ∝ √f is zero at DC, which is wrong:
//! the resistance must tend to R_dc. The exact internal impedance of a solid
//! round wire of radius a is a ratio of Bessel functions, Z = (k/(2πaσ))·J0(ka)/J1(ka)
//! with k = (1 − j)/δ (Ramo, Whinnery & Van Duzer, 1994, the round-wire internal
//! impedance). Its two asymptotes, recalled from the same text (values from
//! memory, re-derived below), are
//!
//! * DC: Z → R_dc + jωL_int with R_dc = 1/(σπa²) and L_int = μ/(8π);
//! * high frequency (δ ≪ a): Z → (1 + j)·Rs/(2πa).
//!
//! This module uses the one-parameter interpolation
//!
//!   Z_int(f) = R_dc·√(1 + j f/f_c),
//!
//! which at low f is R_dc·(1 + j f/(2f_c)) = R_dc + jωL_int with
//! L_int = R_dc/(4π f_c), and at high f is (1 + j)·R_dc·√(f/(2f_c)). Writing the
//! high-frequency resistance as R_hf = k_hf·√f, the corner is chosen so the
//! asymptote is exact: f_c = R_dc²/(2k_hf²).
//!
//! For the round wire, k_hf = √(πμ/σ)/(2πa), so
//! f_c = [1/(σπa²)]²·4π²a²σ/(2πμ) = 2/(πμσa²) (where δ = a/√2), and then
//! L_int = R_dc/(4πf_c) = [1/(σπa²)]·πμσa²/(8π) = **μ/(8π)**: the interpolation
//! also gives the exact DC internal inductance of a round wire. Both ends are
//! exact; in between (δ ≈ a) the error against the Bessel form is a few per cent
//! (checked against mpmath in `tests/tests/lines.rs`). The internal inductance
//! Im Z_int/ω falls from μ/(8π) towards zero as f rises, by itself.
//!
//! For a tube (a coax shield) of inner radius b and wall t, carrying the return
//! current on its inner surface: R_dc = 1/(σπt(2b + t)), k_hf = √(πμ/σ)/(2πb).
//! Its DC internal inductance from this form, μt(2b + t)/(8πb²), is an
//! approximation (≈ 1.5× the exact thin-wall value μt/(6πb)); the quantity is
//! small beside the external inductance. Where the wall is comparable to the
//! skin depth (t/3 < δ < 3t) the tube result carries
//! [`Warnings::THIN_CONDUCTOR`](crate::line::Warnings::THIN_CONDUCTOR).

use crate::error::{self, Result};
use crate::math::complex::Cx;
use crate::scalar::{Real, SIGMA_COPPER_S_PER_M};
use crate::value::Extended;

/// A conducting material: conductivity and relative permeability.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Metal<T> {
    conductivity_s_per_m: T,
    mu_r: T,
}

impl<T: Real> Metal<T> {
    /// A non-magnetic metal (μr = 1) of conductivity σ > 0, S/m.
    pub fn new(conductivity_s_per_m: T) -> Result<Self> {
        Self::with_mu_r(conductivity_s_per_m, T::one())
    }

    /// A metal of conductivity σ > 0 (S/m) and relative permeability μr > 0.
    pub fn with_mu_r(conductivity_s_per_m: T, mu_r: T) -> Result<Self> {
        let s = error::positive(conductivity_s_per_m, "conductivity_s_per_m")?;
        let m = error::positive(mu_r, "mu_r")?;
        Ok(Metal {
            conductivity_s_per_m: s,
            mu_r: m,
        })
    }

    /// Annealed copper, σ = 5.8 × 10⁷ S/m (see [`SIGMA_COPPER_S_PER_M`]), μr = 1.
    pub fn copper() -> Self {
        Metal {
            conductivity_s_per_m: T::lit(SIGMA_COPPER_S_PER_M),
            mu_r: T::one(),
        }
    }

    /// Conductivity σ, S/m.
    pub fn conductivity_s_per_m(&self) -> T {
        self.conductivity_s_per_m
    }

    /// Relative permeability μr.
    pub fn mu_r(&self) -> T {
        self.mu_r
    }

    /// μ = μr·μ0, H/m.
    pub fn mu_h_per_m(&self) -> T {
        self.mu_r * T::mu0()
    }

    /// Skin depth δ = 1/√(π f μ σ) at `freq_hz` ≥ 0, m; infinite at DC.
    pub fn skin_depth_m(&self, freq_hz: T) -> Result<Extended<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        if f == T::zero() {
            return Ok(Extended::Infinite);
        }
        let d = T::one() / (T::PI() * f * self.mu_h_per_m() * self.conductivity_s_per_m).sqrt();
        Ok(Extended::Finite(d))
    }

    /// Surface resistance Rs = √(π f μ/σ) at `freq_hz` ≥ 0, Ω (per square).
    pub fn surface_resistance_ohm(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok((T::PI() * f * self.mu_h_per_m() / self.conductivity_s_per_m).sqrt())
    }

    /// √(πμ/σ): Rs = this·√f, Ω/√Hz.
    fn rs_coeff(&self) -> T {
        (T::PI() * self.mu_h_per_m() / self.conductivity_s_per_m).sqrt()
    }
}

/// The internal impedance of one conductor per metre, Z_int(f) = R_dc·√(1 + j f/f_c).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Conductor<T> {
    r_dc_ohm_per_m: T,
    hf_coeff: T,
    inv_fc: T,
    // Band where a tube wall is within a factor 3 of the skin depth (0, 0 if none).
    thin_lo_hz: T,
    thin_hi_hz: T,
}

impl<T: Real> Conductor<T> {
    fn from_parts(r_dc: T, k_hf: T) -> Result<Self> {
        let r_dc = error::positive(r_dc, "r_dc_ohm_per_m")?;
        let k = error::positive(k_hf, "hf_coeff_ohm_per_m_sqrt_hz")?;
        // f_c = R_dc²/(2k²); 1/f_c = 2(k/R_dc)², formed as a ratio first (no overflow).
        let q = k / r_dc;
        let inv_fc = error::positive(T::two() * q * q, "hf_coeff_ohm_per_m_sqrt_hz")?;
        Ok(Conductor {
            r_dc_ohm_per_m: r_dc,
            hf_coeff: k,
            inv_fc,
            thin_lo_hz: T::zero(),
            thin_hi_hz: T::zero(),
        })
    }

    /// A solid round wire of `radius_m` > 0: R_dc = 1/(σπa²), k_hf = √(πμ/σ)/(2πa).
    pub fn round_wire(metal: Metal<T>, radius_m: T) -> Result<Self> {
        let a = error::positive(radius_m, "radius_m")?;
        let sigma = metal.conductivity_s_per_m;
        let r_dc = T::one() / (sigma * T::PI() * a * a);
        let k = metal.rs_coeff() / (T::two_pi() * a);
        Self::from_parts(r_dc, k)
    }

    /// A tube (coax shield) of inner radius `inner_radius_m` > 0 and wall
    /// `wall_thickness_m` > 0, carrying current on its inner surface at high
    /// frequency: R_dc = 1/(σπt(2b + t)), k_hf = √(πμ/σ)/(2πb).
    pub fn tube(metal: Metal<T>, inner_radius_m: T, wall_thickness_m: T) -> Result<Self> {
        let b = error::positive(inner_radius_m, "inner_radius_m")?;
        let t = error::positive(wall_thickness_m, "wall_thickness_m")?;
        let sigma = metal.conductivity_s_per_m;
        let r_dc = T::one() / (sigma * T::PI() * t * (b + b + t));
        let k = metal.rs_coeff() / (T::two_pi() * b);
        let mut c = Self::from_parts(r_dc, k)?;
        // δ = 3t at f = 1/(9πμσt²); δ = t/3 at f = 9/(πμσt²).
        let base = T::one() / (T::PI() * metal.mu_h_per_m() * sigma * t * t);
        let nine = T::lit(9.0);
        c.thin_lo_hz = base / nine;
        c.thin_hi_hz = base * nine;
        Ok(c)
    }

    /// From a DC resistance R_dc > 0 (Ω/m) and a high-frequency coefficient
    /// k_hf > 0 (Ω/(m·√Hz)), so that R → k_hf·√f at high frequency.
    pub fn generic(r_dc_ohm_per_m: T, hf_coeff_ohm_per_m_sqrt_hz: T) -> Result<Self> {
        Self::from_parts(r_dc_ohm_per_m, hf_coeff_ohm_per_m_sqrt_hz)
    }

    /// DC resistance, Ω/m.
    pub fn r_dc_ohm_per_m(&self) -> T {
        self.r_dc_ohm_per_m
    }

    /// High-frequency coefficient k_hf, Ω/(m·√Hz).
    pub fn hf_coeff_ohm_per_m_sqrt_hz(&self) -> T {
        self.hf_coeff
    }

    /// The corner f_c = R_dc²/(2k_hf²), Hz.
    pub fn corner_freq_hz(&self) -> T {
        T::one() / self.inv_fc
    }

    /// DC internal inductance R_dc/(4π f_c), H/m.
    pub fn l_int_dc_h_per_m(&self) -> T {
        self.r_dc_ohm_per_m * self.inv_fc / (T::lit(4.0) * T::PI())
    }

    /// `true` for a tube (the only kind with a thin-wall band).
    #[inline]
    pub(crate) fn is_tube(&self) -> bool {
        self.thin_hi_hz > T::zero()
    }

    /// `true` if the wall of a tube is within a factor 3 of the skin depth at f.
    #[inline]
    pub(crate) fn is_thin_at(&self, freq_hz: T) -> bool {
        freq_hz > self.thin_lo_hz && freq_hz < self.thin_hi_hz
    }

    /// Z_int at f ≥ 0, no checks: with x = f/f_c, m = √(1 + x²), s = 1 + m and
    /// p = √(s/2), √(1 + jx) = p + j·p·x/s (q = x/(2p) = x·p/(1 + m)), so the
    /// division runs beside the second square root instead of after it.
    /// For x ≥ 10⁸, m = x to within rounding in both precisions.
    #[inline]
    pub(crate) fn eval(&self, freq_hz: T) -> Cx<T> {
        let x = freq_hz * self.inv_fc;
        let one = T::one();
        let m = if x < T::lit(1e8) {
            (one + x * x).sqrt()
        } else {
            x
        };
        let s = one + m;
        let p = (T::half() * s).sqrt();
        let d = x / s;
        Cx::new(self.r_dc_ohm_per_m * p, self.r_dc_ohm_per_m * (p * d))
    }

    /// Internal impedance per metre at `freq_hz` ≥ 0, Ω/m.
    pub fn z_int_ohm_per_m(&self, freq_hz: T) -> Result<Cx<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok(self.eval(f))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::Error;
    use approx::assert_relative_eq;

    #[test]
    fn skin_depth_of_copper() {
        // δ = 1/√(π f μ0 σ); for copper at 1 MHz about 66 µm (common practice, no single source).
        let cu = Metal::<f64>::copper();
        let d = cu.skin_depth_m(1e6).unwrap().finite().unwrap();
        assert_relative_eq!(d, 66.085e-6, max_relative = 1e-4);
        assert!(cu.skin_depth_m(0.0).unwrap().is_infinite());
        assert_relative_eq!(
            cu.surface_resistance_ohm(1e6).unwrap(),
            1.0 / (5.8e7 * d),
            max_relative = 1e-12
        );
        assert_eq!(cu.surface_resistance_ohm(0.0).unwrap(), 0.0);
    }

    #[test]
    fn round_wire_asymptotes_are_exact() {
        let cu = Metal::<f64>::copper();
        let a = 0.5e-3;
        let w = Conductor::round_wire(cu, a).unwrap();
        let r_dc = 1.0 / (5.8e7 * core::f64::consts::PI * a * a);
        assert_relative_eq!(w.eval(0.0).re, r_dc, max_relative = 1e-14);
        assert_eq!(w.eval(0.0).im, 0.0);
        // DC internal inductance μ0/(8π) = 50 nH/m.
        assert_relative_eq!(
            w.l_int_dc_h_per_m(),
            crate::scalar::MU0_H_PER_M / (8.0 * core::f64::consts::PI),
            max_relative = 1e-12
        );
        let z = w.eval(1.0);
        assert_relative_eq!(
            z.im / core::f64::consts::TAU,
            w.l_int_dc_h_per_m(),
            max_relative = 1e-8
        );
        // High frequency: (1 + j)·Rs/(2πa).
        let f = 1e12;
        let rs = cu.surface_resistance_ohm(f).unwrap();
        let z = w.eval(f);
        assert_relative_eq!(z.re, rs / (core::f64::consts::TAU * a), max_relative = 1e-6);
        assert_relative_eq!(z.im, rs / (core::f64::consts::TAU * a), max_relative = 1e-6);
        // Internal inductance falls and resistance rises with frequency.
        let mut prev = w.eval(1.0);
        for k in 1..12 {
            let zf = w.eval(10f64.powi(k));
            let l_prev = prev.im / (core::f64::consts::TAU * 10f64.powi(k - 1));
            let l_now = zf.im / (core::f64::consts::TAU * 10f64.powi(k));
            assert!(zf.re >= prev.re && l_now <= l_prev);
            prev = zf;
        }
        let w32 = Conductor::<f32>::round_wire(Metal::copper(), 0.5e-3).unwrap();
        assert_relative_eq!(w32.eval(1e9).re as f64, w.eval(1e9).re, max_relative = 1e-5);
        assert!(w32.eval(3e38).re.is_finite());
    }

    #[test]
    fn tube_flags_thin_walls() {
        let t = Conductor::<f64>::tube(Metal::copper(), 2e-3, 0.1e-3).unwrap();
        // δ = t at f = 1/(πμ0σt²) ≈ 437 kHz.
        assert!(t.is_thin_at(437e3));
        assert!(!t.is_thin_at(1e9));
        assert!(!t.is_thin_at(0.0));
        let r_dc = 1.0 / (5.8e7 * core::f64::consts::PI * 0.1e-3 * 4.1e-3);
        assert_relative_eq!(t.r_dc_ohm_per_m(), r_dc, max_relative = 1e-14);
    }

    #[test]
    fn bad_inputs_are_named() {
        assert_eq!(
            Metal::<f64>::new(0.0),
            Err(Error::NotPositive("conductivity_s_per_m"))
        );
        assert_eq!(
            Metal::<f64>::with_mu_r(1e7, f64::NAN),
            Err(Error::NonFinite("mu_r"))
        );
        let cu = Metal::<f32>::copper();
        assert_eq!(
            Conductor::round_wire(cu, -1.0),
            Err(Error::NotPositive("radius_m"))
        );
        assert_eq!(
            Conductor::tube(cu, 1e-3, f32::INFINITY),
            Err(Error::NonFinite("wall_thickness_m"))
        );
        assert_eq!(
            Conductor::<f64>::generic(0.0, 1e-3),
            Err(Error::NotPositive("r_dc_ohm_per_m"))
        );
        assert_eq!(
            Conductor::<f64>::generic(1.0, -1.0),
            Err(Error::NotPositive("hf_coeff_ohm_per_m_sqrt_hz"))
        );
        assert_eq!(cu.skin_depth_m(-1.0), Err(Error::Negative("freq_hz")));
        let w = Conductor::round_wire(cu, 1e-3).unwrap();
        assert_eq!(
            w.z_int_ohm_per_m(f32::NAN),
            Err(Error::NonFinite("freq_hz"))
        );
    }
}

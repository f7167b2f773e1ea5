//! Two-wire line (parallel round wires) and twisted pair.
//!
//! **Two-wire**, wire diameter d, centre spacing D, in a homogeneous dielectric
//! (exact for the TEM mode; Ramo, Whinnery & Van Duzer, *Fields and Waves in
//! Communication Electronics*, 3rd ed., 1994; Pozar, *Microwave Engineering*,
//! 4th ed., 2012, Table 2.1):
//!
//!   L_ext = (μ0/π)·arcosh(D/d),  C = π·ε/arcosh(D/d),  Z0 = (η/π)·arcosh(D/d),
//!
//! with arcosh x = ln(1 + (x − 1) + √((x − 1)(x + 1))) written for accuracy
//! near x = 1; ≈ (η/π)·ln(2D/d) for D ≫ d. Each wire is a solid round
//! [`Conductor`] (DC resistance to skin effect) whose high-frequency resistance
//! is raised by the proximity factor (D/d)/√((D/d)² − 1) (the exact skin-effect
//! resistance of two parallel wires, Ramo, Whinnery & Van Duzer 1994; from
//! memory); the factor tends to 1 for D ≫ d. An open two-wire line radiates more
//! as D approaches half a wavelength; that is not modelled (`cutoff_hz` is
//! `None`).
//!
//! **Twisted pair** (stated approximations): two insulated wires (insulation
//! wall t_i, so D = d + 2t_i when they touch) twisted T times per metre.
//!
//! * Effective permittivity between insulation and air, after Lefferson,
//!   "Twisted magnet wire transmission line", IEEE Trans. Parts, Hybrids and
//!   Packaging PHP-7(4):148–154, 1971 (from memory): εeff = 1 + q·(εr − 1) with
//!   q = 0.25 + 0.0004·θ², θ = atan(T·π·D) the twist angle in degrees. A jacket
//!   or a different fill is stated by setting q directly
//!   ([`TwoWire::with_filling_factor`]); q applies to ε′ and ε″ alike. The fit
//!   was made for twisted magnet wire (thin enamel film); with thick insulation
//!   (data and telephone pairs) more of the field lies in the dielectric and q
//!   is larger (roughly 0.4–0.6 for such pairs, value from memory): Lefferson's
//!   q then reads Z0 high, so state q for them.
//! * Twist lengthens each conductor by p = √(1 + (πDT)²) = 1/cos θ per metre
//!   of pair (helix geometry; common practice): every per-unit-length quantity
//!   along the pair (R, L, G, C) is multiplied by p, so Z0 is unchanged and the
//!   velocity along the pair is divided by p.
//!
//! Points carry OUTSIDE_FIT_RANGE when θ > 45° (beyond the range of twist
//! angles the correction was fitted on, from memory).
//!
//! Size: `TwoWire<f64>` ≤ 208 bytes, `TwoWire<f32>` ≤ 104 bytes (no heap).

use crate::error::{self, Error, Result};
use crate::line::conductor::{Conductor, Metal};
use crate::line::dielectric::Dielectric;
use crate::line::tem;
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::complex::Cx;
use crate::scalar::Real;

/// arcosh x for x ≥ 1, accurate near 1.
pub(crate) fn arcosh<T: Real>(x: T) -> T {
    let xm1 = x - T::one();
    (xm1 + (xm1 * (x + T::one())).sqrt()).ln_1p()
}

/// A two-wire line or twisted pair (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TwoWire<T> {
    wire_diameter_m: T,
    spacing_m: T,
    acosh: T,
    dielectric: Dielectric<T>,
    wire: Option<Conductor<T>>,
    q: T,
    twist_factor: T,
    twist_angle_deg: T,
    l_ext: T,
    c_vac: T,
    base: Warnings,
}

impl<T: Real> TwoWire<T> {
    /// Two wires of diameter d > 0 at centre spacing D > d (m), in a
    /// homogeneous dielectric, of `metal` (`None`: perfect conductors).
    pub fn new(
        wire_diameter_m: T,
        spacing_m: T,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        let d = error::positive(wire_diameter_m, "wire_diameter_m")?;
        let dd = error::positive(spacing_m, "spacing_m")?;
        if dd <= d {
            return Err(Error::OutOfRange("spacing_m"));
        }
        let x = dd / d;
        let acosh = arcosh(x);
        if acosh <= T::zero() {
            return Err(Error::OutOfRange("spacing_m"));
        }
        let wire = match metal {
            Some(m) => {
                let a = d * T::half();
                let w = Conductor::round_wire(m, a)?;
                // Proximity factor x/√(x² − 1) on the high-frequency coefficient.
                let prox = x / ((x - T::one()) * (x + T::one())).sqrt();
                Some(Conductor::generic(
                    w.r_dc_ohm_per_m(),
                    w.hf_coeff_ohm_per_m_sqrt_hz() * prox,
                )?)
            }
            None => None,
        };
        let mut base = Warnings::NONE;
        base.set_if(dielectric.is_non_causal(), Warnings::NON_CAUSAL_DIELECTRIC);
        Ok(TwoWire {
            wire_diameter_m: d,
            spacing_m: dd,
            acosh,
            dielectric,
            wire,
            q: T::one(),
            twist_factor: T::one(),
            twist_angle_deg: T::zero(),
            l_ext: T::mu0() / T::PI() * acosh,
            c_vac: T::PI() * T::eps0() / acosh,
            base,
        })
    }

    /// A twisted pair of wires of diameter d > 0 with insulation walls
    /// t_i > 0 (D = d + 2t_i), insulation `dielectric`, `twists_per_m` ≥ 0,
    /// and `metal` (`None`: perfect conductors); Lefferson's filling factor.
    pub fn twisted_pair(
        wire_diameter_m: T,
        insulation_thickness_m: T,
        dielectric: Dielectric<T>,
        twists_per_m: T,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        let d = error::positive(wire_diameter_m, "wire_diameter_m")?;
        let ti = error::positive(insulation_thickness_m, "insulation_thickness_m")?;
        let tw = error::non_negative(twists_per_m, "twists_per_m")?;
        let dd = d + ti + ti;
        let mut line = Self::new(d, dd, dielectric, metal)?;
        let tan_theta = tw * T::PI() * dd;
        let theta_deg = tan_theta.atan() * T::lit(180.0) / T::PI();
        line.twist_angle_deg = theta_deg;
        line.twist_factor = (T::one() + tan_theta * tan_theta).sqrt();
        line.q = (T::lit(0.25) + T::lit(0.0004) * theta_deg * theta_deg).min(T::one());
        line.base
            .set_if(theta_deg > T::lit(45.0), Warnings::OUTSIDE_FIT_RANGE);
        Ok(line)
    }

    /// Sets the filling factor q ∈ [0, 1] of εeff = 1 + q(εr − 1) (1 for a
    /// homogeneous dielectric; a stated approximation for jackets and fills).
    pub fn with_filling_factor(mut self, q: T) -> Result<Self> {
        self.q = error::in_range(q, T::zero(), T::one(), "filling_factor")?;
        Ok(self)
    }

    /// The filling factor q.
    pub fn filling_factor(&self) -> T {
        self.q
    }
    /// The twist angle θ, degrees (0 for a plain two-wire line).
    pub fn twist_angle_deg(&self) -> T {
        self.twist_angle_deg
    }
    /// The path-length factor p = 1/cos θ.
    pub fn twist_factor(&self) -> T {
        self.twist_factor
    }
    /// Wire diameter d, m.
    pub fn wire_diameter_m(&self) -> T {
        self.wire_diameter_m
    }
    /// Centre spacing D, m.
    pub fn spacing_m(&self) -> T {
        self.spacing_m
    }

    /// (ε′eff, ε″eff) at f.
    fn eps_eff_at(&self, f: T) -> (T, T) {
        let (er, loss) = self.dielectric.eval(f);
        (T::one() + self.q * (er - T::one()), self.q * loss)
    }

    /// Lossless Z0 = (η0/(π√ε′eff))·arcosh(D/d) at `freq_hz`, Ω.
    pub fn z0_ohm(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (e, _) = self.eps_eff_at(f);
        Ok(T::eta0() / (T::PI() * e.sqrt()) * self.acosh)
    }

    /// The effective permittivity ε′eff at `freq_hz` (without the twist path factor).
    pub fn eps_eff(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok(self.eps_eff_at(f).0)
    }
}

impl<T: Real> LineModel<T> for TwoWire<T> {
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (er, loss) = self.eps_eff_at(f);
        let w = T::two_pi() * f;
        let p = self.twist_factor;
        let zi = match &self.wire {
            Some(c) => c.eval(f),
            None => Cx::new(T::zero(), T::zero()),
        };
        let z = Cx::new(p * (zi.re + zi.re), p * (zi.im + zi.im + w * self.l_ext));
        let g_dc = self.q * self.dielectric.conductivity_s_per_m() * self.c_vac / T::eps0();
        let wc = w * self.c_vac;
        let y = Cx::new(p * (g_dc + wc * loss), p * wc * er);
        let er0 = T::one() + self.q * (self.dielectric.eps_static() - T::one());
        let z_dc = T::eta0() / (T::PI() * er0.sqrt()) * self.acosh;
        tem::point(f, z, y, Some(Cx::new(z_dc, T::zero())), self.base)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::properties;
    use approx::assert_relative_eq;

    #[test]
    fn two_wire_check_values() {
        // Reference notes (methods.md §5) [calc]: air, 300 Ω at D/d = 6.1428;
        // D/d = 2 → 157.93 Ω.
        let air = Dielectric::vacuum();
        let l = TwoWire::<f64>::new(1e-3, 6.1428e-3, air, None).unwrap();
        assert_relative_eq!(l.z0_ohm(1e6).unwrap(), 300.0, max_relative = 2e-5);
        let l2 = TwoWire::<f64>::new(1e-3, 2e-3, air, None).unwrap();
        // Given to two decimals.
        assert!((l2.z0_ohm(1e6).unwrap() - 157.93).abs() < 5e-3);
        let p = l2.at(1e6).unwrap();
        assert!((p.zc_ohm.finite().unwrap().re - 157.93).abs() < 5e-3);
        let l32 = TwoWire::<f32>::new(1e-3, 1.001e-3, Dielectric::vacuum(), None).unwrap();
        // Near touching: arcosh(1 + ε) ≈ √(2ε)·(1 − ε/12).
        assert_relative_eq!(l32.acosh as f64, (2.0e-3f64).sqrt(), max_relative = 1e-3);
    }

    #[test]
    fn twisted_pair_slows_along_the_pair() {
        let pe = Dielectric::constant(2.3, 0.0).unwrap();
        let tp = TwoWire::<f64>::twisted_pair(0.5e-3, 0.2e-3, pe, 50.0, None).unwrap();
        let theta = (50.0 * core::f64::consts::PI * 0.9e-3).atan().to_degrees();
        assert_relative_eq!(tp.twist_angle_deg(), theta, max_relative = 1e-12);
        let q = 0.25 + 0.0004 * theta * theta;
        assert_relative_eq!(
            tp.eps_eff(1e6).unwrap(),
            1.0 + q * 1.3,
            max_relative = 1e-12
        );
        let pr = properties(&tp, 10e6).unwrap();
        let vf = 1.0 / (tp.eps_eff(1e6).unwrap().sqrt() * tp.twist_factor());
        assert_relative_eq!(pr.velocity_factor, vf, max_relative = 1e-9);
        assert_relative_eq!(
            pr.point.zc_ohm.finite().unwrap().re,
            tp.z0_ohm(1e6).unwrap(),
            max_relative = 1e-12
        );
        let tp = tp.with_filling_factor(0.6).unwrap();
        assert_relative_eq!(tp.eps_eff(1e6).unwrap(), 1.78, max_relative = 1e-12);
    }

    #[test]
    fn loss_is_positive_and_from_dc() {
        let cu = Some(Metal::copper());
        let l =
            TwoWire::<f64>::new(1e-3, 3e-3, Dielectric::constant(2.25, 1e-3).unwrap(), cu).unwrap();
        let dc = l.at(0.0).unwrap();
        assert_relative_eq!(
            dc.z_ohm_per_m.re,
            2.0 / (5.8e7 * core::f64::consts::PI * 0.25e-6),
            max_relative = 1e-12
        );
        // High frequency: R = (Rs/(πa))·x/√(x² − 1), x = 3.
        let f = 1e9;
        let rs = Metal::<f64>::copper().surface_resistance_ohm(f).unwrap();
        let r = rs / (core::f64::consts::PI * 0.5e-3) * 3.0 / 8f64.sqrt();
        assert_relative_eq!(l.at(f).unwrap().z_ohm_per_m.re, r, max_relative = 1e-4);
    }

    #[test]
    fn bad_geometry_is_named() {
        let d = Dielectric::<f64>::vacuum();
        assert_eq!(
            TwoWire::new(1e-3, 1e-3, d, None),
            Err(Error::OutOfRange("spacing_m"))
        );
        assert_eq!(
            TwoWire::new(-1e-3, 1e-3, d, None),
            Err(Error::NotPositive("wire_diameter_m"))
        );
        assert_eq!(
            TwoWire::twisted_pair(1e-3, 0.0, d, 10.0, None),
            Err(Error::NotPositive("insulation_thickness_m"))
        );
        assert_eq!(
            TwoWire::twisted_pair(1e-3, 1e-4, d, -1.0, None),
            Err(Error::Negative("twists_per_m"))
        );
        let l = TwoWire::new(1e-3, 2e-3, d, None).unwrap();
        assert_eq!(
            l.with_filling_factor(1.5),
            Err(Error::OutOfRange("filling_factor"))
        );
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<TwoWire<f64>>() <= 208);
        assert!(core::mem::size_of::<TwoWire<f32>>() <= 104);
    }
}

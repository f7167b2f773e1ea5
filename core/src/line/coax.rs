//! Coaxial line from its geometry, as a frequency-dependent RLGC model.
//!
//! Inner conductor diameter d = 2a, outer (shield inner) diameter D = 2b, shield
//! wall t, one metal of conductivity σ (μr = 1), dielectric ε(f). Per metre
//! (Pozar, *Microwave Engineering*, 4th ed., 2012, §2.7 and Example 2.6 area;
//! values from memory, re-derived from the TEM field of a coax):
//!
//! * L_ext = (μ0/2π)·ln(b/a), C_vac = 2πε0/ln(b/a);
//! * inner conductor: a solid round wire of radius a; outer: a tube of inner
//!   radius b and wall t (see [`Conductor`]), so R tends to the DC resistance at
//!   low frequency and to (Rs/2π)(1/a + 1/b) at high frequency;
//! * Y = jωC_vac·ε(f) (plus any DC conductivity of the dielectric).
//!
//! Closed forms kept for checks and for quick figures (small-loss, high-frequency):
//!
//! * Z0 = η0/(2π√εr)·ln(D/d), exact for a lossless TEM coax;
//! * αc = Rs(1/a + 1/b)/(2η·ln(b/a)) Np/m, η = η0/√εr;
//! * αd = π f √εr·tanδ/c0 Np/m.
//!
//! Valid: 0 < d < D, t > 0, finite; single-mode below the TE11 cutoff.
//!
//! **TE11 cutoff** (the first higher-order mode). Exact: fc = c0·x/(2πa√ε′),
//! x = kc·a the smallest root of
//!
//!   J1′(x)·Y1′(x·b/a) − J1′(x·b/a)·Y1′(x) = 0
//!
//! (Marcuvitz, *Waveguide Handbook*, 1951, the coaxial TE modes; form from
//! memory, checked against scipy's `jvp`/`yvp` + `brentq` in
//! `tests/scripts/vectors_geom.py`). Solved at construction by Brent's method
//! ([`crate::math::roots`]) on [0.5, 1.3]·x0 around the approximation
//! x0 = 2/(1 + b/a), which brackets the first root and only it for every
//! b/a > 1 (the root tends to 1.8412·a/b, the hollow-guide TE11, for b ≫ a); for
//! b/a < 1.001 the approximation itself (error < 10⁻⁷) is used. ε′ is taken at
//! the cutoff (two passes). J1′ and Y1′ come from their ascending series in the
//! scalar's own precision (arguments stay within (0, 2.6] on that bracket), not
//! from `libm`, whose single-precision Bessel functions use double precision
//! inside. This runs once per construction, not per frequency.
//!
//! Approximation ([`Coax::te11_cutoff_approx_hz`]): fc ≈ c0/(π√εr(a + b))
//! (kc ≈ 2/(a + b), the mean circumference equal to one wavelength). Its error
//! (exact/approx − 1) [calc, vectors]: b/a 1.5 → +0.64 %, 2.3 → +2.07 %,
//! 3.0 → +2.72 %, 5 → +2.31 %, 10 → −0.81 %, 100 → −7.0 %: within 3 % for every
//! 50–75 Ω geometry, worse for very thin centre conductors.
//!
//! [`Coax::cutoff_hz`](LineModel::cutoff_hz) returns the exact value; `at` sets
//! [`Warnings::ABOVE_HIGHER_MODE`] at or above it.
//!
//! ```
//! use echoline::line::coax::Coax;
//! use echoline::line::dielectric::Dielectric;
//! use echoline::LineModel;
//!
//! // Solid-PE coax, copper, causal dielectric fitted at 1 GHz.
//! let pe = Dielectric::wideband_debye(2.25, 2e-4, 1e9)?;
//! let coax = Coax::<f64>::new(0.9e-3, 2.95e-3, pe, 5.8e7, 0.2e-3)?;
//! let p = coax.at(100e6)?;
//! let zc = p.zc_ohm.finite().unwrap();
//! assert!((zc.re - 47.5).abs() < 0.5);
//! assert!(p.atten_db_per_m() > 0.0);
//! # Ok::<(), echoline::Error>(())
//! ```
//!
//! Size: `Coax<f64>` ≤ 328 bytes, `Coax<f32>` ≤ 164 bytes (no heap).

use crate::error::{self, Error, Result};
use crate::line::conductor::{Conductor, Metal};
use crate::line::dielectric::Dielectric;
use crate::line::rlgc::Rlgc;
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::roots::find_root;
use crate::scalar::Real;

/// A coaxial line (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Coax<T> {
    inner_radius_m: T,
    outer_radius_m: T,
    log_ratio: T,
    metal: Metal<T>,
    rlgc: Rlgc<T>,
    te11_hz: T,
}

/// (J1′(x), Y1′(x)) for 0 < x ≤ 3 by the ascending series (Abramowitz & Stegun,
/// *Handbook of Mathematical Functions*, 1964, eqs. 9.1.10 and 9.1.11 with n = 1,
/// differentiated term by term), in the scalar's own precision:
///
///   J1′(x) = Σₖ (−1)ᵏ·(2k + 1)/2·(x/2)²ᵏ/(k!(k + 1)!),
///   Y1′(x) = 2/(πx²) + (2/π)·[J1(x)/x + ln(x/2)·J1′(x)]
///            − (1/π)·Σₖ (−1)ᵏ·[ψ(k + 1) + ψ(k + 2)]·(2k + 1)/2·(x/2)²ᵏ/(k!(k + 1)!),
///
/// ψ(1) = −γ, ψ(n + 1) = ψ(n) + 1/n. For x ≤ 3 the terms fall below ε of the
/// sum within 20 terms and the largest term is about 2.3, so the sums lose at
/// most one digit. (libm's single-precision J/Y use double precision inside;
/// this keeps the f32 path in f32.)
fn bessel1_prime_pair<T: Real>(x: T) -> (T, T) {
    let h = x * T::half();
    let h2 = h * h;
    let mut s = T::one(); // (−1)ᵏ (x/2)²ᵏ/(k!(k+1)!)
    let mut psi1 = -T::lit(0.577_215_664_901_532_9);
    let mut psi2 = T::one() + psi1;
    let (mut jp, mut j1h, mut ysum) = (T::zero(), T::zero(), T::zero());
    for k in 0..30u32 {
        if k > 0 {
            let kf = T::from_usize(k as usize);
            s = -s * h2 / (kf * (kf + T::one()));
            psi1 = psi1 + T::one() / kf;
            psi2 = psi2 + T::one() / (kf + T::one());
        }
        let c = (T::lit(2.0) * T::from_usize(k as usize) + T::one()) * T::half() * s;
        jp = jp + c;
        j1h = j1h + s;
        ysum = ysum + (psi1 + psi2) * c;
        if s.abs() <= T::EPS * T::lit(1e-3) {
            break;
        }
    }
    let j1 = j1h * h;
    let yp =
        T::two() / (T::PI() * x * x) + T::two() / T::PI() * (j1 / x + h.ln() * jp) - ysum / T::PI();
    (jp, yp)
}

/// The smallest root x = kc·a of J1′(x)Y1′(rx) − J1′(rx)Y1′(x), r = b/a > 1.
/// The bracket [0.5, 1.3]·x0 keeps x and rx within (0, 2.6], the range of
/// [`bessel1_prime_pair`].
fn te11_root<T: Real>(r: T) -> Result<T> {
    let x0 = T::two() / (T::one() + r);
    if r < T::lit(1.001) {
        return Ok(x0);
    }
    let cross = |x: T| -> Result<T> {
        let (jx, yx) = bessel1_prime_pair(x);
        let (jr, yr) = bessel1_prime_pair(r * x);
        Ok(jx * yr - jr * yx)
    };
    let root = find_root(cross, T::half() * x0, T::lit(1.3) * x0, T::zero(), 100)?;
    Ok(root.x)
}

impl<T: Real> Coax<T> {
    /// From the inner conductor diameter d and the outer conductor's inner
    /// diameter D (m, 0 < d < D), a dielectric, the conductivity of both
    /// conductors σ > 0 (S/m) and the shield wall thickness t > 0 (m).
    pub fn new(
        inner_diameter_m: T,
        outer_diameter_m: T,
        dielectric: Dielectric<T>,
        conductivity_s_per_m: T,
        shield_thickness_m: T,
    ) -> Result<Self> {
        let d = error::positive(inner_diameter_m, "inner_diameter_m")?;
        let dd = error::positive(outer_diameter_m, "outer_diameter_m")?;
        if d >= dd {
            return Err(Error::OutOfRange("inner_diameter_m"));
        }
        let metal = Metal::new(conductivity_s_per_m)?;
        let t = error::positive(shield_thickness_m, "shield_thickness_m")?;
        let a = d * T::half();
        let b = dd * T::half();
        let log_ratio = (dd / d).ln();
        let l_ext = T::mu0() / T::two_pi() * log_ratio;
        let c_vac = T::two_pi() * T::eps0() / log_ratio;
        let inner = Conductor::round_wire(metal, a)?;
        let outer = Conductor::tube(metal, b, t)?;
        let rlgc = Rlgc::builder(l_ext, c_vac)
            .dielectric(dielectric)
            .conductor(inner)
            .conductor(outer)
            .build()?;
        let mut coax = Coax {
            inner_radius_m: a,
            outer_radius_m: b,
            log_ratio,
            metal,
            rlgc,
            te11_hz: T::zero(),
        };
        let x = te11_root(b / a)?;
        // fc = c0·x/(2πa√ε′(fc)), ε′ taken at the cutoff (two passes).
        let vac = T::c0() * x / (T::two_pi() * a);
        let mut fc = vac / dielectric.eval(vac).0.sqrt();
        fc = vac / dielectric.eval(fc).0.sqrt();
        coax.te11_hz = error::finite(fc, "outer_diameter_m")?;
        Ok(coax)
    }

    /// The exact TE11 cutoff frequency, Hz.
    pub fn te11_cutoff_hz(&self) -> T {
        self.te11_hz
    }

    /// The approximation fc ≈ c0/(π√ε′(a + b)) with ε′ at that frequency, Hz
    /// (error documented in the module docs).
    pub fn te11_cutoff_approx_hz(&self) -> T {
        let d = self.rlgc.dielectric();
        let vac = T::c0() / (T::PI() * (self.inner_radius_m + self.outer_radius_m));
        let f = vac / d.eval(vac).0.sqrt();
        vac / d.eval(f).0.sqrt()
    }

    /// The RLGC model underneath.
    pub fn rlgc(&self) -> &Rlgc<T> {
        &self.rlgc
    }

    /// Inner conductor radius a, m.
    pub fn inner_radius_m(&self) -> T {
        self.inner_radius_m
    }

    /// Outer conductor inner radius b, m.
    pub fn outer_radius_m(&self) -> T {
        self.outer_radius_m
    }

    fn eps_at(&self, freq_hz: T) -> Result<(T, T)> {
        let e = self.rlgc.dielectric().at(freq_hz)?;
        Ok((e.re, -e.im / e.re))
    }

    /// Lossless closed form Z0 = η0/(2π√ε′)·ln(D/d) with ε′ at `freq_hz`, Ω.
    pub fn z0_closed_form_ohm(&self, freq_hz: T) -> Result<T> {
        let (er, _) = self.eps_at(freq_hz)?;
        Ok(T::eta0() / (T::two_pi() * er.sqrt()) * self.log_ratio)
    }

    /// High-frequency conductor attenuation αc = Rs(1/a + 1/b)/(2η·ln(b/a)), Np/m.
    pub fn alpha_conductor_closed_form_np_per_m(&self, freq_hz: T) -> Result<T> {
        let (er, _) = self.eps_at(freq_hz)?;
        let rs = self.metal.surface_resistance_ohm(freq_hz)?;
        let eta = T::eta0() / er.sqrt();
        let sum = T::one() / self.inner_radius_m + T::one() / self.outer_radius_m;
        Ok(rs * sum / (T::two() * eta * self.log_ratio))
    }

    /// Dielectric attenuation αd = π f √ε′·tanδ/c0, Np/m.
    pub fn alpha_dielectric_closed_form_np_per_m(&self, freq_hz: T) -> Result<T> {
        let (er, tan_d) = self.eps_at(freq_hz)?;
        Ok(T::PI() * freq_hz * er.sqrt() * tan_d / T::c0())
    }
}

impl<T: Real> LineModel<T> for Coax<T> {
    #[inline]
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let mut p = self.rlgc.at(freq_hz)?;
        p.warnings
            .set_if(p.freq_hz >= self.te11_hz, Warnings::ABOVE_HIGHER_MODE);
        Ok(p)
    }

    fn cutoff_hz(&self) -> Option<T> {
        Some(self.te11_hz)
    }
    #[inline]
    fn propagation_lanes(
        &self,
        freqs_hz: &[T],
        out: &mut crate::line::PropagationLanes<T>,
    ) -> Result<()> {
        self.rlgc.propagation_lanes(freqs_hz, out)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn bessel_series_matches_libm_in_f64() {
        // libm's double-precision J0/J1/Y0/Y1 as the check (A&S 9.1.27 for the
        // derivatives).
        for &x in &[1e-3f64, 0.05, 0.3, 1.0, 1.8412, 2.6, 3.0] {
            let (jp, yp) = bessel1_prime_pair(x);
            let jp_ref = libm::j0(x) - libm::j1(x) / x;
            let yp_ref = libm::y0(x) - libm::y1(x) / x;
            assert_relative_eq!(jp, jp_ref, max_relative = 1e-13, epsilon = 1e-15);
            assert_relative_eq!(yp, yp_ref, max_relative = 1e-13);
        }
        // J1′ vanishes at the first root of J1′, 1.841 183 78 (A&S Table 9.5).
        assert!(bessel1_prime_pair(1.841_183_781_340_659f64).0.abs() < 1e-14);
    }

    #[test]
    fn per_unit_length_values() {
        let c = Coax::<f64>::new(
            1e-3,
            3.5e-3,
            Dielectric::constant(2.25, 0.0).unwrap(),
            5.8e7,
            0.2e-3,
        )
        .unwrap();
        let ln = 3.5f64.ln();
        assert_relative_eq!(
            c.rlgc().l_ext_h_per_m(),
            1.256_637_062_12e-6 / core::f64::consts::TAU * ln,
            max_relative = 1e-12
        );
        let z0 = c.z0_closed_form_ohm(1e9).unwrap();
        assert_relative_eq!(
            z0,
            376.730_313_668 / (core::f64::consts::TAU * 1.5) * ln,
            max_relative = 1e-9
        );
        let zc = c.at(1e10).unwrap().zc_ohm.finite().unwrap();
        assert_relative_eq!(zc.re, z0, max_relative = 1e-3);
        // TE11 at b/a = 3.0: exact/approx − 1 = +2.72 % (reference notes,
        // methods.md §1 [calc]); the full table is in tests/tests/geometry.rs.
        let c3 = Coax::<f64>::new(1e-3, 3e-3, Dielectric::vacuum(), 5.8e7, 0.2e-3).unwrap();
        let ratio = c3.cutoff_hz().unwrap() / c3.te11_cutoff_approx_hz() - 1.0;
        assert!((ratio - 0.0272).abs() < 5e-5, "{ratio}");
        let fc = c.cutoff_hz().unwrap();
        assert!(!c
            .at(0.99 * fc)
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
        assert!(c
            .at(fc)
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
        let c32 = Coax::<f32>::new(
            1e-3,
            3.5e-3,
            Dielectric::constant(2.25, 0.0).unwrap(),
            5.8e7,
            0.2e-3,
        )
        .unwrap();
        assert_relative_eq!(c32.cutoff_hz().unwrap() as f64, fc, max_relative = 1e-5);
    }

    #[test]
    fn bad_geometry_is_named() {
        let d = Dielectric::<f64>::vacuum();
        assert_eq!(
            Coax::new(3e-3, 3e-3, d, 5.8e7, 1e-4),
            Err(Error::OutOfRange("inner_diameter_m"))
        );
        assert_eq!(
            Coax::new(0.0, 3e-3, d, 5.8e7, 1e-4),
            Err(Error::NotPositive("inner_diameter_m"))
        );
        assert_eq!(
            Coax::new(1e-3, f64::NAN, d, 5.8e7, 1e-4),
            Err(Error::NonFinite("outer_diameter_m"))
        );
        assert_eq!(
            Coax::new(1e-3, 3e-3, d, -1.0, 1e-4),
            Err(Error::NotPositive("conductivity_s_per_m"))
        );
        assert_eq!(
            Coax::new(1e-3, 3e-3, d, 5.8e7, 0.0),
            Err(Error::NotPositive("shield_thickness_m"))
        );
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<Coax<f64>>() <= 328);
        assert!(core::mem::size_of::<Coax<f32>>() <= 164);
    }
}

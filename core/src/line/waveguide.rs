//! Rectangular waveguide, TE10 mode, as an equivalent dispersive line.
//!
//! Broad wall a, narrow wall b ≤ a, filled with a dielectric ε = ε′ − jε″
//! (Pozar, *Microwave Engineering*, 4th ed., 2012, §3.3; values from memory):
//!
//! * cutoff fc = c0/(2a√ε′), kc = π/a; k = ω√(μ0ε0ε′), β = √(k² − kc²);
//! * guide wavelength λg = 2π/β = λ/√(1 − (fc/f)²), group velocity
//!   vg = c0·√(1 − (fc/f)²)/√ε′, wave impedance Z_TE = kη/β = η/√(1 − (fc/f)²);
//! * wall loss αc = Rs(2bπ² + a³k²)/(a³·b·β·k·η) Np/m; dielectric loss
//!   αd = k²·tanδ/(2β).
//!
//! **Equivalent line.** γ² = kc² − k² is written as Z·Y with Z = jωμ0 and
//! Y = jωε0ε′ + ωε0ε″ − j·kc²/(ωμ0) + G_w, so that Zc = √(Z/Y) = Z_TE and γ = jβ
//! above cutoff. The wall loss is carried by G_w = (2Rs/η²)·(1/b + 2kc²/(a·k²)),
//! which gives exactly αc above to first order in Rs (δγ = Z·G_w/(2γ) =
//! ωμ0·G_w/(2β)); it is a representation, not a physical leakage, and the
//! [`LinePoint::model_loss_split_np_per_m`] holds (αc, αd) from the closed forms.
//!
//! **Below cutoff** the mode is evanescent: γ is real (α = √(kc² − k²), β = 0),
//! Zc is imaginary (inductive), and every point carries
//! [`Warnings::EVANESCENT`]. At or above the next cutoff, TE20 at c0/(a√ε′) or
//! TE01 at c0/(2b√ε′), points carry [`Warnings::ABOVE_HIGHER_MODE`]. Near
//! cutoff (|Im Y| small) HIGH_LOSS flags that the small-loss forms fail.
//! [`cutoff_hz`](LineModel::cutoff_hz) returns the TE10 cutoff (the waveguide
//! cutoff of the line interface); [`Waveguide::next_cutoff_hz`] the next one.
//!
//! A waveguide has no DC limit (the shunt susceptance kc²/(ωμ0) is infinite):
//! `at(0)` returns [`Error::Undefined`]`("freq_hz")`.
//!
//! Size: `Waveguide<f64>` ≤ 160 bytes, `Waveguide<f32>` ≤ 80 bytes (no heap).

use crate::error::{self, Error, Result};
use crate::line::conductor::Metal;
use crate::line::dielectric::Dielectric;
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::complex::Cx;
use crate::scalar::Real;

/// A rectangular waveguide in its TE10 mode (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Waveguide<T> {
    a: T,
    b: T,
    dielectric: Dielectric<T>,
    metal: Option<Metal<T>>,
    kc2: T,
    te10_hz: T,
    next_hz: T,
    base: Warnings,
}

/// c0/(L√ε′) with ε′ at that frequency (two passes).
fn cutoff_for<T: Real>(d: &Dielectric<T>, length_m: T) -> T {
    let vac = T::c0() / length_m;
    let f = vac / d.eval(vac).0.sqrt();
    vac / d.eval(f).0.sqrt()
}

impl<T: Real> Waveguide<T> {
    /// From the broad wall a > 0 and narrow wall 0 < b ≤ a (m), the filling
    /// dielectric and the wall metal (`None`: perfect walls).
    pub fn new(
        width_m: T,
        height_m: T,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        let a = error::positive(width_m, "width_m")?;
        let b = error::positive(height_m, "height_m")?;
        if b > a {
            return Err(Error::OutOfRange("height_m"));
        }
        let kc = T::PI() / a;
        let mut base = Warnings::NONE;
        base.set_if(dielectric.is_non_causal(), Warnings::NON_CAUSAL_DIELECTRIC);
        Ok(Waveguide {
            a,
            b,
            dielectric,
            metal,
            kc2: kc * kc,
            te10_hz: cutoff_for(&dielectric, T::two() * a),
            next_hz: cutoff_for(&dielectric, a.max(T::two() * b)),
            base,
        })
    }

    /// TE10 cutoff c0/(2a√ε′) with ε′ at the cutoff (two passes), Hz.
    pub fn te10_cutoff_hz(&self) -> T {
        self.te10_hz
    }

    /// The next cutoff, min(TE20 = c0/(a√ε′), TE01 = c0/(2b√ε′)), Hz.
    pub fn next_cutoff_hz(&self) -> T {
        self.next_hz
    }

    /// Closed forms at f > 0 above cutoff: (β rad/m, Z_TE Ω, αc Np/m, αd Np/m);
    /// below cutoff β = 0 and Z_TE, αc, αd are not defined (`Undefined`).
    pub fn closed_forms(&self, freq_hz: T) -> Result<(T, T, T, T)> {
        let f = error::positive(freq_hz, "freq_hz")?;
        let (er, loss) = self.dielectric.eval(f);
        let k = T::two_pi() * f * er.sqrt() / T::c0();
        let b2 = k * k - self.kc2;
        if b2 <= T::zero() {
            return Err(Error::Undefined("freq_hz"));
        }
        let beta = b2.sqrt();
        let eta = T::eta0() / er.sqrt();
        let rs = match self.metal {
            Some(m) => m.surface_resistance_ohm(f)?,
            None => T::zero(),
        };
        let (a, b) = (self.a, self.b);
        let a3 = a * a * a;
        let pi2 = T::PI() * T::PI();
        let ac = rs * (T::two() * b * pi2 + a3 * k * k) / (a3 * b * beta * k * eta);
        let ad = k * k * (loss / er) / (T::two() * beta);
        Ok((beta, k * eta / beta, ac, ad))
    }

    /// Broad wall a, m.
    pub fn width_m(&self) -> T {
        self.a
    }
    /// Narrow wall b, m.
    pub fn height_m(&self) -> T {
        self.b
    }
}

impl<T: Real> LineModel<T> for Waveguide<T> {
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        if f == T::zero() {
            return Err(Error::Undefined("freq_hz"));
        }
        let (er, loss) = self.dielectric.eval(f);
        let w = T::two_pi() * f;
        let wmu = w * T::mu0();
        let weps = w * T::eps0();
        let k2 = w * w * T::mu0() * T::eps0() * er;
        let g_w = match self.metal {
            Some(m) => {
                let rs = m.surface_resistance_ohm(f)?;
                // 2Rs/η² = 2Rs·ε/μ0.
                T::two() * rs * T::eps0() * er / T::mu0()
                    * (T::one() / self.b + T::two() * self.kc2 / (self.a * k2))
            }
            None => T::zero(),
        };
        let z = Cx::new(T::zero(), wmu);
        let y = Cx::new(weps * loss + g_w, weps * er - self.kc2 / wmu);
        let zy = z * y;
        if !crate::math::complex::is_finite(zy) {
            return Err(Error::NonFinite("gamma_per_m"));
        }
        let gamma = crate::math::complex::sqrt(zy);
        let zc = crate::math::complex::div(z, gamma);
        let mut warn = self.base;
        let evanescent = k2 < self.kc2;
        warn.set_if(evanescent, Warnings::EVANESCENT);
        warn.set_if(
            !evanescent && y.re > T::zero() && y.re >= T::lit(0.1) * y.im,
            Warnings::HIGH_LOSS,
        );
        warn.set_if(f >= self.next_hz, Warnings::ABOVE_HIGHER_MODE);
        let split = match self.closed_forms(f) {
            Ok((_, _, ac, ad)) => Some((ac, ad)),
            Err(_) => None,
        };
        if !crate::math::complex::is_finite(gamma) || !crate::math::complex::is_finite(y) {
            return Err(Error::NonFinite("gamma_per_m"));
        }
        Ok(LinePoint {
            freq_hz: f,
            z_ohm_per_m: z,
            y_s_per_m: y,
            gamma_per_m: gamma,
            zc_ohm: crate::value::Impedance::from_complex(zc),
            model_loss_split_np_per_m: split,
            warnings: warn,
        })
    }

    fn cutoff_hz(&self) -> Option<T> {
        Some(self.te10_cutoff_hz())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::properties;
    use approx::assert_relative_eq;

    // WR-90: a = 22.86 mm, b = 10.16 mm (common practice, no single source).
    fn wr90<T: Real>(metal: Option<Metal<T>>) -> Waveguide<T> {
        Waveguide::new(
            T::lit(22.86e-3),
            T::lit(10.16e-3),
            Dielectric::vacuum(),
            metal,
        )
        .unwrap()
    }

    #[test]
    fn te10_relations() {
        let g = wr90::<f64>(None);
        let fc = g.te10_cutoff_hz();
        assert_relative_eq!(fc, 299_792_458.0 / (2.0 * 22.86e-3), max_relative = 1e-14);
        assert_relative_eq!(g.next_cutoff_hz(), 2.0 * fc, max_relative = 1e-14);
        let f = 10e9;
        let r = (1.0 - (fc / f) * (fc / f)).sqrt();
        let p = properties(&g, f).unwrap();
        let lambda = 299_792_458.0 / f;
        assert_relative_eq!(p.wavelength_m, lambda / r, max_relative = 1e-12);
        assert_relative_eq!(
            p.group_velocity_m_per_s,
            299_792_458.0 * r,
            max_relative = 1e-8
        );
        let zc = p.point.zc_ohm.finite().unwrap();
        assert_relative_eq!(zc.re, 376.730_313_668 / r, max_relative = 1e-9);
        assert!(p.point.warnings.is_empty());
        // Below cutoff: evanescent, α = √(kc² − k²).
        let q = g.at(0.5 * fc).unwrap();
        assert!(q.warnings.contains(Warnings::EVANESCENT));
        let kc = core::f64::consts::PI / 22.86e-3;
        let k = core::f64::consts::TAU * 0.5 * fc / 299_792_458.0;
        assert_relative_eq!(
            q.alpha_np_per_m(),
            (kc * kc - k * k).sqrt(),
            max_relative = 1e-12
        );
        assert!(q.beta_rad_per_m().abs() < 1e-9);
        assert!(g
            .at(2.0 * fc)
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
        assert_eq!(g.at(0.0), Err(Error::Undefined("freq_hz")));
    }

    #[test]
    fn wall_loss_matches_pozar() {
        let cu = Metal::<f64>::copper();
        let g = wr90(Some(cu));
        for &f in &[8.5e9, 10e9, 12e9] {
            let (_, _, ac, ad) = g.closed_forms(f).unwrap();
            assert_eq!(ad, 0.0);
            let p = g.at(f).unwrap();
            assert_relative_eq!(p.alpha_np_per_m(), ac, max_relative = 1e-6);
        }
        // Order of magnitude: WR-90 copper near 10 GHz ≈ 0.01 Np/m (common practice).
        let (_, _, ac, _) = g.closed_forms(10e9).unwrap();
        assert!(ac > 0.008 && ac < 0.015, "{ac}");
    }

    #[test]
    fn bad_geometry_is_named() {
        let d = Dielectric::<f64>::vacuum();
        assert_eq!(
            Waveguide::new(1e-2, 2e-2, d, None),
            Err(Error::OutOfRange("height_m"))
        );
        assert_eq!(
            Waveguide::new(0.0, 2e-2, d, None),
            Err(Error::NotPositive("width_m"))
        );
        assert_eq!(
            Waveguide::new(1e-2, f64::NAN, d, None),
            Err(Error::NonFinite("height_m"))
        );
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<Waveguide<f64>>() <= 160);
        assert!(core::mem::size_of::<Waveguide<f32>>() <= 80);
    }
}

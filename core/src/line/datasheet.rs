//! A cable from its datasheet: nominal impedance, velocity factor and the
//! attenuation at one or two frequencies, the way technicians know their cables.
//!
//! **Loss split.** The matched-line attenuation of a TEM cable is the sum of a
//! conductor part, ∝ √f in the skin-effect regime, and a dielectric part, ∝ f
//! for a constant loss tangent (Pozar, *Microwave Engineering*, 4th ed., 2012,
//! §2.7; the two-term fit α(f) = k1·√f + k2·f is common practice for cable
//! attenuation tables, no single source):
//!
//! * two figures (f1, α1), (f2, α2): the 2×2 system k1√fᵢ + k2fᵢ = αᵢ is solved
//!   exactly; both coefficients must come out ≥ 0, i.e. the attenuation must grow
//!   at least like √f and at most like f between the two figures, otherwise
//!   [`Error::OutOfRange`]`("atten_db_per_m")`;
//! * one figure: a stated split, by default **all skin effect**
//!   (k2 = 0; set another share with [`DatasheetBuilder::skin_fraction`]);
//!   [`DatasheetCable::split_assumed`] says so.
//!
//! **Line.** L = Z0/v, C = 1/(Z0·v) with v = VF·c0; the skin term becomes a
//! series internal impedance whose resistance tends to 2·Z0·k1·√f (with the
//! matching internal reactance), from a DC resistance R_dc·√(1 + j f/f_c) when
//! one is given ([`DatasheetBuilder::dc_resistance_ohm_per_m`], the loop
//! resistance of both conductors), else (1 + j)·2Z0k1·√f, which is zero at DC;
//! the f term becomes G = ωC·tanδ with tanδ = k2·VF·c0/π (so G·Z0/2 = k2·f).
//! The result is an RLGC line with a complex, frequency-dependent Zc that works
//! from DC. The fit then corrects k1 and k2 (a few fixed-point steps) so that
//! the **exact** α = Re √(ZY) equals the given figures at the given frequencies
//! (to rounding), not only the small-loss sum.
//!
//! **Accuracy.** At the figures the attenuation is exact. The velocity factor and
//! |Zc| equal the nominal values to within 1.5·α/β (the internal
//! reactance of the skin effect slows the line by about αc/β, so VF is the
//! high-frequency limit and is approached from below): well under 1 % at HF for
//! real cables. Between and near the figures the two-term law is as good as the
//! cable follows it; outside a decade beyond them results carry
//! [`Warnings::EXTRAPOLATED`]. A constant tanδ is not causal:
//! [`Warnings::NON_CAUSAL_DIELECTRIC`] when k2 > 0.
//!
//! Units: dB per metre internally; [`DB_PER_100FT_TO_DB_PER_M`] and
//! [`DB_PER_100M_TO_DB_PER_M`] convert. Size: `DatasheetCable<f64>` ≤ 128 bytes, `DatasheetCable<f32>` ≤ 64 bytes.

use crate::error::{self, Error, Result};
use crate::line::tem::{self, SkinLoss};
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::complex::Cx;
use crate::scalar::{Real, DB_PER_NEPER};

/// dB/100 ft → dB/m: 1/30.48.
pub const DB_PER_100FT_TO_DB_PER_M: f64 = 1.0 / 30.48;
/// dB/100 m → dB/m: 1/100.
pub const DB_PER_100M_TO_DB_PER_M: f64 = 0.01;

/// Most attenuation figures a datasheet fit takes.
pub const MAX_FIGURES: usize = 2;

/// Builds a [`DatasheetCable`]; every value is checked by [`DatasheetBuilder::build`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DatasheetBuilder<T> {
    z0_ohm: T,
    velocity_factor: T,
    vf_range: Option<(T, T)>,
    figures: [Option<(T, T)>; MAX_FIGURES],
    overflow: bool,
    skin_fraction: Option<T>,
    r_dc: Option<T>,
}

/// A cable fitted from datasheet figures (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DatasheetCable<T> {
    z0_ohm: T,
    velocity_factor: T,
    vf_lo: T,
    vf_hi: T,
    k1: T,
    k2: T,
    split_assumed: bool,
    skin: SkinLoss<T>,
    tan_d: T,
    f_lo: T,
    f_hi: T,
    base: Warnings,
}

impl<T: Real> DatasheetBuilder<T> {
    /// A velocity-factor range lo ≤ VF ≤ hi (kept for uncertainty; the nominal
    /// VF given to [`DatasheetCable::builder`] must lie inside).
    pub fn velocity_factor_range(mut self, lo: T, hi: T) -> Self {
        self.vf_range = Some((lo, hi));
        self
    }
    /// Adds an attenuation figure in dB/m at `freq_hz` (at most [`MAX_FIGURES`]).
    pub fn attenuation_db_per_m(mut self, freq_hz: T, atten_db_per_m: T) -> Self {
        match self.figures.iter_mut().find(|s| s.is_none()) {
            Some(slot) => *slot = Some((freq_hz, atten_db_per_m)),
            None => self.overflow = true,
        }
        self
    }
    /// Adds an attenuation figure in dB/100 m.
    pub fn attenuation_db_per_100m(self, freq_hz: T, atten_db_per_100m: T) -> Self {
        self.attenuation_db_per_m(freq_hz, atten_db_per_100m * T::lit(DB_PER_100M_TO_DB_PER_M))
    }
    /// Adds an attenuation figure in dB/100 ft.
    pub fn attenuation_db_per_100ft(self, freq_hz: T, atten_db_per_100ft: T) -> Self {
        self.attenuation_db_per_m(
            freq_hz,
            atten_db_per_100ft * T::lit(DB_PER_100FT_TO_DB_PER_M),
        )
    }
    /// With one figure: the share of the attenuation taken as skin effect, in
    /// [0, 1] (default 1: all skin effect). Ignored with two figures.
    pub fn skin_fraction(mut self, fraction: T) -> Self {
        self.skin_fraction = Some(fraction);
        self
    }
    /// The DC loop resistance of both conductors, Ω/m (> 0), so R tends to it at DC.
    pub fn dc_resistance_ohm_per_m(mut self, r_dc_ohm_per_m: T) -> Self {
        self.r_dc = Some(r_dc_ohm_per_m);
        self
    }

    /// Validates and fits: `z0_ohm` > 0, 0 < `velocity_factor` ≤ 1, at least one
    /// figure with `freq_hz` > 0 and `atten_db_per_m` ≥ 0 (two figures at
    /// different frequencies), `skin_fraction` in [0, 1], `r_dc_ohm_per_m` > 0.
    pub fn build(self) -> Result<DatasheetCable<T>> {
        if self.overflow {
            return Err(Error::Capacity {
                what: "attenuation figures",
                capacity: MAX_FIGURES,
            });
        }
        let z0 = error::positive(self.z0_ohm, "z0_ohm")?;
        let vf = error::positive(self.velocity_factor, "velocity_factor")?;
        if vf > T::one() {
            return Err(Error::OutOfRange("velocity_factor"));
        }
        let (vf_lo, vf_hi) = match self.vf_range {
            Some((lo, hi)) => {
                let lo = error::positive(lo, "velocity_factor_lo")?;
                let hi = error::positive(hi, "velocity_factor_hi")?;
                if hi > T::one() || hi < vf {
                    return Err(Error::OutOfRange("velocity_factor_hi"));
                }
                if lo > vf {
                    return Err(Error::OutOfRange("velocity_factor_lo"));
                }
                (lo, hi)
            }
            None => (vf, vf),
        };
        let r_dc = match self.r_dc {
            Some(r) => Some(error::positive(r, "r_dc_ohm_per_m")?),
            None => None,
        };
        let np = T::one() / T::lit(DB_PER_NEPER);
        let mut figs = [(T::zero(), T::zero()); MAX_FIGURES];
        let mut n = 0;
        for (slot, fig) in figs.iter_mut().zip(self.figures.iter().flatten()) {
            let f = error::positive(fig.0, "freq_hz")?;
            let a = error::non_negative(fig.1, "atten_db_per_m")?;
            *slot = (f, a * np);
            n += 1;
        }
        let [(f1, a1), (f2, a2)] = figs;
        let two = n == 2;
        if n == 0 {
            return Err(Error::TooShort {
                what: "attenuation figures",
                needed: 1,
            });
        }
        if two && f1 == f2 {
            return Err(Error::OutOfRange("freq_hz"));
        }
        let s = match (two, self.skin_fraction) {
            (false, Some(x)) => error::in_range(x, T::zero(), T::one(), "skin_fraction")?,
            _ => T::one(),
        };
        let v = vf * T::c0();
        let mut cable = DatasheetCable {
            z0_ohm: z0,
            velocity_factor: vf,
            vf_lo,
            vf_hi,
            k1: T::zero(),
            k2: T::zero(),
            split_assumed: !two,
            skin: SkinLoss::None,
            tan_d: T::zero(),
            f_lo: if two { f1.min(f2) } else { f1 },
            f_hi: if two { f1.max(f2) } else { f1 },
            base: Warnings::NONE,
        };
        // Solve for (k1, k2), then correct the targets by the exact-vs-small-loss
        // residual and solve again (the map is near the identity).
        let solve = |t1: T, t2: T| -> Result<(T, T)> {
            if two {
                let (r1, r2) = (f1.sqrt(), f2.sqrt());
                let det = r1 * f2 - r2 * f1;
                let k1 = (t1 * f2 - t2 * f1) / det;
                let k2 = (r1 * t2 - r2 * t1) / det;
                let tiny = -T::EPS * T::lit(64.0) * (t1.abs() + t2.abs()) / (r1 + r2);
                if !(k1 >= tiny && k2 * (r1 + r2) >= tiny * (f1 + f2)) {
                    return Err(Error::OutOfRange("atten_db_per_m"));
                }
                Ok((k1.max(T::zero()), k2.max(T::zero())))
            } else {
                Ok((s * t1 / f1.sqrt(), (T::one() - s) * t1 / f1))
            }
        };
        let (mut t1, mut t2) = (a1, a2);
        for _ in 0..8 {
            let (k1, k2) = solve(t1, t2)?;
            cable.set_loss(k1, k2, v, r_dc)?;
            let m1 = cable.at(f1)?.alpha_np_per_m();
            let e1 = a1 - m1;
            let e2 = if two {
                a2 - cable.at(f2)?.alpha_np_per_m()
            } else {
                T::zero()
            };
            let tol = T::EPS * T::lit(4.0);
            if e1.abs() <= tol * a1 && e2.abs() <= tol * a2 {
                break;
            }
            t1 = (t1 + e1).max(T::zero());
            t2 = (t2 + e2).max(T::zero());
        }
        Ok(cable)
    }
}

impl<T: Real> DatasheetCable<T> {
    /// Starts a builder from the nominal impedance Z0 (Ω) and velocity factor.
    pub fn builder(z0_ohm: T, velocity_factor: T) -> DatasheetBuilder<T> {
        DatasheetBuilder {
            z0_ohm,
            velocity_factor,
            vf_range: None,
            figures: [None; MAX_FIGURES],
            overflow: false,
            skin_fraction: None,
            r_dc: None,
        }
    }

    fn set_loss(&mut self, k1: T, k2: T, v: T, r_dc: Option<T>) -> Result<()> {
        self.k1 = k1;
        self.k2 = k2;
        self.skin = SkinLoss::new(T::two() * self.z0_ohm * k1, r_dc)?;
        let tan_d = k2 * v / T::PI();
        if tan_d >= T::one() {
            return Err(Error::OutOfRange("atten_db_per_m"));
        }
        self.tan_d = tan_d;
        self.base = if k2 > T::zero() {
            Warnings::NON_CAUSAL_DIELECTRIC
        } else {
            Warnings::NONE
        };
        Ok(())
    }

    /// The nominal impedance, Ω.
    pub fn z0_ohm(&self) -> T {
        self.z0_ohm
    }
    /// The nominal velocity factor.
    pub fn velocity_factor(&self) -> T {
        self.velocity_factor
    }
    /// The velocity-factor range (lo, hi); (VF, VF) when none was given.
    pub fn velocity_factor_range(&self) -> (T, T) {
        (self.vf_lo, self.vf_hi)
    }
    /// The fitted skin-effect coefficient k1, Np/(m·√Hz).
    pub fn k1_np_per_m_sqrt_hz(&self) -> T {
        self.k1
    }
    /// The fitted dielectric coefficient k2, Np/(m·Hz).
    pub fn k2_np_per_m_hz(&self) -> T {
        self.k2
    }
    /// `true` when the split between skin and dielectric loss was assumed (one figure).
    pub fn split_assumed(&self) -> bool {
        self.split_assumed
    }
    /// The loss tangent equivalent to the dielectric term, k2·VF·c0/π.
    pub fn tan_delta(&self) -> T {
        self.tan_d
    }
    /// The small-loss two-term attenuation k1·√f + k2·f at `freq_hz` ≥ 0, dB/m.
    pub fn atten_two_term_db_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok((self.k1 * f.sqrt() + self.k2 * f) * T::lit(DB_PER_NEPER))
    }
    /// The frequency band [lo/10, hi·10] outside which results are EXTRAPOLATED, Hz.
    pub fn trusted_band_hz(&self) -> (T, T) {
        (self.f_lo / T::lit(10.0), self.f_hi * T::lit(10.0))
    }
}

impl<T: Real> LineModel<T> for DatasheetCable<T> {
    #[inline]
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let eps_eff = T::one() / (self.velocity_factor * self.velocity_factor);
        let (z, y) = tem::zy(f, self.z0_ohm, eps_eff, self.tan_d, self.skin.eval(f));
        let mut w = self.base;
        let (lo, hi) = self.trusted_band_hz();
        w.set_if(f < lo || f > hi, Warnings::EXTRAPOLATED);
        let mut p = tem::point(f, z, y, Some(Cx::new(self.z0_ohm, T::zero())), w)?;
        let half = T::half();
        p.model_loss_split_np_per_m = Some((half * z.re / self.z0_ohm, half * y.re * self.z0_ohm));
        Ok(p)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::properties;
    use approx::assert_relative_eq;

    // Invented demo figures, RG-58-class: 50 Ω, VF 0.66, 4.6 dB/100 ft at
    // 10 MHz (hypothetical), 16 dB/100 m at 100 MHz, 52 dB/100 m at 1 GHz.
    fn two_point<T: Real>() -> DatasheetCable<T> {
        DatasheetCable::builder(T::lit(50.0), T::lit(0.66))
            .attenuation_db_per_100m(T::lit(100e6), T::lit(16.0))
            .attenuation_db_per_100m(T::lit(1e9), T::lit(52.0))
            .build()
            .unwrap()
    }

    #[test]
    fn reproduces_figures_exactly() {
        let c = two_point::<f64>();
        assert!(!c.split_assumed());
        assert_relative_eq!(
            c.at(100e6).unwrap().atten_db_per_m(),
            0.16,
            max_relative = 1e-13
        );
        assert_relative_eq!(
            c.at(1e9).unwrap().atten_db_per_m(),
            0.52,
            max_relative = 1e-13
        );
        assert!(c.k1_np_per_m_sqrt_hz() > 0.0 && c.k2_np_per_m_hz() > 0.0);
        let c32 = two_point::<f32>();
        assert_relative_eq!(
            c32.at(1e9).unwrap().atten_db_per_m(),
            0.52,
            max_relative = 2e-6
        );
        // One figure, all skin: α ∝ √f; stated split.
        let one = DatasheetCable::<f64>::builder(75.0, 0.85)
            .attenuation_db_per_100ft(50e6, 1.5)
            .build()
            .unwrap();
        assert!(one.split_assumed());
        assert_eq!(one.k2_np_per_m_hz(), 0.0);
        assert_relative_eq!(
            one.at(50e6).unwrap().atten_db_per_m(),
            1.5 / 30.48,
            max_relative = 1e-13
        );
    }

    #[test]
    fn velocity_and_impedance_at_hf() {
        let c = two_point::<f64>();
        for &f in &[100e6, 1e9] {
            // The stated accuracy: within α/β of nominal (the skin effect's
            // internal reactance slows the line by about αc/β).
            let p = properties(&c, f).unwrap();
            let band = 1.5 * p.point.alpha_np_per_m() / p.point.beta_rad_per_m();
            assert!(band < 0.015);
            assert!((p.velocity_factor / 0.66 - 1.0).abs() <= band);
            assert!(p.velocity_factor < 0.66);
            let zc = p.point.zc_ohm.finite().unwrap();
            assert!((zc.re / 50.0 - 1.0).abs() <= band, "{zc} {band}");
            assert!(zc.im.abs() <= 50.0 * band);
        }
        // DC: no leakage conductance, so the line is open (Zc infinite).
        assert!(c.at(0.0).unwrap().warnings.contains(Warnings::EXTRAPOLATED));
        let w = c.at(300e6).unwrap().warnings;
        assert_eq!(w, Warnings::NON_CAUSAL_DIELECTRIC);
        assert!(c
            .at(20e9)
            .unwrap()
            .warnings
            .contains(Warnings::EXTRAPOLATED));
    }

    #[test]
    fn dc_resistance_sets_the_low_frequency_limit() {
        let c = DatasheetCable::<f64>::builder(50.0, 0.66)
            .attenuation_db_per_100m(100e6, 16.0)
            .dc_resistance_ohm_per_m(0.04)
            .build()
            .unwrap();
        assert_relative_eq!(
            c.at(0.0).unwrap().z_ohm_per_m.re,
            0.04,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            c.at(100e6).unwrap().atten_db_per_m(),
            0.16,
            max_relative = 1e-12
        );
    }

    #[test]
    fn bad_inputs_are_named() {
        let b = DatasheetCable::<f64>::builder(50.0, 0.66);
        assert_eq!(
            b.build(),
            Err(Error::TooShort {
                what: "attenuation figures",
                needed: 1
            })
        );
        // Attenuation growing faster than f: no passive split.
        assert_eq!(
            b.attenuation_db_per_m(1e8, 0.1)
                .attenuation_db_per_m(1e9, 2.0)
                .build(),
            Err(Error::OutOfRange("atten_db_per_m"))
        );
        assert_eq!(
            b.attenuation_db_per_m(1e8, 0.1)
                .attenuation_db_per_m(1e8, 0.2)
                .build(),
            Err(Error::OutOfRange("freq_hz"))
        );
        assert_eq!(
            b.attenuation_db_per_m(1e8, 0.1)
                .attenuation_db_per_m(2e8, 0.2)
                .attenuation_db_per_m(3e8, 0.3)
                .build(),
            Err(Error::Capacity {
                what: "attenuation figures",
                capacity: 2
            })
        );
        assert_eq!(
            DatasheetCable::<f64>::builder(50.0, 1.2)
                .attenuation_db_per_m(1e8, 0.1)
                .build(),
            Err(Error::OutOfRange("velocity_factor"))
        );
        assert_eq!(
            b.attenuation_db_per_m(f64::NAN, 0.1).build(),
            Err(Error::NonFinite("freq_hz"))
        );
        assert_eq!(
            b.attenuation_db_per_m(1e8, 0.1).skin_fraction(1.5).build(),
            Err(Error::OutOfRange("skin_fraction"))
        );
        assert_eq!(
            b.attenuation_db_per_m(1e8, 0.1)
                .velocity_factor_range(0.7, 0.8)
                .build(),
            Err(Error::OutOfRange("velocity_factor_lo"))
        );
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<DatasheetCable<f64>>() <= 128);
        assert!(core::mem::size_of::<DatasheetCable<f32>>() <= 64);
    }
}

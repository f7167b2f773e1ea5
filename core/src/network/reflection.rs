//! Reflection coefficient, mismatch figures and Smith-chart coordinates.
//!
//! **Convention.** Γ = (Z − Zr)/(Z + Zr) is the *voltage* (pseudo-wave)
//! reflection coefficient at a reference plane for a reference impedance Zr
//! (Pozar, *Microwave Engineering*, 4th ed., 2012, §2.3; Marks & Williams,
//! "A general waveguide circuit theory", J. Res. NIST 97(5), 1992, for complex
//! references). Zr may be complex (e.g. the Zc of a lossy line) but must have
//! Re Zr > 0. With a **real** Zr, every passive load (Re Z ≥ 0) gives |Γ| ≤ 1;
//! with a complex Zr a passive load can give |Γ| > 1 (this is not the
//! power-wave coefficient (Z − Zr*)/(Z + Zr), which would keep |Γ| ≤ 1).
//! Γ(Open) = 1 and Γ(short) = −1 exactly.
//!
//! Figures from |Γ| (Pozar §2.3; common practice):
//! VSWR = (1 + |Γ|)/(1 − |Γ|); return loss RL = −20·log10|Γ| dB;
//! mismatch loss ML = −10·log10(1 − |Γ|²) dB; transmitted power fraction 1 − |Γ|².
//! VSWR and ML are [`Extended::Infinite`] at |Γ| = 1, RL at Γ = 0.
//!
//! Smith chart: normalised impedance z = Z/Zr, admittance y = 1/z, and the
//! Γ-plane point (Smith, "Transmission line calculator", Electronics 12, 1939;
//! Pozar §2.4).

use crate::error::{self, Error, Result};
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::{Admittance, Extended, Impedance};

/// Rounding allowance on |Γ| ≤ 1: a computed |Γ| up to 1 + 8ε is taken as 1.
fn unit_slack<T: Real>() -> T {
    T::one() + T::lit(8.0) * T::EPS
}

pub(crate) fn check_ref<T: Real>(z_ref_ohm: Cx<T>) -> Result<Cx<T>> {
    if !complex::is_finite(z_ref_ohm) {
        return Err(Error::NonFinite("z_ref_ohm"));
    }
    if z_ref_ohm.re <= T::zero() {
        return Err(Error::NotPositive("z_ref_ohm"));
    }
    Ok(z_ref_ohm)
}

/// Γ = (Z − Zr)/(Z + Zr) of `z` for the reference `z_ref_ohm` (Re > 0).
///
/// Errors: `z_ref_ohm` non-finite or Re ≤ 0; a `Finite` `z` holding NaN/∞
/// ([`Error::NonFinite`] `"z_ohm"`); an active load with Z = −Zr
/// ([`Error::Undefined`] `"reflection"`).
pub fn reflection<T: Real>(z: Impedance<T>, z_ref_ohm: Cx<T>) -> Result<Cx<T>> {
    let zr = check_ref(z_ref_ohm)?;
    let zero = T::zero();
    match z {
        Impedance::Open => Ok(Cx::new(T::one(), zero)),
        Impedance::Finite(z) => {
            if !complex::is_finite(z) {
                return Err(Error::NonFinite("z_ohm"));
            }
            if z.re == zero && z.im == zero {
                return Ok(Cx::new(-T::one(), zero));
            }
            let den = z + zr;
            if den.re == zero && den.im == zero {
                return Err(Error::Undefined("reflection"));
            }
            Ok(complex::div(z - zr, den))
        }
    }
}

/// The impedance seen for a reflection coefficient: Z = Zr(1 + Γ)/(1 − Γ).
/// Γ within 8ε of 1 (|1 − Γ| ≤ 8ε, the rounding error of Γ itself) is an
/// [`Impedance::Open`].
pub fn impedance_from_reflection<T: Real>(gamma: Cx<T>, z_ref_ohm: Cx<T>) -> Result<Impedance<T>> {
    let zr = check_ref(z_ref_ohm)?;
    if !complex::is_finite(gamma) {
        return Err(Error::NonFinite("gamma"));
    }
    let one = Cx::new(T::one(), T::zero());
    let den = one - gamma;
    if super::inf_norm(den) <= T::lit(8.0) * T::EPS {
        return Ok(Impedance::Open);
    }
    Ok(Impedance::from_complex(zr * complex::div(one + gamma, den)))
}

fn check_mag<T: Real>(gamma_mag: T) -> Result<T> {
    let g = error::non_negative(gamma_mag, "gamma_mag")?;
    if g > unit_slack() {
        return Err(Error::OutOfRange("gamma_mag"));
    }
    Ok(g.min(T::one()))
}

/// VSWR = (1 + |Γ|)/(1 − |Γ|) for `gamma_mag` in [0, 1] (up to 1 + 8ε taken
/// as 1); [`Extended::Infinite`] at |Γ| = 1.
pub fn vswr<T: Real>(gamma_mag: T) -> Result<Extended<T>> {
    let g = check_mag(gamma_mag)?;
    if g >= T::one() {
        return Ok(Extended::Infinite);
    }
    Ok(Extended::Finite((T::one() + g) / (T::one() - g)))
}

/// Return loss −20·log10|Γ| in dB (≥ 0); [`Extended::Infinite`] at Γ = 0.
pub fn return_loss_db<T: Real>(gamma_mag: T) -> Result<Extended<T>> {
    let g = check_mag(gamma_mag)?;
    if g == T::zero() {
        return Ok(Extended::Infinite);
    }
    Ok(Extended::Finite(T::zero() - T::lit(20.0) * g.log10()))
}

/// Mismatch loss −10·log10(1 − |Γ|²) in dB (≥ 0); [`Extended::Infinite`] at |Γ| = 1.
/// Computed as −(10/ln 10)·ln_1p(−|Γ|²) so that small |Γ| keeps its precision.
pub fn mismatch_loss_db<T: Real>(gamma_mag: T) -> Result<Extended<T>> {
    let g = check_mag(gamma_mag)?;
    if g >= T::one() {
        return Ok(Extended::Infinite);
    }
    let ten_over_ln10 = T::lit(10.0 / core::f64::consts::LN_10);
    Ok(Extended::Finite(
        T::zero() - ten_over_ln10 * (-(g * g)).ln_1p(),
    ))
}

/// Fraction of the incident power delivered past the plane, 1 − |Γ|² in [0, 1].
pub fn transmitted_power_fraction<T: Real>(gamma_mag: T) -> Result<T> {
    let g = check_mag(gamma_mag)?;
    Ok(((T::one() - g) * (T::one() + g)).max(T::zero()))
}

/// All mismatch figures of one |Γ|.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Mismatch<T> {
    /// |Γ| in [0, 1].
    pub gamma_mag: T,
    /// Voltage standing-wave ratio (≥ 1).
    pub vswr: Extended<T>,
    /// Return loss, dB.
    pub return_loss_db: Extended<T>,
    /// Mismatch loss, dB.
    pub mismatch_loss_db: Extended<T>,
    /// Transmitted power fraction 1 − |Γ|².
    pub transmitted_power_fraction: T,
}

/// Every figure of [`Mismatch`] for `gamma_mag` in [0, 1].
pub fn mismatch<T: Real>(gamma_mag: T) -> Result<Mismatch<T>> {
    let g = check_mag(gamma_mag)?;
    Ok(Mismatch {
        gamma_mag: g,
        vswr: vswr(g)?,
        return_loss_db: return_loss_db(g)?,
        mismatch_loss_db: mismatch_loss_db(g)?,
        transmitted_power_fraction: transmitted_power_fraction(g)?,
    })
}

/// A point on the Smith chart.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SmithPoint<T> {
    /// Normalised impedance z = Z/Zr (an open stays [`Impedance::Open`]).
    pub z_norm: Impedance<T>,
    /// Normalised admittance y = 1/z (a short is [`Admittance::Short`]).
    pub y_norm: Admittance<T>,
    /// The Γ-plane point (the chart's Cartesian coordinates).
    pub gamma: Cx<T>,
}

/// Smith-chart coordinates of `z` for the reference `z_ref_ohm` (Re > 0).
pub fn smith_point<T: Real>(z: Impedance<T>, z_ref_ohm: Cx<T>) -> Result<SmithPoint<T>> {
    let gamma = reflection(z, z_ref_ohm)?;
    let z_norm = z.normalised(z_ref_ohm);
    Ok(SmithPoint {
        z_norm,
        y_norm: z_norm.admittance(),
        gamma,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn open_and_short_are_exact() {
        let zr = Cx::new(50.0f64, -3.0);
        assert_eq!(reflection(Impedance::Open, zr), Ok(Cx::new(1.0, 0.0)));
        assert_eq!(
            reflection(Impedance::ohms(0.0f64), zr),
            Ok(Cx::new(-1.0, 0.0))
        );
        assert_eq!(
            impedance_from_reflection(Cx::new(1.0f32, 0.0), Cx::new(50.0, 0.0)),
            Ok(Impedance::Open)
        );
        let z = impedance_from_reflection(Cx::new(-1.0f64, 0.0), Cx::new(50.0, 0.0)).unwrap();
        assert_eq!(z, Impedance::ohms(0.0));
    }

    #[test]
    fn figures_at_the_ends() {
        assert_eq!(vswr(1.0f64), Ok(Extended::Infinite));
        assert_eq!(vswr(0.0f32), Ok(Extended::Finite(1.0)));
        assert_eq!(return_loss_db(0.0f64), Ok(Extended::Infinite));
        assert_eq!(mismatch_loss_db(1.0f32), Ok(Extended::Infinite));
        assert_eq!(mismatch_loss_db(0.0f64), Ok(Extended::Finite(0.0)));
        assert_eq!(transmitted_power_fraction(1.0f64), Ok(0.0));
        assert_eq!(vswr(1.0 + 4.0 * f64::EPSILON), Ok(Extended::Infinite));
        assert_eq!(vswr(1.1f64), Err(Error::OutOfRange("gamma_mag")));
        assert_eq!(vswr(-0.1f64), Err(Error::Negative("gamma_mag")));
        assert_eq!(return_loss_db(f32::NAN), Err(Error::NonFinite("gamma_mag")));
    }

    #[test]
    fn reference_is_checked() {
        let z = Impedance::ohms(75.0f64);
        assert_eq!(
            reflection(z, Cx::new(0.0, 50.0)),
            Err(Error::NotPositive("z_ref_ohm"))
        );
        assert_eq!(
            reflection(z, Cx::new(f64::NAN, 0.0)),
            Err(Error::NonFinite("z_ref_ohm"))
        );
        assert_eq!(
            reflection(
                Impedance::Finite(Cx::new(-50.0f64, 0.0)),
                Cx::new(50.0, 0.0)
            ),
            Err(Error::Undefined("reflection"))
        );
        let p = smith_point(Impedance::ohms(0.0f64), Cx::new(50.0, 0.0)).unwrap();
        assert_eq!(p.y_norm, Admittance::Short);
        let p = smith_point(Impedance::<f32>::Open, Cx::new(50.0, 0.0)).unwrap();
        assert_eq!(p.z_norm, Impedance::Open);
        assert_eq!(p.y_norm, Admittance::Finite(Cx::new(0.0, 0.0)));
    }
}

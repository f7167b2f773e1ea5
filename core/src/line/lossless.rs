//! The ideal lossless line: Z0 and a velocity factor (or εr), the simplest case
//! of the general model.
//!
//! L = Z0/v, C = 1/(Z0·v), v = VF·c0 = c0/√εr; Z = jωL, Y = jωC, so γ = jω/v and
//! Zc = Z0 at every frequency including DC (the limit √(L/C)). Pozar,
//! *Microwave Engineering*, 4th ed., 2012, §2.1.
//!
//! Valid ranges: `z0_ohm` finite and > 0; `velocity_factor` in (0, 1]
//! (`eps_r` ≥ 1).

use crate::error::{self, Error, Result};
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::complex::Cx;
use crate::scalar::Real;
use crate::value::Impedance;

/// A lossless, dispersion-free TEM line.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Lossless<T> {
    z0_ohm: T,
    velocity_factor: T,
}

impl<T: Real> Lossless<T> {
    /// From a characteristic impedance and a velocity factor in (0, 1].
    pub fn new(z0_ohm: T, velocity_factor: T) -> Result<Self> {
        let z0_ohm = error::positive(z0_ohm, "z0_ohm")?;
        let vf = error::positive(velocity_factor, "velocity_factor")?;
        if vf > T::one() {
            return Err(Error::OutOfRange("velocity_factor"));
        }
        Ok(Lossless {
            z0_ohm,
            velocity_factor: vf,
        })
    }

    /// From a characteristic impedance and a relative permittivity εr ≥ 1.
    pub fn from_eps_r(z0_ohm: T, eps_r: T) -> Result<Self> {
        let eps_r = error::finite(eps_r, "eps_r")?;
        if eps_r < T::one() {
            return Err(Error::OutOfRange("eps_r"));
        }
        Self::new(z0_ohm, T::one() / eps_r.sqrt())
    }

    /// The characteristic impedance, Ω.
    pub fn z0_ohm(&self) -> T {
        self.z0_ohm
    }

    /// The velocity factor.
    pub fn velocity_factor(&self) -> T {
        self.velocity_factor
    }

    /// The velocity, m/s.
    pub fn velocity_m_per_s(&self) -> T {
        self.velocity_factor * T::c0()
    }
}

impl<T: Real> LineModel<T> for Lossless<T> {
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let v = self.velocity_m_per_s();
        let omega = T::two_pi() * f;
        let l = self.z0_ohm / v;
        let c = T::one() / (self.z0_ohm * v);
        let zero = T::zero();
        Ok(LinePoint {
            freq_hz: f,
            z_ohm_per_m: Cx::new(zero, omega * l),
            y_s_per_m: Cx::new(zero, omega * c),
            gamma_per_m: Cx::new(zero, omega / v),
            zc_ohm: Impedance::ohms(self.z0_ohm),
            model_loss_split_np_per_m: Some((zero, zero)),
            warnings: Warnings::NONE,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::properties;
    use approx::assert_relative_eq;

    #[test]
    fn properties_of_a_foam_line() {
        let l = Lossless::<f64>::new(50.0, 0.8).unwrap();
        for &f in &[0.0, 1e3, 1e9] {
            let p = properties(&l, f).unwrap();
            assert_relative_eq!(p.velocity_factor, 0.8, max_relative = 1e-12);
            assert_relative_eq!(
                p.group_velocity_m_per_s,
                0.8 * 299_792_458.0,
                max_relative = 1e-6
            );
            assert_relative_eq!(p.eps_eff, 1.5625, max_relative = 1e-12);
            assert_eq!(p.atten_db_per_m, 0.0);
            assert_eq!(p.point.zc_ohm, Impedance::ohms(50.0));
        }
        let p32 = properties(&Lossless::<f32>::new(50.0, 0.8).unwrap(), 1e9).unwrap();
        assert_relative_eq!(
            p32.group_velocity_m_per_s,
            0.8 * 299_792_458.0,
            max_relative = 1e-3
        );
    }

    #[test]
    fn bad_inputs_are_named() {
        assert_eq!(
            Lossless::<f64>::new(f64::NAN, 0.5),
            Err(Error::NonFinite("z0_ohm"))
        );
        assert_eq!(
            Lossless::<f64>::new(50.0, 1.5),
            Err(Error::OutOfRange("velocity_factor"))
        );
        assert_eq!(
            Lossless::<f32>::new(-50.0, 0.5),
            Err(Error::NotPositive("z0_ohm"))
        );
        assert_eq!(
            Lossless::<f64>::from_eps_r(50.0, 0.5),
            Err(Error::OutOfRange("eps_r"))
        );
        let l = Lossless::<f64>::new(50.0, 0.66).unwrap();
        assert_eq!(l.at(-1.0), Err(Error::Negative("freq_hz")));
        assert_eq!(l.at(f64::INFINITY), Err(Error::NonFinite("freq_hz")));
    }
}

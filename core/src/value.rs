//! Values that may be infinite by physics, as explicit types instead of NaN or ∞.
//!
//! An open circuit has infinite impedance; a total reflection has infinite VSWR
//! and infinite mismatch loss; a perfect match has infinite return loss. These
//! are answers, not failures, so they are carried as typed values.

use crate::math::complex::{self, Cx};
use crate::scalar::Real;

/// A real quantity that is either finite or +∞ by physics (VSWR at |Γ| = 1,
/// return loss at Γ = 0, mismatch loss at |Γ| = 1).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Extended<T> {
    /// A finite value.
    Finite(T),
    /// Positive infinity, exactly.
    Infinite,
}

impl<T: Real> Extended<T> {
    /// The finite value, or `None`.
    pub fn finite(self) -> Option<T> {
        match self {
            Extended::Finite(x) => Some(x),
            Extended::Infinite => None,
        }
    }
    /// `true` for [`Extended::Infinite`].
    pub fn is_infinite(self) -> bool {
        matches!(self, Extended::Infinite)
    }
    /// The value as a float (`T::infinity()` for the infinite case), for plotting.
    pub fn to_float(self) -> T {
        match self {
            Extended::Finite(x) => x,
            Extended::Infinite => T::infinity(),
        }
    }
}

/// A complex impedance that may be an open circuit (infinite).
///
/// A short is `Finite(0)`. Use [`Impedance::admittance`] for the dual view, in
/// which a short becomes infinite admittance.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Impedance<T> {
    /// A finite impedance in ohms.
    Finite(Cx<T>),
    /// An open circuit.
    Open,
}

impl<T: Real> Impedance<T> {
    /// A real (resistive) impedance.
    pub fn ohms(r: T) -> Self {
        Impedance::Finite(Cx::new(r, T::zero()))
    }
    /// Builds from a complex value, mapping a non-finite modulus to [`Impedance::Open`].
    pub fn from_complex(z: Cx<T>) -> Self {
        if complex::is_finite(z) {
            Impedance::Finite(z)
        } else {
            Impedance::Open
        }
    }
    /// The finite value, or `None` for an open.
    pub fn finite(self) -> Option<Cx<T>> {
        match self {
            Impedance::Finite(z) => Some(z),
            Impedance::Open => None,
        }
    }
    /// The admittance 1/Z in siemens as an [`Admittance`]: an open gives 0, a short gives infinity.
    pub fn admittance(self) -> Admittance<T> {
        match self {
            Impedance::Open => Admittance::Finite(Cx::new(T::zero(), T::zero())),
            Impedance::Finite(z) => {
                if z.re == T::zero() && z.im == T::zero() {
                    Admittance::Short
                } else {
                    Admittance::Finite(complex::recip(z))
                }
            }
        }
    }
    /// The impedance divided by a reference (normalised impedance z = Z/Zr).
    pub fn normalised(self, z_ref: Cx<T>) -> Self {
        match self {
            Impedance::Open => Impedance::Open,
            Impedance::Finite(z) => Impedance::from_complex(complex::div(z, z_ref)),
        }
    }
}

/// A complex admittance that may be a short circuit (infinite).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Admittance<T> {
    /// A finite admittance in siemens.
    Finite(Cx<T>),
    /// A short circuit.
    Short,
}

impl<T: Real> Admittance<T> {
    /// The finite value, or `None` for a short.
    pub fn finite(self) -> Option<Cx<T>> {
        match self {
            Admittance::Finite(y) => Some(y),
            Admittance::Short => None,
        }
    }
    /// Back to an impedance.
    pub fn impedance(self) -> Impedance<T> {
        match self {
            Admittance::Short => Impedance::Finite(Cx::new(T::zero(), T::zero())),
            Admittance::Finite(y) => {
                if y.re == T::zero() && y.im == T::zero() {
                    Impedance::Open
                } else {
                    Impedance::from_complex(complex::recip(y))
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn open_and_short_are_duals() {
        let open: Impedance<f64> = Impedance::Open;
        assert_eq!(open.admittance(), Admittance::Finite(Cx::new(0.0, 0.0)));
        let short = Impedance::<f32>::ohms(0.0);
        assert_eq!(short.admittance(), Admittance::Short);
        assert_eq!(Admittance::<f64>::Short.impedance(), Impedance::ohms(0.0));
        let z = Impedance::Finite(Cx::new(50.0f64, 50.0));
        let back = z.admittance().impedance().finite().unwrap();
        assert!((back.re - 50.0).abs() < 1e-12 && (back.im - 50.0).abs() < 1e-12);
        assert_eq!(Extended::<f64>::Infinite.to_float(), f64::INFINITY);
        assert_eq!(
            Impedance::from_complex(Cx::new(f64::INFINITY, 0.0)),
            Impedance::Open
        );
    }
}

//! One-ports: terminations and lumped elements evaluated at a frequency.
//!
//! With ω = 2πf (f ≥ 0, DC included):
//!
//! * series R-L-C (any subset): Z = R + jωL + 1/(jωC);
//! * parallel R-L-C (any subset): Y = 1/R + 1/(jωL) + jωC, Z = 1/Y.
//!
//! (Circuit theory; e.g. Pozar, *Microwave Engineering*, 4th ed., 2012, §6.1.)
//! Infinite values are answers, not failures: a series C at DC (or of 0 F) is
//! [`Impedance::Open`]; a parallel L at DC, or a parallel R of 0 Ω, is a short
//! (`Impedance::Finite(0)`); a parallel L-C exactly at resonance, or a
//! parallel C alone at DC, is `Open`. A series combination with no element is a
//! plain wire (a short); a parallel combination with no element is an open.
//! Nothing here ever returns NaN.
//!
//! Valid ranges: `r_ohm`, `l_h`, `c_f` finite and ≥ 0; `freq_hz` finite and ≥ 0;
//! a fixed impedance `z_ohm` finite (any sign: active loads are accepted, but the
//! |Γ| ≤ 1 bound of [`mod@crate::network::reflection`] then no longer holds).

use crate::error::{self, Error, Result};
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::Impedance;

/// A subset of R, L and C, combined in series or in parallel by [`Load`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rlc<T> {
    /// Resistance, Ω (≥ 0), or `None` if absent.
    pub r_ohm: Option<T>,
    /// Inductance, H (≥ 0), or `None` if absent.
    pub l_h: Option<T>,
    /// Capacitance, F (≥ 0), or `None` if absent.
    pub c_f: Option<T>,
}

impl<T: Real> Rlc<T> {
    /// A combination of the given elements (`None` = element absent).
    pub fn new(r_ohm: Option<T>, l_h: Option<T>, c_f: Option<T>) -> Self {
        Rlc { r_ohm, l_h, c_f }
    }

    /// Checks every present value is finite and ≥ 0, naming it (`"r_ohm"`, `"l_h"`, `"c_f"`).
    pub fn validate(&self) -> Result<()> {
        check_opt(self.r_ohm, "r_ohm")?;
        check_opt(self.l_h, "l_h")?;
        check_opt(self.c_f, "c_f")?;
        Ok(())
    }
}

fn check_opt<T: Real>(x: Option<T>, name: &'static str) -> Result<()> {
    match x {
        Some(v) => error::non_negative(v, name).map(|_| ()),
        None => Ok(()),
    }
}

/// A termination, or a lumped element placed in series or shunt in a cascade.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Load<T> {
    /// An open circuit (Z = ∞).
    Open,
    /// A short circuit (Z = 0).
    Short,
    /// A resistor, Ω (≥ 0).
    Resistor(T),
    /// A fixed complex impedance, Ω, the same at every frequency.
    Fixed(Cx<T>),
    /// R, L and C (any subset) in series.
    Series(Rlc<T>),
    /// R, L and C (any subset) in parallel.
    Parallel(Rlc<T>),
}

impl<T: Real> Load<T> {
    /// Checks the element values (see the module docs for ranges).
    pub fn validate(&self) -> Result<()> {
        match *self {
            Load::Open | Load::Short => Ok(()),
            Load::Resistor(r) => error::non_negative(r, "r_ohm").map(|_| ()),
            Load::Fixed(z) => {
                if complex::is_finite(z) {
                    Ok(())
                } else {
                    Err(Error::NonFinite("z_ohm"))
                }
            }
            Load::Series(rlc) | Load::Parallel(rlc) => rlc.validate(),
        }
    }

    /// The impedance at `freq_hz ≥ 0`. Errors: [`Error::NonFinite`] /
    /// [`Error::Negative`] naming `"freq_hz"` or the element value.
    pub fn impedance_at(&self, freq_hz: T) -> Result<Impedance<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        self.validate()?;
        Ok(self.impedance_unchecked(f))
    }

    /// The impedance for an already validated load and frequency (the cascade
    /// validates once, at `push` and at the frequency check).
    pub(crate) fn impedance_unchecked(&self, freq_hz: T) -> Impedance<T> {
        let zero = T::zero();
        let omega = T::two_pi() * freq_hz;
        match *self {
            Load::Open => Impedance::Open,
            Load::Short => Impedance::Finite(Cx::new(zero, zero)),
            Load::Resistor(r) => Impedance::ohms(r),
            Load::Fixed(z) => Impedance::Finite(z),
            Load::Series(rlc) => {
                let mut re = zero;
                let mut im = zero;
                if let Some(r) = rlc.r_ohm {
                    re = r;
                }
                if let Some(l) = rlc.l_h {
                    im = im + omega * l;
                }
                if let Some(c) = rlc.c_f {
                    let wc = omega * c;
                    if wc == zero {
                        return Impedance::Open;
                    }
                    im = im - T::one() / wc;
                }
                Impedance::from_complex(Cx::new(re, im))
            }
            Load::Parallel(rlc) => {
                let mut g = zero;
                let mut b = zero;
                if let Some(r) = rlc.r_ohm {
                    if r == zero {
                        return Impedance::Finite(Cx::new(zero, zero));
                    }
                    g = T::one() / r;
                }
                if let Some(l) = rlc.l_h {
                    let wl = omega * l;
                    if wl == zero {
                        return Impedance::Finite(Cx::new(zero, zero));
                    }
                    b = b - T::one() / wl;
                }
                if let Some(c) = rlc.c_f {
                    b = b + omega * c;
                }
                if g == zero && b == zero {
                    return Impedance::Open;
                }
                let y = Cx::new(g, b);
                if !complex::is_finite(y) {
                    // A susceptance beyond the type's range is a short.
                    return Impedance::Finite(Cx::new(zero, zero));
                }
                Impedance::from_complex(complex::recip(y))
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn z64(l: Load<f64>, f: f64) -> Impedance<f64> {
        l.impedance_at(f).unwrap()
    }

    #[test]
    fn dc_limits_are_explicit() {
        let c = Load::Series(Rlc::new(None, None, Some(1e-9)));
        assert_eq!(z64(c, 0.0), Impedance::Open);
        let l = Load::Parallel(Rlc::new(Some(50.0), Some(1e-6), None));
        assert_eq!(z64(l, 0.0), Impedance::ohms(0.0));
        let pc = Load::Parallel(Rlc::new(None, None, Some(1e-12)));
        assert_eq!(z64(pc, 0.0), Impedance::Open);
        let sl = Load::Series(Rlc::new(Some(10.0), Some(1e-6), None));
        assert_eq!(z64(sl, 0.0), Impedance::ohms(10.0));
        assert_eq!(
            z64(Load::Series(Rlc::new(None, None, None)), 1e6),
            Impedance::ohms(0.0)
        );
        assert_eq!(
            z64(Load::Parallel(Rlc::new(None, None, None)), 1e6),
            Impedance::Open
        );
        assert_eq!(
            Load::<f32>::Series(Rlc::new(None, None, Some(0.0))).impedance_at(1e6),
            Ok(Impedance::Open)
        );
    }

    #[test]
    fn series_and_parallel_values() {
        // Circuit theory (common practice): Z = R + jωL + 1/(jωC).
        let f = 1e6;
        let w = 2.0 * core::f64::consts::PI * f;
        let z = z64(Load::Series(Rlc::new(Some(5.0), Some(1e-6), Some(1e-9))), f)
            .finite()
            .unwrap();
        assert!((z.re - 5.0).abs() < 1e-12);
        assert!((z.im - (w * 1e-6 - 1.0 / (w * 1e-9))).abs() < 1e-9);
        let z = z64(Load::Parallel(Rlc::new(Some(100.0), None, Some(1e-9))), f)
            .finite()
            .unwrap();
        let y = Cx::new(0.01, w * 1e-9);
        let want = Cx::new(1.0, 0.0) / y;
        assert!((z - want).norm() < 1e-9 * want.norm());
        let z32 = Load::<f32>::Parallel(Rlc::new(Some(100.0), None, Some(1e-9)))
            .impedance_at(1e6)
            .unwrap()
            .finite()
            .unwrap();
        assert!(((z32.re as f64) - want.re).abs() < 1e-4 * want.norm());
    }

    #[test]
    fn bad_values_are_named() {
        let l = Load::Resistor(-1.0f64);
        assert_eq!(l.impedance_at(1.0), Err(Error::Negative("r_ohm")));
        let l = Load::Series(Rlc::new(None, Some(f64::NAN), None));
        assert_eq!(l.impedance_at(1.0), Err(Error::NonFinite("l_h")));
        let l = Load::Parallel(Rlc::new(None, None, Some(-1e-9f32)));
        assert_eq!(l.impedance_at(1.0), Err(Error::Negative("c_f")));
        let l = Load::Fixed(Cx::new(f64::INFINITY, 0.0));
        assert_eq!(l.impedance_at(1.0), Err(Error::NonFinite("z_ohm")));
        assert_eq!(
            Load::<f64>::Open.impedance_at(-1.0),
            Err(Error::Negative("freq_hz"))
        );
        assert_eq!(
            Load::<f32>::Short.impedance_at(f32::NAN),
            Err(Error::NonFinite("freq_hz"))
        );
    }
}

//! Bracketing root finder: Brent's method.
//!
//! Brent, *Algorithms for Minimization without Derivatives*, Prentice-Hall 1973,
//! ch. 4 (procedure `zero`): keeps a bracket [b, c] with f(b)·f(c) ≤ 0 and takes
//! an inverse-quadratic or secant step when it shrinks the bracket fast enough,
//! else bisects. It never leaves the bracket, so it converges for any continuous
//! f that changes sign, in at most about (log₂((hi − lo)/tol))² evaluations and
//! usually superlinearly.
//!
//! Termination: |c − b|/2 ≤ 2ε|b| + x_tol/2, so the returned x is within
//! about `x_tol` + 4ε|x| of a sign change of f.

use crate::error::{finite, non_negative, Error, Result};
use crate::scalar::Real;

/// A root found by [`find_root`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Root<T> {
    /// The abscissa.
    pub x: T,
    /// f(x) there.
    pub f_x: T,
    /// Function evaluations used (including the two at the ends).
    pub evaluations: u32,
}

/// Finds x in [lo, hi] (either order) with f(x) = 0 by Brent's method.
///
/// `x_tol` ≥ 0 is the absolute tolerance on x (0 asks for machine precision);
/// `max_iter` bounds the number of evaluations after the two at the ends.
///
/// Errors: [`Error::NonFinite`] naming `"lo"`, `"hi"`, `"x_tol"`, or `"f"` (the
/// closure returned NaN/∞); [`Error::Negative`]`("x_tol")`;
/// [`Error::Unreachable`]`("bracket")` when f(lo) and f(hi) have the same sign
/// (no root is bracketed; callers usually remap this to their own parameter);
/// [`Error::NoConvergence`]`("find_root")` when `max_iter` is exhausted; and
/// any error returned by `f`, unchanged.
pub fn find_root<T, F>(mut f: F, lo: T, hi: T, x_tol: T, max_iter: u32) -> Result<Root<T>>
where
    T: Real,
    F: FnMut(T) -> Result<T>,
{
    let lo = finite(lo, "lo")?;
    let hi = finite(hi, "hi")?;
    let x_tol = non_negative(x_tol, "x_tol")?;
    let mut eval = |x: T| -> Result<T> { finite(f(x)?, "f") };

    let mut a = lo;
    let mut b = hi;
    let mut fa = eval(a)?;
    let mut fb = eval(b)?;
    let mut evaluations = 2;
    if fa == T::zero() {
        return Ok(Root {
            x: a,
            f_x: fa,
            evaluations,
        });
    }
    if fb == T::zero() {
        return Ok(Root {
            x: b,
            f_x: fb,
            evaluations,
        });
    }
    if (fa > T::zero()) == (fb > T::zero()) {
        return Err(Error::Unreachable("bracket"));
    }
    let mut c = b;
    let mut fc = fb;
    let mut d = b - a;
    let mut e = d;
    let two = T::two();
    loop {
        if (fb > T::zero()) == (fc > T::zero()) {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol = two * T::EPS * b.abs() + T::half() * x_tol;
        let m = T::half() * (c - b);
        if m.abs() <= tol || fb == T::zero() {
            return Ok(Root {
                x: b,
                f_x: fb,
                evaluations,
            });
        }
        if evaluations >= max_iter.saturating_add(2) {
            break;
        }
        if e.abs() >= tol && fa.abs() > fb.abs() {
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                // Secant step.
                p = two * m * s;
                q = T::one() - s;
            } else {
                // Inverse quadratic interpolation.
                let qq = fa / fc;
                let r = fb / fc;
                p = s * (two * m * qq * (qq - r) - (b - a) * (r - T::one()));
                q = (qq - T::one()) * (r - T::one()) * (s - T::one());
            }
            if p > T::zero() {
                q = -q;
            }
            p = p.abs();
            let min1 = T::lit(3.0) * m * q - (tol * q).abs();
            let min2 = (e * q).abs();
            if two * p < min1.min(min2) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b = if d.abs() > tol {
            b + d
        } else if m > T::zero() {
            b + tol
        } else {
            b - tol
        };
        fb = eval(b)?;
        evaluations += 1;
    }
    Err(Error::NoConvergence("find_root"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_sqrt2_in_both_precisions() {
        let r = find_root(|x: f64| Ok(x * x - 2.0), 0.0, 2.0, 0.0, 100).unwrap();
        assert!((r.x - core::f64::consts::SQRT_2).abs() < 4e-16);
        assert!(r.evaluations < 20);
        let r = find_root(|x: f32| Ok(x * x - 2.0), 2.0, 0.0, 1e-6, 100).unwrap();
        assert!((r.x - core::f32::consts::SQRT_2).abs() < 2e-6);
    }

    #[test]
    fn errors() {
        assert_eq!(
            find_root(|x: f64| Ok(x * x + 1.0), -1.0, 1.0, 0.0, 50),
            Err(Error::Unreachable("bracket"))
        );
        assert_eq!(
            find_root(|x: f64| Ok(x.powi(3) - 0.3), 0.0, 1.0, 0.0, 2),
            Err(Error::NoConvergence("find_root"))
        );
        assert_eq!(
            find_root(
                |x: f64| if x > 0.7 {
                    Err(Error::Undefined("z"))
                } else {
                    Ok(x - 0.5)
                },
                0.0,
                1.0,
                0.0,
                50
            ),
            Err(Error::Undefined("z"))
        );
        assert_eq!(
            find_root(|_x: f32| Ok(f32::NAN), 0.0, 1.0, 0.0, 50),
            Err(Error::NonFinite("f"))
        );
        assert_eq!(
            find_root(|x: f32| Ok(x), 0.0, 1.0, -1.0, 50),
            Err(Error::Negative("x_tol"))
        );
    }

    #[test]
    fn exact_end_root_is_returned() {
        let r = find_root(|x: f64| Ok(x - 1.0), 1.0, 3.0, 0.0, 10).unwrap();
        assert_eq!(r.x, 1.0);
    }
}

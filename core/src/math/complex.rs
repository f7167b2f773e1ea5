//! Complex helpers that stay finite where the textbook forms overflow or divide by zero.
//!
//! * [`div`]: Smith's algorithm (R. L. Smith, "Algorithm 116: Complex division",
//!   Comm. ACM 5(8):435, 1962): scales by the larger component of the divisor, so
//!   `1 / (1e300 + 1e300 j)` is `5e-301 − 5e-301 j`, not 0 or NaN.
//! * [`sqrt`]: principal square root (Re ≥ 0, branch cut on the negative real
//!   axis) by Kahan's method ("Branch cuts for complex elementary functions",
//!   1987), with a scaled modulus so that neither huge nor tiny arguments overflow.
//! * [`exp_neg`]: e^(−z) for Re z ≥ 0 with the phase reduced in turns first, so
//!   an electrically long line (βl ≈ 1e5 rad) keeps its phase in `f32`.
//! * [`tanh`]: tanh z written as (1 − e^(−2z))/(1 + e^(−2z)) for Re z ≥ 0
//!   (mirrored for Re z < 0); it saturates to ±1 for large |Re z| instead of
//!   producing ∞/∞, and at the quarter-wave point z = jπ/2 it returns a huge
//!   finite value (the pole) rather than NaN. Input-impedance code should not use
//!   tanh at all: see [`crate::network`] for the pole-free reflection form.

use num_complex::Complex;

use crate::scalar::Real;

/// Complex number over the crate's scalar.
pub type Cx<T> = Complex<T>;

/// Builds a complex number.
#[inline(always)]
pub fn cx<T: Real>(re: T, im: T) -> Cx<T> {
    Complex::new(re, im)
}

/// Robust complex division `a / b` (Smith 1962). Division by exactly zero gives
/// non-finite components; callers that can meet it check first.
///
/// Near the overflow threshold both operands are first scaled by 1/8 (exact,
/// a power of two), so that the intermediate b.re + b.im·r and a.re + a.im·r
/// cannot overflow to ∞/∞ = NaN when the quotient itself is finite.
#[inline]
pub fn div<T: Real>(a: Cx<T>, b: Cx<T>) -> Cx<T> {
    let big = T::max_value() * T::lit(0.125);
    let eighth = T::lit(0.125);
    let (a, b) = if b.re.abs() > big || b.im.abs() > big {
        (
            Complex::new(a.re * eighth, a.im * eighth),
            Complex::new(b.re * eighth, b.im * eighth),
        )
    } else {
        (a, b)
    };
    if a.re.abs() > big || a.im.abs() > big {
        let q = smith(Complex::new(a.re * eighth, a.im * eighth), b);
        let eight = T::lit(8.0);
        return Complex::new(q.re * eight, q.im * eight);
    }
    smith(a, b)
}

/// Smith's algorithm proper (operands already scaled away from overflow).
#[inline(always)]
fn smith<T: Real>(a: Cx<T>, b: Cx<T>) -> Cx<T> {
    if b.re.abs() >= b.im.abs() {
        if b.re == T::zero() {
            // b == 0 (both parts zero): let IEEE rules speak (inf or nan).
            return Complex::new(a.re / b.re, a.im / b.re);
        }
        let r = b.im / b.re;
        let d = b.re + b.im * r;
        Complex::new((a.re + a.im * r) / d, (a.im - a.re * r) / d)
    } else {
        let r = b.re / b.im;
        let d = b.re * r + b.im;
        Complex::new((a.re * r + a.im) / d, (a.im * r - a.re) / d)
    }
}

/// `1 / b`, robustly.
#[inline]
pub fn recip<T: Real>(b: Cx<T>) -> Cx<T> {
    div(Complex::new(T::one(), T::zero()), b)
}

/// Modulus |z| without overflow or underflow of the intermediate squares.
#[inline]
pub fn abs<T: Real>(z: Cx<T>) -> T {
    let a = z.re.abs();
    let b = z.im.abs();
    let (big, small) = if a >= b { (a, b) } else { (b, a) };
    if big == T::zero() || !big.is_finite() {
        return big + small; // 0, or inf / nan propagated
    }
    // Fast path when squaring is safe (well inside the exponent range of f32).
    let lo = T::lit(1e-18);
    let hi = T::lit(1e18);
    if big > lo && big < hi {
        return (a * a + b * b).sqrt();
    }
    let r = small / big;
    big * (T::one() + r * r).sqrt()
}

/// Squared modulus |z|², for comparisons where overflow is not a concern.
#[inline(always)]
pub fn norm_sqr<T: Real>(z: Cx<T>) -> T {
    z.re * z.re + z.im * z.im
}

/// Principal square root: Re ≥ 0; for Re = 0 the imaginary part carries the sign
/// of `z.im`. Exact zero maps to zero.
#[inline]
pub fn sqrt<T: Real>(z: Cx<T>) -> Cx<T> {
    let x = z.re;
    let y = z.im;
    if x == T::zero() && y == T::zero() {
        return Complex::new(T::zero(), y);
    }
    // Tiny (near-subnormal) arguments: sqrt(z) = sqrt(z/ε²)·ε, with ε the
    // machine epsilon (a power of two, so the scaling is exact); without it
    // (|x| + |z|)/2 rounds to 0 and y/(2t) is 0/0.
    let tiny = T::min_positive_value() / T::EPS;
    if x.abs() < tiny && y.abs() < tiny {
        let up = T::one() / (T::EPS * T::EPS);
        let r = sqrt(Complex::new(x * up, y * up));
        return Complex::new(r.re * T::EPS, r.im * T::EPS);
    }
    let quarter_max = T::max_value() * T::lit(0.25);
    if x.abs() > quarter_max || y.abs() > quarter_max {
        // sqrt(z) = 2·sqrt(z/4): keeps |z| and |x| + |z| finite.
        let r = sqrt(Complex::new(x * T::lit(0.25), y * T::lit(0.25)));
        return Complex::new(r.re + r.re, r.im + r.im);
    }
    let m = abs(z);
    // t = sqrt((|x| + |z|) / 2), computed without overflow.
    let t = (x.abs() * T::half() + m * T::half()).sqrt();
    if x >= T::zero() {
        Complex::new(t, y / (t + t))
    } else {
        let im = if y.is_sign_negative() { -t } else { t };
        Complex::new(y.abs() / (t + t), im)
    }
}

/// Reduces a phase given in turns (cycles) to the interval [−½, ½].
///
/// The subtraction of the nearest integer is exact in binary floating point, so
/// the reduced phase keeps every significant bit of the input: this is why the
/// crate carries electrical length in wavelengths, not radians.
#[inline(always)]
pub fn reduce_turns<T: Real>(turns: T) -> T {
    turns - turns.round()
}

/// e^(j·2π·turns): a unit phasor from a phase in turns, reduced before the trig call.
#[inline]
pub fn phasor_turns<T: Real>(turns: T) -> Cx<T> {
    // In the scalar's own precision (libm's sinf/cosf use double kernels).
    let (s, c) = crate::math::special::sin_cos_turns(turns);
    Complex::new(c, s)
}

/// e^(−(a + j·2π·turns)) = e^(−a)·e^(−j2π·turns) with `a = Re` in nepers and the
/// imaginary part given in turns. For `a ≥ 0` the result has modulus ≤ 1 and
/// underflows gracefully to 0 for very lossy lines.
#[inline]
pub fn exp_neg_turns<T: Real>(neper: T, turns: T) -> Cx<T> {
    let m = (-neper).exp();
    let p = phasor_turns(-turns);
    Complex::new(m * p.re, m * p.im)
}

/// e^(−z) for a complex z, the phase reduced in turns.
#[inline]
pub fn exp_neg<T: Real>(z: Cx<T>) -> Cx<T> {
    exp_neg_turns(z.re, z.im / T::two_pi())
}

/// Saturating complex tanh. For Re z ≥ 0 uses (1 − e)/(1 + e), e = e^(−2z) with
/// |e| ≤ 1, so large Re z gives 1 exactly rather than ∞/∞. At a pole
/// (z = j(π/2 + kπ)) the denominator is rounding-small but not zero in general;
/// if it is exactly zero the result is a large finite number of the type
/// (`T::max_value()` scaled), never NaN.
#[inline]
pub fn tanh<T: Real>(z: Cx<T>) -> Cx<T> {
    let neg = z.re < T::zero();
    let w = if neg { -z } else { z };
    let e = exp_neg(w + w);
    let one = Complex::new(T::one(), T::zero());
    let num = one - e;
    let den = one + e;
    let r = if den.re == T::zero() && den.im == T::zero() {
        Complex::new(T::max_value().sqrt(), T::zero())
    } else {
        div(num, den)
    };
    if neg {
        -r
    } else {
        r
    }
}

/// Saturating complex coth = 1/tanh, with the same guarantees (at z = 0 it
/// returns a large finite value, never NaN).
#[inline]
pub fn coth<T: Real>(z: Cx<T>) -> Cx<T> {
    let neg = z.re < T::zero();
    let w = if neg { -z } else { z };
    let e = exp_neg(w + w);
    let one = Complex::new(T::one(), T::zero());
    let num = one + e;
    let den = one - e;
    let r = if den.re == T::zero() && den.im == T::zero() {
        Complex::new(T::max_value().sqrt(), T::zero())
    } else {
        div(num, den)
    };
    if neg {
        -r
    } else {
        r
    }
}

/// `true` if both parts are finite.
#[inline(always)]
pub fn is_finite<T: Real>(z: Cx<T>) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

/// Replaces a signed zero in either part by +0 (so that a displayed value never
/// reads `-j0.0000`).
#[inline]
pub fn unsign_zero<T: Real>(z: Cx<T>) -> Cx<T> {
    let fix = |v: T| if v == T::zero() { T::zero() } else { v };
    Complex::new(fix(z.re), fix(z.im))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn division_survives_extreme_magnitudes() {
        let q = div(cx(1.0f64, 0.0), cx(1e300, 1e300));
        assert_relative_eq!(q.re, 5e-301, max_relative = 1e-12);
        assert_relative_eq!(q.im, -5e-301, max_relative = 1e-12);
        let q = div(cx(1e-300f64, 1e-300), cx(1e-300, -1e-300));
        assert_relative_eq!(q.re, 0.0, epsilon = 1e-15);
        assert_relative_eq!(q.im, 1.0, max_relative = 1e-14);
        let q32 = div(cx(1.0f32, 0.0), cx(1e30, 1e30));
        assert_relative_eq!(q32.re, 5e-31, max_relative = 1e-5);
        // Both operands near the overflow threshold: the quotient is 1, not NaN.
        let h = cx(1.16e308f64, 1.16e308);
        let q = div(h, h);
        assert_relative_eq!(q.re, 1.0, max_relative = 1e-15);
        assert_relative_eq!(q.im, 0.0, epsilon = 1e-15);
        let q32 = div(cx(3e38f32, 3e38), cx(3e38f32, 3e38));
        assert_relative_eq!(q32.re, 1.0, max_relative = 1e-6);
    }

    #[test]
    fn sqrt_is_principal_and_scaled() {
        let s = sqrt(cx(-4.0f64, 0.0));
        assert_relative_eq!(s.re, 0.0);
        assert_relative_eq!(s.im, 2.0);
        let s = sqrt(cx(-4.0f64, -0.0));
        assert_relative_eq!(s.im, -2.0);
        let s = sqrt(cx(0.0f64, 2.0));
        assert_relative_eq!(s.re, 1.0, max_relative = 1e-15);
        assert_relative_eq!(s.im, 1.0, max_relative = 1e-15);
        let sub = sqrt(cx(5e-324f64, 0.0));
        assert_relative_eq!(sub.re, 5e-324f64.sqrt(), max_relative = 1e-12);
        assert_eq!(sub.im, 0.0);
        let sub32 = sqrt(cx(1e-45f32, 1e-45));
        assert!(sub32.re > 0.0 && sub32.im > 0.0 && sub32.re.is_finite());
        let big = sqrt(cx(1e300f64, 1e300));
        assert!(big.re.is_finite() && big.re > 0.0);
        let s32 = sqrt(cx(3e38f32, 3e38));
        assert!(s32.re.is_finite());
        for &(re, im) in &[(1.0, 1.0), (-1.0, 0.5), (-3.0, -2.0), (1e-200, 1e-200)] {
            let z = cx(re, im);
            let r = sqrt(z);
            assert!(r.re >= 0.0);
            let back = r * r;
            assert_relative_eq!(back.re, z.re, max_relative = 1e-12, epsilon = 1e-300);
            assert_relative_eq!(back.im, z.im, max_relative = 1e-12, epsilon = 1e-300);
        }
    }

    #[test]
    fn tanh_at_quarter_wave_is_not_nan() {
        let q = cx(0.0f64, core::f64::consts::FRAC_PI_2);
        let t = tanh(q);
        assert!(t.re.is_finite() && t.im.is_finite());
        assert!(t.norm() > 1e12);
        let q32 = cx(0.0f32, core::f32::consts::FRAC_PI_2);
        let t32 = tanh(q32);
        assert!(t32.re.is_finite() && t32.im.is_finite());
    }

    #[test]
    fn tanh_saturates_for_lossy_lines() {
        for &a in &[50.0f64, 200.0, 1e6] {
            let t = tanh(cx(a, 12345.6));
            assert_relative_eq!(t.re, 1.0, epsilon = 1e-15);
            assert_relative_eq!(t.im, 0.0, epsilon = 1e-15);
            let t = tanh(cx(-a, 1.0));
            assert_relative_eq!(t.re, -1.0, epsilon = 1e-15);
        }
        let t = tanh(cx(200.0f32, 3.0));
        assert_eq!(t, cx(1.0, 0.0));
        let c = coth(cx(0.0f64, 0.0));
        assert!(c.re.is_finite());
    }

    #[test]
    fn phase_in_turns_keeps_f32_accuracy() {
        // 1 km of air line at 1 GHz: 3335.64 wavelengths. Reduced in turns the
        // f32 phasor agrees with the f64 one computed from the same f32 input.
        let turns32: f32 = 3_335.640_9;
        let p32 = phasor_turns(turns32);
        let p64 = phasor_turns(turns32 as f64);
        assert!((p32.re as f64 - p64.re).abs() < 1e-6);
        assert!((p32.im as f64 - p64.im).abs() < 1e-6);
    }

    #[test]
    fn unsign_zero_removes_negative_zero() {
        let z = unsign_zero(cx(-0.0f64, -0.0));
        assert!(z.re.is_sign_positive() && z.im.is_sign_positive());
    }
}

//! Complete elliptic integral of the first kind by the arithmetic–geometric mean.
//!
//! K(k) = ∫₀^{π/2} dθ / √(1 − k² sin²θ) = π / (2·AGM(1, k′)), k′ = √(1 − k²)
//! (Gauss; Abramowitz & Stegun, *Handbook of Mathematical Functions*, 1964,
//! eq. 17.6.1–17.6.4; King, *On the direct numerical calculation of elliptic
//! functions and integrals*, 1924). Note the modulus convention: these take the
//! modulus k, whereas `scipy.special.ellipk(m)` takes the parameter m = k².
//!
//! The ratio K(k)/K(k′) used by coplanar and stripline formulas (conformal
//! mapping, Wen 1969) is AGM(1, k)/AGM(1, k′): the π/2 cancels and both AGMs
//! converge quadratically, so it is accurate to a few ulp from k → 0 (ratio → 0,
//! ≈ π/ln(4/k)) to k → 1. Near k = 1 the complement k′ = √((1 − k)(1 + k)) is
//! only as good as the k it came from: callers that can compute k′ directly (e.g.
//! from a tanh/sinh form) should pass both to [`ellip_k_ratio_pair`].

use crate::error::{finite, Error, Result};
use crate::scalar::Real;

/// Iteration budget of the AGM: from AGM(1, 1e−300) it needs about 15 steps.
const AGM_MAX_ITER: usize = 64;

/// Arithmetic–geometric mean of two non-negative numbers (a, b > 0 for a
/// non-zero result).
///
/// Errors: [`Error::NonFinite`] / [`Error::Negative`] naming `"a"` or `"b"`.
pub fn agm<T: Real>(a: T, b: T) -> Result<T> {
    let mut a = crate::error::non_negative(a, "a")?;
    let mut b = crate::error::non_negative(b, "b")?;
    if a == T::zero() || b == T::zero() {
        return Ok(T::zero());
    }
    for _ in 0..AGM_MAX_ITER {
        let an = (a + b) * T::half();
        let bn = (a * b).sqrt();
        if (an - bn).abs() <= T::lit(2.0) * T::EPS * an {
            return Ok((an + bn) * T::half());
        }
        a = an;
        b = bn;
    }
    Err(Error::NoConvergence("agm"))
}

/// Complementary modulus k′ = √((1 − k)(1 + k)), accurate for k near 1 given k.
fn complement<T: Real>(k: T) -> T {
    ((T::one() - k) * (T::one() + k)).sqrt()
}

/// K(k) for the modulus 0 ≤ k < 1 (K(0) = π/2; K → ∞ as k → 1).
///
/// Errors: [`Error::NonFinite`]`("k")`, [`Error::OutOfRange`]`("k")` outside [0, 1).
pub fn ellip_k<T: Real>(k: T) -> Result<T> {
    let k = finite(k, "k")?;
    if !(k >= T::zero() && k < T::one()) {
        return Err(Error::OutOfRange("k"));
    }
    Ok(T::FRAC_PI_2() / agm(T::one(), complement(k))?)
}

/// K(k) given the complementary modulus k′ ∈ (0, 1] directly, which keeps full
/// accuracy when k is within rounding of 1.
///
/// Errors: [`Error::NonFinite`]`("kp")`, [`Error::OutOfRange`]`("kp")` outside (0, 1].
pub fn ellip_k_from_complement<T: Real>(kp: T) -> Result<T> {
    let kp = finite(kp, "kp")?;
    if !(kp > T::zero() && kp <= T::one()) {
        return Err(Error::OutOfRange("kp"));
    }
    Ok(T::FRAC_PI_2() / agm(T::one(), kp)?)
}

/// K(k)/K(k′) for 0 < k < 1, with k′ = √(1 − k²) formed from k.
///
/// Errors: [`Error::NonFinite`]`("k")`, [`Error::OutOfRange`]`("k")` outside (0, 1).
pub fn ellip_k_ratio<T: Real>(k: T) -> Result<T> {
    let k = finite(k, "k")?;
    if !(k > T::zero() && k < T::one()) {
        return Err(Error::OutOfRange("k"));
    }
    let kp = complement(k);
    if kp == T::zero() {
        return Err(Error::OutOfRange("k"));
    }
    Ok(agm(T::one(), k)? / agm(T::one(), kp)?)
}

/// K(k)/K(k′) from both moduli, as the caller computed them (each in (0, 1]).
/// They must satisfy k² + k′² = 1 to within 64·ε.
///
/// Errors: [`Error::NonFinite`] / [`Error::OutOfRange`] naming `"k"` or `"kp"`;
/// `OutOfRange("kp")` when k² + k′² is not 1.
pub fn ellip_k_ratio_pair<T: Real>(k: T, kp: T) -> Result<T> {
    let k = finite(k, "k")?;
    let kp = finite(kp, "kp")?;
    if !(k > T::zero() && k <= T::one()) {
        return Err(Error::OutOfRange("k"));
    }
    if !(kp > T::zero() && kp <= T::one()) {
        return Err(Error::OutOfRange("kp"));
    }
    if (k * k + kp * kp - T::one()).abs() > T::lit(64.0) * T::EPS {
        return Err(Error::OutOfRange("kp"));
    }
    Ok(agm(T::one(), k)? / agm(T::one(), kp)?)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn k_of_zero_and_symmetry_of_the_ratio() {
        assert_eq!(ellip_k(0.0f64), Ok(core::f64::consts::FRAC_PI_2));
        // K(1/√2)/K(1/√2) = 1 (self-complementary modulus).
        let s = core::f64::consts::FRAC_1_SQRT_2;
        assert!((ellip_k_ratio(s).unwrap() - 1.0).abs() < 1e-15);
        // ratio(k) · ratio(k′) = 1.
        for &k in &[0.1f64, 0.5, 0.9, 0.999] {
            let kp = complement(k);
            let r = ellip_k_ratio(k).unwrap() * ellip_k_ratio_pair(kp, k).unwrap();
            assert!((r - 1.0).abs() < 4e-15);
        }
        let r32 = ellip_k_ratio(core::f32::consts::FRAC_1_SQRT_2).unwrap();
        assert!((r32 - 1.0).abs() < 1e-6);
    }

    #[test]
    fn rejects_out_of_range() {
        assert_eq!(ellip_k(1.0f64), Err(Error::OutOfRange("k")));
        assert_eq!(ellip_k(-0.1f32), Err(Error::OutOfRange("k")));
        assert_eq!(ellip_k_ratio(0.0f64), Err(Error::OutOfRange("k")));
        assert_eq!(ellip_k_ratio(f64::NAN), Err(Error::NonFinite("k")));
        assert_eq!(
            ellip_k_ratio_pair(0.6f64, 0.7),
            Err(Error::OutOfRange("kp"))
        );
        assert_eq!(
            ellip_k_from_complement(0.0f32),
            Err(Error::OutOfRange("kp"))
        );
        assert_eq!(agm(-1.0f64, 1.0), Err(Error::Negative("a")));
        assert_eq!(agm(0.0f64, 1.0), Ok(0.0));
    }
}

//! The float abstraction and the physical constants.
//!
//! Every algorithm in the crate is written once over [`Real`], a thin layer on
//! `num_traits::Float` (with `libm` underneath, so it works in `no_std`), and is
//! used concretely with `f32` (single-precision FPUs such as a Cortex-M4F) or
//! `f64`.
//!
//! **No hidden double precision.** [`Real::lit`] turns an `f64` literal into the
//! scalar; it is `#[inline(always)]` so that with a constant argument the
//! conversion is folded at compile time and an `f32` build contains no
//! double-precision arithmetic. Never pass a run-time `f64` through it on an
//! `f32` path.
//!
//! Special functions that `num_traits::Float` lacks (erfc, Bessel J/Y) come from
//! `libm` through the supertrait [`crate::math::special::LibmSpecial`], which
//! calls the single-precision routine for `f32`.
//!
//! Constants (CODATA 2018 / SI 2019): c0 = 299 792 458 m/s exactly;
//! μ0 = 1.256 637 062 12 × 10⁻⁶ H/m; ε0 = 1/(μ0 c0²); η0 = μ0·c0 ≈ 376.730 313 668 Ω
//! (not 120π). 1 Np = 20/ln 10 dB ≈ 8.685 889 638 dB.

use core::fmt::Debug;
use num_traits::{Float, FloatConst};

/// Speed of light in vacuum, m/s (exact by the definition of the metre).
pub const C0_M_PER_S: f64 = 299_792_458.0;
/// Vacuum permeability μ0, H/m (CODATA 2018).
pub const MU0_H_PER_M: f64 = 1.256_637_062_12e-6;
/// Vacuum permittivity ε0 = 1/(μ0·c0²), F/m.
pub const EPS0_F_PER_M: f64 = 1.0 / (MU0_H_PER_M * C0_M_PER_S * C0_M_PER_S);
/// Impedance of free space η0 = μ0·c0, Ω.
pub const ETA0_OHM: f64 = MU0_H_PER_M * C0_M_PER_S;
/// Decibels per neper, 20/ln(10).
pub const DB_PER_NEPER: f64 = 8.685_889_638_065_037;
/// Annealed copper conductivity, S/m (IEC 60028, 5.8001 × 10⁷ S/m; value commonly rounded to 5.8e7).
pub const SIGMA_COPPER_S_PER_M: f64 = 5.8e7;

/// The scalar of every computation: `f32` or `f64`.
pub trait Real:
    Float
    + FloatConst
    + Copy
    + Debug
    + Default
    + PartialOrd
    + 'static
    + crate::math::special::LibmSpecial
{
    /// Machine epsilon of the type.
    const EPS: Self;
    /// Converts a literal. Inlined so that constant arguments fold at compile time
    /// (an `f32` build then holds no double-precision code).
    fn lit(x: f64) -> Self;
    /// Converts a count or index (direct `usize → f32` on the `f32` path).
    fn from_usize(n: usize) -> Self;
    /// Converts a signed integer sample (an ADC code).
    fn from_i32(n: i32) -> Self;
    /// Truncates toward zero to an `i64`, saturating; NaN gives 0.
    fn to_i64_sat(self) -> i64;
    /// Converts to `f64` for reporting at the edges (host tools, tests); never used
    /// inside computations.
    fn to_f64_lossless(self) -> f64;
    /// The error function, through libm in this type's own precision.
    fn erf(self) -> Self;
    /// The complementary error function 1 − erf, through libm in this type's own precision.
    fn erfc(self) -> Self;
    /// 2^k for an integer-valued `k` with a normal result (f64: −1022 ≤ k ≤ 1023;
    /// f32: −126 ≤ k ≤ 127), built from the exponent bits by adding 1.5·2^(p−1)
    /// and shifting: only float adds and integer shifts, so loops over it
    /// vectorise. Outside that range the result is meaningless (callers clamp).
    fn pow2_int(k: Self) -> Self;

    /// c0 in m/s.
    #[inline(always)]
    fn c0() -> Self {
        Self::lit(C0_M_PER_S)
    }
    /// μ0 in H/m.
    #[inline(always)]
    fn mu0() -> Self {
        Self::lit(MU0_H_PER_M)
    }
    /// ε0 in F/m.
    #[inline(always)]
    fn eps0() -> Self {
        Self::lit(EPS0_F_PER_M)
    }
    /// η0 = μ0·c0 in Ω.
    #[inline(always)]
    fn eta0() -> Self {
        Self::lit(ETA0_OHM)
    }
    /// 2π.
    #[inline(always)]
    fn two_pi() -> Self {
        Self::TAU()
    }
    /// 0.5
    #[inline(always)]
    fn half() -> Self {
        Self::lit(0.5)
    }
    /// 2.0
    #[inline(always)]
    fn two() -> Self {
        Self::lit(2.0)
    }
}

impl Real for f32 {
    const EPS: Self = f32::EPSILON;
    #[inline(always)]
    fn lit(x: f64) -> Self {
        x as f32
    }
    #[inline(always)]
    fn from_usize(n: usize) -> Self {
        n as f32
    }
    #[inline(always)]
    fn from_i32(n: i32) -> Self {
        n as f32
    }
    #[inline(always)]
    fn to_i64_sat(self) -> i64 {
        self as i64
    }
    #[inline(always)]
    fn to_f64_lossless(self) -> f64 {
        self as f64
    }
    #[inline]
    fn erf(self) -> Self {
        libm::erff(self)
    }
    #[inline]
    fn erfc(self) -> Self {
        libm::erfcf(self)
    }
    #[inline(always)]
    fn pow2_int(k: Self) -> Self {
        // (k + 127 + 1.5·2²³): the low 9 mantissa bits hold k + 127.
        f32::from_bits((k + 12_583_039.0).to_bits() << 23)
    }
}

impl Real for f64 {
    const EPS: Self = f64::EPSILON;
    #[inline(always)]
    fn lit(x: f64) -> Self {
        x
    }
    #[inline(always)]
    fn from_usize(n: usize) -> Self {
        n as f64
    }
    #[inline(always)]
    fn from_i32(n: i32) -> Self {
        n as f64
    }
    #[inline(always)]
    fn to_i64_sat(self) -> i64 {
        self as i64
    }
    #[inline(always)]
    fn to_f64_lossless(self) -> f64 {
        self
    }
    #[inline]
    fn erf(self) -> Self {
        libm::erf(self)
    }
    #[inline]
    fn erfc(self) -> Self {
        libm::erfc(self)
    }
    #[inline(always)]
    fn pow2_int(k: Self) -> Self {
        // (k + 1023 + 1.5·2⁵²): the low 12 mantissa bits hold k + 1023.
        f64::from_bits((k + 6_755_399_441_056_767.0).to_bits() << 52)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn eta0_is_mu0_c0_not_120_pi() {
        // CODATA 2018: η0 = 376.730 313 668(57) Ω.
        approx::assert_relative_eq!(ETA0_OHM, 376.730_313_668, max_relative = 1e-10);
        assert!((ETA0_OHM - 120.0 * core::f64::consts::PI).abs() > 0.1);
        approx::assert_relative_eq!(EPS0_F_PER_M, 8.854_187_812_8e-12, max_relative = 1e-10);
    }

    #[test]
    fn lit_round_trips_in_both_precisions() {
        assert_eq!(<f32 as Real>::lit(0.25), 0.25f32);
        assert_eq!(<f64 as Real>::lit(0.25), 0.25f64);
        assert_eq!(<f32 as Real>::c0(), 299_792_458.0f32);
        assert_eq!(<f64 as Real>::from_usize(7), 7.0);
    }

    #[test]
    fn pow2_int_builds_exact_powers() {
        for k in -1022..=1023 {
            assert_eq!(<f64 as Real>::pow2_int(k as f64), 2f64.powi(k), "{k}");
        }
        for k in -126..=127 {
            assert_eq!(<f32 as Real>::pow2_int(k as f32), 2f32.powi(k), "{k}");
        }
    }
}

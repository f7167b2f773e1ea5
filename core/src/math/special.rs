//! Special functions: modified Bessel I0, the complementary error function and its
//! inverse, and the Bessel functions J0, J1, Y0, Y1 with the derivatives J1′, Y1′.
//!
//! * I0(x) = Σₖ (x²/4)ᵏ / (k!)² (Abramowitz & Stegun, *Handbook of Mathematical
//!   Functions*, 1964, eq. 9.6.12), summed while every term is positive, so there
//!   is no cancellation, for |x| ≤ 25; above that the asymptotic expansion
//!   e^x/√(2πx) · Σₖ cₖ x⁻ᵏ with c₀ = 1, cₖ = cₖ₋₁ (2k−1)²/(8k) (A&S eq. 9.7.1),
//!   whose smallest term there is below 10⁻²⁰. [`bessel_i0e`] returns the scaled
//!   e^(−|x|)·I0(x), which never overflows (the Kaiser window uses it).
//! * erfc, J0, J1, Y0, Y1 come from `libm` (`erfc`/`erfcf`, `j1`/`j1f`, …) through
//!   the [`LibmSpecial`] trait, so the `f32` path calls the single-precision
//!   routines; our code adds no `f64`. (Checked on `thumbv7em-none-eabihf`:
//!   `erfcf`, `expf`, `logf` are pure single precision, but `libm`'s `j0f`/`j1f`/
//!   `y0f`/`y1f`, like its `sinf`/`cosf`, evaluate parts in double precision, so
//!   the `f32` Bessel J/Y are soft-float on a single-precision FPU: fine for
//!   set-up work such as a cutoff, not for per-sample loops.)
//! * erfc⁻¹(y) solves ln erfc(x) = ln y by Newton's method. ln erfc is concave,
//!   and the start x₀ = √(−ln y) lies right of the root (erfc x ≤ e^(−x²) for
//!   x ≥ 0), so the iterates decrease monotonically onto the root.
//! * [`sin_cos_turns`]: sin and cos of 2π·t in the scalar's own precision (libm's
//!   `sinf`/`cosf` use double-precision kernels internally).
//! * J1′(x) = J0(x) − J1(x)/x and Y1′(x) = Y0(x) − Y1(x)/x (A&S eq. 9.1.27), as
//!   needed for the TE11 cutoff of a coaxial line.

use crate::error::{finite, Error, Result};
use crate::scalar::Real;

/// The `libm` special functions, dispatched per precision (`erfcf` for `f32`,
/// `erfc` for `f64`). Implemented for `f32` and `f64` only; a supertrait of
/// [`Real`] so generic code can reach it.
pub trait LibmSpecial: Copy {
    /// Bessel function of the first kind, order 0.
    fn lib_j0(self) -> Self;
    /// Bessel function of the first kind, order 1.
    fn lib_j1(self) -> Self;
    /// Bessel function of the second kind, order 0 (x > 0).
    fn lib_y0(self) -> Self;
    /// Bessel function of the second kind, order 1 (x > 0).
    fn lib_y1(self) -> Self;
}

impl LibmSpecial for f32 {
    #[inline]
    fn lib_j0(self) -> Self {
        libm::j0f(self)
    }
    #[inline]
    fn lib_j1(self) -> Self {
        libm::j1f(self)
    }
    #[inline]
    fn lib_y0(self) -> Self {
        libm::y0f(self)
    }
    #[inline]
    fn lib_y1(self) -> Self {
        libm::y1f(self)
    }
}

impl LibmSpecial for f64 {
    #[inline]
    fn lib_j0(self) -> Self {
        libm::j0(self)
    }
    #[inline]
    fn lib_j1(self) -> Self {
        libm::j1(self)
    }
    #[inline]
    fn lib_y0(self) -> Self {
        libm::y0(self)
    }
    #[inline]
    fn lib_y1(self) -> Self {
        libm::y1(self)
    }
}

/// The nearest integer to `x` (ties to even), without a library call: for
/// |x| < 2^(p−3) (p the significand bits) x + 1.5·2^(p−1) rounds x to an
/// integer in the FPU's round-to-nearest mode and the subtraction is exact;
/// larger |x| are integers already. NaN stays NaN. (`round` is a software
/// routine on targets without a rounding instruction, e.g. baseline x86-64.)
#[inline(always)]
fn round_near<T: Real>(x: T) -> T {
    let c = T::lit(1.5) / T::EPS; // 1.5·2^(p−1)
    if x.abs() < T::lit(0.25) / T::EPS {
        (x + c) - c
    } else {
        x
    }
}

/// sin(2π·t) and cos(2π·t) for a phase t in turns, in the scalar's own precision.
///
/// `libm`'s `sinf`/`cosf` (musl's design) evaluate their kernels in double
/// precision, which on a single-precision FPU (Cortex-M4F) means soft-float
/// calls. This routine stays in `T`: the phase is reduced exactly (t − round(t),
/// then quadrants by the exact 4t − round(4t)), and on |θ| ≤ π/4 sin and cos
/// are minimax polynomials summed by Horner's rule: in `f64` the coefficients
/// of fdlibm's `__kernel_sin`/`__kernel_cos` (Sun Microsystems, 1993, also in
/// the `libm` crate's `k_sin.rs`/`k_cos.rs`; sin to θ¹³, cos to θ¹⁴,
/// approximation error < 2⁻⁵⁸), in `f32` those of Cephes' `sinf`/`cosf`
/// (S. L. Moshier, 1992; sin to θ⁷, cos to θ⁸; values from memory). `sin_cos_turns_matches_libm`
/// checks both against libm. Error: about 1 ulp of 1 in either precision.
/// Non-finite t gives NaN.
#[inline(always)]
pub fn sin_cos_turns<T: Real>(turns: T) -> (T, T) {
    let r = turns - round_near(turns); // [−½, ½], exact
    let u = r * T::lit(4.0); // exact
    let c0 = T::lit(1.5) / T::EPS;
    let k = (u + c0) - c0; // |u| ≤ 2: `round_near` without its guard
    let f = u - k; // [−½, ½], exact
    let th = f * T::FRAC_PI_2();
    let z = th * th;
    // sin θ = θ + θ·z·S(z), cos θ = 1 − (z/2 − z²·C(z)) (Horner, highest first).
    // Each coefficient is written as `T::lit(literal)` so it folds at compile time.
    let h = |acc: T, c: f64| acc * z + T::lit(c);
    let (sp, cp) = if T::EPS > T::lit(1e-10) {
        let sp = h(
            h(T::lit(-1.951_529_589_1e-4), 8.332_160_873_6e-3),
            -1.666_665_461_1e-1,
        );
        let cp = h(
            h(T::lit(2.443_315_711_809_948e-5), -1.388_731_625_493_765e-3),
            4.166_664_568_298_827e-2,
        );
        (sp, cp)
    } else {
        let mut sp = T::lit(1.589_690_995_211_55e-10);
        sp = h(sp, -2.505_076_025_340_686_3e-8);
        sp = h(sp, 2.755_731_370_707_006_8e-6);
        sp = h(sp, -1.984_126_982_985_795e-4);
        sp = h(sp, 8.333_333_333_322_49e-3);
        sp = h(sp, -1.666_666_666_666_663_2e-1);
        let mut cp = T::lit(-1.135_964_755_778_819_5e-11);
        cp = h(cp, 2.087_572_321_298_175e-9);
        cp = h(cp, -2.755_731_435_139_066_3e-7);
        cp = h(cp, 2.480_158_728_947_673e-5);
        cp = h(cp, -1.388_888_888_887_411e-3);
        cp = h(cp, 4.166_666_666_666_66e-2);
        (sp, cp)
    };
    let s = th + th * z * sp;
    let c = T::one() - (T::half() * z - z * z * cp);
    // Quadrant k ∈ {−2, −1, 0, 1, 2} (k mod 4 = 0: (s, c), 1: (c, −s),
    // 2: (−s, −c), 3: (−c, s)) by exact arithmetic on k rather than selects or
    // an integer match (no float-to-integer conversion, no branch on the
    // phase): o = 1 − |1 − |k|| is 1 for odd k and 0 for even k, 1 − |k| is
    // ±1 for even k and 0 for odd k, and every product below is by −1, 0 or 1.
    let ka = k.abs();
    let ev = T::one() - ka;
    let ko = k * (T::one() - ev.abs());
    (ko * c + ev * s, ev * c - ko * s)
}

/// e^(−x) for x ≥ 0 in the scalar's own precision, without branches or calls
/// (so that loops over it vectorise; frequency sweeps use it).
///
/// Cody–Waite reduction (Cody and Waite, *Software Manual for the Elementary
/// Functions*, 1980, ch. 6): k = round(x·log₂e) by the 1.5·2^(p−1) addition,
/// r = k·ln2_hi − x + k·ln2_lo ∈ [−ln2/2, ln2/2] (ln2_hi with trailing zero
/// bits, so k·ln2_hi is exact), e^(−x) = 2^(−k)·e^r with e^r by its Taylor
/// series to r¹³ in `f64` (truncation < 5·10⁻¹⁸) and to r⁷ in `f32`
/// (< 6·10⁻⁹), by Horner's rule. Error: a few ulp. x above 708 (`f64`) or
/// 87 (`f32`), +∞ included, gives exactly 0 (the true value is below the
/// smallest normal number or nearly so); NaN gives NaN. Negative x is outside
/// the documented range.
#[inline(always)]
pub fn exp_neg_poly<T: Real>(x: T) -> T {
    let single = T::EPS > T::lit(1e-10);
    let x_max = if single { T::lit(87.0) } else { T::lit(708.0) };
    let saturated = x >= x_max;
    let xc = if saturated { x_max } else { x }; // NaN stays NaN
    let c = T::lit(1.5) / T::EPS;
    let k = (xc * T::LOG2_E() + c) - c;
    // ln 2 split as in fdlibm's e_exp.c (f64) and musl's expf (f32) (values
    // from memory; `exp_neg_poly_matches_libm` checks the result against libm).
    let (hi, lo) = if single {
        (
            T::lit(0.693_145_751_953_125),
            T::lit(1.428_606_765_330_187e-6),
        )
    } else {
        (
            T::lit(6.931_471_803_691_238e-1),
            T::lit(1.908_214_929_270_587_7e-10),
        )
    };
    let r = (k * hi - xc) + k * lo;
    let h = |acc: T, c: f64| acc * r + T::lit(c);
    let mut p;
    if single {
        p = T::lit(1.0 / 5_040.0);
        p = h(p, 1.0 / 720.0);
        p = h(p, 1.0 / 120.0);
        p = h(p, 1.0 / 24.0);
        p = h(p, 1.0 / 6.0);
        p = h(p, 0.5);
    } else {
        p = T::lit(1.0 / 6_227_020_800.0);
        p = h(p, 1.0 / 479_001_600.0);
        p = h(p, 1.0 / 39_916_800.0);
        p = h(p, 1.0 / 3_628_800.0);
        p = h(p, 1.0 / 362_880.0);
        p = h(p, 1.0 / 40_320.0);
        p = h(p, 1.0 / 5_040.0);
        p = h(p, 1.0 / 720.0);
        p = h(p, 1.0 / 120.0);
        p = h(p, 1.0 / 24.0);
        p = h(p, 1.0 / 6.0);
        p = h(p, 0.5);
    }
    p = h(p, 1.0);
    p = h(p, 1.0);
    let v = p * T::pow2_int(-k);
    if saturated {
        T::zero()
    } else {
        v
    }
}

/// e^(j2π·turns) = cos + j·sin from [`sin_cos_turns`]: a unit phasor computed
/// entirely in `T` (the FFT, CZT and windows use it).
#[inline]
pub fn cis_turns<T: Real>(turns: T) -> crate::math::complex::Cx<T> {
    let (s, c) = sin_cos_turns(turns);
    crate::math::complex::Cx::new(c, s)
}

/// Above this |x| the asymptotic expansion of I0 is used.
const I0_ASYMPTOTIC_FROM: f64 = 25.0;

/// Power series of I0 (all terms positive), for |x| ≤ 25.
fn i0_series<T: Real>(x: T) -> T {
    let q = x * x * T::lit(0.25);
    let mut term = T::one();
    let mut sum = T::one();
    let mut k = T::one();
    // 25²/4 = 156.25: the terms fall below ε·sum by k ≈ 60 (f64).
    for _ in 0..200 {
        term = term * q / (k * k);
        sum = sum + term;
        if term <= sum * T::EPS * T::half() {
            break;
        }
        k = k + T::one();
    }
    sum
}

/// Σ cₖ x⁻ᵏ of the asymptotic expansion (x ≥ 25).
fn i0_asymptotic_sum<T: Real>(x: T) -> T {
    let mut term = T::one();
    let mut sum = T::one();
    let eight_x = T::lit(8.0) * x;
    let mut k = T::one();
    for _ in 0..60 {
        let two_k_1 = k + k - T::one();
        term = term * two_k_1 * two_k_1 / (k * eight_x);
        sum = sum + term;
        if term <= sum * T::EPS * T::half() {
            break;
        }
        k = k + T::one();
    }
    sum
}

/// Scaled modified Bessel function e^(−|x|)·I0(x): finite for every finite x,
/// in (0, 1]; ≈ 1/√(2π|x|) for large |x|.
///
/// Errors: [`Error::NonFinite`]`("x")`.
pub fn bessel_i0e<T: Real>(x: T) -> Result<T> {
    let x = finite(x, "x")?.abs();
    if x <= T::lit(I0_ASYMPTOTIC_FROM) {
        Ok(i0_series(x) * (-x).exp())
    } else {
        Ok(i0_asymptotic_sum(x) / (T::two_pi() * x).sqrt())
    }
}

/// Modified Bessel function of the first kind, order 0. Even in x, I0(0) = 1.
/// Overflows for |x| above ≈ 713 (`f64`) or ≈ 88 (`f32`); use [`bessel_i0e`] there.
///
/// Errors: [`Error::NonFinite`]`("x")` for non-finite x, [`Error::OutOfRange`]`("x")`
/// when the result would overflow.
pub fn bessel_i0<T: Real>(x: T) -> Result<T> {
    let x = finite(x, "x")?.abs();
    let v = if x <= T::lit(I0_ASYMPTOTIC_FROM) {
        i0_series(x)
    } else {
        // e^x / √(2πx) · Σ, the exponential split to delay overflow.
        let h = (x * T::half()).exp();
        h * (i0_asymptotic_sum(x) / (T::two_pi() * x).sqrt()) * h
    };
    if v.is_finite() {
        Ok(v)
    } else {
        Err(Error::OutOfRange("x"))
    }
}

/// Complementary error function erfc(x) = 1 − erf(x), from `libm`.
///
/// Errors: [`Error::NonFinite`]`("x")`.
pub fn erfc<T: Real>(x: T) -> Result<T> {
    Ok(finite(x, "x")?.erfc())
}

/// Error function erf(x), from `libm`.
///
/// Errors: [`Error::NonFinite`]`("x")`.
pub fn erf<T: Real>(x: T) -> Result<T> {
    Ok(finite(x, "x")?.erf())
}

/// erfc⁻¹ for y ≥ 1e−300 (`f64`) or ≥ 1e−36 (`f32`) in the tail; y ∈ (0, 1].
fn erfc_inv_upper<T: Real>(y: T) -> Result<T> {
    if y == T::one() {
        return Ok(T::zero());
    }
    let two_over_sqrt_pi = T::lit(core::f64::consts::FRAC_2_SQRT_PI);
    let ln_y = y.ln();
    let mut x = (-ln_y).sqrt();
    for _ in 0..100 {
        let e = x.erfc();
        if e <= T::zero() {
            // Underflow at the far tail: step back toward the root.
            x = x * T::lit(0.99);
            continue;
        }
        let f = e.ln() - ln_y;
        let df = -two_over_sqrt_pi * (-x * x).exp() / e;
        if df.is_nan() || df >= T::zero() {
            break;
        }
        let step = f / df;
        x = x - step;
        if step.abs() <= T::lit(4.0) * T::EPS * x.abs().max(T::min_positive_value()) {
            return Ok(x);
        }
    }
    // Newton converges in < 10 steps from the start above; report if it did not.
    if x.is_finite() {
        Ok(x)
    } else {
        Err(Error::NoConvergence("erfc_inv"))
    }
}

/// Inverse complementary error function: the x with erfc(x) = y, for 0 < y < 2.
///
/// For ½ ≤ y ≤ 3/2 it solves erf(x) = 1 − y; for y > 3/2 it uses
/// erfc⁻¹(y) = −erfc⁻¹(2 − y) (2 − y is exact there).
/// Accurate to a few ulp for y down to the smallest normal number of the type;
/// in the subnormal range the accuracy of libm's erfc limits it.
///
/// Errors: [`Error::NonFinite`]`("y")`, [`Error::OutOfRange`]`("y")` unless 0 < y < 2.
pub fn erfc_inv<T: Real>(y: T) -> Result<T> {
    let y = finite(y, "y")?;
    if !(y > T::zero() && y < T::two()) {
        return Err(Error::OutOfRange("y"));
    }
    if y >= T::half() && y <= T::lit(1.5) {
        // Near y = 1 erfc(x) ≈ 1 hides x in its last bits: solve erf(x) = 1 − y
        // instead (1 − y is exact here by Sterbenz's lemma).
        return erf_inv_central(T::one() - y);
    }
    if y < T::one() {
        erfc_inv_upper(y)
    } else {
        Ok(-erfc_inv_upper(T::two() - y)?)
    }
}

/// erf⁻¹(z) for |z| ≤ ½ by Newton's method from the tangent at 0.
fn erf_inv_central<T: Real>(z: T) -> Result<T> {
    if z == T::zero() {
        return Ok(T::zero());
    }
    let two_over_sqrt_pi = T::lit(core::f64::consts::FRAC_2_SQRT_PI);
    let mut x = z / two_over_sqrt_pi;
    for _ in 0..50 {
        let step = (x.erf() - z) / (two_over_sqrt_pi * (-x * x).exp());
        x = x - step;
        if step.abs() <= T::two() * T::EPS * x.abs() {
            return Ok(x);
        }
    }
    if x.is_finite() {
        Ok(x)
    } else {
        Err(Error::NoConvergence("erfc_inv"))
    }
}

/// Bessel function J1(x), from `libm`.
///
/// Errors: [`Error::NonFinite`]`("x")`.
pub fn bessel_j1<T: Real>(x: T) -> Result<T> {
    Ok(finite(x, "x")?.lib_j1())
}

/// Bessel function Y1(x) for x > 0, from `libm`.
///
/// Errors: [`Error::NonFinite`]`("x")`, [`Error::NotPositive`]`("x")`.
pub fn bessel_y1<T: Real>(x: T) -> Result<T> {
    Ok(crate::error::positive(x, "x")?.lib_y1())
}

/// Derivative J1′(x) = J0(x) − J1(x)/x; J1′(0) = ½.
///
/// Errors: [`Error::NonFinite`]`("x")`.
pub fn bessel_j1_prime<T: Real>(x: T) -> Result<T> {
    let x = finite(x, "x")?;
    if x == T::zero() {
        return Ok(T::half());
    }
    Ok(x.lib_j0() - x.lib_j1() / x)
}

/// Derivative Y1′(x) = Y0(x) − Y1(x)/x for x > 0.
///
/// Errors: [`Error::NonFinite`]`("x")`, [`Error::NotPositive`]`("x")`.
pub fn bessel_y1_prime<T: Real>(x: T) -> Result<T> {
    let x = crate::error::positive(x, "x")?;
    Ok(x.lib_y0() - x.lib_y1() / x)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sin_cos_turns_matches_libm() {
        let mut worst64: f64 = 0.0;
        let mut worst32: f64 = 0.0;
        for i in -2000i32..=2000 {
            let t = i as f64 * 0.000_731 + 0.123; // spans several turns
            let (s, c) = sin_cos_turns(t);
            let (s0, c0) = (core::f64::consts::TAU * (t - t.round())).sin_cos();
            worst64 = worst64.max((s - s0).abs()).max((c - c0).abs());
            let t32 = t as f32;
            let (s, c) = sin_cos_turns(t32);
            let r = t32 as f64 - (t32 as f64).round();
            let (s0, c0) = (core::f64::consts::TAU * r).sin_cos();
            worst32 = worst32
                .max((s as f64 - s0).abs())
                .max((c as f64 - c0).abs());
        }
        assert!(worst64 < 4e-16, "{worst64:e}");
        assert!(worst32 < 1.5e-7, "{worst32:e}");
        // Exact quadrant points.
        assert_eq!(sin_cos_turns(0.25f64), (1.0, 0.0));
        assert_eq!(sin_cos_turns(-0.5f32).1, -1.0);
        assert_eq!(sin_cos_turns(3.0f64), (0.0, 1.0));
    }

    #[test]
    fn exp_neg_poly_matches_libm() {
        // Against libm's exp (musl, < 1 ulp) over the whole range.
        let mut worst64: f64 = 0.0;
        let mut worst32: f64 = 0.0;
        for i in 0..=20_000 {
            let x = i as f64 * 0.035_4 + 1e-3 * (i % 7) as f64;
            if x < 708.0 {
                let want = libm::exp(-x);
                worst64 = worst64.max(((exp_neg_poly(x) - want) / want).abs());
            }
            let x32 = x as f32;
            if x32 < 87.0 {
                let want = libm::exp(-(x32 as f64));
                worst32 = worst32.max(((exp_neg_poly(x32) as f64 - want) / want).abs());
            }
        }
        assert!(worst64 < 8.0 * f64::EPSILON, "{worst64:e}");
        assert!(worst32 < 4.0 * f32::EPSILON as f64, "{worst32:e}");
        assert_eq!(exp_neg_poly(0.0f64), 1.0);
        assert_eq!(exp_neg_poly(0.0f32), 1.0);
        assert_eq!(exp_neg_poly(800.0f64), 0.0);
        assert_eq!(exp_neg_poly(f32::INFINITY), 0.0);
        assert!(exp_neg_poly(f64::NAN).is_nan());
        assert!(exp_neg_poly(f32::NAN).is_nan());
    }

    #[test]
    fn i0_small_values_and_symmetry() {
        // I0(0) = 1; I0(1) = 1.2660658777520082 (A&S Table 9.8, value from memory,
        // re-checked against scipy in tests/tests/math.rs).
        assert_eq!(bessel_i0(0.0f64), Ok(1.0));
        let v = bessel_i0(1.0f64).unwrap();
        assert!((v - 1.266_065_877_752_008_2).abs() < 1e-15);
        assert_eq!(bessel_i0(-3.0f64), bessel_i0(3.0f64));
        let v32 = bessel_i0(1.0f32).unwrap();
        assert!((v32 - 1.266_066).abs() < 1e-6);
    }

    #[test]
    fn i0_series_and_asymptotic_agree_at_the_switch() {
        let a = i0_series(25.0f64) * (-25.0f64).exp();
        let b = i0_asymptotic_sum(25.0f64) / (core::f64::consts::TAU * 25.0).sqrt();
        assert!((a / b - 1.0).abs() < 2e-15, "{a} {b}");
    }

    #[test]
    fn i0_rejects_and_reports_overflow() {
        assert_eq!(bessel_i0(f64::NAN), Err(Error::NonFinite("x")));
        assert_eq!(bessel_i0(100.0f32), Err(Error::OutOfRange("x")));
        assert!(bessel_i0e(100.0f32).unwrap() > 0.0);
        assert!(bessel_i0e(1e30f64).unwrap() > 0.0);
    }

    #[test]
    fn erfc_inv_round_trips() {
        for &y in &[1e-300, 1e-20, 0.01, 0.3, 1.0, 1.5, 1.999_999] {
            let x = erfc_inv(y).unwrap();
            let back = libm::erfc(x);
            assert!((back / y - 1.0).abs() < 1e-13, "y={y} x={x} back={back}");
        }
        for &y in &[1e-30f32, 1e-5, 0.5, 1.7] {
            let x = erfc_inv(y).unwrap();
            assert!((libm::erfcf(x) / y - 1.0).abs() < 1e-5);
        }
        assert_eq!(erfc_inv(0.0f64), Err(Error::OutOfRange("y")));
        assert_eq!(erfc_inv(2.0f32), Err(Error::OutOfRange("y")));
        assert_eq!(erfc_inv(f64::INFINITY), Err(Error::NonFinite("y")));
    }

    #[test]
    fn bessel_derivatives_at_zero_and_domain() {
        assert_eq!(bessel_j1_prime(0.0f64), Ok(0.5));
        assert_eq!(bessel_y1_prime(0.0f64), Err(Error::NotPositive("x")));
        assert!(bessel_y1_prime(1.0f32).unwrap().is_finite());
    }
}

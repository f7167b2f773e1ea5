//! Microstrip: a strip of width W and thickness t on a substrate of height h
//! over a ground plane.
//!
//! **Static Zc and εeff**: Hammerstad & Jensen, "Accurate Models for Microstrip
//! Computer-Aided Design", IEEE MTT-S Int. Microwave Symp. Digest, 1980,
//! pp. 407–409. With u = W/h:
//!
//! * Z01(u) = (η0/2π)·ln[f(u)/u + √(1 + (2/u)²)], f(u) = 6 + (2π − 6)·exp[−(30.666/u)^0.7528];
//! * εeff = (εr + 1)/2 + (εr − 1)/2·(1 + 10/u)^(−a·b),
//!   a(u) = 1 + ln[(u⁴ + (u/52)²)/(u⁴ + 0.432)]/49 + ln[1 + (u/18.1)³]/18.7,
//!   b(εr) = 0.564·[(εr − 0.9)/(εr + 3)]^0.053;
//! * thickness (t normalised to h): Δu1 = (t/π)·ln[1 + 4e/(t·coth²√(6.517u))],
//!   Δur = ½Δu1·[1 + sech√(εr − 1)]; Z0 = Z01(u + Δur)/√εeff(u + Δur),
//!   εeff(t) = εeff(u + Δur)·[Z01(u + Δu1)/Z01(u + Δur)]².
//!
//! Claimed accuracy: Z01 better than 0.01 % for u ≤ 1 and 0.03 % for u ≤ 1000;
//! εeff better than 0.2 % for εr ≤ 128, 0.01 ≤ u ≤ 100.
//!
//! **Dispersion of εeff**: Kirschning & Jansen, Electronics Letters 18(6):272–273,
//! 1982. fn = f·h in GHz·mm; εeff(f) = εr − (εr − εeff0)/(1 + P) with
//! P = P1·P2·[(0.1844 + P3·P4)·fn]^1.5763,
//! P1 = 0.27488 + [0.6315 + 0.525/(1 + 0.0157fn)^20]·u − 0.065683·e^(−8.7513u),
//! P2 = 0.33622·(1 − e^(−0.03442εr)), P3 = 0.0363·e^(−4.6u)·[1 − e^(−(fn/38.7)^4.97)],
//! P4 = 1 + 2.751·[1 − e^(−(εr/15.916)^8)]. Valid 0.1 ≤ u ≤ 100, 1 ≤ εr ≤ 20,
//! h/λ0 ≤ 0.13; claimed better than 0.6 %.
//!
//! **Dispersion of Zc**: Jansen & Kirschning, AEÜ 37:108–112, 1983 (the
//! seventeen-term form R1…R17, Z(f) = Z0·(R13/R14)^R17; **from memory**, not
//! checked against the original; valid 0.1 ≤ u ≤ 10, εr ≤ 18, h/λ0 ≤ 0.1). Where
//! its ratio R13/R14 is not positive (εeff within a few per cent of 1) the static
//! Zc is kept and the point is flagged OUTSIDE_FIT_RANGE. Its trend (a slight
//! dip near fn ≈ 1, then a rise: +3 % at fn = 10 and +15 % at fn = 20 for
//! εr 9.8, u = 1) follows the recalled coefficients; [`Microstrip::without_zc_dispersion`]
//! keeps the static Zc instead.
//!
//! **Losses**: conductor αc = Rs·Kr·Ki/(Z0·W) Np/m with current crowding
//! Ki = exp[−1.2·(Z0/η0)^0.7] and roughness Kr = 1 + (2/π)·atan[1.4(Δrms/δ)²]
//! (Hammerstad & Bekkadal, *Microstrip Handbook*, ELAB report STF44 A74169,
//! 1975; from memory). It enters as a series internal impedance
//! Kr·R_dc·√(1 + j f/f_c) per [`Conductor`](crate::line::conductor::Conductor) with
//! R_dc = 1/(σWt) (the strip; the ground plane's DC resistance is neglected) and
//! R → 2·Rs·Ki/W at high frequency, so R tends to R_dc at DC. For t = 0 the
//! pure skin-effect form (1 + j)·2RsKi/W is used (zero at DC) and every point
//! with a metal carries THIN_CONDUCTOR. Dielectric loss with the filling factor
//! q = (εeff − 1)/(εr − 1): αd = (k0/2)·εr·q·tanδ/√εeff (Pozar, *Microwave
//! Engineering*, 4th ed., 2012, eq. 3.198), as G = ωC·εr·q·tanδ/εeff.
//!
//! **Higher-order modes** (Gupta, Garg, Bahl & Bhartia, *Microstrip Lines and
//! Slotlines*, 2nd ed., 1996, ch. 2; forms from memory): strong coupling to the
//! TM0 surface wave from f_T = c0·atan(εr)/(√2·π·h·√(εr − 1)), and the lowest
//! transverse resonance of the strip f_CT = c0/(√εr·(2W + 0.8h)); the
//! [`cutoff_hz`](LineModel::cutoff_hz) is the lower, with ε′ taken at DC.
//!
//! Warnings: ABOVE_HIGHER_MODE at or above the cutoff; OUTSIDE_FIT_RANGE outside
//! the ranges above (geometry, εr, h/λ0); THIN_CONDUCTOR where t/3 < δ < 3t;
//! HIGH_LOSS, DIFFUSIVE as for [`Rlgc`](crate::line::rlgc::Rlgc).
//!
//! **Wideband Debye dielectric: the ε′ table.** The statics that depend on εr
//! (Z0, εeff0, the conductor coefficient, P2, P4, R7, R3·εr^1.674, R9's εr
//! part, R10, R16's εr part) are tabulated at construction as Chebyshev series
//! of degree 9 in ε′ over [ε∞, εs], of their deviations from the midpoint
//! values: the model's ε′ is monotonic between εs (f = 0) and ε∞ (f → ∞), so
//! every frequency falls inside. Eleven evaluations at construction (the ten
//! Chebyshev nodes and the midpoint), then ten dot products of length ten and
//! one `ln` (ln εeff0, from the interpolated εeff0 so that R13 and R14 see the
//! same value) per call. The table is kept only when, for every quantity, the
//! last two coefficients sum to at most 10⁻⁹ (f64; 16ε ≈ 1.9·10⁻⁶ in f32) of
//! its largest value (of 1 for R9 and R16, which enter next to numbers of
//! order 1); coefficients below a quarter of that bound over ten are dropped.
//! Otherwise (ε′ ranges so wide, or so close to 1, that the series converges
//! slowly, e.g. ε∞ = 1, Δε = 30), and in f32 for ε∞ < 1.05 (where R13/R14 and
//! the filling factor amplify single-ulp differences in εeff0 to 10⁻⁴), the
//! statics are evaluated directly at ε′(f) on every call, as before. Tested
//! against the direct evaluation in f64 for seven fitted dielectrics (εr 1.2 …
//! 12.9, tanδ 0.001 … 0.08), eight geometries, and eighteen (ε∞, Δε) pairs
//! down to ε∞ = 1, from 0 Hz to 10 THz: in f64 Z0, εeff and α agree with the
//! direct values to 1·10⁻⁸ (worst seen 2·10⁻⁹); in f32 the table's error
//! exceeds that of the direct f32 evaluation by at most 2·10⁻⁵: far inside the
//! Hammerstad–Jensen accuracy (0.2 % εeff, 0.03 % Z0). The table costs
//! 112 numbers, 896 bytes in f64 (448 in f32), inside the struct, no heap.
//! Width synthesis builds its lines without the table (one evaluation each).
//!
//! Cost (x86-64, `f64`; wall-clock the best of 40 runs of 10 000 log-spaced
//! points, 1 kHz–20 GHz, on a shared, loaded machine; instructions from
//! `tests/scripts/callgrind.sh`, rows `ms` and `msdebye` of
//! `core/examples/perf_probe.rs`): with a constant dielectric every
//! εr-dependent term is computed at construction; `at` then costs the
//! dispersion (at most eleven `exp`, four `ln`; fewer at low fn, where
//! 1 − e^(−x) is a series and the R9, R11 powers are dropped), one `atan` with
//! roughness, and the γ/Zc roots: about 1 170 instructions, 120–130 ns per
//! point. With a wideband Debye dielectric and the ε′ table: about 1 690
//! instructions, 170 ns (3 080 and 360 ns when the statics were evaluated at
//! ε′(f) on every call). In `f32`: 910 instructions, 110 ns constant; 1 390,
//! 150 ns Debye (the low-frequency powers no longer go subnormal). Criterion's
//! best samples (`core/benches/line_models.rs`, load 4–5 on two cores): f64
//! 185–195 ns constant (165–175 before the table; the instruction count fell,
//! so likely code layout, not confirmed), 230–250 ns Debye (395–420 before);
//! f32 130–160 ns and 175–195 ns (195–250 and 365–385 before).
//!
//! Size: `Microstrip<f64>` ≤ 1 168 bytes, `Microstrip<f32>` ≤ 584 bytes (no heap).

use crate::error::{self, Error, Result};
use crate::line::conductor::Metal;
use crate::line::dielectric::Dielectric;
use crate::line::tem::{self, SkinLoss};
use crate::line::{LineModel, LinePoint, Warnings};
use crate::scalar::Real;

/// Hammerstad–Jensen Z01(u) of the strip in air, Ω.
fn z01<T: Real>(u: T) -> T {
    let six = T::lit(6.0);
    let f = six + (T::two_pi() - six) * (-(T::lit(30.666) / u).pw(T::lit(0.7528))).exp();
    let two_u = T::two() / u;
    T::eta0() / T::two_pi() * (f / u + (T::one() + two_u * two_u).sqrt()).ln()
}

/// Hammerstad–Jensen a(u).
fn a_of_u<T: Real>(u: T) -> T {
    let u2 = u * u;
    let u4 = u2 * u2;
    let r = u / T::lit(52.0);
    let s = u / T::lit(18.1);
    T::one()
        + ((u4 + r * r) / (u4 + T::lit(0.432))).ln() / T::lit(49.0)
        + (T::one() + s * s * s).ln() / T::lit(18.7)
}

/// Hammerstad–Jensen b(εr).
fn b_of_er<T: Real>(er: T) -> T {
    T::lit(0.564) * ((er - T::lit(0.9)) / (er + T::lit(3.0))).pw(T::lit(0.053))
}

/// Hammerstad–Jensen εeff(u, εr) for zero thickness.
fn eps_eff0<T: Real>(u: T, er: T) -> T {
    let h = T::half();
    (er + T::one()) * h
        + (er - T::one()) * h * (T::one() + T::lit(10.0) / u).pw(-a_of_u(u) * b_of_er(er))
}

/// Hammerstad & Jensen (1980) static microstrip: (Z0 in Ω, εeff) for u = W/h > 0,
/// εr ≥ 1 and t/h ≥ 0 (see the module docs for the forms and their accuracy).
///
/// Errors: `NotPositive("u")`, `Negative("t_over_h")`, `OutOfRange("eps_r")`
/// (εr < 1), `NonFinite` for any of them.
pub fn hammerstad_jensen<T: Real>(u: T, eps_r: T, t_over_h: T) -> Result<(T, T)> {
    let u = error::positive(u, "u")?;
    let t = error::non_negative(t_over_h, "t_over_h")?;
    let er = error::finite(eps_r, "eps_r")?;
    if er < T::one() {
        return Err(Error::OutOfRange("eps_r"));
    }
    let du1 = thickness_du1(u, t);
    Ok(hj_static(u, er, du1))
}

/// Δu1 = (t/π)·ln[1 + 4e/(t·coth²√(6.517u))] (0 for t = 0).
fn thickness_du1<T: Real>(u: T, t: T) -> T {
    if t <= T::zero() {
        return T::zero();
    }
    let th = (T::lit(6.517) * u).sqrt().tanh();
    // coth² = 1/tanh²  →  4e/(t·coth²) = 4e·tanh²/t.
    t / T::PI() * (T::one() + T::lit(4.0) * T::E() * th * th / t).ln()
}

/// (Z0, εeff) with the thickness correction, given Δu1.
fn hj_static<T: Real>(u: T, er: T, du1: T) -> (T, T) {
    if du1 == T::zero() {
        let e = eps_eff0(u, er);
        return (z01(u) / e.sqrt(), e);
    }
    let sech = T::one() / (er - T::one()).sqrt().cosh();
    let dur = T::half() * du1 * (T::one() + sech);
    let u1 = u + du1;
    let ur = u + dur;
    let z_r = z01(ur);
    let e_r = eps_eff0(ur, er);
    let ratio = z01(u1) / z_r;
    (z_r / e_r.sqrt(), e_r * ratio * ratio)
}

/// Everything that depends on εr (and the geometry) but not on frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Statics<T> {
    er: T,
    z0: T,
    ee0: T,
    ln_ee0: T,
    k_hf: T,
    skin: SkinLoss<T>,
    // Kirschning–Jansen εeff dispersion.
    p1a: T,
    p1b: T,
    p2: T,
    p3a: T,
    p4: T,
    // Jansen–Kirschning Zc dispersion.
    r7: T,
    r3_er: T,
    r9a: T,
    r10: T,
    r12: T,
    r16a: T,
    warn: Warnings,
}

impl<T: Real> Statics<T> {
    /// The εr-dependent numbers, in the table's order.
    fn tabulated(&self) -> [T; NQ] {
        [
            self.z0, self.ee0, self.k_hf, self.p2, self.p4, self.r7, self.r3_er, self.r9a,
            self.r10, self.r16a,
        ]
    }
}

/// Number of Chebyshev nodes (and coefficients) of the ε′ table.
const NT: usize = 10;
/// Number of tabulated statics (see [`Statics::tabulated`]).
const NQ: usize = 10;
/// Absolute scale below which a tabulated quantity's error is judged against
/// 1 rather than its own size: R9 and R16 − 1 (terms added to numbers of
/// order 1). 0: judged relative to its own size.
const FLOOR: [f64; NQ] = [0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 1.0, 0.0, 1.0];
/// The Chebyshev nodes cos(π(j + ½)/NT), j = 0…NT − 1.
const NODES: [f64; NT] = [
    0.987_688_340_595_137_8,
    0.891_006_524_188_367_9,
    core::f64::consts::FRAC_1_SQRT_2,
    0.453_990_499_739_546_8,
    0.156_434_465_040_230_9,
    -0.156_434_465_040_230_9,
    -0.453_990_499_739_546_8,
    -core::f64::consts::FRAC_1_SQRT_2,
    -0.891_006_524_188_367_9,
    -0.987_688_340_595_137_8,
];

/// T_0(x)…T_{NT−1}(x) by the three-term recurrence.
#[inline(always)]
fn chebyshev<T: Real>(x: T) -> [T; NT] {
    let mut t = [T::zero(); NT];
    let (mut a, mut b) = (T::one(), x);
    let two_x = x + x;
    for v in t.iter_mut() {
        *v = a;
        let next = two_x * b - a;
        a = b;
        b = next;
    }
    t
}

/// The εr-dependent statics as Chebyshev series in ε′ over [ε∞, εs] of a
/// wideband Debye dielectric (its ε′ stays in that interval at every f ≥ 0).
#[derive(Clone, Copy, Debug, PartialEq)]
struct EpsTable<T> {
    mid: T,
    inv_half: T,
    /// The quantities at the midpoint; the series are of the deviations from
    /// them, so rounding is relative to the (small) deviations (it matters in
    /// f32, where a sum of ten terms of full size would cost several ulps).
    base: [T; NQ],
    /// coef[k][q]: the k-th Chebyshev coefficient of quantity q (c0 halved).
    coef: [[T; NQ]; NT],
}

impl<T: Real> EpsTable<T> {
    /// The tabulated statics at ε′ = `er` (clamped to the interval).
    #[inline(always)]
    fn eval(&self, er: T) -> [T; NQ] {
        let x = ((er - self.mid) * self.inv_half)
            .max(-T::one())
            .min(T::one());
        let t = chebyshev(x);
        let mut acc = [T::zero(); NQ];
        for (row, &tk) in self.coef.iter().zip(t.iter()) {
            for (a, &c) in acc.iter_mut().zip(row.iter()) {
                *a = *a + c * tk;
            }
        }
        for (a, &b) in acc.iter_mut().zip(self.base.iter()) {
            *a = *a + b;
        }
        acc
    }
}

/// How the εr-dependent statics are obtained per call.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Cache<T> {
    /// A constant dielectric: computed once.
    Fixed(Statics<T>),
    /// A wideband Debye dielectric: interpolated in ε′.
    Table(EpsTable<T>),
    /// Computed at ε′(f) on every call (the table would not meet its bound).
    Direct,
}

/// e^x as 2^(x·log2 e) in `f64`: libm's `exp2` costs about a third less than
/// its `exp`, for a relative error of about |x|·ε (below 10⁻¹⁴ for the
/// arguments here). In `f32` plain `expf` (libm's `exp2f` computes in double
/// precision inside, which the f32 path must not); the branch is on a constant
/// of the type and folds away.
/// x^y for x > 0 as 2^(y·log2 x) likewise (libm's `pow` costs about as much
/// as `log2` and `exp2` together twice over).
trait Ex {
    fn ex(self) -> Self;
    fn pw(self, y: Self) -> Self;
}

impl<T: Real> Ex for T {
    #[inline(always)]
    fn ex(self) -> T {
        if T::EPS < T::lit(1e-10) {
            (self * T::LOG2_E()).exp2()
        } else {
            self.exp()
        }
    }
    #[inline(always)]
    fn pw(self, y: T) -> T {
        if T::EPS < T::lit(1e-10) {
            (y * self.log2()).exp2()
        } else {
            (y * self.ln()).exp()
        }
    }
}

/// 1 − e^(−x) for x ≥ 0: the series x·(1 − x/2·(1 − x/3)) below 10⁻⁵ in
/// f64, 10⁻² in f32 (relative error x³/24: 5·10⁻¹⁷, 5·10⁻⁸; one `exp` saved
/// and no cancellation), else directly (relative error about ε/x).
#[inline(always)]
fn one_minus_exp_neg<T: Real>(x: T) -> T {
    let switch = if T::EPS < T::lit(1e-10) {
        T::lit(1e-5)
    } else {
        T::lit(1e-2)
    };
    if x < switch {
        x * (T::one() - x * T::half() * (T::one() - x / T::lit(3.0)))
    } else {
        T::one() - (-x).ex()
    }
}

/// The statics, borrowed when cached (a constant dielectric), so `at` copies nothing.
enum StRef<'a, T> {
    Borrowed(&'a Statics<T>),
    Owned(Statics<T>),
}

impl<T> core::ops::Deref for StRef<'_, T> {
    type Target = Statics<T>;
    fn deref(&self) -> &Statics<T> {
        match self {
            StRef::Borrowed(s) => s,
            StRef::Owned(s) => s,
        }
    }
}

/// The width-only terms of the dispersion formulas.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Geo<T> {
    p1a: T,
    p3a: T,
    one_m_exp_r2: T,
    r3: T,
    exp_neg_r6: T,
    r12: T,
    one_m_exp_u15: T,
}

impl<T: Real> Geo<T> {
    fn new(u: T) -> Self {
        let lit = T::lit;
        let one = T::one();
        let r2 = lit(0.267) * u.powi(7);
        let r6 = lit(22.2) * u.pw(lit(1.92));
        let u15 = u / lit(15.0);
        Geo {
            p1a: lit(0.27488) - lit(0.065683) * (lit(-8.7513) * u).exp(),
            p3a: lit(0.0363) * (lit(-4.6) * u).exp(),
            one_m_exp_r2: one - (-r2).exp(),
            r3: lit(4.766) * (lit(-3.228) * u.pw(lit(0.641))).exp(),
            exp_neg_r6: (-r6).exp(),
            r12: one / (one + lit(0.00245) * u * u),
            one_m_exp_u15: one - (-u15.powi(6)).exp(),
        }
    }
}

/// A microstrip line (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Microstrip<T> {
    width_m: T,
    height_m: T,
    thickness_m: T,
    u: T,
    du1: T,
    geo: Geo<T>,
    dielectric: Dielectric<T>,
    metal: Option<Metal<T>>,
    roughness_rms_m: T,
    r_dc: Option<T>,
    cache: Cache<T>,
    cutoff_hz: T,
    thin_lo_hz: T,
    thin_hi_hz: T,
    zc_dispersion: bool,
    base: Warnings,
}

impl<T: Real> Microstrip<T> {
    /// From the strip width W > 0, substrate height h > 0 and strip thickness
    /// t ≥ 0 (m), a dielectric, and the strip metal (`None`: a perfect conductor).
    pub fn new(
        width_m: T,
        height_m: T,
        thickness_m: T,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        Self::build(width_m, height_m, thickness_m, dielectric, metal, true)
    }

    /// As [`Self::new`] but without the ε′ table of a wideband Debye dielectric
    /// (eleven static evaluations saved), for a line evaluated at one or two
    /// frequencies only, as in width synthesis. Same results within the table's bound.
    pub(crate) fn new_untabulated(
        width_m: T,
        height_m: T,
        thickness_m: T,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        Self::build(width_m, height_m, thickness_m, dielectric, metal, false)
    }

    fn build(
        width_m: T,
        height_m: T,
        thickness_m: T,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
        tabulate: bool,
    ) -> Result<Self> {
        let w = error::positive(width_m, "width_m")?;
        let h = error::positive(height_m, "height_m")?;
        let t = error::non_negative(thickness_m, "thickness_m")?;
        let u = error::positive(w / h, "width_m")?;
        let du1 = thickness_du1(u, t / h);
        let r_dc = match (metal, t > T::zero()) {
            (Some(m), true) => Some(error::positive(
                T::one() / (m.conductivity_s_per_m() * w * t),
                "thickness_m",
            )?),
            _ => None,
        };
        let mut base = Warnings::NONE;
        base.set_if(dielectric.is_non_causal(), Warnings::NON_CAUSAL_DIELECTRIC);
        // Hammerstad–Jensen, Kirschning–Jansen and Jansen–Kirschning geometry ranges.
        base.set_if(
            u < T::lit(0.1) || u > T::lit(100.0),
            Warnings::OUTSIDE_FIT_RANGE,
        );
        let (thin_lo_hz, thin_hi_hz) = match metal {
            Some(m) if t > T::zero() => {
                let b = T::one() / (T::PI() * m.mu_h_per_m() * m.conductivity_s_per_m() * t * t);
                (b / T::lit(9.0), b * T::lit(9.0))
            }
            Some(_) => (T::zero(), T::infinity()),
            None => (T::zero(), T::zero()),
        };
        let mut ms = Microstrip {
            width_m: w,
            height_m: h,
            thickness_m: t,
            u,
            du1,
            geo: Geo::new(u),
            dielectric,
            metal,
            roughness_rms_m: T::zero(),
            r_dc,
            cache: Cache::Direct,
            cutoff_hz: T::zero(),
            thin_lo_hz,
            thin_hi_hz,
            zc_dispersion: true,
            base,
        };
        let er0 = dielectric.eps_static();
        let c = T::c0();
        let f_ct = c / (er0.sqrt() * (T::two() * w + T::lit(0.8) * h));
        let f_t = if er0 - T::one() > T::lit(1e-6) {
            c * er0.atan() / (T::SQRT_2() * T::PI() * h * (er0 - T::one()).sqrt())
        } else {
            T::infinity()
        };
        ms.cutoff_hz = f_ct.min(f_t);
        ms.cache = match dielectric.debye() {
            None => Cache::Fixed(ms.statics(er0)?),
            Some(_) if !tabulate => Cache::Direct,
            Some(d) => match ms.table(d.eps_inf(), er0) {
                Some(t) => Cache::Table(t),
                None if d.delta_eps() <= T::zero() => Cache::Fixed(ms.statics(er0)?),
                None => Cache::Direct,
            },
        };
        Ok(ms)
    }

    /// Turns the (from-memory) Jansen–Kirschning Zc dispersion off: Zc is then
    /// the static value at every frequency (εeff still disperses).
    pub fn without_zc_dispersion(mut self) -> Self {
        self.zc_dispersion = false;
        self
    }

    /// Sets the RMS surface roughness Δrms ≥ 0 (m) for the Hammerstad–Bekkadal factor.
    pub fn with_roughness(mut self, roughness_rms_m: T) -> Result<Self> {
        self.roughness_rms_m = error::non_negative(roughness_rms_m, "roughness_rms_m")?;
        Ok(self)
    }

    /// The Chebyshev table of the statics over ε′ ∈ [lo, hi], or `None` when
    /// the interval is empty, a node fails, or the last two coefficients of a
    /// quantity exceed [`Self::TABLE_TOL_F64`] of its largest value (the series
    /// has then not converged to the bound; see the module docs).
    fn table(&self, lo: T, hi: T) -> Option<EpsTable<T>> {
        let half_w = (hi - lo) * T::half();
        if half_w.is_nan() || half_w <= T::zero() {
            return None;
        }
        // In f32, for ε∞ < 1.05 the Jansen–Kirschning ratio R13/R14 and the
        // filling factor amplify single-ulp differences in εeff0 up to 10⁻⁴:
        // the direct path is kept there.
        if T::EPS > T::lit(1e-10) && lo < T::lit(1.05) {
            return None;
        }
        let mid = (hi + lo) * T::half();
        let mut coef = [[T::zero(); NQ]; NT];
        let mut scale = [T::zero(); NQ];
        let w = T::two() / T::from_usize(NT);
        let base = self.statics(mid).ok()?.tabulated();
        for &x in NODES.iter() {
            let x = T::lit(x);
            let v = self.statics(mid + half_w * x).ok()?.tabulated();
            for (s, &q) in scale.iter_mut().zip(v.iter()) {
                *s = s.max(q.abs());
            }
            for (row, &tk) in coef.iter_mut().zip(chebyshev(x).iter()) {
                for ((c, &q), &b) in row.iter_mut().zip(v.iter()).zip(base.iter()) {
                    *c = *c + w * tk * (q - b);
                }
            }
        }
        if let Some(row) = coef.first_mut() {
            for c in row.iter_mut() {
                *c = *c * T::half();
            }
        }
        let tol = T::lit(Self::TABLE_TOL_F64).max(T::lit(16.0) * T::EPS);
        // Each quantity's scale: its largest value, or FLOOR if larger.
        for (s, &fl) in scale.iter_mut().zip(FLOOR.iter()) {
            *s = s.max(T::lit(fl));
        }
        let mut tail = coef.iter().rev().take(2);
        let (Some(a), Some(b)) = (tail.next(), tail.next()) else {
            return None;
        };
        for ((&ca, &cb), &s) in a.iter().zip(b.iter()).zip(scale.iter()) {
            let t = ca.abs() + cb.abs();
            if t.is_nan() || t > tol * s || !s.is_finite() {
                return None;
            }
        }
        // Coefficients below tol/(4·NT) of the scale are dropped (tol/4 in all):
        // no subnormal products per call (r9a is ~10⁻³⁴ for wide strips).
        let drop = tol / T::lit(4.0 * NT as f64);
        for row in coef.iter_mut() {
            for (c, &s) in row.iter_mut().zip(scale.iter()) {
                if c.abs() <= drop * s {
                    *c = T::zero();
                }
            }
        }
        Some(EpsTable {
            mid,
            inv_half: T::one() / half_w,
            base,
            coef,
        })
    }

    /// Acceptance bound of the table's tail coefficients, relative (f64; in
    /// f32 it is 16 ε ≈ 1.9·10⁻⁶).
    const TABLE_TOL_F64: f64 = 1e-9;

    /// The statics at ε′ = `er` from the table.
    #[inline(always)]
    fn statics_from(&self, t: &EpsTable<T>, er: T) -> Result<Statics<T>> {
        let [z0, ee0, k_hf, p2, p4, r7, r3_er, r9a, r10, r16a] = t.eval(er);
        // ln εeff0 from the interpolated εeff0 itself: R13 and R14 nearly cancel
        // for εeff0 near 1, and must then see the same εeff0.
        let ln_ee0 = ee0.ln();
        let mut warn = Warnings::NONE;
        warn.set_if(
            er > T::lit(18.0) || self.u > T::lit(10.0) || self.u < T::lit(0.1),
            Warnings::OUTSIDE_FIT_RANGE,
        );
        Ok(Statics {
            er,
            z0,
            ee0,
            ln_ee0,
            k_hf,
            skin: SkinLoss::new(k_hf, self.r_dc)?,
            p1a: self.geo.p1a,
            p1b: self.u,
            p2,
            p3a: self.geo.p3a,
            p4,
            r7,
            r3_er,
            r9a,
            r10,
            r12: self.geo.r12,
            r16a,
            warn,
        })
    }

    fn statics(&self, er: T) -> Result<Statics<T>> {
        let u = self.u;
        let (z0, ee0) = hj_static(u, er, self.du1);
        let z0 = error::finite(z0, "width_m")?;
        let one = T::one();
        let lit = T::lit;
        let ki = (lit(-1.2) * (z0 / T::eta0()).pw(lit(0.7))).exp();
        let k_hf = match self.metal {
            Some(m) => {
                let rs_coeff = (T::PI() * m.mu_h_per_m() / m.conductivity_s_per_m()).sqrt();
                T::two() * rs_coeff * ki / self.width_m
            }
            None => T::zero(),
        };
        let mut warn = Warnings::NONE;
        warn.set_if(
            er > lit(18.0) || u > lit(10.0) || u < lit(0.1),
            Warnings::OUTSIDE_FIT_RANGE,
        );
        let erm1 = er - one;
        let e6 = erm1.powi(6);
        let r1 = lit(0.03891) * er.pw(lit(1.4));
        let g = &self.geo;
        let r4 = lit(0.016) + (lit(0.0514) * er).pw(lit(4.524));
        Ok(Statics {
            er,
            z0,
            ee0,
            ln_ee0: ee0.ln(),
            k_hf,
            skin: SkinLoss::new(k_hf, self.r_dc)?,
            p1a: g.p1a,
            p1b: u,
            p2: lit(0.33622) * (one - (lit(-0.03442) * er).exp()),
            p3a: g.p3a,
            p4: one + lit(2.751) * (one - (-(er / lit(15.916)).powi(8)).exp()),
            r7: lit(1.206) - lit(0.3144) * (-r1).exp() * g.one_m_exp_r2,
            r3_er: lit(0.004625) * g.r3 * er.pw(lit(1.674)),
            r9a: lit(5.086) * r4 / (lit(0.3838) + lit(0.386) * r4) * g.exp_neg_r6 * e6
                / (one + lit(10.0) * e6),
            r10: lit(0.00044) * er.pw(lit(2.136)) + lit(0.0184),
            r12: g.r12,
            r16a: lit(0.0503) * er * er * g.one_m_exp_u15,
            warn,
        })
    }

    /// (Zc, εeff) with dispersion at normalised frequency fn (GHz·mm), and whether
    /// the Zc dispersion had to be skipped.
    fn dispersed(&self, st: &Statics<T>, fnorm: T) -> (T, T, bool) {
        let one = T::one();
        let lit = T::lit;
        if fnorm <= T::zero() {
            return (st.z0, st.ee0, false);
        }
        // Kirschning–Jansen εeff(f). Powers of fn as exp(c·ln fn − c·ln a)
        // (literals: 4.97·ln 38.7, 2.745·ln 18.365, 1.097·ln 12.3).
        let lnf = fnorm.ln();
        let p1 =
            st.p1a + (lit(0.6315) + lit(0.525) / (one + lit(0.0157) * fnorm).powi(20)) * st.p1b;
        // (fn/38.7)^4.97 below e^−40 leaves 0.1844 + P3·P4 unchanged in f64.
        let a3 = lit(4.97) * lnf - lit(18.169_522_812_177_608);
        let p3 = if a3 < lit(-40.0) {
            T::zero()
        } else {
            st.p3a * one_minus_exp_neg(a3.ex())
        };
        let base = lit(0.1844) + p3 * st.p4;
        let p = p1 * st.p2 * (lit(1.5763) * (base.ln() + lnf)).ex();
        let ee = st.er - (st.er - st.ee0) / (one + p);
        if !self.zc_dispersion {
            return (st.z0, ee, false);
        }
        // Jansen–Kirschning Zc(f). R9 and R11 are dropped where they cannot
        // change 0.9408 − R9 or 1 + R16a·R11 in f64 (R9 < R9a·10⁻³⁶, R11 <
        // 10⁻²⁴): no subnormal powers at low frequency (slow, and in f32 common).
        let r8 = one
            + lit(1.275)
                * one_minus_exp_neg(
                    st.r3_er * (lit(2.745) * lnf - lit(7.989_176_134_600_625)).ex(),
                );
        let r9 = if st.r9a == T::zero() || fnorm < lit(28.843e-3) {
            T::zero()
        } else {
            let r5 = (fnorm / lit(28.843)).powi(12);
            st.r9a * r5 / (one + lit(1.2992) * r5)
        };
        let r11 = if fnorm < lit(19.47e-4) {
            T::zero()
        } else {
            let x11 = (fnorm / lit(19.47)).powi(6);
            x11 / (one + lit(0.0962) * x11)
        };
        let r13 = lit(0.9408) * (r8 * ee.ln()).ex() - lit(0.9603);
        let r14 = (lit(0.9408) - r9) * (r8 * st.ln_ee0).ex() - lit(0.9603);
        let r15 = lit(0.707) * st.r10 * (lit(1.097) * lnf - lit(2.753_030_390_829_074)).ex();
        let r16 = one + st.r16a * r11;
        let r17 = st.r7
            * (one
                - lit(1.1241) * st.r12 / r16
                    * (lit(-0.026) * (lit(1.15656) * lnf).ex() - r15).ex());
        let q = r13 / r14;
        if q.is_nan() || q <= T::zero() || !q.is_finite() {
            return (st.z0, ee, true);
        }
        let z = st.z0 * (r17 * q.ln()).ex();
        if !z.is_finite() || z <= T::zero() {
            return (st.z0, ee, true);
        }
        (z, ee, false)
    }

    fn statics_at(&self, f: T) -> Result<(StRef<'_, T>, T, T)> {
        let (er, loss) = self.dielectric.eval(f);
        let st = match &self.cache {
            Cache::Fixed(s) => StRef::Borrowed(s),
            Cache::Table(t) => StRef::Owned(self.statics_from(t, er)?),
            Cache::Direct => StRef::Owned(self.statics(er)?),
        };
        Ok((st, er, loss))
    }

    /// fn = f·h in GHz·mm.
    fn fnorm(&self, f: T) -> T {
        f * self.height_m * T::lit(1e-6)
    }

    /// Lossless characteristic impedance with dispersion at `freq_hz` ≥ 0, Ω.
    pub fn z0_ohm(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, _, _) = self.statics_at(f)?;
        Ok(self.dispersed(&st, self.fnorm(f)).0)
    }

    /// Effective permittivity with dispersion at `freq_hz` ≥ 0.
    pub fn eps_eff(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, _, _) = self.statics_at(f)?;
        Ok(self.dispersed(&st, self.fnorm(f)).1)
    }

    /// Static (Hammerstad–Jensen) (Z0, εeff) with ε′ at `freq_hz` ≥ 0.
    pub fn z0_eps_eff_static(&self, freq_hz: T) -> Result<(T, T)> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, _, _) = self.statics_at(f)?;
        Ok((st.z0, st.ee0))
    }

    /// The surface-wave onset f_T = c0·atan(εr)/(√2πh√(εr − 1)) and the transverse
    /// resonance f_CT = c0/(√εr(2W + 0.8h)), Hz (εr static); f_T is infinite for εr = 1.
    pub fn higher_mode_onsets_hz(&self) -> (T, T) {
        let er0 = self.dielectric.eps_static();
        let c = T::c0();
        let f_ct = c / (er0.sqrt() * (T::two() * self.width_m + T::lit(0.8) * self.height_m));
        let f_t = if er0 - T::one() > T::lit(1e-6) {
            c * er0.atan() / (T::SQRT_2() * T::PI() * self.height_m * (er0 - T::one()).sqrt())
        } else {
            T::infinity()
        };
        (f_t, f_ct)
    }

    /// Strip width W, m.
    pub fn width_m(&self) -> T {
        self.width_m
    }
    /// Substrate height h, m.
    pub fn height_m(&self) -> T {
        self.height_m
    }
    /// Strip thickness t, m.
    pub fn thickness_m(&self) -> T {
        self.thickness_m
    }

    /// Roughness factor Kr = 1 + (2/π)·atan[1.4(Δ/δ)²] at f.
    fn kr(&self, f: T) -> T {
        match self.metal {
            Some(m) if self.roughness_rms_m > T::zero() => {
                // (Δ/δ)² = Δ²·π f μ σ.
                let x = self.roughness_rms_m
                    * self.roughness_rms_m
                    * T::PI()
                    * f
                    * m.mu_h_per_m()
                    * m.conductivity_s_per_m();
                T::one() + T::two() / T::PI() * (T::lit(1.4) * x).atan()
            }
            _ => T::one(),
        }
    }

    /// High-frequency conductor attenuation αc = Rs·Kr·Ki/(Z0·W), Np/m (0 without a metal).
    pub fn alpha_conductor_np_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, _, _) = self.statics_at(f)?;
        Ok(st.k_hf * f.sqrt() * self.kr(f) / (T::two() * st.z0))
    }

    /// Dielectric attenuation αd = (k0/2)·εr·q·tanδ/√εeff (dispersive εeff), Np/m.
    pub fn alpha_dielectric_np_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, er, loss) = self.statics_at(f)?;
        let (_, ee, _) = self.dispersed(&st, self.fnorm(f));
        let k0 = T::two_pi() * f / T::c0();
        Ok(k0 * T::half() * loss * tem::filling_factor(er, ee) / ee.sqrt())
    }
}

impl<T: Real> LineModel<T> for Microstrip<T> {
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let (st, er, loss) = self.statics_at(f)?;
        let fnorm = self.fnorm(f);
        let (z0, ee, skipped) = self.dispersed(&st, fnorm);
        let tan_eff = loss * tem::filling_factor(er, ee) / ee;
        let zi = st.skin.eval(f);
        let kr = self.kr(f);
        let zi = crate::math::complex::Cx::new(zi.re * kr, zi.im * kr);
        let (z, y) = tem::zy(f, z0, ee, tan_eff, zi);
        // The Jansen–Kirschning range applies only when its Zc dispersion is used.
        let mut w = if self.zc_dispersion {
            self.base.union(st.warn)
        } else {
            self.base
        };
        w.set_if(skipped || er > T::lit(20.0), Warnings::OUTSIDE_FIT_RANGE);
        // h/λ0 = f·h/c0 within 0.13 (εeff) and 0.1 (Zc).
        w.set_if(
            f * self.height_m > T::lit(0.1) * T::c0(),
            Warnings::OUTSIDE_FIT_RANGE,
        );
        w.set_if(f >= self.cutoff_hz, Warnings::ABOVE_HIGHER_MODE);
        w.set_if(
            f > self.thin_lo_hz && f < self.thin_hi_hz,
            Warnings::THIN_CONDUCTOR,
        );
        tem::point(
            f,
            z,
            y,
            Some(crate::math::complex::Cx::new(z0, T::zero())),
            w,
        )
    }

    fn cutoff_hz(&self) -> Option<T> {
        Some(self.cutoff_hz)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn hammerstad_jensen_check_values() {
        // Reference notes (methods.md §2) [calc], t = 0.
        for &(er, u, z, e) in &[
            (9.8, 1.0, 49.289, 6.5790),
            (4.4, 2.0, 48.686, 3.3439),
            (1.0, 1.0, 126.424, 1.0),
        ] {
            let (z0, ee) = hammerstad_jensen::<f64>(u, er, 0.0).unwrap();
            assert_relative_eq!(z0, z, max_relative = 2e-5);
            assert_relative_eq!(ee, e, max_relative = 2e-5);
            let (z32, e32) = hammerstad_jensen::<f32>(u as f32, er as f32, 0.0).unwrap();
            assert_relative_eq!(z32 as f64, z, max_relative = 1e-4);
            assert_relative_eq!(e32 as f64, e, max_relative = 1e-4);
        }
        // Thickness lowers Z0 (a wider effective strip).
        let (zt, _) = hammerstad_jensen::<f64>(1.0, 4.4, 0.02).unwrap();
        assert!(zt < hammerstad_jensen::<f64>(1.0, 4.4, 0.0).unwrap().0);
    }

    #[test]
    fn dispersion_starts_at_the_static_values() {
        let d = Dielectric::constant(9.8, 0.0).unwrap();
        let m = Microstrip::<f64>::new(0.635e-3, 0.635e-3, 0.0, d, None).unwrap();
        let (z0, e0) = m.z0_eps_eff_static(0.0).unwrap();
        assert_relative_eq!(m.z0_ohm(1e3).unwrap(), z0, max_relative = 1e-9);
        assert_relative_eq!(m.eps_eff(1e3).unwrap(), e0, max_relative = 1e-9);
        let mut prev = e0;
        for k in 1..=20 {
            let e = m.eps_eff(k as f64 * 1e9).unwrap();
            assert!(e >= prev && e < 9.8);
            prev = e;
        }
        assert!(m.z0_ohm(20e9).unwrap() > z0);
        let p = m.at(1e9).unwrap();
        assert_relative_eq!(
            p.zc_ohm.finite().unwrap().re,
            m.z0_ohm(1e9).unwrap(),
            max_relative = 1e-12
        );
        assert!(p.warnings.is_empty());
        assert!(m
            .at(m.cutoff_hz().unwrap())
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
    }

    #[test]
    fn losses_match_the_closed_forms() {
        let d = Dielectric::constant(4.4, 0.02).unwrap();
        let m = Microstrip::<f64>::new(3e-3, 1.6e-3, 35e-6, d, Some(Metal::copper())).unwrap();
        let f = 1e9;
        let p = m.at(f).unwrap();
        let ac = m.alpha_conductor_np_per_m(f).unwrap();
        let ad = m.alpha_dielectric_np_per_m(f).unwrap();
        assert_relative_eq!(p.alpha_np_per_m(), ac + ad, max_relative = 1e-2);
        let rough = m.with_roughness(2e-6).unwrap();
        assert!(rough.alpha_conductor_np_per_m(f).unwrap() > 1.5 * ac);
        assert!(rough.alpha_conductor_np_per_m(f).unwrap() < 2.0 * ac);
        // DC: R = 1/(σWt).
        let r = m.at(0.0).unwrap().z_ohm_per_m.re;
        assert_relative_eq!(r, 1.0 / (5.8e7 * 3e-3 * 35e-6), max_relative = 1e-12);
        // δ = t at 1/(πμ0σt²) ≈ 3.6 MHz.
        assert!(m
            .at(3.6e6)
            .unwrap()
            .warnings
            .contains(Warnings::THIN_CONDUCTOR));
        assert!(!m
            .at(1e9)
            .unwrap()
            .warnings
            .contains(Warnings::THIN_CONDUCTOR));
    }

    #[test]
    fn bad_geometry_is_named() {
        let d = Dielectric::<f64>::vacuum();
        assert_eq!(
            Microstrip::new(0.0, 1e-3, 0.0, d, None),
            Err(Error::NotPositive("width_m"))
        );
        assert_eq!(
            Microstrip::new(1e-3, -1e-3, 0.0, d, None),
            Err(Error::NotPositive("height_m"))
        );
        assert_eq!(
            Microstrip::new(1e-3, 1e-3, -1e-6, d, None),
            Err(Error::Negative("thickness_m"))
        );
        assert_eq!(
            hammerstad_jensen(1.0, 0.5, 0.0),
            Err(Error::OutOfRange("eps_r"))
        );
        let m = Microstrip::new(1e-3, 1e-3, 0.0, d, None).unwrap();
        assert_eq!(
            m.with_roughness(-1.0),
            Err(Error::Negative("roughness_rms_m"))
        );
        assert_eq!(m.at(f64::NAN), Err(Error::NonFinite("freq_hz")));
    }

    /// The tabulated model's largest error (Z0, εeff, α; relative, over
    /// 0 Hz … 10 THz) beyond that of the direct evaluation in the same
    /// precision, both against the direct evaluation in f64 (`m64`, the same
    /// line); `None` when no table was built. In f64 it is simply the relative
    /// difference between table and direct evaluation.
    fn table_vs_direct<T: Real>(m: &Microstrip<T>, m64: &Microstrip<f64>) -> Option<[f64; 3]> {
        if !matches!(m.cache, Cache::Table(_)) {
            return None;
        }
        let mut direct = *m;
        direct.cache = Cache::Direct;
        let mut r64 = *m64;
        r64.cache = Cache::Direct;
        let excess = |t: T, d: T, r: f64| {
            let (t, d) = (t.to_f64_lossless(), d.to_f64_lossless());
            if t == d {
                0.0
            } else {
                ((t - r).abs() - (d - r).abs()).max(0.0) / r.abs()
            }
        };
        let mut worst = [0.0f64; 3];
        for k in 0..=240 {
            let f64_hz = if k == 0 {
                0.0
            } else {
                10f64.powf(k as f64 / 20.0)
            };
            let f = T::lit(f64_hz);
            let (a, b) = (m.at(f).unwrap(), direct.at(f).unwrap());
            let r = r64.at(f64_hz).unwrap();
            let z = [m.z0_ohm(f), direct.z0_ohm(f)].map(|v| v.unwrap());
            let e = [m.eps_eff(f), direct.eps_eff(f)].map(|v| v.unwrap());
            worst[0] = worst[0].max(excess(z[0], z[1], r64.z0_ohm(f64_hz).unwrap()));
            worst[1] = worst[1].max(excess(e[0], e[1], r64.eps_eff(f64_hz).unwrap()));
            worst[2] = worst[2].max(excess(
                a.alpha_np_per_m(),
                b.alpha_np_per_m(),
                r.alpha_np_per_m(),
            ));
            assert_eq!(a.warnings, b.warnings, "{f:?}");
        }
        Some(worst)
    }

    /// Copper in f64 where `metal` is some metal (the cases use copper only).
    fn metal64<T: Real>(metal: Option<Metal<T>>) -> Option<Metal<f64>> {
        metal.map(|_| Metal::copper())
    }

    fn table_cases<T: Real>(bound: f64) -> usize {
        let l = T::lit;
        let mut tabulated = 0;
        for &(er, td) in &[
            (4.4, 0.02),
            (2.2, 0.001),
            (3.5, 0.004),
            (9.8, 0.002),
            (12.9, 0.01),
            (3.0, 0.08),
            (1.2, 0.01),
        ] {
            let d = Dielectric::wideband_debye(l(er), l(td), l(1e9)).unwrap();
            for &u in &[0.15, 1.0, 3.0, 20.0] {
                for &(t, metal) in &[(0.0, None), (35e-6, Some(Metal::copper()))] {
                    let h = 1.6e-3;
                    let m = Microstrip::new(l(u * h), l(h), l(t), d, metal).unwrap();
                    let d64 = Dielectric::wideband_debye(er, td, 1e9).unwrap();
                    let m64 = Microstrip::new(u * h, h, t, d64, metal64(metal)).unwrap();
                    if let Some(w) = table_vs_direct(&m, &m64) {
                        tabulated += 1;
                        assert!(
                            w.iter().all(|&e| e <= bound),
                            "εr {er} tanδ {td} u {u} t {t}: {w:?}"
                        );
                    }
                }
            }
        }
        tabulated
    }

    /// Dielectrics whose ε′ range reaches down to 1 (where √(εr − 1) in the
    /// thickness correction is singular): tabulated or not, within the bound.
    fn table_edge_cases<T: Real>(bound: f64) {
        use crate::line::dielectric::WidebandDebye;
        let l = T::lit;
        for &de in &[1e-4, 0.01, 0.05, 0.2, 1.0, 3.0] {
            for &ei in &[1.0, 1.001, 1.05] {
                let d = WidebandDebye::new(l(ei), l(de), l(1e3), l(1e12)).unwrap();
                let d = Dielectric::from_debye(d);
                for &(t, metal) in &[(0.0, None), (35e-6, Some(Metal::copper()))] {
                    let m = Microstrip::new(l(1e-3), l(1e-3), l(t), d, metal).unwrap();
                    let d64 = WidebandDebye::new(ei, de, 1e3, 1e12).unwrap();
                    let d64 = Dielectric::from_debye(d64);
                    let m64 = Microstrip::new(1e-3, 1e-3, t, d64, metal64(metal)).unwrap();
                    if let Some(w) = table_vs_direct(&m, &m64) {
                        assert!(
                            w.iter().all(|&e| e <= bound),
                            "{} ε∞ {ei} Δε {de} t {t}: {w:?}",
                            T::EPS.to_f64_lossless()
                        );
                    }
                }
            }
        }
        // No dispersion at all: the statics are computed once.
        let d = WidebandDebye::new(l(4.0), T::zero(), l(1e3), l(1e12)).unwrap();
        let m =
            Microstrip::new(l(1e-3), l(1e-3), T::zero(), Dielectric::from_debye(d), None).unwrap();
        assert!(matches!(m.cache, Cache::Fixed(_)));
    }

    #[test]
    fn debye_table_matches_direct_evaluation() {
        // Against the direct Hammerstad–Jensen/Jansen–Kirschning evaluation at
        // ε′(f) in f64 (this module's own formulas): the table's documented
        // bound (f64: relative difference; f32: excess over the direct f32 error).
        table_edge_cases::<f64>(1e-8);
        table_edge_cases::<f32>(2e-5);
        let n64 = table_cases::<f64>(1e-8);
        let n32 = table_cases::<f32>(2e-5);
        // 7 dielectrics × 8 geometries; all but the widest ε′ ranges tabulate.
        assert!(n64 >= 48 && n32 >= 48, "{n64} {n32}");
        // A range too wide for the series falls back to direct evaluation.
        let wide = Dielectric::from_debye(
            crate::line::dielectric::WidebandDebye::new(1.0, 30.0, 1e3, 1e12).unwrap(),
        );
        let m = Microstrip::<f64>::new(1e-3, 1e-3, 0.0, wide, None).unwrap();
        assert_eq!(m.cache, Cache::Direct);
        // The FR-4 line of the benchmark tabulates in both precisions.
        let fr4 = |f| Microstrip::new(3e-3, 1.6e-3, 35e-6, f, Some(Metal::copper())).unwrap();
        let d64 = Dielectric::<f64>::wideband_debye(4.4, 0.02, 1e9).unwrap();
        let d32 = Dielectric::<f32>::wideband_debye(4.4, 0.02, 1e9).unwrap();
        assert!(matches!(fr4(d64).cache, Cache::Table(_)));
        assert!(matches!(
            Microstrip::new(3e-3f32, 1.6e-3, 35e-6, d32, Some(Metal::copper()))
                .unwrap()
                .cache,
            Cache::Table(_)
        ));
    }

    #[test]
    fn one_minus_exp_neg_is_accurate_on_both_sides_of_the_switch() {
        // Against libm's expm1 (1 − e^−x = −expm1(−x)), f64 and f32.
        for k in 0..=200 {
            let x = 10f64.powf(-30.0 + k as f64 * 0.15);
            // Series below the switch; above it the cancellation, about ε/x.
            let want = -libm::expm1(-x);
            let tol = 4.0 * f64::EPSILON * if x < 1e-5 { 1.0 } else { 1.0 + 1.0 / x };
            assert_relative_eq!(one_minus_exp_neg(x), want, max_relative = tol);
            let x32 = x as f32;
            let want32 = -libm::expm1(-(x32 as f64));
            let tol32 = 4.0 * f32::EPSILON as f64 * if x < 1e-2 { 1.0 } else { 1.0 + 1.0 / x };
            assert_relative_eq!(one_minus_exp_neg(x32) as f64, want32, max_relative = tol32);
        }
        assert_eq!(one_minus_exp_neg(0.0f64), 0.0);
    }

    #[test]
    fn size_is_as_documented() {
        // The ε′ table is 2 + 10·11 numbers: 896 bytes in f64, 448 in f32.
        assert!(core::mem::size_of::<Microstrip<f64>>() <= 1168);
        assert!(core::mem::size_of::<Microstrip<f32>>() <= 584);
    }
}

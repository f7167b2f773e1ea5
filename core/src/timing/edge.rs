//! Loss slows the edge: the skin-effect step response in closed form, and the
//! distance correction for a late, slow edge. The step response of any line
//! model, numerically, is in [`super::step`].
//!
//! # Skin effect in closed form
//!
//! Wigington & Nahman, "Transient analysis of coaxial cables considering skin
//! effect", Proc. IRE 45(2):166–174, 1957: a line whose loss is all skin effect
//! has the transfer function H(s) = e^(−sT_d)·e^(−a√s) over its length, so its
//! step response is
//!
//! v(t) = erfc(a / (2√(t − T_d))) for t > T_d, 0 before,
//!
//! with T_d the lossless delay and a (unit √s) fixed by the attenuation at any
//! frequency: α(f)·l = a·√(πf), i.e. a = α(f)·l/√(πf). The time after T_d at
//! which the step reaches the fraction p is
//!
//! t_p − T_d = a² / (4·[erfc⁻¹(p)]²),
//!
//! hence the 10–90 % rise time t_90 − t_10 ≈ 31.48·a² and the 50 % arrival delay
//! t_50 − T_d ≈ 1.099·a² (scipy, tests/scripts/vectors_timing.py): both grow with the **square** of the length, and the
//! edge has a very long tail (it reaches 90 % only after ≈ 171 times its
//! 10 % delay). [`SkinLoss`] holds a per metre, [`SkinEdge`] for one length.
//! erfc⁻¹ is [`crate::math::special::erfc_inv`] (re-exported here as [`erfc_inv`]).
//!
//! # Distance correction
//!
//! An event read at the fraction p of its step on a long lossy cable arrives
//! late by the excess delay e(x) of the round-trip path x = 2d, which itself
//! depends on the distance. [`correct_round_trip`] solves
//! x/v + e(x) = t_round for x by a bracketed secant iteration (Illinois) for
//! any excess-delay function (closed form, or measured on the numerical step); [`correct_skin_delay`] uses the skin-effect form
//! e(x) = k·x², k = a_m²/(4·[erfc⁻¹(p)]²), whose solution is closed:
//! x = 2t/(1/v + √(1/v² + 4kt)). It neglects the instrument's own rise time.
//! For a reading at a fixed threshold rather than the 50 % point, give
//! p = threshold / (the event's settled step height).

use crate::error::{self, Error, Result};
use crate::line::LineModel;
use crate::scalar::Real;
use crate::timing::{Distance, VelocityRange};

pub use crate::math::special::erfc_inv;

/// Root-sum-square combination √(t_a² + t_b²) of two 10–90 % rise times, s
/// (common practice, no single source; exact for Gaussian responses).
pub fn combine_rise_times_rss<T: Real>(rise_a_s: T, rise_b_s: T) -> Result<T> {
    let a = error::non_negative(rise_a_s, "rise_a_s")?;
    let b = error::non_negative(rise_b_s, "rise_b_s")?;
    error::finite(a.hypot(b), "rise_time_s")
}

/// Skin-effect loss per metre: a_m = α(f)/√(πf) in √s/m (Wigington & Nahman 1957).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkinLoss<T> {
    a_sqrt_s_per_m: T,
}

impl<T: Real> SkinLoss<T> {
    /// From a_m directly, √s/m (finite, ≥ 0).
    pub fn new(a_sqrt_s_per_m: T) -> Result<Self> {
        Ok(SkinLoss {
            a_sqrt_s_per_m: error::non_negative(a_sqrt_s_per_m, "a_sqrt_s_per_m")?,
        })
    }

    /// From a skin-effect attenuation `alpha_np_per_m ≥ 0` (Np/m) at
    /// `freq_hz > 0`: a_m = α/√(πf).
    pub fn from_alpha(alpha_np_per_m: T, freq_hz: T) -> Result<Self> {
        let alpha = error::non_negative(alpha_np_per_m, "alpha_np_per_m")?;
        let f = error::positive(freq_hz, "freq_hz")?;
        let a = alpha / (T::PI() * f).sqrt();
        Self::new(error::finite(a, "a_sqrt_s_per_m")?)
    }

    /// From a skin-effect attenuation in dB/m at `freq_hz > 0`.
    pub fn from_db_per_m(atten_db_per_m: T, freq_hz: T) -> Result<Self> {
        let db = error::non_negative(atten_db_per_m, "atten_db_per_m")?;
        Self::from_alpha(db / T::lit(crate::scalar::DB_PER_NEPER), freq_hz)
    }

    /// From a line model's **conductor** loss at `freq_hz > 0` (the conductor
    /// part of [`crate::line::LinePoint::loss_split_np_per_m`]; the dielectric
    /// loss grows as f, not √f, and is not part of this model). The fit holds
    /// at that one frequency: pick one in the band that shapes the edge
    /// (around 0.35/rise time); where R tends to its DC value a line is not
    /// pure skin effect, and [`super::step::StepResponse`] is the better tool.
    pub fn from_line<M: LineModel<T> + ?Sized>(model: &M, freq_hz: T) -> Result<Self> {
        let f = error::positive(freq_hz, "freq_hz")?;
        let (ac, _) = model.at(f)?.loss_split_np_per_m();
        Self::from_alpha(ac.max(T::zero()), f)
    }

    /// a_m, √s/m.
    pub fn a_sqrt_s_per_m(&self) -> T {
        self.a_sqrt_s_per_m
    }

    /// The edge after `length_m ≥ 0` of line: a = a_m·l.
    pub fn edge(&self, length_m: T) -> Result<SkinEdge<T>> {
        let l = error::non_negative(length_m, "length_m")?;
        SkinEdge::new(error::finite(self.a_sqrt_s_per_m * l, "a_sqrt_s")?)
    }
}

/// The skin-effect step after one length: H(s) = e^(−a√s) beyond the lossless delay.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkinEdge<T> {
    a_sqrt_s: T,
}

impl<T: Real> SkinEdge<T> {
    /// From a (√s), finite and ≥ 0.
    pub fn new(a_sqrt_s: T) -> Result<Self> {
        Ok(SkinEdge {
            a_sqrt_s: error::non_negative(a_sqrt_s, "a_sqrt_s")?,
        })
    }

    /// a, √s.
    pub fn a_sqrt_s(&self) -> T {
        self.a_sqrt_s
    }

    /// Step response erfc(a/(2√τ)) at `t_after_delay_s` = τ = t − T_d (0 for
    /// τ ≤ 0; for a = 0 a unit step, ½ at τ = 0 excluded: 0 there).
    pub fn step(&self, t_after_delay_s: T) -> Result<T> {
        let tau = error::finite(t_after_delay_s, "t_after_delay_s")?;
        if tau <= T::zero() {
            return Ok(T::zero());
        }
        Ok((self.a_sqrt_s / (T::two() * tau.sqrt())).erfc())
    }

    /// Time after T_d at which the step reaches `fraction` in (0, 1):
    /// a²/(4·[erfc⁻¹(p)]²), s.
    pub fn time_to_fraction_s(&self, fraction: T) -> Result<T> {
        let p = error::finite(fraction, "fraction")?;
        if !(p > T::zero() && p < T::one()) {
            return Err(Error::OutOfRange("fraction"));
        }
        let x = erfc_inv(p)?;
        let a = self.a_sqrt_s;
        error::finite(a * a / (T::lit(4.0) * x * x), "time_to_fraction_s")
    }

    /// 10–90 % rise time, s.
    pub fn rise_time_10_90_s(&self) -> Result<T> {
        Ok(self.time_to_fraction_s(T::lit(0.9))? - self.time_to_fraction_s(T::lit(0.1))?)
    }

    /// Delay of the 50 % point beyond the lossless delay T_d, s.
    pub fn delay_50_s(&self) -> Result<T> {
        self.time_to_fraction_s(T::half())
    }
}

/// A distance corrected for the loss-induced excess delay of the edge.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CorrectedDistance<T> {
    /// The corrected distance with its interval.
    pub distance: Distance<T>,
    /// The excess delay subtracted at the nominal distance, s (round trip).
    pub excess_delay_s: T,
    /// The uncorrected reading (d = v·t/2 with the same interval rules).
    pub uncorrected: Distance<T>,
}

fn checked_inputs<T: Real>(
    t_round_s: T,
    t_half_width_s: T,
    v: &VelocityRange<T>,
) -> Result<(T, T, T, T, T)> {
    let t = error::non_negative(t_round_s, "t_round_s")?;
    let dt = error::non_negative(t_half_width_s, "t_half_width_s")?;
    let vn = error::positive(v.nominal_m_per_s, "nominal_m_per_s")?;
    let lo = error::positive(v.lo_m_per_s, "lo_m_per_s")?;
    let hi = error::positive(v.hi_m_per_s, "hi_m_per_s")?;
    Ok((t, dt, vn, lo, hi))
}

/// Solves x/v + e(x) = t for the round-trip path x ∈ [0, v·t] (Illinois).
fn solve_path<T: Real, F: FnMut(T) -> Result<T>>(t: T, v: T, excess: &mut F) -> Result<T> {
    if t == T::zero() {
        return Ok(T::zero());
    }
    let mut resid = |x: T| -> Result<T> {
        let e = error::non_negative(excess(x)?, "excess_delay_s")?;
        Ok(x / v + e - t)
    };
    let (mut a, mut b) = (T::zero(), v * t);
    let (mut fa, mut fb) = (resid(a)?, resid(b)?);
    if fa >= T::zero() {
        return Ok(a);
    }
    if fb <= T::zero() {
        return Ok(b);
    }
    let mut side = 0i8;
    let tol = T::EPS * T::lit(4.0);
    for _ in 0..100 {
        let mut x = (a * fb - b * fa) / (fb - fa);
        if !(x > a && x < b) {
            x = (a + b) * T::half();
        }
        let fx = resid(x)?;
        if fx == T::zero() {
            return Ok(x);
        }
        if (fx < T::zero()) == (fa < T::zero()) {
            a = x;
            fa = fx;
            if side == -1 {
                fb = fb * T::half();
            }
            side = -1;
        } else {
            b = x;
            fb = fx;
            if side == 1 {
                fa = fa * T::half();
            }
            side = 1;
        }
        if b - a <= tol * b || fx.abs() <= T::EPS * t {
            return Ok(x);
        }
    }
    Err(Error::NoConvergence("distance_m"))
}

/// Corrects a round-trip time for a loss-induced excess delay that depends on
/// the path: finds x = 2d with x/v + e(x) = `t_round_s`, where
/// `excess_delay_s(x)` returns the excess delay (s, ≥ 0, non-decreasing in x)
/// of an edge after a round-trip path of x metres, for example from
/// [`super::step::StepResponse`] or [`SkinEdge`]. The interval uses (v_lo, t − δt) and
/// (v_hi, t + δt) as in [`super::distance_from_round_trip`]; an uncertainty of
/// the excess delay itself is not included (see [`correct_skin_delay`]).
pub fn correct_round_trip<T: Real, F: FnMut(T) -> Result<T>>(
    t_round_s: T,
    t_half_width_s: T,
    velocity: &VelocityRange<T>,
    mut excess_delay_s: F,
) -> Result<CorrectedDistance<T>> {
    let (t, dt, vn, vlo, vhi) = checked_inputs(t_round_s, t_half_width_s, velocity)?;
    let uncorrected = super::distance_from_round_trip(t, dt, velocity)?;
    let x = solve_path(t, vn, &mut excess_delay_s)?;
    let x_lo = solve_path((t - dt).max(T::zero()), vlo, &mut excess_delay_s)?;
    let x_hi = solve_path(t + dt, vhi, &mut excess_delay_s)?;
    let h = T::half();
    Ok(CorrectedDistance {
        distance: Distance {
            distance_m: x * h,
            lo_m: x_lo * h,
            hi_m: x_hi * h,
        },
        excess_delay_s: t - x / vn,
        uncorrected,
    })
}

/// Corrects a round-trip time read at `fraction` (in (0, 1), 0.5 for the 50 %
/// point) of the edge on a cable with skin-effect loss `loss` (± the relative
/// tolerance `loss_relative_tolerance` in [0, 1) on a_m): closed-form solution
/// of x/v + k·x² = t, k = a_m²/(4·[erfc⁻¹(p)]²), x = 2t/(1/v + √(1/v² + 4kt)).
/// The interval takes the lower end with (v_lo, t − δt, highest loss) and the
/// upper end with (v_hi, t + δt, lowest loss).
pub fn correct_skin_delay<T: Real>(
    t_round_s: T,
    t_half_width_s: T,
    velocity: &VelocityRange<T>,
    loss: &SkinLoss<T>,
    loss_relative_tolerance: T,
    fraction: T,
) -> Result<CorrectedDistance<T>> {
    let (t, dt, vn, vlo, vhi) = checked_inputs(t_round_s, t_half_width_s, velocity)?;
    let tol = error::non_negative(loss_relative_tolerance, "loss_relative_tolerance")?;
    if tol >= T::one() {
        return Err(Error::OutOfRange("loss_relative_tolerance"));
    }
    // k = τ_p for a = 1 √s, times a_m².
    let tau1 = SkinEdge::new(T::one())?.time_to_fraction_s(fraction)?;
    let am = loss.a_sqrt_s_per_m();
    let k = tau1 * am * am;
    let path = |t: T, v: T, k: T| -> Result<T> {
        let iv = T::one() / v;
        let x = (t + t) / (iv + (iv * iv + T::lit(4.0) * k * t).sqrt());
        error::finite(x, "distance_m")
    };
    let uncorrected = super::distance_from_round_trip(t, dt, velocity)?;
    let up = (T::one() + tol) * (T::one() + tol);
    let down = (T::one() - tol) * (T::one() - tol);
    let x = path(t, vn, k)?;
    let x_lo = path((t - dt).max(T::zero()), vlo, k * up)?;
    let x_hi = path(t + dt, vhi, k * down)?;
    let h = T::half();
    Ok(CorrectedDistance {
        distance: Distance {
            distance_m: x * h,
            lo_m: x_lo * h,
            hi_m: x_hi * h,
        },
        excess_delay_s: k * x * x,
        uncorrected,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn erfc_inv_inverts_erfc() {
        for &p in &[
            1e-300, 1e-20, 1e-3, 0.1, 0.5, 0.9, 0.999, 1.0, 1.3, 1.999999,
        ] {
            let x = erfc_inv(p).unwrap();
            assert!((libm::erfc(x) - p).abs() <= 1e-14 * p, "{p}");
        }
        for &p in &[1e-30f32, 1e-3, 0.1, 0.5, 0.9, 1.5] {
            let x = erfc_inv(p).unwrap();
            assert!((libm::erfcf(x) - p).abs() <= 1e-5 * p, "{p}");
        }
        assert_eq!(erfc_inv(0.0f64), Err(Error::OutOfRange("y")));
        assert_eq!(erfc_inv(2.0f32), Err(Error::OutOfRange("y")));
        assert_eq!(erfc_inv(f64::NAN), Err(Error::NonFinite("y")));
    }

    #[test]
    fn skin_correction_matches_the_iteration() {
        let v = VelocityRange::<f64>::from_factor(0.66, 0.01).unwrap();
        let loss = SkinLoss::from_alpha(0.02, 1e8).unwrap();
        let c = correct_skin_delay(2e-6, 1e-9, &v, &loss, 0.0, 0.5).unwrap();
        let k = SkinEdge::new(loss.a_sqrt_s_per_m())
            .unwrap()
            .delay_50_s()
            .unwrap();
        let it = correct_round_trip(2e-6, 1e-9, &v, |x| Ok(k * x * x)).unwrap();
        assert!((c.distance.distance_m - it.distance.distance_m).abs() < 1e-9);
        assert!((c.distance.lo_m - it.distance.lo_m).abs() < 1e-9);
        assert!((c.distance.hi_m - it.distance.hi_m).abs() < 1e-9);
        assert!(c.distance.distance_m < c.uncorrected.distance_m);
    }
}

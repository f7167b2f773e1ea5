//! Velocity calibration from cables of known length.
//!
//! Common practice, no single source:
//!
//! * **One length.** A cable of known length L (± δL), open or shorted at the
//!   far end, gives the round-trip time t of its end reflection:
//!   v = 2L/t. The measured t also holds the fixture / launch offset t0 (the
//!   time from the instrument's time zero to the cable's input: connector,
//!   test lead, trigger delay), so the result is biased low by t/(t − t0)
//!   unless t0 is subtracted from t first (for example with the offset a
//!   two-length calibration returns).
//! * **Two lengths.** Two cables of the same type, lengths L1 < L2, give
//!   t1 and t2: v = 2(L2 − L1)/(t2 − t1), in which the common offset cancels;
//!   the offset itself is t0 = t1 − 2L1/v.
//!
//! Uncertainty (worst case, not a standard deviation): every length is within
//! ±δL and every time within ±δt (the half-width of
//! [`super::timing_half_width_s`]). Each result is monotone in every input, so
//! its bounds are evaluated at the corners:
//! one length: v_lo = 2(L − δL)/(t + δt), v_hi = 2(L + δL)/(t − δt);
//! two lengths: v_lo = 2(ΔL − 2δL)/(Δt + 2δt), v_hi = 2(ΔL + 2δL)/(Δt − 2δt),
//! t0 ∈ [t0(t1 − δt, t2 + δt, L1 + δL, L2 − δL), t0(t1 + δt, t2 − δt, L1 − δL, L2 + δL)].

use crate::error::{self, Error, Result};
use crate::scalar::Real;
use crate::timing::{VelocityKind, VelocityRange};

/// The result of a two-length calibration.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TwoLengthCalibration<T> {
    /// The velocity with its worst-case range (kind [`VelocityKind::Factor`]).
    pub velocity: VelocityRange<T>,
    /// The fixture / launch offset t0 in the round-trip times, s (best estimate).
    pub offset_s: T,
    /// Lower bound of the offset, s.
    pub offset_lo_s: T,
    /// Upper bound of the offset, s.
    pub offset_hi_s: T,
}

/// Velocity from one cable of `length_m > 0` (± `length_tolerance_m`, which
/// must be smaller than the length) whose end reflection arrives at
/// `t_round_s > 0` (± `t_half_width_s`, smaller than `t_round_s`).
///
/// The result includes the fixture / launch offset (see the module docs):
/// subtract a known offset from `t_round_s` first.
pub fn velocity_from_one_length<T: Real>(
    length_m: T,
    length_tolerance_m: T,
    t_round_s: T,
    t_half_width_s: T,
) -> Result<VelocityRange<T>> {
    let l = error::positive(length_m, "length_m")?;
    let dl = error::non_negative(length_tolerance_m, "length_tolerance_m")?;
    let t = error::positive(t_round_s, "t_round_s")?;
    let dt = error::non_negative(t_half_width_s, "t_half_width_s")?;
    if dl >= l {
        return Err(Error::OutOfRange("length_tolerance_m"));
    }
    if dt >= t {
        return Err(Error::OutOfRange("t_half_width_s"));
    }
    let two = T::two();
    let v = error::finite(two * l / t, "velocity_m_per_s")?;
    let lo = two * (l - dl) / (t + dt);
    let hi = error::finite(two * (l + dl) / (t - dt), "velocity_m_per_s")?;
    VelocityRange::from_m_per_s(v, lo, hi, VelocityKind::Factor)
}

/// Velocity and fixture offset from two cables of the same type, lengths
/// `length1_m` < `length2_m` (each ± `length_tolerance_m`, `length1_m ≥ 0`),
/// with round-trip times `t_round1_s` < `t_round2_s` (each ± `t_half_width_s`).
/// The offset cancels from the velocity.
///
/// Errors: `length2_m` not above `length1_m` by more than 2·`length_tolerance_m`
/// ([`Error::OutOfRange`]`("length2_m")`); `t_round2_s` not above `t_round1_s`
/// by more than 2·`t_half_width_s` ([`Error::OutOfRange`]`("t_round2_s")`).
pub fn velocity_from_two_lengths<T: Real>(
    length1_m: T,
    length2_m: T,
    length_tolerance_m: T,
    t_round1_s: T,
    t_round2_s: T,
    t_half_width_s: T,
) -> Result<TwoLengthCalibration<T>> {
    let l1 = error::non_negative(length1_m, "length1_m")?;
    let l2 = error::positive(length2_m, "length2_m")?;
    let dl = error::non_negative(length_tolerance_m, "length_tolerance_m")?;
    let t1 = error::finite(t_round1_s, "t_round1_s")?;
    let t2 = error::finite(t_round2_s, "t_round2_s")?;
    let dt = error::non_negative(t_half_width_s, "t_half_width_s")?;
    let two = T::two();
    let d_l = l2 - l1;
    let d_t = t2 - t1;
    if d_l <= two * dl {
        return Err(Error::OutOfRange("length2_m"));
    }
    if d_t <= two * dt {
        return Err(Error::OutOfRange("t_round2_s"));
    }
    let v = error::finite(two * d_l / d_t, "velocity_m_per_s")?;
    let lo = two * (d_l - two * dl) / (d_t + two * dt);
    let hi = error::finite(
        two * (d_l + two * dl) / (d_t - two * dt),
        "velocity_m_per_s",
    )?;
    let velocity = VelocityRange::from_m_per_s(v, lo, hi, VelocityKind::Factor)?;
    // t0 = t1 − L1·(t2 − t1)/(L2 − L1): increasing in t1 and L2, decreasing in t2 and L1.
    let t0 = |a: T, b: T, x1: T, x2: T| a - x1 * (b - a) / (x2 - x1);
    let offset_s = error::finite(t0(t1, t2, l1, l2), "offset_s")?;
    let offset_lo_s = error::finite(t0(t1 - dt, t2 + dt, l1 + dl, l2 - dl), "offset_s")?;
    let offset_hi_s = error::finite(
        t0(t1 + dt, t2 - dt, (l1 - dl).max(T::zero()), l2 + dl),
        "offset_s",
    )?;
    Ok(TwoLengthCalibration {
        velocity,
        offset_s,
        offset_lo_s,
        offset_hi_s,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn one_length_bounds_hold_the_truth() {
        let v = 2.0e8f64;
        let r = velocity_from_one_length(100.0, 0.1, 2.0 * 100.0 / v, 0.1e-9).unwrap();
        assert!((r.nominal_m_per_s - v).abs() < 1e-6 * v);
        assert!(r.lo_m_per_s < v && v < r.hi_m_per_s);
        assert_eq!(
            velocity_from_one_length(1.0f32, 1.0, 1e-8, 0.0),
            Err(Error::OutOfRange("length_tolerance_m"))
        );
    }

    #[test]
    fn two_lengths_cancel_the_offset() {
        let (v, t0) = (1.98e8f64, 3.5e-9);
        let t = |l: f64| t0 + 2.0 * l / v;
        let c = velocity_from_two_lengths(10.0, 60.0, 0.0, t(10.0), t(60.0), 0.0).unwrap();
        assert!((c.velocity.nominal_m_per_s - v).abs() < 1e-9 * v);
        assert!((c.offset_s - t0).abs() < 1e-18);
        assert_eq!(
            velocity_from_two_lengths(10.0f64, 10.1, 0.1, 1e-7, 2e-7, 0.0),
            Err(Error::OutOfRange("length2_m"))
        );
    }
}

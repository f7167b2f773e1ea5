//! Time of flight: velocities, round-trip time ↔ distance with uncertainty
//! (in progress; the shared types below are the contract other modules use).
//!
//! d = v·t_round/2 (common practice, no single source). The interval combines
//! the velocity range with the timing half-width: d_lo = v_lo·(t − δt)/2,
//! d_hi = v_hi·(t + δt)/2.

use crate::error::{self, Error, Result};
use crate::scalar::Real;

/// Which velocity converts time to distance.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum VelocityKind<T> {
    /// A frequency-independent velocity factor (a preset range or a calibration).
    Factor,
    /// The phase velocity of a line model at this frequency (Hz).
    PhaseAt(T),
    /// The group velocity of a line model at this frequency (Hz).
    GroupAt(T),
}

/// A propagation velocity with its range: nominal, lowest and highest, m/s.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VelocityRange<T> {
    /// Nominal velocity, m/s.
    pub nominal_m_per_s: T,
    /// Lowest plausible velocity, m/s.
    pub lo_m_per_s: T,
    /// Highest plausible velocity, m/s.
    pub hi_m_per_s: T,
    /// Which velocity this is.
    pub kind: VelocityKind<T>,
}

impl<T: Real> VelocityRange<T> {
    /// A velocity factor with a symmetric relative tolerance (e.g. 0.66 ± 0.02),
    /// both as fractions of c0. Valid: 0 < vf ± tol ≤ 1.
    pub fn from_factor(velocity_factor: T, tolerance: T) -> Result<Self> {
        let vf = error::positive(velocity_factor, "velocity_factor")?;
        let tol = error::non_negative(tolerance, "tolerance")?;
        if vf > T::one() || vf - tol <= T::zero() {
            return Err(Error::OutOfRange("velocity_factor"));
        }
        let c0 = T::c0();
        Ok(VelocityRange {
            nominal_m_per_s: vf * c0,
            lo_m_per_s: (vf - tol) * c0,
            hi_m_per_s: (vf + tol).min(T::one()) * c0,
            kind: VelocityKind::Factor,
        })
    }
}

/// A distance with its uncertainty interval, metres.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Distance<T> {
    /// Best estimate, m.
    pub distance_m: T,
    /// Lower end of the interval, m.
    pub lo_m: T,
    /// Upper end of the interval, m.
    pub hi_m: T,
}

/// One-way distance from a round-trip time `t_round_s ≥ 0` with a timing
/// half-width `t_half_width_s ≥ 0` and a velocity range.
pub fn distance_from_round_trip<T: Real>(
    t_round_s: T,
    t_half_width_s: T,
    velocity: &VelocityRange<T>,
) -> Result<Distance<T>> {
    let t = error::non_negative(t_round_s, "t_round_s")?;
    let dt = error::non_negative(t_half_width_s, "t_half_width_s")?;
    let v = error::positive(velocity.nominal_m_per_s, "nominal_m_per_s")?;
    let lo = error::positive(velocity.lo_m_per_s, "lo_m_per_s")?;
    let hi = error::positive(velocity.hi_m_per_s, "hi_m_per_s")?;
    let h = T::half();
    Ok(Distance {
        distance_m: v * t * h,
        lo_m: lo * (t - dt).max(T::zero()) * h,
        hi_m: hi * (t + dt) * h,
    })
}

/// Half-width of the round-trip-time interval, s.
///
/// δt = q + e, a conservative linear sum of
/// * q, the timing quantisation: half a sample interval for a raw sample
///   index, an eighth of one when the crossing is interpolated between samples;
/// * e = t_r/10, the ambiguity of reading an edge of 10–90 % rise time t_r at
///   its 50 % point (noise and edge shape).
///
/// Common practice, no single source; the interval is a worst-case band, not a
/// standard deviation. Valid: `sample_interval_s > 0`, `rise_time_s ≥ 0`.
pub fn timing_half_width_s<T: Real>(
    sample_interval_s: T,
    interpolated: bool,
    rise_time_s: T,
) -> Result<T> {
    let dt = error::positive(sample_interval_s, "sample_interval_s")?;
    let tr = error::non_negative(rise_time_s, "rise_time_s")?;
    let q = if interpolated {
        dt * T::lit(0.125)
    } else {
        dt * T::half()
    };
    Ok(q + tr * T::lit(0.1))
}

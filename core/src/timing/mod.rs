//! Time of flight: velocities, round-trip time ↔ distance with uncertainty,
//! phase and group delay, velocity presets and calibration, and the late, slow
//! edge of a long lossy cable.
//!
//! # Distance and time
//!
//! d = v·t_round/2 (common practice, no single source): the pulse travels to
//! the event and back. Every conversion carries an interval, formed as a
//! worst-case band (not a standard deviation):
//!
//! * the **velocity range** [v_lo, v_hi] of a [`VelocityRange`] (a preset
//!   range, a calibration's bounds, or a line model's velocity ± a relative
//!   tolerance);
//! * the **timing half-width** δt of [`timing_half_width_s`]: the sample
//!   quantisation (½ sample for a raw index, ⅛ sample for an interpolated
//!   crossing) plus a tenth of the edge's 10–90 % rise time for the ambiguity of
//!   reading an edge at its 50 % point.
//!
//! [`distance_from_round_trip`]: d = v·t/2, d_lo = v_lo·max(t − δt, 0)/2,
//! d_hi = v_hi·(t + δt)/2.
//!
//! [`round_trip_from_distance`]: t = 2d/v, t_lo = 2·max(d − δd, 0)/v_hi,
//! t_hi = 2·(d + δd)/v_lo, with δd the distance half-width.
//!
//! Both ends are monotone in every input, so the band holds every combination
//! of a velocity in the range and a time (distance) in its half-width.
//!
//! The rise time to give [`timing_half_width_s`] is that of the edge as read at
//! the event: the instrument's own edge slowed by the cable, for example
//! [`edge::combine_rise_times_rss`] of the instrument's rise time and
//! [`edge::SkinEdge::rise_time_10_90_s`] for the round-trip path. On a long
//! lossy cable the 50 % point also arrives late: [`edge::correct_skin_delay`]
//! and [`edge::correct_round_trip`] remove that excess delay.
//!
//! ```
//! use echoline::timing::{distance_from_round_trip, timing_half_width_s, VelocityRange};
//! use echoline::timing::presets::Preset;
//!
//! let v = VelocityRange::<f32>::from_preset(Preset::SolidPe); // VF 0.65–0.67
//! // 1 ns samples, interpolated crossing, 2 ns edge: δt = 0.125 + 0.2 ns.
//! let dt = timing_half_width_s(1e-9, true, 2e-9)?;
//! let d = distance_from_round_trip(1.0e-6, dt, &v)?; // ≈ 98.9 m
//! assert!(d.lo_m < d.distance_m && d.distance_m < d.hi_m);
//! assert!((d.distance_m - 98.93).abs() < 0.01);
//! # Ok::<(), echoline::Error>(())
//! ```
//!
//! # Submodules
//! * [`delay`]: phase and group delay of a line model at a frequency.
//! * [`presets`]: velocity-factor ranges by dielectric (common practice).
//! * [`calibrate`]: velocity from one or two cables of known length.
//! * [`edge`]: skin-effect edge (Wigington & Nahman 1957) in closed form and
//!   the correction of a distance read on a long lossy cable.
//! * [`step`]: the numerical step response of any line model after a length.

pub mod calibrate;
pub mod delay;
pub mod edge;
pub mod presets;
pub mod step;

use crate::error::{self, Error, Result};
use crate::line::{self, LineModel};
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

impl<T> VelocityKind<T> {
    /// A stable machine name: `"factor"`, `"phase"` or `"group"`.
    pub const fn name(&self) -> &'static str {
        match self {
            VelocityKind::Factor => "factor",
            VelocityKind::PhaseAt(_) => "phase",
            VelocityKind::GroupAt(_) => "group",
        }
    }
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

    /// A velocity range given directly in m/s. Valid: finite,
    /// `0 < lo_m_per_s ≤ nominal_m_per_s ≤ hi_m_per_s`.
    pub fn from_m_per_s(
        nominal_m_per_s: T,
        lo_m_per_s: T,
        hi_m_per_s: T,
        kind: VelocityKind<T>,
    ) -> Result<Self> {
        let v = error::positive(nominal_m_per_s, "nominal_m_per_s")?;
        let lo = error::positive(lo_m_per_s, "lo_m_per_s")?;
        let hi = error::positive(hi_m_per_s, "hi_m_per_s")?;
        if lo > v {
            return Err(Error::OutOfRange("lo_m_per_s"));
        }
        if hi < v {
            return Err(Error::OutOfRange("hi_m_per_s"));
        }
        Ok(VelocityRange {
            nominal_m_per_s: v,
            lo_m_per_s: lo,
            hi_m_per_s: hi,
            kind,
        })
    }

    /// The velocity-factor range of a dielectric preset (common practice, no
    /// single source; see [`presets`]). Kind [`VelocityKind::Factor`].
    pub fn from_preset(preset: presets::Preset) -> Self {
        preset.velocity()
    }

    /// The velocity of a line model at a frequency with a relative tolerance:
    /// `kind` must be [`VelocityKind::PhaseAt`] (ω/β) or [`VelocityKind::GroupAt`]
    /// (dω/dβ, see [`line::group_delay_s_per_m`]); the range is
    /// v·(1 ∓ `relative_tolerance`). The velocity is not capped at c0 (a
    /// waveguide's phase velocity exceeds it).
    ///
    /// Errors: [`Error::Undefined`]`("kind")` for [`VelocityKind::Factor`];
    /// `relative_tolerance` must lie in [0, 1); the model's errors for a bad
    /// frequency; [`Error::Undefined`]`("velocity_m_per_s")` where the velocity
    /// is zero (DC of a lossy line, below a waveguide cutoff).
    pub fn from_line<M: LineModel<T> + ?Sized>(
        model: &M,
        kind: VelocityKind<T>,
        relative_tolerance: T,
    ) -> Result<Self> {
        let tol = error::non_negative(relative_tolerance, "relative_tolerance")?;
        if tol >= T::one() {
            return Err(Error::OutOfRange("relative_tolerance"));
        }
        let v = match kind {
            VelocityKind::Factor => return Err(Error::Undefined("kind")),
            VelocityKind::PhaseAt(f) => line::properties(model, f)?.phase_velocity_m_per_s,
            VelocityKind::GroupAt(f) => {
                let gd = line::group_delay_s_per_m(model, f)?;
                if gd > T::zero() {
                    T::one() / gd
                } else {
                    T::zero()
                }
            }
        };
        if v <= T::zero() || !v.is_finite() {
            return Err(Error::Undefined("velocity_m_per_s"));
        }
        Ok(VelocityRange {
            nominal_m_per_s: v,
            lo_m_per_s: v * (T::one() - tol),
            hi_m_per_s: v * (T::one() + tol),
            kind,
        })
    }

    /// Nominal velocity factor v/c0.
    pub fn velocity_factor(&self) -> T {
        self.nominal_m_per_s / T::c0()
    }

    /// Half the relative width of the range, (v_hi − v_lo)/(2·v): the relative
    /// distance uncertainty the velocity alone contributes.
    pub fn relative_half_width(&self) -> T {
        (self.hi_m_per_s - self.lo_m_per_s) / (T::two() * self.nominal_m_per_s)
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
    let d = Distance {
        distance_m: v * t * h,
        lo_m: lo * (t - dt).max(T::zero()) * h,
        hi_m: hi * (t + dt) * h,
    };
    // A round trip so long that the distance overflows the scalar.
    if !(d.hi_m.is_finite() && d.distance_m.is_finite()) {
        return Err(Error::OutOfRange("t_round_s"));
    }
    Ok(d)
}

/// A round-trip time with its interval, seconds.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RoundTrip<T> {
    /// Best estimate, s.
    pub t_round_s: T,
    /// Lower end of the interval, s.
    pub lo_s: T,
    /// Upper end of the interval, s.
    pub hi_s: T,
}

/// Round-trip time to an event at `distance_m ≥ 0` known to ±`distance_half_width_m ≥ 0`:
/// t = 2d/v, t_lo = 2·max(d − δd, 0)/v_hi, t_hi = 2·(d + δd)/v_lo.
pub fn round_trip_from_distance<T: Real>(
    distance_m: T,
    distance_half_width_m: T,
    velocity: &VelocityRange<T>,
) -> Result<RoundTrip<T>> {
    let d = error::non_negative(distance_m, "distance_m")?;
    let dd = error::non_negative(distance_half_width_m, "distance_half_width_m")?;
    let v = error::positive(velocity.nominal_m_per_s, "nominal_m_per_s")?;
    let lo = error::positive(velocity.lo_m_per_s, "lo_m_per_s")?;
    let hi = error::positive(velocity.hi_m_per_s, "hi_m_per_s")?;
    let two = T::two();
    let r = RoundTrip {
        t_round_s: two * d / v,
        lo_s: two * (d - dd).max(T::zero()) / hi,
        hi_s: two * (d + dd) / lo,
    };
    error::finite(r.hi_s, "t_round_s")?;
    Ok(r)
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

//! Bindings for the "Fault distance" section: round-trip time and a velocity
//! factor ± tolerance → distance with its uncertainty interval, in metres and
//! feet, through `echoline::timing`.

use echoline::timing::{self, VelocityRange};
use echoline::units::m_to_ft;
use echoline::Result;
use wasm_bindgen::prelude::*;

/// A distance to a fault with its interval, and the figures behind it.
#[wasm_bindgen]
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FaultDistance {
    /// Best estimate, m.
    pub distance_m: f64,
    /// Lower end of the interval, m.
    pub lo_m: f64,
    /// Upper end of the interval, m.
    pub hi_m: f64,
    /// Best estimate, ft.
    pub distance_ft: f64,
    /// Lower end of the interval, ft.
    pub lo_ft: f64,
    /// Upper end of the interval, ft.
    pub hi_ft: f64,
    /// Half-width of the round-trip-time interval, s.
    pub t_half_width_s: f64,
    /// Nominal velocity, m/s.
    pub v_nominal_m_per_s: f64,
    /// Lowest velocity, m/s.
    pub v_lo_m_per_s: f64,
    /// Highest velocity, m/s.
    pub v_hi_m_per_s: f64,
    /// Nominal velocity, ft/s.
    pub v_nominal_ft_per_s: f64,
    /// Lowest velocity, ft/s.
    pub v_lo_ft_per_s: f64,
    /// Highest velocity, ft/s.
    pub v_hi_ft_per_s: f64,
}

/// The computation behind [`fault_distance`].
pub fn compute(
    t_round_s: f64,
    velocity_factor: f64,
    tolerance: f64,
    sample_interval_s: f64,
    interpolated: bool,
    rise_time_s: f64,
) -> Result<FaultDistance> {
    let v = VelocityRange::from_factor(velocity_factor, tolerance)?;
    let dt = timing::timing_half_width_s(sample_interval_s, interpolated, rise_time_s)?;
    let d = timing::distance_from_round_trip(t_round_s, dt, &v)?;
    Ok(FaultDistance {
        distance_m: d.distance_m,
        lo_m: d.lo_m,
        hi_m: d.hi_m,
        distance_ft: m_to_ft(d.distance_m),
        lo_ft: m_to_ft(d.lo_m),
        hi_ft: m_to_ft(d.hi_m),
        t_half_width_s: dt,
        v_nominal_m_per_s: v.nominal_m_per_s,
        v_lo_m_per_s: v.lo_m_per_s,
        v_hi_m_per_s: v.hi_m_per_s,
        v_nominal_ft_per_s: m_to_ft(v.nominal_m_per_s),
        v_lo_ft_per_s: m_to_ft(v.lo_m_per_s),
        v_hi_ft_per_s: m_to_ft(v.hi_m_per_s),
    })
}

/// `fault_distance(t_round_s, velocity_factor, tolerance, sample_interval_s,
/// interpolated, rise_time_s)`: valid `t_round_s ≥ 0`, `0 < vf ± tol ≤ 1`,
/// `sample_interval_s > 0`, `rise_time_s ≥ 0`.
#[wasm_bindgen]
pub fn fault_distance(
    t_round_s: f64,
    velocity_factor: f64,
    tolerance: f64,
    sample_interval_s: f64,
    interpolated: bool,
    rise_time_s: f64,
) -> core::result::Result<FaultDistance, JsError> {
    compute(
        t_round_s,
        velocity_factor,
        tolerance,
        sample_interval_s,
        interpolated,
        rise_time_s,
    )
    .map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;
    use echoline::Error;

    #[test]
    fn distance_is_half_the_round_trip_path() {
        // d = v·t/2 (common practice, no single source), v = VF·c0.
        let r = compute(612e-9, 0.66, 0.02, 1e-9, true, 2e-9).unwrap();
        let c0 = 299_792_458.0;
        assert!((r.distance_m - 0.66 * c0 * 612e-9 / 2.0).abs() < 1e-9);
        assert!((r.distance_ft * 0.3048 - r.distance_m).abs() < 1e-9);
        assert!(r.lo_m < r.distance_m && r.distance_m < r.hi_m);
        assert_eq!(
            compute(1e-6, 1.2, 0.0, 1e-9, false, 0.0),
            Err(Error::OutOfRange("velocity_factor"))
        );
        assert_eq!(
            compute(-1e-6, 0.7, 0.0, 1e-9, false, 0.0),
            Err(Error::Negative("t_round_s"))
        );
    }
}

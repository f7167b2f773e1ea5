//! Bindings for the "Fault distance" section: round-trip time and a velocity
//! factor ± tolerance → distance with its uncertainty interval, in metres and
//! feet, through `echoline::timing`.

use echoline::timing::calibrate::{velocity_from_one_length, velocity_from_two_lengths};
use echoline::timing::presets::Preset;
use echoline::timing::{self, VelocityKind, VelocityRange};
use echoline::units::m_to_ft;
use echoline::{Error, Result};
use wasm_bindgen::prelude::*;

use crate::json::Json;

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

/// Entries of the `numbers` argument of [`fault_distance_by`], in order.
pub const NUMBERS: [&str; 15] = [
    "t_round_s",
    "velocity_factor",
    "tolerance",
    "sample_interval_s",
    "interpolated",
    "rise_time_s",
    "ds_velocity_factor",
    "ds_velocity_factor_lo",
    "ds_velocity_factor_hi",
    "model_tolerance",
    "cal_length_m",
    "cal_t_round_s",
    "cal_length2_m",
    "cal_t_round2_s",
    "cal_length_tolerance_m",
];

/// The calibration's parameter names as the page's fields know them.
fn cal_name(p: &'static str) -> &'static str {
    match p {
        "length_m" | "length1_m" => "cal_length_m",
        "t_round_s" | "t_round1_s" => "cal_t_round_s",
        "length2_m" => "cal_length2_m",
        "t_round2_s" => "cal_t_round2_s",
        "length_tolerance_m" => "cal_length_tolerance_m",
        p => p,
    }
}

fn rename(e: Error, f: fn(&'static str) -> &'static str) -> Error {
    match e {
        Error::NonFinite(p) => Error::NonFinite(f(p)),
        Error::NotPositive(p) => Error::NotPositive(f(p)),
        Error::Negative(p) => Error::Negative(f(p)),
        Error::OutOfRange(p) => Error::OutOfRange(f(p)),
        Error::Undefined(p) => Error::Undefined(f(p)),
        e => e,
    }
}

fn ds_name(p: &'static str) -> &'static str {
    match p {
        "nominal_m_per_s" => "ds_velocity_factor",
        "lo_m_per_s" => "ds_velocity_factor_lo",
        "hi_m_per_s" => "ds_velocity_factor_hi",
        p => p,
    }
}

/// A fault distance with the cable's velocity from one of several sources
/// (`by`): `factor` (VF ± tolerance), a preset's machine name
/// (`timing::presets::Preset`), `datasheet` (nominal VF and its printed
/// range), `model` (the group velocity at the design's frequency of the line
/// described by `design` and `design_numbers`, see [`crate::design`], ±
/// `model_tolerance` relative), `cal1` (`timing::calibrate::velocity_from_one_length`)
/// or `cal2` (`velocity_from_two_lengths`; its fixture offset is subtracted
/// from the round trip and its half-width added to the timing interval).
/// The calibration times carry the same timing interval as the fault's.
///
/// JSON: `{distance_m, lo_m, hi_m, distance_ft, lo_ft, hi_ft, t_used_s,
/// t_half_width_s, v_nominal_m_per_s, v_lo_m_per_s, v_hi_m_per_s, …_ft_per_s,
/// vf_nominal, vf_lo, vf_hi, vf_tolerance, kind, offset_s, offset_lo_s, offset_hi_s}`
/// (offsets `null` unless `cal2`).
pub fn compute_by(
    by: &str,
    design: (&str, &str, &str),
    design_numbers: &[f64],
    n: &[f64],
) -> Result<String> {
    let [t_round_s, vf, tol, dt_s, interp, rise_s, ds_vf, ds_lo, ds_hi, model_tol, l1, t1, l2, t2, dl] =
        <[f64; 15]>::try_from(n).map_err(|_| Error::LengthMismatch("numbers"))?;
    let dt = timing::timing_half_width_s(dt_s, interp != 0.0, rise_s)?;
    let c0 = 299_792_458.0;
    let mut offset: Option<(f64, f64, f64)> = None;
    let v = match by {
        "factor" => VelocityRange::from_factor(vf, tol)?,
        "datasheet" => {
            echoline::error::in_range(ds_vf, 0.0, 1.0, "ds_velocity_factor")?;
            echoline::error::in_range(ds_hi, 0.0, 1.0, "ds_velocity_factor_hi")?;
            VelocityRange::from_m_per_s(ds_vf * c0, ds_lo * c0, ds_hi * c0, VelocityKind::Factor)
                .map_err(|e| rename(e, ds_name))?
        }
        "model" => {
            let d = crate::design::design(design.0, design.1, design.2, design_numbers)?;
            let (line, _, _) = crate::design::model(&d)?;
            VelocityRange::from_line(line.as_ref(), VelocityKind::GroupAt(d.freq_hz), model_tol)
                .map_err(|e| {
                    rename(e, |p| {
                        if p == "relative_tolerance" {
                            "model_tolerance"
                        } else {
                            p
                        }
                    })
                })?
        }
        "cal1" => velocity_from_one_length(l1, dl, t1, dt).map_err(|e| rename(e, cal_name))?,
        "cal2" => {
            let c = velocity_from_two_lengths(l1, l2, dl, t1, t2, dt)
                .map_err(|e| rename(e, cal_name))?;
            offset = Some((c.offset_s, c.offset_lo_s, c.offset_hi_s));
            c.velocity
        }
        name => VelocityRange::from_preset(Preset::from_name(name)?),
    };
    let (t_used, dt_used) = match offset {
        Some((o, lo, hi)) => (t_round_s - o, dt + (hi - lo) * 0.5),
        None => (t_round_s, dt),
    };
    let d = timing::distance_from_round_trip(t_used, dt_used, &v)?;
    let kind = v.kind.name();
    let mut j = Json::new();
    j.open("")
        .num("distance_m", d.distance_m)
        .num("lo_m", d.lo_m)
        .num("hi_m", d.hi_m)
        .num("distance_ft", m_to_ft(d.distance_m))
        .num("lo_ft", m_to_ft(d.lo_m))
        .num("hi_ft", m_to_ft(d.hi_m))
        .num("t_used_s", t_used)
        .num("t_half_width_s", dt_used)
        .num("v_nominal_m_per_s", v.nominal_m_per_s)
        .num("v_lo_m_per_s", v.lo_m_per_s)
        .num("v_hi_m_per_s", v.hi_m_per_s)
        .num("v_nominal_ft_per_s", m_to_ft(v.nominal_m_per_s))
        .num("v_lo_ft_per_s", m_to_ft(v.lo_m_per_s))
        .num("v_hi_ft_per_s", m_to_ft(v.hi_m_per_s))
        .num("vf_nominal", v.nominal_m_per_s / c0)
        .num("vf_lo", v.lo_m_per_s / c0)
        .num("vf_hi", v.hi_m_per_s / c0)
        // The symmetric tolerance that covers the range (to reuse a
        // calibration as a factor ± tolerance).
        .num(
            "vf_tolerance",
            (v.hi_m_per_s - v.nominal_m_per_s).max(v.nominal_m_per_s - v.lo_m_per_s) / c0,
        )
        .str("kind", kind);
    match offset {
        Some((o, lo, hi)) => j
            .num("offset_s", o)
            .num("offset_lo_s", lo)
            .num("offset_hi_s", hi),
        None => j
            .num("offset_s", f64::NAN)
            .num("offset_lo_s", f64::NAN)
            .num("offset_hi_s", f64::NAN),
    };
    j.close();
    Ok(j.finish())
}

/// `fault_distance_by(by, geometry, substrate, dielectric, design_numbers,
/// numbers)` → JSON (see [`compute_by`]); `numbers` in the order of
/// [`NUMBERS`], `design_numbers` in that of [`crate::design::NUMBERS`].
#[wasm_bindgen]
pub fn fault_distance_by(
    by: &str,
    geometry: &str,
    substrate: &str,
    dielectric: &str,
    design_numbers: &[f64],
    numbers: &[f64],
) -> core::result::Result<String, JsError> {
    compute_by(
        by,
        (geometry, substrate, dielectric),
        design_numbers,
        numbers,
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

    fn nums(by_cal: [f64; 5]) -> Vec<f64> {
        // t 612 ns, VF 0.66 ± 0.02, 1 ns samples, interpolated, 2 ns rise;
        // datasheet 0.83 (0.80–0.86); model ±1 %; calibration fields.
        let mut v = vec![612e-9, 0.66, 0.02, 1e-9, 1.0, 2e-9, 0.83, 0.80, 0.86, 0.01];
        v.extend(by_cal);
        v
    }

    fn num(json: &str, key: &str) -> f64 {
        let at = json.find(&format!("\"{key}\":")).unwrap() + key.len() + 3;
        let end = json[at..].find([',', '}']).unwrap() + at;
        json[at..end].parse().unwrap()
    }

    #[test]
    fn velocity_sources() {
        let c0 = 299_792_458.0;
        let none = [0.0; 24];
        let n = nums([100.0, 1.1e-6, 0.0, 0.0, 0.01]);
        // By factor: the same figures as `compute` (d = v·t/2, common practice).
        let j = compute_by("factor", ("", "", ""), &none, &n).unwrap();
        assert!((num(&j, "distance_m") - 0.66 * c0 * 612e-9 / 2.0).abs() < 1e-9);
        // A preset: its range (timing::presets, common practice): foamed PE 0.78–0.88.
        let j = compute_by("foam-pe", ("", "", ""), &none, &n).unwrap();
        assert!((num(&j, "vf_lo") - 0.78).abs() < 1e-9 && (num(&j, "vf_hi") - 0.88).abs() < 1e-9);
        // Datasheet figures: VF 0.83, range 0.80–0.86.
        let j = compute_by("datasheet", ("", "", ""), &none, &n).unwrap();
        assert!((num(&j, "distance_m") - 0.83 * c0 * 612e-9 / 2.0).abs() < 1e-9);
        let mut bad = n.clone();
        bad[7] = 0.9;
        assert_eq!(
            compute_by("datasheet", ("", "", ""), &none, &bad),
            Err(Error::OutOfRange("ds_velocity_factor_lo"))
        );
        // A model: the ideal line's velocity factor (v = VF·c0).
        let mut d = none;
        d[13] = 50.0;
        d[14] = 0.7;
        d[22] = 1e6;
        let j = compute_by("model", ("ideal", "thick", "constant"), &d, &n).unwrap();
        assert!((num(&j, "vf_nominal") - 0.7).abs() < 1e-6, "{j}");
        assert!((num(&j, "vf_hi") / num(&j, "vf_nominal") - 1.01).abs() < 1e-9);
    }

    #[test]
    fn calibration_from_known_lengths() {
        // One length: v = 2L/t (timing::calibrate, common practice): 100 m,
        // 1.1 µs → 181.8 m/µs; the fault at 612 ns then at v·t/2.
        let none = [0.0; 24];
        let n = nums([100.0, 1.1e-6, 0.0, 0.0, 0.01]);
        let j = compute_by("cal1", ("", "", ""), &none, &n).unwrap();
        let v = 2.0 * 100.0 / 1.1e-6;
        assert!((num(&j, "v_nominal_m_per_s") - v).abs() < 1e-3);
        assert!((num(&j, "distance_m") - v * 612e-9 / 2.0).abs() < 1e-9);
        // Two lengths with a 10 ns fixture offset: 50 m and 150 m at VF 0.66;
        // the offset comes back and is removed from the fault's round trip.
        let v = 0.66 * 299_792_458.0;
        let (ta, tb) = (10e-9 + 100.0 / v, 10e-9 + 300.0 / v);
        let n2 = nums([50.0, ta, 150.0, tb, 0.01]);
        let j = compute_by("cal2", ("", "", ""), &none, &n2).unwrap();
        assert!((num(&j, "offset_s") - 10e-9).abs() < 1e-15, "{j}");
        assert!((num(&j, "vf_nominal") - 0.66).abs() < 1e-9);
        assert!((num(&j, "t_used_s") - (612e-9 - 10e-9)).abs() < 1e-15);
        // Field names for the page.
        let mut bad = n.clone();
        bad[10] = -1.0;
        assert_eq!(
            compute_by("cal1", ("", "", ""), &none, &bad),
            Err(Error::NotPositive("cal_length_m"))
        );
    }
}

//! Synthesis: solve one dimension of a geometry for a target characteristic
//! impedance at a frequency.
//!
//! The impedance is the lossless Z0 of each model at `freq_hz` (ε′ of the
//! dielectric there; for microstrip including the Kirschning–Jansen /
//! Jansen–Kirschning dispersion), i.e. the geometry's impedance, not the small
//! complex part losses add. Where the model inverts in closed form (coax:
//! d = D·exp(−2π√ε′·Z/η0); two-wire: D = d·cosh(π√ε′·Z/η0)) that is used;
//! otherwise Brent's bracketing method ([`crate::math::roots::find_root`]) on the
//! logarithm of the dimension across the model's valid range:
//!
//! | model | solved for | range searched |
//! | --- | --- | --- |
//! | microstrip | strip width W | W/h ∈ [0.01, 100] (Hammerstad–Jensen) |
//! | stripline | strip width W | W/b ∈ [0.01, 10] (Wheeler's W′/(b − t) < 10) |
//! | coplanar waveguide | slot width W | W/S ∈ [0.01, 100] |
//! | coax | inner diameter d | D/d ∈ (1, 10⁴] |
//! | two-wire | centre spacing D | D/d ∈ (1, 10⁴] |
//! | twisted pair | insulation wall t_i | t_i/d ∈ [0.01, 10] |
//!
//! A target outside what the range can give is
//! [`Error::Unreachable`]`("target_z0_ohm")`. Tolerance: the root is found to
//! machine precision in the log-dimension, so analysis(synthesis(Z)) = Z to
//! about 10⁻¹² relative in `f64` and 10⁻⁵ in `f32` (tested). The rectangular
//! waveguide is not synthesised (its wave impedance depends on frequency and a
//! only, and is rarely the design target).

use crate::error::{self, Error, Result};
use crate::line::cpw::{Cpw, Substrate};
use crate::line::dielectric::Dielectric;
use crate::line::microstrip::Microstrip;
use crate::line::stripline::Stripline;
use crate::line::two_wire::{arcosh, TwoWire};
use crate::math::roots::find_root;
use crate::scalar::Real;

/// Evaluation budget of the root finder.
pub const MAX_ITER: u32 = 100;

/// Solves `z(x) = target` for x ∈ [lo, hi] in ln x; `z` is monotonic.
fn solve_log<T: Real, F: FnMut(T) -> Result<T>>(mut z: F, target: T, lo: T, hi: T) -> Result<T> {
    let r = find_root(
        |lx: T| Ok(z(lx.exp())? - target),
        lo.ln(),
        hi.ln(),
        T::zero(),
        MAX_ITER,
    );
    match r {
        Ok(root) => Ok(root.x.exp()),
        Err(Error::Unreachable(_)) => Err(Error::Unreachable("target_z0_ohm")),
        Err(e) => Err(e),
    }
}

fn check_target<T: Real>(target_z0_ohm: T, freq_hz: T) -> Result<(T, T)> {
    Ok((
        error::positive(target_z0_ohm, "target_z0_ohm")?,
        error::non_negative(freq_hz, "freq_hz")?,
    ))
}

/// Microstrip strip width W (m) for `target_z0_ohm` at `freq_hz`, on a substrate
/// of `height_m` with strip `thickness_m` ≥ 0.
pub fn microstrip_width_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    height_m: T,
    thickness_m: T,
    dielectric: Dielectric<T>,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let h = error::positive(height_m, "height_m")?;
    let t = error::non_negative(thickness_m, "thickness_m")?;
    let u = solve_log(
        |u| Microstrip::new_untabulated(u * h, h, t, dielectric, None)?.z0_ohm(f),
        target,
        T::lit(0.01),
        T::lit(100.0),
    )?;
    Ok(u * h)
}

/// Stripline strip width W (m) for `target_z0_ohm` at `freq_hz`, between
/// ground planes `spacing_m` apart, strip `thickness_m` (0 ≤ t < b).
pub fn stripline_width_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    spacing_m: T,
    thickness_m: T,
    dielectric: Dielectric<T>,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let b = error::positive(spacing_m, "spacing_m")?;
    let t = error::non_negative(thickness_m, "thickness_m")?;
    if t >= b {
        return Err(Error::OutOfRange("thickness_m"));
    }
    let wb = solve_log(
        |x| Stripline::new(x * b, b, t, dielectric, None)?.z0_ohm(f),
        target,
        T::lit(0.01),
        T::lit(10.0),
    )?;
    Ok(wb * b)
}

/// Coplanar-waveguide slot width W (m) for `target_z0_ohm` at `freq_hz`, with
/// centre strip `strip_width_m` on `substrate`.
pub fn cpw_slot_width_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    strip_width_m: T,
    substrate: Substrate<T>,
    dielectric: Dielectric<T>,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let s = error::positive(strip_width_m, "strip_width_m")?;
    let r = solve_log(
        |x| Cpw::new(s, x * s, T::zero(), substrate, dielectric, None)?.z0_ohm(f),
        target,
        T::lit(0.01),
        T::lit(100.0),
    )?;
    Ok(r * s)
}

/// Largest diameter ratio the closed-form inversions accept.
const MAX_RATIO: f64 = 1e4;

/// Coax inner diameter d (m) for `target_z0_ohm` at `freq_hz` inside an outer
/// conductor of `outer_diameter_m`: d = D·exp(−2π√ε′·Z/η0), exact.
pub fn coax_inner_diameter_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    outer_diameter_m: T,
    dielectric: Dielectric<T>,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let dd = error::positive(outer_diameter_m, "outer_diameter_m")?;
    let er = dielectric.at(f)?.re;
    let log_ratio = T::two_pi() * er.sqrt() * target / T::eta0();
    if log_ratio > T::lit(MAX_RATIO).ln() {
        return Err(Error::Unreachable("target_z0_ohm"));
    }
    let d = dd * (-log_ratio).exp();
    if d >= dd {
        return Err(Error::Unreachable("target_z0_ohm"));
    }
    Ok(d)
}

/// Two-wire centre spacing D (m) for `target_z0_ohm` at `freq_hz` with wires of
/// `wire_diameter_m`: D = d·cosh(π√ε′·Z/η0), exact.
pub fn two_wire_spacing_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    wire_diameter_m: T,
    dielectric: Dielectric<T>,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let d = error::positive(wire_diameter_m, "wire_diameter_m")?;
    let er = dielectric.at(f)?.re;
    let x = T::PI() * er.sqrt() * target / T::eta0();
    if x > arcosh(T::lit(MAX_RATIO)) {
        return Err(Error::Unreachable("target_z0_ohm"));
    }
    let dd = d * x.cosh();
    if dd <= d {
        return Err(Error::Unreachable("target_z0_ohm"));
    }
    Ok(dd)
}

/// Twisted-pair insulation wall t_i (m) for `target_z0_ohm` at `freq_hz`, for
/// wires of `wire_diameter_m` twisted `twists_per_m` times per metre.
pub fn twisted_pair_insulation_m<T: Real>(
    target_z0_ohm: T,
    freq_hz: T,
    wire_diameter_m: T,
    dielectric: Dielectric<T>,
    twists_per_m: T,
) -> Result<T> {
    let (target, f) = check_target(target_z0_ohm, freq_hz)?;
    let d = error::positive(wire_diameter_m, "wire_diameter_m")?;
    let r = solve_log(
        |x| TwoWire::twisted_pair(d, x * d, dielectric, twists_per_m, None)?.z0_ohm(f),
        target,
        T::lit(0.01),
        T::lit(10.0),
    )?;
    Ok(r * d)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::coax::Coax;
    use approx::assert_relative_eq;

    #[test]
    fn microstrip_round_trip_and_pozar() {
        // Pozar's microstrip design example (value from memory; methods.md §2):
        // 50 Ω, h = 0.127 cm, εr 2.20 → W/h = 3.081 (his simple formula; the
        // accurate model gives 50.02 Ω there, so ≈1 %).
        let d = Dielectric::constant(2.2, 0.0).unwrap();
        let w = microstrip_width_m::<f64>(50.0, 0.0, 1.27e-3, 0.0, d).unwrap();
        assert_relative_eq!(w / 1.27e-3, 3.081, max_relative = 0.01);
        for &z in &[20.0, 35.0, 50.0, 75.0, 100.0, 150.0] {
            for &f in &[0.0, 1e9, 10e9] {
                let w = microstrip_width_m::<f64>(z, f, 1.27e-3, 17e-6, d).unwrap();
                let m = Microstrip::new(w, 1.27e-3, 17e-6, d, None).unwrap();
                assert_relative_eq!(m.z0_ohm(f).unwrap(), z, max_relative = 1e-12);
            }
        }
        let d32 = Dielectric::constant(4.4f32, 0.0).unwrap();
        let w = microstrip_width_m::<f32>(50.0, 1e9, 1.6e-3, 35e-6, d32).unwrap();
        let m = Microstrip::new(w, 1.6e-3, 35e-6, d32, None).unwrap();
        assert_relative_eq!(m.z0_ohm(1e9).unwrap(), 50.0, max_relative = 1e-5);
        assert_eq!(
            microstrip_width_m::<f64>(1.0, 0.0, 1e-3, 0.0, d),
            Err(Error::Unreachable("target_z0_ohm"))
        );
    }

    #[test]
    fn other_round_trips() {
        let d = Dielectric::constant(2.2, 0.0).unwrap();
        // Reference notes [calc]: 50 Ω stripline at εr 2.2 has W/b = 0.8291.
        let w = stripline_width_m::<f64>(50.0, 1e9, 1e-3, 0.0, d).unwrap();
        assert_relative_eq!(w / 1e-3, 0.8291, max_relative = 1e-4);
        let s = Stripline::new(w, 1e-3, 0.0, d, None).unwrap();
        assert_relative_eq!(s.z0_ohm(1e9).unwrap(), 50.0, max_relative = 1e-12);
        let w =
            cpw_slot_width_m::<f64>(50.0, 1e9, 100e-6, Substrate::Finite { height_m: 500e-6 }, d)
                .unwrap();
        let c = Cpw::new(
            100e-6,
            w,
            0.0,
            Substrate::Finite { height_m: 500e-6 },
            d,
            None,
        )
        .unwrap();
        assert_relative_eq!(c.z0_ohm(1e9).unwrap(), 50.0, max_relative = 1e-12);
        let di = coax_inner_diameter_m::<f64>(50.0, 1e9, 7e-3, Dielectric::vacuum()).unwrap();
        // IEEE Std 287 7 mm airline: 3.040 mm (value from memory) for ≈ 50 Ω.
        assert_relative_eq!(di, 3.04e-3, max_relative = 1e-3);
        let cx = Coax::new(di, 7e-3, Dielectric::vacuum(), 5.8e7, 1e-3).unwrap();
        assert_relative_eq!(
            cx.z0_closed_form_ohm(1e9).unwrap(),
            50.0,
            max_relative = 1e-12
        );
        let sp = two_wire_spacing_m::<f64>(300.0, 1e6, 1e-3, Dielectric::vacuum()).unwrap();
        assert_relative_eq!(sp / 1e-3, 6.1428, max_relative = 2e-5);
        let pe = Dielectric::constant(2.3, 0.0).unwrap();
        let ti = twisted_pair_insulation_m::<f64>(100.0, 1e6, 0.5e-3, pe, 40.0).unwrap();
        let tp = TwoWire::twisted_pair(0.5e-3, ti, pe, 40.0, None).unwrap();
        assert_relative_eq!(tp.z0_ohm(1e6).unwrap(), 100.0, max_relative = 1e-12);
        assert_eq!(
            coax_inner_diameter_m::<f64>(1e4, 0.0, 1e-3, Dielectric::vacuum()),
            Err(Error::Unreachable("target_z0_ohm"))
        );
        assert_eq!(
            stripline_width_m::<f64>(500.0, 0.0, 1e-3, 0.0, d),
            Err(Error::Unreachable("target_z0_ohm"))
        );
        assert_eq!(
            two_wire_spacing_m::<f64>(-5.0, 0.0, 1e-3, d),
            Err(Error::NotPositive("target_z0_ohm"))
        );
    }
}

//! Bindings for the "Line check" section: the ideal lossless line
//! (`echoline::line::lossless::Lossless`) and its derived properties.

use echoline::line::{lossless::Lossless, properties};
use echoline::units::m_to_ft;
use echoline::{Impedance, Result};
use wasm_bindgen::prelude::*;

/// Properties of a line at one frequency.
#[wasm_bindgen]
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LineCheck {
    /// Characteristic impedance, real part, Ω.
    pub zc_re_ohm: f64,
    /// Characteristic impedance, imaginary part, Ω.
    pub zc_im_ohm: f64,
    /// Effective relative permittivity.
    pub eps_eff: f64,
    /// Phase velocity over c0.
    pub velocity_factor: f64,
    /// Phase velocity, m/s.
    pub velocity_m_per_s: f64,
    /// Phase velocity, ft/s.
    pub velocity_ft_per_s: f64,
    /// Phase delay per metre, s/m.
    pub delay_s_per_m: f64,
    /// Phase delay per foot, s/ft.
    pub delay_s_per_ft: f64,
    /// Guided wavelength, m.
    pub wavelength_m: f64,
    /// Guided wavelength, ft.
    pub wavelength_ft: f64,
    /// Attenuation, dB/m.
    pub atten_db_per_m: f64,
}

/// The computation behind [`line_check`]: `by_eps_r` says whether `value` is
/// a relative permittivity (≥ 1) or a velocity factor (0, 1].
pub fn compute(z0_ohm: f64, value: f64, by_eps_r: bool, freq_hz: f64) -> Result<LineCheck> {
    let line = if by_eps_r {
        Lossless::from_eps_r(z0_ohm, value)?
    } else {
        Lossless::new(z0_ohm, value)?
    };
    let p = properties(&line, freq_hz)?;
    let (zc_re_ohm, zc_im_ohm) = match p.point.zc_ohm {
        Impedance::Finite(z) => (z.re, z.im),
        Impedance::Open => (f64::INFINITY, 0.0),
    };
    Ok(LineCheck {
        zc_re_ohm,
        zc_im_ohm,
        eps_eff: p.eps_eff,
        velocity_factor: p.velocity_factor,
        velocity_m_per_s: p.phase_velocity_m_per_s,
        velocity_ft_per_s: m_to_ft(p.phase_velocity_m_per_s),
        delay_s_per_m: p.phase_delay_s_per_m,
        // s/ft = s/m · m/ft.
        delay_s_per_ft: p.phase_delay_s_per_m * echoline::units::M_PER_FT,
        wavelength_m: p.wavelength_m,
        wavelength_ft: m_to_ft(p.wavelength_m),
        atten_db_per_m: p.atten_db_per_m,
    })
}

/// `line_check(z0_ohm, value, by_eps_r, freq_hz)`: valid `z0_ohm > 0`,
/// a velocity factor in (0, 1] or εr ≥ 1, `freq_hz ≥ 0`.
#[wasm_bindgen]
pub fn line_check(
    z0_ohm: f64,
    value: f64,
    by_eps_r: bool,
    freq_hz: f64,
) -> core::result::Result<LineCheck, JsError> {
    compute(z0_ohm, value, by_eps_r, freq_hz).map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;
    use echoline::Error;

    #[test]
    fn lossless_line_figures() {
        // Pozar, Microwave Engineering, 4th ed., 2012, §2.1: v = c0/√εr,
        // λ = v/f, delay 1/v.
        let r = compute(75.0, 2.25, true, 100e6).unwrap();
        let v = 299_792_458.0 / 1.5;
        assert!((r.velocity_factor - 1.0 / 1.5).abs() < 1e-12);
        assert!((r.wavelength_m - v / 100e6).abs() < 1e-9);
        assert!((r.delay_s_per_m - 1.0 / v).abs() < 1e-20);
        assert!((r.eps_eff - 2.25).abs() < 1e-9);
        assert_eq!((r.zc_re_ohm, r.zc_im_ohm), (75.0, 0.0));
        assert_eq!(
            compute(50.0, 0.5, true, 1e6),
            Err(Error::OutOfRange("eps_r"))
        );
        assert_eq!(
            compute(50.0, 0.7, false, -1.0),
            Err(Error::Negative("freq_hz"))
        );
    }
}

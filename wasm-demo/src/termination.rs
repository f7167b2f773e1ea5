//! Bindings for the "Termination" section: a load at the end of a line
//! (lossless Z0 + VF, constant RLGC per metre, or a copper coax from its
//! diameters and dielectric) over a frequency range —
//! input impedance, Γ, VSWR, return loss and Smith-chart points
//! (`echoline::network::{cascade, load, reflection}`).
//!
//! Zin from the cascade's reflection form, Γ = (Zin − Zr)/(Zin + Zr),
//! VSWR = (1+|Γ|)/(1−|Γ|), RL = −20·log10|Γ| (Pozar, *Microwave
//! Engineering*, 4th ed., 2012, §2.3). An open stays an open, |Γ| = 1 gives
//! an infinite VSWR and Γ = 0 an infinite return loss (`null` in the JSON,
//! with a flag): never NaN.

use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::line::rlgc::Rlgc;
use echoline::line::LineModel;
use echoline::math::complex::{self, Cx};
use echoline::network::cascade::Cascade;
use echoline::network::load::{Load, Rlc};
use echoline::network::reflection::{mismatch, smith_point};
use echoline::scalar::SIGMA_COPPER_S_PER_M;
use echoline::{Error, Extended, Impedance, Result};
use wasm_bindgen::prelude::*;

use crate::json::Json;

/// Most frequency points of one sweep.
pub const MAX_POINTS: usize = 4001;

/// The line in front of the load.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LineSpec {
    /// Ideal lossless line.
    Lossless {
        /// Z0, Ω.
        z0_ohm: f64,
        /// Velocity factor.
        velocity_factor: f64,
    },
    /// Constant R, L, G, C per metre.
    Rlgc {
        /// Ω/m.
        r_ohm_per_m: f64,
        /// H/m.
        l_h_per_m: f64,
        /// S/m.
        g_s_per_m: f64,
        /// F/m.
        c_f_per_m: f64,
    },
    /// Copper coax, shield wall [`COAX_SHIELD_M`].
    Coax {
        /// Inner conductor diameter d, m.
        inner_diameter_m: f64,
        /// Shield inner diameter D, m.
        outer_diameter_m: f64,
        /// Dielectric εr.
        eps_r: f64,
        /// Dielectric tanδ (causal wideband Debye model fitted at 1 GHz if > 0).
        tan_delta: f64,
    },
}

/// Shield wall of the page's coax, m (0.2 mm; the skin depth in copper is
/// below it above ≈ 110 kHz, so it hardly matters in the page's bands).
pub const COAX_SHIELD_M: f64 = 0.2e-3;

/// The figures at one frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Point {
    /// Frequency, Hz.
    pub freq_hz: f64,
    /// Input impedance.
    pub zin: Impedance<f64>,
    /// Γ at the input for the reference impedance.
    pub gamma: Cx<f64>,
    /// |Γ|.
    pub gamma_mag: f64,
    /// VSWR.
    pub vswr: Extended<f64>,
    /// Return loss, dB.
    pub return_loss_db: Extended<f64>,
}

/// The load from the page's fields: `kind` one of `open`, `short`, `r`,
/// `rx` (R + jX), `series`, `parallel` (R, L, C each used if its flag is set).
#[allow(clippy::too_many_arguments)]
pub fn load_from(
    kind: &str,
    r_ohm: f64,
    x_ohm: f64,
    l_h: f64,
    c_f: f64,
    use_r: bool,
    use_l: bool,
    use_c: bool,
) -> Result<Load<f64>> {
    let rlc = Rlc::new(
        use_r.then_some(r_ohm),
        use_l.then_some(l_h),
        use_c.then_some(c_f),
    );
    let load = match kind {
        "open" => Load::Open,
        "short" => Load::Short,
        "r" => Load::Resistor(r_ohm),
        "rx" => {
            echoline::error::non_negative(r_ohm, "r_ohm")?;
            Load::Fixed(Cx::new(r_ohm, x_ohm))
        }
        "series" => Load::Series(rlc),
        "parallel" => Load::Parallel(rlc),
        _ => return Err(Error::Undefined("load")),
    };
    load.validate()?;
    Ok(load)
}

/// The sweep: `points` frequencies evenly from `f_start_hz` to `f_stop_hz`
/// (both included), the load at the end of `length_m` of the line.
pub fn compute(
    line: LineSpec,
    length_m: f64,
    load: Load<f64>,
    z_ref_ohm: f64,
    f_start_hz: f64,
    f_stop_hz: f64,
    points: usize,
) -> Result<Vec<Point>> {
    let f0 = echoline::error::non_negative(f_start_hz, "f_start_hz")?;
    let f1 = echoline::error::non_negative(f_stop_hz, "f_stop_hz")?;
    if f1 < f0 {
        return Err(Error::OutOfRange("f_stop_hz"));
    }
    if !(1..=MAX_POINTS).contains(&points) {
        return Err(Error::OutOfRange("points"));
    }
    let zr = echoline::error::positive(z_ref_ohm, "z_ref_ohm")?;
    let lossless;
    let rlgc;
    let coax;
    let model: &dyn LineModel<f64> = match line {
        LineSpec::Lossless {
            z0_ohm,
            velocity_factor,
        } => {
            lossless = Lossless::new(z0_ohm, velocity_factor)?;
            &lossless
        }
        LineSpec::Rlgc {
            r_ohm_per_m,
            l_h_per_m,
            g_s_per_m,
            c_f_per_m,
        } => {
            rlgc = Rlgc::constant(r_ohm_per_m, l_h_per_m, g_s_per_m, c_f_per_m)?;
            &rlgc
        }
        LineSpec::Coax {
            inner_diameter_m,
            outer_diameter_m,
            eps_r,
            tan_delta,
        } => {
            let diel = if tan_delta > 0.0 {
                Dielectric::wideband_debye(eps_r, tan_delta, 1e9)?
            } else {
                Dielectric::constant(eps_r, tan_delta)?
            };
            coax = Coax::new(
                inner_diameter_m,
                outer_diameter_m,
                diel,
                SIGMA_COPPER_S_PER_M,
                COAX_SHIELD_M,
            )?;
            &coax
        }
    };
    let mut cascade: Cascade<'_, f64, 1> = Cascade::new();
    cascade.push_line(model, length_m)?;
    let freqs: Vec<f64> = (0..points)
        .map(|i| {
            if points == 1 {
                f0
            } else {
                f0 + (f1 - f0) * i as f64 / (points - 1) as f64
            }
        })
        .collect();
    let mut zin = vec![Impedance::Open; points];
    cascade.input_impedance_sweep(&freqs, &load, &mut zin)?;
    let zr = Cx::new(zr, 0.0);
    freqs
        .iter()
        .zip(zin.iter())
        .map(|(&f, &z)| {
            let s = smith_point(z, zr)?;
            // |Γ| within 8ε of 1 is 1: a lossless open or short (or any
            // reactance) reads |Γ| = 1 − 1e-16 after rounding, which would
            // give a VSWR of 10¹⁶ instead of ∞ (the core already takes up
            // to 1 + 8ε as 1 from above).
            let g = complex::abs(s.gamma);
            let g = if (1.0 - g).abs() <= 8.0 * f64::EPSILON {
                1.0
            } else {
                g
            };
            let m = mismatch(g)?;
            Ok(Point {
                freq_hz: f,
                zin: z,
                gamma: s.gamma,
                gamma_mag: m.gamma_mag,
                vswr: m.vswr,
                return_loss_db: m.return_loss_db,
            })
        })
        .collect()
}

fn ext(x: Extended<f64>) -> (f64, bool) {
    match x {
        Extended::Finite(v) => (v, false),
        Extended::Infinite => (f64::INFINITY, true),
    }
}

/// The sweep as JSON: arrays `freq_hz, zin_re, zin_im, zin_open (0/1),
/// gamma_re, gamma_im, gamma_mag, gamma_deg, vswr, vswr_inf, rl_db, rl_inf`.
pub fn to_json(points: &[Point]) -> String {
    let mut j = Json::new();
    let zre = |p: &Point| p.zin.finite().map_or(f64::INFINITY, |z| z.re);
    let zim = |p: &Point| p.zin.finite().map_or(0.0, |z| z.im);
    j.open("")
        .nums("freq_hz", points.iter().map(|p| p.freq_hz))
        .nums("zin_re", points.iter().map(zre))
        .nums("zin_im", points.iter().map(zim))
        .nums(
            "zin_open",
            points
                .iter()
                .map(|p| f64::from(u8::from(p.zin == Impedance::Open))),
        )
        .nums("gamma_re", points.iter().map(|p| p.gamma.re))
        .nums("gamma_im", points.iter().map(|p| p.gamma.im))
        .nums("gamma_mag", points.iter().map(|p| p.gamma_mag))
        .nums(
            "gamma_deg",
            points
                .iter()
                .map(|p| p.gamma.im.atan2(p.gamma.re).to_degrees()),
        )
        .nums("vswr", points.iter().map(|p| ext(p.vswr).0))
        .nums(
            "vswr_inf",
            points.iter().map(|p| f64::from(u8::from(ext(p.vswr).1))),
        )
        .nums("rl_db", points.iter().map(|p| ext(p.return_loss_db).0))
        .nums(
            "rl_inf",
            points
                .iter()
                .map(|p| f64::from(u8::from(ext(p.return_loss_db).1))),
        )
        .close();
    j.finish()
}

/// `termination(load, r_ohm, x_ohm, l_h, c_f, use_r, use_l, use_c, line,
/// z0_ohm, velocity_factor, r_per_m, l_per_m, g_per_m, c_per_m, inner_d_m,
/// outer_d_m, eps_r, tan_delta, length_m, z_ref_ohm, f_start_hz, f_stop_hz,
/// points)` → JSON (see [`to_json`]); `line` is `lossless`, `rlgc` or `coax`.
#[wasm_bindgen]
#[allow(clippy::too_many_arguments)]
pub fn termination(
    load: &str,
    r_ohm: f64,
    x_ohm: f64,
    l_h: f64,
    c_f: f64,
    use_r: bool,
    use_l: bool,
    use_c: bool,
    line: &str,
    z0_ohm: f64,
    velocity_factor: f64,
    r_ohm_per_m: f64,
    l_h_per_m: f64,
    g_s_per_m: f64,
    c_f_per_m: f64,
    inner_d_m: f64,
    outer_d_m: f64,
    eps_r: f64,
    tan_delta: f64,
    length_m: f64,
    z_ref_ohm: f64,
    f_start_hz: f64,
    f_stop_hz: f64,
    points: usize,
) -> core::result::Result<String, JsError> {
    let run = || -> Result<String> {
        let load = load_from(load, r_ohm, x_ohm, l_h, c_f, use_r, use_l, use_c)?;
        let spec = match line {
            "lossless" => LineSpec::Lossless {
                z0_ohm,
                velocity_factor,
            },
            "rlgc" => LineSpec::Rlgc {
                r_ohm_per_m,
                l_h_per_m,
                g_s_per_m,
                c_f_per_m,
            },
            "coax" => LineSpec::Coax {
                inner_diameter_m: inner_d_m,
                outer_diameter_m: outer_d_m,
                eps_r,
                tan_delta,
            },
            _ => return Err(Error::Undefined("line")),
        };
        let pts = compute(
            spec, length_m, load, z_ref_ohm, f_start_hz, f_stop_hz, points,
        )?;
        Ok(to_json(&pts))
    };
    run().map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;

    const C0: f64 = 299_792_458.0;
    const LINE: LineSpec = LineSpec::Lossless {
        z0_ohm: 50.0,
        velocity_factor: 1.0,
    };

    #[test]
    fn quarter_wave_transformer_and_mismatch() {
        // Pozar, Microwave Engineering, 4th ed., 2012, §2.3–2.5: a quarter-wave
        // line inverts the load, Zin = Z0²/ZL = 25 Ω for ZL = 100 Ω, Z0 = 50 Ω;
        // with Zr = 50 Ω, Γ = (25 − 50)/(25 + 50) = −1/3, VSWR = 2,
        // RL = −20·log10(1/3) = 9.5424 dB.
        let f = 100e6;
        let quarter = C0 / f / 4.0;
        let p = compute(LINE, quarter, Load::Resistor(100.0), 50.0, f, f, 1).unwrap();
        let z = p[0].zin.finite().unwrap();
        assert!((z.re - 25.0).abs() < 1e-6 && z.im.abs() < 1e-6, "{z}");
        assert!((p[0].gamma.re + 1.0 / 3.0).abs() < 1e-9);
        let vswr = p[0].vswr.finite().unwrap();
        assert!((vswr - 2.0).abs() < 1e-9, "{vswr}");
        let rl = p[0].return_loss_db.finite().unwrap();
        assert!((rl - 20.0 * 3f64.log10()).abs() < 1e-9, "{rl}");
    }

    #[test]
    fn open_and_short_are_words_not_nan() {
        // Open and short at the end of a lossless line: |Γ| = 1 at every
        // frequency, VSWR infinite (Pozar 2012 §2.3); at DC the open stays open.
        let p = compute(LINE, 3.0, Load::Open, 50.0, 0.0, 1e9, 11).unwrap();
        assert_eq!(p[0].zin, Impedance::Open);
        for q in &p {
            assert!((q.gamma_mag - 1.0).abs() < 1e-9);
            assert_eq!(q.vswr, Extended::Infinite);
        }
        let json = to_json(&p);
        assert!(!json.contains("NaN") && json.contains("\"vswr_inf\":[1,1"));
        // Matched: Γ = 0, return loss infinite.
        let m = compute(LINE, 3.0, Load::Resistor(50.0), 50.0, 1e6, 1e6, 1).unwrap();
        assert_eq!(m[0].return_loss_db, Extended::Infinite);
        assert_eq!(
            load_from("series", 0.0, 0.0, 0.0, -1e-12, false, false, true),
            Err(Error::Negative("c_f"))
        );
        assert_eq!(
            compute(LINE, 3.0, Load::Open, 50.0, 2e6, 1e6, 3),
            Err(Error::OutOfRange("f_stop_hz"))
        );
    }

    #[test]
    fn series_rlc_resonance_and_rlgc_line() {
        // Series RLC at f0 = 1/(2π√(LC)) is R alone (circuit theory; Pozar
        // 2012 §6.1); through zero length Zin = ZL.
        let (l, c) = (1e-6f64, 1e-9f64);
        let f0 = 1.0 / (2.0 * core::f64::consts::PI * (l * c).sqrt());
        let load = load_from("series", 20.0, 0.0, l, c, true, true, true).unwrap();
        let p = compute(LINE, 0.0, load, 50.0, f0, f0, 1).unwrap();
        let z = p[0].zin.finite().unwrap();
        assert!((z.re - 20.0).abs() < 1e-6 && z.im.abs() < 1e-6, "{z}");
        // A lossless RLGC line with √(L/C) = 50 Ω matched by 50 Ω: Γ = 0.
        let rlgc = LineSpec::Rlgc {
            r_ohm_per_m: 0.0,
            l_h_per_m: 250e-9,
            g_s_per_m: 0.0,
            c_f_per_m: 100e-12,
        };
        let p = compute(rlgc, 10.0, Load::Resistor(50.0), 50.0, 1e6, 1e8, 5).unwrap();
        for q in &p {
            assert!(q.gamma_mag < 1e-9, "{}", q.gamma_mag);
        }
    }

    #[test]
    fn coax_matched_by_its_closed_form_impedance() {
        // Z0 = η0/(2π√εr)·ln(D/d) for a TEM coax (Pozar, Microwave
        // Engineering, 4th ed., 2012, §2.2): a load of that value on 5 m of
        // low-loss coax at 100 MHz reflects little (loss makes Zc slightly
        // complex and dispersive).
        let (d, dd, er) = (0.91e-3f64, 2.95e-3f64, 2.25f64);
        let z0 = 376.730_313_412 / (2.0 * core::f64::consts::PI * er.sqrt()) * (dd / d).ln();
        let line = LineSpec::Coax {
            inner_diameter_m: d,
            outer_diameter_m: dd,
            eps_r: er,
            tan_delta: 2e-4,
        };
        let p = compute(line, 5.0, Load::Resistor(z0), z0, 100e6, 100e6, 1).unwrap();
        assert!(p[0].gamma_mag < 0.01, "{}", p[0].gamma_mag);
        let short = compute(line, 5.0, Load::Short, z0, 100e6, 100e6, 1).unwrap();
        // A lossy line returns less than all: |Γ| = e^(−2αl) < 1; a coax of
        // this size loses about 0.1–0.2 dB/m at 100 MHz (value from memory),
        // so 5 m there and back leaves |Γ| between 0.8 and 1.
        assert!(
            short[0].gamma_mag < 1.0 && short[0].gamma_mag > 0.8,
            "{:?}",
            short[0]
        );
    }
}

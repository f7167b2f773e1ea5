//! Bindings for the "Line design" section: a line geometry (coax, microstrip,
//! stripline, coplanar waveguide, two-wire, twisted pair, rectangular
//! waveguide), datasheet figures or an ideal line → Zc, εeff, velocity,
//! delay, loss, cutoff and validity warnings in words (`echoline::line`),
//! and one dimension solved for a target impedance (`line::synth`).

use echoline::line::coax::Coax;
use echoline::line::conductor::Metal;
use echoline::line::cpw::{Cpw, Substrate};
use echoline::line::datasheet::DatasheetCable;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::line::microstrip::Microstrip;
use echoline::line::stripline::Stripline;
use echoline::line::two_wire::TwoWire;
use echoline::line::waveguide::Waveguide;
use echoline::line::{properties, synth, LineModel};
use echoline::units::{m_to_ft, M_PER_FT};
use echoline::{Error, Impedance, Result};
use wasm_bindgen::prelude::*;

use crate::json::Json;

/// Metres per mil (a thousandth of an inch, exact).
const M_PER_MIL: f64 = 25.4e-6;

/// What the section asks for; lengths in metres. Only the fields of the
/// chosen `geometry` are used.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Design<'a> {
    /// `coax`, `microstrip`, `stripline`, `cpw`, `two-wire`, `twisted-pair`,
    /// `waveguide`, `datasheet` or `ideal`.
    pub geometry: &'a str,
    /// Coax inner / wire diameter, m.
    pub d_inner_m: f64,
    /// Coax outer conductor inner diameter, m.
    pub d_outer_m: f64,
    /// Coax shield wall, m.
    pub shield_m: f64,
    /// Two-wire centre spacing, m.
    pub spacing_m: f64,
    /// Twisted-pair insulation wall, m.
    pub insulation_m: f64,
    /// Twists per metre.
    pub twists_per_m: f64,
    /// Strip width (microstrip, stripline), m.
    pub width_m: f64,
    /// Substrate height (microstrip, cpw) or ground spacing (stripline), m.
    pub height_m: f64,
    /// Metal thickness, m.
    pub thickness_m: f64,
    /// CPW centre strip, m.
    pub strip_m: f64,
    /// CPW slot, m.
    pub slot_m: f64,
    /// CPW substrate: `thick`, `finite`, `backed`.
    pub substrate: &'a str,
    /// Waveguide broad and narrow walls, m.
    pub wg_a_m: f64,
    /// Waveguide narrow wall, m.
    pub wg_b_m: f64,
    /// Datasheet / ideal: impedance, Ω.
    pub z0_ohm: f64,
    /// Datasheet / ideal: velocity factor.
    pub velocity_factor: f64,
    /// Datasheet attenuation figures: frequency, dB/100 m (second figure
    /// ignored when its frequency is 0).
    pub att: [(f64, f64); 2],
    /// Relative permittivity.
    pub eps_r: f64,
    /// Loss tangent.
    pub tan_delta: f64,
    /// `debye` (causal, fitted at the frequency) or `constant`.
    pub dielectric: &'a str,
    /// Conductivity, S/m; 0 for perfect conductors, NaN for copper.
    pub conductivity_s_per_m: f64,
    /// Frequency of the figures, Hz.
    pub freq_hz: f64,
    /// Target impedance for the solved dimension, Ω.
    pub target_ohm: f64,
}

fn dielectric(d: &Design<'_>) -> Result<Dielectric<f64>> {
    if d.dielectric == "debye" && d.tan_delta > 0.0 {
        let fit = if d.freq_hz > 0.0 { d.freq_hz } else { 1e9 };
        Dielectric::wideband_debye(d.eps_r, d.tan_delta, fit)
    } else {
        Dielectric::constant(d.eps_r, d.tan_delta)
    }
}

fn metal(d: &Design<'_>) -> Result<Option<Metal<f64>>> {
    if d.conductivity_s_per_m.is_nan() {
        Ok(Some(Metal::copper()))
    } else if d.conductivity_s_per_m == 0.0 {
        Ok(None)
    } else {
        Metal::new(d.conductivity_s_per_m).map(Some)
    }
}

fn substrate(d: &Design<'_>) -> Result<Substrate<f64>> {
    match d.substrate {
        "thick" => Ok(Substrate::Thick),
        "finite" => Ok(Substrate::Finite {
            height_m: d.height_m,
        }),
        "backed" => Ok(Substrate::ConductorBacked {
            height_m: d.height_m,
        }),
        _ => Err(Error::OutOfRange("substrate")),
    }
}

/// The model of the chosen geometry and the words for its cutoff.
pub(crate) type Model = (Box<dyn LineModel<f64>>, &'static str, Option<f64>);

pub(crate) fn model(d: &Design<'_>) -> Result<Model> {
    // Datasheet and ideal lines have no materials to check.
    match d.geometry {
        "datasheet" => {
            let mut b = DatasheetCable::builder(d.z0_ohm, d.velocity_factor)
                .attenuation_db_per_100m(d.att[0].0, d.att[0].1);
            if d.att[1].0 > 0.0 {
                b = b.attenuation_db_per_100m(d.att[1].0, d.att[1].1);
            }
            return Ok((Box::new(b.build()?), "", None));
        }
        "ideal" => {
            let l = Lossless::new(d.z0_ohm, d.velocity_factor)?;
            return Ok((Box::new(l), "", None));
        }
        _ => {}
    }
    let diel = dielectric(d)?;
    let m = metal(d)?;
    Ok(match d.geometry {
        "coax" => {
            // A coax needs real walls: σ = 0 is refused by the model.
            let sigma = m.map(|x| x.conductivity_s_per_m()).unwrap_or(0.0);
            let c = Coax::new(d.d_inner_m, d.d_outer_m, diel, sigma, d.shield_m)?;
            let z = c.z0_closed_form_ohm(d.freq_hz)?;
            (Box::new(c), "TE11 mode", Some(z))
        }
        "microstrip" => (
            Box::new(Microstrip::new(
                d.width_m,
                d.height_m,
                d.thickness_m,
                diel,
                m,
            )?),
            "first surface-wave / higher-mode onset",
            None,
        ),
        "stripline" => (
            Box::new(Stripline::new(
                d.width_m,
                d.height_m,
                d.thickness_m,
                diel,
                m,
            )?),
            "first higher-order mode",
            None,
        ),
        "cpw" => (
            Box::new(Cpw::new(
                d.strip_m,
                d.slot_m,
                d.thickness_m,
                substrate(d)?,
                diel,
                m,
            )?),
            "first higher-order / substrate mode",
            None,
        ),
        "two-wire" => (
            Box::new(TwoWire::new(d.d_inner_m, d.spacing_m, diel, m)?),
            "",
            None,
        ),
        "twisted-pair" => (
            Box::new(TwoWire::twisted_pair(
                d.d_inner_m,
                d.insulation_m,
                diel,
                d.twists_per_m,
                m,
            )?),
            "",
            None,
        ),
        "waveguide" => (
            Box::new(Waveguide::new(d.wg_a_m, d.wg_b_m, diel, m)?),
            "TE10 mode, below it nothing propagates",
            None,
        ),
        _ => return Err(Error::OutOfRange("geometry")),
    })
}

/// The dimension solved for the target impedance: (what, value in m), or
/// `None` for a geometry without one.
fn solve(d: &Design<'_>) -> Option<(&'static str, Result<f64>)> {
    let solvable = [
        "coax",
        "microstrip",
        "stripline",
        "cpw",
        "two-wire",
        "twisted-pair",
    ];
    if !solvable.contains(&d.geometry) {
        return None;
    }
    let diel = match dielectric(d) {
        Ok(x) => x,
        Err(e) => return Some(("", Err(e))),
    };
    let (t, f) = (d.target_ohm, d.freq_hz);
    Some(match d.geometry {
        "coax" => (
            "d_inner",
            synth::coax_inner_diameter_m(t, f, d.d_outer_m, diel),
        ),
        "microstrip" => (
            "width",
            synth::microstrip_width_m(t, f, d.height_m, d.thickness_m, diel),
        ),
        "stripline" => (
            "width",
            synth::stripline_width_m(t, f, d.height_m, d.thickness_m, diel),
        ),
        "cpw" => (
            "slot",
            substrate(d).and_then(|s| synth::cpw_slot_width_m(t, f, d.strip_m, s, diel)),
        ),
        "two-wire" => (
            "spacing",
            synth::two_wire_spacing_m(t, f, d.d_inner_m, diel),
        ),
        "twisted-pair" => (
            "insulation",
            synth::twisted_pair_insulation_m(t, f, d.d_inner_m, diel, d.twists_per_m),
        ),
        _ => return None,
    })
}

/// The figures as JSON: `{zc_re_ohm, zc_im_ohm, zc_open, eps_eff,
/// velocity_factor, velocity_m_per_s, velocity_ft_per_s, delay_s_per_m,
/// delay_s_per_ft, group_delay_s_per_m, atten_db_per_m, atten_db_per_100m,
/// atten_db_per_100ft, atten_conductor_db_per_m, atten_dielectric_db_per_m,
/// wavelength_m, wavelength_ft, cutoff_hz (null if none), cutoff_what,
/// warnings: [words], solve: {what, m, mm, mil} | {what, error} | null}`.
pub fn compute(d: &Design<'_>) -> Result<String> {
    let (line, cutoff_what, closed) = model(d)?;
    let p = properties(line.as_ref(), d.freq_hz)?;
    let (re, im, open) = match p.point.zc_ohm {
        Impedance::Finite(z) => (z.re, z.im, false),
        Impedance::Open => (f64::INFINITY, 0.0, true),
    };
    let mut j = Json::new();
    j.open("")
        .num("zc_re_ohm", re)
        .num("zc_im_ohm", im)
        .bool("zc_open", open)
        .num("zc_closed_form_ohm", closed.unwrap_or(f64::NAN))
        .num("eps_eff", p.eps_eff)
        .num("velocity_factor", p.velocity_factor)
        .num("velocity_m_per_s", p.phase_velocity_m_per_s)
        .num("velocity_ft_per_s", m_to_ft(p.phase_velocity_m_per_s))
        .num("delay_s_per_m", p.phase_delay_s_per_m)
        .num("delay_s_per_ft", p.phase_delay_s_per_m * M_PER_FT)
        .num("group_delay_s_per_m", p.group_delay_s_per_m)
        .num("group_delay_s_per_ft", p.group_delay_s_per_m * M_PER_FT)
        .num("atten_db_per_m", p.atten_db_per_m)
        .num("atten_db_per_100m", p.atten_db_per_m * 100.0)
        .num("atten_db_per_100ft", p.atten_db_per_m * 100.0 * M_PER_FT)
        .num("atten_conductor_db_per_m", p.atten_conductor_db_per_m)
        .num("atten_dielectric_db_per_m", p.atten_dielectric_db_per_m)
        .num("wavelength_m", p.wavelength_m)
        .num("wavelength_ft", m_to_ft(p.wavelength_m));
    match line.cutoff_hz() {
        Some(f) => j.num("cutoff_hz", f),
        None => j.num("cutoff_hz", f64::NAN),
    };
    j.str("cutoff_what", cutoff_what)
        .strs("warnings", p.point.warnings.describe());
    match solve(d) {
        None => {
            j.str("solve", "");
        }
        Some((what, Ok(m))) => {
            j.open("solve")
                .str("what", what)
                .num("m", m)
                .num("mm", m * 1e3)
                .num("mil", m / M_PER_MIL)
                .num("ft", m_to_ft(m))
                .close();
        }
        Some((what, Err(e))) => {
            j.open("solve")
                .str("what", what)
                .str("error", &e.to_string())
                .close();
        }
    }
    j.close();
    Ok(j.finish())
}

/// Entries of the `numbers` argument of [`line_design`], in order.
pub const NUMBERS: [&str; 24] = [
    "d_inner_m",
    "d_outer_m",
    "shield_m",
    "spacing_m",
    "insulation_m",
    "twists_per_m",
    "width_m",
    "height_m",
    "thickness_m",
    "strip_m",
    "slot_m",
    "wg_a_m",
    "wg_b_m",
    "z0_ohm",
    "velocity_factor",
    "att1_freq_hz",
    "att1_db_per_100m",
    "att2_freq_hz",
    "att2_db_per_100m",
    "eps_r",
    "tan_delta",
    "conductivity_s_per_m",
    "freq_hz",
    "target_ohm",
];

/// A [`Design`] from the numbers in the order of [`NUMBERS`].
pub fn design<'a>(
    geometry: &'a str,
    substrate: &'a str,
    dielectric: &'a str,
    n: &[f64],
) -> Result<Design<'a>> {
    let [d_inner_m, d_outer_m, shield_m, spacing_m, insulation_m, twists_per_m, width_m, height_m, thickness_m, strip_m, slot_m, wg_a_m, wg_b_m, z0_ohm, velocity_factor, f1, a1, f2, a2, eps_r, tan_delta, conductivity_s_per_m, freq_hz, target_ohm] =
        <[f64; 24]>::try_from(n).map_err(|_| Error::LengthMismatch("numbers"))?;
    Ok(Design {
        geometry,
        d_inner_m,
        d_outer_m,
        shield_m,
        spacing_m,
        insulation_m,
        twists_per_m,
        width_m,
        height_m,
        thickness_m,
        strip_m,
        slot_m,
        substrate,
        wg_a_m,
        wg_b_m,
        z0_ohm,
        velocity_factor,
        att: [(f1, a1), (f2, a2)],
        eps_r,
        tan_delta,
        dielectric,
        conductivity_s_per_m,
        freq_hz,
        target_ohm,
    })
}

/// `line_design(geometry, substrate, dielectric, numbers)` → JSON (see
/// [`compute`]); `numbers` in the order of [`NUMBERS`], lengths in metres.
#[wasm_bindgen]
pub fn line_design(
    geometry: &str,
    substrate: &str,
    dielectric: &str,
    numbers: &[f64],
) -> core::result::Result<String, JsError> {
    design(geometry, substrate, dielectric, numbers)
        .and_then(|d| compute(&d))
        .map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;

    const ETA0: f64 = 376.730_313_668; // μ0·c0, Ω

    fn base(geometry: &'static str) -> Design<'static> {
        Design {
            geometry,
            d_inner_m: 1e-3,
            d_outer_m: 3.5e-3,
            shield_m: 0.2e-3,
            spacing_m: 2e-3,
            insulation_m: 0.2e-3,
            twists_per_m: 40.0,
            width_m: 1e-3,
            height_m: 1e-3,
            thickness_m: 0.0,
            strip_m: 1e-3,
            slot_m: 0.5e-3,
            substrate: "thick",
            wg_a_m: 22.86e-3,
            wg_b_m: 10.16e-3,
            z0_ohm: 50.0,
            velocity_factor: 0.66,
            att: [(100e6, 6.6), (1e9, 22.0)],
            eps_r: 1.0,
            tan_delta: 0.0,
            dielectric: "debye",
            conductivity_s_per_m: 0.0,
            freq_hz: 1e6,
            target_ohm: 50.0,
        }
    }

    fn num(json: &str, key: &str) -> f64 {
        let at = json.find(&format!("\"{key}\":")).unwrap() + key.len() + 3;
        let end = json[at..].find([',', '}']).unwrap() + at;
        json[at..end].parse().unwrap()
    }

    #[test]
    fn reference_values_of_the_geometries() {
        // Microstrip εr 9.8, W/h 1, t 0: 49.289 Ω (Hammerstad & Jensen 1980;
        // reference notes methods.md §2 [calc]); 1 MHz is the static limit.
        let mut m = base("microstrip");
        m.eps_r = 9.8;
        let j = compute(&m).unwrap();
        assert!((num(&j, "zc_re_ohm") - 49.289).abs() < 5e-3, "{j}");
        // Two-wire in air, D/d 2: Z = (η0/π)·arcosh(2) = 157.93 Ω (reference
        // notes methods.md §5 [calc]; the arcosh form is common practice).
        let j = compute(&base("two-wire")).unwrap();
        let want = ETA0 / std::f64::consts::PI * 2f64.acosh();
        assert!((num(&j, "zc_re_ohm") - want).abs() < 1e-6 * want, "{j}");
        assert!((want - 157.93).abs() < 5e-3);
        // 7 mm airline, d 3.04 mm (IEEE Std 287, value from memory):
        // (η0/2π)·ln(7/3.04) = 50.0085 Ω (methods.md §1 [calc]), closed form.
        let mut c = base("coax");
        c.d_inner_m = 3.04e-3;
        c.d_outer_m = 7e-3;
        c.conductivity_s_per_m = 5.8e7;
        c.freq_hz = 10e9;
        let j = compute(&c).unwrap();
        assert!(
            (num(&j, "zc_closed_form_ohm") - 50.0085).abs() < 5e-5,
            "{j}"
        );
        // With copper walls at 10 GHz the internal inductance adds ≈ δ/2·(1/a +
        // 1/b)/ln(b/a) ≈ 4·10⁻⁴ relative at most (internal inductance ωLi = R at
        // high frequency; common practice, no single source).
        assert!((num(&j, "zc_re_ohm") / 50.0085 - 1.0).abs() < 4e-4, "{j}");
        // TE11 cutoff: approximately 19.01 GHz (IEEE Std 287, value from
        // memory), exact/approx − 1 = 0.0207 at b/a 2.3 (methods.md §1 [calc]).
        assert!(
            (num(&j, "cutoff_hz") / 1e9 - 19.01 * 1.0207).abs() < 0.02,
            "{j}"
        );
        // Stripline W/b 1, t 0, in air: Cohn 1954 exact, Z·√εr = 65.354 Ω
        // (methods.md §3 [calc]).
        let mut st = base("stripline");
        st.width_m = 1e-3;
        st.height_m = 1e-3;
        let j = compute(&st).unwrap();
        assert!((num(&j, "zc_re_ohm") - 65.354).abs() < 5e-3, "{j}");
        // CPW on a thick substrate, k = S/(S + 2W) = 0.5, in air: 120.568 Ω with
        // 30π for η0/4, i.e. 120.568·η0/(120π) (Wen 1969; methods.md §4 [calc]).
        let j = compute(&base("cpw")).unwrap();
        let want = 120.568 * ETA0 / (120.0 * std::f64::consts::PI);
        assert!((num(&j, "zc_re_ohm") - want).abs() < 1e-3 * want, "{j}");
        // WR-90 (22.86 mm broad wall) TE10 cutoff c0/(2a) = 6.557 GHz
        // (methods.md §5, Pozar, Microwave Engineering, value from memory).
        let j = compute(&base("waveguide")).unwrap();
        assert!((num(&j, "cutoff_hz") - 299_792_458.0 / (2.0 * 22.86e-3)).abs() < 1e3);
        // Below cutoff the warning is in words.
        assert!(j.contains("evanescent"), "{j}");
    }

    #[test]
    fn solved_dimension_and_unreachable() {
        // 50 Ω microstrip on εr 9.8: W/h 0.9711 (methods.md §2 [calc]).
        let mut m = base("microstrip");
        m.eps_r = 9.8;
        m.freq_hz = 0.0;
        let j = compute(&m).unwrap();
        assert!((num(&j, "mm") - 0.9711).abs() < 5e-4, "{j}");
        // Coax inside D = 3.5 mm: d = D·exp(−2π·Z/η0) in air, the inverse of
        // Z0 = (η0/2π)·ln(D/d) (methods.md §1).
        let mut c = base("coax");
        c.conductivity_s_per_m = 5.8e7;
        let j = compute(&c).unwrap();
        let want = 3.5e-3 * (-2.0 * std::f64::consts::PI * 50.0 / ETA0).exp();
        assert!((num(&j, "m") - want).abs() < 1e-12, "{j}");
        // 10 kΩ coax needs D/d beyond 10⁴: unreachable, shown in place.
        c.target_ohm = 10_000.0;
        let j = compute(&c).unwrap();
        assert!(j.contains("\"error\":\"target_z0_ohm"), "{j}");
        assert!(j.contains("\"zc_re_ohm\""));
    }

    #[test]
    fn errors_name_the_parameter() {
        let mut c = base("coax");
        c.conductivity_s_per_m = 5.8e7;
        c.d_inner_m = 4e-3;
        assert_eq!(compute(&c), Err(Error::OutOfRange("inner_diameter_m")));
        assert_eq!(compute(&base("spiral")), Err(Error::OutOfRange("geometry")));
        assert_eq!(
            design("coax", "thick", "debye", &[0.0; 3]),
            Err(Error::LengthMismatch("numbers"))
        );
        // A perfect-conductor coax is refused by the model (σ > 0 needed).
        assert!(compute(&base("coax")).is_err());
        // Datasheet and ideal lines: figures from Z0 and VF.
        let j = compute(&base("ideal")).unwrap();
        assert!((num(&j, "velocity_factor") - 0.66).abs() < 1e-12);
        let mut ds = base("datasheet");
        ds.freq_hz = 100e6;
        let j = compute(&ds).unwrap();
        // The datasheet figure is reproduced at its own frequency.
        assert!((num(&j, "atten_db_per_100m") - 6.6).abs() < 0.05, "{j}");
    }
}

//! Line-model constructors and evaluation with arbitrary floats (NaN, ±∞,
//! subnormals, huge and tiny values): each call returns a result or a typed
//! error, never panics, and a valid result holds no NaN.
#![no_main]

use echoline::line::coax::Coax;
use echoline::line::conductor::Metal;
use echoline::line::cpw::{Cpw, Substrate};
use echoline::line::datasheet::DatasheetCable;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::line::microstrip::Microstrip;
use echoline::line::rlgc::Rlgc;
use echoline::line::stripline::Stripline;
use echoline::line::synth;
use echoline::line::two_wire::TwoWire;
use echoline::line::waveguide::Waveguide;
use echoline::line::{properties, LineModel, LinePoint};
use echoline::Impedance;
use libfuzzer_sys::fuzz_target;

mod common;
use common::{no_nan, Floats};

fn check_point(p: &LinePoint<f64>) {
    assert!(!p.gamma_per_m.re.is_nan(), "NaN alpha: {p:?}");
    no_nan(p.gamma_per_m.im, "beta");
    assert!(p.gamma_per_m.re >= 0.0, "negative attenuation: {p:?}");
    if let Impedance::Finite(z) = p.zc_ohm {
        no_nan(z.re, "zc.re");
        no_nan(z.im, "zc.im");
    }
}

fn probe<M: LineModel<f64>>(m: &M, f: f64) {
    if let Ok(p) = m.at(f) {
        check_point(&p);
    }
    if let Ok(p) = properties(m, f) {
        no_nan(p.velocity_factor, "velocity_factor");
        no_nan(p.atten_db_per_m, "atten_db_per_m");
    }
}

fuzz_target!(|data: &[u8]| {
    let mut x = Floats::new(data);
    let which = x.byte();
    let f = x.f64();
    match which % 12 {
        0 => {
            if let Ok(l) = Lossless::new(x.f64(), x.f64()) {
                probe(&l, f);
            }
            if let Ok(l) = Lossless::new(x.f32(), x.f32()) {
                let _ = l.at(x.f32());
            }
        }
        1 => {
            if let Ok(l) = Rlgc::constant(x.f64(), x.f64(), x.f64(), x.f64()) {
                probe(&l, f);
            }
        }
        2 => {
            let d = match x.byte() % 2 {
                0 => Dielectric::constant(x.f64(), x.f64()),
                _ => Dielectric::wideband_debye(x.f64(), x.f64(), x.f64()),
            };
            if let Ok(d) = d {
                if let Ok(c) = Coax::new(x.f64(), x.f64(), d, x.f64(), x.f64()) {
                    probe(&c, f);
                }
            }
        }
        4..=10 => {
            // Geometry models (issue 4): arbitrary sizes, dielectric and metal.
            let d = match x.byte() % 2 {
                0 => Dielectric::constant(x.f64(), x.f64()),
                _ => Dielectric::wideband_debye(x.f64(), x.f64(), x.f64()),
            };
            let Ok(d) = d else { return };
            let metal = Metal::new(x.f64()).ok();
            let (a, b, c) = (x.f64(), x.f64(), x.f64());
            match which % 12 {
                4 => {
                    if let Ok(m) = Microstrip::new(a, b, c, d, metal) {
                        if let Ok(m) = m.with_roughness(x.f64()) {
                            probe(&m, f);
                        }
                    }
                }
                5 => {
                    if let Ok(s) = Stripline::new(a, b, c, d, metal) {
                        probe(&s, f);
                    }
                }
                6 => {
                    let sub = match x.byte() % 3 {
                        0 => Substrate::Thick,
                        1 => Substrate::Finite { height_m: x.f64() },
                        _ => Substrate::ConductorBacked { height_m: x.f64() },
                    };
                    if let Ok(cpw) = Cpw::new(a, b, c, sub, d, metal) {
                        probe(&cpw, f);
                    }
                }
                7 => {
                    if let Ok(w) = TwoWire::new(a, b, d, metal) {
                        probe(&w, f);
                    }
                    if let Ok(w) = TwoWire::twisted_pair(a, b, d, c, metal) {
                        probe(&w, f);
                    }
                }
                8 => {
                    if let Ok(g) = Waveguide::new(a, b, d, metal) {
                        probe(&g, f);
                    }
                }
                9 => {
                    let cable = DatasheetCable::builder(a, b)
                        .attenuation_db_per_m(c, x.f64())
                        .attenuation_db_per_m(x.f64(), x.f64())
                        .build();
                    if let Ok(cable) = cable {
                        probe(&cable, f);
                    }
                }
                _ => {
                    let _ = synth::microstrip_width_m(a, f, b, c, d);
                    let _ = synth::stripline_width_m(a, f, b, c, d);
                    let _ = synth::cpw_slot_width_m(a, f, b, Substrate::Thick, d);
                    let _ = synth::coax_inner_diameter_m(a, f, b, d);
                    let _ = synth::two_wire_spacing_m(a, f, b, d);
                    let _ = synth::twisted_pair_insulation_m(a, f, b, d, c);
                }
            }
        }
        _ => {
            let d = Dielectric::<f32>::wideband_debye(x.f32(), x.f32(), x.f32());
            if let Ok(d) = d {
                if let Ok(c) = Coax::new(x.f32(), x.f32(), d, x.f32(), x.f32()) {
                    let _ = c.at(x.f32());
                }
            }
        }
    }
});

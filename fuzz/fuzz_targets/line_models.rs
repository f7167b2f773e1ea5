//! Line-model constructors and evaluation with arbitrary floats (NaN, ±∞,
//! subnormals, huge and tiny values): each call returns a result or a typed
//! error, never panics, and a valid result holds no NaN.
#![no_main]

use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::line::rlgc::Rlgc;
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
    match which % 4 {
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

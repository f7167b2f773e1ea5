//! Line-model constructors and evaluation with arbitrary floats: each call must
//! return a result or a typed error, never panic, and a valid result holds no NaN.
#![no_main]

use echoline::line::{lossless::Lossless, properties};
use libfuzzer_sys::fuzz_target;

mod common;
use common::{no_nan, Floats};

fuzz_target!(|data: &[u8]| {
    let mut f = Floats::new(data);
    let (z0, vf, freq) = (f.f64(), f.f64(), f.f64());
    if let Ok(line) = Lossless::new(z0, vf) {
        if let Ok(p) = properties(&line, freq) {
            no_nan(p.velocity_factor, "velocity_factor");
            no_nan(p.group_velocity_m_per_s, "group_velocity");
        }
    }
    let (z0, vf, freq) = (f.f32(), f.f32(), f.f32());
    if let Ok(line) = Lossless::new(z0, vf) {
        if let Ok(p) = properties(&line, freq) {
            no_nan(p.velocity_factor as f64, "velocity_factor f32");
        }
    }
});

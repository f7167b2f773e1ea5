//! Trace analysis of arbitrary samples (f32 volts and i16 ADC codes) with
//! arbitrary settings: a result or a typed error, no panic, and every event
//! of a valid result has finite, ordered distances.
#![no_main]

use echoline::tdr::{AdcCodes, DetectSettings, TimeZero, Trace, TraceSetup};
use echoline::timing::VelocityRange;
use libfuzzer_sys::fuzz_target;

mod common;
use common::Floats;

fn check<const N: usize>(a: &echoline::tdr::Analysis<f32, N>) {
    for e in a.events.iter() {
        let d = e.distance;
        assert!(
            d.distance_m.is_finite() && d.lo_m.is_finite() && d.hi_m.is_finite(),
            "{e:?}"
        );
        assert!(d.lo_m <= d.distance_m && d.distance_m <= d.hi_m, "{d:?}");
        assert!(!e.rho.is_nan(), "NaN rho: {e:?}");
    }
}

fuzz_target!(|data: &[u8]| {
    let mut x = Floats::new(data);
    let mode = x.byte();
    let dt = if mode & 1 == 0 { 1e-10 } else { x.f32() };
    let vf = if mode & 2 == 0 { 0.66 } else { x.f32() };
    let Ok(v) = VelocityRange::from_factor(vf, 0.02) else {
        return;
    };
    let mut setup = TraceSetup::measured(dt, 50.0, v);
    if mode & 4 != 0 {
        setup.time_zero = TimeZero::AtIndex(x.f32());
    }
    if mode & 8 != 0 {
        setup.incident_v = Some(x.f32());
    }
    let mut settings = DetectSettings::default();
    if mode & 16 != 0 {
        settings.k_sigma = x.f32();
        settings.min_rho = x.f32();
    }
    let rest = x.rest();
    if mode & 32 == 0 {
        let samples: Vec<f32> = rest
            .chunks_exact(4)
            .map(|c| f32::from_le_bytes([c[0], c[1], c[2], c[3]]))
            .collect();
        if let Ok(t) = Trace::new(&samples[..], setup) {
            if let Ok(a) = t.analyse::<8>(&settings) {
                check(&a);
            }
        }
    } else {
        let codes: Vec<i16> = rest
            .chunks_exact(2)
            .map(|c| i16::from_le_bytes([c[0], c[1]]))
            .collect();
        if let Ok(c) = AdcCodes::new(&codes[..], 1e-3f32, 0.0) {
            if let Ok(t) = Trace::new(&c, setup) {
                if let Ok(a) = t.analyse::<4>(&settings) {
                    check(&a);
                }
            }
        }
    }
});

//! The quantity parser with arbitrary text and every expected unit: a value or
//! a typed error, never a panic, never a non-finite value.
#![no_main]

use echoline::units::{parse_quantity, Unit};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Ok(text) = core::str::from_utf8(data) {
        for unit in Unit::ALL {
            if let Ok(v) = parse_quantity::<f64>(text, unit) {
                assert!(v.is_finite(), "non-finite value from {text:?}");
            }
            if let Ok(v) = parse_quantity::<f32>(text, unit) {
                assert!(v.is_finite(), "non-finite f32 value from {text:?}");
            }
        }
    }
});

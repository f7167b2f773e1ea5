//! The firmware path: what an instrument would run, written once over the
//! scalar. Compiled into the Cortex-M image (`fw-f32`, `fw-f64`) and, through
//! `#[path]`, into the host check `tests/tests/firmware_host.rs`, so both sides
//! compute from the same source and their outputs can be compared.
//!
//! Results are reported as `key hex-bits` lines: no float formatting, which
//! would add tens of KiB of flash.

use echoline::line::lossless::Lossless;
use echoline::line::properties;
use echoline::Real;

/// Where results go: semihosting on the target, a string on the host.
pub trait Sink {
    /// One named result, as raw IEEE-754 bits widened to u64.
    fn put(&mut self, key: &str, bits: u64);
    /// A failure of the path, by its error's parameter name.
    fn fail(&mut self, key: &str, what: &str);
}

/// Raw bits of the scalar.
pub trait Bits: Real {
    /// IEEE-754 bits, widened.
    fn bits(self) -> u64;
}
impl Bits for f32 {
    fn bits(self) -> u64 {
        self.to_bits() as u64
    }
}
impl Bits for f64 {
    fn bits(self) -> u64 {
        self.to_bits()
    }
}

fn put<T: Bits, S: Sink>(s: &mut S, key: &str, v: T) {
    s.put(key, v.bits());
}

/// Runs the whole firmware path once.
pub fn run<T: Bits, S: Sink>(s: &mut S) {
    line_from_figures::<T, S>(s);
}

fn line_from_figures<T: Bits, S: Sink>(s: &mut S) {
    let line = match Lossless::new(T::lit(50.0), T::lit(0.66)) {
        Ok(l) => l,
        Err(_) => return s.fail("lossless", "new"),
    };
    match properties(&line, T::lit(1e8)) {
        Ok(p) => {
            put(s, "lossless.vf", p.velocity_factor);
            put(s, "lossless.vg", p.group_velocity_m_per_s);
        }
        Err(_) => s.fail("lossless", "properties"),
    }
}

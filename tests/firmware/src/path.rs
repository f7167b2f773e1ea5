//! The firmware path: what an instrument would run, written once over the
//! scalar. Compiled into the Cortex-M image (`fw-f32`, `fw-f64`) and, through
//! `#[path]`, into the host check `tests/tests/firmware_host.rs`, so both sides
//! compute from the same source and their outputs can be compared.
//!
//! Results are reported as `key hex-bits` lines: no float formatting, which
//! would add tens of KiB of flash.

use echoline::line::coax::Coax;
use echoline::line::datasheet::DatasheetCable;
use echoline::line::dielectric::Dielectric;
use echoline::line::lossless::Lossless;
use echoline::line::properties;
use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::network::cascade::Cascade;
use echoline::network::load::Load;
use echoline::network::reflection::reflection;
use echoline::sweep::dtf::{band_pass_fft, Config};
use echoline::sweep::peaks::{peaks_complex, Peak};
use echoline::tdr::{AdcCodes, Analysis, DetectSettings, EventKind, Trace, TraceSetup};
use echoline::timing::VelocityRange;
use echoline::{Impedance, Real};

#[path = "demo_trace.rs"]
mod demo_trace;

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

/// Runs the whole firmware path once. Entry points of `echoline` covered
/// (and so proven panic-free by the `no-panic-proof` link):
/// `Lossless::new`, `line::properties`, `Dielectric::wideband_debye`,
/// `Coax::new`, `Cascade::{new, push_line, input_impedance_sweep}`,
/// `AdcCodes::{new, with_rails}`, `Trace::new`, `Analysis::empty`,
/// `Trace::analyse_into`, `DatasheetCable::{builder, build}`, `fill_twiddles`,
/// `Fft::new`, `network::reflection::reflection`, `sweep::dtf::band_pass_fft`,
/// `sweep::peaks::peaks_complex`.
#[allow(dead_code)] // the host example runs all phases at once; the image runs them one by one
pub fn run<T: Bits, S: Sink>(s: &mut S) {
    for phase in PHASES {
        run_phase::<T, S>(phase, s);
    }
}

/// The phases of the firmware path, each measured for stack on the target.
pub const PHASES: [&str; 5] = ["line", "datasheet", "sweep", "trace", "dtf"];

/// Runs one phase by name.
pub fn run_phase<T: Bits, S: Sink>(phase: &str, s: &mut S) {
    match phase {
        "line" => line_from_figures::<T, S>(s),
        "datasheet" => datasheet_line::<T, S>(s),
        "sweep" => coax_cascade_sweep::<T, S>(s),
        "trace" => trace_analysis::<T, S>(s),
        "dtf" => distance_to_fault::<T, S>(s),
        _ => s.fail("phase", phase),
    }
}

/// Solid-PE coax (0.9/2.95 mm, copper, causal dielectric fitted at 1 GHz).
fn solid_pe_coax<T: Bits>() -> echoline::Result<Coax<T>> {
    let pe = Dielectric::wideband_debye(T::lit(2.25), T::lit(2e-4), T::lit(1e9))?;
    Coax::new(
        T::lit(0.9e-3),
        T::lit(2.95e-3),
        pe,
        T::lit(5.8e7),
        T::lit(0.2e-3),
    )
}

#[inline(never)]
fn coax_cascade_sweep<T: Bits, S: Sink>(s: &mut S) {
    let coax = match solid_pe_coax() {
        Ok(c) => c,
        Err(_) => return s.fail("coax", "new"),
    };
    match properties(&coax, T::lit(1e8)) {
        Ok(p) => {
            put(s, "coax.vf", p.velocity_factor);
            put(s, "coax.db_per_m", p.atten_db_per_m);
            if let Impedance::Finite(z) = p.point.zc_ohm {
                put(s, "coax.zc_re", z.re);
                put(s, "coax.zc_im", z.im);
            }
        }
        Err(_) => return s.fail("coax", "properties"),
    }
    let mut c: Cascade<T, 4> = Cascade::new();
    if c.push_line(&coax, T::lit(12.0)).is_err() || c.push_line(&coax, T::lit(3.5)).is_err() {
        return s.fail("cascade", "push");
    }
    const POINTS: usize = 64;
    let mut f = [T::zero(); POINTS];
    for (i, x) in f.iter_mut().enumerate() {
        *x = T::lit(1e6) + T::from_usize(i) * T::lit(15e6);
    }
    let mut z = [Impedance::Open; POINTS];
    if c.input_impedance_sweep(&f, &Load::Resistor(T::lit(75.0)), &mut z)
        .is_err()
    {
        return s.fail("cascade", "sweep");
    }
    let (mut sum_re, mut sum_im) = (T::zero(), T::zero());
    for zi in z.iter() {
        if let Impedance::Finite(v) = zi {
            sum_re = sum_re + v.re;
            sum_im = sum_im + v.im;
        }
    }
    put(s, "sweep.sum_re", sum_re);
    put(s, "sweep.sum_im", sum_im);
}

fn kind_code(k: EventKind) -> u64 {
    match k {
        EventKind::OpenEnd => 1,
        EventKind::Short => 2,
        EventKind::ImpedanceUp => 3,
        EventKind::ImpedanceDown => 4,
        EventKind::Capacitive => 5,
        EventKind::Inductive => 6,
        EventKind::Resistive => 7,
        EventKind::EndOfTrace => 8,
    }
}

const EVENT_KEYS: [[&str; 4]; 4] = [
    ["ev0.kind", "ev0.distance_m", "ev0.rho", "ev0.hi_m"],
    ["ev1.kind", "ev1.distance_m", "ev1.rho", "ev1.hi_m"],
    ["ev2.kind", "ev2.distance_m", "ev2.rho", "ev2.hi_m"],
    ["ev3.kind", "ev3.distance_m", "ev3.rho", "ev3.hi_m"],
];

#[inline(never)]
fn trace_analysis<T: Bits, S: Sink>(s: &mut S) {
    let codes = match AdcCodes::new(
        &demo_trace::CODES[..],
        T::lit(demo_trace::VOLTS_PER_CODE),
        T::lit(-demo_trace::OFFSET_CODES * demo_trace::VOLTS_PER_CODE),
    )
    .and_then(|c| c.with_rails(0, 4095))
    {
        Ok(c) => c,
        Err(_) => return s.fail("trace", "codes"),
    };
    let velocity = match VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)) {
        Ok(v) => v,
        Err(_) => return s.fail("trace", "velocity"),
    };
    let trace = match Trace::new(
        &codes,
        TraceSetup::measured(T::lit(demo_trace::DT_S), T::lit(50.0), velocity),
    ) {
        Ok(t) => t,
        Err(_) => return s.fail("trace", "new"),
    };
    let mut found = Analysis::<T, 8>::empty();
    if trace
        .analyse_into(&DetectSettings::default(), &mut found)
        .is_err()
    {
        return s.fail("trace", "analyse");
    }
    s.put("events.count", found.events.len() as u64);
    for (e, keys) in found.events.iter().zip(EVENT_KEYS.iter()) {
        s.put(keys[0], kind_code(e.kind));
        put(s, keys[1], e.distance.distance_m);
        put(s, keys[2], e.rho);
        put(s, keys[3], e.distance.hi_m);
    }
}

#[inline(never)]
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

/// A cable known only by its datasheet: 50 Ω, VF 0.85, 4.3 dB/100 m at
/// 100 MHz and 14.8 dB/100 m at 1 GHz (figures of an invented foam cable).
#[inline(never)]
fn datasheet_line<T: Bits, S: Sink>(s: &mut S) {
    let cable = DatasheetCable::builder(T::lit(50.0), T::lit(0.85))
        .attenuation_db_per_100m(T::lit(100e6), T::lit(4.3))
        .attenuation_db_per_100m(T::lit(1e9), T::lit(14.8))
        .build();
    let cable = match cable {
        Ok(c) => c,
        Err(_) => return s.fail("datasheet", "build"),
    };
    match properties(&cable, T::lit(450e6)) {
        Ok(p) => {
            put(s, "datasheet.vf", p.velocity_factor);
            put(s, "datasheet.db_per_m", p.atten_db_per_m);
            put(s, "datasheet.vg", p.group_velocity_m_per_s);
        }
        Err(_) => s.fail("datasheet", "properties"),
    }
}

const SWEEP_POINTS: usize = 201;
const DTF_POINTS: usize = 512;

/// A reflection sweep (2–402 MHz, 201 points: alias-free range 49 m) of 30 m
/// of the coax ending open, from its line model,
/// transformed to reflection against distance (Hann window, FFT path) and
/// its peaks listed.
#[inline(never)]
fn distance_to_fault<T: Bits, S: Sink>(s: &mut S) {
    let coax = match solid_pe_coax() {
        Ok(c) => c,
        Err(_) => return s.fail("dtf", "coax"),
    };
    let mut c: Cascade<T, 2> = Cascade::new();
    if c.push_line(&coax, T::lit(30.0)).is_err() {
        return s.fail("dtf", "push");
    }
    let mut f = [T::zero(); SWEEP_POINTS];
    for (i, x) in f.iter_mut().enumerate() {
        *x = T::lit(2e6) + T::from_usize(i) * T::lit(2e6);
    }
    let mut z = [Impedance::Open; SWEEP_POINTS];
    if c.input_impedance_sweep(&f, &Load::Open, &mut z).is_err() {
        return s.fail("dtf", "sweep");
    }
    let mut g = [Cx::new(T::zero(), T::zero()); SWEEP_POINTS];
    for (gi, zi) in g.iter_mut().zip(z.iter()) {
        match reflection(*zi, Cx::new(T::lit(50.0), T::zero())) {
            Ok(r) => *gi = r,
            Err(_) => return s.fail("dtf", "reflection"),
        }
    }
    let mut table = [Cx::new(T::zero(), T::zero()); DTF_POINTS / 2];
    if fill_twiddles(&mut table).is_err() {
        return s.fail("dtf", "twiddles");
    }
    let plan = match Fft::new(&table) {
        Ok(p) => p,
        Err(_) => return s.fail("dtf", "plan"),
    };
    let velocity = match VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)) {
        Ok(v) => v,
        Err(_) => return s.fail("dtf", "velocity"),
    };
    let cfg = Config {
        window: Window::Hann,
        velocity,
    };
    let mut out = [Cx::new(T::zero(), T::zero()); DTF_POINTS];
    let grid = match band_pass_fft(&f, &g, &cfg, &plan, &mut out) {
        Ok(g) => g,
        Err(_) => return s.fail("dtf", "transform"),
    };
    put(s, "dtf.range_m", grid.range_m);
    put(s, "dtf.resolution_m", grid.resolution_m);
    let mut peaks: heapless::Vec<Peak<T>, 8> = heapless::Vec::new();
    if peaks_complex(&out, &grid, T::lit(0.1), &mut peaks).is_err() {
        return s.fail("dtf", "peaks");
    }
    s.put("dtf.count", peaks.len() as u64);
    if let Some(p) = peaks.first() {
        put(s, "dtf.peak0_m", p.distance.distance_m);
        put(s, "dtf.peak0_rho", p.rho);
    }
}

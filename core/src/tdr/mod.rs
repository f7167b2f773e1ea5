//! Reflection traces: simulation of the trace an instrument records on a
//! cable ([`sim`]) and analysis of a measured step trace.
//!
//! Data flow (all in fixed memory, nothing copied):
//!
//! ```text
//! samples (volts, ADC codes, or a difference) ──► Trace::new (validate; time zero,
//!     levels, rise time) ──► noise floor ──► one-pass detection ──► classified Events
//!                        └─► layer peeling ──► impedance profile
//! events today + events of a reference ──► compare ──► changes
//! ```
//!
//! * [`trace`] — the sample sources ([`Samples`], [`AdcCodes`], [`Difference`]),
//!   [`TraceSetup`] and the validated [`Trace`]; 50 % time zero, 10–90 % rise.
//! * [`noise`] — σ from first differences over ≤ 256 points: a 1.4826·MAD
//!   start, then a 4 s clipped RMS (continuous on quantised ADC codes).
//! * [`detect`] — matched-filter (Haar) detection with creep removal,
//!   confirmation, classification, lumped C/L (Johnson & Graham, 1993, value
//!   from memory), distances with intervals via
//!   [`crate::timing::distance_from_round_trip`] and
//!   [`crate::timing::timing_half_width_s`].
//! * [`peel`] — layer peeling (Bruckstein & Kailath, SIAM Review 29(3), 1987).
//! * [`mod@compare`] — new / gone / moved / ρ-changed events against a baseline.
//! * [`sim`] — the sampled port voltage of a source driving a cascade ended
//!   by its load (frequency-domain evaluation, inverse FFT, seeded noise).
//!
//! **Memory per sample:** detection needs nothing per sample beyond the
//! borrowed trace (O(1): three running filters, two lobes, a 256-point noise
//! array of 1 KiB in f32 / 2 KiB in f64 on the stack) plus
//! `N · size_of::<Event<T>>()` for the result (68 bytes per event in f32,
//! 136 in f64 on a 64-bit host). Layer peeling needs two caller
//! buffers of n values (D, U) and the n-value output: 12 bytes per sample in
//! f32, 24 in f64.
//!
//! **Bad input** never panics: too short, non-finite samples, sample interval
//! ≤ 0, time zero outside the trace, no launch in a constant trace and more
//! events than capacity are typed errors; clipped samples are counted
//! ([`Trace::clipping`]) and flagged on the events they touch.

//!
//! ```
//! use echoline::tdr::{DetectSettings, EventKind, Trace, TraceSetup};
//! use echoline::timing::VelocityRange;
//!
//! // An ideal trace: launch at sample 20, an open end 100 samples (100 ns) later.
//! let mut x = [0.0f32; 400];
//! for (i, v) in x.iter_mut().enumerate() {
//!     *v = if i >= 20 { 1.0 } else { 0.0 } + if i >= 120 { 1.0 } else { 0.0 };
//! }
//! let velocity = VelocityRange::from_factor(0.66, 0.02)?;
//! let trace = Trace::new(&x, TraceSetup::measured(1e-9, 50.0, velocity))?;
//! let found = trace.analyse::<8>(&DetectSettings::default())?;
//! let end = found.events[0];
//! assert_eq!(end.kind, EventKind::OpenEnd);
//! // 0.66·c0·100 ns / 2 ≈ 9.89 m, inside its interval.
//! assert!((end.distance.distance_m - 9.893).abs() < 0.01);
//! assert!(end.distance.lo_m < end.distance.distance_m && end.distance.distance_m < end.distance.hi_m);
//! # Ok::<(), echoline::Error>(())
//! ```

pub mod compare;
pub mod detect;
pub mod noise;
pub mod peel;
pub mod sim;
pub mod trace;

pub use compare::{compare, Change, ChangeKind, CompareSettings};
pub use detect::{
    analyse, analyse_into, impedance_from_gamma, Analysis, DetectSettings, Event, EventKind, Lumped,
};
pub use noise::{noise_floor, NoiseFloor};
pub use peel::{peel_impulse, Profile, ProfileEnd};
pub use trace::{AdcCode, AdcCodes, Clipping, Difference, Samples, TimeZero, Trace, TraceSetup};

//! A measured trace: borrowed samples plus what is needed to read them.
//!
//! The samples are borrowed through [`Samples`] (volts as `[f32]`/`[f64]`, or
//! integer ADC codes through [`AdcCodes`] with a scale and offset, or the
//! sample-by-sample difference of two sources through [`Difference`]); nothing
//! is copied. [`Trace::new`] validates everything once (finite samples, sample
//! interval > 0, time zero inside the trace, clipped samples counted) and
//! measures what was not given:
//!
//! * **pre-launch level** — median of up to [`PRE_LAUNCH_SAMPLES`] samples
//!   before the launch edge;
//! * **time zero** — the 50 % crossing of the launch step, linearly
//!   interpolated between samples (the same 50 % rule is used for every
//!   reflected step, so round-trip times compare like with like);
//! * **incident level** — median of [`PLATEAU_SAMPLES`] samples on the launch
//!   plateau (after the edge has settled) minus the pre-launch level; a
//!   reflection inside those samples (a discontinuity at the port) biases it,
//!   so give `incident_v` when the cable starts with a mismatch;
//! * **rise time** — 10–90 % of the launch edge, interpolated.
//!
//! The launch is found as the first sample where the two-sample change
//! |v\[i+2\] − v\[i\]| reaches half of the steepest one in the trace (nothing can
//! precede the launch; a loss creep or an open end does not move this point),
//! and must exceed 10 σ of the noise floor. The 10–90 % rise time and the 50 %
//! time reference are common practice, no single source.

use crate::error::{self, Error, Result};
use crate::scalar::Real;
use crate::timing::{self, VelocityRange};

/// Largest sample magnitude accepted, V (1e12: far beyond any instrument,
/// and small enough that sums over a trace of 2^20 samples stay finite in f32).
pub const MAX_ABS_V: f64 = 1e12;

/// Shortest trace accepted, samples.
pub const MIN_SAMPLES: usize = 16;
/// Samples before the launch used for the pre-launch level (at most).
pub const PRE_LAUNCH_SAMPLES: usize = 8;
/// Samples on the launch plateau used for the incident level.
pub const PLATEAU_SAMPLES: usize = 8;

/// A source of samples in volts, read by index without copying the trace.
pub trait Samples<T: Real> {
    /// Number of samples.
    fn sample_count(&self) -> usize;
    /// Sample `index` in volts, `None` past the end.
    fn volts(&self, index: usize) -> Option<T>;
    /// `true` if sample `index` sits at or beyond a converter rail (its value is
    /// a bound, not a measurement).
    fn is_clipped(&self, _index: usize) -> bool {
        false
    }
    /// The quantisation step in volts (0 for float samples); the noise floor
    /// is never taken below step/√12.
    fn resolution_v(&self) -> T {
        T::zero()
    }
    /// The samples as one contiguous slice of volts, when they are stored so
    /// (`None` by default). Hot loops read such a slice directly instead of
    /// calling [`Samples::volts`] per sample; results are the same either way.
    fn as_slice(&self) -> Option<&[T]> {
        None
    }
}

impl<T: Real> Samples<T> for [T] {
    #[inline]
    fn sample_count(&self) -> usize {
        self.len()
    }
    #[inline]
    fn volts(&self, index: usize) -> Option<T> {
        self.get(index).copied()
    }
    #[inline]
    fn as_slice(&self) -> Option<&[T]> {
        Some(self)
    }
}

impl<T: Real, const M: usize> Samples<T> for [T; M] {
    #[inline]
    fn sample_count(&self) -> usize {
        M
    }
    #[inline]
    fn volts(&self, index: usize) -> Option<T> {
        self.get(index).copied()
    }
    #[inline]
    fn as_slice(&self) -> Option<&[T]> {
        Some(&self[..])
    }
}

/// An integer converter code (`i16` or `i32`).
pub trait AdcCode: Copy {
    /// Lowest representable code.
    const MIN_CODE: i32;
    /// Highest representable code.
    const MAX_CODE: i32;
    /// Widens to `i32`.
    fn to_i32(self) -> i32;
}

impl AdcCode for i16 {
    const MIN_CODE: i32 = i16::MIN as i32;
    const MAX_CODE: i32 = i16::MAX as i32;
    #[inline]
    fn to_i32(self) -> i32 {
        self as i32
    }
}

impl AdcCode for i32 {
    const MIN_CODE: i32 = i32::MIN;
    const MAX_CODE: i32 = i32::MAX;
    #[inline]
    fn to_i32(self) -> i32 {
        self
    }
}

/// Borrowed ADC codes read as volts: v = code·`volts_per_code` + `offset_v`.
/// Codes at or beyond the rails are reported as clipped.
#[derive(Clone, Copy, Debug)]
pub struct AdcCodes<'a, C, T> {
    codes: &'a [C],
    volts_per_code: T,
    offset_v: T,
    rail_lo: i32,
    rail_hi: i32,
}

impl<'a, C: AdcCode, T: Real> AdcCodes<'a, C, T> {
    /// Codes with a scale (finite, ≠ 0) and an offset (finite). The rails are
    /// the code type's extremes until set with [`AdcCodes::with_rails`].
    pub fn new(codes: &'a [C], volts_per_code: T, offset_v: T) -> Result<Self> {
        let volts_per_code = error::finite(volts_per_code, "volts_per_code")?;
        if volts_per_code == T::zero() {
            return Err(Error::NotPositive("volts_per_code"));
        }
        let offset_v = error::finite(offset_v, "offset_v")?;
        Ok(AdcCodes {
            codes,
            volts_per_code,
            offset_v,
            rail_lo: C::MIN_CODE,
            rail_hi: C::MAX_CODE,
        })
    }

    /// Sets the converter rails (e.g. 0 and 4095 for a 12-bit converter);
    /// `rail_lo < rail_hi`.
    pub fn with_rails(mut self, rail_lo: i32, rail_hi: i32) -> Result<Self> {
        if rail_lo >= rail_hi {
            return Err(Error::OutOfRange("rail_lo"));
        }
        self.rail_lo = rail_lo;
        self.rail_hi = rail_hi;
        Ok(self)
    }
}

impl<C: AdcCode, T: Real> Samples<T> for AdcCodes<'_, C, T> {
    #[inline]
    fn sample_count(&self) -> usize {
        self.codes.len()
    }
    #[inline]
    fn volts(&self, index: usize) -> Option<T> {
        self.codes
            .get(index)
            .map(|c| T::from_i32(c.to_i32()) * self.volts_per_code + self.offset_v)
    }
    #[inline]
    fn is_clipped(&self, index: usize) -> bool {
        self.codes.get(index).is_some_and(|c| {
            let c = c.to_i32();
            c <= self.rail_lo || c >= self.rail_hi
        })
    }
    fn resolution_v(&self) -> T {
        self.volts_per_code.abs()
    }
}

/// The sample-by-sample difference `today − reference` of two sources of the
/// same length (a baseline-subtracted trace, without copying either).
///
/// It has no launch: give time zero, the incident level (of the original
/// traces), `pre_launch_v = Some(0)` and the rise time. Event times and ρ
/// keep their meaning; cumulative levels (`gamma_after`, `z_after`) do not.
#[derive(Clone, Copy, Debug)]
pub struct Difference<'a, A: ?Sized, B: ?Sized> {
    today: &'a A,
    reference: &'a B,
}

impl<'a, A: ?Sized, B: ?Sized> Difference<'a, A, B> {
    /// Pairs two sources; they must hold the same number of samples.
    pub fn new<T: Real>(today: &'a A, reference: &'a B) -> Result<Self>
    where
        A: Samples<T>,
        B: Samples<T>,
    {
        if today.sample_count() != reference.sample_count() {
            return Err(Error::LengthMismatch("reference"));
        }
        Ok(Difference { today, reference })
    }
}

impl<T: Real, A: Samples<T> + ?Sized, B: Samples<T> + ?Sized> Samples<T> for Difference<'_, A, B> {
    #[inline]
    fn sample_count(&self) -> usize {
        self.today.sample_count()
    }
    #[inline]
    fn volts(&self, index: usize) -> Option<T> {
        Some(self.today.volts(index)? - self.reference.volts(index)?)
    }
    fn is_clipped(&self, index: usize) -> bool {
        self.today.is_clipped(index) || self.reference.is_clipped(index)
    }
    fn resolution_v(&self) -> T {
        self.today.resolution_v().max(self.reference.resolution_v())
    }
}

/// Where time zero (the launch) is.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum TimeZero<T> {
    /// Found as the 50 % crossing of the launch step.
    FromLaunch,
    /// At this (fractional) sample index, `0 ≤ index ≤ len − 1`.
    AtIndex(T),
}

/// What the caller knows about a trace; `None` fields are measured.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TraceSetup<T> {
    /// Sample interval, s (> 0).
    pub sample_interval_s: T,
    /// Time zero.
    pub time_zero: TimeZero<T>,
    /// Incident step level relative to the pre-launch level, V (finite, ≠ 0);
    /// `None`: measured on the launch plateau.
    pub incident_v: Option<T>,
    /// Level before the launch, V; `None`: measured from samples before it.
    pub pre_launch_v: Option<T>,
    /// Instrument 10–90 % rise time, s (≥ 0); `None`: measured on the launch.
    pub rise_time_s: Option<T>,
    /// Source impedance, Ω (> 0); also the reference Z0 of the first section.
    pub source_ohm: T,
    /// Propagation velocity range used for every distance.
    pub velocity: VelocityRange<T>,
}

impl<T: Real> TraceSetup<T> {
    /// A setup that measures time zero, levels and rise time from the launch.
    pub fn measured(sample_interval_s: T, source_ohm: T, velocity: VelocityRange<T>) -> Self {
        TraceSetup {
            sample_interval_s,
            time_zero: TimeZero::FromLaunch,
            incident_v: None,
            pre_launch_v: None,
            rise_time_s: None,
            source_ohm,
            velocity,
        }
    }
}

/// Clipped samples found while validating.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct Clipping {
    /// How many samples sit at a rail.
    pub count: usize,
    /// The first of them, if any.
    pub first_index: Option<usize>,
}

/// A validated trace: borrowed samples plus time zero, levels and rise time.
#[derive(Clone, Copy, Debug)]
pub struct Trace<'a, T, S: ?Sized> {
    pub(crate) samples: &'a S,
    pub(crate) len: usize,
    pub(crate) dt_s: T,
    pub(crate) t0_index: T,
    pub(crate) incident_v: T,
    pub(crate) pre_v: T,
    pub(crate) rise_time_s: T,
    pub(crate) source_ohm: T,
    pub(crate) velocity: VelocityRange<T>,
    pub(crate) clipping: Clipping,
}

/// Median of a small set in place (`len ≥ 1`), without panicking.
///
/// Heapsort (O(n log n), no recursion, no allocation), written with checked
/// access only, so that no bounds check can panic: the firmware image links
/// it under the no-panic proof, which `core`'s `select_nth_unstable_by` does
/// not pass. NaN compares as not greater (callers reject non-finite samples
/// first).
pub(crate) fn median_in_place<T: Real>(x: &mut [T]) -> Option<T> {
    let n = x.len();
    if n == 0 {
        return None;
    }
    for start in (0..n / 2).rev() {
        sift_down(x, start, n);
    }
    for end in (1..n).rev() {
        swap_checked(x, 0, end);
        sift_down(x, 0, end);
    }
    let hi = *x.get(n / 2)?;
    if n % 2 == 1 {
        return Some(hi);
    }
    let lo = *x.get(n / 2 - 1)?;
    Some((lo + hi) * T::half())
}

/// Swaps `x[a]` and `x[b]` (`a < b`) if both exist.
fn swap_checked<T>(x: &mut [T], a: usize, b: usize) {
    if let Some((lo, hi)) = x.split_at_mut_checked(b) {
        if let (Some(p), Some(q)) = (lo.get_mut(a), hi.first_mut()) {
            core::mem::swap(p, q);
        }
    }
}

/// Restores the max-heap property below `root` within `x[..end]`.
fn sift_down<T: Real>(x: &mut [T], mut root: usize, end: usize) {
    loop {
        let left = 2 * root + 1;
        if left >= end {
            return;
        }
        let right = left + 1;
        let (Some(&l), Some(&r0)) = (x.get(left), x.get(root)) else {
            return;
        };
        let mut child = left;
        let mut cv = l;
        if right < end {
            if let Some(&r) = x.get(right) {
                if r > l {
                    child = right;
                    cv = r;
                }
            }
        }
        if cv > r0 {
            swap_checked(x, root, child);
            root = child;
        } else {
            return;
        }
    }
}

/// Median of samples `[from, to)` (at most 16 used), `None` if the range is empty.
fn median_of<T: Real, S: Samples<T> + ?Sized>(s: &S, from: usize, to: usize) -> Option<T> {
    let mut buf = [T::zero(); 16];
    let mut n = 0;
    for (slot, i) in buf.iter_mut().zip(from..to) {
        *slot = s.volts(i)?;
        n += 1;
    }
    median_in_place(buf.get_mut(..n)?)
}

/// Fractional index where the samples cross `level` going in direction
/// `sign` (±1), searching forward from `from` up to `to`; linear interpolation.
pub(crate) fn crossing_forward<T: Real, S: Samples<T> + ?Sized>(
    s: &S,
    from: usize,
    to: usize,
    level: T,
    sign: T,
) -> Option<T> {
    let mut prev = s.volts(from)?;
    if (prev - level) * sign >= T::zero() {
        return Some(T::from_usize(from));
    }
    for i in from + 1..to.min(s.sample_count()) {
        let v = s.volts(i)?;
        if (v - level) * sign >= T::zero() {
            let frac = (level - prev) / (v - prev);
            return Some(T::from_usize(i - 1) + frac.max(T::zero()).min(T::one()));
        }
        prev = v;
    }
    None
}

/// Fractional index of the last crossing of `level` in direction `sign`
/// before `to`, searching backward down to `from`.
fn crossing_backward<T: Real, S: Samples<T> + ?Sized>(
    s: &S,
    from: usize,
    to: usize,
    level: T,
    sign: T,
) -> Option<T> {
    let mut i = to;
    let mut hi = s.volts(i)?;
    while i > from {
        let lo = s.volts(i - 1)?;
        if (lo - level) * sign < T::zero() && (hi - level) * sign >= T::zero() {
            let frac = (level - lo) / (hi - lo);
            return Some(T::from_usize(i - 1) + frac.max(T::zero()).min(T::one()));
        }
        hi = lo;
        i -= 1;
    }
    None
}

/// 10–90 % rise of the edge around a 50 % point `t50`, samples.
fn rise_around<T: Real, S: Samples<T> + ?Sized>(
    s: &S,
    len: usize,
    pre_v: T,
    incident_v: T,
    t50: T,
) -> Option<T> {
    let sign = incident_v.signum();
    let level = |f: T| pre_v + incident_v * f;
    let i50 = t50.floor().to_i64_sat().max(0) as usize;
    let i50c = (t50.ceil().to_i64_sat().max(0) as usize).min(len.saturating_sub(1));
    let t10 = crossing_backward(s, 0, i50c, level(T::lit(0.1)), sign)?;
    let t90 = crossing_forward(s, i50, len, level(T::lit(0.9)), sign)?;
    if t90 > t10 {
        Some(t90 - t10)
    } else {
        None
    }
}

/// What was measured on the launch edge.
struct Launch<T> {
    pre_v: T,
    incident_v: T,
    t0_index: T,
    rise_samples: Option<T>,
}

fn measure_launch<T: Real, S: Samples<T> + ?Sized>(
    s: &S,
    setup: &TraceSetup<T>,
    len: usize,
) -> Result<Launch<T>> {
    // Pre-launch level: given, or the median of the first samples (when the
    // launch is to be found) or of the samples just before a given time zero.
    let given_t0 = match setup.time_zero {
        TimeZero::AtIndex(i) => Some(i),
        TimeZero::FromLaunch => None,
    };
    let pre_v = match (setup.pre_launch_v, given_t0) {
        (Some(p), _) => error::finite(p, "pre_launch_v")?,
        (None, None) => {
            median_of(s, 0, PRE_LAUNCH_SAMPLES).ok_or(Error::Undefined("pre_launch_v"))?
        }
        (None, Some(t0)) => {
            let end = t0.floor().to_i64_sat().max(0) as usize;
            let end = end.saturating_sub(1);
            if end < 4 {
                return Err(Error::TooShort {
                    what: "pre_launch samples",
                    needed: 4,
                });
            }
            median_of(s, end.saturating_sub(PRE_LAUNCH_SAMPLES), end)
                .ok_or(Error::Undefined("pre_launch_v"))?
        }
    };
    if let (Some(t0), Some(incident_v)) = (given_t0, setup.incident_v) {
        // Nothing to find: only the rise time is read around the given time zero.
        return Ok(Launch {
            pre_v,
            incident_v,
            t0_index: t0,
            rise_samples: rise_around(s, len, pre_v, incident_v, t0),
        });
    }
    // The steepest two-sample change d2 = v[i+2] − v[i] (in the incident's
    // direction when it is given); the launch edge is the first sample where
    // |d2| reaches half of it (no reflection can precede the launch).
    let search_from = match given_t0 {
        Some(t0) => (t0.floor().to_i64_sat().max(0) as usize).saturating_sub(PRE_LAUNCH_SAMPLES),
        None => 0,
    };
    let want = match setup.incident_v {
        Some(v) if v != T::zero() => v.signum(),
        _ => T::zero(),
    };
    let v_at = |i: usize| s.volts(i).ok_or(Error::Undefined("samples"));
    let mut max_d2 = T::zero();
    for i in search_from..len.saturating_sub(2) {
        let d2 = v_at(i + 2)? - v_at(i)?;
        if want == T::zero() || d2.signum() == want {
            max_d2 = max_d2.max(d2.abs());
        }
    }
    let tiny = (pre_v.abs() + T::one()) * T::EPS * T::lit(64.0);
    if max_d2 <= tiny {
        return Err(Error::Undefined("time_zero"));
    }
    let mut found = None;
    for i in search_from..len.saturating_sub(2) {
        let d2 = v_at(i + 2)? - v_at(i)?;
        if d2.abs() >= max_d2 * T::half() && (want == T::zero() || d2.signum() == want) {
            found = Some((i + 1, d2.signum()));
            break;
        }
    }
    let (i_q, sign) = found.ok_or(Error::Undefined("time_zero"))?;
    if given_t0.is_none() && i_q < PRE_LAUNCH_SAMPLES {
        return Err(Error::TooShort {
            what: "pre_launch samples",
            needed: PRE_LAUNCH_SAMPLES,
        });
    }
    // Top of the edge: the first point where the 2-sample rise falls below 2 %
    // of the largest excursion; then the median over the plateau.
    let incident_v = match setup.incident_v {
        Some(v) => v,
        None => {
            let step = max_d2 * T::lit(0.05);
            let mut top = i_q;
            while top + 2 < len {
                let a = s.volts(top).ok_or(Error::Undefined("samples"))?;
                let b = s.volts(top + 2).ok_or(Error::Undefined("samples"))?;
                if (b - a) * sign <= step {
                    break;
                }
                top += 1;
            }
            let start = top + 1;
            if start + PLATEAU_SAMPLES > len {
                return Err(Error::TooShort {
                    what: "samples",
                    needed: start + PLATEAU_SAMPLES,
                });
            }
            median_of(s, start, start + PLATEAU_SAMPLES).ok_or(Error::Undefined("incident_v"))?
                - pre_v
        }
    };
    let sigma = crate::tdr::noise::noise_floor(s, 0, len)?.sigma_v;
    if incident_v.abs() <= tiny.max(T::lit(10.0) * sigma) {
        return Err(Error::Undefined("incident_v"));
    }
    let _ = sign;
    let sign = incident_v.signum();
    let level = |f: T| pre_v + incident_v * f;
    let lo_search = i_q.saturating_sub(len);
    let t50 = match given_t0 {
        Some(t0) => t0,
        None => {
            // The 50 % crossing at or before the quarter-excursion sample
            // (scan back), else forward.
            crossing_backward(s, lo_search, i_q, level(T::lit(0.5)), sign)
                .or_else(|| crossing_forward(s, i_q, len, level(T::lit(0.5)), sign))
                .ok_or(Error::Undefined("time_zero"))?
        }
    };
    let rise_samples = rise_around(s, len, pre_v, incident_v, t50);
    Ok(Launch {
        pre_v,
        incident_v,
        t0_index: t50,
        rise_samples,
    })
}

impl<'a, T: Real, S: Samples<T> + ?Sized> Trace<'a, T, S> {
    /// Validates a trace and measures what the setup leaves open.
    ///
    /// Errors: fewer than [`MIN_SAMPLES`] samples (`TooShort`); a non-finite
    /// sample (`BadIndex { what: "samples", index }`); bad setup values
    /// (`NotPositive("sample_interval_s")`, `NotPositive("source_ohm")`,
    /// `NonFinite(..)`, `OutOfRange("time_zero")` for a time zero outside the
    /// trace); no launch step found, e.g. a constant trace
    /// (`Undefined("time_zero")` / `Undefined("incident_v")`).
    /// Clipped samples are not an error: they are counted in [`Trace::clipping`]
    /// and flagged on the events whose measurement windows they touch.
    pub fn new(samples: &'a S, setup: TraceSetup<T>) -> Result<Self> {
        let len = samples.sample_count();
        if len < MIN_SAMPLES {
            return Err(Error::TooShort {
                what: "samples",
                needed: MIN_SAMPLES,
            });
        }
        let dt_s = error::positive(setup.sample_interval_s, "sample_interval_s")?;
        let source_ohm = error::positive(setup.source_ohm, "source_ohm")?;
        // Validates the velocity range once (all distances use it).
        timing::distance_from_round_trip(T::zero(), T::zero(), &setup.velocity)?;
        let max_v = T::lit(MAX_ABS_V);
        if let Some(v) = setup.incident_v {
            let v = error::finite(v, "incident_v")?;
            if v == T::zero() {
                return Err(Error::Undefined("incident_v"));
            }
            if v.abs() > max_v {
                return Err(Error::OutOfRange("incident_v"));
            }
        }
        if let Some(v) = setup.pre_launch_v {
            if error::finite(v, "pre_launch_v")?.abs() > max_v {
                return Err(Error::OutOfRange("pre_launch_v"));
            }
        }
        let mut clipping = Clipping::default();
        for i in 0..len {
            let v = samples.volts(i).ok_or(Error::BadIndex {
                what: "samples",
                index: i,
            })?;
            // Finite and within ±MAX_ABS_V, so that sums and differences of
            // samples cannot overflow in f32.
            if !v.is_finite() || v.abs() > max_v {
                return Err(Error::BadIndex {
                    what: "samples",
                    index: i,
                });
            }
            if samples.is_clipped(i) {
                clipping.count += 1;
                if clipping.first_index.is_none() {
                    clipping.first_index = Some(i);
                }
            }
        }
        if let TimeZero::AtIndex(t0) = setup.time_zero {
            let t0 = error::finite(t0, "time_zero")?;
            if t0 < T::zero() || t0 > T::from_usize(len - 1) {
                return Err(Error::OutOfRange("time_zero"));
            }
        }
        let rise_given = match setup.rise_time_s {
            Some(r) => Some(error::non_negative(r, "rise_time_s")?),
            None => None,
        };
        let all_given = setup.incident_v.is_some()
            && setup.pre_launch_v.is_some()
            && rise_given.is_some()
            && matches!(setup.time_zero, TimeZero::AtIndex(_));
        let (pre_v, incident_v, t0_index, rise_time_s) = if all_given {
            let t0 = match setup.time_zero {
                TimeZero::AtIndex(t) => t,
                TimeZero::FromLaunch => T::zero(),
            };
            (
                error::finite(setup.pre_launch_v.unwrap_or(T::zero()), "pre_launch_v")?,
                setup.incident_v.unwrap_or(T::one()),
                t0,
                rise_given.unwrap_or(T::zero()),
            )
        } else {
            let l = measure_launch(samples, &setup, len)?;
            (
                l.pre_v,
                l.incident_v,
                l.t0_index,
                match (rise_given, l.rise_samples) {
                    (Some(r), _) => r,
                    (None, Some(r)) => r * dt_s,
                    (None, None) => return Err(Error::Undefined("rise_time_s")),
                },
            )
        };
        if t0_index < T::zero() || t0_index > T::from_usize(len - 1) {
            return Err(Error::OutOfRange("time_zero"));
        }
        Ok(Trace {
            samples,
            len,
            dt_s,
            t0_index,
            incident_v,
            pre_v,
            rise_time_s,
            source_ohm,
            velocity: setup.velocity,
            clipping,
        })
    }

    /// Number of samples.
    pub fn len(&self) -> usize {
        self.len
    }
    /// Always `false` (a trace holds at least [`MIN_SAMPLES`]).
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }
    /// Sample interval, s.
    pub fn sample_interval_s(&self) -> T {
        self.dt_s
    }
    /// Time zero as a fractional sample index.
    pub fn time_zero_index(&self) -> T {
        self.t0_index
    }
    /// Incident step level relative to the pre-launch level, V.
    pub fn incident_v(&self) -> T {
        self.incident_v
    }
    /// Pre-launch level, V.
    pub fn pre_launch_v(&self) -> T {
        self.pre_v
    }
    /// Instrument 10–90 % rise time, s (given or measured).
    pub fn rise_time_s(&self) -> T {
        self.rise_time_s
    }
    /// Source (reference) impedance, Ω.
    pub fn source_ohm(&self) -> T {
        self.source_ohm
    }
    /// The velocity range.
    pub fn velocity(&self) -> &VelocityRange<T> {
        &self.velocity
    }
    /// Clipped samples found while validating.
    pub fn clipping(&self) -> Clipping {
        self.clipping
    }
    /// The borrowed samples.
    pub fn samples(&self) -> &'a S {
        self.samples
    }
    /// The cumulative reflection at a level `v`: Γ = (v − v_pre)/V_inc − 1.
    pub fn gamma_at_level(&self, v: T) -> T {
        (v - self.pre_v) / self.incident_v - T::one()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn vel() -> VelocityRange<f64> {
        VelocityRange::from_factor(0.66, 0.02).unwrap()
    }

    fn ideal(n: usize, at: usize, v: f64) -> [f64; 64] {
        let mut x = [0.0; 64];
        for (i, s) in x.iter_mut().enumerate().take(n) {
            if i >= at {
                *s = v;
            }
        }
        x
    }

    #[test]
    fn launch_is_found_at_the_50_percent_point() {
        let x = ideal(64, 20, 0.5);
        let t = Trace::new(&x[..], TraceSetup::measured(1e-9, 50.0, vel())).unwrap();
        assert!((t.time_zero_index() - 19.5).abs() < 1e-12);
        assert!((t.incident_v() - 0.5).abs() < 1e-12);
        assert!(t.pre_launch_v().abs() < 1e-12);
        // An ideal step reads 0.8 sample 10–90 % by linear interpolation.
        assert!((t.rise_time_s() - 0.8e-9).abs() < 1e-15);
    }

    #[test]
    fn adc_codes_scale_and_clip() {
        let codes: [i16; 4] = [0, 100, 4095, -3];
        let a = AdcCodes::<i16, f32>::new(&codes, 0.001, 0.5)
            .unwrap()
            .with_rails(0, 4095)
            .unwrap();
        assert_eq!(a.volts(1), Some(0.6));
        assert!(a.is_clipped(0) && a.is_clipped(2) && a.is_clipped(3) && !a.is_clipped(1));
        assert_eq!(a.volts(4), None);
        assert!(AdcCodes::<i16, f32>::new(&codes, 0.0, 0.0).is_err());
        assert!(AdcCodes::<i16, f32>::new(&codes, 1.0, 0.0)
            .unwrap()
            .with_rails(5, 5)
            .is_err());
    }

    #[test]
    fn median_even_and_odd() {
        let mut a = [3.0, 1.0, 2.0];
        assert_eq!(median_in_place(&mut a), Some(2.0));
        let mut b = [4.0f32, 1.0, 3.0, 2.0];
        assert_eq!(median_in_place(&mut b), Some(2.5));
        let mut c: [f64; 0] = [];
        assert_eq!(median_in_place(&mut c), None);
    }

    #[test]
    fn samples_beyond_the_voltage_bound_are_rejected() {
        let mut x = [0.0f32; 64];
        x[40] = 1e13;
        let v = VelocityRange::from_factor(0.66, 0.02).unwrap();
        let r = Trace::new(&x[..], TraceSetup::measured(1e-9, 50.0, v));
        assert_eq!(
            r.err(),
            Some(Error::BadIndex {
                what: "samples",
                index: 40
            })
        );
        let mut setup = TraceSetup::measured(1e-9, 50.0, v);
        setup.incident_v = Some(1e20);
        let y = [0.0f32; 64];
        assert_eq!(
            Trace::new(&y[..], setup).err(),
            Some(Error::OutOfRange("incident_v"))
        );
    }

    #[test]
    fn heap_median_matches_a_full_sort() {
        let mut state = 0x1234_5678_9abc_def1u64;
        for n in 1..300usize {
            let mut x = [0.0f64; 300];
            for v in x.iter_mut().take(n) {
                state ^= state << 13;
                state ^= state >> 7;
                state ^= state << 17;
                *v = (state % 1000) as f64 - 500.0;
            }
            let mut sorted = x;
            sorted[..n].sort_by(|a, b| a.partial_cmp(b).unwrap());
            let want = if n % 2 == 1 {
                sorted[n / 2]
            } else {
                (sorted[n / 2 - 1] + sorted[n / 2]) / 2.0
            };
            assert_eq!(median_in_place(&mut x[..n]), Some(want), "n = {n}");
        }
    }
}

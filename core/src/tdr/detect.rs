//! Event detection and classification in one pass over the samples.
//!
//! **Detector.** A Haar (difference-of-boxcars) filter of length `w` per side,
//! S(n) = mean(v[n..n+w)) − mean(v[n−w..n)), is the matched filter for a
//! step in white noise: its peak is the step height for edges shorter than
//! `w`, its noise is σ·√(2/w). `w` is tied to the rise time:
//! w = max(4, ⌈2·t_r/Δt⌉) unless set. A lossy cable's slow creep of slope s
//! (V per sample) adds s·w to S everywhere; it is removed by subtracting the
//! smaller-magnitude of S(n − 2w) and S(n + 2w) (a local trend that an
//! isolated step does not disturb, since at least one neighbour lies outside
//! its lobe). A lobe is a run of samples with |S − trend| above the threshold
//! T = max(k·√2·σ_S, ½·ρ_min·|V_inc|) (k = [`DetectSettings::k_sigma`],
//! default 6; √2 bounds the noise added by the trend), ending when it falls
//! below T/2 or changes sign. Common practice, no single source.
//!
//! **Confirmation and measurement.** For each lobe peaking at sample c, the
//! levels before and after are means over `w` samples outside the edge
//! (gap g = ⌈0.85·t_r/Δt⌉ + 1 each side), creep-corrected; the step
//! Δv must exceed max(k·σ·√(2/w), ρ_min·|V_inc|) and the creep over its own
//! edge, |s|·2g, or the lobe is dropped (a curving creep leaves residue in
//! the filter that this rejects). The
//! event time is the 50 % crossing between the two levels, linearly
//! interpolated (the same rule as time zero). ρ = Δv/V_inc; the cumulative
//! reflection after the event Γ = (v_after − v_pre)/V_inc − 1 gives
//! Z_after = Z_source·(1+Γ)/(1−Γ) (an open for Γ ≥ 1, a short for Γ ≤ −1).
//! Distances use [`distance_from_round_trip`] with the interval
//! [`timing_half_width_s`] (interpolated, instrument rise time).
//!
//! **Classification rules** (in this order):
//! 1. Two adjacent lobes of opposite sign (the second starting within g + 1
//!    samples of the end of the first) whose net level change is at most
//!    [`DetectSettings::lumped_max_net`] × the peak excursion form one lumped
//!    event: a dip is **capacitive**, a bump **inductive**. A is the area
//!    (V·s) of the excursion over a step baseline (level before, then level
//!    after, switching at the discontinuity). Between equal lines Z:
//!    C = −2A/(Z·V_inc), L = 2·Z·A/V_inc (Johnson & Graham, *High-Speed
//!    Digital Design*, 1993, value from memory). Between unequal lines Z1 → Z2
//!    (from the cumulative levels) the excursion is −(1+ρ∞)e^(−t/τ) with
//!    τ = C·Z1Z2/(Z1+Z2) for a shunt C and (1−ρ∞)e^(−t/τ) with τ = L/(Z1+Z2)
//!    for a series L, ρ∞ = (Z2−Z1)/(Z2+Z1), so
//!    C = −(A/V_inc)·(Z1+Z2)²/(2·Z1·Z2²) and L = (A/V_inc)·(Z1+Z2)²/(2·Z1)
//!    (derived here from the same Laplace-domain model; they reduce to the
//!    equal-line forms). The time is the excursion's centroid minus τ (the
//!    centroid of e^(−t/τ) lies τ after its start; a symmetric edge does not
//!    move it). ρ is the peak excursion over V_inc. The values assume the
//!    event sees the full incident step: earlier discontinuities scale them
//!    by their round-trip transmission.
//! 2. A step after which Γ ≥ [`DetectSettings::end_gamma`] (default 0.8) is an
//!    **open end**; Γ ≤ −end_gamma a **short**. Detection stops there: later
//!    lobes are echoes and only counted. A rising step on a level already at
//!    Γ ≥ end_gamma (falling, at ≤ −end_gamma) is the slow tail of a far end on
//!    a lossy cable: the impedance-up (-down) step just before it becomes the
//!    open end (short) and the tail is counted as an echo.
//! 3. Otherwise a step is **impedance up** (ρ > 0) or **impedance down**.
//!    If no open or short was found, the last large step
//!    (|ρ| ≥ [`DetectSettings::resistive_min_rho`]) is an **open end** or
//!    **short** when its *settled* level [`Event::gamma_settled`] (just
//!    before the next event or the end of the trace) passes ±end_gamma: a far
//!    end on a lossy cable rises slowly (skin effect), so its level right after
//!    the edge reads low. Limit: on a very long lossy cable (e.g. 200 m of
//!    thin PE coax) the step over the default filter stays below
//!    resistive_min_rho, and the end is reported as impedance up with
//!    `gamma_settled` ≈ ±1; set [`DetectSettings::filter_samples`] near the
//!    edge's length to classify it (tests/tests/tdr_roundtrip.rs). Its 50 %
//!    reading is then late by the skin-effect delay: correct it with
//!    [`crate::timing::edge::correct_skin_delay`].
//! 4. If no open or short was found, the last large event
//!    (|ρ| ≥ [`DetectSettings::resistive_min_rho`], default 0.1; smaller later
//!    ones are taken as multiple reflections), when it is a step that leaves
//!    the level at |Γ| ≥ the same bound (not back near the source impedance), is reported as
//!    **resistive**: the line ends in (or is lost in) a resistance
//!    R = Z_after — a series fault if ρ > 0, a shunt fault if ρ < 0. A step
//!    trace cannot tell this from a long matched section of another impedance.
//! 5. If no open or short was found, an **end of trace** event marks the last
//!    analysed sample (ρ = 0, Γ and Z there): nothing beyond it was seen.
//!
//! **Dead zone.** No event is claimed before sample t0 + g + w, where the
//! filter still sees the launch edge; a lobe already active there is dropped
//! and flagged ([`Analysis::masked_by_dead_zone`]). The last `w` samples
//! are not analysed either.
//!
//! **Memory and time.** O(1) extra memory: one running Haar filter
//! (re-summed every 257 samples to bound rounding drift) ahead by 2w and a
//! 256-value ring of its past outputs (1 KiB in f32, 2 KiB in f64, on the
//! stack), or three running filters when 4w ≥ 256; the lobe being built and
//! one pending lobe; three sample reads per sample. Away from the trace's
//! ends (3w ≤ n ≤ len − 3w) the ring case runs an interior loop with no
//! per-sample bounds or validity tests, reading a contiguous slice directly
//! when [`Samples::as_slice`] gives one; its results are bit-identical to
//! the checked per-sample path (about 38 instructions per sample against 117
//! before, `tests/scripts/callgrind.sh`). The noise floor uses a 256-point
//! stack array ([`super::noise`]). Results go into a
//! `heapless::Vec<Event<T>, N>`; overflow is [`Error::Capacity`].

use heapless::Vec;

use crate::error::{Error, Result};
use crate::scalar::Real;
use crate::tdr::noise::{noise_floor, NoiseFloor};
use crate::tdr::trace::{crossing_forward, Clipping, Samples, Trace};
use crate::timing::{distance_from_round_trip, timing_half_width_s, Distance};
use crate::value::{Extended, Impedance};

/// Tunable detection rules (defaults by [`Default`]).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DetectSettings<T> {
    /// Threshold in noise standard deviations of the filter output (default 6).
    pub k_sigma: T,
    /// Smallest |ρ| reported whatever the noise (default 0.005).
    pub min_rho: T,
    /// |Γ| after a step at or above which it is an open end / short (default 0.8).
    pub end_gamma: T,
    /// Smallest |ρ| and |Γ after| of the last large step for it to be
    /// reported as resistive (default 0.1).
    pub resistive_min_rho: T,
    /// Largest net level change of a lobe pair, as a fraction of its peak
    /// excursion, for it to be one lumped C/L event (default 0.5).
    pub lumped_max_net: T,
    /// Matched-filter length per side in samples (≥ 2); `None`: from the rise time.
    pub filter_samples: Option<usize>,
    /// Sample range `[from, to)` known to be quiet for the noise floor;
    /// `None`: the whole trace (robust statistics ignore the few edges).
    pub noise_range: Option<(usize, usize)>,
}

impl<T: Real> Default for DetectSettings<T> {
    fn default() -> Self {
        DetectSettings {
            k_sigma: T::lit(6.0),
            min_rho: T::lit(0.005),
            end_gamma: T::lit(0.8),
            resistive_min_rho: T::lit(0.1),
            lumped_max_net: T::lit(0.5),
            filter_samples: None,
            noise_range: None,
        }
    }
}

/// What an event is (see the module docs for the rules).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum EventKind {
    /// The line ends open (Γ ≥ end_gamma).
    OpenEnd,
    /// The line ends in a short (Γ ≤ −end_gamma).
    Short,
    /// A step to a higher impedance.
    ImpedanceUp,
    /// A step to a lower impedance.
    ImpedanceDown,
    /// A lumped shunt capacitance (a dip that returns).
    Capacitive,
    /// A lumped series inductance (a bump that returns).
    Inductive,
    /// The last step, to a level that is not ±1: a resistive end or fault.
    Resistive,
    /// The end of the analysed samples; the line's end was not seen.
    EndOfTrace,
}

/// The lumped value of a capacitive or inductive event.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Lumped<T> {
    /// Not a lumped event.
    None,
    /// Shunt capacitance, F.
    Capacitance {
        /// Farads.
        farads: T,
    },
    /// Series inductance, H.
    Inductance {
        /// Henries.
        henries: T,
    },
}

/// One event found in a trace.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Event<T> {
    /// What it is.
    pub kind: EventKind,
    /// Round-trip time from time zero, s (sub-sample, interpolated).
    pub round_trip_s: T,
    /// Half-width of the round-trip-time interval, s.
    pub t_half_width_s: T,
    /// One-way distance with its interval.
    pub distance: Distance<T>,
    /// Reflection coefficient of the event relative to the incident level
    /// (for lumped events: the peak excursion).
    pub rho: T,
    /// Standard deviation of `rho` from the noise floor.
    pub rho_sigma: T,
    /// Cumulative reflection after the event, Γ = (v − v_pre)/V_inc − 1.
    pub gamma_after: T,
    /// Impedance after the event from Γ (an open for Γ ≥ 1, 0 Ω for Γ ≤ −1).
    pub z_after: Impedance<T>,
    /// Cumulative reflection where the level has settled: the mean over the
    /// last filter length before the next event (or the end of the analysed
    /// samples). On a lossy cable a far end rises slowly and this, not
    /// `gamma_after`, shows where it goes.
    pub gamma_settled: T,
    /// Lumped C or L for capacitive / inductive events.
    pub lumped: Lumped<T>,
    /// |ρ·V_inc| / σ (infinite on a noiseless trace).
    pub snr: Extended<T>,
    /// A clipped sample lies in the event's measurement windows.
    pub clipped: bool,
}

/// Everything found in one trace.
#[derive(Clone, Debug)]
pub struct Analysis<T, const N: usize> {
    /// The events, in time order.
    pub events: Vec<Event<T>, N>,
    /// The noise floor used.
    pub noise: NoiseFloor<T>,
    /// Detection threshold on the filter output, V.
    pub threshold_v: T,
    /// Matched-filter length per side, samples.
    pub filter_samples: usize,
    /// Round-trip time to the end of the dead zone, s.
    pub dead_zone_s: T,
    /// Distance to the end of the dead zone.
    pub dead_zone: Distance<T>,
    /// Distance covered by the analysed samples (to the last one).
    pub range: Distance<T>,
    /// A lobe was already active where the dead zone ends (a fault may hide in it).
    pub masked_by_dead_zone: bool,
    /// Lobes after an open end / short (echoes), counted, not reported.
    pub echoes_after_end: usize,
    /// Lobes whose measured step fell below the level threshold.
    pub rejected_lobes: usize,
    /// Clipped samples in the trace.
    pub clipping: Clipping,
}

impl<T: Real, const N: usize> Analysis<T, N> {
    /// Empty storage for [`analyse_into`] (no events, zero figures).
    pub fn empty() -> Self {
        let zero_d = Distance {
            distance_m: T::zero(),
            lo_m: T::zero(),
            hi_m: T::zero(),
        };
        Analysis {
            events: Vec::new(),
            noise: NoiseFloor {
                sigma_v: T::zero(),
                points: 0,
            },
            threshold_v: T::zero(),
            filter_samples: 0,
            dead_zone_s: T::zero(),
            dead_zone: zero_d,
            range: zero_d,
            masked_by_dead_zone: false,
            echoes_after_end: 0,
            rejected_lobes: 0,
            clipping: Clipping::default(),
        }
    }
}

/// Impedance from a cumulative reflection: Z = Z_s·(1+Γ)/(1−Γ), open and
/// short explicit.
pub fn impedance_from_gamma<T: Real>(z_source_ohm: T, gamma: T) -> Impedance<T> {
    if gamma >= T::one() {
        Impedance::Open
    } else if gamma <= -T::one() {
        Impedance::ohms(T::zero())
    } else {
        Impedance::ohms(z_source_ohm * (T::one() + gamma) / (T::one() - gamma))
    }
}

/// A running Haar filter at one position.
#[derive(Clone, Copy)]
struct Haar<T> {
    pos: usize,
    sl: T,
    sr: T,
    ok: bool,
    since: u32,
}

impl<T: Real> Haar<T> {
    const RESUM: u32 = 256;

    fn new() -> Self {
        Haar {
            pos: 0,
            sl: T::zero(),
            sr: T::zero(),
            ok: false,
            since: 0,
        }
    }

    #[inline]
    fn goto<S: Samples<T> + ?Sized>(&mut self, s: &S, pos: Option<usize>, w: usize, len: usize) {
        let Some(p) = pos else {
            self.ok = false;
            return;
        };
        if p < w || p + w > len {
            self.ok = false;
            return;
        }
        let v = |i: usize| s.volts(i).unwrap_or(T::zero());
        if self.ok && self.pos + 1 == p && self.since < Self::RESUM {
            let q = self.pos;
            let mid = v(q);
            self.sr = self.sr - mid + v(q + w);
            self.sl = self.sl - v(q - w) + mid;
            self.since += 1;
        } else {
            self.sl = (p - w..p).fold(T::zero(), |a, i| a + v(i));
            self.sr = (p..p + w).fold(T::zero(), |a, i| a + v(i));
            self.since = 0;
        }
        self.pos = p;
        self.ok = true;
    }

    #[inline]
    fn value(&self, inv_w: T) -> Option<T> {
        if self.ok {
            Some((self.sr - self.sl) * inv_w)
        } else {
            None
        }
    }
}

/// Ring length for the filter history (power of two): with 4w + 1 ≤ RING the
/// neighbours S(n ± 2w) come from one running filter and this ring, else three
/// running filters are used.
const RING: usize = 256;

/// The filter output at n and at n ± 2w.
struct Filters<'r, T> {
    w: usize,
    len: usize,
    inv_w: T,
    ring: &'r mut [T; RING],
    use_ring: bool,
    lead: Haar<T>,
    hl: Haar<T>,
    hc: Haar<T>,
    hr: Haar<T>,
}

impl<'r, T: Real> Filters<'r, T> {
    /// The ring is the caller's (a local array in the analysis), so it is not
    /// copied through a return value: the firmware stack budget is 4 KiB.
    fn new<S: Samples<T> + ?Sized>(
        s: &S,
        w: usize,
        len: usize,
        n_start: usize,
        ring: &'r mut [T; RING],
    ) -> Self {
        ring.fill(T::nan());
        let mut f = Filters {
            w,
            len,
            inv_w: T::one() / T::from_usize(w),
            ring,
            use_ring: 4 * w < RING,
            lead: Haar::new(),
            hl: Haar::new(),
            hc: Haar::new(),
            hr: Haar::new(),
        };
        if f.use_ring {
            for p in n_start.saturating_sub(2 * w)..n_start + 2 * w {
                f.push(s, p);
            }
        }
        f
    }

    #[inline]
    fn push<S: Samples<T> + ?Sized>(&mut self, s: &S, p: usize) {
        self.lead.goto(s, Some(p), self.w, self.len);
        let v = self.lead.value(self.inv_w).unwrap_or(T::nan());
        if let Some(slot) = self.ring.get_mut(p % RING) {
            *slot = v;
        }
    }

    #[inline]
    fn read(&self, p: usize) -> Option<T> {
        self.ring.get(p % RING).copied().filter(|v| !v.is_nan())
    }

    /// (S(n), S(n − 2w), S(n + 2w)); `n` must advance by one per call.
    #[inline]
    fn at<S: Samples<T> + ?Sized>(&mut self, s: &S, n: usize) -> (Option<T>, Option<T>, Option<T>) {
        let w2 = 2 * self.w;
        if self.use_ring {
            self.push(s, n + w2);
            (
                self.read(n),
                n.checked_sub(w2).and_then(|q| self.read(q)),
                self.read(n + w2),
            )
        } else {
            self.hc.goto(s, Some(n), self.w, self.len);
            self.hl.goto(s, n.checked_sub(w2), self.w, self.len);
            self.hr.goto(s, Some(n + w2), self.w, self.len);
            (
                self.hc.value(self.inv_w),
                self.hl.value(self.inv_w),
                self.hr.value(self.inv_w),
            )
        }
    }

    /// First and one-past-last `n` of the interior: where S(n), S(n − 2w) and
    /// S(n + 2w) all exist (3w ≤ n, n + 3w ≤ len) and the ring serves them.
    /// Empty when the ring is not used.
    fn interior_range(&self, n_start: usize, n_end: usize) -> (usize, usize) {
        let w3 = 3 * self.w;
        let from = n_start.max(w3).min(n_end);
        let to = (self.len + 1).saturating_sub(w3).clamp(from, n_end);
        if self.use_ring {
            (from, to)
        } else {
            (from, from)
        }
    }

    /// [`Filters::at`] for `n` in `[from, to)` of the interior, without the
    /// per-sample edge tests, `Option`s and NaN checks: `each(n, S(n),
    /// S(n − 2w), S(n + 2w))`. `lanes(i, j)` yields, for n in `[i, j)`, the
    /// three samples the running sums drop and take in at each step,
    /// v(n + w − 1), v(n + 2w − 1), v(n + 3w − 1); `sum(a, b)` is the sum of
    /// v over `[a, b)` in index order (the re-sum). The arithmetic and the
    /// re-sum points are those of [`Haar::goto`], so the outputs are
    /// bit-identical; the loop runs in blocks between re-sums, so the inner
    /// loop has no re-sum test. Returns the `n` it stopped at (`from` if the
    /// filter state does not continue at `from`, earlier than `to` if `lanes`
    /// came up short): the caller goes on sample by sample from there.
    #[inline(always)]
    fn interior<L, I, F, E>(
        &mut self,
        from: usize,
        to: usize,
        lanes: L,
        sum: F,
        mut each: E,
    ) -> Result<usize>
    where
        L: Fn(usize, usize) -> I,
        I: Iterator<Item = (T, T, T)>,
        F: Fn(usize, usize) -> T,
        E: FnMut(usize, T, T, T) -> Result<()>,
    {
        const MASK: usize = RING - 1;
        let resum = Haar::<T>::RESUM;
        let (w, w2) = (self.w, 2 * self.w);
        let lead = self.lead;
        if from >= to || !self.use_ring || !lead.ok || lead.pos + 1 != from + w2 || from < w2 {
            return Ok(from);
        }
        let inv_w = self.inv_w;
        let (mut sl, mut sr, mut since) = (lead.sl, lead.sr, lead.since);
        let ring = &mut *self.ring;
        // Stores S(n + 2w) and reads S(n), S(n − 2w) (n ≥ 2w, so no wrap).
        let mut rotate = |n: usize, right: T| {
            if let Some(slot) = ring.get_mut((n + w2) & MASK) {
                *slot = right;
            }
            let centre = ring.get(n & MASK).copied().unwrap_or(T::zero());
            let left = ring.get((n - w2) & MASK).copied().unwrap_or(T::zero());
            (centre, left)
        };
        let mut n = from;
        while n < to {
            if since >= resum {
                let p = n + w2;
                sl = sum(p - w, p);
                sr = sum(p, p + w);
                since = 0;
                let right = (sr - sl) * inv_w;
                let (centre, left) = rotate(n, right);
                each(n, centre, left, right)?;
                n += 1;
                continue;
            }
            let (start, end) = (n, to.min(n + (resum - since) as usize));
            for (a, b, c) in lanes(start, end) {
                sr = sr - b + c;
                sl = sl - a + b;
                let right = (sr - sl) * inv_w;
                let (centre, left) = rotate(n, right);
                each(n, centre, left, right)?;
                n += 1;
            }
            since += (n - start) as u32;
            if n < end {
                break;
            }
        }
        self.lead = Haar {
            pos: n - 1 + w2,
            sl,
            sr,
            ok: true,
            since,
        };
        Ok(n)
    }
}

/// A run of filter output above threshold.
#[derive(Clone, Copy, Debug)]
struct Lobe<T> {
    sign: T,
    start: usize,
    end: usize,
    peak_idx: usize,
    peak: T,
    trend: T,
}

/// The minmod of two creep estimates: the one of smaller magnitude when both
/// have the same sign, else 0 (written with ordered selects so that it
/// compiles to min/max instructions, no products or absolute values).
#[inline(always)]
fn minmod<T: Real>(a: T, b: T) -> T {
    let (lo, hi) = if a < b { (a, b) } else { (b, a) };
    let pos = if lo > T::zero() { lo } else { T::zero() };
    let neg = if hi < T::zero() { hi } else { T::zero() };
    pos + neg
}

/// The one of smaller magnitude (the first on a tie).
#[inline(always)]
fn smaller<T: Real>(a: T, b: T) -> T {
    if a.abs() <= b.abs() {
        a
    } else {
        b
    }
}

/// The lobe being built, the one waiting for a partner, and the thresholds.
struct Scan<T> {
    lobe: Option<Lobe<T>>,
    pending: Option<Lobe<T>>,
    masked: bool,
    n_start: usize,
    thr: T,
    half_thr: T,
}

impl<T: Real> Scan<T> {
    /// One filter output `x` (trend removed) at sample `n`; `neighbours` are
    /// the creep estimates either side, whose smaller ([`smaller`]) is kept
    /// with a lobe's peak for its level measurement (taken only there).
    #[inline(always)]
    #[allow(clippy::neg_cmp_op_on_partial_ord)]
    fn sample<S: Samples<T> + ?Sized, const N: usize>(
        &mut self,
        run: &mut Run<'_, '_, '_, T, S, N>,
        n: usize,
        x: T,
        neighbours: (T, T),
    ) -> Result<()> {
        let ax = x.abs();
        // The common case, inline: no lobe and nothing above the threshold.
        // Written `!(ax > thr)`, the negation of the rule's own test (one
        // compare fewer per sample than `ax <= thr` as compiled).
        if self.lobe.is_none() && !(ax > self.thr) {
            return Ok(());
        }
        self.lobe_sample(run, n, x, ax, neighbours)
    }

    /// [`Scan::sample`] inside a lobe or at its start (kept out of line so
    /// that the loops stay small).
    #[inline(never)]
    fn lobe_sample<S: Samples<T> + ?Sized, const N: usize>(
        &mut self,
        run: &mut Run<'_, '_, '_, T, S, N>,
        n: usize,
        x: T,
        ax: T,
        neighbours: (T, T),
    ) -> Result<()> {
        if let Some(l) = self.lobe.as_mut() {
            if x.signum() == l.sign && ax > self.half_thr {
                if ax > l.peak {
                    l.peak = ax;
                    l.peak_idx = n;
                    l.trend = smaller(neighbours.0, neighbours.1);
                }
                l.end = n + 1;
                return Ok(());
            }
            let l = *l;
            self.lobe = None;
            if l.start == self.n_start {
                self.masked = true;
            } else {
                run.lobe_done(&mut self.pending, l)?;
            }
        }
        if ax > self.thr {
            self.lobe = Some(Lobe {
                sign: x.signum(),
                start: n,
                end: n + 1,
                peak_idx: n,
                peak: ax,
                trend: smaller(neighbours.0, neighbours.1),
            });
        }
        Ok(())
    }
}

/// An event before distances are attached.
struct Found<T> {
    kind: EventKind,
    t_index: T,
    rho: T,
    rho_sigma: T,
    gamma_after: T,
    lumped: Lumped<T>,
    dv: T,
    clipped: bool,
}

struct Run<'t, 'a, 'o, T, S: ?Sized, const N: usize> {
    trace: &'t Trace<'a, T, S>,
    set: DetectSettings<T>,
    sigma: T,
    w: usize,
    g: usize,
    level_thr: T,
    out: &'o mut Vec<Event<T>, N>,
    ended: bool,
    echoes: usize,
    rejected: usize,
    t_hw: T,
}

impl<T: Real, S: Samples<T> + ?Sized, const N: usize> Run<'_, '_, '_, T, S, N> {
    fn v(&self, i: usize) -> T {
        self.trace.samples.volts(i).unwrap_or(T::zero())
    }

    /// Mean over `[a, b)` clamped to the trace, and whether any sample is clipped.
    fn mean(&self, a: usize, b: usize) -> Option<(T, bool)> {
        let b = b.min(self.trace.len);
        if a >= b {
            return None;
        }
        let mut sum = T::zero();
        let mut clip = false;
        for i in a..b {
            sum = sum + self.v(i);
            clip |= self.trace.samples.is_clipped(i);
        }
        Some((sum / T::from_usize(b - a), clip))
    }

    fn step(&mut self, l: &Lobe<T>) -> Option<Found<T>> {
        let (c, g, m) = (l.peak_idx, self.g, self.w);
        let (b0, b1) = (c.saturating_sub(g + m), c.saturating_sub(g));
        let (a0, a1) = (c + g, (c + g + m).min(self.trace.len));
        let (mb, cb) = self.mean(b0, b1)?;
        let (ma, ca) = self.mean(a0, a1)?;
        let slope = l.trend / T::from_usize(self.w);
        let centre_b = T::from_usize(b0 + b1) * T::half();
        let centre_a = T::from_usize(a0 + a1) * T::half();
        let dv = ma - mb - slope * (centre_a - centre_b);
        // A step must exceed the noise and the creep over its own edge (2g).
        if dv.abs() < self.level_thr.max(slope.abs() * T::from_usize(2 * g)) {
            self.rejected += 1;
            return None;
        }
        let mid =
            (ma + mb) * T::half() - slope * ((centre_a + centre_b) * T::half() - T::from_usize(c));
        let t_index = crossing_forward(self.trace.samples, b1, a0 + 1, mid, dv.signum())
            .unwrap_or(T::from_usize(c));
        let gamma_after = self
            .trace
            .gamma_at_level(ma - slope * (centre_a - T::from_usize(c)));
        let vinc = self.trace.incident_v;
        let end = self.set.end_gamma;
        let gamma_before = gamma_after - dv / vinc;
        // A step of the same sign on a level already past ±end_gamma is the
        // slow tail of a far end on a lossy cable: the step before it is the end.
        let tail_of = if gamma_before >= end && dv / vinc > T::zero() {
            Some(EventKind::OpenEnd)
        } else if gamma_before <= -end && dv / vinc < T::zero() {
            Some(EventKind::Short)
        } else {
            None
        };
        if let Some(end_kind) = tail_of {
            let want = if end_kind == EventKind::OpenEnd {
                EventKind::ImpedanceUp
            } else {
                EventKind::ImpedanceDown
            };
            if let Some(prev) = self.out.last_mut().filter(|p| p.kind == want) {
                prev.kind = end_kind;
                self.ended = true;
                self.echoes += 1;
                return None;
            }
        }
        let kind = if gamma_after >= end {
            EventKind::OpenEnd
        } else if gamma_after <= -end {
            EventKind::Short
        } else if dv / vinc > T::zero() {
            EventKind::ImpedanceUp
        } else {
            EventKind::ImpedanceDown
        };
        Some(Found {
            kind,
            t_index,
            rho: dv / vinc,
            rho_sigma: self.sigma * (T::two() / T::from_usize(m)).sqrt() / vinc.abs(),
            gamma_after,
            lumped: Lumped::None,
            dv,
            clipped: cb || ca,
        })
    }

    /// A lobe pair as one lumped event, or `None` if the net change is too large.
    fn lumped(&mut self, l1: &Lobe<T>, l2: &Lobe<T>) -> Option<Option<Found<T>>> {
        let m = self.w;
        let (s, e) = (l1.start, l2.end.min(self.trace.len));
        let (b0, b1) = (s.saturating_sub(m), s);
        let (a0, a1) = (e, e + m);
        let (mb, cb) = self.mean(b0, b1)?;
        let (ma, ca) = self.mean(a0, a1)?;
        let centre_b = T::from_usize(b0 + b1) * T::half();
        let centre_a = T::from_usize(a0 + a1) * T::half();
        let slope = (ma - mb) / (centre_a - centre_b).max(T::one());
        let mut area = T::zero();
        let mut moment = T::zero();
        let mut ext = T::zero();
        let mut clip = cb || ca;
        for i in s..e {
            let x = self.v(i) - (mb + slope * (T::from_usize(i) - centre_b));
            area = area + x;
            moment = moment + x * T::from_usize(i);
            if x.abs() > ext.abs() {
                ext = x;
            }
            clip |= self.trace.samples.is_clipped(i);
        }
        let net = ma - mb;
        if net.abs() > self.set.lumped_max_net * ext.abs() || area == T::zero() {
            return None;
        }
        if ext.abs() < self.level_thr {
            self.rejected += 1;
            return Some(None);
        }
        let dt = self.trace.dt_s;
        let vinc = self.trace.incident_v;
        let capacitive = area / vinc < T::zero();
        let z1 =
            impedance_from_gamma(self.trace.source_ohm, self.trace.gamma_at_level(mb)).finite();
        let z2 =
            impedance_from_gamma(self.trace.source_ohm, self.trace.gamma_at_level(ma)).finite();
        // τ and the lumped value from the normalised area a_s = ∫(ρ − ρ∞) dt.
        let value = |a_s: T| -> (Lumped<T>, T) {
            match (z1, z2) {
                (Some(z1), Some(z2)) if z1.re > T::zero() && z2.re > T::zero() => {
                    let (z1, z2) = (z1.re, z2.re);
                    let sum = z1 + z2;
                    let rho_inf = (z2 - z1) / sum;
                    if capacitive {
                        // Excursion −(1+ρ∞)e^(−t/τ), τ = C·Z1Z2/(Z1+Z2).
                        let c = -a_s * sum * sum / (T::two() * z1 * z2 * z2);
                        (
                            Lumped::Capacitance { farads: c },
                            -a_s / (T::one() + rho_inf),
                        )
                    } else {
                        // Excursion (1−ρ∞)e^(−t/τ), τ = L/(Z1+Z2).
                        let l = a_s * sum * sum / (T::two() * z1);
                        (
                            Lumped::Inductance { henries: l },
                            a_s / (T::one() - rho_inf),
                        )
                    }
                }
                _ => (Lumped::None, a_s.abs()),
            }
        };
        // Start from the straight-line baseline, then refine a step baseline at
        // the discontinuity t = centroid − τ (three passes converge well
        // within a sample).
        let (mut lumped, mut tau_s) = value(area * dt / vinc);
        let mut t_index = moment / area - tau_s / dt;
        for _ in 0..3 {
            let (mut area2, mut moment2) = (T::zero(), T::zero());
            for i in s..e {
                let fi = T::from_usize(i);
                let frac = (fi - t_index + T::half()).max(T::zero()).min(T::one());
                let x = self.v(i) - (mb + net * frac);
                area2 = area2 + x;
                moment2 = moment2 + x * fi;
            }
            if area2 == T::zero() || (area2 / vinc < T::zero()) != capacitive {
                break;
            }
            (lumped, tau_s) = value(area2 * dt / vinc);
            t_index = moment2 / area2 - tau_s / dt;
        }
        Some(Some(Found {
            kind: if capacitive {
                EventKind::Capacitive
            } else {
                EventKind::Inductive
            },
            t_index,
            rho: ext / vinc,
            rho_sigma: self.sigma / vinc.abs(),
            gamma_after: self.trace.gamma_at_level(ma),
            lumped,
            dv: ext,
            clipped: clip,
        }))
    }

    fn push(&mut self, f: Found<T>) -> Result<()> {
        let t = self.trace;
        let t_round_s = ((f.t_index - t.t0_index) * t.dt_s).max(T::zero());
        let distance = distance_from_round_trip(t_round_s, self.t_hw, &t.velocity)?;
        let snr = if self.sigma > T::zero() {
            Extended::Finite(f.dv.abs() / self.sigma)
        } else {
            Extended::Infinite
        };
        if matches!(f.kind, EventKind::OpenEnd | EventKind::Short) {
            self.ended = true;
        }
        self.out
            .push(Event {
                kind: f.kind,
                round_trip_s: t_round_s,
                t_half_width_s: self.t_hw,
                distance,
                rho: f.rho,
                rho_sigma: f.rho_sigma,
                gamma_after: f.gamma_after,
                z_after: impedance_from_gamma(t.source_ohm, f.gamma_after),
                gamma_settled: f.gamma_after,
                lumped: f.lumped,
                snr,
                clipped: f.clipped,
            })
            .map_err(|_| Error::Capacity {
                what: "events",
                capacity: N,
            })
    }

    /// Handles a finished lobe given the pending one.
    fn lobe_done(&mut self, pending: &mut Option<Lobe<T>>, l: Lobe<T>) -> Result<()> {
        if self.ended {
            self.echoes += 1;
            return Ok(());
        }
        if let Some(p) = pending.take() {
            // Opposite lobes close together are one lumped event, unless their
            // peaks lie more than 2w apart: then the level between them is a
            // resolved plateau (a short section), read as two steps.
            if p.sign != l.sign
                && l.start <= p.end + self.g + 1
                && l.peak_idx <= p.peak_idx + 2 * self.w
            {
                match self.lumped(&p, &l) {
                    Some(Some(f)) => return self.push(f),
                    Some(None) => return Ok(()),
                    None => {}
                }
            }
            if let Some(f) = self.step(&p) {
                self.push(f)?;
            }
            if self.ended {
                self.echoes += 1;
                return Ok(());
            }
        }
        *pending = Some(l);
        Ok(())
    }
}

/// Analyses a trace: noise floor, events, classification (see module docs).
///
/// Errors: [`Error::Capacity`] when more than `N` events are found;
/// [`Error::TooShort`] when the trace leaves no samples past the dead zone;
/// invalid settings (`NotPositive("k_sigma")`, `Negative("min_rho")`,
/// `OutOfRange("end_gamma")`, `OutOfRange("filter_samples")`).
pub fn analyse<T: Real, S: Samples<T> + ?Sized, const N: usize>(
    trace: &Trace<'_, T, S>,
    settings: &DetectSettings<T>,
) -> Result<Analysis<T, N>> {
    let mut out = Analysis::empty();
    analyse_into(trace, settings, &mut out)?;
    Ok(out)
}

/// As [`analyse`], but fills caller-provided storage in place (no copy of the
/// event list through return values: the firmware path uses this to stay
/// within its stack budget). `out` is overwritten; on error its content is
/// unspecified (its events may be partly written).
pub fn analyse_into<T: Real, S: Samples<T> + ?Sized, const N: usize>(
    trace: &Trace<'_, T, S>,
    settings: &DetectSettings<T>,
    out: &mut Analysis<T, N>,
) -> Result<()> {
    analyse_with(trace, settings, out, true)
}

/// [`analyse_into`]; `interior: false` takes every sample through the
/// checked edge path (the reference the interior loop is tested against).
fn analyse_with<T: Real, S: Samples<T> + ?Sized, const N: usize>(
    trace: &Trace<'_, T, S>,
    settings: &DetectSettings<T>,
    out: &mut Analysis<T, N>,
    interior: bool,
) -> Result<()> {
    out.events.clear();
    let set = *settings;
    crate::error::positive(set.k_sigma, "k_sigma")?;
    crate::error::non_negative(set.min_rho, "min_rho")?;
    crate::error::in_range(set.end_gamma, T::zero(), T::one(), "end_gamma")?;
    crate::error::non_negative(set.resistive_min_rho, "resistive_min_rho")?;
    crate::error::non_negative(set.lumped_max_net, "lumped_max_net")?;
    let len = trace.len;
    let dt = trace.dt_s;
    let rise_samples = trace.rise_time_s / dt;
    let w = match set.filter_samples {
        Some(w) if w >= 2 && w.saturating_mul(8) < len => w,
        Some(_) => return Err(Error::OutOfRange("filter_samples")),
        None => {
            let w = (T::two() * rise_samples)
                .ceil()
                .to_i64_sat()
                .clamp(4, i64::from(u32::MAX)) as usize;
            if w.saturating_mul(8) >= len {
                return Err(Error::TooShort {
                    what: "samples",
                    needed: w.saturating_mul(8).saturating_add(1),
                });
            }
            w
        }
    };
    let g = (T::lit(0.85) * rise_samples).ceil().to_i64_sat().max(0) as usize + 1;
    let noise = match set.noise_range {
        Some((from, to)) if from < to && to <= len => noise_floor(trace.samples, from, to)?,
        Some(_) => return Err(Error::OutOfRange("noise_range")),
        None => noise_floor(trace.samples, 0, len)?,
    };
    let sigma = noise.sigma_v;
    let vinc_abs = trace.incident_v.abs();
    let inv_w = T::one() / T::from_usize(w);
    let sigma_s = sigma * (T::two() * inv_w).sqrt();
    let thr = (set.k_sigma * T::two().sqrt() * sigma_s).max(T::half() * set.min_rho * vinc_abs);
    let level_thr = (set.k_sigma * sigma_s).max(set.min_rho * vinc_abs);
    let t0 = trace.t0_index;
    let n_start = (t0.ceil().to_i64_sat().max(0) as usize) + g + w;
    let n_end = len.saturating_sub(w);
    if n_start + 2 >= n_end {
        return Err(Error::TooShort {
            what: "samples past the dead zone",
            needed: n_start + w + 3,
        });
    }
    let t_hw = timing_half_width_s(dt, true, trace.rise_time_s)?;
    let dead_zone_s = (T::from_usize(n_start) - t0) * dt;
    let dead_zone = distance_from_round_trip(dead_zone_s, t_hw, &trace.velocity)?;
    let range =
        distance_from_round_trip((T::from_usize(n_end - 1) - t0) * dt, t_hw, &trace.velocity)?;

    let mut run: Run<'_, '_, '_, T, S, N> = Run {
        trace,
        set,
        sigma,
        w,
        g,
        level_thr,
        out: &mut out.events,
        ended: false,
        echoes: 0,
        rejected: 0,
        t_hw,
    };
    let mut ring = [T::nan(); RING];
    let mut filters = Filters::new(trace.samples, w, len, n_start, &mut ring);
    let mut scan = Scan {
        lobe: None,
        pending: None,
        masked: false,
        n_start,
        thr,
        half_thr: thr * T::half(),
    };
    let s = trace.samples;
    // Creep estimates from the filter outputs 2w either side. For detection,
    // their minmod: a slow creep gives outputs of one sign on both sides, while
    // outputs of opposite signs are two real edges (both ends of a short
    // section), which must not be subtracted or they invent steps. For the
    // level measurement of a step, the smaller of the two ([`smaller`]): on
    // a lossy cable the level before an edge creeps one way and the edge's own
    // slow tail the other, and extrapolating with the smaller creep reads the
    // step height best.
    //
    // Edges (sample by sample, through the filters' checked reads), then the
    // interior (no edge tests), then the edge at the far end.
    let edge = |n: usize, filters: &mut Filters<'_, T>| {
        let (sc, left, right) = filters.at(s, n);
        let sc = sc.unwrap_or(T::zero());
        let (trend, neighbours) = match (left, right) {
            (Some(a), Some(b)) => (minmod(a, b), (a, b)),
            (Some(a), None) => (a, (a, a)),
            (None, Some(b)) => (b, (b, b)),
            (None, None) => (T::zero(), (T::zero(), T::zero())),
        };
        (sc - trend, neighbours)
    };
    let (from, to) = if interior {
        filters.interior_range(n_start, n_end)
    } else {
        (n_end, n_end)
    };
    for n in n_start..from {
        let (x, neighbours) = edge(n, &mut filters);
        scan.sample(&mut run, n, x, neighbours)?;
    }
    let each = |n: usize, centre: T, left: T, right: T| {
        scan.sample(&mut run, n, centre - minmod(left, right), (left, right))
    };
    let resume = match s.as_slice() {
        Some(v) => {
            // Three checked sub-slices read in step (empty if out of range:
            // the loop then stops and the checked path takes over).
            let lanes = |i: usize, j: usize| {
                let lane = |k: usize| v.get(i + k * w - 1..j + k * w - 1).unwrap_or(&[]);
                lane(1)
                    .iter()
                    .zip(lane(2))
                    .zip(lane(3))
                    .map(|((&a, &b), &c)| (a, b, c))
            };
            let sum = |i: usize, j: usize| {
                v.get(i..j)
                    .map_or(T::zero(), |x| x.iter().fold(T::zero(), |acc, &y| acc + y))
            };
            filters.interior(from, to, lanes, sum, each)?
        }
        None => {
            let v = |i: usize| s.volts(i).unwrap_or(T::zero());
            let lanes = |i: usize, j: usize| {
                (i..j).map(move |n| (v(n + w - 1), v(n + 2 * w - 1), v(n + 3 * w - 1)))
            };
            let sum = |i: usize, j: usize| (i..j).fold(T::zero(), |acc, k| acc + v(k));
            filters.interior(from, to, lanes, sum, each)?
        }
    };
    for n in resume..n_end {
        let (x, neighbours) = edge(n, &mut filters);
        scan.sample(&mut run, n, x, neighbours)?;
    }
    let Scan {
        lobe,
        mut pending,
        mut masked,
        ..
    } = scan;
    if let Some(l) = lobe {
        if l.start == n_start {
            masked = true;
        } else {
            run.lobe_done(&mut pending, l)?;
        }
    }
    if let Some(p) = pending.take() {
        if run.ended {
            run.echoes += 1;
        } else if let Some(f) = run.step(&p) {
            run.push(f)?;
        }
    }
    // Settled level of each event: the mean over the `w` samples that end
    // g before the next event (or at the last analysed sample).
    let to_index = |rt: T| (t0 + rt / dt).floor().to_i64_sat().max(0) as usize;
    for j in 0..run.out.len() {
        let Some(e) = run.out.get(j) else { break };
        let here = to_index(e.round_trip_s) + g;
        let end = run
            .out
            .get(j + 1)
            .map_or(n_end, |nx| to_index(nx.round_trip_s).saturating_sub(g))
            .min(n_end);
        let start = end.saturating_sub(w).max(here);
        if let Some((m, _)) = run.mean(start, end) {
            let gs = trace.gamma_at_level(m);
            if let Some(e) = run.out.get_mut(j) {
                e.gamma_settled = gs;
            }
        }
    }
    if !run.ended {
        let big = set.resistive_min_rho;
        if let Some(last) = run.out.iter_mut().rev().find(|e| e.rho.abs() >= big) {
            if matches!(last.kind, EventKind::ImpedanceUp | EventKind::ImpedanceDown) {
                if last.gamma_settled >= set.end_gamma {
                    last.kind = EventKind::OpenEnd;
                    run.ended = true;
                } else if last.gamma_settled <= -set.end_gamma {
                    last.kind = EventKind::Short;
                    run.ended = true;
                } else if last.gamma_after.abs() >= big {
                    last.kind = EventKind::Resistive;
                }
            }
        }
    }
    if !run.ended {
        let (m_end, clip) = run
            .mean(n_end.saturating_sub(w), n_end)
            .ok_or(Error::Undefined("samples"))?;
        let gamma = trace.gamma_at_level(m_end);
        run.push(Found {
            kind: EventKind::EndOfTrace,
            t_index: T::from_usize(n_end - 1),
            rho: T::zero(),
            rho_sigma: T::zero(),
            gamma_after: gamma,
            lumped: Lumped::None,
            dv: T::zero(),
            clipped: clip,
        })?;
        // An end of trace is not an end of the line.
        run.ended = false;
    }
    let (echoes, rejected) = (run.echoes, run.rejected);
    out.noise = noise;
    out.threshold_v = thr;
    out.filter_samples = w;
    out.dead_zone_s = dead_zone_s;
    out.dead_zone = dead_zone;
    out.range = range;
    out.masked_by_dead_zone = masked;
    out.echoes_after_end = echoes;
    out.rejected_lobes = rejected;
    out.clipping = trace.clipping;
    Ok(())
}

impl<'a, T: Real, S: Samples<T> + ?Sized> Trace<'a, T, S> {
    /// Analyses this trace into at most `N` events; see [`analyse`].
    pub fn analyse<const N: usize>(&self, settings: &DetectSettings<T>) -> Result<Analysis<T, N>> {
        analyse(self, settings)
    }

    /// Analyses this trace into caller storage; see [`analyse_into`].
    pub fn analyse_into<const N: usize>(
        &self,
        settings: &DetectSettings<T>,
        out: &mut Analysis<T, N>,
    ) -> Result<()> {
        analyse_into(self, settings, out)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tdr::trace::{TimeZero, TraceSetup};
    use crate::timing::VelocityRange;

    #[test]
    fn running_haar_equals_direct_sums() {
        let mut x = [0.0f32; 1200];
        for (i, v) in x.iter_mut().enumerate() {
            *v = ((i * 7919) % 101) as f32 * 0.01 + if i > 600 { 1.0 } else { 0.0 };
        }
        let w = 5;
        let mut h = Haar::new();
        for n in 0..1200 {
            h.goto(&x[..], Some(n), w, x.len());
            let direct = if n >= w && n + w <= x.len() {
                let l: f32 = x[n - w..n].iter().sum();
                let r: f32 = x[n..n + w].iter().sum();
                Some((r - l) / w as f32)
            } else {
                None
            };
            match (h.value(1.0 / w as f32), direct) {
                (Some(a), Some(b)) => assert!((a - b).abs() < 1e-4, "{n}: {a} {b}"),
                (None, None) => {}
                other => panic!("{n}: {other:?}"),
            }
        }
    }

    #[test]
    fn ring_and_three_filters_agree() {
        let mut x = [0.0f64; 3000];
        for (i, v) in x.iter_mut().enumerate() {
            *v = ((i * 7919) % 101) as f64 * 0.01 + if i > 1500 { 1.0 } else { 0.0 };
        }
        for w in [3usize, 40, RING / 4 - 1] {
            let n_start = 50;
            let (mut ra, mut rb) = ([0.0; RING], [0.0; RING]);
            let mut a = Filters::new(&x[..], w, x.len(), n_start, &mut ra);
            let mut b = Filters::new(&x[..], w, x.len(), n_start, &mut rb);
            assert!(a.use_ring);
            b.use_ring = false;
            for n in n_start..x.len() - w {
                let (p, q) = (a.at(&x[..], n), b.at(&x[..], n));
                let same = |u: Option<f64>, v: Option<f64>| match (u, v) {
                    (Some(u), Some(v)) => (u - v).abs() < 1e-9,
                    (None, None) => true,
                    _ => false,
                };
                assert!(
                    same(p.0, q.0) && same(p.1, q.1) && same(p.2, q.2),
                    "w {w} n {n}: {p:?} {q:?}"
                );
            }
        }
        let mut r = [0.0; RING];
        assert!(!Filters::new(&x[..], RING / 4, x.len(), 0, &mut r).use_ring);
    }

    /// The select form of minmod equals the product form it replaced
    /// (`a·b ≤ 0 → 0`, else the smaller magnitude) wherever the product does
    /// not underflow, and gives +0 (not −0) when it is zero.
    #[test]
    fn minmod_matches_the_product_form() {
        let vals = [-3.0f64, -1.5, -1e-3, -0.0, 0.0, 1e-3, 1.5, 3.0, 2e12, -2e12];
        for &a in &vals {
            for &b in &vals {
                let want = if a * b <= 0.0 { 0.0 } else { smaller(a, b) };
                let got = minmod(a, b);
                assert_eq!(got.to_bits(), want.to_bits(), "{a} {b}");
                let got32 = minmod(a as f32, b as f32);
                let want32 = if (a as f32) * (b as f32) <= 0.0 {
                    0.0
                } else {
                    smaller(a as f32, b as f32)
                };
                assert_eq!(got32.to_bits(), want32.to_bits(), "{a} {b}");
            }
        }
        // Underflowing product: two tiny same-sign creeps now count as a creep.
        assert_eq!(minmod(1e-30f32, 2e-30), 1e-30);
    }

    /// Invented test traces: launch, steps, a lumped dip, a slow creep and
    /// deterministic dither (LCG), `len` samples.
    fn test_trace(out: &mut [f64], seed: u32, creep: f64, noise: f64) {
        let len = out.len();
        let mut x = seed;
        let edge = |i: usize, at: usize| if i >= at { 1.0 } else { 0.0 };
        for (i, v) in out.iter_mut().enumerate() {
            *v = {
                x = x.wrapping_mul(1_664_525).wrapping_add(1_013_904_223);
                let d = ((x >> 8) as f64 / (1u32 << 24) as f64 - 0.5) * noise;
                let launch = edge(i, len / 16);
                let f = |k: usize| len * k / 32;
                let dip = if (f(9)..f(9) + 3).contains(&i) {
                    -0.1
                } else {
                    0.0
                };
                let creep = creep * i.saturating_sub(len / 16) as f64;
                launch * (0.5 + 0.1 * edge(i, f(5)) - 0.15 * edge(i, f(13)) + dip + creep)
                    + 0.3 * edge(i, f(24))
                    + d
            };
        }
    }

    fn same_analysis<T: Real, S: Samples<T> + ?Sized>(t: &Trace<'_, T, S>, w: Option<usize>) {
        let set = DetectSettings {
            filter_samples: w,
            ..DetectSettings::default()
        };
        let (mut a, mut b) = (Analysis::<T, 16>::empty(), Analysis::<T, 16>::empty());
        let ra = analyse_with(t, &set, &mut a, true);
        let rb = analyse_with(t, &set, &mut b, false);
        assert_eq!(ra, rb, "w {w:?}");
        assert_eq!(a.events, b.events, "w {w:?}");
        assert_eq!(
            (a.masked_by_dead_zone, a.echoes_after_end, a.rejected_lobes),
            (b.masked_by_dead_zone, b.echoes_after_end, b.rejected_lobes),
            "w {w:?}"
        );
        assert_eq!(a.threshold_v, b.threshold_v);
    }

    /// The interior loop (no per-sample checks) gives bit-identical results
    /// to the checked path, for float slices, arrays and ADC codes, across
    /// filter lengths (ring and three-filter cases, re-sums within and
    /// across the interior), short and long traces.
    #[test]
    fn interior_loop_is_bit_identical_to_the_checked_path() {
        use crate::tdr::trace::{AdcCodes, TimeZero, TraceSetup};
        let vel = VelocityRange::from_factor(0.66, 0.01).unwrap();
        let mut found_events = 0;
        for (len, seed, creep, noise) in [
            (200usize, 1u32, 0.0, 2e-3),
            (1000, 2, 1e-5, 2e-3),
            (3000, 3, -2e-5, 1e-2),
            (5000, 4, 0.0, 0.0),
            (777, 5, 3e-5, 5e-4),
        ] {
            let (mut xb, mut x32b, mut cb) = ([0.0f64; 5000], [0.0f32; 5000], [0i16; 5000]);
            let x = &mut xb[..len];
            test_trace(x, seed, creep, noise);
            let (x32, codes) = (&mut x32b[..len], &mut cb[..len]);
            for ((a, b), c) in x.iter().zip(x32.iter_mut()).zip(codes.iter_mut()) {
                *b = *a as f32;
                *c = (*a * 4000.0) as i16;
            }
            let (x, x32, codes) = (&*x, &*x32, &*codes);
            let mut su = TraceSetup::measured(1e-10, 50.0, vel);
            let su32 = TraceSetup::measured(
                1e-10f32,
                50.0,
                VelocityRange::from_factor(0.66f32, 0.01).unwrap(),
            );
            su.time_zero = TimeZero::FromLaunch;
            let t64 = Trace::new(x, su).unwrap();
            let t32 = Trace::new(x32, su32).unwrap();
            let adc = AdcCodes::<i16, f64>::new(codes, 1.0 / 4000.0, 0.0).unwrap();
            let tadc = Trace::new(&adc, su).unwrap();
            for w in [
                None,
                Some(2),
                Some(3),
                Some(8),
                Some(21),
                Some(63),
                Some(64),
                Some(90),
            ] {
                if w.is_some_and(|w| 8 * w >= len) {
                    continue;
                }
                same_analysis(&t64, w);
                same_analysis(&t32, w);
                same_analysis(&tadc, w);
                if let Ok(a) = t64.analyse::<16>(&DetectSettings {
                    filter_samples: w,
                    ..DetectSettings::default()
                }) {
                    found_events += a.events.len();
                }
            }
        }
        // The comparison is not vacuous: events were found.
        assert!(found_events > 20, "{found_events}");
        let mut arr = [0.0f64; 600];
        test_trace(&mut arr, 9, 0.0, 1e-3);
        let ta = Trace::new(&arr, TraceSetup::measured(1e-10, 50.0, vel)).unwrap();
        same_analysis(&ta, Some(5));
    }

    #[test]
    fn impedance_from_gamma_is_explicit_at_the_ends() {
        assert_eq!(impedance_from_gamma(50.0f64, 1.0), Impedance::Open);
        assert_eq!(impedance_from_gamma(50.0f64, 1.5), Impedance::Open);
        assert_eq!(impedance_from_gamma(50.0f64, -1.0), Impedance::ohms(0.0));
        // Γ = 0.2 → 75 Ω; Γ = −1/3 → 25 Ω.
        let z = impedance_from_gamma(50.0f64, 0.2).finite().unwrap().re;
        assert!((z - 75.0).abs() < 1e-12);
        let z = impedance_from_gamma(50.0f32, -1.0 / 3.0)
            .finite()
            .unwrap()
            .re;
        assert!((z - 25.0).abs() < 1e-4);
    }

    #[test]
    fn ideal_open_in_a_fixed_array() {
        // 50 Ω line, launch at sample 20, open at round trip 100 samples.
        let mut x = [0.0f64; 400];
        for (i, v) in x.iter_mut().enumerate() {
            *v = if i >= 20 { 1.0 } else { 0.0 } + if i >= 120 { 1.0 } else { 0.0 };
        }
        let v = VelocityRange::from_factor(0.5, 0.0).unwrap();
        let su = TraceSetup {
            time_zero: TimeZero::FromLaunch,
            ..TraceSetup::measured(1e-9, 50.0, v)
        };
        let t = Trace::new(&x, su).unwrap();
        let a = t.analyse::<4>(&DetectSettings::default()).unwrap();
        assert_eq!(a.events.len(), 1);
        let e = a.events[0];
        assert_eq!(e.kind, EventKind::OpenEnd);
        // 50 % points at 19.5 and 119.5: 100 ns; d = 0.5·c0·100 ns/2.
        assert!((e.round_trip_s - 100e-9).abs() < 1e-15);
        assert!((e.distance.distance_m - 0.5 * 299_792_458.0 * 50e-9).abs() < 1e-9);
        assert_eq!(e.snr, Extended::Infinite);
        assert_eq!(e.z_after, Impedance::Open);
    }

    /// A low-impedance section between 50 Ω lines, simulated: long enough to
    /// show a plateau (round trip ≥ 2 filter lengths) it reads as a step down
    /// and a step up at its two ends; electrically short it reads as one
    /// capacitive event (a short low-Z section is a shunt C; common practice,
    /// no single source). Regression: the creep estimate once subtracted one
    /// end's lobe from the other's and invented two extra steps.
    #[test]
    fn short_sections_are_two_steps_or_one_lumped_event() {
        use crate::line::lossless::Lossless;
        use crate::math::complex::Cx;
        use crate::network::{cascade::Cascade, load::Load};
        use crate::tdr::sim::{simulate, Sampling, Source, Terminated};
        let pe = Lossless::new(50.0f64, 0.66).unwrap();
        let low = Lossless::new(40.0f64, 0.66).unwrap();
        for (section_m, want_steps) in [(0.3, false), (0.6, true), (1.0, true), (2.0, true)] {
            let mut c: Cascade<f64, 4> = Cascade::new();
            c.push_line(&pe, 14.0).unwrap();
            c.push_line(&low, section_m).unwrap();
            c.push_line(&pe, 10.0).unwrap();
            let port = Terminated {
                cascade: &c,
                load: Load::Resistor(50.0),
            };
            let src = Source::step(2.0, 1.0e-9, 50.0, 20e-9).unwrap();
            let mut v = [0.0f64; 2048];
            let mut w = [Cx::new(0.0, 0.0); 8192];
            let s = Sampling {
                sample_interval_s: 250e-12,
            };
            simulate(&port, &src, &s, None, &mut v, &mut w).unwrap();
            let vel = VelocityRange::from_factor(0.66, 0.01).unwrap();
            let t = Trace::new(&v[..], TraceSetup::measured(250e-12, 50.0, vel)).unwrap();
            let a = t.analyse::<8>(&DetectSettings::default()).unwrap();
            let faults: Vec<&Event<f64>, 8> = {
                let mut f = Vec::new();
                for e in a.events.iter().filter(|e| e.kind != EventKind::EndOfTrace) {
                    f.push(e).unwrap();
                }
                f
            };
            if want_steps {
                assert_eq!(faults.len(), 2, "{section_m} m: {faults:?}");
                assert_eq!(faults[0].kind, EventKind::ImpedanceDown);
                assert_eq!(faults[1].kind, EventKind::ImpedanceUp);
                assert!((faults[0].distance.distance_m - 14.0).abs() < 0.03);
                assert!((faults[1].distance.distance_m - (14.0 + section_m)).abs() < 0.03);
            } else {
                assert_eq!(faults.len(), 1, "{section_m} m: {faults:?}");
                assert_eq!(faults[0].kind, EventKind::Capacitive);
            }
        }
    }
}

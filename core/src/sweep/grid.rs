//! Frequency-grid checks and the one time/distance grid builder every
//! transform uses.
//!
//! A sweep of N points f_n = f₀ + n·Δf (span B = (N−1)·Δf) transformed to time
//! repeats with period 1/Δf (the DFT's periodicity). With the round trip
//! d = v·t/2 (common practice, no single source):
//!
//! * alias-free one-way range: R = v/(2·Δf) = v·(N−1)/(2·B);
//! * bin spacing of an M-point FFT: R/M; of a zoom: (stop − start)/(L − 1);
//! * resolution (band-pass): k₆·v/(2·B); (low-pass, a window over −f_max … f_max):
//!   k₆·v/(4·f_max), where k₆ is the window's 6 dB main-lobe width in bins
//!   ([`WindowFigures`]; Harris, Proc. IEEE 66(1):51–83, 1978, Table 1:
//!   rectangular 1.21, Hann 2.00, Hamming 1.81). Two equal reflections closer
//!   than this merge into one peak.
//!
//! A frequency list is accepted as uniform when every point lies within 1 % of
//! a step of the line through its first and last points (values written with
//! six or seven significant digits in a file are not exactly uniform).

use crate::error::{self, Error, Result};
use crate::math::complex::{cx, Cx};
use crate::math::window::Window;
use crate::scalar::Real;
use crate::timing::VelocityRange;

/// A validated uniform frequency grid f_n = start + n·step, n = 0 .. len − 1.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FreqGrid<T> {
    /// First frequency, Hz (≥ 0).
    pub start_hz: T,
    /// Step, Hz (> 0).
    pub step_hz: T,
    /// Number of points (≥ 2).
    pub len: usize,
}

impl<T: Real> FreqGrid<T> {
    /// A grid from its parameters.
    ///
    /// Errors: [`Error::Negative`]`("start_hz")`, [`Error::NotPositive`]`("step_hz")`
    /// (also non-finite), [`Error::TooShort`] (`"len"`, 2).
    pub fn new(start_hz: T, step_hz: T, len: usize) -> Result<Self> {
        let start_hz = error::non_negative(start_hz, "start_hz")?;
        let step_hz = error::positive(step_hz, "step_hz")?;
        if len < 2 {
            return Err(Error::TooShort {
                what: "len",
                needed: 2,
            });
        }
        Ok(FreqGrid {
            start_hz,
            step_hz,
            len,
        })
    }

    /// Checks a measured frequency list: at least two points, finite, ≥ 0,
    /// strictly increasing and uniform (within 1 % of a step).
    ///
    /// Errors: [`Error::TooShort`] (`"freqs_hz"`, 2); [`Error::NonFinite`]
    /// (`"freqs_hz"`); [`Error::BadIndex`] (`"freqs_hz"`, first bad index) for a
    /// negative, non-increasing or off-grid frequency.
    pub fn from_freqs(freqs_hz: &[T]) -> Result<Self> {
        let (first, last) = match (freqs_hz.first(), freqs_hz.last()) {
            (Some(a), Some(b)) if freqs_hz.len() >= 2 => (*a, *b),
            _ => {
                return Err(Error::TooShort {
                    what: "freqs_hz",
                    needed: 2,
                })
            }
        };
        if freqs_hz.iter().any(|f| !f.is_finite()) {
            return Err(Error::NonFinite("freqs_hz"));
        }
        let bad = |index| Error::BadIndex {
            what: "freqs_hz",
            index,
        };
        if first < T::zero() {
            return Err(bad(0));
        }
        let mut prev = first;
        for (i, f) in freqs_hz.iter().enumerate().skip(1) {
            if *f <= prev {
                return Err(bad(i));
            }
            prev = *f;
        }
        let n1 = T::from_usize(freqs_hz.len() - 1);
        let step = (last - first) / n1;
        let tol = step * T::lit(0.01);
        for (i, f) in freqs_hz.iter().enumerate() {
            let expect = first + step * T::from_usize(i);
            if (*f - expect).abs() > tol {
                return Err(bad(i));
            }
        }
        FreqGrid::new(first, step, freqs_hz.len())
    }

    /// The n-th frequency, Hz.
    pub fn freq_hz(&self, n: usize) -> T {
        self.start_hz + self.step_hz * T::from_usize(n)
    }

    /// Span (N − 1)·Δf, Hz.
    pub fn span_hz(&self) -> T {
        self.step_hz * T::from_usize(self.len.saturating_sub(1))
    }

    /// Last frequency, Hz.
    pub fn stop_hz(&self) -> T {
        self.start_hz + self.span_hz()
    }

    /// k₀ when start = k₀·step within 1 % of a step (a harmonic grid), else `None`.
    pub fn harmonic_offset(&self) -> Option<usize> {
        let q = self.start_hz / self.step_hz;
        let k = q.round();
        if (q - k).abs() <= T::lit(0.01) && k >= T::zero() && k < T::lit(1e9) {
            usize::try_from(k.to_i64_sat()).ok()
        } else {
            None
        }
    }
}

/// Figures of merit of a symmetric window's transform, from its samples.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WindowFigures<T> {
    /// Full main-lobe width at −3 dB, bins.
    pub main_lobe_3db_bins: T,
    /// Full main-lobe width at −6 dB, bins (the resolution factor k₆).
    pub main_lobe_6db_bins: T,
    /// Highest side lobe relative to the main lobe, dB (negative).
    pub side_lobe_db: T,
}

/// Samples used for [`window_figures`] (the figures have converged to the
/// long-window limit to about 10⁻⁴ bins).
pub const FIGURE_SAMPLES: usize = 257;

/// Samples behind [`resolution_bins`] for a Kaiser window (k₆ within 10⁻³
/// bins of the long-window limit).
const RESOLUTION_SAMPLES: usize = 129;

/// W(ν)/W(0) of the symmetric window samples `w`, ν in bins of 1/(len − 1):
/// Σ w_n·cos(2π·ν·(n − c)/(len − 1)), c = (len − 1)/2, summed by pairs.
fn response<T: Real>(w: &[T], nu: T) -> T {
    let len = w.len();
    let span = T::from_usize(len.saturating_sub(1).max(1));
    let c = span * T::half();
    let mut sum = T::zero();
    let mut sum0 = T::zero();
    for (n, wn) in w.iter().take(len / 2).enumerate() {
        let arg = nu * (T::from_usize(n) - c) / span;
        let two_w = *wn + *wn;
        sum = sum + two_w * crate::math::special::sin_cos_turns(arg).1;
        sum0 = sum0 + two_w;
    }
    if len % 2 == 1 {
        if let Some(mid) = w.get(len / 2) {
            sum = sum + *mid;
            sum0 = sum0 + *mid;
        }
    }
    sum / sum0
}

/// First ν below `hi` where the response falls to `level`: a scan in steps of
/// `step` bins, then bisection.
fn crossing<T: Real>(w: &[T], level: T, step: T, hi: T) -> T {
    let mut a = T::zero();
    let mut b = step;
    while b <= hi {
        if response(w, b) < level {
            break;
        }
        a = b;
        b = b + step;
    }
    for _ in 0..40 {
        let m = (a + b) * T::half();
        if response(w, m) < level {
            b = m;
        } else {
            a = m;
        }
    }
    (a + b) * T::half()
}

/// The 6 dB main-lobe width k₆ of `window`, bins: the resolution factor.
///
/// Errors: a bad Kaiser β (see [`Window::value`]).
pub fn resolution_bins<T: Real>(window: &Window<T>) -> Result<T> {
    match window {
        // Closed values (Harris 1978, Table 1, recomputed for long windows).
        Window::Rectangular => Ok(T::lit(1.2067)),
        Window::Hann => Ok(T::lit(2.0)),
        Window::Hamming => Ok(T::lit(1.8152)),
        Window::Kaiser { .. } => {
            let mut w = [T::zero(); RESOLUTION_SAMPLES];
            window.fill(&mut w)?;
            let half = crossing(&w, T::half(), T::lit(0.25), T::lit(8.0));
            Ok(half + half)
        }
    }
}

/// Main-lobe widths and highest side lobe of `window`, computed from
/// [`FIGURE_SAMPLES`] samples (scan of 0.01 bin to 40 bins, refined by a
/// parabola). Slow (some 10⁶ operations): for reports and tests.
///
/// Errors: a bad Kaiser β.
pub fn window_figures<T: Real>(window: &Window<T>) -> Result<WindowFigures<T>> {
    let mut w = [T::zero(); FIGURE_SAMPLES];
    window.fill(&mut w)?;
    let fine = T::lit(0.05);
    let w3 = crossing(&w, T::FRAC_1_SQRT_2(), fine, T::lit(8.0)) * T::two();
    let w6 = crossing(&w, T::half(), fine, T::lit(8.0)) * T::two();
    let step = T::lit(0.01);
    // Walk to the first null (|W| stops falling), then take the highest maximum.
    let mut nu = w6 * T::half();
    let mut prev = response(&w, nu).abs();
    loop {
        let next = response(&w, nu + step).abs();
        nu = nu + step;
        if next > prev || nu > T::lit(40.0) {
            break;
        }
        prev = next;
    }
    let mut best = T::zero();
    let (mut a, mut b) = (prev, response(&w, nu).abs());
    while nu < T::lit(40.0) {
        let c = response(&w, nu + step).abs();
        if b >= a && b >= c {
            let den = a - b - b + c;
            let d = if den < T::zero() {
                T::half() * (a - c) / den
            } else {
                T::zero()
            };
            let v = b - T::lit(0.25) * (a - c) * d;
            best = best.max(v);
        }
        a = b;
        b = c;
        nu = nu + step;
    }
    Ok(WindowFigures {
        main_lobe_3db_bins: w3,
        main_lobe_6db_bins: w6,
        side_lobe_db: T::lit(20.0) * best.max(T::min_positive_value()).log10(),
    })
}

/// The step response treats the last 1/8 of the period as negative time (the
/// tail, before t = 0, of the window's response to reflections near the
/// reference plane), and reports the first 7/8.
pub const STEP_TAIL_DIV: usize = 8;

/// The part of an `m`-sample period a step response reports.
pub(crate) fn step_len(m: usize) -> usize {
    m - m / STEP_TAIL_DIV
}

/// Which transform a grid is for.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Mode {
    /// Band-pass: complex reflection against distance from any uniform sweep.
    BandPass,
    /// Low-pass impulse response (harmonic grid, real output).
    LowPassImpulse,
    /// Low-pass step response (harmonic grid, real output, the first
    /// 1 − 1/[`STEP_TAIL_DIV`] of the period).
    LowPassStep,
}

/// How frequency maps to distance.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Mapping {
    /// A constant velocity: d = v·t/2.
    Constant,
    /// Each frequency's phase through β(f) of a line model (dispersion-corrected).
    LineModel,
}

/// The distance axis of a transform and the figures reported with it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DistanceGrid<T> {
    /// Distance of output sample 0, m.
    pub start_m: T,
    /// Bin spacing, m.
    pub step_m: T,
    /// Output samples.
    pub len: usize,
    /// Round-trip time of sample 0, s.
    pub t_start_s: T,
    /// Round-trip time step, s.
    pub t_step_s: T,
    /// Alias-free one-way range v/(2·Δf) = v·(N−1)/(2·span), m.
    pub range_m: T,
    /// Resolution k₆·v/(2·B) (band-pass) or k₆·v/(4·f_max) (low-pass), m.
    pub resolution_m: T,
    /// The velocity used (and its kind and range).
    pub velocity: VelocityRange<T>,
    /// The transform.
    pub mode: Mode,
    /// The frequency-to-distance mapping.
    pub mapping: Mapping,
}

impl<T: Real> DistanceGrid<T> {
    /// Distance of (fractional) sample `x`, m.
    pub fn distance_m(&self, x: T) -> T {
        self.start_m + self.step_m * x
    }
}

/// Where the output samples go.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Span<T> {
    /// `points` samples from distance 0 in steps of range/points (the FFT grid;
    /// for [`Mode::LowPassStep`] only the first 7/8 of them).
    Fft {
        /// FFT length M.
        points: usize,
    },
    /// `points` samples from `start_m` to `stop_m` inclusive (a zoom).
    Zoom {
        /// First distance, m (≥ 0).
        start_m: T,
        /// Last distance, m (≤ the alias-free range).
        stop_m: T,
        /// Samples (≥ 2).
        points: usize,
    },
}

/// Builds the distance grid of a transform of `freq` with `velocity` and
/// `window` (the one grid builder; every transform calls it).
///
/// For [`Span::Fft`] the step is range/points; in [`Mode::LowPassStep`] the
/// output and the reported range cover the first 7/8 of the period (see
/// [`STEP_TAIL_DIV`]).
///
/// Errors: [`Error::TooShort`] (`"points"`, 2); [`Error::Negative`]`("start_m")`;
/// [`Error::OutOfRange`]`("stop_m")` unless stop > start;
/// [`Error::Unreachable`]`("stop_m")` when the sweep's step makes the requested
/// range impossible (stop beyond the alias-free range); the velocity's fields
/// by name; a bad Kaiser β.
pub fn distance_grid<T: Real>(
    freq: &FreqGrid<T>,
    velocity: &VelocityRange<T>,
    window: &Window<T>,
    mode: Mode,
    span: Span<T>,
) -> Result<DistanceGrid<T>> {
    let v = error::positive(velocity.nominal_m_per_s, "nominal_m_per_s")?;
    error::positive(velocity.lo_m_per_s, "lo_m_per_s")?;
    error::positive(velocity.hi_m_per_s, "hi_m_per_s")?;
    let range_m = v / (T::two() * freq.step_hz);
    let k6 = resolution_bins(window)?;
    let resolution_m = match mode {
        Mode::BandPass => k6 * v / (T::two() * freq.span_hz()),
        _ => k6 * v / (T::lit(4.0) * freq.stop_hz()),
    };
    let (start_m, step_m, len) = match span {
        Span::Fft { points } => {
            if points < 2 {
                return Err(Error::TooShort {
                    what: "points",
                    needed: 2,
                });
            }
            let len = if mode == Mode::LowPassStep {
                step_len(points)
            } else {
                points
            };
            (T::zero(), range_m / T::from_usize(points), len)
        }
        Span::Zoom {
            start_m,
            stop_m,
            points,
        } => {
            let a = error::non_negative(start_m, "start_m")?;
            let b = error::finite(stop_m, "stop_m")?;
            if points < 2 {
                return Err(Error::TooShort {
                    what: "points",
                    needed: 2,
                });
            }
            if b <= a {
                return Err(Error::OutOfRange("stop_m"));
            }
            let limit = if mode == Mode::LowPassStep {
                range_m * T::lit(0.875) // 1 − 1/STEP_TAIL_DIV
            } else {
                range_m
            };
            if b > limit {
                return Err(Error::Unreachable("stop_m"));
            }
            (a, (b - a) / T::from_usize(points - 1), points)
        }
    };
    let to_t = T::two() / v;
    Ok(DistanceGrid {
        start_m,
        step_m,
        len,
        t_start_s: start_m * to_t,
        t_step_s: step_m * to_t,
        range_m: if mode == Mode::LowPassStep {
            range_m * T::lit(0.875) // 1 − 1/STEP_TAIL_DIV
        } else {
            range_m
        },
        resolution_m,
        velocity: *velocity,
        mode,
        mapping: Mapping::Constant,
    })
}

/// A velocity factor (fraction of c0) as an exact [`VelocityRange`] of kind
/// [`crate::timing::VelocityKind::Factor`] (no tolerance).
///
/// Errors: as [`VelocityRange::from_factor`].
pub fn velocity_from_factor<T: Real>(velocity_factor: T) -> Result<VelocityRange<T>> {
    VelocityRange::from_factor(velocity_factor, T::zero())
}

/// Complex zero (a helper for buffers).
pub(crate) fn czero<T: Real>() -> Cx<T> {
    cx(T::zero(), T::zero())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uniform_grids_and_bad_indices() {
        let f = [1e6, 2e6, 3e6, 4e6];
        let g = FreqGrid::<f64>::from_freqs(&f).unwrap();
        assert_eq!((g.start_hz, g.step_hz, g.len), (1e6, 1e6, 4));
        assert_eq!(g.harmonic_offset(), Some(1));
        let e = |f: &[f64]| FreqGrid::<f64>::from_freqs(f).unwrap_err();
        assert_eq!(
            e(&[1.0, 2.0, 2.0, 4.0]),
            Error::BadIndex {
                what: "freqs_hz",
                index: 2
            }
        );
        assert_eq!(
            e(&[1.0, 2.0, 3.5, 4.0]),
            Error::BadIndex {
                what: "freqs_hz",
                index: 2
            }
        );
        assert_eq!(
            e(&[1.0]),
            Error::TooShort {
                what: "freqs_hz",
                needed: 2
            }
        );
        assert_eq!(e(&[1.0, f64::NAN]), Error::NonFinite("freqs_hz"));
        assert_eq!(
            e(&[-1.0, 1.0]),
            Error::BadIndex {
                what: "freqs_hz",
                index: 0
            }
        );
        let g = FreqGrid::<f32>::new(1.5, 1.0, 3).unwrap();
        assert_eq!(g.harmonic_offset(), None);
    }

    #[test]
    fn kaiser_resolution_matches_the_long_window_figure() {
        // Harris (1978) Table 1, Kaiser–Bessel α = 3 (β = 3π): 6 dB width 2.39 bins.
        let w = Window::Kaiser {
            beta: 3.0 * core::f64::consts::PI,
        };
        let fast = resolution_bins(&w).unwrap();
        let slow = window_figures(&w).unwrap().main_lobe_6db_bins;
        assert!((fast - slow).abs() < 2e-3, "{fast} vs {slow}");
        assert!((fast - 2.389).abs() < 0.01);
        let w32 = Window::Kaiser {
            beta: 3.0 * core::f32::consts::PI,
        };
        assert!((resolution_bins(&w32).unwrap() - 2.389).abs() < 0.01);
        // The closed values agree with the computed ones (the rectangular
        // window's N samples span N intervals, not N − 1: 1.2067·256/257).
        for (w, tol) in [
            (Window::<f64>::Rectangular, 6e-3),
            (Window::Hann, 2e-3),
            (Window::Hamming, 3e-3),
        ] {
            let f = window_figures(&w).unwrap().main_lobe_6db_bins;
            assert!((resolution_bins(&w).unwrap() - f).abs() < tol, "{w:?}: {f}");
        }
    }

    #[test]
    fn range_and_resolution() {
        // 101 points, 1 MHz step, VF 1: range = c/(2·1 MHz) ≈ 149.9 m.
        let g = FreqGrid::<f64>::new(1e6, 1e6, 101).unwrap();
        let v = velocity_from_factor(1.0).unwrap();
        let d = distance_grid(
            &g,
            &v,
            &Window::Rectangular,
            Mode::BandPass,
            Span::Fft { points: 256 },
        )
        .unwrap();
        assert!((d.range_m - 299_792_458.0 / 2e6).abs() < 1e-9);
        assert!((d.step_m - d.range_m / 256.0).abs() < 1e-12);
        assert!((d.resolution_m - 1.2067 * 299_792_458.0 / 2e8).abs() < 1e-9);
        let z = Span::Zoom {
            start_m: 0.0,
            stop_m: 200.0,
            points: 10,
        };
        assert_eq!(
            distance_grid(&g, &v, &Window::Hann, Mode::BandPass, z).unwrap_err(),
            Error::Unreachable("stop_m")
        );
    }
}

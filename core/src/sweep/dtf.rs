//! Distance-to-fault transforms of a reflection sweep, over caller buffers.
//!
//! A line with reflections ρᵢ at distances dᵢ has, for a constant velocity v,
//! Γ(f) = Σᵢ ρᵢ·e^(−j4πf·dᵢ/v) (lossless; common practice, no single source).
//! The transforms invert this sum on a uniform sweep f_n = f₀ + n·Δf with a
//! symmetric window wₙ (see [`crate::math::window`]):
//!
//! * **band-pass** ([`band_pass_fft`], [`band_pass_zoom`]):
//!   x(t) = Σₙ wₙ·Γₙ·e^(+j2π·fₙ·t) / Σₙ wₙ, t = 2d/v: complex, any f₀; a single
//!   reflection ρ gives |x| = ρ at its distance; Γ = 1 gives x = 1 at d = 0.
//!   The FFT path zero-pads to the length of `out` (a power of two); the zoom
//!   path evaluates a chosen distance window by the chirp-z transform (Rabiner,
//!   Schafer & Rader, IEEE Trans. Audio Electroacoust. AU-17(2):86–92, 1969).
//! * **low-pass** ([`low_pass`]): on a harmonic grid f_k = k·Δf the spectrum is
//!   extended to negative frequencies by Γ(−f) = Γ(f)* and transformed to a real
//!   impulse response h(t) = Σ_{k=−K}^{K} w_k·Γ_k·e^(+j2πkΔf·t) / Σ w_k (a window
//!   of 2K + 1 samples centred on DC), or to the step response (its running
//!   sum from the last eighth of the period, normalised so that Γ = 1 gives a
//!   unit step). Missing harmonics below
//!   f₀ = k₀·Δf are extrapolated deterministically: linear magnitude and
//!   unwrapped phase from the first two points, the DC phase snapped to the
//!   nearest multiple of π (a real DC value), then magnitude and phase joined
//!   linearly from DC to f₀ (continuous phase). A measured DC point keeps its
//!   real part only.
//! * **line-model mapping** ([`band_pass_model`]): a direct sum over a distance
//!   window, x(d) = Σₙ wₙ·Γₙ·e^(+2(a(fₙ) + jβ(fₙ))·d) / Σ wₙ with β(f) either
//!   2πf/v or the model's own (dispersion-corrected), and a(f) = α(f) of the
//!   model when cable-loss compensation is on (else 0). Cost N·L complex
//!   products; compensation multiplies noise by the same e^(2αd).
//!
//! A user rise time t_r for the step response applies a Gaussian filter
//! G(f) = e^(−2π²σ²f²), σ = t_r/2.563 (10–90 % of a Gaussian edge =
//! 2·√2·erf⁻¹(0.8)·σ, common practice, no single source), on top of the window
//! (use the rectangular window to get t_r itself). The sweep must reach
//! f_max ≥ 0.35/t_r (the one-pole rule of thumb); otherwise
//! [`Error::Unreachable`]`("rise_time_s")`.
//!
//! Every transform returns the [`DistanceGrid`] built by [`distance_grid`]
//! (range, resolution, bin spacing, velocity and its kind).
//!
//! **Memory.** `out` of the FFT paths: M complex (`8·M` bytes in `f32`, `16·M`
//! in `f64`) plus an FFT plan of M/2 twiddles; zoom: [`zoom_work_len`] complex
//! values; low-pass: M complex work + M real out.

use crate::error::{self, Error, Result};
use crate::line::LineModel;
use crate::math::complex::{self, cx, phasor_turns, reduce_turns, Cx};
use crate::math::czt::{czt, scratch_len, Contour};
use crate::math::fft::Fft;
use crate::math::window::Window;
use crate::scalar::Real;
use crate::timing::{VelocityKind, VelocityRange};

use super::grid::{czero, distance_grid, step_len, DistanceGrid, FreqGrid, Mapping, Mode, Span};

/// Window and velocity of a transform.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Config<T> {
    /// The symmetric window over the sweep.
    pub window: Window<T>,
    /// The velocity mapping time to distance (nominal, range and kind).
    pub velocity: VelocityRange<T>,
}

/// Which low-pass response.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LowPass<T> {
    /// The impulse response.
    Impulse,
    /// The step response, with an optional 10–90 % rise time in seconds.
    Step {
        /// Requested rise time, s (> 0), or `None` for the window's own.
        rise_time_s: Option<T>,
    },
}

/// Options of [`band_pass_model`].
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct ModelOptions {
    /// Map each frequency's phase through β(f) of the model (else 2πf/v).
    pub dispersion_corrected: bool,
    /// Multiply by e^(+2α(f)·d) (cable-loss compensation).
    pub loss_compensated: bool,
}

fn check_sweep<T: Real>(freqs_hz: &[T], gamma: &[Cx<T>]) -> Result<FreqGrid<T>> {
    let g = FreqGrid::from_freqs(freqs_hz)?;
    if gamma.len() != freqs_hz.len() {
        return Err(Error::LengthMismatch("gamma"));
    }
    if !gamma.iter().all(|z| complex::is_finite(*z)) {
        return Err(Error::NonFinite("gamma"));
    }
    // |Re|, |Im| ≤ MAX_GAMMA: no measured reflection comes near, and it keeps
    // the transform sums finite (found by fuzzing: 1e308 overflowed to NaN).
    let max = T::lit(MAX_GAMMA);
    if !gamma.iter().all(|z| z.re.abs() <= max && z.im.abs() <= max) {
        return Err(Error::OutOfRange("gamma"));
    }
    Ok(g)
}

/// Largest accepted reflection component (|Re Γ|, |Im Γ|) of a sweep: 1e6.
pub const MAX_GAMMA: f64 = 1e6;

/// Σ wₙ over a length-n window, and a validated window.
fn window_sum<T: Real>(w: &Window<T>, n: usize) -> Result<T> {
    let mut s = T::zero();
    for i in 0..n {
        s = s + w.value(i, n)?;
    }
    nonzero_window_sum(s)
}

/// A window whose samples sum to (nearly) zero — Hann over two points, or a
/// Kaiser window with a huge β over very few — cannot normalise a transform:
/// the sum must exceed the machine epsilon (window peaks are 1).
fn nonzero_window_sum<T: Real>(s: T) -> Result<T> {
    if s > T::EPS {
        Ok(s)
    } else {
        Err(Error::TooShort {
            what: "freqs_hz",
            needed: 3,
        })
    }
}

/// Band-pass transform onto the FFT grid of M = `out.len()` points (a power of
/// two ≥ N): `out[k]` is the complex reflection at distance k·range/M.
///
/// Errors: the sweep checks ([`FreqGrid::from_freqs`];
/// [`Error::LengthMismatch`]`("gamma")`; [`Error::NonFinite`]`("gamma")`;
/// [`Error::OutOfRange`]`("gamma")` beyond [`MAX_GAMMA`]);
/// [`Error::TooShort`] (`"out"`, N) when M < N; [`Error::OutOfRange`]`("len")`
/// unless M is a power of two; [`Error::Capacity`] (`"table"`) when the plan is
/// too small; the grid's errors.
pub fn band_pass_fft<T: Real>(
    freqs_hz: &[T],
    gamma: &[Cx<T>],
    cfg: &Config<T>,
    plan: &Fft<'_, T>,
    out: &mut [Cx<T>],
) -> Result<DistanceGrid<T>> {
    let fg = check_sweep(freqs_hz, gamma)?;
    let n = fg.len;
    let m = out.len();
    if m < n {
        return Err(Error::TooShort {
            what: "out",
            needed: n,
        });
    }
    let grid = distance_grid(
        &fg,
        &cfg.velocity,
        &cfg.window,
        Mode::BandPass,
        Span::Fft { points: m },
    )?;
    // The integer part of q = f₀/Δf is a shift of the spectrum by q bins
    // (index (q + n) mod M: exact, no carrier to multiply); only a fractional
    // part needs the per-sample carrier e^(j2π·q_frac·k/M).
    let q = fg.start_hz / fg.step_hz;
    let qf = q.floor();
    let q_int = (qf.to_i64_sat().max(0) as u64)
        .checked_rem(m as u64)
        .unwrap_or(0) as usize;
    let q_frac = q - qf;
    for o in out.iter_mut() {
        *o = czero();
    }
    // The window is symmetric: one value serves samples i and N − 1 − i.
    let mut sw = T::zero();
    let (lo, hi) = gamma
        .split_at_checked(n.div_ceil(2))
        .ok_or(Error::LengthMismatch("gamma"))?;
    let mut j = q_int;
    let mut j_hi = (q_int + n - 1).checked_rem(m).unwrap_or(0);
    for (i, g) in lo.iter().enumerate() {
        let wv = cfg.window.value(i, n)?;
        sw = sw + wv;
        if let Some(o) = out.get_mut(j) {
            *o = *g * wv;
        }
        if let Some(gh) = hi.len().checked_sub(i + 1).and_then(|r| hi.get(r)) {
            sw = sw + wv;
            if let Some(o) = out.get_mut(j_hi) {
                *o = *gh * wv;
            }
        }
        j = if j + 1 == m { 0 } else { j + 1 };
        j_hi = if j_hi == 0 { m - 1 } else { j_hi - 1 };
    }
    plan.inverse(out)?;
    let scale = T::from_usize(m) / nonzero_window_sum(sw)?;
    if q_frac == T::zero() {
        for o in out.iter_mut() {
            *o = *o * scale;
        }
    } else {
        let mt = T::from_usize(m);
        for (k, o) in out.iter_mut().enumerate() {
            let c = phasor_turns(reduce_turns(q_frac * T::from_usize(k) / mt));
            *o = *o * c * scale;
        }
    }
    Ok(grid)
}

/// Complex values of `work` that [`band_pass_zoom`] needs for N sweep points
/// and `points` outputs: N + [`scratch_len`]`(N, points)`.
///
/// Errors: as [`scratch_len`].
pub fn zoom_work_len(n: usize, points: usize) -> Result<usize> {
    n.checked_add(scratch_len(n, points)?)
        .ok_or(Error::OutOfRange("len"))
}

/// Band-pass transform over the distance window `start_m ..= stop_m`
/// (L = `out.len()` ≥ 2 samples) by the chirp-z transform.
///
/// Errors: the sweep checks; [`Error::Capacity`] (`"work"`) when `work` is
/// shorter than [`zoom_work_len`]; the grid's errors (a window beyond the
/// alias-free range is [`Error::Unreachable`]`("stop_m")`).
pub fn band_pass_zoom<T: Real>(
    freqs_hz: &[T],
    gamma: &[Cx<T>],
    cfg: &Config<T>,
    start_m: T,
    stop_m: T,
    out: &mut [Cx<T>],
    work: &mut [Cx<T>],
) -> Result<DistanceGrid<T>> {
    let fg = check_sweep(freqs_hz, gamma)?;
    let n = fg.len;
    let l = out.len();
    let span = Span::Zoom {
        start_m,
        stop_m,
        points: l,
    };
    let grid = distance_grid(&fg, &cfg.velocity, &cfg.window, Mode::BandPass, span)?;
    let need = zoom_work_len(n, l)?;
    let cap = work.len();
    let w = work.get_mut(..need).ok_or(Error::Capacity {
        what: "work",
        capacity: cap,
    })?;
    let (x, scratch) = w.split_at_mut_checked(n).ok_or(Error::Capacity {
        what: "work",
        capacity: cap,
    })?;
    for (i, (xo, g)) in x.iter_mut().zip(gamma.iter()).enumerate() {
        *xo = *g * cfg.window.value(i, n)?;
    }
    let contour = Contour::time_zoom(fg.step_hz, grid.t_start_s, grid.t_step_s)?;
    czt(x, &contour, out, scratch)?;
    let sw = window_sum(&cfg.window, n)?;
    let a = reduce_turns(fg.start_hz * grid.t_start_s);
    let b = reduce_turns(fg.start_hz * grid.t_step_s);
    for (k, o) in out.iter_mut().enumerate() {
        let c = phasor_turns(a + reduce_turns(b * T::from_usize(k)));
        *o = *o * c / sw;
    }
    Ok(grid)
}

/// Low-pass impulse or step response on the FFT grid of M = `out.len()` points
/// (a power of two ≥ 2·(K + 1), K the highest harmonic); `work` holds ≥ M
/// complex values. Impulse: `out[m]` at distance m·range/M. Step: the first
/// 7/8·M values at m·range/M (the rest set to 0; the grid's length and range
/// are 7/8 of the period's, as its last eighth is the negative time the step
/// sums from, see [`super::grid::STEP_TAIL_DIV`]; reflections must lie within
/// that range).
///
/// Errors: the sweep checks; [`Error::OutOfRange`]`("start_hz")` unless the
/// first frequency is a whole multiple k₀ ≤ N of the step;
/// [`Error::TooShort`] (`"out"`, 2·(K + 1)); [`Error::Capacity`] (`"work"`);
/// [`Error::NotPositive`]`("rise_time_s")`; [`Error::Unreachable`]`("rise_time_s")`
/// when f_max < 0.35/t_r; FFT and grid errors.
pub fn low_pass<T: Real>(
    freqs_hz: &[T],
    gamma: &[Cx<T>],
    cfg: &Config<T>,
    kind: LowPass<T>,
    plan: &Fft<'_, T>,
    work: &mut [Cx<T>],
    out: &mut [T],
) -> Result<DistanceGrid<T>> {
    let fg = check_sweep(freqs_hz, gamma)?;
    let n = fg.len;
    let k0 = match fg.harmonic_offset() {
        Some(k) if k <= n => k,
        _ => return Err(Error::OutOfRange("start_hz")),
    };
    // Re-anchor the grid exactly on the harmonics.
    let fg = FreqGrid::new(fg.step_hz * T::from_usize(k0), fg.step_hz, n)?;
    let kmax = k0 + n - 1;
    let m = out.len();
    let need = kmax.saturating_add(1).saturating_mul(2);
    if m < need {
        return Err(Error::TooShort {
            what: "out",
            needed: need,
        });
    }
    let mode = match kind {
        LowPass::Impulse => Mode::LowPassImpulse,
        LowPass::Step { .. } => Mode::LowPassStep,
    };
    let grid = distance_grid(
        &fg,
        &cfg.velocity,
        &cfg.window,
        mode,
        Span::Fft { points: m },
    )?;
    let sigma = match kind {
        LowPass::Step {
            rise_time_s: Some(tr),
        } => {
            let tr = error::positive(tr, "rise_time_s")?;
            if fg.stop_hz() * tr < T::lit(0.35) {
                return Err(Error::Unreachable("rise_time_s"));
            }
            let sg = tr / T::lit(2.563_103);
            // A rise time so long that 2π·σ·f_max overflows filters out the
            // whole sweep: reject it rather than compute 0·∞.
            if !(T::two_pi() * sg * fg.stop_hz()).is_finite() {
                return Err(Error::OutOfRange("rise_time_s"));
            }
            Some(sg)
        }
        _ => None,
    };
    let cap = work.len();
    let w = work.get_mut(..m).ok_or(Error::Capacity {
        what: "work",
        capacity: cap,
    })?;
    for v in w.iter_mut() {
        *v = czero();
    }
    let len_w = 2 * kmax + 1;
    let ext = Extrapolation::new(gamma, k0);
    let mut s = T::zero();
    let mut c0 = T::one();
    for k in 0..=kmax {
        let h = if k >= k0 {
            gamma.get(k - k0).copied().unwrap_or_else(czero)
        } else {
            ext.at(k)
        };
        let h = if k == 0 { cx(h.re, T::zero()) } else { h };
        let mut wk = cfg.window.value(kmax + k, len_w)?;
        if let Some(sg) = sigma {
            let f = fg.step_hz * T::from_usize(k);
            let a = T::two_pi() * sg * f;
            wk = wk * (-(a * a) * T::half()).exp();
        }
        if k == 0 {
            c0 = wk;
            s = s + wk;
        } else {
            s = s + wk + wk;
        }
        let c = h * wk;
        if let Some(slot) = w.get_mut(k) {
            *slot = c;
        }
        if k > 0 {
            if let Some(slot) = w.get_mut(m - k) {
                *slot = c.conj();
            }
        }
    }
    plan.inverse(w)?;
    match kind {
        LowPass::Impulse => {
            let scale = T::from_usize(m) / nonzero_window_sum(s)?;
            for (o, v) in out.iter_mut().zip(w.iter()) {
                *o = v.re * scale;
            }
        }
        LowPass::Step { .. } => {
            let half = step_len(m);
            let mut acc = T::zero();
            for v in w.iter().skip(half) {
                acc = acc + v.re;
            }
            let inv = if c0 > T::zero() {
                T::one() / c0
            } else {
                T::zero()
            };
            for (i, o) in out.iter_mut().enumerate() {
                if i < half {
                    acc = acc + w.get(i).map_or(T::zero(), |v| v.re);
                    *o = acc * inv;
                } else {
                    *o = T::zero();
                }
            }
        }
    }
    Ok(grid)
}

/// The deterministic extrapolation of the missing harmonics 0 .. k₀ − 1.
struct Extrapolation<T> {
    k0: usize,
    m_dc: T,
    m1: T,
    ph_dc: T,
    ph1: T,
}

impl<T: Real> Extrapolation<T> {
    fn new(gamma: &[Cx<T>], k0: usize) -> Self {
        let g1 = gamma.first().copied().unwrap_or_else(czero);
        let g2 = gamma.get(1).copied().unwrap_or(g1);
        let m1 = complex::abs(g1);
        let m2 = complex::abs(g2);
        let arg = |z: Cx<T>| z.im.atan2(z.re) / T::two_pi();
        let ph1 = arg(g1);
        let ph2 = ph1 + reduce_turns(arg(g2) - ph1);
        let kt = T::from_usize(k0);
        let m_dc = (m1 - kt * (m2 - m1)).max(T::zero());
        let lin = ph1 - kt * (ph2 - ph1);
        let ph_dc = (lin + lin).round() * T::half();
        Extrapolation {
            k0,
            m_dc,
            m1,
            ph_dc,
            ph1,
        }
    }

    /// Extrapolated value at harmonic k < k₀ (DC: ±|Γ(0)|, real).
    fn at(&self, k: usize) -> Cx<T> {
        let u = T::from_usize(k) / T::from_usize(self.k0.max(1));
        let mag = self.m_dc + (self.m1 - self.m_dc) * u;
        let ph = self.ph_dc + (self.ph1 - self.ph_dc) * u;
        if k == 0 {
            let sign = if (self.ph_dc.abs() * T::two()).round().to_i64_sat() % 2 == 0 {
                T::one()
            } else {
                -T::one()
            };
            return cx(mag * sign, T::zero());
        }
        let p = phasor_turns(ph);
        cx(mag * p.re, mag * p.im)
    }
}

/// Band-pass response over `window_m` = (start_m, stop_m), both ends included
/// (L = `out.len()` samples), by a
/// direct sum with the line model's β(f) (dispersion-corrected) and/or α(f)
/// (loss compensation); see the module docs.
///
/// With `dispersion_corrected` the velocity reported is the model's group
/// velocity at the centre frequency ([`VelocityKind::GroupAt`]; it sets the
/// alias-free range and the resolution) and `cfg.velocity` is not used;
/// otherwise β = 2πf/v with `cfg.velocity`.
///
/// Errors: the sweep and grid checks; the model's errors at a sweep frequency;
/// [`Error::NonFinite`]`("out")` if the compensation overflows.
pub fn band_pass_model<T: Real, M: LineModel<T> + ?Sized>(
    freqs_hz: &[T],
    gamma: &[Cx<T>],
    cfg: &Config<T>,
    model: &M,
    options: ModelOptions,
    window_m: (T, T),
    out: &mut [Cx<T>],
) -> Result<DistanceGrid<T>> {
    let (start_m, stop_m) = window_m;
    let fg = check_sweep(freqs_hz, gamma)?;
    let n = fg.len;
    let fc = (fg.start_hz + fg.stop_hz()) * T::half();
    let velocity = if options.dispersion_corrected {
        VelocityRange::from_line(model, VelocityKind::GroupAt(fc), T::zero())?
    } else {
        cfg.velocity
    };
    let span = Span::Zoom {
        start_m,
        stop_m,
        points: out.len(),
    };
    let mut grid = distance_grid(&fg, &velocity, &cfg.window, Mode::BandPass, span)?;
    if options.dispersion_corrected {
        grid.mapping = Mapping::LineModel;
    }
    for o in out.iter_mut() {
        *o = czero();
    }
    let v = velocity.nominal_m_per_s;
    let sw = window_sum(&cfg.window, n)?;
    for i in 0..n {
        let f = fg.freq_hz(i);
        let a = gamma.get(i).copied().unwrap_or_else(czero) * (cfg.window.value(i, n)? / sw);
        let (alpha, beta_turns) = if options.dispersion_corrected || options.loss_compensated {
            let p = model.at(f)?;
            let alpha = if options.loss_compensated {
                p.alpha_np_per_m()
            } else {
                T::zero()
            };
            let bt = if options.dispersion_corrected {
                p.beta_rad_per_m() / T::two_pi()
            } else {
                f / v
            };
            (alpha, bt)
        } else {
            (T::zero(), f / v)
        };
        // e^(2(α + jβ)d): turns 2·β·d/(2π) = 2·bt·d.
        let at = |d: T| -> Cx<T> {
            let p = phasor_turns(reduce_turns(T::two() * beta_turns * d));
            let g = (T::two() * alpha * d).exp();
            cx(p.re * g, p.im * g)
        };
        let step = at(grid.step_m);
        let mut ph = czero();
        for (k, o) in out.iter_mut().enumerate() {
            if k % 32 == 0 {
                ph = at(grid.distance_m(T::from_usize(k)));
            } else {
                ph = ph * step;
            }
            *o = *o + a * ph;
        }
    }
    if !out.iter().all(|z| complex::is_finite(*z)) {
        return Err(Error::NonFinite("out"));
    }
    Ok(grid)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;
    use crate::math::fft::fill_twiddles;
    use std::vec;

    fn vf1<T: Real>() -> VelocityRange<T> {
        VelocityRange::from_factor(T::one(), T::zero()).unwrap()
    }

    fn unit_at_zero<T: Real>(n: usize, tol: T) {
        let freqs: std::vec::Vec<T> = (0..n).map(|i| T::lit(1e6) * T::from_usize(i + 3)).collect();
        let gamma = vec![cx(T::one(), T::zero()); n];
        let cfg = Config {
            window: Window::Hann,
            velocity: vf1(),
        };
        let mut table = vec![czero::<T>(); 512];
        fill_twiddles(&mut table).unwrap();
        let plan = Fft::new(&table).unwrap();
        let mut out = vec![czero::<T>(); 1024];
        let g = band_pass_fft(&freqs, &gamma, &cfg, &plan, &mut out).unwrap();
        assert_eq!(g.len, 1024);
        assert!((out[0].re - T::one()).abs() < tol && out[0].im.abs() < tol);
        // low-pass impulse: unit at zero too (k0 = 3 extrapolated).
        let mut work = vec![czero::<T>(); 1024];
        let mut h = vec![T::zero(); 1024];
        low_pass(
            &freqs,
            &gamma,
            &cfg,
            LowPass::Impulse,
            &plan,
            &mut work,
            &mut h,
        )
        .unwrap();
        assert!((h[0] - T::one()).abs() < tol, "{:?}", h[0]);
        let mut z = vec![czero::<T>(); 16];
        let need = zoom_work_len(n, 16).unwrap();
        let mut wz = vec![czero::<T>(); need];
        let r = g.range_m;
        band_pass_zoom(
            &freqs,
            &gamma,
            &cfg,
            T::zero(),
            r * T::lit(0.1),
            &mut z,
            &mut wz,
        )
        .unwrap();
        assert!((z[0].re - T::one()).abs() < tol && z[0].im.abs() < tol);
    }

    #[test]
    fn perfect_reflection_is_a_unit_impulse_at_zero() {
        unit_at_zero::<f64>(101, 1e-9);
        unit_at_zero::<f64>(100, 1e-9);
        unit_at_zero::<f32>(101, 1e-4);
        unit_at_zero::<f32>(100, 1e-4);
    }

    #[test]
    fn bad_inputs() {
        let cfg = Config::<f64> {
            window: Window::Rectangular,
            velocity: vf1(),
        };
        let table: [Cx<f64>; 0] = [];
        let plan = Fft::new(&table).unwrap();
        let mut out = [czero::<f64>(); 4];
        let g = [cx(0.0, 0.0); 3];
        assert_eq!(
            band_pass_fft(&[1.0, 2.0, 3.0], &g[..2], &cfg, &plan, &mut out).unwrap_err(),
            Error::LengthMismatch("gamma")
        );
        let g2 = [cx(0.0, 0.0), cx(f64::NAN, 0.0), cx(0.0, 0.0)];
        assert_eq!(
            band_pass_fft(&[1.0, 2.0, 3.0], &g2, &cfg, &plan, &mut out).unwrap_err(),
            Error::NonFinite("gamma")
        );
        let mut w = [czero::<f64>(); 8];
        let mut h = [0.0f64; 8];
        assert_eq!(
            low_pass(
                &[1.5, 2.5, 3.5],
                &g,
                &cfg,
                LowPass::Impulse,
                &plan,
                &mut w,
                &mut h
            )
            .unwrap_err(),
            Error::OutOfRange("start_hz")
        );
        let step = LowPass::Step {
            rise_time_s: Some(50e-12),
        };
        let f: std::vec::Vec<f64> = (1..=3).map(|k| k as f64 * 1e9).collect();
        assert_eq!(
            low_pass(&f, &g, &cfg, step, &plan, &mut w, &mut h).unwrap_err(),
            Error::Unreachable("rise_time_s")
        );
    }
}

#[cfg(test)]
mod extrapolation_tests {
    use super::*;

    #[test]
    fn dc_is_real_and_phase_continuous() {
        // A short behind a delay: Γ = −e^(−j2π·k·0.01) at k = 3, 4 (k₀ = 3).
        let g = |k: f64| {
            let p = phasor_turns(-0.01 * k);
            cx(-p.re, -p.im)
        };
        let gamma = [g(3.0), g(4.0)];
        let e = Extrapolation::new(&gamma, 3);
        let dc = e.at(0);
        assert!((dc.re + 1.0).abs() < 1e-12 && dc.im == 0.0, "{dc:?}");
        // The joined phase is linear from −½ turn to the first measured bin.
        for k in 1..3 {
            let z = e.at(k);
            assert!((complex::abs(z) - 1.0).abs() < 1e-12);
            let want = g(k as f64);
            assert!((z - want).norm() < 1e-9, "k {k}: {z:?} vs {want:?}");
        }
        // f32 as well.
        let gf = [cx(-1.0f32, 0.0), cx(-1.0f32, 0.0)];
        let dc = Extrapolation::new(&gf, 2).at(0);
        assert!((dc.re + 1.0).abs() < 1e-6 && dc.im == 0.0);
    }
}

//! The step response of any line model after a length, numerically.
//!
//! [`StepResponse`] computes the step response after a length l of any
//! [`LineModel`] from H(f) = e^(−γ(f)·l), optionally times a Gaussian
//! instrument response, by the inverse Fourier integral of a step (for a
//! real h(t); the textbook pair u(t) ↔ πδ(ω) + 1/(jω), e.g. Papoulis, *The
//! Fourier Integral and Its Applications*, 1962, from memory):
//!
//! v(t) = H(0)/2 + (1/π)·∫₀^∞ Im(H(f)·e^(j2πft))/f df.
//!
//! It writes τ = t − T_ref with T_ref the phase delay at the top frequency,
//! G(f) = H(f)·e^(j2πf·T_ref) (smooth: the delay's linear phase is removed)
//! and
//!
//! v = H(0)·Φ(τ/σ_w) + (1/π)·Im ∫₀^{f_max} g(f)·e^(j2πfτ) df,
//! g(f) = (G(f) − H(0)·W(f))/f,
//!
//! where W(f) = e^(−(f/f_w)²), f_w = f_max/6, is a zero-phase Gaussian whose
//! step Φ(τ/σ_w) = ½·erfc(−π·f_w·τ) is known in closed form: subtracting it
//! (rather than the bare H(0)) leaves an integrand that vanishes at f_max
//! with G, so truncating the integral there drops nothing but G's own tail.
//!
//! g is sampled on the graded grid f_k = f_max·(k/N)⁶, k = 1…N, stored in the
//! caller's buffer (N complex values, 8 bytes each in `f32`, 16 in `f64`), and
//! each panel is integrated by Filon's rule (L. N. G. Filon, "On a quadrature
//! formula for trigonometric integrals", Proc. R. Soc. Edinburgh 49:38–47,
//! 1929, here with g linear on the panel): the oscillating factor
//! e^(j2πfτ) is integrated exactly, so the number of oscillations does not
//! limit the step. The first panel [0, f_1] assumes the diffusive form
//! g ∝ f^(−1/2) of a line with series resistance; the strong grading keeps
//! that region tiny. The sum on all N points and the sum on every other point
//! are combined by Richardson extrapolation, (4·I_N − I_(N/2))/3. Measured on
//! a pure skin-effect line against the erfc closed form (tests/tests/timing.rs),
//! N = 2048 points gives |Δv| ≈ 1e-7 and 10/50/90 % times within ≈ 1e-7
//! relative in `f64` (N = 512: 3e-6 and 3e-5). The
//! integral is truncated at f_max: choose f_max where α(f_max)·l ≳ 25 Np
//! (then the error is below e^(−25)), or give an instrument rise time; a
//! loss-free line truncated at f_max shows Gibbs ringing (≈ 9 %).
//!
//! Cost: one value v(t) is 1.5·N panels (two sin/cos each); a crossing
//! ([`StepResponse::time_to_fraction_s`]) takes some 60–250 values. The model
//! is evaluated N + 2 times, once, in [`StepResponse::new`].
//!
//! The instrument's own edge is modelled as a zero-phase Gaussian of 10–90 %
//! rise time t_r (impulse response of standard deviation σ = t_r/2.563,
//! H_i(f) = e^(−(2πfσ)²/2)); its time zero is the 50 % point of its edge.
//! Rise times of cascaded stages are often combined as the root sum of squares
//! ([`super::edge::combine_rise_times_rss`]; common practice, no single source; exact for
//! Gaussian stages, an approximation for the skin-effect edge: measured 7–13 %
//! low against a scipy convolution in tests/tests/timing.rs).
//!
//! # Precision
//!
//! Everything runs in the scalar's own precision. In `f32` the phase of
//! H(f)·e^(j2πf·T_ref) is formed in turns from βl/2π and f·T_ref, each of the
//! order of f_max·T_d turns, so its rounding error is about f_max·T_d·2⁻²⁴
//! turns (1 km of cable at 10 GHz: ≈ 3e-3 turns); the checks show f32 times
//! within ≈ 5e-6 relative for a 100 m line.
use crate::error::{self, Error, Result};
use crate::line::LineModel;
use crate::math::complex::{self, Cx};
use crate::scalar::Real;

/// The 10 %, 50 % and 90 % crossings of a step, s.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EdgeTimes<T> {
    /// 10 % crossing, s.
    pub t10_s: T,
    /// 50 % crossing, s.
    pub t50_s: T,
    /// 90 % crossing, s.
    pub t90_s: T,
    /// t90 − t10, s.
    pub rise_10_90_s: T,
}

/// The grid f_k = f_max·(k/N)^GRID_POWER.
const GRID_POWER: i32 = 6;

/// f_max / f_w of the subtracted Gaussian H(0)·e^(−(f/f_w)²) (e^(−36) at f_max).
const W_RATIO: f64 = 6.0;

/// Ratio of a Gaussian edge's 10–90 % rise time to its σ: 2·Φ⁻¹(0.9).
const GAUSS_RISE_PER_SIGMA: f64 = 2.563_103_131_100_247;

/// The step response of a line model after a length, on a caller-owned grid
/// (see the module docs for the method and its accuracy).
#[derive(Debug)]
pub struct StepResponse<'a, T> {
    g: &'a [Cx<T>],
    f_max_hz: T,
    t_ref_s: T,
    h0: T,
}

impl<'a, T: Real> StepResponse<'a, T> {
    /// Samples H(f) = e^(−γ(f)·`length_m`) (times the Gaussian instrument
    /// response of `instrument_rise_time_s ≥ 0`, 0 for none) on
    /// f_k = `f_max_hz`·(k/N)⁶, N = `buf.len()` ≥ 64 (`Error::TooShort`
    /// naming `"buf"` otherwise). Errors of the model at any grid frequency are
    /// passed on; [`Error::Undefined`]`("t_ref_s")` if the line does not
    /// propagate at `f_max_hz` (β = 0).
    pub fn new<M: LineModel<T> + ?Sized>(
        model: &M,
        length_m: T,
        f_max_hz: T,
        instrument_rise_time_s: T,
        buf: &'a mut [Cx<T>],
    ) -> Result<Self> {
        let l = error::non_negative(length_m, "length_m")?;
        let f_max = error::positive(f_max_hz, "f_max_hz")?;
        let tr = error::non_negative(instrument_rise_time_s, "instrument_rise_time_s")?;
        let n = buf.len();
        if n < 64 {
            return Err(Error::TooShort {
                what: "buf",
                needed: 64,
            });
        }
        let two_pi = T::two_pi();
        let top = model.at(f_max)?;
        let beta_l_turns = top.beta_rad_per_m() * l / two_pi;
        if top.beta_rad_per_m().partial_cmp(&T::zero()) != Some(core::cmp::Ordering::Greater) {
            return Err(Error::Undefined("t_ref_s"));
        }
        let t_ref_s = error::finite(beta_l_turns / f_max, "t_ref_s")?;
        let g0 = model.at(T::zero())?.gamma_per_m;
        let h0 = error::finite((-(g0.re * l)).exp(), "h0")?;
        let sigma = tr / T::lit(GAUSS_RISE_PER_SIGMA);
        let nf = T::from_usize(n);
        let f_w = f_max / T::lit(W_RATIO);
        for (i, slot) in buf.iter_mut().enumerate() {
            let u = T::from_usize(i + 1) / nf;
            let f = f_max * u.powi(GRID_POWER);
            let p = model.at(f)?;
            let gl = p.gamma_per_m;
            // G = e^(−αl)·e^(−j(βl − 2πf·T_ref)), the phase in turns.
            let turns = gl.im * l / two_pi - f * t_ref_s;
            let w = two_pi * f * sigma;
            let mut gval = complex::exp_neg_turns(gl.re * l + w * w * T::half(), turns);
            let fw = f / f_w;
            gval.re = gval.re - h0 * (-(fw * fw)).exp();
            let gf = Cx::new(gval.re / f, gval.im / f);
            if !complex::is_finite(gf) {
                return Err(Error::NonFinite("buf"));
            }
            *slot = gf;
        }
        Ok(StepResponse {
            g: buf,
            f_max_hz: f_max,
            t_ref_s,
            h0,
        })
    }

    /// The reference delay T_ref = β(f_max)·l/(2π·f_max) (the phase delay at the top), s.
    pub fn reference_delay_s(&self) -> T {
        self.t_ref_s
    }

    /// The settled value H(0) = e^(−γ(0)·l) (1 without DC loss).
    pub fn final_value(&self) -> T {
        self.h0
    }

    /// The step response at time `t_s` after the step enters the line.
    pub fn at(&self, t_s: T) -> Result<T> {
        let t = error::finite(t_s, "t_s")?;
        // Non-finite only for absurd times (f·τ overflowing the phase).
        error::finite(self.eval(t - self.t_ref_s), "t_s")
    }

    /// [`Self::eval`] for the crossing search: a non-finite value stops it.
    fn eval_search(&self, tau: T) -> Result<T> {
        let v = self.eval(tau);
        if v.is_finite() {
            Ok(v)
        } else {
            Err(Error::NoConvergence("time_to_fraction_s"))
        }
    }

    fn eval(&self, tau: T) -> T {
        // Richardson: the Filon sum has an O(h²) error; combine the full grid
        // with the grid of every other point, (4·I_N − I_(N/2))/3.
        let all = self.g.iter().enumerate().map(|(i, &g)| (i + 1, g));
        let fine = self.integral(tau, all);
        let even = self
            .g
            .iter()
            .enumerate()
            .filter(|(i, _)| i & 1 == 1)
            .map(|(i, &g)| (i + 1, g));
        let coarse = self.integral(tau, even);
        let acc = (fine * T::lit(4.0) - coarse) / T::lit(3.0);
        // The subtracted H(0)·e^(−(f/f_w)²) is the zero-phase Gaussian step
        // Φ(τ/σ_w) = ½·erfc(−τ/(√2·σ_w)), √2·σ_w = 1/(π·f_w).
        let f_w = self.f_max_hz / T::lit(W_RATIO);
        let step = self.h0 * T::half() * (-(tau * T::PI() * f_w)).erfc();
        step + acc / T::PI()
    }

    /// Im ∫ g(f)·e^(j2πfτ) df over the given grid points (k, g(f_k)), k increasing.
    fn integral<I: Iterator<Item = (usize, Cx<T>)>>(&self, tau: T, mut pts: I) -> T {
        let nf = T::from_usize(self.g.len());
        let fk = |k: usize| {
            let u = T::from_usize(k) / nf;
            self.f_max_hz * u.powi(GRID_POWER)
        };
        let mut acc = Cx::new(T::zero(), T::zero());
        // First panel [0, f_s], g ∝ f^(−1/2): ∫ = 2·f_s·g_s·∫₀¹ e^(jθy²) dy, θ = 2π·f_s·τ.
        let Some((k1, g1)) = pts.next() else {
            return T::zero();
        };
        let mut f_a = fk(k1);
        acc = acc + g1 * first_panel(T::two_pi() * f_a * tau) * (f_a + f_a);
        let mut g_a = g1;
        for (k, g_b) in pts {
            let f_b = fk(k);
            let h = f_b - f_a;
            let (e0, e1) = filon_weights(h * tau);
            let ph = complex::phasor_turns(f_a * tau);
            let inner = g_a * (e0 - e1) + g_b * e1;
            acc = acc + ph * inner * h;
            f_a = f_b;
            g_a = g_b;
        }
        acc.im
    }

    /// The time at which the response first reaches `fraction` in (0, 1) of
    /// its settled value: a doubling search outward from T_ref for a bracket,
    /// then bisection to rounding level. Assumes the response rises through
    /// the level once (true for a lossy line's edge; ringing of a band-limited
    /// loss-free edge may give a later crossing).
    pub fn time_to_fraction_s(&self, fraction: T) -> Result<T> {
        let p = error::finite(fraction, "fraction")?;
        if !(p > T::zero() && p < T::one()) {
            return Err(Error::OutOfRange("fraction"));
        }
        let target = p * self.h0;
        let scale = T::one() / self.f_max_hz;
        let (mut lo, mut hi);
        if self.eval_search(T::zero())? >= target {
            hi = T::zero();
            lo = -scale;
            let mut k = 0;
            while self.eval_search(lo)? >= target {
                hi = lo;
                lo = lo + lo;
                k += 1;
                if k > 80 {
                    return Err(Error::NoConvergence("time_to_fraction_s"));
                }
            }
        } else {
            lo = T::zero();
            hi = scale;
            let mut k = 0;
            while self.eval_search(hi)? < target {
                lo = hi;
                hi = hi + hi;
                k += 1;
                if k > 200 || !hi.is_finite() {
                    return Err(Error::NoConvergence("time_to_fraction_s"));
                }
            }
        }
        for _ in 0..200 {
            let mid = (lo + hi) * T::half();
            if mid <= lo || mid >= hi {
                break;
            }
            if self.eval_search(mid)? < target {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        error::finite(self.t_ref_s + (lo + hi) * T::half(), "time_to_fraction_s")
    }

    /// The 10 %, 50 % and 90 % crossings and the 10–90 % rise time.
    pub fn edge(&self) -> Result<EdgeTimes<T>> {
        let t10_s = self.time_to_fraction_s(T::lit(0.1))?;
        let t50_s = self.time_to_fraction_s(T::half())?;
        let t90_s = self.time_to_fraction_s(T::lit(0.9))?;
        Ok(EdgeTimes {
            t10_s,
            t50_s,
            t90_s,
            rise_10_90_s: t90_s - t10_s,
        })
    }
}

/// ∫₀¹ e^(jθy²) dy by its power series Σ (jθ)ⁿ/(n!(2n+1)) for |θ| ≤ 8; beyond,
/// the crude mean 1 (the panel is then far too wide for the time asked; see docs).
fn first_panel<T: Real>(theta: T) -> Cx<T> {
    if theta.is_nan() || theta.abs() > T::lit(8.0) {
        return Cx::new(T::one(), T::zero());
    }
    let mut term = Cx::new(T::one(), T::zero());
    let mut sum = term;
    for n in 1..60usize {
        term = term * Cx::new(T::zero(), theta) / T::from_usize(n);
        let add = term / T::from_usize(2 * n + 1);
        sum = sum + add;
        if complex::abs(add) <= T::EPS * complex::abs(sum) {
            break;
        }
    }
    sum
}

/// Filon weights for a panel of width h at delay τ, with `ht` = h·τ (turns):
/// E0 = ∫₀¹ e^(jθx) dx, E1 = ∫₀¹ x·e^(jθx) dx, θ = 2π·ht.
fn filon_weights<T: Real>(ht: T) -> (Cx<T>, Cx<T>) {
    let theta = T::two_pi() * ht;
    if theta.abs() < T::one() {
        // Series: E0 = Σ (jθ)ⁿ/(n+1)!, E1 = Σ (jθ)ⁿ/(n!(n+2)).
        let mut term = Cx::new(T::one(), T::zero()); // (jθ)ⁿ/n!
        let mut e0 = Cx::new(T::one(), T::zero());
        let mut e1 = Cx::new(T::half(), T::zero());
        for n in 1..40usize {
            term = term * Cx::new(T::zero(), theta) / T::from_usize(n);
            let a0 = term / T::from_usize(n + 1);
            let a1 = term / T::from_usize(n + 2);
            e0 = e0 + a0;
            e1 = e1 + a1;
            if complex::abs(a0) <= T::EPS * T::lit(0.25) {
                break;
            }
        }
        (e0, e1)
    } else {
        let e = complex::phasor_turns(ht);
        let inv = T::one() / theta;
        let one = Cx::new(T::one(), T::zero());
        // 1/(jθ) = −j/θ; 1/(jθ)² = −1/θ².
        let c1 = Cx::new(T::zero(), -inv);
        let c2 = Cx::new(-inv * inv, T::zero());
        let e0 = (e - one) * c1;
        let e1 = e * (c1 - c2) + c2;
        (e0, e1)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::lossless::Lossless;

    #[test]
    fn gaussian_instrument_on_a_lossless_line() {
        // A lossless line with a Gaussian instrument edge: the step is Φ(τ/σ),
        // so its 10–90 % time is the instrument's rise time and its 50 % point T_d.
        let line = Lossless::<f64>::new(50.0, 0.66).unwrap();
        let tr = 1e-9;
        let mut buf = [Cx::new(0.0, 0.0); 512];
        let s = StepResponse::new(&line, 10.0, 5.0 / tr, tr, &mut buf).unwrap();
        let td = 10.0 / (0.66 * 299_792_458.0);
        let e = s.edge().unwrap();
        assert!((e.t50_s - td).abs() < 1e-3 * tr, "{:e}", e.t50_s - td);
        assert!(
            (e.rise_10_90_s - tr).abs() < 1e-3 * tr,
            "{:e}",
            e.rise_10_90_s
        );
    }
}

//! Chirp-z transform by Bluestein's algorithm over caller scratch.
//!
//! X_k = Σₙ xₙ · A⁻ⁿ · W^(nk), k = 0 .. M−1, n = 0 .. N−1: the z-transform of x on
//! the points z_k = A·W⁻ᵏ (Rabiner, Schafer & Rader, "The chirp z-transform
//! algorithm", IEEE Trans. Audio Electroacoust. AU-17(2):86–92, 1969; the same
//! definition as `scipy.signal.czt`). With A = 1 and W = e^(−j2π/M), M = N it is
//! the DFT; with A = e^(j2πf₁/fs), W = e^(−j2πΔf/fs) it is a zoomed spectrum of M
//! bins from f₁ in steps Δf.
//!
//! Here A = a_radius · e^(+j2π·a_turns) and W = w_radius · e^(−j2π·w_turns), so
//! that on the unit circle z_k = e^(j2π(a_turns + k·w_turns)).
//!
//! Algorithm: nk = (n² + k² − (k − n)²)/2 turns the sum into a convolution,
//! X_k = W^(k²/2) · Σₙ [xₙ A⁻ⁿ W^(n²/2)] · W^(−(k−n)²/2),
//! done by three FFTs of length L = next power of two ≥ N + M − 1.
//!
//! **Phase accuracy.** The chirp phases w_turns·n²/2 grow like N²; they are
//! reduced modulo one turn *exactly*: the phase in turns is split into 16-bit
//! integer chunks and each chunk times the integer n² is reduced with integer
//! arithmetic. The computed X_k is then the exact CZT of the stored `w_turns`
//! to within a few ε per chirp, in `f32` as in `f64` (no f64 on the f32 path).
//!
//! **Memory.** `scratch` holds 2.5·L complex values ([`scratch_len`]): two
//! convolution buffers and the FFT twiddle table; that is 20·L bytes in `f32`,
//! 40·L bytes in `f64`. N, M ≥ 1 and L ≤ 2²⁰.

use crate::error::{finite, positive, Error, Result};
use crate::math::complex::{reduce_turns, Cx};
use crate::math::fft::{fill_twiddles, Fft, MAX_LEN};
use crate::math::special::cis_turns;
use crate::scalar::Real;

/// The contour z_k = A·W⁻ᵏ, with A = a_radius·e^(j2π·a_turns) and
/// W = w_radius·e^(−j2π·w_turns).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Contour<T> {
    /// |A| > 0 (1 on the unit circle).
    pub a_radius: T,
    /// arg A in turns: the first point's normalised frequency f₁/fs.
    pub a_turns: T,
    /// |W| > 0 (1 on the unit circle; < 1 spirals outward).
    pub w_radius: T,
    /// −arg W in turns: the step in normalised frequency Δf/fs.
    pub w_turns: T,
}

impl<T: Real> Contour<T> {
    /// The unit-circle contour of an M-point DFT (scipy's default: A = 1,
    /// W = e^(−j2π/M)).
    ///
    /// Errors: [`Error::TooShort`] (`"m"`, 1) for M = 0.
    pub fn dft(m: usize) -> Result<Self> {
        if m == 0 {
            return Err(Error::TooShort {
                what: "m",
                needed: 1,
            });
        }
        Ok(Contour {
            a_radius: T::one(),
            a_turns: T::zero(),
            w_radius: T::one(),
            w_turns: T::from_usize(m).recip(),
        })
    }

    /// A frequency zoom on the unit circle: bins at f_start_hz + k·f_step_hz for a
    /// signal sampled at fs_hz (like `scipy.signal.zoom_fft` with
    /// f_step = (f₂ − f₁)/M, `endpoint=False`).
    ///
    /// Errors: [`Error::NonFinite`] naming `"f_start_hz"`, `"f_step_hz"`;
    /// [`Error::NotPositive`]`("fs_hz")`.
    pub fn zoom(f_start_hz: T, f_step_hz: T, fs_hz: T) -> Result<Self> {
        let f1 = finite(f_start_hz, "f_start_hz")?;
        let df = finite(f_step_hz, "f_step_hz")?;
        let fs = positive(fs_hz, "fs_hz")?;
        Ok(Contour {
            a_radius: T::one(),
            a_turns: f1 / fs,
            w_radius: T::one(),
            w_turns: df / fs,
        })
    }

    /// A time zoom of a frequency sweep: for spectrum samples Sₙ at f₀ + n·df_hz,
    /// the CZT on this contour gives X_k = Σₙ Sₙ·e^(+j2π·n·df·t_k) at
    /// t_k = t_start_s + k·t_step_s (an inverse DFT without the 1/N, restricted
    /// to a time window). The common factor e^(j2π f₀ t_k) is left to the caller.
    ///
    /// Errors: [`Error::NotPositive`]`("df_hz")`; [`Error::NonFinite`] naming
    /// `"t_start_s"`, `"t_step_s"`.
    pub fn time_zoom(df_hz: T, t_start_s: T, t_step_s: T) -> Result<Self> {
        let df = positive(df_hz, "df_hz")?;
        let t0 = finite(t_start_s, "t_start_s")?;
        let dt = finite(t_step_s, "t_step_s")?;
        Ok(Contour {
            a_radius: T::one(),
            a_turns: -(df * t0),
            w_radius: T::one(),
            w_turns: -(df * dt),
        })
    }

    fn check(&self) -> Result<()> {
        positive(self.a_radius, "a_radius")?;
        finite(self.a_turns, "a_turns")?;
        positive(self.w_radius, "w_radius")?;
        finite(self.w_turns, "w_turns")?;
        Ok(())
    }
}

/// FFT length L = next power of two ≥ N + M − 1 for N inputs and M outputs.
///
/// Errors: [`Error::TooShort`] naming `"n"` or `"m"` when zero;
/// [`Error::OutOfRange`]`("len")` when L would exceed 2²⁰.
pub fn fft_len(n: usize, m: usize) -> Result<usize> {
    if n == 0 {
        return Err(Error::TooShort {
            what: "n",
            needed: 1,
        });
    }
    if m == 0 {
        return Err(Error::TooShort {
            what: "m",
            needed: 1,
        });
    }
    let need = n.checked_add(m - 1).ok_or(Error::OutOfRange("len"))?;
    if need > MAX_LEN {
        return Err(Error::OutOfRange("len"));
    }
    Ok(need.next_power_of_two())
}

/// Complex values of scratch [`czt`] needs: 2·L + L/2 (L from [`fft_len`]).
///
/// Errors: as [`fft_len`].
pub fn scratch_len(n: usize, m: usize) -> Result<usize> {
    let l = fft_len(n, m)?;
    Ok(2 * l + l / 2)
}

/// Converts an integer below 2⁶⁴ exactly limb by limb (rounded once at the end).
fn from_u64<T: Real>(q: u64) -> T {
    let limb = |s: u32| T::from_i32(((q >> s) & 0xFFFF) as i32);
    let k = T::lit(65536.0);
    ((limb(48) * k + limb(32)) * k + limb(16)) * k + limb(0)
}

/// frac(t·m) reduced to [−½, ½] turns for an integer m < 2⁴¹, with an absolute
/// error of a few ε: the product is never formed in floating point.
fn turns_times<T: Real>(t: T, m: u64) -> T {
    let r0 = reduce_turns(t);
    let neg = r0 < T::zero();
    let mut r = r0.abs();
    let k = T::lit(65536.0);
    let inv_k = T::lit(1.0 / 65536.0);
    let mut unit = T::one();
    let mut acc = T::zero();
    for i in 0..6u32 {
        if r == T::zero() {
            break;
        }
        r = r * k; // exact (power of two)
        let c = r.floor();
        r = r - c; // exact
        unit = unit * inv_k; // 2^(−16(i+1)), exact
        let ci = c.to_i64_sat().max(0) as u64; // < 2^16
        let prod = ci.wrapping_mul(m); // < 2^57: no wrap for m < 2^41
        let bits = 16 * (i + 1);
        let q = if bits >= 64 {
            prod
        } else {
            prod & ((1u64 << bits) - 1)
        };
        acc = reduce_turns(acc + from_u64::<T>(q) * unit);
    }
    if neg {
        -acc
    } else {
        acc
    }
}

/// Computes the chirp-z transform of `x` on `contour` into `out` (M = `out.len()`
/// points), using `scratch` (≥ [`scratch_len`]`(x.len(), out.len())` values).
///
/// Errors: [`Error::TooShort`] naming `"x"` or `"out"` when empty;
/// [`Error::OutOfRange`]`("len")` for L > 2²⁰; [`Error::Capacity`] (`"scratch"`);
/// [`Error::NonFinite`]`("x")`; contour fields by name (`"a_radius"`, …);
/// [`Error::OutOfRange`]`("contour")` when a spiral contour (radius ≠ 1) makes the
/// chirp overflow and the result would not be finite (then `out` holds garbage).
pub fn czt<T: Real>(
    x: &[Cx<T>],
    contour: &Contour<T>,
    out: &mut [Cx<T>],
    scratch: &mut [Cx<T>],
) -> Result<()> {
    let n = x.len();
    let m = out.len();
    if n == 0 {
        return Err(Error::TooShort {
            what: "x",
            needed: 1,
        });
    }
    if m == 0 {
        return Err(Error::TooShort {
            what: "out",
            needed: 1,
        });
    }
    contour.check()?;
    if x.iter().any(|v| !(v.re.is_finite() && v.im.is_finite())) {
        return Err(Error::NonFinite("x"));
    }
    let l = fft_len(n, m)?;
    let cap = scratch.len();
    let need = scratch_len(n, m)?;
    let s = scratch.get_mut(..need).ok_or(Error::Capacity {
        what: "scratch",
        capacity: cap,
    })?;
    let (y, rest) = s.split_at_mut(l);
    let (v, table) = rest.split_at_mut(l);
    fill_twiddles(table)?;
    let plan = Fft::new(table)?;

    let unit_circle = contour.a_radius == T::one() && contour.w_radius == T::one();
    let ln_a = contour.a_radius.ln();
    let ln_w = contour.w_radius.ln();
    let half_w = contour.w_turns * T::half(); // exact
    let sq = |i: usize| (i as u64) * (i as u64);
    // |W^(e·i²/2)·A^(−e_a·i)|, 1 on the unit circle.
    let modulus = |i: usize, e_w: T, e_a: T| {
        if unit_circle {
            T::one()
        } else {
            let it = T::from_usize(i);
            (e_w * ln_w * it * it * T::half() - e_a * ln_a * it).exp()
        }
    };

    // y_n = x_n · A^(−n) · W^(n²/2), zero-padded to L.
    for (i, yv) in y.iter_mut().enumerate() {
        *yv = match x.get(i) {
            Some(xv) => {
                let turns = -(turns_times(half_w, sq(i)) + turns_times(contour.a_turns, i as u64));
                let p = cis_turns(turns);
                let g = modulus(i, T::one(), T::one());
                *xv * Cx::new(p.re * g, p.im * g)
            }
            None => Cx::new(T::zero(), T::zero()),
        };
    }
    // v_r = W^(−r²/2) for r = 0 .. M−1 and at L − r for r = 1 .. N−1.
    let chirp_inv = |r: usize| {
        let p = cis_turns(turns_times(half_w, sq(r)));
        let g = modulus(r, -T::one(), T::zero());
        Cx::new(p.re * g, p.im * g)
    };
    for vv in v.iter_mut() {
        *vv = Cx::new(T::zero(), T::zero());
    }
    for (r, vv) in v.iter_mut().enumerate().take(m) {
        *vv = chirp_inv(r);
    }
    if n > 1 {
        if let Some(tail) = v.get_mut(l - (n - 1)..) {
            for (vv, r) in tail.iter_mut().rev().zip(1..n) {
                *vv = chirp_inv(r);
            }
        }
    }
    plan.forward(y)?;
    plan.forward(v)?;
    for (a, b) in y.iter_mut().zip(v.iter()) {
        *a = *a * *b;
    }
    plan.inverse(y)?;
    // X_k = W^(k²/2) · g_k.
    for (k, (o, g)) in out.iter_mut().zip(y.iter()).enumerate() {
        let p = cis_turns(-turns_times(half_w, sq(k)));
        let mg = modulus(k, T::one(), T::zero());
        *o = *g * Cx::new(p.re * mg, p.im * mg);
    }
    // A spiral contour can overflow |W|^(n²/2); report it rather than return ∞/NaN.
    if out.iter().any(|v| !(v.re.is_finite() && v.im.is_finite())) {
        return Err(Error::OutOfRange("contour"));
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::math::complex::phasor_turns;

    #[test]
    fn exact_phase_reduction() {
        // t = 1/3 (rounded), m = 10^12: compare with f64 of the same rounded t in
        // integer-exact form for f32 input.
        let t32: f32 = 1.0 / 3.0;
        let m: u64 = 1_000_000_000_000;
        let exact = {
            // t32 = c / 2^25 exactly.
            let c = (t32 as f64 * (1u64 << 25) as f64) as u128;
            let q = (c * m as u128) % (1u128 << 25);
            let f = q as f64 / (1u64 << 25) as f64;
            f - f.round()
        };
        let got = turns_times(t32, m) as f64;
        assert!((got - exact).abs() < 1e-6, "{got} {exact}");
        assert_eq!(turns_times(0.0f64, 12345), 0.0);
        assert!((turns_times(0.25f64, 3) - (-0.25)).abs() < 1e-16);
    }

    #[test]
    fn default_contour_is_the_dft() {
        let x: [Cx<f64>; 5] = core::array::from_fn(|i| Cx::new(i as f64 + 1.0, 0.5 * i as f64));
        let mut out = [Cx::new(0.0, 0.0); 5];
        let mut scratch = [Cx::new(0.0, 0.0); 40];
        assert_eq!(scratch_len(5, 5), Ok(40));
        czt(&x, &Contour::dft(5).unwrap(), &mut out, &mut scratch).unwrap();
        for (k, o) in out.iter().enumerate() {
            let mut want = Cx::new(0.0, 0.0);
            for (i, v) in x.iter().enumerate() {
                want += *v * phasor_turns(-((i * k) as f64) / 5.0);
            }
            assert!((*o - want).norm() < 1e-13);
        }
        let mut small = [Cx::new(0.0, 0.0); 39];
        assert_eq!(
            czt(&x, &Contour::dft(5).unwrap(), &mut out, &mut small),
            Err(Error::Capacity {
                what: "scratch",
                capacity: 39
            })
        );
        assert_eq!(
            czt(&x[..0], &Contour::dft(5).unwrap(), &mut out, &mut scratch),
            Err(Error::TooShort {
                what: "x",
                needed: 1
            })
        );
        assert_eq!(fft_len(MAX_LEN, 2), Err(Error::OutOfRange("len")));
        let spiral = Contour {
            a_radius: 1.0,
            a_turns: 0.0,
            w_radius: 0.01,
            w_turns: 0.1,
        };
        let x = [Cx::new(1.0f64, 0.0); 40];
        let mut out = [Cx::new(0.0, 0.0); 40];
        let mut scratch = [Cx::new(0.0, 0.0); 320];
        assert_eq!(scratch_len(40, 40), Ok(320));
        assert_eq!(
            czt(&x, &spiral, &mut out, &mut scratch),
            Err(Error::OutOfRange("contour"))
        );
    }
}

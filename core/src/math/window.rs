//! Symmetric data windows (`w[0] = w[N−1]`) for gating and spectral analysis, and
//! the figures of merit of a window buffer.
//!
//! With m = min(n, N−1−n) (so the symmetry is exact) and s = sin(π·m/(N−1)):
//!
//! * rectangular: w = 1
//! * Hann: w = 0.5 − 0.5·cos(2πn/(N−1)) = s²
//! * Hamming: w = 0.54 − 0.46·cos(2πn/(N−1)) = 0.08 + 0.92·s²
//! * Kaiser(β): w = I0(β·√(1 − r²)) / I0(β), r = (N−1−2m)/(N−1), computed with the
//!   scaled e^(−x)·I0(x) so no β overflows.
//!
//! N = 1 gives the single sample 1 for every window. The sin² forms avoid the
//! cancellation of 1 − cos near the edges.
//!
//! Figures of merit (Harris, "On the use of windows for harmonic analysis with the
//! discrete Fourier transform", Proc. IEEE 66(1):51–83, 1978; values recomputed for
//! long windows, methods.md §8): highest side lobe / 3 dB main-lobe width / 6 dB
//! main-lobe width / equivalent noise bandwidth, widths and ENBW in bins:
//!
//! | window | side lobe | 3 dB | 6 dB | ENBW |
//! | --- | --- | --- | --- | --- |
//! | rectangular | −13.3 dB | 0.886 | 1.207 | 1.000 |
//! | Hann | −31.5 dB | 1.441 | 2.000 | 1.500 |
//! | Hamming | −42.7 dB | 1.303 | 1.815 | 1.363 |
//! | Kaiser β = 3π (α = 3) | −69.6 dB | 1.705 | 2.389 | 1.795 |
//!
//! A symmetric window of N samples spans N−1 sample intervals, so measured in bins of
//! 1/N its widths and ENBW exceed the table by about N/(N−1).
//!
//! [`coherent_gain`] = Σw/N and [`enbw_bins`] = N·Σw²/(Σw)² of any buffer.

use crate::error::{finite, Error, Result};
use crate::math::special::{bessel_i0, bessel_i0e, sin_cos_turns};
use crate::scalar::Real;

/// Which window, with its parameter.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Window<T> {
    /// w = 1.
    Rectangular,
    /// Raised cosine 0.5 − 0.5·cos(2πn/(N−1)).
    Hann,
    /// 0.54 − 0.46·cos(2πn/(N−1)).
    Hamming,
    /// Kaiser–Bessel with shape β ≥ 0 (β = πα; β = 0 is rectangular).
    Kaiser {
        /// Shape parameter β in [0, 1000] (practical windows use β ≤ 50; far
        /// beyond, the scaled Bessel denominator underflows).
        beta: T,
    },
}

/// Largest Kaiser β accepted (found by fuzzing: β ≈ 1e308 made the scaled
/// Bessel denominator 0 and the window NaN).
pub const MAX_KAISER_BETA: f64 = 1000.0;

impl<T: Real> Window<T> {
    /// Validates β and returns the Kaiser denominator e^(−β)·I0(β) (1 otherwise).
    fn check(&self) -> Result<T> {
        if let Window::Kaiser { beta } = *self {
            let beta = crate::error::non_negative(beta, "beta")?;
            if beta > T::lit(MAX_KAISER_BETA) {
                return Err(Error::OutOfRange("beta"));
            }
            return bessel_i0e(beta);
        }
        Ok(T::one())
    }

    /// Sample `n` of the length-`len` symmetric window.
    ///
    /// Errors: [`Error::OutOfRange`]`("n")` unless n < len (so also for len = 0);
    /// [`Error::NonFinite`] / [`Error::Negative`] / [`Error::OutOfRange`]`("beta")`
    /// for a bad Kaiser β.
    pub fn value(&self, n: usize, len: usize) -> Result<T> {
        if n >= len {
            return Err(Error::OutOfRange("n"));
        }
        let den = self.check()?;
        Ok(self.sample(n, len, den))
    }

    /// Fills `out` with the window of length `out.len()`.
    ///
    /// Errors: [`Error::TooShort`] (`"out"`, 1) for an empty buffer; β as [`Self::value`].
    pub fn fill(&self, out: &mut [T]) -> Result<()> {
        if out.is_empty() {
            return Err(Error::TooShort {
                what: "out",
                needed: 1,
            });
        }
        let den = self.check()?;
        let len = out.len();
        for (n, w) in out.iter_mut().enumerate() {
            *w = self.sample(n, len, den);
        }
        Ok(())
    }

    /// Multiplies `data` by the window of length `data.len()` in place.
    ///
    /// Errors: as [`Self::fill`] (named `"data"`).
    pub fn apply(&self, data: &mut [T]) -> Result<()> {
        if data.is_empty() {
            return Err(Error::TooShort {
                what: "data",
                needed: 1,
            });
        }
        let den = self.check()?;
        let len = data.len();
        for (n, v) in data.iter_mut().enumerate() {
            *v = *v * self.sample(n, len, den);
        }
        Ok(())
    }

    /// Sample with n < len, a validated β and `den` = e^(−β)·I0(β).
    fn sample(&self, n: usize, len: usize, den: T) -> T {
        if len == 1 {
            return T::one();
        }
        let span = len - 1;
        let m = n.min(span - n);
        let span_t = T::from_usize(span);
        match *self {
            Window::Rectangular => T::one(),
            Window::Hann => {
                let s = sin_cos_turns(T::from_usize(m) / (span_t + span_t)).0;
                s * s
            }
            Window::Hamming => {
                let s = sin_cos_turns(T::from_usize(m) / (span_t + span_t)).0;
                T::lit(0.08) + T::lit(0.92) * s * s
            }
            Window::Kaiser { beta } => {
                // r = (span − 2m)/span ∈ [0, 1]; 1 − r² = (1 − r)(1 + r) = 4m(span − m)/span².
                let mt = T::from_usize(m);
                let q = T::lit(4.0) * mt * (span_t - mt) / (span_t * span_t);
                let x = beta * q.max(T::zero()).sqrt();
                if beta <= T::lit(25.0) {
                    // Plain ratio of two all-positive series: fewest roundings.
                    // x ≤ β ≤ 25 is finite and I0 cannot overflow there.
                    let num = bessel_i0(x).unwrap_or(T::zero());
                    let d = bessel_i0(beta).unwrap_or(T::one());
                    num / d
                } else {
                    // x is finite (β is), so the scaled I0 cannot fail.
                    let num = bessel_i0e(x).unwrap_or(T::zero());
                    num / den * (x - beta).exp()
                }
            }
        }
    }
}

/// Coherent gain Σw / N of a window buffer (1 for rectangular, ≈ 0.5 for Hann).
///
/// Errors: [`Error::TooShort`] (`"w"`, 1) if empty; [`Error::NonFinite`]`("w")`.
pub fn coherent_gain<T: Real>(w: &[T]) -> Result<T> {
    if w.is_empty() {
        return Err(Error::TooShort {
            what: "w",
            needed: 1,
        });
    }
    let mut sum = T::zero();
    for &v in w {
        sum = sum + finite(v, "w")?;
    }
    Ok(sum / T::from_usize(w.len()))
}

/// Equivalent noise bandwidth in bins, N·Σw² / (Σw)² (1 for rectangular, 1.5 for a
/// long Hann window).
///
/// Errors: as [`coherent_gain`], and [`Error::Undefined`]`("w")` when Σw = 0.
pub fn enbw_bins<T: Real>(w: &[T]) -> Result<T> {
    if w.is_empty() {
        return Err(Error::TooShort {
            what: "w",
            needed: 1,
        });
    }
    let mut sum = T::zero();
    let mut sum2 = T::zero();
    for &v in w {
        let v = finite(v, "w")?;
        sum = sum + v;
        sum2 = sum2 + v * v;
    }
    if sum == T::zero() {
        return Err(Error::Undefined("w"));
    }
    Ok(T::from_usize(w.len()) * sum2 / (sum * sum))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn symmetric_with_expected_end_and_centre_values() {
        for len in [1usize, 2, 5, 8, 33] {
            for win in [
                Window::Rectangular,
                Window::Hann,
                Window::Hamming,
                Window::Kaiser { beta: 8.6f64 },
            ] {
                let mut w = [0.0f64; 33];
                win.fill(&mut w[..len]).unwrap();
                for n in 0..len {
                    assert_eq!(w[n], w[len - 1 - n]);
                    assert_eq!(win.value(n, len).unwrap(), w[n]);
                }
                if len == 1 {
                    assert_eq!(w[0], 1.0);
                }
                if len == 33 {
                    assert!((w[16] - 1.0).abs() < 1e-15);
                    let end = match win {
                        Window::Rectangular => 1.0,
                        Window::Hann => 0.0,
                        Window::Hamming => 0.08,
                        Window::Kaiser { .. } => {
                            1.0 / bessel_i0e(8.6f64).unwrap() * (-8.6f64).exp()
                        }
                    };
                    assert!((w[0] - end).abs() < 1e-15, "{win:?}");
                }
            }
        }
    }

    #[test]
    fn errors_name_the_parameter() {
        let mut w = [0.0f32; 4];
        assert_eq!(
            Window::Kaiser { beta: -1.0f32 }.fill(&mut w),
            Err(Error::Negative("beta"))
        );
        assert_eq!(
            Window::Kaiser { beta: 1.2e308f64 }.value(0, 4),
            Err(Error::OutOfRange("beta"))
        );
        assert_eq!(
            Window::<f32>::Hann.fill(&mut w[..0]),
            Err(Error::TooShort {
                what: "out",
                needed: 1
            })
        );
        assert_eq!(Window::<f32>::Hann.value(4, 4), Err(Error::OutOfRange("n")));
        assert_eq!(enbw_bins(&[0.0f32, 0.0]), Err(Error::Undefined("w")));
        assert_eq!(
            coherent_gain(&[1.0f32, f32::NAN]),
            Err(Error::NonFinite("w"))
        );
    }

    #[test]
    fn rectangular_figures_are_exact() {
        let w = [1.0f32; 10];
        assert_eq!(coherent_gain(&w), Ok(1.0));
        assert_eq!(enbw_bins(&w), Ok(1.0));
    }
}

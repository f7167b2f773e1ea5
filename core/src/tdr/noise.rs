//! Noise floor by robust statistics, in fixed memory.
//!
//! σ = 1.4826 · MAD(Δv) / √2, where Δv are first differences v\[i+1\] − v\[i\]
//! and MAD is the median absolute deviation from their median. The factor
//! 1.4826 = 1/Φ⁻¹(3/4) makes the MAD a consistent estimate of a Gaussian σ
//! (Rousseeuw & Croux, "Alternatives to the median absolute deviation",
//! J. Amer. Statist. Assoc. 88(424):1273–1283, 1993); the √2 undoes the
//! differencing of independent samples. Differencing removes the levels and a
//! slow creep (a constant in Δv, absorbed by the median); steps and edges touch
//! few differences and the median ignores them while they are fewer than half.
//!
//! Memory: at most [`NOISE_POINTS`] differences, taken evenly spaced over the
//! range, are copied to a stack array (`NOISE_POINTS · size_of::<T>()` bytes,
//! 1 KiB in f32) and a selection (not a sort) finds the medians, O(points).
//! The result is never below the quantisation floor step/√12.

use crate::error::{Error, Result};
use crate::scalar::Real;
use crate::tdr::trace::{median_in_place, Samples};

/// Most differences used for the estimate.
pub const NOISE_POINTS: usize = 256;

/// Consistency factor of the MAD for a Gaussian, 1/Φ⁻¹(3/4).
pub const MAD_TO_SIGMA: f64 = 1.482_602_218_505_602;

/// An estimated noise floor.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NoiseFloor<T> {
    /// Standard deviation of one sample's noise, V.
    pub sigma_v: T,
    /// Differences used.
    pub points: usize,
}

/// Robust per-sample noise σ from samples `[from, to)` (at least 8 samples).
pub fn noise_floor<T: Real, S: Samples<T> + ?Sized>(
    s: &S,
    from: usize,
    to: usize,
) -> Result<NoiseFloor<T>> {
    let to = to.min(s.sample_count());
    let n = to.saturating_sub(from);
    if n < 8 {
        return Err(Error::TooShort {
            what: "noise range",
            needed: 8,
        });
    }
    let pairs = n - 1;
    let points = pairs.min(NOISE_POINTS);
    let mut buf = [T::zero(); NOISE_POINTS];
    for (k, slot) in buf.iter_mut().take(points).enumerate() {
        // Evenly spaced pair starts (in u64: no overflow on 32-bit targets).
        let i = from + (k as u64 * pairs as u64 / points as u64) as usize;
        let a = s.volts(i).ok_or(Error::BadIndex {
            what: "samples",
            index: i,
        })?;
        let b = s.volts(i + 1).ok_or(Error::BadIndex {
            what: "samples",
            index: i + 1,
        })?;
        *slot = b - a;
    }
    let used = buf.get_mut(..points).ok_or(Error::Capacity {
        what: "noise points",
        capacity: NOISE_POINTS,
    })?;
    let med = median_in_place(used).ok_or(Error::Undefined("noise floor"))?;
    for x in used.iter_mut() {
        *x = (*x - med).abs();
    }
    let mad = median_in_place(used).ok_or(Error::Undefined("noise floor"))?;
    let sigma = T::lit(MAD_TO_SIGMA) * mad / T::two().sqrt();
    let quant = s.resolution_v() / T::lit(12.0).sqrt();
    Ok(NoiseFloor {
        sigma_v: sigma.max(quant),
        points,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn flat_trace_gives_zero_and_codes_give_the_quantisation_floor() {
        let x = [1.0f64; 100];
        assert_eq!(noise_floor(&x[..], 0, 100).unwrap().sigma_v, 0.0);
        let codes = [7i16; 100];
        let a = crate::tdr::trace::AdcCodes::<i16, f32>::new(&codes, 0.01, 0.0).unwrap();
        let s = noise_floor(&a, 0, 100).unwrap().sigma_v;
        assert!((s - 0.01 / 12f32.sqrt()).abs() < 1e-7);
        assert!(noise_floor(&x[..], 0, 5).is_err());
    }

    #[test]
    fn steps_do_not_raise_the_floor() {
        // Differences cycle through −2, −1, 0, 1, 2 mV (median 0, MAD 1 mV)
        // plus two large steps.
        let mut x = [0.0f64; 400];
        let mut acc = 0.0;
        for (i, v) in x.iter_mut().enumerate() {
            acc += ((i % 5) as f64 - 2.0) * 1e-3;
            *v = acc + if i > 100 { 1.0 } else { 0.0 } + if i > 300 { -0.5 } else { 0.0 };
        }
        let s = noise_floor(&x[..], 0, 400).unwrap().sigma_v;
        assert!((s - MAD_TO_SIGMA * 0.001 / 2f64.sqrt()).abs() < 1e-9, "{s}");
    }
}

//! Noise floor by robust statistics, in fixed memory.
//!
//! Start: s₀ = 1.4826 · MAD(Δv), where Δv are first differences
//! v\[i+1\] − v\[i\] and MAD is the median absolute deviation from their
//! median. The factor 1.4826 = 1/Φ⁻¹(3/4) makes the MAD a consistent estimate
//! of a Gaussian σ (Rousseeuw & Croux, "Alternatives to the median absolute
//! deviation", J. Amer. Statist. Assoc. 88(424):1273–1283, 1993). On
//! quantised samples the MAD jumps between code steps (at ½ LSB of noise it
//! reads either ~0 or ~2× the truth), so it only seeds a clipped RMS: the RMS
//! of the deviations within 4·max(s, LSB) of the median, iterated twice
//! (sigma clipping, common practice, no single source; a 4 s clip biases a
//! Gaussian σ by 0.1 %). σ = s/√2 undoes the differencing of independent
//! samples. Differencing removes the levels and a
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
    // The MAD is robust but coarse on quantised data (the differences take a
    // few integer values and the median jumps between them), so it only
    // starts a clipped RMS: the deviations within 4 s of the median, twice.
    let q = s.resolution_v();
    let mut s_d = T::lit(MAD_TO_SIGMA) * mad;
    let mut clip = T::lit(4.0) * s_d.max(q);
    for _ in 0..2 {
        let (mut sum, mut k) = (T::zero(), 0usize);
        for &x in used.iter() {
            if x <= clip {
                sum = sum + x * x;
                k += 1;
            }
        }
        if k == 0 {
            break;
        }
        s_d = (sum / T::from_usize(k)).sqrt();
        clip = T::lit(4.0) * s_d.max(q);
    }
    let sigma = s_d / T::two().sqrt();
    let quant = q / T::lit(12.0).sqrt();
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
        // Differences cycle through −2, −1, 0, 1, 2 mV (median 0, RMS √2 mV,
        // so σ = 1 mV) plus two large steps, which the clipping drops.
        let mut x = [0.0f64; 200];
        let mut acc = 0.0;
        for (i, v) in x.iter_mut().enumerate() {
            acc += ((i % 5) as f64 - 2.0) * 1e-3;
            *v = acc + if i > 50 { 1.0 } else { 0.0 } + if i > 150 { -0.5 } else { 0.0 };
        }
        let s = noise_floor(&x[..], 0, 200).unwrap().sigma_v;
        assert!((s / 1e-3 - 1.0).abs() < 0.02, "{s}");
    }
}

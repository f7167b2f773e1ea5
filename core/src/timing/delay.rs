//! Phase and group delay of a line model at a frequency.
//!
//! For γ = α + jβ: phase delay τp = β/ω (s/m, the delay of a single sinusoid's
//! phase fronts) and group delay τg = dβ/dω (s/m, the delay of the envelope of
//! a narrow-band signal around ω). For a length l the delays are τ·l. On a
//! dispersion-free line they coincide (= 1/v); on a lossy line with skin effect
//! the phase delay exceeds the high-frequency limit by the internal-inductance
//! term and the group delay more so at low frequency. Pozar, *Microwave
//! Engineering*, 4th ed., 2012, §2.1 for γ; the group velocity dω/dβ is the
//! textbook definition (the same book's wave-velocity section, from memory).
//!
//! Both come from [`crate::line::properties`] and
//! [`crate::line::group_delay_s_per_m`] (central difference); at exactly 0 Hz
//! the phase delay is the limit f → 0⁺ at [`crate::line::DC_LIMIT_HZ`].

use crate::error::{self, Error, Result};
use crate::line::{self, LineModel};
use crate::scalar::Real;

/// Phase and group delay of a line at one frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Delays<T> {
    /// The frequency, Hz.
    pub freq_hz: T,
    /// Phase delay β/ω per metre, s/m.
    pub phase_delay_s_per_m: T,
    /// Group delay dβ/dω per metre, s/m.
    pub group_delay_s_per_m: T,
    /// Phase delay for the length, s (one way).
    pub phase_delay_s: T,
    /// Group delay for the length, s (one way).
    pub group_delay_s: T,
}

/// Phase delay per metre β/ω (s/m) at `freq_hz ≥ 0`.
/// [`Error::Undefined`]`("phase_delay_s_per_m")` where β = 0 (evanescent).
pub fn phase_delay_s_per_m<T: Real, M: LineModel<T> + ?Sized>(model: &M, freq_hz: T) -> Result<T> {
    let p = line::properties(model, freq_hz)?;
    let d = p.phase_delay_s_per_m;
    if d.is_finite() {
        Ok(d)
    } else {
        Err(Error::Undefined("phase_delay_s_per_m"))
    }
}

/// Group delay per metre dβ/dω (s/m) at `freq_hz ≥ 0` (see
/// [`crate::line::group_delay_s_per_m`] for the difference step).
pub fn group_delay_s_per_m<T: Real, M: LineModel<T> + ?Sized>(model: &M, freq_hz: T) -> Result<T> {
    line::group_delay_s_per_m(model, freq_hz)
}

/// Phase and group delay per metre and for `length_m ≥ 0` (one way).
pub fn delays<T: Real, M: LineModel<T> + ?Sized>(
    model: &M,
    freq_hz: T,
    length_m: T,
) -> Result<Delays<T>> {
    let l = error::non_negative(length_m, "length_m")?;
    let p = line::properties(model, freq_hz)?;
    let pd = p.phase_delay_s_per_m;
    if !pd.is_finite() {
        return Err(Error::Undefined("phase_delay_s_per_m"));
    }
    let gd = p.group_delay_s_per_m;
    Ok(Delays {
        freq_hz: p.point.freq_hz,
        phase_delay_s_per_m: pd,
        group_delay_s_per_m: gd,
        phase_delay_s: error::finite(pd * l, "phase_delay_s")?,
        group_delay_s: error::finite(gd * l, "group_delay_s")?,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::lossless::Lossless;

    #[test]
    fn lossless_delays_equal_one_over_v() {
        let l = Lossless::<f64>::new(50.0, 0.66).unwrap();
        let d = delays(&l, 1e8, 100.0).unwrap();
        let t = 100.0 / (0.66 * 299_792_458.0);
        assert!((d.phase_delay_s - t).abs() < 1e-12 * t);
        assert!((d.group_delay_s - t).abs() < 1e-6 * t);
        let l32 = Lossless::<f32>::new(50.0, 0.66).unwrap();
        let d32 = delays(&l32, 1e8, 100.0).unwrap();
        assert!((d32.phase_delay_s as f64 - t).abs() < 1e-5 * t);
        assert_eq!(delays(&l, 1e8, -1.0), Err(Error::Negative("length_m")));
        assert_eq!(
            phase_delay_s_per_m(&l, f64::NAN),
            Err(Error::NonFinite("freq_hz"))
        );
    }
}

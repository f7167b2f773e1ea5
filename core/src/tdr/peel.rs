//! Layer peeling: the impedance profile along the cable from its reflection.
//!
//! The naive reading Z(t) = Z0·(1+ρ(t))/(1−ρ(t)) of a step trace is wrong
//! beyond the first discontinuity: later reflections are masked (the wave that
//! reaches them was reduced by transmission through the earlier ones) and
//! multiple reflections between discontinuities add false steps. Layer
//! peeling undoes both (Bruckstein & Kailath, "Inverse scattering for discrete
//! transmission-line models", SIAM Review 29(3):359–389, 1987).
//!
//! Discrete model: cells of equal delay, one sample per round trip. Start with
//! the down-going wave D₀ = δ\[n\] and the up-going wave U₀ = r\[n\], the impulse
//! reflection (the first difference of the normalised step response
//! s\[n\] = (v\[n\] − v_pre)/V_inc − 1, with r\[0\] = s\[0\] at time zero). For each
//! layer k:
//!
//! r_k = U_k\[0\]/D_k\[0\]; D′ = (D − r_k·U)/(1 − r_k); U′ = (U − r_k·D)/(1 − r_k);
//! D_{k+1}\[n\] = a·D′\[n\], U_{k+1}\[n\] = U′\[n+1\]/a; Z_{k+1} = Z_k·(1+r_k)/(1−r_k),
//!
//! with Z_0 the source impedance and `a` ∈ (0, 1] an optional one-way
//! amplitude factor per cell (loss compensation; `a = 1` lossless). The
//! voltage-wave junction relations D + U = D′ + U′, (D − U)/Z_k = (D′ − U′)/Z_{k+1}
//! give the update. Loss compensation amplifies noise by a^(−2k) at layer k.
//!
//! Memory: two caller buffers of length n (D and U) and the output; time
//! O(n²/2) multiply-adds. The recursion stops early when |r_k| ≥ 0.9999
//! (an open or a short: nothing beyond it is visible).

use crate::error::{self, Error, Result};
use crate::scalar::Real;
use crate::tdr::trace::{Samples, Trace};

/// How the profile ends.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ProfileEnd {
    /// All samples were used.
    Samples,
    /// An open (r ≥ 0.9999) after the given number of layers.
    Open,
    /// A short (r ≤ −0.9999).
    Short,
}

/// The outcome of a peel: how many impedances were written and why it stopped.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Profile {
    /// Entries of the output written: `z_ohm[k]` is the impedance of cell k.
    pub layers: usize,
    /// Why it stopped.
    pub end: ProfileEnd,
    /// Trace sample of cell 0 ([`Trace::peel`]; 0 for [`peel_impulse`]): cell k
    /// starts at round trip (first_sample + k − t0)·Δt.
    pub first_sample: usize,
}

/// Peels an impulse reflection `u` (overwritten; `r[n]` on entry, one sample
/// per cell round trip) using `d` as work (length ≥ `u.len()`) and writes the
/// cell impedances to `z_ohm` (length ≥ `u.len()`).
///
/// `z_source_ohm` > 0 is the reference impedance before cell 0;
/// `cell_attenuation` ∈ (0, 1] the one-way amplitude factor per cell.
pub fn peel_impulse<T: Real>(
    z_source_ohm: T,
    cell_attenuation: T,
    d: &mut [T],
    u: &mut [T],
    z_ohm: &mut [T],
) -> Result<Profile> {
    let z_src = error::positive(z_source_ohm, "z_source_ohm")?;
    let a = error::in_range(cell_attenuation, T::zero(), T::one(), "cell_attenuation")?;
    if a <= T::zero() {
        return Err(Error::NotPositive("cell_attenuation"));
    }
    let n = u.len();
    if n == 0 {
        return Err(Error::TooShort {
            what: "u",
            needed: 1,
        });
    }
    if d.len() < n {
        return Err(Error::Capacity {
            what: "d",
            capacity: d.len(),
        });
    }
    if z_ohm.len() < n {
        return Err(Error::Capacity {
            what: "z_ohm",
            capacity: z_ohm.len(),
        });
    }
    if let Some(i) = u.iter().position(|x| !x.is_finite()) {
        return Err(Error::BadIndex {
            what: "u",
            index: i,
        });
    }
    let d = d.get_mut(..n).ok_or(Error::Capacity {
        what: "d",
        capacity: n,
    })?;
    for (k, x) in d.iter_mut().enumerate() {
        *x = if k == 0 { T::one() } else { T::zero() };
    }
    let r_max = T::lit(0.9999);
    let inv_a = T::one() / a;
    let mut z = z_src;
    let mut live = n;
    for (k, zk) in z_ohm.iter_mut().take(n).enumerate() {
        let (Some(&d0), Some(&u0)) = (d.first(), u.first()) else {
            return Ok(Profile {
                layers: k,
                end: ProfileEnd::Samples,
                first_sample: 0,
            });
        };
        if d0 == T::zero() || !d0.is_finite() {
            return Err(Error::Undefined("u"));
        }
        let r = u0 / d0;
        if r >= r_max {
            return Ok(Profile {
                layers: k,
                end: ProfileEnd::Open,
                first_sample: 0,
            });
        }
        if r <= -r_max {
            return Ok(Profile {
                layers: k,
                end: ProfileEnd::Short,
                first_sample: 0,
            });
        }
        z = z * (T::one() + r) / (T::one() - r);
        *zk = z;
        let inv = T::one() / (T::one() - r);
        let fd = a * inv;
        let fu = inv_a * inv;
        // In place: D[m] ← a(D[m] − rU[m])/(1−r); U[m−1] ← (U[m] − rD[m])/(a(1−r)).
        let mut prev_u: Option<&mut T> = None;
        for (dm, um) in d.iter_mut().zip(u.iter_mut()).take(live) {
            let (dv, uv) = (*dm, *um);
            if let Some(p) = prev_u {
                *p = (uv - r * dv) * fu;
            }
            *dm = (dv - r * uv) * fd;
            prev_u = Some(um);
        }
        if let Some(p) = prev_u {
            *p = T::zero();
        }
        live = live.saturating_sub(1);
    }
    Ok(Profile {
        layers: n,
        end: ProfileEnd::Samples,
        first_sample: 0,
    })
}

impl<'a, T: Real, S: Samples<T> + ?Sized> Trace<'a, T, S> {
    /// Layer-peels this step trace: cell 0 is the first sample past the launch
    /// edge ([`Profile::first_sample`]), one sample per cell round trip (each cell is
    /// v·Δt/2 long). The model is exact for discontinuities on the sample
    /// grid; a finite rise time smears each step over a few cells (the
    /// plateaus between them still read their impedance). Uses
    /// `n = min(u.len(), samples from cell 0 on)` samples; `d` and `z_ohm`
    /// must hold at least `n`. `z_ohm[k]` is then the impedance of cell k,
    /// which spans round trips from (first_sample + k − t0)·Δt on.
    pub fn peel(
        &self,
        cell_attenuation: T,
        d: &mut [T],
        u: &mut [T],
        z_ohm: &mut [T],
    ) -> Result<Profile> {
        // Cell 0 starts where the launch edge has ended: at t0 + 0.85·t_r (the
        // half-width of a raised-cosine edge of 10–90 % rise t_r; an ideal
        // step reads t_r = 0.8 sample) less a quarter sample, so the launch is
        // removed exactly by subtracting the incident level. Reflections that
        // arrive during the edge are lumped into cell 0.
        let rise = self.rise_time_s / self.dt_s;
        let i0 = (self.t0_index + T::lit(0.85) * rise - T::lit(0.25))
            .ceil()
            .to_i64_sat()
            .max(0) as usize;
        let n = u.len().min(self.len.saturating_sub(i0));
        let u = u.get_mut(..n).ok_or(Error::Capacity {
            what: "u",
            capacity: n,
        })?;
        if n == 0 {
            return Err(Error::TooShort {
                what: "u",
                needed: 1,
            });
        }
        let mut prev = T::zero();
        for (k, x) in u.iter_mut().enumerate() {
            let v = self.samples.volts(i0 + k).ok_or(Error::BadIndex {
                what: "samples",
                index: i0 + k,
            })?;
            // r[0] = s[0]: the level at time zero itself, without the launch.
            let s = self.gamma_at_level(v);
            *x = s - prev;
            prev = s;
        }
        let p = peel_impulse(self.source_ohm, cell_attenuation, d, u, z_ohm)?;
        Ok(Profile {
            first_sample: i0,
            ..p
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn single_step_is_read_exactly() {
        // 50 → 75 Ω at cell 0: r = 0.2, no later reflections.
        let mut u = [0.2f64, 0.0, 0.0, 0.0];
        let mut d = [0.0; 4];
        let mut z = [0.0; 4];
        let p = peel_impulse(50.0, 1.0, &mut d, &mut u, &mut z).unwrap();
        assert_eq!(p.layers, 4);
        for zk in z {
            assert!((zk - 75.0).abs() < 1e-12, "{zk}");
        }
    }

    #[test]
    fn rejects_bad_buffers_and_values() {
        let mut u = [0.1f32; 4];
        let mut d = [0.0f32; 3];
        let mut z = [0.0f32; 4];
        assert!(matches!(
            peel_impulse(50.0, 1.0, &mut d, &mut u, &mut z),
            Err(Error::Capacity { what: "d", .. })
        ));
        let mut d = [0.0f32; 4];
        assert_eq!(
            peel_impulse(50.0, 0.0, &mut d, &mut u, &mut z),
            Err(Error::NotPositive("cell_attenuation"))
        );
        assert_eq!(
            peel_impulse(-1.0, 1.0, &mut d, &mut u, &mut z),
            Err(Error::NotPositive("z_source_ohm"))
        );
        u[2] = f32::NAN;
        assert_eq!(
            peel_impulse(50.0, 1.0, &mut d, &mut u, &mut z),
            Err(Error::BadIndex {
                what: "u",
                index: 2
            })
        );
        let mut open = [1.0f32, 0.0];
        let p = peel_impulse(50.0, 1.0, &mut d, &mut open, &mut z).unwrap();
        assert_eq!(
            p,
            Profile {
                layers: 0,
                end: ProfileEnd::Open,
                first_sample: 0,
            }
        );
    }
}

//! Peaks of a distance-domain response: distance with its interval,
//! reflection magnitude and return loss, in a fixed-capacity list.
//!
//! A peak is a sample whose magnitude reaches `threshold` and is not below
//! either neighbour (at an end of a zoom window, its one neighbour; the FFT
//! grid is periodic, so sample 0 has the last sample as its left neighbour).
//! Its position is refined by the parabola through the three magnitudes
//! (common practice, no single source), and so is its height.
//!
//! Interval: d ± resolution/2, each end scaled by the velocity range:
//! d_lo = max(d − res/2, 0)·v_lo/v, d_hi = (d + res/2)·v_hi/v (the
//! worst-case band of [`crate::timing`]). Return loss RL = −20·log10 ρ.

use heapless::Vec;

use crate::error::{self, Error, Result};
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::timing::Distance;

use super::grid::DistanceGrid;

/// A fixed-capacity list of up to `N` peaks (`Peaks::new()` makes an empty one).
pub type Peaks<T, const N: usize> = Vec<Peak<T>, N>;

/// One peak of a response.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Peak<T> {
    /// Distance and its interval, m.
    pub distance: Distance<T>,
    /// Reflection magnitude ρ at the peak (interpolated).
    pub rho: T,
    /// The signed value for a real (low-pass) response, ρ for a complex one:
    /// positive where the impedance rises, negative where it falls.
    pub value: T,
    /// Return loss −20·log10 ρ, dB.
    pub return_loss_db: T,
    /// Index of the sample at the peak.
    pub index: usize,
}

fn is_periodic<T: Real>(grid: &DistanceGrid<T>) -> bool {
    grid.start_m == T::zero()
        && grid.mode != super::grid::Mode::LowPassStep
        && (grid.step_m * T::from_usize(grid.len) - grid.range_m).abs()
            <= grid.range_m * T::lit(1e-4)
}

fn collect<T: Real, F: Fn(usize) -> Option<(T, T)>, const N: usize>(
    len: usize,
    get: F,
    grid: &DistanceGrid<T>,
    threshold: T,
    out: &mut Vec<Peak<T>, N>,
) -> Result<()> {
    let thr = error::positive(threshold, "threshold")?;
    if len != grid.len {
        return Err(Error::LengthMismatch("values"));
    }
    out.clear();
    let periodic = is_periodic(grid);
    let v = grid.velocity.nominal_m_per_s;
    let half_res = grid.resolution_m * T::half();
    for i in 0..len {
        let Some((y0, signed)) = get(i) else { continue };
        if !y0.is_finite() {
            return Err(Error::NonFinite("values"));
        }
        if y0 < thr {
            continue;
        }
        let left = if i == 0 {
            if periodic {
                len.checked_sub(1).and_then(&get).map(|p| p.0)
            } else {
                None
            }
        } else {
            get(i - 1).map(|p| p.0)
        };
        let right = if i + 1 < len {
            get(i + 1).map(|p| p.0)
        } else if periodic {
            // On a periodic grid the last sample's right neighbour is the
            // first: without it a peak at 0 m was listed again at the range.
            get(0).map(|p| p.0)
        } else {
            None
        };
        // Plateaus count once (strictly above the left, at least the right).
        if left.is_some_and(|l| l >= y0) || right.is_some_and(|r| r > y0) {
            continue;
        }
        let (off, rho) = match (left, right) {
            (Some(a), Some(c)) => {
                let den = a - y0 - y0 + c;
                if den < T::zero() {
                    let d = (T::half() * (a - c) / den).max(-T::half()).min(T::half());
                    (d, y0 - T::lit(0.25) * (a - c) * d)
                } else {
                    (T::zero(), y0)
                }
            }
            _ => (T::zero(), y0),
        };
        let d = grid.distance_m(T::from_usize(i) + off).max(T::zero());
        let lo = (d - half_res).max(T::zero()) * grid.velocity.lo_m_per_s / v;
        let hi = (d + half_res) * grid.velocity.hi_m_per_s / v;
        let signed = if signed < T::zero() { -rho } else { rho };
        let peak = Peak {
            distance: Distance {
                distance_m: d,
                lo_m: lo,
                hi_m: hi,
            },
            rho,
            value: signed,
            return_loss_db: -T::lit(20.0) * rho.log10(),
            index: i,
        };
        out.push(peak).map_err(|_| Error::Capacity {
            what: "peaks",
            capacity: N,
        })?;
    }
    Ok(())
}

/// Peaks of |x| of a complex (band-pass) response on `grid`, at or above
/// `threshold` (> 0), into `out` (cleared first).
///
/// Errors: [`Error::NotPositive`]`("threshold")`; [`Error::LengthMismatch`]
/// (`"values"`) unless `values.len()` = `grid.len`; [`Error::NonFinite`]
/// (`"values"`); [`Error::Capacity`] (`"peaks"`, N) when more peaks are found.
pub fn peaks_complex<T: Real, const N: usize>(
    values: &[Cx<T>],
    grid: &DistanceGrid<T>,
    threshold: T,
    out: &mut Vec<Peak<T>, N>,
) -> Result<()> {
    let get = |i: usize| {
        values.get(i).map(|z| {
            let a = complex::abs(*z);
            (a, a)
        })
    };
    collect(values.len(), get, grid, threshold, out)
}

/// Peaks of |h| of a real (low-pass impulse) response; the sign is kept in
/// [`Peak::value`]. Errors as [`peaks_complex`].
pub fn peaks_real<T: Real, const N: usize>(
    values: &[T],
    grid: &DistanceGrid<T>,
    threshold: T,
    out: &mut Vec<Peak<T>, N>,
) -> Result<()> {
    let len = grid.len.min(values.len());
    let vals = values.get(..len).unwrap_or(&[]);
    let get = |i: usize| vals.get(i).map(|h| (h.abs(), *h));
    collect(grid.len, get, grid, threshold, out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::math::complex::cx;
    use crate::math::window::Window;
    use crate::sweep::grid::{distance_grid, FreqGrid, Mode, Span};
    use crate::timing::VelocityRange;

    #[test]
    fn capacity_overflow_is_an_error() {
        let fg = FreqGrid::<f64>::new(1e6, 1e6, 8).unwrap();
        let v = VelocityRange::from_factor(0.5, 0.01).unwrap();
        let g = distance_grid(
            &fg,
            &v,
            &Window::Rectangular,
            Mode::BandPass,
            Span::Fft { points: 8 },
        )
        .unwrap();
        let x = [0.1, 0.5, 0.1, 0.6, 0.1, 0.7, 0.1, 0.2].map(|r| cx(r, 0.0));
        let mut two: Vec<Peak<f64>, 2> = Vec::new();
        assert_eq!(
            peaks_complex(&x, &g, 0.3, &mut two).unwrap_err(),
            Error::Capacity {
                what: "peaks",
                capacity: 2
            }
        );
        let mut four: Vec<Peak<f64>, 4> = Vec::new();
        peaks_complex(&x, &g, 0.3, &mut four).unwrap();
        assert_eq!(four.len(), 3);
        let p = four[0];
        assert!(p.distance.lo_m < p.distance.distance_m && p.distance.distance_m < p.distance.hi_m);
        assert!((p.return_loss_db + 20.0 * p.rho.log10()).abs() < 1e-12);
        assert_eq!(
            peaks_complex(&x, &g, 0.0, &mut four).unwrap_err(),
            Error::NotPositive("threshold")
        );
    }

    /// A reflection at the reference plane on the periodic (FFT) grid: its
    /// main lobe spans both ends of the grid, and it must be listed once, at
    /// 0 m, not again at the end of the range.
    #[test]
    fn a_peak_at_zero_is_not_repeated_at_the_range() {
        let fg = FreqGrid::<f64>::new(1e6, 1e6, 8).unwrap();
        let v = VelocityRange::from_factor(0.5, 0.01).unwrap();
        let g = distance_grid(
            &fg,
            &v,
            &Window::Rectangular,
            Mode::BandPass,
            Span::Fft { points: 8 },
        )
        .unwrap();
        let x = [1.0, 0.6, 0.1, 0.05, 0.05, 0.1, 0.3, 0.8].map(|r| cx(r, 0.0));
        let mut p: Vec<Peak<f64>, 4> = Vec::new();
        peaks_complex(&x, &g, 0.2, &mut p).unwrap();
        assert_eq!(p.len(), 1, "{p:?}");
        assert_eq!(p[0].index, 0);
    }
}

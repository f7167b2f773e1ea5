//! Interpolation on uniformly sampled data.
//!
//! * [`lerp_uniform`]: `y(x) = (1 − u)·y[i] + u·y[i+1]` with `i + u = (x − x0)/dx`.
//! * [`first_crossing`]: the first i with `y[i]` on one side of a level and
//!   `y[i+1]` on the other (or on it), and the fractional position
//!   `i + (level − y[i])/(y[i+1] − y[i])`.
//! * [`parabolic_peak`]: the vertex of the parabola through three neighbouring
//!   samples, offset δ = ½·(y₋ − y₊)/(y₋ − 2y₀ + y₊) and value
//!   y₀ − ¼·(y₋ − y₊)·δ (common practice, no single source; see e.g. Smith,
//!   *Spectral Audio Signal Processing*, 2011, "quadratic interpolation of
//!   spectral peaks").
//!
//! All take slices and never panic: short slices and out-of-range positions are
//! typed errors.

use crate::error::{finite, positive, Error, Result};
use crate::scalar::Real;

/// Linear interpolation of samples `y[i]` taken at x0 + i·dx, at abscissa `x`
/// within [x0, x0 + (N − 1)·dx].
///
/// Errors: [`Error::TooShort`] (`"y"`, 1) if empty; [`Error::NonFinite`] naming
/// `"x0"`, `"x"`; [`Error::NotPositive`]`("dx")`; [`Error::OutOfRange`]`("x")`
/// outside the grid (by more than rounding).
pub fn lerp_uniform<T: Real>(y: &[T], x0: T, dx: T, x: T) -> Result<T> {
    let first = *y.first().ok_or(Error::TooShort {
        what: "y",
        needed: 1,
    })?;
    let x0 = finite(x0, "x0")?;
    let dx = positive(dx, "dx")?;
    let x = finite(x, "x")?;
    let pos = (x - x0) / dx;
    let last = T::from_usize(y.len() - 1);
    let slack = T::lit(8.0) * T::EPS * last.max(T::one());
    if !(pos >= -slack && pos <= last + slack) {
        return Err(Error::OutOfRange("x"));
    }
    if y.len() == 1 {
        return Ok(first);
    }
    let pos = pos.max(T::zero()).min(last);
    // Index of the left sample, clamped so that i + 1 is valid.
    let i = (pos.floor().to_i64_sat().max(0) as usize).min(y.len() - 2);
    let u = pos - T::from_usize(i);
    match (y.get(i), y.get(i + 1)) {
        (Some(&a), Some(&b)) => Ok(a + (b - a) * u),
        _ => Err(Error::OutOfRange("x")),
    }
}

/// Which way a crossing must go.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Direction {
    /// `y[i] < level ≤ y[i+1]`.
    Rising,
    /// `y[i] > level ≥ y[i+1]`.
    Falling,
    /// Either of the above.
    Either,
}

/// Position (fractional sample index) of the first crossing of `level` at or
/// after sample `start`, or `None` if there is none.
///
/// Errors: [`Error::TooShort`] (`"y"`, 2); [`Error::NonFinite`]`("level")`;
/// [`Error::OutOfRange`]`("start")` if `start ≥ y.len()`;
/// [`Error::NonFinite`]`("y")` on a non-finite sample met before the crossing.
pub fn first_crossing<T: Real>(
    y: &[T],
    level: T,
    direction: Direction,
    start: usize,
) -> Result<Option<T>> {
    if y.len() < 2 {
        return Err(Error::TooShort {
            what: "y",
            needed: 2,
        });
    }
    let level = finite(level, "level")?;
    let rest = y.get(start..).ok_or(Error::OutOfRange("start"))?;
    if rest.is_empty() {
        return Err(Error::OutOfRange("start"));
    }
    for (i, w) in rest.windows(2).enumerate() {
        if let [a, b] = *w {
            let a = finite(a, "y")?;
            let b = finite(b, "y")?;
            let rising = a < level && b >= level;
            let falling = a > level && b <= level;
            let hit = match direction {
                Direction::Rising => rising,
                Direction::Falling => falling,
                Direction::Either => rising || falling,
            };
            if hit {
                // b ≠ a here, and (level − a)/(b − a) ∈ (0, 1].
                let u = ((level - a) / (b - a)).max(T::zero()).min(T::one());
                return Ok(Some(T::from_usize(start + i) + u));
            }
        }
    }
    Ok(None)
}

/// A refined extremum from [`parabolic_peak`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Peak<T> {
    /// Fractional offset from the centre sample, in samples (|δ| ≤ ½ when the
    /// centre sample is the largest, or smallest, of the three).
    pub offset: T,
    /// Interpolated value at the vertex.
    pub value: T,
}

/// Vertex of the parabola through `y[i−1]`, `y[i]`, `y[i+1]` (a peak or a trough).
///
/// Three equal samples give offset 0 and value `y[i]`.
///
/// Errors: [`Error::TooShort`] (`"y"`, 3); [`Error::OutOfRange`]`("i")` unless
/// 1 ≤ i ≤ N − 2; [`Error::NonFinite`]`("y")`; [`Error::Undefined`]`("peak")`
/// when the three samples lie on a sloped straight line.
pub fn parabolic_peak<T: Real>(y: &[T], i: usize) -> Result<Peak<T>> {
    if y.len() < 3 {
        return Err(Error::TooShort {
            what: "y",
            needed: 3,
        });
    }
    let lo = i.checked_sub(1).ok_or(Error::OutOfRange("i"))?;
    let hi = lo.checked_add(3).ok_or(Error::OutOfRange("i"))?;
    let three = y.get(lo..hi).ok_or(Error::OutOfRange("i"))?;
    let (ym, y0, yp) = match *three {
        [a, b, c] => (finite(a, "y")?, finite(b, "y")?, finite(c, "y")?),
        _ => return Err(Error::OutOfRange("i")),
    };
    let den = ym - (y0 + y0) + yp;
    let diff = ym - yp;
    if den == T::zero() {
        return if diff == T::zero() {
            Ok(Peak {
                offset: T::zero(),
                value: y0,
            })
        } else {
            Err(Error::Undefined("peak"))
        };
    }
    let offset = T::half() * diff / den;
    Ok(Peak {
        offset,
        value: y0 - T::lit(0.25) * diff * offset,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lerp_on_a_line_is_exact() {
        let y = [1.0f64, 3.0, 5.0, 7.0];
        assert_eq!(lerp_uniform(&y, 10.0, 0.5, 10.25), Ok(2.0));
        assert_eq!(lerp_uniform(&y, 10.0, 0.5, 11.5), Ok(7.0));
        assert_eq!(
            lerp_uniform(&y, 10.0, 0.5, 11.6),
            Err(Error::OutOfRange("x"))
        );
        assert_eq!(lerp_uniform(&y[..1], 10.0, 0.5, 10.0), Ok(1.0));
        assert_eq!(
            lerp_uniform(&y, 10.0, 0.0, 10.0),
            Err(Error::NotPositive("dx"))
        );
        assert_eq!(
            lerp_uniform::<f32>(&[], 0.0, 1.0, 0.0),
            Err(Error::TooShort {
                what: "y",
                needed: 1
            })
        );
    }

    #[test]
    fn crossings() {
        let y = [0.0f32, 0.2, 0.6, 1.0, 0.4, -0.2];
        assert_eq!(
            first_crossing(&y, 0.5, Direction::Rising, 0),
            Ok(Some(1.75))
        );
        let f = first_crossing(&y, 0.5, Direction::Falling, 0)
            .unwrap()
            .unwrap();
        assert!((f - (3.0 + 5.0 / 6.0)).abs() < 1e-6);
        assert_eq!(
            first_crossing(&y, 0.5, Direction::Either, 3).map(|v| v.is_some()),
            Ok(true)
        );
        assert_eq!(first_crossing(&y, 2.0, Direction::Either, 0), Ok(None));
        assert_eq!(
            first_crossing(&y, 0.5, Direction::Rising, 6),
            Err(Error::OutOfRange("start"))
        );
        assert_eq!(
            first_crossing(&y[..1], 0.5, Direction::Rising, 0),
            Err(Error::TooShort {
                what: "y",
                needed: 2
            })
        );
        assert_eq!(
            first_crossing(&[0.0f64, f64::NAN], 0.5, Direction::Rising, 0),
            Err(Error::NonFinite("y"))
        );
    }

    #[test]
    fn parabola_vertex_is_recovered() {
        // y = 3 − 2(x − 4.3)² sampled at integers: vertex at 4.3, value 3.
        let y: [f64; 8] = core::array::from_fn(|k| 3.0 - 2.0 * (k as f64 - 4.3).powi(2));
        let p = parabolic_peak(&y, 4).unwrap();
        assert!((p.offset - 0.3).abs() < 1e-14);
        assert!((p.value - 3.0).abs() < 1e-14);
        assert_eq!(parabolic_peak(&y, 0), Err(Error::OutOfRange("i")));
        assert_eq!(parabolic_peak(&y, 7), Err(Error::OutOfRange("i")));
        assert_eq!(
            parabolic_peak(&[1.0f32, 2.0, 3.0], 1),
            Err(Error::Undefined("peak"))
        );
        assert_eq!(
            parabolic_peak(&[1.0f32, 1.0, 1.0], 1),
            Ok(Peak {
                offset: 0.0,
                value: 1.0
            })
        );
    }
}

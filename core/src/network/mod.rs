//! Terminations, reflection, two-port networks and cascades.
//!
//! * [`load`]: open, short, resistor, fixed impedance, series and parallel
//!   R-L-C at any f ≥ 0 (DC limits explicit, never NaN).
//! * [`mod@reflection`]: Γ = (Z − Zr)/(Z + Zr) (voltage / pseudo-wave convention),
//!   VSWR, return loss, mismatch loss, transmitted power, Smith-chart coordinates.
//! * [`abcd`]: chain matrices of line sections (pole-free, DC-safe form),
//!   series and shunt elements and ideal transformers, kept as a matrix times a
//!   real scale e^s so that αl = 200 Np neither overflows nor loses S21;
//!   S (Pozar, *Microwave Engineering*, 4th ed., 2012, Table 4.2), Z and Y parameters.
//! * [`cascade`]: up to `N` elements ended by a load; input impedance by the
//!   reflection recursion Γin = Γ_L·e^{−2γl}, Zin = Zc(1 + Γin)/(1 − Γin) (never
//!   tanh γl, so no pole at the quarter wave), and sweeps into caller buffers.
//!
//! Every function is generic over [`crate::Real`] and works in f32 and f64;
//! nothing allocates and nothing panics.

pub mod abcd;
pub mod cascade;
pub mod load;
pub mod reflection;

pub use abcd::{Abcd, SParams};
pub use cascade::{Cascade, Element};
pub use load::{Load, Rlc};
pub use reflection::{
    impedance_from_reflection, mismatch, mismatch_loss_db, reflection, return_loss_db, smith_point,
    transmitted_power_fraction, vswr, Mismatch, SmithPoint,
};

use crate::error::{Error, Result};
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::Impedance;

/// max(|Re z|, |Im z|): a cheap norm for scaling and cancellation tests.
#[inline(always)]
pub(crate) fn inf_norm<T: Real>(z: Cx<T>) -> T {
    z.re.abs().max(z.im.abs())
}

/// x + y, or exactly 0 if the sum cancels to within 8ε of the larger term
/// (below the rounding error of the terms themselves).
#[inline]
pub(crate) fn snap_sum<T: Real>(x: Cx<T>, y: Cx<T>) -> Cx<T> {
    let s = x + y;
    if inf_norm(s) <= T::lit(8.0) * T::EPS * inf_norm(x).max(inf_norm(y)) {
        Cx::new(T::zero(), T::zero())
    } else {
        s
    }
}

/// Z = n/d as an [`Impedance`]: d = 0 is an open; 0/0 has no value.
#[inline]
pub(crate) fn ratio_to_impedance<T: Real>(n: Cx<T>, d: Cx<T>) -> Result<Impedance<T>> {
    let zero = T::zero();
    let d_zero = d.re == zero && d.im == zero;
    if d_zero {
        if n.re == zero && n.im == zero {
            return Err(Error::Undefined("input_impedance"));
        }
        return Ok(Impedance::Open);
    }
    Ok(Impedance::from_complex(complex::unsign_zero(complex::div(
        n, d,
    ))))
}

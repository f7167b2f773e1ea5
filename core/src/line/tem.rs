//! Shared pieces of the geometry and datasheet models (crate-private): a
//! quasi-TEM point from Z and Y per metre with the loss warnings, and the
//! series impedance of a conductor loss given as R → k·√f at high frequency.
//!
//! A quasi-TEM line with characteristic impedance Z0 and effective permittivity
//! εeff has L = Z0·√εeff/c0 and C = √εeff/(Z0·c0) per metre (so √(L/C) = Z0 and
//! 1/√(LC) = c0/√εeff). Small-loss attenuation α ≈ R/(2Z0) + G·Z0/2 (Pozar,
//! *Microwave Engineering*, 4th ed., 2012, §2.7), so a closed-form αc maps to
//! R = 2·Z0·αc and αd to G = 2·αd/Z0. A dielectric loss through a filling
//! factor q = (εeff − 1)/(εr − 1) is G = ωC·tanδ_eff with
//! tanδ_eff = εr·q·tanδ/εeff, which reproduces
//! αd = (k0/2)·εr·(εeff − 1)·tanδ/[√εeff·(εr − 1)] (Pozar 2012, eq. 3.198).

use crate::error::Result;
use crate::line::conductor::Conductor;
use crate::line::{LinePoint, Warnings};
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::Impedance;

/// Builds a point from Z and Y (per metre) and sets HIGH_LOSS / DIFFUSIVE as
/// [`crate::line::rlgc`] does, on top of `base`.
#[inline]
pub(crate) fn point<T: Real>(
    f: T,
    z: Cx<T>,
    y: Cx<T>,
    zc_dc: Option<Cx<T>>,
    base: Warnings,
) -> Result<LinePoint<T>> {
    // γ = √(ZY) (principal root; for passive Z and Y, Re γ ≥ 0 and Im γ ≥ 0):
    // Im ZY = ωL·G + ωC·R has no cancellation, so the small α keeps its
    // relative precision (√Z·√Y would lose ε·β/α of it). Zc = Z/γ.
    let zy = z * y;
    // Only a finite, non-zero ZY takes the one-root path (an overflowed product
    // goes through `from_zy`, which rejects non-finite Z and Y and otherwise
    // takes √Z·√Y separately).
    let mut p = if complex::is_finite(zy) && (zy.re != T::zero() || zy.im != T::zero()) {
        let gamma = complex::sqrt(zy);
        if !complex::is_finite(gamma) {
            LinePoint::from_zy(f, z, y, zc_dc)?
        } else {
            LinePoint {
                freq_hz: f,
                z_ohm_per_m: z,
                y_s_per_m: y,
                gamma_per_m: gamma,
                zc_ohm: Impedance::from_complex(complex::div(z, gamma)),
                model_loss_split_np_per_m: None,
                warnings: Warnings::NONE,
            }
        }
    } else {
        LinePoint::from_zy(f, z, y, zc_dc)?
    };
    let mut w = base;
    let tenth = T::lit(0.1);
    w.set_if(
        z.re > T::zero() && z.re >= tenth * z.im,
        Warnings::HIGH_LOSS,
    );
    w.set_if(
        y.re > T::zero() && y.re >= tenth * y.im,
        Warnings::HIGH_LOSS,
    );
    w.set_if(z.re > T::zero() && z.re >= z.im, Warnings::DIFFUSIVE);
    p.warnings = w;
    Ok(p)
}

/// Series internal impedance of a conductor loss: with a DC resistance it is
/// R_dc·√(1 + j f/f_c) (see [`Conductor`]), R → k·√f at high frequency; without
/// one it is the pure skin-effect (1 + j)·k·√f (zero at DC).
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum SkinLoss<T> {
    /// No conductor loss.
    None,
    /// (1 + j)·k·√f, k in Ω/(m·√Hz).
    Pure(T),
    /// R_dc·√(1 + j f/f_c).
    FromDc(Conductor<T>),
}

impl<T: Real> SkinLoss<T> {
    /// From the high-frequency coefficient k ≥ 0 and an optional DC resistance.
    pub(crate) fn new(k_hf: T, r_dc: Option<T>) -> Result<Self> {
        if k_hf <= T::zero() {
            return Ok(SkinLoss::None);
        }
        match r_dc {
            Some(r) => Ok(SkinLoss::FromDc(Conductor::generic(r, k_hf)?)),
            None => Ok(SkinLoss::Pure(k_hf)),
        }
    }

    /// The internal impedance per metre at f ≥ 0.
    #[inline]
    pub(crate) fn eval(&self, f: T) -> Cx<T> {
        match self {
            SkinLoss::None => Cx::new(T::zero(), T::zero()),
            SkinLoss::Pure(k) => {
                let r = *k * f.sqrt();
                Cx::new(r, r)
            }
            SkinLoss::FromDc(c) => c.eval(f),
        }
    }
}

/// Filling factor q = (εeff − 1)/(εr − 1), 1 when εr is within rounding of 1.
#[inline]
pub(crate) fn filling_factor<T: Real>(eps_r: T, eps_eff: T) -> T {
    let d = eps_r - T::one();
    if d <= T::EPS * T::lit(16.0) {
        T::one()
    } else {
        ((eps_eff - T::one()) / d).max(T::zero()).min(T::one())
    }
}

/// Z and Y per metre of a quasi-TEM line: Z = Z_int + jωL, Y = G + jωC with
/// L = Z0√εeff/c0, C = √εeff/(Z0c0), G = ωC·tanδ_eff.
#[inline]
pub(crate) fn zy<T: Real>(f: T, z0: T, eps_eff: T, tan_d_eff: T, z_int: Cx<T>) -> (Cx<T>, Cx<T>) {
    let se = eps_eff.sqrt();
    let w_over_c = T::two_pi() * f / T::c0();
    let wl = w_over_c * z0 * se;
    let wc = w_over_c * se / z0;
    (
        Cx::new(z_int.re, z_int.im + wl),
        Cx::new(wc * tan_d_eff, wc),
    )
}

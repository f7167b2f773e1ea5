//! Transmission-line models: one interface for every kind of line.
//!
//! A uniform line is described per unit length by its series impedance
//! Z(ω) = R(ω) + jωL(ω) and shunt admittance Y(ω) = G(ω) + jωC(ω) (the
//! telegrapher equations; e.g. Pozar, *Microwave Engineering*, 4th ed., 2012,
//! §2.1). From them
//!
//! * propagation constant γ = α + jβ = √Z·√Y, the branch with Re γ ≥ 0 (waves
//!   decay in the direction they travel; for passive Z and Y also Im γ ≥ 0);
//! * characteristic impedance Zc = √Z/√Y, the branch with Re Zc ≥ 0;
//! * effective permittivity εeff = (β·c0/ω)², phase velocity vp = ω/β,
//!   group velocity vg = dω/dβ, velocity factor vp/c0, wavelength 2π/β,
//!   attenuation 20·log10(e)·α dB/m.
//!
//! Every model implements [`LineModel`]: it returns a [`LinePoint`] at any
//! frequency f ≥ 0 **including DC**, with a [`Warnings`] set when the model's
//! assumptions break. [`properties`] derives the velocities and losses.
//!
//! Models: [`lossless`], [`rlgc`] (per-unit-length, from DC), [`coax`] (with its
//! TE11 cutoff), [`datasheet`] (Z0, VF and attenuation figures), [`microstrip`],
//! [`stripline`], [`cpw`], [`two_wire`] (and twisted pair) and [`waveguide`]
//! (TE10 as an equivalent dispersive line: the one model with no DC limit, its
//! `at(0)` is [`Error::Undefined`]). [`synth`] solves one dimension of a
//! geometry for a target impedance.
//!
//! At exactly 0 Hz the phase velocity ω/β is 0/0; [`properties`] reports the
//! limit f → 0⁺, evaluated at [`DC_LIMIT_HZ`]. For a lossless line this is the
//! exact 1/√(LC); for a line with series resistance it is the (small) diffusive
//! velocity there, which tends to zero as it should.

pub mod coax;
pub mod conductor;
pub mod cpw;
pub mod datasheet;
pub mod dielectric;
pub mod lossless;
pub mod microstrip;
pub mod rlgc;
pub mod stripline;
pub mod synth;
pub(crate) mod tem;
pub mod two_wire;
pub mod waveguide;

use crate::error::{self, Error, Result};
use crate::math::complex::{self, Cx};
use crate::scalar::{Real, DB_PER_NEPER};
use crate::value::Impedance;

/// Frequency at which DC limits of velocities are evaluated (1 mHz).
pub const DC_LIMIT_HZ: f64 = 1e-3;

/// A set of validity warnings attached to a computed result (machine-readable,
/// no text on the firmware path; [`Warnings::describe`] gives words for a page).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash)]
pub struct Warnings(u16);

impl Warnings {
    /// No warnings.
    pub const NONE: Warnings = Warnings(0);
    /// The frequency is at or above the first higher-order-mode cutoff (or
    /// surface-wave onset): the line is no longer single-mode TEM / quasi-TEM.
    pub const ABOVE_HIGHER_MODE: Warnings = Warnings(1 << 0);
    /// Below the cutoff of a waveguide mode: the wave is evanescent, nothing propagates.
    pub const EVANESCENT: Warnings = Warnings(1 << 1);
    /// Geometry or material outside the published fit range of the formula used.
    pub const OUTSIDE_FIT_RANGE: Warnings = Warnings(1 << 2);
    /// Loss too large for small-loss forms: R/ωL or G/ωC is not small (≥ 0.1).
    pub const HIGH_LOSS: Warnings = Warnings(1 << 3);
    /// Diffusive (RC) regime: R/ωL ≥ 1, a velocity factor is meaningless here.
    pub const DIFFUSIVE: Warnings = Warnings(1 << 4);
    /// A conductor is thinner than three skin depths; surface-resistance forms are off.
    pub const THIN_CONDUCTOR: Warnings = Warnings(1 << 5);
    /// Constant εr and tanδ: not causal (Kramers–Kronig); fine at one frequency,
    /// wrong for a wideband time-domain simulation.
    pub const NON_CAUSAL_DIELECTRIC: Warnings = Warnings(1 << 6);
    /// Frequency outside the range the model's data were given for (e.g. a
    /// datasheet attenuation extrapolated far beyond its figures).
    pub const EXTRAPOLATED: Warnings = Warnings(1 << 7);

    const ALL: [(Warnings, &'static str); 8] = [
        (
            Warnings::ABOVE_HIGHER_MODE,
            "above the first higher-order-mode cutoff: the line is no longer single-mode",
        ),
        (
            Warnings::EVANESCENT,
            "below the waveguide cutoff: the wave is evanescent and does not propagate",
        ),
        (
            Warnings::OUTSIDE_FIT_RANGE,
            "geometry or material outside the published range of the formula",
        ),
        (
            Warnings::HIGH_LOSS,
            "loss too high for small-loss formulas (R/ωL or G/ωC not small)",
        ),
        (
            Warnings::DIFFUSIVE,
            "diffusive regime (R/ωL ≥ 1): a velocity factor does not describe this line",
        ),
        (
            Warnings::THIN_CONDUCTOR,
            "conductor thinner than three skin depths",
        ),
        (
            Warnings::NON_CAUSAL_DIELECTRIC,
            "constant permittivity and loss tangent are not causal over a wide band",
        ),
        (
            Warnings::EXTRAPOLATED,
            "frequency outside the range of the data the model was built from",
        ),
    ];

    /// The raw bits.
    pub const fn bits(self) -> u16 {
        self.0
    }
    /// From raw bits (unknown bits kept).
    pub const fn from_bits(bits: u16) -> Self {
        Warnings(bits)
    }
    /// `true` if no warning is set.
    pub const fn is_empty(self) -> bool {
        self.0 == 0
    }
    /// `true` if every warning of `other` is set.
    pub const fn contains(self, other: Warnings) -> bool {
        self.0 & other.0 == other.0 && other.0 != 0
    }
    /// Sets the warnings of `other`.
    pub fn insert(&mut self, other: Warnings) {
        self.0 |= other.0;
    }
    /// Sets `other` if `cond`.
    pub fn set_if(&mut self, cond: bool, other: Warnings) {
        if cond {
            self.0 |= other.0;
        }
    }
    /// The union of two sets.
    pub const fn union(self, other: Warnings) -> Warnings {
        Warnings(self.0 | other.0)
    }
    /// Words for each warning that is set, for a page or a report (not for firmware).
    pub fn describe(self) -> impl Iterator<Item = &'static str> {
        Self::ALL
            .into_iter()
            .filter(move |(w, _)| self.contains(*w))
            .map(|(_, s)| s)
    }
}

impl core::ops::BitOr for Warnings {
    type Output = Warnings;
    fn bitor(self, rhs: Warnings) -> Warnings {
        self.union(rhs)
    }
}

/// Per-unit-length description of a line at one frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LinePoint<T> {
    /// The frequency, Hz.
    pub freq_hz: T,
    /// Series impedance per metre Z = R + jωL, Ω/m.
    pub z_ohm_per_m: Cx<T>,
    /// Shunt admittance per metre Y = G + jωC, S/m.
    pub y_s_per_m: Cx<T>,
    /// Propagation constant γ = α + jβ, 1/m (α in Np/m, β in rad/m), Re γ ≥ 0.
    pub gamma_per_m: Cx<T>,
    /// Characteristic impedance (infinite at DC for a line without leakage).
    pub zc_ohm: Impedance<T>,
    /// The model's own split of α into conductor and dielectric parts (Np/m),
    /// when it has closed forms for them; otherwise `None` and [`LinePoint::loss_split_np_per_m`]
    /// apportions α by R and G.
    pub model_loss_split_np_per_m: Option<(T, T)>,
    /// Validity warnings.
    pub warnings: Warnings,
}

impl<T: Real> LinePoint<T> {
    /// Builds a point from Z and Y per metre: γ = √Z·√Y, Zc = √Z/√Y. For Y = 0
    /// and Z ≠ 0, Zc is [`Impedance::Open`]; for Z = Y = 0 (a lossless line at
    /// DC) the caller must give Zc via `zc_dc_limit`.
    pub fn from_zy(
        freq_hz: T,
        z_ohm_per_m: Cx<T>,
        y_s_per_m: Cx<T>,
        zc_dc_limit: Option<Cx<T>>,
    ) -> Result<Self> {
        if !complex::is_finite(z_ohm_per_m) {
            return Err(Error::NonFinite("z_ohm_per_m"));
        }
        if !complex::is_finite(y_s_per_m) {
            return Err(Error::NonFinite("y_s_per_m"));
        }
        let sz = complex::sqrt(z_ohm_per_m);
        let sy = complex::sqrt(y_s_per_m);
        let mut gamma = sz * sy;
        // For passive Z and Y, Re γ ≥ 0 exactly; the product of the two roots
        // can round to a tiny negative value (e.g. 1e-154 when Z is nearly
        // imaginary): clamp it so that α ≥ 0 always holds.
        if gamma.re < T::zero() {
            gamma.re = T::zero();
        }
        let zero = T::zero();
        let y_zero = y_s_per_m.re == zero && y_s_per_m.im == zero;
        let z_zero = z_ohm_per_m.re == zero && z_ohm_per_m.im == zero;
        let zc = if y_zero && z_zero {
            match zc_dc_limit {
                Some(z) => Impedance::Finite(z),
                None => return Err(Error::Undefined("zc_ohm")),
            }
        } else if y_zero {
            Impedance::Open
        } else {
            Impedance::from_complex(complex::div(sz, sy))
        };
        Ok(LinePoint {
            freq_hz,
            z_ohm_per_m,
            y_s_per_m,
            gamma_per_m: gamma,
            zc_ohm: zc,
            model_loss_split_np_per_m: None,
            warnings: Warnings::NONE,
        })
    }

    /// Attenuation α, Np/m.
    pub fn alpha_np_per_m(&self) -> T {
        self.gamma_per_m.re
    }

    /// Phase constant β, rad/m.
    pub fn beta_rad_per_m(&self) -> T {
        self.gamma_per_m.im
    }

    /// Attenuation in dB/m.
    pub fn atten_db_per_m(&self) -> T {
        self.gamma_per_m.re * T::lit(DB_PER_NEPER)
    }

    /// α split into (conductor, dielectric) parts in Np/m, summing to α. Uses the
    /// model's closed forms when it has them (rescaled to the exact total);
    /// otherwise apportions α in the ratio R/(2|Zc|) : G·|Zc|/2 (the small-loss forms).
    pub fn loss_split_np_per_m(&self) -> (T, T) {
        let alpha = self.alpha_np_per_m();
        let (wc, wd) = match self.model_loss_split_np_per_m {
            Some((c, d)) => (c, d),
            None => {
                let r = self.z_ohm_per_m.re.max(T::zero());
                let g = self.y_s_per_m.re.max(T::zero());
                match self.zc_ohm {
                    Impedance::Finite(zc) => {
                        let m = complex::abs(zc);
                        (r / (T::two() * m), g * m / T::two())
                    }
                    Impedance::Open => (T::one(), T::zero()),
                }
            }
        };
        let sum = wc + wd;
        if sum <= T::zero() || !sum.is_finite() {
            return (alpha, T::zero());
        }
        (alpha * wc / sum, alpha * wd / sum)
    }
}

/// Frequencies evaluated together by [`LineModel::propagation_lanes`] (and by
/// the cascade's sweeps).
pub const LANES: usize = 16;

/// γ and Zc at a block of up to [`LANES`] frequencies, part by part (one array
/// per real part, so that the cascade's loops over them vectorise). Written by
/// [`LineModel::propagation_lanes`]. Size: 4·[`LANES`] scalars and [`LANES`]
/// flags (528 bytes in `f64`, 272 in `f32`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PropagationLanes<T> {
    /// Re γ = α, Np/m.
    pub gamma_re: [T; LANES],
    /// Im γ = β, rad/m.
    pub gamma_im: [T; LANES],
    /// Re Zc, Ω (meaningful where `zc_ok`).
    pub zc_re: [T; LANES],
    /// Im Zc, Ω (meaningful where `zc_ok`).
    pub zc_im: [T; LANES],
    /// `true` where Zc is finite and non-zero.
    pub zc_ok: [bool; LANES],
}

impl<T: Real> PropagationLanes<T> {
    /// All zero, no valid Zc.
    pub fn new() -> Self {
        let z = [T::zero(); LANES];
        Self {
            gamma_re: z,
            gamma_im: z,
            zc_re: z,
            zc_im: z,
            zc_ok: [false; LANES],
        }
    }

    /// Stores lane `i` from a complex γ and an [`Impedance`]; `i` ≥ [`LANES`]
    /// is [`Error::Capacity`] (nothing is written).
    #[inline]
    pub fn set(&mut self, i: usize, gamma: Cx<T>, zc: Impedance<T>) -> Result<()> {
        let (Some(gr), Some(gi), Some(zr), Some(zi), Some(ok)) = (
            self.gamma_re.get_mut(i),
            self.gamma_im.get_mut(i),
            self.zc_re.get_mut(i),
            self.zc_im.get_mut(i),
            self.zc_ok.get_mut(i),
        ) else {
            return Err(Error::Capacity {
                what: "propagation_lanes",
                capacity: LANES,
            });
        };
        *gr = gamma.re;
        *gi = gamma.im;
        let (re, im, good) = match zc {
            Impedance::Finite(z) => {
                let m = z.re.abs() + z.im.abs();
                (z.re, z.im, m > T::zero() && m <= T::max_value())
            }
            Impedance::Open => (T::zero(), T::zero(), false),
        };
        *zr = re;
        *zi = im;
        *ok = good;
        Ok(())
    }
}

impl<T: Real> Default for PropagationLanes<T> {
    fn default() -> Self {
        Self::new()
    }
}

/// A line model: anything that can give Z, Y, γ and Zc at a frequency.
///
/// Implementations validate their parameters at construction, so `at` fails only
/// on a bad frequency (negative or non-finite: [`Error::Negative`] /
/// [`Error::NonFinite`] naming `"freq_hz"`) or on a numerical breakdown.
pub trait LineModel<T: Real> {
    /// Evaluates the line at `freq_hz ≥ 0`.
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>>;

    /// γ ([`LinePoint::gamma_per_m`]) and Zc ([`LinePoint::zc_ohm`]) at each of
    /// `freqs_hz` (each finite and ≥ 0, else the error of [`LineModel::at`]),
    /// written to the first `freqs_hz.len()` entries of `gamma_per_m` and
    /// `zc_ohm` (shorter buffers: [`Error::LengthMismatch`]). The same
    /// values as [`LineModel::at`] without the warnings. The default calls `at`
    /// per frequency (the cascade's sweeps use [`LineModel::propagation_lanes`]).
    fn propagation_into(
        &self,
        freqs_hz: &[T],
        gamma_per_m: &mut [Cx<T>],
        zc_ohm: &mut [Impedance<T>],
    ) -> Result<()> {
        if gamma_per_m.len() < freqs_hz.len() || zc_ohm.len() < freqs_hz.len() {
            return Err(Error::LengthMismatch("gamma_per_m"));
        }
        for ((f, g), z) in freqs_hz
            .iter()
            .zip(gamma_per_m.iter_mut())
            .zip(zc_ohm.iter_mut())
        {
            let p = self.at(*f)?;
            *g = p.gamma_per_m;
            *z = p.zc_ohm;
        }
        Ok(())
    }

    /// γ and Zc at each of `freqs_hz` (at most [`LANES`], else
    /// [`Error::LengthMismatch`] `"freqs_hz"`; each finite and ≥ 0, else the
    /// error of [`LineModel::at`]) into the first `freqs_hz.len()` lanes of
    /// `out` (the lanes after those hold unspecified values): the same values
    /// as [`LineModel::propagation_into`], laid out for the cascade's
    /// vectorised sweep. The default calls `at` per frequency;
    /// [`rlgc::Rlgc`] (and the models built on it) evaluate the block in loops
    /// that the compiler vectorises.
    fn propagation_lanes(&self, freqs_hz: &[T], out: &mut PropagationLanes<T>) -> Result<()> {
        if freqs_hz.len() > LANES {
            return Err(Error::LengthMismatch("freqs_hz"));
        }
        for (i, f) in freqs_hz.iter().enumerate() {
            let p = self.at(*f)?;
            out.set(i, p.gamma_per_m, p.zc_ohm)?;
        }
        Ok(())
    }

    /// The frequency of the first higher-order mode, surface-wave onset or
    /// waveguide cutoff, if the model knows it.
    fn cutoff_hz(&self) -> Option<T> {
        None
    }
}

/// Derived properties of a line at one frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LineProperties<T> {
    /// The per-unit-length values.
    pub point: LinePoint<T>,
    /// Effective relative permittivity (β·c0/ω)².
    pub eps_eff: T,
    /// Phase velocity ω/β, m/s.
    pub phase_velocity_m_per_s: T,
    /// Group velocity dω/dβ, m/s (numerical derivative, see [`group_delay_s_per_m`]).
    pub group_velocity_m_per_s: T,
    /// Phase velocity over c0.
    pub velocity_factor: T,
    /// Phase delay per metre β/ω, s/m.
    pub phase_delay_s_per_m: T,
    /// Group delay per metre dβ/dω, s/m.
    pub group_delay_s_per_m: T,
    /// Total attenuation, dB/m.
    pub atten_db_per_m: T,
    /// Conductor part of the attenuation, dB/m.
    pub atten_conductor_db_per_m: T,
    /// Dielectric part of the attenuation, dB/m.
    pub atten_dielectric_db_per_m: T,
    /// Guided wavelength 2π/β, m (infinite at DC).
    pub wavelength_m: T,
}

fn check_freq<T: Real>(freq_hz: T) -> Result<T> {
    error::non_negative(freq_hz, "freq_hz")
}

/// Group delay per metre dβ/dω (s/m) by a central difference with relative
/// step ε^(1/3) (≈ 6e-6 in f64, 5e-3 in f32), the step that balances truncation
/// and rounding error; one-sided near DC.
pub fn group_delay_s_per_m<T: Real, M: LineModel<T> + ?Sized>(model: &M, freq_hz: T) -> Result<T> {
    let f = check_freq(freq_hz)?;
    let rel = T::EPS.cbrt();
    let f_floor = T::lit(DC_LIMIT_HZ);
    let h = (f * rel).max(f_floor * rel);
    let (f_lo, f_hi) = if f > h {
        (f - h, f + h)
    } else {
        (f.max(f_floor), f.max(f_floor) + h)
    };
    let b_lo = model.at(f_lo)?.beta_rad_per_m();
    let b_hi = model.at(f_hi)?.beta_rad_per_m();
    let d = (b_hi - b_lo) / (T::two_pi() * (f_hi - f_lo));
    error::finite(d, "group_delay_s_per_m")
}

/// All derived properties at `freq_hz ≥ 0` (see the module docs for DC).
pub fn properties<T: Real, M: LineModel<T> + ?Sized>(
    model: &M,
    freq_hz: T,
) -> Result<LineProperties<T>> {
    let f = check_freq(freq_hz)?;
    let point = model.at(f)?;
    let f_v = f.max(T::lit(DC_LIMIT_HZ));
    let pv = if f_v == f { point } else { model.at(f_v)? };
    let omega = T::two_pi() * f_v;
    let beta = pv.beta_rad_per_m();
    let (vp, phase_delay) = if beta > T::zero() {
        (omega / beta, beta / omega)
    } else {
        (T::zero(), T::infinity())
    };
    let gd = group_delay_s_per_m(model, f)?;
    let vg = if gd > T::zero() {
        T::one() / gd
    } else {
        T::zero()
    };
    let c0 = T::c0();
    let eps_eff = if vp > T::zero() {
        (c0 / vp) * (c0 / vp)
    } else {
        T::infinity()
    };
    let (ac, ad) = point.loss_split_np_per_m();
    let db = T::lit(DB_PER_NEPER);
    let b0 = point.beta_rad_per_m();
    let wavelength = if b0 > T::zero() {
        T::two_pi() / b0
    } else {
        T::infinity()
    };
    Ok(LineProperties {
        point,
        eps_eff,
        phase_velocity_m_per_s: vp,
        group_velocity_m_per_s: vg,
        velocity_factor: vp / c0,
        phase_delay_s_per_m: phase_delay,
        group_delay_s_per_m: gd,
        atten_db_per_m: point.atten_db_per_m(),
        atten_conductor_db_per_m: ac * db,
        atten_dielectric_db_per_m: ad * db,
        wavelength_m: wavelength,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn warnings_set_and_describe() {
        let mut w = Warnings::NONE;
        assert!(w.is_empty());
        w.insert(Warnings::HIGH_LOSS);
        w.set_if(true, Warnings::EVANESCENT);
        w.set_if(false, Warnings::DIFFUSIVE);
        assert!(w.contains(Warnings::HIGH_LOSS));
        assert!(!w.contains(Warnings::DIFFUSIVE));
        assert_eq!(w.describe().count(), 2);
    }

    #[test]
    fn propagation_lanes_size_is_as_documented() {
        assert_eq!(core::mem::size_of::<PropagationLanes<f64>>(), 528);
        assert_eq!(core::mem::size_of::<PropagationLanes<f32>>(), 272);
    }

    #[test]
    fn from_zy_at_dc_without_leakage_is_open() {
        let p = LinePoint::<f64>::from_zy(0.0, Cx::new(0.1, 0.0), Cx::new(0.0, 0.0), None).unwrap();
        assert_eq!(p.zc_ohm, Impedance::Open);
        assert_eq!(p.gamma_per_m, Cx::new(0.0, 0.0));
        assert_eq!(
            LinePoint::<f64>::from_zy(0.0, Cx::new(0.0, 0.0), Cx::new(0.0, 0.0), None),
            Err(Error::Undefined("zc_ohm"))
        );
    }
}

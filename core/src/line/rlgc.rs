//! A frequency-dependent RLGC line: skin effect from DC and a dielectric that
//! may be causal.
//!
//! Per metre (telegrapher equations; Pozar, *Microwave Engineering*, 4th ed.,
//! 2012, §2.1):
//!
//!   Z(f) = R0 + Σᵢ Z_int,i(f) + jωL_ext,
//!   Y(f) = G_dc + jω·C_vac·ε(f),
//!
//! with R0 a frequency-independent series resistance, Z_int,i the internal
//! impedance of each conductor ([`Conductor`], DC to skin effect), L_ext the
//! external inductance, C_vac the capacitance per metre with the dielectric
//! replaced by vacuum and ε(f) = ε′ − jε″ the relative permittivity
//! ([`Dielectric`]). G_dc collects a user conductance and the dielectric's DC
//! conductivity σ as σ·C_vac/ε0. For a frequency-independent C and tanδ given
//! by the user, C_vac = C/εr′ with [`Dielectric::constant`].
//!
//! γ = √(ZY) and Zc = Z/γ. For passive Z and Y (both in the closed first
//! quadrant) ZY lies in the upper half plane, so the principal root gives
//! Re γ ≥ 0 and Im γ ≥ 0, and arg Zc = (arg Z − arg Y)/2 ∈ [−π/4, π/4] so
//! Re Zc > 0: the same branches as [`LinePoint::from_zy`], with one complex
//! square root instead of two. Near the limits of the float range, and at DC,
//! `from_zy` itself is used.
//!
//! At DC: Z = R_dc total, Y = G_dc; with G_dc = 0 the characteristic impedance
//! is [`Impedance::Open`] and γ = 0; with R = G = 0
//! it is the limit √(L/C) (C at DC uses the static permittivity).
//!
//! Warnings: [`Warnings::HIGH_LOSS`] when R ≥ 0.1·ωL or G ≥ 0.1·ωC (R = Re Z,
//! ωL = Im Z, G = Re Y, ωC = Im Y), [`Warnings::DIFFUSIVE`] when R ≥ ωL (R > 0),
//! [`Warnings::NON_CAUSAL_DIELECTRIC`] for a constant dielectric with tanδ > 0,
//! [`Warnings::THIN_CONDUCTOR`] from tube conductors.
//!
//! Cost: everything frequency-independent is computed at construction. `at`
//! does, per conductor, two real square roots and one division; for γ and Zc
//! two real square roots and one division (γ = √(ZY) by the principal root,
//! Zc = Z·conj(γ)/|ZY|); plus one `ln` and one `atan` for the wideband Debye
//! dielectric. No state is kept between calls. Size: `size_of::<Rlgc<f64>>()`
//! ≤ 320 bytes, `Rlgc<f32>` ≤ 160 bytes.

use crate::error::{self, Error, Result};
use crate::line::conductor::Conductor;
use crate::line::dielectric::Dielectric;
use crate::line::{LineModel, LinePoint, PropagationLanes, Warnings, LANES};
use crate::math::complex::Cx;
use crate::scalar::Real;
use crate::value::Impedance;

/// Most conductors an [`Rlgc`] line holds (signal and return).
pub const MAX_CONDUCTORS: usize = 2;

/// A frequency-dependent per-unit-length line model (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rlgc<T> {
    r0: T,
    l_ext: T,
    g_dc: T,
    c_vac: T,
    dielectric: Dielectric<T>,
    conductors: [Option<Conductor<T>>; MAX_CONDUCTORS],
    // Precomputed.
    two_pi_l: T,
    two_pi_c: T,
    base_warnings: Warnings,
    has_tube: bool,
    has_conductor: bool,
    zc_dc: Option<Cx<T>>,
    // Bounds on max(|Re ZY|, |Im ZY|) for the unscaled fast path.
    safe_lo: T,
    safe_hi: T,
}

/// Builds an [`Rlgc`] line; every value is checked by [`RlgcBuilder::build`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RlgcBuilder<T> {
    r0: T,
    l_ext: T,
    g_dc: T,
    c_vac: T,
    dielectric: Dielectric<T>,
    conductors: [Option<Conductor<T>>; MAX_CONDUCTORS],
    overflow: bool,
    // The API name of the capacitance given, for errors.
    c_param: &'static str,
}

impl<T: Real> RlgcBuilder<T> {
    /// Sets a frequency-independent series resistance R0 (Ω/m, ≥ 0; default 0),
    /// in addition to the conductors.
    pub fn series_r(mut self, r_ohm_per_m: T) -> Self {
        self.r0 = r_ohm_per_m;
        self
    }
    /// Sets a frequency-independent shunt conductance (S/m, ≥ 0; default 0), in
    /// addition to the dielectric's loss and conductivity.
    pub fn shunt_g(mut self, g_s_per_m: T) -> Self {
        self.g_dc = g_s_per_m;
        self
    }
    /// Sets the dielectric (default: vacuum).
    pub fn dielectric(mut self, dielectric: Dielectric<T>) -> Self {
        self.dielectric = dielectric;
        self
    }
    /// Adds a conductor (at most [`MAX_CONDUCTORS`]; more gives
    /// [`Error::Capacity`] at [`RlgcBuilder::build`]).
    pub fn conductor(mut self, conductor: Conductor<T>) -> Self {
        match self.conductors.iter_mut().find(|c| c.is_none()) {
            Some(slot) => *slot = Some(conductor),
            None => self.overflow = true,
        }
        self
    }
    /// Validates and builds: `l_ext_h_per_m` > 0, `c_vac_f_per_m` > 0,
    /// `r_ohm_per_m` ≥ 0, `g_s_per_m` ≥ 0 (all finite).
    pub fn build(self) -> Result<Rlgc<T>> {
        if self.overflow {
            return Err(Error::Capacity {
                what: "conductors",
                capacity: MAX_CONDUCTORS,
            });
        }
        let l_ext = error::positive(self.l_ext, "l_ext_h_per_m")?;
        let c_vac = error::positive(self.c_vac, self.c_param)?;
        let r0 = error::non_negative(self.r0, "r_ohm_per_m")?;
        let g_user = error::non_negative(self.g_dc, "g_s_per_m")?;
        let sigma = self.dielectric.conductivity_s_per_m();
        let g_dc = error::finite(g_user + sigma * (c_vac / T::eps0()), "g_s_per_m")?;
        let r_dc = r0
            + self
                .conductors
                .iter()
                .flatten()
                .fold(T::zero(), |s, c| s + c.r_dc_ohm_per_m());
        let c_dc = c_vac * self.dielectric.eps_static();
        let zc_dc = if r_dc == T::zero() && g_dc == T::zero() {
            Some(Cx::new(
                error::finite((l_ext / c_dc).sqrt(), self.c_param)?,
                T::zero(),
            ))
        } else {
            None
        };
        let mut base_warnings = Warnings::NONE;
        base_warnings.set_if(
            self.dielectric.is_non_causal(),
            Warnings::NON_CAUSAL_DIELECTRIC,
        );
        let has_tube = self.conductors.iter().flatten().any(|c| c.is_tube());
        let has_conductor = self.conductors.iter().any(|c| c.is_some());
        // |Re ZY| + |Im ZY| within [4√min, √max/4] (so max(|Re|, |Im|) within
        // [2√min, √max/4]): the squared modulus neither overflows nor underflows.
        let safe_hi = T::max_value().sqrt() * T::lit(0.25);
        let safe_lo = T::min_positive_value().sqrt() * T::lit(4.0);
        Ok(Rlgc {
            r0,
            l_ext,
            g_dc,
            c_vac,
            dielectric: self.dielectric,
            conductors: self.conductors,
            two_pi_l: T::two_pi() * l_ext,
            two_pi_c: T::two_pi() * c_vac,
            base_warnings,
            has_tube,
            has_conductor,
            zc_dc,
            safe_lo,
            safe_hi,
        })
    }
}

impl<T: Real> Rlgc<T> {
    /// Starts a builder from the external inductance L_ext (H/m) and the vacuum
    /// capacitance C_vac (F/m); the dielectric defaults to vacuum.
    pub fn builder(l_ext_h_per_m: T, c_vac_f_per_m: T) -> RlgcBuilder<T> {
        RlgcBuilder {
            r0: T::zero(),
            l_ext: l_ext_h_per_m,
            g_dc: T::zero(),
            c_vac: c_vac_f_per_m,
            dielectric: Dielectric::vacuum(),
            conductors: [None; MAX_CONDUCTORS],
            overflow: false,
            c_param: "c_vac_f_per_m",
        }
    }

    /// Starts a builder from L_ext (H/m) and the capacitance C (F/m) the line
    /// has **at DC** with `dielectric`: C_vac = C/εs (εs the static permittivity,
    /// εr for [`Dielectric::constant`]). For a user-given C and tanδ this is the
    /// usual constant-loss-tangent line, Y = ωC·tanδ + jωC.
    pub fn builder_from_c(
        l_ext_h_per_m: T,
        c_f_per_m: T,
        dielectric: Dielectric<T>,
    ) -> RlgcBuilder<T> {
        RlgcBuilder {
            c_param: "c_f_per_m",
            ..Self::builder(l_ext_h_per_m, c_f_per_m / dielectric.eps_static())
                .dielectric(dielectric)
        }
    }

    /// A frequency-independent line: R ≥ 0 (Ω/m), L > 0 (H/m), G ≥ 0 (S/m),
    /// C > 0 (F/m), valid from DC. At DC with G = 0 the characteristic impedance
    /// is open; with R = G = 0 it is √(L/C).
    pub fn constant(r_ohm_per_m: T, l_h_per_m: T, g_s_per_m: T, c_f_per_m: T) -> Result<Self> {
        let l = error::positive(l_h_per_m, "l_h_per_m")?;
        let c = error::positive(c_f_per_m, "c_f_per_m")?;
        Self::builder(l, c)
            .series_r(r_ohm_per_m)
            .shunt_g(g_s_per_m)
            .build()
    }

    /// The dielectric.
    pub fn dielectric(&self) -> &Dielectric<T> {
        &self.dielectric
    }

    /// The conductors (internal impedances).
    pub fn conductors(&self) -> impl Iterator<Item = &Conductor<T>> {
        self.conductors.iter().flatten()
    }

    /// External inductance L_ext, H/m.
    pub fn l_ext_h_per_m(&self) -> T {
        self.l_ext
    }

    /// Vacuum capacitance C_vac, F/m.
    pub fn c_vac_f_per_m(&self) -> T {
        self.c_vac
    }

    /// Series impedance Z(f) per metre, Ω/m.
    #[inline(always)]
    fn z_of(&self, f: T) -> Cx<T> {
        let mut z = Cx::new(self.r0, self.two_pi_l * f);
        if self.has_conductor {
            for c in self.conductors.iter().flatten() {
                z = z + c.eval(f);
            }
        }
        z
    }

    /// Shunt admittance Y(f) per metre, S/m.
    #[inline(always)]
    fn y_of(&self, f: T) -> Cx<T> {
        let (er, loss) = self.dielectric.eval(f);
        let wc = self.two_pi_c * f;
        Cx::new(self.g_dc + wc * loss, wc * er)
    }

    /// Series resistance R(f) = Re Z, Ω/m.
    pub fn r_ohm_per_m(&self, freq_hz: T) -> Result<T> {
        Ok(self.z_of(error::non_negative(freq_hz, "freq_hz")?).re)
    }

    /// Series inductance L(f) = Im Z/ω (external plus internal), H/m; at DC the limit.
    pub fn l_h_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        if f == T::zero() {
            return Ok(self.l_ext
                + self
                    .conductors()
                    .fold(T::zero(), |s, c| s + c.l_int_dc_h_per_m()));
        }
        Ok(self.z_of(f).im / (T::two_pi() * f))
    }

    /// Shunt conductance G(f) = Re Y, S/m.
    pub fn g_s_per_m(&self, freq_hz: T) -> Result<T> {
        Ok(self.y_of(error::non_negative(freq_hz, "freq_hz")?).re)
    }

    /// Shunt capacitance C(f) = Im Y/ω = C_vac·ε′(f), F/m.
    pub fn c_f_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok(self.c_vac * self.dielectric.eval(f).0)
    }
}

/// |a| + |b|, between max(|a|, |b|) and twice it, for the root's bounds test;
/// a NaN in either part gives NaN (which fails the test).
#[inline(always)]
fn abs_sum<T: Real>(a: T, b: T) -> T {
    a.abs() + b.abs()
}

impl<T: Real> Rlgc<T> {
    /// Whether `sum` = |Re ZY| + |Im ZY| is inside the bounds where the
    /// unscaled root's squares are safe (a NaN is not).
    #[inline(always)]
    fn root_is_fast(&self, sum: T) -> bool {
        sum > self.safe_lo && sum < self.safe_hi
    }

    /// γ and Zc from Z and Y by the unscaled principal root, or `None` when
    /// |Re ZY| + |Im ZY| is outside the bounds where its squares are safe
    /// (then [`LinePoint::from_zy`] is used).
    #[inline(always)]
    fn gamma_zc_fast(&self, z: Cx<T>, y: Cx<T>) -> Option<(Cx<T>, Cx<T>)> {
        let p = z * y;
        if !self.root_is_fast(abs_sum(p.re, p.im)) {
            return None;
        }
        // γ = √(ZY) by the principal root, Zc = Z/γ = Z·conj(γ)/|ZY|
        // (|γ|² = |ZY|). With m = |ZY| and t = √((|Re| + m)/2), the small
        // part of the root is |Im ZY|/(2t) = |Im ZY|·t/(|Re| + m), so one
        // division 1/((|Re| + m)·m) serves both it and 1/m, and runs beside
        // the second square root. The squares cannot overflow inside these bounds.
        let m = (p.re * p.re + p.im * p.im).sqrt();
        let s = p.re.abs() + m;
        let t = (T::half() * s).sqrt();
        let inv = T::one() / (s * m);
        let small = p.im.abs() * t * (m * inv);
        let inv_m = s * inv;
        let gamma = if p.re >= T::zero() {
            Cx::new(
                t,
                if p.im.is_sign_negative() {
                    -small
                } else {
                    small
                },
            )
        } else {
            Cx::new(small, if p.im.is_sign_negative() { -t } else { t })
        };
        let zc = z * gamma.conj();
        Some((gamma, Cx::new(zc.re * inv_m, zc.im * inv_m)))
    }
}

impl<T: Real> LineModel<T> for Rlgc<T> {
    #[inline]
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let z = self.z_of(f);
        let y = self.y_of(f);
        let mut point = match self.gamma_zc_fast(z, y) {
            Some((gamma, zc)) => LinePoint {
                freq_hz: f,
                z_ohm_per_m: z,
                y_s_per_m: y,
                gamma_per_m: gamma,
                zc_ohm: Impedance::from_complex(zc),
                model_loss_split_np_per_m: None,
                warnings: Warnings::NONE,
            },
            None => LinePoint::from_zy(f, z, y, self.zc_dc)?,
        };
        let mut w = self.base_warnings;
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
        if self.has_tube {
            w.set_if(
                self.conductors().any(|c| c.is_thin_at(f)),
                Warnings::THIN_CONDUCTOR,
            );
        }
        point.warnings = w;
        Ok(point)
    }

    /// As [`LineModel::at`] without warnings, in loops over the block's lanes
    /// that the compiler vectorises: Z and Y (conductors and a wideband
    /// dielectric lane by lane), then the principal root of `gamma_zc_fast`.
    /// Lanes outside the root's safe bounds are redone by
    /// [`LinePoint::from_zy`]. Bit for bit the values of `at`.
    fn propagation_lanes(&self, freqs_hz: &[T], out: &mut PropagationLanes<T>) -> Result<()> {
        let n = freqs_hz.len();
        if n > LANES {
            return Err(Error::LengthMismatch("freqs_hz"));
        }
        let mut f = [T::zero(); LANES];
        for (d, s) in f.iter_mut().zip(freqs_hz) {
            *d = *s;
        }
        // One test for the block (unused lanes hold 0); the named error on the cold path.
        let mut all_valid = true;
        for v in f.iter() {
            all_valid &= *v >= T::zero() && *v <= T::max_value();
        }
        if !all_valid {
            for v in f.iter() {
                error::non_negative(*v, "freq_hz")?;
            }
        }
        let mut zr = [self.r0; LANES];
        let mut zi = [T::zero(); LANES];
        let mut yr = [T::zero(); LANES];
        let mut yi = [T::zero(); LANES];
        for i in 0..LANES {
            zi[i] = self.two_pi_l * f[i];
        }
        if self.has_conductor {
            // In the order of `z_of`: (R0 + jωL) + Z_int,1 + Z_int,2.
            for i in 0..LANES {
                for c in self.conductors.iter().flatten() {
                    let e = c.eval(f[i]);
                    zr[i] = zr[i] + e.re;
                    zi[i] = zi[i] + e.im;
                }
            }
        }
        match self.dielectric.constant_parts() {
            Some((er, loss)) => {
                for i in 0..LANES {
                    let wc = self.two_pi_c * f[i];
                    yr[i] = self.g_dc + wc * loss;
                    yi[i] = wc * er;
                }
            }
            None => {
                for i in 0..LANES {
                    let (er, loss) = self.dielectric.eval(f[i]);
                    let wc = self.two_pi_c * f[i];
                    yr[i] = self.g_dc + wc * loss;
                    yi[i] = wc * er;
                }
            }
        }
        // γ and Zc by the principal root, as `gamma_zc_fast`; its bounds test
        // is one flag for the block, and lanes outside are redone below.
        let mut all_fast = true;
        for i in 0..LANES {
            let pr = zr[i] * yr[i] - zi[i] * yi[i];
            let pi = zr[i] * yi[i] + zi[i] * yr[i];
            let sum = abs_sum(pr, pi);
            all_fast &= self.root_is_fast(sum);
            let m = (pr * pr + pi * pi).sqrt();
            let s = pr.abs() + m;
            let t = (T::half() * s).sqrt();
            let inv = T::one() / (s * m);
            let small = pi.abs() * t * (m * inv);
            let inv_m = s * inv;
            let neg_im = pi.is_sign_negative();
            let (gr, gi) = if pr >= T::zero() {
                (t, if neg_im { -small } else { small })
            } else {
                (small, if neg_im { -t } else { t })
            };
            // Zc = Z·conj(γ)/|ZY|.
            let cr = (zr[i] * gr + zi[i] * gi) * inv_m;
            let ci = (zi[i] * gr - zr[i] * gi) * inv_m;
            out.gamma_re[i] = gr;
            out.gamma_im[i] = gi;
            out.zc_re[i] = cr;
            out.zc_im[i] = ci;
            let mag = cr.abs() + ci.abs();
            out.zc_ok[i] = mag > T::zero() && mag <= T::max_value();
        }
        if all_fast {
            return Ok(());
        }
        for i in 0..LANES {
            let sum = abs_sum(zr[i] * yr[i] - zi[i] * yi[i], zr[i] * yi[i] + zi[i] * yr[i]);
            if i < n && !self.root_is_fast(sum) {
                let z = Cx::new(zr[i], zi[i]);
                let y = Cx::new(yr[i], yi[i]);
                let p = LinePoint::from_zy(f[i], z, y, self.zc_dc)?;
                out.set(i, p.gamma_per_m, p.zc_ohm)?;
            }
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::conductor::Metal;
    use crate::line::lossless::Lossless;
    use approx::assert_relative_eq;

    #[test]
    fn constant_line_matches_textbook_gamma() {
        // R = 0.1 Ω/m, L = 250 nH/m, G = 1 µS/m, C = 100 pF/m at 1 MHz;
        // γ = √((R + jωL)(G + jωC)) by the principal root (Pozar 2012, §2.1).
        let line = Rlgc::<f64>::constant(0.1, 250e-9, 1e-6, 100e-12).unwrap();
        let p = line.at(1e6).unwrap();
        let w = core::f64::consts::TAU * 1e6;
        let zy = num_complex::Complex::new(0.1, w * 250e-9)
            * num_complex::Complex::new(1e-6, w * 100e-12);
        let g = zy.sqrt();
        assert_relative_eq!(p.gamma_per_m.re, g.re, max_relative = 1e-13);
        assert_relative_eq!(p.gamma_per_m.im, g.im, max_relative = 1e-13);
        let zc = p.zc_ohm.finite().unwrap();
        assert_relative_eq!(zc.re, 50.0, max_relative = 1e-3);
        assert!(p.warnings.is_empty());
    }

    #[test]
    fn dc_limits() {
        let line = Rlgc::<f64>::constant(0.1, 250e-9, 0.0, 100e-12).unwrap();
        let p = line.at(0.0).unwrap();
        assert_eq!(p.zc_ohm, Impedance::Open);
        assert_eq!(p.gamma_per_m, Cx::new(0.0, 0.0));
        assert!(p.warnings.contains(Warnings::DIFFUSIVE));
        let lossless = Rlgc::<f32>::constant(0.0, 250e-9, 0.0, 100e-12).unwrap();
        let p = lossless.at(0.0).unwrap();
        assert_relative_eq!(p.zc_ohm.finite().unwrap().re, 50.0, max_relative = 1e-6);
        assert!(p.warnings.is_empty());
        let leaky = Rlgc::<f64>::constant(0.1, 250e-9, 1e-3, 100e-12).unwrap();
        let zc = leaky.at(0.0).unwrap().zc_ohm.finite().unwrap();
        assert_relative_eq!(zc.re, 10.0, max_relative = 1e-14);
    }

    #[test]
    fn lossless_limit_equals_lossless_model() {
        let ll = Lossless::<f64>::new(75.0, 0.66).unwrap();
        let v = 0.66 * 299_792_458.0;
        let line = Rlgc::constant(0.0, 75.0 / v, 0.0, 1.0 / (75.0 * v)).unwrap();
        for &f in &[1e3, 1e6, 1e9, 1e11] {
            let a = line.at(f).unwrap();
            let b = ll.at(f).unwrap();
            assert_relative_eq!(a.gamma_per_m.im, b.gamma_per_m.im, max_relative = 1e-14);
            assert_eq!(a.gamma_per_m.re, 0.0);
            assert_relative_eq!(a.zc_ohm.finite().unwrap().re, 75.0, max_relative = 1e-14);
        }
    }

    #[test]
    fn accessors_and_warnings() {
        let cu = Metal::<f64>::copper();
        let d = Dielectric::constant(2.25, 2e-4).unwrap();
        let line = Rlgc::builder(2e-7, 5e-11)
            .dielectric(d)
            .conductor(Conductor::round_wire(cu, 0.5e-3).unwrap())
            .build()
            .unwrap();
        assert_relative_eq!(
            line.c_f_per_m(1e6).unwrap(),
            2.25 * 5e-11,
            max_relative = 1e-14
        );
        assert_relative_eq!(
            line.g_s_per_m(1e6).unwrap(),
            core::f64::consts::TAU * 1e6 * 2.25 * 5e-11 * 2e-4,
            max_relative = 1e-13
        );
        assert_relative_eq!(
            line.r_ohm_per_m(0.0).unwrap(),
            1.0 / (5.8e7 * core::f64::consts::PI * 0.25e-6),
            max_relative = 1e-13
        );
        assert!(line.l_h_per_m(1e3).unwrap() < line.l_h_per_m(0.0).unwrap());
        assert!(line.l_h_per_m(1e9).unwrap() > 2e-7);
        assert!(line
            .at(1e9)
            .unwrap()
            .warnings
            .contains(Warnings::NON_CAUSAL_DIELECTRIC));
        assert!(line
            .at(10.0)
            .unwrap()
            .warnings
            .contains(Warnings::HIGH_LOSS));
        assert!(!line.at(1e9).unwrap().warnings.contains(Warnings::HIGH_LOSS));
    }

    #[test]
    fn builder_from_c_gives_constant_loss_tangent() {
        let d = Dielectric::constant(2.25, 1e-3).unwrap();
        let line = Rlgc::<f64>::builder_from_c(250e-9, 100e-12, d)
            .build()
            .unwrap();
        for &f in &[1e3, 1e6, 1e9] {
            let p = line.at(f).unwrap();
            let wc = core::f64::consts::TAU * f * 100e-12;
            assert_relative_eq!(p.y_s_per_m.im, wc, max_relative = 1e-14);
            assert_relative_eq!(p.y_s_per_m.re, wc * 1e-3, max_relative = 1e-14);
            assert!(p.warnings.contains(Warnings::NON_CAUSAL_DIELECTRIC));
        }
        assert_eq!(
            Rlgc::<f64>::builder_from_c(250e-9, f64::NAN, d).build(),
            Err(Error::NonFinite("c_f_per_m"))
        );
    }

    /// The block call gives exactly `at`'s γ and Zc (same code path), for a
    /// constant line, a skin-effect line with a lossy dielectric, and DC.
    fn block_equals_at<T: Real>() {
        let cu = Metal::<T>::copper();
        let d = Dielectric::constant(T::lit(2.25), T::lit(2e-4)).unwrap();
        let lines = [
            Rlgc::<T>::constant(T::lit(0.5), T::lit(250e-9), T::lit(1e-5), T::lit(100e-12))
                .unwrap(),
            Rlgc::<T>::constant(T::zero(), T::lit(250e-9), T::zero(), T::lit(100e-12)).unwrap(),
            Rlgc::builder(T::lit(2e-7), T::lit(5e-11))
                .dielectric(d)
                .conductor(Conductor::round_wire(cu, T::lit(0.5e-3)).unwrap())
                .build()
                .unwrap(),
        ];
        let freqs = [
            T::zero(),
            T::lit(10.0),
            T::lit(1e6),
            T::lit(3e8),
            T::lit(1e10),
        ];
        for line in &lines {
            let mut g = [Cx::new(T::zero(), T::zero()); 6];
            let mut z = [Impedance::Open; 6];
            line.propagation_into(&freqs, &mut g, &mut z).unwrap();
            for ((f, g), z) in freqs.iter().zip(g.iter()).zip(z.iter()) {
                let p = line.at(*f).unwrap();
                assert_eq!(*g, p.gamma_per_m);
                assert_eq!(*z, p.zc_ohm);
            }
            assert_eq!(
                line.propagation_into(&freqs, &mut g[..4], &mut z),
                Err(Error::LengthMismatch("gamma_per_m"))
            );
            assert_eq!(
                line.propagation_into(&[T::one(), -T::one()], &mut g, &mut z),
                Err(Error::Negative("freq_hz"))
            );
            assert_eq!(
                line.propagation_into(&[T::nan()], &mut g, &mut z),
                Err(Error::NonFinite("freq_hz"))
            );
        }
    }

    #[test]
    fn propagation_block_equals_at() {
        block_equals_at::<f64>();
        block_equals_at::<f32>();
    }

    /// The lane layout gives bit for bit `at`'s γ and Zc, lane by lane, for
    /// full and partial blocks, with DC (no leakage: Zc open, not `zc_ok`),
    /// a wideband Debye dielectric, and lanes outside the root's fast bounds.
    fn lanes_equal_at<T: Real>() {
        let cu = Metal::<T>::copper();
        let d = Dielectric::constant(T::lit(2.25), T::lit(2e-4)).unwrap();
        let debye = Dielectric::wideband_debye(T::lit(4.3), T::lit(0.02), T::lit(1e9)).unwrap();
        let lines = [
            Rlgc::<T>::constant(T::lit(0.5), T::lit(250e-9), T::lit(1e-5), T::lit(100e-12))
                .unwrap(),
            Rlgc::<T>::constant(T::lit(0.1), T::lit(250e-9), T::zero(), T::lit(100e-12)).unwrap(),
            Rlgc::builder(T::lit(2e-7), T::lit(5e-11))
                .dielectric(d)
                .conductor(Conductor::round_wire(cu, T::lit(0.5e-3)).unwrap())
                .build()
                .unwrap(),
            Rlgc::builder(T::lit(2e-7), T::lit(5e-11))
                .dielectric(debye)
                .conductor(Conductor::round_wire(cu, T::lit(0.5e-3)).unwrap())
                .build()
                .unwrap(),
        ];
        let mut freqs = [T::zero(); LANES];
        for (i, f) in freqs.iter_mut().enumerate() {
            // 0, 10 Hz, … up to ~1e13 Hz: DC, the skin transition, the fast
            // range and beyond.
            *f = if i == 0 {
                T::zero()
            } else {
                T::lit(10.0) * T::lit(10.0).powi(i as i32 - 1) * T::lit(0.73)
            };
        }
        for line in &lines {
            for n in [LANES, 5, 1] {
                let mut out = PropagationLanes::new();
                line.propagation_lanes(&freqs[..n], &mut out).unwrap();
                for (i, f) in freqs.iter().take(n).enumerate() {
                    let p = line.at(*f).unwrap();
                    assert_eq!(Cx::new(out.gamma_re[i], out.gamma_im[i]), p.gamma_per_m);
                    match p.zc_ohm {
                        Impedance::Finite(z) if z.re != T::zero() || z.im != T::zero() => {
                            assert!(out.zc_ok[i]);
                            assert_eq!(Cx::new(out.zc_re[i], out.zc_im[i]), z);
                        }
                        _ => assert!(!out.zc_ok[i]),
                    }
                }
            }
            let mut out = PropagationLanes::new();
            let long = [T::one(); LANES + 1];
            assert_eq!(
                line.propagation_lanes(&long, &mut out),
                Err(Error::LengthMismatch("freqs_hz"))
            );
            assert_eq!(
                line.propagation_lanes(&[T::one(), -T::one()], &mut out),
                Err(Error::Negative("freq_hz"))
            );
            assert_eq!(
                line.propagation_lanes(&[T::infinity()], &mut out),
                Err(Error::NonFinite("freq_hz"))
            );
        }
        // The default (lane by lane through `at`).
        let ll = Lossless::<T>::new(T::lit(75.0), T::lit(0.66)).unwrap();
        let mut out = PropagationLanes::new();
        ll.propagation_lanes(&freqs[..3], &mut out).unwrap();
        for (i, f) in freqs.iter().take(3).enumerate() {
            let p = ll.at(*f).unwrap();
            assert_eq!(Cx::new(out.gamma_re[i], out.gamma_im[i]), p.gamma_per_m);
            assert_eq!(
                Impedance::Finite(Cx::new(out.zc_re[i], out.zc_im[i])),
                p.zc_ohm
            );
        }
        assert_eq!(
            ll.propagation_lanes(&[T::one(); LANES + 1], &mut out),
            Err(Error::LengthMismatch("freqs_hz"))
        );
        assert_eq!(
            out.set(LANES, Cx::new(T::one(), T::one()), Impedance::Open),
            Err(Error::Capacity {
                what: "propagation_lanes",
                capacity: LANES
            })
        );
    }

    #[test]
    fn propagation_lanes_equal_at() {
        lanes_equal_at::<f64>();
        lanes_equal_at::<f32>();
    }

    #[test]
    fn default_propagation_block_equals_at() {
        let ll = Lossless::<f32>::new(75.0, 0.66).unwrap();
        let freqs = [0.0f32, 1e6, 1e9];
        let mut g = [Cx::new(0.0, 0.0); 3];
        let mut z = [Impedance::Open; 3];
        ll.propagation_into(&freqs, &mut g, &mut z).unwrap();
        for ((f, g), z) in freqs.iter().zip(g.iter()).zip(z.iter()) {
            let p = ll.at(*f).unwrap();
            assert_eq!((*g, *z), (p.gamma_per_m, p.zc_ohm));
        }
        assert_eq!(
            ll.propagation_into(&freqs, &mut g[..1], &mut z),
            Err(Error::LengthMismatch("gamma_per_m"))
        );
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<Rlgc<f64>>() <= 320);
        assert!(core::mem::size_of::<Rlgc<f32>>() <= 160);
    }

    #[test]
    fn bad_inputs_are_named() {
        assert_eq!(
            Rlgc::<f64>::constant(-1.0, 1e-7, 0.0, 1e-10),
            Err(Error::Negative("r_ohm_per_m"))
        );
        assert_eq!(
            Rlgc::<f64>::constant(0.0, 0.0, 0.0, 1e-10),
            Err(Error::NotPositive("l_h_per_m"))
        );
        assert_eq!(
            Rlgc::<f32>::constant(0.0, 1e-7, f32::NAN, 1e-10),
            Err(Error::NonFinite("g_s_per_m"))
        );
        assert_eq!(
            Rlgc::<f64>::constant(0.0, 1e-7, 0.0, f64::INFINITY),
            Err(Error::NonFinite("c_f_per_m"))
        );
        let w = Conductor::<f64>::generic(1.0, 1e-4).unwrap();
        assert_eq!(
            Rlgc::builder(1e-7, 1e-10)
                .conductor(w)
                .conductor(w)
                .conductor(w)
                .build(),
            Err(Error::Capacity {
                what: "conductors",
                capacity: 2
            })
        );
        let line = Rlgc::<f64>::constant(0.0, 1e-7, 0.0, 1e-10).unwrap();
        assert_eq!(line.at(-1.0), Err(Error::Negative("freq_hz")));
        assert_eq!(line.at(f64::NAN), Err(Error::NonFinite("freq_hz")));
    }
}

//! Coplanar waveguide: a centre strip of width S between two slots of width W
//! in a ground plane, on a dielectric substrate, by conformal mapping.
//!
//! With k = S/(S + 2W) (k′ = 2√(W(S + W))/(S + 2W), formed without cancellation)
//! and K(k)/K(k′) = AGM(1, k)/AGM(1, k′) exact by the arithmetic–geometric mean
//! ([`crate::math::elliptic`]), for a zero-thickness metal:
//!
//! * **thick substrate** (Wen, "Coplanar waveguide: a surface strip transmission
//!   line suitable for nonreciprocal gyromagnetic device applications",
//!   IEEE Trans. MTT-17:1087–1090, 1969): εeff = (εr + 1)/2,
//!   Z0 = (η0/4)/√εeff·K(k′)/K(k);
//! * **finite substrate h** (Veyres & Fouad Hanna, 1980; Gupta, Garg, Bahl &
//!   Bhartia, *Microstrip Lines and Slotlines*, 2nd ed., 1996):
//!   k3 = sinh(πS/4h)/sinh(π(S + 2W)/4h),
//!   εeff = 1 + ((εr − 1)/2)·[K(k3)/K(k3′)]·[K(k′)/K(k)], Z0 as above;
//! * **conductor-backed** (Ghione & Naldi, Electron. Lett. 20:179, 1984; IEEE
//!   Trans. MTT-35:260, 1987; from memory): k4 = tanh(πS/4h)/tanh(π(S + 2W)/4h),
//!   q = (K4/K4′)/(K/K′ + K4/K4′), εeff = 1 + q(εr − 1),
//!   Z0 = (η0/2)/√εeff/(K/K′ + K4/K4′).
//!
//! The published forms write η0/4 as 30π (η0 ≈ 120π); this module uses
//! η0 = μ0c0, so its Z0 is 0.07 % below a 30π evaluation. The hyperbolic
//! moduli and their complements are written in e^(−2x) (k3′² =
//! (1 − e^(−2(b+a)))(1 − e^(−2(b−a)))/(1 − e^(−2b))², k4′ = k3′/cosh a), so
//! nothing overflows for any h.
//!
//! **Thickness** is not in Z0 or εeff (zero-thickness forms); points carry
//! OUTSIDE_FIT_RANGE when t > W/10 (our threshold, common practice).
//!
//! **Losses** (stated approximations). Conductor loss (Gupta et al. 1996, the
//! CPW conductor-loss formula after Owyang & Wu; from memory), Np/m:
//!
//!   αc = Rs√εeff/(480π·K(k)K(k′)(1 − k²))·Σ_{x ∈ {a, b}} (1/x)·[π + ln(4πx(1 − k)/(t(1 + k)))],
//!
//! a = S/2, b = S/2 + W, valid for t ≫ δ and t ≪ W; it needs t > 0. It enters
//! as R_dc·√(1 + j f/f_c) with R_dc = 1/(σSt) (the centre strip; the wide
//! grounds' DC resistance is neglected), so R tends to R_dc at DC. Dielectric
//! loss with the filling factor q = (εeff − 1)/(εr − 1):
//! αd = (k0/2)·εr·q·tanδ/√εeff (as for microstrip).
//!
//! **Higher-order modes**: on a finite or backed substrate the first
//! surface-wave mode above the zero-cutoff ones, TE1 of the slab:
//! c0/(2h√(εr − 1)) for the bare slab and c0/(4h√(εr − 1)) with the backing
//! (Pozar, *Microwave Engineering*, 4th ed., 2012, §3.6, grounded slab; from
//! memory). The zero-cutoff TM0 surface wave (and, for the backed line, the
//! parallel-plate mode) can take power at any frequency once the CPW is faster
//! than it; the quasi-static forms do not model that leakage. The thick-substrate
//! form has no such cutoff (`cutoff_hz` is `None`).
//!
//! Size: `Cpw<f64>` ≤ 320 bytes, `Cpw<f32>` ≤ 160 bytes (no heap).

use crate::error::{self, Error, Result};
use crate::line::conductor::Metal;
use crate::line::dielectric::Dielectric;
use crate::line::tem::{self, SkinLoss};
use crate::line::{LineModel, LinePoint, Warnings};
use crate::math::complex::Cx;
use crate::math::elliptic::{agm, ellip_k_from_complement};
use crate::scalar::Real;

/// The substrate under the coplanar waveguide.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Substrate<T> {
    /// A substrate much thicker than S + 2W (Wen 1969).
    Thick,
    /// A substrate of height `height_m` with air below (Veyres & Fouad Hanna).
    Finite {
        /// Substrate height h, m.
        height_m: T,
    },
    /// A substrate of height `height_m` on a ground plane (Ghione & Naldi).
    ConductorBacked {
        /// Substrate height h, m.
        height_m: T,
    },
}

/// K(k)/K(k′) from both moduli.
fn k_ratio<T: Real>(k: T, kp: T) -> Result<T> {
    Ok(agm(T::one(), k)? / agm(T::one(), kp)?)
}

/// The geometry-only conformal-mapping results for a CPW.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Mapping<T> {
    /// K(k)/K(k′).
    kk: T,
    /// K(k3)/K(k3′) or K(k4)/K(k4′) (0 for the thick substrate).
    k3: T,
    /// 1 − k².
    one_minus_k2: T,
    k: T,
    kp: T,
}

/// Conformal mapping of S, W over the substrate.
fn mapping<T: Real>(s: T, w: T, substrate: Substrate<T>) -> Result<Mapping<T>> {
    let tot = s + w + w;
    let k = s / tot;
    let kp = T::two() * (w * (s + w)).sqrt() / tot;
    let kk = k_ratio(k, kp)?;
    let k3 = match substrate {
        Substrate::Thick => T::zero(),
        Substrate::Finite { height_m } | Substrate::ConductorBacked { height_m } => {
            let q = T::PI() / (T::lit(4.0) * height_m);
            let a = q * s;
            let b = q * tot;
            let m1 = |x: T| -(-(x + x)).exp_m1(); // 1 − e^(−2x)
            let ea = (-(a + a)).exp();
            let eb = (-(b + b)).exp();
            let k3 = (a - b).exp() * m1(a) / m1(b);
            let k3p = (m1(b + a) * m1(b - a)).sqrt() / m1(b);
            match substrate {
                Substrate::ConductorBacked { .. } => {
                    // tanh a/tanh b and k4′ = k3′/cosh a.
                    let k4 = m1(a) / m1(b) * (T::one() + eb) / (T::one() + ea);
                    let k4p = k3p * T::two() * (-a).exp() / (T::one() + ea);
                    k_ratio(k4, k4p)?
                }
                _ => k_ratio(k3, k3p)?,
            }
        }
    };
    Ok(Mapping {
        kk,
        k3,
        one_minus_k2: kp * kp,
        k,
        kp,
    })
}

/// (Z0, εeff) of a zero-thickness CPW for S > 0, W > 0, εr ≥ 1 (see the module
/// docs for the three substrates).
///
/// Errors: `NotPositive` naming `strip_width_m`, `slot_width_m` or `height_m`;
/// `OutOfRange("eps_r")` for εr < 1; `NonFinite` for any of them.
pub fn cpw_z0_eps_eff<T: Real>(
    strip_width_m: T,
    slot_width_m: T,
    substrate: Substrate<T>,
    eps_r: T,
) -> Result<(T, T)> {
    let (s, w, sub) = check(strip_width_m, slot_width_m, substrate)?;
    let er = error::finite(eps_r, "eps_r")?;
    if er < T::one() {
        return Err(Error::OutOfRange("eps_r"));
    }
    let m = mapping(s, w, sub)?;
    Ok(z0_eeff(&m, sub, er))
}

fn check<T: Real>(s: T, w: T, sub: Substrate<T>) -> Result<(T, T, Substrate<T>)> {
    let s = error::positive(s, "strip_width_m")?;
    let w = error::positive(w, "slot_width_m")?;
    let sub = match sub {
        Substrate::Thick => Substrate::Thick,
        Substrate::Finite { height_m } => Substrate::Finite {
            height_m: error::positive(height_m, "height_m")?,
        },
        Substrate::ConductorBacked { height_m } => Substrate::ConductorBacked {
            height_m: error::positive(height_m, "height_m")?,
        },
    };
    Ok((s, w, sub))
}

fn z0_eeff<T: Real>(m: &Mapping<T>, sub: Substrate<T>, er: T) -> (T, T) {
    let erm1 = er - T::one();
    match sub {
        Substrate::Thick => {
            let e = (er + T::one()) * T::half();
            (T::eta0() * T::lit(0.25) / (e.sqrt() * m.kk), e)
        }
        Substrate::Finite { .. } => {
            let e = T::one() + erm1 * T::half() * m.k3 / m.kk;
            (T::eta0() * T::lit(0.25) / (e.sqrt() * m.kk), e)
        }
        Substrate::ConductorBacked { .. } => {
            let sum = m.kk + m.k3;
            let e = T::one() + m.k3 / sum * erm1;
            (T::eta0() * T::half() / (e.sqrt() * sum), e)
        }
    }
}

/// (Z0, εeff, conductor series impedance) at one εr.
type Statics<T> = (T, T, SkinLoss<T>);

/// A coplanar waveguide (see the module docs).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Cpw<T> {
    strip_width_m: T,
    slot_width_m: T,
    thickness_m: T,
    substrate: Substrate<T>,
    map: Mapping<T>,
    dielectric: Dielectric<T>,
    metal: Option<Metal<T>>,
    // The geometry factor αc/(Rs·√εeff), 1/m/Ω.
    loss_geom: T,
    r_dc: Option<T>,
    fixed: Option<Statics<T>>,
    cutoff_hz: Option<T>,
    thin_lo_hz: T,
    thin_hi_hz: T,
    base: Warnings,
}

impl<T: Real> Cpw<T> {
    /// From the centre strip width S > 0, slot width W > 0, metal thickness
    /// t ≥ 0 (t > 0 with a metal), the substrate, a dielectric and the metal
    /// (`None`: perfect conductors).
    pub fn new(
        strip_width_m: T,
        slot_width_m: T,
        thickness_m: T,
        substrate: Substrate<T>,
        dielectric: Dielectric<T>,
        metal: Option<Metal<T>>,
    ) -> Result<Self> {
        let (s, w, sub) = check(strip_width_m, slot_width_m, substrate)?;
        let t = error::non_negative(thickness_m, "thickness_m")?;
        if metal.is_some() && t == T::zero() {
            return Err(Error::NotPositive("thickness_m"));
        }
        let map = mapping(s, w, sub)?;
        let mut base = Warnings::NONE;
        base.set_if(dielectric.is_non_causal(), Warnings::NON_CAUSAL_DIELECTRIC);
        base.set_if(t > w * T::lit(0.1), Warnings::OUTSIDE_FIT_RANGE);
        let loss_geom = if t > T::zero() {
            let a = s * T::half();
            let b = a + w;
            let r = (T::one() - map.k) / (t * (T::one() + map.k));
            let four_pi = T::lit(4.0) * T::PI();
            let term = |x: T| (T::PI() + (four_pi * x * r).ln()) / x;
            // K(k)·K(k′), each from its complement modulus.
            let kk_abs = ellip_k_from_complement(map.kp)? * ellip_k_from_complement(map.k)?;
            (term(a) + term(b)) / (T::lit(480.0) * T::PI() * kk_abs * map.one_minus_k2)
        } else {
            T::zero()
        };
        let (r_dc, thin_lo_hz, thin_hi_hz) = match metal {
            Some(m) => {
                let base_f =
                    T::one() / (T::PI() * m.mu_h_per_m() * m.conductivity_s_per_m() * t * t);
                (
                    Some(T::one() / (m.conductivity_s_per_m() * s * t)),
                    base_f / T::lit(9.0),
                    base_f * T::lit(9.0),
                )
            }
            None => (None, T::zero(), T::zero()),
        };
        let er0 = dielectric.eps_static();
        let erm1 = (er0 - T::one()).max(T::zero());
        let c = T::c0();
        let cutoff_hz = match sub {
            Substrate::Thick => None,
            Substrate::Finite { height_m } if erm1 > T::zero() => {
                Some(c / (T::two() * height_m * erm1.sqrt()))
            }
            Substrate::ConductorBacked { height_m } if erm1 > T::zero() => {
                Some(c / (T::lit(4.0) * height_m * erm1.sqrt()))
            }
            _ => None,
        };
        let mut cpw = Cpw {
            strip_width_m: s,
            slot_width_m: w,
            thickness_m: t,
            substrate: sub,
            map,
            dielectric,
            metal,
            loss_geom,
            r_dc,
            fixed: None,
            cutoff_hz,
            thin_lo_hz,
            thin_hi_hz,
            base,
        };
        let st = cpw.statics(er0)?;
        // A substrate so thin that a modulus under- or overflows gives no usable line.
        if !(st.0.is_finite() && st.0 > T::zero() && st.1.is_finite()) {
            return Err(Error::OutOfRange("height_m"));
        }
        if dielectric.debye().is_none() {
            cpw.fixed = Some(st);
        }
        Ok(cpw)
    }

    /// (Z0, εeff, conductor series impedance) at εr.
    fn statics(&self, er: T) -> Result<Statics<T>> {
        let (z0, ee) = z0_eeff(&self.map, self.substrate, er);
        let skin = match self.metal {
            Some(m) => {
                let rs_coeff = (T::PI() * m.mu_h_per_m() / m.conductivity_s_per_m()).sqrt();
                // R = 2·Z0·αc, αc = Rs·√εeff·loss_geom.
                SkinLoss::new(
                    T::two() * z0 * ee.sqrt() * self.loss_geom * rs_coeff,
                    self.r_dc,
                )?
            }
            None => SkinLoss::None,
        };
        Ok((z0, ee, skin))
    }

    fn statics_at(&self, f: T) -> Result<(Statics<T>, T, T)> {
        let (er, loss) = self.dielectric.eval(f);
        let st = match self.fixed {
            Some(s) => s,
            None => self.statics(er)?,
        };
        Ok((st, er, loss))
    }

    /// Lossless Z0 at `freq_hz` (ε′ there), Ω.
    pub fn z0_ohm(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok(self.statics_at(f)?.0 .0)
    }

    /// εeff at `freq_hz` (ε′ there; no dispersion).
    pub fn eps_eff(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        Ok(self.statics_at(f)?.0 .1)
    }

    /// Conductor attenuation αc (Gupta et al. 1996) for `metal`, Np/m.
    pub fn alpha_conductor_np_per_m(&self, freq_hz: T, metal: Metal<T>) -> Result<T> {
        let rs = metal.surface_resistance_ohm(freq_hz)?;
        Ok(rs * self.eps_eff(freq_hz)?.sqrt() * self.loss_geom)
    }

    /// Dielectric attenuation αd = (k0/2)·εr·q·tanδ/√εeff, Np/m.
    pub fn alpha_dielectric_np_per_m(&self, freq_hz: T) -> Result<T> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let ((_, ee, _), er, loss) = self.statics_at(f)?;
        let k0 = T::two_pi() * f / T::c0();
        Ok(k0 * T::half() * loss * tem::filling_factor(er, ee) / ee.sqrt())
    }

    /// Centre strip width S, m.
    pub fn strip_width_m(&self) -> T {
        self.strip_width_m
    }
    /// Slot width W, m.
    pub fn slot_width_m(&self) -> T {
        self.slot_width_m
    }
    /// Metal thickness t, m.
    pub fn thickness_m(&self) -> T {
        self.thickness_m
    }
    /// The substrate.
    pub fn substrate(&self) -> Substrate<T> {
        self.substrate
    }
}

impl<T: Real> LineModel<T> for Cpw<T> {
    fn at(&self, freq_hz: T) -> Result<LinePoint<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let ((z0, ee, skin), er, loss) = self.statics_at(f)?;
        let tan_eff = loss * tem::filling_factor(er, ee) / ee;
        let (z, y) = tem::zy(f, z0, ee, tan_eff, skin.eval(f));
        let mut w = self.base;
        if let Some(fc) = self.cutoff_hz {
            w.set_if(f >= fc, Warnings::ABOVE_HIGHER_MODE);
        }
        w.set_if(
            f > self.thin_lo_hz && f < self.thin_hi_hz,
            Warnings::THIN_CONDUCTOR,
        );
        tem::point(f, z, y, Some(Cx::new(z0, T::zero())), w)
    }

    fn cutoff_hz(&self) -> Option<T> {
        self.cutoff_hz
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn wen_in_air() {
        // Reference notes (methods.md §4) [calc]: k = 0.5 in air → 120.568 Ω
        // with 30π; ours uses η0/4, i.e. 120.568·η0/(120π).
        let (z, e) = cpw_z0_eps_eff::<f64>(1.0, 0.5, Substrate::Thick, 1.0).unwrap();
        assert_eq!(e, 1.0);
        let eta0 = 376.730_313_668;
        assert_relative_eq!(
            z,
            120.568 * eta0 / (120.0 * core::f64::consts::PI),
            max_relative = 1e-5
        );
        let (z32, _) = cpw_z0_eps_eff::<f32>(1.0, 0.5, Substrate::Thick, 1.0).unwrap();
        assert_relative_eq!(z32 as f64, z, max_relative = 1e-5);
    }

    #[test]
    fn finite_and_backed_tend_to_wen() {
        // A very thick substrate: k3 → k, so εeff → (εr + 1)/2; the backed line
        // tends to the same (its backing recedes).
        let (zw, ew) = cpw_z0_eps_eff::<f64>(100e-6, 60e-6, Substrate::Thick, 12.9).unwrap();
        let (zf, ef) =
            cpw_z0_eps_eff(100e-6, 60e-6, Substrate::Finite { height_m: 0.1 }, 12.9).unwrap();
        let (zb, eb) = cpw_z0_eps_eff(
            100e-6,
            60e-6,
            Substrate::ConductorBacked { height_m: 0.1 },
            12.9,
        )
        .unwrap();
        // Relative difference of order ((S + 2W)/h)² here.
        assert_relative_eq!(ef, ew, max_relative = 1e-6);
        assert_relative_eq!(zf, zw, max_relative = 1e-6);
        assert_relative_eq!(eb, ew, max_relative = 1e-6);
        assert_relative_eq!(zb, zw, max_relative = 1e-6);
        // Thin substrates: less dielectric (finite) / more capacitance (backed).
        let (zf, ef) =
            cpw_z0_eps_eff(100e-6, 60e-6, Substrate::Finite { height_m: 100e-6 }, 12.9).unwrap();
        let (zb, _) = cpw_z0_eps_eff(
            100e-6,
            60e-6,
            Substrate::ConductorBacked { height_m: 100e-6 },
            12.9,
        )
        .unwrap();
        assert!(ef < ew && zf > zw && zb < zw);
    }

    #[test]
    fn loss_and_warnings() {
        let d = Dielectric::constant(9.8, 1e-3).unwrap();
        let gold = Metal::new(4.1e7).unwrap();
        let c = Cpw::<f64>::new(
            100e-6,
            60e-6,
            3e-6,
            Substrate::Finite { height_m: 635e-6 },
            d,
            Some(gold),
        )
        .unwrap();
        let f = 10e9;
        let p = c.at(f).unwrap();
        let ac = c.alpha_conductor_np_per_m(f, gold).unwrap();
        let ad = c.alpha_dielectric_np_per_m(f).unwrap();
        assert!(ac > 0.0 && ad > 0.0);
        assert_relative_eq!(p.alpha_np_per_m(), ac + ad, max_relative = 2e-2);
        assert_relative_eq!(
            c.at(0.0).unwrap().z_ohm_per_m.re,
            1.0 / (4.1e7 * 100e-6 * 3e-6),
            max_relative = 1e-12
        );
        let fc = c.cutoff_hz().unwrap();
        assert!(c
            .at(fc)
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
        assert!(!c
            .at(0.9 * fc)
            .unwrap()
            .warnings
            .contains(Warnings::ABOVE_HIGHER_MODE));
    }

    #[test]
    fn bad_geometry_is_named() {
        let d = Dielectric::<f64>::vacuum();
        assert_eq!(
            Cpw::new(0.0, 1e-4, 0.0, Substrate::Thick, d, None),
            Err(Error::NotPositive("strip_width_m"))
        );
        assert_eq!(
            Cpw::new(1e-4, -1e-4, 0.0, Substrate::Thick, d, None),
            Err(Error::NotPositive("slot_width_m"))
        );
        assert_eq!(
            Cpw::new(
                1e-4,
                1e-4,
                0.0,
                Substrate::Finite { height_m: 0.0 },
                d,
                None
            ),
            Err(Error::NotPositive("height_m"))
        );
        assert_eq!(
            Cpw::new(1e-4, 1e-4, 0.0, Substrate::Thick, d, Some(Metal::copper())),
            Err(Error::NotPositive("thickness_m"))
        );
        assert_eq!(
            cpw_z0_eps_eff(1e-4, 1e-4, Substrate::Thick, 0.9),
            Err(Error::OutOfRange("eps_r"))
        );
        // S/h = 10⁴ on a backed substrate: k4′ underflows, no usable line.
        let r = Cpw::new(
            1e-2,
            1e-4,
            0.0,
            Substrate::ConductorBacked { height_m: 1e-6 },
            d,
            None,
        );
        assert_eq!(r, Err(Error::OutOfRange("height_m")));
    }

    #[test]
    fn size_is_as_documented() {
        assert!(core::mem::size_of::<Cpw<f64>>() <= 320);
        assert!(core::mem::size_of::<Cpw<f32>>() <= 160);
    }
}

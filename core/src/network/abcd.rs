//! ABCD (chain) matrices of two-ports, stored with a separate real scale so that
//! very lossy lines neither overflow nor lose their transmission.
//!
//! [V1; I1] = [A B; C D]·[V2; I2], currents into port 1 and out of port 2, so a
//! cascade is the matrix product in order from port 1 (Pozar, *Microwave
//! Engineering*, 4th ed., 2012, §4.4, Tables 4.1 and 4.2):
//!
//! * series impedance Z: [1 Z; 0 1]; shunt admittance Y: [1 0; Y 1];
//! * ideal transformer 1:n (V2 = n·V1): [1/n 0; 0 n] (input sees Z_L/n²);
//! * uniform line of length l, x = γl, Z and Y per metre:
//!   A = D = cosh x, B = Z·l·sinh(x)/x, C = Y·l·sinh(x)/x. This equals the usual
//!   [cosh x, Zc sinh x; sinh x/Zc, cosh x] (Z·l/x = Zc, Y·l/x = 1/Zc) but has
//!   no Zc in it, so it has no pole and holds at DC, where a lossless line's Zc
//!   is a 0/0 limit and a line without leakage has Zc = ∞. For |x| < 0.1,
//!   cosh x and sinh(x)/x are summed from their Taylor series to x⁸ (truncation
//!   below 3e-17).
//!
//! **Scaled representation.** An [`Abcd`] holds a matrix M' and a real
//! `scale_np` s (nepers): the two-port is e^s·M'. For a line,
//! s = |Re x| = αl and M' holds cosh and sinh divided by e^{αl}, which have
//! modulus ≤ 1 in A and D whatever the loss (αl = 200 Np would overflow f32 and
//! f64 alike in plain form, as e^88 overflows f32). After every product M' is
//! renormalised by an exact power of two (so no rounding is added) and s
//! absorbs the factor. Results are formed from M' where s cancels (S11, S22,
//! Zin, Z11, ...), and with e^{−s} applied last where it does not
//! (S21 = 2e^{−s}/Δ'), so S21 of a very lossy cascade underflows gracefully to 0.
//!
//! **Determinant.** AD − BC of the represented matrix is tracked in `det`
//! (product of the elements' closed-form determinants, 1 for every reciprocal
//! element here) rather than recomputed from entries: for a lossy line
//! A'D' − B'C' = e^{−2αl} is the difference of two numbers near ¼ and would be
//! lost to cancellation. S12 = det·S21, so reciprocity S12 = S21 is exact.

use crate::error::{self, Error, Result};
use crate::line::LinePoint;
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::Impedance;

use super::inf_norm;

/// A two-port chain matrix e^{`scale_np`}·[[a, b], [c, d]] with its determinant.
///
/// The fields are public for inspection; any values are accepted by the
/// operations (they do not rely on the normalisation).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Abcd<T> {
    /// Scaled A (dimensionless).
    pub a: Cx<T>,
    /// Scaled B, Ω.
    pub b: Cx<T>,
    /// Scaled C, S.
    pub c: Cx<T>,
    /// Scaled D (dimensionless).
    pub d: Cx<T>,
    /// The real scale s in nepers: the two-port is e^s times the matrix.
    pub scale_np: T,
    /// AD − BC of the represented (unscaled) two-port (1 for reciprocal ones).
    pub det: Cx<T>,
}

/// Scattering parameters for a real reference impedance at both ports.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SParams<T> {
    /// Input reflection, port 2 matched.
    pub s11: Cx<T>,
    /// Reverse transmission.
    pub s12: Cx<T>,
    /// Forward transmission.
    pub s21: Cx<T>,
    /// Output reflection, port 1 matched.
    pub s22: Cx<T>,
}

/// q·e^s: the plain product when e^s and the product are finite and normal,
/// else exp(s + ln|q|)·q/|q| (so that e^s alone may overflow or underflow while
/// the product does not).
pub(crate) fn mul_exp<T: Real>(q: Cx<T>, s: T) -> Cx<T> {
    if s == T::zero() {
        return q;
    }
    let es = s.exp();
    if es.is_finite() && es >= T::min_positive_value() {
        let r = q * es;
        if complex::is_finite(r) {
            return r;
        }
    }
    let m = complex::abs(q);
    if m == T::zero() || !m.is_finite() {
        return q;
    }
    let k = (s + m.ln()).exp() / m;
    Cx::new(q.re * k, q.im * k)
}

fn c0<T: Real>() -> Cx<T> {
    Cx::new(T::zero(), T::zero())
}

fn c1<T: Real>() -> Cx<T> {
    Cx::new(T::one(), T::zero())
}

fn is_zero<T: Real>(z: Cx<T>) -> bool {
    z.re == T::zero() && z.im == T::zero()
}

/// cosh x and sinh(x)/x scaled by e^{−|Re x|}, and that scale |Re x|.
pub(crate) fn cosh_sinhc_scaled<T: Real>(x: Cx<T>) -> (Cx<T>, Cx<T>, T) {
    let x2 = x * x;
    if x.re * x.re + x.im * x.im < T::lit(0.01) {
        let one: Cx<T> = c1();
        let ch = one
            + x2 * T::half()
                * (one + x2 / T::lit(12.0) * (one + x2 / T::lit(30.0) * (one + x2 / T::lit(56.0))));
        let shc = one
            + x2 / T::lit(6.0)
                * (one + x2 / T::lit(20.0) * (one + x2 / T::lit(42.0) * (one + x2 / T::lit(72.0))));
        return (ch, shc, T::zero());
    }
    // cosh and sinh(x)/x are even: work with w = ±x so that Re w ≥ 0.
    let w = if x.re < T::zero() { -x } else { x };
    let turns = w.im / T::two_pi();
    let p = complex::phasor_turns(turns); // e^{j Im w}
    let q = complex::exp_neg_turns(w.re + w.re, turns); // e^{−w}·e^{−Re w}
    let ch = (p + q) * T::half();
    let sh = (p - q) * T::half();
    (ch, complex::div(sh, w), w.re)
}

impl<T: Real> Abcd<T> {
    /// The identity (a zero-length connection).
    pub fn identity() -> Self {
        Abcd {
            a: c1(),
            b: c0(),
            c: c0(),
            d: c1(),
            scale_np: T::zero(),
            det: c1(),
        }
    }

    /// From plain entries (no scale); `det` is computed from them.
    pub fn from_matrix(a: Cx<T>, b: Cx<T>, c: Cx<T>, d: Cx<T>) -> Result<Self> {
        for (v, name) in [(a, "a"), (b, "b"), (c, "c"), (d, "d")] {
            if !complex::is_finite(v) {
                return Err(Error::NonFinite(name));
            }
        }
        let det = a * d - b * c;
        Ok(Abcd {
            a,
            b,
            c,
            d,
            scale_np: T::zero(),
            det,
        }
        .renormalised())
    }

    /// A series impedance [1 Z; 0 1]. A series open has no ABCD matrix
    /// ([`Error::Undefined`] `"abcd"`; the cascade's input impedance still handles it).
    pub fn series(z: Impedance<T>) -> Result<Self> {
        match z {
            Impedance::Open => Err(Error::Undefined("abcd")),
            Impedance::Finite(z) => {
                if !complex::is_finite(z) {
                    return Err(Error::NonFinite("z_ohm"));
                }
                Ok(Abcd {
                    b: z,
                    ..Self::identity()
                }
                .renormalised())
            }
        }
    }

    /// A shunt element of impedance Z: [1 0; 1/Z 1]. A shunt short has no ABCD
    /// matrix ([`Error::Undefined`] `"abcd"`); a shunt open is the identity.
    pub fn shunt(z: Impedance<T>) -> Result<Self> {
        match z {
            Impedance::Open => Ok(Self::identity()),
            Impedance::Finite(z) => {
                if !complex::is_finite(z) {
                    return Err(Error::NonFinite("z_ohm"));
                }
                if is_zero(z) {
                    return Err(Error::Undefined("abcd"));
                }
                Ok(Abcd {
                    c: complex::recip(z),
                    ..Self::identity()
                }
                .renormalised())
            }
        }
    }

    /// An ideal transformer 1:n (`turns_ratio` = n > 0, V2 = n·V1): [1/n 0; 0 n].
    pub fn transformer(turns_ratio: T) -> Result<Self> {
        let n = error::positive(turns_ratio, "turns_ratio")?;
        let z = T::zero();
        Ok(Abcd {
            a: Cx::new(T::one() / n, z),
            d: Cx::new(n, z),
            ..Self::identity()
        }
        .renormalised())
    }

    /// A uniform line section of `length_m` (finite, ≥ 0) described by `point`.
    pub fn line(point: &LinePoint<T>, length_m: T) -> Result<Self> {
        let l = error::non_negative(length_m, "length_m")?;
        let g = point.gamma_per_m;
        if !complex::is_finite(g) {
            return Err(Error::NonFinite("gamma_per_m"));
        }
        if !complex::is_finite(point.z_ohm_per_m) {
            return Err(Error::NonFinite("z_ohm_per_m"));
        }
        if !complex::is_finite(point.y_s_per_m) {
            return Err(Error::NonFinite("y_s_per_m"));
        }
        Ok(Self::line_unchecked(point, l))
    }

    pub(crate) fn line_unchecked(point: &LinePoint<T>, l: T) -> Self {
        let x = point.gamma_per_m * l;
        let (ch, shc, s) = cosh_sinhc_scaled(x);
        Abcd {
            a: ch,
            b: point.z_ohm_per_m * l * shc,
            c: point.y_s_per_m * l * shc,
            d: ch,
            scale_np: s,
            det: c1(),
        }
        .renormalised()
    }

    /// Divides the matrix by an exact power of two near its largest entry and
    /// adds the factor to `scale_np` (no rounding is introduced).
    pub fn renormalised(self) -> Self {
        let m = inf_norm(self.a)
            .max(inf_norm(self.b))
            .max(inf_norm(self.c))
            .max(inf_norm(self.d));
        if m == T::zero() || !m.is_finite() {
            return self;
        }
        let k = m.log2().floor();
        if k == T::zero() {
            return self;
        }
        // 2^−k in two exact factors, so that neither overflows for a
        // subnormal or huge m (k may reach ±1074 in f64).
        let ki = k.to_i64_sat().clamp(-2200, 2200) as i32;
        let (f1, f2) = (T::two().powi(-(ki / 2)), T::two().powi(-(ki - ki / 2)));
        Abcd {
            a: self.a * f1 * f2,
            b: self.b * f1 * f2,
            c: self.c * f1 * f2,
            d: self.d * f1 * f2,
            scale_np: self.scale_np + k * T::LN_2(),
            det: self.det,
        }
    }

    /// The cascade `self` followed by `next` (matrix product self·next).
    pub fn then(&self, next: &Abcd<T>) -> Abcd<T> {
        Abcd {
            a: self.a * next.a + self.b * next.c,
            b: self.a * next.b + self.b * next.d,
            c: self.c * next.a + self.d * next.c,
            d: self.c * next.b + self.d * next.d,
            scale_np: self.scale_np + next.scale_np,
            det: self.det * next.det,
        }
        .renormalised()
    }

    /// The plain entries [[A, B], [C, D]] = e^s·M'. Error [`Error::OutOfRange`]
    /// `"scale_np"` if an entry overflows the type (use the scaled form then).
    pub fn matrix(&self) -> Result<[[Cx<T>; 2]; 2]> {
        let s = self.scale_np;
        let m = [
            [mul_exp(self.a, s), mul_exp(self.b, s)],
            [mul_exp(self.c, s), mul_exp(self.d, s)],
        ];
        if m.iter().flatten().all(|z| complex::is_finite(*z)) {
            Ok(m)
        } else {
            Err(Error::OutOfRange("scale_np"))
        }
    }

    /// Input impedance with `load` at port 2: Zin = (A·ZL + B)/(C·ZL + D),
    /// A/C for an open load. A denominator within 8ε of cancelling (relative
    /// to its terms) is an open.
    pub fn input_impedance(&self, load: Impedance<T>) -> Result<Impedance<T>> {
        let (n, d) = match load {
            Impedance::Open => (self.a, self.c),
            Impedance::Finite(zl) => {
                if !complex::is_finite(zl) {
                    return Err(Error::NonFinite("z_ohm"));
                }
                let cz = self.c * zl;
                (self.a * zl + self.b, super::snap_sum(cz, self.d))
            }
        };
        super::ratio_to_impedance(n, d)
    }

    /// S-parameters for the real reference `z_ref_ohm` (> 0) at both ports
    /// (Pozar Table 4.2): Δ = A + B/Zr + C·Zr + D; S11 = (A + B/Zr − C·Zr − D)/Δ;
    /// S21 = 2/Δ; S12 = 2(AD − BC)/Δ; S22 = (−A + B/Zr − C·Zr + D)/Δ.
    ///
    /// The reference is real: a lossy line whose Zc is complex is *not* matched
    /// by it (S11 ≠ 0 even when Zr = |Zc| or Re Zc).
    pub fn s_params(&self, z_ref_ohm: T) -> Result<SParams<T>> {
        let zr = error::positive(z_ref_ohm, "z_ref_ohm")?;
        let bz = self.b / zr;
        let cz = self.c * zr;
        let delta = self.a + bz + cz + self.d;
        if is_zero(delta) || !complex::is_finite(delta) {
            return Err(Error::Undefined("s_params"));
        }
        let s21 = mul_exp(
            complex::div(Cx::new(T::two(), T::zero()), delta),
            -self.scale_np,
        );
        let s = SParams {
            s11: complex::div(self.a + bz - cz - self.d, delta),
            s12: self.det * s21,
            s21,
            s22: complex::div(bz - self.a - cz + self.d, delta),
        };
        if [s.s11, s.s12, s.s21, s.s22]
            .iter()
            .any(|x| x.re.is_nan() || x.im.is_nan())
        {
            return Err(Error::Undefined("s_params"));
        }
        Ok(s)
    }

    /// The two-port from S-parameters for the real reference `z_ref_ohm`
    /// (Pozar Table 4.2, inverse direction). [`Error::Undefined`] `"s21"` if S21 = 0.
    pub fn from_s_params(s: &SParams<T>, z_ref_ohm: T) -> Result<Self> {
        let zr = error::positive(z_ref_ohm, "z_ref_ohm")?;
        for v in [s.s11, s.s12, s.s21, s.s22] {
            if !complex::is_finite(v) {
                return Err(Error::NonFinite("s_params"));
            }
        }
        if is_zero(s.s21) {
            return Err(Error::Undefined("s21"));
        }
        let one: Cx<T> = c1();
        let p = s.s12 * s.s21;
        let two_s21 = s.s21 * T::two();
        let a = complex::div((one + s.s11) * (one - s.s22) + p, two_s21);
        let b = complex::div(((one + s.s11) * (one + s.s22) - p) * zr, two_s21);
        let c = complex::div((one - s.s11) * (one - s.s22) - p, two_s21 * zr);
        let d = complex::div((one - s.s11) * (one + s.s22) + p, two_s21);
        let det = complex::div(s.s12, s.s21);
        Ok(Abcd {
            a,
            b,
            c,
            d,
            scale_np: T::zero(),
            det,
        }
        .renormalised())
    }

    /// Impedance parameters [[Z11, Z12], [Z21, Z22]] (Ω): Z11 = A/C, Z12 = (AD − BC)/C,
    /// Z21 = 1/C, Z22 = D/C. [`Error::Undefined`] `"z_params"` when C = 0
    /// (e.g. a lone series element).
    pub fn z_params(&self) -> Result<[[Cx<T>; 2]; 2]> {
        if is_zero(self.c) {
            return Err(Error::Undefined("z_params"));
        }
        let z21 = mul_exp(complex::recip(self.c), -self.scale_np);
        Ok([
            [complex::div(self.a, self.c), self.det * z21],
            [z21, complex::div(self.d, self.c)],
        ])
    }

    /// Admittance parameters [[Y11, Y12], [Y21, Y22]] (S): Y11 = D/B,
    /// Y12 = (BC − AD)/B, Y21 = −1/B, Y22 = A/B. [`Error::Undefined`]
    /// `"y_params"` when B = 0 (e.g. a lone shunt element).
    pub fn y_params(&self) -> Result<[[Cx<T>; 2]; 2]> {
        if is_zero(self.b) {
            return Err(Error::Undefined("y_params"));
        }
        let y21 = -mul_exp(complex::recip(self.b), -self.scale_np);
        Ok([
            [complex::div(self.d, self.b), self.det * y21],
            [y21, complex::div(self.a, self.b)],
        ])
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::lossless::Lossless;
    use crate::line::LineModel;

    #[test]
    fn series_shunt_transformer_entries() {
        let s = Abcd::series(Impedance::ohms(25.0f64))
            .unwrap()
            .matrix()
            .unwrap();
        assert!((s[0][1].re - 25.0).abs() < 1e-12 && (s[0][0].re - 1.0).abs() < 1e-15);
        let t = Abcd::<f32>::transformer(2.0).unwrap();
        assert_eq!(
            t.input_impedance(Impedance::ohms(200.0)),
            Ok(Impedance::ohms(50.0))
        );
        assert_eq!(
            Abcd::<f64>::series(Impedance::Open),
            Err(Error::Undefined("abcd"))
        );
        assert_eq!(
            Abcd::<f64>::shunt(Impedance::ohms(0.0)),
            Err(Error::Undefined("abcd"))
        );
        assert_eq!(
            Abcd::<f64>::series(Impedance::ohms(5.0))
                .unwrap()
                .z_params(),
            Err(Error::Undefined("z_params"))
        );
        assert_eq!(
            Abcd::<f64>::shunt(Impedance::ohms(5.0)).unwrap().y_params(),
            Err(Error::Undefined("y_params"))
        );
        assert_eq!(
            Abcd::<f64>::transformer(0.0),
            Err(Error::NotPositive("turns_ratio"))
        );
    }

    #[test]
    fn line_at_dc_is_identity_and_series_small_x_matches() {
        let l = Lossless::<f64>::new(50.0, 0.7).unwrap();
        let m = Abcd::line(&l.at(0.0).unwrap(), 3.0)
            .unwrap()
            .matrix()
            .unwrap();
        assert_eq!(m[0][0], Cx::new(1.0, 0.0));
        assert_eq!(m[0][1], Cx::new(0.0, 0.0));
        // Either side of the |x| = 0.1 switch the two forms agree.
        for x in [0.099_999f64, 0.100_001] {
            let (ch, shc, s) = cosh_sinhc_scaled(Cx::new(0.3 * x, 0.9539 * x));
            let z = Cx::new(0.3 * x, 0.9539 * x);
            let want_ch = z.cosh();
            let want_shc = z.sinh() / z;
            assert!((mul_exp(ch, s) - want_ch).norm() < 1e-15);
            assert!((mul_exp(shc, s) - want_shc).norm() < 1e-15);
        }
    }

    #[test]
    fn renormalisation_survives_extreme_entries() {
        let tiny =
            Abcd::from_matrix(Cx::new(1e-310f64, 0.0), c0(), c0(), Cx::new(3e-310, 0.0)).unwrap();
        assert!(
            inf_norm(tiny.d) >= 1.0 && inf_norm(tiny.d) < 2.0,
            "{tiny:?}"
        );
        let huge =
            Abcd::from_matrix(Cx::new(1e38f32, 0.0), c0(), c0(), Cx::new(3e38, 0.0)).unwrap();
        assert!(
            inf_norm(huge.d) >= 1.0 && inf_norm(huge.d) < 2.0,
            "{huge:?}"
        );
        let back = tiny.matrix().unwrap();
        assert!((back[1][1].re - 3e-310).abs() < 1e-320);
    }

    #[test]
    fn renormalisation_is_exact() {
        let m = Abcd::from_matrix(
            Cx::new(3.0f64, 0.0),
            Cx::new(1e10, 0.0),
            c0(),
            Cx::new(1.0, 0.0),
        )
        .unwrap();
        assert!(inf_norm(m.b) >= 1.0 && inf_norm(m.b) < 2.0);
        let back = m.matrix().unwrap();
        assert!((back[0][1].re - 1e10).abs() < 1e-4);
    }
}

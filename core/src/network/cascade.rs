//! Cascades of line sections and lumped elements, ended by a load.
//!
//! Elements are listed from the input (port 1) toward the load (port 2).
//! Capacity is the const generic `N` (a `heapless::Vec`): pushing an
//! (N+1)-th element is [`Error::Capacity`]. Memory: `N × size_of::<Element<T>>()`
//! plus a length word; an element is at most 64 bytes in f64 and 32 bytes in
//! f32 on a 64-bit host (a lumped R-L-C element holds three `Option<T>`).
//!
//! **Input impedance (fast path).** The cascade is walked from the load toward
//! the input carrying the impedance as a ratio Z = V/I of two complex numbers
//! (so an open is I = 0 with no special case and no division until the end).
//! Across a line the reflection form is used (Pozar, *Microwave Engineering*,
//! 4th ed., 2012, §2.3):
//!
//! Γ_L = (Z_L − Zc)/(Z_L + Zc), Γin = Γ_L·e^{−2γl}, Zin = Zc(1 + Γin)/(1 − Γin),
//!
//! with e^{−2γl} from [`crate::math::complex::exp_neg_turns`] (phase in turns,
//! modulus ≤ 1). It has no tanh(γl) and so no pole: at γl = jπ/2 it gives
//! Zc²/Z_L, and a long or very lossy line (αl = 200 Np) gives Zin → Zc without
//! overflow. A 1 − Γin that cancels to within 8ε of its terms (the rounding
//! of Γin itself) is taken as exactly 0: the input is an open (the shorted
//! lossless quarter-wave). Where Zc is not a finite non-zero number (a line
//! without leakage at DC has Zc = ∞) the section's ABCD map is used instead.
//! Each line model is evaluated once per frequency (in sweeps, one
//! [`LineModel::propagation_into`] call per block of frequencies gives γ and Zc).
//! The ratio (n, d) is rescaled only when the sum of its parts' moduli leaves
//! [2⁻³², 2³²] (a common factor does not change n/d), and the final n/d uses
//! one reciprocal n·conj(d)/|d|² where |d| is within [2⁻⁶⁰, 2⁶⁰] (Smith's
//! division otherwise).
//!
//! **Two-port view.** [`Cascade::abcd_at`] multiplies the [`Abcd`] matrices of
//! the elements (scaled form, see [`crate::network::abcd`]); S, Z and Y
//! parameters come from it. The two paths are tested against each other.

use heapless::Vec;

use crate::error::{self, Error, Result};
use crate::line::LineModel;
use crate::math::complex::{self, Cx};
use crate::scalar::Real;
use crate::value::Impedance;

use super::abcd::{Abcd, SParams};
use super::load::Load;
use super::{inf_norm, ratio_to_impedance, reflection::reflection, snap_sum};

/// One element of a cascade.
#[derive(Clone, Copy)]
pub enum Element<'a, T> {
    /// A uniform line section.
    Line {
        /// The line model, evaluated once per frequency.
        model: &'a dyn LineModel<T>,
        /// Section length, m (finite, ≥ 0).
        length_m: T,
    },
    /// A lumped element in series (between the two top conductors).
    Series(Load<T>),
    /// A lumped element in shunt (across the line).
    Shunt(Load<T>),
    /// An ideal transformer 1:n, n = `turns_ratio` > 0 (the input sees Z/n²).
    Transformer {
        /// The turns ratio n (secondary/primary, toward the load).
        turns_ratio: T,
    },
}

impl<T: core::fmt::Debug> core::fmt::Debug for Element<'_, T> {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        match self {
            Element::Line { length_m, .. } => {
                f.debug_struct("Line").field("length_m", length_m).finish()
            }
            Element::Series(l) => f.debug_tuple("Series").field(l).finish(),
            Element::Shunt(l) => f.debug_tuple("Shunt").field(l).finish(),
            Element::Transformer { turns_ratio } => f
                .debug_struct("Transformer")
                .field("turns_ratio", turns_ratio)
                .finish(),
        }
    }
}

impl<T: Real> Element<'_, T> {
    fn validate(&self) -> Result<()> {
        match self {
            Element::Line { length_m, .. } => {
                error::non_negative(*length_m, "length_m").map(|_| ())
            }
            Element::Series(l) | Element::Shunt(l) => l.validate(),
            Element::Transformer { turns_ratio } => {
                error::positive(*turns_ratio, "turns_ratio").map(|_| ())
            }
        }
    }
}

/// A chain of at most `N` elements from the input toward the load.
#[derive(Clone, Debug)]
pub struct Cascade<'a, T, const N: usize> {
    elements: Vec<Element<'a, T>, N>,
}

impl<T: Real, const N: usize> Default for Cascade<'_, T, N> {
    fn default() -> Self {
        Self::new()
    }
}

impl<'a, T: Real, const N: usize> Cascade<'a, T, N> {
    /// An empty cascade (the load seen directly).
    pub const fn new() -> Self {
        Cascade {
            elements: Vec::new(),
        }
    }

    /// Appends an element on the load side. Errors: [`Error::Capacity`]
    /// (`"cascade"`, N) when full; the element's invalid parameter otherwise
    /// (`"length_m"`, `"turns_ratio"`, `"r_ohm"`, ...).
    pub fn push(&mut self, element: Element<'a, T>) -> Result<()> {
        element.validate()?;
        self.elements.push(element).map_err(|_| Error::Capacity {
            what: "cascade",
            capacity: N,
        })
    }

    /// Appends a line section of `length_m`.
    pub fn push_line(&mut self, model: &'a dyn LineModel<T>, length_m: T) -> Result<()> {
        self.push(Element::Line { model, length_m })
    }

    /// The elements, input first.
    pub fn elements(&self) -> &[Element<'a, T>] {
        &self.elements
    }

    /// Number of elements.
    pub fn len(&self) -> usize {
        self.elements.len()
    }

    /// `true` if there is no element.
    pub fn is_empty(&self) -> bool {
        self.elements.is_empty()
    }

    /// The chain matrix of the whole cascade at `freq_hz ≥ 0`. A series open
    /// or shunt short (e.g. a series capacitor at DC) has none:
    /// [`Error::Undefined`] `"abcd"`.
    pub fn abcd_at(&self, freq_hz: T) -> Result<Abcd<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        let mut acc = Abcd::identity();
        for e in self.elements.iter() {
            let m = match e {
                Element::Line { model, length_m } => Abcd::line(&model.at(f)?, *length_m)?,
                Element::Series(l) => Abcd::series(l.impedance_unchecked(f))?,
                Element::Shunt(l) => Abcd::shunt(l.impedance_unchecked(f))?,
                Element::Transformer { turns_ratio } => Abcd::transformer(*turns_ratio)?,
            };
            acc = acc.then(&m);
        }
        Ok(acc)
    }

    /// S-parameters at `freq_hz` for the real reference `z_ref_ohm` at both
    /// ports (see [`Abcd::s_params`] for the convention).
    pub fn s_params(&self, freq_hz: T, z_ref_ohm: T) -> Result<SParams<T>> {
        self.abcd_at(freq_hz)?.s_params(z_ref_ohm)
    }

    /// Z-parameters at `freq_hz` ([`Error::Undefined`] `"z_params"` where singular).
    pub fn z_params(&self, freq_hz: T) -> Result<[[Cx<T>; 2]; 2]> {
        self.abcd_at(freq_hz)?.z_params()
    }

    /// Y-parameters at `freq_hz` ([`Error::Undefined`] `"y_params"` where singular).
    pub fn y_params(&self, freq_hz: T) -> Result<[[Cx<T>; 2]; 2]> {
        self.abcd_at(freq_hz)?.y_params()
    }

    /// Input impedance at `freq_hz ≥ 0` with `load` at the far end (see the
    /// module docs for the method).
    pub fn input_impedance(&self, freq_hz: T, load: &Load<T>) -> Result<Impedance<T>> {
        let f = error::non_negative(freq_hz, "freq_hz")?;
        load.validate()?;
        self.zin_checked(f, load)
    }

    /// Input reflection coefficient Γ = (Zin − Zr)/(Zin + Zr) for the
    /// reference `z_ref_ohm` (Re > 0, complex allowed).
    pub fn input_reflection(&self, freq_hz: T, load: &Load<T>, z_ref_ohm: Cx<T>) -> Result<Cx<T>> {
        reflection(self.input_impedance(freq_hz, load)?, z_ref_ohm)
    }

    /// Input impedance at each of `freqs_hz` into `out` (same length, else
    /// [`Error::LengthMismatch`] `"out"`). A bad frequency is
    /// [`Error::NonFinite`] / [`Error::Negative`] `"freqs_hz"`; on any error
    /// `out` is partly written. Frequencies are processed in blocks of
    /// [`SWEEP_BLOCK`] (element by element across the block, so that the
    /// independent frequencies overlap in the pipeline, and each line model is
    /// called once per block through [`LineModel::propagation_into`]); the only
    /// memory used besides `out` is a stack block of `SWEEP_BLOCK` × (three
    /// complex numbers and one [`Impedance`]) (1152 bytes in f64, 576 in f32).
    /// `out` holds
    /// `size_of::<Impedance<T>>()` = 24 bytes per point in f64, 12 in f32.
    pub fn input_impedance_sweep(
        &self,
        freqs_hz: &[T],
        load: &Load<T>,
        out: &mut [Impedance<T>],
    ) -> Result<()> {
        if freqs_hz.len() != out.len() {
            return Err(Error::LengthMismatch("out"));
        }
        load.validate()?;
        for f in freqs_hz.iter() {
            // One comparison pair per frequency; the named error on the cold path.
            if !(*f >= T::zero() && *f <= T::max_value()) {
                error::non_negative(*f, "freqs_hz")?;
            }
        }
        // Blocks by checked sub-slices (not `chunks().zip()`, whose length
        // computation keeps a division-by-zero panic branch at opt-level z,
        // which the firmware's no-panic proof rejects).
        let mut start = 0;
        while start < freqs_hz.len() {
            let end = freqs_hz.len().min(start + SWEEP_BLOCK);
            let (Some(fs), Some(os)) = (freqs_hz.get(start..end), out.get_mut(start..end)) else {
                break;
            };
            self.walk_block::<SWEEP_BLOCK>(fs, load, os)?;
            start = end;
        }
        Ok(())
    }

    fn zin_checked(&self, f: T, load: &Load<T>) -> Result<Impedance<T>> {
        let mut out = [Impedance::Open];
        self.walk_block::<1>(&[f], load, &mut out)?;
        let [z] = out;
        Ok(z)
    }

    /// The load-to-input walk for up to `B` validated frequencies (`B` = 1 for one point).
    fn walk_block<const B: usize>(
        &self,
        freqs: &[T],
        load: &Load<T>,
        out: &mut [Impedance<T>],
    ) -> Result<()> {
        let zero = Cx::new(T::zero(), T::zero());
        let one = Cx::new(T::one(), T::zero());
        let mut state = [(zero, zero); B];
        for (st, f) in state.iter_mut().zip(freqs.iter()) {
            *st = match load.impedance_unchecked(*f) {
                Impedance::Open => (one, zero),
                Impedance::Finite(z) => (z, one),
            };
        }
        for e in self.elements.iter().rev() {
            match e {
                Element::Line { model, length_m } => {
                    let l = *length_m;
                    if l == T::zero() {
                        continue;
                    }
                    // γ and Zc at every frequency of the block in one call; then
                    // e^{−2γl} and the reflection step per frequency (independent
                    // chains that overlap in the pipeline). A section without a
                    // finite non-zero Zc is evaluated again in full and applied by
                    // its ABCD map.
                    let mut gammas = [zero; B];
                    let mut zcs = [Impedance::Open; B];
                    model.propagation_into(freqs, &mut gammas, &mut zcs)?;
                    for (((st, g), zc), f) in state
                        .iter_mut()
                        .zip(gammas.iter())
                        .zip(zcs.iter())
                        .zip(freqs)
                    {
                        match *zc {
                            // 0 < |Re| + |Im| ≤ max: finite and non-zero (NaN fails).
                            Impedance::Finite(zc)
                                if zc.re.abs() + zc.im.abs() > T::zero()
                                    && zc.re.abs() + zc.im.abs() <= T::max_value() =>
                            {
                                // e^{−2γl}: 2αl nepers, 2βl/(2π) = βl/π turns.
                                let e = complex::exp_neg_turns(
                                    T::two() * g.re * l,
                                    g.im * l * T::FRAC_1_PI(),
                                );
                                *st = line_step(*st, zc, e)?;
                            }
                            _ => {
                                let m = Abcd::line(&model.at(*f)?, l)?;
                                let (n, d) = *st;
                                *st = normalise(m.a * n + m.b * d, snap_sum(m.c * n, m.d * d))?;
                            }
                        }
                    }
                }
                _ => {
                    for (st, f) in state.iter_mut().zip(freqs.iter()) {
                        step(e, *f, st)?;
                    }
                }
            }
        }
        for (o, st) in out.iter_mut().zip(state.iter()) {
            *o = ratio_fast(st.0, st.1)?;
        }
        Ok(())
    }
}

/// Frequencies processed together by [`Cascade::input_impedance_sweep`].
pub const SWEEP_BLOCK: usize = 16;

/// One element of the walk: (n, d) at the element's load side → its input side,
/// renormalised so that max |part| = 1.
#[inline(always)]
fn step<T: Real>(e: &Element<'_, T>, f: T, st: &mut (Cx<T>, Cx<T>)) -> Result<()> {
    let zero = Cx::new(T::zero(), T::zero());
    let one = Cx::new(T::one(), T::zero());
    let (mut n, mut d) = *st;
    match e {
        Element::Line { .. } => {
            // Lines are handled block-wise in `walk_block`.
        }
        Element::Series(ld) => match ld.impedance_unchecked(f) {
            Impedance::Open => {
                n = one;
                d = zero;
            }
            Impedance::Finite(zs) => n = n + zs * d,
        },
        Element::Shunt(ld) => match ld.impedance_unchecked(f) {
            Impedance::Open => {}
            Impedance::Finite(zs) => {
                if zs.re == T::zero() && zs.im == T::zero() {
                    n = zero;
                    d = one;
                } else {
                    let nn = n * zs;
                    d = n + zs * d;
                    n = nn;
                }
            }
        },
        Element::Transformer { turns_ratio } => d = d * (*turns_ratio * *turns_ratio),
    }
    *st = normalise(n, d)?;
    Ok(())
}

/// Across a line of characteristic impedance `zc` with e = e^{−2γl}:
/// Γ_L = (n − Zc·d)/(n + Zc·d), Γin = Γ_L·e, Zin = Zc(1 + Γin)/(1 − Γin),
/// kept as a ratio (n', d'). A 1 − Γin within 8ε of its terms is exactly 0.
#[inline(always)]
fn line_step<T: Real>(st: (Cx<T>, Cx<T>), zc: Cx<T>, e: Cx<T>) -> Result<(Cx<T>, Cx<T>)> {
    let (n, d) = st;
    let zd = zc * d;
    let gn = n - zd; // numerator of Γ_L
    let gd = n + zd; // denominator of Γ_L
    let ge = gn * e; // numerator of Γin (same denominator)
    let dd = gd - ge;
    let tiny = T::lit(8.0) * T::EPS * max_fast(norm_fast(gd), norm_fast(ge));
    let dd = if norm_fast(dd) <= tiny {
        Cx::new(T::zero(), T::zero())
    } else {
        dd
    };
    renormalise(zc * (gd + ge), dd)
}

/// max(|re|, |im|) by plain comparisons (no NaN handling: `f64::max` spends
/// several instructions on dropping a NaN operand; here a NaN simply fails
/// the comparison it feeds and the result is checked by [`renormalise`]).
#[inline(always)]
fn norm_fast<T: Real>(z: Cx<T>) -> T {
    max_fast(z.re.abs(), z.im.abs())
}

#[inline(always)]
fn max_fast<T: Real>(a: T, b: T) -> T {
    if a > b {
        a
    } else {
        b
    }
}

/// n/d as an [`Impedance`], as `ratio_to_impedance` (d = 0: open; 0/0:
/// [`Error::Undefined`]), with one reciprocal n·conj(d)·(1/|d|²) instead of
/// Smith's two divisions when max(|Re d|, |Im d|) is within [2⁻⁶⁰, 2⁶⁰] and
/// n is finite (|d|² and the products can then neither overflow nor underflow
/// to a loss of accuracy).
#[inline(always)]
fn ratio_fast<T: Real>(n: Cx<T>, d: Cx<T>) -> Result<Impedance<T>> {
    let m = norm_fast(d);
    let lo = T::lit(8.673_617_379_884_035e-19); // 2⁻⁶⁰
    let hi = T::lit(1.152_921_504_606_847e18); // 2⁶⁰
    if m >= lo && m <= hi && n.re.abs() <= hi && n.im.abs() <= hi {
        let k = T::one() / (d.re * d.re + d.im * d.im);
        let q = Cx::new(
            (n.re * d.re + n.im * d.im) * k,
            (n.im * d.re - n.re * d.im) * k,
        );
        return Ok(Impedance::Finite(complex::unsign_zero(q)));
    }
    ratio_to_impedance(n, d)
}

/// As [`normalise`], but leaves (n, d) as they are while the sum of the moduli
/// of the four parts is within [2⁻³², 2³²] (finite, far from overflow in the
/// next step): scaling both by the same factor does not change the ratio, so
/// the division and the finiteness checks are only paid outside that range.
/// A NaN or infinity makes the sum fail both comparisons (a `max` would drop a NaN).
#[inline(always)]
fn renormalise<T: Real>(n: Cx<T>, d: Cx<T>) -> Result<(Cx<T>, Cx<T>)> {
    let m = (n.re.abs() + n.im.abs()) + (d.re.abs() + d.im.abs());
    if m >= T::lit(2.328_306_436_538_696_3e-10) && m <= T::lit(4_294_967_296.0) {
        return Ok((n, d));
    }
    normalise(n, d)
}

/// Scales (n, d) so that the largest part has modulus 1.
#[inline(always)]
fn normalise<T: Real>(n: Cx<T>, d: Cx<T>) -> Result<(Cx<T>, Cx<T>)> {
    let m = inf_norm(n).max(inf_norm(d));
    if !(complex::is_finite(n) && complex::is_finite(d)) {
        return Err(Error::NonFinite("input_impedance"));
    }
    if m == T::zero() {
        return Err(Error::Undefined("input_impedance"));
    }
    let k = T::one() / m;
    Ok((n * k, d * k))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::line::lossless::Lossless;
    use crate::network::load::Rlc;

    #[test]
    fn element_sizes_are_as_documented() {
        assert!(core::mem::size_of::<Element<'_, f64>>() <= 64);
        assert!(core::mem::size_of::<Element<'_, f32>>() <= 32);
    }

    #[test]
    fn capacity_is_an_error() {
        let l = Lossless::<f64>::new(50.0, 0.66).unwrap();
        let mut c: Cascade<'_, f64, 2> = Cascade::new();
        c.push_line(&l, 1.0).unwrap();
        c.push(Element::Series(Load::Resistor(5.0))).unwrap();
        assert_eq!(
            c.push_line(&l, 1.0),
            Err(Error::Capacity {
                what: "cascade",
                capacity: 2
            })
        );
        assert_eq!(c.len(), 2);
        assert_eq!(c.push_line(&l, -1.0), Err(Error::Negative("length_m")));
    }

    #[test]
    fn series_c_at_dc_opens_and_shunt_l_at_dc_shorts() {
        let l = Lossless::<f32>::new(50.0, 0.66).unwrap();
        let mut c: Cascade<'_, f32, 4> = Cascade::new();
        c.push(Element::Series(Load::Series(Rlc::new(
            None,
            None,
            Some(1e-9),
        ))))
        .unwrap();
        c.push_line(&l, 2.0).unwrap();
        assert_eq!(
            c.input_impedance(0.0, &Load::Resistor(50.0)),
            Ok(Impedance::Open)
        );
        assert_eq!(c.abcd_at(0.0), Err(Error::Undefined("abcd")));
        let mut c: Cascade<'_, f32, 4> = Cascade::new();
        c.push_line(&l, 2.0).unwrap();
        c.push(Element::Shunt(Load::Parallel(Rlc::new(
            None,
            Some(1e-6),
            None,
        ))))
        .unwrap();
        assert_eq!(
            c.input_impedance(0.0, &Load::Open),
            Ok(Impedance::ohms(0.0))
        );
    }

    /// Sweep (reflection walk with the lazy renormalisation and the
    /// one-reciprocal output) against the chain-matrix product, in f64 and f32:
    /// 12 lossy sections alternating 5 Ω and 2 kΩ so that (n, d) leave
    /// [2⁻³², 2³²] and are rescaled, plus DC and a quarter-wave point.
    fn sweep_matches_abcd<T: Real>(rtol: f64) {
        let lo = crate::line::rlgc::Rlgc::<T>::constant(
            T::lit(0.3),
            T::lit(5.0 / 2e8),
            T::lit(1e-6),
            T::lit(1.0 / (5.0 * 2e8)),
        )
        .unwrap();
        let hi = crate::line::rlgc::Rlgc::<T>::constant(
            T::lit(2.0),
            T::lit(2000.0 / 2e8),
            T::lit(1e-7),
            T::lit(1.0 / (2000.0 * 2e8)),
        )
        .unwrap();
        let mut c: Cascade<'_, T, 12> = Cascade::new();
        for k in 0..12 {
            let m: &dyn LineModel<T> = if k % 2 == 0 { &lo } else { &hi };
            c.push_line(m, T::lit(0.7 + 0.1 * k as f64)).unwrap();
        }
        let load = Load::Series(Rlc::new(Some(T::lit(30.0)), Some(T::lit(5e-9)), None));
        let freqs: [T; 6] = [
            T::zero(),
            T::lit(1e3),
            T::lit(1e6),
            T::lit(3.3e7),
            T::lit(2e8),
            T::lit(1e9),
        ];
        let mut out = [Impedance::Open; 6];
        c.input_impedance_sweep(&freqs, &load, &mut out).unwrap();
        for (f, z) in freqs.iter().zip(out.iter()) {
            let want = c
                .abcd_at(*f)
                .unwrap()
                .input_impedance(load.impedance_unchecked(*f))
                .unwrap()
                .finite()
                .unwrap();
            let got = z.finite().unwrap();
            let err = (got - want).norm().to_f64_lossless();
            let scale = want.norm().to_f64_lossless();
            assert!(err <= rtol * scale, "f = {f:?}: {got:?} vs {want:?}");
        }
    }

    #[test]
    fn sweep_matches_abcd_across_rescaling() {
        sweep_matches_abcd::<f64>(1e-9);
        sweep_matches_abcd::<f32>(2e-3);
    }

    #[test]
    fn ratio_fast_agrees_with_smith_division() {
        let cases = [
            (Cx::new(1.0f64, 2.0), Cx::new(3.0, -4.0)),
            (Cx::new(1e10, -1e9), Cx::new(1e-12, 1e-11)),
            (Cx::new(1.0, 0.0), Cx::new(1e-30, 0.0)),
            (Cx::new(-0.0, 0.0), Cx::new(2.0, 0.0)),
        ];
        for (n, d) in cases {
            let a = ratio_fast(n, d).unwrap().finite().unwrap();
            let b = ratio_to_impedance(n, d).unwrap().finite().unwrap();
            assert!((a - b).norm() <= 4.0 * f64::EPSILON * b.norm());
            assert!(a.re.is_sign_positive() || a.re != 0.0);
        }
        let zero = Cx::new(0.0f32, 0.0);
        assert_eq!(ratio_fast(Cx::new(1.0f32, 0.0), zero), Ok(Impedance::Open));
        assert_eq!(
            ratio_fast(zero, zero),
            Err(Error::Undefined("input_impedance"))
        );
    }

    #[test]
    fn renormalise_rescales_and_rejects_non_finite() {
        let (n, d) = renormalise(Cx::new(1e20f64, 0.0), Cx::new(0.0, 3e19)).unwrap();
        assert_eq!(n, Cx::new(1.0, 0.0));
        assert!((d.im - 0.3).abs() < 1e-15);
        let kept = renormalise(Cx::new(2.0f32, 0.0), Cx::new(0.5, 0.0)).unwrap();
        assert_eq!(kept, (Cx::new(2.0, 0.0), Cx::new(0.5, 0.0)));
        assert_eq!(
            renormalise(Cx::new(f64::NAN, 1.0), Cx::new(1.0, 0.0)),
            Err(Error::NonFinite("input_impedance"))
        );
        assert_eq!(
            renormalise(Cx::new(1.0, 0.0), Cx::new(f32::INFINITY, 0.0)),
            Err(Error::NonFinite("input_impedance"))
        );
        assert_eq!(
            renormalise(Cx::new(0.0f64, 0.0), Cx::new(0.0, 0.0)),
            Err(Error::Undefined("input_impedance"))
        );
    }

    #[test]
    fn sweep_checks_lengths_and_frequencies() {
        let l = Lossless::<f64>::new(50.0, 0.66).unwrap();
        let mut c: Cascade<'_, f64, 1> = Cascade::new();
        c.push_line(&l, 1.0).unwrap();
        let mut out = [Impedance::Open; 2];
        assert_eq!(
            c.input_impedance_sweep(&[1.0], &Load::Short, &mut out),
            Err(Error::LengthMismatch("out"))
        );
        assert_eq!(
            c.input_impedance_sweep(&[1.0, -1.0], &Load::Short, &mut out),
            Err(Error::Negative("freqs_hz"))
        );
        assert_eq!(
            c.input_impedance_sweep(&[f64::NAN, 1.0], &Load::Short, &mut out),
            Err(Error::NonFinite("freqs_hz"))
        );
        assert!(c
            .input_impedance_sweep(&[1e6, 2e6], &Load::Short, &mut out)
            .is_ok());
    }
}

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
//! Each line model is evaluated once per frequency (one
//! [`LineModel::propagation_lanes`] call per block of up to [`SWEEP_BLOCK`]
//! frequencies gives γ and Zc, part by part). The walk keeps (n, d) for the
//! block in arrays and runs each line section as one loop over the lanes
//! without branches or calls (e^{−2αl} by [`exp_neg_poly`], the phase by
//! [`sin_cos_turns`] in turns), which the compiler vectorises, updating the
//! state in place; one flag per block says whether any lane needs the ABCD map
//! (mapped before the loop, from the old state) or a rescale (done after it),
//! and only then does scalar code visit the lanes. The load and the final n/d
//! are vectorised loops too.
//! A single point is a block of one lane, so sweeps equal their points bit for bit.
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
use crate::line::{LineModel, PropagationLanes};
use crate::math::complex::{self, Cx};
use crate::math::special::{exp_neg_poly, sin_cos_turns};
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
    /// [`SWEEP_BLOCK`], element by element across the block, each line model
    /// called once per block through [`LineModel::propagation_lanes`], in
    /// loops that the compiler vectorises (see the module docs); the only
    /// memory used besides `out` is the block's arrays on the stack (about
    /// 2.9 KiB in f64 and 1.5 KiB in f32, the line model's included; the
    /// firmware check measures the whole sweep's peak stack). `out` holds
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
            self.walk_block(fs, load, os)?;
            start = end;
        }
        Ok(())
    }

    fn zin_checked(&self, f: T, load: &Load<T>) -> Result<Impedance<T>> {
        let mut out = [Impedance::Open];
        self.walk_block(&[f], load, &mut out)?;
        let [z] = out;
        Ok(z)
    }

    /// The load-to-input walk for up to [`SWEEP_BLOCK`] validated frequencies
    /// (one for a single point), the state (n, d) kept part by part in arrays.
    /// Per line section: γ and Zc from [`LineModel::propagation_lanes`], then
    /// one loop over all lanes without branches or calls (e^{−2γl} by
    /// [`exp_neg_poly`] and [`sin_cos_turns`], the reflection step, the
    /// rescale test), which the compiler vectorises, in place; a scalar pass
    /// over the lanes runs only when the block's flags say some lane needs more:
    /// a Zc that is not finite and non-zero (the section's ABCD map, computed
    /// into `held` before the loop) or a state to rescale.
    fn walk_block(&self, freqs: &[T], load: &Load<T>, out: &mut [Impedance<T>]) -> Result<()> {
        let n = freqs.len().min(SWEEP_BLOCK).min(out.len());
        let z0 = [T::zero(); SWEEP_BLOCK];
        let mut f = z0;
        for (d, s) in f.iter_mut().zip(freqs) {
            *d = *s;
        }
        let (mut nr, mut ni, mut dr, mut di) = (z0, z0, z0, z0);
        load_lanes(load, &f, n, &mut nr, &mut ni, &mut dr);
        let mut prop = PropagationLanes::new();
        // The state of lanes whose Zc is not finite, mapped by the ABCD matrix
        // before the vectorised loop overwrites it (rare: DC without leakage).
        let mut held =
            [(Cx::new(T::zero(), T::zero()), Cx::new(T::zero(), T::zero())); SWEEP_BLOCK];
        let eps8 = T::lit(8.0) * T::EPS;
        for e in self.elements.iter().rev() {
            match e {
                Element::Line { model, length_m } => {
                    let l = *length_m;
                    if l == T::zero() {
                        continue;
                    }
                    let fs = f.get(..n).unwrap_or(&[]);
                    model.propagation_lanes(fs, &mut prop)?;
                    let mut all_zc = true;
                    for (i, ok) in prop.zc_ok.iter().enumerate() {
                        all_zc &= *ok | (i >= n);
                    }
                    if !all_zc {
                        // Constant loop bounds (not `0..n`) keep the indexing provably
                        // in range at every opt-level (the firmware's no-panic proof).
                        for i in 0..SWEEP_BLOCK {
                            if i >= n {
                                break;
                            }
                            if !prop.zc_ok[i] {
                                // No finite non-zero Zc (e.g. DC without leakage): the ABCD map.
                                let m = Abcd::line(&model.at(f[i])?, l)?;
                                let (a, b) = (Cx::new(nr[i], ni[i]), Cx::new(dr[i], di[i]));
                                held[i] = normalise(m.a * a + m.b * b, snap_sum(m.c * a, m.d * b))?;
                            }
                        }
                    }
                    let mut all_kept = true;
                    for i in 0..SWEEP_BLOCK {
                        // e^{−2γl}: 2αl nepers, 2βl/(2π) = βl/π turns.
                        let m = exp_neg_poly(T::two() * prop.gamma_re[i] * l);
                        let (sn, cs) = sin_cos_turns(-(prop.gamma_im[i] * l * T::FRAC_1_PI()));
                        let (er, ei) = (m * cs, m * sn);
                        let (cr, ci) = (prop.zc_re[i], prop.zc_im[i]);
                        // Γ_L = (n − Zc·d)/(n + Zc·d), Γin = Γ_L·e, Zin = Zc(1 + Γin)/(1 − Γin),
                        // kept as a ratio; a 1 − Γin within 8ε of its terms is exactly 0 (an open).
                        let zdr = cr * dr[i] - ci * di[i];
                        let zdi = cr * di[i] + ci * dr[i];
                        let (gnr, gni) = (nr[i] - zdr, ni[i] - zdi);
                        let (gdr, gdi) = (nr[i] + zdr, ni[i] + zdi);
                        let ger = gnr * er - gni * ei;
                        let gei = gnr * ei + gni * er;
                        let (ddr, ddi) = (gdr - ger, gdi - gei);
                        let tiny = eps8
                            * max_fast(
                                max_fast(gdr.abs(), gdi.abs()),
                                max_fast(ger.abs(), gei.abs()),
                            );
                        let open = max_fast(ddr.abs(), ddi.abs()) <= tiny;
                        let (sr, si) = (gdr + ger, gdi + gei);
                        nr[i] = cr * sr - ci * si;
                        ni[i] = cr * si + ci * sr;
                        dr[i] = if open { T::zero() } else { ddr };
                        di[i] = if open { T::zero() } else { ddi };
                        all_kept &= kept(nr[i], ni[i], dr[i], di[i]);
                    }
                    if !(all_kept && all_zc) {
                        // The few lanes that need more (and, in a partial block, the
                        // unused lanes' flags): the ABCD result, or a rescale.
                        for i in 0..SWEEP_BLOCK {
                            if i >= n {
                                break;
                            }
                            if !prop.zc_ok[i] {
                                let (p, q) = held[i];
                                (nr[i], ni[i], dr[i], di[i]) = (p.re, p.im, q.re, q.im);
                            } else if !kept(nr[i], ni[i], dr[i], di[i]) {
                                let (p, q) =
                                    normalise(Cx::new(nr[i], ni[i]), Cx::new(dr[i], di[i]))?;
                                (nr[i], ni[i], dr[i], di[i]) = (p.re, p.im, q.re, q.im);
                            }
                        }
                    }
                }
                _ => {
                    for i in 0..SWEEP_BLOCK {
                        if i >= n {
                            break;
                        }
                        let mut st = (Cx::new(nr[i], ni[i]), Cx::new(dr[i], di[i]));
                        step(e, f[i], &mut st)?;
                        (nr[i], ni[i], dr[i], di[i]) = (st.0.re, st.0.im, st.1.re, st.1.im);
                    }
                }
            }
        }
        // n/d: one reciprocal per lane in a vectorised loop; lanes outside its
        // bounds by Smith's division.
        let (mut qr, mut qi) = (z0, z0);
        let mut all_fast = true;
        for i in 0..SWEEP_BLOCK {
            (qr[i], qi[i]) = quotient_fast(nr[i], ni[i], dr[i], di[i]);
            all_fast &= ratio_fast_ok(nr[i], ni[i], dr[i], di[i]);
        }
        for (i, o) in out.iter_mut().enumerate() {
            if i >= n {
                break;
            }
            *o = if all_fast {
                Impedance::Finite(Cx::new(qr[i], qi[i]))
            } else {
                // `quotient_fast` lane by lane (so the same bits), or Smith's.
                ratio_fast(Cx::new(nr[i], ni[i]), Cx::new(dr[i], di[i]))?
            };
        }
        Ok(())
    }
}

/// The load's (n, d) = (Z_L, 1), or (1, 0) for an open, in lanes `0..n` (the
/// rest keep their zeros). Series R-L-C loads by a loop without branches
/// (vectorised); the others lane by lane. The values are those of
/// `Load::impedance_unchecked`, bit for bit.
#[inline(always)]
fn load_lanes<T: Real>(
    load: &Load<T>,
    f: &[T; SWEEP_BLOCK],
    n: usize,
    nr: &mut [T; SWEEP_BLOCK],
    ni: &mut [T; SWEEP_BLOCK],
    dr: &mut [T; SWEEP_BLOCK],
) {
    let zero = T::zero();
    if let Load::Series(rlc) = load {
        let r = rlc.r_ohm.unwrap_or(zero);
        let (has_l, l) = (rlc.l_h.is_some(), rlc.l_h.unwrap_or(zero));
        let (has_c, c) = (rlc.c_f.is_some(), rlc.c_f.unwrap_or(T::one()));
        for i in 0..SWEEP_BLOCK {
            let omega = T::two_pi() * f[i];
            let im_l = zero + omega * l;
            let im = if has_l { im_l } else { zero };
            let wc = omega * c;
            let im_c = im - T::one() / wc;
            let im = if has_c { im_c } else { im };
            // Bitwise `&`/`|` (no short-circuit branches: the loop vectorises).
            let finite = (r.abs() <= T::max_value()) & (im.abs() <= T::max_value());
            let open = (has_c & (wc == zero)) | !finite;
            nr[i] = if open { T::one() } else { r };
            ni[i] = if open { zero } else { im };
            dr[i] = if open { zero } else { T::one() };
        }
        return;
    }
    for i in 0..SWEEP_BLOCK {
        if i >= n {
            break;
        }
        match load.impedance_unchecked(f[i]) {
            Impedance::Open => nr[i] = T::one(),
            Impedance::Finite(z) => {
                nr[i] = z.re;
                ni[i] = z.im;
                dr[i] = T::one();
            }
        }
    }
}

/// The state is left as it is while the sum of its parts' moduli is within
/// [2⁻³², 2³²] (a NaN fails both tests); else it is rescaled.
#[inline(always)]
fn kept<T: Real>(nr: T, ni: T, dr: T, di: T) -> bool {
    let lo = T::lit(2.328_306_436_538_696_3e-10); // 2⁻³²
    let hi = T::lit(4_294_967_296.0); // 2³²
    let msum = (nr.abs() + ni.abs()) + (dr.abs() + di.abs());
    msum >= lo && msum <= hi
}

/// Whether n/d may be taken as n·conj(d)·(1/|d|²) rather than by Smith's two
/// divisions: max(|Re d|, |Im d|) within [2⁻⁶⁰, 2⁶⁰] and |Re n|, |Im n| ≤ 2⁶⁰
/// (|d|² and the products can then neither overflow nor underflow to a loss
/// of accuracy; d = 0 and 0/0 go to `ratio_to_impedance`).
#[inline(always)]
fn ratio_fast_ok<T: Real>(nr: T, ni: T, dr: T, di: T) -> bool {
    let m = max_fast(dr.abs(), di.abs());
    let lo = T::lit(8.673_617_379_884_035e-19); // 2⁻⁶⁰
    let hi = T::lit(1.152_921_504_606_847e18); // 2⁶⁰
    m >= lo && m <= hi && nr.abs() <= hi && ni.abs() <= hi
}

/// n/d = n·conj(d)·(1/|d|²), valid where [`ratio_fast_ok`]; `+ 0` turns a
/// −0 into +0 (as `complex::unsign_zero`, without a compare).
#[inline(always)]
fn quotient_fast<T: Real>(nr: T, ni: T, dr: T, di: T) -> (T, T) {
    let k = T::one() / (dr * dr + di * di);
    (
        (nr * dr + ni * di) * k + T::zero(),
        (ni * dr - nr * di) * k + T::zero(),
    )
}

/// Frequencies processed together by [`Cascade::input_impedance_sweep`].
pub const SWEEP_BLOCK: usize = crate::line::LANES;

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

/// max(a, b) by a plain comparison (no NaN handling: `f64::max` spends
/// several instructions on dropping a NaN operand; here a NaN simply fails
/// the comparison it feeds and the result is checked by the walk's rescale test).
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
    if ratio_fast_ok(n.re, n.im, d.re, d.im) {
        let (re, im) = quotient_fast(n.re, n.im, d.re, d.im);
        return Ok(Impedance::Finite(Cx::new(re, im)));
    }
    ratio_to_impedance(n, d)
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

    /// The vectorised block walk against the textbook formula lane by lane, in
    /// one block that mixes the special lanes: DC on a line without leakage
    /// (Zc open: the ABCD map), the quarter-wave point of a lossless line
    /// (Zin = Zc²/Z_L, Pozar 2012, §2.5), a section of αl ≈ 200 Np (Zin → Zc
    /// without overflow) and ordinary lossy lanes; and sweep = point by point.
    fn block_lanes<T: Real>(tol: T) {
        use crate::line::rlgc::Rlgc;
        let v = T::lit(2e8);
        let quarter = Lossless::<T>::new(T::lit(50.0), T::lit(2.0 / 2.997_924_58)).unwrap();
        let leaky =
            Rlgc::<T>::constant(T::lit(0.1), T::lit(250e-9), T::zero(), T::lit(100e-12)).unwrap();
        let lossy =
            Rlgc::<T>::constant(T::lit(400.0), T::lit(250e-9), T::lit(0.04), T::lit(100e-12))
                .unwrap();
        let load = Load::Resistor(T::lit(100.0));
        // Quarter wave at 50 MHz: l = v/(4f) = 1 m.
        let mut c: Cascade<'_, T, 1> = Cascade::new();
        c.push_line(&quarter, T::one()).unwrap();
        let f_q = v / T::lit(4.0);
        let mut freqs = [T::zero(); SWEEP_BLOCK + 3];
        for (i, f) in freqs.iter_mut().enumerate() {
            *f = f_q * T::from_usize(i + 1) / T::from_usize(4);
        }
        let mut out = [Impedance::Open; SWEEP_BLOCK + 3];
        c.input_impedance_sweep(&freqs, &load, &mut out).unwrap();
        for (f, z) in freqs.iter().zip(out.iter()) {
            assert_eq!(*z, c.input_impedance(*f, &load).unwrap());
        }
        let zq = out[3].finite().unwrap(); // f = f_q
        assert!((zq.re - T::lit(25.0)).abs() < tol * T::lit(25.0), "{zq:?}");
        assert!(zq.im.abs() < tol * T::lit(25.0));
        // DC lane (leaky line without leakage: Zc = ∞) beside lossy lanes.
        let mut c: Cascade<'_, T, 2> = Cascade::new();
        c.push_line(&leaky, T::lit(3.0)).unwrap();
        c.push_line(&lossy, T::lit(2.0)).unwrap();
        let mut freqs = [T::zero(); SWEEP_BLOCK];
        for (i, f) in freqs.iter_mut().enumerate().skip(1) {
            *f = T::lit(1e6) * T::from_usize(i * i);
        }
        let mut out = [Impedance::Open; SWEEP_BLOCK];
        c.input_impedance_sweep(&freqs, &load, &mut out).unwrap();
        for (f, z) in freqs.iter().zip(out.iter()) {
            assert_eq!(*z, c.input_impedance(*f, &load).unwrap());
            // Pozar 2012 §2.7 (terminated lossy line): Zin = Zc (ZL + Zc tanh γl)/(Zc + ZL tanh γl),
            // section by section.
            let mut zl = Cx::new(T::lit(100.0), T::zero());
            for (m, l) in [(&lossy, T::lit(2.0)), (&leaky, T::lit(3.0))] {
                let p = m.at(*f).unwrap();
                zl = match p.zc_ohm {
                    Impedance::Finite(zc) => {
                        let t = complex::tanh(p.gamma_per_m * l);
                        zc * (zl + zc * t) / (zc + zl * t)
                    }
                    // DC without leakage: a series resistance R·l.
                    Impedance::Open => zl + p.z_ohm_per_m * l,
                };
            }
            let got = z.finite().unwrap();
            let err = complex::abs(got - zl) / complex::abs(zl);
            assert!(err < tol, "f = {f:?}: {got:?} vs {zl:?}");
        }
        // αl at 1 GHz: R/(2Zc) ≈ 4 Np/m + G·Zc/2 ≈ 1 Np/m over 2 m ≈ 10 Np,
        // at 225 MHz still above 8 Np: Zin is the lossy section's Zc.
        let p = lossy.at(freqs[SWEEP_BLOCK - 1]).unwrap();
        assert!(p.gamma_per_m.re * T::lit(2.0) > T::lit(8.0));
    }

    /// `load_lanes` gives `Load::impedance_unchecked`'s values bit for bit
    /// (signed zeros included) in every lane, for series R-L-C loads with any
    /// elements present or absent (its vectorised path) and for other loads.
    fn load_lanes_bitwise<T: Real>() {
        let same = |a: T, b: T| a == b && a.is_sign_negative() == b.is_sign_negative();
        let vals = [
            None,
            Some(T::zero()),
            Some(T::lit(1e-12)),
            Some(T::lit(50.0)),
        ];
        let mut f = [T::zero(); SWEEP_BLOCK];
        let picks = [0.0, 1e-30, 1.0, 1e3, 1e6, 1e9, 3e11, 1e30];
        for (i, v) in f.iter_mut().enumerate() {
            *v = T::lit(picks[i % picks.len()]) * T::lit(1.0 + i as f64 / 7.0);
        }
        f[SWEEP_BLOCK - 1] = T::max_value();
        let mut loads = [Load::Open; 64 + 4];
        let mut k = 0;
        for r in vals {
            for l in vals {
                for c in vals {
                    loads[k] = Load::Series(Rlc::new(r, l, c));
                    k += 1;
                }
            }
        }
        loads[64] = Load::Short;
        loads[65] = Load::Resistor(T::lit(75.0));
        loads[66] = Load::Parallel(Rlc::new(Some(T::lit(50.0)), None, Some(T::lit(1e-12))));
        for load in loads.iter() {
            let z0 = [T::zero(); SWEEP_BLOCK];
            let (mut nr, mut ni, mut dr) = (z0, z0, z0);
            load_lanes(load, &f, SWEEP_BLOCK, &mut nr, &mut ni, &mut dr);
            for i in 0..SWEEP_BLOCK {
                let (wr, wi, wd) = match load.impedance_unchecked(f[i]) {
                    Impedance::Open => (T::one(), T::zero(), T::zero()),
                    Impedance::Finite(z) => (z.re, z.im, T::one()),
                };
                assert!(
                    same(nr[i], wr) && same(ni[i], wi) && same(dr[i], wd),
                    "{load:?} f = {:?}: ({:?}, {:?}, {:?}) vs ({wr:?}, {wi:?}, {wd:?})",
                    f[i],
                    nr[i],
                    ni[i],
                    dr[i]
                );
            }
        }
    }

    #[test]
    fn load_lanes_equal_the_scalar_load() {
        load_lanes_bitwise::<f64>();
        load_lanes_bitwise::<f32>();
    }

    #[test]
    fn block_walk_handles_special_lanes() {
        block_lanes::<f64>(1e-12);
        block_lanes::<f32>(2e-4);
    }

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
    fn normalise_rescales_and_rejects_non_finite() {
        let (n, d) = normalise(Cx::new(1e20f64, 0.0), Cx::new(0.0, 3e19)).unwrap();
        assert_eq!(n, Cx::new(1.0, 0.0));
        assert!((d.im - 0.3).abs() < 1e-15);
        assert_eq!(
            normalise(Cx::new(f64::NAN, 1.0), Cx::new(1.0, 0.0)),
            Err(Error::NonFinite("input_impedance"))
        );
        assert_eq!(
            normalise(Cx::new(1.0, 0.0), Cx::new(f32::INFINITY, 0.0)),
            Err(Error::NonFinite("input_impedance"))
        );
        assert_eq!(
            normalise(Cx::new(0.0f64, 0.0), Cx::new(0.0, 0.0)),
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

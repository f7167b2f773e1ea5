//! Quantities typed by people: a number with an optional SI prefix and unit,
//! parsed into SI base units without `std`, heap or panics.
//!
//! Grammar (surrounding white space is ignored):
//!
//! ```text
//! quantity := sign? mantissa exponent? space* suffix?
//! sign     := '+' | '-' | '−'
//! mantissa := digits ('.' digits?)? | '.' digits
//! exponent := ('e' | 'E') sign? digits
//! suffix   := prefix? unit | prefix        (velocity: length '/' time)
//! prefix   := y z a f p n u µ μ m c k M G T  (10⁻²⁴ … 10¹²)
//! ```
//!
//! Units by dimension ([`Unit`]): length `m`, `ft` (also `kft`), `in`, `mil`;
//! time `s`; frequency `Hz`; resistance `Ω`, `ohm`, `ohms`; capacitance `F`;
//! inductance `H`; conductance `S`; voltage `V`; velocity `<length>/<time>`
//! (`m/s`, `m/us`, `ft/ns`); level `dB`; plain numbers `%`. The exact
//! definitions 1 ft = 0.3048 m, 1 in = 0.0254 m and 1 mil = 25.4 µm (the
//! international yard and pound agreement, 1959) convert imperial lengths.
//!
//! `m` is both the metre and the milli prefix: the suffix is first read as a
//! unit of the expected dimension, then as prefix + unit, then as a lone prefix.
//! So `5 m` is 5 metres in a length field, `5 ms` is 5 milliseconds in a time
//! field and `5m` is 0.005 in a plain-number field.
//!
//! The decimal number is converted once, with the prefix folded into its
//! decimal exponent: up to 19 significant digits times a power of ten held as a
//! 64-bit mantissa (products of exactly rounded 10^(±2^i)), then one rounding
//! to the target type. The result is within 1 ulp of a correctly rounded
//! conversion (exact for integers and for most short inputs) in both `f32` and
//! `f64`; the `f32` path uses no double precision.
//!
//! ```
//! use echoline::units::{parse_quantity, Unit};
//! assert_eq!(parse_quantity::<f64>("2.5 ns", Unit::Time)?, 2.5e-9);
//! assert_eq!(parse_quantity::<f32>("4.7p", Unit::Capacitance)?, 4.7e-12);
//! assert_eq!(parse_quantity::<f64>("250 m/us", Unit::Velocity)?, 2.5e8);
//! assert!(parse_quantity::<f64>("5 ms", Unit::Length).is_err());
//! # Ok::<(), echoline::Error>(())
//! ```

use crate::error::{Error, Result, TextPos};
use crate::scalar::Real;

/// Exact metres per international foot.
pub const M_PER_FT: f64 = 0.3048;

/// Metres to feet (1 ft = 0.3048 m exactly).
#[inline]
pub fn m_to_ft<T: Real>(length_m: T) -> T {
    length_m / T::lit(M_PER_FT)
}

/// Feet to metres (1 ft = 0.3048 m exactly).
#[inline]
pub fn ft_to_m<T: Real>(length_ft: T) -> T {
    length_ft * T::lit(M_PER_FT)
}

/// The dimension an input field expects; the parsed value is in its SI unit.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Unit {
    /// A plain number (ratio, factor); accepts a lone prefix (`5m` = 0.005) or `%`.
    Number,
    /// Length, metres (`m`, `ft`, `kft`, `in`, `mil`).
    Length,
    /// Time, seconds (`s`).
    Time,
    /// Frequency, hertz (`Hz`).
    Frequency,
    /// Resistance or impedance magnitude, ohms (`Ω`, `ohm`).
    Resistance,
    /// Capacitance, farads (`F`).
    Capacitance,
    /// Inductance, henries (`H`).
    Inductance,
    /// Conductance, siemens (`S`).
    Conductance,
    /// Voltage, volts (`V`).
    Voltage,
    /// Velocity, m/s (`<length>/<time>`, e.g. `m/us`).
    Velocity,
    /// A level in decibels (`dB`), returned in dB; no prefixes.
    Decibel,
}

impl Unit {
    /// What the field expects, as used in [`Error::Parse`] (e.g. "a unit of time").
    pub const fn describe(self) -> &'static str {
        match self {
            Unit::Number => "a plain number (an SI prefix or % allowed)",
            Unit::Length => "a unit of length (m, ft, in, mil)",
            Unit::Time => "a unit of time (s)",
            Unit::Frequency => "a unit of frequency (Hz)",
            Unit::Resistance => "a unit of resistance (ohm)",
            Unit::Capacitance => "a unit of capacitance (F)",
            Unit::Inductance => "a unit of inductance (H)",
            Unit::Conductance => "a unit of conductance (S)",
            Unit::Voltage => "a unit of voltage (V)",
            Unit::Velocity => "a unit of velocity (length/time, e.g. m/us)",
            Unit::Decibel => "decibels (dB)",
        }
    }

    /// A lower-case name for host code (`"length"`, `"time"`, …).
    pub const fn name(self) -> &'static str {
        match self {
            Unit::Number => "number",
            Unit::Length => "length",
            Unit::Time => "time",
            Unit::Frequency => "frequency",
            Unit::Resistance => "resistance",
            Unit::Capacitance => "capacitance",
            Unit::Inductance => "inductance",
            Unit::Conductance => "conductance",
            Unit::Voltage => "voltage",
            Unit::Velocity => "velocity",
            Unit::Decibel => "decibel",
        }
    }

    /// Every dimension, in declaration order.
    pub const ALL: [Unit; 11] = [
        Unit::Number,
        Unit::Length,
        Unit::Time,
        Unit::Frequency,
        Unit::Resistance,
        Unit::Capacitance,
        Unit::Inductance,
        Unit::Conductance,
        Unit::Voltage,
        Unit::Velocity,
        Unit::Decibel,
    ];

    /// The dimension with this [`Unit::name`], if any.
    pub fn from_name(name: &str) -> Option<Unit> {
        Unit::ALL.into_iter().find(|u| u.name() == name)
    }
}

/// A non-decimal factor of a unit (kept symbolic so `f32` folds it as a literal).
#[derive(Clone, Copy, PartialEq, Eq)]
enum Factor {
    One,
    Foot,
    Inch,
}

impl Factor {
    fn apply<T: Real>(self, x: T) -> T {
        match self {
            Factor::One => x,
            Factor::Foot => x * T::lit(M_PER_FT),
            Factor::Inch => x * T::lit(0.0254),
        }
    }
}

/// Which prefixes a unit symbol takes.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Prefixes {
    None,
    KiloOnly,
    All,
}

/// A unit symbol: its text, decimal shift, non-decimal factor and prefixes.
type Sym = (&'static str, i32, Factor, Prefixes);

const LENGTH: &[Sym] = &[
    ("m", 0, Factor::One, Prefixes::All),
    ("ft", 0, Factor::Foot, Prefixes::KiloOnly),
    ("in", 0, Factor::Inch, Prefixes::None),
    ("mil", -3, Factor::Inch, Prefixes::None),
];
const OHM: &[Sym] = &[
    ("\u{3a9}", 0, Factor::One, Prefixes::All),
    ("\u{2126}", 0, Factor::One, Prefixes::All),
    ("ohm", 0, Factor::One, Prefixes::All),
    ("ohms", 0, Factor::One, Prefixes::All),
    ("Ohm", 0, Factor::One, Prefixes::All),
];

fn symbols(unit: Unit) -> &'static [Sym] {
    match unit {
        Unit::Number => &[("%", -2, Factor::One, Prefixes::None)],
        Unit::Length => LENGTH,
        Unit::Time => &[("s", 0, Factor::One, Prefixes::All)],
        Unit::Frequency => &[("Hz", 0, Factor::One, Prefixes::All)],
        Unit::Resistance => OHM,
        Unit::Capacitance => &[("F", 0, Factor::One, Prefixes::All)],
        Unit::Inductance => &[("H", 0, Factor::One, Prefixes::All)],
        Unit::Conductance => &[("S", 0, Factor::One, Prefixes::All)],
        Unit::Voltage => &[("V", 0, Factor::One, Prefixes::All)],
        Unit::Decibel => &[("dB", 0, Factor::One, Prefixes::None)],
        Unit::Velocity => &[],
    }
}

/// Decimal exponent of an SI prefix character.
fn prefix_exp(c: char) -> Option<i32> {
    Some(match c {
        'y' => -24,
        'z' => -21,
        'a' => -18,
        'f' => -15,
        'p' => -12,
        'n' => -9,
        'u' | '\u{b5}' | '\u{3bc}' => -6,
        'm' => -3,
        'c' => -2,
        'k' => 3,
        'M' => 6,
        'G' => 9,
        'T' => 12,
        _ => return None,
    })
}

/// Splits `s` into a prefix and the rest, if it starts with a prefix character.
fn split_prefix(s: &str) -> Option<(char, i32, &str)> {
    let c = s.chars().next()?;
    let e = prefix_exp(c)?;
    Some((c, e, s.get(c.len_utf8()..)?))
}

/// `s` as a (prefixed) unit of `unit`: (decimal shift, factor).
fn match_unit(s: &str, unit: Unit) -> Option<(i32, Factor)> {
    let syms = symbols(unit);
    if let Some(&(_, p, f, _)) = syms.iter().find(|sym| sym.0 == s) {
        return Some((p, f));
    }
    let (c, e, rest) = split_prefix(s)?;
    syms.iter()
        .find(|sym| {
            sym.0 == rest
                && match sym.3 {
                    Prefixes::All => true,
                    Prefixes::KiloOnly => c == 'k',
                    Prefixes::None => false,
                }
        })
        .map(|&(_, p, f, _)| (p + e, f))
}

/// A lone prefix (`"n"`) as a decimal shift.
fn lone_prefix(s: &str) -> Option<i32> {
    match split_prefix(s) {
        Some((_, e, "")) => Some(e),
        _ => None,
    }
}

/// The whole suffix: (decimal shift, factor). A lone prefix counts only when
/// it touches the number (`4.7p`, not `4.7 p`).
fn match_suffix(s: &str, unit: Unit, spaced: bool) -> Option<(i32, Factor)> {
    if s.is_empty() {
        return Some((0, Factor::One));
    }
    if unit == Unit::Velocity {
        if let Some((num, den)) = s.split_once('/') {
            let (pn, f) = match_unit(num, Unit::Length)?;
            let (pd, _) = match_unit(den, Unit::Time)?;
            return Some((pn - pd, f));
        }
    } else if let Some(m) = match_unit(s, unit) {
        return Some(m);
    }
    if unit == Unit::Decibel || spaced {
        return None;
    }
    lone_prefix(s).map(|e| (e, Factor::One))
}

fn err(column: usize, expected: &'static str) -> Error {
    Error::Parse {
        pos: TextPos {
            line: 1,
            column: u32::try_from(column.saturating_add(1)).unwrap_or(u32::MAX),
        },
        expected,
    }
}

/// A decimal number as read: significant digits, decimal exponent, sign.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
struct Decimal {
    digits: u64,
    exp10: i32,
    negative: bool,
}

/// Digits kept in the mantissa (10¹⁹ < 2⁶⁴).
const MAX_DIGITS: u32 = 19;
/// Exponents beyond this magnitude saturate (the value is 0 or ∞ anyway).
const EXP_LIMIT: i32 = 100_000;

/// Reads a decimal number at the start of `b`; returns it and the bytes used.
fn read_decimal(b: &[u8]) -> Result<(Decimal, usize)> {
    let mut i = 0;
    let mut negative = false;
    match b {
        [b'+', ..] => i = 1,
        [b'-', ..] => {
            negative = true;
            i = 1;
        }
        [0xE2, 0x88, 0x92, ..] => {
            // U+2212 MINUS SIGN, as pasted from typeset text.
            negative = true;
            i = 3;
        }
        _ => {}
    }
    let mut digits: u64 = 0;
    let mut kept: u32 = 0;
    let mut exp10: i32 = 0;
    let mut any = false;
    let mut seen_point = false;
    while let Some(&c) = b.get(i) {
        if c.is_ascii_digit() {
            any = true;
            let d = u64::from(c - b'0');
            if kept < MAX_DIGITS {
                if digits != 0 || d != 0 {
                    digits = digits * 10 + d;
                    kept += 1;
                }
                if seen_point {
                    exp10 -= 1;
                }
            } else if !seen_point {
                exp10 += 1;
            }
        } else if c == b'.' && !seen_point {
            seen_point = true;
        } else {
            break;
        }
        i += 1;
        // Cap the shift from very long digit strings; beyond this the value
        // saturates (exp10 only moves by one per byte, no overflow).
        exp10 = exp10.clamp(-EXP_LIMIT, EXP_LIMIT);
    }
    if !any {
        return Err(err(i, "a number"));
    }
    if let Some(b'e' | b'E') = b.get(i) {
        i += 1;
        let mut eneg = false;
        match b.get(i) {
            Some(b'+') => i += 1,
            Some(b'-') => {
                eneg = true;
                i += 1;
            }
            _ => {}
        }
        let start = i;
        let mut e: i32 = 0;
        while let Some(&c) = b.get(i) {
            if !c.is_ascii_digit() {
                break;
            }
            e = (e * 10 + i32::from(c - b'0')).min(EXP_LIMIT);
            i += 1;
        }
        if i == start {
            return Err(err(i, "digits of the exponent"));
        }
        exp10 += if eneg { -e } else { e };
    }
    Ok((
        Decimal {
            digits,
            exp10,
            negative,
        },
        i,
    ))
}

/// 10^(2^i) as (64-bit mantissa with the top bit set, binary exponent),
/// exactly rounded; i = 0..8.
const POW10_POS: [(u64, i32); 9] = [
    (0xA000000000000000, -60),
    (0xC800000000000000, -57),
    (0x9C40000000000000, -50),
    (0xBEBC200000000000, -37),
    (0x8E1BC9BF04000000, -10),
    (0x9DC5ADA82B70B59E, 43),
    (0xC2781F49FFCFA6D5, 149),
    (0x93BA47C980E98CE0, 362),
    (0xAA7EEBFB9DF9DE8E, 787),
];
/// 10^-(2^i), as [`POW10_POS`].
const POW10_NEG: [(u64, i32); 9] = [
    (0xCCCCCCCCCCCCCCCD, -67),
    (0xA3D70A3D70A3D70A, -70),
    (0xD1B71758E219652C, -77),
    (0xABCC77118461CEFD, -90),
    (0xE69594BEC44DE15B, -117),
    (0xCFB11EAD453994BA, -170),
    (0xA87FEA27A539E9A5, -276),
    (0xDDD0467C64BCE4A1, -489),
    (0xC0314325637A193A, -914),
];

/// Product of two normalised mantissas, normalised again; `sticky` keeps a
/// nonzero remainder visible in the lowest bit (for the final rounding).
fn mul(a: (u64, i32), b: (u64, i32), sticky: bool) -> (u64, i32) {
    let p = u128::from(a.0) * u128::from(b.0);
    let shift = if p >> 127 != 0 { 64 } else { 63 };
    let hi = (p >> shift) as u64;
    let rem = p & ((1u128 << shift) - 1);
    let e = a.1 + b.1 + shift;
    if sticky {
        (hi | u64::from(rem != 0), e)
    } else if rem >> (shift - 1) != 0 {
        // Round to nearest; a carry out renormalises.
        match hi.checked_add(1) {
            Some(h) => (h, e),
            None => (1 << 63, e + 1),
        }
    } else {
        (hi, e)
    }
}

/// x · 2^e without intermediate overflow/underflow, in steps of at most 2^60.
fn scale2<T: Real>(mut x: T, mut e: i32) -> T {
    let step = |k: i32| -> T {
        let p: T = num_traits::NumCast::from(1u64 << k.unsigned_abs()).unwrap_or(T::one());
        if k < 0 {
            T::one() / p
        } else {
            p
        }
    };
    while e != 0 && x != T::zero() && x.is_finite() {
        let k = e.clamp(-60, 60);
        x = x * step(k);
        e -= k;
    }
    x
}

/// 5^n for n ≤ 27 (the largest power of five below 2^63), exact.
fn pow5(n: u32) -> u64 {
    (0..n.min(27)).fold(1u64, |p, _| p * 5)
}

/// w · 10^e as a normalised 64-bit mantissa and binary exponent, the lowest
/// bit sticky (set when anything nonzero lies below it). Exact (before the
/// sticky bit) for |e| ≤ 27: 5^27 < 2^63 fits one word, and w · 10^-n is one
/// 128-by-64-bit division. Otherwise a product with the rounded powers of
/// [`POW10_POS`]/[`POW10_NEG`], relative error below 2^-60.
fn scaled_mantissa(w: u64, e: i32) -> (u64, i32) {
    let lz = w.leading_zeros();
    let m = (w << lz, -(lz as i32));
    let n = e.unsigned_abs();
    if e == 0 {
        return m;
    }
    if n <= 27 {
        let p5 = pow5(n);
        if e > 0 {
            // 10^n = 5^n · 2^n, 5^n normalised is exact.
            let plz = p5.leading_zeros();
            return mul(m, (p5 << plz, n as i32 - plz as i32), true);
        }
        // m / 5^n: the quotient of (m · 2^64) has 65..128 bits.
        let num = u128::from(m.0) << 64;
        let q = num / u128::from(p5);
        let rem = num % u128::from(p5);
        let shift = 64 - q.leading_zeros();
        let kept = (q >> shift) as u64;
        let lost = q & ((1u128 << shift) - 1);
        let sticky = u64::from(rem != 0 || lost != 0);
        return (kept | sticky, m.1 - 64 + shift as i32 - n as i32);
    }
    let table = if e < 0 { &POW10_NEG } else { &POW10_POS };
    // Build the power of ten first (rounded products), then apply it once
    // with a sticky bit so the final rounding sees the true remainder.
    let mut p: Option<(u64, i32)> = None;
    for (i, &t) in table.iter().enumerate() {
        if n & (1 << i) != 0 {
            p = Some(match p {
                None => t,
                Some(q) => mul(q, t, false),
            });
        }
    }
    match p {
        Some(p) => mul(m, p, true),
        None => m,
    }
}

/// m · 2^e (m with its top bit set, lowest bit sticky) rounded once to the
/// nearest `T`, ties to even, including the subnormal range.
fn round_to<T: Real>(m: u64, e: i32) -> T {
    // Weight of the lowest subnormal bit of T (2^-149 for f32, 2^-1074 for f64)
    // and its precision p, from the bits of the smallest normal number.
    let (mant, lsb_exp, _) = T::min_positive_value().integer_decode();
    let p = 64 - mant.leading_zeros() as i32;
    // Bit 0 of m weighs 2^e; rounded to the type the last kept bit weighs
    // 2^(e + 64 - p) for a normal result and 2^lsb_exp for a subnormal one.
    let k = i64::from(lsb_exp) - i64::from(e);
    if k <= i64::from(64 - p) {
        let x: T = num_traits::NumCast::from(m).unwrap_or(T::zero());
        return scale2(x, e);
    }
    // Subnormal: round at the bit of weight 2^lsb_exp ourselves, then scale exactly.
    let (keep, round_up) = if k >= 64 {
        (0, k == 64 && m > 1 << 63)
    } else {
        let keep = m >> k;
        let rem = m & ((1u64 << k) - 1);
        let half = 1u64 << (k - 1);
        (keep, rem > half || (rem == half && keep & 1 == 1))
    };
    let keep = keep + u64::from(round_up);
    let x: T = num_traits::NumCast::from(keep).unwrap_or(T::zero());
    scale2(x, i32::from(lsb_exp))
}

/// The decimal as the nearest `T` (within 1 ulp), before unit factors.
fn to_float<T: Real>(d: Decimal) -> T {
    let mag = if d.digits == 0 {
        T::zero()
    } else {
        // Beyond ±400 every input saturates to 0 or ∞ (≤ 19 digits).
        let (m, e) = scaled_mantissa(d.digits, d.exp10.clamp(-400, 400));
        round_to::<T>(m, e)
    };
    if d.negative {
        -mag
    } else {
        mag
    }
}

/// Parses `text` as a quantity of dimension `expected`, in SI base units
/// (metres, seconds, hertz, ohms, farads, henries, siemens, volts, m/s; dB for
/// [`Unit::Decibel`]; the plain value for [`Unit::Number`]).
///
/// Errors are [`Error::Parse`] at line 1 and the 1-based byte column of the
/// problem: no number (`"a number"`), an exponent without digits, a suffix
/// that is not a unit of the expected dimension ([`Unit::describe`]),
/// anything after the unit (`"the end of the input"`), or a value that is not
/// finite in `T` (`"a finite number"`, column of the number).
pub fn parse_quantity<T: Real>(text: &str, expected: Unit) -> Result<T> {
    let b = text.as_bytes();
    let start = b
        .iter()
        .position(|c| !c.is_ascii_whitespace())
        .unwrap_or(b.len());
    let end = b
        .iter()
        .rposition(|c| !c.is_ascii_whitespace())
        .map_or(start, |i| i + 1);
    let body = b.get(start..end).unwrap_or(&[]);
    let (dec, used) = read_decimal(body).map_err(|e| shift_err(e, start))?;
    let rest = body.get(used..).unwrap_or(&[]);
    let spaces = rest.iter().take_while(|c| **c == b' ').count();
    let suffix_at = start + used + spaces;
    let suffix = text
        .get(suffix_at..start + body.len())
        .ok_or_else(|| err(suffix_at, expected.describe()))?;
    let (token, after) = match suffix.find(|c: char| c.is_ascii_whitespace()) {
        Some(i) => (suffix.get(..i).unwrap_or(""), Some(i)),
        None => (suffix, None),
    };
    let (shift, factor) = match_suffix(token, expected, spaces > 0)
        .ok_or_else(|| err(suffix_at, expected.describe()))?;
    if let Some(i) = after {
        let tail = suffix.get(i..).unwrap_or("");
        let ws = tail.len() - tail.trim_start().len();
        return Err(err(suffix_at + i + ws, "the end of the input"));
    }
    let value = to_float::<T>(Decimal {
        exp10: dec.exp10.saturating_add(shift),
        ..dec
    });
    let value = factor.apply(value);
    if value.is_finite() {
        Ok(value)
    } else {
        Err(err(start, "a finite number"))
    }
}

fn shift_err(e: Error, by: usize) -> Error {
    match e {
        Error::Parse { pos, expected } => Error::Parse {
            pos: TextPos {
                line: pos.line,
                column: pos
                    .column
                    .saturating_add(u32::try_from(by).unwrap_or(u32::MAX)),
            },
            expected,
        },
        other => other,
    }
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;
    use std::format;
    use std::string::String;

    fn p64(s: &str, u: Unit) -> f64 {
        parse_quantity::<f64>(s, u).unwrap_or_else(|e| panic!("{s:?}: {e}"))
    }
    fn p32(s: &str, u: Unit) -> f32 {
        parse_quantity::<f32>(s, u).unwrap_or_else(|e| panic!("{s:?}: {e}"))
    }
    fn col(s: &str, u: Unit) -> (u32, &'static str) {
        match parse_quantity::<f64>(s, u) {
            Err(Error::Parse { pos, expected }) => {
                assert_eq!(pos.line, 1);
                (pos.column, expected)
            }
            other => panic!("{s:?}: expected a parse error, got {other:?}"),
        }
    }

    #[test]
    fn examples_from_the_field() {
        // SI prefixes (BIPM, The International System of Units, 9th ed., 2019,
        // Table 7); 1 ft = 0.3048 m, 1 in = 25.4 mm exactly (1959 agreement).
        // Each decimal result is compared with Rust's own correctly rounded
        // parse of the equivalent literal.
        let cases: &[(&str, Unit, &str)] = &[
            ("2.5 ns", Unit::Time, "2.5e-9"),
            ("1.2 GHz", Unit::Frequency, "1.2e9"),
            ("4.7p", Unit::Capacitance, "4.7e-12"),
            ("4.7 pF", Unit::Capacitance, "4.7e-12"),
            ("50 Ω", Unit::Resistance, "50"),
            ("50 Ω", Unit::Resistance, "50"),
            ("50 ohm", Unit::Resistance, "50"),
            ("2.2kohm", Unit::Resistance, "2.2e3"),
            ("1 MΩ", Unit::Resistance, "1e6"),
            ("3.5 mm", Unit::Length, "3.5e-3"),
            ("5 m", Unit::Length, "5"),
            ("5m", Unit::Length, "5"),
            ("12 km", Unit::Length, "12e3"),
            ("5 ms", Unit::Time, "5e-3"),
            ("5m", Unit::Number, "5e-3"),
            ("5m", Unit::Time, "5e-3"),
            ("-20 dB", Unit::Decibel, "-20"),
            ("0.66", Unit::Number, "0.66"),
            ("66 %", Unit::Number, "0.66"),
            ("1e-9 s", Unit::Time, "1e-9"),
            ("250 m/us", Unit::Velocity, "2.5e8"),
            ("200 m/µs", Unit::Velocity, "2e8"),
            ("0.2 m/ns", Unit::Velocity, "2e8"),
            ("2e8", Unit::Velocity, "2e8"),
            ("10 uH", Unit::Inductance, "1e-5"),
            ("10 µH", Unit::Inductance, "1e-5"),
            ("10 μH", Unit::Inductance, "1e-5"),
            ("3 mS", Unit::Conductance, "3e-3"),
            ("48 V", Unit::Voltage, "48"),
            ("1 ys", Unit::Time, "1e-24"),
            ("7 zs", Unit::Time, "7e-21"),
            ("7 as", Unit::Time, "7e-18"),
            ("7 fs", Unit::Time, "7e-15"),
            ("2 cm", Unit::Length, "0.02"),
            ("3 TΩ", Unit::Resistance, "3e12"),
            ("  +.5e+1ns  ", Unit::Time, "5e-9"),
            ("−3 dB", Unit::Decibel, "-3"),
            ("7.", Unit::Number, "7"),
        ];
        for &(s, u, want) in cases {
            let w64: f64 = want.parse().unwrap();
            let w32: f32 = want.parse().unwrap();
            assert_eq!(p64(s, u), w64, "{s}");
            assert_eq!(p32(s, u), w32, "{s}");
        }
    }

    #[test]
    fn imperial_lengths_convert_exactly_defined_factors() {
        // 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 mil = 0.001 in (1959 agreement).
        assert_eq!(p64("120 ft", Unit::Length), 120.0 * 0.3048);
        assert_eq!(p64("1 kft", Unit::Length), 1000.0 * 0.3048);
        assert_eq!(p64("2 in", Unit::Length), 2.0 * 0.0254);
        approx::assert_relative_eq!(
            p64("4 mil", Unit::Length),
            4.0 * 25.4e-6,
            max_relative = 3e-16
        );
        approx::assert_relative_eq!(p32("120 ft", Unit::Length), 36.576, max_relative = 1e-7);
        approx::assert_relative_eq!(
            p64("1 ft/ns", Unit::Velocity),
            3.048e8,
            max_relative = 3e-16
        );
        approx::assert_relative_eq!(m_to_ft(36.576f64), 120.0, max_relative = 1e-15);
        approx::assert_relative_eq!(ft_to_m(120.0f32), 36.576, max_relative = 1e-7);
        // Prefixes other than k are not taken on feet, none on inches.
        assert_eq!(col("1 Mft", Unit::Length).0, 3);
        assert_eq!(col("1 min", Unit::Length).0, 3);
    }

    #[test]
    fn errors_carry_the_byte_column() {
        assert_eq!(col("", Unit::Time), (1, "a number"));
        assert_eq!(col("   ", Unit::Time), (4, "a number"));
        assert_eq!(col("ns", Unit::Time), (1, "a number"));
        assert_eq!(col("-", Unit::Time), (2, "a number"));
        assert_eq!(col(".", Unit::Number), (2, "a number"));
        assert_eq!(col("  nan", Unit::Number), (3, "a number"));
        assert_eq!(col("inf", Unit::Number), (1, "a number"));
        assert_eq!(col("5 ms", Unit::Length), (3, Unit::Length.describe()));
        // A lone prefix must touch the number: "5 m" is not 5 ms.
        assert_eq!(col("5 m", Unit::Time), (3, Unit::Time.describe()));
        assert_eq!(col("5 m", Unit::Number), (3, Unit::Number.describe()));
        assert_eq!(col("5 Hz", Unit::Time), (3, "a unit of time (s)"));
        assert_eq!(col("1e", Unit::Time), (3, "digits of the exponent"));
        assert_eq!(col("1e+x", Unit::Time), (4, "digits of the exponent"));
        assert_eq!(col("5 ns x", Unit::Time), (6, "the end of the input"));
        assert_eq!(col("5 ns  x", Unit::Time), (7, "the end of the input"));
        assert_eq!(col("5 5", Unit::Time), (3, Unit::Time.describe()));
        assert_eq!(col("1.2.3", Unit::Number), (4, Unit::Number.describe()));
        assert_eq!(col("5 mdB", Unit::Decibel), (3, "decibels (dB)"));
        assert_eq!(col("5 m", Unit::Decibel), (3, "decibels (dB)"));
        assert_eq!(col("5 m/x", Unit::Velocity).0, 3);
        assert_eq!(col("5 Ωx", Unit::Resistance).0, 3);
        // Multi-byte characters count as their bytes.
        assert_eq!(col("µ5", Unit::Number).0, 1);
        assert_eq!(col("5 µ µs", Unit::Time).0, 3);
        assert_eq!(col("5 µs µ", Unit::Time), (7, "the end of the input"));
        // Non-finite results.
        assert_eq!(col("1e309", Unit::Number), (1, "a finite number"));
    }

    #[test]
    fn overflow_depends_on_the_type() {
        assert_eq!(p64("4e38", Unit::Number), 4e38);
        assert!(matches!(
            parse_quantity::<f32>("4e38", Unit::Number),
            Err(Error::Parse {
                expected: "a finite number",
                ..
            })
        ));
        assert!(parse_quantity::<f32>("400 TΩ", Unit::Resistance).is_ok());
        assert!(parse_quantity::<f32>("1e30 T", Unit::Number).is_err());
        assert_eq!(p64("1e-400", Unit::Number), 0.0);
        assert_eq!(p32("1e-50", Unit::Number), 0.0);
    }

    #[test]
    fn huge_exponents_and_long_digit_strings_saturate_without_panic() {
        assert!(parse_quantity::<f64>("1e99999999999999", Unit::Number).is_err());
        assert_eq!(p64("1e-99999999999999", Unit::Number), 0.0);
        assert_eq!(p64("0e99999999999", Unit::Number), 0.0);
        let long = format!("0.{}1", "0".repeat(200_000));
        assert_eq!(p64(&long, Unit::Number), 0.0);
        let long = format!("1{}", "0".repeat(400));
        assert!(parse_quantity::<f64>(&long, Unit::Number).is_err());
        let digits = "12345678901234567890123456789";
        assert_eq!(p64(digits, Unit::Number), digits.parse::<f64>().unwrap());
        assert_eq!(p64("-0", Unit::Number).to_bits(), (-0.0f64).to_bits());
    }

    #[test]
    fn unit_names_round_trip() {
        for u in Unit::ALL {
            assert_eq!(Unit::from_name(u.name()), Some(u));
        }
        assert_eq!(Unit::from_name("furlong"), None);
    }

    /// Distance in ulps between two finite floats of the same kind (as bits).
    fn ulps(a: i64, b: i64) -> u64 {
        let key = |x: i64| if x < 0 { i64::MIN - x } else { x };
        key(a).abs_diff(key(b))
    }

    /// A small xorshift generator (deterministic, no dependency).
    struct Rng(u64);
    impl Rng {
        fn next(&mut self) -> u64 {
            self.0 ^= self.0 << 13;
            self.0 ^= self.0 >> 7;
            self.0 ^= self.0 << 17;
            self.0
        }
        fn below(&mut self, n: u64) -> u64 {
            self.next() % n
        }
    }

    fn random_number(r: &mut Rng) -> String {
        let mut s = String::new();
        match r.below(4) {
            0 => s.push('-'),
            1 => s.push('+'),
            _ => {}
        }
        let long = r.below(8) == 0;
        let int_digits = r.below(if long { 30 } else { 8 });
        let long = r.below(8) == 0;
        let frac_digits = r.below(if long { 30 } else { 8 });
        for _ in 0..int_digits {
            s.push(char::from(b'0' + r.below(10) as u8));
        }
        if frac_digits > 0 || int_digits == 0 {
            s.push('.');
            for _ in 0..frac_digits.max(u64::from(int_digits == 0)) {
                s.push(char::from(b'0' + r.below(10) as u8));
            }
        }
        if r.below(2) == 0 {
            s.push(if r.below(2) == 0 { 'e' } else { 'E' });
            let range = if r.below(4) == 0 { 700 } else { 40 };
            let e = r.below(range) as i64 - (range as i64) / 2;
            s.push_str(&format!("{e}"));
        }
        s
    }

    #[test]
    fn random_plain_numbers_agree_with_std_within_one_ulp() {
        // Property: for any plain decimal, the result is within 1 ulp of
        // Rust's correctly rounded `str::parse` (f64 and f32); it is equal to
        // it on the exact path (≤ 19 significant digits, |decimal exponent| ≤ 27)
        // and in the vast majority of all cases.
        let mut r = Rng(0x9E37_79B9_7F4A_7C15);
        let (mut n64, mut n32, mut exact64, mut exact32) = (0u32, 0u32, 0u32, 0u32);
        for _ in 0..200_000 {
            let s = random_number(&mut r);
            let want64: f64 = s.parse().unwrap();
            let want32: f32 = s.parse().unwrap();
            let exact_path = on_exact_path(&s);
            match parse_quantity::<f64>(&s, Unit::Number) {
                Ok(v) => {
                    let d = ulps(v.to_bits() as i64, want64.to_bits() as i64);
                    assert!(d <= 1, "{s}: {v:e} vs {want64:e}");
                    assert!(d == 0 || !exact_path, "{s}: {v:e} vs {want64:e}");
                    exact64 += u32::from(d == 0);
                    n64 += 1;
                }
                Err(_) => assert!(!want64.is_finite(), "{s}"),
            }
            match parse_quantity::<f32>(&s, Unit::Number) {
                Ok(v) => {
                    let d = ulps(
                        i64::from(v.to_bits() as i32),
                        i64::from(want32.to_bits() as i32),
                    );
                    assert!(d <= 1, "{s}: {v:e} vs {want32:e}");
                    assert!(d == 0 || !exact_path, "{s}: {v:e} vs {want32:e}");
                    exact32 += u32::from(d == 0);
                    n32 += 1;
                }
                Err(_) => assert!(!want32.is_finite(), "{s}"),
            }
        }
        // Measured: 22 of about 189 000 finite f64 results are 1 ulp off (long
        // digit strings, exponents beyond ±27), none of the f32 results.
        assert!(n64 > 150_000 && n32 > 150_000);
        assert!(
            f64::from(exact64) / f64::from(n64) > 0.9995,
            "{exact64}/{n64}"
        );
        assert!(
            f64::from(exact32) / f64::from(n32) > 0.9995,
            "{exact32}/{n32}"
        );
    }

    /// ≤ 19 significant digits and a decimal exponent (of the integer of
    /// those digits) within ±27.
    fn on_exact_path(s: &str) -> bool {
        let s = s.trim_start_matches(['+', '-']);
        let (mant, exp) = match s.find(['e', 'E']) {
            Some(i) => (&s[..i], s[i + 1..].parse::<i64>().unwrap()),
            None => (s, 0),
        };
        let (int, frac) = mant.split_once('.').unwrap_or((mant, ""));
        let all = format!("{int}{frac}");
        let sig = all.trim_start_matches('0');
        sig.is_empty() || (sig.len() <= 19 && (exp - frac.len() as i64).abs() <= 27)
    }

    #[test]
    fn random_garbage_never_panics() {
        // Any byte soup returns Ok or a parse error with a column inside the text.
        let alphabet = [
            "1", "0", ".", "e", "E", "-", "+", " ", "m", "µ", "Ω", "/", "s", "k", "x", "%", "\t",
        ];
        let mut r = Rng(12345);
        for _ in 0..50_000 {
            let mut s = String::new();
            for _ in 0..r.below(10) {
                s.push_str(alphabet[r.below(alphabet.len() as u64) as usize]);
            }
            for u in Unit::ALL {
                match parse_quantity::<f32>(&s, u) {
                    Ok(v) => assert!(v.is_finite()),
                    Err(Error::Parse { pos, .. }) => {
                        assert!(
                            pos.column >= 1 && pos.column as usize <= s.len() + 1,
                            "{s:?}"
                        )
                    }
                    Err(e) => panic!("{s:?}: {e:?}"),
                }
            }
        }
    }
}

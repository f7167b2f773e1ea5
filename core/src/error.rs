//! The crate's error type: small, `Copy`, and naming the offending parameter.
//!
//! Every fallible public function returns [`Result`]. Non-finite or out-of-range
//! input is rejected at the boundary with the name of the parameter as it
//! appears in the API (`"length_m"`, `"freq_hz"`), so firmware can log it without
//! formatting floats.

use core::fmt;

use crate::scalar::Real;

/// Shorthand for `core::result::Result<T, echoline::Error>`.
pub type Result<T> = core::result::Result<T, Error>;

/// Where in a text input a parse error happened (1-based line and column).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct TextPos {
    /// Line number, starting at 1.
    pub line: u32,
    /// Column (byte offset in the line), starting at 1.
    pub column: u32,
}

/// Everything that can go wrong, each case naming the parameter it concerns.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[non_exhaustive]
pub enum Error {
    /// A value was NaN or ±∞.
    NonFinite(&'static str),
    /// A value had to be strictly greater than zero.
    NotPositive(&'static str),
    /// A value had to be zero or greater.
    Negative(&'static str),
    /// A value lies outside the documented valid range.
    OutOfRange(&'static str),
    /// A fixed-capacity container or caller buffer is too small.
    Capacity {
        /// What overflowed.
        what: &'static str,
        /// Its capacity.
        capacity: usize,
    },
    /// An input holds too few samples or points.
    TooShort {
        /// The input.
        what: &'static str,
        /// How many are needed at least.
        needed: usize,
    },
    /// Two inputs that must have the same length do not.
    LengthMismatch(&'static str),
    /// An element at a given index breaks a rule (e.g. a non-increasing frequency).
    BadIndex {
        /// The input.
        what: &'static str,
        /// The first offending index.
        index: usize,
    },
    /// The quantity does not exist for this input (e.g. Z-parameters of a lone
    /// series element, the characteristic impedance of a lossless line at DC).
    Undefined(&'static str),
    /// A model or solver was asked for something outside what it can reach
    /// (e.g. a target impedance no width can give).
    Unreachable(&'static str),
    /// An iterative method did not converge in its iteration budget.
    NoConvergence(&'static str),
    /// Text input did not follow its grammar.
    Parse {
        /// Where.
        pos: TextPos,
        /// What was expected there.
        expected: &'static str,
    },
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            Error::NonFinite(p) => write!(f, "{p} is not a finite number"),
            Error::NotPositive(p) => write!(f, "{p} must be greater than zero"),
            Error::Negative(p) => write!(f, "{p} must not be negative"),
            Error::OutOfRange(p) => write!(f, "{p} is outside its valid range"),
            Error::Capacity { what, capacity } => {
                write!(f, "{what} exceeds its capacity of {capacity}")
            }
            Error::TooShort { what, needed } => {
                write!(f, "{what} is too short: at least {needed} needed")
            }
            Error::LengthMismatch(p) => write!(f, "{p}: lengths do not match"),
            Error::BadIndex { what, index } => write!(f, "{what}: bad value at index {index}"),
            Error::Undefined(p) => write!(f, "{p} is not defined for this input"),
            Error::Unreachable(p) => write!(f, "{p} cannot be reached within the model's range"),
            Error::NoConvergence(p) => write!(f, "{p} did not converge"),
            Error::Parse { pos, expected } => {
                write!(
                    f,
                    "line {}, column {}: expected {expected}",
                    pos.line, pos.column
                )
            }
        }
    }
}

#[cfg(feature = "std")]
extern crate std;
#[cfg(feature = "std")]
impl std::error::Error for Error {}

#[cfg(feature = "defmt")]
impl defmt::Format for Error {
    fn format(&self, f: defmt::Formatter) {
        match *self {
            Error::NonFinite(p) => defmt::write!(f, "{=str} not finite", p),
            Error::NotPositive(p) => defmt::write!(f, "{=str} not > 0", p),
            Error::Negative(p) => defmt::write!(f, "{=str} negative", p),
            Error::OutOfRange(p) => defmt::write!(f, "{=str} out of range", p),
            Error::Capacity { what, capacity } => {
                defmt::write!(f, "{=str} over capacity {=usize}", what, capacity)
            }
            Error::TooShort { what, needed } => {
                defmt::write!(f, "{=str} too short, need {=usize}", what, needed)
            }
            Error::LengthMismatch(p) => defmt::write!(f, "{=str} length mismatch", p),
            Error::BadIndex { what, index } => {
                defmt::write!(f, "{=str} bad at {=usize}", what, index)
            }
            Error::Undefined(p) => defmt::write!(f, "{=str} undefined", p),
            Error::Unreachable(p) => defmt::write!(f, "{=str} unreachable", p),
            Error::NoConvergence(p) => defmt::write!(f, "{=str} no convergence", p),
            Error::Parse { pos, expected } => {
                defmt::write!(
                    f,
                    "{=u32}:{=u32} expected {=str}",
                    pos.line,
                    pos.column,
                    expected
                )
            }
        }
    }
}

/// Returns `x` if it is finite, else [`Error::NonFinite`] naming `param`.
#[inline]
pub fn finite<T: Real>(x: T, param: &'static str) -> Result<T> {
    if x.is_finite() {
        Ok(x)
    } else {
        Err(Error::NonFinite(param))
    }
}

/// Returns `x` if it is finite and `> 0`.
#[inline]
pub fn positive<T: Real>(x: T, param: &'static str) -> Result<T> {
    let x = finite(x, param)?;
    if x > T::zero() {
        Ok(x)
    } else {
        Err(Error::NotPositive(param))
    }
}

/// Returns `x` if it is finite and `>= 0`.
#[inline]
pub fn non_negative<T: Real>(x: T, param: &'static str) -> Result<T> {
    let x = finite(x, param)?;
    if x >= T::zero() {
        Ok(x)
    } else {
        Err(Error::Negative(param))
    }
}

/// Returns `x` if it is finite and within `[lo, hi]`.
#[inline]
pub fn in_range<T: Real>(x: T, lo: T, hi: T, param: &'static str) -> Result<T> {
    let x = finite(x, param)?;
    if x >= lo && x <= hi {
        Ok(x)
    } else {
        Err(Error::OutOfRange(param))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn validators_name_the_parameter() {
        assert_eq!(
            finite(f64::NAN, "length_m"),
            Err(Error::NonFinite("length_m"))
        );
        assert_eq!(
            positive(0.0f32, "freq_hz"),
            Err(Error::NotPositive("freq_hz"))
        );
        assert_eq!(
            non_negative(-1.0f64, "r_ohm"),
            Err(Error::Negative("r_ohm"))
        );
        assert_eq!(
            in_range(0.5f64, 1.0, 2.0, "eps_r"),
            Err(Error::OutOfRange("eps_r"))
        );
        assert_eq!(positive(f32::INFINITY, "x"), Err(Error::NonFinite("x")));
        assert_eq!(in_range(1.5f64, 1.0, 2.0, "eps_r"), Ok(1.5));
    }

    #[test]
    fn errors_are_small_and_copy() {
        fn is_copy<T: Copy>() {}
        is_copy::<Error>();
        assert!(core::mem::size_of::<Error>() <= 32);
    }
}

//! Shared text helpers of the sweep readers: tokens with their columns, plain
//! decimal numbers, and parse errors carrying line and column.
//!
//! Numbers are read by [`crate::units::parse_quantity`] with
//! [`crate::units::Unit::Number`] (one rounding, within 1 ulp of the correctly
//! rounded value, no double precision on the `f32` path) after checking that
//! the token holds only `0-9 + - . e E`, so a prefix such as `5m` or a `%` is
//! rejected here, as the file grammars require.

use crate::error::{Error, Result, TextPos};
use crate::scalar::Real;
use crate::units::{parse_quantity, Unit};

/// A parse error at a 1-based line and a 0-based byte offset in that line.
pub(crate) fn err_at(line: u32, offset: usize, expected: &'static str) -> Error {
    Error::Parse {
        pos: TextPos {
            line,
            column: u32::try_from(offset.saturating_add(1)).unwrap_or(u32::MAX),
        },
        expected,
    }
}

/// Lines of `s` split at `\n`, each without a trailing `\r` (like
/// `str::lines`, written with checked slicing only).
pub(crate) fn lines(s: &str) -> impl Iterator<Item = &str> {
    let mut rest = Some(s);
    core::iter::from_fn(move || {
        let r = rest?;
        let (line, next) = match r.find('\n') {
            Some(i) => (r.get(..i).unwrap_or(""), r.get(i + 1..)),
            None => (r, None),
        };
        rest = next.filter(|t| !t.is_empty());
        if next.is_none() && line.is_empty() {
            return None;
        }
        Some(line.strip_suffix('\r').unwrap_or(line))
    })
}

/// The part of a line before a comment character `c` (e.g. `!`).
#[inline]
pub(crate) fn before_comment(line: &str, c: u8) -> &str {
    match line.as_bytes().iter().position(|b| *b == c) {
        Some(i) => line.get(..i).unwrap_or(""),
        None => line,
    }
}

/// Iterator over white-space separated tokens of a line, each with its byte
/// offset in the line.
#[derive(Clone, Debug)]
pub(crate) struct Tokens<'a> {
    s: &'a str,
    i: usize,
}

impl<'a> Tokens<'a> {
    /// Tokens of `s`, starting at offset 0.
    pub(crate) fn new(s: &'a str) -> Self {
        Tokens { s, i: 0 }
    }
}

impl<'a> Iterator for Tokens<'a> {
    type Item = (usize, &'a str);
    fn next(&mut self) -> Option<(usize, &'a str)> {
        let b = self.s.as_bytes();
        let rest = b.get(self.i..)?;
        let skip = rest.iter().position(|c| !c.is_ascii_whitespace())?;
        let start = self.i + skip;
        let len = b
            .get(start..)?
            .iter()
            .position(|c| c.is_ascii_whitespace())
            .unwrap_or(b.len() - start);
        self.i = start + len;
        self.s.get(start..start + len).map(|t| (start, t))
    }
}

/// A plain decimal number (`[+-]digits[.digits][e[+-]digits]`), finite in `T`.
#[inline]
pub(crate) fn number<T: Real>(tok: &str) -> Option<T> {
    let b = tok.as_bytes();
    if b.is_empty()
        || !b
            .iter()
            .all(|c| c.is_ascii_digit() || matches!(c, b'+' | b'-' | b'.' | b'e' | b'E'))
    {
        return None;
    }
    parse_quantity::<T>(tok, Unit::Number).ok()
}

/// [`number`] or a parse error at the token.
#[inline]
pub(crate) fn number_at<T: Real>(tok: &str, line: u32, offset: usize) -> Result<T> {
    number(tok).ok_or_else(|| err_at(line, offset, "a number"))
}

/// Case-insensitive ASCII equality.
#[inline]
pub(crate) fn eq_ci(a: &str, b: &str) -> bool {
    a.eq_ignore_ascii_case(b)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;

    #[test]
    fn tokens_carry_offsets() {
        let mut t = Tokens::new("  1.5\t-2e3  x");
        assert_eq!(t.next(), Some((2, "1.5")));
        assert_eq!(t.next(), Some((6, "-2e3")));
        assert_eq!(t.next(), Some((12, "x")));
        assert_eq!(t.next(), None);
        assert_eq!(Tokens::new("   ").next(), None);
    }

    #[test]
    fn numbers_plain_only() {
        assert_eq!(number::<f64>("1.25e-3"), Some(1.25e-3));
        assert_eq!(number::<f32>("-.5"), Some(-0.5));
        assert_eq!(number::<f64>("5m"), None);
        assert_eq!(number::<f64>("5%"), None);
        assert_eq!(number::<f64>("1e"), None);
        assert_eq!(number::<f64>("1e999"), None);
        assert_eq!(number::<f64>(""), None);
        assert_eq!(number::<f64>("0.1"), Some(0.1));
    }

    #[test]
    fn lines_like_std() {
        for t in ["a\nb", "a\r\nb\n", "", "\n\n", "x", "a\n\nb\r\n"] {
            let mine: std::vec::Vec<&str> = lines(t).collect();
            let std: std::vec::Vec<&str> = t.lines().collect();
            assert_eq!(mine, std, "{t:?}");
        }
    }

    #[test]
    fn comment_cut() {
        assert_eq!(before_comment("1 2 ! c", b'!'), "1 2 ");
        assert_eq!(before_comment("! all", b'!'), "");
    }
}

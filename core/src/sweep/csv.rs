//! Streaming reader for reflection sweeps in CSV with a header line.
//!
//! Grammar (common practice, no single source): comment lines start with `#`
//! or `!`; blank lines are skipped; the first other line is the header; fields
//! are separated by the first of `,` `;` or a tab found in the header, may be
//! padded with white space and may be wrapped in double quotes. Each header
//! name is split into words (runs of letters and digits, case ignored) and
//! classified by the first rule that matches:
//!
//! | column | accepted words | unit |
//! | --- | --- | --- |
//! | frequency | `f`, `freq`, `frequency` | Hz, or `hz` `khz` `mhz` `ghz` among the words |
//! | magnitude in dB | `db` (e.g. `S11 dB`, `mag_db`, `log mag (dB)`) | 20·log10\|Γ\| |
//! | real part | `re`, `real` | — |
//! | imaginary part | `im`, `imag`, `imaginary` | — |
//! | linear magnitude | `mag`, `magnitude`, `lin`, `linear`, `abs`, `rho` | — |
//! | phase | `phase`, `ang`, `angle`, `arg` | degrees; radians if `rad` is among the words |
//!
//! Other columns are ignored (they may hold anything). The header must name a
//! frequency and either real and imaginary parts or a magnitude (linear or dB)
//! and a phase; each kind at most once. Frequencies must increase strictly.
//!
//! Errors are [`Error::Parse`] with line, 1-based byte column and what was
//! expected. Memory: the reader holds the kinds of up to [`MAX_COLUMNS`]
//! columns (about 60 bytes).

use heapless::Vec;

use crate::error::{Error, Result};
use crate::math::complex::{self, cx, Cx};
use crate::scalar::Real;

use super::text::{err_at, lines, number};

/// Most columns a header may have.
pub const MAX_COLUMNS: usize = 32;

/// What a CSV column holds.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Column {
    /// Frequency (unit from the header).
    Frequency,
    /// Real part of Γ.
    Re,
    /// Imaginary part of Γ.
    Im,
    /// |Γ|, linear.
    MagLinear,
    /// 20·log10|Γ|, dB.
    MagDb,
    /// arg Γ in degrees.
    PhaseDeg,
    /// arg Γ in radians.
    PhaseRad,
    /// Not used.
    Ignored,
}

/// One sweep point: frequency and complex reflection.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SweepPoint<T> {
    /// Frequency, Hz.
    pub freq_hz: T,
    /// Reflection coefficient.
    pub gamma: Cx<T>,
}

/// The streaming CSV reader.
///
/// ```
/// use echoline::sweep::csv::CsvSweep;
/// let text = "Frequency (MHz), S11 dB, Phase (deg)\n1, -20, 90\n2, -20, 45\n";
/// let mut r = CsvSweep::<f64>::new();
/// let mut pts = [None; 2];
/// let mut k = 0;
/// let n = r.read_str(text, |p| { pts[k] = Some(p); k += 1; Ok(()) })?;
/// assert_eq!(n, 2);
/// let p = pts[0].unwrap();
/// assert_eq!(p.freq_hz, 1e6);
/// assert!((p.gamma.im - 0.1).abs() < 1e-12);
/// # Ok::<(), echoline::Error>(())
/// ```
#[derive(Clone, Debug)]
pub struct CsvSweep<T> {
    line: u32,
    columns: Vec<Column, MAX_COLUMNS>,
    delim: u8,
    freq_unit_hz: T,
    last_freq: Option<T>,
    count: usize,
}

impl<T: Real> Default for CsvSweep<T> {
    fn default() -> Self {
        Self::new()
    }
}

impl<T: Real> CsvSweep<T> {
    /// A reader before its header.
    pub fn new() -> Self {
        CsvSweep {
            line: 0,
            columns: Vec::new(),
            delim: b',',
            freq_unit_hz: T::one(),
            last_freq: None,
            count: 0,
        }
    }

    /// The column kinds found in the header (empty before it).
    pub fn columns(&self) -> &[Column] {
        &self.columns
    }

    /// Reads all of `text` and [`Self::finish`]es; returns the point count.
    pub fn read_str<F>(&mut self, text: &str, mut sink: F) -> Result<usize>
    where
        F: FnMut(SweepPoint<T>) -> Result<()>,
    {
        for line in lines(text) {
            self.push_line(line, &mut sink)?;
        }
        self.finish()
    }

    /// Consumes one line (without its ending), calling `sink` for its point.
    pub fn push_line<F>(&mut self, line: &str, mut sink: F) -> Result<()>
    where
        F: FnMut(SweepPoint<T>) -> Result<()>,
    {
        self.line = self.line.saturating_add(1);
        let t = line.trim_start();
        if t.is_empty() || t.starts_with('#') || t.starts_with('!') || t.trim_end().is_empty() {
            return Ok(());
        }
        if self.columns.is_empty() {
            return self.header(line);
        }
        self.data(line, &mut sink)
    }

    /// Ends the input; returns the number of points.
    ///
    /// Errors: [`Error::Parse`] when there was no header or no data.
    pub fn finish(&mut self) -> Result<usize> {
        let end = self.line.saturating_add(1);
        if self.columns.is_empty() {
            return Err(err_at(end, 0, "a header line naming the columns"));
        }
        if self.count == 0 {
            return Err(err_at(end, 0, "at least one data line"));
        }
        Ok(self.count)
    }

    fn header(&mut self, line: &str) -> Result<()> {
        let ln = self.line;
        self.delim = line
            .bytes()
            .find(|b| matches!(b, b',' | b';' | b'\t'))
            .unwrap_or(b',');
        let mut unit = T::one();
        for (off, field) in Fields::new(line, self.delim) {
            let (kind, u) = classify::<T>(field);
            if kind != Column::Ignored && self.columns.contains(&kind) {
                return Err(err_at(ln, off, "one column of each kind"));
            }
            if kind == Column::PhaseDeg && self.columns.contains(&Column::PhaseRad)
                || kind == Column::PhaseRad && self.columns.contains(&Column::PhaseDeg)
                || kind == Column::MagDb && self.columns.contains(&Column::MagLinear)
                || kind == Column::MagLinear && self.columns.contains(&Column::MagDb)
            {
                return Err(err_at(ln, off, "one magnitude and one phase column"));
            }
            if let Some(u) = u {
                unit = u;
            }
            self.columns.push(kind).map_err(|_| Error::Capacity {
                what: "columns",
                capacity: MAX_COLUMNS,
            })?;
        }
        let has = |k: Column| self.columns.contains(&k);
        let ok = has(Column::Frequency)
            && ((has(Column::Re) && has(Column::Im))
                || ((has(Column::MagLinear) || has(Column::MagDb))
                    && (has(Column::PhaseDeg) || has(Column::PhaseRad))));
        if !ok {
            self.columns.clear();
            let lead = line.len() - line.trim_start().len();
            return Err(err_at(
                ln,
                lead,
                "a header naming frequency and re/im, or magnitude (linear or dB) and phase columns",
            ));
        }
        self.freq_unit_hz = unit;
        Ok(())
    }

    fn data<F>(&mut self, line: &str, sink: &mut F) -> Result<()>
    where
        F: FnMut(SweepPoint<T>) -> Result<()>,
    {
        let ln = self.line;
        let (mut f, mut re, mut im, mut mag, mut ph) = (None, None, None, None, None);
        let mut fields = Fields::new(line, self.delim);
        let mut f_at = 0;
        for kind in self.columns.iter() {
            let Some((off, field)) = fields.next() else {
                return Err(err_at(ln, line.len(), "a value in every named column"));
            };
            if *kind == Column::Ignored {
                continue;
            }
            let x = number::<T>(field).ok_or_else(|| err_at(ln, off, "a number"))?;
            match kind {
                Column::Frequency => {
                    f = Some(x * self.freq_unit_hz);
                    f_at = off;
                }
                Column::Re => re = Some(x),
                Column::Im => im = Some(x),
                Column::MagLinear => mag = Some(x),
                Column::MagDb => mag = Some((x * T::LN_10() / T::lit(20.0)).exp()),
                Column::PhaseDeg => ph = Some(x / T::lit(360.0)),
                Column::PhaseRad => ph = Some(x / T::two_pi()),
                Column::Ignored => {}
            }
        }
        let freq_hz = f.ok_or_else(|| err_at(ln, 0, "a frequency"))?;
        if freq_hz.is_nan() || freq_hz < T::zero() || !freq_hz.is_finite() {
            return Err(err_at(ln, f_at, "a frequency ≥ 0"));
        }
        if let Some(last) = self.last_freq {
            if freq_hz <= last {
                return Err(err_at(ln, f_at, "a frequency above the previous one"));
            }
        }
        let gamma = match (re, im, mag, ph) {
            (Some(r), Some(i), _, _) => cx(r, i),
            (_, _, Some(m), Some(t)) => {
                let p = complex::phasor_turns(t);
                cx(m * p.re, m * p.im)
            }
            _ => return Err(err_at(ln, 0, "a value in every named column")),
        };
        if !complex::is_finite(gamma) {
            return Err(err_at(ln, 0, "finite values"));
        }
        self.last_freq = Some(freq_hz);
        self.count += 1;
        sink(SweepPoint { freq_hz, gamma })
    }
}

/// Fields of a line split on `delim`, trimmed and unquoted, with offsets.
struct Fields<'a> {
    s: &'a str,
    i: usize,
    done: bool,
    delim: u8,
}

impl<'a> Fields<'a> {
    fn new(s: &'a str, delim: u8) -> Self {
        Fields {
            s,
            i: 0,
            done: false,
            delim,
        }
    }
}

impl<'a> Iterator for Fields<'a> {
    type Item = (usize, &'a str);
    fn next(&mut self) -> Option<(usize, &'a str)> {
        if self.done {
            return None;
        }
        let b = self.s.as_bytes();
        let rest = b.get(self.i..)?;
        let end = match rest.iter().position(|c| *c == self.delim) {
            Some(k) => self.i + k,
            None => {
                self.done = true;
                b.len()
            }
        };
        let raw = self.s.get(self.i..end)?;
        let start = self.i;
        self.i = end + 1;
        let t = raw.trim_start();
        let off = start + (raw.len() - t.len());
        let t = t.trim_end();
        let t = t
            .strip_prefix('"')
            .and_then(|x| x.strip_suffix('"'))
            .map_or(t, str::trim);
        Some((off, t))
    }
}

/// Column kind and frequency unit of a header name.
fn classify<T: Real>(name: &str) -> (Column, Option<T>) {
    let words = || {
        name.split(|c: char| !c.is_ascii_alphanumeric())
            .filter(|w| !w.is_empty())
    };
    let any = |list: &[&str]| words().any(|w| list.iter().any(|l| w.eq_ignore_ascii_case(l)));
    if any(&["f", "freq", "frequency"]) {
        let unit = if any(&["ghz"]) {
            T::lit(1e9)
        } else if any(&["mhz"]) {
            T::lit(1e6)
        } else if any(&["khz"]) {
            T::lit(1e3)
        } else {
            T::one()
        };
        return (Column::Frequency, Some(unit));
    }
    let kind = if any(&["db"]) {
        Column::MagDb
    } else if any(&["re", "real"]) {
        Column::Re
    } else if any(&["im", "imag", "imaginary"]) {
        Column::Im
    } else if any(&["mag", "magnitude", "lin", "linear", "abs", "rho"]) {
        Column::MagLinear
    } else if any(&["phase", "ang", "angle", "arg"]) {
        if any(&["rad"]) {
            Column::PhaseRad
        } else {
            Column::PhaseDeg
        }
    } else {
        Column::Ignored
    };
    (kind, None)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;
    use std::vec::Vec as StdVec;

    fn read<T: Real>(text: &str) -> Result<StdVec<SweepPoint<T>>> {
        let mut v = StdVec::new();
        CsvSweep::<T>::new().read_str(text, |p| {
            v.push(p);
            Ok(())
        })?;
        Ok(v)
    }

    fn pos(e: Error) -> (u32, u32) {
        match e {
            Error::Parse { pos, .. } => (pos.line, pos.column),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn re_im_and_units() {
        let v =
            read::<f64>("# comment\nfreq_GHz;re(S11);im(S11);note\n1;0.5;-0.25;x\n2 ; 0 ; 1 ; y\n")
                .unwrap();
        assert_eq!(v.len(), 2);
        assert_eq!(v[0].freq_hz, 1e9);
        assert_eq!(v[0].gamma, cx(0.5, -0.25));
        assert_eq!(v[1].gamma, cx(0.0, 1.0));
        let v = read::<f32>("\"f (kHz)\"\t\"mag\"\t\"phase rad\"\n3\t0.5\t0\n").unwrap();
        assert_eq!(v[0].freq_hz, 3e3);
        assert!((v[0].gamma.re - 0.5).abs() < 1e-6);
    }

    #[test]
    fn magnitude_phase_degrees() {
        // |Γ| = 10^(−6/20) at 180°.
        let v = read::<f64>("Frequency (Hz),S11 dB,Angle (deg)\n100,-6,180\n").unwrap();
        let m = libm::pow(10.0, -6.0 / 20.0);
        assert!((v[0].gamma.re + m).abs() < 1e-12 && v[0].gamma.im.abs() < 1e-12);
        let v = read::<f64>("frequency,magnitude,phase\n1,0.2,90\n").unwrap();
        assert!(v[0].gamma.re.abs() < 1e-15 && (v[0].gamma.im - 0.2).abs() < 1e-15);
    }

    #[test]
    fn errors_name_line_and_column() {
        assert_eq!(pos(read::<f64>("freq,re\n1,2\n").unwrap_err()), (1, 1));
        assert_eq!(pos(read::<f64>("freq,re,im\n1,2,x\n").unwrap_err()), (2, 5));
        assert_eq!(pos(read::<f64>("freq,re,im\n1,2\n").unwrap_err()), (2, 4));
        assert_eq!(
            pos(read::<f64>("freq,re,im\n2,0,0\n1,0,0\n").unwrap_err()),
            (3, 1)
        );
        assert_eq!(pos(read::<f64>("freq,re,re\n").unwrap_err()), (1, 9));
        assert_eq!(pos(read::<f64>("freq,db,mag,phase\n").unwrap_err()), (1, 9));
        assert_eq!(pos(read::<f64>("# only\n").unwrap_err()), (2, 1));
        assert_eq!(pos(read::<f64>("f,re,im\n").unwrap_err()), (2, 1));
        assert_eq!(pos(read::<f64>("1,2,3\n").unwrap_err()), (1, 1));
    }
}

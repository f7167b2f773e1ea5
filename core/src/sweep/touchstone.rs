//! Streaming Touchstone reader (versions 1.x and 2.0), line by line, no heap.
//!
//! Touchstone is the IBIS Open Forum's open file format for network parameters
//! ("Touchstone File Format Specification", version 1.1, 2002, and version 2.0,
//! 2009). What this reader accepts:
//!
//! * `!` starts a comment anywhere (whole line or trailing); leading white
//!   space is ignored; keywords and option tokens are case-insensitive.
//! * The option line `# <Hz|kHz|MHz|GHz> <S|Y|Z|H|G> <DB|MA|RI> R <n>` (tokens
//!   in any order, each optional; defaults GHz S MA R 50). `R` may be followed
//!   by one value per port (per-port references). Later option lines are ignored.
//! * Data: a frequency, then the matrix as pairs (RI: re im; MA: magnitude,
//!   angle in degrees; DB: 20·log10|x|, angle in degrees). Two-port order
//!   N11 N21 N12 N22 (version 1, and 2.0 with `[Two-Port Data Order] 21_12`;
//!   `12_21` gives N11 N12 N21 N22); one, three or more ports row-major. In
//!   version 1 each matrix row of three or more ports starts on a new line and a
//!   line holds at most four pairs. Every frequency point starts on a new line.
//! * Version 2.0 keywords: `[Version] 2.0` (first), `[Number of Ports]`,
//!   `[Two-Port Data Order] 12_21|21_12` (required for two ports),
//!   `[Number of Frequencies]` (checked), `[Number of Noise Frequencies]`
//!   (checked), `[Reference]` (one value per port, may span lines),
//!   `[Matrix Format] Full|Upper|Lower`, `[Network Data]`, `[Noise Data]`,
//!   `[Begin Information]` … `[End Information]` (skipped), `[End]` (required).
//!   `[Mixed-Mode Order]` is rejected (mixed-mode data are not supported).
//! * Port count: `[Number of Ports]`, else the `.sNp` extension of the file name
//!   ([`ports_from_file_name`]); version 1 needs the latter.
//! * Noise parameters (two-port): in version 1 the block that begins where the
//!   frequency stops increasing; in 2.0 after `[Noise Data]`. Each noise point
//!   is `f NFmin_dB |Γopt| ∠Γopt_deg Rn`, reported apart from the network data
//!   ([`Record::Noise`]); Rn is normalised to R in version 1, in ohms in 2.0.
//! * Network frequencies must increase strictly.
//!
//! Values are reported as read (converted to complex): in version 1, Z and Y
//! are normalised to the reference; in 2.0 they are in ohms and siemens.
//! [`Header::s11`] converts port 1 of a point to a reflection coefficient at a
//! chosen reference.
//!
//! Errors are [`Error::Parse`] with the line, the 1-based byte column and what
//! was expected there; a point count that disagrees with a keyword, a missing
//! `[End]` or an incomplete last point are reported by [`Touchstone::finish`].
//!
//! **Memory.** A reader of port capacity `P` holds one pending point of `P²`
//! complex values plus `P` references: for `P = 4` in `f64`, about 330 bytes.

use crate::error::{self, Error, Result};
use crate::math::complex::{self, cx, Cx};
use crate::scalar::Real;

use super::text::{before_comment, eq_ci, err_at, lines, number, number_at, Tokens};

/// The network parameter stored in a file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Parameter {
    /// Scattering parameters.
    S,
    /// Admittance parameters.
    Y,
    /// Impedance parameters.
    Z,
    /// Hybrid h-parameters (two-port only).
    H,
    /// Inverse hybrid g-parameters (two-port only).
    G,
}

/// How each complex value is written.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Format {
    /// Real and imaginary parts.
    Ri,
    /// Linear magnitude and angle in degrees.
    Ma,
    /// 20·log10 of the magnitude and angle in degrees.
    Db,
}

/// File version.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Version {
    /// Version 1.0 / 1.1 (no keywords).
    V1,
    /// Version 2.x (keywords).
    V2,
}

/// Which part of the matrix a version 2.0 file stores.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum MatrixFormat {
    /// Every element.
    Full,
    /// Upper triangle, row by row (N11 N12 … N1n N22 …), the rest by symmetry.
    Upper,
    /// Lower triangle, row by row (N11 N21 N22 N31 …), the rest by symmetry.
    Lower,
}

/// What the header says about the data.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Header<T, const P: usize> {
    /// The version.
    pub version: Version,
    /// Frequency unit in Hz (1, 1e3, 1e6 or 1e9).
    pub freq_unit_hz: T,
    /// The parameter.
    pub parameter: Parameter,
    /// The number format.
    pub format: Format,
    /// The option line's reference R, Ω.
    pub r_ohm: T,
    /// Per-port references, Ω (the first [`Header::ports`] are valid; default R).
    pub refs_ohm: [T; P],
    /// Port count, once known.
    pub ports: Option<usize>,
    /// Two-port order: `true` for N11 N21 N12 N22 (version 1 and `21_12`).
    pub order_21_12: bool,
    /// Stored part of the matrix.
    pub matrix: MatrixFormat,
}

impl<T: Real, const P: usize> Header<T, P> {
    /// Port 1 of `point` as a reflection coefficient at the real reference
    /// `z_ref_ohm` > 0.
    ///
    /// One-port S data are renormalised from the port's reference R₁ by
    /// Γ' = (s − r)/(1 − r·s), r = (Zr − R₁)/(Zr + R₁); Z data give
    /// Γ = (Z − Zr)/(Z + Zr) and Y data Γ = (1 − Y·Zr)/(1 + Y·Zr), with Z = z·R₁
    /// and Y = y/R₁ in version 1 (normalised values) and as read in 2.0. For more
    /// than one port only S data at `z_ref_ohm` = R₁ are accepted (S11 itself).
    ///
    /// Errors: [`Error::NotPositive`]`("z_ref_ohm")`;
    /// [`Error::Undefined`]`("parameter")` for H/G data or multi-port Z/Y;
    /// [`Error::Undefined`]`("z_ref_ohm")` for multi-port S at another reference.
    pub fn s11(&self, point: &NetworkPoint<T, P>, z_ref_ohm: T) -> Result<Cx<T>> {
        let zr = error::positive(z_ref_ohm, "z_ref_ohm")?;
        let v = point.get(0, 0).ok_or(Error::Undefined("parameter"))?;
        let r1 = self.refs_ohm.first().copied().unwrap_or(self.r_ohm);
        let one = cx(T::one(), T::zero());
        let ports = point.ports;
        let v2 = self.version == Version::V2;
        match self.parameter {
            Parameter::S if ports == 1 => {
                if zr == r1 {
                    return Ok(v);
                }
                let r = cx((zr - r1) / (zr + r1), T::zero());
                Ok(complex::div(v - r, one - r * v))
            }
            Parameter::S => {
                if zr == r1 {
                    Ok(v)
                } else {
                    Err(Error::Undefined("z_ref_ohm"))
                }
            }
            Parameter::Z if ports == 1 => {
                let z = if v2 { v } else { v * r1 };
                let zrc = cx(zr, T::zero());
                Ok(complex::div(z - zrc, z + zrc))
            }
            Parameter::Y if ports == 1 => {
                let y = if v2 { v } else { v / r1 };
                let yz = y * zr;
                Ok(complex::div(one - yz, one + yz))
            }
            _ => Err(Error::Undefined("parameter")),
        }
    }
}

/// One frequency point of network data: an `ports × ports` matrix.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NetworkPoint<T, const P: usize> {
    /// Frequency, Hz.
    pub freq_hz: T,
    /// Number of ports (≤ `P`).
    pub ports: usize,
    /// The matrix, `data[row][column]` (1-based element Nij is `data[i−1][j−1]`).
    pub data: [[Cx<T>; P]; P],
}

impl<T: Real, const P: usize> NetworkPoint<T, P> {
    /// Element (`row`, `col`), 0-based, if inside the point's ports.
    pub fn get(&self, row: usize, col: usize) -> Option<Cx<T>> {
        if row >= self.ports || col >= self.ports {
            return None;
        }
        self.data.get(row).and_then(|r| r.get(col)).copied()
    }
}

/// One noise-parameter point (two-port files).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NoisePoint<T> {
    /// Frequency, Hz.
    pub freq_hz: T,
    /// Minimum noise figure, dB.
    pub nf_min_db: T,
    /// Optimum source reflection coefficient (magnitude and angle as read).
    pub gamma_opt: Cx<T>,
    /// Effective noise resistance: normalised to R in version 1, Ω in 2.0.
    pub rn: T,
}

/// What the reader hands to the sink.
#[derive(Clone, Copy, Debug)]
pub enum Record<'a, T, const P: usize> {
    /// A network-data point.
    Network(&'a NetworkPoint<T, P>),
    /// A noise-parameter point.
    Noise(NoisePoint<T>),
}

/// Counts returned by [`Touchstone::finish`].
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Summary {
    /// Network points read.
    pub network_points: usize,
    /// Noise points read.
    pub noise_points: usize,
}

/// Port count from a `.sNp` file name (`cable.s1p` → 1, `x.S4P` → 4).
pub fn ports_from_file_name(name: &str) -> Option<usize> {
    let ext = name.rsplit_once('.')?.1.as_bytes();
    let (first, rest) = ext.split_first()?;
    let (last, digits) = rest.split_last()?;
    if !(first.eq_ignore_ascii_case(&b's') && last.eq_ignore_ascii_case(&b'p')) {
        return None;
    }
    if digits.is_empty() || digits.len() > 4 || !digits.iter().all(u8::is_ascii_digit) {
        return None;
    }
    let n = digits
        .iter()
        .fold(0usize, |a, d| a * 10 + usize::from(d - b'0'));
    (n > 0).then_some(n)
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Section {
    Header,
    Network,
    Noise,
    Info,
    End,
}

/// The streaming reader, of port capacity `P`.
///
/// ```
/// use echoline::sweep::touchstone::{Record, Touchstone};
/// let text = "! a short\n# MHz S RI R 50\n1 -1 0\n2 -1 0\n";
/// let mut r = Touchstone::<f64, 1>::new(Some(1));
/// let mut n = 0;
/// for line in text.lines() {
///     r.push_line(line, |rec| {
///         if let Record::Network(p) = rec { assert_eq!(p.get(0, 0).unwrap().re, -1.0); n += 1; }
///         Ok(())
///     })?;
/// }
/// assert_eq!(r.finish()?.network_points, 2);
/// assert_eq!(n, 2);
/// # Ok::<(), echoline::Error>(())
/// ```
#[derive(Clone, Debug)]
pub struct Touchstone<T, const P: usize> {
    header: Header<T, P>,
    line: u32,
    seen_content: bool,
    options_seen: bool,
    section: Section,
    n_freq: Option<usize>,
    n_noise: Option<usize>,
    refs_pending: usize,
    point: NetworkPoint<T, P>,
    /// Values of the pending point read so far (0 = none, 1 = the frequency).
    idx: usize,
    /// First half of a pair, when the second is still due.
    half: Option<T>,
    noise: [T; 5],
    noise_idx: usize,
    last_freq: Option<T>,
    last_noise_freq: Option<T>,
    counts: Summary,
    /// Start (line, offset) of the pending point, for an incomplete-point error.
    point_start: (u32, usize),
    /// Pairs read on the current line (version 1 limit of four).
    pairs_on_line: usize,
    two_port_order_seen: bool,
}

impl<T: Real, const P: usize> Touchstone<T, P> {
    /// A reader; `ports_hint` is the port count from the file name (see
    /// [`ports_from_file_name`]), required for version 1 files.
    pub fn new(ports_hint: Option<usize>) -> Self {
        let zero = cx(T::zero(), T::zero());
        Touchstone {
            header: Header {
                version: Version::V1,
                freq_unit_hz: T::lit(1e9),
                parameter: Parameter::S,
                format: Format::Ma,
                r_ohm: T::lit(50.0),
                refs_ohm: [T::lit(50.0); P],
                ports: ports_hint,
                order_21_12: true,
                matrix: MatrixFormat::Full,
            },
            line: 0,
            seen_content: false,
            options_seen: false,
            section: Section::Header,
            n_freq: None,
            n_noise: None,
            refs_pending: 0,
            point: NetworkPoint {
                freq_hz: T::zero(),
                ports: 0,
                data: [[zero; P]; P],
            },
            idx: 0,
            half: None,
            noise: [T::zero(); 5],
            noise_idx: 0,
            last_freq: None,
            last_noise_freq: None,
            counts: Summary {
                network_points: 0,
                noise_points: 0,
            },
            point_start: (0, 0),
            pairs_on_line: 0,
            two_port_order_seen: false,
        }
    }

    /// The header as read so far.
    pub fn header(&self) -> &Header<T, P> {
        &self.header
    }

    /// Reads all of `text` (lines ended by `\n` or `\r\n`) and [`Self::finish`]es.
    pub fn read_str<F>(&mut self, text: &str, mut sink: F) -> Result<Summary>
    where
        F: FnMut(Record<'_, T, P>) -> Result<()>,
    {
        for line in lines(text) {
            self.push_line(line, &mut sink)?;
        }
        self.finish()
    }

    /// Consumes one line (without its line ending; a trailing `\r` is ignored),
    /// calling `sink` for every point completed on it. An error from `sink` is
    /// passed through.
    pub fn push_line<F>(&mut self, line: &str, mut sink: F) -> Result<()>
    where
        F: FnMut(Record<'_, T, P>) -> Result<()>,
    {
        self.line = self.line.saturating_add(1);
        let ln = self.line;
        let body = before_comment(line, b'!');
        let trimmed = body.trim_start();
        let lead = body.len() - trimmed.len();
        let content = trimmed.trim_end();
        if content.is_empty() {
            return Ok(());
        }
        if self.section == Section::Info {
            if content.starts_with('[') {
                let (name, _) = keyword(content, ln, lead)?;
                if eq_ci(name, "End Information") {
                    self.section = Section::Header;
                }
            }
            return Ok(());
        }
        if self.section == Section::End {
            return Err(err_at(ln, lead, "nothing after [End]"));
        }
        let first = !self.seen_content;
        self.seen_content = true;
        if content.starts_with('[') {
            return self.keyword_line(content, lead, first);
        }
        if let Some(rest) = content.strip_prefix('#') {
            if self.options_seen {
                return Ok(());
            }
            self.options_seen = true;
            return self.option_line(rest, lead + 1);
        }
        if self.refs_pending > 0 {
            return self.reference_values(content, lead);
        }
        self.data_line(content, lead, &mut sink)
    }

    /// Ends the input: checks for an incomplete last point, the counts given by
    /// `[Number of Frequencies]` / `[Number of Noise Frequencies]` and, in
    /// version 2, the `[End]` keyword.
    pub fn finish(&mut self) -> Result<Summary> {
        let end_line = self.line.saturating_add(1);
        if self.idx > 0 || self.noise_idx > 0 || self.refs_pending > 0 {
            let (l, o) = self.point_start;
            return Err(err_at(
                l,
                o,
                "a complete point (values missing before the end)",
            ));
        }
        if let Some(n) = self.n_freq {
            if n != self.counts.network_points {
                return Err(err_at(
                    end_line,
                    0,
                    "as many points as [Number of Frequencies]",
                ));
            }
        }
        if let Some(n) = self.n_noise {
            if n != self.counts.noise_points {
                return Err(err_at(
                    end_line,
                    0,
                    "as many noise points as [Number of Noise Frequencies]",
                ));
            }
        }
        if self.header.version == Version::V2 && self.section != Section::End {
            return Err(err_at(end_line, 0, "[End]"));
        }
        if self.counts.network_points == 0 {
            return Err(err_at(end_line, 0, "at least one frequency point"));
        }
        Ok(self.counts)
    }

    fn option_line(&mut self, rest: &str, base: usize) -> Result<()> {
        let ln = self.line;
        let mut toks = Tokens::new(rest);
        while let Some((off, t)) = toks.next() {
            let at = base + off;
            let h = &mut self.header;
            if let Some(u) = freq_unit::<T>(t) {
                h.freq_unit_hz = u;
            } else if eq_ci(t, "S") {
                h.parameter = Parameter::S;
            } else if eq_ci(t, "Y") {
                h.parameter = Parameter::Y;
            } else if eq_ci(t, "Z") {
                h.parameter = Parameter::Z;
            } else if eq_ci(t, "H") {
                h.parameter = Parameter::H;
            } else if eq_ci(t, "G") {
                h.parameter = Parameter::G;
            } else if eq_ci(t, "RI") {
                h.format = Format::Ri;
            } else if eq_ci(t, "MA") {
                h.format = Format::Ma;
            } else if eq_ci(t, "DB") {
                h.format = Format::Db;
            } else if eq_ci(t, "R") {
                let (o, v) = toks
                    .next()
                    .ok_or_else(|| err_at(ln, at + 1, "a reference resistance after R"))?;
                let r = positive_number(v, ln, base + o)?;
                h.r_ohm = r;
                h.refs_ohm = [r; P];
                // Per-port references: further numbers after the first.
                let mut k = 1;
                let mut peek = toks.clone();
                while let Some((o2, v2)) = peek.next() {
                    let Some(r2) = number::<T>(v2) else { break };
                    if r2.is_nan() || r2 <= T::zero() {
                        return Err(err_at(ln, base + o2, "a reference resistance > 0"));
                    }
                    let slot = h
                        .refs_ohm
                        .get_mut(k)
                        .ok_or_else(|| err_at(ln, base + o2, "no more references than ports"))?;
                    *slot = r2;
                    k += 1;
                    toks = peek.clone();
                }
            } else {
                return Err(err_at(
                    ln,
                    at,
                    "a frequency unit (Hz kHz MHz GHz), parameter (S Y Z H G), format (DB MA RI) or R",
                ));
            }
        }
        Ok(())
    }

    fn keyword_line<'a>(&mut self, content: &'a str, lead: usize, first: bool) -> Result<()> {
        let ln = self.line;
        let (name, args_off) = keyword(content, ln, lead)?;
        let args = content.get(args_off - lead..).unwrap_or("");
        let mut toks = Tokens::new(args);
        let end_at = lead + content.len();
        let arg = |toks: &mut Tokens<'a>, what: &'static str| -> Result<(usize, &'a str)> {
            toks.next()
                .map(|(o, t)| (args_off + o, t))
                .ok_or_else(|| err_at(ln, end_at, what))
        };
        let is_v2 = self.header.version == Version::V2;
        if eq_ci(name, "Version") {
            if !first {
                return Err(err_at(
                    ln,
                    lead,
                    "[Version] as the first keyword of the file",
                ));
            }
            let (o, v) = arg(&mut toks, "a version number (2.0)")?;
            if !(v.starts_with("2.") && number::<T>(v).is_some()) {
                return Err(err_at(ln, o, "a version number (2.0 or 2.1)"));
            }
            self.header.version = Version::V2;
            return no_more(&mut toks, ln, args_off);
        }
        if !is_v2 {
            return Err(err_at(ln, lead, "data (keywords need [Version] 2.0 first)"));
        }
        if self.refs_pending > 0 {
            return Err(err_at(ln, lead, "the remaining [Reference] values"));
        }
        if eq_ci(name, "Number of Ports") {
            let (o, v) = arg(&mut toks, "the number of ports")?;
            let n = count(v, ln, o)?;
            if n == 0 {
                return Err(err_at(ln, o, "at least one port"));
            }
            if n > P {
                return Err(Error::Capacity {
                    what: "ports",
                    capacity: P,
                });
            }
            self.header.ports = Some(n);
        } else if eq_ci(name, "Two-Port Data Order") {
            let (o, v) = arg(&mut toks, "12_21 or 21_12")?;
            self.header.order_21_12 = if v == "21_12" {
                true
            } else if v == "12_21" {
                false
            } else {
                return Err(err_at(ln, o, "12_21 or 21_12"));
            };
            self.two_port_order_seen = true;
        } else if eq_ci(name, "Number of Frequencies") {
            let (o, v) = arg(&mut toks, "the number of frequencies")?;
            self.n_freq = Some(count(v, ln, o)?);
        } else if eq_ci(name, "Number of Noise Frequencies") {
            let (o, v) = arg(&mut toks, "the number of noise frequencies")?;
            self.n_noise = Some(count(v, ln, o)?);
        } else if eq_ci(name, "Reference") {
            let n = self
                .header
                .ports
                .ok_or_else(|| err_at(ln, lead, "[Number of Ports] before [Reference]"))?;
            self.refs_pending = n;
            self.point_start = (ln, lead);
            let rest = args.trim_start();
            if !rest.is_empty() {
                return self.reference_values(rest, args_off + (args.len() - rest.len()));
            }
            return Ok(());
        } else if eq_ci(name, "Matrix Format") {
            let (o, v) = arg(&mut toks, "Full, Upper or Lower")?;
            self.header.matrix = if eq_ci(v, "Full") {
                MatrixFormat::Full
            } else if eq_ci(v, "Upper") {
                MatrixFormat::Upper
            } else if eq_ci(v, "Lower") {
                MatrixFormat::Lower
            } else {
                return Err(err_at(ln, o, "Full, Upper or Lower"));
            };
        } else if eq_ci(name, "Mixed-Mode Order") {
            return Err(err_at(
                ln,
                lead,
                "single-ended data (mixed-mode is not supported)",
            ));
        } else if eq_ci(name, "Begin Information") {
            self.section = Section::Info;
            return Ok(());
        } else if eq_ci(name, "Network Data") {
            let n = self
                .header
                .ports
                .ok_or_else(|| err_at(ln, lead, "[Number of Ports] before [Network Data]"))?;
            if n == 2 && !self.two_port_order_seen {
                return Err(err_at(
                    ln,
                    lead,
                    "[Two-Port Data Order] before two-port data",
                ));
            }
            if self.section != Section::Header {
                return Err(err_at(ln, lead, "one [Network Data] block"));
            }
            self.section = Section::Network;
        } else if eq_ci(name, "Noise Data") {
            if self.idx > 0 {
                let (l, o) = self.point_start;
                return Err(err_at(l, o, "a complete point before [Noise Data]"));
            }
            if self.header.ports != Some(2) {
                return Err(err_at(ln, lead, "noise data only in a two-port file"));
            }
            if self.section != Section::Network {
                return Err(err_at(ln, lead, "[Network Data] before [Noise Data]"));
            }
            self.section = Section::Noise;
        } else if eq_ci(name, "End") {
            if self.idx > 0 || self.noise_idx > 0 {
                let (l, o) = self.point_start;
                return Err(err_at(l, o, "a complete point before [End]"));
            }
            self.section = Section::End;
        } else if eq_ci(name, "End Information") {
            return Err(err_at(
                ln,
                lead,
                "[Begin Information] before [End Information]",
            ));
        } else {
            return Err(err_at(ln, lead + 1, "a Touchstone 2.0 keyword"));
        }
        no_more(&mut toks, ln, args_off)
    }

    fn reference_values(&mut self, content: &str, base: usize) -> Result<()> {
        let ln = self.line;
        let n = self.header.ports.unwrap_or(0);
        for (o, t) in Tokens::new(content) {
            if self.refs_pending == 0 {
                return Err(err_at(ln, base + o, "one [Reference] value per port"));
            }
            let r = positive_number(t, ln, base + o)?;
            let k = n.saturating_sub(self.refs_pending);
            if let Some(slot) = self.header.refs_ohm.get_mut(k) {
                *slot = r;
            }
            self.refs_pending -= 1;
        }
        Ok(())
    }

    fn data_line<F>(&mut self, content: &str, base: usize, sink: &mut F) -> Result<()>
    where
        F: FnMut(Record<'_, T, P>) -> Result<()>,
    {
        let ln = self.line;
        let v2 = self.header.version == Version::V2;
        if v2 && !matches!(self.section, Section::Network | Section::Noise) {
            return Err(err_at(
                ln,
                base,
                "a keyword ([Network Data] before the data)",
            ));
        }
        let ports = match self.header.ports {
            Some(n) => n,
            None => {
                return Err(err_at(
                    ln,
                    base,
                    "a known port count (from the .sNp file name or [Number of Ports])",
                ))
            }
        };
        if ports == 0 {
            return Err(err_at(ln, base, "a port count of at least one"));
        }
        if ports > P {
            return Err(Error::Capacity {
                what: "ports",
                capacity: P,
            });
        }
        self.pairs_on_line = 0;
        let mut line_start = true;
        for (off, tok) in Tokens::new(content) {
            let at = base + off;
            let x = number_at::<T>(tok, ln, at)?;
            if self.section == Section::Noise {
                self.noise_value(x, ln, at, line_start, sink)?;
            } else if self.idx == 0 {
                if !line_start {
                    return Err(err_at(ln, at, "the end of the line (a point is complete)"));
                }
                let f = x * self.header.freq_unit_hz;
                if f.is_nan() || f < T::zero() || !f.is_finite() {
                    return Err(err_at(ln, at, "a frequency ≥ 0"));
                }
                if let Some(last) = self.last_freq {
                    if f <= last {
                        if !v2 && ports == 2 {
                            // Version 1: the noise block begins here.
                            self.section = Section::Noise;
                            self.noise_value(x, ln, at, line_start, sink)?;
                            line_start = false;
                            continue;
                        }
                        return Err(err_at(ln, at, "a frequency above the previous one"));
                    }
                }
                self.point.freq_hz = f;
                self.point.ports = ports;
                self.point_start = (ln, at);
                self.idx = 1;
            } else {
                self.pair_value(x, ports, ln, at, line_start, v2)?;
                if self.idx == 0 {
                    self.counts.network_points += 1;
                    self.last_freq = Some(self.point.freq_hz);
                    sink(Record::Network(&self.point))?;
                }
            }
            line_start = false;
        }
        Ok(())
    }

    fn pairs_per_point(&self, ports: usize) -> usize {
        match self.header.matrix {
            MatrixFormat::Full => ports * ports,
            _ => ports * (ports + 1) / 2,
        }
    }

    /// (row, col) of the p-th stored pair.
    fn element(&self, p: usize, ports: usize) -> (usize, usize) {
        match self.header.matrix {
            MatrixFormat::Full => {
                if ports == 2 && self.header.order_21_12 {
                    (p % 2, p / 2)
                } else {
                    (p / ports.max(1), p % ports.max(1))
                }
            }
            MatrixFormat::Upper => {
                let mut q = p;
                for i in 0..ports {
                    let len = ports - i;
                    if q < len {
                        return (i, i + q);
                    }
                    q -= len;
                }
                (0, 0)
            }
            MatrixFormat::Lower => {
                let mut q = p;
                for i in 0..ports {
                    let len = i + 1;
                    if q < len {
                        return (i, q);
                    }
                    q -= len;
                }
                (0, 0)
            }
        }
    }

    fn pair_value(
        &mut self,
        x: T,
        ports: usize,
        ln: u32,
        at: usize,
        line_start: bool,
        v2: bool,
    ) -> Result<()> {
        let Some(a) = self.half.take() else {
            // First half of a pair: version 1 line rules for ≥ 3 ports.
            let p = (self.idx - 1) / 2;
            if !v2 && ports >= 3 {
                let starts_row = p > 0 && p.checked_rem(ports) == Some(0);
                if starts_row && !line_start {
                    return Err(err_at(ln, at, "a new line for the next matrix row"));
                }
                if self.pairs_on_line >= 4 {
                    return Err(err_at(ln, at, "at most four pairs per line"));
                }
            }
            self.half = Some(x);
            self.idx += 1;
            return Ok(());
        };
        let p = (self.idx - 1) / 2;
        let z = match self.header.format {
            Format::Ri => cx(a, x),
            Format::Ma => polar(a, x),
            Format::Db => polar((a * T::LN_10() / T::lit(20.0)).exp(), x),
        };
        if !complex::is_finite(z) {
            return Err(err_at(ln, at, "a finite value"));
        }
        let (i, j) = self.element(p, ports);
        set(&mut self.point.data, i, j, z);
        if self.header.matrix != MatrixFormat::Full {
            set(&mut self.point.data, j, i, z);
        }
        self.pairs_on_line += 1;
        self.idx += 1;
        if p + 1 == self.pairs_per_point(ports) {
            self.idx = 0;
        }
        Ok(())
    }

    fn noise_value<F>(
        &mut self,
        x: T,
        ln: u32,
        at: usize,
        line_start: bool,
        sink: &mut F,
    ) -> Result<()>
    where
        F: FnMut(Record<'_, T, P>) -> Result<()>,
    {
        if self.noise_idx == 0 {
            if !line_start {
                return Err(err_at(
                    ln,
                    at,
                    "the end of the line (a noise point is complete)",
                ));
            }
            let f = x * self.header.freq_unit_hz;
            if f.is_nan() || f < T::zero() || !f.is_finite() {
                return Err(err_at(ln, at, "a frequency ≥ 0"));
            }
            if let Some(last) = self.last_noise_freq {
                if f <= last {
                    return Err(err_at(ln, at, "a noise frequency above the previous one"));
                }
            }
            self.point_start = (ln, at);
            x_store(&mut self.noise, 0, f);
        } else {
            x_store(&mut self.noise, self.noise_idx, x);
        }
        self.noise_idx += 1;
        if self.noise_idx == 5 {
            self.noise_idx = 0;
            let [f, nf, mag, ang, rn] = self.noise;
            self.last_noise_freq = Some(f);
            self.counts.noise_points += 1;
            sink(Record::Noise(NoisePoint {
                freq_hz: f,
                nf_min_db: nf,
                gamma_opt: polar(mag, ang),
                rn,
            }))?;
        }
        Ok(())
    }
}

fn x_store<T: Copy>(a: &mut [T; 5], i: usize, v: T) {
    if let Some(s) = a.get_mut(i) {
        *s = v;
    }
}

fn set<T: Copy, const P: usize>(m: &mut [[Cx<T>; P]; P], i: usize, j: usize, z: Cx<T>) {
    if let Some(s) = m.get_mut(i).and_then(|r| r.get_mut(j)) {
        *s = z;
    }
}

/// magnitude·e^(j·angle°), the angle reduced in turns.
fn polar<T: Real>(mag: T, angle_deg: T) -> Cx<T> {
    let p = complex::phasor_turns(angle_deg / T::lit(360.0));
    cx(mag * p.re, mag * p.im)
}

fn freq_unit<T: Real>(t: &str) -> Option<T> {
    if eq_ci(t, "Hz") {
        Some(T::one())
    } else if eq_ci(t, "kHz") {
        Some(T::lit(1e3))
    } else if eq_ci(t, "MHz") {
        Some(T::lit(1e6))
    } else if eq_ci(t, "GHz") {
        Some(T::lit(1e9))
    } else {
        None
    }
}

fn positive_number<T: Real>(t: &str, ln: u32, at: usize) -> Result<T> {
    match number::<T>(t) {
        Some(r) if r > T::zero() => Ok(r),
        _ => Err(err_at(ln, at, "a reference resistance > 0")),
    }
}

fn count(t: &str, ln: u32, at: usize) -> Result<usize> {
    let b = t.as_bytes();
    if b.is_empty() || b.len() > 9 || !b.iter().all(u8::is_ascii_digit) {
        return Err(err_at(ln, at, "a whole number"));
    }
    Ok(b.iter().fold(0usize, |a, d| a * 10 + usize::from(d - b'0')))
}

fn no_more(toks: &mut Tokens<'_>, ln: u32, base: usize) -> Result<()> {
    match toks.next() {
        Some((o, _)) => Err(err_at(ln, base + o, "the end of the line")),
        None => Ok(()),
    }
}

/// Splits `[Name] args`: the name (inner spaces kept) and the byte offset of
/// what follows `]`, both relative to the line (`lead` = offset of `[`).
fn keyword(content: &str, ln: u32, lead: usize) -> Result<(&str, usize)> {
    let close = content
        .find(']')
        .ok_or_else(|| err_at(ln, lead + content.len(), "] to close the keyword"))?;
    let name = content.get(1..close).unwrap_or("").trim();
    Ok((name, lead + close + 1))
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;
    use std::vec::Vec as StdVec;

    type Pts<T, const P: usize> = (StdVec<NetworkPoint<T, P>>, StdVec<NoisePoint<T>>);

    fn read<T: Real, const P: usize>(text: &str, hint: Option<usize>) -> Result<Pts<T, P>> {
        let mut net = StdVec::new();
        let mut noise = StdVec::new();
        Touchstone::<T, P>::new(hint).read_str(text, |r| {
            match r {
                Record::Network(p) => net.push(*p),
                Record::Noise(n) => noise.push(n),
            }
            Ok(())
        })?;
        Ok((net, noise))
    }

    fn pos(e: Error) -> (u32, u32) {
        match e {
            Error::Parse { pos, .. } => (pos.line, pos.column),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn defaults_are_ghz_s_ma_50() {
        let (n, _) = read::<f64, 1>("1 0.5 90\n2 0.5 -90\n", Some(1)).unwrap();
        assert_eq!(n[0].freq_hz, 1e9);
        let z = n[0].get(0, 0).unwrap();
        assert!(z.re.abs() < 1e-15 && (z.im - 0.5).abs() < 1e-15);
        let r = Touchstone::<f32, 1>::new(Some(1));
        assert_eq!(r.header().r_ohm, 50.0);
        assert_eq!(r.header().format, Format::Ma);
    }

    #[test]
    fn two_port_order_and_noise_v1() {
        let text = "# hz s ri r 50\n\
                    10 1 0 2 0 3 0 4 0 ! 11 21 12 22\n\
                    20 1 0 2 0 3 0 4 0\n\
                    5 1.5 0.5 45 0.2\n\
                    15 1.6 0.4 50 0.3\n";
        let (n, z) = read::<f64, 2>(text, Some(2)).unwrap();
        assert_eq!(n.len(), 2);
        assert_eq!(n[0].data[1][0].re, 2.0); // N21
        assert_eq!(n[0].data[0][1].re, 3.0); // N12
        assert_eq!(z.len(), 2);
        assert_eq!(z[0].freq_hz, 5.0);
        assert_eq!(z[1].rn, 0.3);
    }

    #[test]
    fn v2_keywords_upper_matrix_and_reference() {
        let text = "[Version] 2.0\n# MHz Z RI R 50\n[Number of Ports] 3\n\
                    [Number of Frequencies] 1\n[Reference] 50 75\n 100\n\
                    [Matrix Format] Upper\n[Begin Information]\nanything [x]\n[End Information]\n\
                    [Network Data]\n1 11 0 12 0 13 0\n 22 0 23 0\n 33 0\n[End]\n";
        let mut r = Touchstone::<f64, 4>::new(None);
        let mut got = None;
        r.read_str(text, |rec| {
            if let Record::Network(p) = rec {
                got = Some(*p);
            }
            Ok(())
        })
        .unwrap();
        let p = got.unwrap();
        assert_eq!(p.ports, 3);
        assert_eq!(p.get(2, 0).unwrap().re, 13.0);
        assert_eq!(p.get(1, 2).unwrap().re, 23.0);
        assert_eq!(r.header().refs_ohm[..3], [50.0, 75.0, 100.0]);
    }

    #[test]
    fn s11_conversions() {
        // v1 normalised Z = 2 at R 50 → 100 Ω → Γ = 1/3 at 50 Ω.
        let mut r = Touchstone::<f64, 1>::new(Some(1));
        let mut g = cx(0.0, 0.0);
        r.push_line("# MHz Z RI R 50", |_| Ok(())).unwrap();
        let h = *r.header();
        r.push_line("1 2 0", |rec| {
            if let Record::Network(p) = rec {
                g = h.s11(p, 50.0)?;
            }
            Ok(())
        })
        .unwrap();
        assert!((g.re - 1.0 / 3.0).abs() < 1e-15);
        // S renormalisation: an open stays an open at any reference.
        let p = NetworkPoint {
            freq_hz: 1.0,
            ports: 1,
            data: [[cx(1.0, 0.0)]],
        };
        let s = Touchstone::<f64, 1>::new(Some(1));
        let g = s.header().s11(&p, 75.0).unwrap();
        assert!((g.re - 1.0).abs() < 1e-15);
        // A 50 Ω match seen from 75 Ω: Γ = (50 − 75)/(50 + 75) = −0.2.
        let p = NetworkPoint {
            data: [[cx(0.0, 0.0)]],
            ..p
        };
        let g = s.header().s11(&p, 75.0).unwrap();
        assert!((g.re + 0.2).abs() < 1e-15);
    }

    #[test]
    fn file_names() {
        assert_eq!(ports_from_file_name("feed.s1p"), Some(1));
        assert_eq!(ports_from_file_name("A.S12P"), Some(12));
        assert_eq!(ports_from_file_name("a.ts"), None);
        assert_eq!(ports_from_file_name("a.s0p"), None);
        assert_eq!(ports_from_file_name("noext"), None);
    }

    #[test]
    fn malformed_files() {
        let e = |t: &str, h| pos(read::<f64, 4>(t, h).unwrap_err());
        assert_eq!(e("# MHz Q\n", Some(1)), (1, 7));
        assert_eq!(e("1 0.5 x\n", Some(1)), (1, 7));
        assert_eq!(e("1 0.5 0\n1 0.5 0\n", Some(1)), (2, 1));
        assert_eq!(e("1 0.5\n", Some(1)), (1, 1));
        assert_eq!(e("1 0.5 0\n", None), (1, 1));
        assert_eq!(e("1 0.5 0 2 0.5 0\n", Some(1)), (1, 9));
        assert_eq!(e("[Number of Ports] 1\n", None), (1, 1));
        assert_eq!(
            e(
                "[Version] 2.0\n[Number of Ports] 1\n[Network Data]\n1 0 0\n",
                None
            ),
            (5, 1)
        );
        assert_eq!(
            e("[Version] 2.0\n[Number of Ports] 2\n[Network Data]\n", None),
            (3, 1)
        );
        assert_eq!(e("! c\n#\n[Version] 2.0\n", None), (3, 1));
        assert_eq!(e("[Version] 2.0\n[Bogus]\n", None), (2, 2));
        assert_eq!(
            e("[Version] 2.0\n[Number of Ports] 1\n1 0 0\n", None),
            (3, 1)
        );
        assert_eq!(
            e("[Version] 2.0\n[Number of Ports] 1\n[Number of Frequencies] 2\n[Network Data]\n1 0 0\n[End]\n", None),
            (7, 1)
        );
        // v1 three ports: a row must start on a new line.
        assert_eq!(e("1 1 0 2 0 3 0 4 0\n", Some(3)), (1, 15));
        // more than four pairs on a line (five ports, version 1).
        assert_eq!(
            pos(read::<f64, 5>("1 1 0 2 0 3 0 4 0 5 0\n", Some(5)).unwrap_err()),
            (1, 19)
        );
        assert_eq!(
            read::<f64, 2>("[Version] 2.0\n[Number of Ports] 3\n", None).unwrap_err(),
            Error::Capacity {
                what: "ports",
                capacity: 2
            }
        );
    }
}

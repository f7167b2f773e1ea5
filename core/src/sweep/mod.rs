//! Frequency sweeps: streaming readers and distance-to-fault transforms.
//!
//! A reflection sweep Γ(fₙ) on a uniform grid fₙ = f₀ + n·Δf is turned into
//! reflection against distance by an inverse Fourier sum with a symmetric
//! window, d = v·t/2 (see [`dtf`] for the formulas and sources):
//!
//! * [`touchstone`]: Touchstone 1.x / 2.0 reader (IBIS Open Forum), line by line,
//!   no heap, errors with line and column.
//! * [`csv`]: CSV sweeps with a header (frequency plus re/im or magnitude/phase).
//! * [`grid`]: frequency-grid checks and the one time/distance grid builder
//!   ([`grid::distance_grid`]): alias-free range v(N−1)/(2·span), resolution,
//!   bin spacing, velocity and its kind.
//! * [`dtf`]: band-pass (FFT or chirp-z zoom), low-pass impulse and step,
//!   line-model mapping (dispersion-corrected, cable-loss compensated).
//! * [`peaks`]: peaks with distance interval, ρ and return loss.
//!
//! Windows and their figures (Harris, "On the use of windows for harmonic
//! analysis with the discrete Fourier transform", Proc. IEEE 66(1):51–83, 1978;
//! values recomputed for long symmetric windows; resolution = k₆·v/(2·span)
//! in band-pass):
//!
//! | window | highest side lobe | 6 dB width k₆ (bins) |
//! | --- | --- | --- |
//! | rectangular | −13.3 dB | 1.21 |
//! | Hann | −31.5 dB | 2.00 |
//! | Hamming | −42.7 dB | 1.81 |
//! | Kaiser β = 3π | −69.6 dB | 2.39 |
//!
//! ```
//! use echoline::math::{complex::Cx, fft::{fill_twiddles, Fft}, window::Window};
//! use echoline::sweep::{dtf::{band_pass_fft, Config}, peaks::{peaks_complex, Peak}};
//! use echoline::timing::VelocityRange;
//! // An open 7 m down a lossless VF 0.8 line, swept 10 MHz … 1 GHz.
//! let n = 100;
//! let v = 0.8 * 299_792_458.0;
//! let mut f = [0.0f64; 100];
//! let mut g = [Cx::new(0.0, 0.0); 100];
//! for i in 0..n {
//!     f[i] = 10e6 * (i + 1) as f64;
//!     let ph = -2.0 * core::f64::consts::TAU * f[i] * 7.0 / v;
//!     g[i] = Cx::from_polar(1.0, ph);
//! }
//! let mut table = [Cx::new(0.0, 0.0); 512];
//! fill_twiddles(&mut table)?;
//! let plan = Fft::new(&table)?;
//! let cfg = Config { window: Window::Hann, velocity: VelocityRange::from_factor(0.8, 0.0)? };
//! let mut out = [Cx::new(0.0, 0.0); 1024];
//! let grid = band_pass_fft(&f, &g, &cfg, &plan, &mut out)?;
//! assert!((grid.range_m - v / 20e6).abs() < 1e-6); // alias-free: 11.99 m
//! let mut peaks: heapless::Vec<Peak<f64>, 8> = heapless::Vec::new();
//! peaks_complex(&out, &grid, 0.5, &mut peaks)?;
//! assert_eq!(peaks.len(), 1);
//! assert!((peaks[0].distance.distance_m - 7.0).abs() < 0.05 * grid.resolution_m);
//! assert!((peaks[0].rho - 1.0).abs() < 0.02);
//! # Ok::<(), echoline::Error>(())
//! ```
pub mod csv;
pub mod dtf;
pub mod grid;
pub mod peaks;
mod text;
pub mod touchstone;

use crate::error::{Error, Result};
use crate::math::complex::Cx;
use crate::scalar::Real;

/// Which reader a file name calls for.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FileKind {
    /// Comma/semicolon/tab separated values with a header (`.csv`, `.txt`).
    Csv,
    /// Touchstone (`.sNp`, `.ts`, anything else).
    Touchstone,
}

/// The reader for `file_name`: CSV for `.csv` / `.txt`, else Touchstone.
pub fn file_kind(file_name: &str) -> FileKind {
    match file_name.rsplit_once('.') {
        Some((_, e)) if e.eq_ignore_ascii_case("csv") || e.eq_ignore_ascii_case("txt") => {
            FileKind::Csv
        }
        _ => FileKind::Touchstone,
    }
}

/// Reads a whole sweep file into caller buffers: frequencies (Hz) and the
/// reflection at port 1 at `z_ref_ohm` ([`touchstone::Header::s11`]; a CSV
/// holds Γ directly). Touchstone files of up to four ports are accepted
/// (port count from `[Number of Ports]` or the `.sNp` name); noise data are
/// skipped. Returns the number of points.
///
/// Errors: the readers' [`Error::Parse`] (line, column, expected);
/// [`Error::Capacity`] (`"freqs_hz"`) when the buffers are too short;
/// [`Error::LengthMismatch`]`("gamma")` unless both buffers have one length;
/// [`Error::BadIndex`]`("gamma", i)` when point i converts to a non-finite Γ
/// (a Z or Y value at the reflection pole, Z = −Zref);
/// [`touchstone::Header::s11`]'s errors.
pub fn read_reflection<T: Real>(
    text: &str,
    file_name: &str,
    z_ref_ohm: T,
    freqs_hz: &mut [T],
    gamma: &mut [Cx<T>],
) -> Result<usize> {
    if freqs_hz.len() != gamma.len() {
        return Err(Error::LengthMismatch("gamma"));
    }
    let cap = freqs_hz.len();
    let mut n = 0usize;
    let mut put = |f: T, g: Cx<T>| -> Result<()> {
        // A point whose conversion to Γ is not finite (e.g. Z = −Zref, a
        // reflection pole) is not a measurement: name the point.
        if !(g.re.is_finite() && g.im.is_finite()) {
            return Err(Error::BadIndex {
                what: "gamma",
                index: n,
            });
        }
        match (freqs_hz.get_mut(n), gamma.get_mut(n)) {
            (Some(fs), Some(gs)) => {
                *fs = f;
                *gs = g;
                n += 1;
                Ok(())
            }
            _ => Err(Error::Capacity {
                what: "freqs_hz",
                capacity: cap,
            }),
        }
    };
    match file_kind(file_name) {
        FileKind::Csv => {
            csv::CsvSweep::<T>::new().read_str(text, |p| put(p.freq_hz, p.gamma))?;
        }
        FileKind::Touchstone => {
            let mut r =
                touchstone::Touchstone::<T, 4>::new(touchstone::ports_from_file_name(file_name));
            for line in text::lines(text) {
                let header = *r.header();
                r.push_line(line, |rec| match rec {
                    touchstone::Record::Network(p) => put(p.freq_hz, header.s11(p, z_ref_ohm)?),
                    touchstone::Record::Noise(_) => Ok(()),
                })?;
            }
            r.finish()?;
        }
    }
    Ok(n)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use super::*;
    use std::string::String;

    /// Random printable text (and a few control bytes) must never panic.
    fn garbage<T: Real>() {
        let mut s: u64 = 0x2545_F491_4F6C_DD1D;
        let alphabet = b"0123456789.+-eE !#[]\t,;\"abcdefghijklmnopqrstuvwxyzSZYRIMADBGHz_\r";
        let mut f = [T::zero(); 16];
        let mut g = [Cx::new(T::zero(), T::zero()); 16];
        let heads = [
            "",
            "# MHz S RI R 50\n",
            "[Version] 2.0\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Network Data]\n",
            "freq,re,im\n",
            "f,db,phase\n",
        ];
        for round in 0..2000 {
            let mut text = String::from(heads[round % heads.len()]);
            let len = (round * 7) % 200;
            for _ in 0..len {
                s ^= s << 13;
                s ^= s >> 7;
                s ^= s << 17;
                let c = alphabet[(s % alphabet.len() as u64) as usize];
                text.push(if s % 11 == 0 { '\n' } else { c as char });
            }
            for name in ["x.s1p", "x.s2p", "x.s4p", "x.ts", "x.csv"] {
                let _ = read_reflection(&text, name, T::lit(50.0), &mut f, &mut g);
            }
        }
    }

    #[test]
    fn readers_survive_garbage() {
        garbage::<f32>();
        garbage::<f64>();
    }

    #[test]
    fn file_kinds() {
        assert_eq!(file_kind("a.CSV"), FileKind::Csv);
        assert_eq!(file_kind("a.s2p"), FileKind::Touchstone);
        assert_eq!(file_kind("noext"), FileKind::Touchstone);
    }

    /// Found by fuzzing: a Z one-port at −Zref (normalised −1) has no finite
    /// reflection; the reader names the point instead of returning ∞.
    #[test]
    fn a_point_at_the_reflection_pole_is_named() {
        let text = "# Hz Z MA R 50\n1 0.5 0\n2 -1 0\n";
        let mut f = [0.0f64; 4];
        let mut g = [Cx::new(0.0, 0.0); 4];
        assert_eq!(
            read_reflection(text, "x.s1p", 50.0, &mut f, &mut g),
            Err(Error::BadIndex {
                what: "gamma",
                index: 1
            })
        );
    }
}

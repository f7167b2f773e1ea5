//! Bindings for the "Simulation" section (and the demo traces): a cable
//! described as rows (line sections and lumped discontinuities) ended by a
//! termination, driven by a step source, sampled as an instrument would
//! (`echoline::tdr::sim::simulate` over a `network::cascade::Cascade` of
//! `line::lossless::Lossless` sections and `network::load` elements).

use echoline::line::lossless::Lossless;
use echoline::math::complex::Cx;
use echoline::network::cascade::{Cascade, Element};
use echoline::network::load::{Load, Rlc};
use echoline::tdr::sim::{simulate, Noise, Sampling, Source, Terminated};
use echoline::{Error, Result};
use wasm_bindgen::prelude::*;

/// Most rows in one cable description.
pub const MAX_ROWS: usize = 32;
/// Most samples in one simulated trace.
pub const MAX_SAMPLES: usize = 65_536;

/// One row of a cable description, from the instrument outward.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Row {
    /// A uniform lossless section.
    Section {
        /// Length, m.
        length_m: f64,
        /// Characteristic impedance, Ω.
        z0_ohm: f64,
        /// Velocity factor.
        velocity_factor: f64,
    },
    /// A capacitance across the line, F.
    ShuntC(f64),
    /// An inductance in series, H.
    SeriesL(f64),
    /// A resistance in series, Ω.
    SeriesR(f64),
    /// A resistance across the line, Ω.
    ShuntR(f64),
}

/// The far end.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum End {
    /// Open.
    Open,
    /// Short.
    Short,
    /// A resistor equal to the last section's impedance (the source's if none).
    Matched,
    /// A resistor, Ω.
    Resistor(f64),
}

/// The instrument: step source and sampling.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Instrument {
    /// Open-circuit step amplitude, V (into a matched line the trace shows half).
    pub open_circuit_v: f64,
    /// 10–90 % rise time, s.
    pub rise_time_s: f64,
    /// Source impedance, Ω.
    pub source_ohm: f64,
    /// Sample interval, s.
    pub sample_interval_s: f64,
    /// Number of samples.
    pub count: usize,
    /// RMS noise, V (0 for none).
    pub noise_rms_v: f64,
    /// Noise seed.
    pub seed: u64,
}

/// Time of the launch's 50 % point in a simulated trace: after at least 16
/// samples (so the pre-launch level can be measured) and two rise times (the
/// Gaussian edge's start is then negligible).
pub fn launch_s(ins: &Instrument) -> f64 {
    (2.0 * ins.rise_time_s).max(16.0 * ins.sample_interval_s)
}

/// The simulated samples (volts, t_n = n·Δt).
pub fn compute(rows: &[Row], end: End, ins: &Instrument) -> Result<Vec<f64>> {
    if rows.len() > MAX_ROWS {
        return Err(Error::Capacity {
            what: "rows",
            capacity: MAX_ROWS,
        });
    }
    if ins.count < 16 {
        return Err(Error::TooShort {
            what: "count",
            needed: 16,
        });
    }
    if ins.count > MAX_SAMPLES {
        return Err(Error::Capacity {
            what: "count",
            capacity: MAX_SAMPLES,
        });
    }
    // The line models must outlive the cascade that borrows them.
    let mut lines: Vec<Lossless<f64>> = Vec::with_capacity(rows.len());
    for r in rows {
        if let Row::Section {
            z0_ohm,
            velocity_factor,
            ..
        } = *r
        {
            lines.push(Lossless::new(z0_ohm, velocity_factor)?);
        }
    }
    let mut cascade: Cascade<'_, f64, MAX_ROWS> = Cascade::new();
    let mut models = lines.iter();
    let mut last_z0 = ins.source_ohm;
    for r in rows {
        let el = match *r {
            Row::Section {
                length_m, z0_ohm, ..
            } => {
                last_z0 = z0_ohm;
                let model = models.next().ok_or(Error::Undefined("rows"))?;
                Element::Line { model, length_m }
            }
            Row::ShuntC(c) => Element::Shunt(Load::Series(Rlc::new(None, None, Some(c)))),
            Row::SeriesL(l) => Element::Series(Load::Series(Rlc::new(None, Some(l), None))),
            Row::SeriesR(r) => Element::Series(Load::Resistor(r)),
            Row::ShuntR(r) => Element::Shunt(Load::Resistor(r)),
        };
        cascade.push(el)?;
    }
    let load = match end {
        End::Open => Load::Open,
        End::Short => Load::Short,
        End::Matched => Load::Resistor(last_z0),
        End::Resistor(r) => Load::Resistor(r),
    };
    let port = Terminated {
        cascade: &cascade,
        load,
    };
    let source = Source::step(
        ins.open_circuit_v,
        ins.rise_time_s,
        ins.source_ohm,
        launch_s(ins),
    )?;
    let sampling = Sampling {
        sample_interval_s: ins.sample_interval_s,
    };
    let noise = if ins.noise_rms_v > 0.0 {
        Some(Noise {
            rms_v: ins.noise_rms_v,
            seed: ins.seed,
        })
    } else {
        echoline::error::non_negative(ins.noise_rms_v, "rms_v")?;
        None
    };
    let mut out = vec![0.0; ins.count];
    let mut work = vec![Cx::new(0.0, 0.0); (2 * ins.count).next_power_of_two()];
    simulate(&port, &source, &sampling, noise, &mut out, &mut work)?;
    Ok(out)
}

/// Rows from the page's parallel arrays: `kind[i]` 0 section (`a` length m,
/// `b` Z0 Ω, `c` VF), 1 shunt C (`a` F), 2 series L (`a` H), 3 series R
/// (`a` Ω), 4 shunt R (`a` Ω).
pub fn rows_from(kind: &[u8], a: &[f64], b: &[f64], c: &[f64]) -> Result<Vec<Row>> {
    if a.len() != kind.len() || b.len() != kind.len() || c.len() != kind.len() {
        return Err(Error::LengthMismatch("rows"));
    }
    kind.iter()
        .zip(a.iter().zip(b.iter().zip(c.iter())))
        .enumerate()
        .map(|(i, (&k, (&a, (&b, &c))))| {
            Ok(match k {
                0 => Row::Section {
                    length_m: a,
                    z0_ohm: b,
                    velocity_factor: c,
                },
                1 => Row::ShuntC(a),
                2 => Row::SeriesL(a),
                3 => Row::SeriesR(a),
                4 => Row::ShuntR(a),
                _ => {
                    return Err(Error::BadIndex {
                        what: "kind",
                        index: i,
                    })
                }
            })
        })
        .collect()
}

/// The far end from the page: 0 open, 1 short, 2 matched, 3 resistor `r_ohm`.
pub fn end_from(kind: u8, r_ohm: f64) -> Result<End> {
    Ok(match kind {
        0 => End::Open,
        1 => End::Short,
        2 => End::Matched,
        3 => End::Resistor(r_ohm),
        _ => return Err(Error::OutOfRange("end")),
    })
}

/// `simulate_trace(kind, a, b, c, end, end_r_ohm, open_circuit_v, rise_time_s,
/// source_ohm, sample_interval_s, count, noise_rms_v, seed)`: a trace the
/// page can analyse or overlay (see [`rows_from`] for the rows).
#[wasm_bindgen]
#[allow(clippy::too_many_arguments)]
pub fn simulate_trace(
    kind: &[u8],
    a: &[f64],
    b: &[f64],
    c: &[f64],
    end: u8,
    end_r_ohm: f64,
    open_circuit_v: f64,
    rise_time_s: f64,
    source_ohm: f64,
    sample_interval_s: f64,
    count: usize,
    noise_rms_v: f64,
    seed: u32,
) -> core::result::Result<crate::trace::TraceFile, JsError> {
    let ins = Instrument {
        open_circuit_v,
        rise_time_s,
        source_ohm,
        sample_interval_s,
        count,
        noise_rms_v,
        seed: u64::from(seed),
    };
    let run = || -> Result<crate::trace::TraceFile> {
        let rows = rows_from(kind, a, b, c)?;
        let volts = compute(&rows, end_from(end, end_r_ohm)?, &ins)?;
        crate::trace::TraceFile::from_samples(volts, 0.0, sample_interval_s)
    };
    run().map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;

    const C0: f64 = 299_792_458.0;

    fn ins() -> Instrument {
        Instrument {
            open_circuit_v: 2.0,
            rise_time_s: 2e-9,
            source_ohm: 50.0,
            sample_interval_s: 1e-9,
            count: 1024,
            noise_rms_v: 0.0,
            seed: 1,
        }
    }

    #[test]
    fn open_end_settles_at_twice_the_incident_level() {
        // A matched source into a line: incident V/2, an open end doubles it
        // (Γ = +1) after the round trip 2ℓ/v; a short takes it to 0 (Γ = −1).
        // Pozar, Microwave Engineering, 4th ed., 2012, §2.3 (Γ of open/short).
        let rows = [Row::Section {
            length_m: 30.0,
            z0_ohm: 50.0,
            velocity_factor: 0.66,
        }];
        let v = compute(&rows, End::Open, &ins()).unwrap();
        let t_round = 2.0 * 30.0 / (0.66 * C0); // ≈ 303 ns
        let launch = launch_s(&ins());
        let before = ((launch + t_round) * 1e9 - 20.0) as usize;
        let after = ((launch + t_round) * 1e9 + 20.0) as usize;
        assert!((v[before] - 1.0).abs() < 1e-3, "{}", v[before]);
        assert!((v[after] - 2.0).abs() < 1e-3, "{}", v[after]);
        let s = compute(&rows, End::Short, &ins()).unwrap();
        assert!(s[after].abs() < 1e-3, "{}", s[after]);
        let m = compute(&rows, End::Matched, &ins()).unwrap();
        assert!((m[after] - 1.0).abs() < 1e-3);
        // A 150 Ω end: Γ = (150 − 50)/(150 + 50) = 0.5, level 1.5 V.
        let r = compute(&rows, End::Resistor(150.0), &ins()).unwrap();
        assert!((r[after] - 1.5).abs() < 1e-3, "{}", r[after]);
    }

    #[test]
    fn bad_rows_are_named() {
        assert_eq!(
            rows_from(&[0, 9], &[1.0, 1.0], &[50.0, 1.0], &[0.7, 1.0]),
            Err(Error::BadIndex {
                what: "kind",
                index: 1
            })
        );
        let rows = [Row::Section {
            length_m: -1.0,
            z0_ohm: 50.0,
            velocity_factor: 0.66,
        }];
        assert_eq!(
            compute(&rows, End::Open, &ins()),
            Err(Error::Negative("length_m"))
        );
        let big = Instrument {
            count: MAX_SAMPLES + 1,
            ..ins()
        };
        assert!(matches!(
            compute(&[], End::Open, &big),
            Err(Error::Capacity { .. })
        ));
    }
}

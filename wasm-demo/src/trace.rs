//! Bindings for the "Trace analysis" section: a CSV of samples parsed here
//! (never in the page), then `echoline::tdr` — [`Trace::new`], `analyse`,
//! layer peeling ([`Trace::peel`]) and baseline comparison (`compare`) — with
//! distances from `echoline::timing` (d = v·t/2 with its interval).
//!
//! CSV accepted: optional `#` comment lines and blank lines; an optional
//! header `time_s,volts` (two columns) or `volts` (one column); fields
//! separated by `,`, `;` or a tab. Two columns need evenly spaced increasing
//! times (each step within 1 % of the mean interval); one column needs the
//! sample interval from the page. At most [`MAX_SAMPLES`] samples and
//! [`MAX_BYTES`] bytes.

use echoline::error::TextPos;
use echoline::tdr::{
    compare, Analysis, ChangeKind, CompareSettings, DetectSettings, Event, EventKind, Lumped,
    TimeZero, Trace, TraceSetup,
};
use echoline::timing::presets::Preset;
use echoline::timing::{distance_from_round_trip, VelocityRange};
use echoline::units::m_to_ft;
use echoline::{Error, Impedance, Result};
use wasm_bindgen::prelude::*;

use crate::json::Json;
use crate::sim::{self, End, Instrument, Row};

/// Largest file accepted, samples.
pub const MAX_SAMPLES: usize = 1_000_000;
/// Largest file accepted, bytes (20 MiB).
pub const MAX_BYTES: usize = 20 * 1024 * 1024;
/// Event capacity of one analysis.
pub const MAX_EVENTS: usize = 64;
/// Most cells of an impedance profile; longer traces are block-averaged.
pub const MAX_CELLS: usize = 2048;

/// A trace held in the core's memory: evenly spaced samples in volts.
#[wasm_bindgen]
#[derive(Clone, Debug, PartialEq)]
pub struct TraceFile {
    volts: Vec<f64>,
    t_start_s: f64,
    dt_s: f64,
}

impl TraceFile {
    /// From samples, the time of the first one and the interval.
    pub fn from_samples(volts: Vec<f64>, t_start_s: f64, dt_s: f64) -> Result<Self> {
        echoline::error::positive(dt_s, "sample_interval_s")?;
        echoline::error::finite(t_start_s, "t_start_s")?;
        if volts.len() < echoline::tdr::trace::MIN_SAMPLES {
            return Err(Error::TooShort {
                what: "samples",
                needed: echoline::tdr::trace::MIN_SAMPLES,
            });
        }
        Ok(TraceFile {
            volts,
            t_start_s,
            dt_s,
        })
    }
    /// The samples.
    pub fn volts(&self) -> &[f64] {
        &self.volts
    }
}

#[wasm_bindgen]
impl TraceFile {
    /// Number of samples.
    #[wasm_bindgen(getter)]
    pub fn len(&self) -> usize {
        self.volts.len()
    }
    /// Never empty (at least 16 samples).
    #[wasm_bindgen(getter)]
    pub fn is_empty(&self) -> bool {
        self.volts.is_empty()
    }
    /// Sample interval, s.
    #[wasm_bindgen(getter)]
    pub fn dt_s(&self) -> f64 {
        self.dt_s
    }
    /// Time of the first sample, s.
    #[wasm_bindgen(getter)]
    pub fn t_start_s(&self) -> f64 {
        self.t_start_s
    }
    /// Time of the last sample, s.
    #[wasm_bindgen(getter)]
    pub fn t_end_s(&self) -> f64 {
        self.t_start_s + self.dt_s * (self.volts.len().saturating_sub(1)) as f64
    }
    /// For drawing: at most `max_points` triples (t_s, v_min, v_max), each
    /// the extremes of a run of consecutive samples.
    pub fn envelope(&self, max_points: usize) -> Vec<f64> {
        let n = self.volts.len();
        let per = n.div_ceil(max_points.max(1)).max(1);
        let mut out = Vec::with_capacity(3 * n.div_ceil(per));
        for (j, block) in self.volts.chunks(per).enumerate() {
            let lo = block.iter().copied().fold(f64::INFINITY, f64::min);
            let hi = block.iter().copied().fold(f64::NEG_INFINITY, f64::max);
            out.push(self.t_start_s + self.dt_s * (j * per) as f64);
            out.push(lo);
            out.push(hi);
        }
        out
    }
}

fn parse_err(line: usize, column: usize, expected: &'static str) -> Error {
    Error::Parse {
        pos: TextPos {
            line: u32::try_from(line).unwrap_or(u32::MAX),
            column: u32::try_from(column).unwrap_or(u32::MAX),
        },
        expected,
    }
}

/// Parses a trace CSV (see the module docs); `sample_interval_s` is used
/// for a one-column file only (`None` there is an error).
pub fn parse_csv(text: &str, sample_interval_s: Option<f64>) -> Result<TraceFile> {
    if text.len() > MAX_BYTES {
        return Err(Error::Capacity {
            what: "file_bytes",
            capacity: MAX_BYTES,
        });
    }
    let mut times: Vec<f64> = Vec::new();
    let mut volts: Vec<f64> = Vec::new();
    let mut lines: Vec<usize> = Vec::new();
    let mut columns: Option<usize> = None;
    let mut header_seen = false;
    for (i, raw) in text.split('\n').enumerate() {
        let line_no = i + 1;
        let line = raw.strip_suffix('\r').unwrap_or(raw);
        let line = line.strip_prefix('\u{feff}').unwrap_or(line);
        let t = line.trim();
        if t.is_empty() || t.starts_with('#') {
            continue;
        }
        let fields: Vec<(usize, &str)> = split_fields(line);
        let first_is_number = fields
            .first()
            .is_some_and(|(_, f)| f.trim().parse::<f64>().is_ok());
        if !first_is_number && !header_seen && volts.is_empty() {
            let names: Vec<String> = fields
                .iter()
                .map(|(_, f)| f.trim().to_ascii_lowercase())
                .collect();
            let names: Vec<&str> = names.iter().map(String::as_str).collect();
            match names.as_slice() {
                ["time_s", "volts"] => columns = Some(2),
                ["volts"] => columns = Some(1),
                _ => {
                    return Err(parse_err(
                        line_no,
                        1,
                        "a header time_s,volts (or volts), or numbers",
                    ))
                }
            }
            header_seen = true;
            continue;
        }
        let n = *columns.get_or_insert(fields.len());
        if fields.len() != n || n > 2 {
            let col = fields.get(n).map_or(line.len() + 1, |(c, _)| *c);
            return Err(parse_err(
                line_no,
                col,
                if n == 2 {
                    "2 columns: time_s,volts"
                } else if n == 1 {
                    "1 column: volts"
                } else {
                    "1 or 2 columns"
                },
            ));
        }
        let mut vals = [0.0f64; 2];
        for ((col, f), v) in fields.iter().zip(vals.iter_mut()) {
            let x: f64 = f
                .trim()
                .parse()
                .map_err(|_| parse_err(line_no, *col, "a number"))?;
            if !x.is_finite() {
                return Err(parse_err(line_no, *col, "a finite number"));
            }
            *v = x;
        }
        if volts.len() >= MAX_SAMPLES {
            return Err(Error::Capacity {
                what: "samples",
                capacity: MAX_SAMPLES,
            });
        }
        if n == 2 {
            times.push(vals[0]);
            volts.push(vals[1]);
        } else {
            volts.push(vals[0]);
        }
        lines.push(line_no);
    }
    let n = volts.len();
    if n < echoline::tdr::trace::MIN_SAMPLES {
        return Err(Error::TooShort {
            what: "samples",
            needed: echoline::tdr::trace::MIN_SAMPLES,
        });
    }
    if times.is_empty() {
        let dt = sample_interval_s.ok_or(Error::Undefined("sample_interval_s"))?;
        return TraceFile::from_samples(volts, 0.0, dt);
    }
    let (t0, t1) = (times[0], times[n - 1]);
    let dt = (t1 - t0) / (n - 1) as f64;
    if !(dt > 0.0 && dt.is_finite()) {
        return Err(parse_err(
            lines.get(1).copied().unwrap_or(1),
            1,
            "increasing times",
        ));
    }
    for (k, w) in times.windows(2).enumerate() {
        if ((w[1] - w[0]) - dt).abs() > 0.01 * dt {
            let line = lines.get(k + 1).copied().unwrap_or(0);
            return Err(parse_err(
                line,
                1,
                "evenly spaced increasing times (within 1 % of the mean interval)",
            ));
        }
    }
    TraceFile::from_samples(volts, t0, dt)
}

/// Fields of a line with their 1-based byte columns.
fn split_fields(line: &str) -> Vec<(usize, &str)> {
    let mut out = Vec::new();
    let mut start = 0;
    for (i, c) in line.char_indices() {
        if c == ',' || c == ';' || c == '\t' {
            out.push((start + 1, &line[start..i]));
            start = i + c.len_utf8();
        }
    }
    out.push((start + 1, &line[start..]));
    out
}

/// The wrapper's messages for the refusals a person acts on.
fn file_err(e: Error) -> JsError {
    match e {
        Error::Capacity {
            what: "file_bytes", ..
        } => JsError::new("file refused: larger than 20 MB (the page reads at most 20 MB)"),
        Error::Capacity {
            what: "samples", ..
        } => JsError::new(
            "file refused: more than 1,000,000 samples (the page reads at most 1,000,000)",
        ),
        Error::Undefined("sample_interval_s") => {
            JsError::new("sample_interval_s must be given for a file with one column of volts")
        }
        e => crate::js_err(e),
    }
}

/// `parse_trace_csv(text, sample_interval_s)`: a trace, or an error naming
/// the line and column; `sample_interval_s` (NaN if not given) is used for a
/// one-column file.
#[wasm_bindgen]
pub fn parse_trace_csv(
    text: &str,
    sample_interval_s: f64,
) -> core::result::Result<TraceFile, JsError> {
    let dt = if sample_interval_s.is_nan() {
        None
    } else {
        Some(sample_interval_s)
    };
    parse_csv(text, dt).map_err(file_err)
}

/// The velocity: a preset by its machine name, or a factor ± tolerance
/// when `preset` is empty or `"factor"`.
pub fn velocity(preset: &str, velocity_factor: f64, tolerance: f64) -> Result<VelocityRange<f64>> {
    if preset.is_empty() || preset == "factor" {
        VelocityRange::from_factor(velocity_factor, tolerance)
    } else {
        Ok(VelocityRange::from_preset(Preset::from_name(preset)?))
    }
}

/// The presets as JSON: `[{name, description, nominal, lo, hi}]` (velocity factors).
#[wasm_bindgen]
pub fn velocity_presets() -> String {
    let mut j = Json::new();
    j.open("").open_array("presets");
    for p in Preset::ALL {
        let v = VelocityRange::<f64>::from_preset(p);
        let c0 = 299_792_458.0;
        j.open("")
            .str("name", p.name())
            .str("description", p.description())
            .num("nominal", v.nominal_m_per_s / c0)
            .num("lo", v.lo_m_per_s / c0)
            .num("hi", v.hi_m_per_s / c0)
            .close();
    }
    j.close_array().close();
    j.finish()
}

/// The kind of an event in words.
pub fn kind_words(k: EventKind) -> &'static str {
    match k {
        EventKind::OpenEnd => "open end",
        EventKind::Short => "short",
        EventKind::ImpedanceUp => "impedance rises",
        EventKind::ImpedanceDown => "impedance falls",
        EventKind::Capacitive => "capacitive (shunt C)",
        EventKind::Inductive => "inductive (series L)",
        EventKind::Resistive => "resistive end or fault",
        EventKind::EndOfTrace => "end of trace (far end not seen)",
    }
}

/// Everything the page shows about one analysed trace (and a baseline).
#[wasm_bindgen]
pub struct TraceReport {
    velocity: VelocityRange<f64>,
    source_ohm: f64,
    t_zero_s: f64,
    t_half_width_s: f64,
    json: String,
    trace: Option<(f64, f64, usize)>,
}

fn setup(file: &TraceFile, velocity: VelocityRange<f64>, source_ohm: f64) -> TraceSetup<f64> {
    TraceSetup::measured(file.dt_s, source_ohm, velocity)
}

fn event_json(j: &mut Json, e: &Event<f64>, t_zero_s: f64) {
    let d = e.distance;
    j.open("")
        .str("kind", kind_words(e.kind))
        .str("kind_id", &format!("{:?}", e.kind))
        .num("round_trip_s", e.round_trip_s)
        .num("time_s", t_zero_s + e.round_trip_s)
        .num("t_half_width_s", e.t_half_width_s)
        .num("distance_m", d.distance_m)
        .num("lo_m", d.lo_m)
        .num("hi_m", d.hi_m)
        .num("distance_ft", m_to_ft(d.distance_m))
        .num("lo_ft", m_to_ft(d.lo_m))
        .num("hi_ft", m_to_ft(d.hi_m))
        .num("rho", e.rho)
        .num("rho_sigma", e.rho_sigma)
        .num("gamma_after", e.gamma_after)
        .num("gamma_settled", e.gamma_settled);
    match e.z_after {
        Impedance::Open => j.bool("z_open", true).num("z_ohm", f64::INFINITY),
        Impedance::Finite(z) => j.bool("z_open", false).num("z_ohm", z.re),
    };
    match e.lumped {
        Lumped::Capacitance { farads } => j.num("c_f", farads),
        Lumped::Inductance { henries } => j.num("l_h", henries),
        Lumped::None => j,
    };
    j.num("snr", e.snr.finite().unwrap_or(f64::INFINITY))
        .bool("clipped", e.clipped)
        .close();
}

struct One {
    analysis: Analysis<f64, MAX_EVENTS>,
    t_zero_s: f64,
    incident_v: f64,
    rise_time_s: f64,
    dt_s: f64,
}

fn analyse_one(file: &TraceFile, velocity: VelocityRange<f64>, source_ohm: f64) -> Result<One> {
    let trace = Trace::new(file.volts.as_slice(), setup(file, velocity, source_ohm))?;
    let analysis = trace.analyse::<MAX_EVENTS>(&DetectSettings::default())?;
    Ok(One {
        analysis,
        t_zero_s: file.t_start_s + trace.time_zero_index() * file.dt_s,
        incident_v: trace.incident_v(),
        rise_time_s: trace.rise_time_s(),
        dt_s: file.dt_s,
    })
}

fn one_json(j: &mut Json, key: &str, o: &One) {
    let a = &o.analysis;
    j.open(key)
        .num("t_zero_s", o.t_zero_s)
        .num("incident_v", o.incident_v)
        .num("rise_time_s", o.rise_time_s)
        .num("sample_interval_s", o.dt_s)
        .num("noise_v", a.noise.sigma_v)
        .num("threshold_v", a.threshold_v)
        .num("dead_zone_m", a.dead_zone.distance_m)
        .num("dead_zone_ft", m_to_ft(a.dead_zone.distance_m))
        .num("range_m", a.range.distance_m)
        .num("range_ft", m_to_ft(a.range.distance_m))
        .bool("masked_by_dead_zone", a.masked_by_dead_zone)
        .int("echoes_after_end", a.echoes_after_end)
        .int("clipped_samples", a.clipping.count)
        .open_array("events");
    for e in a.events.iter() {
        event_json(j, e, o.t_zero_s);
    }
    j.close_array().close();
}

/// Analyses `file` (and compares it with `baseline` if given).
pub fn analyse(
    file: &TraceFile,
    baseline: Option<&TraceFile>,
    velocity: VelocityRange<f64>,
    source_ohm: f64,
) -> Result<TraceReport> {
    let today = analyse_one(file, velocity, source_ohm)?;
    let mut j = Json::new();
    j.open("")
        .num("velocity_m_per_s", velocity.nominal_m_per_s)
        .num("velocity_lo_m_per_s", velocity.lo_m_per_s)
        .num("velocity_hi_m_per_s", velocity.hi_m_per_s);
    one_json(&mut j, "today", &today);
    if let Some(b) = baseline {
        let base = analyse_one(b, velocity, source_ohm)?;
        one_json(&mut j, "baseline", &base);
        // Match window: ten rise times or 2 % of the trace, the wider.
        let span = file.dt_s * file.volts.len() as f64;
        let window = (10.0 * today.rise_time_s).max(0.02 * span);
        let changes = compare::<f64, MAX_EVENTS>(
            &today.analysis.events,
            &base.analysis.events,
            &CompareSettings::with_window(window),
        )?;
        j.open_array("changes");
        for c in changes.iter() {
            let at = c
                .today
                .and_then(|i| today.analysis.events.get(i))
                .or_else(|| c.reference.and_then(|i| base.analysis.events.get(i)));
            j.open("").str(
                "kind",
                match c.kind {
                    ChangeKind::New => "new",
                    ChangeKind::Gone => "gone",
                    ChangeKind::Moved => "moved",
                    ChangeKind::RhoChanged => "reflection changed",
                },
            );
            if let Some(e) = at {
                j.str("event", kind_words(e.kind))
                    .num("distance_m", e.distance.distance_m)
                    .num("distance_ft", m_to_ft(e.distance.distance_m));
            }
            let shift = distance_from_round_trip(c.shift_s.abs(), 0.0, &velocity)?;
            j.num("shift_s", c.shift_s)
                .num("shift_m", shift.distance_m.copysign(c.shift_s))
                .num("shift_ft", m_to_ft(shift.distance_m).copysign(c.shift_s))
                .num("delta_rho", c.delta_rho)
                .close();
        }
        j.close_array();
    }
    j.close();
    let t_half_width_s = echoline::timing::timing_half_width_s(file.dt_s, true, today.rise_time_s)?;
    Ok(TraceReport {
        velocity,
        source_ohm,
        t_zero_s: today.t_zero_s,
        t_half_width_s,
        json: j.finish(),
        trace: Some((today.t_zero_s, today.incident_v, file.volts.len())),
    })
}

/// A cursor on the trace: its time, the round trip from the launch and the
/// distance that corresponds.
#[wasm_bindgen]
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Cursor {
    /// Time on the trace's axis, s.
    pub time_s: f64,
    /// Round trip from time zero, s (negative before the launch).
    pub round_trip_s: f64,
    /// Whether the cursor sits before the launch (no distance).
    pub before_launch: bool,
    /// Distance, m (0 before the launch).
    pub distance_m: f64,
    /// Interval, m.
    pub lo_m: f64,
    /// Interval, m.
    pub hi_m: f64,
    /// Distance, ft.
    pub distance_ft: f64,
    /// Interval, ft.
    pub lo_ft: f64,
    /// Interval, ft.
    pub hi_ft: f64,
}

impl TraceReport {
    /// The cursor readout at `time_s` on the trace's time axis.
    pub fn cursor_at(&self, time_s: f64) -> Result<Cursor> {
        let t = echoline::error::finite(time_s, "time_s")?;
        let round = t - self.t_zero_s;
        let before = round < 0.0;
        let d = distance_from_round_trip(round.max(0.0), self.t_half_width_s, &self.velocity)?;
        Ok(Cursor {
            time_s: t,
            round_trip_s: round,
            before_launch: before,
            distance_m: d.distance_m,
            lo_m: d.lo_m,
            hi_m: d.hi_m,
            distance_ft: m_to_ft(d.distance_m),
            lo_ft: m_to_ft(d.lo_m),
            hi_ft: m_to_ft(d.hi_m),
        })
    }

    /// The layer-peeled impedance profile of `file` as JSON
    /// `{distance_m:[], distance_ft:[], z_ohm:[], end, cells, block}`; at most
    /// `max_cells` cells (≤ [`MAX_CELLS`]): a longer trace is averaged over
    /// blocks of `block` samples first (cells block·v·Δt/2 long).
    pub fn profile_json(&self, file: &TraceFile, max_cells: usize) -> Result<String> {
        let max_cells = max_cells.clamp(16, MAX_CELLS);
        let full = Trace::new(
            file.volts.as_slice(),
            setup(file, self.velocity, self.source_ohm),
        )?;
        let n = file.volts.len();
        let block = n.div_ceil(max_cells).max(1);
        let dt = file.dt_s * block as f64;
        let volts: Vec<f64> = if block == 1 {
            file.volts.clone()
        } else {
            file.volts
                .chunks(block)
                .map(|c| c.iter().sum::<f64>() / c.len() as f64)
                .collect()
        };
        // Block j averages samples jb..jb+b−1, centred at jb + (b−1)/2.
        let t0 = ((full.time_zero_index() - (block as f64 - 1.0) * 0.5) / block as f64)
            .clamp(0.0, (volts.len() - 1) as f64);
        let rise = full.rise_time_s().hypot(0.8 * dt);
        let setup = TraceSetup {
            sample_interval_s: dt,
            time_zero: TimeZero::AtIndex(t0),
            incident_v: Some(full.incident_v()),
            pre_launch_v: Some(full.pre_launch_v()),
            rise_time_s: Some(rise),
            source_ohm: self.source_ohm,
            velocity: self.velocity,
        };
        let trace = Trace::new(volts.as_slice(), setup)?;
        let m = volts.len();
        let (mut d, mut u, mut z) = (vec![0.0; m], vec![0.0; m], vec![0.0; m]);
        let p = trace.peel(1.0, &mut d, &mut u, &mut z)?;
        let z = z.get(..p.layers).unwrap_or(&[]);
        let mut dist = Vec::with_capacity(z.len());
        for k in 0..z.len() {
            let round = (p.first_sample as f64 + k as f64 - t0) * dt;
            dist.push(distance_from_round_trip(round.max(0.0), 0.0, &self.velocity)?.distance_m);
        }
        let mut j = Json::new();
        j.open("")
            .nums("distance_m", dist.iter().copied())
            .nums("distance_ft", dist.iter().map(|&x| m_to_ft(x)))
            .nums("z_ohm", z.iter().copied())
            .str(
                "end",
                match p.end {
                    echoline::tdr::ProfileEnd::Samples => "samples",
                    echoline::tdr::ProfileEnd::Open => "open",
                    echoline::tdr::ProfileEnd::Short => "short",
                },
            )
            .int("cells", p.layers)
            .int("block", block)
            .close();
        Ok(j.finish())
    }
}

#[wasm_bindgen]
impl TraceReport {
    /// The report as JSON (events, figures, changes against the baseline).
    pub fn json(&self) -> String {
        self.json.clone()
    }
    /// Time zero on the trace's axis, s.
    #[wasm_bindgen(getter)]
    pub fn t_zero_s(&self) -> f64 {
        self.t_zero_s
    }
    /// Cursor readout at `time_s` (see [`TraceReport::cursor_at`]).
    pub fn cursor(&self, time_s: f64) -> core::result::Result<Cursor, JsError> {
        self.cursor_at(time_s).map_err(crate::js_err)
    }
    /// Impedance profile (see [`TraceReport::profile_json`]).
    pub fn profile(
        &self,
        file: &TraceFile,
        max_cells: usize,
    ) -> core::result::Result<String, JsError> {
        self.profile_json(file, max_cells).map_err(crate::js_err)
    }
    /// Samples of the analysed trace.
    #[wasm_bindgen(getter)]
    pub fn samples(&self) -> usize {
        self.trace.map_or(0, |t| t.2)
    }
}

/// `analyse_trace(file, preset, velocity_factor, tolerance, source_ohm)`.
#[wasm_bindgen]
pub fn analyse_trace(
    file: &TraceFile,
    preset: &str,
    velocity_factor: f64,
    tolerance: f64,
    source_ohm: f64,
) -> core::result::Result<TraceReport, JsError> {
    velocity(preset, velocity_factor, tolerance)
        .and_then(|v| analyse(file, None, v, source_ohm))
        .map_err(crate::js_err)
}

/// `analyse_against(file, baseline, …)`: as [`analyse_trace`], with the
/// baseline analysed too and the differences listed.
#[wasm_bindgen]
pub fn analyse_against(
    file: &TraceFile,
    baseline: &TraceFile,
    preset: &str,
    velocity_factor: f64,
    tolerance: f64,
    source_ohm: f64,
) -> core::result::Result<TraceReport, JsError> {
    velocity(preset, velocity_factor, tolerance)
        .and_then(|v| analyse(file, Some(baseline), v, source_ohm))
        .map_err(crate::js_err)
}

/// The demo scenario (invented): the sensor feeder at the fictional
/// "Marrow Fen pumping station", 120 m of 50 Ω solid-PE coax (VF 0.66)
/// with a crushed spot (a 30 pF shunt C at 42 m) and a wet stretch (4 m at
/// 38 Ω from 78 m), open at the far end.
pub fn demo_rows(with_faults: bool) -> Vec<Row> {
    let sec = |length_m: f64, z0_ohm: f64| Row::Section {
        length_m,
        z0_ohm,
        velocity_factor: 0.66,
    };
    if with_faults {
        vec![
            sec(42.0, 50.0),
            Row::ShuntC(30e-12),
            sec(36.0, 50.0),
            sec(4.0, 38.0),
            sec(38.0, 50.0),
        ]
    } else {
        vec![sec(120.0, 50.0)]
    }
}

/// The demo instrument: 2 V open-circuit step, 2 ns rise, 50 Ω, 1 ns
/// sampling, 2048 samples, 2 mV RMS noise.
pub fn demo_instrument(seed: u64) -> Instrument {
    Instrument {
        open_circuit_v: 2.0,
        rise_time_s: 2e-9,
        source_ohm: 50.0,
        sample_interval_s: 1e-9,
        count: 2048,
        noise_rms_v: 0.002,
        seed,
    }
}

/// `demo_trace(baseline)`: the demo trace (faults) or its baseline (the
/// same cable in good condition), simulated by the core.
#[wasm_bindgen]
pub fn demo_trace(baseline: bool) -> core::result::Result<TraceFile, JsError> {
    let ins = demo_instrument(if baseline { 7 } else { 11 });
    sim::compute(&demo_rows(!baseline), End::Open, &ins)
        .and_then(|v| TraceFile::from_samples(v, 0.0, ins.sample_interval_s))
        .map_err(crate::js_err)
}

/// The demo trace as CSV text (`time_s,volts`), for a file to save and load.
#[wasm_bindgen]
pub fn demo_csv(baseline: bool) -> core::result::Result<String, JsError> {
    let t = demo_trace(baseline)?;
    Ok(to_csv(&t))
}

/// `trace_csv(file)`: a trace as `time_s,volts` CSV text.
#[wasm_bindgen]
pub fn trace_csv(file: &TraceFile) -> String {
    to_csv(file)
}

/// A trace as `time_s,volts` CSV.
pub fn to_csv(t: &TraceFile) -> String {
    use core::fmt::Write;
    let mut s = String::from("# Echoline trace\ntime_s,volts\n");
    for (i, v) in t.volts.iter().enumerate() {
        let _ = writeln!(s, "{:e},{}", t.t_start_s + t.dt_s * i as f64, v);
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    const C0: f64 = 299_792_458.0;

    #[test]
    fn csv_two_columns_and_one_column() {
        let mut s = String::from("# comment\ntime_s,volts\n");
        for i in 0..20 {
            s.push_str(&format!(
                "{},{}\r\n",
                1e-9 * i as f64,
                if i > 5 { 1.0 } else { 0.0 }
            ));
        }
        let t = parse_csv(&s, None).unwrap();
        assert_eq!(t.len(), 20);
        assert!((t.dt_s - 1e-9).abs() < 1e-21);
        let one: String = (0..20).map(|i| format!("{}\n", i % 3)).collect();
        assert_eq!(parse_csv(&one, Some(2e-9)).unwrap().dt_s, 2e-9);
        assert_eq!(
            parse_csv(&one, None),
            Err(Error::Undefined("sample_interval_s"))
        );
    }

    #[test]
    fn bad_files_name_the_line() {
        let mut s = String::from("time_s,volts\n");
        for i in 0..20 {
            s.push_str(&format!("{},{}\n", i, if i == 7 { "x1" } else { "0.5" }));
        }
        // The header is line 1, sample i on line i + 2.
        assert_eq!(parse_csv(&s, None), Err(parse_err(9, 3, "a number")));
        assert_eq!(
            parse_csv("time,value\n1,2\n", None),
            Err(parse_err(
                1,
                1,
                "a header time_s,volts (or volts), or numbers"
            ))
        );
        let uneven: String = (0..20)
            .map(|i| format!("{},1\n", if i == 10 { 10.5 } else { i as f64 }))
            .collect();
        assert!(matches!(
            parse_csv(&uneven, None),
            Err(Error::Parse {
                pos: TextPos { line: 11, .. },
                ..
            })
        ));
        let ragged = "1,2\n2,3,4\n";
        assert_eq!(
            parse_csv(ragged, None),
            Err(parse_err(2, 5, "2 columns: time_s,volts"))
        );
        assert!(matches!(
            parse_csv("1\n2\n", Some(1e-9)),
            Err(Error::TooShort { .. })
        ));
        let huge = "0\n".repeat(MAX_SAMPLES + 1);
        assert_eq!(
            parse_csv(&huge, Some(1e-9)),
            Err(Error::Capacity {
                what: "samples",
                capacity: MAX_SAMPLES
            })
        );
    }

    #[test]
    fn demo_trace_finds_both_faults_and_the_end() {
        let v = velocity("solid-pe", 0.0, 0.0).unwrap();
        let t = TraceFile::from_samples(
            sim::compute(&demo_rows(true), End::Open, &demo_instrument(11)).unwrap(),
            0.0,
            1e-9,
        )
        .unwrap();
        let b = TraceFile::from_samples(
            sim::compute(&demo_rows(false), End::Open, &demo_instrument(7)).unwrap(),
            0.0,
            1e-9,
        )
        .unwrap();
        let r = analyse(&t, Some(&b), v, 50.0).unwrap();
        let json = r.json();
        // Kinds found: the crush (capacitive), the wet stretch (down, up), the open end.
        assert!(json.contains("capacitive"), "{json}");
        assert!(json.contains("impedance falls"), "{json}");
        assert!(json.contains("open end"), "{json}");
        assert!(json.contains("\"changes\":[{"), "{json}");
        // The cursor at time zero + the round trip to 120 m reads 120 m
        // (d = v·t/2, common practice, no single source).
        let c = r.cursor_at(r.t_zero_s + 2.0 * 120.0 / (0.66 * C0)).unwrap();
        assert!((c.distance_m - 120.0).abs() < 1e-9, "{}", c.distance_m);
        assert!(c.lo_m < 120.0 && c.hi_m > 120.0 && !c.before_launch);
        assert!(r.cursor_at(r.t_zero_s - 1e-9).unwrap().before_launch);
        let p = r.profile_json(&t, 4096).unwrap();
        assert!(p.contains("\"end\":\"open\""), "{p}");
    }

    #[test]
    fn profile_reads_a_step_to_75_ohm() {
        // Launch at sample 20 (incident 1 V), a 50 → 75 Ω step 100 samples
        // later: Γ = (75 − 50)/(75 + 50) = 0.2 (Pozar, Microwave Engineering,
        // 4th ed., 2012, §2.3), so the level goes to 1.2 V. The profile reads
        // 50 Ω before, 75 Ω after the step, at d = v·Δt·k/2.
        let x: Vec<f64> = (0..400)
            .map(|i| {
                if i >= 120 {
                    1.2
                } else if i >= 20 {
                    1.0
                } else {
                    0.0
                }
            })
            .collect();
        let t = TraceFile::from_samples(x, 0.0, 1e-9).unwrap();
        let v = velocity("factor", 0.66, 0.0).unwrap();
        let r = analyse(&t, None, v, 50.0).unwrap();
        let p = r.profile_json(&t, 2048).unwrap();
        let z = grab(&p, "z_ohm");
        let d = grab(&p, "distance_m");
        let step_m = 0.66 * C0 * 100e-9 / 2.0;
        for (zk, dk) in z.iter().zip(d.iter()) {
            if *dk < step_m - 1.0 {
                assert!((zk - 50.0).abs() < 1e-6, "{zk} at {dk}");
            } else if *dk > step_m + 1.0 {
                assert!((zk - 75.0).abs() < 1e-6, "{zk} at {dk}");
            }
        }
        // Block-averaged to 64 cells, the plateaus still read 50 and 75 Ω.
        let p = r.profile_json(&t, 16).unwrap();
        assert!(p.contains("\"block\":25"), "{p}");
        let z = grab(&p, "z_ohm");
        assert!(
            (z[1] - 50.0).abs() < 1.0 && (z[z.len() - 2] - 75.0).abs() < 1.0,
            "{z:?}"
        );
    }

    fn grab(json: &str, key: &str) -> Vec<f64> {
        let at = json.find(&format!("\"{key}\":[")).unwrap() + key.len() + 4;
        let end = at + json[at..].find(']').unwrap();
        json[at..end]
            .split(',')
            .map(|x| x.parse().unwrap())
            .collect()
    }
}

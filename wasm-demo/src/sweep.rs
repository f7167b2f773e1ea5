//! Bindings for the "Sweep analysis" section: a reflection sweep (Touchstone
//! or CSV, read by `echoline::sweep::read_reflection`) → reflection against
//! distance (`sweep::dtf::{band_pass_fft, band_pass_zoom, low_pass}`) and its
//! peaks (`sweep::peaks`), with the range, resolution and velocity shown.

use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::sweep::dtf::{
    band_pass_fft, band_pass_zoom, low_pass, zoom_work_len, Config, LowPass,
};
use echoline::sweep::grid::{window_figures, DistanceGrid, Mode};
use echoline::sweep::peaks::{peaks_complex, peaks_real, Peaks};
use echoline::sweep::read_reflection;
use echoline::units::m_to_ft;
use echoline::{Error, Result};
use wasm_bindgen::prelude::*;

use crate::json::Json;

/// The invented demo sweep (a fictional relay-site antenna feeder; see its header).
pub const DEMO_S1P: &str = include_str!("../../core/examples/data/demo_feeder.s1p");
/// The largest sweep the page reads, points.
pub const MAX_POINTS: usize = 100_001;
/// The largest sweep text the page reads, bytes.
pub const MAX_BYTES: usize = 20 * 1024 * 1024;
/// Samples drawn of a response (the largest magnitude of each block is kept).
pub const PLOT_POINTS: usize = 2048;
/// Samples of a zoomed response.
pub const ZOOM_POINTS: usize = 1024;
/// Peaks listed at most.
pub const MAX_PEAKS: usize = 64;

/// A sweep read from a file: frequencies and the reflection at port 1.
#[wasm_bindgen]
#[derive(Clone, Debug, PartialEq)]
pub struct SweepFile {
    freqs_hz: Vec<f64>,
    gamma: Vec<Cx<f64>>,
}

#[wasm_bindgen]
impl SweepFile {
    /// Points in the sweep.
    #[wasm_bindgen(getter)]
    pub fn len(&self) -> usize {
        self.freqs_hz.len()
    }
    /// Whether the sweep is empty (never, for a file that parsed).
    #[wasm_bindgen(getter)]
    pub fn is_empty(&self) -> bool {
        self.freqs_hz.is_empty()
    }
    /// First frequency, Hz.
    #[wasm_bindgen(getter)]
    pub fn f_start_hz(&self) -> f64 {
        self.freqs_hz.first().copied().unwrap_or(0.0)
    }
    /// Last frequency, Hz.
    #[wasm_bindgen(getter)]
    pub fn f_stop_hz(&self) -> f64 {
        self.freqs_hz.last().copied().unwrap_or(0.0)
    }
}

/// Reads a sweep (`file_name` picks the reader: `.csv`/`.txt` CSV, else
/// Touchstone), the reflection taken at `z_ref_ohm`.
pub fn parse(text: &str, file_name: &str, z_ref_ohm: f64) -> Result<SweepFile> {
    if text.len() > MAX_BYTES {
        return Err(Error::Capacity {
            what: "text",
            capacity: MAX_BYTES,
        });
    }
    // One point per line at most.
    let cap = text.lines().count().clamp(1, MAX_POINTS);
    let mut freqs_hz = vec![0.0; cap];
    let mut gamma = vec![Cx::new(0.0, 0.0); cap];
    let n = read_reflection(text, file_name, z_ref_ohm, &mut freqs_hz, &mut gamma)?;
    if n == 0 {
        return Err(Error::TooShort {
            what: "freqs_hz",
            needed: 2,
        });
    }
    freqs_hz.truncate(n);
    gamma.truncate(n);
    Ok(SweepFile { freqs_hz, gamma })
}

/// `parse_sweep(text, file_name, z_ref_ohm)`: a sweep, or an error naming the
/// line and column.
#[wasm_bindgen]
pub fn parse_sweep(
    text: &str,
    file_name: &str,
    z_ref_ohm: f64,
) -> core::result::Result<SweepFile, JsError> {
    parse(text, file_name, z_ref_ohm).map_err(|e| match e {
        Error::Capacity { what: "text", .. } => {
            JsError::new("file refused: larger than 20 MB (the page reads at most 20 MB)")
        }
        Error::Capacity {
            what: "freqs_hz", ..
        } => {
            JsError::new("file refused: more than 100,001 points (the page reads at most 100,001)")
        }
        e => crate::js_err(e),
    })
}

/// The bundled demo sweep, read at 50 Ω.
#[wasm_bindgen]
pub fn demo_sweep() -> core::result::Result<SweepFile, JsError> {
    parse(DEMO_S1P, "demo_feeder.s1p", 50.0).map_err(crate::js_err)
}

/// The demo sweep's text (to save it as a file).
#[wasm_bindgen]
pub fn demo_sweep_text() -> String {
    DEMO_S1P.to_string()
}

/// The window by name: `rect`, `hann`, `hamming`, `kaiser` (with `beta`).
pub fn window(name: &str, beta: f64) -> Result<Window<f64>> {
    match name {
        "rect" => Ok(Window::Rectangular),
        "hann" => Ok(Window::Hann),
        "hamming" => Ok(Window::Hamming),
        "kaiser" => Ok(Window::Kaiser {
            beta: echoline::error::non_negative(beta, "beta")?,
        }),
        _ => Err(Error::OutOfRange("window")),
    }
}

/// What the section asks for.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Request<'a> {
    /// `band`, `impulse` or `step`.
    pub mode: &'a str,
    /// Window name (see [`window`]) and Kaiser β.
    pub window: &'a str,
    /// Kaiser β.
    pub beta: f64,
    /// Velocity preset name, or `factor`.
    pub preset: &'a str,
    /// Velocity factor and tolerance (for `factor`).
    pub velocity_factor: f64,
    /// Tolerance of the factor (±).
    pub tolerance: f64,
    /// Zoom the band-pass response onto `start_m ..= stop_m`.
    pub zoom: bool,
    /// Zoom start, m.
    pub start_m: f64,
    /// Zoom stop, m.
    pub stop_m: f64,
    /// Smallest |Γ| listed as a peak.
    pub threshold: f64,
}

/// The response and its peaks, as JSON text: `{mode, points, f_start_hz,
/// f_stop_hz, range_m/ft, resolution_m/ft, step_m, k6_bins, side_lobe_db,
/// velocity {nominal, lo, hi (m/s), kind}, x_m[], x_ft[], y[], peaks[{distance_m,
/// lo_m, hi_m, …ft, rho, value, return_loss_db}]}`. `y` is |x| (band-pass) or
/// the signed response (low-pass), the largest magnitude of each block when
/// there are more than [`PLOT_POINTS`] samples.
pub fn compute(file: &SweepFile, r: &Request<'_>) -> Result<String> {
    let velocity = crate::trace::velocity(r.preset, r.velocity_factor, r.tolerance)?;
    let win = window(r.window, r.beta)?;
    let cfg = Config {
        window: win,
        velocity,
    };
    let f = &file.freqs_hz;
    let g = &file.gamma;
    let n = f.len();
    let m = n
        .saturating_mul(4)
        .checked_next_power_of_two()
        .ok_or(Error::OutOfRange("len"))?
        .max(4096);
    let mut table = vec![Cx::new(0.0, 0.0); m / 2];
    fill_twiddles(&mut table)?;
    let plan = Fft::new(&table)?;
    let mut peaks: Peaks<f64, MAX_PEAKS> = Peaks::new();
    let thr = r.threshold;
    let (grid, y): (DistanceGrid<f64>, Vec<f64>) = match r.mode {
        "band" if r.zoom => {
            let mut out = vec![Cx::new(0.0, 0.0); ZOOM_POINTS];
            let mut work = vec![Cx::new(0.0, 0.0); zoom_work_len(n, ZOOM_POINTS)?];
            let grid = band_pass_zoom(f, g, &cfg, r.start_m, r.stop_m, &mut out, &mut work)?;
            peaks_complex(&out, &grid, thr, &mut peaks)?;
            (
                grid,
                out.iter()
                    .map(|z| echoline::math::complex::abs(*z))
                    .collect(),
            )
        }
        "band" => {
            let mut out = vec![Cx::new(0.0, 0.0); m];
            let grid = band_pass_fft(f, g, &cfg, &plan, &mut out)?;
            peaks_complex(&out, &grid, thr, &mut peaks)?;
            (
                grid,
                out.iter()
                    .map(|z| echoline::math::complex::abs(*z))
                    .collect(),
            )
        }
        "impulse" | "step" => {
            let mut work = vec![Cx::new(0.0, 0.0); m];
            let mut out = vec![0.0; m];
            let kind = if r.mode == "step" {
                LowPass::Step { rise_time_s: None }
            } else {
                LowPass::Impulse
            };
            let grid = low_pass(f, g, &cfg, kind, &plan, &mut work, &mut out)?;
            out.truncate(grid.len);
            if r.mode == "step" {
                // Peaks of the impulse response with the same window: a step
                // response has levels, not peaks.
                let mut imp = vec![0.0; m];
                let ig = low_pass(f, g, &cfg, LowPass::Impulse, &plan, &mut work, &mut imp)?;
                peaks_real(&imp, &ig, thr, &mut peaks)?;
            } else {
                peaks_real(&out, &grid, thr, &mut peaks)?;
            }
            (grid, out)
        }
        _ => return Err(Error::OutOfRange("mode")),
    };
    let fig = window_figures(&win)?;
    // Drawn samples: the largest magnitude of each block.
    let block = y.len().div_ceil(PLOT_POINTS).max(1);
    let mut xs = Vec::with_capacity(PLOT_POINTS);
    let mut ys = Vec::with_capacity(PLOT_POINTS);
    for (b, chunk) in y.chunks(block).enumerate() {
        let mut best = (0usize, 0.0f64);
        for (i, v) in chunk.iter().enumerate() {
            if v.abs() > best.1.abs() || i == 0 {
                best = (i, *v);
            }
        }
        xs.push(grid.distance_m((b * block + best.0) as f64));
        ys.push(best.1);
    }
    let v = grid.velocity;
    let kind = v.kind.name();
    let mut j = Json::new();
    j.open("")
        .str(
            "mode",
            match grid.mode {
                Mode::BandPass => "band-pass",
                Mode::LowPassImpulse => "low-pass impulse",
                Mode::LowPassStep => "low-pass step",
            },
        )
        .int("points", n)
        .num("f_start_hz", file.f_start_hz())
        .num("f_stop_hz", file.f_stop_hz())
        .num("range_m", grid.range_m)
        .num("range_ft", m_to_ft(grid.range_m))
        .num("resolution_m", grid.resolution_m)
        .num("resolution_ft", m_to_ft(grid.resolution_m))
        .num("step_m", grid.step_m)
        .num("start_m", grid.start_m)
        .num("stop_m", grid.distance_m(grid.len.saturating_sub(1) as f64))
        .int("samples", grid.len)
        .num("k6_bins", fig.main_lobe_6db_bins)
        .num("side_lobe_db", fig.side_lobe_db)
        .open("velocity")
        .num("nominal_m_per_s", v.nominal_m_per_s)
        .num("lo_m_per_s", v.lo_m_per_s)
        .num("hi_m_per_s", v.hi_m_per_s)
        .num("factor", v.nominal_m_per_s / 299_792_458.0)
        .str("kind", kind)
        .close()
        .nums("x_m", xs.iter().copied())
        .nums("x_ft", xs.iter().map(|x| m_to_ft(*x)))
        .nums("y", ys);
    j.open_array("peaks");
    for p in peaks.iter() {
        let d = p.distance;
        j.open("")
            .num("distance_m", d.distance_m)
            .num("lo_m", d.lo_m)
            .num("hi_m", d.hi_m)
            .num("distance_ft", m_to_ft(d.distance_m))
            .num("lo_ft", m_to_ft(d.lo_m))
            .num("hi_ft", m_to_ft(d.hi_m))
            .num("rho", p.rho)
            .num("value", p.value)
            .num("return_loss_db", p.return_loss_db)
            .close();
    }
    j.close_array().close();
    Ok(j.finish())
}

/// `analyse_sweep(file, mode, window, beta, preset, vf, tol, zoom, start_m,
/// stop_m, threshold) → JSON` (see [`compute`]).
#[wasm_bindgen]
#[allow(clippy::too_many_arguments)]
pub fn analyse_sweep(
    file: &SweepFile,
    mode: &str,
    window: &str,
    beta: f64,
    preset: &str,
    velocity_factor: f64,
    tolerance: f64,
    zoom: bool,
    start_m: f64,
    stop_m: f64,
    threshold: f64,
) -> core::result::Result<String, JsError> {
    let r = Request {
        mode,
        window,
        beta,
        preset,
        velocity_factor,
        tolerance,
        zoom,
        start_m,
        stop_m,
        threshold,
    };
    compute(file, &r).map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn req(mode: &'static str, window: &'static str) -> Request<'static> {
        Request {
            mode,
            window,
            beta: 6.0,
            preset: "factor",
            velocity_factor: 0.88,
            tolerance: 0.01,
            zoom: false,
            start_m: 0.0,
            stop_m: 50.0,
            threshold: 0.02,
        }
    }

    fn num(json: &str, key: &str) -> f64 {
        let at = json.find(&format!("\"{key}\":")).unwrap() + key.len() + 3;
        let end = json[at..].find([',', '}']).unwrap() + at;
        json[at..end].parse().unwrap()
    }

    fn peak_distances(json: &str) -> Vec<f64> {
        let p = &json[json.find("\"peaks\":").unwrap()..];
        p.match_indices("\"distance_m\":")
            .map(|(i, _)| {
                let s = &p[i + 13..];
                s[..s.find(',').unwrap()].parse().unwrap()
            })
            .collect()
    }

    #[test]
    fn demo_peaks_where_the_scenario_put_them() {
        // The demo's invented ground truth (core/examples/data/make_demo_sweep.py):
        // wet connector at 12.4 m (both edges of a 5 cm section in one peak,
        // centre 12.425 m), splice edges at 33.0 and 33.4 m, antenna at 35.0 m.
        let file = demo_sweep_file();
        assert_eq!(file.len(), 1601);
        let j = compute(&file, &req("band", "hann")).unwrap();
        let res = num(&j, "resolution_m");
        let d = peak_distances(&j);
        assert_eq!(d.len(), 4, "{d:?}");
        for (got, want) in d.iter().zip([12.425, 33.0, 33.4, 35.0]) {
            assert!((got - want).abs() < res, "{got} vs {want}");
        }
        // Zoom onto 30–38 m: the three far peaks only.
        let mut z = req("band", "hann");
        z.zoom = true;
        z.start_m = 30.0;
        z.stop_m = 38.0;
        let d = peak_distances(&compute(&file, &z).unwrap());
        assert_eq!(d.len(), 3, "{d:?}");
        for (got, want) in d.iter().zip([33.0, 33.4, 35.0]) {
            assert!((got - want).abs() < res, "{got} vs {want}");
        }
        // Impulse mode finds the same places.
        let d = peak_distances(&compute(&file, &req("impulse", "hann")).unwrap());
        assert!(d.iter().any(|x| (x - 35.0).abs() < res), "{d:?}");
    }

    fn demo_sweep_file() -> SweepFile {
        parse(DEMO_S1P, "demo_feeder.s1p", 50.0).unwrap()
    }

    #[test]
    fn window_sets_the_resolution() {
        // Harris, "On the use of windows…", Proc. IEEE 66(1), 1978, Table I:
        // 6 dB main-lobe width 1.21 bins (rectangular), 2.00 bins (Hann);
        // resolution = k6·v/(2·span).
        let file = demo_sweep_file();
        let span = 3202e6 - 2e6;
        let v = 0.88 * 299_792_458.0;
        let rect = num(
            &compute(&file, &req("band", "rect")).unwrap(),
            "resolution_m",
        );
        let hann = num(
            &compute(&file, &req("band", "hann")).unwrap(),
            "resolution_m",
        );
        assert!(
            (rect - 1.21 * v / (2.0 * span)).abs() < 0.01 * rect,
            "{rect}"
        );
        assert!(
            (hann - 2.00 * v / (2.0 * span)).abs() < 0.01 * hann,
            "{hann}"
        );
        // Range v/(2Δf) (common practice, no single source): Δf = 2 MHz.
        let j = compute(&file, &req("band", "hann")).unwrap();
        assert!((num(&j, "range_m") - v / 4e6).abs() < 1e-6);
    }

    #[test]
    fn bad_files_and_inputs() {
        let e = parse("# MHz S RI\n1 0 0\n2 0 zero\n", "x.s1p", 50.0).unwrap_err();
        assert!(e.to_string().contains("line 3, column 5"), "{e}");
        assert!(parse("", "x.s1p", 50.0).is_err());
        let file = demo_sweep_file();
        let mut z = req("band", "hann");
        z.zoom = true;
        z.stop_m = 500.0;
        assert_eq!(compute(&file, &z), Err(Error::Unreachable("stop_m")));
        assert_eq!(
            compute(&file, &req("band", "blackman")),
            Err(Error::OutOfRange("window"))
        );
        let mut k = req("band", "kaiser");
        k.beta = -1.0;
        assert_eq!(compute(&file, &k), Err(Error::Negative("beta")));
    }
}

//! Reads a reflection sweep (Touchstone `.sNp`/`.ts` or CSV) and prints the
//! distance-to-fault peaks.
//!
//! ```text
//! cargo run -p echoline --example sweep_report -- [FILE] [--json] [--vf V]
//!     [--window rect|hann|hamming|kaiser[:BETA]] [--threshold RHO]
//! ```
//!
//! Without FILE it reads the bundled, invented demo sweep
//! (`examples/data/demo_feeder.s1p`, a fictional relay-site antenna feeder).
//! `--vf` is the cable's velocity factor (default 0.88, the demo's foam coax;
//! ±0.01 is used for the distance interval); `--window` defaults to Hann;
//! `--threshold` is the smallest |Γ| reported (default 0.02, a 34 dB return
//! loss). A file that does not parse gives a message naming its line and
//! column, and exit code 2.

use std::process::ExitCode;

use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::sweep::dtf::{band_pass_fft, Config};
use echoline::sweep::grid::DistanceGrid;
use echoline::sweep::peaks::{peaks_complex, Peaks};
use echoline::sweep::read_reflection;
use echoline::timing::VelocityRange;

const DEMO: &str = include_str!("data/demo_feeder.s1p");
const MAX_POINTS: usize = 100_001;

struct Args {
    file: Option<String>,
    json: bool,
    vf: f64,
    window: Window<f64>,
    threshold: f64,
}

fn parse_window(s: &str) -> Option<Window<f64>> {
    let (name, beta) = match s.split_once(':') {
        Some((n, b)) => (n, Some(b.parse::<f64>().ok()?)),
        None => (s, None),
    };
    match name.to_ascii_lowercase().as_str() {
        "rect" | "rectangular" => Some(Window::Rectangular),
        "hann" => Some(Window::Hann),
        "hamming" => Some(Window::Hamming),
        "kaiser" => Some(Window::Kaiser {
            beta: beta.unwrap_or(6.0),
        }),
        _ => None,
    }
}

fn parse_args() -> Result<Args, String> {
    let mut a = Args {
        file: None,
        json: false,
        vf: 0.88,
        window: Window::Hann,
        threshold: 0.02,
    };
    let mut it = std::env::args().skip(1);
    while let Some(arg) = it.next() {
        match arg.as_str() {
            "--json" => a.json = true,
            "--vf" => {
                let v = it.next().ok_or("--vf needs a value")?;
                a.vf = v.parse().map_err(|_| format!("--vf: not a number: {v}"))?;
            }
            "--window" => {
                let v = it.next().ok_or("--window needs a name")?;
                a.window = parse_window(&v).ok_or(format!(
                    "--window: {v}? (rect, hann, hamming, kaiser[:beta])"
                ))?;
            }
            "--threshold" => {
                let v = it.next().ok_or("--threshold needs a value")?;
                a.threshold = v
                    .parse()
                    .map_err(|_| format!("--threshold: not a number: {v}"))?;
            }
            "-h" | "--help" => {
                return Err("usage: sweep_report [FILE] [--json] [--vf V] \
                     [--window rect|hann|hamming|kaiser[:BETA]] [--threshold RHO]"
                    .into())
            }
            s if s.starts_with("--") => return Err(format!("unknown option {s}")),
            _ => a.file = Some(arg),
        }
    }
    Ok(a)
}

type Report = (usize, f64, f64, DistanceGrid<f64>, Peaks<f64, 64>);

/// Reads and transforms one sweep: (points, first and last frequency, grid, peaks).
fn analyse(name: &str, text: &str, args: &Args) -> Result<Report, String> {
    let lines = text.lines().count().min(MAX_POINTS);
    let mut f = vec![0.0f64; lines.max(1)];
    let mut g = vec![Cx::new(0.0, 0.0); lines.max(1)];
    let n =
        read_reflection(text, name, 50.0, &mut f, &mut g).map_err(|e| format!("{name}: {e}"))?;
    f.truncate(n);
    g.truncate(n);
    let velocity = VelocityRange::from_factor(args.vf, 0.01).map_err(|e| format!("--vf: {e}"))?;
    let cfg = Config {
        window: args.window,
        velocity,
    };
    let m = (4 * n).next_power_of_two().max(4096);
    let mut table = vec![Cx::new(0.0, 0.0); m / 2];
    fill_twiddles(&mut table).map_err(|e| e.to_string())?;
    let plan = Fft::new(&table).map_err(|e| e.to_string())?;
    let mut out = vec![Cx::new(0.0, 0.0); m];
    let grid = band_pass_fft(&f, &g, &cfg, &plan, &mut out).map_err(|e| format!("{name}: {e}"))?;
    let mut peaks: Peaks<f64, 64> = Peaks::new();
    peaks_complex(&out, &grid, args.threshold, &mut peaks).map_err(|e| e.to_string())?;
    Ok((n, f[0], f[n - 1], grid, peaks))
}

fn run() -> Result<(), String> {
    let args = parse_args()?;
    let (name, text) = match &args.file {
        Some(p) => (
            p.clone(),
            std::fs::read_to_string(p).map_err(|e| format!("{p}: {e}"))?,
        ),
        None => ("demo_feeder.s1p".to_string(), DEMO.to_string()),
    };
    let (n, f_first, f_last, grid, peaks) = analyse(&name, &text, &args)?;
    if args.json {
        let items: Vec<String> = peaks
            .iter()
            .map(|p| {
                format!(
                    "{{\"distance_m\":{},\"distance_lo_m\":{},\"distance_hi_m\":{},\"rho\":{},\"return_loss_db\":{}}}",
                    p.distance.distance_m, p.distance.lo_m, p.distance.hi_m, p.rho, p.return_loss_db
                )
            })
            .collect();
        println!(
            "{{\"peaks\":[{}],\"range_m\":{},\"resolution_m\":{}}}",
            items.join(","),
            grid.range_m,
            grid.resolution_m
        );
        return Ok(());
    }
    println!(
        "{name}: {n} points, {:.3} MHz to {:.3} MHz",
        f_first / 1e6,
        f_last / 1e6
    );
    println!(
        "window {:?}, VF {:.3} (±0.01), alias-free range {:.2} m, resolution {:.3} m, bins {:.4} m",
        args.window, args.vf, grid.range_m, grid.resolution_m, grid.step_m
    );
    println!(
        "{:>10}  {:>19}  {:>7}  {:>8}",
        "distance", "interval", "|Γ|", "RL"
    );
    for p in peaks.iter() {
        println!(
            "{:>8.3} m  {:>8.3} … {:>7.3} m  {:>7.4}  {:>5.1} dB",
            p.distance.distance_m, p.distance.lo_m, p.distance.hi_m, p.rho, p.return_loss_db
        );
    }
    if peaks.is_empty() {
        println!("no reflection above |Γ| = {}", args.threshold);
    }
    Ok(())
}

fn main() -> ExitCode {
    match run() {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("error: {e}");
            ExitCode::from(2)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn defaults() -> Args {
        Args {
            file: None,
            json: false,
            vf: 0.88,
            window: Window::Hann,
            threshold: 0.02,
        }
    }

    /// The demo's invented ground truth (examples/data/make_demo_sweep.py):
    /// wet connector at 12.4 m (5 cm, both edges in one peak), splice edges at
    /// 33.0 m and 33.4 m, antenna at 35.0 m.
    #[test]
    fn demo_faults_where_the_scenario_put_them() {
        let (n, _, _, grid, peaks) = analyse("demo_feeder.s1p", DEMO, &defaults()).unwrap();
        assert_eq!(n, 1601);
        let d: Vec<f64> = peaks.iter().map(|p| p.distance.distance_m).collect();
        assert_eq!(d.len(), 4, "{d:?}");
        for (got, want) in d.iter().zip([12.425, 33.0, 33.4, 35.0]) {
            assert!((got - want).abs() < grid.resolution_m, "{got} vs {want}");
        }
    }

    #[test]
    fn bad_file_names_the_line() {
        let e = analyse("x.s1p", "# MHz S RI\n1 0 0\n2 0 zero\n", &defaults()).unwrap_err();
        assert!(e.contains("line 3, column 5"), "{e}");
        assert_eq!(parse_window("kaiser:8"), Some(Window::Kaiser { beta: 8.0 }));
        assert_eq!(parse_window("blackman"), None);
    }
}

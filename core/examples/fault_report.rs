//! The main job, runnable: analyse a step trace and print a fault report.
//!
//! ```text
//! cargo run --release -p echoline --example fault_report
//! cargo run --release -p echoline --example fault_report -- trace.csv --preset foam-pe
//! cargo run --release -p echoline --example fault_report -- trace.csv --vf 0.66 --baseline good.csv
//! cargo run --release -p echoline --example fault_report -- samples.csv --dt 2.5e-10 --vf 0.8 --json
//! ```
//!
//! With no file it analyses the bundled demo trace (`examples/data/demo_trace.csv`
//! against `examples/data/demo_baseline.csv`), an invented scenario: the
//! telemetry feeder of the fictional Corrie Moss water-treatment works, 84.0 m
//! of 50 Ω foam-PE coax (VF 0.83 ± 0.01), far end open, crushed at 31.4 m
//! (a shunt capacitance of about 12 pF) and a corroded splice at 58.2 m (a
//! series inductance of about 60 nH). The data come from `make_demo.rs`
//! (the library's simulator with seeded noise). On this lossy run the
//! lumped values read low (about 10 pF and 47 nH: the skin-effect tail of
//! each excursion runs past the area window), and the open end shows as
//! "moved" by about 1.8 ns against the baseline: the edge is delayed in
//! passing the C and the L twice (τ = Z0·C/2 and L/(2·Z0) each way).
//!
//! **Input file.** Lines starting with `#` and blank lines are skipped. Either
//! a header and two columns `time_s,volts` (uniform sampling; the sample
//! interval comes from the time column), or one column of volts (a header is
//! optional) with `--dt <seconds>`. A bad file gives a message naming the line
//! and exit code 2; bad arguments exit with 1.
//!
//! **Options.** `--vf <value>` (± `--vf-tol`, default 0.01) or `--preset <name>`
//! (`solid-pe`, `foam-pe`, `ptfe`, `foam-ptfe`, `air`, `twisted-pair`, `xlpe`,
//! `paper`); `--z0 <ohm>` the instrument's source impedance (default 50);
//! `--baseline <file>` a trace of the same cable in good condition (prints the
//! differences); `--json` prints
//! `{"events":[{"t_s":…,"distance_m":…,"distance_lo_m":…,"distance_hi_m":…,"kind":"…","rho":…,…}]}`
//! with further fields after these (`z_after_ohm`, `lumped_f`/`lumped_h`,
//! `snr`; `null` where not finite). With `--json` the baseline differences
//! are not printed (the output is only that line).

use echoline::tdr::{
    compare, Analysis, ChangeKind, CompareSettings, DetectSettings, Event, EventKind, Lumped,
    Trace, TraceSetup,
};
use echoline::timing::presets::Preset;
use echoline::timing::VelocityRange;
use echoline::{Extended, Impedance};
use std::fmt::Write as _;

/// Events kept per trace.
const CAP: usize = 32;
const FT_PER_M: f64 = 1.0 / 0.3048;
const CAUTION: &str = "CAUTION: de-energise, discharge and lock out the cable before connecting; \
never connect to live conductors; use rated equipment; follow local codes and licensed practice.";

/// A trace read from a file.
#[derive(Debug, Clone, PartialEq)]
struct Loaded {
    volts: Vec<f64>,
    dt_s: f64,
}

/// Reads the CSV text (see the module docs). `dt_s` is required for one
/// column and refused for two. Errors name the 1-based line.
fn parse_csv(text: &str, dt_s: Option<f64>) -> Result<Loaded, String> {
    let mut volts = Vec::new();
    let mut times = Vec::new();
    let mut columns: Option<usize> = None;
    let mut header_seen = false;
    for (i, raw) in text.lines().enumerate() {
        let no = i + 1;
        let line = raw.trim();
        if line.is_empty() || line.starts_with('#') {
            continue;
        }
        let cells: Vec<&str> = line.split(',').map(str::trim).collect();
        let nums: Vec<Result<f64, _>> = cells.iter().map(|c| c.parse::<f64>()).collect();
        if !header_seen && volts.is_empty() && nums.iter().any(|n| n.is_err()) {
            header_seen = true;
            let want = if dt_s.is_some() { 1 } else { 2 };
            if cells.len() != want {
                return Err(format!(
                    "line {no}: header has {} columns, expected {} ({})",
                    cells.len(),
                    want,
                    if want == 2 {
                        "time_s,volts"
                    } else {
                        "one column of volts with --dt"
                    }
                ));
            }
            continue;
        }
        let n = *columns.get_or_insert(cells.len());
        if cells.len() != n {
            return Err(format!("line {no}: {} columns, expected {n}", cells.len()));
        }
        let mut vals = Vec::with_capacity(n);
        for (c, v) in cells.iter().zip(nums) {
            match v {
                Ok(x) if x.is_finite() => vals.push(x),
                _ => return Err(format!("line {no}: '{c}' is not a finite number")),
            }
        }
        match (n, dt_s) {
            (1, Some(_)) => volts.push(vals[0]),
            (2, None) => {
                times.push((no, vals[0]));
                volts.push(vals[1]);
            }
            (1, None) => {
                return Err(format!(
                    "line {no}: one column of samples needs --dt <seconds>"
                ))
            }
            (2, Some(_)) => {
                return Err(format!(
                    "line {no}: two columns (time_s,volts) carry their own time; drop --dt"
                ))
            }
            _ => return Err(format!("line {no}: {n} columns, expected time_s,volts")),
        }
    }
    if volts.len() < 16 {
        return Err(format!(
            "too few samples: {} (at least 16 needed)",
            volts.len()
        ));
    }
    let dt = match dt_s {
        Some(d) if d.is_finite() && d > 0.0 => d,
        Some(_) => return Err("--dt must be a positive number of seconds".into()),
        None => {
            let (_, t0) = times[0];
            let (_, t1) = times[times.len() - 1];
            let dt = (t1 - t0) / (times.len() - 1) as f64;
            if dt.is_nan() || dt <= 0.0 {
                return Err("the time column does not increase".into());
            }
            for (k, (no, t)) in times.iter().enumerate() {
                if ((t - t0) - k as f64 * dt).abs() > 0.01 * dt {
                    return Err(format!(
                        "line {no}: time {t} s breaks the uniform sampling of {dt:e} s"
                    ));
                }
            }
            dt
        }
    };
    Ok(Loaded { volts, dt_s: dt })
}

fn kind_name(k: EventKind) -> &'static str {
    match k {
        EventKind::OpenEnd => "open_end",
        EventKind::Short => "short",
        EventKind::ImpedanceUp => "impedance_up",
        EventKind::ImpedanceDown => "impedance_down",
        EventKind::Capacitive => "capacitive",
        EventKind::Inductive => "inductive",
        EventKind::Resistive => "resistive",
        EventKind::EndOfTrace => "end_of_trace",
    }
}

fn kind_text(k: EventKind) -> &'static str {
    match k {
        EventKind::OpenEnd => "open end",
        EventKind::Short => "short",
        EventKind::ImpedanceUp => "impedance up",
        EventKind::ImpedanceDown => "impedance down",
        EventKind::Capacitive => "capacitive (shunt C)",
        EventKind::Inductive => "inductive (series L)",
        EventKind::Resistive => "resistive fault/end",
        EventKind::EndOfTrace => "end of trace",
    }
}

fn json_num(x: f64) -> String {
    if x.is_finite() {
        format!("{x}")
    } else {
        "null".into()
    }
}

fn z_ohm(z: &Impedance<f64>) -> f64 {
    match z {
        Impedance::Finite(c) => c.re,
        Impedance::Open => f64::INFINITY,
    }
}

/// The JSON line for other tools.
fn json(events: &[Event<f64>]) -> String {
    let mut s = String::from("{\"events\":[");
    for (i, e) in events.iter().enumerate() {
        if i > 0 {
            s.push(',');
        }
        let _ = write!(
            s,
            "{{\"t_s\":{},\"distance_m\":{},\"distance_lo_m\":{},\"distance_hi_m\":{},\"kind\":\"{}\",\"rho\":{}",
            json_num(e.round_trip_s),
            json_num(e.distance.distance_m),
            json_num(e.distance.lo_m),
            json_num(e.distance.hi_m),
            kind_name(e.kind),
            json_num(e.rho)
        );
        let _ = write!(s, ",\"z_after_ohm\":{}", json_num(z_ohm(&e.z_after)));
        match e.lumped {
            Lumped::Capacitance { farads } => {
                let _ = write!(s, ",\"lumped_f\":{}", json_num(farads));
            }
            Lumped::Inductance { henries } => {
                let _ = write!(s, ",\"lumped_h\":{}", json_num(henries));
            }
            _ => {}
        }
        let snr = match e.snr {
            Extended::Finite(x) => x,
            _ => f64::INFINITY,
        };
        let _ = write!(s, ",\"snr\":{}}}", json_num(snr));
    }
    s.push_str("]}");
    s
}

fn si(x: f64, unit: &str) -> String {
    let a = x.abs();
    let (k, p) = if a >= 1e-3 {
        (1e3, "m")
    } else if a >= 1e-6 {
        (1e6, "µ")
    } else if a >= 1e-9 {
        (1e9, "n")
    } else {
        (1e12, "p")
    };
    format!("{:.1} {p}{unit}", x * k)
}

/// The human report.
fn report(title: &str, a: &Analysis<f64, CAP>, v: &VelocityRange<f64>) -> String {
    let mut s = String::new();
    let _ = writeln!(s, "{CAUTION}");
    let _ = writeln!(s, "Fault report: {title}");
    let _ = writeln!(
        s,
        "velocity {:.1} m/µs (VF {:.3}, range {:.3}-{:.3}); noise {:.2} mV RMS; dead zone {:.2} m; range {:.1} m",
        v.nominal_m_per_s / 1e6,
        v.velocity_factor(),
        v.lo_m_per_s / 299_792_458.0,
        v.hi_m_per_s / 299_792_458.0,
        a.noise.sigma_v * 1e3,
        a.dead_zone.distance_m,
        a.range.distance_m
    );
    if a.masked_by_dead_zone {
        let _ = writeln!(s, "note: something is reflecting inside the dead zone");
    }
    if a.clipping.count > 0 {
        let _ = writeln!(s, "note: {} clipped samples", a.clipping.count);
    }
    let _ = writeln!(
        s,
        "{:>3}  {:>9} {:>19}  {:>9} {:>19}  {:<22} {:>7} {:>10}  value",
        "#", "m", "interval m", "ft", "interval ft", "kind", "rho", "Z after"
    );
    for (i, e) in a.events.iter().enumerate() {
        let d = &e.distance;
        // An open end or short is named as such: on a lossy cable the level
        // right after its edge is still rising, so Z from it would mislead.
        let z = match (e.kind, e.z_after) {
            (EventKind::OpenEnd, _) | (_, Impedance::Open) => "open".into(),
            (EventKind::Short, _) => "short".into(),
            (_, Impedance::Finite(c)) => format!("{:.1} Ω", c.re),
        };
        let value = match e.lumped {
            Lumped::Capacitance { farads } => format!("C = {}", si(farads, "F")),
            Lumped::Inductance { henries } => format!("L = {}", si(henries, "H")),
            _ => String::new(),
        };
        let _ = writeln!(
            s,
            "{:>3}  {:>9.2} {:>8.2} .. {:>8.2}  {:>9.1} {:>8.1} .. {:>8.1}  {:<22} {:>+7.3} {:>10}  {}",
            i + 1,
            d.distance_m,
            d.lo_m,
            d.hi_m,
            d.distance_m * FT_PER_M,
            d.lo_m * FT_PER_M,
            d.hi_m * FT_PER_M,
            kind_text(e.kind),
            e.rho,
            z,
            value
        );
    }
    if a.echoes_after_end > 0 {
        let _ = writeln!(
            s,
            "{} later reflections after the end are echoes, not reported",
            a.echoes_after_end
        );
    }
    s
}

fn differences(today: &[Event<f64>], base: &[Event<f64>], dt_s: f64) -> Result<String, String> {
    let set = CompareSettings::with_window(20.0 * dt_s);
    let ch = compare::<f64, CAP>(today, base, &set).map_err(|e| format!("compare: {e}"))?;
    let mut s = String::from("Differences from the baseline:\n");
    if ch.is_empty() {
        s.push_str("  none\n");
    }
    for c in ch.iter() {
        let e = c
            .today
            .and_then(|i| today.get(i))
            .or(c.reference.and_then(|i| base.get(i)));
        let Some(e) = e else { continue };
        let what = match c.kind {
            ChangeKind::New => "new",
            ChangeKind::Gone => "gone",
            ChangeKind::Moved => "moved",
            ChangeKind::RhoChanged => "reflection changed",
        };
        let _ = writeln!(
            s,
            "  {what:<18} {:>8.2} m ({:.1} ft)  {}  rho {:+.3}{}",
            e.distance.distance_m,
            e.distance.distance_m * FT_PER_M,
            kind_text(e.kind),
            e.rho,
            if c.kind == ChangeKind::RhoChanged || c.kind == ChangeKind::Moved {
                format!(
                    " (Δrho {:+.3}, shift {:.2} ns)",
                    c.delta_rho,
                    c.shift_s * 1e9
                )
            } else {
                String::new()
            }
        );
    }
    Ok(s)
}

fn analyse(t: &Loaded, v: VelocityRange<f64>, z0: f64) -> Result<Analysis<f64, CAP>, String> {
    let setup = TraceSetup::measured(t.dt_s, z0, v);
    let trace = Trace::new(&t.volts[..], setup).map_err(|e| format!("trace: {e}"))?;
    trace
        .analyse::<CAP>(&DetectSettings::default())
        .map_err(|e| format!("analysis: {e}"))
}

/// Parsed command line.
#[derive(Debug, Default)]
struct Args {
    file: Option<String>,
    baseline: Option<String>,
    dt_s: Option<f64>,
    vf: Option<f64>,
    vf_tol: Option<f64>,
    preset: Option<String>,
    z0: Option<f64>,
    json: bool,
}

fn parse_args(it: impl Iterator<Item = String>) -> Result<Args, String> {
    let mut a = Args::default();
    let mut it = it.peekable();
    let num = |name: &str, v: Option<String>| -> Result<f64, String> {
        let v = v.ok_or(format!("{name} needs a value"))?;
        v.parse::<f64>()
            .ok()
            .filter(|x| x.is_finite())
            .ok_or(format!("{name}: '{v}' is not a number"))
    };
    while let Some(x) = it.next() {
        match x.as_str() {
            "--json" => a.json = true,
            "--dt" => a.dt_s = Some(num("--dt", it.next())?),
            "--vf" => a.vf = Some(num("--vf", it.next())?),
            "--vf-tol" => a.vf_tol = Some(num("--vf-tol", it.next())?),
            "--z0" => a.z0 = Some(num("--z0", it.next())?),
            "--preset" => a.preset = Some(it.next().ok_or("--preset needs a name")?),
            "--baseline" => a.baseline = Some(it.next().ok_or("--baseline needs a file")?),
            "-h" | "--help" => return Err(String::new()),
            s if s.starts_with("--") => return Err(format!("unknown option {s}")),
            s if a.file.is_none() => a.file = Some(s.to_string()),
            s => return Err(format!("unexpected argument {s}")),
        }
    }
    if a.vf.is_some() && a.preset.is_some() {
        return Err("give --vf or --preset, not both".into());
    }
    Ok(a)
}

fn velocity(a: &Args, demo: bool) -> Result<VelocityRange<f64>, String> {
    if let Some(p) = &a.preset {
        let p = Preset::from_name(p).map_err(|_| {
            let names: Vec<&str> = Preset::ALL.iter().map(|p| p.name()).collect();
            format!("unknown preset '{p}' (one of {})", names.join(", "))
        })?;
        return Ok(VelocityRange::from_preset(p));
    }
    let vf = match (a.vf, demo) {
        (Some(v), _) => v,
        (None, true) => 0.83,
        (None, false) => return Err("give the velocity: --vf <value> or --preset <name>".into()),
    };
    VelocityRange::from_factor(vf, a.vf_tol.unwrap_or(0.01)).map_err(|e| format!("--vf: {e}"))
}

fn data_path(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("examples/data")
        .join(name)
}

fn load(path: &std::path::Path, dt_s: Option<f64>) -> Result<Loaded, String> {
    let text = std::fs::read_to_string(path)
        .map_err(|e| format!("{}: cannot read: {e}", path.display()))?;
    parse_csv(&text, dt_s).map_err(|e| format!("{}: {e}", path.display()))
}

fn run(a: &Args) -> Result<String, (i32, String)> {
    let demo = a.file.is_none();
    let v = velocity(a, demo).map_err(|e| (1, e))?;
    let z0 = a.z0.unwrap_or(50.0);
    let (path, base) = match &a.file {
        Some(f) => (
            std::path::PathBuf::from(f),
            a.baseline.as_ref().map(std::path::PathBuf::from),
        ),
        None => (
            data_path("demo_trace.csv"),
            Some(
                a.baseline
                    .as_ref()
                    .map_or_else(|| data_path("demo_baseline.csv"), std::path::PathBuf::from),
            ),
        ),
    };
    let t = load(&path, a.dt_s).map_err(|e| (2, e))?;
    let an = analyse(&t, v, z0).map_err(|e| (2, format!("{}: {e}", path.display())))?;
    let mut out = if a.json {
        json(&an.events)
    } else {
        let title = if demo {
            "demo, Corrie Moss water-treatment works telemetry feeder (invented scenario)"
                .to_string()
        } else {
            path.display().to_string()
        };
        report(&title, &an, &v)
    };
    if let (Some(b), false) = (base, a.json) {
        let bt = load(&b, a.dt_s).map_err(|e| (2, e))?;
        let ba = analyse(&bt, v, z0).map_err(|e| (2, format!("{}: {e}", b.display())))?;
        out.push_str(&differences(&an.events, &ba.events, t.dt_s).map_err(|e| (2, e))?);
    }
    Ok(out)
}

fn main() {
    let args = match parse_args(std::env::args().skip(1)) {
        Ok(a) => a,
        Err(e) => {
            if !e.is_empty() {
                eprintln!("error: {e}");
            }
            eprintln!(
                "usage: fault_report [FILE.csv] [--vf V [--vf-tol T] | --preset NAME] [--dt S] [--z0 OHM] [--baseline FILE.csv] [--json]"
            );
            std::process::exit(1);
        }
    };
    match run(&args) {
        Ok(s) => println!("{}", s.trim_end()),
        Err((code, e)) => {
            eprintln!("error: {e}");
            std::process::exit(code);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn two_column_csv_with_comments_and_header() {
        let mut s = String::from("# a comment\n\ntime_s,volts\n");
        for i in 0..20 {
            let _ = writeln!(s, "{:e},{}", i as f64 * 1e-9, i as f64 / 10.0);
        }
        let t = parse_csv(&s, None).unwrap();
        assert_eq!(t.volts.len(), 20);
        assert!((t.dt_s - 1e-9).abs() < 1e-21);
        assert_eq!(t.volts[3], 0.3);
    }

    #[test]
    fn one_column_needs_dt_and_header_is_optional() {
        let body: String = (0..20).map(|i| format!("{}\n", i as f64)).collect();
        assert!(parse_csv(&body, None).unwrap_err().contains("--dt"));
        let t = parse_csv(&body, Some(2e-10)).unwrap();
        assert_eq!((t.volts.len(), t.dt_s), (20, 2e-10));
        let t = parse_csv(&format!("volts\n{body}"), Some(2e-10)).unwrap();
        assert_eq!(t.volts.len(), 20);
    }

    #[test]
    fn bad_files_name_the_line() {
        let mut s = String::from("time_s,volts\n");
        for i in 0..20 {
            let _ = writeln!(s, "{:e},0.5", i as f64 * 1e-9);
        }
        let bad = s.replacen("0.5\n", "0.5x\n", 4);
        let e = parse_csv(&bad, None).unwrap_err();
        assert!(e.starts_with("line 2:"), "{e}");
        let lines: Vec<&str> = s.lines().collect();
        let mut broken = lines.clone();
        broken[7] = "6e-9,nan";
        assert!(parse_csv(&broken.join("\n"), None)
            .unwrap_err()
            .starts_with("line 8:"));
        broken = lines.clone();
        broken[9] = "8e-9,1,2";
        assert!(parse_csv(&broken.join("\n"), None)
            .unwrap_err()
            .starts_with("line 10:"));
        broken = lines.clone();
        broken[12] = "1.3e-8,0.5";
        assert!(parse_csv(&broken.join("\n"), None)
            .unwrap_err()
            .starts_with("line 13:"));
        assert!(parse_csv("time_s,volts\n1,2\n", None)
            .unwrap_err()
            .contains("too few"));
        assert!(parse_csv("a,b,c\n", None)
            .unwrap_err()
            .starts_with("line 1:"));
    }

    #[test]
    fn arguments() {
        let a = parse_args(
            [
                "f.csv",
                "--preset",
                "foam-pe",
                "--json",
                "--baseline",
                "b.csv",
            ]
            .iter()
            .map(|s| s.to_string()),
        )
        .unwrap();
        assert_eq!(a.file.as_deref(), Some("f.csv"));
        assert!(a.json);
        let v = velocity(&a, false).unwrap();
        assert!((v.velocity_factor() - 0.83).abs() < 1e-12);
        assert!(parse_args(["--vf"].iter().map(|s| s.to_string())).is_err());
        assert!(parse_args(["--bogus"].iter().map(|s| s.to_string())).is_err());
        let none = parse_args(["x.csv"].iter().map(|s| s.to_string())).unwrap();
        assert!(velocity(&none, false).is_err());
        let bad = parse_args(["--preset", "pvc"].iter().map(|s| s.to_string())).unwrap();
        assert!(velocity(&bad, false).unwrap_err().contains("foam-pe"));
    }

    fn demo() -> (Analysis<f64, CAP>, VelocityRange<f64>) {
        let v = VelocityRange::from_factor(0.83, 0.01).unwrap();
        let t = load(&data_path("demo_trace.csv"), None).unwrap();
        (analyse(&t, v, 50.0).unwrap(), v)
    }

    /// The scenario of make_demo.rs: shunt C ≈ 12 pF at 31.4 m, series
    /// L ≈ 60 nH at 58.2 m, open end at 84.0 m (VF 0.8305 from the foam's
    /// εr 1.45, read with VF 0.83 ± 0.01).
    #[test]
    fn demo_report_finds_the_two_faults_and_the_end() {
        let (a, v) = demo();
        let kinds: Vec<EventKind> = a.events.iter().map(|e| e.kind).collect();
        assert_eq!(
            kinds,
            [
                EventKind::Capacitive,
                EventKind::Inductive,
                EventKind::OpenEnd
            ],
            "{kinds:?}"
        );
        for (e, d) in a.events.iter().zip([31.4, 58.2, 84.0]) {
            let x = &e.distance;
            assert!(x.lo_m <= d && d <= x.hi_m, "{d}: {x:?}");
            assert!((x.distance_m - d).abs() < 0.005 * d, "{d}: {x:?}");
        }
        // The lumped values read low on a lossy cable (about 10 pF and 47 nH
        // here): the skin-effect tail of the excursion runs past the area
        // window. Within 25 % is the honest claim.
        match a.events[0].lumped {
            Lumped::Capacitance { farads } => assert!((farads / 12e-12 - 1.0).abs() < 0.25),
            l => panic!("{l:?}"),
        }
        match a.events[1].lumped {
            Lumped::Inductance { henries } => assert!((henries / 60e-9 - 1.0).abs() < 0.25),
            l => panic!("{l:?}"),
        }
        let r = report("demo", &a, &v);
        assert!(r.starts_with("CAUTION"));
        assert!(r.contains("capacitive") && r.contains("inductive") && r.contains("open end"));
        assert!(r.contains(" ft") || r.contains("ft"));
        let b = load(&data_path("demo_baseline.csv"), None).unwrap();
        let ba = analyse(&b, v, 50.0).unwrap();
        let d = differences(&a.events, &ba.events, 250e-12).unwrap();
        assert_eq!(d.matches("new").count(), 2, "{d}");
    }

    #[test]
    fn json_has_the_documented_fields_in_order() {
        let (a, _) = demo();
        let j = json(&a.events);
        assert!(j.starts_with("{\"events\":[{\"t_s\":"), "{j}");
        assert!(j.ends_with("}]}"));
        let first = &j[..j.find('}').unwrap()];
        let order = [
            "\"t_s\":",
            "\"distance_m\":",
            "\"distance_lo_m\":",
            "\"distance_hi_m\":",
            "\"kind\":\"capacitive\"",
            "\"rho\":",
        ];
        let mut at = 0;
        for k in order {
            let p = first[at..]
                .find(k)
                .unwrap_or_else(|| panic!("{k} in {first}"));
            at += p + k.len();
        }
        assert_eq!(j.matches("\"kind\"").count(), 3);
        assert!(!j.contains("NaN") && !j.contains("inf"));
    }
}

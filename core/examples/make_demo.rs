//! Writes the demo traces of `fault_report` (`examples/data/demo_trace.csv`
//! and `examples/data/demo_baseline.csv`) with the library's simulator, so the
//! committed data are reproducible:
//!
//! ```text
//! cargo run -p echoline --example make_demo
//! ```
//!
//! **Scenario (invented for the demo; the site, the cable and the faults are
//! fictional).** Corrie Moss water-treatment works: the telemetry feeder from
//! the control building to the radio mast beside the filter beds, 84.0 m of
//! 50 Ω foam-polyethylene coax (inner 2.8 mm, shield 7.64 mm, copper, foam
//! εr 1.45, tanδ 1e-4: VF ≈ 0.83, 0.83 ± 0.01 from a calibration on a spare
//! drum). The radio link dropped out after groundworks. The far end was
//! disconnected from the antenna for the test (open). Two faults:
//!
//! 1. 31.4 m, under the access-road crossing: the cable was crushed by a
//!    vehicle, a lumped shunt capacitance of about 12 pF;
//! 2. 58.2 m, at the splice in the cable pit by filter bed 3: a loose,
//!    corroded connector pair, a lumped series inductance of about 60 nH.
//!
//! The baseline is the same run as commissioned (no faults). The instrument:
//! 2 V open-circuit step behind 50 Ω (1 V into the line), 1 ns 10–90 % rise,
//! 250 ps sampling, 3200 samples, 2 mV RMS noise (seeded).

use echoline::line::coax::Coax;
use echoline::line::dielectric::Dielectric;
use echoline::math::complex::Cx;
use echoline::network::cascade::{Cascade, Element};
use echoline::network::load::{Load, Rlc};
use echoline::tdr::sim::{simulate, Noise, Sampling, Source, Terminated};
use std::fmt::Write as _;

/// Sample interval, s.
pub const DT_S: f64 = 250e-12;
/// Samples per trace.
pub const SAMPLES: usize = 3200;
/// Distance of the crushed section, m.
pub const CRUSH_M: f64 = 31.4;
/// Distance of the corroded splice, m.
pub const SPLICE_M: f64 = 58.2;
/// Length of the run, m.
pub const RUN_M: f64 = 84.0;

fn trace(faults: bool, seed: u64) -> Result<Vec<f64>, echoline::Error> {
    let foam = Dielectric::wideband_debye(1.45, 1e-4, 1e9)?;
    let coax = Coax::new(2.8e-3, 7.64e-3, foam, 5.8e7, 0.3e-3)?;
    let mut c: Cascade<f64, 8> = Cascade::new();
    if faults {
        c.push_line(&coax, CRUSH_M)?;
        c.push(Element::Shunt(Load::Series(Rlc::new(
            None,
            None,
            Some(12e-12),
        ))))?;
        c.push_line(&coax, SPLICE_M - CRUSH_M)?;
        c.push(Element::Series(Load::Series(Rlc::new(
            None,
            Some(60e-9),
            None,
        ))))?;
        c.push_line(&coax, RUN_M - SPLICE_M)?;
    } else {
        c.push_line(&coax, RUN_M)?;
    }
    let src = Source::step(2.0, 1e-9, 50.0, 10e-9)?;
    let mut out = vec![0.0; SAMPLES];
    let mut work = vec![Cx::new(0.0, 0.0); 4 * SAMPLES.next_power_of_two()];
    let port = Terminated {
        cascade: &c,
        load: Load::Open,
    };
    let noise = Some(Noise { rms_v: 2e-3, seed });
    simulate(
        &port,
        &src,
        &Sampling {
            sample_interval_s: DT_S,
        },
        noise,
        &mut out,
        &mut work,
    )?;
    Ok(out)
}

fn csv(title: &str, v: &[f64]) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "# Echoline demo trace (invented scenario, fictional site): {title}"
    );
    let _ = writeln!(
        s,
        "# Corrie Moss water-treatment works, telemetry feeder to the radio mast,"
    );
    let _ = writeln!(
        s,
        "# 84.0 m of 50 ohm foam-PE coax (VF 0.83 +/- 0.01), far end open."
    );
    let _ = writeln!(
        s,
        "# Simulated by core/examples/make_demo.rs: 1 V step into 50 ohm, 1 ns rise, 2 mV RMS noise."
    );
    let _ = writeln!(s, "time_s,volts");
    for (i, x) in v.iter().enumerate() {
        let _ = writeln!(s, "{:.9e},{:.6}", i as f64 * DT_S, x);
    }
    s
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/data");
    std::fs::create_dir_all(&dir)?;
    let today = trace(true, 2026).map_err(|e| format!("simulation: {e}"))?;
    let base = trace(false, 1999).map_err(|e| format!("simulation: {e}"))?;
    std::fs::write(
        dir.join("demo_trace.csv"),
        csv(
            "after the groundworks; crushed at 31.4 m (about 12 pF), corroded splice at 58.2 m (about 60 nH)",
            &today,
        ),
    )?;
    std::fs::write(
        dir.join("demo_baseline.csv"),
        csv("as commissioned (no faults)", &base),
    )?;
    println!(
        "wrote {} and demo_baseline.csv",
        dir.join("demo_trace.csv").display()
    );
    Ok(())
}

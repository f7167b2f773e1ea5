//! Cascades of arbitrary elements evaluated at arbitrary frequencies: input
//! impedance (one point and a sweep, which must agree), reflection figures,
//! S/Z/Y parameters. Results or typed errors, no panic, no NaN in a valid result.
#![no_main]

use echoline::line::lossless::Lossless;
use echoline::line::rlgc::Rlgc;
use echoline::math::complex::Cx;
use echoline::network::cascade::{Cascade, Element};
use echoline::network::load::{Load, Rlc};
use echoline::network::reflection::{return_loss_db, smith_point, vswr};
use echoline::Impedance;
use libfuzzer_sys::fuzz_target;

mod common;
use common::{no_nan, Floats};

fn opt(x: &mut Floats<'_>) -> Option<f64> {
    if x.byte() % 2 == 0 {
        Some(x.f64())
    } else {
        None
    }
}

fn load(x: &mut Floats<'_>) -> Load<f64> {
    match x.byte() % 6 {
        0 => Load::Open,
        1 => Load::Short,
        2 => Load::Resistor(x.f64()),
        3 => Load::Fixed(Cx::new(x.f64(), x.f64())),
        4 => Load::Series(Rlc::new(opt(x), opt(x), opt(x))),
        _ => Load::Parallel(Rlc::new(opt(x), opt(x), opt(x))),
    }
}

fuzz_target!(|data: &[u8]| {
    let mut x = Floats::new(data);
    let lossless = Lossless::new(50.0, 0.66).ok();
    let lossy = Rlgc::constant(x.f64(), x.f64(), x.f64(), x.f64()).ok();
    let mut c: Cascade<f64, 4> = Cascade::new();
    for _ in 0..(x.byte() % 6) {
        let e = match x.byte() % 5 {
            0 => match &lossless {
                Some(l) => Element::Line {
                    model: l,
                    length_m: x.f64(),
                },
                None => continue,
            },
            1 => match &lossy {
                Some(l) => Element::Line {
                    model: l,
                    length_m: x.f64(),
                },
                None => continue,
            },
            2 => Element::Series(load(&mut x)),
            3 => Element::Shunt(load(&mut x)),
            _ => Element::Transformer {
                turns_ratio: x.f64(),
            },
        };
        let _ = c.push(e);
    }
    let f = x.f64();
    let ld = load(&mut x);
    if let Ok(z) = c.input_impedance(f, &ld) {
        if let Impedance::Finite(z) = z {
            no_nan(z.re, "zin.re");
            no_nan(z.im, "zin.im");
        }
        let zr = Cx::new(50.0, 0.0);
        if let Ok(p) = smith_point(z, zr) {
            no_nan(p.gamma.re, "gamma.re");
            let m = p.gamma.norm();
            let _ = vswr(m);
            let _ = return_loss_db(m);
        }
    }
    // A sweep of up to 20 arbitrary frequencies (a full 16-lane block and a
    // partial one): a valid sweep equals its points one by one.
    let nf = x.byte() as usize % 21;
    let mut freqs = [0.0f64; 20];
    for v in freqs.iter_mut().take(nf) {
        *v = x.f64();
    }
    let mut out = [Impedance::Open; 20];
    if c.input_impedance_sweep(&freqs[..nf], &ld, &mut out[..nf])
        .is_ok()
    {
        for (f, z) in freqs.iter().zip(out.iter()).take(nf) {
            if let Impedance::Finite(v) = z {
                no_nan(v.re, "sweep zin.re");
                no_nan(v.im, "sweep zin.im");
            }
            assert_eq!(
                c.input_impedance(*f, &ld),
                Ok(*z),
                "sweep vs point at {f:e}"
            );
        }
    }
    let zr = x.f64();
    if let Ok(s) = c.s_params(f, zr) {
        if s.s11.re.is_nan() {
            panic!(
                "NaN s11 at f {f:e}, zr {zr:e}, cascade {:?}, s {s:?}",
                c.elements()
            );
        }
        no_nan(s.s21.re, "s21");
    }
    let _ = c.z_params(f);
    let _ = c.y_params(f);
});

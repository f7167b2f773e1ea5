//! Distance-to-fault transforms of arbitrary sweeps (frequencies and
//! reflections from raw bytes: NaN, ±∞, non-uniform, huge and tiny values)
//! with arbitrary windows, velocities, zoom windows and rise times: a result
//! or a typed error, no panic, and a valid result holds no NaN.
#![no_main]

use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::sweep::dtf::{
    band_pass_fft, band_pass_zoom, low_pass, zoom_work_len, Config, LowPass,
};
use echoline::sweep::peaks::{peaks_complex, peaks_real, Peaks};
use echoline::timing::VelocityRange;
use libfuzzer_sys::fuzz_target;

mod common;
use common::Floats;

fuzz_target!(|data: &[u8]| {
    let mut x = Floats::new(data);
    let mode = x.byte();
    let n = 2 + (x.byte() as usize % 62);
    // Mostly uniform grids (so the transforms run), sometimes arbitrary ones.
    let (f0, df) = if mode & 1 == 0 {
        (1e6 * (x.byte() as f64), 1e6 + x.byte() as f64 * 1e5)
    } else {
        (x.f64(), x.f64())
    };
    let mut freqs = [0.0f64; 64];
    let mut gamma = [Cx::new(0.0, 0.0); 64];
    for i in 0..n {
        freqs[i] = if mode & 2 == 0 {
            f0 + df * i as f64
        } else {
            x.f64()
        };
        gamma[i] = if mode & 4 == 0 {
            Cx::new(
                (x.byte() as f64 - 128.0) / 128.0,
                (x.byte() as f64 - 128.0) / 128.0,
            )
        } else {
            Cx::new(x.f64(), x.f64())
        };
    }
    let (freqs, gamma) = (&freqs[..n], &gamma[..n]);
    let window = match x.byte() % 4 {
        0 => Window::Rectangular,
        1 => Window::Hann,
        2 => Window::Hamming,
        _ => Window::Kaiser { beta: x.f64() },
    };
    let vf = if mode & 8 == 0 { 0.66 } else { x.f64() };
    let Ok(velocity) = VelocityRange::from_factor(vf, 0.01) else {
        return;
    };
    let cfg = Config { window, velocity };
    let mut table = [Cx::new(0.0, 0.0); 128];
    if fill_twiddles(&mut table).is_err() {
        return;
    }
    let Ok(plan) = Fft::new(&table) else { return };
    let mut out = [Cx::new(0.0, 0.0); 256];
    let mut peaks: Peaks<f64, 16> = Peaks::new();
    if let Ok(grid) = band_pass_fft(freqs, gamma, &cfg, &plan, &mut out[..128]) {
        for z in out[..128].iter() {
            assert!(
                !z.re.is_nan() && !z.im.is_nan(),
                "NaN in band-pass output: f {:?} g {:?} cfg {:?} grid {:?}",
                &freqs[..n.min(4)],
                &gamma[..n.min(4)],
                cfg,
                grid
            );
        }
        let _ = peaks_complex(&out[..128], &grid, 0.05, &mut peaks);
    }
    let (start, stop) = (x.f64(), x.f64());
    if let Ok(need) = zoom_work_len(n, 64) {
        if need <= 2048 {
            let mut work = [Cx::new(0.0, 0.0); 2048];
            let mut zout = [Cx::new(0.0, 0.0); 64];
            if band_pass_zoom(
                freqs,
                gamma,
                &cfg,
                start,
                stop,
                &mut zout,
                &mut work[..need],
            )
            .is_ok()
            {
                for z in zout.iter() {
                    assert!(!z.re.is_nan(), "NaN in zoom output");
                }
            }
        }
    }
    let kind = if mode & 16 == 0 {
        LowPass::Impulse
    } else {
        LowPass::Step {
            rise_time_s: if mode & 32 == 0 { None } else { Some(x.f64()) },
        }
    };
    let mut work = [Cx::new(0.0, 0.0); 256];
    let mut real = [0.0f64; 256];
    if let Ok(grid) = low_pass(freqs, gamma, &cfg, kind, &plan, &mut work, &mut real) {
        for v in real.iter() {
            assert!(
                !v.is_nan(),
                "NaN in low-pass output: f {:?} g {:?} cfg {:?} kind {kind:?} grid {grid:?}",
                &freqs[..n.min(4)],
                &gamma[..n.min(4)],
                cfg
            );
        }
        let _ = peaks_real(&real, &grid, 0.05, &mut peaks);
    }
});

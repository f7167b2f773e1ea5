//! The Touchstone and CSV sweep readers with arbitrary text, every port-count
//! hint and both precisions, then the band-pass transform and peak search on
//! whatever parsed: a result or a typed error, never a panic, never a
//! non-finite value accepted.
#![no_main]

use echoline::math::complex::Cx;
use echoline::math::fft::{fill_twiddles, Fft};
use echoline::math::window::Window;
use echoline::sweep::dtf::{band_pass_fft, Config};
use echoline::sweep::peaks::{peaks_complex, Peaks};
use echoline::sweep::read_reflection;
use echoline::timing::VelocityRange;
use echoline::Real;
use libfuzzer_sys::fuzz_target;

fn run<T: Real>(text: &str) {
    let mut f = [T::zero(); 64];
    let mut g = [Cx::new(T::zero(), T::zero()); 64];
    for name in ["a.s1p", "a.s2p", "a.s3p", "a.s4p", "a.s9p", "a.ts", "a.csv"] {
        let Ok(n) = read_reflection(text, name, T::lit(50.0), &mut f, &mut g) else {
            continue;
        };
        let (fs, gs) = (&f[..n], &g[..n]);
        assert!(
            fs.iter().all(|x| x.is_finite()),
            "non-finite frequency from {text:?}"
        );
        assert!(
            gs.iter().all(|z| z.re.is_finite() && z.im.is_finite()),
            "non-finite gamma"
        );
        let mut table = [Cx::new(T::zero(), T::zero()); 64];
        fill_twiddles(&mut table).unwrap();
        let plan = Fft::new(&table).unwrap();
        let cfg = Config {
            window: Window::Hann,
            velocity: VelocityRange::from_factor(T::lit(0.66), T::lit(0.01)).unwrap(),
        };
        let mut out = [Cx::new(T::zero(), T::zero()); 128];
        if let Ok(grid) = band_pass_fft(fs, gs, &cfg, &plan, &mut out) {
            let mut pk: Peaks<T, 16> = Peaks::new();
            let _ = peaks_complex(&out, &grid, T::lit(0.01), &mut pk);
        }
    }
}

fuzz_target!(|data: &[u8]| {
    if let Ok(text) = core::str::from_utf8(data) {
        run::<f64>(text);
        run::<f32>(text);
    }
});

//! Firmware image running the echoline firmware path in f32.
#![no_std]
#![no_main]

#[path = "../harness.rs"]
mod harness;
#[path = "../path.rs"]
mod path;

use path::Sink;

#[cfg(not(feature = "no-panic-proof"))]
#[panic_handler]
fn panic(_: &core::panic::PanicInfo) -> ! {
    harness::exit(false)
}

#[cfg(feature = "no-panic-proof")]
use panic_never as _;

/// Report keys of the per-phase stack figures (same order as `path::PHASES`).
const STACK_KEYS: [&str; 5] = [
    "stack.line",
    "stack.datasheet",
    "stack.sweep",
    "stack.trace",
    "stack.dtf",
];

/// Runs one phase in a frame of its own, below the painted stack top (never
/// inlined into `main`, whose frame is not measured).
#[inline(never)]
fn run_phase(phase: &str, out: &mut harness::Semi) {
    path::run_phase::<f32, _>(phase, out);
}

#[cortex_m_rt::entry]
fn main() -> ! {
    let mut out = harness::Semi::new();
    for (phase, key) in path::PHASES.iter().zip(STACK_KEYS) {
        let top = harness::paint_stack();
        run_phase(phase, &mut out);
        let used = harness::stack_used(top);
        out.put(key, used as u64);
    }
    let ok = !out.failed;
    harness::exit(ok)
}

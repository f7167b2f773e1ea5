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

#[cortex_m_rt::entry]
fn main() -> ! {
    let mut out = harness::Semi::new();
    let top = harness::paint_stack();
    path::run::<f32, _>(&mut out);
    let used = harness::stack_used(top);
    out.put("stack_bytes", used as u64);
    let ok = !out.failed;
    harness::exit(ok)
}

//! Firmware image running the echoline firmware path in f64.
#![no_std]
#![no_main]

#[path = "../harness.rs"]
mod harness;
#[path = "../path.rs"]
mod path;

#[cfg(not(feature = "no-panic-proof"))]
#[panic_handler]
fn panic(_: &core::panic::PanicInfo) -> ! {
    harness::exit(false)
}

#[cfg(feature = "no-panic-proof")]
use panic_never as _;

#[cortex_m_rt::entry]
fn main() -> ! {
    harness::firmware_main::<f64>()
}

//! Target-side harness: semihosting output, stack painting, exit codes.
//!
//! This file is test infrastructure, not library code: painting and scanning
//! the stack needs raw memory access (the only `unsafe` in the project, kept
//! out of `core`, which forbids it).

use cortex_m_semihosting::{debug, hio};

use crate::path::{self, Bits, Sink};

/// Writes `key hexbits\n` lines over semihosting without core::fmt.
pub struct Semi {
    out: Option<hio::HostStream>,
    /// Set when the path reported a failure.
    pub failed: bool,
}

impl Semi {
    /// Opens the host's stdout.
    pub fn new() -> Self {
        Semi {
            out: hio::hstdout().ok(),
            failed: false,
        }
    }
    /// Writes raw bytes.
    pub fn write(&mut self, b: &[u8]) {
        if let Some(o) = self.out.as_mut() {
            let _ = o.write_all(b);
        }
    }
    /// Writes a u64 as 16 hex digits.
    pub fn hex(&mut self, v: u64) {
        let mut buf = [0u8; 16];
        for (i, d) in buf.iter_mut().enumerate() {
            let nib = ((v >> (60 - 4 * i)) & 0xf) as u8;
            *d = if nib < 10 {
                b'0' + nib
            } else {
                b'a' + nib - 10
            };
        }
        self.write(&buf);
    }
}

impl Sink for Semi {
    fn put(&mut self, key: &str, bits: u64) {
        self.write(key.as_bytes());
        self.write(b" ");
        self.hex(bits);
        self.write(b"\n");
    }
    fn fail(&mut self, key: &str, what: &str) {
        self.failed = true;
        self.write(b"FAIL ");
        self.write(key.as_bytes());
        self.write(b" ");
        self.write(what.as_bytes());
        self.write(b"\n");
    }
}

const PAINT: u32 = 0xA5C3_5AC3;
const PAINT_WORDS: usize = 8 * 1024; // 32 KiB below the current stack pointer

/// Margin left unpainted just below the caller's frame (covers this function's
/// own frame); [`stack_used`] adds it back, so its figure is an upper bound.
const MARGIN: usize = 64;

/// Paints the stack region below the current stack pointer; returns its top.
#[inline(never)]
pub fn paint_stack() -> usize {
    let sp = cortex_m::register::msp::read() as usize;
    let top = (sp - MARGIN) & !3;
    let bottom = top - PAINT_WORDS * 4;
    let mut a = bottom;
    while a < top {
        // SAFETY: the 32 KiB below the live stack are unused RAM on the QEMU
        // boards (4 MiB of RAM, .data/.bss at its start, stack at its end).
        unsafe { core::ptr::write_volatile(a as *mut u32, PAINT) };
        a += 4;
    }
    top
}

/// Upper bound of the stack bytes used below the caller of [`paint_stack`]
/// since it painted: the overwritten part of the painted region plus the margin.
#[inline(never)]
pub fn stack_used(top: usize) -> usize {
    let bottom = top - PAINT_WORDS * 4;
    let mut a = bottom;
    while a < top {
        // SAFETY: reads back the region painted above.
        let v = unsafe { core::ptr::read_volatile(a as *const u32) };
        if v != PAINT {
            break;
        }
        a += 4;
    }
    top - a + MARGIN
}

/// Ends the QEMU run with the given status.
pub fn exit(ok: bool) -> ! {
    debug::exit(if ok {
        debug::EXIT_SUCCESS
    } else {
        debug::EXIT_FAILURE
    });
    loop {
        cortex_m::asm::wfi();
    }
}

/// Report keys of the per-phase stack figures (same order as `path::PHASES`).
const STACK_KEYS: [&str; 5] = [
    "stack.line",
    "stack.datasheet",
    "stack.sweep",
    "stack.trace",
    "stack.dtf",
];

/// Runs one phase in a frame of its own, below the painted stack top (never
/// inlined into the caller, whose frame is not measured).
#[inline(never)]
fn run_phase<T: Bits>(phase: &str, out: &mut Semi) {
    path::run_phase::<T, _>(phase, out);
}

/// The whole image: each phase with its stack painted and measured, then exit.
pub fn firmware_main<T: Bits>() -> ! {
    let mut out = Semi::new();
    for (phase, key) in path::PHASES.iter().zip(STACK_KEYS) {
        let top = paint_stack();
        run_phase::<T>(phase, &mut out);
        let used = stack_used(top);
        out.put(key, used as u64);
    }
    let ok = !out.failed;
    exit(ok)
}

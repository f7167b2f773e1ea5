//! Numerical building blocks: complex helpers that never overflow, and (as they
//! land) elliptic integrals, root finding, a fixed-size FFT, windows.

pub mod complex;

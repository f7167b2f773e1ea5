//! Numerical building blocks, all over caller-provided storage and generic over
//! [`Real`](crate::scalar::Real):
//!
//! * [`complex`]: complex helpers that never overflow (robust division, tanh that saturates);
//! * [`fft`]: in-place radix-2 FFT (numpy sign convention), with or without a twiddle table;
//! * [`czt`]: chirp-z transform (Bluestein) and frequency/time zoom;
//! * [`window`]: rectangular, Hann, Hamming and Kaiser windows, coherent gain and ENBW;
//! * [`elliptic`]: complete elliptic integral K(k) and K(k)/K(k′) by the AGM;
//! * [`roots`]: bracketing root finder (Brent's method);
//! * [`interp`]: uniform-grid linear interpolation, threshold crossings, parabolic peaks;
//! * [`special`]: Bessel I0 (and scaled), erfc and its inverse, J1/Y1 and derivatives,
//!   sine/cosine of a phase in turns computed in the scalar's own precision.

pub mod complex;
pub mod czt;
pub mod elliptic;
pub mod fft;
pub mod interp;
pub mod roots;
pub mod special;
pub mod window;

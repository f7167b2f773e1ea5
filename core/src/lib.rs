#![no_std]
#![forbid(unsafe_code)]
#![deny(missing_docs)]
#![doc = include_str!("../../README.md")]

pub mod error;
pub mod line;
pub mod math;
pub mod network;
pub mod scalar;
pub mod sweep;
pub mod tdr;
pub mod timing;
pub mod units;
pub mod value;

pub use error::{Error, Result};
pub use line::{LineModel, LinePoint, LineProperties, Warnings};
pub use scalar::Real;
pub use value::{Admittance, Extended, Impedance};

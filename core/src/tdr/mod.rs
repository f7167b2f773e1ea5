//! Reflection traces: simulation and analysis (in progress).
pub mod sim;

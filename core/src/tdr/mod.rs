//! Reflection traces: simulation and analysis (in progress).

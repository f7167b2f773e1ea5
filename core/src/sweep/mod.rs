//! Frequency sweeps: streaming readers and distance-to-fault transforms.
//!
//! * [`touchstone`]: Touchstone 1.x / 2.0 reader, line by line, no heap.
//! * [`csv`]: CSV sweeps with a header (frequency plus re/im or magnitude/phase).
pub mod csv;
mod text;
pub mod touchstone;

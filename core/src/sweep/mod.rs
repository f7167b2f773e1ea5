//! Frequency sweeps: readers and distance-to-fault transforms (in progress).

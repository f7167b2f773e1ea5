//! Quantities with SI prefixes and units (in progress).

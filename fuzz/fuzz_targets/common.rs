#![allow(dead_code)]
//! Helpers shared by the fuzz targets: arbitrary floats from raw bytes (every
//! bit pattern, so NaN, ±∞, subnormals, huge and tiny values all occur).

/// Reads floats from the fuzzer's bytes.
pub struct Floats<'a> {
    data: &'a [u8],
}

impl<'a> Floats<'a> {
    /// Wraps the input.
    pub fn new(data: &'a [u8]) -> Self {
        Floats { data }
    }
    /// Next f64 from 8 bytes (zeros when exhausted).
    pub fn f64(&mut self) -> f64 {
        let mut b = [0u8; 8];
        let n = self.data.len().min(8);
        b[..n].copy_from_slice(&self.data[..n]);
        self.data = &self.data[n..];
        f64::from_le_bytes(b)
    }
    /// Next f32 from 4 bytes.
    pub fn f32(&mut self) -> f32 {
        let mut b = [0u8; 4];
        let n = self.data.len().min(4);
        b[..n].copy_from_slice(&self.data[..n]);
        self.data = &self.data[n..];
        f32::from_le_bytes(b)
    }
    /// Next byte.
    pub fn byte(&mut self) -> u8 {
        match self.data.split_first() {
            Some((b, rest)) => {
                self.data = rest;
                *b
            }
            None => 0,
        }
    }
    /// The remaining bytes.
    pub fn rest(&self) -> &'a [u8] {
        self.data
    }
}

/// Panics (a fuzz finding) if a value reported as valid is NaN.
pub fn no_nan(x: f64, what: &str) {
    assert!(!x.is_nan(), "NaN in a valid result: {what}");
}

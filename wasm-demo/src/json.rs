//! A tiny JSON writer for results handed to the page (numbers written with
//! Rust's shortest round-trip form, so the page reads back exactly what the
//! core computed; a non-finite number becomes `null`).

use core::fmt::Write;

/// A JSON text being written.
#[derive(Default)]
pub struct Json {
    out: String,
    first: Vec<bool>,
}

impl Json {
    /// An empty writer.
    pub fn new() -> Self {
        Self::default()
    }
    fn sep(&mut self) {
        if let Some(f) = self.first.last_mut() {
            if *f {
                *f = false;
            } else {
                self.out.push(',');
            }
        }
    }
    fn key(&mut self, k: &str) {
        self.sep();
        self.string_raw(k);
        self.out.push(':');
    }
    fn string_raw(&mut self, s: &str) {
        self.out.push('"');
        for c in s.chars() {
            match c {
                '"' => self.out.push_str("\\\""),
                '\\' => self.out.push_str("\\\\"),
                c if (c as u32) < 0x20 => {
                    let _ = write!(self.out, "\\u{:04x}", c as u32);
                }
                c => self.out.push(c),
            }
        }
        self.out.push('"');
    }
    fn num_raw(&mut self, x: f64) {
        if x.is_finite() {
            let _ = write!(self.out, "{x}");
        } else {
            self.out.push_str("null");
        }
    }
    /// Opens an object (as a member `k`, or as an array element if `k` is empty).
    pub fn open(&mut self, k: &str) -> &mut Self {
        if k.is_empty() {
            self.sep();
        } else {
            self.key(k);
        }
        self.out.push('{');
        self.first.push(true);
        self
    }
    /// Opens an array member `k`.
    pub fn open_array(&mut self, k: &str) -> &mut Self {
        self.key(k);
        self.out.push('[');
        self.first.push(true);
        self
    }
    /// Closes the innermost object.
    pub fn close(&mut self) -> &mut Self {
        self.first.pop();
        self.out.push('}');
        self
    }
    /// Closes the innermost array.
    pub fn close_array(&mut self) -> &mut Self {
        self.first.pop();
        self.out.push(']');
        self
    }
    /// A number member.
    pub fn num(&mut self, k: &str, x: f64) -> &mut Self {
        self.key(k);
        self.num_raw(x);
        self
    }
    /// An integer member.
    pub fn int(&mut self, k: &str, x: usize) -> &mut Self {
        self.key(k);
        let _ = write!(self.out, "{x}");
        self
    }
    /// A boolean member.
    pub fn bool(&mut self, k: &str, x: bool) -> &mut Self {
        self.key(k);
        self.out.push_str(if x { "true" } else { "false" });
        self
    }
    /// A string member.
    pub fn str(&mut self, k: &str, s: &str) -> &mut Self {
        self.key(k);
        self.string_raw(s);
        self
    }
    /// A member holding an array of numbers.
    pub fn nums(&mut self, k: &str, xs: impl IntoIterator<Item = f64>) -> &mut Self {
        self.key(k);
        self.out.push('[');
        for (i, x) in xs.into_iter().enumerate() {
            if i > 0 {
                self.out.push(',');
            }
            self.num_raw(x);
        }
        self.out.push(']');
        self
    }
    /// A member holding an array of strings.
    pub fn strs<'a>(&mut self, k: &str, xs: impl IntoIterator<Item = &'a str>) -> &mut Self {
        self.key(k);
        self.out.push('[');
        for (i, x) in xs.into_iter().enumerate() {
            if i > 0 {
                self.out.push(',');
            }
            self.string_raw(x);
        }
        self.out.push(']');
        self
    }
    /// The finished text.
    pub fn finish(self) -> String {
        self.out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn writes_valid_json() {
        let mut j = Json::new();
        j.open("").num("a", 1.5).num("b", f64::NAN).str("s", "x\"y");
        j.open_array("l")
            .open("")
            .int("i", 2)
            .close()
            .open("")
            .close()
            .close_array();
        j.nums("n", [1.0, f64::INFINITY])
            .strs("w", ["a", "b\""])
            .close();
        assert_eq!(
            j.finish(),
            r#"{"a":1.5,"b":null,"s":"x\"y","l":[{"i":2},{}],"n":[1,null],"w":["a","b\""]}"#
        );
    }
}

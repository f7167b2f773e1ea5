//! Bindings: quantity parsing for every input field of the page.

use echoline::units::{self, Unit};
use echoline::{Error, Result};
use wasm_bindgen::prelude::*;

/// Parses `text` as a quantity of the named dimension (see
/// [`Unit::name`]: "number", "length", "time", "frequency", "resistance", …)
/// into SI base units.
pub fn parse(text: &str, unit: &str) -> Result<f64> {
    let unit = Unit::from_name(unit).ok_or(Error::OutOfRange("unit"))?;
    units::parse_quantity::<f64>(text, unit)
}

/// `parse_quantity(text, unit)`: the value in SI base units, or an `Error`
/// such as "line 1, column 5: expected a unit of time (s)".
#[wasm_bindgen]
pub fn parse_quantity(text: &str, unit: &str) -> core::result::Result<f64, JsError> {
    parse(text, unit).map_err(crate::js_err)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_through_the_core() {
        assert_eq!(parse("2.5 ns", "time"), Ok(2.5e-9));
        assert_eq!(parse("120 ft", "length"), Ok(120.0 * 0.3048));
        assert_eq!(parse("1 s", "furlong"), Err(Error::OutOfRange("unit")));
        let e = parse("5 ms", "length").unwrap_err();
        assert_eq!(
            e.to_string(),
            "line 1, column 3: expected a unit of length (m, ft, in, mil)"
        );
    }
}

//! wasm-bindgen bindings of the offline field page over the `echoline` core.
//!
//! The layer converts types and nothing more: every number the page shows is
//! computed here by the core (no physics in JavaScript). Each section of the
//! page has one binding file (`fault.rs`, `line.rs`, …); every export returns
//! `Result<_, JsError>` whose message is the core's `Display` of
//! [`echoline::Error`], so a bad input never reaches the page as a panic.
//!
//! Each binding is a thin wrapper over a plain Rust function returning
//! `echoline::Result`, which the host tests exercise directly (JsError only
//! exists on wasm).

use wasm_bindgen::prelude::*;

pub mod design;
pub mod fault;
pub mod json;
pub mod line;
pub mod sim;
pub mod sweep;
pub mod termination;
pub mod trace;
pub mod units;

/// The core's error as a JS `Error` with a readable message.
pub(crate) fn js_err(e: echoline::Error) -> JsError {
    JsError::new(&e.to_string())
}

/// The version of the bindings (and of the page), for the page's footer.
#[wasm_bindgen]
pub fn version() -> String {
    env!("CARGO_PKG_VERSION").to_string()
}

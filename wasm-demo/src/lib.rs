//! Placeholder for the wasm-bindgen layer of the offline field page.

//! Host side of the firmware check: runs `tests/firmware/src/path.rs` on the
//! host and prints the same `key hexbits` lines as the Cortex-M image.
//! Usage: `cargo run -p echoline-checks --example firmware_host -- f32|f64`.

#[path = "../firmware/src/path.rs"]
#[allow(dead_code)]
mod path;

struct Out;
impl path::Sink for Out {
    fn put(&mut self, key: &str, bits: u64) {
        println!("{key} {bits:016x}");
    }
    fn fail(&mut self, key: &str, what: &str) {
        println!("FAIL {key} {what}");
    }
}

fn main() {
    match std::env::args().nth(1).as_deref() {
        Some("f32") => path::run::<f32, _>(&mut Out),
        Some("f64") => path::run::<f64, _>(&mut Out),
        _ => {
            eprintln!("usage: firmware_host f32|f64");
            std::process::exit(2);
        }
    }
}

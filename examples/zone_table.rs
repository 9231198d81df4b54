//! Writes `src/time/zones.bin`, the compact IANA zone table both builds read, from `chrono-tz` (the
//! version in `Cargo.lock`). Run after a chrono-tz update: `cargo run --release --example zone_table`
//! (about a minute); `tests/zone_table.rs` fails until the committed table is what this writes.

#[path = "../tests/common/zone_scan.rs"]
mod zone_scan;

fn main() {
    let zones = zone_scan::all();
    let bytes = sunlot::time::encode_zone_table(chrono_tz::IANA_TZDB_VERSION, &zones);
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/src/time/zones.bin");
    std::fs::write(path, &bytes).expect("write src/time/zones.bin");
    let transitions: usize = zones.iter().map(|z| z.2.len()).sum();
    println!(
        "{path}: {} bytes, {} names, {transitions} transitions, tz {}",
        bytes.len(),
        zones.len(),
        chrono_tz::IANA_TZDB_VERSION
    );
}

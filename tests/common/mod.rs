//! Helpers shared by the integration tests: reading the committed fixtures.
#![allow(dead_code)] // each test uses some of them

use std::collections::HashMap;
use std::path::PathBuf;

/// Rows of a fixture CSV in `tests/fixtures/` (lines starting with `#` are provenance comments).
pub fn fixture_rows(name: &str) -> Vec<HashMap<String, String>> {
    let path: PathBuf = [env!("CARGO_MANIFEST_DIR"), "tests", "fixtures", name].iter().collect();
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(&path)
        .unwrap_or_else(|e| panic!("fixture {}: {e}", path.display()));
    let headers = rdr.headers().expect("fixture header").clone();
    rdr.records()
        .map(|r| {
            let r = r.expect("fixture row");
            headers.iter().zip(r.iter()).map(|(h, v)| (h.to_string(), v.to_string())).collect()
        })
        .collect()
}

/// A numeric field of a fixture row.
pub fn num(row: &HashMap<String, String>, key: &str) -> f64 {
    row[key].parse().unwrap_or_else(|_| panic!("fixture field {key} = {:?}", row[key]))
}

/// The text of a fixture file in `tests/fixtures/`.
pub fn fixture_text(name: &str) -> String {
    let path: PathBuf = [env!("CARGO_MANIFEST_DIR"), "tests", "fixtures", name].iter().collect();
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("fixture {}: {e}", path.display()))
}

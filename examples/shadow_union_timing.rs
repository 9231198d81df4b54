//! Times the shadow union of 200 volumes at one sun position (azimuth 200°, altitude 25°), median of 30
//! runs, for `benches/shadows_side_by_side.py`, in two layouts:
//! - `grid`: a town of 200 blocks on a 20 × 10 grid (12 × 10 m plots, every third one L-shaped,
//!   heights 6–30 m), the layout a planning study meets;
//! - `pile`: the first 200 random volumes of `tests/fixtures/shadows_shapely.json`, all heaped on a
//!   100 m square — a stress case for the union.
//!
//! Run: cargo run --release --example shadow_union_timing

use std::time::Instant;

use geo::{Area, Coord, LineString, Polygon};
use sunlot::shadow::{cast_shadows, Shadows};
use sunlot::site::{Status, Volume};

#[path = "../benches/support/grid_town.rs"]
mod grid_town;
use grid_town::grid;

fn ring(v: &serde_json::Value) -> LineString<f64> {
    v.as_array().unwrap().iter().map(|p| Coord { x: p[0].as_f64().unwrap(), y: p[1].as_f64().unwrap() }).collect()
}

fn pile() -> Vec<Volume> {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/shadows_shapely.json");
    let doc: serde_json::Value = serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap();
    doc["cases"].as_array().unwrap()[..200]
        .iter()
        .enumerate()
        .map(|(i, c)| {
            let holes = c["holes"].as_array().unwrap().iter().map(ring).collect();
            let fp = Polygon::new(ring(&c["outer"]), holes);
            Volume::new(
                &format!("v{i}"),
                Status::Proposed,
                fp,
                c["base_m"].as_f64().unwrap(),
                c["top_m"].as_f64().unwrap(),
            )
            .unwrap()
        })
        .collect()
}

fn time(volumes: &[Volume]) -> (f64, f64) {
    let extent = geo::Rect::new(Coord { x: -10_000.0, y: -10_000.0 }, Coord { x: 10_000.0, y: 10_000.0 });
    let mut times = Vec::new();
    let mut area = 0.0;
    for _ in 0..30 {
        let t = Instant::now();
        if let Ok(Shadows::Sun { union, .. }) =
            cast_shadows(volumes, &[], 200.0, 25.0, &sunlot::shadow::Receiver::flat_ground(), extent)
        {
            area = union.unsigned_area();
        }
        times.push(t.elapsed().as_secs_f64());
    }
    times.sort_by(f64::total_cmp);
    (times[times.len() / 2], area)
}

fn main() {
    let (g, ga) = time(&grid());
    let (p, pa) = time(&pile());
    println!(
        "{{\"grid\": {{\"median_s\": {g}, \"area_m2\": {ga}}}, \"pile\": {{\"median_s\": {p}, \"area_m2\": {pa}}}}}"
    );
}

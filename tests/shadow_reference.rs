//! Shadow polygons against shapely (GEOS), a general-purpose geometry library.
//!
//! Fixture `tests/fixtures/shadows_shapely.json`, written by `tests/fixtures/generate_shapely.py`
//! (shapely 2.2.0, GEOS 3.14.1; provenance in the file's `generated` field): 250 random volumes —
//! non-convex footprints, courtyards, raised bases — under random suns. The bars are the issue's: area
//! within 0.01 % and symmetric difference under 0.1 % of the area.

use geo::{Area, BooleanOps, Coord, LineString, MultiPolygon, Polygon};
use serde_json::Value;
use sunlot::shadow::{shadow_offset_per_m, volume_shadow};
use sunlot::site::{Status, Volume};

fn ring(v: &Value) -> LineString<f64> {
    v.as_array().unwrap().iter().map(|p| Coord { x: p[0].as_f64().unwrap(), y: p[1].as_f64().unwrap() }).collect()
}

fn polygon(rings: &Value) -> Polygon<f64> {
    let r = rings.as_array().unwrap();
    Polygon::new(ring(&r[0]), r[1..].iter().map(ring).collect())
}

#[test]
fn shadows_match_shapely_within_a_hundredth_of_a_percent() {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/shadows_shapely.json");
    let doc: Value = serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap();
    let cases = doc["cases"].as_array().unwrap();
    assert!(cases.len() >= 200);
    let (mut worst_area, mut worst_xor) = (0.0_f64, 0.0_f64);
    for (i, c) in cases.iter().enumerate() {
        let outer = ring(&c["outer"]);
        let holes: Vec<LineString<f64>> = c["holes"].as_array().unwrap().iter().map(ring).collect();
        let v = Volume::new(
            &format!("case-{i}"),
            Status::Proposed,
            Polygon::new(outer, holes),
            c["base_m"].as_f64().unwrap(),
            c["top_m"].as_f64().unwrap(),
        )
        .unwrap();
        let offset =
            shadow_offset_per_m(c["azimuth_deg"].as_f64().unwrap(), c["altitude_deg"].as_f64().unwrap()).unwrap();
        let ours = volume_shadow(&v, offset, 0.0);
        let theirs = MultiPolygon::new(c["shadow"].as_array().unwrap().iter().map(polygon).collect());
        let area = c["shadow_area_m2"].as_f64().unwrap();
        let d_area = (ours.unsigned_area() - area).abs() / area;
        let d_xor = ours.xor(&theirs).unsigned_area() / area;
        assert!(d_area < 1e-4, "case {i}: area {} vs shapely {area}", ours.unsigned_area());
        assert!(d_xor < 1e-3, "case {i}: symmetric difference {d_xor} of the area");
        worst_area = worst_area.max(d_area);
        worst_xor = worst_xor.max(d_xor);
    }
    println!("worst relative area difference {worst_area:e}, worst symmetric difference {worst_xor:e}");
}

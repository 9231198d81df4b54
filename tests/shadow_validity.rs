//! Shadow polygons written out are valid geometry (OGC simple features, as checked by geo's
//! `Validation`: simple rings, holes inside their shell, parts of a MultiPolygon disjoint) on every
//! terrain, for random sites: blocks turned at any angle, overhangs, courtyards and walls, on flat
//! ground and on slopes up to 30° facing any way, at any sun. Found by fuzzing: on sloping ground the
//! per-feature shadows had zero-area holes and repeated vertices.
#![cfg(not(target_arch = "wasm32"))]

use chrono::{DateTime, Utc};
use geo::{Coord, LineString, MultiPolygon, Polygon, Validation};
use proptest::prelude::*;
use sunlot::shadow::{shadow_study, study_geojson, Study};
use sunlot::site::{Ground, SiteModel, Status, Volume, Wall};
use sunlot::time::{DeltaT, Zone};
use sunlot::Site;

/// A block `w` × `d` m centred at (`cx`, `cy`) turned by `turn_deg`, `height` m tall, optionally with a
/// courtyard; every third block floats `base` m above the ground (bridges, overhangs).
fn block(id: usize, &(cx, cy, w, d, turn_deg, base, height, court): &BlockSpec) -> Volume {
    let base = if id % 3 == 2 { base } else { 0.0 };
    let top = base + height;
    let (s, c) = turn_deg.to_radians().sin_cos();
    let at = |x: f64, y: f64| Coord { x: cx + x * c - y * s, y: cy + x * s + y * c };
    let rect = |hw: f64, hd: f64| LineString::from(vec![at(-hw, -hd), at(hw, -hd), at(hw, hd), at(-hw, hd)]);
    let holes = if court { vec![rect(w / 4.0, d / 4.0)] } else { vec![] };
    let status = if id % 2 == 0 { Status::Existing } else { Status::Proposed };
    Volume::new(&format!("v{id}"), status, Polygon::new(rect(w / 2.0, d / 2.0), holes), base, top).unwrap()
}

type BlockSpec = (f64, f64, f64, f64, f64, f64, f64, bool);

fn blocks() -> impl Strategy<Value = Vec<BlockSpec>> {
    prop::collection::vec(
        (
            -30.0..30.0_f64,
            -30.0..30.0_f64,
            2.0..20.0_f64,
            2.0..20.0_f64,
            0.0..90.0_f64,
            0.0..6.0_f64,
            1.0..25.0_f64,
            any::<bool>(),
        ),
        1..6,
    )
}

fn site(specs: &[BlockSpec], slope_deg: f64, aspect_deg: f64, rotation_deg: f64, wall: bool) -> SiteModel {
    let volumes = specs.iter().enumerate().map(|(k, spec)| block(k, spec)).collect();
    let walls = if wall {
        vec![Wall::new(
            "wall",
            Status::Existing,
            LineString::from(vec![(-40.0, -35.0), (0.0, -38.0), (35.0, -20.0)]),
            2.0,
        )
        .unwrap()]
    } else {
        vec![]
    };
    SiteModel {
        name: "random".into(),
        location: Site::new(47.0, 8.0, 400.0).unwrap(),
        zone: "Europe/Zurich".parse::<Zone>().unwrap(),
        plan_rotation_deg: rotation_deg,
        ground: Ground { slope_deg, aspect_deg }.validated().unwrap(),
        areas: vec![],
        volumes,
        walls,
        windows: vec![],
    }
}

fn check(what: &str, mp: &MultiPolygon<f64>) -> Result<(), TestCaseError> {
    let errors = mp.validation_errors();
    prop_assert!(errors.is_empty(), "{what}: {}", errors.iter().map(|e| e.to_string()).collect::<Vec<_>>().join("; "));
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(500))]

    #[test]
    fn shadows_are_valid_polygons_on_any_ground(specs in blocks(), slope in prop_oneof![Just(0.0), 0.5..30.0_f64],
                                                aspect in 0.0..360.0_f64, rotation in 0.0..360.0_f64,
                                                minute in 0_i64..(24 * 60), day in 0_i64..365, wall in any::<bool>()) {
        let model = site(&specs, slope, aspect, rotation, wall);
        let t: DateTime<Utc> = DateTime::parse_from_rfc3339("2026-01-01T00:00:00Z").unwrap().to_utc()
            + chrono::Duration::days(day) + chrono::Duration::minutes(minute);
        let study = shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap();
        if let Study::Sun { per_feature, existing, proposed, combined, .. } = &study {
            for (id, _, mp) in per_feature {
                check(&format!("the shadow of {id}"), mp)?;
            }
            check("the existing shadow", existing)?;
            check("the proposed shadow", proposed)?;
            check("the combined shadow", combined)?;
        }
        // The GeoJSON written from the study reads back as valid polygons too.
        let text = study_geojson(&model, &study, "t", false);
        let gj: geojson::GeoJson = text.parse().unwrap();
        if let geojson::GeoJson::FeatureCollection(fc) = gj {
            for f in fc.features {
                if let Some(g) = f.geometry {
                    if let Ok(mp) = MultiPolygon::<f64>::try_from(g.value.clone()) {
                        check("a GeoJSON shadow", &mp)?;
                    } else if let Ok(p) = Polygon::<f64>::try_from(g.value) {
                        check("a GeoJSON shadow", &MultiPolygon::new(vec![p]))?;
                    }
                }
            }
        }
    }
}

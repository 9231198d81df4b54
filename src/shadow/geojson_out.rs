//! A shadow study as GeoJSON: each feature's shadow, the unions (existing, proposed, combined) and
//! the areas with their shaded figures, in plan metres or in WGS84.

use geo::{Coord, MapCoords, MultiPolygon, Validation};
use geojson::{Feature, FeatureCollection, Geometry, GeometryValue, JsonObject};
use serde_json::json;

use super::study::Study;
use crate::site::{SiteModel, Status};

fn status_name(s: Status) -> &'static str {
    match s {
        Status::Existing => "existing",
        Status::Proposed => "proposed",
    }
}

/// The study of `model` at the moment labelled `when` as a GeoJSON FeatureCollection (pretty JSON).
/// With `wgs84` coordinates are longitude and latitude (for a site that came from GeoJSON), else plan
/// metres rounded to the micrometre (the boolean operations leave nanometre noise) where the rounded
/// polygon is still valid (rounding can fold a sliver thinner than a micrometre onto itself; such a
/// shadow is written unrounded, so every polygon written is valid geometry). A moment without
/// sun, or with the sun behind the slope, is an empty collection saying so.
pub fn study_geojson(model: &SiteModel, study: &Study, when: &str, wgs84: bool) -> String {
    let mut features = Vec::new();
    let mut add = |geom: GeometryValue, props: serde_json::Value| {
        let properties: Option<JsonObject> = props.as_object().cloned();
        features.push(Feature { geometry: Some(Geometry::new(geom)), properties, ..Default::default() });
    };
    let frame = model.frame();
    let out = |mp: &MultiPolygon<f64>| {
        if wgs84 {
            mp.map_coords(|c| model.plan_to_wgs84(&frame, c))
        } else {
            let rounded = mp.map_coords(|c| Coord { x: (c.x * 1e6).round() / 1e6, y: (c.y * 1e6).round() / 1e6 });
            if rounded.is_valid() {
                rounded
            } else {
                mp.clone()
            }
        }
    };
    let meta = match study {
        Study::Sun { sun, plan_azimuth_deg, per_feature, existing, proposed, combined, areas, clipped, extent } => {
            for (id, status, s) in per_feature {
                add(
                    GeometryValue::from(&out(s)),
                    json!({"layer": "feature_shadow", "source": id, "status": status_name(*status)}),
                );
            }
            for (group, s) in [("existing", existing), ("proposed", proposed), ("combined", combined)] {
                add(GeometryValue::from(&out(s)), json!({"layer": "shadow_union", "group": group}));
            }
            for (a, m) in areas.iter().zip(&model.areas) {
                add(
                    GeometryValue::from(&out(&MultiPolygon::new(vec![m.polygon.clone()]))),
                    json!({"layer": "area", "id": a.id, "name": a.name, "area_m2": a.area_m2,
                           "shaded_existing_m2": a.existing_m2, "shaded_proposed_m2": a.proposed_m2,
                           "shaded_combined_m2": a.combined_m2}),
                );
            }
            json!({"coordinates": if wgs84 { "WGS84 longitude, latitude" } else { "local plan metres (x right, y up the plan), not WGS84" },
                   "plan_rotation_deg": model.plan_rotation_deg, "time": when,
                   "sun_altitude_deg": sun.altitude_deg, "sun_azimuth_deg": sun.azimuth_deg,
                   "sun_plan_azimuth_deg": plan_azimuth_deg, "clipped_to_extent": clipped,
                   "extent_m": [extent.min().x, extent.min().y, extent.max().x, extent.max().y]})
        }
        Study::NoSun { .. } => {
            json!({"time": when, "sun": "the sun is below the horizon: no direct sun, no shadows"})
        }
        Study::SunBehindGround { .. } => json!({"time": when,
            "sun": "the sun is behind the sloping ground: the whole site is in the slope's own shade"}),
    };
    let mut fc = FeatureCollection::new(features);
    let mut members = JsonObject::new();
    members.insert("sunlot".into(), meta);
    fc.foreign_members = Some(members);
    serde_json::to_string_pretty(&fc).unwrap_or_default() + "\n"
}

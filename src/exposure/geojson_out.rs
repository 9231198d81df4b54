//! A map as GeoJSON: each cell inside the areas as a square polygon carrying the map's values, and a
//! `sunlot` member with the map's title, period, cell size, coordinate frame and the caution.

use geo::{Coord, LineString, Polygon};
use geojson::{Feature, FeatureCollection, Geometry, GeometryValue, JsonObject};
use serde_json::json;

use super::{CellValues, Grid};
use crate::site::SiteModel;

/// One layer of a map: a property name with its unit (e.g. `sun_hours`) and a value per cell.
#[derive(Debug, Clone, Copy)]
pub struct MapColumn<'a> {
    /// Property name.
    pub name: &'a str,
    /// Values, row-major as the grid.
    pub values: &'a CellValues,
}

/// The cells of `grid` inside its areas as a GeoJSON FeatureCollection text, with `columns` as
/// properties (rounded to 1e-4, `null` where a value is missing). In WGS84 longitude/latitude when
/// `wgs84` (a site read from GeoJSON), else in plan metres; `title` and `period` describe the map.
pub fn map_geojson(
    model: &SiteModel,
    grid: &Grid,
    columns: &[MapColumn],
    (title, period): (&str, &str),
    wgs84: bool,
) -> String {
    let frame = model.frame();
    let half = grid.cell_m / 2.0;
    let mut features = Vec::new();
    for row in 0..grid.rows {
        for col in 0..grid.cols {
            let i = row * grid.cols + col;
            if !grid.inside.get(i).copied().unwrap_or(false) {
                continue;
            }
            let c = grid.centre(col, row);
            let corner = |dx: f64, dy: f64| Coord { x: c.x + dx * half, y: c.y + dy * half };
            let ring = vec![corner(-1., -1.), corner(1., -1.), corner(1., 1.), corner(-1., 1.), corner(-1., -1.)];
            let sq = Polygon::new(LineString::from(ring), vec![]);
            let sq = if wgs84 { model.polygon_to_wgs84(&frame, &sq) } else { sq };
            let mut props = JsonObject::new();
            for l in columns {
                let v = l.values.get(i);
                props.insert(l.name.into(), v.map_or(serde_json::Value::Null, |v| json!((v * 1e4).round() / 1e4)));
            }
            features.push(Feature {
                geometry: Some(Geometry::new(GeometryValue::from(&sq))),
                properties: Some(props),
                ..Default::default()
            });
        }
    }
    let mut fc = FeatureCollection::new(features);
    let mut members = JsonObject::new();
    members.insert(
        "sunlot".into(),
        json!({"map": title, "period": period, "cell_m": grid.cell_m,
               "crs": if wgs84 { "WGS84" } else { "site plan metres" }, "caution": crate::rules::CAUTION}),
    );
    fc.foreign_members = Some(members);
    serde_json::to_string(&fc).unwrap_or_default()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;

    #[test]
    fn every_inside_cell_is_a_square_with_its_value() {
        let model = crate::demo::demo();
        let garden = model.areas.iter().find(|a| a.id == "garden-16").unwrap();
        let grid = Grid::over_polygon(&garden.polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let values: CellValues = (0..grid.cols * grid.rows).map(|i| Some(i as f64 / 3.0)).collect();
        let text = map_geojson(&model, &grid, &[MapColumn { name: "sun_hours", values: &values }], ("t", "p"), false);
        let fc: FeatureCollection = text.parse::<geojson::GeoJson>().unwrap().try_into().unwrap();
        // The garden is 7 m × 28 m: 196 cells of 1 m².
        assert_eq!(fc.features.len(), 196);
        let f = &fc.features[1];
        assert_eq!(f.property("sun_hours").and_then(|v| v.as_f64()), Some(0.3333));
        let geo::Geometry::Polygon(p) = geo::Geometry::<f64>::try_from(f.geometry.clone().unwrap()).unwrap() else {
            panic!("a polygon")
        };
        assert!((geo::Area::unsigned_area(&p) - 1.0).abs() < 1e-9);
        assert_eq!(fc.foreign_members.unwrap()["sunlot"]["crs"], "site plan metres");
    }
}

//! Plain GeoJSON building footprints: a FeatureCollection with no `sunlot` members, as a city's open
//! data portal or a map export gives them. Each Polygon or MultiPolygon with a height becomes an
//! existing volume; the collection is then read as a sunlot GeoJSON site (same checks, same errors),
//! and every assumption made on the way is returned to be shown to the user.

use geojson::{FeatureCollection, GeometryValue, JsonObject};
use serde_json::{json, Value};

use super::file::{Area, AreaKind, SiteModel};
use super::geojson_io::{bbox_centre, parse_collection, GeoJsonError};
use super::massing::Status;
use crate::limits::MAX_HEIGHT_M;
use crate::time::Zone;

/// Feature properties read as a building's height in metres, first found wins: ours, the common
/// `height`, and OpenStreetMap's `building:height` and rendering height (OSM wiki, Key:height).
pub const HEIGHT_KEYS: &[&str] = &["height_m", "height", "building:height", "render_height"];
/// Properties read as the height of a building's underside in metres (OSM wiki, Key:min_height).
pub const BASE_KEYS: &[&str] = &["base_m", "min_height", "building:min_height", "render_min_height"];
/// Properties read as a count of storeys above ground (OSM wiki, Key:building:levels).
pub const LEVEL_KEYS: &[&str] = &["building:levels", "levels", "storeys"];

/// A storey height of 3 m, used for a levels count when none is given: common practice for a
/// floor-to-floor height in housing and offices (not a published value).
pub const DEFAULT_STOREY_HEIGHT_M: f64 = 3.0;

/// What to assume where plain footprints do not say.
#[derive(Debug, Clone, PartialEq)]
pub struct FootprintOptions {
    /// The site's time zone; plain GeoJSON never gives one. `None` gives [`GeoJsonError::ZoneNeeded`]
    /// with a suggestion from the longitude.
    pub zone: Option<Zone>,
    /// Metres a storey for buildings given by a levels count.
    pub storey_height_m: f64,
    /// The height for buildings with neither height nor levels; `None` refuses them by name.
    pub default_height_m: Option<f64>,
    /// The site's name (plain GeoJSON has none; a caller may pass the file's name).
    pub name: String,
}

impl Default for FootprintOptions {
    fn default() -> Self {
        FootprintOptions {
            zone: None,
            storey_height_m: DEFAULT_STOREY_HEIGHT_M,
            default_height_m: None,
            name: String::new(),
        }
    }
}

/// A site read from plain footprints, with what was assumed, one sentence each.
#[derive(Debug, Clone, PartialEq)]
pub struct Imported {
    pub model: SiteModel,
    pub assumptions: Vec<String>,
}

/// Whether a GeoJSON FeatureCollection is plain: no `sunlot` member on the collection and no `sunlot`
/// property on any feature.
pub fn is_plain(fc: &FeatureCollection) -> bool {
    fc.foreign_members.as_ref().is_none_or(|m| !m.contains_key("sunlot"))
        && fc.features.iter().all(|f| f.properties.as_ref().is_none_or(|p| !p.contains_key("sunlot")))
}

/// The fixed-offset zone the longitude suggests (15° an hour, rounded), as an IANA `Etc/GMT±N` name
/// (whose sign is inverted by POSIX convention: `Etc/GMT-1` is UTC+01:00). It knows no daylight
/// saving: it is offered as a default, never taken silently.
pub fn zone_from_longitude(longitude_deg: f64) -> String {
    let hours = (longitude_deg / 15.0).round().clamp(-12.0, 14.0) as i32;
    match hours {
        0 => "Etc/GMT".to_string(),
        h if h > 0 => format!("Etc/GMT-{h}"),
        h => format!("Etc/GMT+{}", -h),
    }
}

/// The middle longitude of a collection's footprints and the fixed-offset zone it suggests
/// ([`zone_from_longitude`]); `None` without a position in range.
pub fn suggested_zone(fc: &FeatureCollection) -> Option<(f64, String)> {
    bbox_centre(fc).map(|(lon, _)| (lon, zone_from_longitude(lon)))
}

impl SiteModel {
    /// Reads plain building footprints as a site of existing volumes (see the module docs).
    ///
    /// # Errors
    /// [`GeoJsonError::ZoneNeeded`] without a zone; a feature with no usable height, named; and every
    /// error of [`SiteModel::from_geojson`].
    pub fn from_footprints(text: &str, options: &FootprintOptions) -> Result<Imported, GeoJsonError> {
        SiteModel::footprints_from_collection(parse_collection(text)?, options)
    }

    /// As [`SiteModel::from_footprints`], from a parsed collection.
    pub(super) fn footprints_from_collection(
        mut fc: FeatureCollection,
        options: &FootprintOptions,
    ) -> Result<Imported, GeoJsonError> {
        if !(options.storey_height_m.is_finite() && (1.0..=10.0).contains(&options.storey_height_m)) {
            return Err(GeoJsonError::Format(format!(
                "storey_height_m must be 1 m to 10 m, got {} m",
                options.storey_height_m
            )));
        }
        if let Some(h) = options.default_height_m.filter(|h| !(h.is_finite() && *h > 0.0 && *h <= MAX_HEIGHT_M)) {
            return Err(GeoJsonError::Format(format!(
                "default_height_m must be more than 0 m and at most {MAX_HEIGHT_M} m, got {h} m"
            )));
        }
        let mut notes = Notes::default();
        let mut kept = Vec::with_capacity(fc.features.len());
        for (index, mut f) in std::mem::take(&mut fc.features).into_iter().enumerate() {
            let label = feature_label(&f, index);
            let polygonal = matches!(
                f.geometry.as_ref().map(|g| &g.value),
                Some(GeometryValue::Polygon { .. } | GeometryValue::MultiPolygon { .. })
            );
            if !polygonal {
                notes.left_out.push(label);
                continue;
            }
            let props = f.properties.get_or_insert_with(JsonObject::new);
            let (base_m, top_m) = heights(props, &label, options, &mut notes)?;
            props.insert("sunlot".into(), json!("volume"));
            props.insert("base_m".into(), json!(base_m));
            props.insert("top_m".into(), json!(top_m));
            if !matches!(props.get("status"), Some(Value::String(s)) if s == "proposed") {
                props.insert("status".into(), json!("existing"));
            }
            if !props.get("id").is_some_and(Value::is_string) {
                props.remove("id");
            }
            props.retain(|k, _| ["sunlot", "id", "status", "base_m", "top_m"].contains(&k.as_str()));
            kept.push(f);
        }
        if kept.is_empty() {
            return Err(GeoJsonError::Format(
                "no building footprints: a plain GeoJSON site needs Polygon or MultiPolygon features".into(),
            ));
        }
        fc.features = kept;
        let Some(zone) = &options.zone else {
            let (longitude_deg, suggestion) = suggested_zone(&fc).unwrap_or((0.0, zone_from_longitude(0.0)));
            return Err(GeoJsonError::ZoneNeeded { longitude_deg, suggestion });
        };
        let mut members = JsonObject::new();
        members.insert("sunlot".into(), json!({"zone": zone.to_string(), "name": options.name}));
        fc.foreign_members = Some(members);
        let mut model = SiteModel::from_collection(&fc)?;
        let ground = surroundings(&model)?;
        let mut assumptions = vec![format!(
            "Plain GeoJSON: {} footprint(s) read as existing buildings (a \"status\": \"proposed\" property \
                 marks a proposal); the time zone is {zone} as given; the ground is flat at 0 m elevation.",
            model.volumes.len()
        )];
        if let Some((area, margin_m)) = ground {
            assumptions.push(format!(
                "An area {SURROUNDINGS_ID:?} (the footprints' bounding box grown by {margin_m:.0} m, the tallest \
                 building's height and at least {MIN_MARGIN_M:.0} m, the buildings' footprints left out) was added \
                 so that maps have ground to cover; draw the lots and gardens to check them against a rule."
            ));
            model.areas.push(area);
        }
        if !options.name.trim().is_empty() {
            assumptions.push(format!("Plain GeoJSON has no site name: the site is called {:?}.", options.name));
        }
        assumptions.extend(notes.sentences(options));
        Ok(Imported { model, assumptions })
    }
}

/// The id of the area added around imported footprints.
pub const SURROUNDINGS_ID: &str = "surroundings";
/// The least margin of that area around the footprints, metres (a choice of ours: room for the
/// shadows of low buildings; the tallest building's height is used when larger).
const MIN_MARGIN_M: f64 = 20.0;

/// The ground around the footprints as an area (their bounding box grown by the tallest height, at
/// least [`MIN_MARGIN_M`]), with the margin used; `None` for a site without volumes.
fn surroundings(model: &SiteModel) -> Result<Option<(Area, f64)>, GeoJsonError> {
    let polys: Vec<geo::Polygon<f64>> = model.volumes.iter().map(|v| v.footprint.clone()).collect();
    let Some(b) = geo::BoundingRect::bounding_rect(&geo::MultiPolygon::new(polys)) else { return Ok(None) };
    let margin_m = model.volumes.iter().map(|v| v.top_m).fold(MIN_MARGIN_M, f64::max);
    let (lo, hi) = (b.min(), b.max());
    let ring = geo::LineString::from(vec![
        (lo.x - margin_m, lo.y - margin_m),
        (hi.x + margin_m, lo.y - margin_m),
        (hi.x + margin_m, hi.y + margin_m),
        (lo.x - margin_m, hi.y + margin_m),
    ]);
    let rect = geo::Polygon::new(ring, vec![]);
    // The ground under buildings that stand on it is not ground to map: their footprints are holes
    // (a raised volume's is not). A courtyard closed on every side is left out with its building.
    use geo::{Area as _, BooleanOps};
    let standing =
        model.volumes.iter().filter(|v| v.base_m <= 0.0).fold(geo::MultiPolygon::new(vec![]), |acc, v| {
            acc.union(&geo::MultiPolygon::new(vec![v.footprint.clone()]))
        });
    let open = geo::MultiPolygon::new(vec![rect.clone()]).difference(&standing);
    let largest = open.0.into_iter().max_by(|a, b| a.unsigned_area().total_cmp(&b.unsigned_area()));
    let area = |polygon| {
        Area::new(SURROUNDINGS_ID, "Ground around the imported buildings", AreaKind::Other, Status::Existing, polygon)
    };
    // Should the holes not make a valid area (the union's output touching itself), the whole box.
    let area = match largest.map(area) {
        Some(Ok(a)) => a,
        _ => area(rect)?,
    };
    Ok(Some((area, margin_m)))
}

/// What the import assumed, gathered feature by feature.
#[derive(Default)]
struct Notes {
    from_levels: Vec<String>,
    defaulted: Vec<String>,
    left_out: Vec<String>,
}

impl Notes {
    fn sentences(&self, options: &FootprintOptions) -> Vec<String> {
        let list = |v: &[String]| {
            let shown: Vec<_> = v.iter().take(5).cloned().collect();
            let more = if v.len() > 5 { format!(" and {} more", v.len() - 5) } else { String::new() };
            format!("{}{more}", shown.join(", "))
        };
        let mut out = Vec::new();
        if !self.from_levels.is_empty() {
            out.push(format!(
                "{} building(s) given by storeys, at {} m a storey: {}.",
                self.from_levels.len(),
                options.storey_height_m,
                list(&self.from_levels)
            ));
        }
        if !self.defaulted.is_empty() {
            out.push(format!(
                "{} building(s) with no height or storeys, taken as {} m tall: {}.",
                self.defaulted.len(),
                options.default_height_m.unwrap_or(f64::NAN),
                list(&self.defaulted)
            ));
        }
        if !self.left_out.is_empty() {
            out.push(format!(
                "{} feature(s) that are not footprints (not polygons) were left out: {}.",
                self.left_out.len(),
                list(&self.left_out)
            ));
        }
        out
    }
}

/// A feature named as the site reader names it: its id (property, then feature id) and its index.
fn feature_label(f: &geojson::Feature, index: usize) -> String {
    let id =
        f.properties.as_ref().and_then(|p| p.get("id")).and_then(Value::as_str).map(str::to_string).or_else(|| {
            f.id.as_ref().map(|i| match i {
                geojson::feature::Id::String(s) => s.clone(),
                geojson::feature::Id::Number(n) => n.to_string(),
            })
        });
    match id {
        Some(id) => format!("{id:?} (#{index})"),
        None => format!("#{index}"),
    }
}

/// A property as metres: a number, or text such as "12", "12.5 m" or "12m" (OSM's usual forms).
fn metres(props: &JsonObject, keys: &[&str], label: &str) -> Result<Option<f64>, GeoJsonError> {
    for key in keys {
        let value = match props.get(*key) {
            None | Some(Value::Null) => continue,
            Some(Value::Number(n)) => n.as_f64(),
            Some(Value::String(s)) => s.trim().trim_end_matches('m').trim().parse::<f64>().ok(),
            Some(_) => None,
        };
        return match value {
            Some(v) if v.is_finite() && v >= 0.0 => Ok(Some(v)),
            _ => Err(GeoJsonError::Footprint {
                feature: label.to_string(),
                problem: format!("property {key:?} must be a height in metres, got {}", props[*key]),
            }),
        };
    }
    Ok(None)
}

/// A building's underside and top in metres above ground.
fn heights(
    props: &JsonObject,
    label: &str,
    options: &FootprintOptions,
    notes: &mut Notes,
) -> Result<(f64, f64), GeoJsonError> {
    let base_m = metres(props, BASE_KEYS, label)?.unwrap_or(0.0);
    if let Some(top_m) = metres(props, HEIGHT_KEYS, label)? {
        return Ok((base_m, top_m));
    }
    if let Some(levels) = metres(props, LEVEL_KEYS, label)? {
        notes.from_levels.push(label.to_string());
        return Ok((base_m, base_m + levels * options.storey_height_m));
    }
    match options.default_height_m {
        Some(h) => {
            notes.defaulted.push(label.to_string());
            Ok((base_m, base_m + h))
        }
        None => Err(GeoJsonError::Footprint {
            feature: label.to_string(),
            problem: format!(
                "has no height: give it one of the properties {} (metres) or {} (storeys), or give a \
                 default_height_m for buildings without one",
                HEIGHT_KEYS.join(", "),
                LEVEL_KEYS.join(", ")
            ),
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use geojson::GeoJson;

    /// Two footprints about 0.1° W, 51.5° N: one 12 m tall (text, OSM style), one of 4 storeys; and a
    /// Point (a tree) that is not a footprint.
    const PLAIN: &str = r#"{"type": "FeatureCollection", "features": [
      {"type": "Feature", "id": "way/1", "properties": {"building": "yes", "height": "12 m"},
       "geometry": {"type": "Polygon", "coordinates": [[[-0.1, 51.5], [-0.0998, 51.5], [-0.0998, 51.5001], [-0.1, 51.5001], [-0.1, 51.5]]]}},
      {"type": "Feature", "properties": {"building:levels": 4, "min_height": 3},
       "geometry": {"type": "Polygon", "coordinates": [[[-0.1, 51.5003], [-0.0998, 51.5003], [-0.0998, 51.5004], [-0.1, 51.5004], [-0.1, 51.5003]]]}},
      {"type": "Feature", "properties": {"natural": "tree"}, "geometry": {"type": "Point", "coordinates": [-0.0999, 51.5002]}}
    ]}"#;

    fn london() -> FootprintOptions {
        FootprintOptions { zone: Some("Europe/London".parse().unwrap()), ..FootprintOptions::default() }
    }

    #[test]
    fn footprints_become_existing_volumes_and_the_assumptions_are_said() {
        let gj: GeoJson = PLAIN.parse().unwrap();
        let GeoJson::FeatureCollection(fc) = gj else { panic!() };
        assert!(is_plain(&fc));
        let got = SiteModel::from_footprints(PLAIN, &london()).unwrap();
        let v = &got.model.volumes;
        assert_eq!(v.len(), 2);
        assert_eq!((v[0].id.as_str(), v[0].base_m, v[0].top_m), ("way/1", 0.0, 12.0));
        // 4 storeys of 3 m on a 3 m underside.
        assert_eq!((v[1].base_m, v[1].top_m), (3.0, 15.0));
        assert!(v.iter().all(|v| v.status == crate::site::Status::Existing));
        let said = got.assumptions.join(" ");
        assert!(said.contains("2 footprint(s) read as existing buildings"), "{said}");
        assert!(said.contains("1 building(s) given by storeys, at 3 m a storey: #1"), "{said}");
        assert!(said.contains("1 feature(s) that are not footprints (not polygons) were left out: #2"), "{said}");
        assert_eq!(got.model.zone.to_string(), "Europe/London");
        // Ground to map around them: the bounding box grown by 20 m (the tallest is 15 m).
        let a = &got.model.areas;
        assert_eq!((a.len(), a[0].id.as_str()), (1, SURROUNDINGS_ID));
        let r = geo::BoundingRect::bounding_rect(&a[0].polygon).unwrap();
        let fp = geo::BoundingRect::bounding_rect(&v[0].footprint).unwrap();
        assert!((fp.min().x - r.min().x - 20.0).abs() < 1e-6, "{r:?} {fp:?}");
        // The footprints standing on the ground are holes in it; the raised one (3 m up) is not.
        assert_eq!(a[0].polygon.interiors().len(), 1);
        let inside = |p: geo::Point<f64>| geo::Contains::contains(&a[0].polygon, &p);
        assert!(!inside(geo::Centroid::centroid(&v[0].footprint).unwrap()));
        assert!(inside(geo::Centroid::centroid(&v[1].footprint).unwrap()));
        assert!(said.contains("An area \"surroundings\""), "{said}");
    }

    #[test]
    fn without_a_zone_the_longitude_is_offered_not_taken() {
        let e = SiteModel::from_footprints(PLAIN, &FootprintOptions::default()).unwrap_err();
        assert!(matches!(&e, GeoJsonError::ZoneNeeded { suggestion, .. } if suggestion == "Etc/GMT"), "{e}");
        assert!(e.to_string().contains("Etc/GMT"), "{e}");
        // The suggestion does not wait for every building to have a height (the page offers it first).
        let no_height: GeoJson = PLAIN.replace(r#""height": "12 m""#, "\"roof\": 1").parse().unwrap();
        let GeoJson::FeatureCollection(fc) = no_height else { panic!() };
        let (lon, zone) = suggested_zone(&fc).unwrap();
        assert!((lon - -0.0999).abs() < 1e-9 && zone == "Etc/GMT", "{lon} {zone}");
        // 15° an hour, POSIX sign: east of Greenwich is Etc/GMT-N.
        assert_eq!(zone_from_longitude(151.2), "Etc/GMT-10");
        assert_eq!(zone_from_longitude(-74.0), "Etc/GMT+5");
        assert_eq!(zone_from_longitude(7.4), "Etc/GMT");
        assert_eq!(zone_from_longitude(7.6), "Etc/GMT-1");
        // Every suggestion is a zone the reader knows.
        for lon in (-180..=180).step_by(5) {
            assert!(zone_from_longitude(lon as f64).parse::<Zone>().is_ok(), "{lon}");
        }
    }

    #[test]
    fn a_building_without_height_is_named_unless_a_default_is_given() {
        let text = PLAIN.replace(r#""height": "12 m""#, r#""roof": "flat""#);
        let e = SiteModel::from_footprints(&text, &london()).unwrap_err();
        assert!(e.to_string().contains(r#""way/1" (#0): has no height"#), "{e}");
        let opts = FootprintOptions { default_height_m: Some(7.5), ..london() };
        let got = SiteModel::from_footprints(&text, &opts).unwrap();
        assert_eq!(got.model.volumes[0].top_m, 7.5);
        assert!(got.assumptions.join(" ").contains("with no height or storeys, taken as 7.5 m tall: \"way/1\" (#0)"));
        let bad = PLAIN.replace(r#""12 m""#, r#""tall""#);
        let e = SiteModel::from_footprints(&bad, &london()).unwrap_err();
        assert!(e.to_string().contains(r#"property "height" must be a height in metres, got "tall""#), "{e}");
    }

    #[test]
    fn a_collection_of_no_footprints_is_refused() {
        let text = r#"{"type":"FeatureCollection","features":[{"type":"Feature","properties":{},
            "geometry":{"type":"Point","coordinates":[0,0]}}]}"#;
        let e = SiteModel::from_footprints(text, &london()).unwrap_err();
        assert!(e.to_string().contains("no building footprints"), "{e}");
    }
}

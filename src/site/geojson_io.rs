//! Sites as GeoJSON (RFC 7946: WGS84 longitude and latitude), converted to and from the local frame.
//!
//! A site is a FeatureCollection with a foreign member `"sunlot": {"zone": "Europe/London",
//! "elevation_m": 118, "origin": [lon, lat], "name": "…", "ground": {"slope_deg": 0, "aspect_deg": 0}}`
//! (`ground` defaults to flat, `origin` to the centre of the
//! features' bounding box; `elevation_m` to 0). Each feature says what it is in its properties — see
//! [`PROPERTY_NAMES`]. Volumes and areas are Polygons or MultiPolygons (each part its own feature, id
//! suffixed `#2`, `#3`, …); walls are LineStrings or MultiLineStrings. Imported sites use the east-north
//! frame about the origin as their plan (plan rotation 0).

use geo::{Coord, LineString, MapCoords, Polygon};
use geojson::{Feature, FeatureCollection, GeoJson, Geometry, GeometryValue, JsonObject};
use serde_json::{json, Value};

use super::file::{Area, AreaKind, SiteModel};
use super::frame::LocalFrame;
use super::massing::{SiteError, Status, Volume, Wall};
use super::terrain::Ground;
use super::windows::WindowPoint;
use crate::limits::{within, OverBudget, MAX_FEATURES, MAX_SITE_TEXT_BYTES, MAX_VERTICES};
use crate::solar::{InputError, Site};
use crate::time::{TimeError, Zone};

/// The feature properties sunlot reads and writes, with their meaning.
pub const PROPERTY_NAMES: &[(&str, &str)] = &[
    ("sunlot", "what the feature is: \"volume\", \"area\", \"wall\" or \"window\" (required on every feature)"),
    ("id", "unique id (else the feature's own id, else feature-N)"),
    ("name", "display name"),
    ("status", "\"existing\" or \"proposed\" (default existing)"),
    ("base_m", "volume: underside above ground, metres (default 0)"),
    ("top_m", "volume: top above ground, metres"),
    ("height_m", "wall: height above ground, metres"),
    ("kind", "area: \"lot\", \"garden\", \"terrace\", \"amenity\" or \"other\" (default other)"),
    ("z_m", "window (a Point): height of its reference point above the ground, metres"),
    ("facing_deg", "window: the direction it faces, degrees clockwise from true north"),
    ("opening_width_m", "window: width of the opening, metres"),
    ("opening_height_m", "window: height of the opening, metres"),
];

/// Why GeoJSON could not be read as a site; names the feature (by id or index) and the problem.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum GeoJsonError {
    /// Not GeoJSON, or not a FeatureCollection.
    #[error("GeoJSON: {0}")]
    Format(String),
    /// A feature whose geometry type cannot stand for what it says it is.
    #[error("GeoJSON feature {feature}: a {what} must be {expected}, got {found}")]
    UnsupportedGeometry { feature: String, what: String, expected: &'static str, found: String },
    /// A property of the wrong type or value.
    #[error("GeoJSON feature {feature}: property {property:?} {problem}")]
    Property { feature: String, property: &'static str, problem: String },
    /// A position that is not a longitude and a latitude in range.
    #[error("GeoJSON feature {feature}: coordinates{path} {problem}")]
    Coordinate { feature: String, path: String, problem: String },
    /// The site's location.
    #[error("GeoJSON: sunlot.{0}")]
    Location(String),
    /// More text, features or vertices than [`crate::limits`] allows.
    #[error("GeoJSON: {0}")]
    Budget(#[from] OverBudget),
    /// A feature that fails the site model's checks.
    #[error("GeoJSON: {0}")]
    Feature(#[from] SiteError),
    /// Plain building footprints, which never say the site's time zone: the caller must give one.
    #[error(
        "GeoJSON: these building footprints do not say the site's time zone: give it (an IANA name such as \
         Europe/London); from their longitude {longitude_deg:.2}° a fixed offset with no daylight saving \
         would be {suggestion}"
    )]
    ZoneNeeded { longitude_deg: f64, suggestion: String },
    /// A plain footprint whose height cannot be read.
    #[error("GeoJSON feature {feature}: {problem}")]
    Footprint { feature: String, problem: String },
}

fn geometry_name(g: &GeometryValue) -> String {
    match g {
        GeometryValue::Point { .. } => "Point",
        GeometryValue::MultiPoint { .. } => "MultiPoint",
        GeometryValue::LineString { .. } => "LineString",
        GeometryValue::MultiLineString { .. } => "MultiLineString",
        GeometryValue::Polygon { .. } => "Polygon",
        GeometryValue::MultiPolygon { .. } => "MultiPolygon",
        GeometryValue::GeometryCollection { .. } => "GeometryCollection",
    }
    .to_string()
}

impl SiteModel {
    /// Reads a site from GeoJSON.
    ///
    /// # Errors
    /// [`GeoJsonError`] naming the feature and the problem; no feature is silently dropped.
    pub fn from_geojson(text: &str) -> Result<Self, GeoJsonError> {
        SiteModel::from_collection(&parse_collection(text)?)
    }

    /// A site from a parsed FeatureCollection with `sunlot` members (see [`SiteModel::from_geojson`]).
    pub(super) fn from_collection(fc: &FeatureCollection) -> Result<Self, GeoJsonError> {
        within("features", fc.features.len() as f64, MAX_FEATURES as f64, "features")?;
        within(
            "vertices",
            fc.features.iter().map(vertex_count).sum::<usize>() as f64,
            MAX_VERTICES as f64,
            "vertices",
        )?;
        let (mut model, frame) = site_header(fc)?;
        let mut ids = std::collections::HashSet::new();
        for (index, f) in fc.features.iter().enumerate() {
            read_feature(&mut model, &frame, &mut ids, index, f)?;
        }
        Ok(model)
    }

    /// Writes the site as GeoJSON in WGS84 about its location, with the properties of [`PROPERTY_NAMES`].
    pub fn to_geojson(&self) -> String {
        let frame = self.frame();
        let mut features = Vec::new();
        let mut push = |geom: GeometryValue, props: Value| {
            features.push(Feature {
                geometry: Some(Geometry::new(geom)),
                properties: props.as_object().cloned(),
                ..Default::default()
            });
        };
        let status = |s: Status| if s == Status::Existing { "existing" } else { "proposed" };
        for v in &self.volumes {
            push(
                GeometryValue::from(&self.polygon_to_wgs84(&frame, &v.footprint)),
                json!({"sunlot": "volume", "id": v.id, "status": status(v.status), "base_m": v.base_m, "top_m": v.top_m}),
            );
        }
        for a in &self.areas {
            let kind = serde_json::to_value(a.kind).unwrap_or(Value::Null);
            push(
                GeometryValue::from(&self.polygon_to_wgs84(&frame, &a.polygon)),
                json!({"sunlot": "area", "id": a.id, "name": a.name, "status": status(a.status), "kind": kind}),
            );
        }
        for w in &self.walls {
            let line = w.line.map_coords(|c| self.plan_to_wgs84(&frame, c));
            push(
                GeometryValue::from(&line),
                json!({"sunlot": "wall", "id": w.id, "status": status(w.status), "height_m": w.height_m}),
            );
        }
        for w in &self.windows {
            let c = self.plan_to_wgs84(&frame, w.at);
            push(
                GeometryValue::Point { coordinates: vec![c.x, c.y].into() },
                json!({"sunlot": "window", "id": w.id, "name": w.name, "status": status(w.status), "z_m": w.z_m,
                       "facing_deg": w.facing_deg, "opening_width_m": w.opening_width_m,
                       "opening_height_m": w.opening_height_m}),
            );
        }
        let mut fc = FeatureCollection::new(features);
        let mut members = JsonObject::new();
        members.insert(
            "sunlot".into(),
            json!({"name": self.name, "zone": self.zone.to_string(), "elevation_m": self.location.elevation_m,
                   "origin": [self.location.longitude_deg, self.location.latitude_deg], "ground": self.ground}),
        );
        fc.foreign_members = Some(members);
        serde_json::to_string_pretty(&fc).unwrap_or_default()
    }

    /// The local frame about the site's location (ground plane at its elevation).
    pub fn frame(&self) -> LocalFrame {
        LocalFrame::new(self.location.longitude_deg, self.location.latitude_deg, self.location.elevation_m)
    }

    /// A plan point as (longitude, latitude), turning the plan by its rotation to true north first.
    pub fn plan_to_wgs84(&self, frame: &LocalFrame, c: Coord<f64>) -> Coord<f64> {
        let (s, k) = self.plan_rotation_deg.to_radians().sin_cos();
        let (e, n) = (c.x * k - c.y * s, c.x * s + c.y * k);
        let (lon, lat) = frame.to_wgs84(e, n);
        Coord { x: lon, y: lat }
    }

    /// A plan polygon in WGS84.
    pub fn polygon_to_wgs84(&self, frame: &LocalFrame, p: &Polygon<f64>) -> Polygon<f64> {
        p.map_coords(|c| self.plan_to_wgs84(frame, c))
    }
}

/// A site's text as a FeatureCollection: within the text budget, no member given twice, GeoJSON.
pub(super) fn parse_collection(text: &str) -> Result<FeatureCollection, GeoJsonError> {
    within("site", text.len() as f64, MAX_SITE_TEXT_BYTES as f64, "bytes")?;
    crate::json_check::unique_members(text).map_err(GeoJsonError::Format)?;
    let gj: GeoJson = text.parse().map_err(|e: geojson::Error| GeoJsonError::Format(e.to_string()))?;
    let GeoJson::FeatureCollection(fc) = gj else {
        return Err(GeoJsonError::Format("a site must be a FeatureCollection".into()));
    };
    Ok(fc)
}

/// The site a collection's `sunlot` member describes (location, zone, name, ground), with no features
/// yet, and the local frame its features are read in.
fn site_header(fc: &FeatureCollection) -> Result<(SiteModel, LocalFrame), GeoJsonError> {
    let meta = fc.foreign_members.as_ref().and_then(|m| m.get("sunlot")).cloned().unwrap_or(Value::Null);
    if !(meta.is_object() || meta.is_null()) {
        return Err(GeoJsonError::Location(format!(" must be an object with the zone, got {meta}")));
    }
    let zone: Zone = match meta.get("zone") {
        None | Some(Value::Null) => {
            return Err(GeoJsonError::Location("zone is missing (an IANA name such as Europe/London)".into()))
        }
        Some(Value::String(z)) => z.parse().map_err(|e: TimeError| GeoJsonError::Location(e.to_string()))?,
        Some(other) => {
            return Err(GeoJsonError::Location(format!("zone must be a name such as Europe/London, got {other}")))
        }
    };
    let elevation_m = match meta.get("elevation_m") {
        None | Some(Value::Null) => 0.0,
        Some(v) => v
            .as_f64()
            .ok_or_else(|| GeoJsonError::Location(format!("elevation_m must be a number of metres, got {v}")))?,
    };
    let origin = match meta.get("origin").and_then(Value::as_array) {
        Some(o) if o.len() == 2 && o.iter().all(Value::is_number) => {
            (o[0].as_f64().unwrap_or(f64::NAN), o[1].as_f64().unwrap_or(f64::NAN))
        }
        Some(_) => return Err(GeoJsonError::Location("origin must be [longitude, latitude]".into())),
        None => bbox_centre(fc).ok_or_else(|| GeoJsonError::Format("the collection has no coordinates".into()))?,
    };
    let location =
        Site::new(origin.1, origin.0, elevation_m).map_err(|e: InputError| GeoJsonError::Location(e.to_string()))?;
    let frame = LocalFrame::new(origin.0, origin.1, elevation_m);
    let name = match meta.get("name") {
        None | Some(Value::Null) => String::new(),
        Some(Value::String(n)) => n.clone(),
        Some(other) => return Err(GeoJsonError::Location(format!("name must be text, got {other}"))),
    };
    let ground: Ground = match meta.get("ground") {
        None | Some(Value::Null) => Ground::flat(),
        Some(g) => serde_json::from_value::<Ground>(g.clone())
            .map_err(|e| GeoJsonError::Location(format!("ground: {e}")))?
            .validated()
            .map_err(GeoJsonError::Location)?,
    };
    let model = SiteModel {
        name,
        location,
        zone,
        plan_rotation_deg: 0.0,
        ground,
        areas: vec![],
        volumes: vec![],
        walls: vec![],
        windows: vec![],
    };
    Ok((model, frame))
}

/// Reads feature `index` into `model`: a volume, area or wall (each part of a Multi geometry its own
/// feature) or a window, in `frame`; `ids` holds the ids taken so far.
fn read_feature(
    model: &mut SiteModel,
    frame: &LocalFrame,
    ids: &mut std::collections::HashSet<String>,
    index: usize,
    f: &Feature,
) -> Result<(), GeoJsonError> {
    let props = f.properties.clone().unwrap_or_default();
    let Some(what) = props.get("sunlot").and_then(Value::as_str).map(str::to_string) else {
        return Err(GeoJsonError::Property {
            feature: format!("#{index}"),
            property: "sunlot",
            problem: "is missing: say whether the feature is a \"volume\", an \"area\" or a \"wall\"".into(),
        });
    };
    let base_id = feature_id(f, &props, index);
    let label = format!("{base_id:?} (#{index})");
    let prop = Props { props: &props, feature: &label };
    let status = prop.status()?;
    let geom = f.geometry.as_ref().map(|g| &g.value);
    let mut claim = |id: &str| {
        if ids.insert(id.to_string()) {
            Ok(())
        } else {
            Err(GeoJsonError::Property {
                feature: label.clone(),
                property: "id",
                problem: format!("{id:?} is used by more than one feature"),
            })
        }
    };
    if what == "window" {
        claim(&base_id)?;
        model.windows.push(read_window(&prop, geom, frame, base_id, status)?);
        return Ok(());
    }
    let parts = match what.as_str() {
        "volume" | "area" => geometry_parts(geom, frame, &label, &what, "a Polygon or MultiPolygon", true)?,
        "wall" => geometry_parts(geom, frame, &label, &what, "a LineString or MultiLineString", false)?,
        other => {
            return Err(GeoJsonError::Property {
                feature: label,
                property: "sunlot",
                problem: format!("must be \"volume\", \"area\", \"wall\" or \"window\", got {other:?}"),
            })
        }
    };
    for (k, rings) in parts.into_iter().enumerate() {
        // A multi-part feature gives one feature a part: `id`, `id#2`, `id#3`, …
        let id = if k == 0 { base_id.clone() } else { format!("{base_id}#{}", k + 1) };
        claim(&id)?;
        let polygon = || {
            let mut it = rings.iter().map(|r| LineString::from(r.clone()));
            let outer = it.next().unwrap_or_else(|| LineString::new(vec![]));
            Polygon::new(outer, it.collect())
        };
        match what.as_str() {
            "volume" => {
                let base = prop.number("base_m")?.unwrap_or(0.0);
                let top = prop.number("top_m")?.ok_or_else(|| prop.missing("top_m"))?;
                model.volumes.push(Volume::new(&id, status, polygon(), base, top)?);
            }
            "area" => {
                model.areas.push(Area::new(&id, &prop.text("name")?, prop.kind()?, status, polygon())?);
            }
            _ => {
                let h = prop.number("height_m")?.ok_or_else(|| prop.missing("height_m"))?;
                let line = rings.first().cloned().unwrap_or_default();
                model.walls.push(Wall::new(&id, status, LineString::from(line), h)?);
            }
        }
    }
    Ok(())
}

/// A feature's id: its `id` property, else the Feature's own id, else `feature-<index>`.
fn feature_id(f: &Feature, props: &JsonObject, index: usize) -> String {
    props
        .get("id")
        .and_then(Value::as_str)
        .map(str::to_string)
        .or_else(|| {
            f.id.as_ref().map(|i| match i {
                geojson::feature::Id::String(s) => s.clone(),
                geojson::feature::Id::Number(n) => n.to_string(),
            })
        })
        .unwrap_or_else(|| format!("feature-{index}"))
}

/// A window feature (a Point with `z_m`, `facing_deg` and the opening's size), checked.
fn read_window(
    prop: &Props,
    geom: Option<&GeometryValue>,
    frame: &LocalFrame,
    id: String,
    status: Status,
) -> Result<WindowPoint, GeoJsonError> {
    let Some(GeometryValue::Point { coordinates }) = geom else {
        return Err(GeoJsonError::UnsupportedGeometry {
            feature: prop.feature.to_string(),
            what: "window".into(),
            expected: "a Point",
            found: geom.map_or("no geometry".to_string(), geometry_name),
        });
    };
    let (lon, lat) = lon_lat(coordinates, prop.feature, "")?;
    let (e, n) = frame.to_local(lon, lat);
    let need = |key: &'static str| prop.number(key)?.ok_or_else(|| prop.missing(key));
    let window = WindowPoint {
        id,
        name: prop.text("name")?,
        status,
        at: Coord { x: e, y: n },
        z_m: need("z_m")?,
        facing_deg: need("facing_deg")?,
        opening_width_m: need("opening_width_m")?,
        opening_height_m: need("opening_height_m")?,
    };
    Ok(window.checked()?)
}

/// A feature's geometry as parts of rings in the local frame: polygons (outer ring, then holes) when
/// `polygonal`, else lines (one ring each); another geometry is named with what was `expected`.
fn geometry_parts(
    geom: Option<&GeometryValue>,
    frame: &LocalFrame,
    label: &str,
    what: &str,
    expected: &'static str,
    polygonal: bool,
) -> Result<Vec<Vec<Vec<Coord<f64>>>>, GeoJsonError> {
    let ring = |r: &Vec<geojson::Position>, path: String| -> Result<Vec<Coord<f64>>, GeoJsonError> {
        r.iter()
            .enumerate()
            .map(|(k, p)| {
                let (lon, lat) = lon_lat(p, label, &format!("{path}[{k}]"))?;
                let (e, n) = frame.to_local(lon, lat);
                Ok(Coord { x: e, y: n })
            })
            .collect()
    };
    match (geom, polygonal) {
        (Some(GeometryValue::Polygon { coordinates }), true) => Ok(vec![coordinates
            .iter()
            .enumerate()
            .map(|(r, c)| ring(c, format!("[{r}]")))
            .collect::<Result<_, _>>()?]),
        (Some(GeometryValue::MultiPolygon { coordinates }), true) => coordinates
            .iter()
            .enumerate()
            .map(|(k, p)| p.iter().enumerate().map(|(r, c)| ring(c, format!("[{k}][{r}]"))).collect())
            .collect(),
        (Some(GeometryValue::LineString { coordinates }), false) => Ok(vec![vec![ring(coordinates, String::new())?]]),
        (Some(GeometryValue::MultiLineString { coordinates }), false) => {
            coordinates.iter().enumerate().map(|(k, l)| Ok(vec![ring(l, format!("[{k}]"))?])).collect()
        }
        (g, _) => Err(GeoJsonError::UnsupportedGeometry {
            feature: label.to_string(),
            what: what.to_string(),
            expected,
            found: g.map_or("no geometry".to_string(), geometry_name),
        }),
    }
}

/// A position's longitude and latitude, checked: two numbers (a third, the altitude, is allowed and
/// ignored), in range. `path` is the position's place in the geometry's coordinates (`[0][3]`).
fn lon_lat(p: &geojson::Position, feature: &str, path: &str) -> Result<(f64, f64), GeoJsonError> {
    let bad =
        |problem: String| GeoJsonError::Coordinate { feature: feature.to_string(), path: path.to_string(), problem };
    let (lon, lat) = match p.as_slice() {
        [lon, lat] | [lon, lat, _] => (*lon, *lat),
        other => {
            return Err(bad(format!(
                "has {} numbers; a position is [longitude, latitude] or [longitude, latitude, altitude]",
                other.len()
            )))
        }
    };
    if !(lon.is_finite() && (-180.0..=180.0).contains(&lon)) {
        return Err(bad(format!("longitude {lon} is outside -180 to 180")));
    }
    if !(lat.is_finite() && (-90.0..=90.0).contains(&lat)) {
        return Err(bad(format!("latitude {lat} is outside -90 to 90")));
    }
    Ok((lon, lat))
}

pub(super) fn bbox_centre(fc: &FeatureCollection) -> Option<(f64, f64)> {
    let (mut lo, mut hi) = ((f64::INFINITY, f64::INFINITY), (f64::NEG_INFINITY, f64::NEG_INFINITY));
    let mut visit = |p: &geojson::Position| {
        // Bad positions are named when the features are read; here they are only left out.
        if let Ok((lon, lat)) = lon_lat(p, "", "") {
            lo = (lo.0.min(lon), lo.1.min(lat));
            hi = (hi.0.max(lon), hi.1.max(lat));
        }
    };
    for f in &fc.features {
        match f.geometry.as_ref().map(|g| &g.value) {
            Some(GeometryValue::Polygon { coordinates }) => coordinates.iter().flatten().for_each(&mut visit),
            Some(GeometryValue::MultiPolygon { coordinates }) => {
                coordinates.iter().flatten().flatten().for_each(&mut visit)
            }
            Some(GeometryValue::LineString { coordinates }) => coordinates.iter().for_each(&mut visit),
            Some(GeometryValue::MultiLineString { coordinates }) => coordinates.iter().flatten().for_each(&mut visit),
            _ => {}
        }
    }
    lo.0.is_finite().then(|| ((lo.0 + hi.0) / 2.0, (lo.1 + hi.1) / 2.0))
}

/// Positions in a feature's geometry.
fn vertex_count(f: &Feature) -> usize {
    match f.geometry.as_ref().map(|g| &g.value) {
        Some(GeometryValue::Polygon { coordinates }) | Some(GeometryValue::MultiLineString { coordinates }) => {
            coordinates.iter().map(Vec::len).sum()
        }
        Some(GeometryValue::MultiPolygon { coordinates }) => coordinates.iter().flatten().map(Vec::len).sum(),
        Some(GeometryValue::LineString { coordinates }) | Some(GeometryValue::MultiPoint { coordinates }) => {
            coordinates.len()
        }
        _ => 0,
    }
}

struct Props<'a> {
    props: &'a JsonObject,
    feature: &'a str,
}

impl Props<'_> {
    fn number(&self, key: &'static str) -> Result<Option<f64>, GeoJsonError> {
        match self.props.get(key) {
            None | Some(Value::Null) => Ok(None),
            Some(v) => v.as_f64().map(Some).ok_or_else(|| GeoJsonError::Property {
                feature: self.feature.to_string(),
                property: key,
                problem: format!("must be a number of metres, got {v}"),
            }),
        }
    }

    fn missing(&self, key: &'static str) -> GeoJsonError {
        GeoJsonError::Property { feature: self.feature.to_string(), property: key, problem: "is missing".into() }
    }

    fn text(&self, key: &'static str) -> Result<String, GeoJsonError> {
        match self.props.get(key) {
            None | Some(Value::Null) => Ok(String::new()),
            Some(Value::String(t)) => Ok(t.clone()),
            Some(other) => Err(GeoJsonError::Property {
                feature: self.feature.to_string(),
                property: key,
                problem: format!("must be text, got {other}"),
            }),
        }
    }

    fn status(&self) -> Result<Status, GeoJsonError> {
        match self.props.get("status") {
            None | Some(Value::Null) => Ok(Status::Existing),
            Some(Value::String(s)) if s == "existing" => Ok(Status::Existing),
            Some(Value::String(s)) if s == "proposed" => Ok(Status::Proposed),
            Some(other) => Err(GeoJsonError::Property {
                feature: self.feature.to_string(),
                property: "status",
                problem: format!("must be \"existing\" or \"proposed\", got {other}"),
            }),
        }
    }

    fn kind(&self) -> Result<AreaKind, GeoJsonError> {
        match self.props.get("kind") {
            None => Ok(AreaKind::Other),
            Some(v) => serde_json::from_value(v.clone()).map_err(|_| GeoJsonError::Property {
                feature: self.feature.to_string(),
                property: "kind",
                problem: format!("must be lot, garden, terrace, amenity or other, got {v}"),
            }),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn geojson_round_trip_keeps_coordinates_within_a_millimetre() {
        let site = crate::demo::demo();
        let text = site.to_geojson();
        let back = SiteModel::from_geojson(&text).unwrap();
        assert_eq!(back.volumes.len(), site.volumes.len());
        assert_eq!(back.areas.len(), site.areas.len());
        assert_eq!(back.walls.len(), site.walls.len());
        for (a, b) in site.volumes.iter().zip(&back.volumes) {
            assert_eq!(a.id, b.id);
            assert_eq!((a.base_m, a.top_m, a.status), (b.base_m, b.top_m, b.status));
            for (p, q) in a.footprint.exterior().coords().zip(b.footprint.exterior().coords()) {
                assert_abs_diff_eq!(p.x, q.x, epsilon = 1e-3);
                assert_abs_diff_eq!(p.y, q.y, epsilon = 1e-3);
            }
        }
        // And GeoJSON → model → GeoJSON keeps longitudes and latitudes (1 mm ≈ 9e-9°).
        let again = SiteModel::from_geojson(&back.to_geojson()).unwrap();
        for (a, b) in back.volumes.iter().zip(&again.volumes) {
            for (p, q) in a.footprint.exterior().coords().zip(b.footprint.exterior().coords()) {
                assert_abs_diff_eq!(p.x, q.x, epsilon = 1e-6);
                assert_abs_diff_eq!(p.y, q.y, epsilon = 1e-6);
            }
        }
    }

    #[test]
    fn rotated_plans_land_on_true_north() {
        // A plan turned so that true north is 90° clockwise from its top: plan "up" is true west.
        let mut site = crate::demo::demo();
        site.plan_rotation_deg = 90.0;
        let f = site.frame();
        let c = site.plan_to_wgs84(&f, Coord { x: 0.0, y: 100.0 });
        let (e, n) = f.to_local(c.x, c.y);
        assert_abs_diff_eq!(e, -100.0, epsilon = 1e-6);
        assert_abs_diff_eq!(n, 0.0, epsilon = 1e-6);
    }

    #[test]
    fn unsupported_geometry_and_bad_properties_are_named() {
        let doc = |geom: &str, props: &str| {
            format!(
                r#"{{"type":"FeatureCollection","sunlot":{{"zone":"Europe/London"}},"features":[
                {{"type":"Feature","id":"ok","geometry":{{"type":"Polygon","coordinates":[[[-1.87,52.62],[-1.8698,52.62],[-1.8698,52.6202],[-1.87,52.62]]]}},"properties":{{"sunlot":"volume","top_m":6}}}},
                {{"type":"Feature","geometry":{geom},"properties":{props}}}]}}"#
            )
        };
        let point = r#"{"type":"Point","coordinates":[-1.87,52.62]}"#;
        let e = SiteModel::from_geojson(&doc(point, r#"{"sunlot":"volume","id":"mast","top_m":20}"#)).unwrap_err();
        assert_eq!(
            e.to_string(),
            "GeoJSON feature \"mast\" (#1): a volume must be a Polygon or MultiPolygon, got Point"
        );
        let poly =
            r#"{"type":"Polygon","coordinates":[[[-1.871,52.62],[-1.8705,52.62],[-1.8705,52.6205],[-1.871,52.62]]]}"#;
        let e = SiteModel::from_geojson(&doc(poly, r#"{"sunlot":"volume","top_m":"tall"}"#)).unwrap_err();
        assert!(e.to_string().contains("feature-1") && e.to_string().contains("top_m"), "{e}");
        let e = SiteModel::from_geojson(&doc(poly, r#"{"sunlot":"volume"}"#)).unwrap_err();
        assert!(e.to_string().contains("\"top_m\" is missing"), "{e}");
        let e = SiteModel::from_geojson(&doc(poly, r#"{"sunlot":"tower","top_m":3}"#)).unwrap_err();
        assert!(e.to_string().contains("\"sunlot\" must be"), "{e}");
        let e = SiteModel::from_geojson(&doc(poly, r#"{"sunlot":"volume","top_m":3,"status":"maybe"}"#)).unwrap_err();
        assert!(e.to_string().contains("status"), "{e}");
        let e = SiteModel::from_geojson(&doc(poly, r#"{"sunlot":"volume","id":"ok","top_m":3}"#)).unwrap_err();
        assert!(e.to_string().contains("more than one"), "{e}");
        // A feature that does not say what it is is refused, not dropped.
        let e = SiteModel::from_geojson(&doc(point, r#"{"note":"a tree"}"#)).unwrap_err();
        assert!(e.to_string().contains("#1") && e.to_string().contains("\"sunlot\" is missing"), "{e}");
        let e = SiteModel::from_geojson(r#"{"type":"Point","coordinates":[0,0]}"#).unwrap_err();
        assert!(e.to_string().contains("FeatureCollection"), "{e}");
        let e = SiteModel::from_geojson(r#"{"type":"FeatureCollection","features":[]}"#).unwrap_err();
        assert!(e.to_string().contains("zone is missing"), "{e}");
    }

    /// Found by fuzzing: a position of one number panicked the reader; a status or name that was not
    /// text was silently taken as the default.
    #[test]
    fn malformed_positions_and_properties_are_typed_errors() {
        let doc = |coords: &str, props: &str| {
            format!(
                r#"{{"type":"FeatureCollection","sunlot":{{"zone":"Europe/London","origin":[-1.87,52.62]}},"features":[
                {{"type":"Feature","id":"b","geometry":{{"type":"Polygon","coordinates":{coords}}},"properties":{props}}}]}}"#
            )
        };
        let ok = "[[[-1.87,52.62],[-1.8698,52.62],[-1.8698,52.6202],[-1.87,52.62]]]";
        let vol = r#"{"sunlot":"volume","top_m":6}"#;
        assert!(SiteModel::from_geojson(&doc(ok, vol)).is_ok());
        let e = SiteModel::from_geojson(&doc("[[[-1.87,52.62],[-1.8698],[-1.8698,52.6202],[-1.87,52.62]]]", vol))
            .unwrap_err();
        assert_eq!(
            e.to_string(),
            "GeoJSON feature \"b\" (#0): coordinates[0][1] has 1 numbers; a position is [longitude, latitude] or \
             [longitude, latitude, altitude]"
        );
        let e =
            SiteModel::from_geojson(&doc("[[[-1.87,52.62,1,2],[-1.8698,52.62],[-1.8698,52.6202],[-1.87,52.62]]]", vol))
                .unwrap_err();
        assert!(e.to_string().contains("coordinates[0][0] has 4 numbers"), "{e}");
        let e =
            SiteModel::from_geojson(&doc("[[[-1.87,52.62],[-1.8698,152.62],[-1.8698,52.6202],[-1.87,52.62]]]", vol))
                .unwrap_err();
        assert!(e.to_string().contains("coordinates[0][1] latitude 152.62 is outside -90 to 90"), "{e}");
        let e = SiteModel::from_geojson(&doc(ok, r#"{"sunlot":"volume","top_m":6,"status":7}"#)).unwrap_err();
        assert!(e.to_string().contains("property \"status\" must be \"existing\" or \"proposed\", got 7"), "{e}");
        let e = SiteModel::from_geojson(&doc(ok, r#"{"sunlot":"area","name":[1]}"#)).unwrap_err();
        assert!(e.to_string().contains("property \"name\" must be text"), "{e}");
        let e = SiteModel::from_geojson(&doc(ok, r#"{"sunlot":"volume","top_m":6,"top_m":1e308}"#)).unwrap_err();
        assert!(e.to_string().contains("features[0].properties: the member \"top_m\" appears twice"), "{e}");
        let e = SiteModel::from_geojson(&doc(ok, r#"{"sunlot":"volume","top_m":1e308}"#)).unwrap_err();
        assert!(e.to_string().contains("top_m must be a finite height of 0 m to 2000 m"), "{e}");
        let e = SiteModel::from_geojson(&doc(ok, vol).replace("\"origin\":[-1.87,52.62]", "\"elevation_m\":\"high\""))
            .unwrap_err();
        assert!(e.to_string().contains("elevation_m must be a number"), "{e}");
    }
}

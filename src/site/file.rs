//! The site file: sunlot's own versioned JSON in local plan metres (schema: `schemas/site-v2.schema.json`;
//! version 1, `schemas/site-v1.schema.json`, the same without windows, is still read).
//!
//! ```json
//! { "sunlot_site": 2, "name": "…",
//!   "location": { "latitude_deg": 52.62, "longitude_deg": -1.87, "elevation_m": 118, "zone": "Europe/London" },
//!   "plan_rotation_deg": 0, "ground": { "slope_deg": 0, "aspect_deg": 180 },
//!   "areas":   [ { "id": "garden-12", "kind": "garden", "status": "existing", "outline": [[x, y], …], "holes": [] } ],
//!   "volumes": [ { "id": "block-a", "status": "proposed", "base_m": 0, "top_m": 12.5, "outline": [[x, y], …] } ],
//!   "walls":   [ { "id": "fence-1", "status": "existing", "height_m": 1.8, "line": [[x, y], …] } ],
//!   "windows": [ { "id": "w-16-rear", "name": "16 Tenter Lane, rear window", "status": "existing",
//!                  "at": [x, y, z], "facing_deg": 0, "opening_width_m": 1.2, "opening_height_m": 1.4 } ] }
//! ```
//! Plan x runs to the plan's right and y to its top, in metres; `plan_rotation_deg` is the angle,
//! clockwise, from the plan's top to true north (0 when the plan is drawn to true north). `ground` is
//! optional (flat): `aspect_deg` is the direction the slope faces, downhill, from true north.

use geo::{Coord, LineString, Polygon};
use serde::{Deserialize, Serialize};

use super::footprints::{is_plain, FootprintOptions};
use super::massing::{check_ring, SiteError, Status, Volume, Wall};
use super::terrain::Ground;
use super::windows::WindowPoint;
use crate::json_check::{read_with_path, unique_members};
use crate::limits::{within, OverBudget, MAX_FEATURES, MAX_SITE_TEXT_BYTES, MAX_VERTICES};
use crate::solar::{InputError, Site};
use crate::time::{TimeError, Zone};

/// The file format version this build writes (and reads, with version 1: the same without windows).
pub const SITE_FILE_VERSION: u32 = 2;

/// Why a site file could not be read; names the feature or field.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SiteFileError {
    /// Not JSON, or a field of the wrong type or missing.
    #[error("site file: {0}")]
    Json(String),
    /// A version this build does not know.
    #[error("site file: unknown format version {found}; this sunlot reads sunlot_site 1 and {SITE_FILE_VERSION}")]
    UnknownVersion { found: String },
    /// A bad latitude, longitude or elevation.
    #[error("site file: location: {0}")]
    Location(InputError),
    /// A zone that is neither IANA nor an offset.
    #[error("site file: location: {0}")]
    Zone(TimeError),
    /// A bad ground slope.
    #[error("site file: {0}")]
    Ground(String),
    /// A plan rotation that is not a finite number.
    #[error("site file: plan_rotation_deg must be a finite number, got {0}")]
    Rotation(f64),
    /// Two features share an id.
    #[error("site file: id {0:?} is used by more than one feature; ids must be unique")]
    DuplicateId(String),
    /// A bad feature.
    #[error("site file: {0}")]
    Feature(SiteError),
    /// More features or vertices than [`crate::limits`] allows.
    #[error("site file: {0}")]
    Budget(#[from] OverBudget),
}

/// What an area is for; planning rules pick areas by kind.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum AreaKind {
    /// A plot of land (the subject lot or a neighbour's).
    Lot,
    /// A garden.
    Garden,
    /// A terrace, balcony or roof terrace.
    Terrace,
    /// Any other amenity area (a playground, a square).
    Amenity,
    /// Anything else worth measuring.
    Other,
}

/// A named ground area.
#[derive(Debug, Clone, PartialEq)]
pub struct Area {
    /// Unique id.
    pub id: String,
    /// Display name.
    pub name: String,
    /// What the area is.
    pub kind: AreaKind,
    /// Existing or proposed.
    pub status: Status,
    /// The outline in plan metres, holes allowed.
    pub polygon: Polygon<f64>,
}

impl Area {
    /// A validated area.
    ///
    /// # Errors
    /// [`SiteError`] naming `id` for too few vertices, non-finite coordinates or an invalid outline.
    pub fn new(id: &str, name: &str, kind: AreaKind, status: Status, polygon: Polygon<f64>) -> Result<Self, SiteError> {
        check_ring(id, "the outline", polygon.exterior())?;
        for (k, h) in polygon.interiors().iter().enumerate() {
            check_ring(id, &format!("hole {}", k + 1), h)?;
        }
        if let Some(problem) = geo::Validation::validation_errors(&polygon).into_iter().next() {
            return Err(SiteError::InvalidFootprint { feature: id.to_string(), reason: problem.to_string() });
        }
        Ok(Area { id: id.to_string(), name: name.to_string(), kind, status, polygon })
    }
}

/// A site: where it is, how its plan is turned, and what stands on it.
#[derive(Debug, Clone, PartialEq)]
pub struct SiteModel {
    /// Display name.
    pub name: String,
    /// Location on the Earth.
    pub location: Site,
    /// Zone for local times.
    pub zone: Zone,
    /// Angle, clockwise, from the plan's top to true north, degrees.
    pub plan_rotation_deg: f64,
    /// The ground's slope (flat by default).
    pub ground: Ground,
    /// Lots, gardens, terraces and other areas.
    pub areas: Vec<Area>,
    /// Massing volumes, existing and proposed.
    pub volumes: Vec<Volume>,
    /// Walls and fences.
    pub walls: Vec<Wall>,
    /// Named windows (site file version 2).
    pub windows: Vec<WindowPoint>,
}

impl SiteModel {
    /// The areas a proposal's effect is measured on: every area but the lots (under a new building
    /// its own lot loses most, which says nothing about the neighbours); all areas when every one is a
    /// lot.
    pub fn areas_beside_lots(&self) -> Vec<&Area> {
        let out: Vec<&Area> = self.areas.iter().filter(|a| a.kind != AreaKind::Lot).collect();
        if out.is_empty() {
            self.areas.iter().collect()
        } else {
            out
        }
    }

    /// The sun's azimuth in the plan frame for a true azimuth, degrees 0–360.
    pub fn plan_azimuth_deg(&self, true_azimuth_deg: f64) -> f64 {
        (true_azimuth_deg + self.plan_rotation_deg).rem_euclid(360.0)
    }

    /// Reads a site file.
    ///
    /// # Errors
    /// [`SiteFileError`] naming the field or the feature (by id) and the problem.
    pub fn from_json(text: &str) -> Result<Self, SiteFileError> {
        within("site", text.len() as f64, MAX_SITE_TEXT_BYTES as f64, "bytes")?;
        unique_members(text).map_err(SiteFileError::Json)?;
        // Only the version and whether there are windows: the rest is skipped, not built as a tree.
        #[derive(Deserialize)]
        struct Probe {
            sunlot_site: Option<serde_json::Value>,
            windows: Option<serde::de::IgnoredAny>,
        }
        let probe: Probe = serde_json::from_str(text).unwrap_or(Probe { sunlot_site: None, windows: None });
        match &probe.sunlot_site {
            Some(v) if v.as_u64() == Some(u64::from(SITE_FILE_VERSION)) => {}
            Some(v) if v.as_u64() == Some(1) => {
                if probe.windows.is_some() {
                    return Err(SiteFileError::Json(
                        "windows: a version 1 site file has no windows; say \"sunlot_site\": 2".into(),
                    ));
                }
            }
            Some(v) => return Err(SiteFileError::UnknownVersion { found: v.to_string() }),
            None => return Err(SiteFileError::Json("missing field `sunlot_site` (the format version, 2)".into())),
        }
        let file: SiteFile = read_with_path(text).map_err(SiteFileError::Json)?;
        file.within_budget()?;
        file.into_model()
    }

    /// Writes the site file (pretty JSON); reading it back gives the same model.
    pub fn to_json(&self) -> String {
        let file = SiteFile::from_model(self);
        serde_json::to_string_pretty(&file).unwrap_or_default()
    }
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct SiteFile {
    sunlot_site: u32,
    #[serde(default)]
    name: String,
    location: LocationFile,
    #[serde(default)]
    plan_rotation_deg: f64,
    #[serde(default, skip_serializing_if = "is_flat")]
    ground: Ground,
    #[serde(default)]
    areas: Vec<AreaFile>,
    #[serde(default)]
    volumes: Vec<VolumeFile>,
    #[serde(default)]
    walls: Vec<WallFile>,
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    windows: Vec<WindowFile>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct LocationFile {
    latitude_deg: f64,
    longitude_deg: f64,
    #[serde(default)]
    elevation_m: f64,
    zone: String,
}

type Ring = Vec<[f64; 2]>;

fn is_flat(g: &Ground) -> bool {
    g.slope_deg == 0.0
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct AreaFile {
    id: String,
    #[serde(default)]
    name: String,
    kind: AreaKind,
    status: Status,
    outline: Ring,
    #[serde(default)]
    holes: Vec<Ring>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct VolumeFile {
    id: String,
    status: Status,
    base_m: f64,
    top_m: f64,
    outline: Ring,
    #[serde(default)]
    holes: Vec<Ring>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct WallFile {
    id: String,
    status: Status,
    height_m: f64,
    line: Ring,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct WindowFile {
    id: String,
    #[serde(default)]
    name: String,
    status: Status,
    /// Plan x, y and height above ground of the reference point, metres.
    at: [f64; 3],
    facing_deg: f64,
    opening_width_m: f64,
    opening_height_m: f64,
}

fn line(r: &Ring) -> LineString<f64> {
    r.iter().map(|&[x, y]| Coord { x, y }).collect()
}

fn polygon(outline: &Ring, holes: &[Ring]) -> Polygon<f64> {
    Polygon::new(line(outline), holes.iter().map(line).collect())
}

/// A ring as written: the closing vertex is left out.
fn ring_out(ls: &LineString<f64>) -> Ring {
    let mut v: Ring = ls.coords().map(|c| [c.x, c.y]).collect();
    if v.len() > 1 && v.first() == v.last() {
        v.pop();
    }
    v
}

impl SiteFile {
    /// Features and vertices within [`MAX_FEATURES`] and [`MAX_VERTICES`].
    fn within_budget(&self) -> Result<(), OverBudget> {
        let features = self.areas.len() + self.volumes.len() + self.walls.len() + self.windows.len();
        within("features", features as f64, MAX_FEATURES as f64, "features")?;
        let rings = |outline: &Ring, holes: &[Ring]| outline.len() + holes.iter().map(Vec::len).sum::<usize>();
        let vertices = self.areas.iter().map(|a| rings(&a.outline, &a.holes)).sum::<usize>()
            + self.volumes.iter().map(|v| rings(&v.outline, &v.holes)).sum::<usize>()
            + self.walls.iter().map(|w| w.line.len()).sum::<usize>();
        within("vertices", vertices as f64, MAX_VERTICES as f64, "vertices")
    }

    fn into_model(self) -> Result<SiteModel, SiteFileError> {
        let l = &self.location;
        let location = Site::new(l.latitude_deg, l.longitude_deg, l.elevation_m).map_err(SiteFileError::Location)?;
        let zone: Zone = l.zone.parse().map_err(SiteFileError::Zone)?;
        if !self.plan_rotation_deg.is_finite() {
            return Err(SiteFileError::Rotation(self.plan_rotation_deg));
        }
        let ground = self.ground.validated().map_err(SiteFileError::Ground)?;
        let mut ids = std::collections::HashSet::new();
        let all_ids = self
            .areas
            .iter()
            .map(|a| &a.id)
            .chain(self.volumes.iter().map(|v| &v.id))
            .chain(self.walls.iter().map(|w| &w.id))
            .chain(self.windows.iter().map(|w| &w.id));
        for id in all_ids {
            if !ids.insert(id.clone()) {
                return Err(SiteFileError::DuplicateId(id.clone()));
            }
        }
        let areas = self
            .areas
            .iter()
            .map(|a| {
                Area::new(&a.id, &a.name, a.kind, a.status, polygon(&a.outline, &a.holes))
                    .map_err(SiteFileError::Feature)
            })
            .collect::<Result<Vec<_>, _>>()?;
        let volumes = self
            .volumes
            .iter()
            .map(|v| {
                Volume::new(&v.id, v.status, polygon(&v.outline, &v.holes), v.base_m, v.top_m)
                    .map_err(SiteFileError::Feature)
            })
            .collect::<Result<Vec<_>, _>>()?;
        let walls = self
            .walls
            .iter()
            .map(|w| Wall::new(&w.id, w.status, line(&w.line), w.height_m).map_err(SiteFileError::Feature))
            .collect::<Result<Vec<_>, _>>()?;
        let windows = self
            .windows
            .iter()
            .map(|w| {
                WindowPoint {
                    id: w.id.clone(),
                    name: w.name.clone(),
                    status: w.status,
                    at: Coord { x: w.at[0], y: w.at[1] },
                    z_m: w.at[2],
                    facing_deg: w.facing_deg,
                    opening_width_m: w.opening_width_m,
                    opening_height_m: w.opening_height_m,
                }
                .checked()
                .map_err(SiteFileError::Feature)
            })
            .collect::<Result<Vec<_>, _>>()?;
        Ok(SiteModel {
            name: self.name,
            location,
            zone,
            plan_rotation_deg: self.plan_rotation_deg,
            ground,
            areas,
            volumes,
            walls,
            windows,
        })
    }

    fn from_model(m: &SiteModel) -> Self {
        SiteFile {
            sunlot_site: SITE_FILE_VERSION,
            name: m.name.clone(),
            location: LocationFile {
                latitude_deg: m.location.latitude_deg,
                longitude_deg: m.location.longitude_deg,
                elevation_m: m.location.elevation_m,
                zone: m.zone.to_string(),
            },
            plan_rotation_deg: m.plan_rotation_deg,
            ground: m.ground,
            areas: m
                .areas
                .iter()
                .map(|a| AreaFile {
                    id: a.id.clone(),
                    name: a.name.clone(),
                    kind: a.kind,
                    status: a.status,
                    outline: ring_out(a.polygon.exterior()),
                    holes: a.polygon.interiors().iter().map(ring_out).collect(),
                })
                .collect(),
            volumes: m
                .volumes
                .iter()
                .map(|v| VolumeFile {
                    id: v.id.clone(),
                    status: v.status,
                    base_m: v.base_m,
                    top_m: v.top_m,
                    outline: ring_out(v.footprint.exterior()),
                    holes: v.footprint.interiors().iter().map(ring_out).collect(),
                })
                .collect(),
            walls: m
                .walls
                .iter()
                .map(|w| WallFile {
                    id: w.id.clone(),
                    status: w.status,
                    height_m: w.height_m,
                    line: w.line.coords().map(|c| [c.x, c.y]).collect(),
                })
                .collect(),
            windows: m
                .windows
                .iter()
                .map(|w| WindowFile {
                    id: w.id.clone(),
                    name: w.name.clone(),
                    status: w.status,
                    at: [w.at.x, w.at.y, w.z_m],
                    facing_deg: w.facing_deg,
                    opening_width_m: w.opening_width_m,
                    opening_height_m: w.opening_height_m,
                })
                .collect(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const SMALL: &str = r#"{
      "sunlot_site": 1, "name": "test",
      "location": { "latitude_deg": 52.0, "longitude_deg": -1.0, "elevation_m": 50, "zone": "Europe/London" },
      "plan_rotation_deg": 12.5, "ground": { "slope_deg": 4, "aspect_deg": 200 },
      "areas": [ { "id": "garden", "kind": "garden", "status": "existing", "outline": [[0,0],[10,0],[10,10],[0,10]] } ],
      "volumes": [ { "id": "house", "status": "existing", "base_m": 0, "top_m": 7.5,
                     "outline": [[0,20],[10,20],[10,30],[0,30]], "holes": [] },
                   { "id": "court", "status": "proposed", "base_m": 0, "top_m": 12,
                     "outline": [[20,0],[50,0],[50,30],[20,30]], "holes": [[[30,10],[40,10],[40,20],[30,20]]] } ],
      "walls": [ { "id": "fence", "status": "existing", "height_m": 1.8, "line": [[0,-1],[10,-1]] } ]
    }"#;

    #[test]
    fn reads_and_round_trips_without_loss() {
        let m = SiteModel::from_json(SMALL).unwrap();
        assert_eq!((m.areas.len(), m.volumes.len(), m.walls.len()), (1, 2, 1));
        assert_eq!(m.volumes[1].footprint.interiors().len(), 1);
        let again = SiteModel::from_json(&m.to_json()).unwrap();
        assert_eq!(again, m);
        assert_eq!(m.plan_azimuth_deg(350.0), 2.5);
    }

    #[test]
    fn errors_name_the_feature_and_field() {
        let e = SiteModel::from_json(&SMALL.replace("\"top_m\": 7.5", "\"top_m\": -2")).unwrap_err();
        assert_eq!(
            e.to_string(),
            "site file: feature \"house\": top_m must be a finite height of 0 m to 2000 m, got -2"
        );
        let e = SiteModel::from_json(&SMALL.replace("\"sunlot_site\": 1", "\"sunlot_site\": 7")).unwrap_err();
        assert!(matches!(e, SiteFileError::UnknownVersion { .. }), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("\"id\": \"fence\"", "\"id\": \"house\"")).unwrap_err();
        assert_eq!(e, SiteFileError::DuplicateId("house".into()));
        let e = SiteModel::from_json(&SMALL.replace("Europe/London", "Moon/Tycho")).unwrap_err();
        assert!(e.to_string().contains("Moon/Tycho"), "{e}");
        let e =
            SiteModel::from_json(&SMALL.replace("[[0,20],[10,20],[10,30],[0,30]]", "[[0,20],[10,30],[10,20],[0,30]]"))
                .unwrap_err();
        assert!(e.to_string().contains("\"house\": footprint is not a valid polygon"), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("\"height_m\": 1.8", "\"height_m\": 0")).unwrap_err();
        assert!(e.to_string().contains("\"fence\""), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("\"kind\": \"garden\"", "\"kind\": \"moat\"")).unwrap_err();
        assert!(e.to_string().contains("moat"), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("\"latitude_deg\": 52.0", "\"latitude_deg\": 95")).unwrap_err();
        assert!(e.to_string().contains("latitude_deg must be between -90 and 90"), "{e}");
        assert!(matches!(SiteModel::from_json("{"), Err(SiteFileError::Json(_))));
    }

    /// Version 2 adds named windows; version 1 files are still read (and may not have windows).
    #[test]
    fn windows_round_trip_and_version_1_still_reads() {
        let v2 = SMALL.replace("\"sunlot_site\": 1", "\"sunlot_site\": 2").replace(
            "\"walls\": [",
            "\"windows\": [ { \"id\": \"w1\", \"name\": \"House, south window\", \"status\": \"existing\",
                           \"at\": [5, 20, 1.5], \"facing_deg\": 180, \"opening_width_m\": 1.2, \"opening_height_m\": 1.4 } ],
             \"walls\": [",
        );
        let m = SiteModel::from_json(&v2).unwrap();
        assert_eq!(m.windows.len(), 1);
        assert_eq!(
            (m.windows[0].at, m.windows[0].z_m, m.windows[0].facing_deg),
            (Coord { x: 5.0, y: 20.0 }, 1.5, 180.0)
        );
        let text = m.to_json();
        assert!(text.contains("\"sunlot_site\": 2"), "{text}");
        assert_eq!(SiteModel::from_json(&text).unwrap(), m);
        let g = SiteModel::from_geojson(&m.to_geojson()).unwrap();
        let (a, b) = (&m.windows[0], &g.windows[0]);
        assert_eq!((&a.id, &a.name, a.status, a.facing_deg), (&b.id, &b.name, b.status, b.facing_deg));
        // The GeoJSON site is in the east-north frame; the file's plan is turned 12.5°.
        let r = m.plan_rotation_deg.to_radians();
        let (e, n) = (a.at.x * r.cos() - a.at.y * r.sin(), a.at.x * r.sin() + a.at.y * r.cos());
        assert!((b.at.x - e).abs() < 1e-6 && (b.at.y - n).abs() < 1e-6, "{:?} against ({e}, {n})", b.at);
        // Version 1: read as before, with no windows; windows in it are refused by name.
        assert!(SiteModel::from_json(SMALL).unwrap().windows.is_empty());
        let e = SiteModel::from_json(&v2.replace("\"sunlot_site\": 2", "\"sunlot_site\": 1")).unwrap_err();
        assert!(e.to_string().contains("a version 1 site file has no windows"), "{e}");
        let e = SiteModel::from_json(&v2.replace("\"facing_deg\": 180", "\"facing_deg\": 400")).unwrap_err();
        assert!(e.to_string().contains("\"w1\": facing_deg must be 0 to 360"), "{e}");
        let e = SiteModel::from_json(&v2.replace("\"opening_width_m\": 1.2", "\"opening_width_m\": 0")).unwrap_err();
        assert!(e.to_string().contains("opening_width_m must be 0.05 to 50 m"), "{e}");
        let e = SiteModel::from_json(&v2.replace("\"id\": \"w1\"", "\"id\": \"house\"")).unwrap_err();
        assert_eq!(e, SiteFileError::DuplicateId("house".into()));
        let e = SiteModel::from_json(&v2.replace("[5, 20, 1.5]", "[5, 20]")).unwrap_err();
        assert!(e.to_string().contains("windows[0].at"), "{e}");
    }

    /// Found by fuzzing: flat ground with an aspect was written without its ground and read back
    /// with aspect 0, so the site did not round-trip.
    #[test]
    fn flat_ground_has_no_aspect() {
        let m = SiteModel::from_json(&SMALL.replace("\"slope_deg\": 4", "\"slope_deg\": 0")).unwrap();
        assert_eq!(m.ground, Ground::flat());
        assert_eq!(SiteModel::from_json(&m.to_json()).unwrap(), m);
    }

    /// Found by fuzzing: a member given twice was read as its last copy, and serde's messages gave a
    /// line and column but not the field.
    #[test]
    fn repeated_members_type_errors_and_far_coordinates_are_named() {
        let e =
            SiteModel::from_json(&SMALL.replace("\"top_m\": 7.5,", "\"top_m\": 7.5, \"top_m\": 1e308,")).unwrap_err();
        assert!(e.to_string().contains("volumes[0]: the member \"top_m\" appears twice"), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("\"top_m\": 12", "\"top_m\": \"tall\"")).unwrap_err();
        assert!(
            e.to_string().starts_with("site file: volumes[1].top_m: invalid type: string \"tall\", expected f64"),
            "{e}"
        );
        let e = SiteModel::from_json(&SMALL.replace("\"status\": \"proposed\"", "\"status\": 3")).unwrap_err();
        assert!(e.to_string().contains("volumes[1].status"), "{e}");
        let e = SiteModel::from_json(&SMALL.replace("[[0,20],[10,20]", "[[0,20],[1e300,20]")).unwrap_err();
        assert!(
            e.to_string().contains("\"house\": coordinate 1 of the outer ring (1e300, 20.0) is more than 100000 m"),
            "{e}"
        );
        let e = SiteModel::from_json(&SMALL.replace("\"height_m\": 1.8", "\"height_m\": 1e308")).unwrap_err();
        assert!(e.to_string().contains("\"fence\": height_m must be a finite height of 0 m to 2000 m"), "{e}");
    }
}

/// Why a site's text could not be read: too large, or the site-file or GeoJSON reader's error (each
/// names the feature or field).
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SiteReadError {
    /// More text than [`crate::limits::MAX_SITE_TEXT_BYTES`].
    #[error("{0}")]
    Budget(String),
    /// A site file (JSON) that does not read.
    #[error("{0}")]
    File(#[from] SiteFileError),
    /// A GeoJSON site or plain footprints that do not read.
    #[error("{0}")]
    GeoJson(#[from] super::geojson_io::GeoJsonError),
}

/// A site read from text that is either a site file or a GeoJSON FeatureCollection.
#[derive(Debug, Clone, PartialEq)]
pub struct ReadSite {
    /// The site.
    pub model: SiteModel,
    /// Whether it came from GeoJSON (results then go out in WGS84 too).
    pub from_geojson: bool,
    /// What was assumed in reading it, a sentence each (plain building footprints only; else empty).
    pub assumptions: Vec<String>,
}

impl SiteModel {
    /// Reads a site file or, when the text is a GeoJSON FeatureCollection, a GeoJSON site.
    ///
    /// # Errors
    /// [`SiteReadError`]: the reader's error, naming the feature or field.
    pub fn read(text: &str) -> Result<ReadSite, SiteReadError> {
        SiteModel::read_with(text, &FootprintOptions::default())
    }

    /// As [`SiteModel::read`], and plain GeoJSON building footprints (no `sunlot` members) with
    /// `footprints` saying what to assume (see [`SiteModel::from_footprints`]).
    ///
    /// # Errors
    /// [`SiteReadError`]: the reader's error, naming the feature or field.
    pub fn read_with(text: &str, footprints: &FootprintOptions) -> Result<ReadSite, SiteReadError> {
        within("site", text.len() as f64, MAX_SITE_TEXT_BYTES as f64, "bytes")
            .map_err(|e| SiteReadError::Budget(e.hint("split the site or simplify its outlines").to_string()))?;
        // Only the top-level "type": the rest is skipped, not built as a tree.
        #[derive(Deserialize)]
        struct Probe {
            #[serde(rename = "type")]
            kind: Option<serde_json::Value>,
        }
        let is_geojson = serde_json::from_str::<Probe>(text)
            .ok()
            .is_some_and(|p| p.kind.as_ref().and_then(|t| t.as_str()) == Some("FeatureCollection"));
        if !is_geojson {
            let model = SiteModel::from_json(text)?;
            return Ok(ReadSite { model, from_geojson: false, assumptions: vec![] });
        }
        // Parsed once: a plain collection goes to the footprint reader, a sunlot one to the site reader.
        let fc = super::geojson_io::parse_collection(text)?;
        if is_plain(&fc) {
            let got = SiteModel::footprints_from_collection(fc, footprints)?;
            return Ok(ReadSite { model: got.model, from_geojson: true, assumptions: got.assumptions });
        }
        let model = SiteModel::from_collection(&fc)?;
        Ok(ReadSite { model, from_geojson: true, assumptions: vec![] })
    }
}

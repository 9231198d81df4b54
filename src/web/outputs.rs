//! The facade's outputs (wasm32 only): one `Serialize` struct per result the page reads, in camelCase,
//! each named as its TypeScript declaration in `types.rs` (the end-to-end test `e2e/types.test.mjs`
//! compiles every call's real result against those declarations with `tsc --strict`). Maps carry their
//! values as `Float64Array`s, passed to JavaScript as they are (row-major from the bottom row, NaN
//! outside the areas). The core's reports (`CheckReport`, `WindowReport`) serialize in camelCase
//! themselves in the wasm build.

use js_sys::Float64Array;
use serde::Serialize;

use crate::exposure::{CellValues, Grid};

/// A grid's geometry (`GridGeometry`): cell (c, r) is centred at `originXM + (col0 + c + 0.5)·cellM`,
/// `originYM + (row0 + r + 0.5)·cellM`.
#[derive(Serialize, Clone, Copy)]
#[serde(rename_all = "camelCase")]
pub(super) struct GridGeometry {
    pub cols: usize,
    pub rows: usize,
    pub origin_x_m: f64,
    pub origin_y_m: f64,
    pub col0: usize,
    pub row0: usize,
    pub cell_m: f64,
}

impl From<&Grid> for GridGeometry {
    fn from(g: &Grid) -> Self {
        GridGeometry {
            cols: g.cols,
            rows: g.rows,
            origin_x_m: g.origin.x,
            origin_y_m: g.origin.y,
            col0: g.col0,
            row0: g.row0,
            cell_m: g.cell_m,
        }
    }
}

/// The core's figures of a map's values (`MapFigures`, from [`crate::exposure::map_stats`], each cell
/// with a value counted whole), for captions and status lines.
#[derive(Serialize)]
pub(super) struct MapFigures {
    pub cells: usize,
    pub min: f64,
    pub mean: f64,
    pub max: f64,
}

impl MapFigures {
    /// The figures of `values` on `grid`; `None` when no cell has a value.
    pub fn of(grid: &Grid, values: &CellValues) -> Option<Self> {
        crate::exposure::map_stats(grid, values, None, 0.0).map(|m| MapFigures {
            cells: m.cells,
            min: m.min,
            mean: m.mean,
            max: m.max,
        })
    }
}

/// A map's values as a `Float64Array`, NaN where a cell has none.
#[derive(Serialize)]
#[serde(transparent)]
pub(super) struct Values(#[serde(with = "serde_wasm_bindgen::preserve")] Float64Array);

impl From<&CellValues> for Values {
    fn from(values: &CellValues) -> Self {
        Values(Float64Array::from(values.as_nan_coded()))
    }
}

/// `sunHoursMap`: hours of direct sun per cell.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct SunHoursMap {
    pub grid: GridGeometry,
    pub hours: Values,
    /// Hours of direct sun on open ground over the period.
    pub open_hours: f64,
    /// Sun positions sampled.
    pub steps: usize,
    /// The period in words ([`crate::exposure::Period::describe`]).
    pub period: String,
    pub stats: Option<MapFigures>,
}

/// `compareMap`: before and after the proposal; `stats` are those of `lostH`.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct CompareMap {
    pub grid: GridGeometry,
    pub open_hours: f64,
    pub period: String,
    pub stats: Option<MapFigures>,
    pub before: Values,
    pub after: Values,
    pub lost_h: Values,
    pub ratio: Values,
}

/// Insolation on open ground, kWh/m² (and hours of sun) over the period.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct OpenInsolation {
    pub total_kwh_m2: f64,
    pub beam_kwh_m2: f64,
    pub diffuse_kwh_m2: f64,
    pub sun_hours: f64,
}

/// `insolationMap`: clear-sky insolation per cell, kWh/m²; `stats` are those of `totalKwhM2`.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct InsolationMap {
    pub grid: GridGeometry,
    pub period: String,
    pub stats: Option<MapFigures>,
    pub total_kwh_m2: Values,
    pub beam_kwh_m2: Values,
    pub diffuse_kwh_m2: Values,
    pub sky_view: Values,
    pub sun_hours: Values,
    pub open: OpenInsolation,
}

/// `solarEnvelope`: the envelope's height per cell of the lot, metres.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct Envelope {
    pub grid: GridGeometry,
    pub height_m: Values,
    pub steps: usize,
    pub period: String,
    pub stats: Option<MapFigures>,
}

/// `drawMapFigure`: the grid drawn and the open ground's hours.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct MapDrawn {
    pub grid: GridGeometry,
    pub open_hours: f64,
}

/// One stretch of a point's day, local RFC 3339 times; `by` is the volume casting the shade.
#[derive(Serialize)]
pub(super) struct Interval {
    pub from: String,
    pub to: String,
    pub sunlit: bool,
    pub by: Option<String>,
}

/// `pointTimeline`: a point's day in stretches of sun and shade.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct Timeline {
    pub intervals: Vec<Interval>,
    pub sun_hours: f64,
    pub day_hours: f64,
}

/// What a site text is before reading it (`SiteTextKind`); the zone suggestion only for footprints.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct SiteTextKind {
    /// `site`, `geojson`, `footprints` or `unknown`.
    pub kind: &'static str,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub suggested_zone: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub longitude_deg: Option<f64>,
}

/// An area of a site summary.
#[derive(Serialize)]
pub(super) struct AreaSummary {
    pub id: String,
    pub name: String,
    pub kind: crate::site::AreaKind,
    pub status: crate::site::Status,
}

/// A volume of a site summary, heights in metres.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct VolumeSummary {
    pub id: String,
    pub status: crate::site::Status,
    pub base_m: f64,
    pub top_m: f64,
}

/// A window of a site summary: its centre in plan metres and height, and its facing (degrees from north).
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct WindowSummary {
    pub id: String,
    pub name: String,
    pub status: crate::site::Status,
    pub x_m: f64,
    pub y_m: f64,
    pub z_m: f64,
    pub facing_deg: f64,
}

/// `readSite`: a site as read, with the site-file text (`siteJson`) and what was assumed reading it.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct SiteSummary {
    pub name: String,
    pub from_geojson: bool,
    pub zone: String,
    pub latitude_deg: f64,
    pub longitude_deg: f64,
    pub areas: Vec<AreaSummary>,
    pub volumes: Vec<VolumeSummary>,
    pub windows: Vec<WindowSummary>,
    pub assumptions: Vec<String>,
    pub site_json: String,
}

/// One face of a facade map with its cells, row-major from the bottom row, columns from the face's left
/// end seen from outside.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct FaceCells<'a> {
    pub number: usize,
    pub facing_deg: f64,
    pub compass: &'static str,
    pub start_m: [f64; 2],
    pub end_m: [f64; 2],
    pub base_m: f64,
    pub top_m: f64,
    pub cols: usize,
    pub rows: usize,
    pub sun_hours: &'a [f64],
    pub beam_kwh_m2: &'a [f64],
    pub diffuse_kwh_m2: &'a [f64],
    /// The site's windows on the face (the core's [`crate::exposure::FaceWindow`]).
    pub windows: &'a [crate::exposure::FaceWindow],
}

/// `facadeMap`: a building's faces with their cells, and the caution.
#[derive(Serialize)]
pub(super) struct FacadeMap<'a> {
    pub faces: Vec<FaceCells<'a>>,
    pub caution: &'static str,
}

/// A figure's size in pixels.
#[derive(Serialize)]
pub(super) struct FigureSize {
    pub width: u32,
    pub height: u32,
}

/// A month of a point's year.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct MonthFigures {
    pub month: u32,
    pub sun_hours: f64,
    pub open_hours: f64,
    pub kwh_m2: f64,
    pub open_kwh_m2: f64,
}

/// `yearProfile`: a point's sun and clear-sky insolation per month against an open point.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct YearProfile {
    pub year: i32,
    pub sky_view: f64,
    pub months: Vec<MonthFigures>,
}

/// A row of `shadowTable`: the sun, the shadow per metre of height and each volume's shadow tip.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct ShadowTableRow {
    pub time: String,
    pub altitude_deg: f64,
    pub azimuth_deg: f64,
    pub shadow_length_m_per_m: f64,
    pub shadow_azimuth_deg: f64,
    /// Volume id → shadow length of its top, metres, in the site's order.
    #[serde(serialize_with = "as_map")]
    pub tips_m: Vec<(String, f64)>,
}

/// Pairs as an object of their keys, in their order.
fn as_map<S: serde::Serializer>(pairs: &[(String, f64)], s: S) -> Result<S::Ok, S::Error> {
    s.collect_map(pairs.iter().map(|(k, v)| (k, v)))
}

/// Where a shadow plan was drawn (`PlanFrame`): the plan point at the canvas's top-left, the scale,
/// and the drawing's box `[x, y, width, height]` in pixels.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
pub(super) struct PlanFrame {
    pub x_at_left_m: f64,
    pub y_at_top_m: f64,
    pub px_per_m: f64,
    #[serde(rename = "box")]
    pub bounds_px: [f64; 4],
}

/// A rule preset (`RulePreset`): `rule` in the rule-file format (snake_case, as `checkRule` takes it).
#[derive(Serialize)]
pub(super) struct RulePreset {
    pub id: &'static str,
    /// `area` or `window`.
    pub kind: &'static str,
    pub summary: &'static str,
    pub rule: crate::rules::AnyRule,
}

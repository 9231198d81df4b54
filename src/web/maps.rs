//! The facade for sites and exposure (wasm32 only): sun-hours and before/after maps as typed arrays,
//! rule checks, the solar envelope and a point's day. Each call takes the site as text (a site file
//! or GeoJSON), so the page keeps the user's site and nothing is lost on an error.

use geo::{MultiPolygon, Polygon};
use js_sys::Float64Array;
use serde::{Deserialize, Serialize};
use wasm_bindgen::prelude::*;

use super::defaults;
use super::{err, read, read_split, site, write};
use crate::envelope::{solar_envelope, EnvelopeRequest};
use crate::exposure::{before_after, day_timeline, sun_hours, Grid, Massing, Period, SunHoursRequest, Window};
use crate::shadow::ViewPoint;
use crate::site::SiteModel;
use crate::time::DeltaT;

pub(crate) fn window(text: Option<&str>) -> Result<Window, JsError> {
    text.map_or(Ok(Window::Daylight), |t| Window::parse(t).map_err(|e| JsError::new(&format!("window: {e}"))))
}

pub(crate) fn date(text: &str, field: &str) -> Result<chrono::NaiveDate, JsError> {
    chrono::NaiveDate::parse_from_str(text, "%Y-%m-%d")
        .map_err(|_| JsError::new(&format!("{field}: {text:?} is not YYYY-MM-DD")))
}

/// What every map call takes.
#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct MapIn {
    /// The site as text.
    site: String,
    /// Area ids (default: all).
    #[serde(default)]
    areas: Vec<String>,
    #[serde(default = "defaults::cell_m")]
    cell_m: f64,
    date: String,
    to: Option<String>,
    window: Option<String>,
    #[serde(default = "defaults::step_min")]
    step_min: u32,
    #[serde(default)]
    plane_m: f64,
    /// "existing" or "withProposed" (default).
    massing: Option<String>,
    max_cells: Option<usize>,
}

/// "existing" or "withProposed" (the default); anything else is an error naming the field.
pub(crate) fn massing_of(text: Option<&str>) -> Result<Massing, JsError> {
    match text {
        None | Some("withProposed") => Ok(Massing::WithProposed),
        Some("existing") => Ok(Massing::Existing),
        Some(other) => Err(JsError::new(&format!("massing: {other:?} is not \"existing\" or \"withProposed\""))),
    }
}

/// `value` with every object key turned from snake_case to camelCase (`before_share` → `beforeShare`),
/// the JavaScript side's naming, for reports whose core types are written in snake_case for the CLI.
pub(crate) fn camel_keys(value: serde_json::Value) -> serde_json::Value {
    use serde_json::Value;
    match value {
        Value::Object(map) => Value::Object(
            map.into_iter()
                .map(|(k, v)| {
                    let mut out = String::with_capacity(k.len());
                    let mut up = false;
                    for ch in k.chars() {
                        if ch == '_' {
                            up = true;
                        } else if up {
                            out.extend(ch.to_uppercase());
                            up = false;
                        } else {
                            out.push(ch);
                        }
                    }
                    (out, camel_keys(v))
                })
                .collect(),
        ),
        Value::Array(items) => Value::Array(items.into_iter().map(camel_keys).collect()),
        other => other,
    }
}

impl MapIn {
    fn parts(&self) -> Result<(SiteModel, Grid, Period, Massing), JsError> {
        self.parts_over(false)
    }

    /// As [`MapIn::parts`]; with `beside_lots` and no areas named, the grid leaves out the lots (a map
    /// of what the proposal takes from the neighbours).
    fn parts_over(&self, beside_lots: bool) -> Result<(SiteModel, Grid, Period, Massing), JsError> {
        let model = site(&self.site)?;
        for id in &self.areas {
            if !model.areas.iter().any(|a| &a.id == id) {
                return Err(JsError::new(&format!("areas: the site has no area {id:?}")));
            }
        }
        let polys: Vec<Polygon<f64>> = if self.areas.is_empty() && beside_lots {
            model.areas_beside_lots().iter().map(|a| a.polygon.clone()).collect()
        } else {
            model
                .areas
                .iter()
                .filter(|a| self.areas.is_empty() || self.areas.contains(&a.id))
                .map(|a| a.polygon.clone())
                .collect()
        };
        if polys.is_empty() {
            return Err(JsError::new("areas: the site has no areas to map"));
        }
        let grid = Grid::covering(
            &MultiPolygon::new(polys),
            self.cell_m,
            self.max_cells.unwrap_or(crate::exposure::DEFAULT_MAX_CELLS),
        )
        .map_err(|e| JsError::new(&format!("cellM, maxCells: {e}")))?;
        let first = date(&self.date, "date")?;
        let last = self.to.as_deref().map_or(Ok(first), |t| date(t, "to"))?;
        let period = Period { first, last, window: window(self.window.as_deref())?, step_min: self.step_min };
        Ok((model, grid, period, massing_of(self.massing.as_deref())?))
    }
}

impl MapIn {
    /// The sun-hours request of this input on `model` and `grid`.
    fn request<'a>(
        &self,
        model: &'a SiteModel,
        grid: &'a Grid,
        period: Period,
        massing: Massing,
    ) -> SunHoursRequest<'a> {
        SunHoursRequest { model, grid, period, plane_m: self.plane_m, delta_t: DeltaT::EspenakMeeus, massing }
    }
}

/// A grid's geometry for the page.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct GridOut {
    cols: usize,
    rows: usize,
    origin_x_m: f64,
    origin_y_m: f64,
    col0: usize,
    row0: usize,
    cell_m: f64,
}

fn grid_out(g: &Grid) -> GridOut {
    GridOut {
        cols: g.cols,
        rows: g.rows,
        origin_x_m: g.origin.x,
        origin_y_m: g.origin.y,
        col0: g.col0,
        row0: g.row0,
        cell_m: g.cell_m,
    }
}

/// Values row-major from the bottom row, NaN outside the areas.
fn array(values: &[Option<f64>]) -> Float64Array {
    let v: Vec<f64> = values.iter().map(|x| x.unwrap_or(f64::NAN)).collect();
    Float64Array::from(v.as_slice())
}

/// The core's figures of a map's values, `{cells, min, mean, max}` (each cell with a value counts
/// whole), for captions and status lines; `null` when no cell has a value.
fn stats(grid: &Grid, values: &[Option<f64>]) -> serde_json::Value {
    match crate::exposure::map_stats(grid, values, None, 0.0) {
        Some(m) => serde_json::json!({"cells": m.cells, "min": m.min, "mean": m.mean, "max": m.max}),
        None => serde_json::Value::Null,
    }
}

fn set(obj: &JsValue, key: &str, value: &JsValue) -> Result<(), JsError> {
    js_sys::Reflect::set(obj, &JsValue::from_str(key), value)
        .map(|_| ())
        .map_err(|_| JsError::new("could not build the result"))
}

pub(crate) fn progress(callback: &Option<js_sys::Function>) -> impl FnMut(f64) -> bool + '_ {
    move |f| match callback {
        Some(cb) => cb.call1(&JsValue::NULL, &JsValue::from_f64(f)).map_or(true, |r| r.as_bool() != Some(false)),
        None => true,
    }
}

/// Hours of direct sun per cell: `{grid, hours: Float64Array, openHours, steps}`. `onProgress(f)` is
/// called with the fraction done and may return `false` to cancel.
#[wasm_bindgen(js_name = sunHoursMap, unchecked_return_type = "SunHoursMap")]
pub fn sun_hours_map(
    #[wasm_bindgen(unchecked_param_type = "MapInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: MapIn = read(input, "sunHoursMap")?;
    let (model, grid, period, massing) = i.parts()?;
    let req = i.request(&model, &grid, period, massing);
    let map = sun_hours(&req, progress(&on_progress)).map_err(err)?;
    #[derive(Serialize)]
    #[serde(rename_all = "camelCase")]
    struct Out {
        grid: GridOut,
        open_hours: f64,
        steps: usize,
        /// The period in words (the core's [`Period::describe`]).
        period: String,
        /// The core's figures of the hours.
        stats: serde_json::Value,
    }
    let (open_hours, steps, stats) = (map.open_hours, map.steps, stats(&grid, &map.hours));
    let out = write(&Out { grid: grid_out(&grid), open_hours, steps, period: period.describe(), stats })?;
    set(&out, "hours", &array(&map.hours))?;
    Ok(out)
}

/// Before and after the proposal: `{grid, before, after, lostH, ratio}` as Float64Arrays; without
/// `areas`, over every area but the lots (the neighbours').
#[wasm_bindgen(js_name = compareMap, unchecked_return_type = "CompareMap")]
pub fn compare_map(
    #[wasm_bindgen(unchecked_param_type = "MapInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: MapIn = read(input, "compareMap")?;
    let (model, grid, period, _) = i.parts_over(true)?;
    let req = i.request(&model, &grid, period, Massing::WithProposed);
    let ba = before_after(&req, progress(&on_progress)).map_err(err)?;
    let out = write(&serde_json::json!({"grid": grid_out(&grid), "openHours": ba.before.open_hours,
                                         "period": period.describe(), "stats": stats(&grid, &ba.lost_h)}))?;
    set(&out, "before", &array(&ba.before.hours))?;
    set(&out, "after", &array(&ba.after.hours))?;
    set(&out, "lostH", &array(&ba.lost_h))?;
    set(&out, "ratio", &array(&ba.ratio))?;
    Ok(out)
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct InsolationIn {
    /// Aerosol optical depth at 500 nm of the Bird clear sky (default 0.1).
    aod500: Option<f64>,
    /// Sky patch size for the sky-view factor, degrees (default 5).
    sky_step_deg: Option<f64>,
}

/// Clear-sky insolation on a horizontal plane per cell (Bird clear sky, beam while in direct sun
/// plus diffuse times the sky-view factor): `{grid, totalKwhM2, beamKwhM2, diffuseKwhM2, skyView,
/// sunHours, open: {totalKwhM2, beamKwhM2, diffuseKwhM2, sunHours}}`, maps as Float64Arrays.
#[wasm_bindgen(js_name = insolationMap, unchecked_return_type = "InsolationMap")]
pub fn insolation_map(
    #[wasm_bindgen(unchecked_param_type = "InsolationInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let (map, i): (MapIn, InsolationIn) = read_split(input, "insolationMap", &["aod500", "skyStepDeg"])?;
    let (model, grid, period, massing) = map.parts()?;
    let mut atmosphere = crate::sky::BirdAtmosphere::default();
    if let Some(a) = i.aod500 {
        atmosphere.aod_500 = a;
    }
    let req = crate::exposure::InsolationRequest {
        model: &model,
        grid: &grid,
        period,
        plane_m: map.plane_m,
        delta_t: DeltaT::EspenakMeeus,
        massing,
        atmosphere,
        sky_step_deg: i.sky_step_deg.unwrap_or(crate::exposure::DEFAULT_SKY_STEP_DEG),
    };
    let m = crate::exposure::insolation(&req, progress(&on_progress)).map_err(err)?;
    let o = m.open;
    let out = write(&serde_json::json!({"grid": grid_out(&grid), "period": period.describe(),
                                         "stats": stats(&grid, &m.total_kwh_m2), "open": {
        "totalKwhM2": o.total_kwh_m2, "beamKwhM2": o.beam_kwh_m2, "diffuseKwhM2": o.diffuse_kwh_m2,
        "sunHours": o.sun_hours}}))?;
    set(&out, "totalKwhM2", &array(&m.total_kwh_m2))?;
    set(&out, "beamKwhM2", &array(&m.beam_kwh_m2))?;
    set(&out, "diffuseKwhM2", &array(&m.diffuse_kwh_m2))?;
    set(&out, "skyView", &array(&m.sky_view))?;
    set(&out, "sunHours", &array(&m.sun_hours))?;
    Ok(out)
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct EnvelopeIn {
    site: String,
    lot: String,
    #[serde(default)]
    protect: Vec<String>,
    date: String,
    to: Option<String>,
    window: Option<String>,
    #[serde(default = "defaults::long_step_min")]
    step_min: u32,
    #[serde(default = "defaults::envelope_cell_m")]
    cell_m: f64,
    #[serde(default = "defaults::max_height_m")]
    max_height_m: f64,
    #[serde(default = "defaults::height_step_m")]
    height_step_m: f64,
}

/// The solar envelope of a lot: `{grid, heightM: Float64Array, steps}`.
#[wasm_bindgen(js_name = solarEnvelope, unchecked_return_type = "Envelope")]
pub fn solar_envelope_js(
    #[wasm_bindgen(unchecked_param_type = "EnvelopeInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: EnvelopeIn = read(input, "solarEnvelope")?;
    let model = site(&i.site)?;
    let lot = model
        .areas
        .iter()
        .find(|a| a.id == i.lot)
        .ok_or_else(|| JsError::new(&format!("lot: the site has no area {:?}", i.lot)))?;
    for id in &i.protect {
        if !model.areas.iter().any(|a| &a.id == id) {
            return Err(JsError::new(&format!("protect: the site has no area {id:?}")));
        }
    }
    let protected: Vec<Polygon<f64>> = if i.protect.is_empty() {
        crate::envelope::default_protected(&model, &lot.id).iter().map(|a| a.polygon.clone()).collect()
    } else {
        model.areas.iter().filter(|a| i.protect.contains(&a.id)).map(|a| a.polygon.clone()).collect()
    };
    let grid = Grid::over_polygon(&lot.polygon, i.cell_m, crate::exposure::DEFAULT_MAX_CELLS)
        .map_err(|e| JsError::new(&format!("cellM: {e}")))?;
    let first = date(&i.date, "date")?;
    let last = i.to.as_deref().map_or(Ok(first), |t| date(t, "to"))?;
    let window = window(Some(i.window.as_deref().unwrap_or(crate::envelope::DEFAULT_ENVELOPE_WINDOW)))?;
    let req = EnvelopeRequest {
        model: &model,
        grid: &grid,
        protected: &protected,
        period: Period { first, last, window, step_min: i.step_min },
        max_height_m: i.max_height_m,
        height_step_m: i.height_step_m,
        delta_t: DeltaT::EspenakMeeus,
    };
    let env = solar_envelope(&req, progress(&on_progress)).map_err(err)?;
    let out = write(&serde_json::json!({"grid": grid_out(&grid), "steps": env.steps, "period": req.period.describe(),
                                         "stats": stats(&grid, &env.height_m)}))?;
    set(&out, "heightM", &array(&env.height_m))?;
    Ok(out)
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct TimelineIn {
    site: String,
    x_m: f64,
    y_m: f64,
    #[serde(default)]
    z_m: f64,
    date: String,
    massing: Option<String>,
}

/// A point's day: `{intervals: [{from, to, sunlit, by}], sunHours, dayHours}` with local RFC 3339 times.
#[wasm_bindgen(js_name = pointTimeline, unchecked_return_type = "Timeline")]
pub fn point_timeline(
    #[wasm_bindgen(unchecked_param_type = "TimelineInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: TimelineIn = read(input, "pointTimeline")?;
    let model = site(&i.site)?;
    let massing = massing_of(i.massing.as_deref())?;
    let t = day_timeline(
        &model,
        ViewPoint { x_m: i.x_m, y_m: i.y_m, z_m: i.z_m },
        date(&i.date, "date")?,
        massing,
        DeltaT::EspenakMeeus,
    )
    .map_err(err)?;
    let zone = model.zone;
    let intervals: Vec<_> = t
        .intervals
        .iter()
        .map(|iv| {
            serde_json::json!({"from": super::stamp(iv.from, &zone), "to": super::stamp(iv.to, &zone),
                               "sunlit": iv.sunlit, "by": iv.by})
        })
        .collect();
    write(&serde_json::json!({"intervals": intervals, "sunHours": t.sun_hours, "dayHours": t.day_hours}))
}

/// What a map figure shows.
#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct FigureIn {
    /// "hours" (default: hours of direct sun with the chosen massing) or "lost" (hours lost to the
    /// proposal).
    show: Option<String>,
    /// Page colours.
    #[serde(default)]
    palette: super::layer::PaletteIn,
}

/// Computes a one-period map and draws its heat-map figure onto `canvas` (the drawing code of the PNG
/// and SVG exports). Returns `{grid, openHours}`.
#[wasm_bindgen(js_name = drawMapFigure, unchecked_return_type = "{ grid: GridGeometry; openHours: number }")]
pub fn draw_map_figure(
    canvas: &web_sys::HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "MapFigureInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let mut surface = super::Canvas::new(canvas)?;
    let (map, i): (MapIn, FigureIn) = read_split(input, "drawMapFigure", &["show", "palette"])?;
    let (model, grid, period, massing) = map.parts_over(i.show.as_deref() == Some("lost"))?;
    let req = map.request(&model, &grid, period, massing);
    let describe = period.describe();
    let (values, open, title, unit, range) = match i.show.as_deref() {
        None | Some("hours") => {
            let m = sun_hours(&req, |_| true).map_err(err)?;
            let top = m.open_hours.max(0.1);
            (m.hours, m.open_hours, "Hours of direct sun", "hours of direct sun", (0.0, top))
        }
        Some("lost") => {
            let ba = before_after(&req, |_| true).map_err(err)?;
            let top = ba.lost_h.iter().flatten().copied().fold(0.5, f64::max);
            (ba.lost_h, ba.before.open_hours, "Hours of direct sun lost to the proposal", "hours lost", (0.0, top))
        }
        Some(other) => return Err(JsError::new(&format!("show: {other:?} is not \"hours\" or \"lost\""))),
    };
    let map = crate::render::HeatMap::of_site(&model, &grid, &values, (title, &describe), unit, range);
    let palette = i.palette.palette()?;
    crate::render::draw_heat_map(&mut crate::render::Restyle { inner: &mut surface, palette }, &map);
    write(&serde_json::json!({"grid": grid_out(&grid), "openHours": open}))
}

/// What to assume for plain GeoJSON building footprints (no `sunlot` members); see
/// [`crate::site::FootprintOptions`].
#[derive(Deserialize, Default)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct FootprintsIn {
    zone: Option<String>,
    storey_height_m: Option<f64>,
    default_height_m: Option<f64>,
    name: Option<String>,
}

/// What a site text is, before reading it: `{kind: "site" | "geojson" | "footprints" | "unknown",
/// suggestedZone?, longitudeDeg?}`; for plain footprints the fixed-offset zone their longitude suggests
/// (to offer the user, who must confirm or correct it: it knows no daylight saving).
#[wasm_bindgen(js_name = siteTextKind, unchecked_return_type = "SiteTextKind")]
pub fn site_text_kind(#[wasm_bindgen(unchecked_param_type = "string")] text: JsValue) -> Result<JsValue, JsError> {
    let text = super::text_arg(&text, "site")?;
    let parsed = text.parse::<geojson::GeoJson>();
    let out = match parsed {
        Ok(geojson::GeoJson::FeatureCollection(fc)) if crate::site::is_plain(&fc) => {
            match crate::site::suggested_zone(&fc) {
                Some((longitude_deg, suggestion)) => serde_json::json!({
                    "kind": "footprints", "suggestedZone": suggestion, "longitudeDeg": longitude_deg}),
                None => serde_json::json!({"kind": "footprints"}),
            }
        }
        Ok(geojson::GeoJson::FeatureCollection(_)) => serde_json::json!({"kind": "geojson"}),
        _ if serde_json::from_str::<serde_json::Value>(&text).is_ok_and(|v| v.is_object()) => {
            serde_json::json!({"kind": "site"})
        }
        _ => serde_json::json!({"kind": "unknown"}),
    };
    write(&out)
}

/// Reads a site (site file, GeoJSON site, or plain GeoJSON building footprints with `footprints`:
/// `{zone, storeyHeightM?, defaultHeightM?, name?}`) and describes it: `{name, fromGeojson, zone,
/// latitudeDeg, longitudeDeg, areas: [{id, name, kind, status}], volumes: [{id, status, baseM, topM}],
/// windows: [{id, name, status, xM, yM, zM, facingDeg}], assumptions: [text], siteJson}`,
/// where `siteJson` is the site in the site-file format and `assumptions` says what was assumed in
/// reading plain footprints. Throws an `Error` naming the bad feature.
#[wasm_bindgen(js_name = readSite, unchecked_return_type = "SiteSummary")]
pub fn read_site(
    #[wasm_bindgen(unchecked_param_type = "string")] text: JsValue,
    #[wasm_bindgen(unchecked_param_type = "FootprintOptions | undefined")] footprints: JsValue,
) -> Result<JsValue, JsError> {
    // Taken as any value and checked: a `&str` parameter given a number traps in the glue code.
    let text = super::text_arg(&text, "site")?;
    let given: FootprintsIn = if footprints.is_undefined() || footprints.is_null() {
        FootprintsIn::default()
    } else {
        read(footprints, "footprints")?
    };
    let options = crate::site::FootprintOptions {
        zone: match given.zone {
            Some(z) => Some(z.parse().map_err(|e| JsError::new(&format!("footprints: zone: {e}")))?),
            None => None,
        },
        storey_height_m: given.storey_height_m.unwrap_or(crate::site::DEFAULT_STOREY_HEIGHT_M),
        default_height_m: given.default_height_m,
        name: given.name.unwrap_or_default(),
    };
    let r = crate::site::SiteModel::read_with(&text, &options).map_err(|e| JsError::new(&format!("site: {e}")))?;
    let m = &r.model;
    let status = |s: crate::site::Status| if s == crate::site::Status::Proposed { "proposed" } else { "existing" };
    let areas: Vec<_> = m
        .areas
        .iter()
        .map(|a| serde_json::json!({"id": a.id, "name": a.name, "kind": a.kind, "status": status(a.status)}))
        .collect();
    let volumes: Vec<_> = m
        .volumes
        .iter()
        .map(|v| serde_json::json!({"id": v.id, "status": status(v.status), "baseM": v.base_m, "topM": v.top_m}))
        .collect();
    let windows: Vec<_> = m
        .windows
        .iter()
        .map(|w| {
            serde_json::json!({"id": w.id, "name": w.name, "status": status(w.status), "xM": w.at.x, "yM": w.at.y,
                               "zM": w.z_m, "facingDeg": w.facing_deg})
        })
        .collect();
    write(&serde_json::json!({
        "name": m.name, "fromGeojson": r.from_geojson, "zone": m.zone.to_string(),
        "latitudeDeg": m.location.latitude_deg, "longitudeDeg": m.location.longitude_deg,
        "areas": areas, "volumes": volumes, "windows": windows, "assumptions": r.assumptions, "siteJson": m.to_json(),
    }))
}

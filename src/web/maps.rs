//! The facade for sites and exposure (wasm32 only): sun-hours and before/after maps as typed arrays,
//! rule checks, the solar envelope and a point's day. Each call takes the site as text (a site file
//! or GeoJSON), so the page keeps the user's site and nothing is lost on an error.

use geo::{MultiPolygon, Polygon};
use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::defaults;
use super::outputs::{
    AreaSummary, CompareMap, Envelope, InsolationMap, Interval, MapDrawn, MapFigures, OpenInsolation, SiteSummary,
    SiteTextKind, SunHoursMap, Timeline, VolumeSummary, WindowSummary,
};
use super::{err, read, read_split, site, write};
use crate::envelope::{solar_envelope, EnvelopeRequest};
use crate::exposure::{
    before_after, day_timeline, sun_hours, Grid, MapCall, MapKind, Massing, Period, SunHoursRequest, Window,
};
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
pub(super) struct MapIn {
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
    /// Band `index` of `of` of the grid's rows ([`Grid::row_band`]): set by `mapOfKind`'s `part` for
    /// the kinds split by rows, never read from the caller's object.
    #[serde(skip)]
    pub(super) band: Option<(usize, usize)>,
}

/// "existing" or "withProposed" (the default); anything else is an error naming the field.
pub(crate) fn massing_of(text: Option<&str>) -> Result<Massing, JsError> {
    match text {
        None | Some("withProposed") => Ok(Massing::WithProposed),
        Some("existing") => Ok(Massing::Existing),
        Some(other) => Err(JsError::new(&format!("massing: {other:?} is not \"existing\" or \"withProposed\""))),
    }
}

impl MapIn {
    /// The input of a map of `kind` ([`crate::exposure::MAP_KINDS`]) over all of the site's areas
    /// (for the lost hours, all but the lots), the page showing `date`.
    pub(super) fn of_kind(kind: &MapKind, site: String, period: &Period) -> Self {
        let massing = match kind.call {
            MapCall::SunHours(Massing::Existing) => Some("existing".to_string()),
            _ => None,
        };
        MapIn {
            site,
            areas: Vec::new(),
            cell_m: kind.cell_m,
            date: period.first.to_string(),
            to: Some(period.last.to_string()),
            window: kind.window.map(str::to_string),
            step_min: kind.step_min,
            plane_m: 0.0,
            massing,
            max_cells: None,
            band: None,
        }
    }

    fn parts(&self) -> Result<(SiteModel, Grid, Period, Massing), JsError> {
        self.parts_over(false)
    }

    /// As [`MapIn::parts`]; with `beside_lots` and no areas named, the grid leaves out the lots (a map
    /// of what the proposal takes from the neighbours).
    pub(super) fn parts_over(&self, beside_lots: bool) -> Result<(SiteModel, Grid, Period, Massing), JsError> {
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
        let grid = match self.band {
            Some((index, of)) => grid.row_band(index, of),
            None => grid,
        };
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

/// Hours of direct sun an input asks for, on its grid, over its period.
pub(super) fn sun_hours_of(
    i: &MapIn,
    progress: impl FnMut(f64) -> bool,
) -> Result<(Grid, Period, crate::exposure::SunHours), JsError> {
    let (model, grid, period, massing) = i.parts()?;
    let map = sun_hours(&i.request(&model, &grid, period, massing), progress).map_err(err)?;
    Ok((grid, period, map))
}

/// Before and after the proposal; without areas named, over every area but the lots.
pub(super) fn compare_of(
    i: &MapIn,
    progress: impl FnMut(f64) -> bool,
) -> Result<(Grid, Period, crate::exposure::BeforeAfter), JsError> {
    let (model, grid, period, _) = i.parts_over(true)?;
    let ba = before_after(&i.request(&model, &grid, period, Massing::WithProposed), progress).map_err(err)?;
    Ok((grid, period, ba))
}

/// Milliseconds of direct sun per cell over a share of an input's steps ([`crate::exposure::StepShare`])
/// for each of `massings` in turn (the site read once); with `beside_lots` and no areas named, over
/// every area but the lots. Progress runs over the massings one after the other.
pub(super) fn sunlit_shares_of(
    i: &MapIn,
    massings: &[Massing],
    beside_lots: bool,
    share: crate::exposure::StepShare,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<(Grid, Vec<crate::exposure::SunlitMs>), JsError> {
    let (model, grid, period, _) = i.parts_over(beside_lots)?;
    let n = massings.len() as f64;
    let mut out = Vec::with_capacity(massings.len());
    for (k, &massing) in massings.iter().enumerate() {
        let req = i.request(&model, &grid, period, massing);
        out.push(crate::exposure::sunlit_ms(&req, share, |f| progress((k as f64 + f) / n)).map_err(err)?);
    }
    Ok((grid, out))
}

/// Clear-sky insolation an input asks for, on its grid, over its period.
pub(super) fn insolation_of(
    map: &MapIn,
    i: &InsolationIn,
    progress: impl FnMut(f64) -> bool,
) -> Result<(Grid, Period, crate::exposure::Insolation), JsError> {
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
    let m = crate::exposure::insolation(&req, progress).map_err(err)?;
    Ok((grid, period, m))
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
    let (grid, period, map) = sun_hours_of(&i, progress(&on_progress))?;
    write(&SunHoursMap {
        grid: (&grid).into(),
        hours: (&map.hours).into(),
        open_hours: map.open_hours,
        steps: map.steps,
        period: period.describe(),
        stats: MapFigures::of(&grid, &map.hours),
    })
}

/// Before and after the proposal: `{grid, before, after, lostH, ratio}` as Float64Arrays; without
/// `areas`, over every area but the lots (the neighbours').
#[wasm_bindgen(js_name = compareMap, unchecked_return_type = "CompareMap")]
pub fn compare_map(
    #[wasm_bindgen(unchecked_param_type = "MapInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: MapIn = read(input, "compareMap")?;
    let (grid, period, ba) = compare_of(&i, progress(&on_progress))?;
    write(&CompareMap {
        grid: (&grid).into(),
        open_hours: ba.before.open_hours,
        period: period.describe(),
        stats: MapFigures::of(&grid, &ba.lost_h),
        before: (&ba.before.hours).into(),
        after: (&ba.after.hours).into(),
        lost_h: (&ba.lost_h).into(),
        ratio: (&ba.ratio).into(),
    })
}

#[derive(Deserialize, Default)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
pub(super) struct InsolationIn {
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
    let (grid, period, m) = insolation_of(&map, &i, progress(&on_progress))?;
    let o = m.open;
    write(&InsolationMap {
        grid: (&grid).into(),
        period: period.describe(),
        stats: MapFigures::of(&grid, &m.total_kwh_m2),
        total_kwh_m2: (&m.total_kwh_m2).into(),
        beam_kwh_m2: (&m.beam_kwh_m2).into(),
        diffuse_kwh_m2: (&m.diffuse_kwh_m2).into(),
        sky_view: (&m.sky_view).into(),
        sun_hours: (&m.sun_hours).into(),
        open: OpenInsolation {
            total_kwh_m2: o.total_kwh_m2,
            beam_kwh_m2: o.beam_kwh_m2,
            diffuse_kwh_m2: o.diffuse_kwh_m2,
            sun_hours: o.sun_hours,
        },
    })
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
pub(super) struct EnvelopeIn {
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
    let (grid, period, env) = envelope_of(&i, progress(&on_progress))?;
    write(&Envelope {
        grid: (&grid).into(),
        height_m: (&env.height_m).into(),
        steps: env.steps,
        period: period.describe(),
        stats: MapFigures::of(&grid, &env.height_m),
    })
}

impl EnvelopeIn {
    /// The input of the envelope of `lot` for a map of `kind`, protecting the default areas.
    pub(super) fn of_kind(kind: &MapKind, site: String, lot: String, period: &Period) -> Self {
        EnvelopeIn {
            site,
            lot,
            protect: Vec::new(),
            date: period.first.to_string(),
            to: Some(period.last.to_string()),
            window: kind.window.map(str::to_string),
            step_min: kind.step_min,
            cell_m: kind.cell_m,
            max_height_m: crate::envelope::DEFAULT_MAX_HEIGHT_M,
            height_step_m: crate::envelope::DEFAULT_HEIGHT_STEP_M,
        }
    }
}

/// The envelope an input asks for, on its grid, over its period.
pub(super) fn envelope_of(
    i: &EnvelopeIn,
    progress: impl FnMut(f64) -> bool,
) -> Result<(Grid, Period, crate::envelope::Envelope), JsError> {
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
    let period = Period { first, last, window, step_min: i.step_min };
    let req = EnvelopeRequest {
        model: &model,
        grid: &grid,
        protected: &protected,
        period,
        max_height_m: i.max_height_m,
        height_step_m: i.height_step_m,
        delta_t: DeltaT::EspenakMeeus,
    };
    let env = solar_envelope(&req, progress).map_err(err)?;
    Ok((grid, period, env))
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
    let intervals = t
        .intervals
        .iter()
        .map(|iv| Interval {
            from: super::stamp(iv.from, &zone),
            to: super::stamp(iv.to, &zone),
            sunlit: iv.sunlit,
            by: iv.by.clone(),
        })
        .collect();
    write(&Timeline { intervals, sun_hours: t.sun_hours, day_hours: t.day_hours })
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
            let top = ba.lost_h.values().fold(0.5, f64::max);
            (ba.lost_h, ba.before.open_hours, "Hours of direct sun lost to the proposal", "hours lost", (0.0, top))
        }
        Some(other) => return Err(JsError::new(&format!("show: {other:?} is not \"hours\" or \"lost\""))),
    };
    let map = crate::render::HeatMap::of_site(&model, &grid, &values, (title, &describe), unit, range);
    let palette = i.palette.palette()?;
    crate::render::draw_heat_map(&mut crate::render::Restyle { inner: &mut surface, palette }, &map);
    write(&MapDrawn { grid: (&grid).into(), open_hours: open })
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
    let kind = |kind| SiteTextKind { kind, suggested_zone: None, longitude_deg: None };
    let out = match parsed {
        Ok(geojson::GeoJson::FeatureCollection(fc)) if crate::site::is_plain(&fc) => {
            match crate::site::suggested_zone(&fc) {
                Some((longitude_deg, suggestion)) => SiteTextKind {
                    suggested_zone: Some(suggestion),
                    longitude_deg: Some(longitude_deg),
                    ..kind("footprints")
                },
                None => kind("footprints"),
            }
        }
        Ok(geojson::GeoJson::FeatureCollection(_)) => kind("geojson"),
        _ if serde_json::from_str::<serde_json::Value>(&text).is_ok_and(|v| v.is_object()) => kind("site"),
        _ => kind("unknown"),
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
    let areas = m
        .areas
        .iter()
        .map(|a| AreaSummary { id: a.id.clone(), name: a.name.clone(), kind: a.kind, status: a.status })
        .collect();
    let volumes = m
        .volumes
        .iter()
        .map(|v| VolumeSummary { id: v.id.clone(), status: v.status, base_m: v.base_m, top_m: v.top_m })
        .collect();
    let windows = m
        .windows
        .iter()
        .map(|w| WindowSummary {
            id: w.id.clone(),
            name: w.name.clone(),
            status: w.status,
            x_m: w.at.x,
            y_m: w.at.y,
            z_m: w.z_m,
            facing_deg: w.facing_deg,
        })
        .collect();
    write(&SiteSummary {
        name: m.name.clone(),
        from_geojson: r.from_geojson,
        zone: m.zone.to_string(),
        latitude_deg: m.location.latitude_deg,
        longitude_deg: m.location.longitude_deg,
        areas,
        volumes,
        windows,
        assumptions: r.assumptions.clone(),
        site_json: m.to_json(),
    })
}

//! Facade maps for pages (wasm32 only): hours of direct sun and clear-sky beam on every face of a
//! building, as data, drawn onto a canvas, or as SVG — the same elevation figure as `sunlot facade`.

use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::defaults;
use super::maps::{date, massing_of, window};
use super::outputs::{FacadeMap, FaceCells, FigureSize};
use super::{err, read, site, write};
use crate::exposure::{facade_map, FacadeLayer, FacadeRequest, FaceMap, Massing, Period, SunSteps};
use crate::render::{draw_elevation, elevation_size, Elevation};
use crate::sky::BirdAtmosphere;
use crate::time::DeltaT;

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct FacadeIn {
    site: String,
    /// The building: a volume id.
    volume: String,
    date: String,
    to: Option<String>,
    window: Option<String>,
    #[serde(default = "defaults::long_step_min")]
    step_min: u32,
    #[serde(default = "defaults::facade_cell_m")]
    cell_m: f64,
    massing: Option<String>,
    /// `hours` (default), `beam`, `insolation` (beam and diffuse) or `lost` (hours lost to the
    /// proposal), for the figures.
    show: Option<String>,
}

/// A computed facade map: the site, the faces with the proposal, before it (for the hours lost), and
/// the period in words.
struct Computed {
    model: crate::site::SiteModel,
    faces: Vec<FaceMap>,
    before: Option<Vec<FaceMap>>,
    describe: String,
}

/// The layer `show` names (hours when absent).
fn layer(i: &FacadeIn) -> Result<FacadeLayer, JsError> {
    let name = i.show.as_deref().unwrap_or("hours");
    FacadeLayer::named(name)
        .ok_or_else(|| JsError::new(&format!("show: {name:?} is not \"hours\", \"beam\", \"insolation\" or \"lost\"")))
}

/// The facade map of the request; the faces before the proposal too when `with_before`.
fn compute(i: &FacadeIn, with_before: bool) -> Result<Computed, JsError> {
    let model = site(&i.site)?;
    let first = date(&i.date, "date")?;
    let last = i.to.as_deref().map_or(Ok(first), |t| date(t, "to"))?;
    let period = Period { first, last, window: window(i.window.as_deref())?, step_min: i.step_min };
    let massing = massing_of(i.massing.as_deref())?;
    let steps = SunSteps::of(&model, &period, DeltaT::EspenakMeeus, |_| true).map_err(err)?;
    let req = FacadeRequest {
        model: &model,
        volume_id: &i.volume,
        cell_m: i.cell_m,
        massing,
        delta_t: DeltaT::EspenakMeeus,
        atmosphere: BirdAtmosphere::default(),
    };
    let bad = |e: crate::exposure::ExposureError| JsError::new(&format!("volume, cellM: {e}"));
    let faces = facade_map(&req, &steps, |_| true).map_err(bad)?;
    let before = if with_before {
        Some(facade_map(&FacadeRequest { massing: Massing::Existing, ..req }, &steps, |_| true).map_err(bad)?)
    } else {
        None
    };
    let describe = period.describe();
    Ok(Computed { model, faces, before, describe })
}

/// Computes the map for the request's layer and draws its elevations onto the surface `make` gives
/// for the figure's size.
fn figure<D: crate::render::Draw>(
    i: &FacadeIn,
    make: impl FnOnce((u32, u32)) -> Result<D, JsError>,
) -> Result<D, JsError> {
    let layer = layer(i)?;
    let Computed { model, faces, before, describe } = compute(i, layer.needs_before())?;
    let values = layer.values(&faces, before.as_deref()).unwrap_or_default();
    let e = Elevation::of_layer(layer, &faces, &values, (&i.volume, &model.name), describe);
    let mut surface = make(elevation_size(&faces))?;
    draw_elevation(&mut surface, &e);
    Ok(surface)
}

/// The faces of a building with their cells: `{faces: [{number, facingDeg, compass, startM: [x, y],
/// endM: [x, y], baseM, topM, cols, rows, sunHours, beamKwhM2, diffuseKwhM2, windows: [{id, alongM, zM, widthM,
/// heightM}]}], caution}`; cells row-major from the bottom row, columns from the face's left end seen
/// from outside.
#[wasm_bindgen(js_name = facadeMap, unchecked_return_type = "FacadeMap")]
pub fn facade_map_js(#[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue) -> Result<JsValue, JsError> {
    let i: FacadeIn = read(input, "facadeMap")?;
    let maps = compute(&i, false)?.faces;
    let faces = maps
        .iter()
        .map(|f| FaceCells {
            number: f.face.number,
            facing_deg: f.face.facing_deg,
            compass: f.face.compass(),
            start_m: [f.face.start.x, f.face.start.y],
            end_m: [f.face.end.x, f.face.end.y],
            base_m: f.face.base_m,
            top_m: f.face.top_m,
            cols: f.cols,
            rows: f.rows,
            sun_hours: &f.sun_hours,
            beam_kwh_m2: &f.beam_kwh_m2,
            diffuse_kwh_m2: &f.diffuse_kwh_m2,
            windows: &f.windows,
        })
        .collect();
    write(&FacadeMap { faces, caution: crate::rules::CAUTION })
}

/// Computes the facade map and draws its elevations onto `canvas`, first sized to the figure (`{width,
/// height}` returned); `show` picks the layer.
#[wasm_bindgen(js_name = drawFacade, unchecked_return_type = "{ width: number; height: number }")]
pub fn draw_facade(
    canvas: &web_sys::HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: FacadeIn = read(input, "drawFacade")?;
    figure(&i, |(w, h)| {
        canvas.set_width(w);
        canvas.set_height(h);
        super::Canvas::new(canvas)
    })?;
    write(&FigureSize { width: canvas.width(), height: canvas.height() })
}

/// The facade map's elevations as an SVG document.
#[wasm_bindgen(js_name = facadeSvg)]
pub fn facade_svg(#[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue) -> Result<String, JsError> {
    let i: FacadeIn = read(input, "facadeSvg")?;
    Ok(figure(&i, |(w, h)| super::canvas::svg_surface(w, h))?.finish())
}

//! Facade maps for pages (wasm32 only): hours of direct sun and clear-sky beam on every face of a
//! building, as data, drawn onto a canvas, or as SVG — the same elevation figure as `sunlot facade`.

use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::maps::{date, massing_of, window};
use super::{err, read, site, write};
use crate::exposure::{facade_map, FacadeRequest, FaceMap, Massing, Period, SunSteps};
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
    #[serde(default = "fifteen")]
    step_min: u32,
    #[serde(default = "one")]
    cell_m: f64,
    massing: Option<String>,
    /// `hours` (default), `beam`, `insolation` (beam and diffuse) or `lost` (hours lost to the
    /// proposal), for the figures.
    show: Option<String>,
}

fn fifteen() -> u32 {
    15
}

fn one() -> f64 {
    1.0
}

/// A computed facade map: the site, the faces with the proposal, before it (for the hours lost), and
/// the period in words.
struct Computed {
    model: crate::site::SiteModel,
    faces: Vec<FaceMap>,
    before: Option<Vec<FaceMap>>,
    describe: String,
}

fn compute(i: &FacadeIn) -> Result<Computed, JsError> {
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
    let before = match i.show.as_deref() {
        Some("lost") => {
            Some(facade_map(&FacadeRequest { massing: Massing::Existing, ..req }, &steps, |_| true).map_err(bad)?)
        }
        _ => None,
    };
    let describe = format!(
        "{}{}, {}, {}-minute steps",
        i.date,
        i.to.as_deref().map_or(String::new(), |t| format!(" to {t}")),
        i.window.as_deref().unwrap_or("sunrise to sunset"),
        i.step_min
    );
    Ok(Computed { model, faces, before, describe })
}

/// The figure's values per face, unit and label for `show`.
fn shown(
    i: &FacadeIn,
    faces: &[FaceMap],
    before: Option<&[FaceMap]>,
) -> Result<(Vec<Vec<f64>>, &'static str, &'static str), JsError> {
    Ok(match (i.show.as_deref(), before) {
        (None | Some("hours"), _) => (faces.iter().map(|f| f.sun_hours.clone()).collect(), "h", "Hours of direct sun"),
        (Some("beam"), _) => {
            (faces.iter().map(|f| f.beam_kwh_m2.clone()).collect(), "kWh/m²", "Clear-sky beam insolation")
        }
        (Some("lost"), Some(b)) => (
            b.iter()
                .zip(faces)
                .map(|(b, f)| b.sun_hours.iter().zip(&f.sun_hours).map(|(b, a)| (b - a).max(0.0)).collect())
                .collect(),
            "h",
            "Hours of direct sun lost to the proposal",
        ),
        (Some(other), _) => {
            return Err(JsError::new(&format!(
                "show: {other:?} is not \"hours\", \"beam\", \"insolation\" or \"lost\""
            )))
        }
    })
}

fn figure(i: &FacadeIn, surface: &mut dyn crate::render::Draw) -> Result<(), JsError> {
    let Computed { model, faces, before, describe } = compute(i)?;
    let (values, unit, label) = shown(i, &faces, before.as_deref())?;
    let top = values.iter().flatten().copied().fold(0.0_f64, f64::max);
    let e = Elevation {
        title: format!("{label} on the faces of {} — {}", i.volume, model.name),
        subtitle: describe,
        unit: unit.into(),
        faces: &faces,
        values: values.iter().map(Vec::as_slice).collect(),
        range: (0.0, if top > 0.0 { top } else { 1.0 }),
        caution: crate::rules::CAUTION.into(),
    };
    draw_elevation(surface, &e);
    Ok(())
}

/// The faces of a building with their cells: `{faces: [{number, facingDeg, compass, startM: [x, y],
/// endM: [x, y], baseM, topM, cols, rows, sunHours, beamKwhM2, diffuseKwhM2, windows: [{id, alongM, zM, widthM,
/// heightM}]}], caution}`; cells row-major from the bottom row, columns from the face's left end seen
/// from outside.
#[wasm_bindgen(js_name = facadeMap, unchecked_return_type = "FacadeMap")]
pub fn facade_map_js(#[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue) -> Result<JsValue, JsError> {
    let i: FacadeIn = read(input, "facadeMap")?;
    let faces = compute(&i)?.faces;
    let faces: Vec<serde_json::Value> = faces
        .iter()
        .map(|f| {
            let windows: Vec<serde_json::Value> = f
                .windows
                .iter()
                .map(|w| {
                    serde_json::json!({"id": w.id, "alongM": w.along_m, "zM": w.z_m, "widthM": w.width_m,
                                       "heightM": w.height_m})
                })
                .collect();
            serde_json::json!({
                "number": f.face.number, "facingDeg": f.face.facing_deg, "compass": f.face.compass(),
                "startM": [f.face.start.x, f.face.start.y], "endM": [f.face.end.x, f.face.end.y],
                "baseM": f.face.base_m, "topM": f.face.top_m, "cols": f.cols, "rows": f.rows,
                "sunHours": f.sun_hours, "beamKwhM2": f.beam_kwh_m2, "diffuseKwhM2": f.diffuse_kwh_m2,
                "windows": windows,
            })
        })
        .collect();
    write(&serde_json::json!({"faces": faces, "caution": crate::rules::CAUTION}))
}

/// Computes the facade map and draws its elevations onto `canvas`, first sized to the figure (`{width,
/// height}` returned); `show` picks hours or beam.
#[wasm_bindgen(js_name = drawFacade, unchecked_return_type = "{ width: number; height: number }")]
pub fn draw_facade(
    canvas: &web_sys::HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: FacadeIn = read(input, "drawFacade")?;
    let size = size_of(&i)?;
    canvas.set_width(size.0);
    canvas.set_height(size.1);
    figure(&i, &mut super::Canvas::new(canvas)?)?;
    write(&serde_json::json!({"width": size.0, "height": size.1}))
}

/// The facade map's elevations as an SVG document.
#[wasm_bindgen(js_name = facadeSvg)]
pub fn facade_svg(#[wasm_bindgen(unchecked_param_type = "FacadeInput")] input: JsValue) -> Result<String, JsError> {
    let i: FacadeIn = read(input, "facadeSvg")?;
    let (w, h) = size_of(&i)?;
    let mut svg = super::canvas::svg_surface(w, h)?;
    figure(&i, &mut svg)?;
    Ok(svg.finish())
}

/// The figure's size from the faces alone (no sun computed).
fn size_of(i: &FacadeIn) -> Result<(u32, u32), JsError> {
    let model = site(&i.site)?;
    let faces: Vec<FaceMap> = crate::exposure::faces_of(&model, &i.volume)
        .map_err(err)?
        .into_iter()
        .map(|face| FaceMap {
            face,
            cols: 1,
            rows: 1,
            sun_hours: vec![0.0],
            beam_kwh_m2: vec![0.0],
            diffuse_kwh_m2: vec![0.0],
            windows: vec![],
        })
        .collect();
    Ok(elevation_size(&faces))
}

//! The 3-D view for pages (wasm32 only): a site's scene built once (its faces and their partition),
//! the light kept for the last moment drawn, so orbiting redraws without recomputing the shadows and
//! stepping the time recomputes only them.

use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::canvas::{local_instant, svg_surface};
use super::{err, read};
use crate::render::{draw_massing_view, MassingLight, MassingView, Restyle};
use crate::site::SiteModel;
use crate::time::DeltaT;
use crate::view3d::{Camera, MassingScene};

/// What a view draws.
#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct ViewIn {
    /// Local wall time `YYYY-MM-DDTHH:MM` in the site's zone.
    local_time: String,
    /// Where the viewer stands, degrees clockwise from the plan's north.
    from_deg: f64,
    /// How far above the horizon the viewer looks down from, degrees (5–90).
    elevation_deg: f64,
    /// A perspective from this many metres (default: parallel).
    perspective_m: Option<f64>,
    #[serde(default)]
    palette: super::layer::PaletteIn,
}

/// A site's 3-D view: `new MassingViewer(siteText)`, then `draw(canvas, input)` as often as the
/// viewer moves or the time changes.
#[wasm_bindgen]
pub struct MassingViewer {
    model: SiteModel,
    scene: MassingScene,
    /// The last moment's local time and its light.
    lit: Option<(String, String, MassingLight)>,
}

#[wasm_bindgen]
impl MassingViewer {
    /// The viewer of a site (site file or GeoJSON text); throws an `Error` naming what is wrong (a
    /// sloping ground is refused).
    #[wasm_bindgen(constructor)]
    pub fn new(#[wasm_bindgen(unchecked_param_type = "string")] site: JsValue) -> Result<MassingViewer, JsError> {
        let text = super::text_arg(&site, "site")?;
        let model = super::site(&text)?;
        let scene = MassingScene::of(&model).map_err(err)?;
        Ok(MassingViewer { model, scene, lit: None })
    }

    /// Faces after the partition's splits (what each frame draws).
    #[wasm_bindgen(getter)]
    pub fn fragments(&self) -> usize {
        self.scene.bsp.fragments()
    }

    /// Shows the solar envelope of lot `lot` (an area id; `""` for the site's subject lot, the
    /// proposal's) on `date` (YYYY-MM-DD) in the daily window
    /// `window` (`HH:MM-HH:MM`, default 09:00-15:00) as translucent steps every 3 m, keeping shadows
    /// off the site's other gardens, terraces and amenity areas; `null` for `lot` takes it away.
    #[wasm_bindgen(js_name = setEnvelope)]
    pub fn set_envelope(
        &mut self,
        #[wasm_bindgen(unchecked_param_type = "string | null")] lot: JsValue,
        #[wasm_bindgen(unchecked_param_type = "string")] date: JsValue,
        #[wasm_bindgen(unchecked_param_type = "string | undefined")] window: JsValue,
    ) -> Result<(), JsError> {
        let treads = if lot.is_null() || lot.is_undefined() {
            Vec::new()
        } else {
            let mut lot = super::text_arg(&lot, "lot")?;
            if lot.is_empty() {
                lot = crate::envelope::subject_lot(&self.model)
                    .ok_or_else(|| JsError::new("lot: the site has no lot"))?
                    .id
                    .clone();
            }
            let day = super::maps::date(&super::text_arg(&date, "date")?, "date")?;
            let window = if window.is_undefined() || window.is_null() {
                crate::envelope::DEFAULT_ENVELOPE_WINDOW.to_string()
            } else {
                super::text_arg(&window, "window")?
            };
            let window = super::maps::window(Some(&window))?;
            crate::view3d::envelope_treads(
                &self.model,
                &lot,
                day,
                window,
                crate::envelope::DEFAULT_BAND_M,
                DeltaT::EspenakMeeus,
            )
            .map_err(|e| JsError::new(&format!("lot: {e}")))?
        };
        self.scene = MassingScene::with(&self.model, treads).map_err(err)?;
        self.lit = None;
        Ok(())
    }

    /// Draws the view onto `canvas` (its size as set); the light is reused while `localTime` stays.
    pub fn draw(
        &mut self,
        canvas: &web_sys::HtmlCanvasElement,
        #[wasm_bindgen(unchecked_param_type = "MassingViewInput")] input: JsValue,
    ) -> Result<(), JsError> {
        let mut surface = super::Canvas::new(canvas)?;
        let i: ViewIn = read(input, "MassingViewer.draw")?;
        self.render(&mut surface, &i)
    }

    /// The view as an SVG document, `width` × `height` pixels.
    pub fn svg(
        &mut self,
        #[wasm_bindgen(unchecked_param_type = "MassingViewInput")] input: JsValue,
        width: u32,
        height: u32,
    ) -> Result<String, JsError> {
        let mut svg = svg_surface(width, height)?;
        let i: ViewIn = read(input, "MassingViewer.svg")?;
        self.render(&mut svg, &i)?;
        Ok(svg.finish())
    }
}

impl MassingViewer {
    fn render(&mut self, d: &mut dyn crate::render::Draw, i: &ViewIn) -> Result<(), JsError> {
        let camera =
            Camera::checked(i.from_deg, i.elevation_deg, i.perspective_m, self.scene.centre).map_err(|e| match e {
                crate::view3d::ViewError::Camera { field, range, value } => {
                    let name = match field {
                        "azimuth_deg" => "fromDeg",
                        "elevation_deg" => "elevationDeg",
                        _ => "perspectiveM",
                    };
                    JsError::new(&format!("{name}: must be {range}, got {value}"))
                }
                other => err(other),
            })?;
        let palette = i.palette.palette()?;
        if self.lit.as_ref().map(|(t, _, _)| t.as_str()) != Some(i.local_time.as_str()) {
            let t = local_instant(&self.model, &i.local_time)?;
            let sun = crate::solar_position(&self.model.location, t, &Default::default(), DeltaT::EspenakMeeus)
                .map_err(err)?;
            let light = MassingLight::at(&self.model, &self.scene, (sun.azimuth_deg, sun.altitude_deg));
            self.lit = Some((i.local_time.clone(), self.model.zone.label(t), light));
        }
        let Some((_, when, light)) = &self.lit else { return Err(JsError::new("localTime: no light")) };
        let view = MassingView::at(&self.model, &self.scene, light, camera, when);
        draw_massing_view(&mut Restyle { inner: d, palette }, &view);
        Ok(())
    }
}

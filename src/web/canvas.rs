//! The canvas back end of the drawing abstraction (wasm32 only), and the facade calls that draw the
//! figures onto a page's `<canvas>`: the same drawing code as the PNG and SVG exports.

use wasm_bindgen::prelude::*;
use wasm_bindgen::{Clamped, JsCast};
use web_sys::{CanvasRenderingContext2d, CanvasWindingRule, HtmlCanvasElement, ImageData};

use super::layer::PlanLayer;
use crate::render::{Anchor, Colour, Draw, Image, Restyle};

/// A 2-D canvas context as a drawing surface.
pub struct Canvas {
    ctx: CanvasRenderingContext2d,
    width: u32,
    height: u32,
    /// Whether a clip is in force (saved on the context's stack).
    clipped: bool,
    /// The CSS font family of text (the canvas's `data-font`, else [`crate::render::FONT_FAMILY`]).
    font: String,
    /// Whether the page chose that font (`data-font`): text is then measured by the canvas itself, so
    /// wrapping and labels fit the font drawn; otherwise by DejaVu Sans's widths, as in the SVG.
    page_font: bool,
}

impl Canvas {
    /// The canvas's 2-D context. A canvas with a `data-scale` attribute (the device pixel ratio, set
    /// by the widgets for crisp high-DPI drawing) is drawn in its size divided by that scale; its
    /// `data-font` attribute (a CSS font family, from the page's `--sunlot-font`) sets the text font.
    ///
    /// # Errors
    /// A `JsError` when the canvas has no 2-D context.
    pub fn new(canvas: &HtmlCanvasElement) -> Result<Self, JsError> {
        let ctx = canvas
            .get_context("2d")
            .ok()
            .flatten()
            .and_then(|c| c.dyn_into::<CanvasRenderingContext2d>().ok())
            .ok_or_else(|| JsError::new("canvas: no 2-D context"))?;
        crate::limits::figure_size("canvas", canvas.width(), canvas.height()).map_err(super::err)?;
        let scale = canvas
            .get_attribute("data-scale")
            .and_then(|s| s.parse::<f64>().ok())
            .filter(|s| s.is_finite() && (0.25..=8.0).contains(s))
            .unwrap_or(1.0);
        let _ = ctx.set_transform(scale, 0.0, 0.0, scale, 0.0, 0.0);
        let chosen = canvas.get_attribute("data-font").filter(|f| !f.is_empty() && f.len() < 200 && !f.contains(';'));
        let page_font = chosen.is_some();
        let font = chosen.unwrap_or_else(|| crate::render::FONT_FAMILY.into());
        let size = |px: u32| (f64::from(px) / scale).round() as u32;
        Ok(Canvas { ctx, width: size(canvas.width()), height: size(canvas.height()), clipped: false, font, page_font })
    }

    fn path(&self, points: &[(f64, f64)], closed: bool) {
        for (i, &(x, y)) in points.iter().enumerate() {
            if i == 0 {
                self.ctx.move_to(x, y);
            } else {
                self.ctx.line_to(x, y);
            }
        }
        if closed {
            self.ctx.close_path();
        }
    }
}

impl Canvas {
    fn text_style(&self, size_px: f64, colour: Colour, anchor: Anchor) {
        self.ctx.set_font(&format!("{size_px}px {}", self.font));
        self.ctx.set_text_align(match anchor {
            Anchor::Start => "start",
            Anchor::Middle => "center",
            Anchor::End => "end",
        });
        self.ctx.set_fill_style_str(&colour.css());
    }
}

impl Draw for Canvas {
    fn measure_px(&self, size_px: f64, text: &str) -> f64 {
        if !self.page_font {
            return crate::render::text_width_px(size_px, text);
        }
        self.ctx.set_font(&format!("{size_px}px {}", self.font));
        self.ctx.measure_text(text).map_or_else(|_| crate::render::text_width_px(size_px, text), |m| m.width())
    }

    fn size(&self) -> (u32, u32) {
        (self.width, self.height)
    }

    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour) {
        self.ctx.begin_path();
        for r in rings {
            self.path(r, true);
        }
        self.ctx.set_fill_style_str(&fill.css());
        self.ctx.fill_with_canvas_winding_rule(CanvasWindingRule::Evenodd);
    }

    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool) {
        self.ctx.begin_path();
        self.path(points, closed);
        self.ctx.set_line_width(width_px);
        self.ctx.set_line_join("round");
        self.ctx.set_stroke_style_str(&colour.css());
        self.ctx.stroke();
    }

    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.text_style(size_px, colour, anchor);
        let _ = self.ctx.fill_text(text, x, y);
    }

    fn text_vertical(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.text_style(size_px, colour, anchor);
        self.ctx.save();
        let _ = self.ctx.translate(x, y);
        let _ = self.ctx.rotate(-std::f64::consts::FRAC_PI_2);
        let _ = self.ctx.fill_text(text, 0.0, 0.0);
        self.ctx.restore();
    }

    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>) {
        if self.clipped {
            self.ctx.restore();
            self.clipped = false;
        }
        if let Some((x, y, w, h)) = rect {
            self.ctx.save();
            self.ctx.begin_path();
            self.ctx.rect(x, y, w, h);
            self.ctx.clip();
            self.clipped = true;
        }
    }

    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image) {
        // Through a scratch canvas, so the image is scaled without smoothing like the other back ends.
        let Some(doc) = web_sys::window().and_then(|w| w.document()) else { return };
        let Some(scratch) = doc.create_element("canvas").ok().and_then(|e| e.dyn_into::<HtmlCanvasElement>().ok())
        else {
            return;
        };
        scratch.set_width(image.width);
        scratch.set_height(image.height);
        let Ok(sc) = Canvas::new(&scratch) else { return };
        if let Ok(data) = ImageData::new_with_u8_clamped_array_and_sh(Clamped(image.rgba), image.width, image.height) {
            let _ = sc.ctx.put_image_data(&data, 0.0, 0.0);
        }
        self.ctx.set_image_smoothing_enabled(false);
        let _ = self.ctx.draw_image_with_html_canvas_element_and_dw_and_dh(&scratch, x, y, width, height);
    }
}

#[derive(serde::Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct SkyIn {
    site: String,
    year: i32,
    /// Local wall time `YYYY-MM-DDTHH:MM` of the sun to mark.
    local_time: Option<String>,
    /// Dates of the day paths (default: the 21st of every month).
    #[serde(default)]
    dates: Vec<String>,
    /// The skyline is seen from this point, plan metres, if given.
    x_m: Option<f64>,
    y_m: Option<f64>,
    #[serde(default)]
    z_m: f64,
    /// "existing" or "withProposed" (default).
    massing: Option<String>,
    /// "stereographic" (default), "equidistant" or "rectangular".
    projection: Option<String>,
    /// Page colours.
    #[serde(default)]
    palette: super::layer::PaletteIn,
}

fn sky_chart(input: JsValue) -> Result<(crate::render::SkyChart, crate::render::Palette), JsError> {
    use crate::render::{Projection, SkyChart};
    let i: SkyIn = super::read(input, "skyChart")?;
    let model = super::site(&i.site)?;
    crate::limits::within("dates", i.dates.len() as f64, crate::limits::MAX_SKY_DATES as f64, "day paths")
        .map_err(super::err)?;
    let dates = if i.dates.is_empty() {
        None
    } else {
        Some(
            i.dates
                .iter()
                .map(|d| {
                    chrono::NaiveDate::parse_from_str(d, "%Y-%m-%d")
                        .map(|x| (x, x.format("%d %b %Y").to_string()))
                        .map_err(|_| JsError::new(&format!("dates: {d:?} is not YYYY-MM-DD")))
                })
                .collect::<Result<Vec<_>, _>>()?,
        )
    };
    let now = i.local_time.as_deref().map(|t| local_instant(&model, t)).transpose()?;
    let massing = super::maps::massing_of(i.massing.as_deref())?;
    let from = match (i.x_m, i.y_m) {
        (Some(x), Some(y)) => Some((crate::shadow::ViewPoint { x_m: x, y_m: y, z_m: i.z_m }, massing)),
        (None, None) => None,
        _ => return Err(JsError::new("xM, yM: give both or neither")),
    };
    let projection = match i.projection.as_deref() {
        None | Some("stereographic") => Projection::Stereographic,
        Some("equidistant") => Projection::Equidistant,
        Some("rectangular") => Projection::Rectangular,
        Some(p) => {
            return Err(JsError::new(&format!("projection: {p:?} is not stereographic, equidistant or rectangular")))
        }
    };
    let palette = i.palette.palette()?;
    let request =
        crate::render::SkyChartRequest { dates, now, from, projection, ..crate::render::SkyChartRequest::year(i.year) };
    let chart = SkyChart::for_site(&model, request).map_err(|e| match e {
        crate::render::SkyChartError::Dates(b) => JsError::new(&b.to_string()),
        crate::render::SkyChartError::Point(p) => JsError::new(&format!("xM, yM, zM: {p}")),
    })?;
    Ok((chart, palette))
}

/// Draws the sun-path diagram onto `canvas` (sized by the page).
#[wasm_bindgen(js_name = drawSkyChart)]
pub fn draw_sky_chart_js(
    canvas: &HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "SkyInput")] input: JsValue,
) -> Result<(), JsError> {
    let mut surface = Canvas::new(canvas)?;
    let (chart, palette) = sky_chart(input)?;
    crate::render::draw_sky_chart(&mut Restyle { inner: &mut surface, palette }, &chart).map_err(super::err)
}

/// The sun-path diagram as an SVG document, `width` × `height` pixels: the same drawing as the canvas.
#[wasm_bindgen(js_name = skyChartSvg)]
pub fn sky_chart_svg(
    #[wasm_bindgen(unchecked_param_type = "SkyInput")] input: JsValue,
    width: u32,
    height: u32,
) -> Result<String, JsError> {
    let mut svg = svg_surface(width, height)?;
    let (chart, palette) = sky_chart(input)?;
    crate::render::draw_sky_chart(&mut Restyle { inner: &mut svg, palette }, &chart).map_err(super::err)?;
    Ok(svg.finish())
}

/// An SVG surface of `width` × `height` pixels, within [`crate::limits::figure_size`].
pub(crate) fn svg_surface(width: u32, height: u32) -> Result<crate::render::Svg, JsError> {
    crate::limits::figure_size("width, height", width, height).map_err(super::err)?;
    Ok(crate::render::Svg::new(width, height).with_image_encoder(browser_png))
}

/// An image as a PNG data URL by the browser's own encoder (a scratch canvas's `toDataURL`); `None`
/// where there is no document (a worker).
fn browser_png(image: &Image) -> Option<String> {
    let document = web_sys::window()?.document()?;
    let canvas: HtmlCanvasElement = document.create_element("canvas").ok()?.dyn_into().ok()?;
    canvas.set_width(image.width);
    canvas.set_height(image.height);
    let ctx: CanvasRenderingContext2d = canvas.get_context("2d").ok()??.dyn_into().ok()?;
    let data = ImageData::new_with_u8_clamped_array_and_sh(Clamped(image.rgba), image.width, image.height).ok()?;
    ctx.put_image_data(&data, 0.0, 0.0).ok()?;
    canvas.to_data_url_with_type("image/png").ok()
}

/// A local wall time `YYYY-MM-DDTHH:MM` in the site's zone (the earlier of a repeated time).
pub(crate) fn local_instant(model: &crate::site::SiteModel, t: &str) -> Result<chrono::DateTime<chrono::Utc>, JsError> {
    let bad = |e: String| JsError::new(&format!("localTime: {e}"));
    let wall = chrono::NaiveDateTime::parse_from_str(t, "%Y-%m-%dT%H:%M")
        .map_err(|_| bad(format!("{t:?} is not YYYY-MM-DDTHH:MM")))?;
    model.zone.resolve(wall, crate::time::Fold::Earlier).map_err(|e| bad(e.to_string()))
}

#[derive(serde::Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct PlanIn {
    site: String,
    /// Local wall time `YYYY-MM-DDTHH:MM` in the site's zone.
    local_time: String,
    /// Pan and zoom: the plan point at the middle of the plan and the metres across it (default:
    /// the whole site).
    view: Option<ViewIn>,
    /// Page colours.
    #[serde(default)]
    palette: super::layer::PaletteIn,
}

#[derive(serde::Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct ViewIn {
    x_m: f64,
    y_m: f64,
    width_m: f64,
}

/// What a plan call draws: the study of the site at the moment, how, and in which colours.
struct PlanJob {
    model: crate::site::SiteModel,
    study: crate::shadow::Study,
    when: String,
    /// The moment for the figure's title, local with the zone's abbreviation.
    label: String,
    wgs84: bool,
    view: Option<(geo::Coord<f64>, f64)>,
    palette: crate::render::Palette,
}

fn plan_job(input: JsValue) -> Result<PlanJob, JsError> {
    let i: PlanIn = super::read(input, "shadowPlan")?;
    let read = super::read_site_text(&i.site)?;
    let t = local_instant(&read.model, &i.local_time)?;
    let study = crate::shadow::shadow_study(&read.model, t, crate::time::DeltaT::EspenakMeeus).map_err(super::err)?;
    let when = super::stamp(t, &read.model.zone);
    let label = read.model.zone.label(t);
    let view = match i.view {
        Some(v) if [v.x_m, v.y_m, v.width_m].iter().all(|x| x.is_finite()) && v.width_m > 0.0 => {
            Some((geo::Coord { x: v.x_m, y: v.y_m }, v.width_m))
        }
        Some(v) => {
            return Err(JsError::new(&format!(
                "view: xM, yM must be a plan point and widthM a positive width, got ({}, {}) across {} m",
                v.x_m, v.y_m, v.width_m
            )))
        }
        None => None,
    };
    Ok(PlanJob { model: read.model, study, when, label, wgs84: read.from_geojson, view, palette: i.palette.palette()? })
}

impl PlanJob {
    fn draw(&self, d: &mut dyn crate::render::Draw, layer: Option<&PlanLayer>) -> crate::render::PlanFrame {
        let plan = crate::render::ShadowPlan::of_study(&self.model, &self.study, &self.label);
        let extras = crate::render::PlanExtras { layer: layer.map(PlanLayer::parts), view: self.view };
        crate::render::draw_shadow_plan(&mut Restyle { inner: d, palette: self.palette }, &plan, &extras)
    }
}

/// The shadows at a moment as GeoJSON text (each feature's shadow, the unions and the areas with
/// their shaded figures; WGS84 when the site came from GeoJSON, else plan metres).
#[wasm_bindgen(js_name = shadowsGeojson)]
pub fn shadows_geojson(#[wasm_bindgen(unchecked_param_type = "PlanInput")] input: JsValue) -> Result<String, JsError> {
    let j = plan_job(input)?;
    Ok(crate::shadow::study_geojson(&j.model, &j.study, &j.when, j.wgs84))
}

/// Draws the shadow plan at a moment onto `canvas` (with a map under the shadows:
/// [`PlanLayer::draw_plan`]). Returns how figure pixels map to the plan: `{xAtLeftM, yAtTopM, pxPerM, box}`:
/// plan x = xAtLeftM + px / pxPerM, plan y = yAtTopM − py / pxPerM, in the figure's pixels (before
/// any high-DPI scale), metres; `box` = `[x, y, width, height]` is the plan's box in those pixels.
#[wasm_bindgen(js_name = drawShadowPlan, unchecked_return_type = "PlanFrame")]
pub fn draw_shadow_plan_js(
    canvas: &HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "PlanInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    draw_plan(canvas, input, None)
}

pub(crate) fn draw_plan(
    canvas: &HtmlCanvasElement,
    input: JsValue,
    layer: Option<&PlanLayer>,
) -> Result<JsValue, JsError> {
    let mut surface = Canvas::new(canvas)?;
    let j = plan_job(input)?;
    let frame = j.draw(&mut surface, layer);
    let (o, far) = (frame.to_plan(0.0, 0.0), frame.to_plan(1.0, 1.0));
    let (bx, by, bw, bh) = frame.bounds_px();
    super::write(&super::outputs::PlanFrame {
        x_at_left_m: o.x,
        y_at_top_m: o.y,
        px_per_m: 1.0 / (far.x - o.x),
        bounds_px: [bx, by, bw, bh],
    })
}

/// The shadow plan as an SVG document, `width` × `height` pixels.
#[wasm_bindgen(js_name = shadowPlanSvg)]
pub fn shadow_plan_svg(
    #[wasm_bindgen(unchecked_param_type = "PlanInput")] input: JsValue,
    width: u32,
    height: u32,
) -> Result<String, JsError> {
    plan_svg(input, width, height, None)
}

pub(crate) fn plan_svg(input: JsValue, width: u32, height: u32, layer: Option<&PlanLayer>) -> Result<String, JsError> {
    let mut svg = svg_surface(width, height)?;
    let j = plan_job(input)?;
    j.draw(&mut svg, layer);
    Ok(svg.finish())
}

//! Map layers for the plan widget (wasm32 only): a computed map handed back once, kept on the Rust
//! side with its pixels, and drawn under the shadows on every frame; a map as GeoJSON; page colours.

use geo::{Coord, Rect};
use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::read;
use crate::exposure::{map_geojson, CellValues, Grid, MapColumn};
use crate::render::{Colour, MapLayer, Palette};

/// A grid's geometry as the map calls return it.
#[derive(Deserialize)]
#[serde(rename_all = "camelCase")]
pub(crate) struct GridIn {
    cols: usize,
    rows: usize,
    origin_x_m: f64,
    origin_y_m: f64,
    col0: usize,
    row0: usize,
    cell_m: f64,
}

/// The grid of `g` with the cells inside where `values` are numbers; checks the sizes agree.
fn grid_of(g: GridIn, values: &[f64]) -> Result<Grid, JsError> {
    if !(g.cell_m.is_finite() && g.cell_m > 0.0) {
        return Err(JsError::new(&format!("grid.cellM: must be a positive number of metres, got {}", g.cell_m)));
    }
    let cells = g.cols.checked_mul(g.rows).filter(|&n| n == values.len());
    if cells.is_none() {
        return Err(JsError::new(&format!(
            "grid.cols, grid.rows: {} × {} cells do not fit {} values",
            g.cols,
            g.rows,
            values.len()
        )));
    }
    Ok(Grid {
        origin: Coord { x: g.origin_x_m, y: g.origin_y_m },
        col0: g.col0,
        row0: g.row0,
        cell_m: g.cell_m,
        cols: g.cols,
        rows: g.rows,
        inside: values.iter().map(|v| v.is_finite()).collect(),
    })
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct LayerIn {
    grid: GridIn,
    /// What the values are, e.g. "hours of direct sun".
    label: String,
    /// Their unit, e.g. "h".
    unit: String,
    /// The values at the ends of the colour ramp (default: 0 or the least value, and the largest).
    range_lo: Option<f64>,
    range_hi: Option<f64>,
}

/// A map to draw under the shadows of the plan widget: made once from a map call's result, drawn on
/// every frame without being passed again.
#[wasm_bindgen]
pub struct PlanLayer {
    layer: MapLayer,
    rgba: Vec<u8>,
    grid: Grid,
}

#[wasm_bindgen]
impl PlanLayer {
    /// `new PlanLayer({grid, label, unit, rangeLo?, rangeHi?}, values)`: `grid` as a map call
    /// returns it, `values` its Float64Array (NaN outside the areas).
    #[wasm_bindgen(constructor)]
    pub fn new(
        #[wasm_bindgen(unchecked_param_type = "LayerInput")] input: JsValue,
        values: &[f64],
    ) -> Result<PlanLayer, JsError> {
        let i: LayerIn = read(input, "PlanLayer")?;
        let grid = grid_of(i.grid, values)?;
        let finite = values.iter().copied().filter(|v| v.is_finite());
        let (lo, hi) = finite.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| (a.min(v), b.max(v)));
        let lo = i.range_lo.unwrap_or(if lo.is_finite() { lo.min(0.0) } else { 0.0 });
        let hi = i.range_hi.unwrap_or(if hi.is_finite() { hi } else { 1.0 });
        if !(lo.is_finite() && hi.is_finite() && hi > lo) {
            return Err(JsError::new(&format!("rangeLo, rangeHi: {lo} to {hi} is not a range")));
        }
        let values = values.iter().map(|&v| v.is_finite().then_some(v)).collect();
        let layer = MapLayer::on_grid(&grid, values, &i.label, &i.unit, (lo, hi));
        let rgba = layer.rgba();
        Ok(PlanLayer { layer, rgba, grid })
    }

    /// Draws the shadow plan (input as `drawShadowPlan`) with this map under the shadows and its
    /// legend; returns the same pixel-to-plan mapping.
    #[wasm_bindgen(js_name = drawPlan, unchecked_return_type = "PlanFrame")]
    pub fn draw_plan(
        &self,
        canvas: &web_sys::HtmlCanvasElement,
        #[wasm_bindgen(unchecked_param_type = "PlanInput")] input: JsValue,
    ) -> Result<JsValue, JsError> {
        super::canvas::draw_plan(canvas, input, Some(self))
    }

    /// The shadow plan with this map as an SVG document, `width` × `height` pixels.
    #[wasm_bindgen(js_name = planSvg)]
    pub fn plan_svg(
        &self,
        #[wasm_bindgen(unchecked_param_type = "PlanInput")] input: JsValue,
        width: u32,
        height: u32,
    ) -> Result<String, JsError> {
        super::canvas::plan_svg(input, width, height, Some(self))
    }

    /// Draws the map alone as a heat-map figure (as the CLI's PNG): `drawMap(canvas, {site, title,
    /// subtitle, palette?})`.
    #[wasm_bindgen(js_name = drawMap)]
    pub fn draw_map(
        &self,
        canvas: &web_sys::HtmlCanvasElement,
        #[wasm_bindgen(unchecked_param_type = "LayerFigureInput")] input: JsValue,
    ) -> Result<(), JsError> {
        let mut surface = super::Canvas::new(canvas)?;
        self.heat_map(input, &mut surface)
    }

    /// The heat-map figure as an SVG document, `width` × `height` pixels.
    #[wasm_bindgen(js_name = mapSvg)]
    pub fn map_svg(
        &self,
        #[wasm_bindgen(unchecked_param_type = "LayerFigureInput")] input: JsValue,
        width: u32,
        height: u32,
    ) -> Result<String, JsError> {
        let mut svg = super::canvas::svg_surface(width, height)?;
        self.heat_map(input, &mut svg)?;
        Ok(svg.finish())
    }

    /// The plan rectangle the layer covers: `[xMin, yMin, xMax, yMax]`, metres.
    #[wasm_bindgen(getter, js_name = boundsM)]
    pub fn bounds_m(&self) -> Vec<f64> {
        let b: Rect<f64> = self.layer.bounds;
        vec![b.min().x, b.min().y, b.max().x, b.max().y]
    }
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct MapFigureIn {
    site: String,
    title: String,
    #[serde(default)]
    subtitle: String,
    #[serde(default)]
    palette: PaletteIn,
}

impl PlanLayer {
    fn heat_map(&self, input: JsValue, d: &mut dyn crate::render::Draw) -> Result<(), JsError> {
        let i: MapFigureIn = read(input, "drawMap")?;
        let model = super::site(&i.site)?;
        let unit = format!("{} ({})", self.layer.label, self.layer.unit);
        let map = crate::render::HeatMap::of_site(
            &model,
            &self.grid,
            &self.layer.values,
            (&i.title, &i.subtitle),
            &unit,
            self.layer.range,
        );
        let palette = i.palette.palette()?;
        crate::render::draw_heat_map(&mut crate::render::Restyle { inner: d, palette }, &map);
        Ok(())
    }

    /// The layer and its pixels, for drawing.
    pub(crate) fn parts(&self) -> (&MapLayer, &[u8]) {
        (&self.layer, &self.rgba)
    }
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct MapGeojsonIn {
    site: String,
    grid: GridIn,
    /// Property name with its unit, e.g. "sun_hours".
    name: String,
    #[serde(default)]
    title: String,
    #[serde(default)]
    period: String,
}

/// A map as GeoJSON text: `mapGeojson({site, grid, name, title?, period?}, values)`, each cell with a
/// value as a square polygon carrying it (WGS84 when the site came from GeoJSON, else plan metres).
#[wasm_bindgen(js_name = mapGeojson)]
pub fn map_geojson_js(
    #[wasm_bindgen(unchecked_param_type = "MapGeojsonInput")] input: JsValue,
    values: &[f64],
) -> Result<String, JsError> {
    let i: MapGeojsonIn = read(input, "mapGeojson")?;
    let read = super::read_site_text(&i.site)?;
    let grid = grid_of(i.grid, values)?;
    let cells: CellValues = values.iter().map(|&v| v.is_finite().then_some(v)).collect();
    let columns = [MapColumn { name: &i.name, values: &cells }];
    Ok(map_geojson(&read.model, &grid, &columns, (&i.title, &i.period), read.from_geojson))
}

/// Page colours for the figures: CSS hex `#rrggbb` for ink, paper and the proposal.
#[derive(Deserialize, Default)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
pub(crate) struct PaletteIn {
    ink: Option<String>,
    paper: Option<String>,
    proposed: Option<String>,
}

impl PaletteIn {
    pub(crate) fn palette(&self) -> Result<Palette, JsError> {
        let one = |v: &Option<String>, field: &str| {
            v.as_deref()
                .map(|t| {
                    Colour::from_hex(t)
                        .ok_or_else(|| JsError::new(&format!("palette.{field}: {t:?} is not a colour #rrggbb")))
                })
                .transpose()
        };
        Ok(Palette {
            ink: one(&self.ink, "ink")?,
            paper: one(&self.paper, "paper")?,
            proposed: one(&self.proposed, "proposed")?,
        })
    }
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct UnderlayIn {
    image_a: (f64, f64),
    image_b: (f64, f64),
    plan_a: (f64, f64),
    distance_m: f64,
    bearing_deg: Option<f64>,
}

/// Where a site-plan image goes under the plan: `underlayPlacement({imageA: [u, v], imageB: [u, v],
/// planA: [xM, yM], distanceM, bearingDeg?})` → `{a, b, c, d, e, f}` with plan x = a·u + c·v + e,
/// y = b·u + d·v + f (image pixels u right, v down). `bearingDeg` is the plan bearing from A to B
/// (clockwise from the plan's north); without it the image's up is the plan's north.
#[wasm_bindgen(js_name = underlayPlacement, unchecked_return_type = "Placement")]
pub fn underlay_placement(
    #[wasm_bindgen(unchecked_param_type = "UnderlayInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: UnderlayIn = read(input, "underlayPlacement")?;
    let p = crate::site::Placement::from_reference(i.image_a, i.image_b, i.plan_a, i.distance_m, i.bearing_deg)
        .map_err(super::err)?;
    super::write(&p)
}

//! A map figure: a grid of values in the colour ramp over the site plan, with a title, a legend in
//! the map's unit, a scale bar, a north arrow and the caution line.

use super::draw::{footnote, footnote_px, heading, Draw, PAPER};
use super::layer::{draw_cells, draw_legend_len, MapLayer, LEGEND_PX};
use super::plan::site_outlines;
use super::plan::{draw_north_arrow, draw_outlines, draw_scale_bar, outline_key, Outline, PlanFrame};
use super::plan_view::key_px;
use crate::exposure::{CellValues, Grid};
use crate::site::SiteModel;

/// A map to draw.
#[derive(Debug, Clone)]
pub struct HeatMap<'a> {
    /// Title line.
    pub title: String,
    /// A second line under the title (period, settings).
    pub subtitle: String,
    /// The unit of the values, for the legend (e.g. "h", "kWh/m²", "m").
    pub unit: String,
    /// The cells.
    pub grid: &'a Grid,
    /// Values per cell, row-major as the grid; `None` cells are left blank.
    pub values: &'a CellValues,
    /// Values mapped to the ends of the ramp.
    pub range: (f64, f64),
    /// Outlines over the map.
    pub outlines: Vec<Outline>,
    /// Rotation of the plan's north from true north, degrees clockwise.
    pub plan_rotation_deg: f64,
    /// Footnote (the caution).
    pub caution: String,
}

impl<'a> HeatMap<'a> {
    /// The map of `values` on `grid` over `model`'s outlines, titled "`title` — site name", with the
    /// plan's north and the caution.
    pub fn of_site(
        model: &SiteModel,
        grid: &'a Grid,
        values: &'a CellValues,
        (title, subtitle): (&str, &str),
        unit: &str,
        range: (f64, f64),
    ) -> Self {
        HeatMap {
            title: super::titled(title, &model.name),
            subtitle: subtitle.into(),
            unit: unit.into(),
            grid,
            values,
            range,
            outlines: site_outlines(model),
            plan_rotation_deg: model.plan_rotation_deg,
            caution: crate::rules::CAUTION.into(),
        }
    }
}

/// Figure size, pixels.
pub const FIGURE_PX: (u32, u32) = (960, 760);

/// Draws `map` onto `d` (sized [`FIGURE_PX`]); returns where the plan lies in the figure.
pub fn draw_heat_map(d: &mut dyn Draw, map: &HeatMap) -> PlanFrame {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    let top = heading(d, &map.title, &map.subtitle);

    let layer = MapLayer::on_grid(map.grid, map.values.clone(), "", &map.unit, map.range);
    let plan_box = (24.0, top, w - 24.0 - key_px(w), h - top - 56.0 - footnote_px(d, &map.caution));
    let frame = PlanFrame::fit(layer.bounds, &map.outlines, plan_box);
    draw_cells(d, &frame, &layer, &layer.rgba());
    draw_outlines(d, &frame, &map.outlines);
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, map.plan_rotation_deg);
    let (lx, ly) = (w - key_px(w) + 16.0, frame.by + 20.0);
    // The ramp as long as the column allows above the outline key (three rows) and the footnote.
    let room = frame.by + frame.bh - ly - 40.0 - 3.0 * 24.0;
    let len = LEGEND_PX.min((0.5 * h).round()).min(room);
    let below = draw_legend_len(d, lx, ly, "", &map.unit, map.range, len);
    outline_key(d, &map.outlines, lx, below + 40.0);
    footnote(d, &map.caution);
    frame
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use crate::render::{ramp_colour, Pixmap, Svg};
    use geo::{Coord, LineString, Polygon};

    fn figure<'a>(grid: &'a Grid, values: &'a CellValues) -> HeatMap<'a> {
        HeatMap {
            title: "Test map".into(),
            subtitle: "sub".into(),
            unit: "h".into(),
            grid,
            values,
            range: (0.0, 10.0),
            outlines: vec![],
            plan_rotation_deg: 0.0,
            caution: "caution".into(),
        }
    }

    #[test]
    fn the_raster_and_svg_back_ends_draw_the_same_figure() {
        let sq = Polygon::new(LineString::from(vec![(0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0)]), vec![]);
        let g = Grid::over_polygon(&sq, 1.0, DEFAULT_MAX_CELLS).unwrap();
        // Low values in the west half, high in the east half.
        let values: CellValues = (0..100).map(|i| Some(if i % 10 < 5 { 0.0 } else { 10.0 })).collect();
        let map = figure(&g, &values);
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_heat_map(&mut px, &map);
        let r = px.render().unwrap();
        let at = |x: f64, y: f64| {
            let (u, v) = frame.to_px(Coord { x, y });
            r.rgb(u as u32, v as u32)
        };
        // Mid-height, a quarter in from the west and from the east edge of the square.
        let (lo, hi) = (ramp_colour(0.0, 0.0, 10.0), ramp_colour(10.0, 0.0, 10.0));
        assert_eq!(at(2.5, 5.2), [lo.r, lo.g, lo.b]);
        assert_eq!(at(7.5, 5.2), [hi.r, hi.g, hi.b]);
        let png = px.to_png().unwrap();
        assert_eq!(&png[1..4], b"PNG");
        let mut svg = Svg::new(FIGURE_PX.0, FIGURE_PX.1);
        draw_heat_map(&mut svg, &map);
        let text = svg.finish();
        assert!(text.starts_with("<svg") && text.contains("Test map") && text.contains("data:image/png;base64,"));
    }
}

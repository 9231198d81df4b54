//! A map figure: a grid of values in the colour ramp over the site plan, with a title, a legend in
//! the map's unit, a scale bar, a north arrow and the caution line.

use geo::Coord;

use super::draw::{footnote, heading, Anchor, Colour, Draw, Image};
use super::plan::{draw_north_arrow, draw_outlines, draw_scale_bar, outline_key, Outline, PlanFrame};
use super::ramp::ramp_colour;
use crate::exposure::Grid;

const INK: Colour = Colour::rgb(30, 30, 30);

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
    pub values: &'a [Option<f64>],
    /// Values mapped to the ends of the ramp.
    pub range: (f64, f64),
    /// Outlines over the map.
    pub outlines: Vec<Outline>,
    /// Rotation of the plan's north from true north, degrees clockwise.
    pub plan_rotation_deg: f64,
    /// Footnote (the caution).
    pub caution: String,
}

/// Figure size, pixels.
pub const FIGURE_PX: (u32, u32) = (960, 760);

/// Draws `map` onto `d` (sized [`FIGURE_PX`]).
pub fn draw_heat_map(d: &mut dyn Draw, map: &HeatMap) {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, Colour::rgb(255, 255, 255));
    heading(d, &map.title, &map.subtitle);

    let g = map.grid;
    let frame = PlanFrame::fit(g.bounds(), &map.outlines, (24.0, 80.0, w - 260.0, h - 200.0));
    let to_px = |c: Coord<f64>| frame.to_px(c);
    // Cells, as an image with the top row first.
    let (lo, hi) = map.range;
    let mut rgba = vec![0u8; g.cols * g.rows * 4];
    for row in 0..g.rows {
        for col in 0..g.cols {
            if let Some(v) = map.values.get(row * g.cols + col).copied().flatten() {
                let c = ramp_colour(v, lo, hi);
                let i = ((g.rows - 1 - row) * g.cols + col) * 4;
                rgba[i..i + 4].copy_from_slice(&[c.r, c.g, c.b, 255]);
            }
        }
    }
    let b = g.bounds();
    let (x0, y0) = to_px(Coord { x: b.min().x, y: b.max().y });
    let (x1, y1) = to_px(Coord { x: b.max().x, y: b.min().y });
    d.image(x0, y0, x1 - x0, y1 - y0, &Image { rgba: &rgba, width: g.cols as u32, height: g.rows as u32 });

    draw_outlines(d, &frame, &map.outlines);
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, map.plan_rotation_deg);

    // Legend: a vertical ramp with five labelled ticks.
    let (lx, ly, lw, lh) = (w - 200.0, frame.by + 20.0, 24.0, 320.0);
    d.text(lx, ly - 10.0, 13.0, &map.unit, INK, Anchor::Start);
    let bands = 64;
    for k in 0..bands {
        let t = (k as f64 + 0.5) / bands as f64;
        let colour = ramp_colour(lo + t * (hi - lo), lo, hi);
        d.fill_rect(lx, ly + lh - (k + 1) as f64 * lh / bands as f64, lw, lh / bands as f64 + 0.5, colour);
    }
    d.stroke(&[(lx, ly), (lx + lw, ly), (lx + lw, ly + lh), (lx, ly + lh)], 1.0, INK, true);
    for k in 0..=4 {
        let v = lo + (hi - lo) * f64::from(k) / 4.0;
        let y = ly + lh - lh * f64::from(k) / 4.0;
        d.stroke(&[(lx + lw, y), (lx + lw + 6.0, y)], 1.0, INK, false);
        let digits = if (hi - lo).abs() >= 20.0 {
            0
        } else if (hi - lo).abs() >= 2.0 {
            1
        } else {
            2
        };
        d.text(lx + lw + 10.0, y + 4.0, 12.0, &format!("{v:.digits$}"), INK, Anchor::Start);
    }
    outline_key(d, &map.outlines, lx, ly + lh + 40.0);
    footnote(d, &map.caution);
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use crate::render::{Pixmap, Svg};
    use geo::{LineString, Polygon};

    fn figure<'a>(grid: &'a Grid, values: &'a [Option<f64>]) -> HeatMap<'a> {
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
        let values: Vec<Option<f64>> = (0..100).map(|i| Some(if i % 10 < 5 { 0.0 } else { 10.0 })).collect();
        let map = figure(&g, &values);
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        draw_heat_map(&mut px, &map);
        let at = |x: usize, y: usize| {
            let i = (y * FIGURE_PX.0 as usize + x) * 4;
            [px.rgba()[i], px.rgba()[i + 1], px.rgba()[i + 2]]
        };
        // The plan box is centred in 24..724 × 80..680; its centre row, a quarter in from each side.
        let (lo, hi) = (ramp_colour(0.0, 0.0, 10.0), ramp_colour(10.0, 0.0, 10.0));
        assert_eq!(at(24 + 175 + 50, 380), [lo.r, lo.g, lo.b]);
        assert_eq!(at(24 + 525 - 50, 380), [hi.r, hi.g, hi.b]);
        let png = px.to_png();
        assert_eq!(&png[1..4], b"PNG");
        let mut svg = Svg::new(FIGURE_PX.0, FIGURE_PX.1);
        draw_heat_map(&mut svg, &map);
        let text = svg.finish();
        assert!(text.starts_with("<svg") && text.contains("Test map") && text.contains("data:image/png;base64,"));
    }
}

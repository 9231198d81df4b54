//! A map figure: a grid of values in the colour ramp over the site plan, with a title, a legend in
//! the map's unit, a scale bar, a north arrow and the caution line.

use geo::{BoundingRect, Coord, Polygon, Rect};

use super::draw::{text_width_px, wrap, Anchor, Colour, Draw, Image};
use super::ramp::ramp_colour;
use crate::exposure::Grid;

const INK: Colour = Colour::rgb(30, 30, 30);
const MUTED: Colour = Colour::rgb(110, 110, 110);
const PROPOSED: Colour = Colour::rgb(200, 40, 120);

/// What an outline on the plan is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum OutlineKind {
    /// An area (lot, garden): thin line.
    Area,
    /// An existing volume: solid line.
    Existing,
    /// A proposed volume: a heavier line in the proposal colour.
    Proposed,
}

/// An outline drawn over the map, with a label.
#[derive(Debug, Clone, PartialEq)]
pub struct Outline {
    /// Plan polygon, metres.
    pub polygon: Polygon<f64>,
    /// Label drawn at its centre (may be empty).
    pub label: String,
    /// How it is drawn.
    pub kind: OutlineKind,
}

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

/// A length of 1, 2 or 5 × 10ⁿ metres near `target`.
fn nice_length(target: f64) -> f64 {
    let p = 10f64.powf(target.log10().floor());
    [10.0, 5.0, 2.0, 1.0].into_iter().map(|k| k * p).find(|&l| l <= target).unwrap_or(p)
}

/// Draws `map` onto `d` (sized [`FIGURE_PX`]).
pub fn draw_heat_map(d: &mut dyn Draw, map: &HeatMap) {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, Colour::rgb(255, 255, 255));
    let title = wrap(&map.title, 16.0, w - 48.0);
    d.text(24.0, 30.0, 16.0, title.first().map_or("", |s| s.as_str()), INK, Anchor::Start);
    let sub =
        if title.len() > 1 { format!("{} · {}", title[1..].join(" "), map.subtitle) } else { map.subtitle.clone() };
    d.text(24.0, 54.0, 12.0, &sub, MUTED, Anchor::Start);

    // The plan's extent: the grid and every outline, with a margin.
    let g = map.grid;
    let mut ext: Rect<f64> = g.bounds();
    for o in &map.outlines {
        if let Some(r) = o.polygon.bounding_rect() {
            ext = Rect::new(
                Coord { x: ext.min().x.min(r.min().x), y: ext.min().y.min(r.min().y) },
                Coord { x: ext.max().x.max(r.max().x), y: ext.max().y.max(r.max().y) },
            );
        }
    }
    let (bx, by, bw, bh) = (24.0, 80.0, w - 260.0, h - 200.0);
    let scale = (bw / ext.width().max(1e-9)).min(bh / ext.height().max(1e-9));
    let ox = bx + (bw - ext.width() * scale) / 2.0;
    let oy = by + (bh - ext.height() * scale) / 2.0;
    let to_px = |c: Coord<f64>| (ox + (c.x - ext.min().x) * scale, oy + (ext.max().y - c.y) * scale);

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

    for o in map.outlines.iter().filter(|o| o.kind == OutlineKind::Existing) {
        let rings: Vec<Vec<(f64, f64)>> = std::iter::once(o.polygon.exterior())
            .chain(o.polygon.interiors())
            .map(|r| r.coords().map(|c| to_px(*c)).collect())
            .collect();
        d.fill_polygon(&rings, Colour::rgb(222, 222, 222));
    }
    // Labels go where they fit: inside their outline's width, clear of labels already placed.
    let mut placed: Vec<(f64, f64, f64, f64)> = Vec::new();
    for o in &map.outlines {
        let (colour, width) = match o.kind {
            OutlineKind::Area => (MUTED, 1.0),
            OutlineKind::Existing => (INK, 1.5),
            OutlineKind::Proposed => (PROPOSED, 2.5),
        };
        for ring in std::iter::once(o.polygon.exterior()).chain(o.polygon.interiors()) {
            let pts: Vec<(f64, f64)> = ring.coords().map(|c| to_px(*c)).collect();
            d.stroke(&pts, width, colour, true);
        }
        let Some(r) = o.polygon.bounding_rect().filter(|_| !o.label.is_empty()) else { continue };
        let tw = text_width_px(10.0, &o.label);
        if tw > r.width() * scale - 4.0 {
            continue;
        }
        let (cx, cy) = to_px(r.center());
        for shift in [0.0, 14.0, -14.0, 28.0] {
            let bx = (cx - tw / 2.0, cy + shift - 8.0, cx + tw / 2.0, cy + shift + 4.0);
            if placed.iter().all(|p| bx.2 < p.0 || bx.0 > p.2 || bx.3 < p.1 || bx.1 > p.3) {
                d.text(cx, cy + shift + 4.0, 10.0, &o.label, colour, Anchor::Middle);
                placed.push(bx);
                break;
            }
        }
    }

    // Scale bar under the plan.
    let len_m = nice_length(ext.width() / 4.0);
    let (sx, sy) = (bx, by + bh + 24.0);
    d.fill_rect(sx, sy - 6.0, len_m * scale, 6.0, INK);
    d.text(sx, sy + 16.0, 11.0, "0", INK, Anchor::Middle);
    d.text(sx + len_m * scale, sy + 16.0, 11.0, &format!("{len_m} m"), INK, Anchor::Middle);

    // True north: the plan's north turned back by its rotation.
    let (nx, ny, r) = (bx + bw - 20.0, by + 30.0, 18.0);
    let a = (-map.plan_rotation_deg).to_radians();
    let (s, c) = a.sin_cos();
    let tip = (nx + r * s, ny - r * c);
    let left = (nx - 0.45 * r * c - 0.6 * r * s, ny - 0.45 * r * s + 0.6 * r * c);
    let right = (nx + 0.45 * r * c - 0.6 * r * s, ny + 0.45 * r * s + 0.6 * r * c);
    d.fill_polygon(&[vec![tip, right, (nx, ny), left]], INK);
    d.text(tip.0 + 14.0 * s, tip.1 - 14.0 * c + 4.0, 12.0, "N", INK, Anchor::Middle);

    // Legend: a vertical ramp with five labelled ticks.
    let (lx, ly, lw, lh) = (w - 200.0, by + 20.0, 24.0, 320.0);
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
    let key = [(OutlineKind::Existing, "existing"), (OutlineKind::Proposed, "proposed"), (OutlineKind::Area, "area")];
    for (k, (kind, label)) in key.iter().enumerate() {
        if map.outlines.iter().any(|o| o.kind == *kind) {
            let y = ly + lh + 40.0 + 22.0 * k as f64;
            let (colour, width) = match kind {
                OutlineKind::Area => (MUTED, 1.0),
                OutlineKind::Existing => (INK, 1.5),
                OutlineKind::Proposed => (PROPOSED, 2.5),
            };
            d.stroke(&[(lx, y), (lx + lw, y)], width, colour, false);
            d.text(lx + lw + 10.0, y + 4.0, 12.0, label, INK, Anchor::Start);
        }
    }
    let lines = wrap(&map.caution, 11.0, w - 48.0);
    for (k, line) in lines.iter().enumerate() {
        d.text(24.0, h - 12.0 - 16.0 * (lines.len() - 1 - k) as f64, 11.0, line, MUTED, Anchor::Start);
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use crate::render::{Pixmap, Svg};
    use geo::LineString;

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

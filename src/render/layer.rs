//! A map layer on a plan figure: a grid of values drawn in the colour ramp, and its legend in the
//! map's unit. The heat-map figure and the shadow plan share it.

use geo::{Coord, Rect};

use super::draw::{Anchor, Draw, Image, INK};
use super::plan::PlanFrame;
use super::ramp::ramp_colour;
use crate::exposure::Grid;

/// A grid of values to draw over a plan.
#[derive(Debug, Clone, PartialEq)]
pub struct MapLayer {
    /// What the values are, for the legend (e.g. "hours of direct sun").
    pub label: String,
    /// Their unit, for the legend (e.g. "h", "kWh/m²", "m").
    pub unit: String,
    /// The plan rectangle the cells cover, metres.
    pub bounds: Rect<f64>,
    /// Columns and rows of cells.
    pub cols: usize,
    /// Rows of cells.
    pub rows: usize,
    /// Values, row-major from the bottom (south) row; `None` cells are left blank.
    pub values: Vec<Option<f64>>,
    /// Values mapped to the ends of the ramp.
    pub range: (f64, f64),
}

impl MapLayer {
    /// A layer of `values` on the cells of `grid`.
    pub fn on_grid(grid: &Grid, values: Vec<Option<f64>>, label: &str, unit: &str, range: (f64, f64)) -> Self {
        MapLayer {
            label: label.into(),
            unit: unit.into(),
            bounds: grid.bounds(),
            cols: grid.cols,
            rows: grid.rows,
            values,
            range,
        }
    }

    /// The cells as an RGBA image, top (north) row first, blank cells transparent.
    pub fn rgba(&self) -> Vec<u8> {
        let (lo, hi) = self.range;
        let mut rgba = vec![0u8; self.cols * self.rows * 4];
        for row in 0..self.rows {
            for col in 0..self.cols {
                if let Some(v) = self.values.get(row * self.cols + col).copied().flatten() {
                    let c = ramp_colour(v, lo, hi);
                    let i = ((self.rows - 1 - row) * self.cols + col) * 4;
                    rgba[i..i + 4].copy_from_slice(&[c.r, c.g, c.b, 255]);
                }
            }
        }
        rgba
    }
}

/// Draws the layer's cells into `frame` (the pixels of `rgba`, from [`MapLayer::rgba`]).
pub fn draw_cells(d: &mut dyn Draw, frame: &PlanFrame, layer: &MapLayer, rgba: &[u8]) {
    let b = layer.bounds;
    let (x0, y0) = frame.to_px(Coord { x: b.min().x, y: b.max().y });
    let (x1, y1) = frame.to_px(Coord { x: b.max().x, y: b.min().y });
    d.image(x0, y0, x1 - x0, y1 - y0, &Image { rgba, width: layer.cols as u32, height: layer.rows as u32 });
}

/// Height of the legend drawn by [`draw_legend`], pixels.
pub const LEGEND_PX: f64 = 320.0;

/// The legend: the label and unit above a vertical ramp with five labelled ticks, its top left at
/// (`x`, `y`). Returns the y below it.
pub fn draw_legend(d: &mut dyn Draw, x: f64, y: f64, label: &str, unit: &str, (lo, hi): (f64, f64)) -> f64 {
    let (lw, lh) = (24.0, LEGEND_PX);
    let title = if label.is_empty() { unit.to_string() } else { format!("{label} ({unit})") };
    let lines = super::draw::wrap(&title, 13.0, 190.0);
    let top = y + 16.0 * (lines.len().max(1) - 1) as f64;
    for (k, line) in lines.iter().enumerate() {
        d.text(x, y - 10.0 + 16.0 * k as f64, 13.0, line, INK, Anchor::Start);
    }
    let bands = 64;
    for k in 0..bands {
        let t = (k as f64 + 0.5) / bands as f64;
        let colour = ramp_colour(lo + t * (hi - lo), lo, hi);
        d.fill_rect(x, top + lh - (k + 1) as f64 * lh / bands as f64, lw, lh / bands as f64 + 0.5, colour);
    }
    d.stroke(&[(x, top), (x + lw, top), (x + lw, top + lh), (x, top + lh)], 1.0, INK, true);
    let digits = if (hi - lo).abs() >= 20.0 {
        0
    } else if (hi - lo).abs() >= 2.0 {
        1
    } else {
        2
    };
    for k in 0..=4 {
        let v = lo + (hi - lo) * f64::from(k) / 4.0;
        let ty = top + lh - lh * f64::from(k) / 4.0;
        d.stroke(&[(x + lw, ty), (x + lw + 6.0, ty)], 1.0, INK, false);
        d.text(x + lw + 10.0, ty + 4.0, 12.0, &format!("{v:.digits$}"), INK, Anchor::Start);
    }
    top + lh
}

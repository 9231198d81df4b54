//! A map layer on a plan figure: a grid of values drawn in the colour ramp, and its legend in the
//! map's unit. The heat-map figure and the shadow plan share it.

use geo::{Coord, Rect};

use super::draw::{Anchor, Draw, Image, INK, LABEL_PX, TEXT_PX};
use super::plan::PlanFrame;
use super::ramp::ramp_colour;
use crate::exposure::{CellValues, Grid};

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
    pub values: CellValues,
    /// Values mapped to the ends of the ramp.
    pub range: (f64, f64),
}

impl MapLayer {
    /// A layer of `values` on the cells of `grid`.
    pub fn on_grid(grid: &Grid, values: CellValues, label: &str, unit: &str, range: (f64, f64)) -> Self {
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
                if let Some(v) = self.values.get(row * self.cols + col) {
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
pub fn draw_legend(d: &mut dyn Draw, x: f64, y: f64, label: &str, unit: &str, range: (f64, f64)) -> f64 {
    // Shorter on a short figure (drawn small for print or a narrow page): at most half its height.
    let len = LEGEND_PX.min((0.5 * f64::from(d.size().1)).round());
    draw_legend_len(d, x, y, label, unit, range, len)
}

/// As [`draw_legend`], the ramp `len_px` long (at least 100 px).
pub fn draw_legend_len(
    d: &mut dyn Draw,
    x: f64,
    y: f64,
    label: &str,
    unit: &str,
    (lo, hi): (f64, f64),
    len_px: f64,
) -> f64 {
    let (lw, lh) = (24.0, len_px.max(100.0));
    let title = if label.is_empty() { unit.to_string() } else { format!("{label} ({unit})") };
    let lines = super::draw::wrap_on(d, &title, TEXT_PX, 210.0);
    let top = y + 19.0 * (lines.len().max(1) - 1) as f64;
    for (k, line) in lines.iter().enumerate() {
        d.text(x, y - 10.0 + 19.0 * k as f64, TEXT_PX, line, INK, Anchor::Start);
    }
    let bands = 64;
    for k in 0..bands {
        let t = (k as f64 + 0.5) / bands as f64;
        let colour = ramp_colour(lo + t * (hi - lo), lo, hi);
        d.fill_rect(x, top + lh - (k + 1) as f64 * lh / bands as f64, lw, lh / bands as f64 + 0.5, colour);
    }
    d.stroke(&[(x, top), (x + lw, top), (x + lw, top + lh), (x, top + lh)], 1.0, INK, true);
    let (ticks, digits) = nice_ticks(lo, hi, 6);
    for v in ticks {
        let ty = top + lh - lh * (v - lo) / (hi - lo);
        d.stroke(&[(x + lw, ty), (x + lw + 6.0, ty)], 1.0, INK, false);
        d.text(x + lw + 10.0, ty + 5.0, LABEL_PX, &format!("{v:.digits$}"), INK, Anchor::Start);
    }
    top + lh
}

/// Round tick values within `lo`…`hi`: multiples of 1, 2, 2.5 or 5 × 10ⁿ, at most `most` of them (at
/// least two where the range allows), and the decimals that show them exactly (common practice for
/// axis labels). An empty or reversed range gives its one value.
pub fn nice_ticks(lo: f64, hi: f64, most: usize) -> (Vec<f64>, usize) {
    if !(lo.is_finite() && hi.is_finite()) || hi <= lo {
        return (vec![lo], 0);
    }
    let most = most.max(2) as f64;
    let raw = (hi - lo) / (most - 1.0);
    let p = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .into_iter()
        .map(|k| k * p)
        .find(|&s| ((hi - lo) / s).floor() + 1.0 <= most)
        .unwrap_or(10.0 * p);
    // Decimals: none for whole steps, else enough for the step (2.5 needs one, 0.25 two).
    let digits = (0..6).find(|&n| ((step * 10f64.powi(n)).round() - step * 10f64.powi(n)).abs() < 1e-6).unwrap_or(6);
    let unit = 10f64.powi(digits);
    let first = (lo / step - 1e-9).ceil();
    let ticks: Vec<f64> = (0..)
        .map(|k| ((first + f64::from(k)) * step * unit).round() / unit)
        .take_while(|v| *v <= hi + step * 1e-9)
        .map(|v| if v == 0.0 { 0.0 } else { v })
        .collect();
    (ticks, digits as usize)
}

#[cfg(test)]
mod tests {
    use super::nice_ticks;

    #[test]
    fn legend_ticks_are_round_numbers_inside_the_range() {
        assert_eq!(nice_ticks(0.0, 12.2, 6), (vec![0.0, 2.5, 5.0, 7.5, 10.0], 1));
        assert_eq!(nice_ticks(0.0, 10.0, 6), (vec![0.0, 2.0, 4.0, 6.0, 8.0, 10.0], 0));
        assert_eq!(nice_ticks(0.0, 2.6, 6), (vec![0.0, 0.5, 1.0, 1.5, 2.0, 2.5], 1));
        assert_eq!(nice_ticks(0.0, 1340.0, 6), (vec![0.0, 250.0, 500.0, 750.0, 1000.0, 1250.0], 0));
        assert_eq!(nice_ticks(0.3, 0.95, 6), (vec![0.4, 0.6, 0.8], 1));
        assert_eq!(nice_ticks(5.0, 5.0, 6), (vec![5.0], 0));
        for (lo, hi) in [(0.0, 0.07), (3.0, 1e4), (-2.0, 2.0)] {
            let (t, _) = nice_ticks(lo, hi, 6);
            assert!(t.len() >= 2 && t.len() <= 6 && t.iter().all(|v| *v >= lo && *v <= hi), "{lo}..{hi}: {t:?}");
        }
    }
}

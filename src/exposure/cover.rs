//! Exact cover of grid cells by an area: the share (0–1) of each cell's square that lies in the
//! area, holes taken out.
//!
//! # Method
//! Row by row, each ring of the polygon is clipped to the row's strip, and the strip's ring to each
//! cell it touches, with the Sutherland–Hodgman algorithm (Sutherland & Hodgman 1974, "Reentrant
//! polygon clipping", CACM 17(1)): clipping a ring, convex or not, against a convex window gives a ring
//! whose signed area is exactly the area of the ring inside the window (it may have zero-width bridges,
//! which add no area). A cell is the exterior's area in it minus its holes'. Cells that no edge of the
//! polygon touches are wholly in or wholly out, decided by their centre. Cost: each row clips every
//! ring once, and each touched cell clips the row's pieces, so it grows with the perimeter, not the
//! area.

use geo::{Coord, LineString, Polygon};

use super::grid::Grid;
use super::raster::RowSpans;

/// A cover below this share of a cell (10⁻⁹) counts as none: cells that only touch the area along
/// an edge or at a corner.
pub const MIN_COVER: f64 = 1e-9;

/// The share of each cell of `grid` (row-major) that lies in `polygon`, 0–1.
pub fn cell_cover(grid: &Grid, polygon: &Polygon<f64>) -> Vec<f64> {
    let (c, cols) = (grid.cell_m, grid.cols);
    let cell_m2 = c * c;
    let mut cover = vec![0.0; cols * grid.rows];
    let mut spans = RowSpans::new(grid);
    spans.add_polygon(grid, polygon);
    let rings: Vec<&LineString<f64>> = std::iter::once(polygon.exterior()).chain(polygon.interiors()).collect();
    let x_lo = grid.origin.x + grid.col0 as f64 * c;
    let mut touched = vec![false; cols];
    let mut scratch = Vec::new();
    for row in 0..grid.rows {
        let y0 = grid.origin.y + (grid.row0 + row) as f64 * c;
        let y1 = y0 + c;
        let pieces: Vec<(f64, Vec<Coord<f64>>)> = rings
            .iter()
            .enumerate()
            .map(|(k, ring)| {
                let mut p = clip(&ring.0, |q| q.y - y0, |q| Coord { y: y0, ..q }, &mut scratch);
                p = clip(&p, |q| y1 - q.y, |q| Coord { y: y1, ..q }, &mut scratch);
                (if k == 0 { 1.0 } else { -1.0 }, p)
            })
            .filter(|(_, p)| p.len() >= 3)
            .collect();
        if pieces.is_empty() {
            continue;
        }
        touched.fill(false);
        for (_, p) in &pieces {
            for (a, b) in p.iter().zip(p.iter().cycle().skip(1)) {
                let on_strip_edge = (a.y == y0 && b.y == y0) || (a.y == y1 && b.y == y1);
                if on_strip_edge {
                    continue;
                }
                let first = ((a.x.min(b.x) - x_lo) / c).floor().max(0.0);
                let last = ((a.x.max(b.x) - x_lo) / c).floor().min(cols as f64 - 1.0);
                if first <= last {
                    touched[first as usize..=last as usize].fill(true);
                }
            }
        }
        let out = &mut cover[row * cols..(row + 1) * cols];
        for (a, b) in spans.merged(row) {
            out[a..b].fill(1.0);
        }
        for (col, _) in touched.iter().enumerate().filter(|(_, &t)| t) {
            let x0 = x_lo + col as f64 * c;
            let x1 = x0 + c;
            let mut m2 = 0.0;
            for (sign, p) in &pieces {
                let q = clip(p, |q| q.x - x0, |q| Coord { x: x0, ..q }, &mut scratch);
                let q = clip(&q, |q| x1 - q.x, |q| Coord { x: x1, ..q }, &mut scratch);
                m2 += sign * signed_area(&q).abs();
            }
            let share = (m2 / cell_m2).clamp(0.0, 1.0);
            out[col] = if share < MIN_COVER { 0.0 } else { share };
        }
    }
    cover
}

/// The part of the closed ring `ring` (first point not repeated, or repeated: both work) where
/// `inside(q) ≥ 0`, for an affine `inside`. Each new vertex where an edge crosses the line
/// `inside = 0` is put exactly on it by `on_line` (rounding would leave it a hair off, and a strip's
/// bottom edge would then not read as the strip's edge: every cell of the row would be clipped).
fn clip(
    ring: &[Coord<f64>],
    inside: impl Fn(Coord<f64>) -> f64,
    on_line: impl Fn(Coord<f64>) -> Coord<f64>,
    out: &mut Vec<Coord<f64>>,
) -> Vec<Coord<f64>> {
    out.clear();
    let n = ring.len();
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        let (da, db) = (inside(a), inside(b));
        if da >= 0.0 {
            out.push(a);
        }
        if (da >= 0.0) != (db >= 0.0) {
            let t = da / (da - db);
            out.push(on_line(Coord { x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) }));
        }
    }
    std::mem::take(out)
}

/// Shoelace area of a ring, m² (positive anticlockwise).
fn signed_area(ring: &[Coord<f64>]) -> f64 {
    let n = ring.len();
    (0..n).map(|i| ring[i].x * ring[(i + 1) % n].y - ring[(i + 1) % n].x * ring[i].y).sum::<f64>() / 2.0
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use geo::{Area, BooleanOps, Rect};

    fn lshape() -> Polygon<f64> {
        let ring = LineString::from(vec![(0.3, 0.2), (7.9, 0.2), (7.9, 3.1), (3.7, 3.1), (2.2, 9.4), (0.3, 9.4)]);
        let hole = LineString::from(vec![(1.0, 1.0), (2.5, 1.2), (1.4, 2.6)]);
        Polygon::new(ring, vec![hole])
    }

    #[test]
    fn the_cover_of_each_cell_equals_the_clipped_area_from_geo() {
        // Reference: geo's boolean intersection of the polygon with each cell's square (its overlay
        // snaps to a fixed-point lattice, so agreement is to about 1e-8 of a cell, not to the last bit).
        let p = lshape();
        let g = Grid::covering(&geo::MultiPolygon::new(vec![p.clone()]), 0.7, DEFAULT_MAX_CELLS).unwrap();
        let cover = cell_cover(&g, &p);
        for row in 0..g.rows {
            for col in 0..g.cols {
                let k = g.centre(col, row);
                let h = g.cell_m / 2.0;
                let sq = Rect::new(Coord { x: k.x - h, y: k.y - h }, Coord { x: k.x + h, y: k.y + h }).to_polygon();
                let exact = sq.intersection(&p).unsigned_area() / (g.cell_m * g.cell_m);
                let got = cover[row * g.cols + col];
                assert!((got - exact).abs() < 1e-7, "cell {col},{row}: {got} vs {exact}");
            }
        }
    }

    #[test]
    fn the_covers_add_up_to_the_polygon_area_at_any_cell_size() {
        let p = lshape();
        for cell in [0.05, 0.3, 1.0, 2.5, 20.0] {
            let g = Grid::covering(&geo::MultiPolygon::new(vec![p.clone()]), cell, DEFAULT_MAX_CELLS).unwrap();
            let sum: f64 = cell_cover(&g, &p).iter().sum::<f64>() * cell * cell;
            assert!((sum - p.unsigned_area()).abs() < 1e-9 * p.unsigned_area().max(1.0), "{cell}: {sum}");
        }
    }
}

//! Exact scanline rasterising at cell centres.
//!
//! For each grid row the horizontal line through the cell centres is cut with every polygon edge; the
//! crossings, paired even-odd, give the spans of the line inside the polygon (holes included), and each
//! span covers the cells whose centre x lies in it (a centre exactly on the left end counts, one on the
//! right end does not). Spans of many polygons are merged per row, so the cost grows with the rows and
//! edges the polygons cross, not with the area they cover.

use geo::Polygon;

use super::grid::Grid;

/// Per-row spans of cell indices, `[from, to)`, collected from many polygons.
#[derive(Debug, Clone, Default)]
pub struct RowSpans {
    rows: Vec<Vec<(usize, usize)>>,
    scratch: Vec<f64>,
}

impl RowSpans {
    /// Empty spans for the rows of `grid`.
    pub fn new(grid: &Grid) -> Self {
        RowSpans { rows: vec![Vec::new(); grid.rows], scratch: Vec::new() }
    }

    /// Removes all spans, keeping the storage.
    pub fn clear(&mut self) {
        self.rows.iter_mut().for_each(Vec::clear);
    }

    /// Adds the cells of `grid` whose centres lie in `polygon`.
    pub fn add_polygon(&mut self, grid: &Grid, polygon: &Polygon<f64>) {
        let rows = &mut self.rows;
        row_spans(grid, polygon, &mut self.scratch, |row, a, b| rows[row].push((a, b)));
    }

    /// The merged spans of `row`, sorted, as `[from, to)` cell ranges, into `out` (cleared first).
    pub fn merged_into(&mut self, row: usize, out: &mut Vec<(usize, usize)>) {
        out.clear();
        let spans = &mut self.rows[row];
        spans.sort_unstable();
        for &(a, b) in spans.iter() {
            match out.last_mut() {
                Some(last) if a <= last.1 => last.1 = last.1.max(b),
                _ => out.push((a, b)),
            }
        }
    }

    /// The merged spans of `row`, sorted, as `[from, to)` cell ranges.
    pub fn merged(&mut self, row: usize) -> Vec<(usize, usize)> {
        let mut out = Vec::with_capacity(self.rows[row].len());
        self.merged_into(row, &mut out);
        out
    }
}

/// Calls `emit(row, from, to)` for each span `[from, to)` of cells of `grid` whose centres lie in
/// `polygon`.
pub fn polygon_row_spans(grid: &Grid, polygon: &Polygon<f64>, emit: impl FnMut(usize, usize, usize)) {
    row_spans(grid, polygon, &mut Vec::new(), emit);
}

fn row_spans(grid: &Grid, polygon: &Polygon<f64>, xs: &mut Vec<f64>, mut emit: impl FnMut(usize, usize, usize)) {
    let Some(r) = geo::BoundingRect::bounding_rect(polygon) else { return };
    let c = grid.cell_m;
    // Lattice indices (from the grid's origin) of this grid's first row and column.
    let (row0, col0) = (grid.row0 as f64, grid.col0 as f64);
    let (x_lo, x_hi) = (grid.origin.x + col0 * c, grid.origin.x + (col0 + grid.cols as f64) * c);
    if r.max().x < x_lo || r.min().x > x_hi {
        return;
    }
    // Rows whose centre line y = origin + (row0 + row + ½)·c lies within the polygon's y range.
    let first = ((r.min().y - grid.origin.y) / c - 0.5).ceil() - row0;
    let last = ((r.max().y - grid.origin.y) / c - 0.5).floor() - row0;
    let (first, last) = (first.max(0.0), last.min(grid.rows as f64 - 1.0));
    if first > last {
        return;
    }
    let rings = || std::iter::once(polygon.exterior()).chain(polygon.interiors());
    for row in first as usize..=last as usize {
        let y = grid.origin.y + ((grid.row0 + row) as f64 + 0.5) * c;
        xs.clear();
        for e in rings().flat_map(|ring| ring.lines()) {
            let (a, b) = (e.start, e.end);
            // Half-open rule: an edge counts when its ends straddle y with the lower end included.
            if (a.y <= y) != (b.y <= y) {
                xs.push(a.x + (y - a.y) / (b.y - a.y) * (b.x - a.x));
            }
        }
        xs.sort_unstable_by(f64::total_cmp);
        for pair in xs.chunks_exact(2) {
            // Cells with centre x in [x0, x1): lattice index i with origin + (i + ½)·c ≥ x0 and < x1.
            let from = (((pair[0] - grid.origin.x) / c - 0.5).ceil() - col0).max(0.0);
            let to = (((pair[1] - grid.origin.x) / c - 0.5).ceil() - col0).min(grid.cols as f64);
            if to > from {
                emit(row, from as usize, to as usize);
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use geo::{Area, Contains, Euclidean, Length, LineString, Point};

    fn square(x0: f64, y0: f64, s: f64) -> Polygon<f64> {
        Polygon::new(LineString::from(vec![(x0, y0), (x0 + s, y0), (x0 + s, y0 + s), (x0, y0 + s), (x0, y0)]), vec![])
    }

    #[test]
    fn raster_matches_point_in_polygon_at_every_centre() {
        let site = square(0.0, 0.0, 50.0);
        let g = Grid::over_polygon(&site, 0.5, DEFAULT_MAX_CELLS).unwrap();
        let outer =
            LineString::from(vec![(3.3, 4.1), (40.2, 7.7), (45.9, 44.4), (20.0, 30.0), (5.0, 41.0), (3.3, 4.1)]);
        let hole = LineString::from(vec![(15.0, 15.0), (25.0, 15.0), (25.0, 22.0), (15.0, 22.0), (15.0, 15.0)]);
        let p = Polygon::new(outer, vec![hole]);
        let mut spans = RowSpans::new(&g);
        spans.add_polygon(&g, &p);
        let mut count = 0;
        for row in 0..g.rows {
            let mut covered = vec![false; g.cols];
            for (a, b) in spans.merged(row) {
                covered[a..b].fill(true);
            }
            for (col, &c) in covered.iter().enumerate() {
                let centre = g.centre(col, row);
                assert_eq!(c, p.contains(&Point::from(centre)), "cell {col},{row} at {centre:?}");
                count += usize::from(c);
            }
        }
        // Area by counting cells agrees with the polygon's area within one cell per metre of boundary.
        let perimeter: f64 = std::iter::once(p.exterior()).chain(p.interiors()).map(|r| Euclidean.length(r)).sum();
        let raster = count as f64 * 0.25;
        assert!((raster - p.unsigned_area()).abs() <= 0.5 * perimeter, "{raster} vs {}", p.unsigned_area());
    }
}

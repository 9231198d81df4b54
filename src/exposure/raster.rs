//! Exact scanline rasterising at cell centres.
//!
//! For each grid row the horizontal line through the cell centres is cut with every polygon edge; the
//! crossings, paired even-odd, give the spans of the line inside the polygon (holes included), and each
//! span covers the cells whose centre x lies in it (a centre exactly on the left end counts, one on the
//! right end does not). Spans of many polygons are merged per row, so the cost grows with the rows and
//! edges the polygons cross, not with the area they cover.

use geo::Polygon;

use super::grid::Grid;

/// Per-row spans of cell indices, `[from, to)`, collected from many polygons and merged per row.
#[derive(Debug, Clone, Default)]
pub struct RowSpans {
    /// Spans packed as `from << 32 | to` (a grid's columns fit in 32 bits, it has at most a few
    /// million cells): sorting the packed integers orders by `from` then `to`, with one comparison.
    rows: Vec<Vec<u64>>,
    scratch: Crossings,
}

impl RowSpans {
    /// Empty spans for the rows of `grid`.
    pub fn new(grid: &Grid) -> Self {
        RowSpans { rows: vec![Vec::new(); grid.rows], scratch: Crossings::default() }
    }

    /// Removes all spans, keeping the storage.
    pub fn clear(&mut self) {
        self.rows.iter_mut().for_each(Vec::clear);
    }

    /// Adds the cells of `grid` whose centres lie in `polygon`.
    pub fn add_polygon(&mut self, grid: &Grid, polygon: &Polygon<f64>) {
        let rows = &mut self.rows;
        row_spans(grid, polygon, &mut self.scratch, |row, a, b| rows[row].push((a as u64) << 32 | b as u64));
    }

    /// The merged spans of `row`, sorted, as `[from, to)` cell ranges, into `out` (cleared first).
    pub fn merged_into(&mut self, row: usize, out: &mut Vec<(usize, usize)>) {
        out.clear();
        let spans = &mut self.rows[row];
        spans.sort_unstable();
        for &packed in spans.iter() {
            let (a, b) = ((packed >> 32) as usize, (packed & u64::from(u32::MAX)) as usize);
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
    row_spans(grid, polygon, &mut Crossings::default(), emit);
}

/// The ceiling of `x` for |x| < 2⁶³, without a branch or a library call (`f64::ceil` is a call on
/// baseline x86-64, and this runs for every span).
#[inline(always)]
fn small_ceil(x: f64) -> i64 {
    let t = x as i64;
    t + i64::from((t as f64) < x)
}

/// Scratch for [`row_spans`]: each row's edge crossings. The first two of a row are kept in flat
/// arrays (a convex polygon has exactly two per row, and shadows of extruded footprints mostly are
/// convex); more go to a per-row overflow list.
#[derive(Debug, Clone, Default)]
pub(crate) struct Crossings {
    count: Vec<u32>,
    first: Vec<[f64; 2]>,
    more: Vec<Vec<f64>>,
}

impl Crossings {
    fn reset(&mut self, n: usize) {
        if self.count.len() < n {
            self.count.resize(n, 0);
            self.first.resize(n, [0.0; 2]);
            self.more.resize(n, Vec::new());
        }
        self.count[..n].fill(0);
    }

    #[inline(always)]
    fn push(&mut self, k: usize, x: f64) {
        let c = self.count[k] as usize;
        if c < 2 {
            self.first[k][c] = x;
        } else {
            if c == 2 {
                self.more[k].clear();
                self.more[k].extend_from_slice(&self.first[k]);
            }
            self.more[k].push(x);
        }
        self.count[k] += 1;
    }
}

/// A grid's columns on its lattice, for cutting a row's crossings into cell spans.
struct Lattice {
    origin_x: f64,
    inv_c: f64,
    /// Lattice columns just outside the grid on either side: crossings are clamped to them first,
    /// so the fast ceiling only sees small numbers.
    lo: f64,
    hi: f64,
    col0: i64,
    cols: i64,
}

impl Lattice {
    /// The cells `[from, to)` of the grid whose centre x lies in `[x0, x1)`: lattice index i with
    /// origin + (i + ½)·c ≥ x0 and < x1. The lattice index is found before the grid's first column
    /// is taken off, so a tile's cells are decided by the same arithmetic as the whole grid's.
    /// Inlined always: it runs for every span, and the wasm build optimises for size.
    #[inline(always)]
    fn cells(&self, x0: f64, x1: f64) -> Option<(usize, usize)> {
        let within = |u: f64| {
            if u < self.lo {
                self.lo
            } else if u > self.hi {
                self.hi
            } else {
                u
            }
        };
        let u0 = within((x0 - self.origin_x) * self.inv_c - 0.5);
        let u1 = within((x1 - self.origin_x) * self.inv_c - 0.5);
        let (from, to) = (small_ceil(u0) - self.col0, small_ceil(u1) - self.col0);
        let (from, to) = (from.max(0), to.min(self.cols));
        (to > from).then_some((from as usize, to as usize))
    }
}

fn row_spans(grid: &Grid, polygon: &Polygon<f64>, xs: &mut Crossings, mut emit: impl FnMut(usize, usize, usize)) {
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
    let (first, last) = (first as usize, last as usize);
    let n = last - first + 1;
    xs.reset(n);
    // Edge by edge, the rows it crosses: half-open rule, an edge counts for the centre line y when its
    // ends straddle y with the lower end included.
    let row_y = |row: usize| grid.origin.y + ((grid.row0 + row) as f64 + 0.5) * c;
    for ring in std::iter::once(polygon.exterior()).chain(polygon.interiors()) {
        for e in ring.lines() {
            let (a, b) = if e.start.y <= e.end.y { (e.start, e.end) } else { (e.end, e.start) };
            if a.y == b.y {
                continue;
            }
            // Rows with a.y ≤ y < b.y.
            let lo = (((a.y - grid.origin.y) / c - 0.5).ceil() - row0).max(first as f64);
            let hi = (((b.y - grid.origin.y) / c - 0.5).ceil() - row0 - 1.0).min(last as f64);
            if lo > hi {
                continue;
            }
            let slope = (b.x - a.x) / (b.y - a.y);
            let (lo, hi) = (lo as usize, hi as usize);
            for row in lo..hi + 1 {
                let y = row_y(row);
                // Guard the rounding of the row range's ends against the exact rule.
                if (row == lo || row == hi) && !(a.y <= y && y < b.y) {
                    continue;
                }
                xs.push(row - first, a.x + (y - a.y) * slope);
            }
        }
    }
    let lattice = Lattice {
        origin_x: grid.origin.x,
        inv_c: 1.0 / c,
        lo: grid.col0 as f64 - 1.0,
        hi: (grid.col0 + grid.cols) as f64 + 1.0,
        col0: grid.col0 as i64,
        cols: grid.cols as i64,
    };
    // One call of `emit` (the wasm build, optimised for size, inlines a closure used once).
    let mut two: [f64; 2];
    for k in 0..n {
        let row_xs: &[f64] = match xs.count[k] {
            0 | 1 => continue,
            2 => {
                let [a, b] = xs.first[k];
                two = if a <= b { [a, b] } else { [b, a] };
                &two
            }
            _ => {
                let more = &mut xs.more[k];
                more.sort_unstable_by(f64::total_cmp);
                more
            }
        };
        for pair in row_xs.chunks_exact(2) {
            if let Some((from, to)) = lattice.cells(pair[0], pair[1]) {
                emit(first + k, from, to);
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

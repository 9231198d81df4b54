//! An analysis grid: square cells sampled at their centres over an area.

use geo::{BoundingRect, Coord, MultiPolygon, Polygon};

use super::raster::RowSpans;

/// The most cells a grid may have unless the caller allows more.
pub const DEFAULT_MAX_CELLS: usize = 4_000_000;

/// Problems with an exposure request; checked before any work starts.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ExposureError {
    /// A cell size under 1 cm or not a number.
    #[error("cell_m must be at least 0.01 m, got {0}")]
    CellSize(f64),
    /// Too many cells.
    #[error("the grid would have {cells} cells, more than the limit of {limit}; use larger cells")]
    TooManyCells { cells: usize, limit: usize },
    /// An area with no extent.
    #[error("the area has no extent to put a grid on")]
    EmptyArea,
    /// An empty or inverted daily window, a bad step, or a bad date range.
    #[error("{0}")]
    Period(String),
    /// A request larger than its budget ([`crate::limits`]).
    #[error("{0}")]
    Budget(#[from] crate::limits::OverBudget),
    /// The solar engine refused an instant.
    #[error("{0}")]
    Time(#[from] crate::solar::InputError),
    /// The caller's progress callback asked to stop.
    #[error("cancelled")]
    Cancelled,
}

/// Square cells over the bounding box of an area; cells whose centre is outside the area are marked.
///
/// Cells lie on a lattice anchored at `origin`; a grid covers the lattice's columns `col0..col0 + cols`
/// and rows `row0..row0 + rows` (a whole grid has both at 0, a tile of it does not), so the centre of
/// a cell is computed the same way in a tile as in the whole grid.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    /// Lower-left corner of the lattice's cell (0, 0), plan metres.
    pub origin: Coord<f64>,
    /// First lattice column of this grid.
    pub col0: usize,
    /// First lattice row of this grid.
    pub row0: usize,
    /// Cell side, metres.
    pub cell_m: f64,
    /// Cells per row (x).
    pub cols: usize,
    /// Rows (y), row 0 at the bottom.
    pub rows: usize,
    /// Whether each cell's centre lies in the area, row-major.
    pub inside: Vec<bool>,
}

impl Grid {
    /// A grid of `cell_m` cells over `area` (its bounding box), at most `max_cells` cells (and never
    /// more than [`crate::limits::MAX_GRID_CELLS`]); a cell is inside when its centre is in the area.
    ///
    /// The lattice is anchored at the plan origin (cell corners at whole multiples of `cell_m`), so two
    /// grids of one cell size over different areas sample the same points.
    ///
    /// # Errors
    /// [`ExposureError`] for a cell under 1 cm, too many cells or an empty area.
    pub fn over(area: &MultiPolygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        let mut g = Grid::lattice(area, cell_m, max_cells)?;
        let mut spans = RowSpans::new(&g);
        for p in &area.0 {
            spans.add_polygon(&g, p);
        }
        for row in 0..g.rows {
            for (a, b) in spans.merged(row) {
                g.inside[row * g.cols + a..row * g.cols + b].fill(true);
            }
        }
        Ok(g)
    }

    /// As [`Grid::over`], but a cell is inside when any of its area (more than
    /// [`super::cover::MIN_COVER`] of it) lies in the area: the grid for figures over an area, whose
    /// cells are weighted by [`Grid::cover_of`].
    ///
    /// # Errors
    /// As [`Grid::over`].
    pub fn covering(area: &MultiPolygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        let mut g = Grid::lattice(area, cell_m, max_cells)?;
        for p in &area.0 {
            let cover = super::cover::cell_cover(&g, p);
            for (inside, share) in g.inside.iter_mut().zip(cover) {
                *inside |= share > 0.0;
            }
        }
        Ok(g)
    }

    fn lattice(area: &MultiPolygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        if !(cell_m.is_finite() && cell_m >= 0.01) {
            return Err(ExposureError::CellSize(cell_m));
        }
        let r = area.bounding_rect().ok_or(ExposureError::EmptyArea)?;
        if !(r.width() > 0.0 && r.height() > 0.0) {
            return Err(ExposureError::EmptyArea);
        }
        let origin = Coord { x: (r.min().x / cell_m).floor() * cell_m, y: (r.min().y / cell_m).floor() * cell_m };
        let cols = ((r.max().x - origin.x) / cell_m).ceil().max(1.0);
        let rows = ((r.max().y - origin.y) / cell_m).ceil().max(1.0);
        let cells = cols * rows;
        let max_cells = max_cells.min(crate::limits::MAX_GRID_CELLS);
        if cells > max_cells as f64 {
            return Err(ExposureError::TooManyCells { cells: cells.min(usize::MAX as f64) as usize, limit: max_cells });
        }
        let (cols, rows) = (cols as usize, rows as usize);
        Ok(Grid { origin, col0: 0, row0: 0, cell_m, cols, rows, inside: vec![false; cols * rows] })
    }

    /// A grid over one polygon.
    pub fn over_polygon(area: &Polygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        Grid::over(&MultiPolygon::new(vec![area.clone()]), cell_m, max_cells)
    }

    /// The centre of cell (`col`, `row`) of this grid, plan metres.
    pub fn centre(&self, col: usize, row: usize) -> Coord<f64> {
        Coord {
            x: self.origin.x + ((self.col0 + col) as f64 + 0.5) * self.cell_m,
            y: self.origin.y + ((self.row0 + row) as f64 + 0.5) * self.cell_m,
        }
    }

    /// The plan rectangle the grid's cells cover, metres.
    pub fn bounds(&self) -> geo::Rect<f64> {
        let c = self.cell_m;
        let lo = Coord { x: self.origin.x + self.col0 as f64 * c, y: self.origin.y + self.row0 as f64 * c };
        geo::Rect::new(lo, Coord { x: lo.x + self.cols as f64 * c, y: lo.y + self.rows as f64 * c })
    }

    /// Cuts the grid into tiles of at most `tile_cols` × `tile_rows` cells, row by row from the
    /// bottom left; each tile keeps the lattice, so its cells are exactly the whole grid's.
    pub fn tiles(&self, tile_cols: usize, tile_rows: usize) -> Vec<Grid> {
        let (tc, tr) = (tile_cols.max(1), tile_rows.max(1));
        let mut out = Vec::new();
        for r0 in (0..self.rows).step_by(tr) {
            for c0 in (0..self.cols).step_by(tc) {
                let (cols, rows) = (tc.min(self.cols - c0), tr.min(self.rows - r0));
                let mut inside = Vec::with_capacity(cols * rows);
                for row in r0..r0 + rows {
                    inside.extend_from_slice(&self.inside[row * self.cols + c0..row * self.cols + c0 + cols]);
                }
                out.push(Grid {
                    origin: self.origin,
                    col0: self.col0 + c0,
                    row0: self.row0 + r0,
                    cell_m: self.cell_m,
                    cols,
                    rows,
                    inside,
                });
            }
        }
        out
    }

    /// Band `index` of `of` bands of whole rows, bottom first: rows `rows·index/of` up to
    /// `rows·(index+1)/of` (a band may have no rows when the grid has fewer rows than bands). Like a
    /// tile it keeps the lattice, so its cells are exactly the whole grid's; the page's map workers
    /// each compute one band.
    pub fn row_band(&self, index: usize, of: usize) -> Grid {
        let of = of.max(1);
        let index = index.min(of - 1);
        let (from, to) = (self.rows * index / of, self.rows * (index + 1) / of);
        Grid {
            origin: self.origin,
            col0: self.col0,
            row0: self.row0 + from,
            cell_m: self.cell_m,
            cols: self.cols,
            rows: to - from,
            inside: self.inside[from * self.cols..to * self.cols].to_vec(),
        }
    }

    /// Copies the values of a tile's cells into `whole` (row-major over this grid).
    pub fn stitch<T: Clone>(&self, tile: &Grid, values: &[T], whole: &mut [T]) {
        for row in 0..tile.rows {
            let at = (tile.row0 - self.row0 + row) * self.cols + (tile.col0 - self.col0);
            whole[at..at + tile.cols].clone_from_slice(&values[row * tile.cols..(row + 1) * tile.cols]);
        }
    }

    /// The share (0–1) of each cell, row-major, that lies in `polygon`, exactly (see
    /// [`super::cover`]); the weights of an area's figures.
    pub fn cover_of(&self, polygon: &Polygon<f64>) -> Vec<f64> {
        super::cover::cell_cover(self, polygon)
    }

    /// Number of cells inside the area.
    pub fn inside_count(&self) -> usize {
        self.inside.iter().filter(|&&b| b).count()
    }
}

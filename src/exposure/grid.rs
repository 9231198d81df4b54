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
    /// The solar engine refused an instant.
    #[error("{0}")]
    Time(#[from] crate::solar::InputError),
}

/// Square cells over the bounding box of an area; cells whose centre is outside the area are marked.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    /// Lower-left corner of cell (0, 0), plan metres.
    pub origin: Coord<f64>,
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
    /// A grid of `cell_m` cells over `area` (its bounding box), at most `max_cells` cells.
    ///
    /// # Errors
    /// [`ExposureError`] for a cell under 1 cm, too many cells or an empty area.
    pub fn over(area: &MultiPolygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        if !(cell_m.is_finite() && cell_m >= 0.01) {
            return Err(ExposureError::CellSize(cell_m));
        }
        let r = area.bounding_rect().ok_or(ExposureError::EmptyArea)?;
        if !(r.width() > 0.0 && r.height() > 0.0) {
            return Err(ExposureError::EmptyArea);
        }
        let cols = (r.width() / cell_m).ceil().max(1.0);
        let rows = (r.height() / cell_m).ceil().max(1.0);
        let cells = cols * rows;
        if cells > max_cells as f64 {
            return Err(ExposureError::TooManyCells { cells: cells.min(usize::MAX as f64) as usize, limit: max_cells });
        }
        let (cols, rows) = (cols as usize, rows as usize);
        let mut g = Grid { origin: r.min(), cell_m, cols, rows, inside: vec![false; cols * rows] };
        let mut spans = RowSpans::new(&g);
        for p in &area.0 {
            spans.add_polygon(&g, p);
        }
        for row in 0..rows {
            for (a, b) in spans.merged(row) {
                g.inside[row * cols + a..row * cols + b].fill(true);
            }
        }
        Ok(g)
    }

    /// A grid over one polygon.
    pub fn over_polygon(area: &Polygon<f64>, cell_m: f64, max_cells: usize) -> Result<Self, ExposureError> {
        Grid::over(&MultiPolygon::new(vec![area.clone()]), cell_m, max_cells)
    }

    /// The centre of cell (`col`, `row`), plan metres.
    pub fn centre(&self, col: usize, row: usize) -> Coord<f64> {
        Coord {
            x: self.origin.x + (col as f64 + 0.5) * self.cell_m,
            y: self.origin.y + (row as f64 + 0.5) * self.cell_m,
        }
    }

    /// Number of cells inside the area.
    pub fn inside_count(&self) -> usize {
        self.inside.iter().filter(|&&b| b).count()
    }
}

//! A map tile as a binary file of 32-bit floats, and the stitching of such files into one map.
//!
//! The format is our own, little-endian, a 48-byte header then the cells:
//!
//! ```text
//! bytes 0–7    "SUNLOTF1"
//! 8–15         lattice origin x, plan metres (f64)      16–23  origin y (f64)
//! 24–31        cell side, metres (f64)
//! 32–35        first lattice column (u32)               36–39  first lattice row (u32)
//! 40–43        columns (u32)                            44–47  rows (u32)
//! 48…          columns × rows f32 values, row by row from the bottom (south in plan) row, west to
//!              east; NaN for a cell outside the mapped area
//! ```
//!
//! numpy reads one as `np.fromfile(path, dtype="<f4", offset=48).reshape(rows, cols)`. Tiles of one
//! lattice (see [`super::Grid::tiles`]) stitch into the map computed whole bit for bit.

use super::cell_values::CellValues;
use super::grid::Grid;

/// The first eight bytes of a tile file.
pub const TILE_MAGIC: &[u8; 8] = b"SUNLOTF1";
/// Header bytes before the cells.
pub const TILE_HEADER_BYTES: usize = 48;

/// A tile read back: where its cells sit on the lattice, and their values.
#[derive(Debug, Clone, PartialEq)]
pub struct TileValues {
    /// Lattice origin, plan metres.
    pub origin_m: (f64, f64),
    /// Cell side, metres.
    pub cell_m: f64,
    /// First lattice column and row.
    pub col0: usize,
    pub row0: usize,
    /// Columns and rows.
    pub cols: usize,
    pub rows: usize,
    /// Values, row-major from the bottom row; NaN outside the area.
    pub values: Vec<f32>,
}

/// What is wrong with a tile file or a set of tiles; each names the tile (its label, e.g. the file).
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum TileFileError {
    /// Not a tile file, or cut short.
    #[error("{tile}: not a sunlot tile file ({why})")]
    Format { tile: String, why: String },
    /// A tile on another lattice (origin or cell size) than the first one given.
    #[error("{tile}: on another lattice than {first} (origin or cell size differs); tiles must come from one plan")]
    OtherLattice { tile: String, first: String },
    /// Two tiles give different values for one cell.
    #[error("{tile} and {other} disagree at lattice cell ({col}, {row}): {a} against {b}")]
    Disagree { tile: String, other: String, col: usize, row: usize, a: f32, b: f32 },
    /// The tiles leave cells of their bounding rectangle uncovered.
    #[error("the tiles leave {missing} cells of columns {col0}–{col1}, rows {row0}–{row1} uncovered, first at lattice cell ({col}, {row}); is a tile missing?")]
    Gap { missing: usize, col0: usize, col1: usize, row0: usize, row1: usize, col: usize, row: usize },
    /// No tiles.
    #[error("no tiles given")]
    Empty,
}

/// The tile file of `values` (one per cell of `grid`, `None` outside).
pub fn tile_bytes(grid: &Grid, values: &CellValues) -> Vec<u8> {
    let mut out = Vec::with_capacity(TILE_HEADER_BYTES + 4 * values.len());
    out.extend_from_slice(TILE_MAGIC);
    for v in [grid.origin.x, grid.origin.y, grid.cell_m] {
        out.extend_from_slice(&v.to_le_bytes());
    }
    for v in [grid.col0, grid.row0, grid.cols, grid.rows] {
        out.extend_from_slice(&u32::try_from(v).unwrap_or(u32::MAX).to_le_bytes());
    }
    for &v in values.as_nan_coded() {
        out.extend_from_slice(&(v as f32).to_le_bytes());
    }
    out
}

/// Reads a tile file; `tile` labels it in errors.
///
/// # Errors
/// [`TileFileError::Format`] when the bytes are not a whole tile file.
pub fn read_tile(tile: &str, bytes: &[u8]) -> Result<TileValues, TileFileError> {
    let bad = |why: String| TileFileError::Format { tile: tile.to_string(), why };
    if bytes.len() < TILE_HEADER_BYTES || &bytes[..8] != TILE_MAGIC {
        return Err(bad("it does not start with SUNLOTF1 and a 48-byte header".into()));
    }
    let f = |at: usize| f64::from_le_bytes(bytes[at..at + 8].try_into().expect("8 bytes"));
    let u = |at: usize| u32::from_le_bytes(bytes[at..at + 4].try_into().expect("4 bytes")) as usize;
    let (cols, rows) = (u(40), u(44));
    let cells = cols.checked_mul(rows).ok_or_else(|| bad(format!("{cols} × {rows} cells")))?;
    if bytes.len() - TILE_HEADER_BYTES != cells.saturating_mul(4) {
        return Err(bad(format!(
            "{cols} × {rows} cells need {} bytes after the header, it has {}",
            4 * cells,
            bytes.len() - 48
        )));
    }
    let cell_m = f(24);
    if !(cell_m.is_finite() && cell_m > 0.0 && f(8).is_finite() && f(16).is_finite()) {
        return Err(bad("its origin or cell size is not a finite number".into()));
    }
    let values =
        bytes[TILE_HEADER_BYTES..].chunks_exact(4).map(|c| f32::from_le_bytes([c[0], c[1], c[2], c[3]])).collect();
    Ok(TileValues { origin_m: (f(8), f(16)), cell_m, col0: u(32), row0: u(36), cols, rows, values })
}

/// Stitches tiles (label, values) of one lattice into the map over their bounding rectangle. Cells
/// two tiles share must agree bit for bit, and every cell of the rectangle must be covered.
///
/// # Errors
/// [`TileFileError`] for tiles of other lattices, disagreeing overlaps or uncovered cells.
pub fn stitch_tiles(tiles: &[(String, TileValues)]) -> Result<TileValues, TileFileError> {
    let (first_label, first) = tiles.first().ok_or(TileFileError::Empty)?;
    let col0 = tiles.iter().map(|t| t.1.col0).min().unwrap_or(0);
    let row0 = tiles.iter().map(|t| t.1.row0).min().unwrap_or(0);
    let col1 = tiles.iter().map(|t| t.1.col0 + t.1.cols).max().unwrap_or(0);
    let row1 = tiles.iter().map(|t| t.1.row0 + t.1.rows).max().unwrap_or(0);
    let (cols, rows) = (col1 - col0, row1 - row0);
    let mut values = vec![f32::NAN; cols * rows];
    let mut owner: Vec<Option<usize>> = vec![None; cols * rows];
    for (k, (label, t)) in tiles.iter().enumerate() {
        if t.origin_m != first.origin_m || t.cell_m != first.cell_m {
            return Err(TileFileError::OtherLattice { tile: label.clone(), first: first_label.clone() });
        }
        for r in 0..t.rows {
            for c in 0..t.cols {
                let at = (t.row0 + r - row0) * cols + (t.col0 + c - col0);
                let v = t.values[r * t.cols + c];
                if let Some(o) = owner[at] {
                    if values[at].to_bits() != v.to_bits() {
                        return Err(TileFileError::Disagree {
                            tile: label.clone(),
                            other: tiles[o].0.clone(),
                            col: t.col0 + c,
                            row: t.row0 + r,
                            a: v,
                            b: values[at],
                        });
                    }
                }
                values[at] = v;
                owner[at] = Some(k);
            }
        }
    }
    let missing = owner.iter().filter(|o| o.is_none()).count();
    if let Some(i) = owner.iter().position(Option::is_none) {
        let (col, row) = (col0 + i % cols, row0 + i / cols);
        return Err(TileFileError::Gap { missing, col0, col1: col1 - 1, row0, row1: row1 - 1, col, row });
    }
    Ok(TileValues { origin_m: first.origin_m, cell_m: first.cell_m, col0, row0, cols, rows, values })
}

impl TileValues {
    /// This map as a tile file.
    pub fn bytes(&self) -> Vec<u8> {
        let grid = Grid {
            origin: geo::Coord { x: self.origin_m.0, y: self.origin_m.1 },
            col0: self.col0,
            row0: self.row0,
            cell_m: self.cell_m,
            cols: self.cols,
            rows: self.rows,
            inside: Vec::new(),
        };
        let values = CellValues::from_nan_coded(self.values.iter().map(|&v| f64::from(v)).collect());
        tile_bytes(&grid, &values)
    }

    /// The plan centre of cell (`col`, `row`) of this map, metres.
    pub fn centre_m(&self, col: usize, row: usize) -> (f64, f64) {
        let c = self.cell_m;
        (self.origin_m.0 + ((self.col0 + col) as f64 + 0.5) * c, self.origin_m.1 + ((self.row0 + row) as f64 + 0.5) * c)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use geo::{polygon, MultiPolygon};

    fn grid() -> Grid {
        let area = polygon![(x: 0.0, y: 0.0), (x: 10.0, y: 0.0), (x: 10.0, y: 6.0), (x: 0.0, y: 6.0)];
        Grid::over(&MultiPolygon::new(vec![area]), 1.0, 1000).unwrap()
    }

    fn values(g: &Grid) -> CellValues {
        (0..g.cols * g.rows).map(|i| (i % 7 != 3).then_some(i as f64 * 0.25)).collect()
    }

    #[test]
    fn tiles_stitch_back_to_the_whole_map_bit_for_bit() {
        let g = grid();
        let whole = read_tile("whole", &tile_bytes(&g, &values(&g))).unwrap();
        let tiles: Vec<(String, TileValues)> = g
            .tiles(4, 4)
            .iter()
            .enumerate()
            .map(|(k, t)| {
                let (mut v, all) = (vec![None; t.cols * t.rows], values(&g));
                for r in 0..t.rows {
                    for c in 0..t.cols {
                        v[r * t.cols + c] = all.get((t.row0 + r) * g.cols + t.col0 + c);
                    }
                }
                (format!("tile {k}"), read_tile("t", &tile_bytes(t, &v.into())).unwrap())
            })
            .collect();
        let stitched = stitch_tiles(&tiles).unwrap();
        assert_eq!(stitched.bytes(), whole.bytes());
        assert_eq!(stitched.centre_m(0, 0), (0.5, 0.5));
        // A tile left out is named as a gap; a tile that disagrees is named with its neighbour.
        let e = stitch_tiles(&tiles[1..]).unwrap_err();
        assert!(matches!(e, TileFileError::Gap { missing: 16, .. }), "{e}");
        let mut wrong = tiles.clone();
        wrong.push(("again".into(), TileValues { values: vec![9.0; 16], ..tiles[0].1.clone() }));
        assert!(matches!(stitch_tiles(&wrong), Err(TileFileError::Disagree { .. })));
    }

    #[test]
    fn a_file_that_is_not_a_tile_is_refused_by_name() {
        let e = read_tile("a.f32", b"SUNLOTF1 short").unwrap_err();
        assert!(e.to_string().starts_with("a.f32: not a sunlot tile file"), "{e}");
        let mut b = tile_bytes(&grid(), &values(&grid()));
        b.pop();
        assert!(read_tile("b.f32", &b).unwrap_err().to_string().contains("need 240 bytes"));
    }
}

//! `sunlot tiles` and `sunlot stitch`: a sun-hours map too large for one process, cut into tiles that
//! separate processes (or machines) compute, each with the massing within the period's shadow halo,
//! and stitched back into the map computed whole, bit for bit.

use std::path::PathBuf;

use clap::Args;
use geo::{polygon, BoundingRect, MultiPolygon};
use sunlot::exposure::{
    massing_near, read_tile, shadow_halo, stitch_tiles, sun_hours, tile_bytes, Grid, Halo, SunHoursRequest, TileValues,
    DEFAULT_CELL_M,
};
use sunlot::site::SiteModel;

use crate::args::DeltaTArgs;
use crate::maps::{self, PeriodArgs};
use crate::output::{Cell, Format, Table};
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct TilesArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub period: PeriodArgs,
    /// Cell size, metres (at least 0.01).
    #[arg(long, default_value_t = DEFAULT_CELL_M)]
    pub cell_m: f64,
    /// Height of the receiving plane above the ground, metres.
    #[arg(long, default_value_t = 0.0)]
    pub plane_m: f64,
    /// The map's extent in plan metres, X0,Y0,X1,Y1 (default: the bounding box of the site's areas).
    #[arg(long, value_name = "X0,Y0,X1,Y1", value_delimiter = ',', allow_hyphen_values = true)]
    pub bbox: Vec<f64>,
    /// Cells along a tile's side.
    #[arg(long, default_value_t = 256)]
    pub tile_cells: usize,
    /// Map the existing massing alone (before the proposal).
    #[arg(long)]
    pub existing_only: bool,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Compute this tile (numbered from 0 as the plan lists them) and write it to --out.
    #[arg(long, conflicts_with = "whole", requires = "out")]
    pub index: Option<usize>,
    /// Compute the whole extent in this one process and write it to --out (the single run the
    /// stitched tiles equal).
    #[arg(long, requires = "out")]
    pub whole: bool,
    /// The tile file to write: a 48-byte header and 32-bit floats (see README, "City scale").
    #[arg(long, value_name = "FILE")]
    pub out: Option<PathBuf>,
    /// Output on standard output: the plan (one row a tile) or the tile written.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

#[derive(Debug, Args)]
pub struct StitchArgs {
    /// The tile files (from `sunlot tiles --index`), in any order.
    #[arg(required = true, value_name = "TILE")]
    pub tiles: Vec<PathBuf>,
    /// The stitched map, in the same format.
    #[arg(long, value_name = "FILE")]
    pub out: PathBuf,
    /// Also write every cell as CSV (x_m, y_m, sun_hours; cells outside the areas left out).
    #[arg(long = "cells-csv", value_name = "FILE")]
    pub csv: Option<PathBuf>,
}

/// The whole extent's grid: every cell whose centre lies in the box (the lattice anchored at the plan
/// origin, as every grid of one cell size; see [`Grid::over`]).
fn extent_grid(a: &TilesArgs, model: &SiteModel) -> Result<Grid, String> {
    let r = match a.bbox.as_slice() {
        [] => {
            let areas = maps::pick_areas(model, &[], "--bbox")?;
            let all = MultiPolygon::new(areas.iter().map(|a| a.polygon.clone()).collect());
            all.bounding_rect().ok_or("the site's areas have no extent; give --bbox")?
        }
        &[x0, y0, x1, y1] if [x0, y0, x1, y1].iter().all(|v| v.is_finite()) && x1 > x0 && y1 > y0 => {
            geo::Rect::new((x0, y0), (x1, y1))
        }
        v => return Err(format!("--bbox takes X0,Y0,X1,Y1 with X1 > X0 and Y1 > Y0, got {v:?}")),
    };
    let (lo, hi) = (r.min(), r.max());
    let area = polygon![(x: lo.x, y: lo.y), (x: hi.x, y: lo.y), (x: hi.x, y: hi.y), (x: lo.x, y: hi.y)];
    Grid::over(&MultiPolygon::new(vec![area]), a.cell_m, sunlot::limits::MAX_GRID_CELLS)
        .map_err(|e| format!("--cell-m: {e}"))
}

/// The halo in words, for the plan's notes and a tile's report.
fn halo_note(h: &Halo) -> String {
    match h.lowest_altitude_deg {
        None => "No step of the period has the sun up: no shadows, no halo.".into(),
        Some(alt) => format!(
            "Halo {:.1} m: the tallest massing ({:.1} m above the plane) times the longest shadow per metre of the period's steps ({:.2} m, the sun at {:.2}° at its lowest). Every tile is computed with the volumes and walls within that distance; a daily window keeping the sun higher (--window) shrinks it.",
            h.halo_m, h.tallest_m, h.per_m, alt
        ),
    }
}

pub fn run_tiles(a: &TilesArgs) -> Result<String, String> {
    if a.tile_cells == 0 {
        return Err("--tile-cells must be 1 or more".into());
    }
    let loaded = a.site.load()?;
    let model = &loaded.model;
    let whole = extent_grid(a, model)?;
    let period = a.period.period()?;
    let delta_t = a.delta_t.delta_t()?;
    let halo = shadow_halo(model, &period, a.plane_m, delta_t).map_err(|e| e.to_string())?;
    let tiles = whole.tiles(a.tile_cells, a.tile_cells);
    let (grid, label) = match (a.index, a.whole) {
        (Some(i), _) => {
            let t = tiles.get(i).ok_or_else(|| format!("--index {i}: the plan has tiles 0 to {}", tiles.len() - 1))?;
            (t.clone(), format!("tile {i} of {}", tiles.len()))
        }
        (None, true) => (whole.clone(), "the whole extent".to_string()),
        (None, false) => return Ok(plan(a, model, &whole, &tiles, &halo)),
    };
    let near = if a.whole { model.clone() } else { massing_near(model, &grid, halo.halo_m) };
    let req = SunHoursRequest {
        model: &near,
        grid: &grid,
        period,
        plane_m: a.plane_m,
        delta_t,
        massing: maps::massing(a.existing_only),
    };
    let map = sun_hours(&req, |_| true).map_err(|e| e.to_string())?;
    let out = a.out.as_ref().ok_or("give --out FILE")?;
    std::fs::write(out, tile_bytes(&grid, &map.hours)).map_err(|e| format!("{}: {e}", out.display()))?;
    let mut t = Table::new(format!("Hours of direct sun, {}, {label}", a.period.describe()), columns());
    t.single = true;
    t.rows.push(tile_row(a.index.unwrap_or(0), &grid, near.volumes.len() + near.walls.len()));
    t.notes.push(format!("Written to {} ({} × {} cells, 32-bit floats).", out.display(), grid.cols, grid.rows));
    t.notes.push(halo_note(&halo));
    Ok(t.render(a.format))
}

fn columns() -> Vec<&'static str> {
    vec!["index", "col0", "row0", "cols", "rows", "x0_m", "y0_m", "x1_m", "y1_m", "casting"]
}

fn tile_row(index: usize, g: &Grid, casting: usize) -> Vec<Cell> {
    let b = g.bounds();
    let n = |v: usize| Cell::Int(v as i64);
    vec![
        n(index),
        n(g.col0),
        n(g.row0),
        n(g.cols),
        n(g.rows),
        Cell::num(b.min().x, 2),
        Cell::num(b.min().y, 2),
        Cell::num(b.max().x, 2),
        Cell::num(b.max().y, 2),
        n(casting),
    ]
}

/// One row a tile, with how many volumes and walls cast on it (those within the halo).
fn plan(a: &TilesArgs, model: &SiteModel, whole: &Grid, tiles: &[Grid], halo: &Halo) -> String {
    let mut t = Table::new(
        format!(
            "Tiles of {} × {} cells ({} m) over the extent, {}",
            whole.cols,
            whole.rows,
            a.cell_m,
            a.period.describe()
        ),
        columns(),
    );
    for (i, g) in tiles.iter().enumerate() {
        let near = massing_near(model, g, halo.halo_m);
        t.rows.push(tile_row(i, g, near.volumes.len() + near.walls.len()));
    }
    t.notes.push(halo_note(halo));
    t.notes.push(format!(
        "{} tiles; of {} volumes and walls, a tile is cast on by those in its halo (the casting column). Compute each with --index N --out FILE (any order, any machine), then `sunlot stitch FILE… --out map.f32`; --whole --out FILE computes the extent in one process.",
        tiles.len(),
        model.volumes.len() + model.walls.len()
    ));
    t.render(a.format)
}

pub fn run_stitch(a: &StitchArgs) -> Result<String, String> {
    let mut tiles: Vec<(String, TileValues)> = Vec::new();
    for p in &a.tiles {
        let label = p.display().to_string();
        let bytes = std::fs::read(p).map_err(|e| format!("{label}: {e}"))?;
        tiles.push((label.clone(), read_tile(&label, &bytes).map_err(|e| e.to_string())?));
    }
    let map = stitch_tiles(&tiles).map_err(|e| e.to_string())?;
    std::fs::write(&a.out, map.bytes()).map_err(|e| format!("{}: {e}", a.out.display()))?;
    let mut notes = vec![format!(
        "{} tiles stitched into {} × {} cells ({} m), written to {}.",
        tiles.len(),
        map.cols,
        map.rows,
        map.cell_m,
        a.out.display()
    )];
    if let Some(csv) = &a.csv {
        let mut text = String::from("x_m,y_m,sun_hours\n");
        for r in 0..map.rows {
            for c in 0..map.cols {
                let v = map.values[r * map.cols + c];
                if !v.is_nan() {
                    let (x, y) = map.centre_m(c, r);
                    text.push_str(&format!("{x},{y},{v}\n"));
                }
            }
        }
        std::fs::write(csv, text).map_err(|e| format!("{}: {e}", csv.display()))?;
        notes.push(format!("Cells written to {}.", csv.display()));
    }
    Ok(notes.join("\n") + "\n")
}

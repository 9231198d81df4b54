//! Before and after a proposal: the same map for the existing massing alone and with the proposal,
//! the difference (hours lost) and ratio (after / before) maps, and per-area figures.

use serde::Serialize;

use super::cell_values::CellValues;
use super::grid::{ExposureError, Grid};
use super::shade::Massing;
use super::sun_hours::{sun_hours, SunHours, SunHoursRequest};

/// Figures of a map over an area, each cell weighted by the share of it in the area.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MapStats {
    /// Cells with any of their area in the area.
    pub cells: usize,
    /// The area, m²: the cells' covered parts, so exactly the polygon's area when the weights are
    /// [`Grid::cover_of`] (the cells' whole area when there are no weights).
    pub area_m2: f64,
    /// Smallest value.
    pub min: f64,
    /// Mean value, area-weighted.
    pub mean: f64,
    /// Largest value.
    pub max: f64,
    /// The threshold `at_least_*` refers to.
    pub threshold: f64,
    /// Area with at least `threshold`, m².
    pub at_least_m2: f64,
    /// Share of the area with at least `threshold`, 0–1.
    pub at_least_share: f64,
    /// Share of the area (0–1) in cells whose centre sample may not stand for the whole cell: cells
    /// cut by the area's edge, and cells with an edge-neighbour on the other side of the threshold.
    /// `at_least_share` is within this of the exact share as long as the map resolves its shadows
    /// (no patch of sun or shade smaller than a cell); it shrinks with the cell size.
    pub uncertain_share: f64,
}

/// Figures of `values` (row-major over `grid`, `None` outside it) over an area whose share of each
/// cell is `weights` (from [`Grid::cover_of`]; `None`: every cell with a value counts whole); `None`
/// when no cell with a value has any weight.
pub fn map_stats(grid: &Grid, values: &CellValues, weights: Option<&[f64]>, threshold: f64) -> Option<MapStats> {
    let weight = |k: usize| match (values.get(k), weights) {
        (None, _) => 0.0,
        (Some(_), None) => 1.0,
        (Some(_), Some(w)) => w[k],
    };
    // A tolerance of 1e-9 of the map's unit (for hours, about 4 µs) keeps a cell at exactly the
    // threshold from falling under it by rounding in the sums.
    let hit = |v: f64| v >= threshold - 1e-9;
    let cols = grid.cols;
    let (mut cells, mut total, mut sum, mut at_least, mut uncertain) = (0, 0.0, 0.0, 0.0, 0.0);
    let (mut min, mut max) = (f64::INFINITY, f64::NEG_INFINITY);
    for (k, v) in values.iter().enumerate() {
        let (Some(v), w) = (v, weight(k)) else { continue };
        if w <= 0.0 {
            continue;
        }
        cells += 1;
        total += w;
        sum += w * v;
        min = min.min(v);
        max = max.max(v);
        if hit(v) {
            at_least += w;
        }
        let (col, row) = (k % cols, k / cols);
        let neighbours = [
            (col > 0).then(|| k - 1),
            (col + 1 < cols).then(|| k + 1),
            (row > 0).then(|| k - cols),
            (row + 1 < grid.rows).then(|| k + cols),
        ];
        let across = neighbours.iter().flatten().any(|&j| values.get(j).is_some_and(|u| hit(u) != hit(v)));
        if w < 1.0 - 1e-12 || across {
            uncertain += w;
        }
    }
    if cells == 0 {
        return None;
    }
    let cell_m2 = grid.cell_m * grid.cell_m;
    Some(MapStats {
        cells,
        area_m2: total * cell_m2,
        min,
        mean: sum / total,
        max,
        threshold,
        at_least_m2: at_least * cell_m2,
        at_least_share: at_least / total,
        uncertain_share: uncertain / total,
    })
}

/// Sun-hours maps before and after, with their difference and ratio.
#[derive(Debug, Clone, PartialEq)]
pub struct BeforeAfter {
    /// Existing massing alone.
    pub before: SunHours,
    /// Existing and proposed massing.
    pub after: SunHours,
    /// Hours lost per cell (before − after, 0 or more); `None` outside the area.
    pub lost_h: CellValues,
    /// After / before per cell; `None` outside the area and where the cell had no sun before.
    pub ratio: CellValues,
}

/// Runs the map of `req` (its `massing` is ignored) for both massings. Progress runs 0–½ for the
/// before map and ½–1 for the after map.
///
/// # Errors
/// As [`sun_hours`].
pub fn before_after(
    req: &SunHoursRequest,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<BeforeAfter, ExposureError> {
    let run = |m: Massing, progress: &mut dyn FnMut(f64) -> bool| {
        sun_hours(&SunHoursRequest { massing: m, ..req.clone() }, progress)
    };
    let before = run(Massing::Existing, &mut |f| progress(0.5 * f))?;
    let after = run(Massing::WithProposed, &mut |f| progress(0.5 + 0.5 * f))?;
    Ok(BeforeAfter::of(before, after))
}

impl BeforeAfter {
    /// The comparison of two maps of the same grid and period: `before` for the existing massing
    /// alone, `after` with the proposal.
    pub fn of(before: SunHours, after: SunHours) -> Self {
        let pairs = || before.hours.iter().zip(after.hours.iter());
        let lost_h = pairs().map(|(b, a)| Some((b? - a?).max(0.0))).collect();
        let ratio = pairs()
            .map(|(b, a)| match (b, a) {
                (Some(b), Some(a)) if b > 0.0 => Some(a / b),
                _ => None,
            })
            .collect();
        BeforeAfter { before, after, lost_h, ratio }
    }
}

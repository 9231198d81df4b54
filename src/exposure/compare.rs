//! Before and after a proposal: the same map for the existing massing alone and with the proposal,
//! the difference (hours lost) and ratio (after / before) maps, and per-area figures.

use serde::Serialize;

use super::grid::ExposureError;
use super::shade::Massing;
use super::sun_hours::{sun_hours, SunHours, SunHoursRequest};

/// Figures of a map over the cells inside its area.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MapStats {
    /// Cells inside the area.
    pub cells: usize,
    /// Their plan area, m² (cells × cell area).
    pub area_m2: f64,
    /// Smallest value.
    pub min: f64,
    /// Mean value.
    pub mean: f64,
    /// Largest value.
    pub max: f64,
    /// The threshold `at_least_*` refers to.
    pub threshold: f64,
    /// Plan area of the cells with at least `threshold`, m².
    pub at_least_m2: f64,
    /// Share of the cells with at least `threshold`, 0–1.
    pub at_least_share: f64,
}

/// Figures of `values` (row-major, `None` outside the area) on cells of `cell_m`; `None` when no cell
/// is inside.
pub fn map_stats(values: &[Option<f64>], cell_m: f64, threshold: f64) -> Option<MapStats> {
    let inside: Vec<f64> = values.iter().flatten().copied().collect();
    if inside.is_empty() {
        return None;
    }
    let n = inside.len();
    let cell_m2 = cell_m * cell_m;
    // A tolerance of 1e-9 of the map's unit (for hours, about 4 µs) keeps a cell at exactly the
    // threshold from falling under it by rounding in the sums.
    let hits = inside.iter().filter(|&&v| v >= threshold - 1e-9).count();
    Some(MapStats {
        cells: n,
        area_m2: n as f64 * cell_m2,
        min: inside.iter().copied().fold(f64::INFINITY, f64::min),
        mean: inside.iter().sum::<f64>() / n as f64,
        max: inside.iter().copied().fold(f64::NEG_INFINITY, f64::max),
        threshold,
        at_least_m2: hits as f64 * cell_m2,
        at_least_share: hits as f64 / n as f64,
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
    pub lost_h: Vec<Option<f64>>,
    /// After / before per cell; `None` outside the area and where the cell had no sun before.
    pub ratio: Vec<Option<f64>>,
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
    let pairs = || before.hours.iter().zip(&after.hours);
    let lost_h = pairs().map(|(b, a)| Some((b.as_ref()? - a.as_ref()?).max(0.0))).collect();
    let ratio = pairs()
        .map(|(b, a)| match (b, a) {
            (Some(b), Some(a)) if *b > 0.0 => Some(a / b),
            _ => None,
        })
        .collect();
    Ok(BeforeAfter { before, after, lost_h, ratio })
}

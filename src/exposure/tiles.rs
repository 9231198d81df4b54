//! Tiles with a halo: a large map cut into tiles that can be computed apart (in other processes) and
//! stitched back, equal to the map computed whole.
//!
//! A tile keeps the whole grid's lattice (see [`Grid::tiles`]), so its cell centres are the same
//! numbers; shadows are rasterised exactly whatever their length (see [`super::shade`]) and the
//! weights are summed as integers, so a tile's values are bit for bit the whole map's as long as
//! the tile is given every volume and wall whose shadow can reach it: those within the halo, the
//! longest shadow the period's sun can cast.

use geo::BoundingRect;

use super::grid::{ExposureError, Grid};
use super::period::Period;
use super::sun_hours::{for_each_day, step_offset};
use crate::shadow::Receiver;
use crate::site::SiteModel;
use crate::time::DeltaT;

/// How far a tile's halo reaches and why: the tallest feature above the receiving plane times the
/// longest shadow per metre of height over the period's sun-up steps.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Halo {
    /// The halo, metres (infinite when nothing can be bounded; 0 with nothing above the plane).
    pub halo_m: f64,
    /// The tallest volume or wall above the plane, metres.
    pub tallest_m: f64,
    /// The longest shadow per metre of height over the steps.
    pub per_m: f64,
    /// The lowest sun altitude among the steps that cast, degrees (shadows are cast no lower than
    /// [`super::MIN_CAST_ALTITUDE_DEG`]); `None` without such a step.
    pub lowest_altitude_deg: Option<f64>,
}

/// The longest shadow the sun-up steps of `period` can cast on the plane `plane_m` above the ground,
/// metres: the tallest feature's height above the plane times the longest shadow per metre over the
/// steps (on sloping ground, a tip lands at h / (1 + k·o) along the flat offset o). Infinite when
/// nothing can be bounded (a step with the sun at the horizon casts as at 0.01°: about 5.7 km per
/// metre of height, so sunrise-to-sunset periods have very wide halos).
///
/// # Errors
/// [`ExposureError`] for a bad period.
pub fn shadow_halo_m(model: &SiteModel, period: &Period, plane_m: f64, delta_t: DeltaT) -> Result<f64, ExposureError> {
    shadow_halo(model, period, plane_m, delta_t).map(|h| h.halo_m)
}

/// [`shadow_halo_m`] with what it comes from.
///
/// # Errors
/// [`ExposureError`] for a bad period.
pub fn shadow_halo(model: &SiteModel, period: &Period, plane_m: f64, delta_t: DeltaT) -> Result<Halo, ExposureError> {
    period.check(model, delta_t)?;
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, plane_m);
    let tallest =
        model.volumes.iter().map(|v| v.top_m).chain(model.walls.iter().map(|w| w.height_m)).fold(0.0_f64, f64::max)
            - plane_m;
    let k = receiver.gradient;
    let (mut per_m, mut lowest) = (0.0_f64, None::<f64>);
    for_each_day(model, period, delta_t, &mut |_| true, |_, steps| {
        for s in &steps {
            if let Some(o) = step_offset(model, &receiver, s) {
                per_m = per_m.max(o.x.hypot(o.y) / (1.0 + k.x * o.x + k.y * o.y));
                let alt = s.sun.altitude_deg.max(super::MIN_CAST_ALTITUDE_DEG);
                lowest = Some(lowest.map_or(alt, |l| l.min(alt)));
            }
        }
        Ok(())
    })?;
    let halo_m = if tallest <= 0.0 { 0.0 } else { tallest * per_m };
    Ok(Halo { halo_m, tallest_m: tallest.max(0.0), per_m, lowest_altitude_deg: lowest })
}

/// `model` with only the volumes and walls that come within `halo_m` of `grid`'s cells.
pub fn massing_near(model: &SiteModel, grid: &Grid, halo_m: f64) -> SiteModel {
    let b = grid.bounds();
    let (lo, hi) = (b.min(), b.max());
    let near = |r: Option<geo::Rect<f64>>| {
        r.is_some_and(|r| {
            r.max().x >= lo.x - halo_m
                && r.min().x <= hi.x + halo_m
                && r.max().y >= lo.y - halo_m
                && r.min().y <= hi.y + halo_m
        })
    };
    let mut out = model.clone();
    out.volumes.retain(|v| near(v.footprint.bounding_rect()));
    out.walls.retain(|w| near(w.line.bounding_rect()));
    out
}

//! Sky-view factor of horizontal cells and points: the share of an isotropic sky's diffuse light on a
//! horizontal surface that the massing leaves it.
//!
//! # Method
//! The sky hemisphere is cut into patches `step_deg` high (altitude bands of equal height, 90° / n)
//! and `step_deg` wide in azimuth. Under an isotropic sky a horizontal surface receives from a patch
//! the share of the cosine-weighted solid angle it spans, (sin²a₂ − sin²a₁)·Δφ / 360° for the band
//! a₁…a₂ (Lambert's cosine law, integrated exactly over the patch; the shares sum to 1). A patch
//! counts as seen when the ray toward its centre is unobstructed. For a grid that is the sun-hours
//! method run with one "sun" per patch centre (a cell sees the patch when it is outside the shadow
//! cast from that direction), so the cost is that of one shadow step per patch; for a point it is
//! the exact ray test per patch. Directions behind sloping ground are not seen. Light reflected by
//! the massing or the ground is not counted.

use geo::Coord;

use super::cell_values::CellValues;
use super::grid::{ExposureError, Grid};
use super::shade::{Cast, Massing, ShadeSums};
use crate::shadow::{shadow_offset_per_m, Exposure, Receiver, ViewPoint};
use crate::site::SiteModel;

/// Default patch size, degrees.
pub const DEFAULT_SKY_STEP_DEG: f64 = 5.0;

/// A patch of the sky hemisphere.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SkyPatch {
    /// Altitude of the patch centre, degrees.
    pub altitude_deg: f64,
    /// Azimuth of the patch centre in the plan frame, degrees clockwise from the plan's north.
    pub azimuth_deg: f64,
    /// Share of a horizontal surface's isotropic diffuse light from this patch, 0–1.
    pub weight: f64,
}

/// The patches for `step_deg` (0.5° to 30°).
///
/// # Errors
/// [`ExposureError::Period`] naming `sky_step_deg` when out of range.
pub fn sky_patches(step_deg: f64) -> Result<Vec<SkyPatch>, ExposureError> {
    if !(step_deg.is_finite() && (0.5..=30.0).contains(&step_deg)) {
        return Err(ExposureError::Period(format!("sky_step_deg must be 0.5 to 30 degrees, got {step_deg}")));
    }
    let bands = (90.0 / step_deg).round().max(1.0) as usize;
    let sectors = (360.0 / step_deg).round().max(4.0) as usize;
    let (da, dphi) = (90.0 / bands as f64, 360.0 / sectors as f64);
    let mut out = Vec::with_capacity(bands * sectors);
    for b in 0..bands {
        let (a1, a2) = ((b as f64 * da).to_radians(), ((b + 1) as f64 * da).to_radians());
        let w = (a2.sin().powi(2) - a1.sin().powi(2)) / sectors as f64;
        for s in 0..sectors {
            out.push(SkyPatch { altitude_deg: (b as f64 + 0.5) * da, azimuth_deg: (s as f64 + 0.5) * dphi, weight: w });
        }
    }
    Ok(out)
}

/// Sky-view factor per cell (0–1), row-major as the grid; `None` outside the area.
///
/// # Errors
/// [`ExposureError`] for a bad step or plane height.
pub fn sky_view_map(
    model: &SiteModel,
    grid: &Grid,
    plane_m: f64,
    massing: Massing,
    step_deg: f64,
) -> Result<CellValues, ExposureError> {
    super::sun_hours::check_plane(plane_m)?;
    let patches = sky_patches(step_deg)?;
    crate::limits::within(
        "sky_step_deg",
        patches.len() as f64 * grid.inside_count() as f64,
        crate::limits::MAX_CELL_STEPS,
        "cell-patches",
    )
    .map_err(|e| e.hint("use larger cells or a larger sky step"))?;
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, plane_m);
    let casts: Vec<Cast<1>> = patches
        .iter()
        .map(|p| {
            let o = shadow_offset_per_m(p.azimuth_deg, p.altitude_deg).unwrap_or(Coord { x: 0.0, y: 0.0 });
            (o, [p.weight])
        })
        .collect();
    let mut sums = ShadeSums::<1>::new(model, grid, receiver, massing);
    sums.add(&casts);
    let [hidden] = sums.finish();
    Ok(hidden.iter().zip(&grid.inside).map(|(h, &inside)| inside.then(|| (1.0 - h).clamp(0.0, 1.0))).collect())
}

/// Sky-view factor (0–1) of a horizontal surface at `point`, by the exact ray test toward every patch.
///
/// # Errors
/// [`ExposureError`] for a bad step or a non-finite point.
pub fn sky_view_at(model: &SiteModel, point: ViewPoint, massing: Massing, step_deg: f64) -> Result<f64, ExposureError> {
    // ΔT plays no part: the patches are directions, not moments.
    let sky = super::timeline::PointSky::new(model, point, massing, crate::time::DeltaT::EspenakMeeus);
    // Summed as the hidden share, as the map does, so an open point gets exactly 1.
    let patches = sky_patches(step_deg)?;
    let casters = model.volumes.len() + model.walls.len();
    crate::limits::ray_tests("sky_step_deg", patches.len() as f64, casters, "use a larger sky step")?;
    let mut hidden = 0.0;
    for p in patches {
        if sky.toward(p.azimuth_deg, p.altitude_deg)? != Exposure::Sunlit {
            hidden += p.weight;
        }
    }
    Ok((1.0 - hidden).clamp(0.0, 1.0))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use crate::site::{Area, AreaKind, Status, Wall};
    use geo::{LineString, Polygon};

    /// A point's sky view and year are refused before any ray is cast when they would take too many
    /// ray tests (hostile input: a fine sky step or a one-minute year over a town of volumes).
    #[test]
    fn point_work_over_budget_is_refused_first() {
        let mut m = crate::demo::demo();
        let v = m.volumes[0].clone();
        for k in 0..2_000 {
            let mut c = v.clone();
            c.id = format!("copy-{k}");
            m.volumes.push(c);
        }
        let p = crate::shadow::ViewPoint { x_m: 31.0, y_m: 25.0, z_m: 0.0 };
        let e = sky_view_at(&m, p, Massing::WithProposed, 0.5).unwrap_err().to_string();
        assert!(e.starts_with("sky_step_deg: 260,496,000 ray tests is more than the limit of 200,000,000"), "{e}");
        let req = crate::exposure::YearProfileRequest {
            model: &m,
            point: p,
            year: 2026,
            step_min: 1,
            massing: Massing::WithProposed,
            atmosphere: Default::default(),
            delta_t: crate::time::DeltaT::EspenakMeeus,
        };
        let e = crate::exposure::year_profile(&req, |_| true).unwrap_err().to_string();
        assert!(e.starts_with("step_min: ") && e.contains("ray tests is more than the limit"), "{e}");
    }

    #[test]
    fn patch_weights_sum_to_one() {
        for step in [1.0, 5.0, 7.5, 30.0] {
            let total: f64 = sky_patches(step).unwrap().iter().map(|p| p.weight).sum();
            assert!((total - 1.0).abs() < 1e-12, "{step}: {total}");
        }
        assert!(sky_patches(0.1).is_err() && sky_patches(f64::NAN).is_err());
    }

    #[test]
    fn long_wall_leaves_one_plus_cos_beta_over_two() {
        // A horizontal surface beside an infinitely long wall whose top is seen at elevation β
        // (perpendicular to the wall) sees (1 + cos β) / 2 of the sky: the blocked wedge projects onto
        // the base disc as the half disc minus a half ellipse of semi-axis cos β (analytic).
        let mut m = crate::demo::demo();
        m.volumes.clear();
        let h = 6.0;
        m.walls =
            vec![Wall::new("w", Status::Existing, LineString::from(vec![(-3_000.0, 0.0), (3_000.0, 0.0)]), h).unwrap()];
        let ring = LineString::from(vec![(-1.0, 0.5), (1.0, 0.5), (1.0, 30.5), (-1.0, 30.5), (-1.0, 0.5)]);
        m.areas = vec![Area::new("a", "", AreaKind::Other, Status::Existing, Polygon::new(ring, vec![])).unwrap()];
        let g = Grid::over_polygon(&m.areas[0].polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let map = sky_view_map(&m, &g, 0.0, Massing::Existing, 1.0).unwrap();
        for row in [0, 2, 5, 10, 29] {
            let d = g.centre(0, row).y;
            let want = (1.0 + (h / d).atan().cos()) / 2.0;
            let got = map.get(row * g.cols).unwrap();
            // 1° patches: the wall's edge cuts a band of patches, so within about one band's weight.
            assert!((got - want).abs() < 0.012, "d = {d}: {got} vs {want}");
            let at = sky_view_at(&m, ViewPoint { x_m: g.centre(0, row).x, y_m: d, z_m: 0.0 }, Massing::Existing, 1.0)
                .unwrap();
            assert!((at - got).abs() < 1e-9, "ray {at} vs grid {got}");
        }
    }
}

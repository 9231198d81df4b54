//! A shadow study of a site at one moment: the shadows of the existing and the proposed massing, and
//! how much of each area they cover.

use chrono::{DateTime, Utc};
use geo::{Area as _, BooleanOps, BoundingRect, Coord, MultiPolygon, Rect};
use serde::Serialize;

use super::cast::{cast_each, ShadowError, Shadows};
use super::ground::Receiver;
use crate::site::{SiteModel, Status};
use crate::solar::{solar_position, Atmosphere, InputError, SolarPosition};
use crate::time::DeltaT;

/// How far the analysis extent reaches beyond the site's features: this many times the tallest height
/// (a shadow 20 × its height long falls at a sun altitude of 2.9°), and at least [`MIN_MARGIN_M`].
pub const EXTENT_HEIGHTS: f64 = 20.0;
/// The least margin of the analysis extent around the features, metres.
pub const MIN_MARGIN_M: f64 = 100.0;

/// The shade on one area.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AreaShade {
    /// The area's id.
    pub id: String,
    /// Its name.
    pub name: String,
    /// Its size, m².
    pub area_m2: f64,
    /// Shaded by existing massing alone, m².
    pub existing_m2: f64,
    /// Shaded by proposed massing alone, m².
    pub proposed_m2: f64,
    /// Shaded by both together, m².
    pub combined_m2: f64,
}

impl AreaShade {
    /// A shaded area as a fraction of the area (0 for an area of no size).
    pub fn fraction(&self, shaded_m2: f64) -> f64 {
        if self.area_m2 > 0.0 {
            shaded_m2 / self.area_m2
        } else {
            0.0
        }
    }
}

/// The result of a study.
#[derive(Debug, Clone, PartialEq)]
pub enum Study {
    /// The sun is not above the horizon at that moment.
    NoSun { sun: SolarPosition },
    /// The sun is up but behind the sloping ground: the whole site is in the slope's own shade.
    SunBehindGround { sun: SolarPosition },
    /// The sun is up.
    Sun {
        /// The sun's position (true azimuth).
        sun: SolarPosition,
        /// The sun's azimuth in the plan frame, degrees.
        plan_azimuth_deg: f64,
        /// Each feature's shadow: id, status, polygons (plan metres).
        per_feature: Vec<(String, Status, MultiPolygon<f64>)>,
        /// Union of the existing features' shadows.
        existing: MultiPolygon<f64>,
        /// Union of the proposed features' shadows.
        proposed: MultiPolygon<f64>,
        /// Union of all shadows.
        combined: MultiPolygon<f64>,
        /// Shade on each area.
        areas: Vec<AreaShade>,
        /// Whether a shadow reached the analysis extent and was cut there.
        clipped: bool,
        /// The analysis extent, plan metres.
        extent: Rect<f64>,
    },
}

/// Errors of a study.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum StudyError {
    /// The moment is outside the solar engine's range.
    #[error("{0}")]
    Time(#[from] InputError),
    /// The geometry could not be cast.
    #[error("{0}")]
    Shadow(#[from] ShadowError),
    /// The site has nothing to cast a shadow.
    #[error("the site has no volumes or walls to cast a shadow")]
    NothingToCast,
}

/// The analysis extent of a site: its features' bounding box grown by [`EXTENT_HEIGHTS`] × the tallest
/// height, at least [`MIN_MARGIN_M`].
pub fn analysis_extent(model: &SiteModel) -> Option<Rect<f64>> {
    let rects = model
        .volumes
        .iter()
        .filter_map(|v| v.footprint.bounding_rect())
        .chain(model.walls.iter().filter_map(|w| w.line.bounding_rect()))
        .chain(model.areas.iter().filter_map(|a| a.polygon.bounding_rect()));
    let (mut lo, mut hi) =
        (Coord { x: f64::INFINITY, y: f64::INFINITY }, Coord { x: f64::NEG_INFINITY, y: f64::NEG_INFINITY });
    for r in rects {
        lo = Coord { x: lo.x.min(r.min().x), y: lo.y.min(r.min().y) };
        hi = Coord { x: hi.x.max(r.max().x), y: hi.y.max(r.max().y) };
    }
    if !lo.x.is_finite() {
        return None;
    }
    let tallest =
        model.volumes.iter().map(|v| v.top_m).chain(model.walls.iter().map(|w| w.height_m)).fold(0.0, f64::max);
    let m = (EXTENT_HEIGHTS * tallest).max(MIN_MARGIN_M);
    Some(Rect::new(lo - Coord { x: m, y: m }, hi + Coord { x: m, y: m }))
}

/// Shadows of the site at `instant` on its ground (flat or sloping), with each area's shade. Areas are
/// measured in plan (horizontal projection), as site plans give them.
///
/// # Errors
/// [`StudyError`] when the site has nothing to cast or the moment is out of range.
pub fn shadow_study(model: &SiteModel, instant: DateTime<Utc>, delta_t: DeltaT) -> Result<Study, StudyError> {
    let sun = solar_position(&model.location, instant, &Atmosphere::default(), delta_t)?;
    let extent = analysis_extent(model)
        .filter(|_| !(model.volumes.is_empty() && model.walls.is_empty()))
        .ok_or(StudyError::NothingToCast)?;
    let plan_az = model.plan_azimuth_deg(sun.azimuth_deg);
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, 0.0);
    let (per_feature, clipped) =
        match cast_each(&model.volumes, &model.walls, plan_az, sun.altitude_deg, &receiver, extent)? {
            Shadows::NoSun => return Ok(Study::NoSun { sun }),
            Shadows::GroundFacesAway => return Ok(Study::SunBehindGround { sun }),
            Shadows::Sun { per_feature, clipped, .. } => (per_feature, clipped),
        };
    let statuses = model.volumes.iter().map(|v| v.status).chain(model.walls.iter().map(|w| w.status));
    let per_feature: Vec<(String, Status, MultiPolygon<f64>)> =
        per_feature.into_iter().zip(statuses).map(|((id, s), st)| (id, st, s)).collect();
    let union_of = |want: Status| {
        super::cast::without_slivers(geo::unary_union(per_feature.iter().filter(|f| f.1 == want).map(|f| &f.2)))
    };
    let existing = union_of(Status::Existing);
    let proposed = union_of(Status::Proposed);
    // Both together: one side alone as it is, else the union of the two unions (their pieces' union,
    // without forming it a third time from every feature).
    let combined = if proposed.0.is_empty() {
        existing.clone()
    } else if existing.0.is_empty() {
        proposed.clone()
    } else {
        super::cast::without_slivers(existing.union(&proposed))
    };
    let areas = model
        .areas
        .iter()
        .map(|a| AreaShade {
            id: a.id.clone(),
            name: a.name.clone(),
            area_m2: a.polygon.unsigned_area(),
            existing_m2: a.polygon.intersection(&existing).unsigned_area(),
            proposed_m2: a.polygon.intersection(&proposed).unsigned_area(),
            combined_m2: a.polygon.intersection(&combined).unsigned_area(),
        })
        .collect();
    Ok(Study::Sun { sun, plan_azimuth_deg: plan_az, per_feature, existing, proposed, combined, areas, clipped, extent })
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    fn model() -> SiteModel {
        SiteModel::from_json(include_str!("../../demo-site/hollin-vale.site.json")).unwrap()
    }

    #[test]
    fn night_has_no_sun() {
        let t = chrono::DateTime::parse_from_rfc3339("2026-12-21T23:00:00Z").unwrap().to_utc();
        assert!(matches!(shadow_study(&model(), t, DeltaT::EspenakMeeus).unwrap(), Study::NoSun { .. }));
    }

    #[test]
    fn proposal_shades_the_north_garden_at_winter_noon_and_figures_add_up() {
        let t = chrono::DateTime::parse_from_rfc3339("2026-12-21T12:08:00Z").unwrap().to_utc();
        let Study::Sun { areas, sun, .. } = shadow_study(&model(), t, DeltaT::EspenakMeeus).unwrap() else {
            panic!("sun up")
        };
        let g = areas.iter().find(|a| a.id == "garden-9").unwrap();
        assert_abs_diff_eq!(g.area_m2, 28.0 * 14.0, epsilon = 1e-9);
        // Noon sun ~14° high: the 15 m upper block's shadow runs ~60 m north, over the whole garden
        // between x 6 and 22 (analytic: 16 m × 14 m at least).
        assert!(sun.altitude_deg > 13.0 && sun.altitude_deg < 15.0);
        assert!(g.proposed_m2 >= 16.0 * 14.0 - 1e-6, "{}", g.proposed_m2);
        assert!(g.combined_m2 >= g.proposed_m2.max(g.existing_m2) - 1e-7 * g.area_m2);
        // Within 1e-7 of the area: the boolean operations work on a fixed-precision grid.
        let tol = 1e-7 * g.area_m2;
        assert!(g.combined_m2 <= g.existing_m2 + g.proposed_m2 + tol, "{g:?}");
        assert!(g.fraction(g.combined_m2) <= 1.0 + 1e-12);
    }
}

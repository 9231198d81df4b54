//! Building massing: extruded footprints between a base and a top height, and walls.

use geo::{Coord, LineString, Polygon, Validation};
use serde::{Deserialize, Serialize};

use crate::limits::{MAX_HEIGHT_M, MAX_PLAN_EXTENT_M, MAX_RING_VERTICES};

/// Whether a volume or area is there now or is proposed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Status {
    /// Standing today (the baseline).
    Existing,
    /// Part of the proposal.
    Proposed,
}

/// A problem with one feature of a site, naming it by id.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SiteError {
    /// A ring with fewer than three distinct vertices (a line with fewer than two).
    #[error("feature {feature:?}: {ring} has {count} distinct vertices, too few")]
    TooFewVertices { feature: String, ring: String, count: usize },
    /// A coordinate that is NaN or infinite.
    #[error("feature {feature:?}: coordinate {index} of {ring} is not a finite number")]
    NotFinite { feature: String, ring: String, index: usize },
    /// A height below ground (or a wall of no height), above [`MAX_HEIGHT_M`], or not a number.
    #[error("feature {feature:?}: {field} must be a finite height of 0 m to {max} m, got {value}", max = MAX_HEIGHT_M)]
    BadHeight { feature: String, field: &'static str, value: f64 },
    /// A coordinate farther than [`MAX_PLAN_EXTENT_M`] from the plan origin.
    #[error(
        "feature {feature:?}: coordinate {index} of {ring} ({x:?}, {y:?}) is more than {max} m from the plan origin",
        max = MAX_PLAN_EXTENT_M
    )]
    TooFar { feature: String, ring: String, index: usize, x: f64, y: f64 },
    /// A window field out of its range.
    #[error("feature {feature:?}: {field} {reason}")]
    BadWindow { feature: String, field: &'static str, reason: String },
    /// A ring or line with more than [`MAX_RING_VERTICES`] vertices.
    #[error("feature {feature:?}: {ring} has {count} vertices, more than the limit of {max}", max = MAX_RING_VERTICES)]
    TooManyVertices { feature: String, ring: String, count: usize },
    /// A top at or below the base.
    #[error("feature {feature:?}: top_m ({top_m}) must be above base_m ({base_m})")]
    TopNotAboveBase { feature: String, base_m: f64, top_m: f64 },
    /// A self-intersecting or otherwise invalid footprint.
    #[error("feature {feature:?}: footprint is not a valid polygon: {reason}")]
    InvalidFootprint { feature: String, reason: String },
}

/// An extruded footprint between `base_m` and `top_m` above ground: a block, one tier of a setback
/// building, or (with a base above zero) a bridge or an overhang.
#[derive(Debug, Clone, PartialEq)]
pub struct Volume {
    /// The feature's id, used in messages and results.
    pub id: String,
    /// Existing or proposed.
    pub status: Status,
    /// Footprint in the plan frame, metres; may be non-convex and have holes (courtyards).
    pub footprint: Polygon<f64>,
    /// Height of the underside above ground, metres.
    pub base_m: f64,
    /// Height of the top above ground, metres.
    pub top_m: f64,
}

impl Volume {
    /// A validated volume.
    ///
    /// # Errors
    /// [`SiteError`] naming `id` for fewer than three distinct vertices in a ring, non-finite
    /// coordinates, a negative base, a top not above the base, or a self-intersecting footprint.
    pub fn new(id: &str, status: Status, footprint: Polygon<f64>, base_m: f64, top_m: f64) -> Result<Self, SiteError> {
        let feature = || id.to_string();
        check_ring(id, "the outer ring", footprint.exterior())?;
        for (k, hole) in footprint.interiors().iter().enumerate() {
            check_ring(id, &format!("hole {}", k + 1), hole)?;
        }
        for (field, value) in [("base_m", base_m), ("top_m", top_m)] {
            if !(value.is_finite() && (0.0..=MAX_HEIGHT_M).contains(&value)) {
                return Err(SiteError::BadHeight { feature: feature(), field, value });
            }
        }
        if top_m <= base_m {
            return Err(SiteError::TopNotAboveBase { feature: feature(), base_m, top_m });
        }
        if let Some(problem) = footprint.validation_errors().into_iter().next() {
            return Err(SiteError::InvalidFootprint { feature: feature(), reason: problem.to_string() });
        }
        Ok(Volume { id: id.to_string(), status, footprint, base_m, top_m })
    }

    /// A volume from a list of `(x, y)` vertices (no holes), validated as [`Volume::new`].
    pub fn from_vertices(
        id: &str,
        status: Status,
        xy: &[(f64, f64)],
        base_m: f64,
        top_m: f64,
    ) -> Result<Self, SiteError> {
        let ring: LineString<f64> = xy.iter().map(|&(x, y)| Coord { x, y }).collect();
        Volume::new(id, status, Polygon::new(ring, vec![]), base_m, top_m)
    }
}

/// A wall or fence: a polyline with a height above ground.
#[derive(Debug, Clone, PartialEq)]
pub struct Wall {
    /// The feature's id.
    pub id: String,
    /// Existing or proposed.
    pub status: Status,
    /// The wall's line in the plan frame, metres.
    pub line: LineString<f64>,
    /// Height above ground, metres.
    pub height_m: f64,
}

impl Wall {
    /// A validated wall: at least two distinct finite points and a height above 0 m.
    ///
    /// # Errors
    /// [`SiteError`] naming `id`.
    pub fn new(id: &str, status: Status, line: LineString<f64>, height_m: f64) -> Result<Self, SiteError> {
        check_coords(id, "the line", &line)?;
        let first = line.0.first().copied();
        if line.0.len() < 2 || line.coords().all(|c| Some(*c) == first) {
            return Err(SiteError::TooFewVertices {
                feature: id.to_string(),
                ring: "the line".into(),
                count: usize::from(first.is_some()),
            });
        }
        if !(height_m.is_finite() && height_m > 0.0 && height_m <= MAX_HEIGHT_M) {
            return Err(SiteError::BadHeight { feature: id.to_string(), field: "height_m", value: height_m });
        }
        Ok(Wall { id: id.to_string(), status, line, height_m })
    }
}

/// Every coordinate finite and within [`MAX_PLAN_EXTENT_M`] of the plan origin.
fn check_coords(id: &str, ring: &str, ls: &LineString<f64>) -> Result<(), SiteError> {
    if ls.0.len() > MAX_RING_VERTICES {
        return Err(SiteError::TooManyVertices { feature: id.to_string(), ring: ring.to_string(), count: ls.0.len() });
    }
    for (index, c) in ls.coords().enumerate() {
        if !c.x.is_finite() || !c.y.is_finite() {
            return Err(SiteError::NotFinite { feature: id.to_string(), ring: ring.to_string(), index });
        }
        // A millimetre of slack: a site at the limit, written as GeoJSON and read back, moves by
        // ~1e-11 m in the WGS84 round trip and must still be read.
        if c.x.abs() > MAX_PLAN_EXTENT_M + 1e-3 || c.y.abs() > MAX_PLAN_EXTENT_M + 1e-3 {
            return Err(SiteError::TooFar { feature: id.to_string(), ring: ring.to_string(), index, x: c.x, y: c.y });
        }
    }
    Ok(())
}

pub(crate) fn check_ring(id: &str, ring: &str, ls: &LineString<f64>) -> Result<(), SiteError> {
    check_coords(id, ring, ls)?;
    let mut distinct: Vec<Coord<f64>> = Vec::new();
    for c in ls.coords() {
        if !distinct.iter().any(|d| (d.x - c.x).abs() < 1e-9 && (d.y - c.y).abs() < 1e-9) {
            distinct.push(*c);
            if distinct.len() == 3 {
                break;
            }
        }
    }
    if distinct.len() < 3 {
        return Err(SiteError::TooFewVertices {
            feature: id.to_string(),
            ring: ring.to_string(),
            count: distinct.len(),
        });
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bad_volumes_are_named() {
        let sq = [(0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0)];
        let e = Volume::from_vertices("tower-a", Status::Proposed, &sq, 5.0, 3.0).unwrap_err();
        assert_eq!(e.to_string(), "feature \"tower-a\": top_m (3) must be above base_m (5)");
        let e = Volume::from_vertices("b", Status::Existing, &sq, -1.0, 3.0).unwrap_err();
        assert!(matches!(e, SiteError::BadHeight { field: "base_m", .. }));
        let e = Volume::from_vertices("line", Status::Existing, &[(0.0, 0.0), (1.0, 1.0), (0.0, 0.0)], 0.0, 3.0)
            .unwrap_err();
        assert!(matches!(e, SiteError::TooFewVertices { count: 2, .. }), "{e}");
        let bow = [(0.0, 0.0), (10.0, 10.0), (10.0, 0.0), (0.0, 10.0)];
        let e = Volume::from_vertices("bow-tie", Status::Existing, &bow, 0.0, 3.0).unwrap_err();
        assert!(matches!(e, SiteError::InvalidFootprint { .. }), "{e}");
        let e = Volume::from_vertices("nan", Status::Existing, &[(0.0, 0.0), (f64::NAN, 1.0), (1.0, 0.0)], 0.0, 3.0)
            .unwrap_err();
        assert!(matches!(e, SiteError::NotFinite { index: 1, .. }), "{e}");
    }
}

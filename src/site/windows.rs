//! Named windows: a reference point on the outside face of a wall, the way the wall faces, and the
//! opening's size, so a planner can refer to "16 Tenter Lane, rear window" rather than to plan
//! coordinates.

use geo::Coord;

use super::massing::{SiteError, Status};
use crate::limits::{MAX_HEIGHT_M, MAX_PLAN_EXTENT_M};

/// A window of a site.
#[derive(Debug, Clone, PartialEq)]
pub struct WindowPoint {
    /// Unique id among the site's features.
    pub id: String,
    /// Display name ("16 Tenter Lane, rear window").
    pub name: String,
    /// Existing or proposed.
    pub status: Status,
    /// The reference point in the plan, metres: on the outside face of the wall, the centre of the
    /// glazing unless the user places it elsewhere.
    pub at: Coord<f64>,
    /// Height of the reference point above the ground, metres.
    pub z_m: f64,
    /// The direction the window faces (its wall's outward normal), degrees clockwise from true north,
    /// 0–360.
    pub facing_deg: f64,
    /// Width of the opening, metres.
    pub opening_width_m: f64,
    /// Height of the opening, metres.
    pub opening_height_m: f64,
}

impl WindowPoint {
    /// The window checked: finite numbers, the point within the plan's extent and above the ground,
    /// the facing 0–360° (360 read as 0), an opening of 0.05 to 50 m a side. Build the struct, then
    /// check it: `WindowPoint { id, name, …, opening_height_m }.checked()?`.
    ///
    /// # Errors
    /// [`SiteError`] naming the window and the field.
    pub fn checked(self) -> Result<Self, SiteError> {
        let feature = || self.id.clone();
        let bad = |field: &'static str, reason: String| SiteError::BadWindow { feature: feature(), field, reason };
        let at = self.at;
        if !(at.x.is_finite() && at.y.is_finite()) {
            return Err(SiteError::NotFinite { feature: feature(), ring: "the window's point".into(), index: 0 });
        }
        if at.x.abs() > MAX_PLAN_EXTENT_M + 1e-3 || at.y.abs() > MAX_PLAN_EXTENT_M + 1e-3 {
            return Err(SiteError::TooFar {
                feature: feature(),
                ring: "the window's point".into(),
                index: 0,
                x: at.x,
                y: at.y,
            });
        }
        if !(self.z_m.is_finite() && (0.0..=MAX_HEIGHT_M).contains(&self.z_m)) {
            return Err(SiteError::BadHeight { feature: feature(), field: "z_m", value: self.z_m });
        }
        let facing_deg = self.facing_deg;
        if !(facing_deg.is_finite() && (0.0..=360.0).contains(&facing_deg)) {
            return Err(bad(
                "facing_deg",
                format!("must be 0 to 360 degrees clockwise from true north, got {facing_deg}"),
            ));
        }
        for (field, v) in [("opening_width_m", self.opening_width_m), ("opening_height_m", self.opening_height_m)] {
            if !(v.is_finite() && (0.05..=50.0).contains(&v)) {
                return Err(bad(field, format!("must be 0.05 to 50 m, got {v}")));
            }
        }
        Ok(WindowPoint { facing_deg: facing_deg % 360.0, ..self })
    }

    /// The reference point as a view point for the ray tests and the sky component.
    pub fn view_point(&self) -> crate::shadow::ViewPoint {
        crate::shadow::ViewPoint { x_m: self.at.x, y_m: self.at.y, z_m: self.z_m }
    }
}

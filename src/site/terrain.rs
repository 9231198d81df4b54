//! The ground of a site: a plane with a slope and an aspect, flat by default.

use geo::Coord;
use serde::{Deserialize, Serialize};

/// The ground's slope.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct Ground {
    /// Steepest slope from horizontal, degrees (0 flat, below 60).
    pub slope_deg: f64,
    /// The direction the slope faces (downhill), clockwise from true north, degrees.
    pub aspect_deg: f64,
}

impl Ground {
    /// Flat ground.
    pub fn flat() -> Self {
        Ground::default()
    }

    /// The gradient in the plan frame of a plan turned `plan_rotation_deg` from true north.
    pub fn gradient(&self, plan_rotation_deg: f64) -> Coord<f64> {
        let rise = self.slope_deg.to_radians().tan();
        // Uphill is opposite the aspect; in the plan frame azimuths gain the plan rotation.
        let (s, c) = (self.aspect_deg + plan_rotation_deg + 180.0).to_radians().sin_cos();
        Coord { x: rise * s, y: rise * c }
    }

    /// Checks the slope (0 to below 60°) and aspect (finite). Flat ground has no aspect: it becomes
    /// [`Ground::flat`], so a site reads the same after it is written (found by fuzzing: flat ground
    /// with an aspect came back with aspect 0).
    ///
    /// # Errors
    /// A message naming `slope_deg` or `aspect_deg`.
    pub fn validated(self) -> Result<Self, String> {
        if !(self.slope_deg.is_finite() && (0.0..60.0).contains(&self.slope_deg)) {
            return Err(format!("ground.slope_deg must be 0 to below 60 degrees, got {}", self.slope_deg));
        }
        if !self.aspect_deg.is_finite() {
            return Err(format!("ground.aspect_deg must be a finite number, got {}", self.aspect_deg));
        }
        if self.slope_deg == 0.0 {
            return Ok(Ground::flat());
        }
        Ok(self)
    }
}

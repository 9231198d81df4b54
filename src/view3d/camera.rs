//! Where the view is seen from: a parallel (axonometric) projection or a perspective one, from an
//! azimuth and an elevation around the site's centre.

use super::scene::V3;

/// How the view projects.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Projection {
    /// Parallel lines stay parallel (an axonometric view); sizes read the same everywhere.
    Parallel,
    /// A perspective from `distance_m` from the centre.
    Perspective { distance_m: f64 },
}

/// The viewer.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Camera {
    /// Where the viewer stands, degrees clockwise from the plan's north (180: looking north).
    pub azimuth_deg: f64,
    /// How far above the horizon the viewer looks down from, degrees (5–90).
    pub elevation_deg: f64,
    pub projection: Projection,
    /// The point looked at, plan metres.
    pub target: V3,
}

impl Camera {
    /// The unit vector from the target toward the viewer.
    pub fn toward_viewer(&self) -> V3 {
        let (sa, ca) = self.azimuth_deg.to_radians().sin_cos();
        let (se, ce) = self.elevation_deg.to_radians().sin_cos();
        V3::new(ce * sa, ce * ca, se)
    }

    /// The eye's point for visibility: the viewer's position, or for a parallel view a point far out
    /// along the direction toward the viewer.
    pub fn eye(&self) -> V3 {
        let d = match self.projection {
            Projection::Parallel => 1e7,
            Projection::Perspective { distance_m } => distance_m,
        };
        self.target.plus(self.toward_viewer().scale(d))
    }

    /// The view's right and up unit vectors on the screen.
    fn axes(&self) -> (V3, V3) {
        let f = self.toward_viewer().scale(-1.0);
        let right = f.cross(V3::new(0.0, 0.0, 1.0)).unit();
        // Looking straight down, north is up on the screen.
        let right = if right.norm() < 0.5 {
            let (sa, ca) = self.azimuth_deg.to_radians().sin_cos();
            V3::new(-ca, sa, 0.0)
        } else {
            right
        };
        (right, right.cross(f))
    }

    /// `p` on the view plane: metres to the right of and above the target as seen (for a perspective,
    /// scaled to the target's distance); `None` behind a perspective eye.
    pub fn project(&self, p: V3) -> Option<(f64, f64)> {
        let (right, up) = self.axes();
        let d = p.minus(self.target);
        let (x, y) = (d.dot(right), d.dot(up));
        match self.projection {
            Projection::Parallel => Some((x, y)),
            Projection::Perspective { distance_m } => {
                let depth = distance_m - d.dot(self.toward_viewer());
                (depth > 1e-3).then(|| (x * distance_m / depth, y * distance_m / depth))
            }
        }
    }
}

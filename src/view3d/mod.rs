//! A three-dimensional view of the massing and its shadows, exact and without a GPU: the site as
//! planar faces ([`scene`]), each face's share of the sun — Lambert's cosine and the exact polygon of
//! the shadow the massing casts on it, on the ground, on roofs and on other buildings' walls
//! ([`light`]) — and visibility by a binary space partition of the faces ([`bsp`]), drawn back to
//! front from a parallel or perspective viewer ([`camera`]) through the drawing abstraction
//! ([`crate::render::draw_massing_view`]).
//!
//! The ground is drawn flat: a site with a sloping ground is refused (its volumes stand on the slope,
//! which this view does not model yet).

pub mod bsp;
pub mod camera;
pub mod envelope;
pub mod light;
pub mod scene;

pub use bsp::{Bsp, Fragment};
pub use camera::{Camera, Projection};
pub use envelope::{envelope_treads, EnvelopeViewError};
pub use light::{light_faces, toward_sun, FaceLight};
pub use scene::{site_faces, Face3, FaceKind, Frame3, V3};

use crate::site::SiteModel;

/// Ground shown around the site's extent in the view, metres.
pub const GROUND_MARGIN_M: f64 = 12.0;

/// Why a site cannot be viewed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ViewError {
    /// The site's ground slopes.
    #[error("ground: the 3-D view draws level sites only; this site's ground slopes")]
    SlopedGround,
    /// Nothing to draw.
    #[error("site: has no areas, volumes or walls to draw")]
    Empty,
    /// A camera number out of its range.
    #[error("{field}: must be {range}, got {value}")]
    Camera { field: &'static str, range: &'static str, value: f64 },
}

/// The massing of a site ready to be viewed: its faces and their partition (built once; any camera
/// and any sun after).
#[derive(Debug)]
pub struct MassingScene {
    pub faces: Vec<Face3>,
    pub bsp: Bsp,
    /// The middle of the site's plan extent, on the ground: where a viewer looks.
    pub centre: V3,
}

impl MassingScene {
    /// The scene of `model`.
    ///
    /// # Errors
    /// [`ViewError`] for a sloping ground or a site with nothing to draw.
    pub fn of(model: &SiteModel) -> Result<Self, ViewError> {
        Self::with(model, Vec::new())
    }

    /// The scene of `model` with `extra` faces (a solar envelope's treads, [`scene::envelope_faces`]).
    ///
    /// # Errors
    /// As [`MassingScene::of`].
    pub fn with(model: &SiteModel, extra: Vec<Face3>) -> Result<Self, ViewError> {
        if model.ground.slope_deg.abs() > 1e-9 {
            return Err(ViewError::SlopedGround);
        }
        let mut faces = site_faces(model, GROUND_MARGIN_M);
        if faces.len() <= 1 {
            return Err(ViewError::Empty);
        }
        faces.extend(extra);
        let bsp = Bsp::build(&faces);
        let centre = scene::extent(model).map_or(V3::new(0.0, 0.0, 0.0), |r| V3::new(r.center().x, r.center().y, 0.0));
        Ok(MassingScene { faces, bsp, centre })
    }
}

impl Camera {
    /// A viewer at `azimuth_deg` (clockwise from the plan's north), `elevation_deg` above the horizon,
    /// looking at `target`: a perspective from `perspective_m` metres, or parallel with `None`.
    ///
    /// # Errors
    /// As [`check_camera`].
    pub fn checked(
        azimuth_deg: f64,
        elevation_deg: f64,
        perspective_m: Option<f64>,
        target: V3,
    ) -> Result<Self, ViewError> {
        let projection =
            perspective_m.map_or(Projection::Parallel, |distance_m| Projection::Perspective { distance_m });
        let camera = Camera { azimuth_deg, elevation_deg, projection, target };
        check_camera(&camera)?;
        Ok(camera)
    }
}

/// A camera checked: elevation 5–90°, azimuth finite, a perspective distance of 1 m to 100 km.
///
/// # Errors
/// [`ViewError::Camera`] naming the field.
pub fn check_camera(c: &Camera) -> Result<(), ViewError> {
    if !c.azimuth_deg.is_finite() {
        return Err(ViewError::Camera {
            field: "azimuth_deg",
            range: "a finite number of degrees",
            value: c.azimuth_deg,
        });
    }
    if !(5.0..=90.0).contains(&c.elevation_deg) {
        return Err(ViewError::Camera { field: "elevation_deg", range: "5 to 90 degrees", value: c.elevation_deg });
    }
    if let Projection::Perspective { distance_m } = c.projection {
        if !(1.0..=1e5).contains(&distance_m) {
            return Err(ViewError::Camera { field: "distance_m", range: "1 m to 100 km", value: distance_m });
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests;

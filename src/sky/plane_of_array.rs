//! Irradiance on a tilted surface (a roof, a façade, a collector).
//!
//! # References
//! Beam: DNI·cos θ, θ the angle of incidence (Reda & Andreas 2004, eq. 47). Sky diffuse: the isotropic
//! sky, DHI·(1 + cos β)/2 (Liu, B. Y. H. & Jordan, R. C. 1963, "The long-term average performance of
//! flat-plate solar-energy collectors", Solar Energy 7(2)). Ground reflected: GHI·ρ·(1 − cos β)/2.

use serde::{Deserialize, Serialize};

use super::bird::ClearSky;
use crate::solar::SolarPosition;

/// A plane surface.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Surface {
    /// Slope from horizontal, degrees (0 flat roof, 90 wall).
    pub tilt_deg: f64,
    /// Direction the surface faces, clockwise from true north, degrees (180 faces south).
    pub azimuth_deg: f64,
    /// Albedo of the ground in front of it, 0–1.
    pub albedo: f64,
}

/// Irradiance on a surface, W/m².
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PlaneOfArray {
    /// Angle of incidence of the beam, degrees.
    pub incidence_deg: f64,
    /// Beam irradiance on the plane.
    pub beam_w_m2: f64,
    /// Sky diffuse on the plane (isotropic).
    pub sky_diffuse_w_m2: f64,
    /// Ground-reflected irradiance on the plane.
    pub ground_reflected_w_m2: f64,
    /// Sum of the three.
    pub total_w_m2: f64,
}

/// Plane-of-array irradiance from horizontal clear-sky values and the sun's position.
///
/// # Examples
/// ```
/// use sunlot::sky::{plane_of_array, ClearSky, Surface};
/// # let sun = sunlot::solar::solar_position(&sunlot::solar::Site::new(0.0, 0.0, 0.0)?,
/// #     chrono::DateTime::from_timestamp(0, 0).unwrap(), &Default::default(), Default::default())?;
/// // Isotropic sky on a 40° tilt with DHI 100 W/m²: 88.30222 W/m² (pvlib test_isotropic_float);
/// // ground reflected with GHI 900 W/m², albedo 0.25: 26.32 W/m² (pvlib test_get_ground_diffuse_simple_float).
/// let sky = ClearSky { dni_w_m2: 0.0, dhi_w_m2: 100.0, ghi_w_m2: 900.0 };
/// let p = plane_of_array(&sky, &sun, &Surface { tilt_deg: 40.0, azimuth_deg: 180.0, albedo: 0.25 });
/// assert!((p.sky_diffuse_w_m2 - 88.30222).abs() < 1e-5);
/// assert!((p.ground_reflected_w_m2 - 26.32).abs() < 1e-5);
/// # Ok::<(), sunlot::solar::InputError>(())
/// ```
pub fn plane_of_array(sky: &ClearSky, sun: &SolarPosition, surface: &Surface) -> PlaneOfArray {
    let incidence_deg = sun.incidence_deg(surface.tilt_deg, surface.azimuth_deg);
    let beam = if sun.zenith_deg < 90.0 { sky.dni_w_m2 * incidence_deg.to_radians().cos().max(0.0) } else { 0.0 };
    let cos_b = surface.tilt_deg.to_radians().cos();
    let sky_diffuse = sky.dhi_w_m2 * (1.0 + cos_b) / 2.0;
    let ground = sky.ghi_w_m2 * surface.albedo * (1.0 - cos_b) / 2.0;
    PlaneOfArray {
        incidence_deg,
        beam_w_m2: beam,
        sky_diffuse_w_m2: sky_diffuse,
        ground_reflected_w_m2: ground,
        total_w_m2: beam + sky_diffuse + ground,
    }
}

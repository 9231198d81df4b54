//! Where the sun is, for a site and an instant.

use chrono::{DateTime, Datelike, Utc};
use serde::Serialize;

use super::input::{Atmosphere, InputError, Site};
use super::spa::{Geocentric, Topocentric};
use crate::time::{julian_day, DeltaT};

/// The sun's position seen from a site, from the NREL SPA.
///
/// # Units
/// Degrees, except the equation of time (minutes) and the distance (AU). Azimuth is clockwise from
/// true north, 0–360°. Altitude and zenith are apparent (refracted) unless refraction was switched off.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SolarPosition {
    /// Topocentric zenith angle, degrees (90° − altitude).
    pub zenith_deg: f64,
    /// Topocentric altitude (elevation angle) above the horizon, degrees.
    pub altitude_deg: f64,
    /// Topocentric azimuth, clockwise from true north, degrees 0–360.
    pub azimuth_deg: f64,
    /// Altitude without atmospheric refraction, degrees.
    pub altitude_unrefracted_deg: f64,
    /// Topocentric declination δ′, degrees.
    pub declination_deg: f64,
    /// Topocentric local hour angle H′, degrees, negative before solar noon (−180 to 180).
    pub hour_angle_deg: f64,
    /// Topocentric right ascension α′, degrees 0–360.
    pub right_ascension_deg: f64,
    /// Equation of time (apparent minus mean solar time), minutes.
    pub equation_of_time_min: f64,
    /// Earth–Sun distance, astronomical units.
    pub earth_sun_distance_au: f64,
    /// ΔT used, seconds.
    pub delta_t_s: f64,
}

impl SolarPosition {
    /// Whether the sun's centre is above the (apparent) horizon.
    pub fn is_up(&self) -> bool {
        self.altitude_deg > 0.0
    }

    /// Angle between the sun's direction and the normal of a surface, degrees 0–180 (SPA eq. 47).
    ///
    /// `tilt_deg` is the surface's slope from horizontal (0 flat, 90 a wall); `surface_azimuth_deg` the
    /// direction its face points, clockwise from true north (180 faces south). Above 90° the sun is behind
    /// the surface.
    pub fn incidence_deg(&self, tilt_deg: f64, surface_azimuth_deg: f64) -> f64 {
        let z = self.zenith_deg.to_radians();
        let b = tilt_deg.to_radians();
        let cos_i = z.cos() * b.cos() + b.sin() * z.sin() * (self.azimuth_deg - surface_azimuth_deg).to_radians().cos();
        cos_i.clamp(-1.0, 1.0).acos().to_degrees()
    }

    fn from_parts(geo: &Geocentric, topo: &Topocentric, delta_t_s: f64) -> Self {
        SolarPosition {
            zenith_deg: topo.zenith_deg,
            altitude_deg: 90.0 - topo.zenith_deg,
            azimuth_deg: topo.azimuth_deg,
            altitude_unrefracted_deg: topo.altitude_unrefracted_deg,
            declination_deg: topo.declination_deg,
            hour_angle_deg: wrap_180(topo.hour_angle_deg),
            right_ascension_deg: topo.right_ascension_deg,
            equation_of_time_min: geo.equation_of_time_min,
            earth_sun_distance_au: geo.earth_sun_distance_au,
            delta_t_s,
        }
    }
}

fn wrap_180(deg: f64) -> f64 {
    let a = super::spa::limit_360(deg);
    if a > 180.0 {
        a - 360.0
    } else {
        a
    }
}

/// The time-only part of the sun's position at one instant, to be observed from many sites.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SunAtInstant {
    geo: Geocentric,
    delta_t_s: f64,
}

impl SunAtInstant {
    /// Computes the heliocentric, nutation and geocentric terms for `instant`.
    ///
    /// # Errors
    /// [`InputError::YearOutOfRange`] outside −2000…6000; [`InputError::NotFinite`] for a bad ΔT.
    pub fn new(instant: DateTime<Utc>, delta_t: DeltaT) -> Result<Self, InputError> {
        let (jd, delta_t_s) = Self::checked_inputs(instant, delta_t)?;
        Ok(SunAtInstant { geo: Geocentric::at(jd, delta_t_s), delta_t_s })
    }

    /// The Julian day (UT) and ΔT in seconds of an instant, after checking the year and ΔT.
    pub(crate) fn checked_inputs(instant: DateTime<Utc>, delta_t: DeltaT) -> Result<(f64, f64), InputError> {
        let year = instant.year();
        if !(-2000..=6000).contains(&year) {
            return Err(InputError::YearOutOfRange { year });
        }
        let delta_t_s = super::input::check_delta_t(delta_t.seconds_at(instant))?;
        Ok((julian_day(instant), delta_t_s))
    }

    pub(crate) fn from_geocentric(geo: Geocentric, delta_t_s: f64) -> Self {
        SunAtInstant { geo, delta_t_s }
    }

    /// The geocentric intermediate values (for reports and checks).
    pub fn geocentric(&self) -> &Geocentric {
        &self.geo
    }

    /// The position seen from `site` through `atmosphere`.
    pub fn observe(&self, site: &Site, atmosphere: &Atmosphere) -> SolarPosition {
        let topo = self.topocentric(site, atmosphere);
        SolarPosition::from_parts(&self.geo, &topo, self.delta_t_s)
    }

    /// The full topocentric intermediate values seen from `site`.
    pub fn topocentric(&self, site: &Site, atmosphere: &Atmosphere) -> Topocentric {
        Topocentric::observe(
            &self.geo,
            site.latitude_deg,
            site.longitude_deg,
            site.elevation_m,
            atmosphere.refraction_args(),
        )
    }
}

/// The sun's position at `site` and `instant` (NREL SPA; Reda & Andreas 2004).
///
/// # Examples
/// ```
/// use chrono::{TimeZone, Utc};
/// use sunlot::solar::{solar_position, Atmosphere, Site};
/// use sunlot::time::DeltaT;
/// // The SPA paper's worked example (Reda & Andreas 2004, Table A5.2): zenith 50.11162°, azimuth 194.34024°.
/// let site = Site::new(39.742476, -105.1786, 1830.14)?;
/// let air = Atmosphere::new(820.0, 11.0, true)?;
/// let t = Utc.with_ymd_and_hms(2003, 10, 17, 19, 30, 30).unwrap();
/// let p = solar_position(&site, t, &air, DeltaT::Seconds(67.0))?;
/// assert!((p.zenith_deg - 50.11162).abs() < 5e-6);
/// assert!((p.azimuth_deg - 194.34024).abs() < 5e-6);
/// # Ok::<(), sunlot::solar::InputError>(())
/// ```
///
/// # Errors
/// [`InputError`] for a year outside −2000…6000 or a non-finite ΔT.
pub fn solar_position(
    site: &Site,
    instant: DateTime<Utc>,
    atmosphere: &Atmosphere,
    delta_t: DeltaT,
) -> Result<SolarPosition, InputError> {
    Ok(SunAtInstant::new(instant, delta_t)?.observe(site, atmosphere))
}

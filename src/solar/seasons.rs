//! Equinoxes and solstices: when the sun's apparent longitude is 0°, 90°, 180° and 270°.
//!
//! # References
//! Meeus, J. (1998), *Astronomical Algorithms*, 2nd ed., ch. 27: the instant is found by repeating
//! JDE ← JDE + 58·sin(k·90° − λ) until it settles, λ the apparent geocentric longitude of the sun, here
//! from the NREL SPA's VSOP87 terms, nutation and aberration (Reda & Andreas 2004, eq. 9–27). The result
//! is in TT and is turned into UT with ΔT.

use chrono::{DateTime, Utc};
use serde::Serialize;

use super::input::InputError;
use super::spa::Geocentric;
use crate::time::{instant_from_julian_day, DeltaT};

/// The four season instants of one year, in UT.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Seasons {
    /// Year asked for.
    pub year: i32,
    /// March equinox (apparent longitude 0°).
    pub march_equinox: DateTime<Utc>,
    /// June solstice (90°).
    pub june_solstice: DateTime<Utc>,
    /// September equinox (180°).
    pub september_equinox: DateTime<Utc>,
    /// December solstice (270°).
    pub december_solstice: DateTime<Utc>,
}

/// The Julian ephemeris day (TT) at which the sun's apparent longitude is `target_deg` in `year`.
pub fn season_jde(year: i32, target_deg: f64) -> f64 {
    // Start from the mean tropical year after the 2000 March equinox (JDE 2451623.81, Meeus table 27.b).
    let mut jde = 2_451_623.81 + 365.242_2 * f64::from(year - 2000) + target_deg / 360.0 * 365.242_2;
    for _ in 0..20 {
        let lambda = Geocentric::at(jde, 0.0).apparent_longitude_deg;
        let step = 58.0 * (target_deg - lambda).to_radians().sin();
        jde += step;
        if step.abs() < 1e-8 {
            break;
        }
    }
    jde
}

/// The equinoxes and solstices of `year`, in UT.
///
/// # Errors
/// [`InputError::YearOutOfRange`] outside −2000…6000.
pub fn season_instants(year: i32, delta_t: DeltaT) -> Result<Seasons, InputError> {
    if !(-2000..=6000).contains(&year) {
        return Err(InputError::YearOutOfRange { year });
    }
    let at = |target: f64| {
        let jde = season_jde(year, target);
        let tt = instant_from_julian_day(jde).ok_or(InputError::YearOutOfRange { year })?;
        let dt = super::input::check_delta_t(delta_t.seconds_at(tt))?;
        instant_from_julian_day(jde - dt / 86_400.0).ok_or(InputError::YearOutOfRange { year })
    };
    Ok(Seasons {
        year,
        march_equinox: at(0.0)?,
        june_solstice: at(90.0)?,
        september_equinox: at(180.0)?,
        december_solstice: at(270.0)?,
    })
}

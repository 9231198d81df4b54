//! The observer and the air: validated inputs of the solar engine.

use serde::{Deserialize, Serialize};

/// A number out of its allowed range, or not a number at all; names the field.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum InputError {
    /// NaN or infinite.
    #[error("{field} must be a finite number, got {value}")]
    NotFinite { field: &'static str, value: f64 },
    /// Outside the inclusive range `[min, max]`.
    #[error("{field} must be between {min} and {max}, got {value}")]
    OutOfRange { field: &'static str, value: f64, min: f64, max: f64 },
    /// A year outside the SPA's validity, −2000 to 6000.
    #[error("year {year} is outside the range −2000 to 6000 for which the NREL SPA is valid")]
    YearOutOfRange { year: i32 },
}

/// Checks that `value` is finite and within `[min, max]`.
pub(crate) fn check(field: &'static str, value: f64, min: f64, max: f64) -> Result<f64, InputError> {
    if !value.is_finite() {
        return Err(InputError::NotFinite { field, value });
    }
    if value < min || value > max {
        return Err(InputError::OutOfRange { field, value, min, max });
    }
    Ok(value)
}

/// The ΔT values accepted, seconds: the Espenak–Meeus long-term parabola gives about 46,700 s at −2000
/// and 55,900 s at 6000, the ends of the SPA's years; the bounds leave room for user values around them.
pub(crate) const DELTA_T_RANGE_S: (f64, f64) = (-8_000.0, 100_000.0);

/// Checks a ΔT in seconds against [`DELTA_T_RANGE_S`].
pub(crate) fn check_delta_t(seconds: f64) -> Result<f64, InputError> {
    check("delta_t_s", seconds, DELTA_T_RANGE_S.0, DELTA_T_RANGE_S.1)
}

/// A point on the Earth where the sun is observed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Site {
    /// Geodetic latitude, degrees, north positive, −90 to 90.
    pub latitude_deg: f64,
    /// Longitude, degrees, east positive, −180 to 180.
    pub longitude_deg: f64,
    /// Height above mean sea level, metres.
    pub elevation_m: f64,
}

impl Site {
    /// Lowest elevation accepted, metres (the Dead Sea shore is about −430 m; common practice).
    pub const MIN_ELEVATION_M: f64 = -500.0;
    /// Highest elevation accepted, metres (above the highest summit; common practice).
    pub const MAX_ELEVATION_M: f64 = 9_000.0;

    /// A validated site.
    ///
    /// # Errors
    /// [`InputError`] naming `latitude_deg`, `longitude_deg` or `elevation_m`.
    pub fn new(latitude_deg: f64, longitude_deg: f64, elevation_m: f64) -> Result<Self, InputError> {
        Ok(Site {
            latitude_deg: check("latitude_deg", latitude_deg, -90.0, 90.0)?,
            longitude_deg: check("longitude_deg", longitude_deg, -180.0, 180.0)?,
            elevation_m: check("elevation_m", elevation_m, Self::MIN_ELEVATION_M, Self::MAX_ELEVATION_M)?,
        })
    }
}

/// The air between the observer and the sun, for atmospheric refraction (SPA eq. 42).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Atmosphere {
    /// Annual mean local air pressure, hectopascals (= millibars).
    pub pressure_hpa: f64,
    /// Annual mean local air temperature, degrees Celsius.
    pub temperature_c: f64,
    /// Whether refraction is applied; off gives the true geometric position.
    pub refraction: bool,
}

impl Default for Atmosphere {
    /// The standard atmosphere at sea level: 1013.25 hPa (ISO 2533) and 10 °C (a common default).
    fn default() -> Self {
        Atmosphere { pressure_hpa: 1013.25, temperature_c: 10.0, refraction: true }
    }
}

impl Atmosphere {
    /// A validated atmosphere: pressure 0–5000 hPa and temperature −273 to 6000 °C, the SPA's limits.
    ///
    /// # Errors
    /// [`InputError`] naming `pressure_hpa` or `temperature_c`.
    pub fn new(pressure_hpa: f64, temperature_c: f64, refraction: bool) -> Result<Self, InputError> {
        Ok(Atmosphere {
            pressure_hpa: check("pressure_hpa", pressure_hpa, 0.0, 5_000.0)?,
            temperature_c: check("temperature_c", temperature_c, -272.0, 6_000.0)?,
            refraction,
        })
    }

    /// Pressure and temperature for the SPA, or `None` when refraction is off.
    pub(crate) fn refraction_args(&self) -> Option<(f64, f64)> {
        self.refraction.then_some((self.pressure_hpa, self.temperature_c))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn latitude_beyond_90_names_the_field() {
        let e = Site::new(91.0, 0.0, 0.0).unwrap_err();
        assert_eq!(e.to_string(), "latitude_deg must be between -90 and 90, got 91");
    }

    #[test]
    fn nan_longitude_is_refused() {
        assert!(matches!(Site::new(0.0, f64::NAN, 0.0), Err(InputError::NotFinite { field: "longitude_deg", .. })));
    }

    #[test]
    fn negative_pressure_is_refused() {
        assert!(matches!(Atmosphere::new(-1.0, 10.0, true), Err(InputError::OutOfRange { field: "pressure_hpa", .. })));
    }
}

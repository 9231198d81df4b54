//! The Bird clear-sky model for direct and diffuse irradiance on the horizontal.
//!
//! # References
//! Bird, R. E. & Hulstrom, R. L. (1981), "A simplified clear sky model for direct and diffuse
//! insolation on horizontal surfaces", SERI/TR-642-761, Solar Energy Research Institute; broadband
//! aerosol optical depth from Bird & Hulstrom (1980), 0.27583·τ₃₈₀ + 0.35·τ₅₀₀. Checked in
//! `tests/clear_sky.rs` against pvlib-python's `clearsky.bird` (which follows Myers 2013, pp. 46–51).

use serde::{Deserialize, Serialize};

use super::air_mass::{absolute_air_mass, relative_air_mass_kasten_young};
use crate::solar::InputError;

/// The clear atmosphere the Bird model sees.
///
/// The default is a clear rural mid-latitude sky of our choosing (common practice for such studies):
/// aerosol optical depth 0.15 at 380 nm and 0.10 at 500 nm, 1.5 cm of precipitable water, 0.3 cm of
/// ozone, forward-scattering ratio 0.85 (the value of Myers 2013 and pvlib), ground albedo 0.2 and the
/// sea-level pressure 1013.25 hPa.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct BirdAtmosphere {
    /// Aerosol optical depth at 380 nm, dimensionless.
    pub aod_380: f64,
    /// Aerosol optical depth at 500 nm, dimensionless.
    pub aod_500: f64,
    /// Precipitable water, centimetres.
    pub precipitable_water_cm: f64,
    /// Ozone column, centimetres (atm-cm).
    pub ozone_cm: f64,
    /// Aerosol forward-scattering ratio, dimensionless.
    pub forward_scattering: f64,
    /// Ground albedo, 0–1.
    pub albedo: f64,
    /// Surface air pressure, hectopascals.
    pub pressure_hpa: f64,
}

impl Default for BirdAtmosphere {
    fn default() -> Self {
        BirdAtmosphere {
            aod_380: 0.15,
            aod_500: 0.10,
            precipitable_water_cm: 1.5,
            ozone_cm: 0.3,
            forward_scattering: 0.85,
            albedo: 0.2,
            pressure_hpa: 1013.25,
        }
    }
}

impl BirdAtmosphere {
    /// Checks every field's range, naming the first one out of it.
    ///
    /// # Errors
    /// [`InputError`] naming the field.
    pub fn validated(self) -> Result<Self, InputError> {
        let c = crate::solar::check_range;
        c("aod_380", self.aod_380, 0.0, 5.0)?;
        c("aod_500", self.aod_500, 0.0, 5.0)?;
        c("precipitable_water_cm", self.precipitable_water_cm, 0.0, 15.0)?;
        c("ozone_cm", self.ozone_cm, 0.0, 1.0)?;
        c("forward_scattering", self.forward_scattering, 0.0, 1.0)?;
        c("albedo", self.albedo, 0.0, 1.0)?;
        c("pressure_hpa", self.pressure_hpa, 1.0, 1_200.0)?;
        Ok(self)
    }
}

/// Clear-sky irradiance, W/m².
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct ClearSky {
    /// Direct normal irradiance (beam on a plane facing the sun).
    pub dni_w_m2: f64,
    /// Diffuse horizontal irradiance.
    pub dhi_w_m2: f64,
    /// Global horizontal irradiance (beam on the horizontal plus diffuse).
    pub ghi_w_m2: f64,
}

/// Bird & Hulstrom (1981) clear-sky irradiance for the sun at `zenith_deg` (apparent), with
/// `extraterrestrial_w_m2` the irradiance normal to the sun above the atmosphere. Zero at night.
pub fn bird_clear_sky(zenith_deg: f64, extraterrestrial_w_m2: f64, atm: &BirdAtmosphere) -> ClearSky {
    let Some(am) = relative_air_mass_kasten_young(zenith_deg).filter(|_| zenith_deg < 90.0) else {
        return ClearSky::default();
    };
    let am_p = absolute_air_mass(am, atm.pressure_hpa);
    let t_rayleigh = (-0.0903 * am_p.powf(0.84) * (1.0 + am_p - am_p.powf(1.01))).exp();
    let x_o = atm.ozone_cm * am;
    let t_ozone = 1.0
        - 0.1611 * x_o * (1.0 + 139.48 * x_o).powf(-0.3034)
        - 0.002715 * x_o / (1.0 + 0.044 * x_o + 0.0003 * x_o * x_o);
    let t_gases = (-0.0127 * am_p.powf(0.26)).exp();
    let x_w = atm.precipitable_water_cm * am;
    let t_water = 1.0 - 2.4959 * x_w / ((1.0 + 79.034 * x_w).powf(0.6828) + 6.385 * x_w);
    let tau_a = 0.275_83 * atm.aod_380 + 0.35 * atm.aod_500;
    let t_aerosol = (-(tau_a.powf(0.873)) * (1.0 + tau_a - tau_a.powf(0.7088)) * am.powf(0.9108)).exp();
    let t_aa = 1.0 - 0.1 * (1.0 - am + am.powf(1.06)) * (1.0 - t_aerosol);
    let sky_albedo = 0.0685 + (1.0 - atm.forward_scattering) * (1.0 - t_aerosol / t_aa);

    let dni = 0.9662 * extraterrestrial_w_m2 * t_aerosol * t_water * t_gases * t_ozone * t_rayleigh;
    let cos_z = zenith_deg.to_radians().cos();
    let beam_h = dni * cos_z;
    let scattered = extraterrestrial_w_m2
        * cos_z
        * 0.79
        * t_ozone
        * t_gases
        * t_water
        * t_aa
        * (0.5 * (1.0 - t_rayleigh) + atm.forward_scattering * (1.0 - t_aerosol / t_aa))
        / (1.0 - am + am.powf(1.02));
    let ghi = (beam_h + scattered) / (1.0 - atm.albedo * sky_albedo);
    ClearSky { dni_w_m2: dni, dhi_w_m2: ghi - beam_h, ghi_w_m2: ghi }
}

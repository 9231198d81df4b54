//! Clear-sky irradiance: extraterrestrial sunlight, air mass, the Bird clear-sky model and the
//! irradiance on tilted surfaces. All irradiances are in W/m².

mod air_mass;
mod bird;
mod extraterrestrial;
mod plane_of_array;

pub use air_mass::{absolute_air_mass, relative_air_mass_kasten_young};
pub use bird::{bird_clear_sky, BirdAtmosphere, ClearSky};
pub use extraterrestrial::{earth_sun_distance_factor, extraterrestrial_normal_w_m2, SOLAR_CONSTANT_W_M2};
pub use plane_of_array::{plane_of_array, PlaneOfArray, Surface};

//! The sun's apparent motion: position (NREL SPA), day events and season instants.

mod ephemeris;
mod events;
mod input;
mod position;
mod seasons;
pub mod spa;
mod terms;

pub use ephemeris::Ephemeris;
pub use events::{day_events, rise_transit_set_ut, Crossing, DayEvents, UtDayEvents, CIVIL_TWILIGHT_DEG, SUNRISE_DEG};
pub(crate) use input::check as check_range;
pub use input::{Atmosphere, InputError, Site};
pub use position::{solar_position, SolarPosition, SunAtInstant};
pub use seasons::{season_instants, season_jde, Seasons};

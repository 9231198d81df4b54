//! # sunlot
//!
//! Sun-exposure analysis for building lots, as a pure Rust core that runs natively and in WebAssembly.
//!
//! ## Conventions (held everywhere in the crate)
//! - **Angles** are in degrees. Azimuth is measured clockwise from true north, 0–360° (90° east,
//!   180° south). Altitude (elevation angle) is above the horizon; zenith = 90° − altitude.
//! - **Latitude** north positive, **longitude** east positive, on WGS84; **heights** in metres above
//!   local ground. **Plan** coordinates: x east, y north (of the plan), metres.
//! - **Instants** are `chrono::DateTime<Utc>`; a [`time::Zone`] (IANA or fixed offset) goes with them
//!   for reading and writing local clock times. Local times that a daylight-saving change skips or
//!   repeats are never guessed: see [`time::Zone::resolve`].
//! - **Units** are in names (`height_m`, `irradiance_w_m2`, `step_min`) or in types.
//! - "The sun is down" is a value, never an error; bad input is a typed error naming the field.
//!
//! ## Modules
//! - [`time`]: zones, RFC 3339 and local times, Julian days, ΔT.
//! - [`solar`]: the sun's position (NREL SPA), day events, equinoxes and solstices.
//! - [`sky`]: clear-sky irradiance (Bird), air mass (Kasten–Young), tilted surfaces.
//! - [`site`]: the site model: massing volumes and walls in the plan frame.
//! - [`shadow`]: exact shadow polygons of the massing and their union.
//! - [`exposure`]: analysis grids, exact rasterising, hours of direct sun per cell.
//! - [`daylight`]: the sky component of windows and planes under the CIE overcast sky.
//! - [`limits`]: the budget every request is checked against before any allocation.
//! - [`demo`]: the invented demo scenario.
//! - `web` (wasm32 only): the JavaScript facade.

pub mod daylight;
pub mod demo;
pub mod envelope;
pub mod exposure;
pub(crate) mod json_check;
pub mod limits;
pub mod render;
pub mod rules;
pub mod shadow;
pub mod site;
pub mod sky;
pub mod solar;
pub mod time;
pub mod view3d;

#[cfg(target_arch = "wasm32")]
pub mod web;

pub use solar::{day_events, season_instants, solar_position, Atmosphere, DayEvents, Seasons, Site, SolarPosition};
pub use time::{DeltaT, Zone};

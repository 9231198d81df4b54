//! The demo scenario: an invented site used by the README's main command and the demo pages.
//!
//! "Hollin Vale" and its street are made up; the coordinates are plausible for a small town in a
//! temperate northern climate and name no real property.

use crate::solar::Site;

/// Name of the invented demo site.
pub const DEMO_SITE_NAME: &str = "Hollin Vale, 14 Tenter Lane (invented)";

/// IANA zone of the demo site.
pub const DEMO_ZONE: &str = "Europe/London";

/// The demo site: 52.62° N, 1.87° W, 118 m above sea level.
pub fn demo_site() -> Site {
    Site { latitude_deg: 52.62, longitude_deg: -1.87, elevation_m: 118.0 }
}

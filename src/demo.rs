//! The demo scenario: an invented site used by the README's main command and the demo pages.
//!
//! The data lives in `demo-site/hollin-vale.json` and is compiled in, so the demo needs no files at run
//! time. "Hollin Vale" and its street are made up; the coordinates name no real property.

use serde::Deserialize;

use crate::solar::Site;
use crate::time::Zone;

const DEMO_JSON: &str = include_str!("../demo-site/hollin-vale.json");

/// The demo site as stored in `demo-site/hollin-vale.json`.
#[derive(Debug, Clone, Deserialize)]
pub struct DemoSite {
    /// Display name (invented).
    pub name: String,
    /// Latitude, degrees north.
    pub latitude_deg: f64,
    /// Longitude, degrees east.
    pub longitude_deg: f64,
    /// Ground elevation above sea level, metres.
    pub elevation_m: f64,
    /// IANA time zone.
    pub zone: String,
}

/// The demo scenario, parsed from the compiled-in JSON (checked by this module's tests).
pub fn demo() -> DemoSite {
    serde_json::from_str(DEMO_JSON).expect("demo-site/hollin-vale.json is valid (tested)")
}

/// The demo site's location.
pub fn demo_site() -> Site {
    let d = demo();
    Site { latitude_deg: d.latitude_deg, longitude_deg: d.longitude_deg, elevation_m: d.elevation_m }
}

/// The demo site's zone.
pub fn demo_zone() -> Zone {
    demo().zone.parse().unwrap_or_else(|_| Zone::utc())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_data_parses_and_is_valid() {
        let d = demo();
        assert!(Site::new(d.latitude_deg, d.longitude_deg, d.elevation_m).is_ok());
        assert!(d.zone.parse::<Zone>().is_ok());
        assert!(d.name.contains("invented"));
    }
}

//! The demo scenario: an invented site used by the README's main command and the demo pages.
//!
//! The data lives in `demo-site/hollin-vale.site.json` (a sunlot site file) and is compiled in, so the
//! demo needs no files at run time. "Hollin Vale", its streets, houses and the proposal are made up;
//! the coordinates name no real property.

use crate::site::SiteModel;
use crate::solar::Site;
use crate::time::Zone;

/// The demo site file's text.
pub const DEMO_SITE_JSON: &str = include_str!("../demo-site/hollin-vale.site.json");

/// The demo scenario (checked by this module's tests).
pub fn demo() -> SiteModel {
    SiteModel::from_json(DEMO_SITE_JSON).expect("demo-site/hollin-vale.site.json is valid (tested)")
}

/// The demo site's location.
pub fn demo_site() -> Site {
    demo().location
}

/// The demo site's zone.
pub fn demo_zone() -> Zone {
    demo().zone
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_data_parses_and_is_invented() {
        let d = demo();
        assert!(d.name.contains("invented"));
        assert!(!d.volumes.is_empty() && !d.areas.is_empty());
        assert_eq!(d.zone.to_string(), "Europe/London");
    }
}

//! The site model: massing volumes and walls in a local plan frame (x east, y north, metres, heights
//! above local ground), the lots and areas, sunlot's site file, and the placing of a scanned plan under it.

mod file;
mod footprints;
mod frame;
mod geojson_io;
mod massing;
mod terrain;
#[cfg(test)]
pub(crate) mod test_sites;
mod underlay;
mod windows;

pub use file::{Area, AreaKind, ReadSite, SiteFileError, SiteModel, SiteReadError, SITE_FILE_VERSION};
pub use footprints::{
    is_plain, suggested_zone, zone_from_longitude, FootprintOptions, Imported, BASE_KEYS, DEFAULT_STOREY_HEIGHT_M,
    HEIGHT_KEYS, LEVEL_KEYS,
};
pub use frame::LocalFrame;
pub use geojson_io::{GeoJsonError, PROPERTY_NAMES};
pub use massing::{SiteError, Status, Volume, Wall};
pub use terrain::Ground;
pub use underlay::{Placement, UnderlayError};
pub use windows::WindowPoint;

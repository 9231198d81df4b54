//! The site model: massing volumes and walls in a local plan frame (x east, y north, metres, heights
//! above local ground). File formats and the lots and areas come with the site files.

mod massing;

pub use massing::{SiteError, Status, Volume, Wall};

//! Small sites for the crate's unit tests: flat ground in UTC at a latitude, and square blocks.

use super::{Ground, SiteModel, Status, Volume};
use crate::time::Zone;

/// A flat site at `latitude_deg` on the prime meridian, zone UTC, with `volumes` only.
pub(crate) fn flat_site(volumes: Vec<Volume>, latitude_deg: f64) -> SiteModel {
    SiteModel {
        name: "test site".into(),
        location: crate::Site::new(latitude_deg, 0.0, 0.0).unwrap(),
        zone: Zone::utc(),
        plan_rotation_deg: 0.0,
        ground: Ground::flat(),
        areas: vec![],
        volumes,
        walls: vec![],
        windows: vec![],
    }
}

/// An existing block over the plan rectangle (`x0`, `y0`)–(`x1`, `y1`), from the ground to `top` m.
pub(crate) fn block(id: &str, x0: f64, y0: f64, x1: f64, y1: f64, top: f64) -> Volume {
    Volume::from_vertices(id, Status::Existing, &[(x0, y0), (x1, y0), (x1, y1), (x0, y1)], 0.0, top).unwrap()
}

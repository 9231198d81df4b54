//! Points at height: is a point in direct sun, and what skyline of obstructions does it see.
//!
//! Exact ray tests against the massing: the ray from the point toward the sun is followed in plan; a
//! volume blocks it where the ray's height lies between the volume's base and top over the stretch
//! where the ray is above its footprint; a wall blocks it where the ray crosses the wall below its top.
//! A point on a façade counts as just in front of it: the ray must run inside a footprint for more
//! than a micrometre to be blocked.

use geo::{Contains, Coord, Line, Point, Polygon};
use serde::Serialize;

use super::cast::{shadow_offset_per_m, ShadowError};
use super::ground::{volume_levels_m, Receiver};
use crate::site::{Volume, Wall};

/// A stretch shorter than this counts as touching, not crossing, metres.
const TOUCH_M: f64 = 1e-6;

/// A point of the site: plan position and height above ground, metres.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ViewPoint {
    /// Plan x (east), metres.
    pub x_m: f64,
    /// Plan y (north), metres.
    pub y_m: f64,
    /// Height above ground, metres.
    pub z_m: f64,
}

/// Whether a point receives direct sun.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Exposure {
    /// The sun is not above the horizon.
    NoSun,
    /// Direct sun reaches the point.
    Sunlit,
    /// The ray toward the sun is blocked; `by` names the first feature found in the way.
    Shaded { by: String },
}

/// Unit plan vector toward azimuth `az_deg` (clockwise from plan north).
fn toward(az_deg: f64) -> Coord<f64> {
    let (s, c) = az_deg.to_radians().sin_cos();
    Coord { x: s, y: c }
}

/// Distances along the plan ray from `origin` in `dir` (a unit vector), up to `d_max`, over which the
/// ray is inside `footprint`, as `(from, to)` pairs in metres. The ray is cut at every ring edge it
/// meets and each piece is classified by its midpoint (exact point-in-polygon predicates).
fn inside_stretches(footprint: &Polygon<f64>, origin: Coord<f64>, dir: Coord<f64>, d_max: f64) -> Vec<(f64, f64)> {
    let mut cuts = vec![0.0, d_max];
    let rings = std::iter::once(footprint.exterior()).chain(footprint.interiors());
    for edge in rings.flat_map(|r| r.lines()) {
        let e = edge.end - edge.start;
        let w = edge.start - origin;
        let denom = dir.x * e.y - dir.y * e.x;
        if denom.abs() < 1e-12 {
            continue; // parallel to the edge: the pieces on either side are classified anyway
        }
        let d = (w.x * e.y - w.y * e.x) / denom;
        let s = (w.x * dir.y - w.y * dir.x) / denom;
        if (0.0..=1.0).contains(&s) && d > 0.0 && d < d_max {
            cuts.push(d);
        }
    }
    cuts.sort_by(f64::total_cmp);
    let mut out: Vec<(f64, f64)> = Vec::new();
    for pair in cuts.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        if b - a <= TOUCH_M {
            continue;
        }
        let mid = origin + dir * ((a + b) / 2.0);
        if footprint.contains(&Point::from(mid)) {
            match out.last_mut() {
                Some(last) if (last.1 - a).abs() <= TOUCH_M => last.1 = b,
                _ => out.push((a, b)),
            }
        }
    }
    out
}

/// Distance along the ray at which it crosses wall segment `seg`, if it does.
fn crossing(seg: &Line<f64>, origin: Coord<f64>, dir: Coord<f64>) -> Option<f64> {
    let e = seg.end - seg.start;
    let denom = dir.x * e.y - dir.y * e.x;
    if denom.abs() < 1e-12 {
        return None; // parallel: a wall seen edge-on blocks no area of sky
    }
    let w = seg.start - origin;
    let d = (w.x * e.y - w.y * e.x) / denom; // along the ray
    let s = (w.x * dir.y - w.y * dir.x) / denom; // along the wall, 0…1
    (d > TOUCH_M && (0.0..=1.0).contains(&s)).then_some(d)
}

/// Whether `point` is in direct sun for the sun at `azimuth_deg` (plan frame) and `altitude_deg`.
///
/// # Errors
/// [`ShadowError::NotFinite`] for a non-finite coordinate or angle.
pub fn exposure(
    point: ViewPoint,
    volumes: &[Volume],
    walls: &[Wall],
    ground: &Receiver,
    azimuth_deg: f64,
    altitude_deg: f64,
) -> Result<Exposure, ShadowError> {
    for (field, value) in [
        ("x_m", point.x_m),
        ("y_m", point.y_m),
        ("z_m", point.z_m),
        ("azimuth_deg", azimuth_deg),
        ("altitude_deg", altitude_deg),
    ] {
        if !value.is_finite() {
            return Err(ShadowError::NotFinite { field, value });
        }
    }
    if altitude_deg <= 0.0 {
        return Ok(Exposure::NoSun);
    }
    let rise = altitude_deg.to_radians().tan(); // metres up per metre along
    let origin = Coord { x: point.x_m, y: point.y_m };
    let dir = toward(azimuth_deg);
    if shadow_offset_per_m(azimuth_deg, altitude_deg).is_some_and(|o| !ground.faces_sun(o)) {
        return Ok(Exposure::Shaded { by: "ground".into() });
    }
    let z0 = ground.ground_m(origin) + point.z_m;
    for v in volumes {
        let (zb, zt) = volume_levels_m(v, ground);
        let d_hi = (zt - z0) / rise;
        if d_hi <= 0.0 {
            continue; // the ray is already above the top
        }
        let d_lo = ((zb - z0) / rise).max(0.0);
        if inside_stretches(&v.footprint, origin, dir, d_hi).iter().any(|&(a, b)| b.min(d_hi) - a.max(d_lo) > TOUCH_M) {
            return Ok(Exposure::Shaded { by: v.id.clone() });
        }
    }
    for w in walls {
        for seg in w.line.lines() {
            if let Some(d) = crossing(&seg, origin, dir) {
                if z0 + d * rise < ground.ground_m(origin + dir * d) + w.height_m {
                    return Ok(Exposure::Shaded { by: w.id.clone() });
                }
            }
        }
    }
    Ok(Exposure::Sunlit)
}

/// The obstruction skyline seen from `point`: for each azimuth from 0° in steps of `step_deg` (plan
/// frame), the highest altitude of any obstruction's top, degrees (0 where the horizon is clear).
/// Only obstructions within `reach_m` are seen. Overhangs are drawn as solid up to their top, as on a
/// sun-path diagram; use [`exposure`] for the exact answer at one moment.
///
/// # Errors
/// [`ShadowError::NotFinite`] for bad numbers; [`ShadowError::OutOfRange`] for a step outside 0.01…90°.
pub fn skyline(
    point: ViewPoint,
    volumes: &[Volume],
    walls: &[Wall],
    ground: &Receiver,
    step_deg: f64,
    reach_m: f64,
) -> Result<Vec<(f64, f64)>, ShadowError> {
    if !(0.01..=90.0).contains(&step_deg) {
        return Err(ShadowError::OutOfRange { field: "step_deg", value: step_deg, min: 0.01, max: 90.0 });
    }
    for (field, value) in [("x_m", point.x_m), ("y_m", point.y_m), ("z_m", point.z_m), ("reach_m", reach_m)] {
        if !value.is_finite() {
            return Err(ShadowError::NotFinite { field, value });
        }
    }
    let origin = Coord { x: point.x_m, y: point.y_m };
    let z0 = ground.ground_m(origin) + point.z_m;
    let levels: Vec<(f64, f64)> = volumes.iter().map(|v| volume_levels_m(v, ground)).collect();
    let n = (360.0 / step_deg).round() as usize;
    let mut out = Vec::with_capacity(n);
    for k in 0..n {
        let az = k as f64 * step_deg;
        let dir = toward(az);
        // Sloping ground rises above the horizontal uphill: atan(k · direction).
        let uphill = ground.gradient.x * dir.x + ground.gradient.y * dir.y;
        let mut best = uphill.atan().to_degrees().max(0.0);
        for (v, &(_, zt)) in volumes.iter().zip(&levels).filter(|(_, l)| l.1 > z0) {
            if let Some(&(near, _)) = inside_stretches(&v.footprint, origin, dir, reach_m).first() {
                best = best.max((zt - z0).atan2(near).to_degrees());
            }
        }
        for w in walls {
            for seg in w.line.lines() {
                if let Some(d) = crossing(&seg, origin, dir).filter(|&d| d <= reach_m) {
                    let top = ground.ground_m(origin + dir * d) + w.height_m;
                    if top > z0 {
                        best = best.max((top - z0).atan2(d).to_degrees());
                    }
                }
            }
        }
        out.push((az, best));
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::site::Status;
    use approx::assert_abs_diff_eq;
    use geo::LineString;

    fn flat() -> Receiver {
        Receiver::flat_ground()
    }

    #[test]
    fn slopes_rise_in_the_skyline_and_can_hide_the_sun() {
        // Ground rising 10° to the north (faces south): the skyline due north is at 10°, due south 0°.
        let g = Receiver::on(&crate::site::Ground { slope_deg: 10.0, aspect_deg: 180.0 }, 0.0, 0.0);
        let s = skyline(ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 }, &[], &[], &g, 90.0, 1_000.0).unwrap();
        assert_abs_diff_eq!(s[0].1, 10.0, epsilon = 1e-9);
        assert_eq!(s[2].1, 0.0);
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        assert_eq!(exposure(p, &[], &[], &g, 0.0, 9.0).unwrap(), Exposure::Shaded { by: "ground".into() });
        assert_eq!(exposure(p, &[], &[], &g, 0.0, 11.0).unwrap(), Exposure::Sunlit);
    }

    fn block(x0: f64, y0: f64, w: f64, d: f64, base: f64, top: f64) -> Volume {
        Volume::from_vertices(
            "block",
            Status::Proposed,
            &[(x0, y0), (x0 + w, y0), (x0 + w, y0 + d), (x0, y0 + d)],
            base,
            top,
        )
        .unwrap()
    }

    #[test]
    fn point_behind_a_block_is_shaded_until_the_sun_clears_it() {
        // 10 m block from y = 10 to 20, point at the origin, sun due north (plan) at altitude a:
        // blocked while tan a < 10 / 10, i.e. below 45° (analytic).
        let v = vec![block(-20.0, 10.0, 40.0, 10.0, 0.0, 10.0)];
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 };
        assert_eq!(exposure(p, &v, &[], &flat(), 0.0, 44.9).unwrap(), Exposure::Shaded { by: "block".into() });
        assert_eq!(exposure(p, &v, &[], &flat(), 0.0, 45.1).unwrap(), Exposure::Sunlit);
        assert_eq!(exposure(p, &v, &[], &flat(), 180.0, 10.0).unwrap(), Exposure::Sunlit);
        assert_eq!(exposure(p, &v, &[], &flat(), 0.0, -1.0).unwrap(), Exposure::NoSun);
        // A window 5 m up needs only tan a > 5 / 10.
        let w = ViewPoint { z_m: 5.0, ..p };
        assert_eq!(exposure(w, &v, &[], &flat(), 0.0, 27.0).unwrap(), Exposure::Sunlit);
        assert!(matches!(exposure(w, &v, &[], &flat(), 0.0, 26.0).unwrap(), Exposure::Shaded { .. }));
    }

    #[test]
    fn sun_passes_under_a_bridge() {
        // Slab 6–7 m up, from y = 10 to 14: the ray at 20° reaches 6 m only after 16.5 m, beyond it.
        let v = vec![block(-20.0, 10.0, 40.0, 4.0, 6.0, 7.0)];
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 };
        assert_eq!(exposure(p, &v, &[], &flat(), 0.0, 20.0).unwrap(), Exposure::Sunlit);
        assert!(matches!(exposure(p, &v, &[], &flat(), 0.0, 32.0).unwrap(), Exposure::Shaded { .. }));
        // 6.2–8.7 m over y 10–14
    }

    #[test]
    fn a_point_on_a_facade_faces_away_from_its_own_wall() {
        let v = vec![block(0.0, 0.0, 10.0, 10.0, 0.0, 20.0)];
        let sill = ViewPoint { x_m: 5.0, y_m: 0.0, z_m: 1.0 }; // on the south wall
        assert_eq!(exposure(sill, &v, &[], &flat(), 180.0, 30.0).unwrap(), Exposure::Sunlit);
        assert!(matches!(exposure(sill, &v, &[], &flat(), 0.0, 30.0).unwrap(), Exposure::Shaded { .. }));
    }

    #[test]
    fn walls_block_below_their_top() {
        let wall = Wall {
            id: "fence".into(),
            status: Status::Existing,
            line: LineString::from(vec![(-5.0, 2.0), (5.0, 2.0)]),
            height_m: 2.0,
        };
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 };
        assert!(matches!(
            exposure(p, &[], std::slice::from_ref(&wall), &flat(), 0.0, 40.0).unwrap(),
            Exposure::Shaded { .. }
        ));
        assert_eq!(exposure(p, &[], &[wall], &flat(), 0.0, 46.0).unwrap(), Exposure::Sunlit);
    }

    #[test]
    fn skyline_of_a_block_to_the_north() {
        let v = vec![block(-10.0, 10.0, 20.0, 10.0, 0.0, 10.0)];
        let s = skyline(ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 }, &v, &[], &flat(), 1.0, 1_000.0).unwrap();
        assert_eq!(s.len(), 360);
        assert_abs_diff_eq!(s[0].1, 45.0, epsilon = 1e-9); // due north: atan(10 / 10)
                                                           // At 30° east of north the ray meets the south face at 10 / cos 30° (analytic).
        assert_abs_diff_eq!(s[30].1, (10.0_f64).atan2(10.0 / 30f64.to_radians().cos()).to_degrees(), epsilon = 1e-9);
        assert_eq!(s[90].1, 0.0);
        assert_eq!(s[180].1, 0.0);
    }
}

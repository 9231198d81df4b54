//! Sun on the faces: each face's Lambert factor (the cosine of the sun's angle of incidence, n·s) and
//! the exact part of it in the shadow of the massing, as a polygon in the face's own coordinates.
//!
//! A point of a plane is in shadow when the ray from it toward the sun meets a solid. Only the part of
//! a solid in front of the plane can be met, and the projection along the sun onto the plane is an
//! affine map, so the shadow is the image of that part: on a horizontal plane at height z the existing
//! plan shadows of the volumes' parts above z ([`crate::shadow::volume_shadow`]); on a vertical plane,
//! each volume's footprint clipped to the half-plane in front of the wall, mapped by
//! (u, w) ↦ (u − w·s_u/s_w, −w·s_z/s_w) (u along the wall, w out of it, s the unit vector toward the
//! sun) and swept up from the volume's base to its top — the same Minkowski sweep as a plan shadow.

use geo::orient::{Direction, Orient};
use geo::{BooleanOps, Coord, LineString, MapCoords, MultiPolygon, Polygon};

use super::scene::{Face3, FaceKind, V3};
use crate::shadow::{shadow_offset_per_m, volume_shadow, wall_shadow};
use crate::site::{SiteModel, Volume};

/// Distance in front of a wall below which a solid is taken to touch it (the wall's own volume), metres.
const TOUCH_M: f64 = 1e-6;

/// The unit vector toward a sun at plan azimuth `azimuth_deg` (clockwise from the plan's north) and
/// altitude `altitude_deg`.
pub fn toward_sun(azimuth_deg: f64, altitude_deg: f64) -> V3 {
    let (sa, ca) = azimuth_deg.to_radians().sin_cos();
    let (sh, ch) = altitude_deg.to_radians().sin_cos();
    V3::new(ch * sa, ch * ca, sh)
}

/// How a face meets the sun.
#[derive(Debug, Clone, PartialEq)]
pub struct FaceLight {
    /// cos of the angle of incidence on the side the face is seen from, 0 when the sun is behind
    /// it (for a two-sided face, the side facing the sun).
    pub lambert: f64,
    /// The part of the face in the shadow of the massing, frame coordinates; the whole face when the
    /// sun is behind it or down.
    pub shadow: MultiPolygon<f64>,
}

/// The light on every face of `faces` for the sun at plan azimuth `azimuth_deg`, altitude
/// `altitude_deg`.
pub fn light_faces(model: &SiteModel, faces: &[Face3], azimuth_deg: f64, altitude_deg: f64) -> Vec<FaceLight> {
    let s = toward_sun(azimuth_deg, altitude_deg);
    let offset = shadow_offset_per_m(azimuth_deg, altitude_deg);
    // The shadows on each horizontal plane once: the ground and every area share z = 0, roofs of one
    // height share theirs.
    let mut planes: Vec<(f64, MultiPolygon<f64>)> = Vec::new();
    faces
        .iter()
        .map(|f| {
            if f.kind == FaceKind::Envelope {
                return FaceLight { lambert: 1.0, shadow: MultiPolygon::new(vec![]) };
            }
            let facing = f.frame.normal.dot(s);
            let lambert = if f.two_sided { facing.abs() } else { facing.max(0.0) };
            let (Some(o), true) = (offset, lambert > 1e-12) else {
                return FaceLight { lambert: 0.0, shadow: f.shape.clone() };
            };
            let shadow = match f.kind {
                FaceKind::Ground | FaceKind::Area | FaceKind::Roof => {
                    let z = f.frame.origin.z;
                    let at = match planes.iter().position(|(h, _)| *h == z) {
                        Some(k) => k,
                        None => {
                            planes.push((z, horizontal_shadow(model, o, z)));
                            planes.len() - 1
                        }
                    };
                    f.shape.intersection(&planes[at].1)
                }
                FaceKind::Wall | FaceKind::Fence => {
                    // A fence lit from its back is seen through its other side: flip the frame's normal.
                    let n = if facing < 0.0 { f.frame.normal.scale(-1.0) } else { f.frame.normal };
                    f.shape.intersection(&vertical_shadow(model, f, n, s))
                }
                // Answered above: a tread is neither lit nor shaded.
                FaceKind::Envelope => MultiPolygon::new(vec![]),
            };
            FaceLight { lambert, shadow }
        })
        .collect()
}

/// The shadows of the massing on the horizontal plane at `z_m`, plan coordinates.
fn horizontal_shadow(model: &SiteModel, offset: Coord<f64>, z_m: f64) -> MultiPolygon<f64> {
    let mut parts: Vec<Polygon<f64>> = Vec::new();
    for v in &model.volumes {
        parts.extend(volume_shadow(v, offset, z_m));
    }
    for w in &model.walls {
        parts.extend(wall_shadow(w, offset, z_m));
    }
    geo::unary_union(&parts)
}

/// The shadows of the massing on the vertical face `f` (lit on the side of normal `n`, the sun along
/// `s`), in the face's coordinates (metres along it from its start, metres above the ground).
fn vertical_shadow(model: &SiteModel, f: &Face3, n: V3, s: V3) -> MultiPolygon<f64> {
    let (a, e1) = (f.frame.origin, f.frame.e1);
    let (s_u, s_w, s_z) = (s.dot(e1), s.dot(n), s.z);
    // Plan point p ↦ (u, w) ↦ its shadow's place on the wall at height 0.
    let to_wall = |p: Coord<f64>| {
        let d = V3::new(p.x - a.x, p.y - a.y, 0.0);
        let (u, w) = (d.dot(e1), d.dot(n));
        Coord { x: u - w * s_u / s_w, y: -w * s_z / s_w }
    };
    // The half-plane in front of the wall, in plan: the wall's line pushed out by TOUCH_M, as a
    // rectangle just large enough for the site (a huge one would coarsen the boolean operation's grid).
    let far = 1.0 + reach(model, a);
    let front = {
        let corner = |along: f64, out: f64| {
            let p = a.plus(e1.scale(along)).plus(n.scale(out));
            (p.x, p.y)
        };
        Polygon::new(
            LineString::from(vec![corner(-far, TOUCH_M), corner(far, TOUCH_M), corner(far, far), corner(-far, far)]),
            vec![],
        )
    };
    let mut parts: Vec<Polygon<f64>> = Vec::new();
    for v in &model.volumes {
        let ahead = v.footprint.intersection(&front);
        for piece in ahead {
            let image = piece.map_coords(to_wall);
            // The image swept up from the volume's base to its top: the shadow of a prism.
            let prism = Volume { footprint: image, ..v.clone() };
            parts.extend(volume_shadow(&prism, Coord { x: 0.0, y: 1.0 }, 0.0));
        }
    }
    for w in &model.walls {
        for seg in w.line.lines() {
            let (p, q) = (seg.start, seg.end);
            let (dp, dq) = (depth(p, a, n), depth(q, a, n));
            if dp <= TOUCH_M && dq <= TOUCH_M {
                continue;
            }
            // The part of the segment in front of the wall.
            let cut = |x: Coord<f64>, y: Coord<f64>, dx: f64, dy: f64| x + (y - x) * ((TOUCH_M - dx) / (dy - dx));
            let (p, q) = match (dp > TOUCH_M, dq > TOUCH_M) {
                (true, true) => (p, q),
                (true, false) => (p, cut(p, q, dp, dq)),
                _ => (cut(p, q, dp, dq), q),
            };
            let (p, q) = (to_wall(p), to_wall(q));
            let h = w.height_m;
            parts.push(Polygon::new(
                LineString::from(vec![(p.x, p.y), (q.x, q.y), (q.x, q.y + h), (p.x, p.y + h)]),
                vec![],
            ));
        }
    }
    // Counter-clockwise for the union (a mapped or mirrored piece may come out clockwise).
    let parts: Vec<Polygon<f64>> = parts
        .into_iter()
        .filter(|p| geo::Area::unsigned_area(p) > 1e-12)
        .map(|p| p.orient(Direction::Default))
        .collect();
    geo::unary_union(&parts)
}

/// The greatest plan distance from `a` of a vertex of the site's volumes, metres.
fn reach(model: &SiteModel, a: V3) -> f64 {
    model
        .volumes
        .iter()
        .flat_map(|v| v.footprint.exterior().0.iter())
        .map(|c| ((c.x - a.x).powi(2) + (c.y - a.y).powi(2)).sqrt())
        .fold(0.0, f64::max)
}

/// Distance of plan point `p` in front of the wall through `a` with horizontal normal `n`, metres.
fn depth(p: Coord<f64>, a: V3, n: V3) -> f64 {
    (p.x - a.x) * n.x + (p.y - a.y) * n.y
}

//! Sloping ground: shadows cast onto an inclined plane, and the heights of things standing on it.
//!
//! The ground is the plane z = k·p through the plan origin (k the gradient, metres of rise per metre in
//! plan). A volume's base and top heights are measured from the ground at the lowest point of its
//! footprint; a wall's height from the ground along its line; a point's height from the ground under it.
//!
//! Projecting along the sun onto the plane z = k·p is an affine map, so the shadow of a solid is still
//! the union of the images of its faces. It factors as the projection onto z = 0 (a point at height z
//! moves by z·o, o the flat-ground shadow offset per metre) followed by the shear
//! A·p = p − o·(k·p)/(1 + k·o), which fixes the ground's own points. Only the part of a solid above the
//! receiving plane casts a shadow, so volumes are clipped by it first. When 1 + k·o ≤ 0 the sun is
//! behind the slope and the whole ground is in its own shade.

use crate::site::{Ground, Volume, Wall};
use geo::orient::{Direction, Orient};
use geo::{BooleanOps, Coord, LineString, MapCoords, MultiPolygon, Polygon, Translate};

/// The plane that receives the shadows: the ground, or a plane parallel to it `height_m` above.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Receiver {
    /// Rise per metre in plan x and y (the gradient), metres per metre.
    pub gradient: Coord<f64>,
    /// Height above the ground, metres.
    pub height_m: f64,
}

impl Receiver {
    /// Flat ground.
    pub fn flat_ground() -> Self {
        Receiver { gradient: Coord { x: 0.0, y: 0.0 }, height_m: 0.0 }
    }

    /// The ground of `ground` for a plan turned `plan_rotation_deg`, raised by `height_m`.
    pub fn on(ground: &Ground, plan_rotation_deg: f64, height_m: f64) -> Self {
        Receiver { gradient: ground.gradient(plan_rotation_deg), height_m }
    }

    /// Height of the ground at plan point `p`, metres (0 at the plan origin).
    pub fn ground_m(&self, p: Coord<f64>) -> f64 {
        self.gradient.x * p.x + self.gradient.y * p.y
    }

    fn is_flat(&self) -> bool {
        self.gradient.x == 0.0 && self.gradient.y == 0.0
    }

    /// Whether the sun, with flat-ground offset `o`, is in front of the plane.
    pub fn faces_sun(&self, o: Coord<f64>) -> bool {
        1.0 + self.gradient.x * o.x + self.gradient.y * o.y > 1e-9
    }

    /// The shear from the flat projection onto this plane.
    fn shear(&self, o: Coord<f64>, mp: &MultiPolygon<f64>) -> MultiPolygon<f64> {
        mp.map_coords(|p| self.shear_point(o, p))
    }

    fn shear_polygon(&self, o: Coord<f64>, p: &Polygon<f64>) -> Polygon<f64> {
        p.map_coords(|c| self.shear_point(o, c))
    }

    fn shear_point(&self, o: Coord<f64>, p: Coord<f64>) -> Coord<f64> {
        let k = self.gradient;
        let f = (k.x * p.x + k.y * p.y) / (1.0 + k.x * o.x + k.y * o.y);
        Coord { x: p.x - o.x * f, y: p.y - o.y * f }
    }
}

/// Absolute base and top of a volume: its heights above the ground at the lowest point of its
/// footprint (a building stands on its lowest ground and is cut into the slope uphill, so no underside
/// floats above the ground on a slope).
pub fn volume_levels_m(v: &Volume, r: &Receiver) -> (f64, f64) {
    let g = v.footprint.exterior().coords().map(|c| r.ground_m(*c)).fold(f64::INFINITY, f64::min);
    let g = if g.is_finite() { g } else { 0.0 };
    (g + v.base_m, g + v.top_m)
}

/// The part of `footprint` where `lo ≤ k·p − level` holds and `k·p − level ≤ hi`, for levels measured
/// from the receiving plane: a strip between two lines across a sloping plane.
fn band(footprint: &Polygon<f64>, k: Coord<f64>, lo: f64, hi: f64) -> MultiPolygon<f64> {
    let norm = k.x.hypot(k.y);
    if norm == 0.0 {
        return if lo <= 0.0 && 0.0 <= hi {
            MultiPolygon::new(vec![footprint.clone()])
        } else {
            MultiPolygon::new(vec![])
        };
    }
    // A rectangle spanning the footprint, between the lines k·p = lo and k·p = hi.
    let u = Coord { x: k.x / norm, y: k.y / norm }; // uphill
    let v = Coord { x: -u.y, y: u.x };
    let reach = footprint.exterior().coords().map(|c| c.x.abs() + c.y.abs()).fold(0.0, f64::max) * 2.0 + 1.0;
    let (a, b) = ((lo / norm).max(-reach), (hi / norm).min(reach));
    if a >= b {
        return MultiPolygon::new(vec![]);
    }
    let corner = |s: f64, t: f64| Coord { x: u.x * s + v.x * t, y: u.y * s + v.y * t };
    let strip = Polygon::new(
        LineString::from(vec![
            corner(a, -reach),
            corner(b, -reach),
            corner(b, reach),
            corner(a, reach),
            corner(a, -reach),
        ]),
        vec![],
    );
    footprint.intersection(&strip.orient(Direction::Default))
}

/// The shadow of `v` on the receiving plane `r` for the flat-ground offset `o`; `None` when the sun is
/// behind the plane.
pub fn volume_shadow_on(v: &Volume, o: Coord<f64>, r: &Receiver) -> Option<MultiPolygon<f64>> {
    if !r.faces_sun(o) {
        return None;
    }
    if r.is_flat() {
        return Some(super::cast::volume_shadow(v, o, r.height_m));
    }
    Some(sloped_shadow(v, o, r))
}

/// Pieces whose union is [`volume_shadow_on`], pushed onto `out` without a boolean union (for
/// rasterising); `false` when the sun is behind the plane.
pub fn volume_faces_on(v: &Volume, o: Coord<f64>, r: &Receiver, out: &mut Vec<Polygon<f64>>) -> bool {
    if !r.faces_sun(o) {
        return false;
    }
    if r.is_flat() {
        super::cast::flat_volume_faces(v, o, r.height_m, out);
    } else {
        let from = out.len();
        sloped_faces(v, o, r, out);
        for face in &mut out[from..] {
            *face = r.shear_polygon(o, face);
        }
    }
    true
}

/// The general construction of [`volume_shadow_on`], for any receiving plane in front of the sun.
fn sloped_shadow(v: &Volume, o: Coord<f64>, r: &Receiver) -> MultiPolygon<f64> {
    let mut faces = Vec::new();
    sloped_faces(v, o, r, &mut faces);
    r.shear(o, &geo::unary_union(&faces))
}

/// The faces of [`sloped_shadow`] before the shear onto the plane.
fn sloped_faces(v: &Volume, o: Coord<f64>, r: &Receiver, faces: &mut Vec<Polygon<f64>>) {
    let (zb, zt) = volume_levels_m(v, r);
    // Heights from here on are above the receiving plane's level at the plan origin.
    let (zb, zt) = (zb - r.height_m, zt - r.height_m);
    let k = r.gradient;
    let g = |p: Coord<f64>| k.x * p.x + k.y * p.y;
    let mut push = |mp: MultiPolygon<f64>| faces.extend(mp.0.into_iter().map(|p| p.orient(Direction::Default)));
    // Top and underside, where they are above the plane (g(p) ≤ level).
    push(band(&v.footprint, k, f64::NEG_INFINITY, zt).translate(o.x * zt, o.y * zt));
    push(band(&v.footprint, k, f64::NEG_INFINITY, zb).translate(o.x * zb, o.y * zb));
    // The plane's own piece under the volume, between the two levels: p ↦ p + g(p)·o.
    push(band(&v.footprint, k, zb, zt).map_coords(|p| Coord { x: p.x + o.x * g(p), y: p.y + o.y * g(p) }));
    // Walls: in (t along the edge, z) each is the rectangle [0,1] × [zb, zt] cut by z ≥ g.
    let rings = std::iter::once(v.footprint.exterior()).chain(v.footprint.interiors());
    for e in rings.flat_map(|ring| ring.lines()) {
        let (ga, gc) = (g(e.start), g(e.end));
        let corners = [(0.0, zb), (1.0, zb), (1.0, zt), (0.0, zt)];
        let above = |(t, z): (f64, f64)| z - (ga + t * (gc - ga));
        let mut poly: Vec<(f64, f64)> = Vec::new();
        for i in 0..4 {
            let (p, q) = (corners[i], corners[(i + 1) % 4]);
            let (fp, fq) = (above(p), above(q));
            if fp >= 0.0 {
                poly.push(p);
            }
            if (fp >= 0.0) != (fq >= 0.0) {
                let s = fp / (fp - fq);
                poly.push((p.0 + s * (q.0 - p.0), p.1 + s * (q.1 - p.1)));
            }
        }
        if poly.len() < 3 {
            continue;
        }
        let d = e.delta();
        let ring: Vec<Coord<f64>> = poly
            .iter()
            .map(|&(t, z)| Coord { x: e.start.x + t * d.x + o.x * z, y: e.start.y + t * d.y + o.y * z })
            .collect();
        let quad = Polygon::new(LineString::from(ring), vec![]);
        if geo::Area::unsigned_area(&quad) > 1e-9 {
            faces.push(quad.orient(Direction::Default));
        }
    }
}

/// The shadow of a wall following the ground on the receiving plane; `None` when the sun is behind it.
pub fn wall_shadow_on(w: &Wall, o: Coord<f64>, r: &Receiver) -> Option<MultiPolygon<f64>> {
    let mut quads = Vec::new();
    wall_faces_on(w, o, r, &mut quads).then(|| geo::unary_union(&quads))
}

/// The quadrilaterals whose union is [`wall_shadow_on`], one per segment; `false` when the sun is
/// behind the plane.
pub fn wall_faces_on(w: &Wall, o: Coord<f64>, r: &Receiver, out: &mut Vec<Polygon<f64>>) -> bool {
    if !r.faces_sun(o) {
        return false;
    }
    let k = r.gradient;
    let g = |p: Coord<f64>| k.x * p.x + k.y * p.y;
    let h = w.height_m - r.height_m;
    if h <= 0.0 {
        return true;
    }
    out.extend(
        w.line
            .lines()
            .map(|e| {
                let at = |p: Coord<f64>, z: f64| Coord { x: p.x + o.x * z, y: p.y + o.y * z };
                let (ga, gc) = (g(e.start), g(e.end));
                Polygon::new(
                    LineString::from(vec![
                        at(e.start, ga),
                        at(e.end, gc),
                        at(e.end, gc + h),
                        at(e.start, ga + h),
                        at(e.start, ga),
                    ]),
                    vec![],
                )
            })
            .filter(|q| geo::Area::unsigned_area(q) > 1e-9)
            .map(|q| {
                let q = q.orient(Direction::Default);
                if r.is_flat() {
                    q
                } else {
                    r.shear_polygon(o, &q)
                }
            }),
    );
    true
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::shadow::shadow_offset_per_m;
    use crate::site::Status;
    use approx::assert_abs_diff_eq;
    use geo::{Area, BoundingRect};

    #[test]
    fn pole_on_a_slope_rising_along_its_shadow_is_shorter() {
        // Tip distance t = h / (1 + k·o) (derived in this module's docs; flat ground: k = 0).
        let pole = Volume::from_vertices(
            "pole",
            Status::Existing,
            &[(-0.005, -0.005), (0.005, -0.005), (0.005, 0.005), (-0.005, 0.005)],
            0.0,
            10.0,
        )
        .unwrap();
        let o = shadow_offset_per_m(180.0, 30.0).unwrap(); // shadow to the north
        let ground = Ground { slope_deg: 10.0, aspect_deg: 180.0 }; // faces south: rises to the north
        let r = Receiver::on(&ground, 0.0, 0.0);
        let k_o = r.gradient.x * o.x + r.gradient.y * o.y;
        assert!(k_o > 0.0);
        let s = volume_shadow_on(&pole, o, &r).unwrap();
        let len = s.bounding_rect().unwrap().max().y;
        assert_abs_diff_eq!(len, 10.0 * (o.y) / (1.0 + k_o), epsilon = 0.01);
        assert!(len < 10.0 / 30f64.to_radians().tan());
    }

    #[test]
    fn box_on_a_slope_facing_the_sun() {
        // Box w × d, height h above the ground at its lowest (south) side, sun due south at altitude α,
        // ground rising north with gradient k: the top's north edge stands h − k·d above the ground
        // there, so the shadow is w·(d + s), s = (h − k·d) / (tan α + k) (analytic).
        let (w, d, h, alt) = (10.0, 6.0, 9.0, 35.0_f64);
        let b =
            Volume::from_vertices("box", Status::Existing, &[(0.0, 0.0), (w, 0.0), (w, d), (0.0, d)], 0.0, h).unwrap();
        let ground = Ground { slope_deg: 8.0, aspect_deg: 180.0 };
        let r = Receiver::on(&ground, 0.0, 0.0);
        let k = r.gradient.y;
        let s = volume_shadow_on(&b, shadow_offset_per_m(180.0, alt).unwrap(), &r).unwrap();
        let want = w * (d + (h - k * d) / (alt.to_radians().tan() + k));
        assert_abs_diff_eq!(s.unsigned_area(), want, epsilon = 1e-6);
        // Flat ground through the general path equals the flat formula.
        let flat = volume_shadow_on(&b, shadow_offset_per_m(180.0, alt).unwrap(), &Receiver::flat_ground()).unwrap();
        assert_abs_diff_eq!(flat.unsigned_area(), w * (d + h / alt.to_radians().tan()), epsilon = 1e-6);
    }

    #[test]
    fn general_construction_on_flat_ground_equals_the_flat_one() {
        use geo::BooleanOps;
        let outer = LineString::from(vec![(0.0, 0.0), (30.0, 0.0), (30.0, 30.0), (0.0, 30.0), (0.0, 0.0)]);
        let hole = LineString::from(vec![(10.0, 10.0), (20.0, 10.0), (20.0, 20.0), (10.0, 20.0), (10.0, 10.0)]);
        let court = Volume::new("court", Status::Existing, Polygon::new(outer, vec![hole]), 2.0, 9.0).unwrap();
        let l = Volume::from_vertices(
            "L",
            Status::Existing,
            &[(0.0, 0.0), (10.0, 0.0), (10.0, 4.0), (4.0, 4.0), (4.0, 10.0), (0.0, 10.0)],
            0.0,
            6.0,
        )
        .unwrap();
        for v in [court, l] {
            for (az, alt, plane) in [(200.0, 25.0, 0.0), (95.0, 50.0, 0.0), (310.0, 12.0, 3.0)] {
                let o = shadow_offset_per_m(az, alt).unwrap();
                let r = Receiver { height_m: plane, ..Receiver::flat_ground() };
                let a = sloped_shadow(&v, o, &r);
                let b = crate::shadow::volume_shadow(&v, o, plane);
                assert!(a.xor(&b).unsigned_area() < 1e-6 * b.unsigned_area(), "{} {az} {alt}", v.id);
            }
        }
    }

    #[test]
    fn sun_behind_the_slope_shades_all_ground() {
        // A 30° slope facing north with the sun due south at 20°: the sun is behind the hillside.
        let r = Receiver::on(&Ground { slope_deg: 30.0, aspect_deg: 0.0 }, 0.0, 0.0);
        let b =
            Volume::from_vertices("b", Status::Existing, &[(0.0, 0.0), (1.0, 0.0), (1.0, 1.0), (0.0, 1.0)], 0.0, 1.0)
                .unwrap();
        assert!(volume_shadow_on(&b, shadow_offset_per_m(180.0, 20.0).unwrap(), &r).is_none());
    }
}

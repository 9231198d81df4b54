//! Casting the shadows of volumes onto a horizontal plane.

use geo::orient::{Direction, Orient};
use geo::{
    unary_union, Area, BooleanOps, BoundingRect, Coord, IsConvex, LineString, MultiPolygon, Polygon, Rect, Translate,
};

use super::ground::{volume_shadow_on, wall_shadow_on, Receiver};
use crate::site::{Volume, Wall};

/// Below this area a face's shadow is a sliver of an edge seen end-on and is left out, m².
const SLIVER_M2: f64 = 1e-9;

/// Problems with a shadow request.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ShadowError {
    /// The analysis extent has no area or is not finite.
    #[error("the analysis extent must be a finite rectangle with an area, got {min_x}…{max_x} × {min_y}…{max_y} m")]
    BadExtent { min_x: f64, max_x: f64, min_y: f64, max_y: f64 },
    /// A number outside its range.
    #[error("{field} must be between {min} and {max}, got {value}")]
    OutOfRange { field: &'static str, value: f64, min: f64, max: f64 },
    /// An angle that is not a finite number.
    #[error("{field} must be a finite number, got {value}")]
    NotFinite { field: &'static str, value: f64 },
}

/// Horizontal displacement of the shadow of a point per metre of its height above the receiving plane,
/// in the plan frame (x east, y north when the plan is drawn to true north), metres per metre.
///
/// `azimuth_deg` is the sun's azimuth in the plan frame (clockwise from the plan's north), `altitude_deg`
/// its altitude. The shadow falls away from the sun: direction azimuth + 180°, length 1 / tan(altitude)
/// (common practice). `None` when the sun is not above the horizon.
pub fn shadow_offset_per_m(azimuth_deg: f64, altitude_deg: f64) -> Option<Coord<f64>> {
    if !(altitude_deg > 0.0 && altitude_deg.is_finite() && azimuth_deg.is_finite()) {
        return None;
    }
    let len = 1.0 / altitude_deg.to_radians().tan();
    let (s, c) = azimuth_deg.to_radians().sin_cos();
    Some(Coord { x: -s * len, y: -c * len })
}

/// Length of the shadow per metre of height on flat ground, 1 / tan(altitude), metres per metre; `None`
/// when the sun is not above the horizon (common practice).
///
/// # Examples
/// ```
/// // At 45° altitude a pole casts a shadow as long as it is tall.
/// assert!((sunlot::shadow::shadow_length_per_m(45.0).unwrap() - 1.0).abs() < 1e-12);
/// ```
pub fn shadow_length_per_m(altitude_deg: f64) -> Option<f64> {
    (altitude_deg > 0.0 && altitude_deg.is_finite()).then(|| 1.0 / altitude_deg.to_radians().tan())
}

/// The exact shadow of one volume on the horizontal plane at `plane_m` above ground, for a shadow
/// offset per metre `offset` (from [`shadow_offset_per_m`]). Only the part of the volume above the
/// plane casts; a volume wholly below it casts nothing.
pub fn volume_shadow(volume: &Volume, offset: Coord<f64>, plane_m: f64) -> MultiPolygon<f64> {
    let mut faces = Vec::new();
    flat_volume_faces(volume, offset, plane_m, &mut faces);
    match faces.len() {
        0 => MultiPolygon::new(vec![]),
        1 => MultiPolygon::new(faces),
        _ => unary_union(&faces),
    }
}

/// Pieces whose union is [`volume_shadow`], pushed onto `out` without a boolean union (for
/// rasterising, where spans are merged anyway). A convex footprint without holes gives one piece: its
/// underside shadow swept along to its top shadow (the shadow of a convex prism, a convex set). Otherwise: the underside and top shadows and the quadrilateral of
/// every wall facing away from the sun.
pub(crate) fn flat_volume_faces(volume: &Volume, offset: Coord<f64>, plane_m: f64, out: &mut Vec<Polygon<f64>>) {
    let top = volume.top_m - plane_m;
    if top <= 0.0 {
        return;
    }
    let base = (volume.base_m - plane_m).max(0.0);
    let at = |h: f64| Coord { x: offset.x * h, y: offset.y * h };
    let (b, t) = (at(base), at(top));
    if volume.footprint.interiors().is_empty() && volume.footprint.exterior().is_convex() {
        out.push(swept_convex(volume.footprint.exterior(), b, t));
        return;
    }
    out.push(volume.footprint.translate(b.x, b.y).orient(Direction::Default));
    out.push(volume.footprint.translate(t.x, t.y).orient(Direction::Default));
    // A point is in the shadow when the segment from it toward the sun meets the solid; if neither end
    // lies in the top or underside shadow, the segment leaves the solid through a wall that faces away
    // from the sun. So only walls whose outward normal points along the shadow offset are needed.
    // With the exterior counter-clockwise and holes clockwise the solid is left of every edge and the
    // outward normal of an edge (dx, dy) is (dy, −dx).
    let along = Coord { x: t.x - b.x, y: t.y - b.y };
    let oriented = volume.footprint.orient(Direction::Default);
    let rings = std::iter::once(oriented.exterior()).chain(oriented.interiors());
    for edge in rings.flat_map(|r| r.lines()) {
        let d = edge.delta();
        if d.y * along.x - d.x * along.y <= 0.0 {
            continue;
        }
        let quad = Polygon::new(
            LineString::from(vec![edge.start + b, edge.end + b, edge.end + t, edge.start + t, edge.start + b]),
            vec![],
        );
        if quad.unsigned_area() > SLIVER_M2 {
            out.push(quad.orient(Direction::Default));
        }
    }
}

/// The convex ring `ring` translated by `b` and swept on to `t`: its Minkowski sum with the segment
/// from `b` to `t`. Walking the ring counter-clockwise, the edges whose outward normal points along
/// d = t − b (front edges) move by d, the others stay, and where the two kinds meet the sum gains an
/// edge parallel to d (a standard construction of the Minkowski sum of convex polygons).
fn swept_convex(ring: &LineString<f64>, b: Coord<f64>, t: Coord<f64>) -> Polygon<f64> {
    // Without repeated vertices: an edge of no length has no outward normal and would send the walk
    // back over its own path (found by fuzzing: a footprint with a vertex given twice).
    let mut c: Vec<Coord<f64>> = ring.0.clone();
    c.dedup();
    let n = if c.len() > 1 && c.first() == c.last() { c.len() - 1 } else { c.len() };
    if n == 0 {
        return Polygon::new(LineString::new(vec![]), vec![]);
    }
    let twice_area: f64 = (0..n).map(|i| c[i].x * c[(i + 1) % n].y - c[(i + 1) % n].x * c[i].y).sum();
    // The ring's vertices counter-clockwise.
    let pt = |i: usize| if twice_area >= 0.0 { c[i] } else { c[n - 1 - i] };
    let d = Coord { x: t.x - b.x, y: t.y - b.y };
    // Edge i runs from pt(i) to pt(i + 1); its outward normal (counter-clockwise ring) is (dy, −dx).
    let front = |i: usize| {
        let e = pt((i + 1) % n) - pt(i);
        e.y * d.x - e.x * d.y > 0.0
    };
    let mut out = Vec::with_capacity(n + 3);
    for i in 0..n {
        let (before, after) = (front((i + n - 1) % n), front(i));
        let (p, q) = (pt(i) + b, pt(i) + t);
        match (before, after) {
            (false, false) => out.push(p),
            (true, true) => out.push(q),
            (false, true) => {
                out.push(p);
                out.push(q);
            }
            (true, false) => {
                out.push(q);
                out.push(p);
            }
        }
    }
    if let Some(&first) = out.first() {
        out.push(first);
    }
    Polygon::new(LineString::from(out), vec![])
}

/// The shadow of a wall or fence (a vertical strip along its line up to `height_m`) on the plane at
/// `plane_m` above ground.
pub fn wall_shadow(wall: &Wall, offset: Coord<f64>, plane_m: f64) -> MultiPolygon<f64> {
    let mut quads = Vec::new();
    flat_wall_faces(wall, offset, plane_m, &mut quads);
    unary_union(&quads)
}

/// The quadrilaterals whose union is [`wall_shadow`], one per segment of the wall.
pub(crate) fn flat_wall_faces(wall: &Wall, offset: Coord<f64>, plane_m: f64, out: &mut Vec<Polygon<f64>>) {
    let h = wall.height_m - plane_m;
    if h <= 0.0 {
        return;
    }
    let t = Coord { x: offset.x * h, y: offset.y * h };
    out.extend(
        wall.line
            .lines()
            .map(|e| Polygon::new(LineString::from(vec![e.start, e.end, e.end + t, e.start + t, e.start]), vec![]))
            .filter(|q| q.unsigned_area() > SLIVER_M2)
            .map(|q| q.orient(Direction::Default)),
    );
}

/// The shadows of a set of volumes and walls at one sun position.
#[derive(Debug, Clone, PartialEq)]
pub enum Shadows {
    /// The sun is not above the horizon: there is no direct sun, so no shadow is cast.
    NoSun,
    /// The sun is up but behind the sloping ground: all of the ground is in its own shade.
    GroundFacesAway,
    /// The sun is up.
    Sun {
        /// Each feature's shadow by id, volumes then walls in the order given, clipped to the extent.
        per_feature: Vec<(String, MultiPolygon<f64>)>,
        /// The union of all shadows, clipped to the extent.
        union: MultiPolygon<f64>,
        /// Whether any shadow reached beyond the analysis extent and was cut at it.
        clipped: bool,
    },
}

/// Casts the shadows of `volumes` and `walls` onto the receiving plane (the ground, flat or sloping, or
/// a plane parallel to it), for the sun at `azimuth_deg` (plan frame) and `altitude_deg`, clipped to
/// `extent` (low sun casts very long shadows).
///
/// # Examples
/// ```
/// use geo::{Area, Coord, LineString, Polygon, Rect};
/// use sunlot::shadow::{cast_shadows, Receiver, Shadows};
/// use sunlot::site::{Status, Volume};
/// // A 10 m cube with the sun due south at 45°: its shadow runs 10 m / tan 45° = 10 m north, so the
/// // shade it casts on flat ground, footprint included, is 10 m × 20 m (analytic).
/// let square = LineString::from(vec![(0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0)]);
/// let cube = Volume::new("cube", Status::Existing, Polygon::new(square, vec![]), 0.0, 10.0)?;
/// let extent = Rect::new(Coord { x: -100.0, y: -100.0 }, Coord { x: 100.0, y: 100.0 });
/// let Shadows::Sun { union, clipped, .. } = cast_shadows(&[cube], &[], 180.0, 45.0, &Receiver::flat_ground(), extent)?
/// else { unreachable!("the sun is up") };
/// assert!((union.unsigned_area() - 200.0).abs() < 1e-6 && !clipped);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
///
/// # Errors
/// [`ShadowError`] for a degenerate extent or non-finite angles.
pub fn cast_shadows(
    volumes: &[Volume],
    walls: &[Wall],
    azimuth_deg: f64,
    altitude_deg: f64,
    receiver: &Receiver,
    extent: Rect<f64>,
) -> Result<Shadows, ShadowError> {
    let mut s = cast_each(volumes, walls, azimuth_deg, altitude_deg, receiver, extent)?;
    if let Shadows::Sun { per_feature, union, .. } = &mut s {
        *union = without_slivers(unary_union(per_feature.iter().map(|(_, s)| s)));
    }
    Ok(s)
}

/// [`cast_shadows`] without the union (left empty): for callers that form their own unions.
pub(crate) fn cast_each(
    volumes: &[Volume],
    walls: &[Wall],
    azimuth_deg: f64,
    altitude_deg: f64,
    receiver: &Receiver,
    extent: Rect<f64>,
) -> Result<Shadows, ShadowError> {
    let k = receiver.gradient;
    for (field, value) in [
        ("azimuth_deg", azimuth_deg),
        ("altitude_deg", altitude_deg),
        ("height_m", receiver.height_m),
        ("gradient", k.x + k.y),
    ] {
        if !value.is_finite() {
            return Err(ShadowError::NotFinite { field, value });
        }
    }
    let (lo, hi) = (extent.min(), extent.max());
    if !(lo.x.is_finite() && lo.y.is_finite() && hi.x.is_finite() && hi.y.is_finite())
        || extent.width() <= 0.0
        || extent.height() <= 0.0
    {
        return Err(ShadowError::BadExtent { min_x: lo.x, max_x: hi.x, min_y: lo.y, max_y: hi.y });
    }
    let Some(offset) = shadow_offset_per_m(azimuth_deg, altitude_deg) else { return Ok(Shadows::NoSun) };
    if !receiver.faces_sun(offset) {
        return Ok(Shadows::GroundFacesAway);
    }
    let none = || MultiPolygon::new(vec![]);
    let frame = extent.to_polygon();
    let mut clipped = false;
    let shadows = volumes
        .iter()
        .map(|v| (v.id.clone(), volume_shadow_on(v, offset, receiver).unwrap_or_else(none)))
        .chain(walls.iter().map(|w| (w.id.clone(), wall_shadow_on(w, offset, receiver).unwrap_or_else(none))));
    let mut per_feature = Vec::with_capacity(volumes.len() + walls.len());
    for (id, s) in shadows {
        let inside = s
            .bounding_rect()
            .is_none_or(|r| r.min().x >= lo.x && r.min().y >= lo.y && r.max().x <= hi.x && r.max().y <= hi.y);
        let s = if inside {
            s
        } else {
            clipped = true;
            s.intersection(&frame)
        };
        per_feature.push((id, without_slivers(s)));
    }
    Ok(Shadows::Sun { per_feature, union: MultiPolygon::new(vec![]), clipped })
}

/// Parts and holes smaller than this are noise of the boolean operations, not shade, m² (a square
/// millimetre; the operations work on a grid far finer than that).
pub const OUTPUT_SLIVER_M2: f64 = 1e-6;

/// `mp` without parts or holes under [`OUTPUT_SLIVER_M2`] and without repeated consecutive vertices. The
/// boolean operations can leave a sliver a tenth of a micrometre across touching a real part; kept,
/// it makes the geometry invalid as soon as its coordinates are rounded or re-read.
pub fn without_slivers(mp: MultiPolygon<f64>) -> MultiPolygon<f64> {
    let ring = |ls: &LineString<f64>| {
        let mut v: Vec<Coord<f64>> = Vec::with_capacity(ls.0.len());
        for c in &ls.0 {
            if v.last() != Some(c) {
                v.push(*c);
            }
        }
        LineString::from(v)
    };
    let big = |ls: &LineString<f64>| Polygon::new(ls.clone(), vec![]).unsigned_area() >= OUTPUT_SLIVER_M2;
    MultiPolygon::new(
        mp.0.iter()
            .filter(|p| big(p.exterior()))
            .map(|p| Polygon::new(ring(p.exterior()), p.interiors().iter().filter(|h| big(h)).map(ring).collect()))
            .collect(),
    )
}

#[cfg(test)]
mod sweep_tests {
    use super::*;
    use geo::Validation;

    /// Found by fuzzing: a convex footprint with a vertex given twice swept into a self-intersecting ring.
    #[test]
    fn a_repeated_vertex_leaves_the_swept_shadow_valid() {
        let ring = LineString::from(vec![(3.0, 4.0), (25.0, 4.0), (25.0, 30.0), (3.0, 30.0), (3.0, 30.0)]);
        for (dx, dy) in [(1.0, 1.0), (-2.0, 1.0), (1.0, -3.0), (-1.0, -1.0), (0.0, 2.0), (2.0, 0.0)] {
            let p = swept_convex(&ring, Coord { x: 0.0, y: 0.0 }, Coord { x: dx, y: dy });
            assert!(p.is_valid(), "{:?}: {:?}", (dx, dy), p.validation_errors());
            let want = 22.0 * 26.0 + (22.0 * dy.abs() + 26.0 * dx.abs());
            assert!((p.unsigned_area() - want).abs() < 1e-9, "{} against {want}", p.unsigned_area());
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::site::Status;
    use approx::assert_abs_diff_eq;
    use geo::{Contains, Point};

    fn block(id: &str, x0: f64, y0: f64, w: f64, d: f64, base: f64, top: f64) -> Volume {
        Volume::from_vertices(
            id,
            Status::Existing,
            &[(x0, y0), (x0 + w, y0), (x0 + w, y0 + d), (x0, y0 + d)],
            base,
            top,
        )
        .unwrap()
    }

    fn extent() -> Rect<f64> {
        Rect::new(Coord { x: -1_000.0, y: -1_000.0 }, Coord { x: 1_000.0, y: 1_000.0 })
    }

    #[test]
    fn thin_pole_shadow_length_and_direction() {
        // Pole: h / tan(altitude), pointing to azimuth + 180° (common practice).
        let pole = block("pole", -0.005, -0.005, 0.01, 0.01, 0.0, 10.0);
        for (az, alt) in [(180.0, 30.0), (90.0, 60.0), (225.0, 15.0)] {
            let s = volume_shadow(&pole, shadow_offset_per_m(az, alt).unwrap(), 0.0);
            let r = s.bounding_rect().unwrap();
            let len = 10.0 / f64::to_radians(alt).tan();
            let dir = f64::to_radians(az + 180.0);
            let tip = Coord { x: len * dir.sin(), y: len * dir.cos() };
            assert!(
                r.min().x - 0.02 <= tip.x
                    && tip.x <= r.max().x + 0.02
                    && r.min().y - 0.02 <= tip.y
                    && tip.y <= r.max().y + 0.02,
                "{az} {alt}"
            );
            let extent_len = ((r.width() - 0.01).powi(2) + (r.height() - 0.01).powi(2)).sqrt();
            assert_abs_diff_eq!(extent_len, len, epsilon = 0.02);
        }
    }

    #[test]
    fn box_shadow_area_with_sun_due_south() {
        // A w × d × h box, sun due south at altitude a: the shadow is the footprint stretched north by
        // h / tan(a): area w·(d + h / tan a) (analytic).
        let b = block("box", 0.0, 0.0, 10.0, 6.0, 0.0, 9.0);
        let alt = 35.0_f64;
        let s = volume_shadow(&b, shadow_offset_per_m(180.0, alt).unwrap(), 0.0);
        assert_abs_diff_eq!(s.unsigned_area(), 10.0 * (6.0 + 9.0 / alt.to_radians().tan()), epsilon = 1e-6);
        // With the sun in the south-west (azimuth φ = 225°) the shadow is the footprint swept by the
        // vector h·cot(a)·(−sin φ, −cos φ): area w·d + h·cot(a)·(w·|cos φ| + d·|sin φ|) (analytic).
        let az = 225.0_f64;
        let s = volume_shadow(&b, shadow_offset_per_m(az, alt).unwrap(), 0.0);
        let l = 9.0 / alt.to_radians().tan();
        let want = 60.0 + l * (10.0 * az.to_radians().cos().abs() + 6.0 * az.to_radians().sin().abs());
        assert_abs_diff_eq!(s.unsigned_area(), want, epsilon = 1e-6);
    }

    #[test]
    fn l_shaped_footprint_shadow() {
        // L of two arms 4 m wide (outer sides 10 m), 6 m tall, sun due south at 45°: the shadow is the L
        // swept 6 m north (analytic).
        let l = Volume::from_vertices(
            "L",
            Status::Existing,
            &[(0.0, 0.0), (10.0, 0.0), (10.0, 4.0), (4.0, 4.0), (4.0, 10.0), (0.0, 10.0)],
            0.0,
            6.0,
        )
        .unwrap();
        let s = volume_shadow(&l, shadow_offset_per_m(180.0, 45.0).unwrap(), 0.0);
        // Sweeping the L by 6 m north covers x∈[0,4] for y∈[0,16] (64) and x∈[4,10] for y∈[0,10] (60).
        assert_abs_diff_eq!(s.unsigned_area(), 64.0 + 60.0, epsilon = 1e-6);
    }

    #[test]
    fn courtyard_fills_with_shadow_as_the_sun_lowers() {
        // 30 × 30 block with a 10 × 10 courtyard, 9 m tall, sun due south.
        let outer = LineString::from(vec![(0.0, 0.0), (30.0, 0.0), (30.0, 30.0), (0.0, 30.0), (0.0, 0.0)]);
        let hole = LineString::from(vec![(10.0, 10.0), (20.0, 10.0), (20.0, 20.0), (10.0, 20.0), (10.0, 10.0)]);
        let v = Volume::new("court", Status::Existing, Polygon::new(outer, vec![hole]), 0.0, 9.0).unwrap();
        let lit = |alt: f64| {
            let s = volume_shadow(&v, shadow_offset_per_m(180.0, alt).unwrap(), 0.0);
            let court = Polygon::new(
                LineString::from(vec![(10.0, 10.0), (20.0, 10.0), (20.0, 20.0), (10.0, 20.0), (10.0, 10.0)]),
                vec![],
            );
            100.0 - court.intersection(&s).unsigned_area()
        };
        // The courtyard's south wall shades a strip 9/tan(alt) deep (analytic): 10 × (10 − 9 cot alt).
        assert_abs_diff_eq!(lit(60.0), 10.0 * (10.0 - 9.0 / 60f64.to_radians().tan()), epsilon = 1e-6);
        assert!(lit(60.0) > lit(50.0) && lit(50.0) > lit(45.0));
        assert_abs_diff_eq!(lit(40.0), 0.0, epsilon = 1e-6); // 9·cot 40° = 10.7 m > 10 m
    }

    #[test]
    fn raised_slab_casts_a_detached_shadow() {
        // A bridge 10 × 4, underside 6 m, top 7 m; sun due south at 45°: shadow from y = 6 to y = 11,
        // so the ground under the bridge (y 0…4) stays lit.
        let v = block("bridge", 0.0, 0.0, 10.0, 4.0, 6.0, 7.0);
        let s = volume_shadow(&v, shadow_offset_per_m(180.0, 45.0).unwrap(), 0.0);
        assert!(!s.contains(&Point::new(5.0, 2.0)));
        assert!(s.contains(&Point::new(5.0, 8.0)));
        assert_abs_diff_eq!(s.unsigned_area(), 10.0 * (4.0 + 1.0), epsilon = 1e-6);
    }

    #[test]
    fn plane_above_ground_sees_only_the_part_above_it() {
        let v = block("b", 0.0, 0.0, 10.0, 10.0, 0.0, 6.0);
        let o = shadow_offset_per_m(180.0, 45.0).unwrap();
        assert_abs_diff_eq!(volume_shadow(&v, o, 4.0).unsigned_area(), 10.0 * 12.0, epsilon = 1e-6);
        assert!(volume_shadow(&v, o, 6.0).0.is_empty());
    }

    #[test]
    fn sun_down_and_low_sun() {
        let v = vec![block("b", 0.0, 0.0, 10.0, 10.0, 0.0, 20.0)];
        assert_eq!(cast_shadows(&v, &[], 180.0, -2.0, &Receiver::flat_ground(), extent()).unwrap(), Shadows::NoSun);
        let Shadows::Sun { clipped, union, .. } =
            cast_shadows(&v, &[], 180.0, 0.5, &Receiver::flat_ground(), extent()).unwrap()
        else {
            panic!()
        };
        assert!(clipped, "a 20 m block at 0.5° casts 2.3 km");
        assert!(union.bounding_rect().unwrap().max().y <= 1_000.0 + 1e-9);
        let Shadows::Sun { clipped, .. } =
            cast_shadows(&v, &[], 180.0, 40.0, &Receiver::flat_ground(), extent()).unwrap()
        else {
            panic!()
        };
        assert!(!clipped);
        let bad = Rect::new(Coord { x: 0.0, y: 0.0 }, Coord { x: 0.0, y: 10.0 });
        assert!(matches!(
            cast_shadows(&v, &[], 180.0, 40.0, &Receiver::flat_ground(), bad),
            Err(ShadowError::BadExtent { .. })
        ));
    }

    #[test]
    fn wall_shadow_is_a_strip() {
        // A 10 m fence 2 m high along x, sun due south at 45°: a 10 × 2 strip to the north (analytic).
        let w = Wall {
            id: "fence".into(),
            status: Status::Existing,
            line: LineString::from(vec![(0.0, 0.0), (10.0, 0.0)]),
            height_m: 2.0,
        };
        let s = wall_shadow(&w, shadow_offset_per_m(180.0, 45.0).unwrap(), 0.0);
        assert_abs_diff_eq!(s.unsigned_area(), 20.0, epsilon = 1e-9);
        // With the sun due west, along the fence, it casts nothing.
        assert!(wall_shadow(&w, shadow_offset_per_m(270.0, 45.0).unwrap(), 0.0).0.is_empty());
    }
}

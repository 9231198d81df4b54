//! Checks of the view's geometry: an analytic shadow on a facade, every face's lit and shaded parts
//! against the exact ray test, and the partition's order against depth.

use geo::{Area, BooleanOps, InteriorPoint, MultiPolygon};

use super::*;
use crate::shadow::{exposure, Exposure, Receiver, ViewPoint};
use crate::site::test_sites::{block, flat_site};

/// A 12 m block 4 m south of a 20 m one, the sun due south at 30°: the shadow on the taller block's
/// south wall reaches 12 − 4·tan 30° = 9.690598 m up, across the wall's whole width (the shadow of an
/// edge at height H a horizontal distance g in front of a wall falls at H − g·tan α; common practice).
#[test]
fn a_lower_block_shades_the_facade_behind_it_up_to_the_analytic_line() {
    let m =
        flat_site(vec![block("south", 0.0, 0.0, 10.0, 6.0, 12.0), block("north", 0.0, 10.0, 10.0, 16.0, 20.0)], 52.0);
    let faces = site_faces(&m, 5.0);
    let light = light_faces(&m, &faces, 180.0, 30.0);
    let wall = faces
        .iter()
        .position(|f| f.owner == "north" && f.kind == FaceKind::Wall && f.frame.normal.y < -0.99)
        .expect("the north block's south wall");
    let shadow = &light[wall].shadow;
    let want = 12.0 - 4.0 * 30f64.to_radians().tan();
    let expected = MultiPolygon::new(vec![scene::rect(0.0, 0.0, 10.0, want)]);
    let differ = shadow.xor(&expected).unsigned_area();
    assert!(differ < 1e-6, "shadow {shadow:?} against height {want}: {differ} m² apart");
    assert!((light[wall].lambert - 30f64.to_radians().cos()).abs() < 1e-12);
    // The sun 20° west of south: the line is as high where the edge's shadow lands (the horizontal
    // distance along the sun is 4 / cos 20°), and it slides east by 4·tan 20° m.
    let light = light_faces(&m, &faces, 200.0, 30.0);
    let run = 4.0 / 20f64.to_radians().cos();
    let top = 12.0 - run * 30f64.to_radians().tan();
    let sample = light[wall].shadow.clone();
    let at = |u: f64, z: f64| geo::Contains::contains(&sample, &geo::Point::new(u, z));
    // The wall's u runs from its start: the south wall of a counter-clockwise footprint runs east to
    // west seen from the plan, so x = 10 − u.
    let shift = 4.0 * 20f64.to_radians().tan();
    assert!(at(5.0, top - 0.01) && !at(5.0, top + 0.01), "the line at {top}");
    assert!(at(shift + 0.01, 1.0) && !at(shift - 0.01, 1.0), "the western edge at u = {shift}");
}

/// On the demo site at several moments, every part of every face marked lit is in sun by the exact
/// ray test from a point inside it, and every part marked in shadow is shaded.
#[test]
fn lit_and_shaded_parts_agree_with_the_ray_test() {
    let m = crate::demo::demo();
    let scene = MassingScene::of(&m).unwrap();
    let ground = Receiver::flat_ground();
    let mut checked = (0, 0);
    for (az, alt) in [(135.0, 25.0), (180.0, 38.0), (230.0, 20.0), (260.0, 9.0)] {
        let light = light_faces(&m, &scene.faces, az, alt);
        for (f, l) in scene.faces.iter().zip(&light) {
            if l.lambert <= 0.0 {
                continue;
            }
            let lit = f.shape.difference(&l.shadow);
            for (part, want_sun) in [(&lit, true), (&l.shadow, false)] {
                for poly in part {
                    // Points of a 6 × 6 lattice over the part, inside it and 2 cm clear of its edges
                    // (the ray test and the polygons agree to rounding on the edges themselves).
                    for c in samples(poly, 0.02) {
                        // A millimetre off the face on its lit side, so the ray does not start inside it.
                        let sun = toward_sun(az, alt);
                        let n = if f.frame.normal.dot(sun) < 0.0 { f.frame.normal.scale(-1.0) } else { f.frame.normal };
                        let p = f.frame.at(c).plus(n.scale(1e-3));
                        let got = exposure(
                            ViewPoint { x_m: p.x, y_m: p.y, z_m: p.z },
                            &m.volumes,
                            &m.walls,
                            &ground,
                            az,
                            alt,
                        )
                        .unwrap();
                        assert_eq!(
                            got == Exposure::Sunlit,
                            want_sun,
                            "{:?} {} at {p:?}, sun {az}°/{alt}°: {got:?}",
                            f.kind,
                            f.owner
                        );
                        if want_sun {
                            checked.0 += 1
                        } else {
                            checked.1 += 1
                        }
                    }
                }
            }
        }
    }
    assert!(checked.0 > 500 && checked.1 > 200, "{checked:?} lit and shaded points checked");
}

/// Points of a 6 × 6 lattice over `poly`'s bounding box that lie inside it at least `clear` from its
/// edges.
fn samples(poly: &geo::Polygon<f64>, clear: f64) -> Vec<geo::Coord<f64>> {
    use geo::{BoundingRect, Contains, Distance, Euclidean};
    let Some(r) = poly.bounding_rect() else { return vec![] };
    let mut out = Vec::new();
    for i in 0..6 {
        for j in 0..6 {
            let c = geo::Coord {
                x: r.min().x + r.width() * (i as f64 + 0.5) / 6.0,
                y: r.min().y + r.height() * (j as f64 + 0.5) / 6.0,
            };
            let pt = geo::Point::from(c);
            let edges = std::iter::once(poly.exterior()).chain(poly.interiors());
            if poly.contains(&pt) && edges.map(|e| Euclidean.distance(&pt, e)).fold(f64::INFINITY, f64::min) > clear {
                out.push(c);
            }
        }
    }
    out
}

/// Walking the partition from a viewer draws nothing before a fragment that hides it: for every pair
/// of fragments whose projections overlap, the one drawn later is nearer the viewer where they
/// overlap (checked at a point of the overlap by the depth along the view).
#[test]
fn fragments_come_back_to_front() {
    let m = crate::demo::demo();
    let scene = MassingScene::of(&m).unwrap();
    for azimuth_deg in [20.0, 150.0, 215.0, 300.0] {
        let cam = Camera {
            azimuth_deg,
            elevation_deg: 35.0,
            projection: Projection::Parallel,
            target: V3::new(14.0, 24.0, 0.0),
        };
        let order = scene.bsp.back_to_front(cam.eye());
        let toward = cam.toward_viewer();
        // Each fragment projected to the view plane, with its plane for depths.
        let seen: Vec<(MultiPolygon<f64>, &Frame3)> = order
            .iter()
            .map(|fr| {
                let f = &scene.faces[fr.face];
                let shape = geo::MapCoords::map_coords(&fr.shape, |c| {
                    let (x, y) = cam.project(f.frame.at(c)).unwrap();
                    geo::Coord { x, y }
                });
                (shape, &f.frame)
            })
            .collect();
        let mut pairs = 0;
        for i in 0..seen.len() {
            for j in i + 1..seen.len() {
                let overlap = seen[i].0.intersection(&seen[j].0);
                if overlap.unsigned_area() < 1e-3 {
                    continue;
                }
                let Some(q) = overlap.interior_point() else { continue };
                // The depth toward the viewer of each plane along the line of sight through q.
                let depth = |frame: &Frame3| {
                    let (right, up) = (cam_axis(&cam, 0), cam_axis(&cam, 1));
                    let origin = cam.target.plus(right.scale(q.x())).plus(up.scale(q.y()));
                    // origin + t·toward lies in the plane: n·(origin + t·toward − o) = 0.
                    let denom = frame.normal.dot(toward);
                    if denom.abs() < 1e-9 {
                        return None;
                    }
                    Some(-frame.distance(origin) / denom)
                };
                if let (Some(a), Some(b)) = (depth(seen[i].1), depth(seen[j].1)) {
                    assert!(
                        b >= a - 1e-6,
                        "fragment {j} drawn after {i} but {b} < {a} toward the viewer (azimuth {azimuth_deg})"
                    );
                    pairs += 1;
                }
            }
        }
        assert!(pairs > 20, "{pairs} overlapping pairs checked");
    }
}

/// The camera's screen axes (0: right, 1: up), rebuilt from two projections.
fn cam_axis(cam: &Camera, which: usize) -> V3 {
    let o = cam.project(cam.target).unwrap();
    let probe = |v: V3| {
        let p = cam.project(cam.target.plus(v)).unwrap();
        if which == 0 {
            p.0 - o.0
        } else {
            p.1 - o.1
        }
    };
    // The axis is the vector whose dot products with x, y, z are the projections of the unit vectors.
    V3::new(probe(V3::new(1.0, 0.0, 0.0)), probe(V3::new(0.0, 1.0, 0.0)), probe(V3::new(0.0, 0.0, 1.0)))
}

#[test]
fn sloped_sites_and_bad_cameras_are_refused_by_name() {
    let mut m = crate::demo::demo();
    m.ground.slope_deg = 3.0;
    assert_eq!(MassingScene::of(&m).unwrap_err(), ViewError::SlopedGround);
    let cam = Camera {
        azimuth_deg: 200.0,
        elevation_deg: 2.0,
        projection: Projection::Parallel,
        target: V3::new(0.0, 0.0, 0.0),
    };
    assert!(check_camera(&cam).unwrap_err().to_string().starts_with("elevation_deg: must be 5 to 90"));
}

/// The envelope's treads stand at their bands' lowest heights over the lot, cast no shade and take
/// none, and join the partition after the site's faces.
#[test]
fn envelope_treads_sit_at_their_band_heights_over_the_lot() {
    use geo::{Coord, LineString, Polygon};
    let m = crate::demo::demo();
    let band = |from_m: f64, x0: f64| crate::envelope::HeightBand {
        from_m,
        to_m: from_m + 3.0,
        outline: MultiPolygon::new(vec![Polygon::new(
            LineString::from(vec![
                Coord { x: x0, y: 8.0 },
                Coord { x: x0 + 4.0, y: 8.0 },
                Coord { x: x0 + 4.0, y: 12.0 },
                Coord { x: x0, y: 12.0 },
            ]),
            vec![],
        )]),
    };
    let treads = scene::envelope_faces("lot-14", &[band(0.0, 4.0), band(6.0, 10.0)]);
    assert_eq!(treads.iter().map(|f| f.frame.origin.z).collect::<Vec<_>>(), vec![0.05, 6.0]);
    let plain = MassingScene::of(&m).unwrap();
    let scene = MassingScene::with(&m, treads).unwrap();
    assert_eq!(scene.faces.len(), plain.faces.len() + 2);
    let light = light_faces(&m, &scene.faces, 200.0, 30.0);
    let tread = light.last().unwrap();
    assert_eq!((tread.lambert, tread.shadow.0.len()), (1.0, 0));
    assert!(scene.bsp.back_to_front(V3::new(0.0, -1e6, 1e6)).iter().any(|f| f.face == scene.faces.len() - 1));
}

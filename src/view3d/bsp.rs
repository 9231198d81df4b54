//! Visibility without a depth buffer: a binary space partition of the faces (Fuchs, Kedem & Naylor,
//! "On visible surface generation by a priori tree structures", SIGGRAPH 1980). Each node keeps the
//! faces in one plane; a face that crosses a node's plane is split along it (in the face's own
//! coordinates, by `geo`'s boolean intersection with the two half-planes), so walking the tree from
//! the side away from the eye gives every fragment after everything behind it — the painter's order,
//! exact for any arrangement, cycles included. The tree depends on the geometry alone: built once per
//! site, walked for every view.

use geo::{BooleanOps, Coord, LineString, MultiPolygon, Polygon};

use super::scene::{Face3, Frame3, V3};

/// Distance within which a point is taken to lie in a plane, metres.
const ON_PLANE_M: f64 = 1e-7;
/// Fragments smaller than this are dropped, m².
const CRUMB_M2: f64 = 1e-10;

/// A piece of a face: the face's index and the piece's outline in the face's frame.
#[derive(Debug, Clone, PartialEq)]
pub struct Fragment {
    pub face: usize,
    pub shape: MultiPolygon<f64>,
}

#[derive(Debug)]
struct Node {
    plane: Frame3,
    here: Vec<Fragment>,
    front: Option<Box<Node>>,
    back: Option<Box<Node>>,
}

/// The partition of a set of faces.
#[derive(Debug)]
pub struct Bsp {
    root: Option<Box<Node>>,
    fragments: usize,
}

impl Bsp {
    /// The tree of `faces`, split where they cross; planes are taken in the faces' order (put large
    /// faces such as the ground first: fewer splits).
    pub fn build(faces: &[Face3]) -> Self {
        let all: Vec<Fragment> =
            faces.iter().enumerate().map(|(i, f)| Fragment { face: i, shape: f.shape.clone() }).collect();
        let root = build(faces, all);
        let fragments = count(&root);
        Bsp { root, fragments }
    }

    /// How many fragments the faces became.
    pub fn fragments(&self) -> usize {
        self.fragments
    }

    /// Every fragment, the farthest from `eye` first. For a parallel projection give a point far out
    /// along the direction toward the viewer.
    pub fn back_to_front(&self, eye: V3) -> Vec<&Fragment> {
        let mut out = Vec::with_capacity(self.fragments);
        walk(&self.root, eye, &mut out);
        out
    }
}

fn count(node: &Option<Box<Node>>) -> usize {
    node.as_ref().map_or(0, |n| n.here.len() + count(&n.front) + count(&n.back))
}

fn walk<'a>(node: &'a Option<Box<Node>>, eye: V3, out: &mut Vec<&'a Fragment>) {
    let Some(n) = node else { return };
    if n.plane.distance(eye) >= 0.0 {
        walk(&n.back, eye, out);
        out.extend(n.here.iter());
        walk(&n.front, eye, out);
    } else {
        walk(&n.front, eye, out);
        out.extend(n.here.iter());
        walk(&n.back, eye, out);
    }
}

fn build(faces: &[Face3], mut list: Vec<Fragment>) -> Option<Box<Node>> {
    if list.is_empty() {
        return None;
    }
    let first = list.remove(0);
    let plane = faces[first.face].frame;
    let (mut here, mut front, mut back) = (vec![first], Vec::new(), Vec::new());
    for frag in list {
        let frame = &faces[frag.face].frame;
        let (lo, hi) = extremes(frame, &frag.shape, &plane);
        if hi <= ON_PLANE_M && lo >= -ON_PLANE_M {
            here.push(frag);
        } else if lo >= -ON_PLANE_M {
            front.push(frag);
        } else if hi <= ON_PLANE_M {
            back.push(frag);
        } else {
            let (f, b) = split(frame, &frag.shape, &plane);
            if area(&f) > CRUMB_M2 {
                front.push(Fragment { face: frag.face, shape: f });
            }
            if area(&b) > CRUMB_M2 {
                back.push(Fragment { face: frag.face, shape: b });
            }
        }
    }
    Some(Box::new(Node { plane, here, front: build(faces, front), back: build(faces, back) }))
}

fn area(mp: &MultiPolygon<f64>) -> f64 {
    geo::Area::unsigned_area(mp)
}

/// The least and greatest signed distance of the shape's vertices (in `frame`) from `plane`.
fn extremes(frame: &Frame3, shape: &MultiPolygon<f64>, plane: &Frame3) -> (f64, f64) {
    let mut lo = f64::INFINITY;
    let mut hi = f64::NEG_INFINITY;
    for poly in shape {
        for c in poly.exterior().0.iter().chain(poly.interiors().iter().flat_map(|r| r.0.iter())) {
            let d = plane.distance(frame.at(*c));
            lo = lo.min(d);
            hi = hi.max(d);
        }
    }
    (lo, hi)
}

/// `shape` (in `frame`) split by `plane` into its parts in front of and behind it. In the frame's
/// coordinates the signed distance is affine, d(c) = d0 + g·c; its zero line bounds the two
/// half-planes.
fn split(frame: &Frame3, shape: &MultiPolygon<f64>, plane: &Frame3) -> (MultiPolygon<f64>, MultiPolygon<f64>) {
    let d0 = plane.distance(frame.origin);
    let g = Coord { x: plane.normal.dot(frame.e1), y: plane.normal.dot(frame.e2) };
    let gg = g.x * g.x + g.y * g.y;
    // The point of the zero line nearest the frame's origin, the line's direction, and g's direction.
    let on = Coord { x: -d0 * g.x / gg, y: -d0 * g.y / gg };
    let len = gg.sqrt();
    let (gx, gy) = (g.x / len, g.y / len);
    let along = Coord { x: -gy, y: gx };
    // Each half-plane as a rectangle just large enough to hold the shape (a huge one would coarsen
    // the boolean operation's integer grid, which is scaled to the operands' extent).
    let reach = 1.0
        + shape
            .iter()
            .flat_map(|p| p.exterior().0.iter())
            .map(|c| ((c.x - on.x).powi(2) + (c.y - on.y).powi(2)).sqrt())
            .fold(0.0, f64::max);
    let half = |sign: f64| {
        let p = |t: f64, s: f64| (on.x + along.x * t + gx * s * sign, on.y + along.y * t + gy * s * sign);
        Polygon::new(LineString::from(vec![p(-reach, 0.0), p(reach, 0.0), p(reach, reach), p(-reach, reach)]), vec![])
    };
    (shape.intersection(&half(1.0)), shape.intersection(&half(-1.0)))
}

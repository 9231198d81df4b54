//! The site as planar faces in three dimensions: the ground, the areas on it, and every volume's roof
//! and walls, and the site walls (fences) as two-sided strips. Each face carries a frame — an origin,
//! two axes in its plane and its outward normal — and its outline in the frame's coordinates, so the
//! boolean work on it (shadows, splitting) is done in two dimensions with `geo`.

use geo::orient::{Direction, Orient};
use geo::{BoundingRect, Coord, LineString, MultiPolygon, Polygon};

use crate::site::{SiteModel, Status};

/// A point or vector in the plan frame, metres: x to the plan's right, y to its top, z up.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct V3 {
    pub x: f64,
    pub y: f64,
    pub z: f64,
}

impl V3 {
    pub const fn new(x: f64, y: f64, z: f64) -> Self {
        V3 { x, y, z }
    }
    pub fn dot(self, o: V3) -> f64 {
        self.x * o.x + self.y * o.y + self.z * o.z
    }
    pub fn cross(self, o: V3) -> V3 {
        V3::new(self.y * o.z - self.z * o.y, self.z * o.x - self.x * o.z, self.x * o.y - self.y * o.x)
    }
    pub fn scale(self, k: f64) -> V3 {
        V3::new(self.x * k, self.y * k, self.z * k)
    }
    pub fn plus(self, o: V3) -> V3 {
        V3::new(self.x + o.x, self.y + o.y, self.z + o.z)
    }
    pub fn minus(self, o: V3) -> V3 {
        V3::new(self.x - o.x, self.y - o.y, self.z - o.z)
    }
    pub fn norm(self) -> f64 {
        self.dot(self).sqrt()
    }
    /// The unit vector along this one (itself when it has no length).
    pub fn unit(self) -> V3 {
        let n = self.norm();
        if n > 0.0 {
            self.scale(1.0 / n)
        } else {
            self
        }
    }
}

/// A plane with two axes in it: a point `(a, b)` of the frame is `origin + a·e1 + b·e2`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Frame3 {
    pub origin: V3,
    pub e1: V3,
    pub e2: V3,
    /// Unit normal, `e1 × e2`.
    pub normal: V3,
}

impl Frame3 {
    /// The frame of the horizontal plane at height `z_m`: plan coordinates, normal up.
    pub fn horizontal(z_m: f64) -> Self {
        Frame3 {
            origin: V3::new(0.0, 0.0, z_m),
            e1: V3::new(1.0, 0.0, 0.0),
            e2: V3::new(0.0, 1.0, 0.0),
            normal: V3::new(0.0, 0.0, 1.0),
        }
    }

    /// The frame of the vertical plane through the plan segment `a`→`b`: `e1` along it (metres from
    /// `a`), `e2` up (metres above the ground), normal `e1 × e2` — the outward normal of an edge of a
    /// counter-clockwise ring.
    pub fn vertical(a: Coord<f64>, b: Coord<f64>) -> Self {
        let e1 = V3::new(b.x - a.x, b.y - a.y, 0.0).unit();
        let e2 = V3::new(0.0, 0.0, 1.0);
        Frame3 { origin: V3::new(a.x, a.y, 0.0), e1, e2, normal: e1.cross(e2) }
    }

    /// The point of frame coordinates `c`.
    pub fn at(&self, c: Coord<f64>) -> V3 {
        self.origin.plus(self.e1.scale(c.x)).plus(self.e2.scale(c.y))
    }

    /// Signed distance of `p` from the plane, along the normal, metres.
    pub fn distance(&self, p: V3) -> f64 {
        self.normal.dot(p.minus(self.origin))
    }

    /// Frame coordinates of `p` (projected onto the plane along the normal).
    pub fn coords(&self, p: V3) -> Coord<f64> {
        let d = p.minus(self.origin);
        Coord { x: d.dot(self.e1), y: d.dot(self.e2) }
    }
}

/// What a face is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FaceKind {
    /// The ground around the site.
    Ground,
    /// An area (lot, garden, terrace) on the ground.
    Area,
    /// A volume's top.
    Roof,
    /// A volume's wall.
    Wall,
    /// A site wall or fence (two-sided).
    Fence,
    /// A tread of a lot's solar envelope: the band of cells allowed at least this high (drawn
    /// translucent, neither lit nor shaded).
    Envelope,
}

/// A planar face of the site.
#[derive(Debug, Clone, PartialEq)]
pub struct Face3 {
    pub kind: FaceKind,
    /// Id of the volume, area or wall it belongs to (empty for the ground).
    pub owner: String,
    pub status: Status,
    pub frame: Frame3,
    /// The outline in frame coordinates, metres.
    pub shape: MultiPolygon<f64>,
    /// Whether it is seen and lit from both sides (fences).
    pub two_sided: bool,
}

/// The faces of `model`: the ground (the site's extent grown by `margin_m`), the areas, every
/// volume's roof and walls (courtyard walls included), and the site walls.
pub fn site_faces(model: &SiteModel, margin_m: f64) -> Vec<Face3> {
    let mut faces = Vec::new();
    if let Some(r) = extent(model) {
        let (min, max) = (r.min(), r.max());
        let ground = Polygon::new(
            LineString::from(vec![
                (min.x - margin_m, min.y - margin_m),
                (max.x + margin_m, min.y - margin_m),
                (max.x + margin_m, max.y + margin_m),
                (min.x - margin_m, max.y + margin_m),
            ]),
            vec![],
        );
        faces.push(Face3 {
            kind: FaceKind::Ground,
            owner: String::new(),
            status: Status::Existing,
            frame: Frame3::horizontal(0.0),
            shape: MultiPolygon::new(vec![ground]),
            two_sided: false,
        });
    }
    for a in &model.areas {
        faces.push(Face3 {
            kind: FaceKind::Area,
            owner: a.id.clone(),
            status: a.status,
            // In the ground's plane: the partition keeps a plane's faces in the order given, so the
            // areas (after the ground) are drawn over it.
            frame: Frame3::horizontal(0.0),
            shape: MultiPolygon::new(vec![a.polygon.orient(Direction::Default)]),
            two_sided: false,
        });
    }
    for v in &model.volumes {
        let footprint = v.footprint.orient(Direction::Default);
        faces.push(Face3 {
            kind: FaceKind::Roof,
            owner: v.id.clone(),
            status: v.status,
            frame: Frame3::horizontal(v.top_m),
            shape: MultiPolygon::new(vec![footprint.clone()]),
            two_sided: false,
        });
        // Exterior counter-clockwise and holes clockwise: each edge's e1 × up points out of the solid.
        let rings = std::iter::once(footprint.exterior()).chain(footprint.interiors());
        let edges = rings.flat_map(|r| r.lines());
        faces.extend(upright(edges, FaceKind::Wall, &v.id, v.status, (v.base_m, v.top_m)));
    }
    for w in &model.walls {
        faces.extend(upright(w.line.lines(), FaceKind::Fence, &w.id, w.status, (0.0, w.height_m)));
    }
    faces
}

/// A vertical face on each plan segment of `edges` from height `from_m` to `to_m` (fences two-sided).
fn upright<'a>(
    edges: impl Iterator<Item = geo::Line<f64>> + 'a,
    kind: FaceKind,
    owner: &'a str,
    status: Status,
    (from_m, to_m): (f64, f64),
) -> impl Iterator<Item = Face3> + 'a {
    edges.filter_map(move |edge| {
        let length = (edge.dx().powi(2) + edge.dy().powi(2)).sqrt();
        (length >= 1e-6).then(|| Face3 {
            kind,
            owner: owner.to_string(),
            status,
            frame: Frame3::vertical(edge.start, edge.end),
            shape: MultiPolygon::new(vec![rect(0.0, from_m, length, to_m)]),
            two_sided: kind == FaceKind::Fence,
        })
    })
}

/// Lowest height an envelope tread is drawn at, metres (a tread at the ground would lie in it).
const ENVELOPE_LIFT_M: f64 = 0.05;

/// The treads of the solar envelope of lot `lot_id` from its height bands (each band's cells at the
/// band's lowest height: what the envelope allows there at least).
pub fn envelope_faces(lot_id: &str, bands: &[crate::envelope::HeightBand]) -> Vec<Face3> {
    bands
        .iter()
        .filter(|b| !b.outline.0.is_empty())
        .map(|b| Face3 {
            kind: FaceKind::Envelope,
            owner: lot_id.to_string(),
            status: Status::Proposed,
            frame: Frame3::horizontal(b.from_m.max(ENVELOPE_LIFT_M)),
            shape: b.outline.orient(Direction::Default),
            two_sided: true,
        })
        .collect()
}

/// The axis-aligned rectangle from (x0, y0) to (x1, y1), counter-clockwise.
pub fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Polygon<f64> {
    Polygon::new(LineString::from(vec![(x0, y0), (x1, y0), (x1, y1), (x0, y1)]), vec![])
}

/// The plan extent of the site's areas, volumes and walls.
pub fn extent(model: &SiteModel) -> Option<geo::Rect<f64>> {
    let mut all: Vec<Coord<f64>> = Vec::new();
    all.extend(model.areas.iter().flat_map(|a| a.polygon.exterior().0.iter().copied()));
    all.extend(model.volumes.iter().flat_map(|v| v.footprint.exterior().0.iter().copied()));
    all.extend(model.walls.iter().flat_map(|w| w.line.0.iter().copied()));
    LineString::from(all).bounding_rect()
}

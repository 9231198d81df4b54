//! The 3-D view of the massing at a moment: every face filled by the sun on it (Lambert's cosine for
//! the lit part, one shade for the part in shadow, cast or its own), drawn back to front through the
//! scene's partition, with the sun's direction, true north on the ground, a key and the caution.

use geo::{BooleanOps, Coord, LineString, MultiPolygon};

use super::draw::{footnote, footnote_px, heading, Anchor, Colour, Draw, INK, LABEL_PX, MUTED, PAPER, TEXT_PX};
use crate::site::{AreaKind, SiteModel, Status};
use crate::view3d::{Camera, FaceKind, FaceLight, MassingScene, V3};

/// Design size of the view, pixels.
pub const VIEW_PX: (u32, u32) = (960, 720);
/// Width of the key column, pixels.
const KEY_PX: f64 = 200.0;
/// Brightness of a face in shadow, as a share of its colour.
const IN_SHADOW: f64 = 0.56;
/// Brightness of a lit face: this share, plus the rest times the cosine of incidence.
const LIT_FLOOR: f64 = 0.82;

const GROUND: Colour = Colour::rgb(236, 233, 226);
const LOT: Colour = Colour::rgb(240, 231, 205);
const GARDEN: Colour = Colour::rgb(214, 229, 199);
const PAVED: Colour = Colour::rgb(226, 224, 230);
const EXISTING: Colour = Colour::rgb(246, 244, 240);
const PROPOSED: Colour = Colour::rgb(178, 188, 238);
const FENCE: Colour = Colour::rgb(196, 170, 140);
const EDGE: Colour = Colour { r: 30, g: 30, b: 30, a: 150 };
const SUN: Colour = Colour::rgb(214, 140, 0);
const ENVELOPE: Colour = Colour { r: 0, g: 128, b: 118, a: 72 };
const ENVELOPE_EDGE: Colour = Colour { r: 0, g: 110, b: 100, a: 200 };

/// The sun on a scene at a moment: each face's light, and the sun (plan azimuth, altitude, degrees;
/// `None` when it is down and everything is in shade). Computed once per moment, drawn from any camera.
#[derive(Debug, Clone)]
pub struct MassingLight {
    pub faces: Vec<FaceLight>,
    pub sun: Option<(f64, f64)>,
    /// The sun in words, true azimuth and altitude.
    pub sun_words: String,
}

impl MassingLight {
    /// The light on `scene` (of `model`) with the sun at true azimuth and apparent altitude `sun_deg`.
    pub fn at(model: &SiteModel, scene: &MassingScene, (azimuth_deg, altitude_deg): (f64, f64)) -> Self {
        if altitude_deg > 0.0 {
            let az = model.plan_azimuth_deg(azimuth_deg);
            MassingLight {
                faces: crate::view3d::light_faces(model, &scene.faces, az, altitude_deg),
                sun: Some((az, altitude_deg)),
                sun_words: format!("sun at azimuth {azimuth_deg:.1}°, altitude {altitude_deg:.1}°"),
            }
        } else {
            MassingLight {
                faces: scene.faces.iter().map(|f| FaceLight { lambert: 0.0, shadow: f.shape.clone() }).collect(),
                sun: None,
                sun_words: "the sun is below the horizon: no direct sun".into(),
            }
        }
    }
}

/// A view to draw: the scene, the light on its faces at the moment, the viewer, and the words.
#[derive(Debug)]
pub struct MassingView<'a> {
    pub model: &'a SiteModel,
    pub scene: &'a MassingScene,
    pub light: &'a MassingLight,
    pub camera: Camera,
    pub title: String,
    pub subtitle: String,
    pub caution: String,
}

impl<'a> MassingView<'a> {
    /// The view of `scene` (of `model`) in `light`, from `camera`, at the moment called `when`.
    pub fn at(
        model: &'a SiteModel,
        scene: &'a MassingScene,
        light: &'a MassingLight,
        camera: Camera,
        when: &str,
    ) -> Self {
        let subtitle = format!(
            "{}; seen from {:.0}°, {:.0}° above the horizon",
            light.sun_words,
            camera.azimuth_deg.rem_euclid(360.0),
            camera.elevation_deg
        );
        MassingView {
            model,
            scene,
            light,
            camera,
            title: super::titled(&format!("Massing and shadows at {when}"), &model.name),
            subtitle,
            caution: crate::rules::CAUTION.to_string(),
        }
    }
}

/// The colour a face is drawn in, before the sun.
fn base_colour(model: &SiteModel, kind: FaceKind, owner: &str, status: Status) -> Colour {
    match kind {
        FaceKind::Ground => GROUND,
        FaceKind::Area => match model.areas.iter().find(|a| a.id == owner).map(|a| a.kind) {
            Some(AreaKind::Lot) => LOT,
            Some(AreaKind::Garden) => GARDEN,
            _ => PAVED,
        },
        FaceKind::Fence => FENCE,
        FaceKind::Envelope => ENVELOPE,
        FaceKind::Roof | FaceKind::Wall if status == Status::Proposed => PROPOSED,
        FaceKind::Roof | FaceKind::Wall => EXISTING,
    }
}

fn times(c: Colour, k: f64) -> Colour {
    let f = |v: u8| (f64::from(v) * k).round().clamp(0.0, 255.0) as u8;
    Colour { r: f(c.r), g: f(c.g), b: f(c.b), a: c.a }
}

/// Where the view sits on the figure: plan-to-pixel scale and offset.
struct Fit {
    scale: f64,
    cx: f64,
    cy: f64,
    ox: f64,
    oy: f64,
}

impl Fit {
    fn px(&self, camera: &Camera, p: V3) -> Option<(f64, f64)> {
        camera.project(p).map(|(x, y)| (self.cx + (x - self.ox) * self.scale, self.cy - (y - self.oy) * self.scale))
    }
}

/// Fits every face of the scene into the box (x, y, w, h).
fn fit(v: &MassingView, b: (f64, f64, f64, f64)) -> Fit {
    let (mut lo, mut hi) = ((f64::INFINITY, f64::INFINITY), (f64::NEG_INFINITY, f64::NEG_INFINITY));
    for f in &v.scene.faces {
        for poly in &f.shape {
            for c in &poly.exterior().0 {
                if let Some((x, y)) = v.camera.project(f.frame.at(*c)) {
                    lo = (lo.0.min(x), lo.1.min(y));
                    hi = (hi.0.max(x), hi.1.max(y));
                }
            }
        }
    }
    let (w, h) = ((hi.0 - lo.0).max(1e-6), (hi.1 - lo.1).max(1e-6));
    let scale = (b.2 / w).min(b.3 / h);
    Fit { scale, cx: b.0 + b.2 / 2.0, cy: b.1 + b.3 / 2.0, ox: (lo.0 + hi.0) / 2.0, oy: (lo.1 + hi.1) / 2.0 }
}

/// Rings of a face-frame shape in pixels.
fn rings_px(v: &MassingView, fit: &Fit, face: usize, shape: &MultiPolygon<f64>) -> Vec<Vec<(f64, f64)>> {
    let frame = &v.scene.faces[face].frame;
    let mut out = Vec::new();
    for poly in shape {
        for ring in std::iter::once(poly.exterior()).chain(poly.interiors()) {
            let pts: Option<Vec<(f64, f64)>> = ring.0.iter().map(|c| fit.px(&v.camera, frame.at(*c))).collect();
            if let Some(pts) = pts {
                out.push(pts);
            }
        }
    }
    out
}

/// Draws the view.
pub fn draw_massing_view(d: &mut dyn Draw, v: &MassingView) {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    let top = heading(d, &v.title, &v.subtitle);
    let bottom = h - footnote_px(d, &v.caution) - 12.0;
    let key_x = w - KEY_PX;
    let fit = fit(v, (24.0, top + 8.0, key_x - 48.0, (bottom - top - 16.0).max(10.0)));
    draw_faces(d, v, &fit);
    draw_north(d, v, &fit);
    if let Some(sun) = v.light.sun {
        draw_sun(d, v, &fit, sun);
    }
    draw_key(d, v, key_x, top);
    footnote(d, &v.caution);
}

/// Every fragment back to front: its lit part by the cosine of incidence, then its part in shadow,
/// then the edges it shares with its face's outline.
fn draw_faces(d: &mut dyn Draw, v: &MassingView, fit: &Fit) {
    for frag in v.scene.bsp.back_to_front(v.camera.eye()) {
        let face = &v.scene.faces[frag.face];
        let base = base_colour(v.model, face.kind, &face.owner, face.status);
        let light = &v.light.faces[frag.face];
        let lit = times(base, LIT_FLOOR + (1.0 - LIT_FLOOR) * light.lambert);
        let dark = times(base, IN_SHADOW);
        let rings = rings_px(v, fit, frag.face, &frag.shape);
        if face.kind == FaceKind::Envelope {
            // Translucent: what stands behind it shows through; no seam strokes (they would double
            // the tint).
            d.fill_polygon(&rings, ENVELOPE);
        } else if light.lambert <= 0.0 {
            fill(d, &rings, dark);
        } else {
            fill(d, &rings, lit);
            let shade = frag.shape.intersection(&light.shadow);
            if !shade.0.is_empty() {
                fill(d, &rings_px(v, fit, frag.face, &shade), dark);
            }
        }
        // The fragment's edges that lie on its face's outline (not the partition's cuts), holes included.
        let outline: Vec<&LineString<f64>> = rings_of(&face.shape).collect();
        for edge in rings_of(&frag.shape).flat_map(|r| r.lines()) {
            if !outline.iter().any(|r| along(r, edge)) {
                continue;
            }
            let (Some(a), Some(b)) =
                (fit.px(&v.camera, face.frame.at(edge.start)), fit.px(&v.camera, face.frame.at(edge.end)))
            else {
                continue;
            };
            match face.kind {
                FaceKind::Ground => {}
                FaceKind::Envelope => d.stroke(&[a, b], 0.8, ENVELOPE_EDGE, false),
                _ => d.stroke(&[a, b], 0.8, EDGE, false),
            }
        }
    }
}

/// Every ring of a shape: each polygon's exterior, then its holes.
fn rings_of(shape: &MultiPolygon<f64>) -> impl Iterator<Item = &LineString<f64>> {
    shape.iter().flat_map(|p| std::iter::once(p.exterior()).chain(p.interiors()))
}

/// Fills `rings` and strokes them in the same colour, so neighbouring fragments meet without a seam.
fn fill(d: &mut dyn Draw, rings: &[Vec<(f64, f64)>], colour: Colour) {
    d.fill_polygon(rings, colour);
    for r in rings {
        d.stroke(r, 0.6, colour, true);
    }
}

/// Whether the whole edge runs along one segment of the ring (within a micrometre).
fn along(ring: &LineString<f64>, edge: geo::Line<f64>) -> bool {
    ring.lines().any(|s| {
        segment_distance(s.start, s.end, edge.start) < 1e-6 && segment_distance(s.start, s.end, edge.end) < 1e-6
    })
}

fn segment_distance(a: Coord<f64>, b: Coord<f64>, p: Coord<f64>) -> f64 {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let len2 = dx * dx + dy * dy;
    let t = if len2 > 0.0 { (((p.x - a.x) * dx + (p.y - a.y) * dy) / len2).clamp(0.0, 1.0) } else { 0.0 };
    ((a.x + t * dx - p.x).powi(2) + (a.y + t * dy - p.y).powi(2)).sqrt()
}

/// The unit vector from pixel `a` to `b`.
fn unit(a: (f64, f64), b: (f64, f64)) -> (f64, f64) {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let len = (dx * dx + dy * dy).sqrt().max(1e-6);
    (dx / len, dy / len)
}

/// The barbs and tip of an arrowhead `size` pixels long at `b` on the line from `a`.
fn arrow_head(a: (f64, f64), b: (f64, f64), size: f64) -> [(f64, f64); 3] {
    let (ux, uy) = unit(a, b);
    let half = size / 2.0;
    [
        (b.0 - size * ux + half * uy, b.1 - size * uy - half * ux),
        b,
        (b.0 - size * ux - half * uy, b.1 - size * uy + half * ux),
    ]
}

/// The sun's direction: a ray of sunlight ending at the view's target, the sun's disc where it comes
/// from.
fn draw_sun(d: &mut dyn Draw, v: &MassingView, fit: &Fit, (az, alt): (f64, f64)) {
    let s = crate::view3d::toward_sun(az, alt);
    let reach = 0.45 * extent_m(v);
    let end = v.camera.target;
    let start = end.plus(s.scale(reach));
    let (Some(a), Some(b)) = (fit.px(&v.camera, start), fit.px(&v.camera, end)) else { return };
    d.stroke(&[a, b], 1.6, SUN, false);
    // An arrowhead at the target, pointing along the light.
    d.stroke(&arrow_head(a, b, 10.0), 1.6, SUN, false);
    let disc: Vec<(f64, f64)> = (0..24)
        .map(|k| {
            let t = f64::from(k) / 24.0 * std::f64::consts::TAU;
            (a.0 + 8.0 * t.cos(), a.1 + 8.0 * t.sin())
        })
        .collect();
    d.fill_polygon(std::slice::from_ref(&disc), SUN);
    d.stroke(&disc, 1.0, PAPER, true);
}

/// True north on the ground at the site's near corner.
fn draw_north(d: &mut dyn Draw, v: &MassingView, fit: &Fit) {
    let Some(ground) = v.scene.faces.iter().find(|f| f.kind == FaceKind::Ground) else { return };
    let Some(r) = geo::BoundingRect::bounding_rect(&ground.shape) else { return };
    let az = v.model.plan_azimuth_deg(0.0).to_radians();
    let dir = V3::new(az.sin(), az.cos(), 0.0);
    let len = 0.12 * extent_m(v);
    // The ground's corner nearest the viewer.
    let toward = v.camera.toward_viewer();
    let corners = [(r.min().x, r.min().y), (r.max().x, r.min().y), (r.max().x, r.max().y), (r.min().x, r.max().y)];
    let near = corners
        .iter()
        .map(|&(x, y)| V3::new(x, y, 0.0))
        .max_by(|a, b| a.dot(toward).total_cmp(&b.dot(toward)))
        .unwrap_or(v.camera.target);
    let foot = near.plus(v.camera.target.minus(near).unit().scale(0.9 * len));
    let (Some(a), Some(b)) = (fit.px(&v.camera, foot), fit.px(&v.camera, foot.plus(dir.scale(len)))) else { return };
    d.stroke(&[a, b], 1.6, INK, false);
    d.fill_polygon(&[arrow_head(a, b, 8.0).to_vec()], INK);
    let (ux, uy) = unit(a, b);
    d.text(b.0 + 10.0 * ux, b.1 + 10.0 * uy + 4.0, LABEL_PX, "N", INK, Anchor::Middle);
}

/// The site's plan size, metres (the ground's longer side).
fn extent_m(v: &MassingView) -> f64 {
    v.scene
        .faces
        .iter()
        .find(|f| f.kind == FaceKind::Ground)
        .and_then(|g| geo::BoundingRect::bounding_rect(&g.shape))
        .map_or(50.0, |r| r.width().max(r.height()))
}

/// The key: what the fills mean.
fn draw_key(d: &mut dyn Draw, v: &MassingView, x: f64, top: f64) {
    d.text(x, top + 10.0, TEXT_PX, "Faces", INK, Anchor::Start);
    let proposed = v.model.volumes.iter().any(|vol| vol.status == Status::Proposed);
    let mut rows: Vec<(Colour, &str)> =
        vec![(times(EXISTING, 1.0), "existing, in sun"), (times(EXISTING, IN_SHADOW), "existing, in shadow")];
    if proposed {
        rows.push((times(PROPOSED, 1.0), "proposed, in sun"));
        rows.push((times(PROPOSED, IN_SHADOW), "proposed, in shadow"));
    }
    rows.push((times(GROUND, 1.0), "ground, in sun"));
    rows.push((times(GROUND, IN_SHADOW), "ground, in shadow"));
    if v.scene.faces.iter().any(|f| f.kind == FaceKind::Envelope) {
        rows.push((ENVELOPE, "solar envelope (steps)"));
    }
    let mut y = top + 30.0;
    for (colour, label) in rows {
        d.fill_rect(x, y - 11.0, 22.0, 14.0, colour);
        d.stroke(&[(x, y - 11.0), (x + 22.0, y - 11.0), (x + 22.0, y + 3.0), (x, y + 3.0)], 0.8, EDGE, true);
        d.text(x + 30.0, y, LABEL_PX, label, INK, Anchor::Start);
        y += 22.0;
    }
    y += 8.0;
    let notes = [
        "Lit faces are lighter the more squarely the sun meets them (Lambert).",
        "Shadows are exact polygons on the ground, roofs and walls.",
    ];
    for note in notes {
        for line in super::draw::wrap_on(d, note, LABEL_PX, KEY_PX - 16.0) {
            d.text(x, y, LABEL_PX, &line, MUTED, Anchor::Start);
            y += LABEL_PX * 1.35;
        }
        y += 6.0;
    }
    if v.light.sun.is_some() {
        d.stroke(&[(x, y), (x + 22.0, y)], 1.6, SUN, false);
        d.text(x + 30.0, y + 4.0, LABEL_PX, "sunlight", INK, Anchor::Start);
    }
}

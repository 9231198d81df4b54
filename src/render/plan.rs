//! What every plan figure shares: fitting the plan into a box, outlines of areas and volumes with
//! labels where they fit, a scale bar, a true-north arrow and the key of outline styles.

use geo::{Area, BooleanOps, BoundingRect, Coord, MultiPolygon, Polygon, Rect};

use crate::site::{SiteModel, Status};

use super::draw::{Anchor, Colour, Draw, INK, LABEL_PX, MUTED, TEXT_PX};
use super::labels::LabelPlacer;

/// The colour of the proposal on every plan: its outlines, and the shade it adds (deep indigo, CIE
/// L* ≈ 24, far darker than the existing shade's grey; sunlot's own code).
pub const PROPOSED: Colour = Colour::rgb(38, 48, 130);
/// Roofs of existing buildings.
const BUILDING: Colour = Colour::rgb(222, 222, 222);
/// Roofs of proposed buildings: a pale tint of the proposal colour.
const PROPOSED_ROOF: Colour = Colour::rgb(228, 230, 244);

/// What an outline on the plan is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum OutlineKind {
    /// An area (lot, garden): thin line.
    Area,
    /// An existing volume: solid line.
    Existing,
    /// A proposed volume: a heavier line in the proposal colour.
    Proposed,
}

/// An outline drawn over the map, with a label.
#[derive(Debug, Clone, PartialEq)]
pub struct Outline {
    /// Plan polygon, metres.
    pub polygon: Polygon<f64>,
    /// Label drawn inside it where it fits, else beside it with a leader (may be empty).
    pub label: String,
    /// How it is drawn.
    pub kind: OutlineKind,
    /// Where the label may go, if not anywhere in the polygon (a podium's label outside the taller
    /// block standing on it), plan metres.
    pub label_region: Option<MultiPolygon<f64>>,
}

impl OutlineKind {
    fn style(self) -> (Colour, f64) {
        match self {
            OutlineKind::Area => (MUTED, 1.0),
            OutlineKind::Existing => (INK, 1.5),
            OutlineKind::Proposed => (PROPOSED, 2.5),
        }
    }
}

/// Plan metres to pixels: the plan fitted into a box, north (the plan's y) up.
#[derive(Debug, Clone, Copy)]
pub struct PlanFrame {
    ext: Rect<f64>,
    /// Pixels per metre.
    pub scale: f64,
    ox: f64,
    oy: f64,
    /// The box: left, top, width, height, pixels.
    pub bx: f64,
    /// Top of the box.
    pub by: f64,
    /// Width of the box.
    pub bw: f64,
    /// Height of the box.
    pub bh: f64,
}

impl PlanFrame {
    /// Fits `extent` and every outline into the box `(x, y, width, height)`.
    pub fn fit(extent: Rect<f64>, outlines: &[Outline], (bx, by, bw, bh): (f64, f64, f64, f64)) -> Self {
        let mut ext = extent;
        for o in outlines {
            if let Some(r) = o.polygon.bounding_rect() {
                ext = Rect::new(
                    Coord { x: ext.min().x.min(r.min().x), y: ext.min().y.min(r.min().y) },
                    Coord { x: ext.max().x.max(r.max().x), y: ext.max().y.max(r.max().y) },
                );
            }
        }
        let scale = (bw / ext.width().max(1e-9)).min(bh / ext.height().max(1e-9));
        let ox = bx + (bw - ext.width() * scale) / 2.0;
        let oy = by + (bh - ext.height() * scale) / 2.0;
        PlanFrame { ext, scale, ox, oy, bx, by, bw, bh }
    }

    /// A view of the plan: the point `centre` (plan metres) at the middle of the box and `width_m`
    /// metres across it (pan and zoom). Widths are kept between 1 mm and 100 km.
    pub fn view(centre: Coord<f64>, width_m: f64, (bx, by, bw, bh): (f64, f64, f64, f64)) -> Self {
        let width_m = if width_m.is_finite() { width_m.clamp(1e-3, 1e5) } else { 100.0 };
        let scale = bw / width_m;
        let (hw, hh) = (bw / scale / 2.0, bh / scale / 2.0);
        let ext = Rect::new(Coord { x: centre.x - hw, y: centre.y - hh }, Coord { x: centre.x + hw, y: centre.y + hh });
        PlanFrame { ext, scale, ox: bx, oy: by, bx, by, bw, bh }
    }

    /// The box as `(x, y, width, height)`, pixels.
    pub fn bounds_px(&self) -> (f64, f64, f64, f64) {
        (self.bx, self.by, self.bw, self.bh)
    }

    /// Pixel position of a plan point.
    pub fn to_px(&self, c: Coord<f64>) -> (f64, f64) {
        (self.ox + (c.x - self.ext.min().x) * self.scale, self.oy + (self.ext.max().y - c.y) * self.scale)
    }

    /// The plan point under a pixel (the inverse of [`PlanFrame::to_px`]).
    pub fn to_plan(&self, x: f64, y: f64) -> Coord<f64> {
        Coord { x: self.ext.min().x + (x - self.ox) / self.scale, y: self.ext.max().y - (y - self.oy) / self.scale }
    }

    /// A polygon's rings in pixels.
    pub fn rings(&self, p: &Polygon<f64>) -> Vec<Vec<(f64, f64)>> {
        std::iter::once(p.exterior())
            .chain(p.interiors())
            .map(|r| r.coords().map(|c| self.to_px(*c)).collect())
            .collect()
    }
}

/// Roofs filled (existing grey, proposed a pale tint), every outline stroked in its style, then every
/// label: inside its outline where it fits, else beside it with a leader, never over another label.
/// Buildings are labelled before areas, the larger first.
pub fn draw_outlines(d: &mut dyn Draw, frame: &PlanFrame, outlines: &[Outline]) {
    draw_outline_shapes(d, frame, outlines);
    draw_outline_labels(d, frame, outlines, &mut LabelPlacer::new(frame.bounds_px()));
}

/// The fills and strokes of [`draw_outlines`], no labels.
pub fn draw_outline_shapes(d: &mut dyn Draw, frame: &PlanFrame, outlines: &[Outline]) {
    for o in outlines {
        match o.kind {
            OutlineKind::Existing => d.fill_polygon(&frame.rings(&o.polygon), BUILDING),
            OutlineKind::Proposed => d.fill_polygon(&frame.rings(&o.polygon), PROPOSED_ROOF),
            OutlineKind::Area => {}
        }
    }
    for o in outlines {
        let (colour, width) = o.kind.style();
        for ring in frame.rings(&o.polygon) {
            d.stroke(&ring, width, colour, true);
        }
    }
}

/// The labels of [`draw_outlines`], placed among those `placer` already holds.
pub fn draw_outline_labels(d: &mut dyn Draw, frame: &PlanFrame, outlines: &[Outline], placer: &mut LabelPlacer) {
    let mut order: Vec<&Outline> = outlines.iter().filter(|o| !o.label.is_empty()).collect();
    order.sort_by(|a, b| {
        (a.kind == OutlineKind::Area)
            .cmp(&(b.kind == OutlineKind::Area))
            .then(b.polygon.unsigned_area().total_cmp(&a.polygon.unsigned_area()))
    });
    for o in order {
        let colour = if o.kind == OutlineKind::Area { INK } else { o.kind.style().0 };
        let rings: Vec<Vec<(f64, f64)>> = match &o.label_region {
            Some(region) => region
                .0
                .iter()
                .max_by(|a, b| a.unsigned_area().total_cmp(&b.unsigned_area()))
                .map(|p| frame.rings(p))
                .unwrap_or_default(),
            None => frame.rings(&o.polygon),
        };
        placer.label(d, &rings, &o.label, LABEL_PX, colour);
    }
}

/// A length of 1, 2 or 5 × 10ⁿ metres near `target`.
fn nice_length(target: f64) -> f64 {
    let p = 10f64.powf(target.log10().floor());
    [10.0, 5.0, 2.0, 1.0].into_iter().map(|k| k * p).find(|&l| l <= target).unwrap_or(p)
}

/// A scale bar under the plan's box, about a quarter of the plan's width.
pub fn draw_scale_bar(d: &mut dyn Draw, frame: &PlanFrame) {
    let len_m = nice_length(frame.ext.width() / 4.0);
    let (sx, sy) = (frame.bx, frame.by + frame.bh + 24.0);
    let half = len_m * frame.scale / 2.0;
    // Two halves, filled and open: the bar reads in greyscale and at any size.
    d.fill_rect(sx, sy - 6.0, half, 6.0, INK);
    d.stroke(&[(sx, sy - 6.0), (sx + 2.0 * half, sy - 6.0), (sx + 2.0 * half, sy), (sx, sy)], 1.0, INK, true);
    d.text(sx, sy + 18.0, LABEL_PX, "0", INK, Anchor::Middle);
    d.text(sx + 2.0 * half, sy + 18.0, LABEL_PX, &format!("{len_m} m"), INK, Anchor::Middle);
}

/// True north at the top right of the plan's box: the plan's north turned back by its rotation.
pub fn draw_north_arrow(d: &mut dyn Draw, frame: &PlanFrame, plan_rotation_deg: f64) {
    let (nx, ny, r) = (frame.bx + frame.bw - 20.0, frame.by + 30.0, 18.0);
    let (s, c) = (-plan_rotation_deg).to_radians().sin_cos();
    let tip = (nx + r * s, ny - r * c);
    let left = (nx - 0.45 * r * c - 0.6 * r * s, ny - 0.45 * r * s + 0.6 * r * c);
    let right = (nx + 0.45 * r * c - 0.6 * r * s, ny + 0.45 * r * s + 0.6 * r * c);
    d.fill_polygon(&[vec![tip, right, (nx, ny), left]], INK);
    d.text(tip.0 + 14.0 * s, tip.1 - 14.0 * c + 5.0, TEXT_PX, "N", INK, Anchor::Middle);
}

/// The key of the outline styles present, one line each from (`x`, `y`) down; returns the next free y.
pub fn outline_key(d: &mut dyn Draw, outlines: &[Outline], x: f64, y: f64) -> f64 {
    let mut y = y;
    for (kind, label) in
        [(OutlineKind::Existing, "existing"), (OutlineKind::Proposed, "proposed"), (OutlineKind::Area, "area")]
    {
        if outlines.iter().any(|o| o.kind == kind) {
            let (colour, width) = kind.style();
            let swatch = [(x, y - 9.0), (x + 24.0, y - 9.0), (x + 24.0, y + 5.0), (x, y + 5.0)];
            match kind {
                OutlineKind::Existing => d.fill_polygon(&[swatch.to_vec()], BUILDING),
                OutlineKind::Proposed => d.fill_polygon(&[swatch.to_vec()], PROPOSED_ROOF),
                OutlineKind::Area => {}
            }
            d.stroke(&swatch, width, colour, true);
            d.text(x + 34.0, y + 3.0, TEXT_PX, label, INK, Anchor::Start);
            y += 24.0;
        }
    }
    y
}

/// The plan outlines of a site: areas labelled by id, volumes by the height of their top; a volume's
/// label stays off the footprints of taller volumes over it (a podium's on the podium, not on the
/// block it carries).
pub fn site_outlines(model: &SiteModel) -> Vec<Outline> {
    let mut out: Vec<Outline> = model
        .areas
        .iter()
        .map(|a| Outline {
            polygon: a.polygon.clone(),
            label: a.id.clone(),
            kind: OutlineKind::Area,
            label_region: None,
        })
        .collect();
    for v in &model.volumes {
        let kind = if v.status == Status::Proposed { OutlineKind::Proposed } else { OutlineKind::Existing };
        let own = MultiPolygon::new(vec![v.footprint.clone()]);
        let taller: Vec<Polygon<f64>> =
            model.volumes.iter().filter(|o| o.top_m > v.top_m).map(|o| o.footprint.clone()).collect();
        let region = (!taller.is_empty()).then(|| own.difference(&MultiPolygon::new(taller)));
        let label = format!("{} m", v.top_m);
        out.push(Outline {
            polygon: v.footprint.clone(),
            label,
            kind,
            label_region: region.filter(|r| r.unsigned_area() > 0.0),
        });
    }
    out
}

/// The bounding box of a site's areas and volumes grown by a fifth on each side (the plan a figure
/// shows); `None` for an empty site.
pub fn site_bounds(model: &SiteModel) -> Option<Rect<f64>> {
    let mut polys: Vec<Polygon<f64>> = model.areas.iter().map(|a| a.polygon.clone()).collect();
    polys.extend(model.volumes.iter().map(|v| v.footprint.clone()));
    let r = MultiPolygon::new(polys).bounding_rect()?;
    let m = 0.2 * r.width().max(r.height());
    Some(Rect::new(Coord { x: r.min().x - m, y: r.min().y - m }, Coord { x: r.max().x + m, y: r.max().y + m }))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pixels_map_back_to_the_plan() {
        let ext = Rect::new(Coord { x: -12.0, y: 3.0 }, Coord { x: 40.0, y: 70.0 });
        let f = PlanFrame::fit(ext, &[], (24.0, 80.0, 700.0, 560.0));
        for c in [Coord { x: -12.0, y: 3.0 }, Coord { x: 40.0, y: 70.0 }, Coord { x: 7.25, y: 33.5 }] {
            let (x, y) = f.to_px(c);
            let back = f.to_plan(x, y);
            assert!((back.x - c.x).abs() < 1e-9 && (back.y - c.y).abs() < 1e-9, "{c:?} → {back:?}");
        }
        // North up: a larger plan y is higher on the figure.
        assert!(f.to_px(Coord { x: 0.0, y: 60.0 }).1 < f.to_px(Coord { x: 0.0, y: 10.0 }).1);
    }

    #[test]
    fn a_view_puts_its_centre_mid_box_at_its_width() {
        let f = PlanFrame::view(Coord { x: 10.0, y: 20.0 }, 50.0, (24.0, 80.0, 700.0, 560.0));
        let (x, y) = f.to_px(Coord { x: 10.0, y: 20.0 });
        assert!((x - 374.0).abs() < 1e-9 && (y - 360.0).abs() < 1e-9, "{x} {y}");
        assert!((f.scale - 14.0).abs() < 1e-12);
        let left = f.to_plan(24.0, 360.0);
        assert!((left.x - -15.0).abs() < 1e-9);
    }
}

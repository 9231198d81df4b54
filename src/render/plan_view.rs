//! The shadow plan: the site at a moment, with the shade of the existing massing and the shade the
//! proposal adds, outlines, scale bar, north arrow and key.

use geo::{BooleanOps, Coord, MultiPolygon, Rect};

use super::draw::{footnote, heading, Anchor, Colour, Draw, INK, PAPER};
use super::layer::{draw_cells, draw_legend, MapLayer};
use super::plan::{
    draw_north_arrow, draw_outlines, draw_scale_bar, outline_key, site_bounds, site_outlines, Outline, PlanFrame,
    PROPOSED,
};
use crate::shadow::Study;
use crate::site::SiteModel;

const EXISTING_SHADE: Colour = Colour { r: 60, g: 60, b: 90, a: 110 };
const ADDED_SHADE: Colour = Colour { r: PROPOSED.r, g: PROPOSED.g, b: PROPOSED.b, a: 120 };

/// A shadow plan to draw (sized [`super::FIGURE_PX`]).
#[derive(Debug, Clone)]
pub struct ShadowPlan {
    /// Title line.
    pub title: String,
    /// A second line (the moment, the sun).
    pub subtitle: String,
    /// Outlines of areas and volumes.
    pub outlines: Vec<Outline>,
    /// Shade of the existing massing, plan metres.
    pub existing: MultiPolygon<f64>,
    /// Shade the proposal adds (with-proposal shade minus existing shade).
    pub added: MultiPolygon<f64>,
    /// The plan area to show (the shadows are drawn within it).
    pub extent: Rect<f64>,
    /// Rotation of the plan's north from true north, degrees clockwise.
    pub plan_rotation_deg: f64,
    /// Footnote (the caution).
    pub caution: String,
}

impl ShadowPlan {
    /// The plan of `study` (of `model` at the moment labelled `when`): the site's areas and volumes
    /// with a margin, the shadows cut to it.
    pub fn of_study(model: &SiteModel, study: &Study, when: &str) -> ShadowPlan {
        let shown =
            site_bounds(model).unwrap_or_else(|| Rect::new(Coord { x: -50.0, y: -50.0 }, Coord { x: 50.0, y: 50.0 }));
        let frame = MultiPolygon::new(vec![shown.to_polygon()]);
        let none = || MultiPolygon::new(vec![]);
        let (subtitle, existing, added) = match study {
            Study::Sun { sun, existing, combined, clipped, .. } => (
                format!(
                    "sun at azimuth {:.1}°, altitude {:.1}°{}",
                    sun.azimuth_deg,
                    sun.altitude_deg,
                    if *clipped { "; long shadows cut at the analysis extent" } else { "" }
                ),
                existing.intersection(&frame),
                combined.difference(existing).intersection(&frame),
            ),
            Study::NoSun { .. } => ("the sun is below the horizon: no direct sun".into(), none(), none()),
            Study::SunBehindGround { .. } => {
                ("the sun is behind the sloping ground: all of it in the slope's shade".into(), frame.clone(), none())
            }
        };
        ShadowPlan {
            title: format!("Shadows at {when} — {}", model.name),
            subtitle,
            outlines: site_outlines(model),
            existing,
            added,
            extent: shown,
            plan_rotation_deg: model.plan_rotation_deg,
            caution: crate::rules::CAUTION.into(),
        }
    }
}

/// What a shadow plan may show besides the shadows: a map layer under them (with its cells as
/// pixels, from [`MapLayer::rgba`]) and a view (pan and zoom) instead of the whole site.
#[derive(Debug, Clone, Copy, Default)]
pub struct PlanExtras<'a> {
    /// The layer and its pixels.
    pub layer: Option<(&'a MapLayer, &'a [u8])>,
    /// The plan point at the middle of the plan box and the metres across it.
    pub view: Option<(Coord<f64>, f64)>,
}

/// Draws `plan` onto `d`; returns where the plan lies in the figure (to map clicks back to the plan).
pub fn draw_shadow_plan(d: &mut dyn Draw, plan: &ShadowPlan, extras: &PlanExtras) -> PlanFrame {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    heading(d, &plan.title, &plan.subtitle);
    let plan_box = (24.0, 80.0, w - 260.0, h - 200.0);
    let frame = match extras.view {
        Some((centre, width_m)) => PlanFrame::view(centre, width_m, plan_box),
        None => PlanFrame::fit(plan.extent, &plan.outlines, plan_box),
    };
    d.clip(Some(plan_box));
    if let Some((layer, rgba)) = extras.layer {
        draw_cells(d, &frame, layer, rgba);
    }
    for (mp, colour) in [(&plan.existing, EXISTING_SHADE), (&plan.added, ADDED_SHADE)] {
        for p in &mp.0 {
            d.fill_polygon(&frame.rings(p), colour);
        }
    }
    draw_outlines(d, &frame, &plan.outlines);
    d.clip(None);
    if extras.view.is_some() {
        let (bx, by, bw, bh) = plan_box;
        d.stroke(&[(bx, by), (bx + bw, by), (bx + bw, by + bh), (bx, by + bh)], 1.0, Colour::rgb(200, 200, 200), true);
    }
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, plan.plan_rotation_deg);
    let (lx, ly) = (w - 200.0, frame.by + 20.0);
    for (k, (colour, label)) in
        [(EXISTING_SHADE, "shade of existing"), (ADDED_SHADE, "added by proposal")].iter().enumerate()
    {
        let y = ly + 22.0 * k as f64;
        d.fill_rect(lx, y - 10.0, 24.0, 12.0, *colour);
        d.text(lx + 34.0, y, 12.0, label, INK, Anchor::Start);
    }
    let mut y = ly + 60.0;
    if let Some((layer, _)) = extras.layer {
        y = draw_legend(d, lx, y + 10.0, &layer.label, &layer.unit, layer.range) + 30.0;
    }
    outline_key(d, &plan.outlines, lx, y);
    footnote(d, &plan.caution);
    frame
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::render::{Pixmap, FIGURE_PX};
    use crate::shadow::shadow_study;
    use crate::time::DeltaT;
    use geo::Rect;

    fn plan() -> ShadowPlan {
        let model = crate::demo::demo();
        let t = chrono::DateTime::parse_from_rfc3339("2026-03-21T15:00:00Z").unwrap().to_utc();
        let study = shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap();
        ShadowPlan::of_study(&model, &study, "2026-03-21T15:00Z")
    }

    #[test]
    fn a_zoomed_view_with_a_layer_stays_inside_the_plan_box() {
        let p = plan();
        // A layer of one value far larger than the view: without the clip it would cover the figure.
        let layer = MapLayer {
            label: "test".into(),
            unit: "h".into(),
            bounds: Rect::new(Coord { x: -500.0, y: -500.0 }, Coord { x: 500.0, y: 500.0 }),
            cols: 2,
            rows: 2,
            values: vec![Some(1.0); 4],
            range: (0.0, 1.0),
        };
        let rgba = layer.rgba();
        let extras = PlanExtras { layer: Some((&layer, &rgba)), view: Some((Coord { x: 14.0, y: 20.0 }, 10.0)) };
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_shadow_plan(&mut px, &p, &extras);
        assert!((frame.scale - 70.0).abs() < 1e-9, "700 px over 10 m");
        let at = |x: usize, y: usize| {
            let i = (y * FIGURE_PX.0 as usize + x) * 4;
            [px.rgba()[i], px.rgba()[i + 1], px.rgba()[i + 2]]
        };
        // Just inside the box's corners: the layer (under shade or outlines, never paper); just
        // outside the box (left margin, under the box): paper.
        for (x, y) in [(30, 90), (716, 90), (30, 634), (716, 634)] {
            assert_ne!(at(x, y), [255, 255, 255], "({x}, {y})");
        }
        assert_eq!(at(10, 300), [255, 255, 255]);
        assert_eq!(at(300, 650), [255, 255, 255]);
    }

    #[test]
    fn the_whole_site_is_fitted_when_no_view_is_given() {
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_shadow_plan(&mut px, &plan(), &PlanExtras::default());
        // The demo site with its margin is about 90 m across: a few pixels a metre.
        assert!(frame.scale > 4.0 && frame.scale < 12.0, "{}", frame.scale);
    }
}

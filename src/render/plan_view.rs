//! The shadow plan: the site at a moment, with the shade of the existing massing and the shade the
//! proposal adds, outlines, scale bar, north arrow and key.

use geo::{BooleanOps, Coord, MultiPolygon, Rect};

use super::draw::{footnote, footnote_px, heading, Anchor, Colour, Draw, INK, PAPER, TEXT_PX};
use super::hatch::hatch_segments;
use super::layer::{draw_cells, draw_legend, MapLayer};
use super::plan::{
    draw_north_arrow, draw_outlines, draw_scale_bar, outline_key, site_bounds, site_outlines, Outline, PlanFrame,
    PROPOSED,
};
use crate::shadow::Study;
use crate::site::SiteModel;

/// Shade of the existing massing: a light neutral grey veil (CIE L* ≈ 76 on paper).
pub const EXISTING_SHADE: Colour = Colour { r: 80, g: 80, b: 80, a: 100 };
/// Shade the proposal adds: the proposal's indigo, denser (L* ≈ 47 on paper, ≥ 25 below the existing
/// shade however colours are seen), hatched and outlined so it also reads in greyscale print.
pub const ADDED_SHADE: Colour = Colour { r: PROPOSED.r, g: PROPOSED.g, b: PROPOSED.b, a: 178 };
/// Spacing of the added shade's hatching, pixels.
const HATCH_PX: f64 = 7.0;

/// Fills the shade the proposal adds in `rings` (pixels): the veil, diagonal hatching and an outline.
pub fn draw_added_shade(d: &mut dyn Draw, rings: &[Vec<(f64, f64)>]) {
    d.fill_polygon(rings, ADDED_SHADE);
    for [a, b] in hatch_segments(rings, HATCH_PX) {
        d.stroke(&[a, b], 1.2, PROPOSED, false);
    }
    for ring in rings {
        d.stroke(ring, 1.2, PROPOSED, true);
    }
}

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
    /// The plan area to show (the shadows are drawn within it): the site's frame grown toward long
    /// shadows within [`super::cut::MAX_GROWTH`].
    pub extent: Rect<f64>,
    /// Stretches of the extent's edges where a shadow runs on past it (plan metres), marked with a
    /// break line.
    pub cut: Vec<[Coord<f64>; 2]>,
    /// Rotation of the plan's north from true north, degrees clockwise.
    pub plan_rotation_deg: f64,
    /// Footnote (the caution).
    pub caution: String,
}

impl ShadowPlan {
    /// The plan of `study` (of `model` at the moment labelled `when`): the site's areas and volumes
    /// with a margin, the shadows cut to it.
    pub fn of_study(model: &SiteModel, study: &Study, when: &str) -> ShadowPlan {
        let site =
            site_bounds(model).unwrap_or_else(|| Rect::new(Coord { x: -50.0, y: -50.0 }, Coord { x: 50.0, y: 50.0 }));
        let none = || MultiPolygon::new(vec![]);
        let (subtitle, existing, added, shown, cut) = match study {
            Study::Sun { sun, existing, combined, .. } => {
                let shown = super::cut::grown_extent(site, combined, crate::shadow::analysis_extent(model));
                let frame = MultiPolygon::new(vec![shown.to_polygon()]);
                let cut = super::cut::cut_edges(combined, shown);
                let sides = super::cut::cut_sides(&cut, shown);
                let mut subtitle = format!("sun at azimuth {:.1}°, altitude {:.1}°", sun.azimuth_deg, sun.altitude_deg);
                if !sides.is_empty() {
                    subtitle.push_str(&format!(" — shadows run on past the {sides} edge of the plan (marked)"));
                }
                let added = combined.difference(existing).intersection(&frame);
                (subtitle, existing.intersection(&frame), added, shown, cut)
            }
            Study::NoSun { .. } => ("the sun is below the horizon: no direct sun".into(), none(), none(), site, vec![]),
            Study::SunBehindGround { .. } => (
                "the sun is behind the sloping ground: all of it in the slope's shade".into(),
                MultiPolygon::new(vec![site.to_polygon()]),
                none(),
                site,
                vec![],
            ),
        };
        ShadowPlan {
            title: super::titled(&format!("Shadows at {when}"), &model.name),
            subtitle,
            outlines: site_outlines(model),
            existing,
            added,
            extent: shown,
            cut,
            plan_rotation_deg: model.plan_rotation_deg,
            caution: crate::rules::CAUTION.into(),
        }
    }
}

/// Width of the key column at the right of a plan figure, pixels.
pub const KEY_PX: f64 = 250.0;

/// The key column's width on a figure `width_px` wide: [`KEY_PX`], narrower on a narrow figure (drawn
/// small for print or a narrow page) so the plan keeps most of the width; its longest entries still fit.
pub fn key_px(width_px: f64) -> f64 {
    if width_px < 800.0 {
        190.0
    } else {
        KEY_PX
    }
}

/// The key of the two shades, from (`x`, `y`) down; returns the next free y.
pub fn shade_key(d: &mut dyn Draw, x: f64, y: f64) -> f64 {
    let swatch = |y: f64| vec![(x, y - 11.0), (x + 28.0, y - 11.0), (x + 28.0, y + 5.0), (x, y + 5.0)];
    d.fill_polygon(&[swatch(y)], EXISTING_SHADE);
    d.stroke(&swatch(y), 1.0, Colour::rgb(150, 150, 150), true);
    d.text(x + 38.0, y + 3.0, TEXT_PX, "existing shade", INK, Anchor::Start);
    let y2 = y + 26.0;
    draw_added_shade(d, &[swatch(y2)]);
    d.text(x + 38.0, y2 + 3.0, TEXT_PX, "added by proposal", INK, Anchor::Start);
    y2 + 26.0
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
    let top = heading(d, &plan.title, &plan.subtitle);
    let plan_box = (24.0, top, w - 24.0 - key_px(w), h - top - 56.0 - footnote_px(d, &plan.caution));
    let frame = match extras.view {
        Some((centre, width_m)) => PlanFrame::view(centre, width_m, plan_box),
        None => PlanFrame::fit(plan.extent, &plan.outlines, plan_box),
    };
    d.clip(Some(plan_box));
    if let Some((layer, rgba)) = extras.layer {
        draw_cells(d, &frame, layer, rgba);
    }
    for p in &plan.existing.0 {
        d.fill_polygon(&frame.rings(p), EXISTING_SHADE);
    }
    for p in &plan.added.0 {
        draw_added_shade(d, &frame.rings(p));
    }
    draw_outlines(d, &frame, &plan.outlines);
    d.clip(None);
    if extras.view.is_some() {
        let (bx, by, bw, bh) = plan_box;
        d.stroke(&[(bx, by), (bx + bw, by), (bx + bw, by + bh), (bx, by + bh)], 1.0, Colour::rgb(200, 200, 200), true);
    } else if !plan.cut.is_empty() {
        // The frame the shadows are cut to, and a break line where they run on past it.
        let (lo, hi) = (plan.extent.min(), plan.extent.max());
        let corners = [lo, Coord { x: hi.x, y: lo.y }, hi, Coord { x: lo.x, y: hi.y }].map(|c| frame.to_px(c));
        d.stroke(&corners, 1.0, Colour::rgb(200, 200, 200), true);
        for [a, b] in &plan.cut {
            super::cut::draw_break_line(d, frame.to_px(*a), frame.to_px(*b), INK);
        }
    }
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, plan.plan_rotation_deg);
    let (lx, ly) = (w - key_px(w) + 16.0, frame.by + 20.0);
    let mut y = shade_key(d, lx, ly);
    if extras.view.is_none() && !plan.cut.is_empty() {
        super::cut::draw_break_line(d, (lx, y - 3.0), (lx + 28.0, y - 3.0), INK);
        d.text(lx + 38.0, y + 3.0, TEXT_PX, "cut at the edge", INK, Anchor::Start);
        y += 26.0;
    }
    y += 14.0;
    if let Some((layer, _)) = extras.layer {
        y = draw_legend(d, lx, y + 14.0, &layer.label, &layer.unit, layer.range) + 30.0;
    }
    outline_key(d, &plan.outlines, lx, y);
    footnote(d, &plan.caution);
    frame
}

#[cfg(all(test, not(target_arch = "wasm32")))]
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
            values: vec![Some(1.0); 4].into(),
            range: (0.0, 1.0),
        };
        let rgba = layer.rgba();
        let extras = PlanExtras { layer: Some((&layer, &rgba)), view: Some((Coord { x: 14.0, y: 20.0 }, 10.0)) };
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_shadow_plan(&mut px, &p, &extras);
        let (bx, by, bw, bh) = frame.bounds_px();
        assert!((frame.scale - bw / 10.0).abs() < 1e-9, "the box's width over 10 m");
        let r = px.render().unwrap();
        let at = |x: f64, y: f64| r.rgb(x as u32, y as u32);
        // Just inside the box's corners: the layer (under shade or outlines, never paper); just
        // outside the box (left margin, under the box): paper.
        for (x, y) in
            [(bx + 6.0, by + 6.0), (bx + bw - 6.0, by + 6.0), (bx + 6.0, by + bh - 6.0), (bx + bw - 6.0, by + bh - 6.0)]
        {
            assert_ne!(at(x, y), [255, 255, 255], "({x}, {y})");
        }
        assert_eq!(at(10.0, by + bh / 2.0), [255, 255, 255]);
        assert_eq!(at(bx + bw / 2.0, by + bh + 3.0), [255, 255, 255]);
    }

    /// A low winter sun (4° up, from the south-east): the frame grows toward the shadows up to its cap
    /// and marks where they run on past its west edge, in the subtitle and with a break line.
    #[test]
    fn long_shadows_grow_the_frame_and_are_marked_where_cut() {
        let model = crate::demo::demo();
        let t = chrono::DateTime::parse_from_rfc3339("2026-12-21T09:00:00Z").unwrap().to_utc();
        let study = shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap();
        let plan = ShadowPlan::of_study(&model, &study, "2026-12-21 09:00 GMT");
        let site = crate::render::site_bounds(&model).unwrap();
        assert!(plan.extent.width() > site.width() * 1.9 && plan.extent.min().x < site.min().x);
        assert!(!plan.cut.is_empty() && plan.cut.iter().all(|[a, b]| a.x == plan.extent.min().x && b.x == a.x));
        assert!(plan.subtitle.contains("run on past the west edge"), "{}", plan.subtitle);
        let mut svg = crate::render::Svg::new(FIGURE_PX.0, FIGURE_PX.1);
        draw_shadow_plan(&mut svg, &plan, &PlanExtras::default());
        assert!(svg.finish().contains("cut at the edge"));
        // At 15:00 in March every shadow fits: no mark.
        assert!(plan_at("2026-03-21T15:00:00Z").cut.is_empty());
    }

    fn plan_at(t: &str) -> ShadowPlan {
        let model = crate::demo::demo();
        let t = chrono::DateTime::parse_from_rfc3339(t).unwrap().to_utc();
        ShadowPlan::of_study(&model, &shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap(), "t")
    }

    /// An imported site may have no name: its titles then end with the title, not a bare dash.
    #[test]
    fn a_site_without_a_name_has_titles_without_a_dangling_dash() {
        let mut model = crate::demo::demo();
        model.name = String::new();
        let t = chrono::DateTime::parse_from_rfc3339("2026-03-21T15:00:00Z").unwrap().to_utc();
        let study = shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap();
        let plan = ShadowPlan::of_study(&model, &study, "2026-03-21T15:00Z");
        assert_eq!(plan.title, "Shadows at 2026-03-21T15:00Z");
        let chart = crate::render::SkyChart::for_site(&model, crate::render::SkyChartRequest::year(2026));
        assert!(chart.is_ok_and(|c| c.title == "Sun path"));
    }

    #[test]
    fn the_whole_site_is_fitted_when_no_view_is_given() {
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_shadow_plan(&mut px, &plan(), &PlanExtras::default());
        // The demo site with its margin is about 90 m across: a few pixels a metre.
        assert!(frame.scale > 4.0 && frame.scale < 12.0, "{}", frame.scale);
    }
}

//! The shadow plan: the site at a moment, with the shade of the existing massing and the shade the
//! proposal adds, outlines, scale bar, north arrow and key.

use geo::{BooleanOps, Coord, MultiPolygon, Rect};

use super::draw::{footnote, heading, Anchor, Colour, Draw};
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

/// Draws `plan` onto `d`; returns where the plan lies in the figure (to map clicks back to the plan).
pub fn draw_shadow_plan(d: &mut dyn Draw, plan: &ShadowPlan) -> PlanFrame {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, Colour::rgb(255, 255, 255));
    heading(d, &plan.title, &plan.subtitle);
    let frame = PlanFrame::fit(plan.extent, &plan.outlines, (24.0, 80.0, w - 260.0, h - 200.0));
    for (mp, colour) in [(&plan.existing, EXISTING_SHADE), (&plan.added, ADDED_SHADE)] {
        for p in &mp.0 {
            d.fill_polygon(&frame.rings(p), colour);
        }
    }
    draw_outlines(d, &frame, &plan.outlines);
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, plan.plan_rotation_deg);
    let (lx, ly) = (w - 200.0, frame.by + 20.0);
    let ink = Colour::rgb(30, 30, 30);
    for (k, (colour, label)) in
        [(EXISTING_SHADE, "shade of existing"), (ADDED_SHADE, "added by proposal")].iter().enumerate()
    {
        let y = ly + 22.0 * k as f64;
        d.fill_rect(lx, y - 10.0, 24.0, 12.0, *colour);
        d.text(lx + 34.0, y, 12.0, label, ink, Anchor::Start);
    }
    outline_key(d, &plan.outlines, lx, ly + 60.0);
    footnote(d, &plan.caution);
    frame
}

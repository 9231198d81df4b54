//! The shadow plan: the site at a moment, with the shade of the existing massing and the shade the
//! proposal adds, outlines, scale bar, north arrow and key.

use geo::{MultiPolygon, Rect};

use super::draw::{footnote, heading, Anchor, Colour, Draw};
use super::plan::{draw_north_arrow, draw_outlines, draw_scale_bar, outline_key, Outline, PlanFrame, PROPOSED};

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

/// Draws `plan` onto `d`.
pub fn draw_shadow_plan(d: &mut dyn Draw, plan: &ShadowPlan) {
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
}

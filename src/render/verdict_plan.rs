//! The rule check on the plan: each tested area filled by its verdict and labelled with its id,
//! verdict and share margin, so a table row can be found on the drawing and the drawing read alone.
//!
//! Fills are from the Okabe–Ito palette (Okabe & Ito 2008, "Color Universal Design"), chosen to stay
//! apart for colour-blind readers: "passes" a light bluish green, "fails" a full vermillion with dark
//! hatching, so the two differ by ≥ 25 CIE L* (tests/figure_colours.rs) and in greyscale print; an
//! area whose verdict could flip within its share error gets a broken (dashed) outline.

use geo::Polygon;

use super::draw::{footnote, footnote_px, heading, Anchor, Colour, Draw, INK, LABEL_PX, PAPER, TEXT_PX};
use super::hatch::hatch_segments;
use super::labels::LabelPlacer;
use super::plan::{draw_north_arrow, draw_outline_labels, draw_outline_shapes, draw_scale_bar, outline_key};
use super::plan::{site_bounds, site_outlines};
use super::plan::{Outline, PlanFrame};
use super::plan_view::key_px;
use crate::rules::CheckReport;
use crate::site::SiteModel;

/// Fill of an area that passes: Okabe–Ito bluish green rgb(0, 158, 115) at 30 % over paper.
pub const PASSES: Colour = Colour { r: 0, g: 158, b: 115, a: 77 };
/// Fill of an area that fails: Okabe–Ito vermillion rgb(213, 94, 0).
pub const FAILS: Colour = Colour::rgb(213, 94, 0);
/// Hatching over a failing area.
const FAILS_HATCH: Colour = Colour::rgb(90, 30, 0);
const HATCH_PX: f64 = 7.0;

/// One tested area on the plan.
#[derive(Debug, Clone)]
pub struct AreaVerdict {
    /// The area's outline, plan metres.
    pub polygon: Polygon<f64>,
    /// Its label: id, verdict and margin ("garden-16 fails −12.4 pts").
    pub label: String,
    pub passes: bool,
    /// The verdict could flip within the share's error (drawn with a broken outline).
    pub near_threshold: bool,
}

/// A rule check to draw (sized [`super::FIGURE_PX`]).
#[derive(Debug, Clone)]
pub struct VerdictPlan {
    pub title: String,
    pub subtitle: String,
    pub outlines: Vec<Outline>,
    pub verdicts: Vec<AreaVerdict>,
    pub extent: geo::Rect<f64>,
    pub plan_rotation_deg: f64,
    /// Footnote: the rule's source and the caution.
    pub caution: String,
}

impl VerdictPlan {
    /// The plan of `report` on `model`: every tested area by its verdict, the rest as outlines.
    pub fn of_report(model: &SiteModel, report: &CheckReport) -> Option<Self> {
        let extent = site_bounds(model)?;
        let verdicts = report
            .areas
            .iter()
            .filter_map(|a| {
                let area = model.areas.iter().find(|m| m.id == a.id)?;
                let verdict = if a.passes { "passes" } else { "fails" };
                Some(AreaVerdict {
                    polygon: area.polygon.clone(),
                    label: format!("{}\n{verdict} {}", a.id, signed(100.0 * a.share_margin)),
                    passes: a.passes,
                    near_threshold: a.near_threshold,
                })
            })
            .collect();
        // Tested areas carry their own labels; the other outlines keep theirs.
        let tested: Vec<&str> = report.areas.iter().map(|a| a.id.as_str()).collect();
        let outlines = site_outlines(model)
            .into_iter()
            .map(|mut o| {
                if tested.contains(&o.label.as_str()) {
                    o.label.clear();
                }
                o
            })
            .collect();
        let source =
            if report.rule.source.is_empty() { String::new() } else { format!("Rule: {}. ", report.rule.source) };
        Some(VerdictPlan {
            title: super::titled(&format!("Rule check: {}", report.rule.title), &model.name),
            subtitle: format!(
                "{}: {} of {} areas pass · {} m cells, {}-minute steps · under each area its verdict and margin: \
                 share points above (+) or below (−) the rule's share",
                report.date,
                report.areas.iter().filter(|a| a.passes).count(),
                report.areas.len(),
                report.cell_m,
                report.step_min
            ),
            outlines,
            verdicts,
            extent,
            plan_rotation_deg: model.plan_rotation_deg,
            caution: format!("{source}{}", report.caution),
        })
    }
}

/// A margin with its sign, one decimal, a true minus sign for negatives ("+12.3", "−4.0").
fn signed(v: f64) -> String {
    format!("{v:+.1}").replace('-', "−")
}

fn fill_verdict(d: &mut dyn Draw, rings: &[Vec<(f64, f64)>], passes: bool) {
    if passes {
        d.fill_polygon(rings, PASSES);
    } else {
        d.fill_polygon(rings, FAILS);
        for [a, b] in hatch_segments(rings, HATCH_PX) {
            d.stroke(&[a, b], 1.0, FAILS_HATCH, false);
        }
    }
    for ring in rings {
        d.stroke(ring, 1.5, INK, true);
    }
}

/// The closed `ring` cut into dashes `on_px` long with `off_px` gaps, for stroking.
fn dashes(ring: &[(f64, f64)], on_px: f64, off_px: f64) -> Vec<Vec<(f64, f64)>> {
    let mut out = Vec::new();
    let mut current: Vec<(f64, f64)> = Vec::new();
    let (mut drawing, mut left) = (true, on_px);
    for (i, &a) in ring.iter().enumerate() {
        let b = ring[(i + 1) % ring.len()];
        let len = (b.0 - a.0).hypot(b.1 - a.1);
        let mut at = 0.0;
        while len - at > 1e-9 {
            let step = left.min(len - at);
            let p = |t: f64| (a.0 + (b.0 - a.0) * t / len, a.1 + (b.1 - a.1) * t / len);
            if drawing {
                if current.is_empty() {
                    current.push(p(at));
                }
                current.push(p(at + step));
            }
            at += step;
            left -= step;
            if left <= 1e-9 {
                if drawing {
                    out.push(std::mem::take(&mut current));
                }
                drawing = !drawing;
                left = if drawing { on_px } else { off_px };
            }
        }
    }
    if current.len() > 1 {
        out.push(current);
    }
    out
}

/// Draws `plan` onto `d`; returns where the plan lies in the figure.
pub fn draw_verdict_plan(d: &mut dyn Draw, plan: &VerdictPlan) -> PlanFrame {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    let top = heading(d, &plan.title, &plan.subtitle);
    let plan_box = (24.0, top, w - 24.0 - key_px(w), h - top - 56.0 - footnote_px(d, &plan.caution));
    let frame = PlanFrame::fit(plan.extent, &plan.outlines, plan_box);
    d.clip(Some(frame.bounds_px()));
    for v in &plan.verdicts {
        fill_verdict(d, &frame.rings(&v.polygon), v.passes);
    }
    draw_outline_shapes(d, &frame, &plan.outlines);
    for v in plan.verdicts.iter().filter(|v| v.near_threshold) {
        for ring in frame.rings(&v.polygon) {
            for dash in dashes(&ring, 8.0, 5.0) {
                d.stroke(&dash, 4.0, PAPER, false);
            }
        }
    }
    // Labels last, over every fill, on their paper backing: the verdicts first (they are what the
    // figure is for), then the outlines' own among them.
    let mut placer = LabelPlacer::new(frame.bounds_px());
    for v in plan.verdicts.iter().filter(|v| !v.label.is_empty()) {
        placer.label(d, &frame.rings(&v.polygon), &v.label, LABEL_PX, INK);
    }
    draw_outline_labels(d, &frame, &plan.outlines, &mut placer);
    d.clip(None);
    draw_scale_bar(d, &frame);
    draw_north_arrow(d, &frame, plan.plan_rotation_deg);
    let (lx, mut y) = (w - key_px(w) + 16.0, frame.by + 20.0);
    for (passes, text) in [(true, "passes"), (false, "fails")] {
        let swatch = vec![(lx, y - 9.0), (lx + 24.0, y - 9.0), (lx + 24.0, y + 7.0), (lx, y + 7.0)];
        fill_verdict(d, &[swatch], passes);
        d.text(lx + 34.0, y + 3.0, TEXT_PX, text, INK, Anchor::Start);
        y += 26.0;
    }
    if plan.verdicts.iter().any(|v| v.near_threshold) {
        let swatch = vec![(lx, y - 9.0), (lx + 24.0, y - 9.0), (lx + 24.0, y + 7.0), (lx, y + 7.0)];
        fill_verdict(d, std::slice::from_ref(&swatch), false);
        for dash in dashes(&swatch, 8.0, 5.0) {
            d.stroke(&dash, 4.0, PAPER, false);
        }
        d.text(lx + 34.0, y + 3.0, TEXT_PX, "near threshold", INK, Anchor::Start);
        y += 26.0;
    }
    outline_key(d, &plan.outlines, lx, y + 16.0);
    footnote(d, &plan.caution);
    frame
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;
    use crate::render::{Pixmap, FIGURE_PX};
    use crate::rules::{check_rule, AnyRule, CheckRequest};
    use crate::time::DeltaT;
    use geo::Contains;

    #[test]
    fn each_tested_area_is_filled_by_its_verdict_and_labelled_with_its_margin() {
        let model = crate::demo::demo();
        // Stricter than any preset, so the demo has areas both ways (an invented test rule, shared with
        // the colour test and the reference images).
        let text = include_str!("../../tests/fixtures/strict_garden_rule.json");
        let AnyRule::Area(rule) = AnyRule::from_json(text).unwrap() else { panic!("an area rule") };
        let (year, cell_m, step_min, delta_t) = (2026, 1.0, 30, DeltaT::EspenakMeeus);
        let req = CheckRequest { model: &model, rule: &rule, year, cell_m, step_min, delta_t };
        let report = check_rule(&req, |_| true).unwrap();
        assert!(report.areas.iter().any(|a| a.passes) && report.areas.iter().any(|a| !a.passes), "the demo has both");
        let plan = VerdictPlan::of_report(&model, &report).unwrap();
        let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
        let frame = draw_verdict_plan(&mut px, &plan);
        let r = px.render().unwrap();
        for a in &report.areas {
            let v = plan.verdicts.iter().find(|v| v.label.starts_with(&format!("{}\n", a.id))).unwrap();
            let verdict = if a.passes { "passes" } else { "fails" };
            let margin = format!("{verdict} {:+.1}", 100.0 * a.share_margin).replace('-', "−");
            assert!(v.label.ends_with(&margin), "{} vs {margin}", v.label);
            // Pixels over the area: a good part of them its verdict's fill (the label, outlines and hatch
            // lines take the rest), none the other verdict's.
            // PASSES over white paper: 255 + (c − 255) × a / 255.
            let over = |c: u8| (255.0 + (f64::from(c) - 255.0) * f64::from(PASSES.a) / 255.0).round() as u8;
            let (pass_fill, fail_fill) =
                ([over(PASSES.r), over(PASSES.g), over(PASSES.b)], [FAILS.r, FAILS.g, FAILS.b]);
            let (want, other) = if a.passes { (pass_fill, fail_fill) } else { (fail_fill, pass_fill) };
            let close =
                |g: [u8; 3], w: [u8; 3]| g.iter().zip(w).all(|(g, w)| (i32::from(*g) - i32::from(w)).abs() <= 3);
            let b = geo::BoundingRect::bounding_rect(&v.polygon).unwrap();
            let (mut n, mut hits, mut wrong) = (0, 0, 0);
            for j in 0..40 {
                for i in 0..20 {
                    let (fx, fy) = ((f64::from(i) + 0.5) / 20.0, (f64::from(j) + 0.5) / 40.0);
                    let p = geo::Coord { x: b.min().x + fx * b.width(), y: b.min().y + fy * b.height() };
                    if v.polygon.contains(&geo::Point::from(p)) {
                        let (x, y) = frame.to_px(p);
                        let got = r.rgb(x as u32, y as u32);
                        n += 1;
                        hits += usize::from(close(got, want));
                        wrong += usize::from(close(got, other));
                    }
                }
            }
            assert!(
                n > 10 && hits * 5 >= n && wrong == 0,
                "{}: {hits} of {n} pixels its fill, {wrong} the other's",
                a.id
            );
        }
    }
}

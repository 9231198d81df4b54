//! The shadow plan's two shades must stay apart for every reader: CIE L* at least 25 apart on the
//! rendered figure with normal colour vision and with simulated protanopia, deuteranopia and
//! tritanopia (Machado, Oliveira & Fernandes 2009, severity 1, matrices and check values from the
//! colorspacious library: tests/fixtures/cvd_machado2009.csv and its generating script), and the
//! added shade hatched, so it also reads in greyscale print.

#![cfg(not(target_arch = "wasm32"))]

use geo::{BooleanOps, BoundingRect, Contains, Coord, MultiPolygon, Point};
use sunlot::render::{draw_shadow_plan, Pixmap, PlanExtras, Raster, ShadowPlan, FIGURE_PX};
use sunlot::shadow::shadow_study;
use sunlot::DeltaT;

const FIXTURE: &str = include_str!("fixtures/cvd_machado2009.csv");

fn to_linear(v: f64) -> f64 {
    // IEC 61966-2-1 (sRGB) transfer function.
    if v <= 0.04045 {
        v / 12.92
    } else {
        ((v + 0.055) / 1.055).powf(2.4)
    }
}

fn to_srgb(v: f64) -> f64 {
    let v = v.clamp(0.0, 1.0);
    if v <= 0.0031308 {
        12.92 * v
    } else {
        1.055 * v.powf(1.0 / 2.4) - 0.055
    }
}

/// CIE L* (D65) of a linear-sRGB colour, from its relative luminance Y (CIE 15:2004).
fn lstar(lin: [f64; 3]) -> f64 {
    let y = 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
    if y > (6.0f64 / 29.0).powi(3) {
        116.0 * y.cbrt() - 16.0
    } else {
        y * (29.0f64 / 3.0).powi(3)
    }
}

fn simulate(m: &[f64; 9], lin: [f64; 3]) -> [f64; 3] {
    let row = |r: usize| (m[3 * r] * lin[0] + m[3 * r + 1] * lin[1] + m[3 * r + 2] * lin[2]).clamp(0.0, 1.0);
    [row(0), row(1), row(2)]
}

struct Vision {
    name: String,
    matrix: [f64; 9],
}

fn visions() -> Vec<Vision> {
    let mut out = vec![Vision { name: "normal".into(), matrix: [1.0, 0.0, 0.0, 0.0, 1.0, 0.0, 0.0, 0.0, 1.0] }];
    for line in FIXTURE.lines().filter(|l| l.starts_with("matrix,")) {
        let f: Vec<&str> = line.split(',').collect();
        let mut m = [0.0; 9];
        for (k, v) in m.iter_mut().enumerate() {
            *v = f[2 + k].parse().unwrap();
        }
        out.push(Vision { name: f[1].into(), matrix: m });
    }
    out
}

#[test]
fn the_simulation_reproduces_the_reference_library() {
    let vs = visions();
    assert_eq!(vs.len(), 4);
    let mut checked = 0;
    for line in FIXTURE.lines().filter(|l| l.starts_with("check,")) {
        let f: Vec<&str> = line.split(',').collect();
        let v = vs.iter().find(|v| v.name == f[1]).unwrap();
        let num = |k: usize| f[k].parse::<f64>().unwrap();
        let lin = [to_linear(num(11) / 255.0), to_linear(num(12) / 255.0), to_linear(num(13) / 255.0)];
        let sim = simulate(&v.matrix, lin);
        for (k, want) in [(0, num(14)), (1, num(15)), (2, num(16))] {
            let got = to_srgb(sim[k]) * 255.0;
            assert!((got - want).abs() < 0.05, "{}: {:?} channel {k}: {got} vs {want}", v.name, &f[11..14]);
        }
        // colorspacious's L* uses its own D65 white (white is 99.998); within 0.05.
        assert!((lstar(sim) - num(17)).abs() < 0.05, "{} L*", v.name);
        checked += 1;
    }
    assert_eq!(checked, 18);
}

/// Mean linear colour of the figure's pixels lying well inside `region` (plan metres), the share of
/// them at least 10 L* darker than their median (hatch lines), and how many were sampled.
fn sample(
    r: &Raster,
    to_px: impl Fn(Coord<f64>) -> (f64, f64),
    scale: f64,
    region: &MultiPolygon<f64>,
) -> ([f64; 3], f64, usize) {
    let b = region.bounding_rect().unwrap();
    let clearance_m = 6.0 / scale;
    let (mut sum, mut ls, mut n) = ([0.0; 3], Vec::new(), 0);
    let step = 1.0 / scale;
    let mut y = b.min().y;
    while y <= b.max().y {
        let mut x = b.min().x;
        while x <= b.max().x {
            let near = [(clearance_m, 0.0), (-clearance_m, 0.0), (0.0, clearance_m), (0.0, -clearance_m), (0.0, 0.0)];
            if near.iter().all(|(dx, dy)| region.contains(&Point::new(x + dx, y + dy))) {
                let (u, v) = to_px(Coord { x, y });
                let [cr, cg, cb] = r.rgb(u as u32, v as u32);
                let lin = [
                    to_linear(f64::from(cr) / 255.0),
                    to_linear(f64::from(cg) / 255.0),
                    to_linear(f64::from(cb) / 255.0),
                ];
                for k in 0..3 {
                    sum[k] += lin[k];
                }
                ls.push(lstar(lin));
                n += 1;
            }
            x += step;
        }
        y += step;
    }
    ls.sort_by(f64::total_cmp);
    let median = ls.get(ls.len() / 2).copied().unwrap_or(0.0);
    let k = n.max(1) as f64;
    let dark = ls.iter().filter(|l| **l < median - 10.0).count() as f64 / k;
    ([sum[0] / k, sum[1] / k, sum[2] / k], dark, n)
}

#[test]
fn the_two_shades_differ_by_25_lstar_for_every_vision_and_the_added_shade_is_hatched() {
    let model = sunlot::demo::demo();
    let t = chrono::DateTime::parse_from_rfc3339("2026-03-21T15:00:00Z").unwrap().to_utc();
    let study = shadow_study(&model, t, DeltaT::EspenakMeeus).unwrap();
    let plan = ShadowPlan::of_study(&model, &study, "2026-03-21 15:00 GMT");
    let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
    let frame = draw_shadow_plan(&mut px, &plan, &PlanExtras::default());
    let raster = px.render().unwrap();
    // Shade on open ground only: off every outline's footprint (roofs are drawn over the shade).
    let roofs = plan
        .outlines
        .iter()
        .filter(|o| o.kind != sunlot::render::OutlineKind::Area)
        .fold(MultiPolygon::new(vec![]), |acc, o| acc.union(&MultiPolygon::new(vec![o.polygon.clone()])));
    let existing = plan.existing.difference(&roofs);
    let added = plan.added.difference(&roofs);
    let (e, e_dark, en) = sample(&raster, |c| frame.to_px(c), frame.scale, &existing);
    let (a, a_dark, an) = sample(&raster, |c| frame.to_px(c), frame.scale, &added);
    assert!(en > 500 && an > 500, "enough pixels sampled: {en} existing, {an} added");
    for v in visions() {
        let (le, la) = (lstar(simulate(&v.matrix, e)), lstar(simulate(&v.matrix, a)));
        assert!(le - la >= 25.0, "{}: existing shade L* {le:.1}, added shade L* {la:.1}", v.name);
    }
    // Hatched: lines 1.2 px wide every 7 px cover about a sixth of the added shade; the existing shade
    // is flat (but for the few outlines and labels crossing it).
    assert!(a_dark > 0.08 && e_dark < 0.04, "share of hatch-dark pixels: added {a_dark:.3}, existing {e_dark:.3}");
}

/// The rule check's plan: "passes" and "fails" fills at least 25 L* apart for every vision (sampled on
/// the rendered figure without its labels), and "fails" hatched.
#[test]
fn pass_and_fail_differ_by_25_lstar_for_every_vision_and_fail_is_hatched() {
    use sunlot::render::{draw_verdict_plan, VerdictPlan};
    use sunlot::rules::{check_rule, AnyRule, CheckRequest};
    let model = sunlot::demo::demo();
    // Stricter than any preset, so the demo has areas both ways (an invented test rule).
    let text = include_str!("fixtures/strict_garden_rule.json");
    let AnyRule::Area(rule) = AnyRule::from_json(text).unwrap() else { panic!("an area rule") };
    let req = CheckRequest {
        model: &model,
        rule: &rule,
        year: 2026,
        cell_m: 1.0,
        step_min: 30,
        delta_t: DeltaT::EspenakMeeus,
    };
    let report = check_rule(&req, |_| true).unwrap();
    let mut plan = VerdictPlan::of_report(&model, &report).unwrap();
    // The fills alone: labels fill most of the narrow gardens and are checked elsewhere.
    for v in &mut plan.verdicts {
        v.label.clear();
    }
    let mut px = Pixmap::new(FIGURE_PX.0, FIGURE_PX.1);
    let frame = draw_verdict_plan(&mut px, &plan);
    let raster = px.render().unwrap();
    let union = |passes: bool| {
        plan.verdicts
            .iter()
            .filter(|v| v.passes == passes)
            .fold(MultiPolygon::new(vec![]), |acc, v| acc.union(&MultiPolygon::new(vec![v.polygon.clone()])))
    };
    let (p, p_dark, pn) = sample(&raster, |c| frame.to_px(c), frame.scale, &union(true));
    let (f, f_dark, fn_) = sample(&raster, |c| frame.to_px(c), frame.scale, &union(false));
    assert!(pn > 300 && fn_ > 300, "enough pixels sampled: {pn} passing, {fn_} failing");
    for v in visions() {
        let (lp, lf) = (lstar(simulate(&v.matrix, p)), lstar(simulate(&v.matrix, f)));
        assert!(lp - lf >= 25.0, "{}: passes L* {lp:.1}, fails L* {lf:.1}", v.name);
    }
    assert!(f_dark > 0.08 && p_dark < 0.06, "share of hatch-dark pixels: fails {f_dark:.3}, passes {p_dark:.3}");
}

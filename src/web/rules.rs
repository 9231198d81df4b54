//! Rule checks for pages (wasm32 only): areas against an area rule, windows against a window rule,
//! and the presets with their sources. Errors name the member.

use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::defaults;
use super::outputs::RulePreset;
use super::{err, read, site, write};
use crate::daylight::DEFAULT_AZIMUTH_STEP_DEG;
use crate::render::{draw_verdict_plan, VerdictPlan, FIGURE_PX};
use crate::rules::{
    check_rule, check_windows, preset, AnyRule, CheckReport, CheckRequest, RuleError, WindowCheckRequest,
    DEFAULT_AREA_PRESET, PRESETS,
};
use crate::time::DeltaT;

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct CheckIn {
    site: String,
    /// A preset id (default: the BRE BR 209 amenity preset for `checkRule`) …
    preset: Option<String>,
    /// … or a rule as an object of the rule-file format.
    rule: Option<serde_json::Value>,
    year: i32,
    #[serde(default = "defaults::cell_m")]
    cell_m: f64,
    #[serde(default = "defaults::step_min")]
    step_min: u32,
    azimuth_step_deg: Option<f64>,
}

/// The rule of a request: its `rule` object, or its preset (`default` when neither is given).
fn rule_of(i: &CheckIn, default: Option<&str>) -> Result<AnyRule, JsError> {
    if !(-2000..=6000).contains(&i.year) {
        return Err(JsError::new(&format!("year: must be -2000 to 6000, got {}", i.year)));
    }
    match (&i.rule, i.preset.as_deref().or(default)) {
        (Some(r), _) => AnyRule::from_json(&r.to_string()).map_err(|e| match e {
            // A field path first (`min_ratio: invalid type …`) reads as `rule.min_ratio: …`.
            RuleError::Json(m) => {
                let head = m.split(':').next().unwrap_or_default();
                let is_path = !head.is_empty() && head.chars().all(|c| c.is_alphanumeric() || "_[].".contains(c));
                JsError::new(&if is_path { format!("rule.{m}") } else { format!("rule: {m}") })
            }
            other => err(other),
        }),
        (None, Some(p)) => preset(p).map_err(|e| JsError::new(&format!("preset: {e}"))),
        (None, None) => Err(JsError::new("preset, rule: give a window rule's preset id or the rule")),
    }
}

/// The area check a request asks for, with its site.
fn area_check(input: JsValue, call: &str) -> Result<(crate::site::SiteModel, CheckReport), JsError> {
    let i: CheckIn = read(input, call)?;
    let AnyRule::Area(rule) = rule_of(&i, Some(DEFAULT_AREA_PRESET))? else {
        return Err(JsError::new("preset, rule: a window rule; check it with checkWindows"));
    };
    let model = site(&i.site)?;
    let req = CheckRequest {
        model: &model,
        rule: &rule,
        year: i.year,
        cell_m: i.cell_m,
        step_min: i.step_min,
        delta_t: DeltaT::EspenakMeeus,
    };
    let report = check_rule(&req, |_| true).map_err(err)?;
    Ok((model, report))
}

fn report_js(report: &CheckReport) -> Result<JsValue, JsError> {
    write(report)
}

fn verdict_plan(model: &crate::site::SiteModel, report: &CheckReport) -> Result<VerdictPlan, JsError> {
    VerdictPlan::of_report(model, report).ok_or_else(|| JsError::new("site: has no areas or volumes to draw"))
}

/// A rule check on areas: the report (rule, date, each area's figures, pass/fail, margins, caution).
#[wasm_bindgen(js_name = checkRule, unchecked_return_type = "CheckReport")]
pub fn check_rule_js(#[wasm_bindgen(unchecked_param_type = "CheckInput")] input: JsValue) -> Result<JsValue, JsError> {
    report_js(&area_check(input, "checkRule")?.1)
}

/// A rule check on areas drawn onto `canvas` (sized [`FIGURE_PX`] first): each tested area filled by
/// its verdict and labelled with its margin; returns the report, as `checkRule` does.
#[wasm_bindgen(js_name = drawRuleCheck, unchecked_return_type = "CheckReport")]
pub fn draw_rule_check(
    canvas: &web_sys::HtmlCanvasElement,
    #[wasm_bindgen(unchecked_param_type = "CheckInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let (model, report) = area_check(input, "drawRuleCheck")?;
    let plan = verdict_plan(&model, &report)?;
    canvas.set_width(FIGURE_PX.0);
    canvas.set_height(FIGURE_PX.1);
    let mut surface = super::Canvas::new(canvas)?;
    draw_verdict_plan(&mut surface, &plan);
    report_js(&report)
}

/// The same figure as SVG text.
#[wasm_bindgen(js_name = ruleCheckSvg)]
pub fn rule_check_svg(#[wasm_bindgen(unchecked_param_type = "CheckInput")] input: JsValue) -> Result<String, JsError> {
    let (model, report) = area_check(input, "ruleCheckSvg")?;
    let plan = verdict_plan(&model, &report)?;
    let mut svg = super::canvas::svg_surface(FIGURE_PX.0, FIGURE_PX.1)?;
    draw_verdict_plan(&mut svg, &plan);
    Ok(svg.finish())
}

/// A rule check on the site's windows: the report (rule, each window's figures before and with the
/// proposal, pass/fail and why, the share passing, the cautions).
#[wasm_bindgen(js_name = checkWindows, unchecked_return_type = "WindowReport")]
pub fn check_windows_js(
    #[wasm_bindgen(unchecked_param_type = "CheckInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: CheckIn = read(input, "checkWindows")?;
    let AnyRule::Window(rule) = rule_of(&i, None)? else {
        return Err(JsError::new("preset, rule: an area rule; check it with checkRule"));
    };
    let model = site(&i.site)?;
    let req = WindowCheckRequest {
        model: &model,
        rule: &rule,
        year: i.year,
        step_min: i.step_min,
        azimuth_step_deg: i.azimuth_step_deg.unwrap_or(DEFAULT_AZIMUTH_STEP_DEG),
        delta_t: DeltaT::EspenakMeeus,
    };
    write(&check_windows(&req, |_| true).map_err(err)?)
}

/// The rule presets: `[{id, kind, summary, rule}]`, `kind` `"area"` or `"window"`, `rule` the full
/// rule in the rule-file format that `checkRule` and `checkWindows` take (its source, and `from_memory`
/// for a window rule whose numbers must be checked).
#[wasm_bindgen(js_name = rulePresets, unchecked_return_type = "RulePreset[]")]
pub fn rule_presets() -> Result<JsValue, JsError> {
    let out: Vec<RulePreset> = PRESETS
        .iter()
        .map(|p| {
            let rule = (p.rule)();
            let kind = if matches!(rule, AnyRule::Area(_)) { "area" } else { "window" };
            RulePreset { id: p.id, kind, summary: p.summary, rule }
        })
        .collect();
    write(&out)
}

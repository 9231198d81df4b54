//! Checking a site against a rule: each area's sun before and after the proposal.

use chrono::NaiveDate;
use geo::MultiPolygon;
use serde::Serialize;

use super::rule::{Combine, Rule, RuleError};
use crate::exposure::{before_after, map_stats, Grid, Period, SunHoursRequest, Window, DEFAULT_MAX_CELLS};
use crate::site::SiteModel;
use crate::time::DeltaT;

/// The caution shown with every pass or fail.
pub const CAUTION: &str = "Indicative results from a clear-sky model with the massing as drawn; local planning codes \
                           and a licensed professional's assessment govern.";

/// What to check.
#[derive(Debug, Clone)]
pub struct CheckRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The rule.
    pub rule: &'a Rule,
    /// The year of the rule's date.
    pub year: i32,
    /// Cell size, metres.
    pub cell_m: f64,
    /// Time step, minutes.
    pub step_min: u32,
    /// ΔT.
    pub delta_t: DeltaT,
}

/// One area's result.
#[derive(Debug, Clone, PartialEq, Serialize)]
/// Serialized with snake_case keys (the CLI's JSON) and, in the wasm build, camelCase keys (the
/// JavaScript facade's naming).
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct AreaCheck {
    /// Area id.
    pub id: String,
    /// Area name.
    pub name: String,
    /// Plan area of the area's polygon, m² (each cell weighted by its exact overlap with it).
    pub area_m2: f64,
    /// Share with at least the rule's hours before the proposal, 0–1.
    pub before_share: f64,
    /// Share after, 0–1.
    pub after_share: f64,
    /// Area with at least the rule's hours before, m².
    pub before_m2: f64,
    /// Area after, m².
    pub after_m2: f64,
    /// `after_m2 / before_m2`; `None` when nothing had the hours before.
    pub ratio: Option<f64>,
    /// Whether `after_share ≥ min_share`.
    pub share_test: bool,
    /// `after_share − min_share`, share points (positive passes).
    pub share_margin: f64,
    /// Whether `after_m2 ≥ min_ratio × before_m2`, when the rule has a ratio.
    pub ratio_test: Option<bool>,
    /// `ratio − min_ratio` (positive passes), when both exist.
    pub ratio_margin: Option<f64>,
    /// The verdict.
    pub passes: bool,
    /// Discretisation error estimate of the shares before and after, share points (0–1): the share
    /// of the area in cells cut by its edge or by the threshold's contour (see
    /// [`crate::exposure::MapStats::uncertain_share`]).
    pub share_error: f64,
    /// Whether the verdict could change within `share_error` (of the share or of the ratio): check
    /// again with smaller cells.
    pub near_threshold: bool,
    /// Mean hours of direct sun before and after.
    pub mean_before_h: f64,
    /// Mean hours after.
    pub mean_after_h: f64,
}

/// The check of every area the rule picks.
#[derive(Debug, Clone, PartialEq, Serialize)]
/// Serialized with snake_case keys (the CLI's JSON) and, in the wasm build, camelCase keys (the
/// JavaScript facade's naming).
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct CheckReport {
    /// The rule.
    pub rule: Rule,
    /// The date tested.
    pub date: NaiveDate,
    /// Cell size, metres.
    pub cell_m: f64,
    /// Time step, minutes.
    pub step_min: u32,
    /// Each area.
    pub areas: Vec<AreaCheck>,
    /// Whether every area passes.
    pub all_pass: bool,
    /// The caution.
    pub caution: &'static str,
}

/// Checks the site against the rule. `progress` gets the fraction done and may cancel.
///
/// # Examples
/// ```
/// use sunlot::rules::{check_rule, preset, AnyRule, CheckRequest};
/// use sunlot::DeltaT;
/// // The demo's gardens against BRE BR 209's amenity test (half of each area with 2 h of sun on
/// // 21 March, or 0.8 × its former sunlit area): every garden passes, 16's with 64 % of it sunlit.
/// let model = sunlot::demo::demo();
/// let AnyRule::Area(rule) = preset("bre-br209-amenity")? else { unreachable!("an area rule") };
/// let req = CheckRequest { model: &model, rule: &rule, year: 2026, cell_m: 1.0, step_min: 10, delta_t: DeltaT::EspenakMeeus };
/// let report = check_rule(&req, |_| true)?;
/// assert!(report.all_pass);
/// let g16 = report.areas.iter().find(|a| a.id == "garden-16").unwrap();
/// assert!((g16.after_share - 0.64).abs() < 0.05 && g16.share_margin > 0.0, "{}", g16.after_share);
/// # Ok::<(), sunlot::rules::RuleError>(())
/// ```
///
/// # Errors
/// [`RuleError`] for an unknown area, no areas, a bad date, grid or step (before any work), or a
/// cancelled run.
pub fn check_rule(req: &CheckRequest, mut progress: impl FnMut(f64) -> bool) -> Result<CheckReport, RuleError> {
    let rule = req.rule.clone().validated()?;
    let model = req.model;
    for id in &rule.area_ids {
        if !model.areas.iter().any(|a| &a.id == id) {
            return Err(RuleError::UnknownArea { rule: rule.id.clone(), area: id.clone() });
        }
    }
    let areas: Vec<_> =
        model.areas.iter().filter(|a| rule.area_kinds.contains(&a.kind) || rule.area_ids.contains(&a.id)).collect();
    if areas.is_empty() {
        let kinds = serde_json::to_string(&rule.area_kinds).unwrap_or_default();
        return Err(RuleError::NoAreas { rule: rule.id.clone(), kinds });
    }
    let date = NaiveDate::from_ymd_opt(req.year, rule.month, rule.day).ok_or_else(|| RuleError::Field {
        rule: rule.id.clone(),
        field: "day",
        reason: format!("{}-{:02}-{:02} is not a date", req.year, rule.month, rule.day),
    })?;
    let window = match rule.window_times()? {
        (Some(from), Some(to)) => Window::Clock { from, to },
        _ => Window::Daylight,
    };
    let period = Period { first: date, last: date, window, step_min: req.step_min };
    period.check(model, req.delta_t)?;
    let grids = areas
        .iter()
        .map(|a| Grid::covering(&MultiPolygon::new(vec![a.polygon.clone()]), req.cell_m, DEFAULT_MAX_CELLS))
        .collect::<Result<Vec<_>, _>>()?;
    // Twice: before and after.
    period.check_work(2 * grids.iter().map(Grid::inside_count).sum::<usize>())?;
    let mut out = Vec::new();
    let n = areas.len() as f64;
    for (k, (area, grid)) in areas.iter().zip(&grids).enumerate() {
        let sun = SunHoursRequest {
            model,
            grid,
            period,
            plane_m: 0.0,
            delta_t: req.delta_t,
            massing: crate::exposure::Massing::WithProposed,
        };
        let ba = before_after(&sun, |f| progress((k as f64 + f) / n))?;
        let cover = grid.cover_of(&area.polygon);
        let (Some(b), Some(a)) = (
            map_stats(grid, &ba.before.hours, Some(&cover), rule.min_hours),
            map_stats(grid, &ba.after.hours, Some(&cover), rule.min_hours),
        ) else {
            continue; // the area is smaller than a cell's centre spacing: nothing sampled
        };
        let ratio = (b.at_least_m2 > 0.0).then(|| a.at_least_m2 / b.at_least_m2);
        let share_test = a.at_least_share >= rule.min_share;
        let ratio_test = rule.min_ratio.map(|r| a.at_least_m2 >= r * b.at_least_m2 - 1e-9);
        let passes = match (ratio_test, rule.combine) {
            (None, _) => share_test,
            (Some(r), Combine::Either) => share_test || r,
            (Some(r), Combine::Both) => share_test && r,
        };
        let share_error = a.uncertain_share.max(b.uncertain_share);
        // The verdict at both ends of the shares' error ranges: near the threshold when they differ.
        let verdict_at = |e: f64| {
            let share = a.at_least_share + e * a.uncertain_share >= rule.min_share;
            let ratio = rule.min_ratio.map(|r| {
                let after = (a.at_least_share + e * a.uncertain_share).max(0.0);
                let before = (b.at_least_share - e * b.uncertain_share).max(0.0);
                after >= r * before - 1e-9
            });
            match (ratio, rule.combine) {
                (None, _) => share,
                (Some(r), Combine::Either) => share || r,
                (Some(r), Combine::Both) => share && r,
            }
        };
        let near_threshold = verdict_at(-1.0) != verdict_at(1.0);
        out.push(AreaCheck {
            id: area.id.clone(),
            name: area.name.clone(),
            area_m2: a.area_m2,
            before_share: b.at_least_share,
            after_share: a.at_least_share,
            before_m2: b.at_least_m2,
            after_m2: a.at_least_m2,
            ratio,
            share_test,
            share_margin: a.at_least_share - rule.min_share,
            ratio_test,
            ratio_margin: rule.min_ratio.zip(ratio).map(|(r, x)| x - r),
            passes,
            share_error,
            near_threshold,
            mean_before_h: b.mean,
            mean_after_h: a.mean,
        });
    }
    let all_pass = out.iter().all(|a| a.passes);
    Ok(CheckReport { rule, date, cell_m: req.cell_m, step_min: req.step_min, areas: out, all_pass, caution: CAUTION })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::rules::area_preset as preset;

    fn req<'a>(m: &'a SiteModel, r: &'a Rule) -> CheckRequest<'a> {
        CheckRequest { model: m, rule: r, year: 2026, cell_m: 1.0, step_min: 10, delta_t: DeltaT::EspenakMeeus }
    }

    #[test]
    fn the_demo_gardens_are_checked_against_the_bre_preset() {
        let m = crate::demo::demo();
        let rule = preset("bre-br209-amenity").unwrap();
        let r = check_rule(&req(&m, &rule), |_| true).unwrap();
        assert!(r.areas.len() >= 5, "{:?}", r.areas.iter().map(|a| &a.id).collect::<Vec<_>>());
        for a in &r.areas {
            assert!(a.after_share <= a.before_share + 1e-12, "{}: the proposal cannot add sun", a.id);
            let verdict = a.share_test || a.ratio_test.unwrap();
            assert_eq!(a.passes, verdict);
        }
    }

    #[test]
    fn a_rule_naming_an_unknown_area_is_refused_before_work() {
        let m = crate::demo::demo();
        let mut rule = preset("bre-br209-amenity").unwrap();
        rule.area_ids.push("garden-99".into());
        let e = check_rule(&req(&m, &rule), |_| panic!("no work may start")).unwrap_err();
        assert!(e.to_string().contains("garden-99"), "{e}");
        let bad = r#"{"id":"x","title":"t","month":2,"day":30,"min_hours":2,"min_share":0.5,"area_kinds":["garden"]}"#;
        assert!(Rule::from_json(bad).unwrap_err().to_string().contains("day"));
        let inverted = r#"{"id":"x","title":"t","month":6,"day":21,"from":"15:00","to":"09:00","min_hours":2,"min_share":0.5,"area_kinds":["garden"]}"#;
        assert!(Rule::from_json(inverted).unwrap_err().to_string().contains("inverted"));
        assert!(preset("nope").unwrap_err().to_string().contains("bre-br209-amenity"));
    }

    #[test]
    fn an_area_share_is_the_same_from_the_check_and_from_a_map_over_all_areas() {
        // `sunlot check` grids each area alone, `sunlot hours --area` lays one grid over all the picked
        // areas: on the lattice anchored at the plan origin both sample the same points and weigh
        // them by the same exact cover, so they agree; the area is the polygon's.
        use crate::exposure::{sun_hours, Massing};
        use geo::Area;
        let m = crate::demo::demo();
        let rule = preset("bre-br209-amenity").unwrap();
        let r = check_rule(&req(&m, &rule), |_| true).unwrap();
        let gardens: Vec<_> = m.areas.iter().filter(|a| r.areas.iter().any(|c| c.id == a.id)).collect();
        let all = MultiPolygon::new(gardens.iter().map(|a| a.polygon.clone()).collect());
        let grid = Grid::covering(&all, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let date = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
        let sun = SunHoursRequest {
            model: &m,
            grid: &grid,
            period: Period::day(date, 10),
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: Massing::WithProposed,
        };
        let map = sun_hours(&sun, |_| true).unwrap();
        for (area, c) in gardens.iter().zip(&r.areas) {
            let s = map_stats(&grid, &map.hours, Some(&grid.cover_of(&area.polygon)), 2.0).unwrap();
            assert!(
                (s.at_least_share - c.after_share).abs() < 1e-9,
                "{}: {} vs {}",
                c.id,
                s.at_least_share,
                c.after_share
            );
            assert!((c.area_m2 - area.polygon.unsigned_area()).abs() < 1e-6, "{}: {}", c.id, c.area_m2);
        }
    }

    #[test]
    fn an_area_share_converges_within_its_error_estimate_as_cells_shrink() {
        let m = crate::demo::demo();
        let rule = preset("bre-br209-amenity").unwrap();
        let at = |cell_m: f64| {
            let r = check_rule(&CheckRequest { cell_m, ..req(&m, &rule) }, |_| true).unwrap();
            r.areas.into_iter().map(|a| (a.after_share, a.share_error)).collect::<Vec<_>>()
        };
        let fine = at(0.125);
        for cell_m in [1.0, 0.5] {
            for (k, ((share, err), (best, best_err))) in at(cell_m).into_iter().zip(&fine).enumerate() {
                assert!(
                    (share - best).abs() <= err + best_err,
                    "area {k} at {cell_m} m: {share} ± {err} vs {best} ± {best_err}"
                );
            }
        }
    }

    #[test]
    fn rules_round_trip_through_json() {
        let rule = preset("bre-br209-amenity").unwrap();
        assert_eq!(Rule::from_json(&rule.to_json()).unwrap(), rule);
    }
}

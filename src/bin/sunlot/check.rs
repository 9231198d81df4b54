//! `sunlot check`: a site against a sunlight rule (a preset or a rule file), area by area.

use std::path::PathBuf;

use clap::Args;
use sunlot::rules::{
    check_rule, check_windows, preset, AnyRule, CheckReport, CheckRequest, WindowCheckRequest, WindowReport, PRESETS,
};

use crate::args::DeltaTArgs;
use crate::figure::write_figure;
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;
use sunlot::render::FIGURE_PX;

#[derive(Debug, Args)]
#[command(after_help = sunlot::rules::presets_help())]
pub struct CheckArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// Rule presets, comma-separated (listed below); each is checked in turn.
    #[arg(long, value_delimiter = ',', default_value = sunlot::rules::DEFAULT_AREA_PRESET, conflicts_with = "rule_file")]
    pub rule: Vec<String>,
    /// List the presets with their sources and stop.
    #[arg(long)]
    pub list: bool,
    /// A rule of your own, as JSON (see README: "Rules").
    #[arg(long, value_name = "FILE")]
    pub rule_file: Option<PathBuf>,
    /// Year of the rule's date (default: this year).
    #[arg(long)]
    pub year: Option<i32>,
    /// Cell size, metres.
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_CELL_M)]
    pub cell_m: f64,
    /// Time step, minutes.
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_STEP_MIN)]
    pub step_min: u32,
    /// Azimuth step of the vertical sky component's integration, degrees (window sky rules).
    #[arg(long, default_value_t = sunlot::daylight::DEFAULT_AZIMUTH_STEP_DEG)]
    pub azimuth_step_deg: f64,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
    /// Output: a readable report (table), the full report as JSON, or the area rows as CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
    /// Also draw the plan with each tested area filled by its verdict and labelled with its margin, as
    /// PNG here (with several area rules, one file each, the rule's id added to the name).
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// The same plan as SVG here.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
}

/// `path` with `-rule` added before its extension when several area rules share one file name.
fn per_rule(path: Option<&PathBuf>, rule: &str, several: bool) -> Option<PathBuf> {
    let path = path?;
    if !several {
        return Some(path.clone());
    }
    let stem = path.file_stem().map(|s| s.to_string_lossy().to_string()).unwrap_or_default();
    let ext = path.extension().map(|e| format!(".{}", e.to_string_lossy())).unwrap_or_default();
    Some(path.with_file_name(format!("{stem}-{rule}{ext}")))
}

fn pct(x: f64) -> Cell {
    Cell::num(100.0 * x, 1)
}

/// The report as a table with its rule, date and caution.
pub fn report_table(r: &CheckReport) -> Table {
    let h = r.rule.min_hours;
    let mut t = Table::new(
        format!("Rule {} on {}: {}", r.rule.id, r.date, r.rule.title),
        vec![
            "area",
            "name",
            &format!("before_{h}h_pct"),
            &format!("after_{h}h_pct"),
            "after_over_before",
            "share_test",
            "share_margin_pct",
            "share_error_pct",
            "ratio_test",
            "ratio_margin",
            "verdict",
        ],
    );
    for a in &r.areas {
        t.rows.push(vec![
            Cell::text(&a.id),
            Cell::text(&a.name),
            pct(a.before_share),
            pct(a.after_share),
            a.ratio.map_or(Cell::Empty, |x| Cell::num(x, 2)),
            Cell::text(if a.share_test { "passes" } else { "fails" }),
            pct(a.share_margin),
            pct(a.share_error),
            a.ratio_test.map_or(Cell::Empty, |p| Cell::text(if p { "passes" } else { "fails" })),
            a.ratio_margin.map_or(Cell::Empty, |x| Cell::num(x, 2)),
            Cell::text(match (a.passes, a.near_threshold) {
                (true, false) => "passes",
                (false, false) => "fails",
                (true, true) => "passes (near threshold)",
                (false, true) => "fails (near threshold)",
            }),
        ]);
    }
    if !r.rule.source.is_empty() {
        t.notes.push(format!("Source: {}.", r.rule.source));
    }
    let window = match (&r.rule.from, &r.rule.to) {
        (Some(f), Some(to)) => format!("{f}–{to} local time"),
        _ => "sunrise to sunset".into(),
    };
    let share = 100.0 * r.rule.min_share;
    let mut test = format!("An area passes when at least {share}% of it gets at least {h} h of direct sun ({window})");
    if let Some(ratio) = r.rule.min_ratio {
        let join = match r.rule.combine {
            sunlot::rules::Combine::Either => "or",
            sunlot::rules::Combine::Both => "and",
        };
        test += &format!(", {join} the area so sunlit after the proposal is at least {ratio} × its area before");
    }
    t.notes.push(test + ".");
    t.notes.push(format!(
        "{} of {} areas pass. {} m cells, {}-minute steps; before = existing massing, after = with the proposal.",
        r.areas.iter().filter(|a| a.passes).count(),
        r.areas.len(),
        r.cell_m,
        r.step_min
    ));
    t.notes.push(
        "Areas are the polygons' areas: each cell counts by its exact overlap with the area. share_error_pct is \
         the share of the area in cells cut by its edge or by the edge of the sunlit part, a bound on the \
         discretisation error while the cells resolve the shadows."
            .into(),
    );
    if r.areas.iter().any(|a| a.near_threshold) {
        t.notes.push(format!(
            "A verdict marked near threshold could change within that error: check again with smaller cells \
             (--cell-m {}).",
            r.cell_m / 2.0
        ));
    }
    t.notes.push(r.caution.into());
    t
}

/// A window report as a table with its rule, cautions and source.
pub fn window_table(r: &WindowReport) -> Table {
    let names: Vec<&str> =
        r.windows.iter().flat_map(|w| w.figures.iter().map(|f| f.name)).fold(Vec::new(), |mut v, n| {
            if !v.contains(&n) {
                v.push(n);
            }
            v
        });
    let mut columns = vec!["window".to_string(), "name".into(), "facing_deg".into()];
    for n in &names {
        columns.push(format!("before_{n}"));
        columns.push(format!("after_{n}"));
    }
    columns.extend(["verdict".to_string(), "why".into()]);
    let mut t = Table::new(
        format!("Rule {} ({}): {}", r.rule.id, r.year, r.rule.title),
        columns.iter().map(String::as_str).collect(),
    );
    for w in &r.windows {
        let mut row = vec![Cell::text(&w.id), Cell::text(&w.name), Cell::num(w.facing_deg, 0)];
        for n in &names {
            let f = w.figures.iter().find(|f| f.name == *n);
            let (scale, digits) =
                if n.ends_with("_share") { (100.0, 1) } else { (1.0, if n.ends_with("_h") { 2 } else { 1 }) };
            row.push(f.and_then(|f| f.before).map_or(Cell::Empty, |x| Cell::num(scale * x, digits)));
            row.push(f.map_or(Cell::Empty, |f| Cell::num(scale * f.after, digits)));
        }
        row.push(Cell::text(match w.passes {
            Some(true) => "passes",
            Some(false) => "fails",
            None => "not tested",
        }));
        row.push(Cell::text(&w.reason));
        t.rows.push(row);
    }
    if !r.rule.source.is_empty() {
        t.notes.push(format!("Source: {}.", r.rule.source));
    }
    if names.iter().any(|n| n.ends_with("_share")) {
        t.notes.push("Shares are percent of the year's sun-up hours at the site.".into());
    }
    let tested = r.windows.iter().filter(|w| w.passes.is_some()).count();
    let passing = r.windows.iter().filter(|w| w.passes == Some(true)).count();
    t.notes.push(format!(
        "{passing} of {tested} windows tested pass; the rule {}. Before = existing massing, after = with the proposal; \
         {}-minute steps.",
        if r.passes { "passes" } else { "fails" },
        r.step_min
    ));
    t.notes.extend(r.cautions.iter().cloned());
    t
}

/// The presets as a table.
fn preset_table() -> Table {
    let mut t = Table::new("Rule presets", vec!["id", "test", "summary", "source", "numbers"]);
    for p in PRESETS {
        let rule = (p.rule)();
        let (test, source, memory) = match &rule {
            AnyRule::Area(r) => ("area_sun", r.source.clone(), false),
            AnyRule::Window(w) => (
                match w.test {
                    sunlot::rules::WindowTest::WindowSky(_) => "window_sky",
                    sunlot::rules::WindowTest::WindowSunDay(_) => "window_sun_day",
                    sunlot::rules::WindowTest::WindowSunYear(_) => "window_sun_year",
                },
                w.source.clone(),
                w.from_memory,
            ),
        };
        t.rows.push(vec![
            Cell::text(p.id),
            Cell::text(test),
            Cell::text(p.summary),
            Cell::text(&source),
            Cell::text(if memory { "from memory: check the document" } else { "from the project's references" }),
        ]);
    }
    t.notes.push("A rule file of your own: see README, \"Rules\". Results are indicative; local planning codes and a licensed professional's assessment govern.".into());
    t
}

pub fn run(a: &CheckArgs) -> Result<String, String> {
    if a.list {
        return Ok(preset_table().render(a.format));
    }
    let rules = match &a.rule_file {
        Some(path) => {
            let text = std::fs::read_to_string(path).map_err(|e| format!("{}: {e}", path.display()))?;
            vec![AnyRule::from_json(&text).map_err(|e| format!("{}: {e}", path.display()))?]
        }
        None => {
            a.rule.iter().map(|id| preset(id.trim()).map_err(|e| format!("--rule: {e}"))).collect::<Result<_, _>>()?
        }
    };
    let model = a.site.load()?.model;
    let year = a.year.unwrap_or_else(|| chrono::Datelike::year(&chrono::Utc::now()));
    let delta_t = a.delta_t.delta_t()?;
    let (mut text, mut json) = (Vec::new(), Vec::new());
    let several = rules.iter().filter(|r| matches!(r, AnyRule::Area(_))).count() > 1;
    for rule in &rules {
        let mut bar = Bar::new(&format!("rule {}", rule.id()), a.quiet);
        let (value, table) = match rule {
            AnyRule::Area(rule) => {
                let req = CheckRequest { model: &model, rule, year, cell_m: a.cell_m, step_min: a.step_min, delta_t };
                let report = check_rule(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
                let (png, svg) =
                    (per_rule(a.png.as_ref(), &rule.id, several), per_rule(a.svg.as_ref(), &rule.id, several));
                let mut table = report_table(&report);
                if let Some(plan) = sunlot::render::VerdictPlan::of_report(&model, &report) {
                    table.notes.extend(write_figure(
                        FIGURE_PX,
                        png.as_deref(),
                        svg.as_deref(),
                        "The plan of verdicts",
                        |d| {
                            sunlot::render::draw_verdict_plan(d, &plan);
                            Ok(())
                        },
                    )?);
                }
                (serde_json::to_value(&report), table)
            }
            AnyRule::Window(rule) => {
                let req = WindowCheckRequest {
                    model: &model,
                    rule,
                    year,
                    step_min: a.step_min,
                    azimuth_step_deg: a.azimuth_step_deg,
                    delta_t,
                };
                let report = check_windows(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
                (serde_json::to_value(&report), window_table(&report))
            }
        };
        drop(bar);
        json.push(value.map_err(|e| e.to_string())?);
        text.push(table.render(a.format));
    }
    Ok(match a.format {
        Format::Json if json.len() == 1 => serde_json::to_string_pretty(&json[0]).unwrap_or_default() + "\n",
        Format::Json => serde_json::to_string_pretty(&json).unwrap_or_default() + "\n",
        _ => text.join("\n"),
    })
}

//! `sunlot check`: a site against a sunlight rule (a preset or a rule file), area by area.

use std::path::PathBuf;

use clap::Args;
use sunlot::rules::{check_rule, preset, CheckReport, CheckRequest, Rule};

use crate::args::DeltaTArgs;
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

/// The presets, for `--help`.
pub const PRESET_HELP: &str =
    "Presets:\n  bre-br209-amenity  at least half of each garden or amenity area with at least 2 h of \
direct sun on 21 March, or at least 0.8 times the area so sunlit before (BRE BR 209, Site layout planning for daylight \
and sunlight, 3rd ed. 2022; same numbers in the 2nd ed. 2011)";

#[derive(Debug, Args)]
#[command(after_help = PRESET_HELP)]
pub struct CheckArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// A rule preset (listed below).
    #[arg(long, default_value = "bre-br209-amenity", conflicts_with = "rule_file")]
    pub rule: String,
    /// A rule of your own, as JSON (see README: "Rules").
    #[arg(long, value_name = "FILE")]
    pub rule_file: Option<PathBuf>,
    /// Year of the rule's date (default: this year).
    #[arg(long)]
    pub year: Option<i32>,
    /// Cell size, metres.
    #[arg(long, default_value_t = 0.5)]
    pub cell_m: f64,
    /// Time step, minutes.
    #[arg(long, default_value_t = 5)]
    pub step_min: u32,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
    /// Output: a readable report (table), the full report as JSON, or the area rows as CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
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
            Cell::text(if a.share_test { "pass" } else { "fail" }),
            pct(a.share_margin),
            pct(a.share_error),
            a.ratio_test.map_or(Cell::Empty, |p| Cell::text(if p { "pass" } else { "fail" })),
            a.ratio_margin.map_or(Cell::Empty, |x| Cell::num(x, 2)),
            Cell::text(match (a.passes, a.near_threshold) {
                (true, false) => "PASS",
                (false, false) => "FAIL",
                (true, true) => "PASS (near threshold)",
                (false, true) => "FAIL (near threshold)",
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

pub fn run(a: &CheckArgs) -> Result<String, String> {
    let rule = match &a.rule_file {
        Some(path) => {
            let text = std::fs::read_to_string(path).map_err(|e| format!("{}: {e}", path.display()))?;
            Rule::from_json(&text).map_err(|e| format!("{}: {e}", path.display()))?
        }
        None => preset(&a.rule).map_err(|e| format!("--rule: {e}"))?,
    };
    let model = a.site.load()?.model;
    let year = a.year.unwrap_or_else(|| chrono::Datelike::year(&chrono::Utc::now()));
    let req = CheckRequest {
        model: &model,
        rule: &rule,
        year,
        cell_m: a.cell_m,
        step_min: a.step_min,
        delta_t: a.delta_t.delta_t()?,
    };
    let mut bar = Bar::new("rule check", a.quiet);
    let report = check_rule(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    Ok(match a.format {
        Format::Json => serde_json::to_string_pretty(&report).unwrap_or_default() + "\n",
        f => report_table(&report).render(f),
    })
}

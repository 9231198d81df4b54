//! `sunlot hours`: hours of direct sun per cell over a site's areas.

use clap::Args;
use sunlot::exposure::{map_stats, sun_hours, CellValues, Grid, SunHoursRequest};
use sunlot::rules::CAUTION;
use sunlot::site::SiteModel;

use crate::args::DeltaTArgs;
use crate::maps::{self, GridArgs, Layer, MapFiles, PeriodArgs, Picture};
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct HoursArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub period: PeriodArgs,
    #[command(flatten)]
    pub grid: GridArgs,
    /// Map the existing massing alone (before the proposal) instead of existing and proposed.
    #[arg(long)]
    pub existing_only: bool,
    /// The hours of sun a cell must get a day (on average over a range of dates) to count in the
    /// "share with at least" columns.
    #[arg(long, default_value_t = 2.0)]
    pub min_hours: f64,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    #[command(flatten)]
    pub files: MapFiles,
    /// Output on standard output: the per-area summary as a table, JSON or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

/// The largest threshold accepted, hours: ten leap years of round-the-clock sun, a bound no real
/// period reaches (a sanity cap on typing errors, not a rule of the trade).
const MAX_MIN_HOURS: f64 = 24.0 * 366.0 * 10.0;

/// Checks a threshold in hours.
pub fn check_min_hours(h: f64) -> Result<(), String> {
    if h.is_finite() && (0.0..=MAX_MIN_HOURS).contains(&h) {
        Ok(())
    } else {
        Err(format!("--min-hours must be 0 or more, got {h}"))
    }
}

/// The columns' "per day" mark over a range of dates.
pub fn per_day(days: usize) -> &'static str {
    if days > 1 {
        "_per_day"
    } else {
        ""
    }
}

/// One row per area of the figures of `values` on `grid`.
pub fn area_rows(
    model: &SiteModel,
    grid: &Grid,
    values: &CellValues,
    ids: &[String],
    threshold: f64,
) -> Vec<Vec<Cell>> {
    let mut rows = Vec::new();
    for area in maps::pick_areas(model, ids, "--area").unwrap_or_default() {
        let Some(s) = map_stats(grid, values, Some(&grid.cover_of(&area.polygon)), threshold) else { continue };
        rows.push(vec![
            Cell::text(&area.id),
            Cell::text(&area.name),
            Cell::num(s.area_m2, 1),
            Cell::num(s.min, 2),
            Cell::num(s.mean, 2),
            Cell::num(s.max, 2),
            Cell::num(s.at_least_m2, 1),
            Cell::num(100.0 * s.at_least_share, 1),
        ]);
    }
    rows
}

pub fn run(a: &HoursArgs) -> Result<String, String> {
    check_min_hours(a.min_hours)?;
    let loaded = a.site.load()?;
    let model = &loaded.model;
    let grid = a.grid.grid(model)?;
    let massing = maps::massing(a.existing_only);
    let req = SunHoursRequest {
        model,
        grid: &grid,
        period: a.period.period()?,
        plane_m: a.grid.plane_m,
        delta_t: a.delta_t.delta_t()?,
        massing,
    };
    let mut bar = Bar::new("sun hours", a.files.quiet);
    let map = sun_hours(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    let which = if a.existing_only { "existing massing" } else { "existing and proposed massing" };
    let (h, days) = (a.min_hours, req.period.days());
    let per = per_day(days);
    let mut t = Table::new(
        format!("Hours of direct sun, {} ({which})", a.period.describe()),
        vec![
            "area",
            "name",
            "area_m2",
            "min_h",
            "mean_h",
            "max_h",
            &format!("at_least_{h}h{per}_m2"),
            &format!("at_least_{h}h{per}_pct"),
        ],
    );
    t.rows = area_rows(model, &grid, &map.hours, &a.grid.area, h * days as f64);
    if days > 1 {
        t.notes.push(format!(
            "Over {days} days: a cell counts in the at_least columns with at least {h} h a day on average ({} h in all).",
            h * days as f64
        ));
    }
    t.notes.push(format!(
        "An open site gets {:.2} h. {} m cells sampled at their centres, each weighted by its exact overlap with the area; plane {} m above the ground; a step counts when its midpoint is between sunrise and sunset.",
        map.open_hours, a.grid.cell_m, a.grid.plane_m
    ));
    let picture = Picture {
        layer: 0,
        unit: "hours of direct sun",
        range: (0.0, map.open_hours.max(0.1)),
        title: sunlot::render::titled("Hours of direct sun", &model.name),
        subtitle: format!("{} · {which}", a.period.describe()),
    };
    t.notes.extend(maps::write_files(
        &a.files,
        &loaded,
        &grid,
        &[Layer { name: "sun_hours", values: &map.hours }],
        &picture,
    )?);
    t.notes.push(CAUTION.into());
    Ok(t.render(a.format))
}

//! `sunlot compare`: hours of direct sun before (existing massing) and after (with the proposal),
//! area by area, with maps of the hours lost and the after / before ratio.

use clap::{Args, ValueEnum};
use sunlot::exposure::{before_after, map_stats, CellValues, Massing, SunHoursRequest};
use sunlot::rules::CAUTION;

use crate::args::DeltaTArgs;
use crate::hours::check_min_hours;
use crate::maps::{self, GridArgs, Layer, MapFiles, PeriodArgs, Picture};
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

/// Which map the picture shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Show {
    /// Hours lost (before − after).
    Lost,
    /// After / before.
    Ratio,
    /// Hours before.
    Before,
    /// Hours after.
    After,
}

#[derive(Debug, Args)]
pub struct CompareArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub period: PeriodArgs,
    #[command(flatten)]
    pub grid: GridArgs,
    /// The hours of sun a cell must get a day (on average over a range of dates) to count as sunlit
    /// enough.
    #[arg(long, default_value_t = 2.0)]
    pub min_hours: f64,
    /// Include the lots in the maps and the table when no --area is given (by default they are left
    /// out: a new building's own lot loses most, which says nothing about the neighbours).
    #[arg(long)]
    pub with_lot: bool,
    /// The map drawn in --png / --svg.
    #[arg(long, value_enum, default_value_t = Show::Lost)]
    pub show: Show,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    #[command(flatten)]
    pub files: MapFiles,
    /// Output on standard output: the per-area report as a table, JSON or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &CompareArgs) -> Result<String, String> {
    check_min_hours(a.min_hours)?;
    let loaded = a.site.load()?;
    let model = &loaded.model;
    // Without --area: the neighbours' areas, the lots only with --with-lot.
    let ids: Vec<String> = if a.grid.area.is_empty() && !a.with_lot {
        model.areas_beside_lots().iter().map(|x| x.id.clone()).collect()
    } else {
        a.grid.area.clone()
    };
    let grid = GridArgs { area: ids.clone(), ..a.grid.clone() }.grid(model)?;
    let req = SunHoursRequest {
        model,
        grid: &grid,
        period: a.period.period()?,
        plane_m: a.grid.plane_m,
        delta_t: a.delta_t.delta_t()?,
        massing: Massing::WithProposed,
    };
    let mut bar = Bar::new("before and after", a.files.quiet);
    let ba = before_after(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    let (h, days) = (a.min_hours, req.period.days());
    let per = crate::hours::per_day(days);
    let mut t = Table::new(
        format!("Sun before and after the proposal, {}", a.period.describe()),
        vec![
            "area",
            "name",
            "area_m2",
            &format!("before_{h}h{per}_m2"),
            &format!("after_{h}h{per}_m2"),
            &format!("before_{h}h{per}_pct"),
            &format!("after_{h}h{per}_pct"),
            "after_over_before",
            "mean_before_h",
            "mean_after_h",
            "mean_lost_h",
            "max_lost_h",
        ],
    );
    for area in maps::pick_areas(model, &ids, "--area")? {
        let cover = grid.cover_of(&area.polygon);
        let stats = |v: &CellValues, th| map_stats(&grid, v, Some(&cover), th);
        let (Some(b), Some(af), Some(lost)) =
            (stats(&ba.before.hours, h * days as f64), stats(&ba.after.hours, h * days as f64), stats(&ba.lost_h, 0.0))
        else {
            continue;
        };
        t.rows.push(vec![
            Cell::text(&area.id),
            Cell::text(&area.name),
            Cell::num(b.area_m2, 1),
            Cell::num(b.at_least_m2, 1),
            Cell::num(af.at_least_m2, 1),
            Cell::num(100.0 * b.at_least_share, 1),
            Cell::num(100.0 * af.at_least_share, 1),
            if b.at_least_m2 > 0.0 { Cell::num(af.at_least_m2 / b.at_least_m2, 2) } else { Cell::Empty },
            Cell::num(b.mean, 2),
            Cell::num(af.mean, 2),
            Cell::num(lost.mean, 2),
            Cell::num(lost.max, 2),
        ]);
    }
    t.notes.push(format!(
        "Before = existing massing, after = existing and proposed; {} m cells at their centres, each weighted by its \
         exact overlap with the area; an open site gets {:.2} h.",
        a.grid.cell_m, ba.before.open_hours
    ));
    if a.grid.area.is_empty() && !a.with_lot && model.areas.iter().any(|x| x.kind == sunlot::site::AreaKind::Lot) {
        t.notes.push("The lots are left out (their own building shades them most); --with-lot maps them too.".into());
    }
    let layers = [
        Layer { name: "before_h", values: &ba.before.hours },
        Layer { name: "after_h", values: &ba.after.hours },
        Layer { name: "lost_h", values: &ba.lost_h },
        Layer { name: "after_over_before", values: &ba.ratio },
    ];
    let open = ba.before.open_hours.max(0.1);
    let (layer, unit, range, what) = match a.show {
        Show::Lost => {
            (2, "hours lost", (0.0, maps::top_of(&ba.lost_h, 0.5)), "Hours of direct sun lost to the proposal")
        }
        Show::Ratio => (3, "after / before", (0.0, 1.0), "Sun after the proposal as a share of before"),
        Show::Before => (0, "hours of direct sun", (0.0, open), "Hours of direct sun before the proposal"),
        Show::After => (1, "hours of direct sun", (0.0, open), "Hours of direct sun with the proposal"),
    };
    let picture =
        Picture { layer, unit, range, title: sunlot::render::titled(what, &model.name), subtitle: a.period.describe() };
    t.notes.extend(maps::write_files(&a.files, &loaded, &grid, &layers, &picture)?);
    t.notes.push(CAUTION.into());
    Ok(t.render(a.format))
}

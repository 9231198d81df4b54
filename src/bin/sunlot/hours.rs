//! `sunlot hours`: hours of direct sun per cell over an area of a site.

use chrono::NaiveTime;
use clap::Args;
use geo::MultiPolygon;
use sunlot::exposure::{sun_hours, Grid, Massing, SunHours, SunHoursRequest, Window, DEFAULT_MAX_CELLS};
use sunlot::site::SiteModel;

use crate::args::{self, DeltaTArgs};
use crate::output::{Cell, Format, Table};
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct HoursArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// Id of the area to map (default: every area of the site, one grid over all of them).
    #[arg(long)]
    pub area: Option<String>,
    /// First local date, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// Last local date, YYYY-MM-DD (default: the first).
    #[arg(long)]
    pub to: Option<String>,
    /// Daily window in local clock time, HH:MM-HH:MM (default: sunrise to sunset).
    #[arg(long)]
    pub window: Option<String>,
    /// Time step, minutes (1 to 60).
    #[arg(long, default_value_t = 5)]
    pub step_min: u32,
    /// Cell size, metres (at least 0.01).
    #[arg(long, default_value_t = 0.5)]
    pub cell_m: f64,
    /// Height of the receiving plane above the ground, metres (a terrace, a first-floor sill).
    #[arg(long, default_value_t = 0.0)]
    pub plane_m: f64,
    /// Compare each area's sun before (existing massing) and after (with the proposal), area by area.
    #[arg(long)]
    pub before_after: bool,
    /// With --before-after: the hours of sun a cell must get to count as sunlit enough.
    #[arg(long, default_value_t = 2.0)]
    pub min_hours: f64,
    /// Most cells allowed.
    #[arg(long, default_value_t = DEFAULT_MAX_CELLS)]
    pub max_cells: usize,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: a summary table, JSON of the summary, or CSV of every cell (x_m,y_m,sun_hours).
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

fn window(text: &str) -> Result<Window, String> {
    let bad = || format!("--window: {text:?} is not HH:MM-HH:MM");
    let (a, b) = text.split_once('-').ok_or_else(bad)?;
    let t = |s: &str| NaiveTime::parse_from_str(s.trim(), "%H:%M").map_err(|_| bad());
    Ok(Window::Clock { from: t(a)?, to: t(b)? })
}

pub fn run(a: &HoursArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    if a.before_after {
        return before_after(a, &model);
    }
    let polys: Vec<_> = match &a.area {
        Some(id) => vec![model
            .areas
            .iter()
            .find(|x| &x.id == id)
            .ok_or_else(|| format!("--area: the site has no area {id:?}"))?
            .polygon
            .clone()],
        None => model.areas.iter().map(|x| x.polygon.clone()).collect(),
    };
    if polys.is_empty() {
        return Err("the site has no areas to map; add one or give --area".into());
    }
    let grid = Grid::over(&MultiPolygon::new(polys), a.cell_m, a.max_cells).map_err(|e| format!("--cell-m: {e}"))?;
    let map = map_of(a, &model, &grid, Massing::WithProposed)?;
    let first = args::date(&a.date, "--date")?;
    let last = a.to.as_deref().map_or(Ok(first), |t| args::date(t, "--to"))?;
    if a.format == Format::Csv {
        let mut t = Table::new("", vec!["x_m", "y_m", "sun_hours"]);
        for row in 0..grid.rows {
            for col in 0..grid.cols {
                if let Some(h) = map.hours[row * grid.cols + col] {
                    let c = grid.centre(col, row);
                    t.rows.push(vec![Cell::num(c.x, 3), Cell::num(c.y, 3), Cell::num(h, 4)]);
                }
            }
        }
        return Ok(t.render(Format::Csv));
    }
    let values: Vec<f64> = map.hours.iter().flatten().copied().collect();
    let n = values.len().max(1) as f64;
    let share = |hmin: f64| 100.0 * values.iter().filter(|&&h| h >= hmin).count() as f64 / n;
    let mut t = Table::new(
        format!("Hours of direct sun, {} to {} ({})", first, last, a.area.as_deref().unwrap_or("all areas")),
        vec!["cells", "cell_m", "open_site_h", "min_h", "mean_h", "max_h", "share_2h_pct", "share_4h_pct"],
    );
    t.rows.push(vec![
        Cell::Int(values.len() as i64),
        Cell::num(a.cell_m, 2),
        Cell::num(map.open_hours, 2),
        Cell::num(values.iter().copied().fold(f64::INFINITY, f64::min), 2),
        Cell::num(values.iter().sum::<f64>() / n, 2),
        Cell::num(values.iter().copied().fold(0.0, f64::max), 2),
        Cell::num(share(2.0), 1),
        Cell::num(share(4.0), 1),
    ]);
    t.single = true;
    t.notes.push(format!("{}-minute steps; a step counts when its midpoint is between sunrise and sunset; cells sampled at their centres.", a.step_min));
    t.notes.push("Indicative; local planning codes and a licensed professional's assessment govern.".into());
    Ok(t.render(a.format))
}

/// Each area's sun before and after the proposal.
fn before_after(a: &HoursArgs, model: &SiteModel) -> Result<String, String> {
    if !(a.min_hours.is_finite() && a.min_hours >= 0.0) {
        return Err(format!("--min-hours must be 0 or more, got {}", a.min_hours));
    }
    let first = args::date(&a.date, "--date")?;
    let last = a.to.as_deref().map_or(Ok(first), |t| args::date(t, "--to"))?;
    let areas: Vec<_> = model.areas.iter().filter(|x| a.area.as_ref().is_none_or(|id| &x.id == id)).collect();
    if areas.is_empty() {
        return Err(match &a.area {
            Some(id) => format!("--area: the site has no area {id:?}"),
            None => "the site has no areas to compare".into(),
        });
    }
    let h = a.min_hours;
    let mut t = Table::new(
        format!("Sun before and after the proposal, {first} to {last}: share of each area with at least {h} h of direct sun"),
        vec!["area", "name", "before_pct", "after_pct", "after_over_before", "mean_before_h", "mean_after_h", "mean_lost_h"],
    );
    for area in areas {
        let grid = Grid::over_polygon(&area.polygon, a.cell_m, a.max_cells).map_err(|e| format!("--cell-m: {e}"))?;
        let (before, after) =
            (map_of(a, model, &grid, Massing::Existing)?, map_of(a, model, &grid, Massing::WithProposed)?);
        let vals = |m: &SunHours| m.hours.iter().flatten().copied().collect::<Vec<f64>>();
        let (b, af) = (vals(&before), vals(&after));
        let n = b.len().max(1) as f64;
        let share = |v: &[f64]| 100.0 * v.iter().filter(|&&x| x >= h).count() as f64 / n;
        let mean = |v: &[f64]| v.iter().sum::<f64>() / n;
        let (sb, sa) = (share(&b), share(&af));
        t.rows.push(vec![
            Cell::text(&area.id),
            Cell::text(&area.name),
            Cell::num(sb, 1),
            Cell::num(sa, 1),
            if sb > 0.0 { Cell::num(sa / sb, 2) } else { Cell::Empty },
            Cell::num(mean(&b), 2),
            Cell::num(mean(&af), 2),
            Cell::num(mean(&b) - mean(&af), 2),
        ]);
    }
    t.notes.push(format!(
        "{} m cells, {}-minute steps; before = existing massing, after = existing and proposed.",
        a.cell_m, a.step_min
    ));
    t.notes.push("Indicative, clear sky; local planning codes and a licensed professional's assessment govern.".into());
    Ok(t.render(a.format))
}

/// Runs the sun-hours map of `grid` for the period and options of `a`.
fn map_of(a: &HoursArgs, model: &SiteModel, grid: &Grid, massing: Massing) -> Result<SunHours, String> {
    let first = args::date(&a.date, "--date")?;
    let last = match &a.to {
        Some(t) => args::date(t, "--to")?,
        None => first,
    };
    let window = a.window.as_deref().map(window).transpose()?.unwrap_or(Window::Daylight);
    let req = SunHoursRequest {
        model,
        grid,
        period: sunlot::exposure::Period { first, last, window, step_min: a.step_min },
        plane_m: a.plane_m,
        delta_t: a.delta_t.delta_t()?,
        massing,
    };
    sun_hours(&req, |_| true).map_err(|e| e.to_string())
}

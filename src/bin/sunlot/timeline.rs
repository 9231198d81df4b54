//! `sunlot timeline` and `sunlot year`: a point's day of sun and shade, and its months.

use clap::Args;
use sunlot::exposure::{day_timeline, year_profile, YearProfileRequest};

use crate::args::{self, AirArgs, ClearSkyArgs, DeltaTArgs};
use crate::output::{Cell, Format, Table};
use crate::point::parse_point;
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct TimelineArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// The point: plan x and y and height above ground, metres, as X,Y,Z (e.g. 14,41,1.5).
    #[arg(long, value_name = "X,Y,Z", allow_hyphen_values = true)]
    pub at: String,
    /// Local date, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// The existing massing alone (before the proposal).
    #[arg(long)]
    pub existing_only: bool,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run_timeline(a: &TimelineArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    let p = parse_point(&a.at)?;
    let date = args::date(&a.date, "--date")?;
    let t = day_timeline(&model, p, date, crate::maps::massing(a.existing_only), a.delta_t.delta_t()?)
        .map_err(|e| e.to_string())?;
    let mut out = Table::new(
        format!("Sun and shade at ({}, {}, {} m) on {date}", p.x_m, p.y_m, p.z_m),
        vec!["from", "to", "hours", "state", "shaded_by"],
    );
    for i in &t.intervals {
        out.rows.push(vec![
            Cell::text(args::rfc3339(i.from, &model.zone)),
            Cell::text(args::rfc3339(i.to, &model.zone)),
            Cell::num(i.hours(), 3),
            Cell::text(if i.sunlit { "sun" } else { "shade" }),
            i.by.as_ref().map_or(Cell::Empty, Cell::text),
        ]);
    }
    out.notes.push(format!("{:.2} h of direct sun of {:.2} h between sunrise and sunset; changes found to about a second (exact ray test).", t.sun_hours, t.day_hours));
    if t.intervals.is_empty() {
        out.notes.push("The sun does not rise on this date.".into());
    }
    Ok(out.render(a.format))
}

#[derive(Debug, Args)]
pub struct YearArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// The point: plan x and y and height above ground, metres, as X,Y,Z.
    #[arg(long, value_name = "X,Y,Z", allow_hyphen_values = true)]
    pub at: String,
    /// The year (default: this year).
    #[arg(long)]
    pub year: Option<i32>,
    /// Time step, minutes.
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_LONG_STEP_MIN)]
    pub step_min: u32,
    /// The existing massing alone (before the proposal).
    #[arg(long)]
    pub existing_only: bool,
    #[command(flatten)]
    pub sky: ClearSkyArgs,
    #[command(flatten)]
    pub air: AirArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run_year(a: &YearArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    let p = parse_point(&a.at)?;
    let year = a.year.unwrap_or_else(|| chrono::Datelike::year(&chrono::Utc::now()));
    let atm = a.sky.bird(a.air.pressure_hpa)?;
    let mut bar = Bar::new("year profile", a.quiet);
    let req = YearProfileRequest {
        model: &model,
        point: p,
        year,
        step_min: a.step_min,
        massing: crate::maps::massing(a.existing_only),
        atmosphere: atm,
        delta_t: a.delta_t.delta_t()?,
    };
    let y = year_profile(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    let mut t = Table::new(
        format!(
            "The year {year} at ({}, {}, {} m): direct sun and clear-sky insolation per month",
            p.x_m, p.y_m, p.z_m
        ),
        vec!["month", "sun_h", "open_h", "sun_pct", "kwh_m2", "open_kwh_m2"],
    );
    for m in &y.months {
        t.rows.push(vec![
            Cell::Int(i64::from(m.month)),
            Cell::num(m.sun_hours, 1),
            Cell::num(m.open_hours, 1),
            if m.open_hours > 0.0 { Cell::num(100.0 * m.sun_hours / m.open_hours, 1) } else { Cell::Empty },
            Cell::num(m.kwh_m2, 2),
            Cell::num(m.open_kwh_m2, 2),
        ]);
    }
    t.notes.push(format!(
        "Horizontal surface; sky-view factor {:.3}; {}-minute steps; Bird clear sky (no clouds), so the sun hours are possible, not probable, sunshine.",
        y.sky_view, a.step_min
    ));
    Ok(t.render(a.format))
}

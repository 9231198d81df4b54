//! `sunlot demo`: the sun at the invented demo site through the year's key dates.

use chrono::Datelike;
use clap::Args;
use sunlot::demo::{demo, demo_site, demo_zone};
use sunlot::shadow::{shadow_study, shadow_table, Study};
use sunlot::solar::{day_events, season_instants};
use sunlot::time::DeltaT;

use crate::args::input_message;
use crate::day::{day_row, day_table};
use crate::output::{Cell, Format, Table};

#[derive(Debug, Args)]
pub struct DemoArgs {
    /// Year to show (default: this year).
    #[arg(long)]
    pub year: Option<i32>,
}

pub fn run(a: &DemoArgs) -> Result<String, String> {
    let year = a.year.unwrap_or_else(|| chrono::Utc::now().year());
    let (site, zone, model) = (demo_site(), demo_zone(), demo());
    let seasons = season_instants(year, DT).map_err(|e| input_message(&e))?;
    let key = [
        ("March equinox", seasons.march_equinox),
        ("June solstice", seasons.june_solstice),
        ("September equinox", seasons.september_equinox),
        ("December solstice", seasons.december_solstice),
    ];
    let mut tables = vec![season_days(year, &key)?];
    for (name, t) in [key[0], key[1], key[3]] {
        tables.push(hourly_sun(&model, zone.local_date(t), name)?);
    }
    tables.push(area_shade(&model, zone.local_date(seasons.march_equinox))?);
    tables.push(garden_check(&model, year)?);
    tables.extend(window_checks(&model, year)?);
    let mut out = format!(
        "sunlot demo — {}\n  {:.2}° N, {:.2}° W, {} m above sea level, zone {zone}\n\n",
        model.name, site.latitude_deg, -site.longitude_deg, site.elevation_m
    );
    for t in tables {
        out += &t.render(Format::Table);
        out.push('\n');
    }
    out += "Indicative results from the NREL SPA; the site is invented. Local planning codes and a licensed\nprofessional's assessment govern any planning decision.\n";
    Ok(out)
}

/// ΔT for every table of the demo.
const DT: DeltaT = DeltaT::EspenakMeeus;

/// The sun's day on the year's equinoxes and solstices (`key`: their names and instants).
fn season_days(year: i32, key: &[(&str, chrono::DateTime<chrono::Utc>); 4]) -> Result<Table, String> {
    let (site, zone) = (demo_site(), demo_zone());
    let mut days = day_table(&zone);
    days.title = format!("The sun's day on the equinoxes and solstices of {year}");
    days.columns.insert(0, "occasion".into());
    days.columns.insert(1, "instant".into());
    for (name, t) in key {
        let ev = day_events(&site, zone.local_date(*t), &zone, DT).map_err(|e| input_message(&e))?;
        let mut r = vec![Cell::text(*name), Cell::text(zone.local(*t).format("%Y-%m-%d %H:%M %Z").to_string())];
        r.extend(day_row(&ev, &zone, true));
        days.rows.push(r);
    }
    days.drop_columns(&["day_length_h", "zone", "sun", "date"]);
    Ok(days)
}

/// The sun and the shadow length every hour of `date` (the core's shadow-length table, on the hour).
fn hourly_sun(model: &sunlot::site::SiteModel, date: chrono::NaiveDate, name: &str) -> Result<Table, String> {
    let zone = model.zone;
    let mut table = Table::new(
        format!("Sun every hour on {date} ({name}), local time {zone}"),
        vec!["local_time", "altitude_deg", "azimuth_deg", "shadow_length_m_per_m", "shadow_azimuth_deg"],
    );
    for r in shadow_table(model, date, 60, DT).map_err(|e| input_message(&e))? {
        table.rows.push(vec![
            Cell::text(zone.local(r.time).format("%H:%M").to_string()),
            Cell::num(r.altitude_deg, 2),
            Cell::num(r.azimuth_deg, 2),
            Cell::num(r.shadow_length_m_per_m, 2),
            Cell::num(r.shadow_azimuth_deg, 1),
        ]);
    }
    table.notes.push("Shadow length per metre of height = 1 / tan(altitude), on flat ground (common practice).".into());
    Ok(table)
}

/// Each area's share in shadow at 09:00, 12:00 and 15:00 on `date`, existing → with the proposal.
fn area_shade(model: &sunlot::site::SiteModel, date: chrono::NaiveDate) -> Result<Table, String> {
    let mut shade = Table::new(
        format!("Share of each area in shadow on {date} (March equinox): existing → with the proposal"),
        vec!["area", "09:00", "12:00", "15:00"],
    );
    let mut cells: Vec<Vec<Cell>> =
        model.areas.iter().map(|a| vec![Cell::text(if a.name.is_empty() { &a.id } else { &a.name })]).collect();
    for hour in [9, 12, 15] {
        let wall = date.and_hms_opt(hour, 0, 0).ok_or("bad hour")?;
        let t = model.zone.resolve(wall, sunlot::time::Fold::Earlier).map_err(|e| e.to_string())?;
        let study = shadow_study(model, t, DT).map_err(|e| e.to_string())?;
        for (row, a) in cells.iter_mut().zip(&model.areas) {
            let text = match &study {
                Study::Sun { areas, .. } => areas
                    .iter()
                    .find(|s| s.id == a.id)
                    .map(|s| {
                        format!("{:.0}% → {:.0}%", 100.0 * s.fraction(s.existing_m2), 100.0 * s.fraction(s.combined_m2))
                    })
                    .unwrap_or_default(),
                _ => "no sun".into(),
            };
            row.push(Cell::text(text));
        }
    }
    shade.rows = cells;
    shade.notes.push(
        "From demo-site/hollin-vale.site.json; try: sunlot shadows --demo --local 2026-03-20T12:00 --format table"
            .into(),
    );
    Ok(shade)
}

/// The gardens against the default area preset (BRE BR 209's amenity test).
fn garden_check(model: &sunlot::site::SiteModel, year: i32) -> Result<Table, String> {
    let rule = sunlot::rules::area_preset(sunlot::rules::DEFAULT_AREA_PRESET).map_err(|e| e.to_string())?;
    let (cell_m, step_min) = (sunlot::exposure::DEFAULT_CELL_M, sunlot::exposure::DEFAULT_STEP_MIN);
    let req = sunlot::rules::CheckRequest { model, rule: &rule, year, cell_m, step_min, delta_t: DT };
    let report = sunlot::rules::check_rule(&req, |_| true).map_err(|e| e.to_string())?;
    let mut check = crate::check::report_table(&report);
    check.notes.insert(
        0,
        "Try: sunlot compare --demo --date YYYY-03-21 --png lost.png; sunlot envelope --demo --lot lot-14 --date YYYY-03-21"
            .replace("YYYY", &year.to_string()),
    );
    Ok(check)
}

/// The neighbours' windows against BR 209's window tests.
fn window_checks(model: &sunlot::site::SiteModel, year: i32) -> Result<Vec<Table>, String> {
    let mut out = Vec::new();
    for id in ["bre-br209-window-sky", "bre-br209-window-sun"] {
        let sunlot::rules::AnyRule::Window(rule) = sunlot::rules::preset(id).map_err(|e| e.to_string())? else {
            continue;
        };
        let req = sunlot::rules::WindowCheckRequest {
            model,
            rule: &rule,
            year,
            step_min: 10,
            azimuth_step_deg: sunlot::daylight::DEFAULT_AZIMUTH_STEP_DEG,
            delta_t: DT,
        };
        let report = sunlot::rules::check_windows(&req, |_| true).map_err(|e| e.to_string())?;
        let mut table = crate::check::window_table(&report);
        table.drop_columns(&["window"]);
        out.push(table);
    }
    Ok(out)
}

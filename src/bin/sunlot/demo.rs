//! `sunlot demo`: the sun at the invented demo site through the year's key dates.

use chrono::Datelike;
use clap::Args;
use sunlot::demo::{demo, demo_site, demo_zone};
use sunlot::shadow::{shadow_study, Study};
use sunlot::solar::{day_events, season_instants, Atmosphere, SunAtInstant};
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
    let site = demo_site();
    let zone = demo_zone();
    let dt = DeltaT::EspenakMeeus;
    let seasons = season_instants(year, dt).map_err(|e| input_message(&e))?;
    let mut out = format!(
        "sunlot demo — {}\n  {:.2}° N, {:.2}° W, {} m above sea level, zone {zone}\n\n",
        demo().name,
        site.latitude_deg,
        -site.longitude_deg,
        site.elevation_m
    );

    let key = [
        ("March equinox", seasons.march_equinox),
        ("June solstice", seasons.june_solstice),
        ("September equinox", seasons.september_equinox),
        ("December solstice", seasons.december_solstice),
    ];
    let mut days = day_table(&zone);
    days.title = format!("The sun's day on the equinoxes and solstices of {year}");
    days.columns.insert(0, "occasion".into());
    days.columns.insert(1, "instant".into());
    for (name, t) in key {
        let ev = day_events(&site, zone.local_date(t), &zone, dt).map_err(|e| input_message(&e))?;
        let mut r = vec![Cell::text(name), Cell::text(zone.local(t).format("%Y-%m-%d %H:%M %Z").to_string())];
        r.extend(day_row(&ev, &zone, true));
        days.rows.push(r);
    }
    days.drop_columns(&["day_length_h", "zone", "sun", "date"]);
    out += &days.render(Format::Table);
    out.push('\n');

    for (name, t) in [key[0], key[1], key[3]] {
        let date = zone.local_date(t);
        let mut table = Table::new(
            format!("Sun every hour on {date} ({name}), local time {zone}"),
            vec!["local_time", "altitude_deg", "azimuth_deg", "shadow_length_m_per_m", "shadow_azimuth_deg"],
        );
        let (start, end) = crate::args::day_bounds(&zone, date);
        let mut at = start;
        while at < end {
            let p = SunAtInstant::new(at, dt).map_err(|e| input_message(&e))?.observe(&site, &Atmosphere::default());
            if p.is_up() {
                table.rows.push(vec![
                    Cell::text(zone.local(at).format("%H:%M").to_string()),
                    Cell::num(p.altitude_deg, 2),
                    Cell::num(p.azimuth_deg, 2),
                    Cell::num(1.0 / p.altitude_deg.to_radians().tan(), 2),
                    Cell::num((p.azimuth_deg + 180.0) % 360.0, 1),
                ]);
            }
            at += chrono::Duration::hours(1);
        }
        table
            .notes
            .push("Shadow length per metre of height = 1 / tan(altitude), on flat ground (common practice).".into());
        out += &table.render(Format::Table);
        out.push('\n');
    }
    let model = demo();
    let date = zone.local_date(seasons.march_equinox);
    let mut shade = Table::new(
        format!("Share of each area in shadow on {date} (March equinox): existing → with the proposal"),
        vec!["area", "09:00", "12:00", "15:00"],
    );
    let mut cells: Vec<Vec<Cell>> =
        model.areas.iter().map(|a| vec![Cell::text(if a.name.is_empty() { &a.id } else { &a.name })]).collect();
    for hour in [9, 12, 15] {
        let wall = date.and_hms_opt(hour, 0, 0).ok_or("bad hour")?;
        let t = zone.resolve(wall, sunlot::time::Fold::Earlier).map_err(|e| e.to_string())?;
        let study = shadow_study(&model, t, dt).map_err(|e| e.to_string())?;
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
    out += &shade.render(Format::Table);
    out.push('\n');
    let rule = sunlot::rules::area_preset(sunlot::rules::DEFAULT_AREA_PRESET).map_err(|e| e.to_string())?;
    let req = sunlot::rules::CheckRequest { model: &model, rule: &rule, year, cell_m: 0.5, step_min: 5, delta_t: dt };
    let report = sunlot::rules::check_rule(&req, |_| true).map_err(|e| e.to_string())?;
    let mut check = crate::check::report_table(&report);
    check.notes.insert(
        0,
        "Try: sunlot compare --demo --date YYYY-03-21 --png lost.png; sunlot envelope --demo --lot lot-14 --date YYYY-03-21"
            .replace("YYYY", &year.to_string()),
    );
    out += &check.render(Format::Table);
    out.push('\n');
    // The neighbours' windows against BR 209's window tests.
    for id in ["bre-br209-window-sky", "bre-br209-window-sun"] {
        let sunlot::rules::AnyRule::Window(rule) = sunlot::rules::preset(id).map_err(|e| e.to_string())? else {
            continue;
        };
        let req = sunlot::rules::WindowCheckRequest {
            model: &model,
            rule: &rule,
            year,
            step_min: 10,
            azimuth_step_deg: sunlot::daylight::DEFAULT_AZIMUTH_STEP_DEG,
            delta_t: dt,
        };
        let report = sunlot::rules::check_windows(&req, |_| true).map_err(|e| e.to_string())?;
        let mut table = crate::check::window_table(&report);
        table.drop_columns(&["window"]);
        out += &table.render(Format::Table);
        out.push('\n');
    }
    out += "Indicative results from the NREL SPA; the site is invented. Local planning codes and a licensed\nprofessional's assessment govern any planning decision.\n";
    Ok(out)
}

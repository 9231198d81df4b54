//! `sunlot position`: where the sun is at one moment, through a day, or for each row of a CSV.

use chrono::{DateTime, NaiveDate, Utc};
use clap::Args;
use sunlot::solar::{day_events, Atmosphere, Ephemeris, Site, SolarPosition, SunAtInstant};
use sunlot::time::{DeltaT, Zone};

use crate::args::{self, input_message, AirArgs, DeltaTArgs, SiteArgs, When, WhenArgs, ZoneArgs};
use crate::output::{Cell, Format, Table};

#[derive(Debug, Args)]
pub struct PositionArgs {
    #[command(flatten)]
    pub site: SiteArgs,
    #[command(flatten)]
    pub when: WhenArgs,
    /// In the day table, also list the steps when the sun is below the horizon.
    #[arg(long)]
    pub include_night: bool,
    #[command(flatten)]
    pub zone: ZoneArgs,
    #[command(flatten)]
    pub air: AirArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Also give the sun's angle of incidence on a surface of this slope from horizontal, degrees.
    #[arg(long, requires = "surface_azimuth_deg")]
    pub surface_tilt_deg: Option<f64>,
    /// Direction the surface faces, degrees clockwise from true north (180 = south).
    #[arg(long, requires = "surface_tilt_deg")]
    pub surface_azimuth_deg: Option<f64>,
    /// Output: an aligned table, JSON, or CSV. With csv and no --time/--local/--date, reads a CSV of
    /// lat,lon,time[,elevation_m,pressure_hpa,temperature_c] on standard input and adds
    /// zenith_deg,altitude_deg,azimuth_deg to each row.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &PositionArgs) -> Result<String, String> {
    let atmosphere = a.air.atmosphere()?;
    let delta_t = a.delta_t.delta_t()?;
    let surface = match (a.surface_tilt_deg, a.surface_azimuth_deg) {
        (Some(t), Some(az)) if t.is_finite() && az.is_finite() && (0.0..=180.0).contains(&t) => Some((t, az)),
        (Some(t), Some(az)) => {
            return Err(format!("--surface-tilt-deg must be 0 to 180 and both surface angles finite, got {t} and {az}"))
        }
        _ => None,
    };
    let table = match a.when.resolve(&a.zone, a.site.demo)? {
        When::Unspecified if a.format == Format::Csv => return crate::batch::run(&a.air, &a.delta_t),
        When::Unspecified => {
            return Err("give a moment with --time or --local, a day with --date, or use --format csv to read rows from standard input".into());
        }
        When::Moment(t, zone) => {
            let site = a.site.site()?;
            let p = SunAtInstant::new(t, delta_t).map_err(|e| input_message(&e))?.observe(&site, &atmosphere);
            let mut table = position_table(&site, &zone, &atmosphere, surface);
            table.title = format!("Sun at {} ({zone})", args::rfc3339(t, &zone));
            let row = position_row(t, &zone, &p, &site, surface, &table.columns);
            table.rows.push(row);
            table.single = true;
            table
        }
        When::Day { date, zone, step_min, steps } => {
            let site = a.site.site()?;
            let day = Day { site: &site, date, zone: &zone, air: &atmosphere, delta_t, surface };
            day_table(&day, step_min, &steps, a.include_night)?
        }
    };
    Ok(table.render(a.format))
}

fn position_table(site: &Site, zone: &Zone, air: &Atmosphere, surface: Option<(f64, f64)>) -> Table {
    let mut cols = vec![
        "time",
        "altitude_deg",
        "azimuth_deg",
        "zenith_deg",
        "declination_deg",
        "hour_angle_deg",
        "equation_of_time_min",
        "earth_sun_distance_au",
        "altitude_unrefracted_deg",
        "delta_t_s",
        "latitude_deg",
        "longitude_deg",
        "elevation_m",
        "zone",
        "sun_up",
    ];
    if surface.is_some() {
        cols.push("incidence_deg");
    }
    let mut t = Table::new("", cols);
    t.notes.push(format!(
        "Site {:.5}°, {:.5}°, {} m; zone {zone}. Azimuth clockwise from true north. {}.",
        site.latitude_deg,
        site.longitude_deg,
        site.elevation_m,
        if air.refraction {
            format!("Refraction for {} hPa, {} °C", air.pressure_hpa, air.temperature_c)
        } else {
            "No refraction".into()
        }
    ));
    t.notes.push("NREL SPA (Reda & Andreas 2004); ΔT by Espenak & Meeus (2006) unless --delta-t-s is given.".into());
    t
}

fn position_row(
    t: DateTime<Utc>,
    zone: &Zone,
    p: &SolarPosition,
    site: &Site,
    surface: Option<(f64, f64)>,
    columns: &[String],
) -> Vec<Cell> {
    let mut cells = vec![
        ("time", Cell::text(args::rfc3339(t, zone))),
        ("altitude_deg", Cell::num(p.altitude_deg, 4)),
        ("azimuth_deg", Cell::num(p.azimuth_deg, 4)),
        ("zenith_deg", Cell::num(p.zenith_deg, 4)),
        ("declination_deg", Cell::num(p.declination_deg, 4)),
        ("hour_angle_deg", Cell::num(p.hour_angle_deg, 4)),
        ("equation_of_time_min", Cell::num(p.equation_of_time_min, 3)),
        ("earth_sun_distance_au", Cell::num(p.earth_sun_distance_au, 6)),
        ("altitude_unrefracted_deg", Cell::num(p.altitude_unrefracted_deg, 4)),
        ("delta_t_s", Cell::num(p.delta_t_s, 1)),
        ("latitude_deg", Cell::num(site.latitude_deg, 5)),
        ("longitude_deg", Cell::num(site.longitude_deg, 5)),
        ("elevation_m", Cell::num(site.elevation_m, 1)),
        ("zone", Cell::text(zone.to_string())),
        ("sun_up", Cell::Bool(p.is_up())),
    ];
    if let Some((tilt, az)) = surface {
        cells.push(("incidence_deg", Cell::num(p.incidence_deg(tilt, az), 4)));
    }
    cells.into_iter().filter(|(c, _)| columns.iter().any(|k| k == c)).map(|(_, v)| v).collect()
}

/// A day table's fixed inputs.
struct Day<'a> {
    site: &'a Site,
    date: NaiveDate,
    zone: &'a Zone,
    air: &'a Atmosphere,
    delta_t: DeltaT,
    surface: Option<(f64, f64)>,
}

fn day_table(d: &Day, step_min: u32, steps: &[DateTime<Utc>], night: bool) -> Result<Table, String> {
    let mut table = position_table(d.site, d.zone, d.air, d.surface);
    table.columns.retain(|c| {
        !matches!(c.as_str(), "latitude_deg" | "longitude_deg" | "elevation_m" | "zone" | "delta_t_s" | "sun_up")
    });
    table.title = format!(
        "Sun through {} ({}), every {step_min} min{}",
        d.date,
        d.zone,
        if night { "" } else { ", sun up only" }
    );
    let ev = day_events(d.site, d.date, d.zone, d.delta_t).map_err(|e| input_message(&e))?;
    let mut ephemeris = Ephemeris::new();
    for &t in steps {
        let p = ephemeris.sun_at(t, d.delta_t).map_err(|e| input_message(&e))?.observe(d.site, d.air);
        if night || p.is_up() {
            table.rows.push(position_row(t, d.zone, &p, d.site, d.surface, &table.columns));
        }
    }
    table.notes.insert(0, crate::day::describe_sun(&ev, d.zone));
    Ok(table)
}

#[cfg(test)]
mod tests {
    use super::*;
    use chrono::Duration;

    #[test]
    fn day_table_columns_and_cells_line_up() {
        let site = sunlot::demo::demo_site();
        let zone: Zone = "Europe/London".parse().unwrap();
        let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let (start, _) = args::day_bounds(&zone, date);
        let steps: Vec<_> = (0..24).map(|h| start + Duration::hours(h)).collect();
        for surface in [None, Some((30.0, 180.0))] {
            let air = Atmosphere::default();
            let d = Day { site: &site, date, zone: &zone, air: &air, delta_t: DeltaT::EspenakMeeus, surface };
            let t = day_table(&d, 60, &steps, false).unwrap();
            assert!(t.rows.len() >= 11 && t.rows.len() <= 13, "{} rows", t.rows.len());
            assert!(t.rows.iter().all(|r| r.len() == t.columns.len()));
        }
    }
}

//! `sunlot day`: sunrise, solar noon, sunset, day length and civil twilight for local dates.

use chrono::{DateTime, Duration, Utc};
use clap::Args;
use sunlot::solar::{day_events, Crossing, DayEvents};
use sunlot::time::Zone;

use crate::args::{self, input_message, DeltaTArgs, SiteArgs, ZoneArgs};
use crate::output::{Cell, Format, Table};

#[derive(Debug, Args)]
pub struct DayArgs {
    #[command(flatten)]
    pub site: SiteArgs,
    /// First local date, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// Number of consecutive days (1 to 3660).
    #[arg(long, default_value_t = 1)]
    pub days: u32,
    #[command(flatten)]
    pub zone: ZoneArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &DayArgs) -> Result<String, String> {
    let site = a.site.site()?;
    let zone = a.zone.zone(a.site.demo)?.unwrap_or_else(Zone::utc);
    let delta_t = a.delta_t.delta_t()?;
    let first = args::date(&a.date, "--date")?;
    if !(1..=3660).contains(&a.days) {
        return Err(format!("--days must be 1 to 3660, got {}", a.days));
    }
    let mut t = day_table(&zone);
    t.title = format!("Sun's day at {:.5}°, {:.5}° ({zone})", site.latitude_deg, site.longitude_deg);
    for k in 0..a.days {
        let date = first + Duration::days(i64::from(k));
        let ev = day_events(&site, date, &zone, delta_t).map_err(|e| input_message(&e))?;
        t.rows.push(day_row(&ev, &zone, a.format == Format::Table));
    }
    t.single = a.days == 1;
    Ok(t.render(a.format))
}

pub fn day_table(zone: &Zone) -> Table {
    let mut t = Table::new(
        "",
        vec![
            "date",
            "sunrise",
            "solar_noon",
            "sunset",
            "day_length",
            "day_length_h",
            "noon_altitude_deg",
            "civil_dawn",
            "civil_dusk",
            "sun",
            "zone",
        ],
    );
    t.notes.push(format!(
        "Times in {zone}. Sunrise and sunset: upper limb on the horizon with standard refraction (−0.8333°); civil twilight: sun 6° below."
    ));
    t.notes.push(
        "NREL SPA, Appendix A.2 (Reda & Andreas 2004). 'always_up' = polar day, 'always_down' = polar night.".into(),
    );
    t
}

/// One date's row; `clock` writes times as local HH:MM:SS (for reading) rather than RFC 3339.
pub fn day_row(ev: &DayEvents, zone: &Zone, clock: bool) -> Vec<Cell> {
    let stamp =
        |t: DateTime<Utc>| if clock { zone.local(t).format("%H:%M:%S").to_string() } else { args::rfc3339(t, zone) };
    let (rise, set) = times(&ev.sun, &stamp);
    let (dawn, dusk) = times(&ev.civil_twilight, &stamp);
    let len = ev.day_length();
    vec![
        Cell::text(ev.date.to_string()),
        rise,
        Cell::text(stamp(ev.transit)),
        set,
        Cell::text(hm(len)),
        Cell::num(len.num_milliseconds() as f64 / 3_600_000.0, 4),
        Cell::num(ev.transit_altitude_deg, 3),
        dawn,
        dusk,
        Cell::text(kind(&ev.sun)),
        Cell::text(zone.to_string()),
    ]
}

fn times(c: &Crossing, stamp: &dyn Fn(DateTime<Utc>) -> String) -> (Cell, Cell) {
    let f = |t: DateTime<Utc>| Cell::text(stamp(t));
    match c {
        Crossing::Crosses { rise, set } => (f(*rise), f(*set)),
        _ => (Cell::Empty, Cell::Empty),
    }
}

fn kind(c: &Crossing) -> &'static str {
    match c {
        Crossing::Crosses { .. } => "rises_and_sets",
        Crossing::AlwaysAbove => "always_up",
        Crossing::AlwaysBelow => "always_down",
    }
}

/// A duration as `11h 47m`.
pub fn hm(d: Duration) -> String {
    let m = (d.num_seconds() as f64 / 60.0).round() as i64;
    format!("{}h {:02}m", m / 60, m % 60)
}

/// One line on the sun's day, for notes under other tables.
pub fn describe_sun(ev: &DayEvents, zone: &Zone) -> String {
    let clock = |t: DateTime<Utc>| zone.local(t).format("%H:%M").to_string();
    match ev.sun {
        Crossing::Crosses { rise, set } => format!(
            "Sunrise {}, solar noon {} (altitude {:.1}°), sunset {}; day length {}.",
            clock(rise),
            clock(ev.transit),
            ev.transit_altitude_deg,
            clock(set),
            hm(ev.day_length())
        ),
        Crossing::AlwaysAbove => format!("The sun does not set (polar day); solar noon {}.", clock(ev.transit)),
        Crossing::AlwaysBelow => "The sun does not rise (polar night).".to_string(),
    }
}

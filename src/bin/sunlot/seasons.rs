//! `sunlot seasons`: the equinoxes and solstices of one or more years.

use clap::Args;
use sunlot::solar::season_instants;
use sunlot::time::Zone;

use crate::args::{self, input_message, DeltaTArgs};
use crate::output::{Cell, Format, Table};

#[derive(Debug, Args)]
pub struct SeasonsArgs {
    /// First year (−2000 to 6000).
    #[arg(long, allow_hyphen_values = true)]
    pub year: i32,
    /// Number of consecutive years (1 to 1000).
    #[arg(long, default_value_t = 1)]
    pub years: u32,
    /// Zone to show the instants in: IANA name or offset. Default UTC.
    #[arg(long, default_value = "UTC")]
    pub zone: String,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &SeasonsArgs) -> Result<String, String> {
    let zone: Zone = a.zone.parse().map_err(|e: sunlot::time::TimeError| format!("--zone: {e}"))?;
    let delta_t = a.delta_t.delta_t()?;
    if !(1..=1000).contains(&a.years) {
        return Err(format!("--years must be 1 to 1000, got {}", a.years));
    }
    let mut t = Table::new(
        format!("Equinoxes and solstices ({zone})"),
        vec!["year", "march_equinox", "june_solstice", "september_equinox", "december_solstice", "zone"],
    );
    t.notes
        .push("When the sun's apparent longitude is 0°, 90°, 180°, 270° (NREL SPA terms; Meeus 1998 ch. 27).".into());
    for k in 0..a.years {
        let year = a.year.saturating_add(k as i32);
        let s = season_instants(year, delta_t).map_err(|e| format!("--year: {}", input_message(&e)))?;
        t.rows.push(vec![
            Cell::Int(i64::from(year)),
            Cell::text(args::rfc3339(s.march_equinox, &zone)),
            Cell::text(args::rfc3339(s.june_solstice, &zone)),
            Cell::text(args::rfc3339(s.september_equinox, &zone)),
            Cell::text(args::rfc3339(s.december_solstice, &zone)),
            Cell::text(zone.to_string()),
        ]);
    }
    t.single = a.years == 1;
    Ok(t.render(a.format))
}

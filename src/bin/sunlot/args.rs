//! Options shared by several commands: the site, the air, ΔT, the zone and the moment.

use chrono::{DateTime, NaiveDate, Utc};
use clap::{Args, ValueEnum};
use sunlot::solar::{Atmosphere, InputError, Site};
use sunlot::time::{parse_instant, DeltaT, Zone};

/// The flag a core field name comes from, so messages name what the user typed.
pub fn flag_for(field: &str) -> &str {
    match field {
        "latitude_deg" => "--lat",
        "longitude_deg" => "--lon",
        "elevation_m" => "--elevation-m",
        "pressure_hpa" => "--pressure-hpa",
        "temperature_c" => "--temperature-c",
        "delta_t_s" => "--delta-t-s",
        other => other,
    }
}

/// An input error worded for the command line.
pub fn input_message(e: &InputError) -> String {
    match e {
        InputError::NotFinite { field, value } => format!("{} must be a finite number, got {value}", flag_for(field)),
        InputError::OutOfRange { field, value, min, max } => {
            format!("{} must be between {min} and {max}, got {value}", flag_for(field))
        }
        other => other.to_string(),
    }
}

#[derive(Debug, Clone, Args)]
pub struct SiteArgs {
    /// Latitude of the site, degrees, north positive (−90 to 90).
    #[arg(long, allow_hyphen_values = true)]
    pub lat: Option<f64>,
    /// Longitude of the site, degrees, east positive (−180 to 180).
    #[arg(long, allow_hyphen_values = true)]
    pub lon: Option<f64>,
    /// Height of the site above sea level, metres.
    #[arg(long, allow_hyphen_values = true, default_value_t = 0.0)]
    pub elevation_m: f64,
    /// Use the built-in demo site (an invented lot at 52.62° N, 1.87° W, 118 m, Europe/London).
    #[arg(long, conflicts_with_all = ["lat", "lon"])]
    pub demo: bool,
}

impl SiteArgs {
    pub fn site(&self) -> Result<Site, String> {
        if self.demo {
            return Ok(sunlot::demo::demo_site());
        }
        let (Some(lat), Some(lon)) = (self.lat, self.lon) else {
            return Err("give the site with --lat and --lon (degrees), or use --demo".into());
        };
        Site::new(lat, lon, self.elevation_m).map_err(|e| input_message(&e))
    }
}

#[derive(Debug, Clone, Args)]
pub struct AirArgs {
    /// Mean local air pressure for refraction, hectopascals (= millibars).
    #[arg(long, default_value_t = 1013.25)]
    pub pressure_hpa: f64,
    /// Mean local air temperature for refraction, degrees Celsius.
    #[arg(long, allow_hyphen_values = true, default_value_t = 10.0)]
    pub temperature_c: f64,
    /// Give the true geometric position, without atmospheric refraction.
    #[arg(long)]
    pub no_refraction: bool,
}

impl AirArgs {
    pub fn atmosphere(&self) -> Result<Atmosphere, String> {
        Atmosphere::new(self.pressure_hpa, self.temperature_c, !self.no_refraction).map_err(|e| input_message(&e))
    }
}

#[derive(Debug, Clone, Args)]
pub struct DeltaTArgs {
    /// ΔT = TT − UT, seconds. Default: the Espenak–Meeus (2006) polynomials (≈ 69 s in 2020–2026
    /// measured; the polynomial gives a few seconds more).
    #[arg(long, allow_hyphen_values = true)]
    pub delta_t_s: Option<f64>,
}

impl DeltaTArgs {
    pub fn delta_t(&self) -> Result<DeltaT, String> {
        match self.delta_t_s {
            Some(s) if !s.is_finite() => Err(format!("--delta-t-s must be a finite number, got {s}")),
            Some(s) => Ok(DeltaT::Seconds(s)),
            None => Ok(DeltaT::EspenakMeeus),
        }
    }
}

/// Which instant a repeated local time (clocks going back) means.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Fold {
    /// The first occurrence, before the clocks go back.
    Earlier,
    /// The second occurrence, after the clocks go back.
    Later,
}

#[derive(Debug, Clone, Args)]
pub struct ZoneArgs {
    /// Time zone for local times: an IANA name (Europe/London, America/Denver) or an offset (+01:00).
    /// Default: the demo site's zone with --demo, else the offset written in --time, else UTC.
    #[arg(long)]
    pub zone: Option<String>,
    /// For a local time that occurs twice (clocks going back): which one is meant. Without it such a
    /// time is refused.
    #[arg(long, value_enum)]
    pub fold: Option<Fold>,
}

impl ZoneArgs {
    pub fn zone(&self, demo: bool) -> Result<Option<Zone>, String> {
        match (&self.zone, demo) {
            (Some(z), _) => z.parse().map(Some).map_err(|e: sunlot::time::TimeError| format!("--zone: {e}")),
            (None, true) => Ok(Some(sunlot::demo::demo_zone())),
            (None, false) => Ok(None),
        }
    }

    pub fn fold(&self) -> sunlot::time::Fold {
        match self.fold {
            None => sunlot::time::Fold::Reject,
            Some(Fold::Earlier) => sunlot::time::Fold::Earlier,
            Some(Fold::Later) => sunlot::time::Fold::Later,
        }
    }
}

/// One instant from `--time` (RFC 3339) or `--local` (wall time in `--zone`), with the display zone.
pub fn instant(
    time: Option<&str>,
    local: Option<&str>,
    zones: &ZoneArgs,
    demo: bool,
) -> Result<Option<(DateTime<Utc>, Zone)>, String> {
    let zone = zones.zone(demo)?;
    match (time, local) {
        (Some(t), _) => {
            let (i, written) = parse_instant(t).map_err(|e| format!("--time: {e}"))?;
            Ok(Some((i, zone.unwrap_or(written))))
        }
        (None, Some(l)) => {
            let zone = zone.ok_or("--local needs --zone (an IANA name such as Europe/London, or an offset)")?;
            let i = zone.parse_local(l, zones.fold()).map_err(|e| format!("--local: {e}"))?;
            Ok(Some((i, zone)))
        }
        (None, None) => Ok(None),
    }
}

/// A date from `--date`.
pub fn date(text: &str, flag: &str) -> Result<NaiveDate, String> {
    Zone::parse_date(text).map_err(|e| format!("{flag}: {e}"))
}

/// An instant in a zone, as RFC 3339 to the second.
pub fn rfc3339(t: DateTime<Utc>, zone: &Zone) -> String {
    zone.local(t).to_rfc3339_opts(chrono::SecondsFormat::Secs, true)
}

/// When to compute: one moment, or a whole local day at a step.
#[derive(Debug, Clone, Args)]
pub struct WhenArgs {
    /// The moment, RFC 3339 with an offset (2026-06-21T12:00:00+01:00 or ...Z).
    #[arg(long, conflicts_with_all = ["local", "date"])]
    pub time: Option<String>,
    /// The moment as local wall-clock time YYYY-MM-DDTHH:MM[:SS] in --zone.
    #[arg(long, conflicts_with = "date")]
    pub local: Option<String>,
    /// A whole local date YYYY-MM-DD: a table through the day at --step-min.
    #[arg(long)]
    pub date: Option<String>,
    /// Step of the day table, minutes (1 to 720), counted from local midnight.
    #[arg(long, default_value_t = sunlot::shadow::DEFAULT_TABLE_STEP_MIN)]
    pub step_min: u32,
}

/// What [`WhenArgs`] asked for.
pub enum When {
    /// One instant, shown in a zone.
    Moment(DateTime<Utc>, Zone),
    /// The steps of a local day (from local midnight to the next, at `step_min`).
    Day { date: NaiveDate, zone: Zone, step_min: u32, steps: Vec<DateTime<Utc>> },
    /// Neither a moment nor a date was given.
    Unspecified,
}

impl WhenArgs {
    pub fn resolve(&self, zones: &ZoneArgs, demo: bool) -> Result<When, String> {
        if let Some((t, zone)) = instant(self.time.as_deref(), self.local.as_deref(), zones, demo)? {
            return Ok(When::Moment(t, zone));
        }
        let Some(text) = self.date.as_deref() else { return Ok(When::Unspecified) };
        let date = date(text, "--date")?;
        if !(1..=720).contains(&self.step_min) {
            return Err(format!("--step-min must be 1 to 720, got {}", self.step_min));
        }
        let zone = zones.zone(demo)?.unwrap_or_else(Zone::utc);
        let (start, end) = day_bounds(&zone, date);
        let step = chrono::Duration::minutes(i64::from(self.step_min));
        let steps = std::iter::successors(Some(start), |t| Some(*t + step)).take_while(|t| *t < end).collect();
        Ok(When::Day { date, zone, step_min: self.step_min, steps })
    }
}

/// Local midnight at the start of `date` and of the next day, as instants (where midnight is skipped
/// by a daylight-saving change, the first hour that exists).
pub fn day_bounds(zone: &Zone, date: NaiveDate) -> (DateTime<Utc>, DateTime<Utc>) {
    (zone.start_of_day(date), zone.start_of_day(date.succ_opt().unwrap_or(date)))
}

/// The clear atmosphere of the Bird model.
#[derive(Debug, Args)]
pub struct ClearSkyArgs {
    /// Ground albedo, 0–1 (for the Bird model and the ground-reflected part on a surface).
    #[arg(long, default_value_t = 0.2)]
    pub albedo: f64,
    /// Aerosol optical depth at 500 nm.
    #[arg(long, default_value_t = 0.10)]
    pub aod_500: f64,
    /// Aerosol optical depth at 380 nm.
    #[arg(long, default_value_t = 0.15)]
    pub aod_380: f64,
    /// Precipitable water, centimetres.
    #[arg(long, default_value_t = 1.5)]
    pub precipitable_water_cm: f64,
    /// Ozone column, centimetres.
    #[arg(long, default_value_t = 0.3)]
    pub ozone_cm: f64,
}

impl ClearSkyArgs {
    /// The checked Bird atmosphere at `pressure_hpa`.
    pub fn bird(&self, pressure_hpa: f64) -> Result<sunlot::sky::BirdAtmosphere, String> {
        sunlot::sky::BirdAtmosphere {
            aod_380: self.aod_380,
            aod_500: self.aod_500,
            precipitable_water_cm: self.precipitable_water_cm,
            ozone_cm: self.ozone_cm,
            forward_scattering: 0.85,
            albedo: self.albedo,
            pressure_hpa,
        }
        .validated()
        .map_err(|e| format!("--{}", input_message(&e).replace('_', "-")))
    }
}

/// A moment at a site: an instant, or a local time in the site's zone, and the ΔT model.
#[derive(Debug, Args)]
pub struct MomentArgs {
    /// The moment, RFC 3339 with an offset.
    #[arg(long, conflicts_with = "local")]
    pub time: Option<String>,
    /// The moment as local wall-clock time YYYY-MM-DDTHH:MM[:SS] in the site's zone.
    #[arg(long, required_unless_present = "time")]
    pub local: Option<String>,
    /// For a local time that occurs twice (clocks going back): which one is meant.
    #[arg(long, value_enum)]
    pub fold: Option<Fold>,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
}

impl MomentArgs {
    /// The instant asked for, with the zone to show it in (the site's for a local time).
    pub fn instant(&self, model: &sunlot::site::SiteModel) -> Result<(DateTime<Utc>, Zone), String> {
        let zones = ZoneArgs { zone: Some(model.zone.to_string()), fold: self.fold };
        instant(self.time.as_deref(), self.local.as_deref(), &zones, false)?
            .ok_or_else(|| "give --time or --local".into())
    }
}

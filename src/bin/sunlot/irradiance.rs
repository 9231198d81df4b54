//! `sunlot irradiance`: clear-sky sunlight at a moment or through a day, on the horizontal and on a
//! tilted surface.

use chrono::{DateTime, Datelike, Utc};
use clap::Args;
use sunlot::sky::{
    bird_clear_sky, extraterrestrial_normal_w_m2, plane_of_array, relative_air_mass_kasten_young, BirdAtmosphere,
    Surface,
};
use sunlot::solar::{Atmosphere, Site, SunAtInstant};
use sunlot::time::{DeltaT, Zone};

use crate::args::{self, input_message, AirArgs, DeltaTArgs, SiteArgs, When, WhenArgs, ZoneArgs};
use crate::output::{Cell, Format, Table};

#[derive(Debug, Args)]
pub struct IrradianceArgs {
    #[command(flatten)]
    pub site: SiteArgs,
    /// With --date, the table comes with daily totals.
    #[command(flatten)]
    pub when: WhenArgs,
    #[command(flatten)]
    pub zone: ZoneArgs,
    #[command(flatten)]
    pub air: AirArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Slope of a receiving surface from horizontal, degrees (0 flat, 90 a wall).
    #[arg(long, alias = "tilt-deg")]
    pub surface_tilt_deg: Option<f64>,
    /// Direction the receiving surface faces, degrees clockwise from true north (180 = south).
    #[arg(long, default_value_t = 180.0)]
    pub surface_azimuth_deg: f64,
    #[command(flatten)]
    pub sky: args::ClearSkyArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

struct Setup {
    site: Site,
    air: Atmosphere,
    bird: BirdAtmosphere,
    delta_t: DeltaT,
    surface: Option<Surface>,
}

pub fn run(a: &IrradianceArgs) -> Result<String, String> {
    let site = a.site.site()?;
    let air = a.air.atmosphere()?;
    let bird = a.sky.bird(a.air.pressure_hpa)?;
    let surface = match a.surface_tilt_deg {
        Some(t) if (0.0..=180.0).contains(&t) && a.surface_azimuth_deg.is_finite() => {
            Some(Surface { tilt_deg: t, azimuth_deg: a.surface_azimuth_deg, albedo: a.sky.albedo })
        }
        Some(t) => {
            return Err(format!("--surface-tilt-deg must be 0 to 180 with a finite --surface-azimuth-deg, got {t}"))
        }
        None => None,
    };
    let s = Setup { site, air, bird, delta_t: a.delta_t.delta_t()?, surface };
    let mut table = table(&s);
    let (date, zone, step_min, steps) = match a.when.resolve(&a.zone, a.site.demo)? {
        When::Moment(t, zone) => {
            table.title = format!("Clear-sky irradiance at {} ({zone})", args::rfc3339(t, &zone));
            table.rows.push(row(&s, t, &zone)?.0);
            table.single = true;
            return Ok(table.render(a.format));
        }
        When::Day { date, zone, step_min, steps } => (date, zone, step_min, steps),
        When::Unspecified => return Err("give a moment with --time or --local, or a day with --date".into()),
    };
    table.title = format!("Clear-sky irradiance through {date} ({zone}), every {step_min} min");
    let step_h = f64::from(step_min) / 60.0;
    let (mut ghi_wh, mut poa_wh) = (0.0, 0.0);
    for t in steps {
        let (r, ghi_w_m2, surface_w_m2) = row(&s, t, &zone)?;
        ghi_wh += ghi_w_m2 * step_h;
        poa_wh += surface_w_m2 * step_h;
        table.rows.push(r);
    }
    table.notes.insert(
        0,
        format!("Daily clear-sky total on the horizontal: {:.2} kWh/m² (sum of steps × step length).", ghi_wh / 1000.0),
    );
    if s.surface.is_some() {
        table.notes.insert(1, format!("Daily clear-sky total on the surface: {:.2} kWh/m².", poa_wh / 1000.0));
    }
    Ok(table.render(a.format))
}

fn table(s: &Setup) -> Table {
    let mut cols = vec![
        "time",
        "zenith_deg",
        "altitude_deg",
        "azimuth_deg",
        "air_mass",
        "extraterrestrial_w_m2",
        "dni_w_m2",
        "dhi_w_m2",
        "ghi_w_m2",
    ];
    if s.surface.is_some() {
        cols.extend([
            "incidence_deg",
            "surface_beam_w_m2",
            "surface_sky_diffuse_w_m2",
            "surface_ground_w_m2",
            "surface_total_w_m2",
        ]);
    }
    let mut t = Table::new("", cols);
    t.notes.push(format!(
        "Bird & Hulstrom (1981) clear sky: AOD {} at 380 nm, {} at 500 nm, water {} cm, ozone {} cm, albedo {}; air mass Kasten & Young (1989); solar constant 1361 W/m².",
        s.bird.aod_380, s.bird.aod_500, s.bird.precipitable_water_cm, s.bird.ozone_cm, s.bird.albedo
    ));
    if let Some(f) = s.surface {
        t.notes.push(format!(
            "Surface: tilt {}°, facing {}° from north; isotropic sky diffuse (Liu & Jordan).",
            f.tilt_deg, f.azimuth_deg
        ));
    }
    t.notes.push("A cloudless sky: real sunlight is lower. Indicative values.".into());
    t
}

/// One time's cells, with the global horizontal and the surface total (0 without a surface), W/m².
fn row(s: &Setup, t: DateTime<Utc>, zone: &Zone) -> Result<(Vec<Cell>, f64, f64), String> {
    let p = SunAtInstant::new(t, s.delta_t).map_err(|e| input_message(&e))?.observe(&s.site, &s.air);
    let e0 = extraterrestrial_normal_w_m2(t.ordinal());
    let sky = bird_clear_sky(p.zenith_deg, e0, &s.bird);
    let mut r = vec![
        Cell::text(args::rfc3339(t, zone)),
        Cell::num(p.zenith_deg, 3),
        Cell::num(p.altitude_deg, 3),
        Cell::num(p.azimuth_deg, 3),
        relative_air_mass_kasten_young(p.zenith_deg).map_or(Cell::Empty, |m| Cell::num(m, 3)),
        Cell::num(e0, 1),
        Cell::num(sky.dni_w_m2, 1),
        Cell::num(sky.dhi_w_m2, 1),
        Cell::num(sky.ghi_w_m2, 1),
    ];
    let mut surface_total = 0.0;
    if let Some(f) = s.surface {
        let poa = plane_of_array(&sky, &p, &f);
        surface_total = poa.total_w_m2;
        r.extend([
            Cell::num(poa.incidence_deg, 3),
            Cell::num(poa.beam_w_m2, 1),
            Cell::num(poa.sky_diffuse_w_m2, 1),
            Cell::num(poa.ground_reflected_w_m2, 1),
            Cell::num(poa.total_w_m2, 1),
        ]);
    }
    Ok((r, sky.ghi_w_m2, surface_total))
}

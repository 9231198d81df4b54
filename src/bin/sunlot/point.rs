//! `sunlot point`: direct sun at a point of a site, at a moment or through a day, and its skyline.

use clap::Args;
use sunlot::shadow::{exposure, skyline, Exposure, Receiver, ViewPoint};
use sunlot::solar::{Atmosphere, Ephemeris};

use crate::args::{self, input_message, DeltaTArgs, Fold, When, WhenArgs, ZoneArgs};
use crate::output::{Cell, Format, Table};
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct PointArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// The point: plan x and y and height above ground, metres, as X,Y,Z (e.g. 14,41,1.5).
    #[arg(long, value_name = "X,Y,Z", allow_hyphen_values = true)]
    pub at: String,
    #[command(flatten)]
    pub when: WhenArgs,
    /// For a local time that occurs twice (clocks going back): which one is meant.
    #[arg(long, value_enum)]
    pub fold: Option<Fold>,
    /// Instead, list the obstruction skyline seen from the point at this azimuth step, degrees.
    #[arg(long, conflicts_with_all = ["time", "local", "date"])]
    pub skyline_step_deg: Option<f64>,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn parse_point(text: &str) -> Result<ViewPoint, String> {
    let v: Vec<f64> = text
        .split(',')
        .map(|p| p.trim().parse::<f64>())
        .collect::<Result<_, _>>()
        .map_err(|_| format!("--at: {text:?} is not X,Y,Z in metres"))?;
    match v[..] {
        [x, y, z] if x.is_finite() && y.is_finite() && z.is_finite() && z >= 0.0 => {
            Ok(ViewPoint { x_m: x, y_m: y, z_m: z })
        }
        _ => Err(format!("--at: {text:?} must be three finite numbers X,Y,Z with Z (height) 0 m or more")),
    }
}

pub fn run(a: &PointArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    let p = parse_point(&a.at)?;
    if let Some(step) = a.skyline_step_deg {
        let reach = sunlot::shadow::analysis_extent(&model).map_or(1_000.0, |r| r.width().hypot(r.height()));
        let sky = skyline(
            p,
            &model.volumes,
            &model.walls,
            &Receiver::on(&model.ground, model.plan_rotation_deg, 0.0),
            step,
            reach,
        )
        .map_err(|e| format!("--skyline-step-deg: {e}"))?;
        let mut t = Table::new(
            format!("Skyline from ({}, {}, {} m) at {}", p.x_m, p.y_m, p.z_m, model.name),
            vec!["azimuth_deg", "obstruction_altitude_deg"],
        );
        for (plan_az, alt) in sky {
            // Report true azimuths: plan azimuth minus the plan's rotation to true north.
            t.rows.push(vec![Cell::num((plan_az - model.plan_rotation_deg).rem_euclid(360.0), 2), Cell::num(alt, 3)]);
        }
        t.notes.push(
            "Azimuth clockwise from true north; altitude of the highest obstruction top in that direction.".into(),
        );
        return Ok(t.render(a.format));
    }
    let zones = ZoneArgs { zone: Some(model.zone.to_string()), fold: a.fold };
    let (instants, step_min) = match a.when.resolve(&zones, false)? {
        When::Moment(t, _) => (vec![t], None),
        When::Day { steps, step_min, .. } => (steps, Some(step_min)),
        When::Unspecified => return Err("give --time, --local or --date, or --skyline-step-deg".into()),
    };
    let mut t = Table::new(
        format!("Direct sun at ({}, {}, {} m) of {}", p.x_m, p.y_m, p.z_m, model.name),
        vec!["time", "altitude_deg", "azimuth_deg", "direct_sun", "blocked_by"],
    );
    let mut eph = Ephemeris::new();
    let delta_t = a.delta_t.delta_t()?;
    let mut sunlit_steps = 0_u32;
    let ground = Receiver::on(&model.ground, model.plan_rotation_deg, 0.0);
    for at in instants {
        let sun =
            eph.sun_at(at, delta_t).map_err(|e| input_message(&e))?.observe(&model.location, &Atmosphere::default());
        let e = exposure(
            p,
            &model.volumes,
            &model.walls,
            &ground,
            model.plan_azimuth_deg(sun.azimuth_deg),
            sun.altitude_deg,
        )
        .map_err(|e| e.to_string())?;
        let (lit, by) = match e {
            Exposure::NoSun if step_min.is_some() => continue,
            Exposure::NoSun => ("sun down", String::new()),
            Exposure::Sunlit => ("yes", String::new()),
            Exposure::Shaded { by } => ("no", by),
        };
        sunlit_steps += u32::from(lit == "yes");
        t.rows.push(vec![
            Cell::text(args::rfc3339(at, &model.zone)),
            Cell::num(sun.altitude_deg, 2),
            Cell::num(sun.azimuth_deg, 2),
            Cell::text(lit),
            Cell::text(by),
        ]);
    }
    if let Some(step) = step_min {
        let minutes = sunlit_steps * step;
        t.notes.push(format!(
            "Direct sun at {sunlit_steps} of the sun-up steps: about {}h {:02}m at {step}-minute steps.",
            minutes / 60,
            minutes % 60
        ));
    }
    t.notes.push(
        "Exact ray test against the volumes and walls; a point on a façade counts as just in front of it.".into(),
    );
    Ok(t.render(a.format))
}

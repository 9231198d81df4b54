//! `sunlot window`: a window's daylight and sunlight before and with the proposal — its vertical sky
//! component under the CIE overcast sky, and its clear-sky hours of direct sun over a period.

use clap::Args;
use sunlot::daylight::{sky_component_pct, SkyPlane, DEFAULT_AZIMUTH_STEP_DEG, UNOBSTRUCTED_VERTICAL_PCT};
use sunlot::exposure::{window_sun_hours, Massing, WindowAim};
use sunlot::rules::CAUTION;

use crate::args::DeltaTArgs;
use crate::maps::PeriodArgs;
use crate::output::{Cell, Format, Table};
use crate::point::parse_point;
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct WindowArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// A window of the site file by its id (instead of --at and --facing-deg).
    #[arg(long, conflicts_with_all = ["at", "facing_deg"])]
    pub id: Option<String>,
    /// The window's reference point on the outside face of its wall: plan x and y and height above
    /// ground, metres, as X,Y,Z (e.g. 31,12,1.2).
    #[arg(long, value_name = "X,Y,Z", allow_hyphen_values = true, requires = "facing_deg")]
    pub at: Option<String>,
    /// The direction the window faces (its wall's outward normal), degrees clockwise from true north.
    #[arg(long, allow_hyphen_values = true, requires = "at")]
    pub facing_deg: Option<f64>,
    #[command(flatten)]
    pub period: PeriodArgs,
    /// Width of the sky's azimuth bins for the sky component, degrees (0.01 to 5).
    #[arg(long, default_value_t = DEFAULT_AZIMUTH_STEP_DEG)]
    pub azimuth_step_deg: f64,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &WindowArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    let (p, facing_deg, label) = match (&a.id, &a.at, a.facing_deg) {
        (Some(id), _, _) => {
            let w = model.windows.iter().find(|w| &w.id == id).ok_or_else(|| {
                let ids: Vec<&str> = model.windows.iter().map(|w| w.id.as_str()).collect();
                format!(
                    "--id: the site has no window {id:?} (its windows: {})",
                    if ids.is_empty() { "none".into() } else { ids.join(", ") }
                )
            })?;
            let name = if w.name.is_empty() { w.id.clone() } else { w.name.clone() };
            (w.view_point(), w.facing_deg, name)
        }
        (None, Some(at), Some(facing)) => {
            let p = parse_point(at)?;
            (p, facing, format!("Window at ({}, {}, {} m)", p.x_m, p.y_m, p.z_m))
        }
        _ => return Err("give --id of a window of the site, or --at X,Y,Z and --facing-deg".into()),
    };
    let period = a.period.period()?;
    let delta_t = a.delta_t.delta_t()?;
    let plane = SkyPlane::Vertical { facing_deg };
    let mut out = Table::new(
        format!("{label} facing {facing_deg}° — {} — {}", model.name, a.period.describe()),
        vec!["massing", "vsc_pct", "sun_h", "open_sun_h", "day_h"],
    );
    let mut rows = Vec::new();
    for (name, massing) in [("existing", Massing::Existing), ("with proposal", Massing::WithProposed)] {
        let vsc = sky_component_pct(&model, p, plane, massing, a.azimuth_step_deg).map_err(|e| e.to_string())?;
        let aim = WindowAim { massing, ..WindowAim::at(p, facing_deg) };
        let sun = window_sun_hours(&model, &aim, &period, delta_t, |_| true).map_err(|e| e.to_string())?;
        out.rows.push(vec![
            Cell::text(name),
            Cell::num(vsc, 2),
            Cell::num(sun.sun_hours, 2),
            Cell::num(sun.front_hours, 2),
            Cell::num(sun.day_hours, 2),
        ]);
        rows.push((vsc, sun.sun_hours));
    }
    let ((vsc0, sun0), (vsc1, sun1)) = (rows[0], rows[1]);
    let ratio = |after: f64, before: f64| if before > 0.0 { format!("{:.2}", after / before) } else { "—".into() };
    out.notes.push(format!(
        "With the proposal / existing: sky component {}, hours of direct sun {}.",
        ratio(vsc1, vsc0),
        ratio(sun1, sun0)
    ));
    out.notes.push(format!(
        "vsc_pct: vertical sky component, the light from the visible sky of the CIE standard overcast sky on the \
         window's plane as a percentage of an unobstructed horizontal plane's ({UNOBSTRUCTED_VERTICAL_PCT:.2} % for an \
         unobstructed window). sun_h: clear-sky hours the sun is up, in front of the window and not blocked; \
         open_sun_h: the same with nothing blocking. Clear-sky hours are an upper bound of probable sunlight \
         hours, which need a local sunshine record that sunlot does not have."
    ));
    out.notes.push(CAUTION.into());
    Ok(out.render(a.format))
}

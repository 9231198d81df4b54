//! `sunlot view`: the 3-D view of a site's massing at a moment, faces shaded by the sun and the
//! shadows exact on the ground, roofs and walls, written as PNG or SVG.

use std::path::PathBuf;

use clap::Args;
use sunlot::render::{draw_massing_view, MassingLight, MassingView, VIEW_PX};
use sunlot::view3d::{check_camera, Camera, MassingScene, Projection, V3};

use crate::args;
use crate::shadows::{Loaded, SiteFileArgs};

/// Where the viewer stands by default, degrees clockwise from the plan's north, and how high.
const FROM_DEG: f64 = 210.0;
const ELEVATION_DEG: f64 = 35.0;

#[derive(Debug, Args)]
pub struct ViewArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub moment: args::MomentArgs,
    /// Where the viewer stands, degrees clockwise from the plan's north (180: looking north).
    #[arg(long, default_value_t = FROM_DEG, allow_negative_numbers = true)]
    pub view_from_deg: f64,
    /// How far above the horizon the viewer looks down from, degrees (5 to 90).
    #[arg(long, default_value_t = ELEVATION_DEG)]
    pub view_elevation_deg: f64,
    /// A perspective from this many metres from the site's centre (default: a parallel, axonometric
    /// view).
    #[arg(long, value_name = "METRES")]
    pub perspective_m: Option<f64>,
    /// Also draw the solar envelope of this lot (translucent steps every --envelope-band-m), keeping
    /// shadows off the site's gardens, terraces and amenity areas in --envelope-window on the view's date.
    #[arg(long, value_name = "LOT")]
    pub envelope_lot: Option<String>,
    /// The envelope's daily window, HH:MM-HH:MM.
    #[arg(long, default_value = sunlot::envelope::DEFAULT_ENVELOPE_WINDOW)]
    pub envelope_window: String,
    /// Height of the envelope's steps, metres.
    #[arg(long, default_value_t = sunlot::envelope::DEFAULT_BAND_M)]
    pub envelope_band_m: f64,
    /// Write the view as PNG here.
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// Write the view as SVG here.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
}

pub fn run(a: &ViewArgs) -> Result<String, String> {
    if a.png.is_none() && a.svg.is_none() {
        return Err("give --png FILE or --svg FILE for the view".into());
    }
    let Loaded { model, .. } = a.site.load()?;
    let (t, zone) = a.moment.instant(&model)?;
    let extra = match &a.envelope_lot {
        Some(lot) => envelope_treads(a, &model, lot, model.zone.local_date(t))?,
        None => Vec::new(),
    };
    let scene = MassingScene::with(&model, extra).map_err(|e| e.to_string())?;
    let centre = sunlot::view3d::scene::extent(&model).map_or(V3::new(0.0, 0.0, 0.0), |r| {
        let c = r.center();
        V3::new(c.x, c.y, 0.0)
    });
    let projection = a.perspective_m.map_or(Projection::Parallel, |distance_m| Projection::Perspective { distance_m });
    let camera =
        Camera { azimuth_deg: a.view_from_deg, elevation_deg: a.view_elevation_deg, projection, target: centre };
    check_camera(&camera).map_err(|e| match e {
        sunlot::view3d::ViewError::Camera { field, range, value } => {
            let option = match field {
                "azimuth_deg" => "--view-from-deg",
                "elevation_deg" => "--view-elevation-deg",
                _ => "--perspective-m",
            };
            format!("{option}: must be {range}, got {value}")
        }
        other => other.to_string(),
    })?;
    let sun = sunlot::solar_position(&model.location, t, &Default::default(), a.moment.delta_t.delta_t()?)
        .map_err(|e| e.to_string())?;
    let light = MassingLight::at(&model, &scene, (sun.azimuth_deg, sun.altitude_deg));
    let view = MassingView::at(&model, &scene, &light, camera, &zone.label(t));
    let mut notes = crate::figure::write_figure(VIEW_PX, a.png.as_deref(), a.svg.as_deref(), "3-D view", |d| {
        draw_massing_view(d, &view);
        Ok(())
    })?;
    let mut out = format!("3-D view of {} at {}\n", model.name, args::rfc3339(t, &zone));
    out.push_str(&format!("  {}\n", view.subtitle));
    out.push_str(&format!(
        "  {} faces drawn as {} fragments (split where they cross, for the order of drawing)\n",
        scene.faces.len(),
        scene.bsp.fragments()
    ));
    notes.push(sunlot::rules::CAUTION.into());
    for n in notes {
        out.push_str(&format!("{n}\n"));
    }
    Ok(out)
}

/// The treads of the envelope of `lot` on `date` (the envelope command's defaults otherwise).
fn envelope_treads(
    a: &ViewArgs,
    model: &sunlot::site::SiteModel,
    lot: &str,
    date: chrono::NaiveDate,
) -> Result<Vec<sunlot::view3d::Face3>, String> {
    use sunlot::envelope::{default_protected, height_bands, solar_envelope, EnvelopeRequest};
    use sunlot::exposure::{Grid, Period, DEFAULT_LONG_STEP_MIN, DEFAULT_MAX_CELLS};
    let area = crate::maps::pick_areas(model, std::slice::from_ref(&lot.to_string()), "--envelope-lot")?[0];
    let protected: Vec<_> = default_protected(model, &area.id).iter().map(|x| x.polygon.clone()).collect();
    if protected.is_empty() {
        return Err("--envelope-lot: the site has no gardens, terraces or amenity areas to keep shadows off".into());
    }
    let grid = Grid::over_polygon(&area.polygon, sunlot::envelope::DEFAULT_ENVELOPE_CELL_M, DEFAULT_MAX_CELLS)
        .map_err(|e| format!("--envelope-lot: {e}"))?;
    let window = crate::maps::window(&a.envelope_window, "--envelope-window")?;
    let req = EnvelopeRequest {
        model,
        grid: &grid,
        protected: &protected,
        period: Period { first: date, last: date, window, step_min: DEFAULT_LONG_STEP_MIN },
        max_height_m: sunlot::envelope::DEFAULT_MAX_HEIGHT_M,
        height_step_m: sunlot::envelope::DEFAULT_HEIGHT_STEP_M,
        delta_t: a.moment.delta_t.delta_t()?,
    };
    let env = solar_envelope(&req, |_| true).map_err(|e| e.to_string())?;
    Ok(sunlot::view3d::scene::envelope_faces(&area.id, &height_bands(&grid, &env, a.envelope_band_m)))
}

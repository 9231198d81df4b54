//! `sunlot view`: the 3-D view of a site's massing at a moment, faces shaded by the sun and the
//! shadows exact on the ground, roofs and walls, written as PNG or SVG.

use std::path::PathBuf;

use clap::Args;
use sunlot::render::{draw_massing_view, MassingLight, MassingView, VIEW_PX};
use sunlot::view3d::{Camera, MassingScene};

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
        Some(lot) => {
            let window = crate::maps::window(&a.envelope_window, "--envelope-window")?;
            let date = model.zone.local_date(t);
            sunlot::view3d::envelope_treads(&model, lot, date, window, a.envelope_band_m, a.moment.delta_t.delta_t()?)
                .map_err(|e| format!("--envelope-lot: {e}"))?
        }
        None => Vec::new(),
    };
    let scene = MassingScene::with(&model, extra).map_err(|e| e.to_string())?;
    let camera =
        Camera::checked(a.view_from_deg, a.view_elevation_deg, a.perspective_m, scene.centre).map_err(|e| match e {
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

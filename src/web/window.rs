//! A window's daylight and sunlight for pages (wasm32 only): its vertical sky component and clear-sky
//! hours of direct sun, existing and with the proposal. Takes the site as text; errors name the field.

use serde::{Deserialize, Serialize};
use wasm_bindgen::prelude::*;

use super::defaults;
use super::maps::date;
use super::{err, read, site, write};
use crate::daylight::{sky_component_pct, SkyPlane, DEFAULT_AZIMUTH_STEP_DEG};
use crate::exposure::{window_sun_hours, Massing, Period, Window, WindowAim};
use crate::time::DeltaT;

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct WindowIn {
    site: String,
    /// A window of the site by id …
    id: Option<String>,
    /// … or its reference point (plan metres, height above ground) and facing (degrees from true north).
    x_m: Option<f64>,
    y_m: Option<f64>,
    z_m: Option<f64>,
    facing_deg: Option<f64>,
    date: String,
    to: Option<String>,
    #[serde(default = "defaults::step_min")]
    step_min: u32,
    azimuth_step_deg: Option<f64>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct LightOut {
    vsc_pct: f64,
    sun_h: f64,
    open_sun_h: f64,
    day_h: f64,
}

/// `{facingDeg, existing: {vscPct, sunH, openSunH, dayH}, withProposed: {…}}`: the vertical sky
/// component under the CIE overcast sky (percent of an unobstructed horizontal plane's light) and the
/// clear-sky hours of direct sun over `date`…`to` (sun up, in front of the window, not blocked;
/// `openSunH` with nothing blocking).
#[wasm_bindgen(js_name = windowLight, unchecked_return_type = "WindowLight")]
pub fn window_light(
    #[wasm_bindgen(unchecked_param_type = "WindowLightInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: WindowIn = read(input, "windowLight")?;
    let model = site(&i.site)?;
    let (point, facing_deg) = match (&i.id, i.x_m, i.y_m, i.facing_deg) {
        (Some(id), None, None, None) => {
            let w = model
                .windows
                .iter()
                .find(|w| &w.id == id)
                .ok_or_else(|| JsError::new(&format!("id: the site has no window {id:?}")))?;
            (w.view_point(), w.facing_deg)
        }
        (None, Some(x_m), Some(y_m), Some(f)) => {
            // Checked as a window of the site would be (extent, height, facing 0–360°).
            let at = geo::Coord { x: x_m, y: y_m };
            let w = crate::site::WindowPoint {
                id: "xM, yM, zM, facingDeg".into(),
                name: String::new(),
                status: crate::site::Status::Existing,
                at,
                z_m: i.z_m.unwrap_or(0.0),
                facing_deg: f,
                opening_width_m: 1.0,
                opening_height_m: 1.0,
            }
            .checked()
            .map_err(err)?;
            (w.view_point(), w.facing_deg)
        }
        _ => return Err(JsError::new("id, xM, yM, facingDeg: give the id of a window, or xM, yM and facingDeg")),
    };
    let first = date(&i.date, "date")?;
    let last = i.to.as_deref().map_or(Ok(first), |t| date(t, "to"))?;
    let period = Period { first, last, window: Window::Daylight, step_min: i.step_min };
    let step = i.azimuth_step_deg.unwrap_or(DEFAULT_AZIMUTH_STEP_DEG);
    let light = |massing| -> Result<LightOut, JsError> {
        let vsc = sky_component_pct(&model, point, SkyPlane::Vertical { facing_deg }, massing, step).map_err(err)?;
        let aim = WindowAim { massing, ..WindowAim::at(point, facing_deg) };
        let sun = window_sun_hours(&model, &aim, &period, DeltaT::EspenakMeeus, |_| true).map_err(err)?;
        Ok(LightOut { vsc_pct: vsc, sun_h: sun.sun_hours, open_sun_h: sun.front_hours, day_h: sun.day_hours })
    };
    #[derive(Serialize)]
    #[serde(rename_all = "camelCase")]
    struct Out {
        facing_deg: f64,
        existing: LightOut,
        with_proposed: LightOut,
    }
    write(&Out { facing_deg, existing: light(Massing::Existing)?, with_proposed: light(Massing::WithProposed)? })
}

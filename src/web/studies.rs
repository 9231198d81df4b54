//! Studies of a site for report pages (wasm32 only): the hourly shadow-length table, a point's year
//! and a point's sky-view factor. Each call takes the site as text; errors name the field.

use serde::Deserialize;
use wasm_bindgen::prelude::*;

use super::defaults;
use super::maps::{date, massing_of};
use super::outputs::{MonthFigures, ShadowTableRow, YearProfile};
use super::{err, read, site, write};
use crate::shadow::ViewPoint;
use crate::time::DeltaT;

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct TableIn {
    site: String,
    date: String,
    #[serde(default = "defaults::table_step_min")]
    step_min: u32,
}

/// The shadow-length table of a day: `[{time, altitudeDeg, azimuthDeg, shadowLengthMPerM, shadowAzimuthDeg,
/// tipsM: {volumeId: metres}}]` from sunrise to sunset every `stepMin` minutes (default 60) from local
/// midnight; times local RFC 3339. Shadow length per metre of height is 1 / tan(altitude) on flat ground.
#[wasm_bindgen(js_name = shadowTable, unchecked_return_type = "ShadowTableRow[]")]
pub fn shadow_table_js(
    #[wasm_bindgen(unchecked_param_type = "ShadowTableInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: TableIn = read(input, "shadowTable")?;
    let model = site(&i.site)?;
    let rows =
        crate::shadow::shadow_table(&model, date(&i.date, "date")?, i.step_min, DeltaT::EspenakMeeus).map_err(err)?;
    let out: Vec<ShadowTableRow> = rows
        .iter()
        .map(|r| ShadowTableRow {
            time: super::stamp(r.time, &model.zone),
            altitude_deg: r.altitude_deg,
            azimuth_deg: r.azimuth_deg,
            shadow_length_m_per_m: r.shadow_length_m_per_m,
            shadow_azimuth_deg: r.shadow_azimuth_deg,
            tips_m: r.tips_m.clone(),
        })
        .collect();
    write(&out)
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct YearIn {
    site: String,
    x_m: f64,
    y_m: f64,
    #[serde(default)]
    z_m: f64,
    year: Option<i32>,
    #[serde(default = "defaults::long_step_min")]
    step_min: u32,
    massing: Option<String>,
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct SkyViewIn {
    site: String,
    x_m: f64,
    y_m: f64,
    #[serde(default)]
    z_m: f64,
    massing: Option<String>,
    /// Sky patch size, degrees.
    sky_step_deg: Option<f64>,
}

/// A point's year: `{year, skyView, months: [{month, sunHours, openHours, kwhM2, openKwhM2}]}` — hours
/// of direct sun and clear-sky horizontal insolation per month at the point against an open point.
#[wasm_bindgen(js_name = yearProfile, unchecked_return_type = "YearProfile")]
pub fn year_profile_js(
    #[wasm_bindgen(unchecked_param_type = "YearProfileInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: YearIn = read(input, "yearProfile")?;
    let model = site(&i.site)?;
    let year = i.year.ok_or_else(|| JsError::new("year: missing"))?;
    let req = crate::exposure::YearProfileRequest {
        model: &model,
        point: ViewPoint { x_m: i.x_m, y_m: i.y_m, z_m: i.z_m },
        year,
        step_min: i.step_min,
        massing: massing_of(i.massing.as_deref())?,
        atmosphere: crate::sky::BirdAtmosphere::default(),
        delta_t: DeltaT::EspenakMeeus,
    };
    let p = crate::exposure::year_profile(&req, super::maps::progress(&on_progress)).map_err(err)?;
    let months = p
        .months
        .iter()
        .map(|m| MonthFigures {
            month: m.month,
            sun_hours: m.sun_hours,
            open_hours: m.open_hours,
            kwh_m2: m.kwh_m2,
            open_kwh_m2: m.open_kwh_m2,
        })
        .collect();
    write(&YearProfile { year: p.year, sky_view: p.sky_view, months })
}

/// A point's sky-view factor (0–1, the cosine-weighted share of the sky it sees past the massing,
/// in patches of `skyStepDeg`, default 5°).
#[wasm_bindgen(js_name = skyView)]
pub fn sky_view_js(#[wasm_bindgen(unchecked_param_type = "SkyViewInput")] input: JsValue) -> Result<f64, JsError> {
    let i: SkyViewIn = read(input, "skyView")?;
    let model = site(&i.site)?;
    crate::exposure::sky_view_at(
        &model,
        ViewPoint { x_m: i.x_m, y_m: i.y_m, z_m: i.z_m },
        massing_of(i.massing.as_deref())?,
        i.sky_step_deg.unwrap_or(crate::exposure::DEFAULT_SKY_STEP_DEG),
    )
    .map_err(err)
}

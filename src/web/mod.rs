//! The JavaScript facade (wasm32 only): plain objects in, plain objects out, errors as `Error`s.
//!
//! It parses, calls the core and converts; it owns no maths. Field names on the JavaScript side are
//! camelCase with the unit in the name (`latitudeDeg`, `pressureHpa`), times are RFC 3339 strings.

use chrono::{DateTime, Utc};
use serde::{Deserialize, Serialize};
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;

mod canvas;
mod defaults;
mod facade;
mod kinds;
mod layer;
mod maps;
mod massing;
mod outputs;
mod rules;
mod studies;
mod types;
mod window;
pub use canvas::{draw_shadow_plan_js, draw_sky_chart_js, shadow_plan_svg, shadows_geojson, sky_chart_svg, Canvas};
pub use facade::{draw_facade, facade_map_js, facade_svg};
pub use kinds::{join_map_parts, map_kinds, map_of_kind};
pub use layer::{map_geojson_js, underlay_placement, PlanLayer};
pub use maps::{
    compare_map, draw_map_figure, insolation_map, point_timeline, read_site, solar_envelope_js, sun_hours_map,
};
pub use massing::MassingViewer;
pub use rules::{check_rule_js, check_windows_js, rule_presets};
pub use studies::{shadow_table_js, sky_view_js, year_profile_js};
pub use window::window_light;

use crate::sky::{bird_clear_sky, extraterrestrial_normal_w_m2, relative_air_mass_kasten_young, BirdAtmosphere};
use crate::solar::{self, Atmosphere, Crossing, Site, SunAtInstant};
use crate::time::{parse_instant, DeltaT, Fold, Zone};

/// A serde error from reading a JavaScript object, as a thrown `Error` naming the call and the field's
/// path in the caller's terms (`checkRule: rule.minRatio: invalid type: …`).
fn read<T: for<'de> Deserialize<'de>>(value: JsValue, what: &str) -> Result<T, JsError> {
    serde_path_to_error::deserialize(serde_wasm_bindgen::Deserializer::from(value)).map_err(|e| {
        let path = e.path().to_string();
        if path.is_empty() || path == "." {
            JsError::new(&format!("{what}: {}", e.inner()))
        } else {
            JsError::new(&format!("{what}: {path}: {}", e.inner()))
        }
    })
}

fn write<T: Serialize>(value: &T) -> Result<JsValue, JsError> {
    value.serialize(&serde_wasm_bindgen::Serializer::json_compatible()).map_err(|e| JsError::new(&e.to_string()))
}

/// A site from its text (site file or GeoJSON), with whether it came from GeoJSON; the error names
/// the bad feature under `site:`.
fn read_site_text(text: &str) -> Result<crate::site::ReadSite, JsError> {
    crate::site::SiteModel::read(text).map_err(|e| JsError::new(&format!("site: {e}")))
}

/// A site from its text, as [`read_site_text`], without where it came from.
fn site(text: &str) -> Result<crate::site::SiteModel, JsError> {
    read_site_text(text).map(|r| r.model)
}

/// Reads an input whose members belong to two types: `B`'s members (`b_keys`) are taken out of the
/// object first, so each part is read with its own field paths (serde's `flatten` loses them) and its
/// own unknown-member check.
fn read_split<A: for<'de> Deserialize<'de>, B: for<'de> Deserialize<'de>>(
    value: JsValue,
    what: &str,
    b_keys: &[&str],
) -> Result<(A, B), JsError> {
    if !value.is_object() || js_sys::Array::is_array(&value) {
        return Err(read::<A>(value, what).err().unwrap_or_else(|| JsError::new(&format!("{what}: not an object"))));
    }
    let (a, b) = (js_sys::Object::new(), js_sys::Object::new());
    for key in js_sys::Object::keys(value.unchecked_ref::<js_sys::Object>()).iter() {
        let v = js_sys::Reflect::get(&value, &key).unwrap_or(JsValue::UNDEFINED);
        let to_b = key.as_string().is_some_and(|k| b_keys.contains(&k.as_str()));
        let _ = js_sys::Reflect::set(if to_b { &b } else { &a }, &key, &v);
    }
    Ok((read(a.into(), what)?, read(b.into(), what)?))
}

/// A string argument given as any JavaScript value; anything but a string is an error naming `field`.
fn text_arg(value: &JsValue, field: &str) -> Result<String, JsError> {
    value.as_string().ok_or_else(|| {
        let kind = value.js_typeof().as_string().unwrap_or_default();
        JsError::new(&format!("{field}: must be text (a string), got a {kind}"))
    })
}

fn err(e: impl std::fmt::Display) -> JsError {
    JsError::new(&e.to_string())
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct PositionIn {
    latitude_deg: f64,
    longitude_deg: f64,
    #[serde(default)]
    elevation_m: f64,
    /// RFC 3339 with offset.
    time: Option<String>,
    /// Local wall-clock `YYYY-MM-DDTHH:MM[:SS]` in `zone` (instead of `time`).
    local_time: Option<String>,
    /// IANA name or offset: the zone of `localTime`, and of the output time.
    zone: Option<String>,
    /// "earlier" or "later" for a repeated local time.
    fold: Option<String>,
    pressure_hpa: Option<f64>,
    temperature_c: Option<f64>,
    refraction: Option<bool>,
    delta_t_s: Option<f64>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct PositionOut {
    time: String,
    zone: String,
    zenith_deg: f64,
    altitude_deg: f64,
    azimuth_deg: f64,
    altitude_unrefracted_deg: f64,
    declination_deg: f64,
    hour_angle_deg: f64,
    right_ascension_deg: f64,
    equation_of_time_min: f64,
    earth_sun_distance_au: f64,
    delta_t_s: f64,
    sun_up: bool,
}

fn delta_t(s: Option<f64>) -> DeltaT {
    s.map_or(DeltaT::EspenakMeeus, DeltaT::Seconds)
}

fn zone(text: Option<&str>) -> Result<Option<Zone>, JsError> {
    text.map(|z| z.parse::<Zone>().map_err(|e| JsError::new(&format!("zone: {e}")))).transpose()
}

fn fold(text: Option<&str>) -> Result<Fold, JsError> {
    match text {
        None => Ok(Fold::Reject),
        Some("earlier") => Ok(Fold::Earlier),
        Some("later") => Ok(Fold::Later),
        Some(other) => Err(JsError::new(&format!("fold: expected \"earlier\" or \"later\", got {other:?}"))),
    }
}

fn stamp(t: DateTime<Utc>, zone: &Zone) -> String {
    zone.local(t).to_rfc3339_opts(chrono::SecondsFormat::Secs, true)
}

/// The sun's position (NREL SPA) for `{latitudeDeg, longitudeDeg, elevationM?, time | localTime, zone?, fold?,
/// pressureHpa?, temperatureC?, refraction?, deltaTS?}`. Angles in degrees, azimuth clockwise from north.
#[wasm_bindgen(js_name = solarPosition, unchecked_return_type = "SolarPosition")]
pub fn solar_position(
    #[wasm_bindgen(unchecked_param_type = "SolarPositionInput")] input: JsValue,
) -> Result<JsValue, JsError> {
    let i: PositionIn = read(input, "solarPosition")?;
    let site = Site::new(i.latitude_deg, i.longitude_deg, i.elevation_m).map_err(err)?;
    let d = Atmosphere::default();
    let air = Atmosphere::new(
        i.pressure_hpa.unwrap_or(d.pressure_hpa),
        i.temperature_c.unwrap_or(d.temperature_c),
        i.refraction.unwrap_or(true),
    )
    .map_err(err)?;
    let z = zone(i.zone.as_deref())?;
    let (t, z) = match (&i.time, &i.local_time, z) {
        (Some(_), Some(_), _) => return Err(JsError::new("solarPosition: give either time or localTime, not both")),
        (Some(text), None, z) => {
            let (t, written) = parse_instant(text).map_err(err)?;
            (t, z.unwrap_or(written))
        }
        (None, Some(text), Some(z)) => (
            z.parse_local(text, fold(i.fold.as_deref())?)
                .map_err(|e| JsError::new(&format!("localTime, fold: {e}")))?,
            z,
        ),
        (None, Some(_), None) => return Err(JsError::new("solarPosition: localTime needs a zone")),
        (None, None, _) => {
            return Err(JsError::new("solarPosition: missing field `time` (RFC 3339) or `localTime` with `zone`"))
        }
    };
    let dt = delta_t(i.delta_t_s);
    let p = SunAtInstant::new(t, dt).map_err(err)?.observe(&site, &air);
    write(&PositionOut {
        time: stamp(t, &z),
        zone: z.to_string(),
        zenith_deg: p.zenith_deg,
        altitude_deg: p.altitude_deg,
        azimuth_deg: p.azimuth_deg,
        altitude_unrefracted_deg: p.altitude_unrefracted_deg,
        declination_deg: p.declination_deg,
        hour_angle_deg: p.hour_angle_deg,
        right_ascension_deg: p.right_ascension_deg,
        equation_of_time_min: p.equation_of_time_min,
        earth_sun_distance_au: p.earth_sun_distance_au,
        delta_t_s: p.delta_t_s,
        sun_up: p.is_up(),
    })
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct DayIn {
    latitude_deg: f64,
    longitude_deg: f64,
    #[serde(default)]
    elevation_m: f64,
    /// Local date `YYYY-MM-DD`.
    date: String,
    zone: String,
    delta_t_s: Option<f64>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct DayOut {
    date: String,
    zone: String,
    /// "risesAndSets", "alwaysUp" (polar day) or "alwaysDown" (polar night).
    sun: &'static str,
    sunrise: Option<String>,
    solar_noon: String,
    sunset: Option<String>,
    day_length_h: f64,
    noon_altitude_deg: f64,
    civil_dawn: Option<String>,
    civil_dusk: Option<String>,
}

/// Sunrise, solar noon, sunset, day length (hours) and civil twilight for `{latitudeDeg, longitudeDeg,
/// elevationM?, date, zone, deltaTS?}`; times are RFC 3339 in `zone`, `null` when the sun does not cross.
#[wasm_bindgen(js_name = dayEvents, unchecked_return_type = "DayEvents")]
pub fn day_events(#[wasm_bindgen(unchecked_param_type = "DayEventsInput")] input: JsValue) -> Result<JsValue, JsError> {
    let i: DayIn = read(input, "dayEvents")?;
    let site = Site::new(i.latitude_deg, i.longitude_deg, i.elevation_m).map_err(err)?;
    let z = zone(Some(&i.zone))?.unwrap_or_else(Zone::utc);
    let date = Zone::parse_date(&i.date).map_err(err)?;
    let ev = solar::day_events(&site, date, &z, delta_t(i.delta_t_s)).map_err(err)?;
    let pair = |c: &Crossing| match c {
        Crossing::Crosses { rise, set } => (Some(stamp(*rise, &z)), Some(stamp(*set, &z))),
        _ => (None, None),
    };
    let (sunrise, sunset) = pair(&ev.sun);
    let (civil_dawn, civil_dusk) = pair(&ev.civil_twilight);
    write(&DayOut {
        date: i.date.clone(),
        zone: z.to_string(),
        sun: match ev.sun {
            Crossing::Crosses { .. } => "risesAndSets",
            Crossing::AlwaysAbove => "alwaysUp",
            Crossing::AlwaysBelow => "alwaysDown",
        },
        sunrise,
        solar_noon: stamp(ev.transit, &z),
        sunset,
        day_length_h: ev.day_length().num_milliseconds() as f64 / 3.6e6,
        noon_altitude_deg: ev.transit_altitude_deg,
        civil_dawn,
        civil_dusk,
    })
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct SeasonsOut {
    year: i32,
    march_equinox: String,
    june_solstice: String,
    september_equinox: String,
    december_solstice: String,
}

/// The equinox and solstice instants of `year`, as RFC 3339 strings in `zone` (UTC when omitted).
#[wasm_bindgen(js_name = seasonInstants, unchecked_return_type = "SeasonInstants")]
pub fn season_instants(
    year: f64,
    #[wasm_bindgen(unchecked_param_type = "string | undefined")] zone_name: JsValue,
) -> Result<JsValue, JsError> {
    // Both taken as any value and checked: an `Option<String>` given a number traps in the glue code,
    // and an `i32` turns NaN or 2026.5 into a year silently.
    if !(year.fract() == 0.0 && year.abs() <= 1e6) {
        return Err(JsError::new(&format!("year: must be a whole year, got {year}")));
    }
    let year = year as i32;
    let zone_name =
        if zone_name.is_undefined() || zone_name.is_null() { None } else { Some(text_arg(&zone_name, "zone")?) };
    let z = zone(zone_name.as_deref())?.unwrap_or_else(Zone::utc);
    let s = solar::season_instants(year, DeltaT::EspenakMeeus).map_err(err)?;
    write(&SeasonsOut {
        year,
        march_equinox: stamp(s.march_equinox, &z),
        june_solstice: stamp(s.june_solstice, &z),
        september_equinox: stamp(s.september_equinox, &z),
        december_solstice: stamp(s.december_solstice, &z),
    })
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct ClearSkyIn {
    zenith_deg: f64,
    day_of_year: u32,
    #[serde(default)]
    atmosphere: Option<AtmosphereIn>,
}

/// The Bird model's atmosphere with JavaScript names; each field falls back to the core's default.
#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct AtmosphereIn {
    aod380: Option<f64>,
    aod500: Option<f64>,
    precipitable_water_cm: Option<f64>,
    ozone_cm: Option<f64>,
    forward_scattering: Option<f64>,
    albedo: Option<f64>,
    pressure_hpa: Option<f64>,
}

impl AtmosphereIn {
    fn atmosphere(&self) -> BirdAtmosphere {
        let d = BirdAtmosphere::default();
        BirdAtmosphere {
            aod_380: self.aod380.unwrap_or(d.aod_380),
            aod_500: self.aod500.unwrap_or(d.aod_500),
            precipitable_water_cm: self.precipitable_water_cm.unwrap_or(d.precipitable_water_cm),
            ozone_cm: self.ozone_cm.unwrap_or(d.ozone_cm),
            forward_scattering: self.forward_scattering.unwrap_or(d.forward_scattering),
            albedo: self.albedo.unwrap_or(d.albedo),
            pressure_hpa: self.pressure_hpa.unwrap_or(d.pressure_hpa),
        }
    }
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct ClearSkyOut {
    air_mass: Option<f64>,
    extraterrestrial_w_m2: f64,
    dni_w_m2: f64,
    dhi_w_m2: f64,
    ghi_w_m2: f64,
}

/// Bird clear-sky irradiance (W/m²) for `{zenithDeg, dayOfYear, atmosphere?}`; `atmosphere` may set
/// `aod380`, `aod500`, `precipitableWaterCm`, `ozoneCm`, `forwardScattering`, `albedo`, `pressureHpa`
/// (defaults: a clear rural sky, see the core's `BirdAtmosphere`).
#[wasm_bindgen(js_name = clearSky, unchecked_return_type = "ClearSky")]
pub fn clear_sky(#[wasm_bindgen(unchecked_param_type = "ClearSkyInput")] input: JsValue) -> Result<JsValue, JsError> {
    let i: ClearSkyIn = read(input, "clearSky")?;
    if !i.zenith_deg.is_finite() {
        return Err(JsError::new(&format!("clearSky: zenithDeg must be a finite number, got {}", i.zenith_deg)));
    }
    if !(1..=366).contains(&i.day_of_year) {
        return Err(JsError::new(&format!("clearSky: dayOfYear must be 1 to 366, got {}", i.day_of_year)));
    }
    let atm = i.atmosphere.map_or_else(BirdAtmosphere::default, |a| a.atmosphere()).validated().map_err(err)?;
    let e0 = extraterrestrial_normal_w_m2(i.day_of_year);
    let s = bird_clear_sky(i.zenith_deg, e0, &atm);
    write(&ClearSkyOut {
        air_mass: relative_air_mass_kasten_young(i.zenith_deg),
        extraterrestrial_w_m2: e0,
        dni_w_m2: s.dni_w_m2,
        dhi_w_m2: s.dhi_w_m2,
        ghi_w_m2: s.ghi_w_m2,
    })
}

/// The built-in, invented demo site as site-file text.
#[wasm_bindgen(js_name = demoSiteText)]
pub fn demo_site_text() -> String {
    crate::demo::DEMO_SITE_JSON.to_string()
}

//! A point's year: hours of direct sun and clear-sky insolation per month.
//!
//! # Method
//! Every day of the year is cut into sun-up steps (see [`super::period`]); at each the exact ray test
//! decides direct sun, and the Bird clear sky gives the beam on the horizontal (counted when sunlit)
//! and the diffuse horizontal (counted times the point's sky-view factor, see [`super::sky_view`]).
//! Figures are for a horizontal surface at the point, like the maps.

use chrono::{Datelike, NaiveDate};
use serde::Serialize;

use super::grid::ExposureError;
use super::insolation::{beam_horizontal_w_m2, step_sky};
use super::period::{Period, Window};
use super::shade::Massing;
use super::sky_view::sky_view_at;
use super::sun_hours::{for_each_day, MIN_CAST_ALTITUDE_DEG};
use super::timeline::PointSky;
use crate::shadow::{Exposure, ViewPoint};
use crate::site::SiteModel;
use crate::sky::BirdAtmosphere;
use crate::time::DeltaT;

/// One month of a point's year.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MonthProfile {
    /// Month, 1–12.
    pub month: u32,
    /// Hours of direct sun at the point.
    pub sun_hours: f64,
    /// Hours the sun is up (what an open point would get).
    pub open_hours: f64,
    /// Clear-sky insolation at the point (horizontal), kWh/m².
    pub kwh_m2: f64,
    /// Clear-sky GHI integral (an open point), kWh/m².
    pub open_kwh_m2: f64,
}

/// A point's year.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct YearProfile {
    /// The year.
    pub year: i32,
    /// Sky-view factor at the point, 0–1.
    pub sky_view: f64,
    /// January to December.
    pub months: Vec<MonthProfile>,
}

/// What a year profile is of.
#[derive(Debug, Clone)]
pub struct YearProfileRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The point, plan metres and height.
    pub point: ViewPoint,
    /// The calendar year.
    pub year: i32,
    /// Time step, minutes.
    pub step_min: u32,
    /// Which volumes stand.
    pub massing: Massing,
    /// The clear sky (Bird) of the insolation.
    pub atmosphere: BirdAtmosphere,
    /// ΔT model.
    pub delta_t: DeltaT,
}

/// The year profile of the request's point.
///
/// # Errors
/// [`ExposureError`] for a bad step, a year the solar engine refuses, a bad atmosphere, a non-finite
/// point, or a cancelled run.
pub fn year_profile(
    req: &YearProfileRequest,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<YearProfile, ExposureError> {
    let YearProfileRequest { model, point, year, step_min, massing, ref atmosphere, delta_t } = *req;
    let bad_year = || ExposureError::Period(format!("year {year} is out of range"));
    let first = NaiveDate::from_ymd_opt(year, 1, 1).ok_or_else(bad_year)?;
    let last = NaiveDate::from_ymd_opt(year, 12, 31).ok_or_else(bad_year)?;
    let period = Period { first, last, window: Window::Daylight, step_min };
    period.check(model, delta_t)?;
    crate::limits::ray_tests(
        "step_min",
        period.max_steps(),
        model.volumes.len() + model.walls.len(),
        "use a longer step",
    )?;
    let atm = atmosphere.validated()?;
    let sky_view = sky_view_at(model, point, massing, super::sky_view::DEFAULT_SKY_STEP_DEG)?;
    let sky = PointSky::new(model, point, massing, delta_t);
    let mut months: Vec<MonthProfile> = (1..=12)
        .map(|month| MonthProfile { month, sun_hours: 0.0, open_hours: 0.0, kwh_m2: 0.0, open_kwh_m2: 0.0 })
        .collect();
    for_each_day(model, &period, delta_t, &mut progress, |date, steps| {
        let m = &mut months[date.month0() as usize];
        for s in &steps {
            let cs = step_sky(s, &atm);
            let beam_kwh = beam_horizontal_w_m2(&cs, s) * s.dt_s / 3.6e6;
            let diffuse_kwh = (cs.ghi_w_m2 * s.dt_s / 3.6e6 - beam_kwh).max(0.0);
            m.open_hours += s.dt_s / 3600.0;
            m.open_kwh_m2 += beam_kwh + diffuse_kwh;
            m.kwh_m2 += diffuse_kwh * sky_view;
            let az = model.plan_azimuth_deg(s.sun.azimuth_deg);
            if sky.toward(az, s.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG))? == Exposure::Sunlit {
                m.sun_hours += s.dt_s / 3600.0;
                m.kwh_m2 += beam_kwh;
            }
        }
        Ok(())
    })?;
    Ok(YearProfile { year, sky_view, months })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn open_point_gets_every_hour_and_more_sun_in_summer() {
        let mut m = crate::demo::demo();
        m.volumes.clear();
        m.walls.clear();
        m.ground = crate::site::Ground::flat();
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 };
        let req = YearProfileRequest {
            model: &m,
            point: p,
            year: 2026,
            step_min: 30,
            massing: Massing::WithProposed,
            atmosphere: BirdAtmosphere::default(),
            delta_t: DeltaT::EspenakMeeus,
        };
        let y = year_profile(&req, |_| true).unwrap();
        assert_eq!(y.sky_view, 1.0);
        for mp in &y.months {
            assert!((mp.sun_hours - mp.open_hours).abs() < 1e-9);
            assert!((mp.kwh_m2 - mp.open_kwh_m2).abs() < 1e-9);
        }
        // Northern site: June gets more sun than December (common practice).
        assert!(y.months[5].open_kwh_m2 > 3.0 * y.months[11].open_kwh_m2);
    }
}

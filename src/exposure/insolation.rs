//! Clear-sky insolation per cell: the energy a horizontal cell receives over a period, kWh/m².
//!
//! # Method
//! At each sun-up step of the period (see [`super::period`]) the Bird clear-sky model gives the beam
//! on the horizontal, DNI·cos z, and the diffuse horizontal DHI (Bird & Hulstrom 1981, with the
//! ground–sky multiple reflection, so beam + diffuse = GHI). A cell gets the beam while it is in
//! direct sun (the shadows of the step rasterised as for sun hours) and the diffuse times its
//! sky-view factor (see [`super::sky_view`]), so an unobstructed cell receives the GHI integral.
//! Each step's irradiance is taken at its midpoint and held for the step (midpoint rule). Energy is
//! per m² of horizontal plane, on sloping ground too; light reflected by the massing is not counted.

use serde::Serialize;

use super::cell_values::CellValues;
use super::grid::{ExposureError, Grid};
use super::period::{Period, Step};
use super::shade::{Cast, Massing, ShadeSums};
use super::sky_view::sky_view_map;
use super::sun_hours::{check_plane, for_each_day, step_offset};
use crate::shadow::Receiver;
use crate::site::SiteModel;
use crate::sky::{bird_clear_sky, extraterrestrial_normal_w_m2, BirdAtmosphere, ClearSky};
use crate::time::DeltaT;

/// Joules per kilowatt-hour.
const J_PER_KWH: f64 = 3.6e6;

/// What to compute.
#[derive(Debug, Clone)]
pub struct InsolationRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The cells.
    pub grid: &'a Grid,
    /// Dates, daily window and step.
    pub period: Period,
    /// Height of the receiving plane above the ground, metres.
    pub plane_m: f64,
    /// ΔT.
    pub delta_t: DeltaT,
    /// Which massing casts shadows and hides sky.
    pub massing: Massing,
    /// The clear atmosphere.
    pub atmosphere: BirdAtmosphere,
    /// Sky patch size for the sky-view factor, degrees.
    pub sky_step_deg: f64,
}

/// Insolation per cell; every map is row-major as the grid with `None` outside the area.
#[derive(Debug, Clone, PartialEq)]
pub struct Insolation {
    /// Beam plus diffuse, kWh/m².
    pub total_kwh_m2: CellValues,
    /// Beam on the horizontal while in direct sun, kWh/m².
    pub beam_kwh_m2: CellValues,
    /// Diffuse times the sky-view factor, kWh/m².
    pub diffuse_kwh_m2: CellValues,
    /// Sky-view factor, 0–1.
    pub sky_view: CellValues,
    /// Hours of direct sun.
    pub sun_hours: CellValues,
    /// What an unobstructed cell receives.
    pub open: OpenSky,
}

/// What an unobstructed horizontal cell receives over the period.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct OpenSky {
    /// GHI integral, kWh/m².
    pub total_kwh_m2: f64,
    /// Beam on the horizontal, kWh/m².
    pub beam_kwh_m2: f64,
    /// Diffuse horizontal, kWh/m².
    pub diffuse_kwh_m2: f64,
    /// Hours of sun.
    pub sun_hours: f64,
}

/// The Bird clear sky at a step's sun.
pub(crate) fn step_sky(s: &Step, atm: &BirdAtmosphere) -> ClearSky {
    use chrono::Datelike;
    bird_clear_sky(s.sun.zenith_deg, extraterrestrial_normal_w_m2(s.mid.ordinal()), atm)
}

/// Beam on the horizontal, W/m².
pub(crate) fn beam_horizontal_w_m2(sky: &ClearSky, s: &Step) -> f64 {
    (sky.dni_w_m2 * s.sun.zenith_deg.to_radians().cos()).max(0.0)
}

/// Insolation per cell. `progress` is told the fraction done and may return `false` to cancel.
///
/// # Errors
/// [`ExposureError`] for a bad period, plane, atmosphere or sky step (before any work), or a
/// cancelled run.
pub fn insolation(req: &InsolationRequest, mut progress: impl FnMut(f64) -> bool) -> Result<Insolation, ExposureError> {
    req.period.check(req.model, req.delta_t)?;
    req.period.check_work(req.grid.inside_count())?;
    check_plane(req.plane_m)?;
    let atm = req.atmosphere.validated()?;
    let (g, model) = (req.grid, req.model);
    let sky_view = sky_view_map(model, g, req.plane_m, req.massing, req.sky_step_deg)?;
    if !progress(0.05) {
        return Err(ExposureError::Cancelled);
    }
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, req.plane_m);
    let mut sums = ShadeSums::<2>::new(model, g, receiver, req.massing);
    let mut open = OpenSky::default();
    let (mut open_ms, mut open_mj) = (0.0_f64, 0.0_f64);
    let mut batch: Vec<Cast<2>> = Vec::new();
    for_each_day(model, &req.period, req.delta_t, &mut |f| progress(0.05 + 0.95 * f), |_, day| {
        for s in &day {
            let sky = step_sky(s, &atm);
            let beam_j = beam_horizontal_w_m2(&sky, s) * s.dt_s;
            open.diffuse_kwh_m2 += (sky.ghi_w_m2 * s.dt_s - beam_j).max(0.0) / J_PER_KWH;
            if let Some(o) = step_offset(model, &receiver, s) {
                // Weights in whole milliseconds and millijoules: integer sums are exact in f64, so
                // tiles equal the whole map bit for bit.
                let (dt_ms, beam_mj) = ((s.dt_s * 1e3).round(), (beam_j * 1e3).round());
                open_ms += dt_ms;
                open_mj += beam_mj;
                batch.push((o, [dt_ms, beam_mj]));
            }
        }
        if batch.len() >= 256 {
            sums.add(&batch);
            batch.clear();
        }
        Ok(())
    })?;
    sums.add(&batch);
    // Hours and beam are formed in the shaded totals' own storage.
    let [mut hours, mut beam] = sums.finish();
    open.sun_hours = open_ms / 3.6e6;
    open.beam_kwh_m2 = open_mj / (1e3 * J_PER_KWH);
    open.total_kwh_m2 = open.beam_kwh_m2 + open.diffuse_kwh_m2;
    let n = g.rows * g.cols;
    let (mut total, mut diffuse) = (vec![f64::NAN; n], vec![f64::NAN; n]);
    for i in 0..n {
        let Some(svf) = sky_view.get(i) else {
            (hours[i], beam[i]) = (f64::NAN, f64::NAN);
            continue;
        };
        let b = ((open_mj - beam[i]) / (1e3 * J_PER_KWH)).max(0.0);
        let d = svf * open.diffuse_kwh_m2;
        beam[i] = b;
        diffuse[i] = d;
        total[i] = b + d;
        hours[i] = ((open_ms - hours[i]) / 3.6e6).max(0.0);
    }
    let cells = CellValues::from_nan_coded;
    Ok(Insolation {
        total_kwh_m2: cells(total),
        beam_kwh_m2: cells(beam),
        diffuse_kwh_m2: cells(diffuse),
        sky_view,
        sun_hours: cells(hours),
        open,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::{Window, DEFAULT_MAX_CELLS};
    use crate::site::{Area, AreaKind, Status};
    use chrono::{Duration, NaiveDate};
    use geo::{LineString, Polygon};

    #[test]
    fn open_cell_receives_the_daily_ghi_integral() {
        // The Bird model's GHI integrated independently at 10-second steps over the whole day
        // (trapezoid rule) against the map's 5-minute midpoint steps on an open site.
        let mut m = crate::demo::demo();
        m.volumes.clear();
        m.walls.clear();
        let ring = LineString::from(vec![(0.0, 0.0), (4.0, 0.0), (4.0, 4.0), (0.0, 4.0), (0.0, 0.0)]);
        m.areas = vec![Area::new("a", "", AreaKind::Other, Status::Existing, Polygon::new(ring, vec![])).unwrap()];
        let g = Grid::over_polygon(&m.areas[0].polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let atm = BirdAtmosphere::default();
        for date in [NaiveDate::from_ymd_opt(2026, 6, 21).unwrap(), NaiveDate::from_ymd_opt(2026, 12, 21).unwrap()] {
            let req = InsolationRequest {
                model: &m,
                grid: &g,
                period: Period { first: date, last: date, window: Window::Daylight, step_min: 5 },
                plane_m: 0.0,
                delta_t: DeltaT::EspenakMeeus,
                massing: Massing::WithProposed,
                atmosphere: atm,
                sky_step_deg: 10.0,
            };
            let r = insolation(&req, |_| true).unwrap();
            let mut eph = crate::solar::Ephemeris::new();
            let start = m.zone.start_of_day(date);
            let mut ghi = |k: i64| {
                let t = start + Duration::seconds(10 * k);
                let sun = eph
                    .sun_at(t, DeltaT::EspenakMeeus)
                    .unwrap()
                    .observe(&m.location, &crate::solar::Atmosphere::default());
                use chrono::Datelike;
                bird_clear_sky(sun.zenith_deg, extraterrestrial_normal_w_m2(t.ordinal()), &atm).ghi_w_m2
            };
            let n = 8_640;
            let integral_kwh = (0..n).map(|k| 0.5 * (ghi(k) + ghi(k + 1)) * 10.0).sum::<f64>() / J_PER_KWH;
            for v in r.total_kwh_m2.iter() {
                let v = v.unwrap();
                assert!((v - integral_kwh).abs() < 0.002 * integral_kwh, "{date}: {v} vs {integral_kwh} kWh/m²");
            }
            assert!(r.sky_view.iter().all(|s| s == Some(1.0)));
        }
    }
}

//! Hours of direct sun per grid cell over a date range, inside a daily window.
//!
//! # Method
//! The period is cut into steps of `step_min` from the window's start (the last step may be shorter).
//! A step counts as sun-up when its midpoint lies between sunrise and sunset (upper limb on the
//! horizon with standard refraction, as in the day events), so an open site gets the day length to
//! within one step. At each sun-up step the exact shadow polygons of every volume and wall are cast on
//! the receiving plane (the ground, or a plane `plane_m` above it: only what rises above the plane
//! casts) and rasterised at cell centres by scanlines; each row's merged spans add the step's length to
//! a per-row difference array, summed once at the end. While the sun's centre is still below the
//! apparent horizon in that window its shadows are cast as at 0.01° altitude, i.e. as long as the
//! analysis extent allows.

use chrono::{DateTime, Duration, NaiveDate, NaiveTime, Utc};
use geo::{Coord, MultiPolygon};

use super::grid::{ExposureError, Grid};
use super::raster::RowSpans;
use crate::shadow::{analysis_extent, shadow_offset_per_m, volume_shadow_on, wall_shadow_on, Receiver};
use crate::site::{SiteModel, Status};
use crate::solar::{day_events, Atmosphere, Crossing, Ephemeris};
use crate::time::{DeltaT, Fold};

/// Steps of a day are split over this many threads (the machines we target have two cores; one in wasm).
const THREADS: usize = 2;

/// Lowest altitude at which shadows are cast, degrees (see the module's method).
const MIN_CAST_ALTITUDE_DEG: f64 = 0.01;

/// The daily time window.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Window {
    /// Sunrise to sunset.
    Daylight,
    /// Between two local clock times, e.g. 09:00–15:00.
    Clock { from: NaiveTime, to: NaiveTime },
}

/// Which massing casts shadows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Massing {
    /// The existing volumes and walls alone (before).
    Existing,
    /// Existing and proposed together (after).
    WithProposed,
}

/// What to compute.
#[derive(Debug, Clone)]
pub struct SunHoursRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The cells.
    pub grid: &'a Grid,
    /// First local date.
    pub first: NaiveDate,
    /// Last local date (inclusive).
    pub last: NaiveDate,
    /// Daily window.
    pub window: Window,
    /// Time step, minutes (1 to 60).
    pub step_min: u32,
    /// Height of the receiving plane above the ground, metres.
    pub plane_m: f64,
    /// ΔT.
    pub delta_t: DeltaT,
    /// Which massing casts shadows.
    pub massing: Massing,
}

/// Hours of direct sun per cell.
#[derive(Debug, Clone, PartialEq)]
pub struct SunHours {
    /// Hours per cell, row-major as the grid; `None` for cells outside the area.
    pub hours: Vec<Option<f64>>,
    /// Hours an unobstructed cell would get over the same period and window.
    pub open_hours: f64,
    /// Sun-up steps computed.
    pub steps: usize,
}

/// What every step of a run shares.
struct Cast<'a> {
    req: &'a SunHoursRequest<'a>,
    receiver: Receiver,
    extent: Option<geo::Rect<f64>>,
}

impl Cast<'_> {
    /// Adds each step's shaded time to the per-row difference array `shaded` (rows × (cols + 1)).
    fn accumulate(&self, steps: &[(Coord<f64>, f64)], shaded: &mut [f64]) {
        let g = self.req.grid;
        let model = self.req.model;
        let stride = g.cols + 1;
        let frame = self.extent.map(|e| e.to_polygon());
        let mut spans = RowSpans::new(g);
        let counts = |s: Status| self.req.massing == Massing::WithProposed || s == Status::Existing;
        for &(o, dt) in steps {
            spans.clear();
            let mut add = |mp: Option<MultiPolygon<f64>>| {
                for p in mp.iter().flat_map(|m| m.0.iter()) {
                    match &frame {
                        Some(f) if !geo::Contains::contains(f, p) => {
                            for q in geo::BooleanOps::intersection(p, f).0.iter() {
                                spans.add_polygon(g, q);
                            }
                        }
                        _ => spans.add_polygon(g, p),
                    }
                }
            };
            for v in model.volumes.iter().filter(|v| counts(v.status)) {
                add(volume_shadow_on(v, o, &self.receiver));
            }
            for w in model.walls.iter().filter(|w| counts(w.status)) {
                add(wall_shadow_on(w, o, &self.receiver));
            }
            for row in 0..g.rows {
                for (a, b) in spans.merged(row) {
                    shaded[row * stride + a] += dt;
                    shaded[row * stride + b] -= dt;
                }
            }
        }
    }
}

fn window_bounds(req: &SunHoursRequest, date: NaiveDate) -> Result<(DateTime<Utc>, DateTime<Utc>), ExposureError> {
    let zone = &req.model.zone;
    match req.window {
        Window::Daylight => Ok((zone.start_of_day(date), zone.start_of_day(date.succ_opt().unwrap_or(date)))),
        Window::Clock { from, to } => {
            let at = |t: NaiveTime, fold| {
                zone.resolve(date.and_time(t), fold)
                    .map_err(|e| ExposureError::Period(format!("window on {date}: {e}")))
            };
            Ok((at(from, Fold::Earlier)?, at(to, Fold::Later)?))
        }
    }
}

/// Hours of direct sun per cell. `progress` is told the fraction done after each day and may return
/// `false` to cancel, which returns [`ExposureError::Period`] with "cancelled".
///
/// # Errors
/// [`ExposureError`] for an empty or inverted window, a bad step or date range (before any work), or a
/// cancelled run.
pub fn sun_hours(req: &SunHoursRequest, mut progress: impl FnMut(f64) -> bool) -> Result<SunHours, ExposureError> {
    if !(1..=60).contains(&req.step_min) {
        return Err(ExposureError::Period(format!("step_min must be 1 to 60, got {}", req.step_min)));
    }
    if req.last < req.first {
        return Err(ExposureError::Period(format!("the last date {} is before the first {}", req.last, req.first)));
    }
    if let Window::Clock { from, to } = req.window {
        if to <= from {
            return Err(ExposureError::Period(format!("the daily window {from}–{to} is empty or inverted")));
        }
    }
    if !req.plane_m.is_finite() || req.plane_m < 0.0 {
        return Err(ExposureError::Period(format!("plane_m must be 0 m or more, got {}", req.plane_m)));
    }
    let days = (req.last - req.first).num_days() + 1;
    let g = req.grid;
    let model = req.model;
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, req.plane_m);
    let extent = analysis_extent(model);
    let air = Atmosphere::default();
    let mut eph = Ephemeris::new();
    let stride = g.cols + 1;
    let threads = if cfg!(target_arch = "wasm32") { 1 } else { THREADS };
    let mut shaded = vec![vec![0.0_f64; g.rows * stride]; threads];
    let (mut open_s, mut steps) = (0.0_f64, 0_usize);
    let step = Duration::minutes(i64::from(req.step_min));
    let cast = Cast { req, receiver, extent };

    for k in 0..days {
        let date = req.first + Duration::days(k);
        let (start, end) = window_bounds(req, date)?;
        let ev = day_events(&model.location, date, &model.zone, req.delta_t)?;
        // The day's sun-up steps: shadow offset per metre and length in seconds.
        let mut day: Vec<(Coord<f64>, f64)> = Vec::new();
        let mut t0 = start;
        while t0 < end {
            let t1 = (t0 + step).min(end);
            let mid = t0 + (t1 - t0) / 2;
            let dt = (t1 - t0).num_milliseconds() as f64 / 1000.0;
            t0 = t1;
            let up = match ev.sun {
                Crossing::Crosses { rise, set } => mid >= rise && mid <= set,
                Crossing::AlwaysAbove => true,
                Crossing::AlwaysBelow => false,
            };
            if !up {
                continue;
            }
            let sun = eph.sun_at(mid, req.delta_t)?.observe(&model.location, &air);
            let az = model.plan_azimuth_deg(sun.azimuth_deg);
            let Some(o) = shadow_offset_per_m(az, sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG)) else { continue };
            if receiver.faces_sun(o) {
                day.push((o, dt)); // behind the slope there is no direct sun anywhere
            }
        }
        open_s += day.iter().map(|s| s.1).sum::<f64>();
        steps += day.len();
        let chunk = day.len().div_ceil(threads).max(1);
        if threads == 1 {
            cast.accumulate(&day, &mut shaded[0]);
        } else {
            std::thread::scope(|s| {
                for (part, buf) in day.chunks(chunk).zip(shaded.iter_mut()) {
                    let cast = &cast;
                    s.spawn(move || cast.accumulate(part, buf));
                }
            });
        }
        if !progress((k + 1) as f64 / days as f64) {
            return Err(ExposureError::Period("cancelled".into()));
        }
    }
    let (first, rest) = shaded.split_at_mut(1);
    for other in rest {
        first[0].iter_mut().zip(other.iter()).for_each(|(a, b)| *a += b);
    }
    let shaded = &first[0];

    let mut hours = vec![None; g.rows * g.cols];
    for row in 0..g.rows {
        let mut acc = 0.0;
        for col in 0..g.cols {
            acc += shaded[row * stride + col];
            if g.inside[row * g.cols + col] {
                hours[row * g.cols + col] = Some(((open_s - acc) / 3600.0).max(0.0));
            }
        }
    }
    Ok(SunHours { hours, open_hours: open_s / 3600.0, steps })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::DEFAULT_MAX_CELLS;
    use crate::site::{Area, AreaKind, Wall};
    use geo::{LineString, Polygon};

    fn open_site(lat: f64) -> SiteModel {
        let mut m = crate::demo::demo();
        m.location.latitude_deg = lat;
        m.volumes.clear();
        m.walls.clear();
        let ring = LineString::from(vec![(0.0, 0.0), (20.0, 0.0), (20.0, 20.0), (0.0, 20.0), (0.0, 0.0)]);
        m.areas = vec![Area::new("field", "", AreaKind::Other, Status::Existing, Polygon::new(ring, vec![])).unwrap()];
        m
    }

    fn request<'a>(m: &'a SiteModel, g: &'a Grid, d: NaiveDate) -> SunHoursRequest<'a> {
        SunHoursRequest {
            model: m,
            grid: g,
            first: d,
            last: d,
            window: Window::Daylight,
            step_min: 5,
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: Massing::WithProposed,
        }
    }

    #[test]
    fn open_site_gets_the_day_length_in_every_cell() {
        let m = open_site(52.62);
        let g = Grid::over_polygon(&m.areas[0].polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let d = NaiveDate::from_ymd_opt(2026, 6, 21).unwrap();
        let r = sun_hours(&request(&m, &g, d), |_| true).unwrap();
        let day = day_events(&m.location, d, &m.zone, DeltaT::EspenakMeeus).unwrap().day_length();
        let day_h = day.num_seconds() as f64 / 3600.0;
        // Within one step (5 min) of the day length from the solar engine.
        assert!((r.open_hours - day_h).abs() <= 5.0 / 60.0, "{} vs {day_h}", r.open_hours);
        assert!(r.hours.iter().all(|h| h.is_some_and(|h| (h - r.open_hours).abs() < 1e-9)));
    }

    #[test]
    fn polar_night_gives_zero_everywhere() {
        let m = open_site(78.2);
        let g = Grid::over_polygon(&m.areas[0].polygon, 2.0, DEFAULT_MAX_CELLS).unwrap();
        let r = sun_hours(&request(&m, &g, NaiveDate::from_ymd_opt(2026, 12, 21).unwrap()), |_| true).unwrap();
        assert_eq!(r.open_hours, 0.0);
        assert!(r.hours.iter().all(|h| *h == Some(0.0)));
    }

    #[test]
    fn east_west_wall_shades_a_strip_of_depth_h_tan_latitude_all_equinox_day() {
        // A long E–W wall of height h at latitude φ: with declination 0 its shadow depth north of the
        // wall is h·tan φ all day (analytic), so cells inside the strip get no sun and cells beyond get
        // the open-site hours. Tolerance: one step at each end of the day — at sunrise and sunset the
        // refracted sun stands a little north of east and west (common practice), lighting the north
        // side for a moment — and the declination's drift of 0.4° over the day.
        let (lat, h) = (40.0_f64, 5.0);
        let mut m = open_site(lat);
        m.zone = "UTC".parse().unwrap();
        m.location.longitude_deg = 0.0;
        m.walls =
            vec![Wall::new("wall", Status::Existing, LineString::from(vec![(-2_000.0, 0.0), (2_000.0, 0.0)]), h)
                .unwrap()];
        let depth = h * lat.to_radians().tan(); // 4.2 m
        let ring =
            LineString::from(vec![(-1.0, 0.0), (1.0, 0.0), (1.0, 3.0 * depth), (-1.0, 3.0 * depth), (-1.0, 0.0)]);
        m.areas = vec![Area::new("strip", "", AreaKind::Other, Status::Existing, Polygon::new(ring, vec![])).unwrap()];
        let g = Grid::over_polygon(&m.areas[0].polygon, 0.25, DEFAULT_MAX_CELLS).unwrap();
        let equinox = crate::solar::season_instants(2026, DeltaT::EspenakMeeus).unwrap().march_equinox.date_naive();
        let r = sun_hours(&request(&m, &g, equinox), |_| true).unwrap();
        let at = |y: f64| {
            let row = ((y - g.origin.y) / g.cell_m) as usize;
            r.hours[row * g.cols + g.cols / 2].unwrap()
        };
        assert!(at(0.5 * depth) <= 2.0 * 5.0 / 60.0 + 1e-9, "inside the strip: {} h", at(0.5 * depth));
        assert!(
            at(1.5 * depth) >= r.open_hours - 5.0 / 60.0 - 1e-9,
            "beyond it: {} of {} h",
            at(1.5 * depth),
            r.open_hours
        );
    }

    #[test]
    fn bad_periods_are_refused_before_work_and_cancel_stops() {
        let m = open_site(52.0);
        let g = Grid::over_polygon(&m.areas[0].polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
        let d = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let mut req = request(&m, &g, d);
        req.window = Window::Clock {
            from: NaiveTime::from_hms_opt(15, 0, 0).unwrap(),
            to: NaiveTime::from_hms_opt(9, 0, 0).unwrap(),
        };
        assert!(sun_hours(&req, |_| true).unwrap_err().to_string().contains("inverted"));
        let mut req = request(&m, &g, d);
        req.step_min = 0;
        assert!(sun_hours(&req, |_| true).is_err());
        let mut req = request(&m, &g, d);
        req.last = d + Duration::days(3);
        assert_eq!(sun_hours(&req, |f| f < 0.5).unwrap_err().to_string(), "cancelled");
        assert!(matches!(
            Grid::over_polygon(&m.areas[0].polygon, 0.001, DEFAULT_MAX_CELLS),
            Err(ExposureError::CellSize(_))
        ));
        assert!(matches!(
            Grid::over_polygon(&m.areas[0].polygon, 0.01, 1_000),
            Err(ExposureError::TooManyCells { .. })
        ));
    }
}

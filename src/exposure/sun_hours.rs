//! Hours of direct sun per grid cell over a period.
//!
//! # Method
//! The period's sun-up steps (see [`super::period`]) each cast the exact shadows of the massing on the
//! receiving plane (the ground, or a plane `plane_m` above it: only what rises above the plane casts),
//! rasterised at cell centres and accumulated by [`super::shade`]; a cell's hours are the sun-up time
//! minus its shaded time. While the sun's centre is still below the apparent horizon at a sun-up step
//! (the upper limb is up) its shadows are cast as at 0.01° altitude, i.e. as long as the site allows.
//! Steps when the sun is behind a sloping ground give no sun anywhere.

use chrono::NaiveDate;
use geo::Coord;

use super::cell_values::CellValues;
use super::grid::{ExposureError, Grid};
use super::period::{Period, Step};
use super::shade::{Cast, Massing, ShadeSums};
use crate::shadow::{shadow_offset_per_m, Receiver};
use crate::site::SiteModel;
use crate::solar::Ephemeris;
use crate::time::DeltaT;

/// Lowest altitude at which shadows are cast, degrees (see the module's method).
pub const MIN_CAST_ALTITUDE_DEG: f64 = 0.01;

/// Days accumulated between progress reports.
const DAYS_PER_REPORT: usize = 7;

/// What to compute.
#[derive(Debug, Clone)]
pub struct SunHoursRequest<'a> {
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
    /// Which massing casts shadows.
    pub massing: Massing,
}

/// Hours of direct sun per cell.
#[derive(Debug, Clone, PartialEq)]
pub struct SunHours {
    /// Hours per cell, row-major as the grid; `None` for cells outside the area.
    pub hours: CellValues,
    /// Hours an unobstructed cell would get over the same period and window.
    pub open_hours: f64,
    /// Sun-up steps computed.
    pub steps: usize,
}

/// One of `of` interleaved shares of a period's casting steps. A period of at least `of` days is
/// shared by days: day `d` (0 for the first) belongs to share `d % of`, and a share computes the sun's
/// steps of its own days only. A shorter period is shared by steps: the `k`-th step that casts
/// (counted from the first date's first step) belongs to share `k % of`. The shares of a map can be
/// computed apart (one per worker) and joined exactly ([`SunlitMs::join`]); interleaving gives each
/// share about as much of every season or hour as the others.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct StepShare {
    /// Which share, `0..of`.
    pub index: usize,
    /// How many shares.
    pub of: usize,
}

impl StepShare {
    /// Every step.
    pub const WHOLE: StepShare = StepShare { index: 0, of: 1 };

    /// Whether day `d` of a period of `days` days is computed for this share.
    fn takes_day(self, d: usize, days: usize) -> bool {
        days < self.of || d % self.of == self.index
    }

    /// Whether the `k`-th casting step of the days computed is this share's (period of `days` days).
    fn takes_step(self, k: usize, days: usize) -> bool {
        days >= self.of || k % self.of == self.index
    }
}

/// Milliseconds of direct sun per cell over a share of a period's steps: whole numbers of
/// milliseconds, so the shares' sums are the whole period's exactly and [`SunlitMs::hours`] of the
/// joined shares equals [`sun_hours`] bit for bit.
#[derive(Debug, Clone, PartialEq)]
pub struct SunlitMs {
    /// Milliseconds per cell, row-major as the grid; NaN outside the area.
    pub ms: Vec<f64>,
    /// Milliseconds an unobstructed cell gets over the same steps.
    pub open_ms: f64,
    /// Sun-up steps cast.
    pub steps: usize,
}

impl SunlitMs {
    /// The shares of one map (each over the same grid) summed cell by cell; `None` when there are no
    /// shares or their grids differ in size.
    pub fn join(shares: impl IntoIterator<Item = SunlitMs>) -> Option<SunlitMs> {
        let mut it = shares.into_iter();
        let mut whole = it.next()?;
        for s in it {
            if s.ms.len() != whole.ms.len() {
                return None;
            }
            whole.ms.iter_mut().zip(&s.ms).for_each(|(a, b)| *a += b);
            whole.open_ms += s.open_ms;
            whole.steps += s.steps;
        }
        Some(whole)
    }

    /// The hours of direct sun (formed in the milliseconds' own storage).
    pub fn hours(self) -> SunHours {
        let mut ms = self.ms;
        // NaN (outside the area) stays NaN: `max` would turn it into 0.
        ms.iter_mut().filter(|h| !h.is_nan()).for_each(|h| *h = (*h / 3.6e6).max(0.0));
        SunHours { hours: CellValues::from_nan_coded(ms), open_hours: self.open_ms / 3.6e6, steps: self.steps }
    }
}

/// The shadow offset per metre for a step's sun in `model`'s plan frame, cast no lower than
/// [`MIN_CAST_ALTITUDE_DEG`]; `None` when the sun is behind the receiving plane.
pub(crate) fn step_offset(model: &SiteModel, receiver: &Receiver, s: &Step) -> Option<Coord<f64>> {
    let az = model.plan_azimuth_deg(s.sun.azimuth_deg);
    shadow_offset_per_m(az, s.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG)).filter(|o| receiver.faces_sun(*o))
}

/// Checks a plane height, metres.
pub(crate) fn check_plane(plane_m: f64) -> Result<(), ExposureError> {
    if plane_m.is_finite() && plane_m >= 0.0 {
        Ok(())
    } else {
        Err(ExposureError::Period(format!("plane_m must be 0 m or more, got {plane_m}")))
    }
}

/// Runs `day(date, steps, eph)` for every date of `period` with its sun-up steps, reporting progress
/// every few days; stops with [`ExposureError::Cancelled`] when `progress` returns `false`.
pub(crate) fn for_each_day(
    model: &SiteModel,
    period: &Period,
    delta_t: DeltaT,
    progress: &mut dyn FnMut(f64) -> bool,
    day: impl FnMut(NaiveDate, Vec<Step>) -> Result<(), ExposureError>,
) -> Result<(), ExposureError> {
    for_each_day_of(model, period, delta_t, progress, |_| true, day)
}

/// As [`for_each_day`] for the dates whose index in the period (0 for the first) `take` accepts; the
/// others' steps are not computed.
fn for_each_day_of(
    model: &SiteModel,
    period: &Period,
    delta_t: DeltaT,
    progress: &mut dyn FnMut(f64) -> bool,
    take: impl Fn(usize) -> bool,
    mut day: impl FnMut(NaiveDate, Vec<Step>) -> Result<(), ExposureError>,
) -> Result<(), ExposureError> {
    let mut eph = Ephemeris::new();
    let days = period.days();
    for (k, date) in period.dates().enumerate() {
        if take(k) {
            day(date, period.steps_of(model, date, delta_t, &mut eph)?)?;
        }
        if ((k + 1) % DAYS_PER_REPORT == 0 || k + 1 == days) && !progress((k + 1) as f64 / days as f64) {
            return Err(ExposureError::Cancelled);
        }
    }
    Ok(())
}

/// Hours of direct sun per cell. `progress` is told the fraction done every few days and may return
/// `false` to cancel, which returns [`ExposureError::Cancelled`].
///
/// # Examples
/// ```
/// use chrono::NaiveDate;
/// use sunlot::exposure::{sun_hours, Grid, Massing, Period, SunHoursRequest, Window, DEFAULT_MAX_CELLS};
/// use sunlot::DeltaT;
/// // The demo's front garden at 9 Weir Close has nothing to its south: on 21 March at 52.6° N every
/// // cell gets the open site's hours, sunrise to sunset (about 12.2 h: the day is a little longer
/// // than 12 h at an equinox, by refraction and the sun's radius; common practice).
/// let model = sunlot::demo::demo();
/// let garden = model.areas.iter().find(|a| a.id == "garden-9").unwrap();
/// let grid = Grid::over_polygon(&garden.polygon, 1.0, DEFAULT_MAX_CELLS)?;
/// let day = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
/// let period = Period { first: day, last: day, window: Window::Daylight, step_min: 5 };
/// let req = SunHoursRequest {
///     model: &model, grid: &grid, period, plane_m: 0.0, delta_t: DeltaT::EspenakMeeus, massing: Massing::WithProposed,
/// };
/// let map = sun_hours(&req, |_| true)?;
/// assert!((map.open_hours - 12.25).abs() < 0.1, "{}", map.open_hours);
/// let least = map.hours.values().fold(f64::INFINITY, f64::min);
/// assert!(least > map.open_hours - 1.0, "{least}");
/// # Ok::<(), sunlot::exposure::ExposureError>(())
/// ```
///
/// # Errors
/// [`ExposureError`] for an empty or inverted window, a bad step, plane or date range (before any
/// work), or a cancelled run.
pub fn sun_hours(req: &SunHoursRequest, progress: impl FnMut(f64) -> bool) -> Result<SunHours, ExposureError> {
    sunlit_ms(req, StepShare::WHOLE, progress).map(SunlitMs::hours)
}

/// Milliseconds of direct sun per cell over `share` of the period's casting steps (see [`StepShare`]);
/// [`sun_hours`] is the whole period's. `progress` as for [`sun_hours`].
///
/// # Errors
/// As [`sun_hours`]; a share with `index` not below `of` is refused.
pub fn sunlit_ms(
    req: &SunHoursRequest,
    share: StepShare,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<SunlitMs, ExposureError> {
    if share.of == 0 || share.index >= share.of {
        return Err(ExposureError::Period(format!("step share {} of {} is not a share", share.index, share.of)));
    }
    req.period.check(req.model, req.delta_t)?;
    req.period.check_work(req.grid.inside_count())?;
    check_plane(req.plane_m)?;
    let (g, model) = (req.grid, req.model);
    let receiver = Receiver::on(&model.ground, model.plan_rotation_deg, req.plane_m);
    let mut sums = ShadeSums::<1>::new(model, g, receiver, req.massing);
    // Weights in whole milliseconds: sums of integers are exact in f64, so a tile's cells equal the
    // whole map's bit for bit whatever the order of the sums.
    let (mut open_ms, mut steps, mut casting) = (0.0_f64, 0_usize, 0_usize);
    let mut batch: Vec<Cast<1>> = Vec::new();
    let days = req.period.days();
    let take_day = |d| share.takes_day(d, days);
    for_each_day_of(model, &req.period, req.delta_t, &mut progress, take_day, |_, day| {
        for s in &day {
            if let Some(o) = step_offset(model, &receiver, s) {
                if share.takes_step(casting, days) {
                    batch.push((o, [(s.dt_s * 1e3).round()]));
                }
                casting += 1;
            }
        }
        if batch.len() >= 256 {
            open_ms += batch.iter().map(|c| c.1[0]).sum::<f64>();
            steps += batch.len();
            sums.add(&batch);
            batch.clear();
        }
        Ok(())
    })?;
    open_ms += batch.iter().map(|c| c.1[0]).sum::<f64>();
    steps += batch.len();
    sums.add(&batch);
    // The sunlit time is formed in the shaded totals' own storage (no second map in memory).
    let [mut ms] = sums.finish();
    for (t, &inside) in ms.iter_mut().zip(&g.inside) {
        *t = if inside { open_ms - *t } else { f64::NAN };
    }
    Ok(SunlitMs { ms, open_ms, steps })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::{Window, DEFAULT_MAX_CELLS};
    use crate::site::Status;
    use crate::site::{Area, AreaKind, Wall};
    use crate::solar::day_events;
    use chrono::{Duration, NaiveTime};
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
            period: Period::day(d, 5),
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
        assert!(r.hours.iter().all(|h| h == Some(0.0)));
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
            r.hours.get(row * g.cols + g.cols / 2).unwrap()
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
        req.period.window = Window::Clock {
            from: NaiveTime::from_hms_opt(15, 0, 0).unwrap(),
            to: NaiveTime::from_hms_opt(9, 0, 0).unwrap(),
        };
        assert!(sun_hours(&req, |_| true).unwrap_err().to_string().contains("inverted"));
        let mut req = request(&m, &g, d);
        req.period.step_min = 0;
        assert!(sun_hours(&req, |_| true).is_err());
        let mut req = request(&m, &g, d);
        req.period.last = d + Duration::days(30);
        let e = sun_hours(&req, |f| f < 0.5).unwrap_err();
        assert!(matches!(e, ExposureError::Cancelled) && e.to_string() == "cancelled", "{e}");
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

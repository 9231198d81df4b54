//! Hours of direct sun on a window: the sun up, in front of the glazing — within 90° of the wall's
//! outward normal, so cos i = cos α · cos(A − β) > 0 on a vertical plane facing azimuth β (the angle
//! of incidence of a vertical surface; Duffie & Beckman, *Solar Engineering of Thermal Processes*,
//! eq. 1.6.3 with tilt 90°) — and not blocked by the massing (the exact ray test from the window's
//! point). Steps as in the maps ([`Period`]): a step counts whole by its midpoint.
//!
//! These are clear-sky hours: how long the sun could reach the window. Planning tests written in
//! "probable sunlight hours" weigh the hours by the local record of sunshine, which this tool does not
//! have; clear-sky hours are an upper bound of them.

use super::grid::ExposureError;
use chrono::NaiveDate;

use super::period::{Period, Step};
use super::shade::Massing;
use super::sun_hours::{for_each_day, MIN_CAST_ALTITUDE_DEG};
use super::timeline::PointSky;
use crate::shadow::{Exposure, ViewPoint};
use crate::site::SiteModel;
use crate::time::DeltaT;

/// A window's hours over a period.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct WindowSun {
    /// Hours of direct sun on the window: in front of it and not blocked.
    pub sun_hours: f64,
    /// Hours the sun is up and in front of the window, blocked or not (an open site's hours).
    pub front_hours: f64,
    /// Hours the sun is up.
    pub day_hours: f64,
}

impl WindowSun {
    /// Adds `other`'s hours to these.
    fn add(&mut self, other: &WindowSun) {
        self.sun_hours += other.sun_hours;
        self.front_hours += other.front_hours;
        self.day_hours += other.day_hours;
    }
}

/// Whether a sun at true azimuth `azimuth_deg` is in front of a vertical plane facing `facing_deg`
/// (within 90° of its outward normal).
pub fn in_front_of_wall(azimuth_deg: f64, facing_deg: f64) -> bool {
    (azimuth_deg - facing_deg).to_radians().cos() > 0.0
}

/// A window as the sun tests see it: its point, the way it faces, the massing, and the lowest sun
/// that counts.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WindowAim {
    /// The reference point on the outside face of its wall, plan metres and height.
    pub point: ViewPoint,
    /// The way the window faces (its wall's outward normal), degrees clockwise from true north.
    pub facing_deg: f64,
    /// Which volumes stand.
    pub massing: Massing,
    /// The sun counts (in `sun_hours` and `front_hours`) only at an apparent altitude of at least this,
    /// degrees (0: whenever it is up), as tests that ignore a sun too low to matter require.
    pub min_altitude_deg: f64,
}

impl WindowAim {
    /// The window at `point` facing `facing_deg`, with the proposal, the sun counting whenever it is up.
    pub fn at(point: ViewPoint, facing_deg: f64) -> Self {
        WindowAim { point, facing_deg, massing: Massing::WithProposed, min_altitude_deg: 0.0 }
    }
}

/// The hours of direct sun on the window `aim` over `period`. `progress` as for the maps.
///
/// # Errors
/// [`ExposureError`] for a bad period, facing or lowest altitude (outside 0–90°), a non-finite point,
/// more ray tests than [`crate::limits::MAX_RAY_TESTS`], or a cancelled run.
pub fn window_sun_hours(
    model: &SiteModel,
    aim: &WindowAim,
    period: &Period,
    delta_t: DeltaT,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<WindowSun, ExposureError> {
    check_window(aim)?;
    period.check(model, delta_t)?;
    let casters = model.volumes.len() + model.walls.len();
    crate::limits::ray_tests("step_min", period.max_steps(), casters, "use a longer step or a shorter period")?;
    let sky = PointSky::new(model, aim.point, aim.massing, delta_t);
    let mut out = WindowSun::default();
    for_each_day(model, period, delta_t, &mut progress, |_, steps| add_steps(model, &sky, aim, &steps, &mut out))?;
    Ok(out)
}

fn check_window(aim: &WindowAim) -> Result<(), ExposureError> {
    let (facing_deg, min_altitude_deg) = (aim.facing_deg, aim.min_altitude_deg);
    if !(0.0..=90.0).contains(&min_altitude_deg) {
        return Err(ExposureError::Period(format!("min_altitude_deg must be 0 to 90, got {min_altitude_deg}")));
    }
    if !facing_deg.is_finite() {
        return Err(ExposureError::Period(format!("facing_deg must be a finite azimuth, got {facing_deg}")));
    }
    Ok(())
}

/// Adds the hours of `steps` to `out`.
fn add_steps(
    model: &SiteModel,
    sky: &PointSky,
    aim: &WindowAim,
    steps: &[Step],
    out: &mut WindowSun,
) -> Result<(), ExposureError> {
    let (facing_deg, min_altitude_deg) = (aim.facing_deg, aim.min_altitude_deg);
    for s in steps {
        let h = s.dt_s / 3600.0;
        out.day_hours += h;
        if !in_front_of_wall(s.sun.azimuth_deg, facing_deg)
            || (min_altitude_deg > 0.0 && s.sun.altitude_deg < min_altitude_deg)
        {
            continue;
        }
        out.front_hours += h;
        let az = model.plan_azimuth_deg(s.sun.azimuth_deg);
        if sky.toward(az, s.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG))? == Exposure::Sunlit {
            out.sun_hours += h;
        }
    }
    Ok(())
}

/// Most steps (counting whole days) a [`SunSteps`] holds: a year at 2-minute steps, about 40 MB.
pub const MAX_HELD_STEPS: f64 = 400_000.0;

/// A period's sun-up steps, computed once and shared by many windows and massings (the sun's
/// positions and the days' events are most of the cost of a window's year). Holds every step: for
/// periods of up to a year or so.
#[derive(Debug, Clone)]
pub struct SunSteps {
    days: Vec<(NaiveDate, Vec<Step>)>,
    max_steps: f64,
}

impl SunSteps {
    /// The steps of `period`.
    ///
    /// # Errors
    /// [`ExposureError`] for a bad period or a cancelled run.
    pub fn of(
        model: &SiteModel,
        period: &Period,
        delta_t: DeltaT,
        mut progress: impl FnMut(f64) -> bool,
    ) -> Result<Self, ExposureError> {
        period.check(model, delta_t)?;
        crate::limits::within("to, step_min", period.max_steps(), MAX_HELD_STEPS, "steps held at once")?;
        let mut days = Vec::with_capacity(period.days());
        for_each_day(model, period, delta_t, &mut progress, |date, steps| {
            days.push((date, steps));
            Ok(())
        })?;
        Ok(SunSteps { days, max_steps: period.max_steps() })
    }

    /// Every step, day by day.
    pub fn all(&self) -> impl Iterator<Item = &Step> {
        self.days.iter().flat_map(|(_, steps)| steps.iter())
    }

    /// An upper bound of the steps, known before they were computed (for budgets).
    pub fn max_steps(&self) -> f64 {
        self.max_steps
    }

    /// The hours of direct sun on the window `aim` (as [`window_sun_hours`]) over every day, and over
    /// the days for which `on` holds, in one pass over the steps.
    ///
    /// # Errors
    /// As [`window_sun_hours`].
    pub fn window(
        &self,
        model: &SiteModel,
        aim: &WindowAim,
        delta_t: DeltaT,
        on: impl Fn(NaiveDate) -> bool,
    ) -> Result<(WindowSun, WindowSun), ExposureError> {
        check_window(aim)?;
        let casters = model.volumes.len() + model.walls.len();
        crate::limits::ray_tests("step_min", self.max_steps, casters, "use a longer step or a shorter period")?;
        let sky = PointSky::new(model, aim.point, aim.massing, delta_t);
        let (mut all, mut picked) = (WindowSun::default(), WindowSun::default());
        for (date, steps) in &self.days {
            let mut day = WindowSun::default();
            add_steps(model, &sky, aim, steps, &mut day)?;
            all.add(&day);
            if on(*date) {
                picked.add(&day);
            }
        }
        Ok((all, picked))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::{day_timeline, Window};
    use crate::site::test_sites::{block, flat_site as site};
    use chrono::NaiveDate;

    /// An unobstructed window at 52° N on 21 June: the sun crosses the east–west line (azimuth 90° and
    /// 270°) at hour angle H0 with cos H0 = tan δ / tan φ, and rises and sets at Hs with
    /// cos Hs = (sin h0 − sin φ sin δ) / (cos φ cos δ), h0 = −0.8333° (common practice; Meeus ch. 15).
    /// A south-facing window gets 2·H0/15 hours, a north-facing one 2·(Hs − H0)/15 — within a
    /// one-minute step at each crossing.
    #[test]
    fn an_open_window_gets_the_hours_the_sun_is_in_front() {
        let (lat, date) = (52.0_f64, NaiveDate::from_ymd_opt(2026, 6, 21).unwrap());
        let house = block("house", -5.0, 0.0, 5.0, 8.0, 7.0);
        let m = site(vec![house.clone(), block("house-n", -5.0, 20.0, 5.0, 28.0, 7.0)], lat);
        let noon = date.and_hms_opt(12, 0, 0).unwrap().and_utc();
        let sun = crate::solar_position(&m.location, noon, &Default::default(), DeltaT::EspenakMeeus).unwrap();
        let (phi, delta) = (lat.to_radians(), sun.declination_deg.to_radians());
        let h0 = (delta.tan() / phi.tan()).acos().to_degrees();
        let hs = (((-0.8333_f64).to_radians().sin() - phi.sin() * delta.sin()) / (phi.cos() * delta.cos()))
            .acos()
            .to_degrees();
        let period = Period { first: date, last: date, window: Window::Daylight, step_min: 1 };
        let south = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let s = window_sun_hours(&m, &WindowAim::at(south, 180.0), &period, DeltaT::EspenakMeeus, |_| true).unwrap();
        assert!(
            (s.sun_hours - 2.0 * h0 / 15.0).abs() < 2.0 / 60.0,
            "south {} against {}",
            s.sun_hours,
            2.0 * h0 / 15.0
        );
        assert_eq!(s.sun_hours, s.front_hours);
        // The north face of the second house: nothing to its north.
        let north = ViewPoint { x_m: 0.0, y_m: 28.0, z_m: 1.5 };
        let n = window_sun_hours(&m, &WindowAim::at(north, 0.0), &period, DeltaT::EspenakMeeus, |_| true).unwrap();
        let want = 2.0 * (hs - h0) / 15.0;
        assert!((n.sun_hours - want).abs() < 4.0 / 60.0, "north {} against {want}", n.sun_hours);
        assert!((s.day_hours - 2.0 * hs / 15.0).abs() < 2.0 / 60.0, "day {} against {}", s.day_hours, 2.0 * hs / 15.0);
    }

    /// Behind an obstruction, a south-facing window at the March equinox (sun in front all day) gets
    /// the point's own sun hours (the exact timeline), within a step per change of state.
    #[test]
    fn an_obstructed_window_matches_the_point_timeline() {
        let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let m =
            site(vec![block("house", -5.0, 0.0, 5.0, 8.0, 7.0), block("block", -8.0, -25.0, 2.0, -15.0, 14.0)], 52.0);
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let period = Period { first: date, last: date, window: Window::Daylight, step_min: 1 };
        let w = window_sun_hours(&m, &WindowAim::at(p, 180.0), &period, DeltaT::EspenakMeeus, |_| true).unwrap();
        let t = day_timeline(&m, p, date, Massing::WithProposed, DeltaT::EspenakMeeus).unwrap();
        assert!(w.sun_hours < w.front_hours - 0.5, "{w:?}");
        // The sun rises a little north of due east at the equinox: minutes outside the window's half-space.
        assert!((w.sun_hours - t.sun_hours).abs() < 12.0 / 60.0, "{} against {}", w.sun_hours, t.sun_hours);
        assert!(w.sun_hours <= t.sun_hours + 2.0 / 60.0);
        let e = window_sun_hours(&m, &WindowAim::at(p, f64::NAN), &period, DeltaT::EspenakMeeus, |_| true).unwrap_err();
        assert!(e.to_string().contains("facing_deg"), "{e}");
        let low = WindowAim { min_altitude_deg: 91.0, ..WindowAim::at(p, 180.0) };
        let e = window_sun_hours(&m, &low, &period, DeltaT::EspenakMeeus, |_| true).unwrap_err();
        assert!(e.to_string().contains("min_altitude_deg"), "{e}");
    }
}

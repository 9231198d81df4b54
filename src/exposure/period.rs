//! The period of an exposure run: local dates, a daily window and a time step, cut into sun-up steps.
//!
//! # Method
//! Each day's window is cut into steps of `step_min` from the window's start (the last step may be
//! shorter). A step counts as sun-up when its midpoint lies between sunrise and sunset (upper limb on
//! the horizon with standard refraction, as in the day events), so an open site gets the day length
//! to within one step; the step's sun is the sun at its midpoint. Partial steps at sunrise and sunset
//! therefore count whole or not at all, by their midpoint.

use chrono::{DateTime, Duration, NaiveDate, NaiveTime, Utc};

use super::grid::ExposureError;
use crate::limits::{within, MAX_CELL_STEPS, MAX_PERIOD_DAYS};
use crate::site::SiteModel;
use crate::solar::{day_events, Atmosphere, Crossing, Ephemeris, SolarPosition};
use crate::time::{DeltaT, Fold};

/// The daily time window.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Window {
    /// Sunrise to sunset.
    Daylight,
    /// Between two local clock times, e.g. 09:00–15:00.
    Clock { from: NaiveTime, to: NaiveTime },
}

/// A daily window's text that is not two clock times.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
#[error("{text:?} is not HH:MM-HH:MM")]
pub struct WindowError {
    /// The text given.
    pub text: String,
}

impl Window {
    /// Reads `HH:MM-HH:MM` (the window's ends in local clock time).
    ///
    /// # Errors
    /// [`WindowError`] quoting the text when it is not two clock times joined by `-`.
    pub fn parse(text: &str) -> Result<Window, WindowError> {
        let bad = || WindowError { text: text.to_string() };
        let (a, b) = text.split_once('-').ok_or_else(bad)?;
        let t = |s: &str| NaiveTime::parse_from_str(s.trim(), "%H:%M").map_err(|_| bad());
        Ok(Window::Clock { from: t(a)?, to: t(b)? })
    }
}

impl std::fmt::Display for Window {
    /// "sunrise to sunset", or the clock times "09:00-15:00" as they are written in requests.
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Window::Daylight => f.write_str("sunrise to sunset"),
            Window::Clock { from, to } => write!(f, "{}-{}", from.format("%H:%M"), to.format("%H:%M")),
        }
    }
}

/// Cell size of ground maps when a request does not say, metres (the CLI's, the module's and the
/// page's default: fine enough to resolve a garden fence's shadow; common practice).
pub const DEFAULT_CELL_M: f64 = 0.5;
/// Time step of a day's map when a request does not say, minutes.
pub const DEFAULT_STEP_MIN: u32 = 5;
/// Time step of a longer run (a point's day, a year's map, an envelope, facade faces), minutes.
pub const DEFAULT_LONG_STEP_MIN: u32 = 15;

/// Local dates, a daily window and a step.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Period {
    /// First local date.
    pub first: NaiveDate,
    /// Last local date (inclusive).
    pub last: NaiveDate,
    /// Daily window.
    pub window: Window,
    /// Time step, minutes (1 to 60).
    pub step_min: u32,
}

/// One sun-up step.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Step {
    /// The step's midpoint.
    pub mid: DateTime<Utc>,
    /// The step's length, seconds.
    pub dt_s: f64,
    /// The sun at the midpoint (true-north azimuth; apparent altitude with standard refraction).
    pub sun: SolarPosition,
}

impl Period {
    /// The period in words, as figures and tables state it: "2026-03-21, sunrise to sunset, 5-minute
    /// steps" or "2026-06-01 to 2026-08-31, 09:00-15:00, 10-minute steps".
    pub fn describe(&self) -> String {
        let dates =
            if self.last == self.first { self.first.to_string() } else { format!("{} to {}", self.first, self.last) };
        format!("{dates}, {}, {}-minute steps", self.window, self.step_min)
    }

    /// One local date, sunrise to sunset, at `step_min`.
    pub fn day(date: NaiveDate, step_min: u32) -> Self {
        Period { first: date, last: date, window: Window::Daylight, step_min }
    }

    /// Number of days.
    pub fn days(&self) -> usize {
        usize::try_from((self.last - self.first).num_days() + 1).unwrap_or(0)
    }

    /// The dates of the period, in order.
    pub fn dates(&self) -> impl Iterator<Item = NaiveDate> + '_ {
        (0..self.days()).map(move |k| self.first + Duration::days(k as i64))
    }

    /// Checks the step, the date order and the window, and that the solar engine accepts the first and
    /// last dates at `model`'s site.
    ///
    /// # Errors
    /// [`ExposureError::Period`] naming the problem.
    pub fn check(&self, model: &SiteModel, delta_t: DeltaT) -> Result<(), ExposureError> {
        if !(1..=60).contains(&self.step_min) {
            return Err(ExposureError::Period(format!("step_min must be 1 to 60, got {}", self.step_min)));
        }
        if self.last < self.first {
            return Err(ExposureError::Period(format!(
                "the last date {} is before the first {}",
                self.last, self.first
            )));
        }
        within("the period", self.days() as f64, MAX_PERIOD_DAYS as f64, "days")?;
        if let Window::Clock { from, to } = self.window {
            if to <= from {
                return Err(ExposureError::Period(format!("the daily window {from}–{to} is empty or inverted")));
            }
        }
        for d in [self.first, self.last] {
            day_events(&model.location, d, &model.zone, delta_t)
                .map_err(|e| ExposureError::Period(format!("date {d}: {e}")))?;
            self.bounds(model, d)?;
        }
        Ok(())
    }

    /// The most steps the period can have: every step of the window (a whole day for sunrise to
    /// sunset) on every day, as if the sun were always up.
    pub fn max_steps(&self) -> f64 {
        let window_min = match self.window {
            Window::Daylight => 24.0 * 60.0,
            Window::Clock { from, to } => (to - from).num_minutes().max(0) as f64,
        };
        self.days() as f64 * (window_min / f64::from(self.step_min.max(1))).ceil()
    }

    /// Checks that `cells` cells over this period stay within [`MAX_CELL_STEPS`], counting every step
    /// of the window (a whole day for sunrise to sunset) as sun-up: an upper bound known before any
    /// sun is computed.
    ///
    /// # Errors
    /// [`ExposureError::Budget`] naming the cells and steps, with what to change.
    pub fn check_work(&self, cells: usize) -> Result<(), ExposureError> {
        let steps = self.max_steps();
        within("cell_m, step_min, to", cells as f64 * steps, MAX_CELL_STEPS, "cell-steps").map_err(|e| {
            let (cells, steps) = (crate::limits::count(cells as f64), crate::limits::count(steps));
            e.hint(&format!("{cells} cells × up to {steps} steps: use larger cells, a longer step or a shorter period"))
        })?;
        Ok(())
    }

    /// The window of `date` as instants.
    fn bounds(&self, model: &SiteModel, date: NaiveDate) -> Result<(DateTime<Utc>, DateTime<Utc>), ExposureError> {
        let zone = &model.zone;
        match self.window {
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

    /// The sun-up steps of `date` (see the module's method).
    ///
    /// # Errors
    /// [`ExposureError`] when the solar engine refuses the date or the window falls in a clock gap.
    pub fn steps_of(
        &self,
        model: &SiteModel,
        date: NaiveDate,
        delta_t: DeltaT,
        eph: &mut Ephemeris,
    ) -> Result<Vec<Step>, ExposureError> {
        let (start, end) = self.bounds(model, date)?;
        let ev = day_events(&model.location, date, &model.zone, delta_t)?;
        let air = Atmosphere::default();
        let step = Duration::minutes(i64::from(self.step_min));
        let mut out = Vec::new();
        let mut t0 = start;
        while t0 < end {
            let t1 = (t0 + step).min(end);
            let mid = t0 + (t1 - t0) / 2;
            let dt_s = (t1 - t0).num_milliseconds() as f64 / 1000.0;
            t0 = t1;
            let up = match ev.sun {
                Crossing::Crosses { rise, set } => mid >= rise && mid <= set,
                Crossing::AlwaysAbove => true,
                Crossing::AlwaysBelow => false,
            };
            if up {
                out.push(Step { mid, dt_s, sun: eph.sun_at(mid, delta_t)?.observe(&model.location, &air) });
            }
        }
        Ok(out)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_period_says_itself_in_one_form() {
        let d = |m, day| NaiveDate::from_ymd_opt(2026, m, day).unwrap();
        assert_eq!(Period::day(d(3, 21), 5).describe(), "2026-03-21, sunrise to sunset, 5-minute steps");
        let window = Window::parse("09:00-15:00").unwrap();
        let summer = Period { first: d(6, 1), last: d(8, 31), window, step_min: 10 };
        assert_eq!(summer.describe(), "2026-06-01 to 2026-08-31, 09:00-15:00, 10-minute steps");
    }
}

//! A point's day: the intervals of direct sun and shade between sunrise and sunset, with times.
//!
//! # Method
//! The exact ray test (see [`crate::shadow::exposure`]) is sampled every minute from sunrise to
//! sunset; each change between samples is then found by bisection to within a second. Changes that
//! start and end within the same minute can be missed (a mullion's shadow); the intervals are
//! otherwise exact to a second. The sun counts as up from sunrise to sunset (upper limb, standard
//! refraction, as the day events); the ray is cast at no less than 0.01° altitude, as for the maps.

use chrono::{DateTime, Duration, NaiveDate, Utc};
use serde::Serialize;

use super::grid::ExposureError;
use super::shade::Massing;
use super::sun_hours::MIN_CAST_ALTITUDE_DEG;
use crate::shadow::{exposure, Exposure, Receiver, ViewPoint};
use crate::site::{SiteModel, Volume, Wall};
use crate::solar::{day_events, Atmosphere, Crossing, Ephemeris};
use crate::time::DeltaT;

/// One stretch of a point's day.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Interval {
    /// Start.
    pub from: DateTime<Utc>,
    /// End.
    pub to: DateTime<Utc>,
    /// Whether the point is in direct sun.
    pub sunlit: bool,
    /// What shades it (the first feature found at the interval's middle), when shaded.
    pub by: Option<String>,
}

impl Interval {
    /// Length, hours.
    pub fn hours(&self) -> f64 {
        (self.to - self.from).num_milliseconds() as f64 / 3.6e6
    }
}

/// A point's day of sun and shade.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Timeline {
    /// The intervals from sunrise to sunset, in order; empty in polar night.
    pub intervals: Vec<Interval>,
    /// Hours of direct sun.
    pub sun_hours: f64,
    /// Hours the sun is up.
    pub day_hours: f64,
}

/// The massing of one kind, and a ray test against it.
pub(crate) struct PointSky<'a> {
    model: &'a SiteModel,
    volumes: Vec<Volume>,
    walls: Vec<Wall>,
    ground: Receiver,
    point: ViewPoint,
    eph: Ephemeris,
    delta_t: DeltaT,
}

impl<'a> PointSky<'a> {
    pub(crate) fn new(model: &'a SiteModel, point: ViewPoint, massing: Massing, delta_t: DeltaT) -> Self {
        PointSky {
            model,
            volumes: model.volumes.iter().filter(|v| massing.includes(v.status)).cloned().collect(),
            walls: model.walls.iter().filter(|w| massing.includes(w.status)).cloned().collect(),
            ground: Receiver::on(&model.ground, model.plan_rotation_deg, 0.0),
            point,
            eph: Ephemeris::new(),
            delta_t,
        }
    }

    /// Moves the test to `point`, keeping the massing.
    pub(crate) fn set_point(&mut self, point: ViewPoint) {
        self.point = point;
    }

    /// The ray test at `t` for a sun counted as up.
    pub(crate) fn at(&mut self, t: DateTime<Utc>) -> Result<Exposure, ExposureError> {
        let sun = self.eph.sun_at(t, self.delta_t)?.observe(&self.model.location, &Atmosphere::default());
        self.toward(self.model.plan_azimuth_deg(sun.azimuth_deg), sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG))
    }

    /// The ray test toward plan azimuth and altitude.
    pub(crate) fn toward(&self, azimuth_deg: f64, altitude_deg: f64) -> Result<Exposure, ExposureError> {
        exposure(self.point, &self.volumes, &self.walls, &self.ground, azimuth_deg, altitude_deg)
            .map_err(|e| ExposureError::Period(e.to_string()))
    }
}

/// The day of `point` on local `date`.
///
/// # Errors
/// [`ExposureError`] for a date the solar engine refuses or a non-finite point.
pub fn day_timeline(
    model: &SiteModel,
    point: ViewPoint,
    date: NaiveDate,
    massing: Massing,
    delta_t: DeltaT,
) -> Result<Timeline, ExposureError> {
    let ev = day_events(&model.location, date, &model.zone, delta_t)?;
    let (rise, set) = match ev.sun {
        Crossing::Crosses { rise, set } => (rise, set),
        Crossing::AlwaysAbove => (model.zone.start_of_day(date), model.zone.start_of_day(date + Duration::days(1))),
        Crossing::AlwaysBelow => return Ok(Timeline { intervals: vec![], sun_hours: 0.0, day_hours: 0.0 }),
    };
    let mut sky = PointSky::new(model, point, massing, delta_t);
    let lit = |e: &Exposure| *e == Exposure::Sunlit;
    // Times where the state changes, found by bisection between one-minute samples.
    let mut cuts = vec![rise];
    let mut t = rise;
    let mut state = lit(&sky.at(rise)?);
    while t < set {
        let next = (t + Duration::minutes(1)).min(set);
        let s = lit(&sky.at(next)?);
        if s != state {
            let (mut lo, mut hi) = (t, next);
            while hi - lo > Duration::milliseconds(500) {
                let mid = lo + (hi - lo) / 2;
                if lit(&sky.at(mid)?) == state {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            cuts.push(lo + (hi - lo) / 2);
            state = s;
        }
        t = next;
    }
    cuts.push(set);
    let mut intervals = Vec::with_capacity(cuts.len() - 1);
    for w in cuts.windows(2) {
        let e = sky.at(w[0] + (w[1] - w[0]) / 2)?;
        let by = match &e {
            Exposure::Shaded { by } => Some(by.clone()),
            _ => None,
        };
        intervals.push(Interval { from: w[0], to: w[1], sunlit: lit(&e), by });
    }
    let sun_hours = intervals.iter().filter(|i| i.sunlit).map(Interval::hours).sum();
    Ok(Timeline { intervals, sun_hours, day_hours: (set - rise).num_milliseconds() as f64 / 3.6e6 })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn open_point_is_sunlit_from_sunrise_to_sunset() {
        let mut m = crate::demo::demo();
        m.volumes.clear();
        m.walls.clear();
        let d = NaiveDate::from_ymd_opt(2026, 6, 21).unwrap();
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let t = day_timeline(&m, p, d, Massing::WithProposed, DeltaT::EspenakMeeus).unwrap();
        assert_eq!(t.intervals.len(), 1);
        assert!(t.intervals[0].sunlit);
        let day = day_events(&m.location, d, &m.zone, DeltaT::EspenakMeeus).unwrap().day_length();
        assert!((t.sun_hours - day.num_milliseconds() as f64 / 3.6e6).abs() < 1e-9);
    }

    #[test]
    fn a_wall_due_south_shades_the_middle_of_the_day() {
        // A 10 m wide, 20 m tall wall 5 m south of the point: around solar noon the sun stands behind
        // it, and the point is shaded by it; the intervals alternate sun, shade, sun.
        let mut m = crate::demo::demo();
        m.volumes.clear();
        m.plan_rotation_deg = 0.0;
        m.walls = vec![crate::site::Wall::new(
            "screen",
            crate::site::Status::Existing,
            geo::LineString::from(vec![(-5.0, -5.0), (5.0, -5.0)]),
            20.0,
        )
        .unwrap()];
        let d = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let t =
            day_timeline(&m, ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 }, d, Massing::Existing, DeltaT::EspenakMeeus)
                .unwrap();
        let kinds: Vec<bool> = t.intervals.iter().map(|i| i.sunlit).collect();
        assert_eq!(kinds, vec![true, false, true], "{:?}", t.intervals);
        assert_eq!(t.intervals[1].by.as_deref(), Some("screen"));
        // The shade is centred on the sun's transit within a few minutes (the wall is symmetric
        // about the meridian through the point; the sun's azimuth is not quite symmetric in time).
        let ev = day_events(&m.location, d, &m.zone, DeltaT::EspenakMeeus).unwrap();
        let mid = t.intervals[1].from + (t.intervals[1].to - t.intervals[1].from) / 2;
        assert!((mid - ev.transit).num_seconds().abs() < 300, "{mid} vs {}", ev.transit);
    }
}

//! Sunrise, solar noon (transit), sunset and twilight for a date at a site.
//!
//! # References
//! Reda, I. & Andreas, A. (2004, rev. 2008), NREL/TP-560-34302, Appendix A.2, "Sunrise, sun transit and
//! sunset": the sun's geocentric right ascension and declination at 0 TT on the day before, of and after
//! the date are interpolated (Meeus 1998, ch. 15) and each event is corrected once by the altitude error.
//!
//! [`rise_transit_set_ut`] is that procedure exactly as published, for one UT day, with each event
//! brought into that UT day. [`day_events`] answers the question a user asks — when does the sun rise,
//! culminate and set on this *local* date — by taking the transit that falls on the local date and
//! the rising and setting on either side of it, each computed within the UT day that contains it.

use chrono::{DateTime, Duration, NaiveDate, NaiveTime, Utc};
use serde::Serialize;

use super::input::{InputError, Site};
use super::spa::{limit_360, Geocentric, HORIZON_REFRACTION_DEG, SUN_RADIUS_DEG};
use crate::time::{julian_day, DeltaT, Zone};

/// Altitude of the sun's centre at sunrise and sunset, degrees: the upper limb on the apparent horizon
/// with the SPA's standard refraction, h₀′ = −(0.26667° + 0.5667°) = −0.8333° (Reda & Andreas 2004, A.2).
pub const SUNRISE_DEG: f64 = -(SUN_RADIUS_DEG + HORIZON_REFRACTION_DEG);

/// Altitude of the sun's centre at the start and end of civil twilight, degrees (common practice).
pub const CIVIL_TWILIGHT_DEG: f64 = -6.0;

/// The sun against one altitude over one day: two crossings, or none.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Crossing {
    /// The sun rises through the altitude at `rise` and sets through it at `set`.
    Crosses { rise: DateTime<Utc>, set: DateTime<Utc> },
    /// The sun stays above the altitude all day (polar day, or twilight all night).
    AlwaysAbove,
    /// The sun stays below the altitude all day (polar night).
    AlwaysBelow,
}

impl Crossing {
    /// Time between rising and setting; 24 h when always above and zero when always below.
    pub fn duration(&self) -> Duration {
        match self {
            Crossing::Crosses { rise, set } => *set - *rise,
            Crossing::AlwaysAbove => Duration::hours(24),
            Crossing::AlwaysBelow => Duration::zero(),
        }
    }
}

/// The sun's day at a site on one local date.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct DayEvents {
    /// The local date asked for.
    pub date: NaiveDate,
    /// Solar noon: the sun crosses the local meridian (transit).
    pub transit: DateTime<Utc>,
    /// Geometric (unrefracted, geocentric) altitude of the sun at transit, degrees.
    pub transit_altitude_deg: f64,
    /// Sunrise and sunset, at [`SUNRISE_DEG`].
    pub sun: Crossing,
    /// Civil dawn and dusk, at [`CIVIL_TWILIGHT_DEG`].
    pub civil_twilight: Crossing,
}

impl DayEvents {
    /// Day length, sunrise to sunset.
    pub fn day_length(&self) -> Duration {
        self.sun.duration()
    }
}

/// The A.2 procedure's result for one UT day, as fractions of that day (0 = 00:00 UT).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct UtDayEvents {
    /// Sun transit, fraction of the UT day.
    pub transit_frac: f64,
    /// Sunrise within the UT day, fraction; `None` when the sun does not cross the altitude.
    pub rise_frac: Option<f64>,
    /// Sunset within the UT day, fraction.
    pub set_frac: Option<f64>,
}

/// The paper's A.2 procedure for the UT day `date` at `site`, with ΔT in seconds and the event altitude
/// `h0_deg` (use [`SUNRISE_DEG`] for sunrise and sunset).
pub fn rise_transit_set_ut(date: NaiveDate, site: &Site, delta_t_s: f64, h0_deg: f64) -> UtDayEvents {
    let day = UtDay::new(date, site, delta_t_s);
    let m0 = day.transit_m();
    let transit_frac = day.refine(m0, None);
    let (rise_frac, set_frac) = match day.half_arc_deg(h0_deg) {
        Some(h0_arc) => (
            Some(day.refine((m0 - h0_arc / 360.0).rem_euclid(1.0), Some(h0_deg))),
            Some(day.refine((m0 + h0_arc / 360.0).rem_euclid(1.0), Some(h0_deg))),
        ),
        None => (None, None),
    };
    UtDayEvents { transit_frac, rise_frac, set_frac }
}

/// Sunrise, transit, sunset and civil twilight on the local `date` in `zone` at `site`.
///
/// The day is the transit (solar noon) that falls on the local date, with the rising before it and the
/// setting after it. Where clock time runs about 12 hours off solar time a local date can hold no
/// transit; the transit nearest local midday is then taken.
///
/// # Errors
/// [`InputError`] for a date outside the SPA's years or a non-finite ΔT.
pub fn day_events(site: &Site, date: NaiveDate, zone: &Zone, delta_t: DeltaT) -> Result<DayEvents, InputError> {
    let midday = zone.midday(date);
    // Checks the year and ΔT; ΔT at local midday serves the whole day.
    let (_, delta_t_s) = super::SunAtInstant::checked_inputs(midday, delta_t)?;

    // The transit that falls on the local date, nearest local midday: searched in the UT days around
    // it, since a transit close to midnight belongs to the neighbouring UT day's procedure.
    let base = midday.date_naive();
    let mut days = UtDays { site, delta_t_s, known: Vec::with_capacity(4) };
    let mut on_date: Option<(UtDay, f64, i64)> = None;
    let mut nearest: Option<(UtDay, f64, i64)> = None;
    for d in [base - Duration::days(1), base, base + Duration::days(1)] {
        let day = days.get(d);
        for shift in [-1.0, 0.0, 1.0] {
            let t = day.refine(day.transit_m() + shift, None);
            let instant = day.instant(t);
            let miss = (instant - midday).num_seconds().abs();
            if zone.local_date(instant) == date && on_date.as_ref().is_none_or(|b| miss < b.2) {
                on_date = Some((day, t, miss));
            }
            if nearest.as_ref().is_none_or(|b| miss < b.2) {
                nearest = Some((day, t, miss));
            }
        }
    }
    // No transit on the date happens only where clock time runs about 12 h off solar time and the
    // transit crosses midnight: then the transit nearest local midday is taken.
    let (day, t, _) = on_date.or(nearest).unwrap_or_else(|| {
        let day = days.get(base);
        (day, day.refine(day.transit_m(), None), 0)
    });

    Ok(DayEvents {
        date,
        transit: day.instant(t),
        transit_altitude_deg: day.altitude_deg(t),
        sun: crossing(&day, t, SUNRISE_DEG, &mut days),
        civil_twilight: crossing(&day, t, CIVIL_TWILIGHT_DEG, &mut days),
    })
}

/// The rising before and the setting after the transit at fraction `t` of `day`, at altitude `h0_deg`.
fn crossing(day: &UtDay, t: f64, h0_deg: f64, days: &mut UtDays) -> Crossing {
    let Some(arc) = day.half_arc_deg(h0_deg) else {
        return if day.altitude_deg(t) > h0_deg { Crossing::AlwaysAbove } else { Crossing::AlwaysBelow };
    };
    let mut event = |m_estimate: f64| {
        // Computed in the UT day that holds the event, where the interpolation is best (A.2).
        let k = m_estimate.floor();
        let host = days.get(day.date + Duration::days(k as i64));
        let local = m_estimate - k;
        let m = match host.half_arc_deg(h0_deg) {
            Some(host_arc) => {
                let sign = if m_estimate < t { -1.0 } else { 1.0 };
                let m = host.transit_m() + sign * host_arc / 360.0;
                m - (m - local).round() // the same event, brought next to the estimate
            }
            None => local,
        };
        host.instant(host.refine(m, Some(h0_deg)))
    };
    Crossing::Crosses { rise: event(t - arc / 360.0), set: event(t + arc / 360.0) }
}

/// The UT days one local date's events need (the transit's search and the risings and settings all
/// use the day before, of and after), each computed once: the same numbers, a seventh of the work.
struct UtDays<'a> {
    site: &'a Site,
    delta_t_s: f64,
    known: Vec<UtDay>,
}

impl UtDays<'_> {
    fn get(&mut self, date: NaiveDate) -> UtDay {
        if let Some(d) = self.known.iter().find(|d| d.date == date) {
            return *d;
        }
        let d = UtDay::new(date, self.site, self.delta_t_s);
        self.known.push(d);
        d
    }
}

/// The inputs of A.2 for one UT day.
#[derive(Debug, Clone, Copy)]
struct UtDay {
    date: NaiveDate,
    latitude_deg: f64,
    longitude_deg: f64,
    delta_t_s: f64,
    /// Apparent sidereal time at Greenwich at 0 UT, degrees (A.2 step 1).
    nu_deg: f64,
    /// Right ascension at 0 TT on the day before, of and after, degrees (step 2).
    alpha_deg: [f64; 3],
    /// Declination at the same three instants, degrees.
    delta_deg: [f64; 3],
}

impl UtDay {
    fn new(date: NaiveDate, site: &Site, delta_t_s: f64) -> Self {
        let jd0 = julian_day(date.and_time(NaiveTime::MIN).and_utc());
        let g = [-1.0, 0.0, 1.0].map(|d| Geocentric::at(jd0 + d, 0.0));
        // Step 1's sidereal time at 0 UT is the middle instant's (A.2 takes ΔT = 0 for both).
        let nu_deg = g[1].sidereal_time_deg;
        UtDay {
            date,
            latitude_deg: site.latitude_deg,
            longitude_deg: site.longitude_deg,
            delta_t_s,
            nu_deg,
            alpha_deg: g.map(|g| g.right_ascension_deg),
            delta_deg: g.map(|g| g.declination_deg),
        }
    }

    /// Approximate transit m₀, fraction of the day in 0…1 (step 3).
    fn transit_m(&self) -> f64 {
        ((self.alpha_deg[1] - self.longitude_deg - self.nu_deg) / 360.0).rem_euclid(1.0)
    }

    /// Local hour angle H₀ of the crossing of `h0_deg`, degrees 0…180, or `None` if never crossed (step 4).
    fn half_arc_deg(&self, h0_deg: f64) -> Option<f64> {
        let phi = self.latitude_deg.to_radians();
        let d = self.delta_deg[1].to_radians();
        let c = (h0_deg.to_radians().sin() - phi.sin() * d.sin()) / (phi.cos() * d.cos());
        (c.is_finite() && c.abs() <= 1.0).then(|| c.acos().to_degrees())
    }

    /// Declination and local hour angle (−180…180) of the sun at fraction `m` (steps 5–9).
    fn sun_at(&self, m: f64) -> (f64, f64) {
        let nu = self.nu_deg + 360.985_647 * m;
        let n = m + self.delta_t_s / 86_400.0;
        let interp = |v: [f64; 3]| {
            let lim = |x: f64| if x.abs() > 2.0 { x.rem_euclid(1.0) } else { x };
            let a = lim(v[1] - v[0]);
            let b = lim(v[2] - v[1]);
            v[1] + n * (a + b + (b - a) * n) / 2.0
        };
        let alpha = interp(self.alpha_deg);
        let delta = interp(self.delta_deg);
        let mut h = limit_360(nu + self.longitude_deg - alpha);
        if h > 180.0 {
            h -= 360.0;
        }
        (delta, h)
    }

    fn altitude_from(&self, delta_deg: f64, h_deg: f64) -> f64 {
        let phi = self.latitude_deg.to_radians();
        let d = delta_deg.to_radians();
        (phi.sin() * d.sin() + phi.cos() * d.cos() * h_deg.to_radians().cos()).asin().to_degrees()
    }

    /// Geometric altitude at fraction `m`, degrees.
    fn altitude_deg(&self, m: f64) -> f64 {
        let (d, h) = self.sun_at(m);
        self.altitude_from(d, h)
    }

    /// One correction of an event estimate `m` (step 10): the transit when `h0_deg` is `None`.
    fn refine(&self, m: f64, h0_deg: Option<f64>) -> f64 {
        let (d, h) = self.sun_at(m);
        match h0_deg {
            None => m - h / 360.0,
            Some(h0) => {
                let alt = self.altitude_from(d, h);
                let slope = 360.0 * d.to_radians().cos() * self.latitude_deg.to_radians().cos() * h.to_radians().sin();
                m + (alt - h0) / slope
            }
        }
    }

    fn instant(&self, frac: f64) -> DateTime<Utc> {
        let ms = (frac * 86_400_000.0).round() as i64;
        self.date.and_time(NaiveTime::MIN).and_utc() + Duration::milliseconds(ms)
    }
}

//! Julian days from instants and back.
//!
//! # References
//! Meeus, J. (1998), *Astronomical Algorithms*, 2nd ed., ch. 7: JD 2440587.5 is 1970-01-01 00:00 UT.
//! Dates are proleptic Gregorian (as in chrono), also before 1582.

use chrono::{DateTime, Datelike, TimeZone, Utc};

/// Julian day of the Unix epoch, 1970-01-01T00:00:00Z (Meeus 1998, ch. 7).
pub const UNIX_EPOCH_JD: f64 = 2_440_587.5;

const SECONDS_PER_DAY: f64 = 86_400.0;

/// Julian day (UT) of an instant, in days.
///
/// # Examples
/// ```
/// use chrono::{TimeZone, Utc};
/// // The SPA worked example: 2003-10-17 19:30:30 UT (Reda & Andreas 2004, Table A5.2).
/// let t = Utc.with_ymd_and_hms(2003, 10, 17, 19, 30, 30).unwrap();
/// assert!((sunlot::time::julian_day(t) - 2_452_930.312_847).abs() < 1e-6);
/// ```
pub fn julian_day(instant: DateTime<Utc>) -> f64 {
    let secs = instant.timestamp() as f64 + f64::from(instant.timestamp_subsec_nanos()) * 1e-9;
    UNIX_EPOCH_JD + secs / SECONDS_PER_DAY
}

/// The instant of a Julian day (UT), rounded to the millisecond; `None` outside chrono's range.
pub fn instant_from_julian_day(jd: f64) -> Option<DateTime<Utc>> {
    let ms = ((jd - UNIX_EPOCH_JD) * SECONDS_PER_DAY * 1000.0).round();
    if !ms.is_finite() || ms.abs() > 8.0e15 {
        return None;
    }
    Utc.timestamp_millis_opt(ms as i64).single()
}

/// Decimal year `y + (month − 0.5) / 12`, the argument of the Espenak–Meeus ΔT polynomials.
pub fn year_fraction(instant: DateTime<Utc>) -> f64 {
    f64::from(instant.year()) + (f64::from(instant.month()) - 0.5) / 12.0
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn j2000_epoch_is_2451545() {
        // Meeus (1998) ch. 7: 2000 January 1.5 = JD 2451545.0.
        let t = Utc.with_ymd_and_hms(2000, 1, 1, 12, 0, 0).unwrap();
        assert_abs_diff_eq!(julian_day(t), 2_451_545.0, epsilon = 1e-9);
    }

    #[test]
    fn meeus_example_7a_sputnik() {
        // Meeus (1998) Example 7.a: 1957 October 4.81 = JD 2436116.31.
        let t = Utc.with_ymd_and_hms(1957, 10, 4, 19, 26, 24).unwrap();
        assert_abs_diff_eq!(julian_day(t), 2_436_116.31, epsilon = 1e-6);
    }

    #[test]
    fn round_trip_to_the_millisecond() {
        let t = Utc.with_ymd_and_hms(2088, 2, 29, 23, 59, 59).unwrap();
        assert_eq!(instant_from_julian_day(julian_day(t)), Some(t));
    }
}

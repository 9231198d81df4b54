//! Time zones and the reading of times typed by a user.
//!
//! A [`Zone`] is an IANA zone (with its daylight-saving history, from the compact table of
//! [`super::zone_table`], generated from `chrono-tz`) or a fixed UTC offset.
//! Local wall-clock times are resolved to instants explicitly: a time skipped by a spring-forward change
//! is an error, and a time repeated by a fall-back change is an error unless the caller picks a [`Fold`].

use std::fmt;
use std::str::FromStr;

use chrono::{DateTime, FixedOffset, LocalResult, NaiveDate, NaiveDateTime, TimeZone, Utc};

use super::zone_table::{self, Kind, LocalKinds};

/// Errors in reading times and zones; each names what was wrong with the text given.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum TimeError {
    /// Not an RFC 3339 date-time with an offset.
    #[error("time {text:?} is not an RFC 3339 date-time with an offset (e.g. 2024-06-21T12:00:00+01:00)")]
    NotRfc3339 { text: String },
    /// Not a local date-time.
    #[error("local time {text:?} is not of the form YYYY-MM-DDTHH:MM[:SS]")]
    NotLocalTime { text: String },
    /// Not a date.
    #[error("date {text:?} is not of the form YYYY-MM-DD")]
    NotDate { text: String },
    /// Of the form YYYY-MM-DD, but no such day.
    #[error("date {text:?} does not exist (no such day in that month)")]
    NoSuchDay { text: String },
    /// Neither an IANA zone name nor a UTC offset.
    #[error("zone {text:?} is neither an IANA time zone name (e.g. Europe/London) nor an offset like +01:00")]
    UnknownZone { text: String },
    /// The wall time is skipped by a daylight-saving change.
    #[error("local time {wall} does not exist in {zone}: the clocks skip it (daylight-saving change)")]
    Nonexistent { wall: NaiveDateTime, zone: String },
    /// The wall time occurs twice and no fold was chosen.
    #[error(
        "local time {wall} occurs twice in {zone} (clocks go back): at {earlier} and at {later}; \
         choose the earlier or the later one"
    )]
    Ambiguous { wall: NaiveDateTime, zone: String, earlier: DateTime<FixedOffset>, later: DateTime<FixedOffset> },
}

/// Which of two instants a repeated wall-clock time means.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Fold {
    /// Refuse to choose: an ambiguous time is an error.
    Reject,
    /// The first occurrence (still on daylight-saving time).
    Earlier,
    /// The second occurrence (after the clocks went back).
    Later,
}

/// An IANA zone by name (links included), an index into the compact table.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct IanaZone(u16);

impl IanaZone {
    /// The zone's name as the database spells it (`Europe/London`).
    pub fn name(self) -> &'static str {
        zone_table::table().names[usize::from(self.0)].0
    }

    /// Every zone of the table (links included), in name order.
    pub fn all() -> impl Iterator<Item = IanaZone> {
        (0..zone_table::table().names.len()).filter_map(|i| u16::try_from(i).ok().map(IanaZone))
    }

    /// Every change of this zone's offset or abbreviation at or after `from` and before `to`: the
    /// instant, the offset in seconds east of UTC from then on, and its abbreviation.
    pub fn transitions(self, from: DateTime<Utc>, to: DateTime<Utc>) -> Vec<(DateTime<Utc>, i32, &'static str)> {
        let r = zone_table::table().record(usize::from(self.0));
        r.at_s
            .iter()
            .zip(&r.kinds)
            .filter(|(&t, _)| (from.timestamp()..to.timestamp()).contains(&t))
            .filter_map(|(&t, k)| Some((DateTime::from_timestamp(t, 0)?, k.offset_s, k.abbreviation)))
            .collect()
    }

    fn kind_at(self, instant: DateTime<Utc>) -> Kind {
        zone_table::table().record(usize::from(self.0)).at(instant.timestamp())
    }
}

/// The IANA tz release the zone table was made from (e.g. `2025b`).
pub fn tz_release() -> &'static str {
    zone_table::table().release
}

fn fixed(offset_s: i32) -> FixedOffset {
    FixedOffset::east_opt(offset_s).unwrap_or(FixedOffset::east_opt(0).expect("zero offset is valid"))
}

/// A time zone for reading and writing local clock times.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Zone {
    /// An IANA zone, with its daylight-saving history.
    Iana(IanaZone),
    /// A fixed offset from UTC.
    Fixed(FixedOffset),
}

impl Zone {
    /// UTC itself.
    pub fn utc() -> Self {
        Zone::Fixed(FixedOffset::east_opt(0).expect("zero offset is valid"))
    }

    /// The instant a local wall-clock time names in this zone.
    ///
    /// # Errors
    /// [`TimeError::Nonexistent`] in a spring-forward gap; [`TimeError::Ambiguous`] in a fall-back
    /// overlap when `fold` is [`Fold::Reject`].
    pub fn resolve(&self, wall: NaiveDateTime, fold: Fold) -> Result<DateTime<Utc>, TimeError> {
        match self {
            Zone::Iana(tz) => {
                let wall_utc = wall.and_utc();
                // The instant a wall time names under an offset: the wall time read as UTC, less the offset.
                let at = |k: Kind| wall_utc - chrono::Duration::seconds(i64::from(k.offset_s));
                let r = match zone_table::table().record(usize::from(tz.0)).local(wall_utc.timestamp()) {
                    LocalKinds::None => LocalResult::None,
                    LocalKinds::Single(k) => LocalResult::Single(at(k)),
                    LocalKinds::Ambiguous(a, b) => LocalResult::Ambiguous(at(a), at(b)),
                };
                pick(r, wall, fold, self)
            }
            Zone::Fixed(off) => pick(off.from_local_datetime(&wall), wall, fold, self),
        }
    }

    /// An instant as local time in this zone, with the offset in force then.
    pub fn local(&self, instant: DateTime<Utc>) -> DateTime<FixedOffset> {
        match self {
            Zone::Iana(tz) => instant.with_timezone(&fixed(tz.kind_at(instant).offset_s)),
            Zone::Fixed(off) => instant.with_timezone(off),
        }
    }

    /// The local date of an instant in this zone.
    pub fn local_date(&self, instant: DateTime<Utc>) -> NaiveDate {
        self.local(instant).date_naive()
    }

    /// A label of `instant` for figures: local date and clock time with the zone's abbreviation
    /// (e.g. `2026-06-21 15:00 BST`), or the offset for a fixed zone.
    pub fn label(&self, instant: DateTime<Utc>) -> String {
        match self {
            Zone::Iana(tz) => {
                format!("{} {}", self.local(instant).format("%Y-%m-%d %H:%M"), tz.kind_at(instant).abbreviation)
            }
            Zone::Fixed(off) => instant.with_timezone(off).format("%Y-%m-%d %H:%M %:z").to_string(),
        }
    }

    /// The first instant of a local date: midnight, or where a daylight-saving change skips midnight,
    /// the first whole hour that exists.
    pub fn start_of_day(&self, date: NaiveDate) -> DateTime<Utc> {
        (0..4)
            .find_map(|h| self.resolve(date.and_hms_opt(h, 0, 0).expect("hours 0-3 are valid"), Fold::Earlier).ok())
            .unwrap_or_else(|| date.and_time(chrono::NaiveTime::MIN).and_utc())
    }

    /// Local midday of a date, as an instant (12:00 never falls in a daylight-saving gap in any zone in
    /// use; if it ever does, the instant one hour later is taken).
    pub fn midday(&self, date: NaiveDate) -> DateTime<Utc> {
        let noon = date.and_hms_opt(12, 0, 0).expect("12:00 is a valid time");
        self.resolve(noon, Fold::Earlier)
            .or_else(|_| self.resolve(noon + chrono::Duration::hours(1), Fold::Earlier))
            .unwrap_or_else(|_| Utc.from_utc_datetime(&noon))
    }
}

fn pick<T: TimeZone>(
    r: LocalResult<DateTime<T>>,
    wall: NaiveDateTime,
    fold: Fold,
    zone: &Zone,
) -> Result<DateTime<Utc>, TimeError> {
    match r {
        LocalResult::Single(t) => Ok(t.with_timezone(&Utc)),
        LocalResult::None => Err(TimeError::Nonexistent { wall, zone: zone.to_string() }),
        LocalResult::Ambiguous(a, b) => {
            let (a, b) = (a.with_timezone(&Utc), b.with_timezone(&Utc));
            let (earlier, later) = if a <= b { (a, b) } else { (b, a) };
            match fold {
                Fold::Earlier => Ok(earlier),
                Fold::Later => Ok(later),
                Fold::Reject => Err(TimeError::Ambiguous {
                    wall,
                    zone: zone.to_string(),
                    earlier: zone.local(earlier),
                    later: zone.local(later),
                }),
            }
        }
    }
}

impl FromStr for Zone {
    type Err = TimeError;

    /// An IANA name (`Europe/London`), `UTC`/`Z`, or an offset `+HH:MM` / `-HH:MM`.
    fn from_str(text: &str) -> Result<Self, TimeError> {
        let t = text.trim();
        if t.eq_ignore_ascii_case("utc") || t == "Z" {
            return Ok(Zone::utc());
        }
        if let Some(i) = zone_table::table().find(t).and_then(|i| u16::try_from(i).ok()) {
            return Ok(Zone::Iana(IanaZone(i)));
        }
        parse_offset(t).map(Zone::Fixed).ok_or_else(|| TimeError::UnknownZone { text: text.to_string() })
    }
}

fn parse_offset(t: &str) -> Option<FixedOffset> {
    let (sign, rest) = match t.as_bytes().first()? {
        b'+' => (1, &t[1..]),
        b'-' => (-1, &t[1..]),
        _ => return None,
    };
    let (h, m) = match rest.split_once(':') {
        Some((h, m)) => (h, m),
        None if rest.len() == 4 => rest.split_at(2),
        None if rest.len() <= 2 => (rest, "0"),
        None => return None,
    };
    let (h, m): (i32, i32) = (h.parse().ok()?, m.parse().ok()?);
    if !(0..=18).contains(&h) || !(0..60).contains(&m) {
        return None;
    }
    FixedOffset::east_opt(sign * (h * 3600 + m * 60))
}

impl fmt::Display for Zone {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Zone::Iana(tz) => write!(f, "{}", tz.name()),
            Zone::Fixed(off) if off.local_minus_utc() == 0 => write!(f, "UTC"),
            Zone::Fixed(off) => write!(f, "UTC{off}"),
        }
    }
}

/// An RFC 3339 date-time with offset, as an instant plus the offset it was written in.
///
/// # Errors
/// [`TimeError::NotRfc3339`] naming the text.
pub fn parse_instant(text: &str) -> Result<(DateTime<Utc>, Zone), TimeError> {
    let t = DateTime::parse_from_rfc3339(text.trim()).map_err(|_| TimeError::NotRfc3339 { text: text.to_string() })?;
    Ok((t.with_timezone(&Utc), Zone::Fixed(*t.offset())))
}

/// A local date-time `YYYY-MM-DDTHH:MM[:SS[.f]]` (a space may stand for the `T`).
pub(crate) fn parse_wall(text: &str) -> Result<NaiveDateTime, TimeError> {
    let t = text.trim();
    ["%Y-%m-%dT%H:%M:%S%.f", "%Y-%m-%dT%H:%M", "%Y-%m-%d %H:%M:%S%.f", "%Y-%m-%d %H:%M"]
        .iter()
        .find_map(|f| NaiveDateTime::parse_from_str(t, f).ok())
        .ok_or_else(|| TimeError::NotLocalTime { text: text.to_string() })
}

/// A date `YYYY-MM-DD`.
pub(crate) fn parse_date(text: &str) -> Result<NaiveDate, TimeError> {
    NaiveDate::parse_from_str(text.trim(), "%Y-%m-%d").map_err(|_| {
        // The right form, a day the calendar does not have (2026-02-30, 2026-13-01)?
        let parts: Vec<&str> = text.trim().trim_start_matches('-').split('-').collect();
        let shaped = parts.len() == 3
            && parts.iter().all(|p| !p.is_empty() && p.chars().all(|c| c.is_ascii_digit()))
            && parts[1].len() <= 2
            && parts[2].len() <= 2;
        if shaped {
            TimeError::NoSuchDay { text: text.to_string() }
        } else {
            TimeError::NotDate { text: text.to_string() }
        }
    })
}

impl Zone {
    /// Reads a local wall time (`YYYY-MM-DDTHH:MM[:SS]`) in this zone.
    pub fn parse_local(&self, text: &str, fold: Fold) -> Result<DateTime<Utc>, TimeError> {
        self.resolve(parse_wall(text)?, fold)
    }

    /// Reads a date `YYYY-MM-DD`.
    pub fn parse_date(text: &str) -> Result<NaiveDate, TimeError> {
        parse_date(text)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn london() -> Zone {
        "Europe/London".parse().unwrap()
    }

    #[test]
    fn a_day_the_calendar_lacks_is_named_as_such() {
        assert!(matches!(parse_date("2026-02-30"), Err(TimeError::NoSuchDay { .. })));
        assert!(matches!(parse_date("2026-13-01"), Err(TimeError::NoSuchDay { .. })));
        assert!(matches!(parse_date("21/03/2026"), Err(TimeError::NotDate { .. })));
        assert!(parse_date("2026-3-1").is_ok());
    }

    #[test]
    fn summer_time_is_an_hour_ahead() {
        let t = london().parse_local("2024-06-21T12:00", Fold::Reject).unwrap();
        assert_eq!(t.to_rfc3339(), "2024-06-21T11:00:00+00:00");
        assert_eq!(london().local(t).to_rfc3339(), "2024-06-21T12:00:00+01:00");
    }

    #[test]
    fn spring_forward_gap_is_an_error() {
        // UK clocks went from 01:00 to 02:00 GMT on 2024-03-31 (UK Summer Time Order; common practice).
        let e = london().parse_local("2024-03-31T01:30", Fold::Earlier).unwrap_err();
        assert!(matches!(e, TimeError::Nonexistent { .. }), "{e}");
        assert!(e.to_string().contains("does not exist in Europe/London"));
    }

    #[test]
    fn fall_back_overlap_needs_a_choice() {
        let e = london().parse_local("2024-10-27T01:30", Fold::Reject).unwrap_err();
        assert!(matches!(e, TimeError::Ambiguous { .. }), "{e}");
        let a = london().parse_local("2024-10-27T01:30", Fold::Earlier).unwrap();
        let b = london().parse_local("2024-10-27T01:30", Fold::Later).unwrap();
        assert_eq!((b - a).num_minutes(), 60);
        assert_eq!(a.to_rfc3339(), "2024-10-27T00:30:00+00:00");
    }

    #[test]
    fn offsets_and_names_parse() {
        assert_eq!("+05:30".parse::<Zone>().unwrap().to_string(), "UTC+05:30");
        assert_eq!("-0700".parse::<Zone>().unwrap().to_string(), "UTC-07:00");
        assert_eq!("UTC".parse::<Zone>().unwrap().to_string(), "UTC");
        assert!(matches!("Mars/Olympus".parse::<Zone>(), Err(TimeError::UnknownZone { .. })));
        assert!(matches!(parse_instant("2024-06-21 12:00"), Err(TimeError::NotRfc3339 { .. })));
    }

    #[test]
    fn figure_labels_carry_the_zone_abbreviation() {
        let (t, _) = parse_instant("2026-06-21T14:00:00Z").unwrap();
        assert_eq!("Europe/London".parse::<Zone>().unwrap().label(t), "2026-06-21 15:00 BST");
        let (w, _) = parse_instant("2026-12-21T14:00:00Z").unwrap();
        assert_eq!("Europe/London".parse::<Zone>().unwrap().label(w), "2026-12-21 14:00 GMT");
        assert_eq!("+05:30".parse::<Zone>().unwrap().label(w), "2026-12-21 19:30 +05:30");
    }
}

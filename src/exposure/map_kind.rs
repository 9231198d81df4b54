//! The maps a page shows by name: which computation, over which period, at which cell size and time
//! step, and how its values read (title, unit, CSV column, colour range). One table, [`MAP_KINDS`]:
//! the wasm facade's `mapKinds` and `mapOfKind` and the widgets read it, so a new kind is a row here
//! (and its tests). Cell sizes and steps are the core's defaults where the kind has no reason to differ.

use chrono::{Datelike, NaiveDate};

use super::period::{Period, Window, WindowError, DEFAULT_CELL_M, DEFAULT_LONG_STEP_MIN, DEFAULT_STEP_MIN};
use super::{CellValues, Massing};
use crate::envelope::{DEFAULT_ENVELOPE_CELL_M, DEFAULT_ENVELOPE_WINDOW};

/// What a kind computes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MapCall {
    /// Hours of direct sun on every area with the massing.
    SunHours(Massing),
    /// Hours of direct sun the proposal takes, on every area but the lots (the neighbours').
    Lost,
    /// Clear-sky insolation on every area (Bird clear sky), kWh/m².
    Insolation,
    /// The solar envelope of the site's subject lot ([`crate::envelope::subject_lot`]) keeping
    /// shadows off the other gardens, terraces and amenity areas.
    Envelope,
}

/// The dates a kind covers, from the date the page shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MapSpan {
    /// That date.
    Day,
    /// The calendar year of that date.
    Year,
}

/// Where a kind's colour range ends (it starts at 0).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum RangeTop {
    /// The open ground's figure over the period (nothing on the site gets more).
    Open,
    /// The largest value of the map, at least this.
    Largest(f64),
}

/// A map the page can show by name.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MapKind {
    /// Name, e.g. `sun-hours`.
    pub id: &'static str,
    /// Figure title.
    pub title: &'static str,
    /// What a value is, for keys and labels.
    pub label: &'static str,
    /// Unit of the values.
    pub unit: &'static str,
    /// CSV and GeoJSON column of the values (unit in the name).
    pub column: &'static str,
    /// The choice's text in a page's menu of maps; `None`: not offered there (a widget may still
    /// ask for it by name).
    pub menu: Option<&'static str>,
    /// What it computes.
    pub call: MapCall,
    /// Its dates.
    pub span: MapSpan,
    /// Daily window, `HH:MM-HH:MM`; `None`: sunrise to sunset.
    pub window: Option<&'static str>,
    /// Cell size, metres.
    pub cell_m: f64,
    /// Time step, minutes.
    pub step_min: u32,
    /// End of the colour range.
    pub top: RangeTop,
}

/// Every map kind, in the order a menu lists them.
pub const MAP_KINDS: &[MapKind] = &[
    MapKind {
        id: "sun-hours",
        title: "Hours of direct sun",
        label: "hours of direct sun",
        unit: "h",
        column: "sun_hours",
        menu: Some("hours of sun on the day"),
        call: MapCall::SunHours(Massing::WithProposed),
        span: MapSpan::Day,
        window: None,
        cell_m: DEFAULT_CELL_M,
        step_min: DEFAULT_STEP_MIN,
        top: RangeTop::Open,
    },
    MapKind {
        id: "sun-hours-existing",
        title: "Hours of direct sun, existing massing only",
        label: "hours of direct sun",
        unit: "h",
        column: "sun_hours",
        menu: None,
        call: MapCall::SunHours(Massing::Existing),
        span: MapSpan::Day,
        window: None,
        cell_m: DEFAULT_CELL_M,
        step_min: DEFAULT_STEP_MIN,
        top: RangeTop::Open,
    },
    MapKind {
        id: "lost",
        title: "Hours of direct sun lost to the proposal",
        label: "hours of sun lost",
        unit: "h",
        column: "lost_h",
        menu: Some("hours lost to the proposal on the day"),
        call: MapCall::Lost,
        span: MapSpan::Day,
        window: None,
        cell_m: DEFAULT_CELL_M,
        step_min: DEFAULT_STEP_MIN,
        top: RangeTop::Largest(0.5),
    },
    MapKind {
        id: "insolation",
        title: "Clear-sky insolation on the ground",
        label: "insolation",
        unit: "kWh/m²",
        column: "insolation_kwh_m2",
        menu: Some("clear-sky insolation on the day"),
        call: MapCall::Insolation,
        span: MapSpan::Day,
        window: None,
        // Each cell also sums its sky view over the sky's patches: coarser cells and steps keep it
        // interactive.
        cell_m: 1.0,
        step_min: 10,
        top: RangeTop::Open,
    },
    MapKind {
        id: "year-hours",
        title: "Hours of direct sun over the year",
        label: "hours of direct sun",
        unit: "h",
        column: "sun_hours",
        menu: Some("hours of sun over the year"),
        call: MapCall::SunHours(Massing::WithProposed),
        span: MapSpan::Year,
        window: None,
        cell_m: 1.0,
        step_min: DEFAULT_LONG_STEP_MIN,
        top: RangeTop::Open,
    },
    MapKind {
        id: "envelope",
        title: "Solar envelope of the lot (09:00–15:00)",
        label: "envelope height",
        unit: "m",
        column: "envelope_height_m",
        menu: Some("solar envelope of the lot"),
        call: MapCall::Envelope,
        span: MapSpan::Day,
        window: Some(DEFAULT_ENVELOPE_WINDOW),
        cell_m: DEFAULT_ENVELOPE_CELL_M,
        step_min: DEFAULT_LONG_STEP_MIN,
        top: RangeTop::Largest(1.0),
    },
];

/// The kind called `id`.
///
/// # Examples
/// ```
/// use sunlot::exposure::map_kind;
/// // The hours of sun the proposal takes from the neighbours on the equinox, at the core's default
/// // cell and step.
/// let lost = map_kind("lost")?;
/// assert_eq!((lost.cell_m, lost.step_min, lost.column), (0.5, 5, "lost_h"));
/// let day = chrono::NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
/// assert_eq!(lost.caption(&lost.period(day)?), "2026-03-21, sunrise to sunset, 5-minute steps, 0.5 m cells");
/// // The year's kind covers the calendar year of the date shown.
/// let year = map_kind("year-hours")?.period(day)?;
/// assert_eq!((year.first.to_string(), year.last.to_string()), ("2026-01-01".into(), "2026-12-31".into()));
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
///
/// # Errors
/// An unknown name, with the names there are.
pub fn map_kind(id: &str) -> Result<&'static MapKind, String> {
    MAP_KINDS.iter().find(|k| k.id == id).ok_or_else(|| {
        let names: Vec<&str> = MAP_KINDS.iter().map(|k| k.id).collect();
        format!("{id:?} is not one of {}", names.join(", "))
    })
}

impl MapKind {
    /// The period the kind covers when the page shows `date`.
    ///
    /// # Errors
    /// [`WindowError`] for a bad window in the table (a test reads every row).
    pub fn period(&self, date: NaiveDate) -> Result<Period, WindowError> {
        let (first, last) = match self.span {
            MapSpan::Day => (date, date),
            MapSpan::Year => (
                NaiveDate::from_ymd_opt(date.year(), 1, 1).unwrap_or(date),
                NaiveDate::from_ymd_opt(date.year(), 12, 31).unwrap_or(date),
            ),
        };
        let window = self.window.map_or(Ok(Window::Daylight), Window::parse)?;
        Ok(Period { first, last, window, step_min: self.step_min })
    }

    /// The end of the colour range of `values` (NaN-free: at least a millionth), given the open
    /// ground's figure `open`.
    pub fn range_top(&self, values: &CellValues, open: f64) -> f64 {
        let top = match self.top {
            RangeTop::Open => open,
            RangeTop::Largest(floor) => values.values().filter(|v| v.is_finite()).fold(floor, f64::max),
        };
        if top.is_finite() {
            top.max(1e-6)
        } else {
            1e-6
        }
    }

    /// The caption of a map of this kind: its period in words and its cells, e.g. "21 Mar 2026,
    /// sunrise to sunset, 5-minute steps, 0.5 m cells".
    pub fn caption(&self, period: &Period) -> String {
        format!("{}, {} m cells", period.describe(), self.cell_m)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_kind_has_a_unique_name_a_period_and_sane_steps() {
        let date = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
        for (i, k) in MAP_KINDS.iter().enumerate() {
            assert!(MAP_KINDS[..i].iter().all(|o| o.id != k.id), "{} twice", k.id);
            let p = k.period(date).unwrap_or_else(|e| panic!("{}: {e}", k.id));
            assert!(p.first <= date && date <= p.last);
            assert!((1..=60).contains(&k.step_min) && k.cell_m > 0.0, "{}", k.id);
            assert!(k.column.chars().all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_'), "{}", k.column);
        }
        assert!(map_kind("nope").unwrap_err().contains("sun-hours, sun-hours-existing"));
    }

    #[test]
    fn the_year_kind_covers_the_calendar_year_and_the_envelope_its_window() {
        let date = NaiveDate::from_ymd_opt(2026, 7, 4).unwrap();
        let year = map_kind("year-hours").unwrap().period(date).unwrap();
        assert_eq!((year.first.to_string(), year.last.to_string()), ("2026-01-01".into(), "2026-12-31".into()));
        let env = map_kind("envelope").unwrap().period(date).unwrap();
        assert_eq!(env.window, Window::parse("09:00-15:00").unwrap());
        let day = map_kind("sun-hours").unwrap();
        assert_eq!(
            day.caption(&day.period(date).unwrap()),
            format!("{}, 0.5 m cells", day.period(date).unwrap().describe())
        );
    }

    #[test]
    fn the_colour_range_ends_at_the_open_figure_or_the_largest_value() {
        let values: CellValues = vec![Some(0.2), None, Some(f64::NAN), Some(3.5)].into();
        assert_eq!(map_kind("sun-hours").unwrap().range_top(&values, 11.9), 11.9);
        assert_eq!(map_kind("lost").unwrap().range_top(&values, 11.9), 3.5);
        assert_eq!(map_kind("lost").unwrap().range_top(&vec![Some(0.1)].into(), 11.9), 0.5);
        assert_eq!(map_kind("envelope").unwrap().range_top(&CellValues::default(), f64::NAN), 1.0);
        assert_eq!(map_kind("sun-hours").unwrap().range_top(&CellValues::default(), 0.0), 1e-6);
    }
}

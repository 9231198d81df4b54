//! Window rules as data: which windows of a site, and the test each must pass — a vertical sky
//! component, hours of direct sun on one day, or the year's and the winter's share of the sun-up
//! hours.

use chrono::NaiveDate;
use serde::{Deserialize, Serialize};
use serde_json::{Map, Value};

use super::rule::RuleError;
use crate::site::Status;

/// A rule on windows.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WindowRule {
    /// Short id, e.g. `bre-br209-window-sky`.
    pub id: String,
    /// What the rule says, in a sentence.
    pub title: String,
    /// The published document, with its edition; empty for a rule of the user's own.
    pub source: String,
    /// Whether the numbers are quoted from memory of the document rather than checked against it:
    /// shown beside every verdict, so the user confirms them against the document.
    pub from_memory: bool,
    /// Ids of the windows tested; empty: every window whose status is in `statuses`.
    pub window_ids: Vec<String>,
    /// Statuses of the windows tested when `window_ids` is empty.
    pub statuses: Vec<Status>,
    /// The test.
    #[serde(flatten)]
    pub test: WindowTest,
}

/// What a window must achieve.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "test", rename_all = "snake_case")]
pub enum WindowTest {
    /// The vertical sky component under the CIE standard overcast sky.
    WindowSky(SkyTest),
    /// Hours of direct sun on the window plane on one day.
    WindowSunDay(SunDayTest),
    /// The year's and the winter half-year's hours of direct sun as shares of the year's sun-up hours.
    WindowSunYear(SunYearTest),
}

/// Vertical sky component test: passes at `min_vsc_pct` or more, or (for a window that exists
/// before the proposal) at `min_ratio` times its former value or more.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SkyTest {
    /// Vertical sky component needed, percent.
    pub min_vsc_pct: f64,
    /// Or at least this times the value before the proposal (0–1).
    #[serde(default)]
    pub min_ratio: Option<f64>,
}

/// One-day sun test: at least `min_hours` of direct sun on the window plane on the date, in the
/// daily window, counting the sun only at `min_altitude_deg` or higher; the rule passes when at least
/// `min_share_of_windows` of the windows tested pass.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SunDayTest {
    /// Month of the test date, 1–12.
    pub month: u32,
    /// Day of the test date.
    pub day: u32,
    /// Start of the daily window, local clock time `HH:MM`; both ends absent: sunrise to sunset.
    #[serde(default)]
    pub from: Option<String>,
    /// End of the daily window, `HH:MM`.
    #[serde(default)]
    pub to: Option<String>,
    /// Hours of direct sun a window needs.
    pub min_hours: f64,
    /// Lowest solar altitude that counts, degrees.
    #[serde(default)]
    pub min_altitude_deg: f64,
    /// Share of the windows tested (0–1) that must pass for the rule to pass.
    #[serde(default = "all")]
    pub min_share_of_windows: f64,
    /// The hemisphere the date is written for (a mid-winter date is 21 June in the south, 21
    /// December in the north); at a site in the other hemisphere the test runs six months on, in the
    /// same season. Absent: the date as written everywhere.
    #[serde(default)]
    pub date_hemisphere: Option<Hemisphere>,
}

/// North or south of the equator.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Hemisphere {
    /// North of the equator.
    North,
    /// South of it.
    South,
}

impl SunDayTest {
    /// The test date in `year` at a site at `latitude_deg`: six months on from the written date when
    /// the site is in the other hemisphere than [`SunDayTest::date_hemisphere`].
    pub fn date_at(&self, year: i32, latitude_deg: f64) -> Option<NaiveDate> {
        let site = if latitude_deg >= 0.0 { Hemisphere::North } else { Hemisphere::South };
        let month = match self.date_hemisphere {
            Some(h) if h != site => (self.month + 5) % 12 + 1,
            _ => self.month,
        };
        NaiveDate::from_ymd_opt(year, month, self.day)
    }
}

fn all() -> f64 {
    1.0
}

/// Year test, on windows facing within `facing_within_deg` of the equator (due south in the
/// northern hemisphere): the window's hours of direct sun over the year and over the winter
/// half-year (21 September to 21 March north of the equator, 21 March to 21 September south of it),
/// each as a share of the year's sun-up hours at the site.
/// A window fails when, with the proposal, it is below `annual_min_share` or `winter_min_share`,
/// and below `min_ratio` times its former share in either period, and (for a window that exists
/// before) has lost more than `max_annual_loss` of the year.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SunYearTest {
    /// Year's share needed, 0–1.
    pub annual_min_share: f64,
    /// Winter half-year's share needed (of the whole year's sun-up hours), 0–1.
    pub winter_min_share: f64,
    /// Or at least this times the former share in both periods, 0–1.
    pub min_ratio: f64,
    /// Or a loss over the year of no more than this share, 0–1.
    pub max_annual_loss: f64,
    /// Windows facing further than this from the equator are not tested, degrees.
    pub facing_within_deg: f64,
}

/// The members every window rule has, besides its test's.
#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct Head {
    id: String,
    title: String,
    #[serde(default)]
    source: String,
    #[serde(default)]
    from_memory: bool,
    #[serde(default)]
    window_ids: Vec<String>,
    #[serde(default = "existing")]
    statuses: Vec<Status>,
}

const HEAD: &[&str] = &["id", "title", "source", "from_memory", "window_ids", "statuses"];

fn existing() -> Vec<Status> {
    vec![Status::Existing]
}

impl WindowRule {
    /// A window rule read from the members of a JSON object (its `test` one of `window_sky`,
    /// `window_sun_day`, `window_sun_year`) and checked.
    ///
    /// # Errors
    /// [`RuleError`] naming the member.
    pub fn from_members(members: Map<String, Value>) -> Result<Self, RuleError> {
        let (mut head, mut rest) = (Map::new(), Map::new());
        for (k, v) in members {
            if HEAD.contains(&k.as_str()) {
                head.insert(k, v);
            } else {
                rest.insert(k, v);
            }
        }
        let kind = match rest.remove("test") {
            Some(Value::String(s)) => s,
            other => return Err(RuleError::Json(format!("test: must be text naming the test, got {other:?}"))),
        };
        let h: Head = crate::json_check::read_value_with_path(Value::Object(head)).map_err(RuleError::Json)?;
        let rest = Value::Object(rest);
        let read = |e| RuleError::Json(e);
        let test = match kind.as_str() {
            "window_sky" => WindowTest::WindowSky(crate::json_check::read_value_with_path(rest).map_err(read)?),
            "window_sun_day" => WindowTest::WindowSunDay(crate::json_check::read_value_with_path(rest).map_err(read)?),
            "window_sun_year" => {
                WindowTest::WindowSunYear(crate::json_check::read_value_with_path(rest).map_err(read)?)
            }
            other => {
                return Err(RuleError::Json(format!(
                    "test: unknown test {other:?}; tests: area_sun, window_sky, window_sun_day, window_sun_year"
                )))
            }
        };
        WindowRule {
            id: h.id,
            title: h.title,
            source: h.source,
            from_memory: h.from_memory,
            window_ids: h.window_ids,
            statuses: h.statuses,
            test,
        }
        .validated()
    }

    fn field(&self, field: &'static str, reason: impl Into<String>) -> RuleError {
        RuleError::Field { rule: self.id.clone(), field, reason: reason.into() }
    }

    fn share(&self, field: &'static str, x: f64) -> Result<(), RuleError> {
        if x.is_finite() && (0.0..=1.0).contains(&x) {
            Ok(())
        } else {
            Err(self.field(field, format!("must be 0 to 1, got {x}")))
        }
    }

    /// Checks every field's range.
    ///
    /// # Errors
    /// [`RuleError::Field`] naming the first bad field.
    pub fn validated(self) -> Result<Self, RuleError> {
        if self.window_ids.is_empty() && self.statuses.is_empty() {
            return Err(self.field("statuses", "name at least one window status or window id"));
        }
        match &self.test {
            WindowTest::WindowSky(t) => {
                if !(t.min_vsc_pct.is_finite() && (0.0..=100.0).contains(&t.min_vsc_pct)) {
                    return Err(self.field("min_vsc_pct", format!("must be 0 to 100, got {}", t.min_vsc_pct)));
                }
                if let Some(r) = t.min_ratio {
                    self.share("min_ratio", r)?;
                }
            }
            WindowTest::WindowSunDay(t) => {
                if NaiveDate::from_ymd_opt(2024, t.month, t.day).is_none() {
                    return Err(self.field("day", format!("{}-{} is not a date", t.month, t.day)));
                }
                if !(t.min_hours.is_finite() && (0.0..=24.0).contains(&t.min_hours)) {
                    return Err(self.field("min_hours", format!("must be 0 to 24, got {}", t.min_hours)));
                }
                if !(t.min_altitude_deg.is_finite() && (0.0..=90.0).contains(&t.min_altitude_deg)) {
                    return Err(self.field("min_altitude_deg", format!("must be 0 to 90, got {}", t.min_altitude_deg)));
                }
                self.share("min_share_of_windows", t.min_share_of_windows)?;
                super::rule::clock_window(&self.id, &t.from, &t.to)?;
            }
            WindowTest::WindowSunYear(t) => {
                self.share("annual_min_share", t.annual_min_share)?;
                self.share("winter_min_share", t.winter_min_share)?;
                self.share("min_ratio", t.min_ratio)?;
                self.share("max_annual_loss", t.max_annual_loss)?;
                if !(t.facing_within_deg.is_finite() && (0.0..=180.0).contains(&t.facing_within_deg)) {
                    return Err(
                        self.field("facing_within_deg", format!("must be 0 to 180, got {}", t.facing_within_deg))
                    );
                }
            }
        }
        Ok(self)
    }

    /// The rule as pretty JSON.
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(self).unwrap_or_default()
    }
}

//! A sunlight rule as data, read from and written to JSON.

use chrono::{NaiveDate, NaiveTime};
use serde::{Deserialize, Serialize};

use super::window_rule::WindowRule;
use crate::site::AreaKind;

/// Problems with a rule or a check request; found before any work starts.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RuleError {
    /// A field out of its range or unreadable.
    #[error("rule {rule:?}: {field}: {reason}")]
    Field { rule: String, field: &'static str, reason: String },
    /// The rule names an area the site does not have.
    #[error("rule {rule:?}: the site has no area {area:?}")]
    UnknownArea { rule: String, area: String },
    /// No area of the site is picked by the rule.
    #[error("rule {rule:?}: no area of the site is of the kinds {kinds} or named by the rule")]
    NoAreas { rule: String, kinds: String },
    /// Not a rule file.
    #[error("rule file: {0}")]
    Json(String),
    /// No preset of that name.
    #[error("no rule preset {0:?}; presets: {1}")]
    UnknownPreset(String, String),
    /// The computation failed or was cancelled.
    #[error("{0}")]
    Exposure(#[from] crate::exposure::ExposureError),
}

/// How the share test and the ratio test combine.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Combine {
    /// An area passes when either test passes (the loss is acceptable if the area stays well lit).
    Either,
    /// An area passes only when both pass.
    Both,
}

/// A rule: which areas, on which date and hours, how much sun on how much of each area.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Rule {
    /// Short id, e.g. `bre-br209-amenity`.
    pub id: String,
    /// What the rule says, in a sentence.
    pub title: String,
    /// The published document it comes from, with its edition; empty for a rule of the user's own.
    #[serde(default)]
    pub source: String,
    /// Month of the test date, 1–12.
    pub month: u32,
    /// Day of the test date.
    pub day: u32,
    /// Daily window as local clock times `HH:MM`; both absent: sunrise to sunset.
    #[serde(default)]
    pub from: Option<String>,
    /// End of the daily window, `HH:MM`.
    #[serde(default)]
    pub to: Option<String>,
    /// Hours of direct sun a cell needs.
    pub min_hours: f64,
    /// Share of the area (0–1) that must get `min_hours`, after the proposal.
    pub min_share: f64,
    /// Optional: the after area with `min_hours` must be at least this times the before area.
    #[serde(default)]
    pub min_ratio: Option<f64>,
    /// How the two tests combine when both are given.
    #[serde(default = "default_combine")]
    pub combine: Combine,
    /// Area kinds the rule applies to.
    #[serde(default)]
    pub area_kinds: Vec<AreaKind>,
    /// Area ids the rule applies to (besides those of `area_kinds`).
    #[serde(default)]
    pub area_ids: Vec<String>,
}

/// Largest rule text read, bytes (a rule is a few hundred).
const MAX_RULE_TEXT_BYTES: usize = 1024 * 1024;

fn default_combine() -> Combine {
    Combine::Either
}

impl Rule {
    /// A rule read from JSON and checked.
    ///
    /// # Errors
    /// [`RuleError`] naming the field.
    pub fn from_json(text: &str) -> Result<Self, RuleError> {
        crate::limits::within("rule", text.len() as f64, MAX_RULE_TEXT_BYTES as f64, "bytes")
            .map_err(|e| RuleError::Json(e.to_string()))?;
        crate::json_check::unique_members(text).map_err(RuleError::Json)?;
        let r: Rule = crate::json_check::read_with_path(text).map_err(RuleError::Json)?;
        r.validated()
    }

    fn field(&self, field: &'static str, reason: impl Into<String>) -> RuleError {
        RuleError::Field { rule: self.id.clone(), field, reason: reason.into() }
    }

    /// Checks every field's range.
    ///
    /// # Errors
    /// [`RuleError::Field`] naming the first bad field.
    pub fn validated(self) -> Result<Self, RuleError> {
        if NaiveDate::from_ymd_opt(2024, self.month, self.day).is_none() {
            return Err(self.field("day", format!("{}-{} is not a date", self.month, self.day)));
        }
        if !(self.min_hours.is_finite() && (0.0..=24.0).contains(&self.min_hours)) {
            return Err(self.field("min_hours", format!("must be 0 to 24, got {}", self.min_hours)));
        }
        if !(self.min_share.is_finite() && (0.0..=1.0).contains(&self.min_share)) {
            return Err(self.field("min_share", format!("must be 0 to 1, got {}", self.min_share)));
        }
        if let Some(r) = self.min_ratio {
            if !(r.is_finite() && (0.0..=1.0).contains(&r)) {
                return Err(self.field("min_ratio", format!("must be 0 to 1, got {r}")));
            }
        }
        self.window_times()?;
        if self.area_kinds.is_empty() && self.area_ids.is_empty() {
            return Err(self.field("area_kinds", "name at least one area kind or area id"));
        }
        Ok(self)
    }

    /// The daily window's clock times; both `None` for sunrise to sunset.
    ///
    /// # Errors
    /// [`RuleError::Field`] for an unreadable time, only one end given, or an empty window.
    pub fn window_times(&self) -> Result<(Option<NaiveTime>, Option<NaiveTime>), RuleError> {
        clock_window(&self.id, &self.from, &self.to)
    }

    /// The rule as pretty JSON.
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(self).unwrap_or_default()
    }
}

/// A rule's daily window from its `from` and `to` members (`HH:MM`); both `None` for sunrise to
/// sunset.
///
/// # Errors
/// [`RuleError::Field`] for an unreadable time, only one end given, or an empty or inverted window.
pub(crate) fn clock_window(
    rule: &str,
    from: &Option<String>,
    to: &Option<String>,
) -> Result<(Option<NaiveTime>, Option<NaiveTime>), RuleError> {
    let field = |field, reason: String| RuleError::Field { rule: rule.to_string(), field, reason };
    let parse = |name, s: &Option<String>| {
        s.as_deref()
            .map(|t| NaiveTime::parse_from_str(t, "%H:%M").map_err(|_| field(name, format!("{t:?} is not HH:MM"))))
            .transpose()
    };
    let (f, t) = (parse("from", from)?, parse("to", to)?);
    if f.is_some() != t.is_some() {
        return Err(field("from", "give both ends of the window, or neither".into()));
    }
    if let (Some(f), Some(t)) = (f, t) {
        if t <= f {
            return Err(field("to", format!("the window {f}–{t} is empty or inverted")));
        }
    }
    Ok((f, t))
}

/// Any rule: on areas ([`Rule`]) or on windows ([`WindowRule`]).
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(untagged)]
pub enum AnyRule {
    /// A share of each area with enough hours of sun.
    Area(Rule),
    /// A test of each window.
    Window(WindowRule),
}

impl AnyRule {
    /// A rule read from JSON: its `test` member picks the kind (`area_sun`, the default when absent,
    /// or one of the window tests).
    ///
    /// # Errors
    /// [`RuleError`] naming the member.
    pub fn from_json(text: &str) -> Result<Self, RuleError> {
        crate::limits::within("rule", text.len() as f64, MAX_RULE_TEXT_BYTES as f64, "bytes")
            .map_err(|e| RuleError::Json(e.to_string()))?;
        crate::json_check::unique_members(text).map_err(RuleError::Json)?;
        #[derive(Deserialize)]
        struct Probe {
            #[serde(default)]
            test: Option<serde_json::Value>,
        }
        let probe: Probe = serde_json::from_str(text).map_err(|e| RuleError::Json(e.to_string()))?;
        match probe.test {
            None => Rule::from_json(text).map(AnyRule::Area),
            Some(serde_json::Value::String(t)) if t == "area_sun" => {
                let mut members: serde_json::Map<String, serde_json::Value> =
                    serde_json::from_str(text).map_err(|e| RuleError::Json(e.to_string()))?;
                members.remove("test");
                let r: Rule = crate::json_check::read_value_with_path(serde_json::Value::Object(members))
                    .map_err(RuleError::Json)?;
                r.validated().map(AnyRule::Area)
            }
            Some(_) => {
                let members = serde_json::from_str(text).map_err(|e| RuleError::Json(e.to_string()))?;
                WindowRule::from_members(members).map(AnyRule::Window)
            }
        }
    }

    /// The rule's id.
    pub fn id(&self) -> &str {
        match self {
            AnyRule::Area(r) => &r.id,
            AnyRule::Window(r) => &r.id,
        }
    }

    /// The rule as pretty JSON.
    pub fn to_json(&self) -> String {
        match self {
            AnyRule::Area(r) => r.to_json(),
            AnyRule::Window(r) => r.to_json(),
        }
    }
}

//! A sunlight rule as data, read from and written to JSON.

use chrono::{NaiveDate, NaiveTime};
use serde::{Deserialize, Serialize};

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
        let (from, to) = self.window_times()?;
        if let (Some(f), Some(t)) = (from, to) {
            if t <= f {
                return Err(self.field("to", format!("the window {f}–{t} is empty or inverted")));
            }
        }
        if self.area_kinds.is_empty() && self.area_ids.is_empty() {
            return Err(self.field("area_kinds", "name at least one area kind or area id"));
        }
        Ok(self)
    }

    /// The daily window's clock times; both `None` for sunrise to sunset.
    ///
    /// # Errors
    /// [`RuleError::Field`] for an unreadable time or only one end given.
    pub fn window_times(&self) -> Result<(Option<NaiveTime>, Option<NaiveTime>), RuleError> {
        let parse = |field, s: &Option<String>| {
            s.as_deref()
                .map(|t| {
                    NaiveTime::parse_from_str(t, "%H:%M").map_err(|_| self.field(field, format!("{t:?} is not HH:MM")))
                })
                .transpose()
        };
        let (f, t) = (parse("from", &self.from)?, parse("to", &self.to)?);
        if f.is_some() != t.is_some() {
            return Err(self.field("from", "give both ends of the window, or neither"));
        }
        Ok((f, t))
    }

    /// The rule as pretty JSON.
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(self).unwrap_or_default()
    }
}

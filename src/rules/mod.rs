//! Planning-rule checks. A rule is data: on areas ("at least P % of an area gets at least H hours of
//! direct sun on date D between T1 and T2", optionally "… or / and the after value is at least R ×
//! the before value") or on windows (a vertical sky component, hours of sun on a day, the year's and
//! the winter's share of sun). Presets cite published guidance, and a check names each area or
//! window with its figures, pass or fail and the margin. Results are indicative: local planning codes
//! and a licensed professional's assessment govern.

mod check;
mod presets;
mod rule;
mod window_check;
mod window_rule;

pub use check::{check_rule, AreaCheck, CheckReport, CheckRequest, CAUTION};
pub use presets::{area_preset, preset, presets_help, Preset, DEFAULT_AREA_PRESET, PRESETS};
pub use rule::{AnyRule, Combine, Rule, RuleError};
pub use window_check::{check_windows, Figure, WindowCheck, WindowCheckRequest, WindowReport, CLEAR_SKY_CAUTION};
pub use window_rule::{Hemisphere, SkyTest, SunDayTest, SunYearTest, WindowRule, WindowTest};

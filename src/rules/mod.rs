//! Planning-rule checks: a rule is data ("at least P % of an area gets at least H hours of direct
//! sun on date D between T1 and T2", optionally "… or / and the after value is at least R × the
//! before value"), presets cite published guidance, and a check names each area with its figures,
//! pass or fail and the margin. Results are indicative: local planning codes and a licensed
//! professional's assessment govern.

mod check;
mod presets;
mod rule;

pub use check::{check_rule, AreaCheck, CheckReport, CheckRequest, CAUTION};
pub use presets::{preset, PRESETS};
pub use rule::{Combine, Rule, RuleError};

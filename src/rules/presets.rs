//! Rules whose numbers come from published planning guidance, each citing its document and edition.

use super::rule::{Combine, Rule, RuleError};
use crate::site::AreaKind;

/// The ids of the presets.
pub const PRESETS: &[&str] = &["bre-br209-amenity"];

/// The preset named `id`.
///
/// # Errors
/// [`RuleError::UnknownPreset`] listing the presets.
pub fn preset(id: &str) -> Result<Rule, RuleError> {
    match id {
        // BRE BR 209, "Site layout planning for daylight and sunlight: a guide to good practice",
        // 3rd edition (2022), and the same numbers in the 2nd edition (2011): a garden or amenity
        // area is adequately sunlit if at least half of it receives at least 2 hours of sun on
        // 21 March; after a development, if it fails that and the area so sunlit is less than 0.8
        // times its former value, the loss is likely to be noticeable (numbers as listed in this
        // project's references; wording paraphrased).
        "bre-br209-amenity" => Ok(Rule {
            id: id.into(),
            title: "At least half of each garden or amenity area gets at least 2 hours of direct sun on 21 March, \
                    or the area so sunlit is at least 0.8 times its former value"
                .into(),
            source: "BRE BR 209, Site layout planning for daylight and sunlight: a guide to good practice, \
                     3rd edition (2022); same numbers in the 2nd edition (2011)"
                .into(),
            month: 3,
            day: 21,
            from: None,
            to: None,
            min_hours: 2.0,
            min_share: 0.5,
            min_ratio: Some(0.8),
            combine: Combine::Either,
            area_kinds: vec![AreaKind::Garden, AreaKind::Amenity],
            area_ids: vec![],
        }),
        _ => Err(RuleError::UnknownPreset(id.into(), PRESETS.join(", "))),
    }
}

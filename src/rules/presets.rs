//! Rules whose numbers come from published planning guidance, each citing its document and edition.
//! One table ([`PRESETS`]): the CLI's help and list, the facade's list and the defaults are made
//! from it.

use super::rule::{AnyRule, Combine, Rule, RuleError};
use super::window_rule::{Hemisphere, SkyTest, SunDayTest, SunYearTest, WindowRule, WindowTest};
use crate::site::{AreaKind, Status};

/// A preset: its id, what it is for, and the rule.
#[derive(Debug, Clone, Copy)]
pub struct Preset {
    /// The id (`--rule ID`).
    pub id: &'static str,
    /// Where it applies and to what, in a line.
    pub summary: &'static str,
    /// The rule.
    pub rule: fn() -> AnyRule,
}

/// The default rule for areas.
pub const DEFAULT_AREA_PRESET: &str = "bre-br209-amenity";

const BR209: &str = "BRE BR 209, Site layout planning for daylight and sunlight: a guide to good practice, \
                     3rd edition (2022); same numbers in the 2nd edition (2011)";

/// Every preset.
pub const PRESETS: &[Preset] = &[
    Preset {
        id: "bre-br209-amenity",
        summary: "BRE BR 209 (UK): half of each garden or amenity area with 2 h of sun on 21 March, or 0.8 × before",
        rule: br209_amenity,
    },
    Preset {
        id: "bre-br209-window-sky",
        summary: "BRE BR 209 (UK): each existing window's vertical sky component at least 27 %, or 0.8 × before",
        rule: br209_window_sky,
    },
    Preset {
        id: "bre-br209-window-sun",
        summary: "BRE BR 209 (UK): south-facing existing windows' share of the year's and the winter's sun (clear-sky \
                  stand-in for probable sunlight hours)",
        rule: br209_window_sun,
    },
    Preset {
        id: "nsw-adg-window-sun",
        summary: "NSW Apartment Design Guide 2015 (Australia): 70 % of windows with 2 h of sun 09:00-15:00 at mid-winter (21 June in the south)",
        rule: nsw_adg_window_sun,
    },
    Preset {
        id: "en17037-window-sun",
        summary: "EN 17037:2018 (Europe): each window with 1.5 h of sun on 21 March (EN 17037 minimum level)",
        rule: en17037_window_sun,
    },
    Preset {
        id: "din5034-window-sun",
        summary: "DIN 5034-1:2011 (Germany): each window with 1 h of sun above 6° altitude on 17 January",
        rule: din5034_window_sun,
    },
];

/// The preset named `id`.
///
/// # Errors
/// [`RuleError::UnknownPreset`] listing the presets.
pub fn preset(id: &str) -> Result<AnyRule, RuleError> {
    PRESETS
        .iter()
        .find(|p| p.id == id)
        .map(|p| (p.rule)())
        .ok_or_else(|| RuleError::UnknownPreset(id.into(), PRESETS.iter().map(|p| p.id).collect::<Vec<_>>().join(", ")))
}

/// The area preset named `id`.
///
/// # Errors
/// [`RuleError::UnknownPreset`], or [`RuleError::Field`] when the preset is a window rule.
pub fn area_preset(id: &str) -> Result<Rule, RuleError> {
    match preset(id)? {
        AnyRule::Area(r) => Ok(r),
        AnyRule::Window(_) => {
            Err(RuleError::Field { rule: id.into(), field: "test", reason: "a window rule, not an area rule".into() })
        }
    }
}

/// The presets as help text: a line each.
pub fn presets_help() -> String {
    let width = PRESETS.iter().map(|p| p.id.len()).max().unwrap_or(0);
    let mut out =
        String::from("Presets (sources with each report; values marked there as from memory must be checked):\n");
    for p in PRESETS {
        out += &format!("  {:width$}  {}\n", p.id, p.summary);
    }
    out
}

// BRE BR 209, 3rd edition (2022), and the same numbers in the 2nd edition (2011): a garden or
// amenity area is adequately sunlit if at least half of it receives at least 2 hours of sun on
// 21 March; after a development, if it fails that and the area so sunlit is less than 0.8 times its
// former value, the loss is likely to be noticeable (numbers as listed in this project's references;
// wording paraphrased).
fn br209_amenity() -> AnyRule {
    AnyRule::Area(Rule {
        id: "bre-br209-amenity".into(),
        title: "At least half of each garden or amenity area gets at least 2 hours of direct sun on 21 March, \
                or the area so sunlit is at least 0.8 times its former value"
            .into(),
        source: BR209.into(),
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
    })
}

/// A window preset; `from_memory` when its numbers are not in this project's references.
fn window_rule(
    id: &str,
    title: &str,
    source: &str,
    from_memory: bool,
    statuses: Vec<Status>,
    test: WindowTest,
) -> AnyRule {
    AnyRule::Window(WindowRule {
        id: id.into(),
        title: title.into(),
        source: source.into(),
        from_memory,
        window_ids: vec![],
        statuses,
        test,
    })
}

// BR 209 (2022; 2011), diffuse daylight to existing windows: if the vertical sky component with the
// development is both less than 27 % and less than 0.8 times its former value, occupants are likely
// to notice the reduction. Numbers from memory.
fn br209_window_sky() -> AnyRule {
    window_rule(
        "bre-br209-window-sky",
        "Each existing window keeps a vertical sky component of at least 27 %, or at least 0.8 times its former value",
        BR209,
        true,
        vec![Status::Existing],
        WindowTest::WindowSky(SkyTest { min_vsc_pct: 27.0, min_ratio: Some(0.8) }),
    )
}

// BR 209 (2022; 2011), sunlight to existing windows facing within 90° of due south: adversely
// affected if the window's centre receives less than 25 % of annual probable sunlight hours, or less
// than 5 % of them between 21 September and 21 March (25 % and 5 % are in this project's references),
// and less than 0.8 times its former sunlight hours in either period, and has a reduction over the
// year greater than 4 % of annual probable sunlight hours (0.8 and 4 % from memory). Probable sunlight
// hours weigh each sun position by the local sunshine record, which sunlot does not have: the shares
// here are of clear-sky sun-up hours, the same test when sunshine is equally likely at every sun
// position, and only indicative otherwise.
fn br209_window_sun() -> AnyRule {
    window_rule(
        "bre-br209-window-sun",
        "Each existing window facing within 90° of due south gets at least 25 % of the year's sun-up hours as \
         direct sun, 5 % in the winter half-year, or keeps 0.8 times its former share in both, or loses no more \
         than 4 % of the year (clear-sky hours standing in for probable sunlight hours)",
        BR209,
        true,
        vec![Status::Existing],
        WindowTest::WindowSunYear(SunYearTest {
            annual_min_share: 0.25,
            winter_min_share: 0.05,
            min_ratio: 0.8,
            max_annual_loss: 0.04,
            facing_within_deg: 90.0,
        }),
    )
}

// NSW Apartment Design Guide (2015), objective 4A-1, design criterion 1: living rooms and private
// open spaces of at least 70 % of apartments receive a minimum of 2 hours of direct sunlight between
// 9 am and 3 pm at mid-winter in the Sydney Metropolitan Area and the Newcastle and Wollongong local
// government areas (3 hours elsewhere). Numbers as listed in this project's references.
fn nsw_adg_window_sun() -> AnyRule {
    window_rule(
        "nsw-adg-window-sun",
        "At least 70 % of the living-room windows tested get at least 2 hours of direct sun between 09:00 and \
         15:00 at mid-winter, 21 June (21 December north of the equator; Sydney, Newcastle and Wollongong; 3 hours \
         elsewhere)",
        "NSW Department of Planning and Environment, Apartment Design Guide (July 2015), objective 4A-1, \
         design criterion 1",
        false,
        vec![Status::Existing, Status::Proposed],
        WindowTest::WindowSunDay(SunDayTest {
            month: 6,
            day: 21,
            from: Some("09:00".into()),
            to: Some("15:00".into()),
            min_hours: 2.0,
            min_altitude_deg: 0.0,
            min_share_of_windows: 0.7,
            date_hemisphere: Some(Hemisphere::South),
        }),
    )
}

// EN 17037:2018, Daylight in buildings, exposure to sunlight (from memory): a habitable room
// should receive direct sunlight for at least 1.5 hours (minimum level; 3 h medium, 4 h high) on a
// chosen date between 1 February and 21 March, on a clear day, at a reference point in the window.
// The standard also sets a lowest solar altitude that counts, by location; set `min_altitude_deg`
// from it, it is 0 here.
fn en17037_window_sun() -> AnyRule {
    window_rule(
        "en17037-window-sun",
        "Each window tested gets at least 1.5 hours of direct sun on 21 March (minimum level; 3 h medium, 4 h high; \
         any date from 1 February to 21 March may be chosen)",
        "CEN EN 17037:2018, Daylight in buildings, exposure to sunlight",
        true,
        vec![Status::Existing, Status::Proposed],
        WindowTest::WindowSunDay(SunDayTest {
            month: 3,
            day: 21,
            from: None,
            to: None,
            min_hours: 1.5,
            min_altitude_deg: 0.0,
            min_share_of_windows: 1.0,
            date_hemisphere: Some(Hemisphere::North),
        }),
    )
}

// DIN 5034-1:2011-07, Daylight in interiors, general requirements (from memory): a dwelling is
// adequately sunlit if at least one living room can receive at least 1 hour of possible sunshine on
// 17 January (and 4 hours at an equinox), counting the sun only above 6° altitude.
fn din5034_window_sun() -> AnyRule {
    window_rule(
        "din5034-window-sun",
        "Each window tested gets at least 1 hour of direct sun above 6° solar altitude on 17 January",
        "DIN 5034-1:2011-07, Tageslicht in Innenräumen, Teil 1: Allgemeine Anforderungen",
        true,
        vec![Status::Existing, Status::Proposed],
        WindowTest::WindowSunDay(SunDayTest {
            month: 1,
            day: 17,
            from: None,
            to: None,
            min_hours: 1.0,
            min_altitude_deg: 6.0,
            min_share_of_windows: 1.0,
            date_hemisphere: Some(Hemisphere::North),
        }),
    )
}

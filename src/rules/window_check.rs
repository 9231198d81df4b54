//! Checking a site's windows against a window rule, before and with the proposal.

use chrono::{Datelike, NaiveDate};
use serde::Serialize;

use super::rule::{clock_window, RuleError};
use super::window_rule::{SkyTest, SunDayTest, SunYearTest, WindowRule, WindowTest};
use crate::daylight::{sky_component_pct, SkyPlane};
use crate::exposure::{window_sun_hours, Massing, Period, SunSteps, Window, WindowAim};
use crate::site::{SiteModel, Status, WindowPoint};
use crate::time::DeltaT;

/// Said with every window verdict, besides [`super::CAUTION`].
pub const CLEAR_SKY_CAUTION: &str =
    "Hours of sun are clear-sky hours (the sun could reach the window); tests written in probable sunlight hours \
     weigh them by a local sunshine record, which sunlot does not have.";

/// What to check.
#[derive(Debug, Clone)]
pub struct WindowCheckRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The rule.
    pub rule: &'a WindowRule,
    /// The year of the rule's dates.
    pub year: i32,
    /// Time step of the sun tests, minutes.
    pub step_min: u32,
    /// Azimuth step of the sky component's integration, degrees.
    pub azimuth_step_deg: f64,
    /// ΔT.
    pub delta_t: DeltaT,
}

/// A figure of a window before and with the proposal.
#[derive(Debug, Clone, PartialEq, Serialize)]
/// Serialized with snake_case keys (the CLI's JSON) and, in the wasm build, camelCase keys (the
/// JavaScript facade's naming).
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct Figure {
    /// What it is, with its unit (`vsc_pct`, `sun_h`, `annual_share`, `winter_share`).
    pub name: &'static str,
    /// With the existing massing alone; `None` for a proposed window.
    pub before: Option<f64>,
    /// With the proposal.
    pub after: f64,
}

/// One window's result.
#[derive(Debug, Clone, PartialEq, Serialize)]
/// Serialized with snake_case keys (the CLI's JSON) and, in the wasm build, camelCase keys (the
/// JavaScript facade's naming).
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct WindowCheck {
    /// Window id.
    pub id: String,
    /// Window name.
    pub name: String,
    /// Existing or proposed.
    pub status: Status,
    /// Facing, degrees clockwise from true north.
    pub facing_deg: f64,
    /// The figures the test uses.
    pub figures: Vec<Figure>,
    /// The verdict; `None` when the test does not apply to this window.
    pub passes: Option<bool>,
    /// Why, in words.
    pub reason: String,
}

/// The check of every window the rule picks.
#[derive(Debug, Clone, PartialEq, Serialize)]
/// Serialized with snake_case keys (the CLI's JSON) and, in the wasm build, camelCase keys (the
/// JavaScript facade's naming).
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct WindowReport {
    /// The rule.
    pub rule: WindowRule,
    /// The year of the rule's dates.
    pub year: i32,
    /// Time step of the sun tests, minutes.
    pub step_min: u32,
    /// Each window.
    pub windows: Vec<WindowCheck>,
    /// Share of the windows tested that pass, 0–1 (`None` when none is tested).
    pub share_passing: Option<f64>,
    /// The rule's verdict.
    pub passes: bool,
    /// Cautions: the general one, the clear-sky one for sun tests, and one for numbers from memory.
    pub cautions: Vec<String>,
}

/// Checks the site's windows against the rule. `progress` gets the fraction done and may cancel.
///
/// # Errors
/// [`RuleError`] for an unknown window, no windows, a bad request (before any work), or a cancelled
/// run.
pub fn check_windows(
    req: &WindowCheckRequest,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<WindowReport, RuleError> {
    let rule = req.rule.clone().validated()?;
    let model = req.model;
    for id in &rule.window_ids {
        if !model.windows.iter().any(|w| &w.id == id) {
            return Err(RuleError::Field {
                rule: rule.id.clone(),
                field: "window_ids",
                reason: format!("the site has no window {id:?}"),
            });
        }
    }
    let windows: Vec<&WindowPoint> = model
        .windows
        .iter()
        .filter(|w| {
            if rule.window_ids.is_empty() {
                rule.statuses.contains(&w.status)
            } else {
                rule.window_ids.contains(&w.id)
            }
        })
        .collect();
    if windows.is_empty() {
        return Err(RuleError::Field {
            rule: rule.id.clone(),
            field: "statuses",
            reason: "the site has no windows of these statuses; add windows to the site file".into(),
        });
    }
    if !(req.azimuth_step_deg.is_finite() && req.azimuth_step_deg > 0.0) {
        return Err(RuleError::Field {
            rule: rule.id.clone(),
            field: "azimuth_step_deg",
            reason: format!("must be more than 0, got {}", req.azimuth_step_deg),
        });
    }
    // The year test's steps once for every window and massing (most of its cost).
    let plan = match &rule.test {
        WindowTest::WindowSky(t) => Plan::Sky(t),
        WindowTest::WindowSunDay(t) => Plan::Day(t),
        WindowTest::WindowSunYear(t) => {
            let period = Period {
                first: date(&rule.id, req.year, 1, 1)?,
                last: date(&rule.id, req.year, 12, 31)?,
                window: Window::Daylight,
                step_min: req.step_min,
            };
            Plan::Year(t, SunSteps::of(model, &period, req.delta_t, |f| progress(0.5 * f))?)
        }
    };
    let (n, done) = (windows.len() as f64, if matches!(plan, Plan::Year(..)) { 0.5 } else { 0.0 });
    let mut out = Vec::new();
    for (k, w) in windows.iter().enumerate() {
        out.push(match &plan {
            Plan::Sky(t) => sky(req, w, t)?,
            Plan::Day(t) => sun_day(req, &rule, w, t)?,
            Plan::Year(t, steps) => sun_year(req, w, t, steps)?,
        });
        if !progress(done + (1.0 - done) * (k + 1) as f64 / n) {
            return Err(crate::exposure::ExposureError::Cancelled.into());
        }
    }
    let tested: Vec<bool> = out.iter().filter_map(|w| w.passes).collect();
    let share_passing =
        (!tested.is_empty()).then(|| tested.iter().filter(|&&p| p).count() as f64 / tested.len() as f64);
    let passes = match (&rule.test, share_passing) {
        (_, None) => true,
        (WindowTest::WindowSunDay(t), Some(s)) => s >= t.min_share_of_windows - 1e-12,
        (_, Some(s)) => s >= 1.0,
    };
    let mut cautions = vec![super::CAUTION.to_string()];
    if !matches!(rule.test, WindowTest::WindowSky(_)) {
        cautions.push(CLEAR_SKY_CAUTION.into());
    }
    if rule.from_memory {
        cautions.push(format!(
            "The numbers of this rule are quoted from memory of {}: check them against the document before relying on \
             the verdicts.",
            if rule.source.is_empty() { "its source" } else { &rule.source }
        ));
    }
    Ok(WindowReport { rule, year: req.year, step_min: req.step_min, windows: out, share_passing, passes, cautions })
}

/// A rule's test, ready to run on each window.
enum Plan<'a> {
    Sky(&'a SkyTest),
    Day(&'a SunDayTest),
    Year(&'a SunYearTest, SunSteps),
}

fn result(w: &WindowPoint, figures: Vec<Figure>, passes: Option<bool>, reason: String) -> WindowCheck {
    WindowCheck {
        id: w.id.clone(),
        name: w.name.clone(),
        status: w.status,
        facing_deg: w.facing_deg,
        figures,
        passes,
        reason,
    }
}

/// Both massings for an existing window, the proposal's alone for a proposed one.
fn before_after<T>(
    w: &WindowPoint,
    mut f: impl FnMut(Massing) -> Result<T, RuleError>,
) -> Result<(Option<T>, T), RuleError> {
    let before = if w.status == Status::Existing { Some(f(Massing::Existing)?) } else { None };
    Ok((before, f(Massing::WithProposed)?))
}

fn sky(req: &WindowCheckRequest, w: &WindowPoint, t: &SkyTest) -> Result<WindowCheck, RuleError> {
    let plane = SkyPlane::Vertical { facing_deg: w.facing_deg };
    let (before, after) = before_after(w, |m| {
        sky_component_pct(req.model, w.view_point(), plane, m, req.azimuth_step_deg).map_err(RuleError::from)
    })?;
    let absolute = after >= t.min_vsc_pct - 1e-9;
    let kept = t.min_ratio.zip(before).map(|(r, b)| after >= r * b - 1e-9);
    let passes = absolute || kept == Some(true);
    let reason = match (absolute, kept, before) {
        (true, _, _) => format!("{after:.1} % ≥ {} %", t.min_vsc_pct),
        (false, Some(true), Some(b)) => format!("{after:.1} % is {:.2} × its former {b:.1} %", after / b.max(1e-12)),
        (false, Some(false), Some(b)) => format!(
            "{after:.1} % < {} % and {:.2} × its former {b:.1} % < {}",
            t.min_vsc_pct,
            after / b.max(1e-12),
            t.min_ratio.unwrap_or(0.0)
        ),
        _ => format!("{after:.1} % < {} %", t.min_vsc_pct),
    };
    Ok(result(w, vec![Figure { name: "vsc_pct", before, after }], Some(passes), reason))
}

fn date(rule: &str, year: i32, month: u32, day: u32) -> Result<NaiveDate, RuleError> {
    NaiveDate::from_ymd_opt(year, month, day).ok_or_else(|| no_date(rule, year, month, day))
}

fn no_date(rule: &str, year: i32, month: u32, day: u32) -> RuleError {
    RuleError::Field { rule: rule.into(), field: "day", reason: format!("{year}-{month:02}-{day:02} is not a date") }
}

fn sun_day(
    req: &WindowCheckRequest,
    rule: &WindowRule,
    w: &WindowPoint,
    t: &SunDayTest,
) -> Result<WindowCheck, RuleError> {
    let d = t
        .date_at(req.year, req.model.location.latitude_deg)
        .ok_or_else(|| no_date(&rule.id, req.year, t.month, t.day))?;
    let window = match clock_window(&rule.id, &t.from, &t.to)? {
        (Some(from), Some(to)) => Window::Clock { from, to },
        _ => Window::Daylight,
    };
    let period = Period { first: d, last: d, window, step_min: req.step_min };
    let (before, after) = before_after(w, |m| {
        let aim = WindowAim {
            point: w.view_point(),
            facing_deg: w.facing_deg,
            massing: m,
            min_altitude_deg: t.min_altitude_deg,
        };
        window_sun_hours(req.model, &aim, &period, req.delta_t, |_| true).map(|s| s.sun_hours).map_err(RuleError::from)
    })?;
    let passes = after >= t.min_hours - 1e-9;
    let reason = format!("{after:.2} h on {d} {} {} h", if passes { "≥" } else { "<" }, t.min_hours);
    Ok(result(w, vec![Figure { name: "sun_h", before, after }], Some(passes), reason))
}

/// Whether a window facing `facing_deg` faces within `within_deg` of the equator (due south north of
/// it, due north south of it).
fn faces_equator(facing_deg: f64, latitude_deg: f64, within_deg: f64) -> bool {
    let toward = if latitude_deg >= 0.0 { 180.0 } else { 0.0 };
    let off = (facing_deg - toward).rem_euclid(360.0);
    off.min(360.0 - off) <= within_deg + 1e-9
}

fn sun_year(
    req: &WindowCheckRequest,
    w: &WindowPoint,
    t: &SunYearTest,
    year: &SunSteps,
) -> Result<WindowCheck, RuleError> {
    let lat = req.model.location.latitude_deg;
    if !faces_equator(w.facing_deg, lat, t.facing_within_deg) {
        let toward = if lat >= 0.0 { "south" } else { "north" };
        return Ok(result(
            w,
            vec![],
            None,
            format!("faces {:.0}°, more than {}° from due {toward}: not tested", w.facing_deg, t.facing_within_deg),
        ));
    }
    // The winter half-year, within the one calendar year: 21 September to 21 March north of the
    // equator, 21 March to 21 September south of it.
    let (march, september) = ((3, 21), (9, 21));
    let winter = |d: NaiveDate| {
        let md = (d.month(), d.day());
        if lat >= 0.0 {
            md <= march || md >= september
        } else {
            md >= march && md <= september
        }
    };
    let shares = |m: Massing| -> Result<(f64, f64), RuleError> {
        let (all, cold) = year
            .window(
                req.model,
                &WindowAim { massing: m, ..WindowAim::at(w.view_point(), w.facing_deg) },
                req.delta_t,
                winter,
            )
            .map_err(RuleError::from)?;
        let possible = all.day_hours.max(1e-9);
        Ok((all.sun_hours / possible, cold.sun_hours / possible))
    };
    let (before, (annual, winter)) = before_after(w, shares)?;
    let low = annual < t.annual_min_share - 1e-9 || winter < t.winter_min_share - 1e-9;
    let pct = |x: f64| 100.0 * x;
    let (passes, reason) = match before {
        None => (
            !low,
            format!("annual {:.1} %, winter {:.1} % (a proposed window: the shares alone)", pct(annual), pct(winter)),
        ),
        Some((ba, bw)) => {
            let cut = annual < t.min_ratio * ba - 1e-9 || winter < t.min_ratio * bw - 1e-9;
            let lost = ba - annual > t.max_annual_loss + 1e-9;
            let why = if !low {
                "meets both shares".to_string()
            } else if !cut {
                format!("keeps at least {} × its former shares", t.min_ratio)
            } else if !lost {
                format!("loses no more than {:.0} % of the year", pct(t.max_annual_loss))
            } else {
                "below the shares, below the ratio and a loss over the limit".to_string()
            };
            let text = format!(
                "annual {:.1} % (was {:.1} %), winter {:.1} % (was {:.1} %): {why}",
                pct(annual),
                pct(ba),
                pct(winter),
                pct(bw)
            );
            (!(low && cut && lost), text)
        }
    };
    Ok(result(
        w,
        vec![
            Figure { name: "annual_share", before: before.map(|b| b.0), after: annual },
            Figure { name: "winter_share", before: before.map(|b| b.1), after: winter },
        ],
        Some(passes),
        reason,
    ))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::rules::{preset, AnyRule, PRESETS};
    use crate::site::test_sites::{block, flat_site};
    use crate::site::Volume;
    use chrono::FixedOffset;
    use geo::Coord;

    fn window(id: &str, at: (f64, f64, f64), facing_deg: f64) -> WindowPoint {
        WindowPoint {
            id: id.into(),
            name: id.into(),
            status: Status::Existing,
            at: Coord { x: at.0, y: at.1 },
            z_m: at.2,
            facing_deg,
            opening_width_m: 1.0,
            opening_height_m: 1.2,
        }
        .checked()
        .unwrap()
    }

    fn rule(test: WindowTest) -> WindowRule {
        WindowRule {
            id: "test".into(),
            title: "t".into(),
            source: String::new(),
            from_memory: false,
            window_ids: vec![],
            statuses: vec![Status::Existing],
            test,
        }
    }

    fn run(m: &SiteModel, r: &WindowRule, year: i32, step_min: u32) -> WindowReport {
        let req = WindowCheckRequest {
            model: m,
            rule: r,
            year,
            step_min,
            azimuth_step_deg: 0.25,
            delta_t: DeltaT::EspenakMeeus,
        };
        check_windows(&req, |_| true).unwrap()
    }

    fn proposed(mut v: Volume) -> Volume {
        v.status = Status::Proposed;
        v
    }

    /// BRE BR 209's window test (27 %, or 0.8 × before; from memory) on a south-facing window with a
    /// proposed long block opposite whose top stands α above the window: the sky component is the
    /// closed form checked in `daylight::sky_component` (27.31 % at 25°), so at 25° the window
    /// passes on the absolute test and at 30° it fails both (0.8 × 39.6 % = 31.7 %).
    #[test]
    fn the_sky_test_follows_the_closed_form_of_a_long_obstruction() {
        let r = match preset("bre-br209-window-sky").unwrap() {
            AnyRule::Window(w) => w,
            AnyRule::Area(_) => unreachable!(),
        };
        for (alpha_deg, passes) in [(25.0_f64, true), (30.0, false)] {
            let distance = 20.0;
            let top = 1.5 + distance * alpha_deg.to_radians().tan();
            let mut m = flat_site(
                vec![
                    block("house", -5.0, 0.0, 5.0, 8.0, 7.0),
                    proposed(block("new", -20_000.0, -distance - 10.0, 20_000.0, -distance, top)),
                ],
                51.5,
            );
            m.windows.push(window("w", (0.0, 0.0, 1.5), 180.0));
            let report = run(&m, &r, 2026, 10);
            let w = &report.windows[0];
            let before = w.figures[0].before.unwrap();
            assert!((before - 39.62).abs() < 0.01, "{before}");
            assert_eq!(w.passes, Some(passes), "α {alpha_deg}°: {}", w.reason);
            assert_eq!(report.passes, passes);
        }
    }

    /// On an open site the hours of sun on an east-facing window run from sunrise to solar transit, and
    /// on a west-facing one from transit to sunset: at the NREL SPA worked example's site and date
    /// (Reda & Andreas 2004/2008, table A5.2: sunrise 06:12:43, transit 11:46:04, sunset 17:20:19 local,
    /// UTC−7) that is 5.556 h and 5.571 h, within two 1-minute steps.
    #[test]
    fn a_window_on_an_open_site_gets_sunrise_to_transit_or_transit_to_sunset() {
        let mut m = flat_site(vec![], 39.742476);
        m.location = crate::Site::new(39.742476, -105.1786, 1830.14).unwrap();
        m.zone = crate::time::Zone::Fixed(FixedOffset::west_opt(7 * 3600).unwrap());
        m.windows = vec![window("east", (0.0, 0.0, 1.5), 90.0), window("west", (10.0, 0.0, 1.5), 270.0)];
        let r = rule(WindowTest::WindowSunDay(SunDayTest {
            month: 10,
            day: 17,
            from: None,
            to: None,
            min_hours: 5.5,
            min_altitude_deg: 0.0,
            min_share_of_windows: 1.0,
            date_hemisphere: None,
        }));
        let report = run(&m, &r, 2003, 1);
        let hours: Vec<f64> = report.windows.iter().map(|w| w.figures[0].after).collect();
        let (east, west) = (5.0 + 33.0 / 60.0 + 21.0 / 3600.0, 5.0 + 34.0 / 60.0 + 15.0 / 3600.0);
        assert!((hours[0] - east).abs() <= 2.0 / 60.0, "east {} vs {east}", hours[0]);
        assert!((hours[1] - west).abs() <= 2.0 / 60.0, "west {} vs {west}", hours[1]);
        assert_eq!(report.share_passing, Some(1.0));
        assert!(report.passes);
        // Counting the sun only above 6° takes the low sun off both ends.
        let mut t = day_test(&r);
        t.min_altitude_deg = 6.0;
        let high = run(&m, &rule(WindowTest::WindowSunDay(t)), 2003, 1);
        assert!(high.windows.iter().zip(&hours).all(|(w, h)| w.figures[0].after < h - 0.3));
    }

    fn day_test(r: &WindowRule) -> SunDayTest {
        match &r.test {
            WindowTest::WindowSunDay(t) => t.clone(),
            _ => unreachable!("a one-day sun test"),
        }
    }

    #[test]
    fn a_mid_winter_date_moves_six_months_in_the_other_hemisphere() {
        let AnyRule::Window(r) = preset("nsw-adg-window-sun").unwrap() else { unreachable!() };
        let t = day_test(&r);
        assert_eq!(t.date_at(2026, -33.87), NaiveDate::from_ymd_opt(2026, 6, 21));
        assert_eq!(t.date_at(2026, 52.6), NaiveDate::from_ymd_opt(2026, 12, 21));
        let AnyRule::Window(r) = preset("din5034-window-sun").unwrap() else { unreachable!() };
        assert_eq!(day_test(&r).date_at(2026, -33.87), NaiveDate::from_ymd_opt(2026, 7, 17));
    }

    /// The year test: an open south-facing window passes with its share of the year's sun-up hours
    /// (every hour the sun is south of the east-west line); a north-facing one is not tested; one
    /// behind a tall proposed block fails all three parts.
    #[test]
    fn the_year_test_on_open_shaded_and_north_facing_windows() {
        let AnyRule::Window(r) = preset("bre-br209-window-sun").unwrap() else { unreachable!() };
        let mut m = flat_site(vec![proposed(block("tower", -30.0, -16.0, 30.0, -6.0, 40.0))], 51.5);
        m.windows = vec![
            window("south-open", (5000.0, 0.0, 1.5), 180.0),
            window("south-shaded", (0.0, 0.0, 1.5), 180.0),
            window("north", (5000.0, 20.0, 1.5), 0.0),
        ];
        let report = run(&m, &r, 2026, 20);
        let [open, shaded, north] = &report.windows[..] else { panic!() };
        let share = |w: &WindowCheck, k: usize| (w.figures[k].before.unwrap(), w.figures[k].after);
        let (b, a) = share(open, 0);
        assert!(b == a && a > 0.6 && a < 0.95, "{b} {a}");
        assert_eq!(open.passes, Some(true));
        let (b, a) = share(shaded, 0);
        assert!(a < 0.25 && a < 0.8 * b && b - a > 0.04, "{b} {a}");
        assert_eq!(shaded.passes, Some(false), "{}", shaded.reason);
        assert_eq!(north.passes, None);
        assert!(north.reason.contains("not tested"));
        assert!(!report.passes);
    }

    #[test]
    fn every_preset_round_trips_through_json_and_bad_rules_name_the_member() {
        for p in PRESETS {
            let r = (p.rule)();
            assert_eq!(AnyRule::from_json(&r.to_json()).unwrap(), r, "{}", p.id);
        }
        let base = r#"{"id":"x","title":"t","test":"window_sky","min_vsc_pct":27"#;
        let e = |tail: &str| AnyRule::from_json(&format!("{base}{tail}")).unwrap_err().to_string();
        assert!(e(r#","min_ratio":"most"}"#).contains("min_ratio"), "{}", e(r#","min_ratio":"most"}"#));
        assert!(e(r#","min_hours":2}"#).contains("min_hours"));
        assert!(e(r#","statuses":["gone"]}"#).contains("statuses"));
        assert!(e(r#","min_ratio":1.5}"#).contains("min_ratio"));
        let unknown = AnyRule::from_json(r#"{"id":"x","title":"t","test":"window_moon"}"#).unwrap_err().to_string();
        assert!(unknown.contains("window_moon") && unknown.contains("window_sky"), "{unknown}");
        let missing = AnyRule::from_json(r#"{"id":"x","title":"t","test":"window_sun_day","month":6,"day":21}"#)
            .unwrap_err()
            .to_string();
        assert!(missing.contains("min_hours"), "{missing}");
        // An area rule may say its test or not.
        let area = r#"{"id":"x","title":"t","month":3,"day":21,"min_hours":2,"min_share":0.5,"area_kinds":["garden"]"#;
        let a = AnyRule::from_json(&format!("{area}}}")).unwrap();
        assert_eq!(AnyRule::from_json(&format!(r#"{area},"test":"area_sun"}}"#)).unwrap(), a);
    }

    #[test]
    fn a_site_without_the_rules_windows_is_refused_before_work() {
        let AnyRule::Window(r) = preset("bre-br209-window-sky").unwrap() else { unreachable!() };
        let m = flat_site(vec![], 51.5);
        let req = WindowCheckRequest {
            model: &m,
            rule: &r,
            year: 2026,
            step_min: 10,
            azimuth_step_deg: 0.25,
            delta_t: DeltaT::EspenakMeeus,
        };
        let e = check_windows(&req, |_| panic!("no work may start")).unwrap_err().to_string();
        assert!(e.contains("no windows"), "{e}");
        let mut named = r.clone();
        named.window_ids = vec!["w-99".into()];
        let e = check_windows(&WindowCheckRequest { rule: &named, ..req }, |_| panic!()).unwrap_err().to_string();
        assert!(e.contains("w-99"), "{e}");
    }
}

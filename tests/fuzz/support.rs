//! The fuzz harness's mutator and the properties checked on every accepted input.

use chrono::{DateTime, NaiveDate, Utc};
use geo::{Area, MultiPolygon, Validation};
use serde_json::Value;
use sunlot::exposure::{sun_hours, Grid, Massing, Period, SunHoursRequest, Window};
use sunlot::rules::{check_rule, check_windows, CheckRequest, Rule, WindowCheckRequest, WindowRule};
use sunlot::shadow::{shadow_study, study_geojson, Study};
use sunlot::site::SiteModel;
use sunlot::time::DeltaT;

/// SplitMix64 (Steele, Lea & Flood 2014): a small, fast, reproducible generator.
pub struct Mutator {
    state: u64,
}

/// Values a structural mutation puts in place of a JSON value: edges of number ranges, other types.
const EDGE_VALUES: &[&str] = &[
    "0",
    "-0",
    "-1",
    "1",
    "0.5",
    "1e308",
    "-1e308",
    "1e-320",
    "4294967296",
    "-4294967297",
    "18446744073709551616",
    "90.000001",
    "-180.5",
    "360",
    "9000",
    "100000",
    "1e6",
    "\"\"",
    "\"x\"",
    "\"2026-02-30\"",
    "\"existing\"",
    "\"proposed\"",
    "\"NaN\"",
    "null",
    "true",
    "false",
    "[]",
    "{}",
    "[1]",
    "[1, 2, 3]",
    "[[1]]",
    "[[]]",
    "[[0, 0], [0, 0], [0, 0]]",
    "[[0, 0], [1e308, 0], [0, 1e308]]",
    "[[-1e6, -1e6], [1e6, -1e6], [1e6, 1e6]]",
    "{\"type\": \"Point\", \"coordinates\": [0]}",
    "[[[0]]]",
    "[[[1, 2, 3, 4]]]",
];

/// Text spliced in by a textual mutation.
const TOKENS: &[&str] = &[
    ",",
    ":",
    "[",
    "]",
    "{",
    "}",
    "\"",
    "-",
    "e9",
    "1e999",
    "NaN",
    "Infinity",
    "0",
    "99999999999999999999",
    "null",
    "\\u0000",
    "\u{feff}",
    "é",
    "\n",
    "\"top_m\": 1e308,",
    "\"status\": 7,",
    "\"coordinates\": [1],",
];

impl Mutator {
    /// A generator from `seed`.
    pub fn new(seed: u64) -> Self {
        Mutator { state: seed }
    }

    fn next(&mut self) -> u64 {
        self.state = self.state.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.state;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    }

    /// A number in `0..n` (`n` > 0).
    pub fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }

    /// One to four mutations of `text`.
    pub fn mutate(&mut self, text: &str) -> String {
        let mut out = text.to_string();
        for _ in 0..1 + self.below(4) {
            out = match self.below(10) {
                0..=5 => self.structural(&out).unwrap_or_else(|| self.textual(&out)),
                6 => self.repeat_member(&out),
                _ => self.textual(&out),
            };
        }
        out
    }

    /// A JSON value somewhere in `text` replaced, dropped or duplicated; `None` when `text` is not JSON.
    fn structural(&mut self, text: &str) -> Option<String> {
        let mut v: Value = serde_json::from_str(text).ok()?;
        let mut count = 0;
        count_nodes(&v, &mut count);
        let target = self.below(count);
        let choice = self.below(8);
        let edge: Value = serde_json::from_str(EDGE_VALUES[self.below(EDGE_VALUES.len())]).unwrap_or(Value::Null);
        let mut k = 0;
        edit(
            &mut v,
            target,
            &mut k,
            &mut |node: &mut Value, rng: &mut dyn FnMut(usize) -> usize| match choice {
                0..=3 => *node = edge.clone(),
                4 => match node {
                    Value::Object(m) if !m.is_empty() => {
                        let key = m.keys().nth(rng(m.len())).cloned().unwrap_or_default();
                        m.remove(&key);
                    }
                    Value::Array(a) if !a.is_empty() => {
                        a.remove(rng(a.len()));
                    }
                    other => *other = edge.clone(),
                },
                5 => match node {
                    Value::Array(a) if !a.is_empty() => {
                        let item = a[rng(a.len())].clone();
                        a.push(item);
                    }
                    other => *other = edge.clone(),
                },
                6 => match node {
                    Value::Array(a) if !a.is_empty() => {
                        let i = rng(a.len());
                        a[i] = Value::Array(vec![a[i].clone()]);
                    }
                    Value::Number(n) => *node = Value::from(-n.as_f64().unwrap_or(0.0) * 1e3),
                    other => *other = edge.clone(),
                },
                _ => match node {
                    Value::Number(n) => *node = Value::from(n.as_f64().unwrap_or(0.0) * 1.000_001 + 1e-7),
                    Value::String(s) => s.push_str(" x"),
                    other => *other = Value::Array(vec![other.clone(), other.clone()]),
                },
            },
            self,
        );
        Some(if self.below(2) == 0 { v.to_string() } else { serde_json::to_string_pretty(&v).unwrap_or_default() })
    }

    /// A member repeated with another value in the same object (JSON allows it; readers must not be fooled).
    fn repeat_member(&mut self, text: &str) -> String {
        let opens: Vec<usize> = text.match_indices('{').map(|(i, _)| i).collect();
        if opens.is_empty() {
            return self.textual(text);
        }
        let at = opens[self.below(opens.len())] + 1;
        let keys =
            ["top_m", "base_m", "status", "kind", "outline", "zone", "coordinates", "sunlot", "min_share", "month"];
        let key = keys[self.below(keys.len())];
        let value = EDGE_VALUES[self.below(EDGE_VALUES.len())];
        let (front, back) = (format!("\"{key}\": {value}, "), format!(", \"{key}\": {value}"));
        if self.below(2) == 0 {
            format!("{}{front}{}", &text[..at], &text[at..])
        } else {
            // Just before the object's closing brace, so the repeat comes last and wins in a map.
            match text[at..].find('}') {
                Some(i) => format!("{}{back}{}", &text[..at + i], &text[at + i..]),
                None => format!("{}{front}{}", &text[..at], &text[at..]),
            }
        }
    }

    /// A span cut or repeated, or a token spliced in, at a character boundary.
    fn textual(&mut self, text: &str) -> String {
        let bounds: Vec<usize> = text.char_indices().map(|(i, _)| i).chain([text.len()]).collect();
        let a = bounds[self.below(bounds.len())];
        let b = bounds[self.below(bounds.len())].max(a).min(a + 64);
        let b = bounds.iter().copied().filter(|&x| x <= b).max().unwrap_or(a).max(a);
        match self.below(3) {
            0 => format!("{}{}", &text[..a], &text[b..]),
            1 => format!("{}{}{}", &text[..b], &text[a..b], &text[b..]),
            _ => format!("{}{}{}", &text[..a], TOKENS[self.below(TOKENS.len())], &text[a..]),
        }
    }
}

fn count_nodes(v: &Value, n: &mut usize) {
    *n += 1;
    match v {
        Value::Array(a) => a.iter().for_each(|x| count_nodes(x, n)),
        Value::Object(m) => m.values().for_each(|x| count_nodes(x, n)),
        _ => {}
    }
}

type Rng<'a> = &'a mut dyn FnMut(usize) -> usize;

fn edit(v: &mut Value, target: usize, k: &mut usize, f: &mut dyn FnMut(&mut Value, Rng), m: &mut Mutator) -> bool {
    if *k == target {
        f(v, &mut |n| m.below(n));
        return true;
    }
    *k += 1;
    match v {
        Value::Array(a) => a.iter_mut().any(|x| edit(x, target, k, f, m)),
        Value::Object(o) => o.values_mut().any(|x| edit(x, target, k, f, m)),
        _ => false,
    }
}

fn finite(what: &str, x: f64) -> Result<(), String> {
    if x.is_finite() {
        Ok(())
    } else {
        Err(format!("{what} is {x}"))
    }
}

/// Valid (OGC simple features: simple rings, holes inside, parts disjoint) with finite coordinates.
pub fn valid_polygons(what: &str, mp: &MultiPolygon<f64>) -> Result<(), String> {
    for p in &mp.0 {
        for c in p.exterior().coords().chain(p.interiors().iter().flat_map(|r| r.coords())) {
            finite(what, c.x)?;
            finite(what, c.y)?;
        }
    }
    if let Some(e) = mp.validation_errors().into_iter().next() {
        return Err(format!("{what} is not a valid polygon: {e}"));
    }
    finite(what, mp.unsigned_area())
}

/// What an accepted site must give: a shadow study at three moments with finite figures and valid
/// polygons, its GeoJSON without non-numbers, and a small sun-hours map with finite hours.
pub fn check_site_outputs(model: &SiteModel) -> Result<(), String> {
    for when in ["2026-03-20T09:30:00Z", "2026-06-21T12:00:00Z", "2026-12-21T15:00:00Z"] {
        let t: DateTime<Utc> = DateTime::parse_from_rfc3339(when).unwrap().to_utc();
        let study = match shadow_study(model, t, DeltaT::EspenakMeeus) {
            Ok(s) => s,
            Err(e) if !e.to_string().trim().is_empty() => continue,
            Err(_) => return Err("an empty study error".into()),
        };
        if let Study::Sun { per_feature, existing, proposed, combined, areas, .. } = &study {
            for (id, _, mp) in per_feature {
                valid_polygons(&format!("the shadow of {id} at {when}"), mp)?;
            }
            valid_polygons("the existing shadow", existing)?;
            valid_polygons("the proposed shadow", proposed)?;
            valid_polygons("the combined shadow", combined)?;
            for a in areas {
                for x in [a.area_m2, a.existing_m2, a.proposed_m2, a.combined_m2] {
                    finite(&format!("the shade on {}", a.id), x)?;
                }
            }
        }
        let text = study_geojson(model, &study, when, false);
        let v: Value = serde_json::from_str(&text).map_err(|e| format!("shadow GeoJSON: {e}"))?;
        if has_null_number(&v) {
            return Err("shadow GeoJSON has a null where a number belongs (a NaN written out)".into());
        }
    }
    if let Some(area) = model.areas.first() {
        // Coarse cells so each case stays quick: about 400 cells over the first area.
        let r = geo::BoundingRect::bounding_rect(&area.polygon).ok_or("an area with no extent")?;
        let cell = (r.width() * r.height() / 400.0).sqrt().max(0.05);
        if let Ok(grid) = Grid::over_polygon(&area.polygon, cell, 10_000) {
            let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
            let period = Period { first: date, last: date, window: Window::Daylight, step_min: 60 };
            let req = SunHoursRequest {
                model,
                grid: &grid,
                period,
                plane_m: 0.0,
                delta_t: DeltaT::EspenakMeeus,
                massing: Massing::WithProposed,
            };
            if let Ok(map) = sun_hours(&req, |_| true) {
                finite("open hours", map.open_hours)?;
                // Every cell inside the area has a number (a NaN would read as "no value").
                for (h, &inside) in map.hours.iter().zip(&grid.inside) {
                    let Some(h) = h else {
                        if inside {
                            return Err("a cell inside the area has no hours (NaN)".into());
                        }
                        continue;
                    };
                    finite("a cell's hours", h)?;
                    if h < -1e-9 || h > map.open_hours + 1e-9 {
                        return Err(format!("a cell's {h} h is outside 0..{}", map.open_hours));
                    }
                }
            }
        }
    }
    Ok(())
}

fn has_null_number(v: &Value) -> bool {
    match v {
        Value::Array(a) => a.iter().any(|x| x.is_null() || has_null_number(x)),
        Value::Object(m) => m.iter().any(|(k, x)| (k.ends_with("_m2") && x.is_null()) || has_null_number(x)),
        _ => false,
    }
}

/// A rule that reads must check `site` with finite figures, or be refused with a typed error.
pub fn check_rule_on(site: &SiteModel, rule: &Rule) -> Result<(), String> {
    let req = CheckRequest { model: site, rule, year: 2026, cell_m: 2.0, step_min: 30, delta_t: DeltaT::EspenakMeeus };
    match check_rule(&req, |_| true) {
        Err(e) if e.to_string().trim().is_empty() => Err("an empty check error".into()),
        Err(_) => Ok(()),
        Ok(report) => {
            for a in &report.areas {
                for x in
                    [a.area_m2, a.before_share, a.after_share, a.before_m2, a.after_m2, a.mean_before_h, a.mean_after_h]
                {
                    finite(&format!("rule figures of {}", a.id), x)?;
                }
            }
            Ok(())
        }
    }
}

/// A window rule that reads must check `site` with finite figures, or be refused with a typed error.
pub fn check_windows_on(site: &SiteModel, rule: &WindowRule) -> Result<(), String> {
    let req = WindowCheckRequest {
        model: site,
        rule,
        year: 2026,
        step_min: 60,
        azimuth_step_deg: 2.0,
        delta_t: DeltaT::EspenakMeeus,
    };
    match check_windows(&req, |_| true) {
        Err(e) if e.to_string().trim().is_empty() => Err("an empty window check error".into()),
        Err(_) => Ok(()),
        Ok(report) => {
            for w in &report.windows {
                for f in &w.figures {
                    finite(&format!("{} of window {}", f.name, w.id), f.after)?;
                    if let Some(b) = f.before {
                        finite(&format!("{} of window {}", f.name, w.id), b)?;
                    }
                }
            }
            Ok(())
        }
    }
}

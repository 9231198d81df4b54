//! Mutation fuzzing of what reads user input: the site reader (site file and GeoJSON), the rule
//! reader, and what a read site is then used for (a shadow study, its GeoJSON, a small sun-hours
//! map, a rule check, the site written back). Every mutated input must give a typed error, or results
//! whose numbers are finite and whose polygons are valid (OGC simple features) — never a panic.
//!
//! Seeds are the committed corpus in `tests/fuzz/corpus/` plus the demo site as GeoJSON and the
//! published rule presets. Mutations are structural (a JSON value replaced by an edge value, a member
//! or element dropped or duplicated, a member repeated with another value) and textual (spans cut,
//! repeated or spliced with JSON tokens), one to four per case.
//!
//! Bounded by time: `SUNLOT_FUZZ_SECS` (default 8 s per target) and `SUNLOT_FUZZ_SEED` (default
//! fixed, so a run repeats). A failing input is written to `target/fuzz-failures/` and the test
//! fails naming it. Run longer with `SUNLOT_FUZZ_SECS=300 cargo test --release --test fuzz_readers`.
#![cfg(not(target_arch = "wasm32"))]

#[path = "fuzz/support.rs"]
mod support;

use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::PathBuf;
use std::time::{Duration, Instant};

use serde_json::Value;
use sunlot::rules::{preset, AnyRule, PRESETS};
use sunlot::site::SiteModel;
use support::{check_rule_on, check_site_outputs, check_windows_on, Mutator};

fn corpus(kind: &str) -> Vec<String> {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fuzz/corpus").join(kind);
    let mut files: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap_or_else(|e| panic!("{}: {e}", dir.display()))
        .map(|e| e.unwrap().path())
        .collect();
    files.sort();
    files.iter().map(|p| std::fs::read_to_string(p).unwrap()).collect()
}

fn budget() -> Duration {
    let secs = std::env::var("SUNLOT_FUZZ_SECS").ok().and_then(|s| s.parse::<f64>().ok()).unwrap_or(8.0);
    Duration::from_secs_f64(secs.max(0.1))
}

fn seed() -> u64 {
    std::env::var("SUNLOT_FUZZ_SEED").ok().and_then(|s| s.parse().ok()).unwrap_or(0x5eed_f5a1)
}

/// Runs `target` on mutations of `seeds` until the time budget is spent; panics (with the input
/// saved) on the first case whose `target` panics or returns `Err` (a broken property).
fn fuzz(name: &str, seeds: &[String], mut target: impl FnMut(&str) -> Result<bool, String>) {
    let mut m = Mutator::new(seed() ^ name.len() as u64);
    let (start, budget) = (Instant::now(), budget());
    let (mut cases, mut accepted) = (0_u64, 0_u64);
    // The seeds themselves first: each must be accepted.
    for s in seeds {
        assert_eq!(target(s), Ok(true), "{name}: a seed is refused:\n{s}");
    }
    while start.elapsed() < budget {
        let base = &seeds[m.below(seeds.len())];
        let input = m.mutate(base);
        cases += 1;
        match catch_unwind(AssertUnwindSafe(|| target(&input))) {
            Ok(Ok(ok)) => accepted += u64::from(ok),
            outcome => {
                let why = match outcome {
                    Ok(Err(e)) => e,
                    Err(p) => p
                        .downcast_ref::<String>()
                        .cloned()
                        .or_else(|| p.downcast_ref::<&str>().map(|s| s.to_string()))
                        .unwrap_or_default(),
                    Ok(Ok(_)) => unreachable!(),
                };
                let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("target/fuzz-failures");
                std::fs::create_dir_all(&dir).unwrap();
                let file = dir.join(format!("{name}-{cases}.txt"));
                std::fs::write(&file, &input).unwrap();
                panic!("{name}: case {cases} failed ({why}); input saved in {}", file.display());
            }
        }
    }
    println!(
        "fuzz {name}: {cases} cases in {:.1} s, {accepted} accepted, {} refused",
        start.elapsed().as_secs_f64(),
        cases - accepted
    );
    assert!(cases > 0, "{name}: no case ran");
}

/// A site reader case: `Ok(true)` for a site read and used without fault, `Ok(false)` for a typed
/// refusal, `Err` for a broken property.
fn site_case(text: &str) -> Result<bool, String> {
    match SiteModel::read(text) {
        Err(e) => {
            if e.to_string().trim().is_empty() {
                return Err("an empty error message".into());
            }
            Ok(false)
        }
        Ok(read) => {
            check_site_outputs(&read.model)?;
            // Written back and read again, the site is the same (site file) or reads again (GeoJSON).
            let again = SiteModel::from_json(&read.model.to_json()).map_err(|e| format!("round trip: {e}"))?;
            if !read.from_geojson && again != read.model {
                return Err("the site file does not round-trip".into());
            }
            // As GeoJSON it goes through WGS84 and comes back within ~1e-11 m, which can tip a hole that
            // touches its outline (valid as given) either way: the round trip must read or give a typed
            // error naming the feature — it must not panic or give an empty message.
            if let Err(e) = SiteModel::from_geojson(&read.model.to_geojson()) {
                if !e.to_string().contains("feature") {
                    return Err(format!("GeoJSON round trip: {e}"));
                }
            }
            Ok(true)
        }
    }
}

#[test]
fn site_reader_never_panics_and_accepted_sites_give_finite_valid_results() {
    let mut seeds = corpus("site");
    seeds.push(sunlot::demo::demo().to_geojson());
    fuzz("site", &seeds, site_case);
}

#[test]
fn rule_reader_never_panics_and_accepted_rules_check_a_site() {
    let mut seeds = corpus("rule");
    seeds.extend(PRESETS.iter().map(|p| preset(p.id).unwrap().to_json()));
    let site = SiteModel::from_json(&corpus("site")[1]).unwrap();
    let with_windows = sunlot::demo::demo();
    fuzz("rule", &seeds, |text| match AnyRule::from_json(text) {
        Err(e) => {
            let m = e.to_string();
            if m.trim().is_empty() {
                return Err("an empty error message".into());
            }
            Ok(false)
        }
        Ok(AnyRule::Area(rule)) => {
            check_rule_on(&site, &rule)?;
            Ok(true)
        }
        Ok(AnyRule::Window(rule)) => {
            check_windows_on(&with_windows, &rule)?;
            Ok(true)
        }
    });
}

/// Not a mutation test but the sizes the readers refuse before they allocate: a huge site text, too
/// many features, and a coordinate far outside a site.
#[test]
fn oversized_sites_are_refused_naming_the_limit() {
    let big = format!("{{\"sunlot_site\": 1, \"name\": \"{}\"}}", "x".repeat(sunlot::limits::MAX_SITE_TEXT_BYTES));
    let e = SiteModel::read(&big).unwrap_err();
    assert!(matches!(e, sunlot::site::SiteReadError::Budget(_)), "{e:?}");
    let e = e.to_string();
    assert!(e.contains("site") && e.contains("limit"), "{e}");
    let mut v: Value = serde_json::from_str(&corpus("site")[1]).unwrap();
    let wall = v["walls"][0].clone();
    let walls: Vec<Value> = (0..=sunlot::limits::MAX_FEATURES)
        .map(|k| {
            let mut w = wall.clone();
            w["id"] = Value::from(format!("w{k}"));
            w
        })
        .collect();
    v["walls"] = Value::from(walls);
    let e = SiteModel::read(&v.to_string()).unwrap_err().to_string();
    assert!(e.contains("features") && e.contains(&sunlot::limits::count(sunlot::limits::MAX_FEATURES as f64)), "{e}");
}

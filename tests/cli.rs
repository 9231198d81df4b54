//! The command line's contract, run as a user would run it.
#![cfg(not(target_arch = "wasm32"))]

use std::io::Write;
use std::process::{Command, Output, Stdio};

fn sunlot(args: &[&str], stdin: Option<&str>) -> Output {
    let mut child = Command::new(env!("CARGO_BIN_EXE_sunlot"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("sunlot runs");
    if let Some(text) = stdin {
        child.stdin.take().unwrap().write_all(text.as_bytes()).unwrap();
    } else {
        drop(child.stdin.take());
    }
    child.wait_with_output().unwrap()
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).unwrap()
}

fn stderr(o: &Output) -> String {
    String::from_utf8(o.stderr.clone()).unwrap()
}

const PAPER: [&str; 14] = [
    "position",
    "--lat",
    "39.742476",
    "--lon",
    "-105.1786",
    "--time",
    "2003-10-17T12:30:30-07:00",
    "--elevation-m",
    "1830.14",
    "--pressure-hpa",
    "820",
    "--temperature-c",
    "11",
    "--delta-t-s",
];

#[test]
fn position_json_has_the_contract_fields() {
    let mut args = PAPER.to_vec();
    args.extend(["67", "--format", "json"]);
    let o = sunlot(&args, None);
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).expect("one JSON object");
    // Reda & Andreas (2004), Table A5.2.
    assert!((v["zenith_deg"].as_f64().unwrap() - 50.11162).abs() < 5e-6);
    assert!((v["azimuth_deg"].as_f64().unwrap() - 194.34024).abs() < 5e-6);
    assert!((v["altitude_deg"].as_f64().unwrap() - 39.88838).abs() < 5e-6);
    assert!((v["declination_deg"].as_f64().unwrap() - -9.316179).abs() < 5e-6);
    assert!((v["equation_of_time_min"].as_f64().unwrap() - 14.641511).abs() < 5e-6);
    assert_eq!(v["time"], "2003-10-17T12:30:30-07:00");
}

#[test]
fn no_refraction_gives_the_geometric_zenith() {
    let mut args = PAPER.to_vec();
    args.extend(["67", "--format", "json", "--no-refraction"]);
    let v: serde_json::Value = serde_json::from_str(&stdout(&sunlot(&args, None))).unwrap();
    let z = v["zenith_deg"].as_f64().unwrap();
    assert!(z > 50.11162 + 0.01, "refraction lifts the sun, so without it the zenith is larger: {z}");
}

#[test]
fn csv_batch_adds_three_columns_per_row() {
    let input = "lat,lon,time,elevation_m,pressure_hpa,temperature_c\n\
                 39.742476,-105.1786,2003-10-17T12:30:30-07:00,1830.14,820,11\n\
                 -33.9,151.2,2026-06-21T12:00:00+10:00,20,1013,15\n\
                 51.5,0,2026-03-20T12:00:00Z,,,\n";
    let o = sunlot(&["position", "--format", "csv", "--delta-t-s", "67"], Some(&input.replace(",,,", ",0,1013.25,10")));
    assert!(o.status.success(), "{}", stderr(&o));
    let out = stdout(&o);
    let lines: Vec<&str> = out.lines().collect();
    assert_eq!(lines[0], "lat,lon,time,elevation_m,pressure_hpa,temperature_c,zenith_deg,altitude_deg,azimuth_deg");
    assert_eq!(lines.len(), 4);
    let z: f64 = lines[1].split(',').nth(6).unwrap().parse().unwrap();
    assert!((z - 50.11162).abs() < 5e-6);
}

#[test]
fn bad_input_exits_non_zero_naming_the_field() {
    let cases: [(&[&str], Option<&str>, &str); 7] = [
        (
            &["position", "--lat", "91", "--lon", "0", "--time", "2020-01-01T00:00:00Z"],
            None,
            "--lat must be between -90 and 90",
        ),
        (
            &["position", "--lat", "NaN", "--lon", "0", "--time", "2020-01-01T00:00:00Z"],
            None,
            "--lat must be a finite number",
        ),
        (
            &["position", "--lat", "10", "--lon", "0", "--time", "2020-01-01 12:00"],
            None,
            "--time: time \"2020-01-01 12:00\" is not an RFC 3339",
        ),
        (
            &["day", "--lat", "10", "--lon", "0", "--date", "2020-01-01", "--zone", "Mars/Olympus"],
            None,
            "--zone: zone \"Mars/Olympus\"",
        ),
        (
            &["position", "--format", "csv"],
            Some("lat,lon,time\n1,2,2020-01-01T00:00:00Z\n1,200,2020-01-01T00:00:00Z\n"),
            "row 2 (line 3): lon must be between -180 and 180, got 200",
        ),
        (
            &["position", "--lat", "51", "--lon", "0", "--local", "2024-03-31T01:30", "--zone", "Europe/London"],
            None,
            "does not exist in Europe/London",
        ),
        (
            &["position", "--lat", "51", "--lon", "0", "--local", "2024-10-27T01:30", "--zone", "Europe/London"],
            None,
            "occurs twice in Europe/London",
        ),
    ];
    for (args, input, want) in cases {
        let o = sunlot(args, input);
        assert!(!o.status.success(), "{args:?} should fail");
        assert!(stderr(&o).contains(want), "{args:?}: {}", stderr(&o));
        assert!(!stderr(&o).contains("panicked"), "{args:?} panicked");
        assert!(stdout(&o).is_empty(), "{args:?} wrote output before failing");
    }
}

#[test]
fn fold_picks_one_of_a_repeated_local_time() {
    let o = sunlot(
        &[
            "position",
            "--lat",
            "51",
            "--lon",
            "0",
            "--local",
            "2024-10-27T01:30",
            "--zone",
            "Europe/London",
            "--fold",
            "later",
            "--format",
            "json",
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(v["time"], "2024-10-27T01:30:00Z");
}

#[test]
fn day_seasons_and_irradiance_write_parseable_json_and_csv() {
    let day = sunlot(&["day", "--demo", "--date", "2026-06-21", "--format", "json"], None);
    let v: serde_json::Value = serde_json::from_str(&stdout(&day)).unwrap();
    assert_eq!(v["sun"], "rises_and_sets");
    assert!(v["sunrise"].as_str().unwrap().ends_with("+01:00"));
    let polar = sunlot(
        &[
            "day",
            "--lat",
            "78.2",
            "--lon",
            "15.6",
            "--zone",
            "Arctic/Longyearbyen",
            "--date",
            "2026-12-21",
            "--format",
            "json",
        ],
        None,
    );
    let v: serde_json::Value = serde_json::from_str(&stdout(&polar)).unwrap();
    assert_eq!(v["sun"], "always_down");
    assert!(v["sunrise"].is_null());

    let s = sunlot(&["seasons", "--year", "2026", "--years", "3", "--format", "csv"], None);
    assert!(s.status.success(), "{}", stderr(&s));
    assert_eq!(stdout(&s).lines().count(), 4);

    let i =
        sunlot(&["irradiance", "--demo", "--date", "2026-06-21", "--surface-tilt-deg", "35", "--format", "csv"], None);
    assert!(i.status.success(), "{}", stderr(&i));
    let out = stdout(&i);
    assert!(out.lines().next().unwrap().ends_with("surface_total_w_m2"));
    assert_eq!(out.lines().count(), 25); // header + 24 hourly steps
}

#[test]
fn help_explains_units() {
    let o = sunlot(&["position", "--help"], None);
    let h = stdout(&o);
    for needle in ["degrees", "RFC 3339", "hectopascals", "metres", "seconds", "clockwise from true north"] {
        assert!(h.contains(needle), "help lacks {needle:?}:\n{h}");
    }
}

#[test]
fn shadows_of_the_demo_site_as_table_and_geojson() {
    let o = sunlot(&["shadows", "--demo", "--local", "2026-12-21T12:00", "--format", "json"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let rows: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let g9 = rows.as_array().unwrap().iter().find(|r| r["area"] == "garden-9").unwrap();
    assert!(g9["proposed_m2"].as_f64().unwrap() > 200.0, "the proposal shades the garden to its north at winter noon");

    let o = sunlot(&["shadows", "--demo", "--local", "2026-03-20T09:00", "--format", "geojson"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let fc: geojson::FeatureCollection = stdout(&o).parse::<geojson::GeoJson>().unwrap().try_into().unwrap();
    let layers: Vec<String> =
        fc.features.iter().map(|f| f.properties.as_ref().unwrap()["layer"].as_str().unwrap().to_string()).collect();
    assert_eq!(layers.iter().filter(|l| *l == "feature_shadow").count(), 10); // 5 volumes + 5 fences
    assert_eq!(layers.iter().filter(|l| *l == "shadow_union").count(), 3);
    assert_eq!(layers.iter().filter(|l| *l == "area").count(), 7);

    let night = sunlot(&["shadows", "--demo", "--local", "2026-12-21T22:00", "--format", "table"], None);
    assert!(night.status.success());
    assert!(stdout(&night).contains("below the horizon"));
    let night = sunlot(&["shadows", "--demo", "--local", "2026-12-21T22:00"], None);
    let v: serde_json::Value = serde_json::from_str(&stdout(&night)).unwrap();
    assert_eq!(v["features"].as_array().unwrap().len(), 0);
    assert!(v["sunlot"]["sun"].as_str().unwrap().contains("below the horizon"));
}

#[test]
fn shadow_table_and_bad_site_files() {
    let o = sunlot(&["shadow-table", "--demo", "--date", "2026-03-20", "--format", "csv"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let out = stdout(&o);
    assert!(out.lines().next().unwrap().ends_with("tip_proposal-upper_m"));
    assert_eq!(out.lines().count(), 13); // header + 07:00…18:00

    let dir = std::env::temp_dir().join(format!("sunlot-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let bad = dir.join("bad.json");
    let site = sunlot::demo::DEMO_SITE_JSON.replace("\"top_m\": 15", "\"top_m\": 5");
    std::fs::write(&bad, site).unwrap();
    let o = sunlot(&["shadows", bad.to_str().unwrap(), "--local", "2026-03-20T12:00"], None);
    assert!(!o.status.success());
    assert!(stderr(&o).contains("feature \"proposal-upper\": top_m (5) must be above base_m (9)"), "{}", stderr(&o));
    let o = sunlot(&["shadows", dir.join("missing.json").to_str().unwrap(), "--local", "2026-03-20T12:00"], None);
    assert!(!o.status.success() && stderr(&o).contains("missing.json"));
    std::fs::remove_dir_all(&dir).ok();
}

#[test]
fn geojson_sites_read_and_write_wgs84() {
    let o = sunlot(&["convert", "--demo", "--format", "geojson"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let dir = std::env::temp_dir().join(format!("sunlot-gj-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("demo.geojson");
    std::fs::write(&path, stdout(&o)).unwrap();
    let plan = sunlot(&["shadows", "--demo", "--local", "2026-12-21T12:00", "--format", "csv"], None);
    let geo = sunlot(&["shadows", path.to_str().unwrap(), "--local", "2026-12-21T12:00", "--format", "csv"], None);
    assert!(geo.status.success(), "{}", stderr(&geo));
    // The same site through GeoJSON gives the same figures (to 0.1 m², the table's precision).
    let col = |text: &str| -> Vec<f64> {
        text.lines().skip(1).map(|l| l.split(',').nth(7).unwrap().parse().unwrap()).collect()
    };
    for (a, b) in col(&stdout(&plan)).iter().zip(col(&stdout(&geo))) {
        assert!((a - b).abs() < 0.1, "{a} vs {b}");
    }
    let gj = sunlot(&["shadows", path.to_str().unwrap(), "--local", "2026-12-21T12:00", "--format", "geojson"], None);
    let fc: serde_json::Value = serde_json::from_str(&stdout(&gj)).unwrap();
    let first = &fc["features"][0]["geometry"]["coordinates"][0][0][0];
    assert!(
        (first[0].as_f64().unwrap() + 1.87).abs() < 0.01 && (first[1].as_f64().unwrap() - 52.62).abs() < 0.01,
        "{first}"
    );
    std::fs::remove_dir_all(&dir).ok();
}

#[test]
fn point_in_sun_and_skyline() {
    let o =
        sunlot(&["point", "--demo", "--at", "14,48.5,1.5", "--local", "2026-12-21T12:00", "--format", "json"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(v[0]["direct_sun"], "no", "the proposal stands between the point and the winter noon sun");
    let o = sunlot(&["point", "--demo", "--at", "14,48.5,1.5", "--skyline-step-deg", "1", "--format", "csv"], None);
    assert_eq!(stdout(&o).lines().count(), 361);
    let o = sunlot(&["point", "--demo", "--at", "14,48.5", "--local", "2026-12-21T12:00"], None);
    assert!(!o.status.success() && stderr(&o).contains("--at"), "{}", stderr(&o));
}

fn out_dir(name: &str) -> std::path::PathBuf {
    let d = std::env::temp_dir().join(format!("sunlot-cli-{name}-{}", std::process::id()));
    std::fs::create_dir_all(&d).unwrap();
    d
}

fn json_rows(o: &Output) -> Vec<serde_json::Value> {
    assert!(o.status.success(), "{}", stderr(o));
    serde_json::from_str::<serde_json::Value>(&stdout(o)).unwrap().as_array().unwrap().clone()
}

#[test]
fn sun_hours_per_area_and_map_files() {
    let d = out_dir("hours");
    let (csv, gj, png, svg) = (d.join("h.csv"), d.join("h.geojson"), d.join("h.png"), d.join("h.svg"));
    let o = sunlot(
        &[
            "hours",
            "--demo",
            "--area",
            "garden-16",
            "--date",
            "2026-03-20",
            "--cell-m",
            "1",
            "--format",
            "json",
            "--cells-csv",
            csv.to_str().unwrap(),
            "--geojson",
            gj.to_str().unwrap(),
            "--png",
            png.to_str().unwrap(),
            "--svg",
            svg.to_str().unwrap(),
        ],
        None,
    );
    let rows = json_rows(&o);
    assert_eq!(rows.len(), 1);
    assert_eq!(rows[0]["area_m2"], 196.0); // 7 m × 28 m
    let max = rows[0]["max_h"].as_f64().unwrap();
    assert!(max <= 12.3 && rows[0]["min_h"].as_f64().unwrap() >= 0.0, "equinox day at 52.6° N is about 12 h 10 min");
    let text = std::fs::read_to_string(&csv).unwrap();
    assert_eq!(text.lines().count(), 1 + 7 * 28);
    assert!(text.starts_with("x_m,y_m,sun_hours"));
    let fc: serde_json::Value = serde_json::from_str(&std::fs::read_to_string(&gj).unwrap()).unwrap();
    assert_eq!(fc["features"].as_array().unwrap().len(), 7 * 28);
    assert!(fc["features"][0]["properties"]["sun_hours"].is_number());
    assert_eq!(&std::fs::read(&png).unwrap()[1..4], b"PNG");
    assert!(std::fs::read_to_string(&svg).unwrap().starts_with("<svg"));
    for (args, want) in [
        (vec!["hours", "--demo", "--date", "2026-03-20", "--window", "15:00-09:00"], "inverted"),
        (vec!["hours", "--demo", "--date", "2026-03-20", "--cell-m", "0.001"], "cell_m must be at least 0.01"),
        (vec!["hours", "--demo", "--date", "2026-03-20", "--cell-m", "0.02"], "more than the limit"),
        (vec!["hours", "--demo", "--date", "2026-03-20", "--area", "moat"], "no area \"moat\""),
        (vec!["hours", "--demo", "--date", "2026-03-20", "--to", "2026-03-01"], "before the first"),
        (vec!["hours", "--demo", "--date", "9999-03-20"], "9999"),
    ] {
        let o = sunlot(&args, None);
        assert!(!o.status.success() && stderr(&o).contains(want), "{args:?}: {}", stderr(&o));
    }
}

#[test]
fn compare_reports_each_area_before_and_after() {
    let o = sunlot(&["compare", "--demo", "--date", "2026-03-20", "--cell-m", "1", "--format", "json"], None);
    let rows = json_rows(&o);
    // Six gardens; the lot is left out unless --with-lot.
    assert_eq!(rows.len(), 6);
    for r in &rows {
        // The proposal only adds shade: after never exceeds before.
        assert!(r["after_2h_pct"].as_f64().unwrap() <= r["before_2h_pct"].as_f64().unwrap() + 1e-9, "{r}");
        assert!(r["mean_lost_h"].as_f64().unwrap() >= 0.0, "{r}");
    }
    let g9 = rows.iter().find(|r| r["area"] == "garden-9").unwrap();
    assert_eq!(
        g9["mean_lost_h"], 0.0,
        "at the equinox the proposal's shadow stops short of the garden across the lane"
    );
    let g16 = rows.iter().find(|r| r["area"] == "garden-16").unwrap();
    assert!(g16["mean_lost_h"].as_f64().unwrap() > 0.5, "the proposal shades the neighbour's garden: {g16}");
}

#[test]
fn check_report_and_json_agree() {
    let o = sunlot(&["check", "--demo", "--year", "2026", "--cell-m", "1", "--format", "json"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(v["rule"]["id"], "bre-br209-amenity");
    assert!(v["rule"]["source"].as_str().unwrap().contains("BR 209"));
    assert!(v["caution"].as_str().unwrap().contains("licensed professional"));
    let areas = v["areas"].as_array().unwrap();
    assert!(areas.iter().all(|a| a["id"].as_str().unwrap().starts_with("garden")));
    let o = sunlot(&["check", "--demo", "--year", "2026", "--cell-m", "1"], None);
    let text = stdout(&o);
    for a in areas {
        // The verdict is the row's last cell, in the words the web tables use.
        let verdict = if a["passes"].as_bool().unwrap() { "passes" } else { "fails" };
        let line = text.lines().find(|l| l.contains(a["id"].as_str().unwrap())).unwrap().trim_end();
        assert!(
            (line.ends_with(verdict) || line.ends_with(&format!("{verdict} (near threshold)")))
                && line.contains(&format!("{:.1}", 100.0 * a["after_share"].as_f64().unwrap())),
            "{line}"
        );
    }
    assert!(text.contains("licensed professional"));
    let d = out_dir("check");
    let rule = d.join("rule.json");
    std::fs::write(
        &rule,
        r#"{"id":"own","title":"3 h in the morning","month":6,"day":21,"from":"08:00","to":"12:00",
            "min_hours":3,"min_share":0.5,"area_ids":["garden-16","garden-99"]}"#,
    )
    .unwrap();
    let o = sunlot(&["check", "--demo", "--rule-file", rule.to_str().unwrap()], None);
    assert!(!o.status.success() && stderr(&o).contains("garden-99"), "{}", stderr(&o));
    assert!(stdout(&sunlot(&["check", "--help"], None)).contains("BR 209"));
}

#[test]
fn envelope_insolation_timeline_and_year() {
    let d = out_dir("envelope");
    let gj = d.join("bands.geojson");
    let o = sunlot(
        &[
            "envelope",
            "--demo",
            "--lot",
            "lot-14",
            "--date",
            "2026-03-21",
            "--geojson",
            gj.to_str().unwrap(),
            "--format",
            "json",
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let max = v["max_height_m"].as_f64().unwrap();
    assert!(max > 5.0 && max < 30.0, "{v}");
    let fc: serde_json::Value = serde_json::from_str(&std::fs::read_to_string(&gj).unwrap()).unwrap();
    assert!(fc["features"].as_array().unwrap().len() >= 3);
    let o = sunlot(&["envelope", "--demo", "--lot", "nowhere", "--date", "2026-03-21"], None);
    assert!(!o.status.success() && stderr(&o).contains("nowhere"));

    let rows = json_rows(&sunlot(
        &[
            "insolation",
            "--demo",
            "--area",
            "garden-9,garden-16",
            "--date",
            "2026-06-21",
            "--sky-step-deg",
            "10",
            "--format",
            "json",
        ],
        None,
    ));
    let by = |id: &str| rows.iter().find(|r| r["area"] == id).unwrap().clone();
    let (g9, g16) = (by("garden-9"), by("garden-16"));
    assert!(g16["mean_kwh_m2"].as_f64().unwrap() < g9["mean_kwh_m2"].as_f64().unwrap());
    assert!(g16["mean_sky_view"].as_f64().unwrap() < 1.0);

    let rows = json_rows(&sunlot(
        &["timeline", "--demo", "--at", "14,41,1.5", "--date", "2026-03-21", "--format", "json"],
        None,
    ));
    assert_eq!(rows.iter().map(|r| r["state"].as_str().unwrap()).collect::<Vec<_>>(), ["sun", "shade", "sun"]);
    assert_eq!(rows[1]["shaded_by"], "proposal-upper");
    let rows = json_rows(&sunlot(
        &["year", "--demo", "--at", "14,41,0", "--year", "2026", "--step-min", "30", "--format", "json"],
        None,
    ));
    assert_eq!(rows.len(), 12);
    assert!(rows[5]["sun_h"].as_f64().unwrap() > rows[11]["sun_h"].as_f64().unwrap());
}

#[test]
fn sun_path_diagram_as_png_and_svg() {
    let d = out_dir("sky");
    let (png, svg) = (d.join("sky.png"), d.join("sky.svg"));
    let o = sunlot(
        &[
            "sky",
            "--demo",
            "--at",
            "14,41,1.5",
            "--year",
            "2026",
            "--png",
            png.to_str().unwrap(),
            "--svg",
            svg.to_str().unwrap(),
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    assert_eq!(&std::fs::read(&png).unwrap()[1..4], b"PNG");
    let text = std::fs::read_to_string(&svg).unwrap();
    assert!(text.starts_with("<svg") && text.contains("21 Jun") && text.contains("sky hidden by"));
    let o = sunlot(&["sky", "--demo"], None);
    assert!(!o.status.success() && stderr(&o).contains("--png"));
}

#[test]
fn shadow_plan_as_png_and_svg() {
    let d = out_dir("plan");
    let (png, svg) = (d.join("plan.png"), d.join("plan.svg"));
    let o = sunlot(
        &[
            "shadows",
            "--demo",
            "--local",
            "2026-03-21T15:00",
            "--format",
            "json",
            "--png",
            png.to_str().unwrap(),
            "--svg",
            svg.to_str().unwrap(),
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    assert_eq!(&std::fs::read(&png).unwrap()[1..4], b"PNG");
    let text = std::fs::read_to_string(&svg).unwrap();
    assert!(text.contains("added by proposal") && text.contains("licensed"));
}

/// Found by hostile input: a grid of ~1e10 cells ran out of memory and long periods ran for minutes.
/// Every request is checked against its budget before the work allocates, naming the field, the
/// request's size and the limit (`src/limits.rs`).
#[test]
fn oversized_requests_are_refused_before_any_work() {
    let o =
        sunlot(&["hours", "--demo", "--date", "2026-03-20", "--cell-m", "0.01", "--max-cells", "100000000000"], None);
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(stderr(&o).contains("more than the limit of 16000000"), "{}", stderr(&o));
    let o = sunlot(
        &["hours", "--demo", "--date", "2026-01-01", "--to", "2035-12-31", "--step-min", "1", "--cell-m", "0.05"],
        None,
    );
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(
        stderr(&o)
            .contains("cell_m, step_min, to: 5,242,051,584,000 cell-steps is more than the limit of 200,000,000,000"),
        "{}",
        stderr(&o)
    );
    let o = sunlot(&["hours", "--demo", "--date", "2026-01-01", "--to", "2999-12-31", "--cell-m", "2"], None);
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(stderr(&o).contains("the period: 355,746 days is more than the limit of 3,660 days"), "{}", stderr(&o));
    let o = sunlot(
        &[
            "insolation",
            "--demo",
            "--date",
            "2026-03-20",
            "--cell-m",
            "0.02",
            "--sky-step-deg",
            "0.5",
            "--max-cells",
            "16000000",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(stderr(&o).contains("sky_step_deg:") && stderr(&o).contains("cell-patches"), "{}", stderr(&o));
}

/// `sunlot window`: the demo's rear window of 16 Tenter Lane (north-facing, west of it the proposal):
/// existing and with-proposal rows, the sky component within the unobstructed 39.62 % and lower with
/// the proposal, hours of sun no more than the open window's, which are no more than the day's.
#[test]
fn window_reports_sky_component_and_sun_hours_before_and_after() {
    let o = sunlot(
        &["window", "--demo", "--at", "31,12,1.2", "--facing-deg", "0", "--date", "2026-06-21", "--format", "json"],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let rows = v.as_array().unwrap_or_else(|| panic!("{v}"));
    assert_eq!(rows.len(), 2, "{v}");
    let num = |r: &serde_json::Value, k: &str| r[k].as_f64().unwrap_or_else(|| panic!("{k} in {r}"));
    let (before, after) = (&rows[0], &rows[1]);
    assert_eq!(before["massing"], "existing");
    for r in rows {
        assert!(num(r, "vsc_pct") > 0.0 && num(r, "vsc_pct") <= 39.62, "{r}");
        assert!(num(r, "sun_h") <= num(r, "open_sun_h") + 1e-9 && num(r, "open_sun_h") <= num(r, "day_h"), "{r}");
    }
    assert!(num(after, "vsc_pct") < num(before, "vsc_pct"), "{v}");
    assert!(num(after, "sun_h") <= num(before, "sun_h"), "{v}");
    let o = sunlot(
        &[
            "window",
            "--demo",
            "--at",
            "31,12,1.2",
            "--facing-deg",
            "0",
            "--date",
            "2026-06-21",
            "--azimuth-step-deg",
            "9",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("azimuth_step_deg must be 0.01 to 5"), "{}", stderr(&o));
}

/// A window named in a version 2 site file is picked by its id, with its name in the title; an unknown
/// id lists the site's windows.
#[test]
fn window_by_id_from_the_site_file() {
    let site = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fuzz/corpus/site/windows.site.json");
    let o = sunlot(&["window", site, "--id", "w-16-rear", "--date", "2026-06-21", "--format", "json"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let by_id: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let o = sunlot(
        &["window", site, "--at", "31,12,1.2", "--facing-deg", "0", "--date", "2026-06-21", "--format", "json"],
        None,
    );
    let by_point: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(by_id, by_point);
    let o = sunlot(&["window", site, "--id", "w-16-rear", "--date", "2026-06-21"], None);
    assert!(stdout(&o).starts_with("16 Tenter Lane, rear window facing 0°"), "{}", stdout(&o));
    let o = sunlot(&["window", site, "--id", "nope", "--date", "2026-06-21"], None);
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("no window \"nope\" (its windows: w-16-rear, w-12-rear"), "{}", stderr(&o));
}

#[test]
fn facade_maps_every_face_with_its_windows_and_writes_the_elevations() {
    let d = out_dir("facade");
    let (png, svg, csv) = (d.join("f.png"), d.join("f.svg"), d.join("f.csv"));
    let o = sunlot(
        &[
            "facade",
            "--demo",
            "--volume",
            "terrace-east",
            "--date",
            "2026-03-21",
            "--step-min",
            "15",
            "--quiet",
            "--png",
            png.to_str().unwrap(),
            "--svg",
            svg.to_str().unwrap(),
            "--cells-csv",
            csv.to_str().unwrap(),
            "--format",
            "json",
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let rows: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let rows = rows.as_array().unwrap();
    let facing: Vec<f64> = rows.iter().map(|r| r["facing_deg"].as_f64().unwrap()).collect();
    assert_eq!(facing, vec![180.0, 90.0, 0.0, 270.0]);
    // The open south face gets the whole equinox day; the west face has the side window.
    assert!(rows[0]["min_sun_h"].as_f64().unwrap() > 11.5);
    assert_eq!(rows[3]["windows"].as_str().unwrap(), "w16-side");
    assert_eq!(&std::fs::read(&png).unwrap()[1..4], b"PNG");
    let text = std::fs::read_to_string(&svg).unwrap();
    assert!(text.starts_with("<svg") && text.contains("w16-side") && text.contains("licensed professional"));
    let cells = std::fs::read_to_string(&csv).unwrap();
    assert!(cells.starts_with("face,facing_deg,col,row,x_m,y_m,z_m,sun_hours,beam_kwh_m2"));
    let o = sunlot(&["facade", "--demo", "--volume", "shed", "--date", "2026-03-21"], None);
    assert!(
        !o.status.success() && stderr(&o).contains("shed") && stderr(&o).contains("terrace-east"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn negative_numbers_are_values_and_impossible_dates_are_named() {
    let o = sunlot(
        &["position", "--lat", "52", "--lon", "0", "--time", "2026-06-21T12:00:00Z", "--pressure-hpa", "-5"],
        None,
    );
    assert!(!o.status.success() && stderr(&o).contains("--pressure-hpa must be between"), "{}", stderr(&o));
    let o = sunlot(
        &["day", "--lat", "-33.87", "--lon", "151.21", "--zone", "Australia/Sydney", "--date", "2026-06-21"],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let o = sunlot(&["day", "--lat", "52", "--lon", "0", "--date", "2026-02-30"], None);
    assert!(stderr(&o).contains("does not exist"), "{}", stderr(&o));
}

#[test]
fn compare_leaves_the_lot_out_unless_asked() {
    let rows = |extra: &[&str]| {
        let mut args = vec![
            "compare",
            "--demo",
            "--date",
            "2026-03-21",
            "--cell-m",
            "2",
            "--step-min",
            "30",
            "--quiet",
            "--format",
            "json",
        ];
        args.extend_from_slice(extra);
        let o = sunlot(&args, None);
        assert!(o.status.success(), "{}", stderr(&o));
        let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
        v.as_array().unwrap().iter().map(|r| r["area"].as_str().unwrap().to_string()).collect::<Vec<_>>()
    };
    let neighbours = rows(&[]);
    assert!(
        !neighbours.contains(&"lot-14".to_string()) && neighbours.contains(&"garden-16".to_string()),
        "{neighbours:?}"
    );
    assert!(rows(&["--with-lot"]).contains(&"lot-14".to_string()));
}

/// Plain GeoJSON building footprints, as an open-data portal gives them (no sunlot members, OSM-style
/// heights): refused with a zone suggested from the longitude until `--zone` is given; then read as
/// existing volumes named after the file, with what was assumed said on stderr.
#[test]
fn plain_building_footprints_are_read_once_the_zone_is_given() {
    let d = std::env::temp_dir().join(format!("sunlot-cli-footprints-{}", std::process::id()));
    std::fs::create_dir_all(&d).unwrap();
    let path = d.join("mill-street.geojson");
    let ring = |lon: f64, lat: f64| {
        format!(
            "[[[{lon},{lat}],[{},{lat}],[{},{}],[{lon},{}],[{lon},{lat}]]]",
            lon + 2e-4,
            lon + 2e-4,
            lat + 1e-4,
            lat + 1e-4
        )
    };
    let text = format!(
        r#"{{"type":"FeatureCollection","features":[
        {{"type":"Feature","id":"way/7","properties":{{"height":"9.5"}},"geometry":{{"type":"Polygon","coordinates":{}}}}},
        {{"type":"Feature","properties":{{"building:levels":3}},"geometry":{{"type":"Polygon","coordinates":{}}}}}]}}"#,
        ring(16.37, 48.2),
        ring(16.37, 48.2003)
    );
    std::fs::write(&path, text).unwrap();
    let p = path.to_str().unwrap();
    let o = sunlot(&["convert", p, "--format", "site"], None);
    assert!(!o.status.success());
    let e = stderr(&o);
    assert!(
        e.contains("do not say the site's time zone") && e.contains("Etc/GMT-1") && e.contains("give --zone"),
        "{e}"
    );
    let o = sunlot(&["convert", p, "--format", "site", "--zone", "Europe/Vienna", "--storey-height-m", "3.5"], None);
    assert!(o.status.success(), "{}", stderr(&o));
    let site: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(site["location"]["zone"], "Europe/Vienna");
    assert_eq!(site["name"], "mill-street");
    let tops: Vec<f64> = site["volumes"].as_array().unwrap().iter().map(|v| v["top_m"].as_f64().unwrap()).collect();
    assert_eq!(tops, vec![9.5, 10.5]);
    let e = stderr(&o);
    assert!(e.contains("2 footprint(s) read as existing buildings") && e.contains("at 3.5 m a storey"), "{e}");
    assert!(e.contains("the site is called \"mill-street\""), "{e}");
}

/// Too many day paths are refused under the flag that gives them (the diagram's typed error; the
/// message named --at before).
#[test]
fn too_many_sky_dates_name_the_dates_flag() {
    let dates = vec!["2026-06-21"; 70].join(",");
    let o = sunlot(&["sky", "--demo", "--dates", &dates, "--svg", "/dev/null"], None);
    assert!(!o.status.success());
    let e = stderr(&o);
    assert!(e.contains("--dates: 70 day paths is more than the limit of 64") && !e.contains("--at"), "{e}");
}

/// `sunlot view` writes the 3-D view as PNG and SVG, says how many faces it drew, and refuses a view
/// without a file, a camera out of range, and a sloping site, naming the option.
#[test]
fn view_writes_the_3d_view_and_names_bad_options() {
    let dir = out_dir("view");
    let (png, svg) = (dir.join("v.png"), dir.join("v.svg"));
    let o = sunlot(
        &[
            "view",
            "--demo",
            "--local",
            "2026-06-21T09:00",
            "--png",
            png.to_str().unwrap(),
            "--svg",
            svg.to_str().unwrap(),
        ],
        None,
    );
    assert!(o.status.success(), "{}", stderr(&o));
    assert!(stdout(&o).contains("faces drawn as"), "{}", stdout(&o));
    assert_eq!(&std::fs::read(&png).unwrap()[1..4], b"PNG");
    let text = std::fs::read_to_string(&svg).unwrap();
    assert!(text.starts_with("<svg") && text.contains("Massing and shadows at 2026-06-21 09:00"), "{}", &text[..200]);
    let o = sunlot(&["view", "--demo", "--local", "2026-06-21T09:00"], None);
    assert!(!o.status.success() && stderr(&o).contains("--png FILE or --svg FILE"), "{}", stderr(&o));
    let o = sunlot(
        &["view", "--demo", "--local", "2026-06-21T09:00", "--view-elevation-deg", "2", "--svg", svg.to_str().unwrap()],
        None,
    );
    assert!(stderr(&o).contains("--view-elevation-deg: must be 5 to 90 degrees, got 2"), "{}", stderr(&o));
    let o = sunlot(
        &["view", "--demo", "--local", "2026-06-21T09:00", "--perspective-m", "0.1", "--svg", svg.to_str().unwrap()],
        None,
    );
    assert!(stderr(&o).contains("--perspective-m: must be 1 m to 100 km"), "{}", stderr(&o));
    let o = sunlot(
        &["view", "--demo", "--local", "2026-03-21T11:00", "--envelope-lot", "lot-14", "--svg", svg.to_str().unwrap()],
        None,
    );
    assert!(
        o.status.success() && std::fs::read_to_string(&svg).unwrap().contains("solar envelope (steps)"),
        "{}",
        stderr(&o)
    );
    let o = sunlot(
        &["view", "--demo", "--local", "2026-03-21T11:00", "--envelope-lot", "nowhere", "--svg", svg.to_str().unwrap()],
        None,
    );
    assert!(stderr(&o).contains("--envelope-lot"), "{}", stderr(&o));
}

/// `sunlot tiles` plans, computes and `sunlot stitch` joins tiles equal to the single run, byte for
/// byte; wrong extents, indices and files are refused by name.
#[test]
fn tiles_stitch_into_the_single_run_and_bad_tiles_are_named() {
    let dir = std::env::temp_dir().join(format!("sunlot-cli-tiles-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = |f: &str| dir.join(f).to_string_lossy().to_string();
    let common =
        ["tiles", "--demo", "--date", "2026-03-21", "--window", "10:00-14:00", "--cell-m", "1", "--tile-cells", "25"];
    let plan = sunlot(&[&common[..], &["--format", "json"]].concat(), None);
    assert!(plan.status.success(), "{}", stderr(&plan));
    let rows: serde_json::Value = serde_json::from_str(&stdout(&plan)).unwrap();
    let n = rows.as_array().unwrap().len();
    assert!(n > 4, "{n} tiles");
    let text = stdout(&sunlot(&common, None));
    assert!(text.contains("Halo ") && text.contains("at its lowest"), "{text}");
    let mut files = Vec::new();
    for i in 0..n {
        let f = p(&format!("t{i}.f32"));
        let o = sunlot(&[&common[..], &["--index", &i.to_string(), "--out", &f]].concat(), None);
        assert!(o.status.success(), "{}", stderr(&o));
        files.push(f);
    }
    let whole = sunlot(&[&common[..], &["--whole", "--out", &p("whole.f32")]].concat(), None);
    assert!(whole.status.success(), "{}", stderr(&whole));
    let refs: Vec<&str> = files.iter().map(String::as_str).collect();
    let out = p("stitched.f32");
    let s = sunlot(&[&["stitch"][..], &refs, &["--out", &out, "--cells-csv", &p("cells.csv")]].concat(), None);
    assert!(s.status.success(), "{}", stderr(&s));
    assert_eq!(std::fs::read(&out).unwrap(), std::fs::read(p("whole.f32")).unwrap());
    let csv = std::fs::read_to_string(p("cells.csv")).unwrap();
    assert!(csv.starts_with("x_m,y_m,sun_hours\n") && csv.lines().count() > 100);

    let o = sunlot(&[&common[..], &["--index", "999", "--out", &p("x.f32")]].concat(), None);
    assert!(stderr(&o).contains(&format!("--index 999: the plan has tiles 0 to {}", n - 1)), "{}", stderr(&o));
    let o = sunlot(&[&common[..], &["--bbox", "10,10,5,20"]].concat(), None);
    assert!(stderr(&o).contains("--bbox takes X0,Y0,X1,Y1"), "{}", stderr(&o));
    std::fs::write(p("junk.f32"), b"not a tile").unwrap();
    let o = sunlot(&["stitch", &files[0], &p("junk.f32"), "--out", &p("y.f32")], None);
    assert!(stderr(&o).contains("junk.f32: not a sunlot tile file"), "{}", stderr(&o));
    let o = sunlot(&[&["stitch"][..], &refs[1..], &["--out", &p("z.f32")]].concat(), None);
    assert!(stderr(&o).contains("uncovered"), "{}", stderr(&o));
    std::fs::remove_dir_all(&dir).ok();
}

//! The JavaScript facade in headless Chromium (wasm-bindgen-test): the SPA paper's worked example
//! through the browser path, and thrown errors for bad input.
//!
//! Inputs are built as JavaScript objects (JSON.parse), the way a page would pass them.
#![cfg(target_arch = "wasm32")]

use js_sys::{Reflect, JSON};
use wasm_bindgen::JsValue;
use wasm_bindgen_test::*;

wasm_bindgen_test_configure!(run_in_browser);

#[path = "common/zone_digest.rs"]
mod zone_digest;

fn js(text: &str) -> JsValue {
    JSON::parse(text).expect("test input is JSON")
}

fn get(v: &JsValue, key: &str) -> JsValue {
    Reflect::get(v, &JsValue::from_str(key)).expect("field present")
}

fn num(v: &JsValue, key: &str) -> f64 {
    get(v, key).as_f64().unwrap_or_else(|| panic!("{key} is a number"))
}

fn error_message(r: Result<JsValue, wasm_bindgen::JsError>) -> String {
    let e: JsValue = r.expect_err("an error").into();
    get(&e, "message").as_string().expect("message string")
}

/// Reda & Andreas (2004), Table A5.2: zenith 50.11162°, azimuth 194.34024°; the same as the native core.
#[wasm_bindgen_test]
fn spa_worked_example_in_the_browser() {
    let input = r#"{"latitudeDeg": 39.742476, "longitudeDeg": -105.1786, "elevationM": 1830.14,
        "time": "2003-10-17T12:30:30-07:00", "pressureHpa": 820, "temperatureC": 11, "deltaTS": 67}"#;
    let out = sunlot::web::solar_position(js(input)).expect("position");
    assert!((num(&out, "zenithDeg") - 50.11162).abs() < 5e-6);
    assert!((num(&out, "azimuthDeg") - 194.34024).abs() < 5e-6);
    assert!((num(&out, "equationOfTimeMin") - 14.641511).abs() < 5e-6);
    assert_eq!(get(&out, "time").as_string().unwrap(), "2003-10-17T12:30:30-07:00");

    let native = sunlot::solar_position(
        &sunlot::Site::new(39.742476, -105.1786, 1830.14).unwrap(),
        sunlot::time::parse_instant("2003-10-17T12:30:30-07:00").unwrap().0,
        &sunlot::Atmosphere::new(820.0, 11.0, true).unwrap(),
        sunlot::DeltaT::Seconds(67.0),
    )
    .unwrap();
    assert_eq!(num(&out, "zenithDeg"), native.zenith_deg);
    assert_eq!(num(&out, "azimuthDeg"), native.azimuth_deg);
}

#[wasm_bindgen_test]
fn paper_sunrise_and_polar_night_in_the_browser() {
    let out = sunlot::web::day_events(js(r#"{"latitudeDeg": 39.742476, "longitudeDeg": -105.1786,
        "date": "2003-10-17", "zone": "-07:00", "deltaTS": 67}"#))
    .unwrap();
    assert_eq!(get(&out, "sunrise").as_string().unwrap(), "2003-10-17T06:12:43-07:00");
    assert_eq!(get(&out, "solarNoon").as_string().unwrap(), "2003-10-17T11:46:04-07:00"); // 11:46:04.96, seconds truncated as in the paper
    let polar = sunlot::web::day_events(js(
        r#"{"latitudeDeg": 78.2, "longitudeDeg": 15.6, "date": "2026-12-21", "zone": "Arctic/Longyearbyen"}"#,
    ))
    .unwrap();
    assert_eq!(get(&polar, "sun").as_string().unwrap(), "alwaysDown");
    assert!(get(&polar, "sunrise").is_null());
}

#[wasm_bindgen_test]
fn bad_input_throws_errors_that_name_the_field() {
    let m = error_message(sunlot::web::solar_position(js(
        r#"{"latitudeDeg": 91, "longitudeDeg": 0, "time": "2020-01-01T00:00:00Z"}"#,
    )));
    assert!(m.contains("latitude_deg must be between -90 and 90"), "{m}");
    let m = error_message(sunlot::web::solar_position(js(r#"{"latitudeDeg": 10, "longitudeDeg": 0, "time": "noon"}"#)));
    assert!(m.contains("\"noon\" is not an RFC 3339"), "{m}");
    let m = error_message(sunlot::web::solar_position(js(r#"{"longitudeDeg": 0, "time": "2020-01-01T00:00:00Z"}"#)));
    assert!(m.contains("latitudeDeg"), "{m}");
    let m = error_message(sunlot::web::solar_position(js(
        r#"{"latitudeDeg": 51, "longitudeDeg": 0, "localTime": "2024-03-31T01:30", "zone": "Europe/London"}"#,
    )));
    assert!(m.contains("does not exist in Europe/London"), "{m}");
    let m = error_message(sunlot::web::day_events(js(
        r#"{"latitudeDeg": 51, "longitudeDeg": 0, "date": "2024-03-31", "zone": "Mars/Base"}"#,
    )));
    assert!(m.contains("zone"), "{m}");
    let m = error_message(sunlot::web::season_instants(7000.0, JsValue::UNDEFINED));
    assert!(m.contains("year 7000"), "{m}");
    let m = error_message(sunlot::web::clear_sky(js(r#"{"zenithDeg": 30, "dayOfYear": 400}"#)));
    assert!(m.contains("dayOfYear"), "{m}");
    // Not an object at all.
    let m = error_message(sunlot::web::solar_position(JsValue::from_f64(3.0)));
    assert!(m.starts_with("solarPosition:"), "{m}");
}

#[wasm_bindgen_test]
fn clear_sky_in_the_browser_matches_the_core() {
    let out = sunlot::web::clear_sky(js(r#"{"zenithDeg": 30, "dayOfYear": 172}"#)).unwrap();
    let e0 = sunlot::sky::extraterrestrial_normal_w_m2(172);
    let s = sunlot::sky::bird_clear_sky(30.0, e0, &Default::default());
    assert_eq!(num(&out, "ghiWM2"), s.ghi_w_m2);
    assert!(num(&out, "ghiWM2") > 700.0 && num(&out, "ghiWM2") < 1100.0);
    let hazy = sunlot::web::clear_sky(js(
        r#"{"zenithDeg": 30, "dayOfYear": 172, "atmosphere": {"aod500": 0.5, "aod380": 0.7}}"#,
    ))
    .unwrap();
    assert!(num(&hazy, "dniWM2") < num(&out, "dniWM2"));
    let m = error_message(sunlot::web::clear_sky(js(
        r#"{"zenithDeg": 30, "dayOfYear": 172, "atmosphere": {"albedo": 2}}"#,
    )));
    assert!(m.contains("albedo"), "{m}");
}

fn demo_site_js() -> String {
    serde_json::to_string(sunlot::demo::DEMO_SITE_JSON).unwrap()
}

/// The sun-hours map through the facade equals the core's map on the same inputs, as a typed array.
#[wasm_bindgen_test]
fn sun_hours_map_is_a_typed_array_equal_to_the_core() {
    let input = format!(
        r#"{{"site": {}, "areas": ["garden-16"], "cellM": 1, "date": "2026-03-20", "stepMin": 10}}"#,
        demo_site_js()
    );
    let out = sunlot::web::sun_hours_map(js(&input), None).expect("map");
    let grid = get(&out, "grid");
    let (cols, rows) = (num(&grid, "cols") as usize, num(&grid, "rows") as usize);
    let hours: js_sys::Float64Array = get(&out, "hours").into();
    assert_eq!(hours.length() as usize, cols * rows);
    let m = sunlot::demo::demo();
    let garden = m.areas.iter().find(|a| a.id == "garden-16").unwrap();
    let g = sunlot::exposure::Grid::over_polygon(&garden.polygon, 1.0, sunlot::exposure::DEFAULT_MAX_CELLS).unwrap();
    let req = sunlot::exposure::SunHoursRequest {
        model: &m,
        grid: &g,
        period: sunlot::exposure::Period::day(chrono::NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 10),
        plane_m: 0.0,
        delta_t: sunlot::time::DeltaT::EspenakMeeus,
        massing: sunlot::exposure::Massing::WithProposed,
    };
    let core = sunlot::exposure::sun_hours(&req, |_| true).unwrap();
    for (k, want) in core.hours.iter().enumerate() {
        let got = hours.get_index(k as u32);
        match want {
            Some(h) => assert_eq!(got, h),
            None => assert!(got.is_nan()),
        }
    }
}

#[wasm_bindgen_test]
fn rule_checks_envelopes_and_timelines_through_the_facade() {
    let site = demo_site_js();
    let report =
        sunlot::web::check_rule_js(js(&format!(r#"{{"site": {site}, "year": 2026, "cellM": 1, "stepMin": 10}}"#)))
            .unwrap();
    assert!(get(&report, "caution").as_string().unwrap().contains("licensed professional"));
    let areas: js_sys::Array = get(&report, "areas").into();
    assert!(areas.length() >= 5);
    // The report in camelCase like every other call; its rule in the rule-file format, so that it can
    // be given back as `rule` (here with a stricter share: the same areas, other verdicts).
    let first = areas.get(0);
    assert!(num(&first, "beforeShare") >= num(&first, "afterShare"));
    let rule = get(&report, "rule");
    assert_eq!(get(&rule, "min_hours").as_f64(), Some(2.0));
    js_sys::Reflect::set(&rule, &"min_share".into(), &1.0.into()).unwrap();
    let again = js_sys::Object::new();
    for (k, v) in
        [("site", js(&site)), ("rule", rule), ("year", 2026.into()), ("cellM", 1.into()), ("stepMin", 10.into())]
    {
        js_sys::Reflect::set(&again, &k.into(), &v).unwrap();
    }
    let strict = sunlot::web::check_rule_js(again.into()).unwrap();
    assert_eq!(get(&get(&strict, "rule"), "min_share").as_f64(), Some(1.0));
    assert_eq!(js_sys::Array::from(&get(&strict, "areas")).length(), areas.length());
    let env = sunlot::web::solar_envelope_js(
        js(&format!(r#"{{"site": {site}, "lot": "lot-14", "date": "2026-03-21"}}"#)),
        None,
    )
    .unwrap();
    let h: js_sys::Float64Array = get(&env, "heightM").into();
    assert!(h.to_vec().iter().any(|&x| x > 3.0));
    let t = sunlot::web::point_timeline(js(&format!(
        r#"{{"site": {site}, "xM": 14, "yM": 41, "zM": 1.5, "date": "2026-03-21"}}"#
    )))
    .unwrap();
    let iv: js_sys::Array = get(&t, "intervals").into();
    assert_eq!(iv.length(), 3);
}

#[wasm_bindgen_test]
fn bad_map_input_throws_errors_naming_the_field() {
    let site = demo_site_js();
    let cases = [
        (format!(r#"{{"site": {site}, "areas": ["moat"], "date": "2026-03-20"}}"#), "moat"),
        (format!(r#"{{"site": {site}, "date": "2026-03-20", "window": "15:00-09:00"}}"#), "inverted"),
        (format!(r#"{{"site": {site}, "date": "2026-03-20", "cellM": 0.001}}"#), "cellM"),
        (format!(r#"{{"site": {site}, "date": "20 March"}}"#), "date"),
        (r#"{"site": "{\"sunlot_site\": 9}", "date": "2026-03-20"}"#.to_string(), "site"),
        (format!(r#"{{"site": {site}, "date": "2026-03-20", "massing": "maybe"}}"#), "massing"),
    ];
    for (input, want) in cases {
        let msg = error_message(sunlot::web::sun_hours_map(js(&input), None));
        assert!(msg.contains(want), "{input}: {msg}");
    }
    // Cancelling from the progress callback is a clean error.
    let cancel = js_sys::Function::new_with_args("f", "return false;");
    let input = format!(r#"{{"site": {site}, "areas": ["garden-16"], "date": "2026-03-01", "to": "2026-03-31"}}"#);
    assert!(error_message(sunlot::web::sun_hours_map(js(&input), Some(cancel))).contains("cancelled"));
}

/// The sun-path diagram drawn on a canvas by the same code as the PNG and SVG exports: pixels checked.
#[wasm_bindgen_test]
fn sky_chart_draws_on_a_canvas_and_as_svg() {
    use wasm_bindgen::JsCast;
    let doc = web_sys::window().unwrap().document().unwrap();
    let canvas: web_sys::HtmlCanvasElement = doc.create_element("canvas").unwrap().dyn_into().unwrap();
    canvas.set_width(900);
    canvas.set_height(720);
    let input = format!(
        r#"{{"site": {}, "year": 2026, "xM": 14, "yM": 41, "zM": 1.5, "localTime": "2026-03-21T15:00"}}"#,
        demo_site_js()
    );
    sunlot::web::draw_sky_chart_js(&canvas, js(&input)).expect("drawn");
    let ctx: web_sys::CanvasRenderingContext2d = canvas.get_context("2d").unwrap().unwrap().dyn_into().unwrap();
    let data = ctx.get_image_data(0.0, 0.0, 900.0, 720.0).unwrap().data();
    let px = data.0;
    let (mut ink, mut june) = (0, 0);
    for p in px.chunks_exact(4) {
        if p[0] < 200 || p[1] < 200 || p[2] < 200 {
            ink += 1;
        }
        // The June solstice path (the diagram's summer red, 160 36 24), allowing for anti-aliasing.
        if (p[0] as i32 - 160).abs() < 12 && (p[1] as i32 - 36).abs() < 12 && (p[2] as i32 - 24).abs() < 12 {
            june += 1;
        }
    }
    assert!(ink > 20_000, "the chart has ink: {ink}");
    assert!(june > 200, "the June path is drawn: {june}");
    let svg = sunlot::web::sky_chart_svg(js(&input), 900, 720).expect("svg");
    assert!(svg.starts_with("<svg") && svg.contains("sky hidden by"));
    assert!(error_message(
        sunlot::web::sky_chart_svg(js(&format!(r#"{{"site": {}, "year": 2026, "xM": 1}}"#, demo_site_js())), 10, 10)
            .map(JsValue::from)
    )
    .contains("xM"));
}

/// Insolation through the facade equals the core's map; the map layer, its GeoJSON and the plan with
/// a view, a layer and a page palette draw; bad layer, view, palette and underlay input is named.
#[wasm_bindgen_test]
fn insolation_layers_views_palettes_and_underlays_through_the_facade() {
    use wasm_bindgen::JsCast;
    let site = demo_site_js();
    let input =
        format!(r#"{{"site": {site}, "areas": ["garden-16"], "cellM": 1, "date": "2026-06-21", "stepMin": 20}}"#);
    let out = sunlot::web::insolation_map(js(&input), None).expect("insolation");
    let total: js_sys::Float64Array = get(&out, "totalKwhM2").into();
    let m = sunlot::demo::demo();
    let garden = m.areas.iter().find(|a| a.id == "garden-16").unwrap();
    let g = sunlot::exposure::Grid::over_polygon(&garden.polygon, 1.0, sunlot::exposure::DEFAULT_MAX_CELLS).unwrap();
    let req = sunlot::exposure::InsolationRequest {
        model: &m,
        grid: &g,
        period: sunlot::exposure::Period::day(chrono::NaiveDate::from_ymd_opt(2026, 6, 21).unwrap(), 20),
        plane_m: 0.0,
        delta_t: sunlot::time::DeltaT::EspenakMeeus,
        massing: sunlot::exposure::Massing::WithProposed,
        atmosphere: sunlot::sky::BirdAtmosphere::default(),
        sky_step_deg: sunlot::exposure::DEFAULT_SKY_STEP_DEG,
    };
    let core = sunlot::exposure::insolation(&req, |_| true).unwrap();
    for (k, want) in core.total_kwh_m2.iter().enumerate() {
        let got = total.get_index(k as u32);
        match want {
            Some(v) => assert_eq!(got, v),
            None => assert!(got.is_nan()),
        }
    }

    // A layer from the map, drawn under the plan in a zoomed view with a page paper colour.
    let values = total.to_vec();
    let grid = get(&out, "grid");
    let spec = js_sys::Object::new();
    Reflect::set(&spec, &"grid".into(), &grid).unwrap();
    Reflect::set(&spec, &"label".into(), &"insolation".into()).unwrap();
    Reflect::set(&spec, &"unit".into(), &"kWh/m²".into()).unwrap();
    let layer = sunlot::web::PlanLayer::new(spec.clone().into(), &values).expect("layer");
    let doc = web_sys::window().unwrap().document().unwrap();
    let canvas: web_sys::HtmlCanvasElement = doc.create_element("canvas").unwrap().dyn_into().unwrap();
    canvas.set_width(960);
    canvas.set_height(760);
    let plan_in = format!(
        r##"{{"site": {site}, "localTime": "2026-06-21T09:00", "view": {{"xM": 31, "yM": 26, "widthM": 20}},
             "palette": {{"paper": "#fdf6e3"}}}}"##
    );
    let frame = layer.draw_plan(&canvas, js(&plan_in)).expect("plan drawn");
    // The plan box is the figure's width less its 24 px margin and the 250 px key column.
    assert!((num(&frame, "pxPerM") - 686.0 / 20.0).abs() < 1e-9, "the view is 20 m across 686 px");
    let ctx: web_sys::CanvasRenderingContext2d = canvas.get_context("2d").unwrap().unwrap().dyn_into().unwrap();
    let corner = ctx.get_image_data(2.0, 2.0, 1.0, 1.0).unwrap().data().0;
    assert_eq!(&corner[..3], &[0xfd, 0xf6, 0xe3], "the page's paper colour");
    let svg = layer.plan_svg(js(&plan_in), 960, 760).expect("svg");
    assert!(svg.contains("clip-path") && svg.contains("insolation (kWh/m²)") && svg.contains("#fdf6e3"));
    // The map's cells ride in the SVG as a PNG the browser encoded (the module carries no encoder of
    // its own): a data URL whose bytes start with the PNG signature.
    let start = svg.find("href=\"data:image/png;base64,").expect("the cells as a PNG image") + 28;
    assert!(svg[start..].starts_with("iVBORw0KGgo"), "{}", &svg[start..start + 20]);
    let text = sunlot::web::map_geojson_js(
        js(&format!(
            r#"{{"site": {site}, "grid": {}, "name": "insolation_kwh_m2"}}"#,
            String::from(JSON::stringify(&grid).unwrap())
        )),
        &values,
    )
    .expect("geojson");
    let fc: serde_json::Value = serde_json::from_str(&text).unwrap();
    assert_eq!(fc["features"].as_array().unwrap().len(), values.iter().filter(|v| v.is_finite()).count());

    // Bad input names its field.
    assert!(error_message(sunlot::web::PlanLayer::new(spec.into(), &values[1..]).map(JsValue::from)).contains("grid"));
    let bad_view = plan_in.replace(r#""widthM": 20"#, r#""widthM": -2"#);
    assert!(error_message(sunlot::web::draw_shadow_plan_js(&canvas, js(&bad_view))).contains("view"));
    let bad_paper = plan_in.replace("#fdf6e3", "ivory");
    assert!(error_message(sunlot::web::draw_shadow_plan_js(&canvas, js(&bad_paper))).contains("palette.paper"));
    let timeline = format!(r#"{{"site": {site}, "xM": 14, "yM": 41, "date": "2026-03-21", "massing": "both"}}"#);
    assert!(error_message(sunlot::web::point_timeline(js(&timeline))).contains("massing"));
    let placed = sunlot::web::underlay_placement(js(
        r#"{"imageA": [100, 400], "imageB": [400, 400], "planA": [0, 0], "distanceM": 30, "bearingDeg": 90}"#,
    ))
    .unwrap();
    assert!((num(&placed, "a") - 0.1).abs() < 1e-12);
    assert!(error_message(sunlot::web::underlay_placement(js(
        r#"{"imageA": [1, 1], "imageB": [1, 1], "planA": [0, 0], "distanceM": 30}"#
    )))
    .contains("imageA"));
}

/// Hostile input to the calls added for the widgets and report pages: every one throws an `Error`
/// (never a trap, which would end this test), and the message names a field.
#[wasm_bindgen_test]
fn hostile_input_to_the_newer_calls_throws_and_never_traps() {
    let site = demo_site_js();
    let msg = |r: Result<JsValue, wasm_bindgen::JsError>| error_message(r);
    // (input, call, a word the error must hold, or None where a clean answer is fine too)
    let bad = |extra: &str| format!(r#"{{"site": {site}, {extra}}}"#);
    let cases: Vec<(String, &str, Option<&str>)> = vec![
        (bad(r#""date": "2026-03-21", "stepMin": 0"#), "shadowTable", Some("step")),
        (bad(r#""date": "2026-03-21", "stepMin": 100000"#), "shadowTable", Some("step")),
        (bad(r#""date": "31/12/2026""#), "shadowTable", Some("date")),
        (bad(r#""xM": 1e308, "yM": 0, "year": 2026"#), "yearProfile", None),
        (bad(r#""xM": 14, "yM": 41, "year": 99999"#), "yearProfile", Some("year")),
        (bad(r#""xM": 14, "yM": 41, "year": 2026, "stepMin": 0"#), "yearProfile", Some("step")),
        (bad(r#""xM": 14, "yM": 41"#), "yearProfile", Some("year")),
        (bad(r#""xM": 14, "yM": 41, "skyStepDeg": 0"#), "skyView", Some("step")),
        (bad(r#""xM": 14, "yM": 41, "skyStepDeg": -5"#), "skyView", Some("step")),
        (bad(r#""date": "2026-03-21", "cellM": -1"#), "insolationMap", Some("cellM")),
        (bad(r#""date": "2026-03-21", "aod500": -3"#), "insolationMap", Some("aod")),
        (bad(r#""date": "2026-03-21", "skyStepDeg": 1e9"#), "insolationMap", None),
        (bad(r#""localTime": "2026-03-21T12:00", "view": {"xM": 0, "yM": 0, "widthM": 1e308}"#), "plan", None),
        (bad(r#""localTime": "2026-03-21T25:00""#), "plan", Some("localTime")),
        (bad(r#""localTime": "2026-03-29T01:30""#), "plan", Some("localTime")),
        (
            r#"{"imageA": [0, 0], "imageB": [1e308, 1e308], "planA": [0, 0], "distanceM": 1e308}"#.to_string(),
            "underlay",
            None,
        ),
        (
            r#"{"imageA": [0, 0], "imageB": [1, 0], "planA": [0, 0], "distanceM": 0}"#.to_string(),
            "underlay",
            Some("distanceM"),
        ),
    ];
    for (input, call, want) in cases {
        let r = match call {
            "shadowTable" => sunlot::web::shadow_table_js(js(&input)),
            "yearProfile" => sunlot::web::year_profile_js(js(&input), None),
            "skyView" => sunlot::web::sky_view_js(js(&input)).map(JsValue::from),
            "insolationMap" => sunlot::web::insolation_map(js(&input), None),
            "plan" => sunlot::web::shadows_geojson(js(&input)).map(JsValue::from),
            _ => sunlot::web::underlay_placement(js(&input)),
        };
        // Known-bad input is refused naming the field; the rest (a huge view is clamped, a far point
        // or a huge placement is computed or refused) only has to come back without a trap.
        match (want, r) {
            (Some(field), r) => {
                let m = msg(r);
                assert!(m.to_lowercase().contains(&field.to_lowercase()), "{call} {input}: {m}");
            }
            (None, Err(e)) => assert!(!msg(Err(e)).is_empty(), "{call} {input}: an empty message"),
            (None, Ok(_)) => {}
        }
    }
    // A layer whose grid does not fit its values, or whose size overflows, is refused.
    let grid = r#"{"grid": {"cols": 4294967295, "rows": 4294967295, "originXM": 0, "originYM": 0, "col0": 0,
                   "row0": 0, "cellM": 1}, "label": "x", "unit": "h"}"#;
    assert!(msg(sunlot::web::PlanLayer::new(js(grid), &[1.0, 2.0]).map(JsValue::from)).contains("grid"));
    let nan_cell = grid.replace("4294967295", "1").replace(r#""cellM": 1"#, r#""cellM": -0.5"#);
    assert!(msg(sunlot::web::PlanLayer::new(js(&nan_cell), &[1.0]).map(JsValue::from)).contains("grid"));
    let flat = grid.replace("4294967295", "1");
    let r = sunlot::web::PlanLayer::new(
        js(&flat.replace(r#""unit": "h""#, r#""unit": "h", "rangeLo": 5, "rangeHi": 5"#)),
        &[1.0],
    );
    assert!(msg(r.map(JsValue::from)).contains("range"));
}

/// `windowLight` equals the core's sky component and window sun hours, by a window's id or by its
/// point, and `readSite` lists the site's windows.
#[wasm_bindgen_test]
fn window_light_through_the_facade_equals_the_core() {
    let text = include_str!("fuzz/corpus/site/windows.site.json");
    let site = serde_json::to_string(text).unwrap();
    let by_id =
        sunlot::web::window_light(js(&format!(r#"{{"site": {site}, "id": "w-16-rear", "date": "2026-06-21"}}"#)))
            .unwrap();
    let by_point = sunlot::web::window_light(js(&format!(
        r#"{{"site": {site}, "xM": 31, "yM": 12, "zM": 1.2, "facingDeg": 0, "date": "2026-06-21"}}"#
    )))
    .unwrap();
    let m = sunlot::site::SiteModel::from_json(text).unwrap();
    let w = &m.windows[0];
    let massing = sunlot::exposure::Massing::WithProposed;
    let vsc = sunlot::daylight::sky_component_pct(
        &m,
        w.view_point(),
        sunlot::daylight::SkyPlane::Vertical { facing_deg: 0.0 },
        massing,
        sunlot::daylight::DEFAULT_AZIMUTH_STEP_DEG,
    )
    .unwrap();
    let date = chrono::NaiveDate::from_ymd_opt(2026, 6, 21).unwrap();
    let period = sunlot::exposure::Period::day(date, 5);
    let aim = sunlot::exposure::WindowAim { massing, ..sunlot::exposure::WindowAim::at(w.view_point(), 0.0) };
    let sun =
        sunlot::exposure::window_sun_hours(&m, &aim, &period, sunlot::time::DeltaT::EspenakMeeus, |_| true).unwrap();
    for out in [&by_id, &by_point] {
        let after = get(out, "withProposed");
        assert_eq!(num(&after, "vscPct"), vsc);
        assert_eq!(num(&after, "sunH"), sun.sun_hours);
        assert!(num(&get(out, "existing"), "vscPct") > vsc);
    }
    let summary = sunlot::web::read_site(JsValue::from_str(text), JsValue::UNDEFINED).unwrap();
    let windows: js_sys::Array = get(&summary, "windows").into();
    assert_eq!(windows.length(), 4);
    assert_eq!(get(&windows.get(0), "id").as_string().unwrap(), "w-16-rear");
    let m = error_message(sunlot::web::window_light(js(&format!(
        r#"{{"site": {site}, "id": "nope", "date": "2026-06-21"}}"#
    ))));
    assert!(m.contains("id: the site has no window \"nope\""), "{m}");
    let m = error_message(sunlot::web::window_light(js(&format!(
        r#"{{"site": {site}, "xM": 31, "yM": 12, "facingDeg": 400, "date": "2026-06-21"}}"#
    ))));
    assert!(m.contains("facing_deg must be 0 to 360"), "{m}");
}

/// `checkWindows` gives the core's window report (camel-case members) for a preset, refuses an area
/// rule naming the right call, and `rulePresets` lists every preset of the core's table.
#[wasm_bindgen_test]
fn check_windows_through_the_facade_equals_the_core() {
    let site = serde_json::to_string(sunlot::demo::DEMO_SITE_JSON).unwrap();
    let out = sunlot::web::check_windows_js(js(&format!(
        r#"{{"site": {site}, "preset": "bre-br209-window-sky", "year": 2026, "stepMin": 30, "azimuthStepDeg": 1}}"#
    )))
    .unwrap();
    let m = sunlot::demo::demo();
    let sunlot::rules::AnyRule::Window(rule) = sunlot::rules::preset("bre-br209-window-sky").unwrap() else {
        panic!("a window preset")
    };
    let req = sunlot::rules::WindowCheckRequest {
        model: &m,
        rule: &rule,
        year: 2026,
        step_min: 30,
        azimuth_step_deg: 1.0,
        delta_t: sunlot::time::DeltaT::EspenakMeeus,
    };
    let core = sunlot::rules::check_windows(&req, |_| true).unwrap();
    let windows = js_sys::Array::from(&get(&out, "windows"));
    assert_eq!(windows.length() as usize, core.windows.len());
    for (k, w) in core.windows.iter().enumerate() {
        let js_w = windows.get(k as u32);
        assert_eq!(get(&js_w, "id").as_string().unwrap(), w.id);
        assert_eq!(get(&js_w, "passes").as_bool(), w.passes);
        let f = js_sys::Array::from(&get(&js_w, "figures")).get(0);
        assert_eq!(num(&f, "after"), w.figures[0].after);
    }
    assert_eq!(get(&out, "passes").as_bool(), Some(core.passes));
    let area = sunlot::web::check_windows_js(js(&format!(
        r#"{{"site": {site}, "preset": "bre-br209-amenity", "year": 2026}}"#
    )));
    assert!(error_message(area).contains("checkRule"));
    let presets = js_sys::Array::from(&sunlot::web::rule_presets().unwrap());
    assert_eq!(presets.length() as usize, sunlot::rules::PRESETS.len());
}

/// `facadeMap` gives the core's facade map, `facadeSvg` the elevation figure with the windows, and a
/// volume the site does not have is refused naming it.
#[wasm_bindgen_test]
fn facade_map_through_the_facade_equals_the_core() {
    let site = serde_json::to_string(sunlot::demo::DEMO_SITE_JSON).unwrap();
    let input =
        format!(r#"{{"site": {site}, "volume": "terrace-east", "date": "2026-03-21", "stepMin": 30, "cellM": 2}}"#);
    let out = sunlot::web::facade_map_js(js(&input)).unwrap();
    let m = sunlot::demo::demo();
    let date = chrono::NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
    let dt = sunlot::time::DeltaT::EspenakMeeus;
    let steps = sunlot::exposure::SunSteps::of(&m, &sunlot::exposure::Period::day(date, 30), dt, |_| true).unwrap();
    let req = sunlot::exposure::FacadeRequest {
        model: &m,
        volume_id: "terrace-east",
        cell_m: 2.0,
        massing: sunlot::exposure::Massing::WithProposed,
        delta_t: dt,
        atmosphere: sunlot::sky::BirdAtmosphere::default(),
    };
    let core = sunlot::exposure::facade_map(&req, &steps, |_| true).unwrap();
    let faces = js_sys::Array::from(&get(&out, "faces"));
    assert_eq!(faces.length() as usize, core.len());
    for (k, f) in core.iter().enumerate() {
        let hours = js_sys::Array::from(&get(&faces.get(k as u32), "sunHours"));
        let got: Vec<f64> = hours.iter().map(|v| v.as_f64().unwrap()).collect();
        assert_eq!(got, f.sun_hours);
    }
    let svg = sunlot::web::facade_svg(js(&input.replace("\"stepMin\"", "\"show\": \"lost\", \"stepMin\""))).unwrap();
    assert!(svg.starts_with("<svg") && svg.contains("w16-side") && svg.contains("lost to the proposal"));
    let svg =
        sunlot::web::facade_svg(js(&input.replace("\"stepMin\"", "\"show\": \"insolation\", \"stepMin\""))).unwrap();
    assert!(svg.contains("beam and sky diffuse"));
    let bad = sunlot::web::facade_map_js(js(&input.replace(r#""volume": "terrace-east""#, r#""volume": "shed""#)));
    assert!(error_message(bad).contains("shed"));
}

/// `compareMap` without areas maps the neighbours' areas, not the lot the proposal stands on (its own
/// building would set the legend of the hours lost); the values equal the core's before/after there.
#[wasm_bindgen_test]
fn compare_map_leaves_the_lot_out() {
    let site = serde_json::to_string(sunlot::demo::DEMO_SITE_JSON).unwrap();
    let out = sunlot::web::compare_map(
        js(&format!(r#"{{"site": {site}, "date": "2026-03-21", "cellM": 2, "stepMin": 30}}"#)),
        None,
    )
    .unwrap();
    let m = sunlot::demo::demo();
    let polys: Vec<_> = m.areas_beside_lots().iter().map(|a| a.polygon.clone()).collect();
    assert!(polys.len() < m.areas.len());
    let g = sunlot::exposure::Grid::covering(&geo::MultiPolygon::new(polys), 2.0, sunlot::exposure::DEFAULT_MAX_CELLS)
        .unwrap();
    let grid = get(&out, "grid");
    assert_eq!(num(&grid, "cols") as usize, g.cols);
    assert_eq!(num(&grid, "rows") as usize, g.rows);
    let lost = js_sys::Float64Array::from(get(&out, "lostH"));
    let inside = lost.to_vec().iter().filter(|v| !v.is_nan()).count();
    assert_eq!(inside, g.inside_count());
}

/// Each map kind computes what the pages asked for by hand before the core owned the table: the same
/// call with the same cell, step, massing, window and lot gives the same values, bit for bit.
#[wasm_bindgen_test]
fn map_kinds_give_the_maps_of_their_explicit_requests() {
    let site = demo_site_js();
    let date = "2026-03-21";
    let same = |kind: &str, explicit: JsValue, key: &str| {
        let by_kind =
            sunlot::web::map_of_kind(js(&format!(r#"{{"kind": "{kind}", "site": {site}, "date": "{date}"}}"#)), None)
                .unwrap_or_else(|e| panic!("{kind}: {:?}", JsValue::from(e)));
        let (a, b): (js_sys::Float64Array, js_sys::Float64Array) =
            (get(&by_kind, "values").into(), get(&explicit, key).into());
        assert_eq!(a.length(), b.length(), "{kind}");
        assert!(a.length() > 0, "{kind}");
        for k in 0..a.length() {
            let (x, y) = (a.get_index(k), b.get_index(k));
            assert!(x == y || (x.is_nan() && y.is_nan()), "{kind} cell {k}: {x} against {y}");
        }
        assert_eq!(JSON::stringify(&get(&by_kind, "grid")).unwrap(), JSON::stringify(&get(&explicit, "grid")).unwrap());
        by_kind
    };
    let map = |json: String| js(&json);
    let existing = same(
        "sun-hours-existing",
        sunlot::web::sun_hours_map(
            map(format!(r#"{{"site": {site}, "date": "{date}", "cellM": 0.5, "stepMin": 5, "massing": "existing"}}"#)),
            None,
        )
        .unwrap(),
        "hours",
    );
    assert!(get(&existing, "caption").as_string().unwrap().ends_with(", 0.5 m cells"));
    let lost = sunlot::web::compare_map(
        map(format!(r#"{{"site": {site}, "date": "{date}", "cellM": 0.5, "stepMin": 5}}"#)),
        None,
    )
    .unwrap();
    let by_kind = same("lost", lost, "lostH");
    assert!(num(&by_kind, "rangeTop") >= 0.5);
    let insolation = sunlot::web::insolation_map(
        map(format!(r#"{{"site": {site}, "date": "{date}", "cellM": 1, "stepMin": 10}}"#)),
        None,
    )
    .unwrap();
    let by_kind = same("insolation", insolation.clone(), "totalKwhM2");
    assert_eq!(num(&by_kind, "rangeTop"), num(&get(&insolation, "open"), "totalKwhM2"));
    let year = sunlot::web::sun_hours_map(
        map(format!(r#"{{"site": {site}, "date": "2026-01-01", "to": "2026-12-31", "cellM": 1, "stepMin": 15}}"#)),
        None,
    )
    .unwrap();
    same("year-hours", year, "hours");
    let envelope = sunlot::web::solar_envelope_js(
        map(format!(
            r#"{{"site": {site}, "lot": "lot-14", "date": "{date}", "window": "09:00-15:00", "stepMin": 15}}"#
        )),
        None,
    )
    .unwrap();
    same("envelope", envelope, "heightM");
    let unknown =
        sunlot::web::map_of_kind(js(&format!(r#"{{"kind": "shade", "site": {site}, "date": "{date}"}}"#)), None);
    assert!(error_message(unknown).starts_with("kind: \"shade\" is not one of sun-hours"));
}

/// The page's map workers: `mapOfKind` with `part` computes a part (a share of the steps for the sun
/// hours and hours lost, a band of rows for insolation), `joinMapParts` joins the parts' values into
/// what the whole call gives, bit for bit, with the same grid, range, figures and open value.
#[wasm_bindgen_test]
fn map_parts_joined_equal_the_whole_map() {
    let site = demo_site_js();
    let date = "2026-03-21";
    let kinds = sunlot::web::map_kinds().unwrap();
    let parts_of = |id: &str| {
        js_sys::Array::from(&kinds)
            .iter()
            .find(|k| get(k, "id").as_string().as_deref() == Some(id))
            .map(|k| get(&k, "parts"))
    };
    assert_eq!(parts_of("envelope"), Some(JsValue::FALSE));
    for kind in ["sun-hours", "lost", "insolation"] {
        assert_eq!(parts_of(kind), Some(JsValue::TRUE), "{kind}");
        let call = |extra: &str| {
            sunlot::web::map_of_kind(
                js(&format!(r#"{{"kind": "{kind}", "site": {site}, "date": "{date}"{extra}}}"#)),
                None,
            )
            .unwrap_or_else(|e| panic!("{kind}: {:?}", JsValue::from(e)))
        };
        let whole = call("");
        let parts: Vec<JsValue> = (0..3).map(|i| call(&format!(r#", "part": {{"index": {i}, "of": 3}}"#))).collect();
        let mut values = Vec::new();
        let cells = num(&get(&whole, "grid"), "rows") * num(&get(&whole, "grid"), "cols");
        for p in &parts {
            assert!(num(&get(p, "grid"), "rows") > 0.0, "{kind}: an empty band");
            let v = js_sys::Float64Array::from(get(p, "values")).to_vec();
            // A share of the steps: every cell's milliseconds (each massing's for the hours lost)
            // and the share's open milliseconds.
            match kind {
                "sun-hours" => assert_eq!(v.len() as f64, cells + 1.0, "{kind}"),
                "lost" => assert_eq!(v.len() as f64, 2.0 * cells + 1.0, "{kind}"),
                _ => assert!((v.len() as f64) < cells, "{kind}: a band"),
            }
            values.extend(v);
        }
        let open = num(&parts[0], "openValue");
        if kind == "insolation" {
            assert_eq!(open, num(&whole, "openValue"), "{kind}");
        }
        let joined = sunlot::web::join_map_parts(
            js(&format!(r#"{{"kind": "{kind}", "site": {site}, "date": "{date}", "openValue": {open}}}"#)),
            &values,
        )
        .unwrap_or_else(|e| panic!("{kind}: {:?}", JsValue::from(e)));
        let (a, b) = (
            js_sys::Float64Array::from(get(&joined, "values")).to_vec(),
            js_sys::Float64Array::from(get(&whole, "values")).to_vec(),
        );
        assert_eq!(a.len(), b.len(), "{kind}");
        assert!(a.iter().zip(&b).all(|(x, y)| x == y || (x.is_nan() && y.is_nan())), "{kind}: joined values differ");
        for key in ["grid", "rangeTop", "stats", "caption", "openValue"] {
            assert_eq!(
                JSON::stringify(&get(&joined, key)).unwrap(),
                JSON::stringify(&get(&whole, key)).unwrap(),
                "{kind}: {key}"
            );
        }
        let short = sunlot::web::join_map_parts(
            js(&format!(r#"{{"kind": "{kind}", "site": {site}, "date": "{date}", "openValue": {open}}}"#)),
            &values[1..],
        );
        assert!(error_message(short).starts_with("values: "), "{kind}");
    }
    let bad = |extra: &str, kind: &str| {
        error_message(sunlot::web::map_of_kind(
            js(&format!(r#"{{"kind": "{kind}", "site": {site}, "date": "{date}"{extra}}}"#)),
            None,
        ))
    };
    assert!(bad(r#", "part": {"index": 2, "of": 2}"#, "sun-hours").starts_with("part: index 2 of 2 is not a part"));
    assert!(bad(r#", "part": {"index": 0, "of": 0}"#, "sun-hours").starts_with("part: index 0 of 0"));
    assert!(bad(r#", "part": {"index": 0, "of": 2}"#, "envelope")
        .starts_with("part: the map \"envelope\" is computed whole"));
}

/// Every IANA zone's transitions over 1970–2037, read from the table by the wasm build, have the
/// digest chrono-tz's give natively (`tests/zone_table.rs` checks the fixture against chrono-tz).
#[wasm_bindgen_test]
fn the_wasm_build_reads_every_zones_transitions_as_native_does() {
    use sunlot::time::IanaZone;
    let (from, to) = zone_digest::SPAN_S;
    let at = |t| chrono::DateTime::from_timestamp(t, 0).unwrap();
    let ours = zone_digest::digest(IanaZone::all().map(|z| {
        let t = z.transitions(at(from), at(to));
        (z.name().to_string(), t.into_iter().map(|(i, o, a)| (i.timestamp(), o, a.to_string())).collect())
    }));
    let fixture = include_str!("fixtures/zone_transitions_1970_2037.txt");
    assert_eq!(zone_digest::line(ours), zone_digest::committed(fixture));
    assert!(IanaZone::all().count() > 590);
}

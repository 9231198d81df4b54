// Hostile input to every call of the module, in headless Chromium from file:// (the classic bundle, as a
// page opened from disk uses it). For each call a valid input is taken and mutated: every member
// dropped or replaced by NaN, ±Infinity, a negative, zero, a huge number, 2^32, a string, null, an
// array, an object, a boolean; positional sizes by NaN, -1, 0 and 1e9; canvases of 20000 × 20000 and
// 0 × 0; and the whole input replaced by non-objects. Each call must return, or throw an `Error` whose
// message names the member mutated; it must never trap (`WebAssembly.RuntimeError`), never take more
// than the hang limit, and the module must still give the right answer to a valid call afterwards.
// Run: node e2e/hostile.test.mjs (after ./dev wasm). Prints the counts; exits 1 on any failure.
import { bundlePage, launch } from "./chromium.mjs";

const browser = await launch();
const context = await browser.newContext();
await context.route("**/*", route => route.request().url().startsWith("file:") ? route.continue() : route.abort());
const page = await context.newPage();
const console_errors = [];
page.on("pageerror", e => console_errors.push(String(e)));
await page.goto(bundlePage("hostile"));
await page.waitForFunction(() => window.sunlot && window.sunlot.ready);

const HANG_MS = 4000;

const report = await page.evaluate(async HANG_MS => {
  let m = await window.sunlot.ready;
  const site = m.demoSiteText();
  // Plain building footprints (no sunlot members): one with a height, one with storeys, one with neither.
  const box = (lon, lat) => [[[lon, lat], [lon + 2e-4, lat], [lon + 2e-4, lat + 1e-4], [lon, lat + 1e-4], [lon, lat]]];
  const footprints = JSON.stringify({ type: "FeatureCollection", features: [
    { type: "Feature", properties: { height: "12 m" }, geometry: { type: "Polygon", coordinates: box(-1.87, 52.62) } },
    { type: "Feature", properties: { "building:levels": 4 }, geometry: { type: "Polygon", coordinates: box(-1.87, 52.6203) } },
    { type: "Feature", properties: {}, geometry: { type: "Polygon", coordinates: box(-1.87, 52.6206) } }] });
  const grid = m.sunHoursMap({ site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30 }).grid;
  const canvas = (w, h) => { const c = document.createElement("canvas"); c.width = w; c.height = h; return c; };
  const normal = () => canvas(400, 300);
  // Each call: a valid input and how to call it with an input (and positional sizes).
  const calls = {
    solarPosition: [{ latitudeDeg: 52.62, longitudeDeg: -1.87, elevationM: 118, time: "2026-06-21T14:00:00Z",
                      pressureHpa: 1000, temperatureC: 12, deltaTS: 69 }, (m, i) => m.solarPosition(i)],
    solarPositionLocal: [{ latitudeDeg: 52.62, longitudeDeg: -1.87, localTime: "2026-10-25T01:30", zone: "Europe/London",
                           fold: "later" }, (m, i) => m.solarPosition(i)],
    dayEvents: [{ latitudeDeg: 52.62, longitudeDeg: -1.87, date: "2026-12-21", zone: "Europe/London" }, (m, i) => m.dayEvents(i)],
    clearSky: [{ zenithDeg: 30, dayOfYear: 172, atmosphere: { aod500: 0.1, albedo: 0.2 } }, (m, i) => m.clearSky(i)],
    readSite: [{ text: site }, (m, i) => m.readSite(i.text)],
    readFootprints: [{ text: footprints, zone: "Europe/London", storeyHeightM: 3, defaultHeightM: 6, name: "blocks" },
                     (m, i) => m.readSite(i.text, { zone: i.zone, storeyHeightM: i.storeyHeightM, defaultHeightM: i.defaultHeightM,
                                                    name: i.name })],
    siteTextKind: [{ text: footprints }, (m, i) => m.siteTextKind(i.text)],
    sunHoursMap: [{ site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", to: "2026-03-21", window: "09:00-15:00",
                    stepMin: 30, planeM: 0, massing: "existing", maxCells: 100000 }, (m, i) => m.sunHoursMap(i, () => true)],
    compareMap: [{ site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30 }, (m, i) => m.compareMap(i)],
    insolationMap: [{ site, areas: ["garden-16"], cellM: 2, date: "2026-03-20", stepMin: 30, aod500: 0.1, skyStepDeg: 10 },
                    (m, i) => m.insolationMap(i)],
    checkRule: [{ site, preset: "bre-br209-amenity", year: 2026, cellM: 2, stepMin: 30 }, (m, i) => m.checkRule(i)],
    drawRuleCheck: [{ site, preset: "bre-br209-amenity", year: 2026, cellM: 2, stepMin: 60 }, (m, i) => m.drawRuleCheck(normal(), i)],
    ruleCheckSvg: [{ site, preset: "bre-br209-amenity", year: 2026, cellM: 2, stepMin: 60 }, (m, i) => m.ruleCheckSvg(i)],
    facadeMap: [{ site, volume: "terrace-east", date: "2026-03-21", stepMin: 30, cellM: 2, massing: "existing", show: "lost" },
                (m, i) => m.facadeMap(i)],
    facadeSvg: [{ site, volume: "house-9", date: "2026-03-21", to: "2026-03-22", window: "09:00-15:00", stepMin: 60, cellM: 3 },
                (m, i) => m.facadeSvg(i)],
    checkWindows: [{ site, preset: "bre-br209-window-sky", year: 2026, stepMin: 30, azimuthStepDeg: 2 }, (m, i) => m.checkWindows(i)],
    checkWindowsCustom: [{ site, year: 2026, stepMin: 60, rule: { id: "w", title: "t", test: "window_sun_day", month: 1, day: 17,
                           min_hours: 1, min_altitude_deg: 6, window_ids: ["w16-side"] } }, (m, i) => m.checkWindows(i)],
    checkRuleCustom: [{ site, year: 2026, cellM: 2, stepMin: 30, rule: { id: "r", title: "t", month: 3, day: 21,
                        min_hours: 2, min_share: 0.5, min_ratio: 0.8, area_kinds: ["garden"] } }, (m, i) => m.checkRule(i)],
    solarEnvelope: [{ site, lot: "lot-14", date: "2026-03-21", window: "09:00-15:00", stepMin: 30, cellM: 2,
                      maxHeightM: 40, heightStepM: 1 }, (m, i) => m.solarEnvelope(i)],
    pointTimeline: [{ site, xM: 31, yM: 25, zM: 0, date: "2026-03-20", massing: "withProposed" }, (m, i) => m.pointTimeline(i)],
    yearProfile: [{ site, xM: 31, yM: 25, year: 2026, stepMin: 60 }, (m, i) => m.yearProfile(i)],
    skyView: [{ site, xM: 31, yM: 25, skyStepDeg: 10 }, (m, i) => m.skyView(i)],
    shadowTable: [{ site, date: "2026-03-20", stepMin: 60 }, (m, i) => m.shadowTable(i)],
    shadowsGeojson: [{ site, localTime: "2026-03-20T15:00" }, (m, i) => m.shadowsGeojson(i)],
    drawShadowPlan: [{ site, localTime: "2026-03-20T15:00", view: { xM: 10, yM: 20, widthM: 80 },
                       palette: { ink: "#000000", paper: "#ffffff" } }, (m, i) => m.drawShadowPlan(normal(), i)],
    shadowPlanSvg: [{ site, localTime: "2026-03-20T15:00", w: 400, h: 300 }, (m, i) => m.shadowPlanSvg({ site: i.site, localTime: i.localTime }, i.w, i.h)],
    drawSkyChart: [{ site, year: 2026, localTime: "2026-06-21T15:00", dates: ["2026-06-21", "2026-12-21"], xM: 31, yM: 25,
                     zM: 1, massing: "existing", projection: "equidistant" }, (m, i) => m.drawSkyChart(normal(), i)],
    skyChartSvg: [{ site, year: 2026, w: 400, h: 300 }, (m, i) => m.skyChartSvg({ site: i.site, year: i.year }, i.w, i.h)],
    drawMapFigure: [{ site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30, show: "lost" },
                    (m, i) => m.drawMapFigure(normal(), i)],
    mapGeojson: [{ site, grid, name: "hours", title: "t", period: "p" },
                 (m, i) => m.mapGeojson(i, new Float64Array(grid.cols * grid.rows).fill(1))],
    underlayPlacement: [{ imageA: [10, 10], imageB: [110, 10], planA: [0, 0], distanceM: 20, bearingDeg: 90 },
                        (m, i) => m.underlayPlacement(i)],
    planLayer: [{ grid, label: "hours", unit: "h", rangeLo: 0, rangeHi: 12 },
                (m, i) => new m.PlanLayer(i, new Float64Array(grid.cols * grid.rows).fill(2)).free()],
    seasonInstants: [{ year: 2026, zone: "Europe/London" }, (m, i) => m.seasonInstants(i.year, i.zone)],
    mapOfKind: [{ kind: "lost", site, date: "2026-03-20" }, (m, i) => m.mapOfKind(i)],
    mapOfKindPart: [{ kind: "lost", site, date: "2026-03-20", part: { index: 1, of: 2 } }, (m, i) => m.mapOfKind(i)],
    joinMapParts: [{ kind: "lost", site, date: "2026-03-20", openValue: 12 },
                   (m, i) => m.joinMapParts(i, lostValues ||= m.mapOfKind({ kind: "lost", site, date: "2026-03-20", part: { index: 0, of: 1 } }).values)],
    massingViewer: [{ text: site }, (m, i) => new m.MassingViewer(i.text).free()],
    massingDraw: [{ localTime: "2026-03-20T15:00", fromDeg: 210, elevationDeg: 35, perspectiveM: 120,
                    palette: { ink: "#000000", paper: "#ffffff" } },
                  (m, i) => { const v = new m.MassingViewer(site); try { v.draw(normal(), i); } finally { v.free(); } }],
    massingEnvelope: [{ lot: "lot-14", date: "2026-03-21", window: "09:00-15:00" },
                      (m, i) => { const v = new m.MassingViewer(site); try { v.setEnvelope(i.lot, i.date, i.window); } finally { v.free(); } }],
    massingSvg: [{ localTime: "2026-03-20T15:00", fromDeg: 210, elevationDeg: 35, w: 400, h: 300 },
                 (m, i) => { const v = new m.MassingViewer(site); try { return v.svg({ localTime: i.localTime, fromDeg: i.fromDeg,
                   elevationDeg: i.elevationDeg }, i.w, i.h); } finally { v.free(); } }],
    windowLight: [{ site, xM: 31, yM: 12, zM: 1.2, facingDeg: 0, date: "2026-06-21", to: "2026-06-22", stepMin: 30,
                    azimuthStepDeg: 1 }, (m, i) => m.windowLight(i)],
  };
  let lostValues = null;
  const replacements = [NaN, Infinity, -Infinity, -1, 0, 1e308, 2 ** 32, -(2 ** 31), "x", "", null, [], {}, true,
                        [1], "2026-02-30", "99:99-00:00", "garden-16".repeat(1000)];
  const cases = [];
  for (const [name, [valid, call]] of Object.entries(calls)) {
    cases.push({ name, key: null, input: valid, call, valid: true });
    for (const whole of [undefined, null, 3, "x", [], () => 1]) cases.push({ name, key: "(whole input)", input: whole, call });
    for (const key of Object.keys(valid)) {
      const drop = { ...valid }; delete drop[key];
      cases.push({ name, key, input: drop, call, dropped: true });
      for (const r of replacements) cases.push({ name, key, input: { ...valid, [key]: r }, call });
      if (valid[key] && typeof valid[key] === "object" && !Array.isArray(valid[key]))
        for (const sub of Object.keys(valid[key]))
          for (const r of [NaN, -1, "x", null, 1e308])
            cases.push({ name, key: sub, input: { ...valid, [key]: { ...valid[key], [sub]: r } }, call });
    }
  }
  // Sizes and canvases.
  for (const [w, h] of [[NaN, 300], [-1, 300], [0, 300], [400, 1e9], [20000, 20000]]) {
    cases.push({ name: "shadowPlanSvg", key: "width", input: { site, localTime: "2026-03-20T15:00", w, h }, call: calls.shadowPlanSvg[1] });
    cases.push({ name: "skyChartSvg", key: "width", input: { site, year: 2026, w, h }, call: calls.skyChartSvg[1] });
  }
  for (const [w, h] of [[20000, 20000], [0, 0], [16384, 16384]]) {
    cases.push({ name: "drawShadowPlan", key: "canvas", input: { site, localTime: "2026-03-20T15:00" },
                 call: (m, i) => m.drawShadowPlan(canvas(w, h), i) });
    cases.push({ name: "drawSkyChart", key: "canvas", input: { site, year: 2026 }, call: (m, i) => m.drawSkyChart(canvas(w, h), i) });
  }
  // Sizes of work: a huge grid, a long period, many dates, a sky step too fine for the grid.
  const big = [
    ["sunHoursMap", "maxCells", { site, cellM: 0.01, date: "2026-03-20", maxCells: 1e12 }, calls.sunHoursMap[1]],
    ["sunHoursMap", "cellM", { site, cellM: 0.05, date: "2026-01-01", to: "2035-12-31", stepMin: 1, maxCells: 1e9 }, calls.sunHoursMap[1]],
    ["sunHoursMap", "to", { site, cellM: 1, date: "2026-01-01", to: "2999-12-31" }, calls.sunHoursMap[1]],
    ["insolationMap", "skyStepDeg", { site, cellM: 0.02, date: "2026-03-20", skyStepDeg: 0.5, maxCells: 1e9 }, calls.insolationMap[1]],
    ["drawSkyChart", "dates", { site, year: 2026, dates: Array(5000).fill("2026-06-21") }, calls.drawSkyChart[1]],
    ["solarEnvelope", "cellM", { site, lot: "lot-14", date: "2026-01-01", to: "2026-12-31", stepMin: 1, cellM: 0.01 }, calls.solarEnvelope[1]],
    ["readSite", "text", { text: "[".repeat(200000) }, calls.readSite[1]],
  ];
  for (const [name, key, input, call] of big) cases.push({ name, key, input, call });

  const results = { cases: 0, ok: 0, errors: 0, traps: [], slow: [], unnamed: [], other: [], invalidOk: [] };
  const norm = s => String(s).toLowerCase().replace(/[_\s]/g, "");
  for (const c of cases) {
    results.cases++;
    const t0 = performance.now();
    try {
      c.call(m, c.input);
      results.ok++;
    } catch (e) {
      if (e instanceof WebAssembly.RuntimeError) {
        results.traps.push(`${c.name} ${c.key}: ${e.message}`);
        m = await window.sunlot.boot(); // the trapped instance is not to be trusted: start another
      } else if (e instanceof Error) {
        results.errors++;
        const msg = e.message;
        const named = c.key === "(whole input)" || norm(msg).includes(norm(c.key))
          || (c.key === "text" && /^site/.test(msg)) || (c.key === "w" || c.key === "h") && /width|height/.test(msg);
        if (!named) results.unnamed.push(`${c.name} ${c.key}=${JSON.stringify(c.input?.[c.key])?.slice(0, 40)}: ${msg.slice(0, 160)}`);
      } else {
        results.other.push(`${c.name} ${c.key}: threw ${String(e).slice(0, 100)}`);
      }
    }
    const ms = performance.now() - t0;
    if (ms > HANG_MS) results.slow.push(`${c.name} ${c.key}: ${ms.toFixed(0)} ms`);
  }
  // A type error inside the rule names its path in the rule.
  try { m.checkRule({ site, year: 2026, rule: { ...calls.checkRuleCustom[0].rule, min_ratio: "high" } }); results.rulePath = "no error"; }
  catch (e) { results.rulePath = e.message; }
  // Still working: the SPA paper's worked example (Reda & Andreas 2004, Table A5.2: zenith 50.11162°).
  const p = m.solarPosition({ latitudeDeg: 39.742476, longitudeDeg: -105.1786, elevationM: 1830.14,
                              time: "2003-10-17T12:30:30-07:00", pressureHpa: 820, temperatureC: 11, deltaTS: 67 });
  results.afterwards = p.zenithDeg;
  const map = m.sunHoursMap({ site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30 });
  results.mapAfterwards = map.hours.length === map.grid.cols * map.grid.rows;
  return results;
}, HANG_MS);

const failures = [];
let passed = 0;
const check = (ok, what) => { console.log(`${ok ? "ok  " : "FAIL"} ${what}`); if (ok) passed++; else failures.push(what); };
console.log(`     ${report.cases} hostile calls: ${report.ok} returned, ${report.errors} threw an Error`);
check(report.traps.length === 0, `no call traps (${report.traps.length})`);
report.traps.forEach(t => console.log(`       trap: ${t}`));
check(report.slow.length === 0, `no call takes more than ${HANG_MS} ms (${report.slow.length})`);
report.slow.forEach(t => console.log(`       slow: ${t}`));
check(report.other.length === 0, `every throw is an Error (${report.other.length})`);
report.other.forEach(t => console.log(`       other: ${t}`));
check(report.unnamed.length === 0, `every error names the member (${report.unnamed.length} do not)`);
report.unnamed.forEach(t => console.log(`       unnamed: ${t}`));
check(/^rule\.min_ratio: invalid type: string "high", expected f64/.test(report.rulePath), `a rule's type error names rule.min_ratio (${report.rulePath})`);
check(Math.abs(report.afterwards - 50.11162) < 5e-6, `the module still gives the SPA worked example afterwards (${report.afterwards})`);
check(report.mapAfterwards, "the module still computes a map afterwards");
check(console_errors.length === 0, `no uncaught page errors (${console_errors.join("; ").slice(0, 300)})`);
await browser.close();
console.log(`${passed} passed, ${failures.length} failed`);
process.exit(failures.length ? 1 : 0);

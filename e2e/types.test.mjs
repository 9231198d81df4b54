// The TypeScript declarations against the module's real inputs and results: every call that returns
// an object is made in headless Chromium from file:// (the classic bundle, as a page opened from disk
// uses it) on the demo site; each input and each result is written out as a TypeScript literal typed
// by the call's own declaration (`Parameters<typeof S.call>[0]`, `ReturnType<typeof S.call>`, from
// www/pkg/sunlot.d.ts), and `tsc --strict` compiles the file. A member the result has and the
// declaration lacks (excess property), a member declared and missing, or a wrong type fails the test.
// Run: node e2e/types.test.mjs (after ./dev wasm). Exits 1 on any failure.
import { bundlePage, launch, out, root } from "./chromium.mjs";
import { writeFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import path from "node:path";

const browser = await launch();
const page = await browser.newPage();
await page.goto(bundlePage("types"));
await page.waitForFunction(() => window.sunlot && window.sunlot.ready);

const made = await page.evaluate(async () => {
  const m = await window.sunlot.ready;
  const site = m.demoSiteText();
  const canvas = () => { const c = document.createElement("canvas"); c.width = 400; c.height = 300; return c; };
  const box = (lon, lat) => [[[lon, lat], [lon + 2e-4, lat], [lon + 2e-4, lat + 1e-4], [lon, lat + 1e-4], [lon, lat]]];
  const footprints = JSON.stringify({ type: "FeatureCollection", features: [
    { type: "Feature", properties: { height: 12 }, geometry: { type: "Polygon", coordinates: box(-1.87, 52.62) } }] });
  // [name of the call, its input (or null when it takes no object), how to call it]
  const calls = [
    ["solarPosition", { latitudeDeg: 52.62, longitudeDeg: -1.87, elevationM: 118, time: "2026-06-21T14:00:00Z" }, i => m.solarPosition(i)],
    ["solarPosition", { latitudeDeg: 52.62, longitudeDeg: -1.87, localTime: "2026-10-25T01:30", zone: "Europe/London",
                        fold: "later", pressureHpa: 1000, temperatureC: 12, refraction: true, deltaTS: 69 }, i => m.solarPosition(i)],
    ["dayEvents", { latitudeDeg: 52.62, longitudeDeg: -1.87, date: "2026-12-21", zone: "Europe/London" }, i => m.dayEvents(i)],
    ["dayEvents", { latitudeDeg: 78.2, longitudeDeg: 15.6, date: "2026-06-21", zone: "Europe/Oslo" }, i => m.dayEvents(i)],
    ["seasonInstants", null, () => m.seasonInstants(2026, "Europe/London")],
    ["clearSky", { zenithDeg: 30, dayOfYear: 172 }, i => m.clearSky(i)],
    ["readSite", null, () => m.readSite(site)],
    ["readSite", null, () => m.readSite(footprints, { zone: "Europe/London", storeyHeightM: 3, name: "blocks" })],
    ["siteTextKind", null, () => m.siteTextKind(footprints)],
    ["siteTextKind", null, () => m.siteTextKind(site)],
    ["sunHoursMap", { site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", to: "2026-03-21", window: "09:00-15:00",
                      stepMin: 30, planeM: 0, massing: "existing", maxCells: 100000 }, i => m.sunHoursMap(i, () => true)],
    ["compareMap", { site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30 }, i => m.compareMap(i)],
    ["insolationMap", { site, areas: ["garden-16"], cellM: 2, date: "2026-03-20", stepMin: 30, aod500: 0.1, skyStepDeg: 10 },
     i => m.insolationMap(i)],
    ["solarEnvelope", { site, lot: "lot-14", date: "2026-03-21", window: "09:00-15:00", stepMin: 30, cellM: 2,
                        maxHeightM: 40, heightStepM: 1 }, i => m.solarEnvelope(i)],
    ["pointTimeline", { site, xM: 31, yM: 25, zM: 0, date: "2026-03-20", massing: "withProposed" }, i => m.pointTimeline(i)],
    ["yearProfile", { site, xM: 31, yM: 25, year: 2026, stepMin: 60 }, i => m.yearProfile(i)],
    ["shadowTable", { site, date: "2026-03-20", stepMin: 60 }, i => m.shadowTable(i)],
    ["checkRule", { site, preset: "bre-br209-amenity", year: 2026, cellM: 2, stepMin: 30 }, i => m.checkRule(i)],
    ["checkRule", { site, year: 2026, cellM: 2, stepMin: 30, rule: { id: "r", title: "t", month: 3, day: 21, min_hours: 2,
                    min_share: 0.5, min_ratio: 0.8, area_kinds: ["garden"] } }, i => m.checkRule(i)],
    ["drawRuleCheck", { site, preset: "bre-br209-amenity", year: 2026, cellM: 2, stepMin: 60 }, i => m.drawRuleCheck(canvas(), i)],
    ["checkWindows", { site, preset: "bre-br209-window-sky", year: 2026, stepMin: 30, azimuthStepDeg: 2 }, i => m.checkWindows(i)],
    ...m.rulePresets().filter(p => p.kind === "window").map(p =>
      ["checkWindows", { site, preset: p.id, year: 2026, stepMin: 60 }, i => m.checkWindows(i)]),
    ["rulePresets", null, () => m.rulePresets()],
    ["mapKinds", null, () => m.mapKinds()],
    ...m.mapKinds().map(k => ["mapOfKind", { kind: k.id, site, date: "2026-03-21" }, i => m.mapOfKind(i)]),
    ["mapOfKind", { kind: "lost", site, date: "2026-03-21", part: { index: 1, of: 2 } }, i => m.mapOfKind(i)],
    ["joinMapParts", { kind: "lost", site, date: "2026-03-21", openValue: 12 },
     i => m.joinMapParts(i, m.mapOfKind({ kind: "lost", site, date: "2026-03-21", part: { index: 0, of: 1 } }).values)],
    ["facadeMap", { site, volume: "terrace-east", date: "2026-03-21", stepMin: 30, cellM: 2, massing: "existing", show: "lost" },
     i => m.facadeMap(i)],
    ["drawFacade", { site, volume: "house-9", date: "2026-03-21", stepMin: 60, cellM: 3 }, i => m.drawFacade(canvas(), i)],
    ["windowLight", { site, xM: 31, yM: 12, zM: 1.2, facingDeg: 0, date: "2026-06-21", to: "2026-06-22", stepMin: 30,
                      azimuthStepDeg: 1 }, i => m.windowLight(i)],
    ["windowLight", { site, id: m.readSite(site).windows[0].id, date: "2026-06-21", stepMin: 60 }, i => m.windowLight(i)],
    ["drawShadowPlan", { site, localTime: "2026-03-20T15:00", view: { xM: 10, yM: 20, widthM: 80 },
                         palette: { ink: "#000000", paper: "#ffffff" } }, i => m.drawShadowPlan(canvas(), i)],
    ["drawMapFigure", { site, areas: ["garden-16"], cellM: 1, date: "2026-03-20", stepMin: 30, show: "lost" },
     i => m.drawMapFigure(canvas(), i)],
    ["underlayPlacement", { imageA: [10, 10], imageB: [110, 10], planA: [0, 0], distanceM: 20, bearingDeg: 90 },
     i => m.underlayPlacement(i)],
  ];
  // A value as a TypeScript literal: typed arrays as their constructor, long arrays cut to their head.
  const lit = v => {
    if (v === null) return "null";
    if (v === undefined) return "undefined";
    if (typeof v === "number") return Number.isNaN(v) ? "NaN" : Number.isFinite(v) ? String(v) : (v > 0 ? "Infinity" : "-Infinity");
    if (typeof v === "string" || typeof v === "boolean") return JSON.stringify(v);
    if (ArrayBuffer.isView(v)) return `new ${v.constructor.name}(${v.length})`;
    if (Array.isArray(v)) return `[${(v.length > 12 ? v.slice(0, 12) : v).map(lit).join(", ")}]`;
    return `{ ${Object.entries(v).map(([k, x]) => `${JSON.stringify(k)}: ${lit(x)}`).join(", ")} }`;
  };
  return calls.map(([name, input, call]) => {
    try { return { name, input: input && lit(input), result: lit(call(input)) }; }
    catch (e) { return { name, error: String(e && e.message || e) }; }
  });
});
await browser.close();

const failures = made.filter(c => c.error).map(c => `${c.name}: threw ${c.error}`);
const pkg = path.relative(out, path.join(root, "www", "pkg", "sunlot")).split(path.sep).join("/");
const lines = [`import type * as S from "${pkg}";`, "// Generated by e2e/types.test.mjs from the module's real results."];
made.filter(c => !c.error).forEach((c, k) => {
  // The draw calls take the canvas first.
  const at = c.name.startsWith("draw") ? 1 : 0;
  if (c.input) lines.push(`export const in${k}: Parameters<typeof S.${c.name}>[${at}] = ${c.input};`);
  lines.push(`export const out${k}: ReturnType<typeof S.${c.name}> = ${c.result};`);
});
const ts = path.join(out, "types.check.ts");
writeFileSync(ts, lines.join("\n") + "\n");
const tsc = spawnSync(process.execPath, [path.join(root, "e2e", "node_modules", "typescript", "bin", "tsc"), "--strict", "--noEmit",
  "--target", "es2022", "--lib", "esnext,dom", "--module", "esnext", "--moduleResolution", "bundler", "--skipLibCheck", "false", ts],
  { encoding: "utf8" });
if (tsc.status !== 0) failures.push(`tsc --strict on ${path.relative(root, ts)}:\n${tsc.stdout}${tsc.stderr}`);
console.log(`types: ${made.length} calls checked against www/pkg/sunlot.d.ts`);
if (failures.length) {
  console.error(failures.join("\n"));
  process.exit(1);
}
console.log("types: every input and result matches its declaration");

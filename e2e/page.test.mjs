// End to end: www/index.html opened from disk (file://) in Debian's headless Chromium with every
// request to anything but a local file blocked. Checks that both widgets draw (pixels, not just a
// canvas), that changing the time moves the shadows, that the exports produce files that parse,
// that a bad input shows an error, and that there are no console errors. Screenshots go to
// target/e2e/ as test artefacts. Run: node e2e/page.test.mjs (after ./dev wasm).
import { chromium } from "playwright-core";
import { mkdirSync, readFileSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const page_url = pathToFileURL(path.join(root, "www", "index.html")).href;
const shots = path.join(root, "target", "e2e");
mkdirSync(shots, { recursive: true });

const failures = [];
const check = (ok, what) => { console.log(`${ok ? "ok  " : "FAIL"} ${what}`); if (!ok) failures.push(what); };

const browser = await chromium.launch({
  executablePath: "/usr/bin/chromium",
  args: ["--headless=new", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
         "--disable-component-update", "--disable-sync", "--no-first-run"],
});
const context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1400, height: 1000 } });
const blocked = [];
await context.route("**/*", route => {
  const url = route.request().url();
  if (url.startsWith("file:") || url.startsWith("data:") || url.startsWith("blob:")) return route.continue();
  blocked.push(url);
  return route.abort();
});
const page = await context.newPage();
const errors = [];
page.on("console", m => { if (m.type() === "error") errors.push(m.text()); });
page.on("pageerror", e => errors.push(String(e)));

const t0 = Date.now();
await page.goto(page_url);
await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 30000 });
const ready_ms = Date.now() - t0;
check(await page.evaluate(() => document.body.dataset.ready) === "yes", "the module starts from file://");
console.log(`     first drawing of the widgets ${ready_ms} ms after navigation`);

// Ink and a fingerprint of a canvas's pixels.
const pixels = sel => page.evaluate(sel => {
  const c = document.querySelector(sel);
  const d = c.getContext("2d").getImageData(0, 0, c.width, c.height).data;
  let ink = 0, hash = 0;
  for (let i = 0; i < d.length; i += 4) {
    if (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200) ink++;
    hash = (hash * 31 + d[i] + 7 * d[i + 1] + 13 * d[i + 2]) >>> 0;
  }
  return { ink, hash };
}, sel);
const sky = await pixels("#sky canvas");
const plan = await pixels("#plan canvas");
check(sky.ink > 20000, `the sky widget draws (${sky.ink} inked pixels)`);
check(plan.ink > 20000, `the plan widget draws (${plan.ink} inked pixels)`);
const map = await pixels("#map canvas");
check(map.ink > 20000, `the map widget draws (${map.ink} inked pixels)`);
await page.selectOption("#layer", "lost");
const lost = await pixels("#map canvas");
check(lost.hash !== map.hash, "switching the map to hours lost redraws it");
await page.selectOption("#layer", "hours");
check((await page.textContent("#summary")).includes("h of direct sun"), "the text summary is written");
await page.screenshot({ path: path.join(shots, "index-1500.png"), fullPage: true });

// Move the time: the shadows move.
await page.$eval("#time", el => { el.value = "600"; el.dispatchEvent(new Event("input")); });
const plan2 = await pixels("#plan canvas");
check(plan2.hash !== plan.hash, "changing the time redraws the shadows");
await page.$eval("#date", el => { el.value = "2026-12-21"; el.dispatchEvent(new Event("change")); });
const plan3 = await pixels("#plan canvas");
check(plan3.hash !== plan2.hash, "changing the date redraws the shadows");
await page.screenshot({ path: path.join(shots, "index-december-1000.png"), fullPage: true });

// Exports: PNG and SVG files that parse.
for (const [which, kinds] of [["sky", ["png", "svg"]], ["plan", ["png", "svg", "geojson"]], ["map", ["png", "csv"]]]) {
  for (const kind of kinds) {
    const [dl] = await Promise.all([page.waitForEvent("download"), page.click(`[data-export="${which}-${kind}"]`)]);
    const file = path.join(shots, `${which}.${kind}`);
    await dl.saveAs(file);
    const bytes = readFileSync(file);
    const text = bytes.toString();
    const csv_ok = () => {
      const lines = text.trim().split("\n");
      return lines[0] === "x_m,y_m,sun_hours" && lines.length > 100 && lines.slice(1).every(l => l.split(",").length === 3 && l.split(",").every(v => Number.isFinite(Number(v))));
    };
    const geojson_ok = () => {
      const fc = JSON.parse(text);
      return fc.type === "FeatureCollection" && fc.features.some(f => f.properties.layer === "shadow_union");
    };
    const ok = kind === "png" ? bytes.subarray(1, 4).toString() === "PNG" : kind === "csv" ? csv_ok()
      : kind === "geojson" ? geojson_ok() : text.startsWith("<svg");
    check(ok, `${which} exports a ${kind.toUpperCase()} that parses`);
  }
}

// Animation: frames of the shadow plan; the median frame time must allow 30 frames a second.
await page.click("#play");
await page.waitForTimeout(1500);
await page.click("#play");
const frames = await page.evaluate(() => window.sunlotFrameTimes.slice().sort((a, b) => a - b));
const median = frames[Math.floor(frames.length / 2)];
console.log(`     animation: ${frames.length} frames in 1.5 s, median draw ${median.toFixed(1)} ms`);
check(frames.length >= 30 && median < 33, "the day's animation runs at 30 frames a second or more");

// The year's map in a worker: progress moves, the page stays responsive, the result arrives; a second
// run is cancelled.
const t_year = Date.now();
await page.click("#year-run");
await page.waitForFunction(() => Number(document.querySelector("#year-progress").value) > 0, null, { timeout: 60000 });
await page.$eval("#time", el => { el.value = "780"; el.dispatchEvent(new Event("input")); });
const during = await pixels("#plan canvas");
check(during.hash !== plan3.hash, "the plan redraws while the year's map runs in the worker");
await page.waitForFunction(() => /mean \d+ h/.test(document.querySelector("#year-result").textContent), null, { timeout: 120000 });
console.log(`     the year's map (1 m cells, 15-min steps) took ${Date.now() - t_year} ms in the browser`);
check(true, `the year's map finishes: ${await page.textContent("#year-result")}`);
await page.screenshot({ path: path.join(shots, "index-year.png"), fullPage: true });
await page.click("#year-run");
await page.click("#year-cancel"); // at once: the worker is still starting, so the run cannot finish first
await page.waitForFunction(() => document.querySelector("#year-result").textContent === "cancelled", null, { timeout: 10000 });
check(await page.isHidden("#year-progress"), "a cancelled run says so and hides its progress bar");

// A click on the plan picks the point whose sky view and day of sun and shade are shown.
const sky_before = await pixels("#sky canvas");
const box = await page.$eval("#plan canvas", c => { const r = c.getBoundingClientRect(); return { x: r.left, y: r.top, w: r.width, h: r.height }; });
await page.mouse.click(box.x + box.w * 0.5, box.y + box.h * 0.45);
const picked = await page.inputValue("#point");
check(picked !== "14,41,1.5" && picked.split(",").length === 3, `clicking the plan picks a point (${picked})`);
check((await pixels("#sky canvas")).hash !== sky_before.hash, "the sky widget shows the picked point's skyline");
check(/(sun|shade) \d\d:\d\d–\d\d:\d\d/.test(await page.textContent("#summary")), "the summary lists its sun and shade intervals");
await page.$eval("#point", el => { el.value = "14,41,1.5"; el.dispatchEvent(new Event("change")); });

// Bad input: an error message, and the page keeps working.
await page.$eval("#point", el => { el.value = "14,41"; el.dispatchEvent(new Event("change")); });
check(!(await page.isHidden("#error")), "a bad point shows an error message");
await page.$eval("#point", el => { el.value = "14,41,1.5"; el.dispatchEvent(new Event("change")); });
check(await page.isHidden("#error"), "a good point clears it");

// Import: a malformed GeoJSON shows an error naming the feature and leaves the site as it was; a good
// site file replaces it, is saved in the browser and is restored on reload.
const name_before = await page.textContent("#site-name");
const plan_before = await pixels("#plan canvas");
const bad = JSON.stringify({ type: "FeatureCollection", sunlot: { zone: "Europe/London" }, features: [{ type: "Feature",
  properties: { sunlot: "volume", id: "tower-x", top_m: -3 },
  geometry: { type: "Polygon", coordinates: [[[0, 0], [0.0001, 0], [0.0001, 0.0001], [0, 0.0001], [0, 0]]] } }] });
await page.setInputFiles("#import", { name: "bad.geojson", mimeType: "application/json", buffer: Buffer.from(bad) });
await page.waitForFunction(() => !document.querySelector("#error").hidden, null, { timeout: 10000 });
const msg = await page.textContent("#error");
check(msg.includes("tower-x") && msg.includes("unchanged"), `a malformed GeoJSON names its feature: ${msg}`);
check(await page.textContent("#site-name") === name_before, "the site is unchanged after a bad import");
check((await pixels("#plan canvas")).hash === plan_before.hash, "the plan is unchanged after a bad import");
const good = JSON.parse(readFileSync(path.join(root, "demo-site", "hollin-vale.site.json"), "utf8"));
good.name = "Imported test site (invented)";
await page.setInputFiles("#import", { name: "mine.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(good)) });
await page.waitForFunction(() => document.querySelector("#site-name").textContent.includes("Imported test site"), null, { timeout: 10000 });
check(true, "a good site file is imported");
await page.reload();
await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 30000 });
check((await page.textContent("#site-name")).includes("Imported test site"), "the imported site is restored on reload");
const [dl] = await Promise.all([page.waitForEvent("download"), page.click("#export-site")]);
await dl.saveAs(path.join(shots, "site.sunlot.json"));
check(JSON.parse(readFileSync(path.join(shots, "site.sunlot.json"), "utf8")).name === good.name, "the site file saves and parses");
await page.click("#reset-demo");
check((await page.textContent("#site-name")) === name_before, "the demo site comes back");

// High-DPI: at a device pixel ratio of 2 the canvases carry twice the pixels each way, fully drawn.
const hidpi = await browser.newContext({ deviceScaleFactor: 2, viewport: { width: 1400, height: 1000 } });
await hidpi.route("**/*", route => route.request().url().startsWith("file:") ? route.continue() : route.abort());
const page2 = await hidpi.newPage();
await page2.goto(page_url);
await page2.waitForFunction(() => document.body.dataset.ready, null, { timeout: 30000 });
const sky2 = await page2.evaluate(() => {
  const c = document.querySelector("#sky canvas");
  const d = c.getContext("2d").getImageData(0, 0, c.width, c.height).data;
  let ink = 0;
  for (let i = 0; i < d.length; i += 4) if (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200) ink++;
  return { width: c.width, ink };
});
check(sky2.width === 1800 && sky2.ink > 3 * sky.ink, `high-DPI canvases are drawn at full resolution (${sky2.width} px wide, ${sky2.ink} inked)`);
await page2.screenshot({ path: path.join(shots, "index-hidpi.png") });
await hidpi.close();

check(blocked.length === 0, `no request leaves the disk (${blocked.join(", ") || "none"})`);
check(errors.length === 0, `no console errors (${errors.join(" | ") || "none"})`);
await browser.close();
if (failures.length) {
  console.error(`${failures.length} end-to-end check(s) failed`);
  process.exit(1);
}
console.log("all end-to-end checks passed");

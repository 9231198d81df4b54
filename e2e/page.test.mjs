// End to end: www/index.html opened from disk (file://) in Debian's headless Chromium with every
// request to anything but a local file blocked. Checks that both widgets draw (pixels, not just a
// canvas), that changing the time moves the shadows, map layers, pan and zoom, keyboard, editing with
// undo and redo, drawing a volume, an underlay, the worker's annual map with cancel, that the exports
// produce files that parse (and the SVG renders like the canvas), import errors, restore on reload,
// print, an embedding page, high-DPI, no network and no console errors. Screenshots go to
// target/e2e/ as test artefacts. Run: node e2e/page.test.mjs (after ./dev wasm).
import { launch } from "./chromium.mjs";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const page_url = pathToFileURL(path.join(root, "www", "index.html")).href;
const shots = path.join(root, "target", "e2e");
mkdirSync(shots, { recursive: true });

const failures = [];
const check = (ok, what) => { console.log(`${ok ? "ok  " : "FAIL"} ${what}`); if (!ok) failures.push(what); };

const browser = await launch();
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
const draw_ms = await page.evaluate(() => window.sunlot.measured.firstDrawMs);
console.log(`     both widgets drawn ${ready_ms} ms after navigation (drawing ${draw_ms.toFixed(0)} ms)`);

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
// Polls until a canvas's pixels differ from `before` (a fingerprint), or times out.
async function changed(sel, before, timeout = 20000) {
  const end = Date.now() + timeout;
  let now = await pixels(sel);
  while (now.hash === before.hash && Date.now() < end) { await page.waitForTimeout(50); now = await pixels(sel); }
  return now;
}
const mapDone = () => page.waitForFunction(() => /cells, mean/.test(document.querySelector("#map-status").textContent),
  null, { timeout: 120000 });

const sky = await pixels("#sky canvas");
const plan = await pixels("#plan canvas");
check(sky.ink > 20000, `the sky widget draws (${sky.ink} inked pixels)`);
check(plan.ink > 20000, `the plan widget draws (${plan.ink} inked pixels)`);
await mapDone();
const map = await changed("#map canvas", { hash: -1 });
check(map.ink > 20000, `the map widget draws (${map.ink} inked pixels): ${await page.textContent("#map-status")}`);
await page.selectOption("#layer", "lost");
const lost = await changed("#map canvas", map);
check(lost.hash !== map.hash, "switching the map to hours lost redraws it");
await page.selectOption("#layer", "insolation");
const insol = await changed("#map canvas", lost);
check(insol.hash !== lost.hash && /kWh/.test(await page.textContent("#map-status")), "the insolation map draws in kWh/m²");
await page.selectOption("#layer", "sun-hours");
await changed("#map canvas", insol);
await page.check("#on-plan");
const layered = await changed("#plan canvas", plan);
check(layered.ink > plan.ink * 1.2, `the map draws under the plan's shadows (${plan.ink} → ${layered.ink} inked pixels)`);
await page.uncheck("#on-plan");
await changed("#plan canvas", layered);
check((await page.textContent("#summary")).includes("h of direct sun"), "the text summary is written");
await page.screenshot({ path: path.join(shots, "index-1500.png"), fullPage: true });

// Move the time: the shadows move.
await page.$eval("#time", el => { el.value = "600"; el.dispatchEvent(new Event("input")); });
const plan2 = await pixels("#plan canvas");
check(plan2.hash !== plan.hash, "changing the time redraws the shadows");
await page.$eval("#date", el => { el.value = "2026-12-21"; el.dispatchEvent(new Event("change")); });
const plan3 = await pixels("#plan canvas");
check(plan3.hash !== plan2.hash, "changing the date redraws the shadows");
await mapDone();
await page.screenshot({ path: path.join(shots, "index-december-1000.png"), fullPage: true });

// Keyboard: ] on the focused plan steps the time by 15 minutes and the page's slider follows.
await page.focus("#plan canvas");
await page.keyboard.press("]");
check(await page.textContent("#time-label") === "10:15", `] on the plan steps the time (${await page.textContent("#time-label")})`);
await page.keyboard.press("[");

// The 3-D view: drawn, orbits under a drag and the arrow keys, follows and steps the time.
const massing = await pixels("#massing canvas");
check(massing.ink > 20000, `the 3-D view draws (${massing.ink} inked pixels)`);
{
  await (await page.$("#massing canvas")).scrollIntoViewIfNeeded();
  const box = await (await page.$("#massing canvas")).boundingBox();
  const from = await page.evaluate(() => document.querySelector("#massing").view.fromDeg);
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();
  for (let k = 1; k <= 10; k++) await page.mouse.move(box.x + box.width / 2 + 10 * k, box.y + box.height / 2);
  await page.mouse.up();
  const turned = await changed("#massing canvas", massing);
  const after = await page.evaluate(() => document.querySelector("#massing").view);
  check(turned.hash !== massing.hash && Math.abs(((from - after.fromDeg + 540) % 360) - 180 - 40) < 1e-6,
    `dragging 100 px walks the viewer 40° round (from ${from}° to ${after.fromDeg}°) and redraws`);
  await page.focus("#massing canvas");
  await page.keyboard.press("ArrowUp");
  const up = await page.evaluate(() => document.querySelector("#massing").view.elevationDeg);
  check(Math.abs(up - after.elevationDeg - 5) < 1e-6, `the up arrow looks 5° higher (${after.elevationDeg}° to ${up}°)`);
  await page.keyboard.press("]");
  check(await page.textContent("#time-label") === "10:15", `] on the 3-D view steps the page's time (${await page.textContent("#time-label")})`);
  await page.keyboard.press("[");
  const bare = await pixels("#massing canvas");
  await page.check("#massing-envelope");
  const enveloped = await changed("#massing canvas", bare);
  check(enveloped.hash !== bare.hash && await page.evaluate(() => document.querySelector("#massing").envelopeLot === "")
    && !(await page.isVisible("#error")), "the lot's solar envelope shows in the 3-D view");
  await page.uncheck("#massing-envelope");
  await page.evaluate(() => window.scrollTo(0, 0));
  const label = await page.getAttribute("#massing canvas", "aria-label");
  check(/at \d{4}-\d\d-\d\d 10:00/.test(label), `the 3-D view shows the page's moment (${label.slice(0, 60)}…)`);
}

// The download a click on `selector` starts. Headless Chromium now and then drops one of several
// downloads started in quick succession (seen with every widget, clicking a button a second): the
// click is given a moment and one more try, as a user would click again.
async function downloadOf(selector) {
  for (let attempt = 0; ; attempt++) {
    await page.waitForTimeout(150);
    const [dl] = await Promise.all([page.waitForEvent("download", { timeout: 10000 }).catch(() => null), page.click(selector)]);
    if (dl || attempt === 1) {
      if (!dl) throw new Error(`${selector}: no download after two clicks`);
      return dl;
    }
  }
}

// Exports: files that parse.
for (const [which, kinds] of [["sky", ["png", "svg"]], ["plan", ["png", "svg", "geojson"]],
                              ["map", ["png", "svg", "csv", "geojson"]], ["massing", ["png", "svg"]]]) {
  for (const kind of kinds) {
    if (process.env.SUNLOT_E2E_VERBOSE) console.log(`     export ${which}-${kind}`);
    const dl = await downloadOf(`[data-export="${which}-${kind}"]`);
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
      if (fc.type !== "FeatureCollection") return false;
      return which === "plan" ? fc.features.some(f => f.properties.layer === "shadow_union")
        : fc.features.length > 100 && fc.features.every(f => f.geometry.type === "Polygon" && Number.isFinite(f.properties.sun_hours));
    };
    const ok = kind === "png" ? bytes.subarray(1, 4).toString() === "PNG" : kind === "csv" ? csv_ok()
      : kind === "geojson" ? geojson_ok() : text.startsWith("<svg");
    check(ok, `${which} exports a ${kind.toUpperCase()} that parses`);
  }
}

// The SVG is the same drawing as the canvas: rendered back into pixels, it matches the widget.
const svg_vs_canvas = await page.evaluate(async () => {
  const el = document.querySelector("#plan");
  // At the size the page shows it (exports are drawn at the design size).
  const { width: W, height: H } = el.size;
  const img = new Image();
  img.src = URL.createObjectURL(new Blob([el.svg(el.size)], { type: "image/svg+xml" }));
  await img.decode();
  const c = document.createElement("canvas");
  c.width = W; c.height = H;
  const ctx = c.getContext("2d");
  ctx.drawImage(img, 0, 0);
  const a = ctx.getImageData(0, 0, W, H).data;
  const d = document.createElement("canvas");
  d.width = W; d.height = H;
  d.getContext("2d").drawImage(el.canvas, 0, 0, W, H);
  const b = d.getContext("2d").getImageData(0, 0, W, H).data;
  let diff = 0, far = 0;
  for (let i = 0; i < a.length; i += 4) {
    const e = Math.abs(a[i] - b[i]) + Math.abs(a[i + 1] - b[i + 1]) + Math.abs(a[i + 2] - b[i + 2]);
    diff += e;
    if (e > 120) far++;
  }
  return { mean: diff / (a.length / 4) / 3, far: far / (a.length / 4) };
});
check(svg_vs_canvas.mean < 3 && svg_vs_canvas.far < 0.01,
  `the plan's SVG renders like its canvas (mean difference ${svg_vs_canvas.mean.toFixed(2)}/255, ${(100 * svg_vs_canvas.far).toFixed(2)}% of pixels far apart)`);

// Animation: frames of the shadow plan; the median frame time must allow 30 frames a second, and the
// time and the plan must move (a slider step coarser than a frame once snapped every frame back).
const time_before_play = await page.inputValue("#time");
const plan_before_play = await pixels("#plan canvas");
await page.click("#play");
await page.waitForTimeout(1500);
await page.click("#play");
const time_after_play = await page.inputValue("#time");
const plan_after_play = await pixels("#plan canvas");
check(time_after_play !== time_before_play && plan_after_play.hash !== plan_before_play.hash,
  `playing the day moves the time (${time_before_play} → ${time_after_play} min) and the plan`);
const frames = await page.evaluate(() => window.sunlot.measured.frameTimes.slice().sort((a, b) => a - b));
const median = frames[Math.floor(frames.length / 2)];
console.log(`     animation: ${frames.length} frames in 1.5 s, median draw ${median.toFixed(1)} ms`);
check(frames.length >= 30 && median < 33, "the day's animation runs at 30 frames a second or more");

// The year's map in a worker: progress moves, the page stays responsive, the result arrives; the
// envelope run after it is cancelled.
const t_year = Date.now();
const map_before_year = await pixels("#map canvas");
await page.selectOption("#layer", "year-hours");
await page.waitForFunction(() => Number(document.querySelector("#map-progress").value) > 0, null, { timeout: 60000 });
await page.$eval("#time", el => { el.value = "780"; el.dispatchEvent(new Event("input")); });
const during = await pixels("#plan canvas");
check(during.hash !== plan3.hash, "the plan redraws while the year's map runs in the worker");
await page.waitForFunction(() => /over the year: \d+ cells/.test(document.querySelector("#map-status").textContent), null, { timeout: 120000 });
console.log(`     the year's map (1 m cells, 15-min steps) took ${Date.now() - t_year} ms in the browser ` +
  `(${(await page.evaluate(() => window.sunlot.measured.lastMapMs)).toFixed(0)} ms in the worker)`);
check((await changed("#map canvas", map_before_year)).ink > 20000, `the year's map is drawn: ${await page.textContent("#map-status")}`);
await page.screenshot({ path: path.join(shots, "index-year.png"), fullPage: true });
// The workers run the speed-built module (www/build/sunlot-fast.js); its maps are the page module's
// exactly (the same code, built for speed: no fast-math, so the same floating point).
check(await page.evaluate(() => window.sunlot.workerRuns.last) === "fast", "the year's map ran on the workers' module");
const same = await page.evaluate(async () => {
  const fast = await window.sunlot.workerModule();
  const m = await fast.bootModule(fast.compiled);
  const page = await window.sunlot.ready;
  const site = page.demoSiteText(), out = [];
  for (const kind of ["sun-hours", "lost", "insolation", "year-hours", "envelope"]) {
    const input = { kind, site, date: "2026-03-21" };
    const a = m.mapOfKind(input, () => true).values, b = page.mapOfKind(input, () => true).values;
    let differ = a.length === b.length ? 0 : -1;
    for (let i = 0; differ >= 0 && i < a.length; i++) if (!Object.is(a[i], b[i])) differ++;
    out.push(`${kind}: ${a.length} cells, ${differ} differ`);
  }
  return out;
});
check(same.every(s => / 0 differ$/.test(s)), `the workers' module gives the page module's maps bit for bit (${same.join("; ")})`);
// Start the envelope and cancel it in one task: the worker's answer cannot be taken in between.
await page.evaluate(() => {
  const layer = document.querySelector("#layer");
  layer.value = "envelope";
  layer.dispatchEvent(new Event("change"));
  document.querySelector("#map-cancel").click();
});
await page.waitForFunction(() => document.querySelector("#map-status").textContent === "cancelled", null, { timeout: 10000 });
check(await page.isHidden("#map-progress"), "a cancelled run says so and hides its progress bar");
await page.selectOption("#layer", "sun-hours");
await mapDone();

// Pan and zoom: the wheel zooms about the cursor, arrows pan, 0 fits the whole site again.
// Figure pixels → page pixels, measured again before each use (clicks elsewhere scroll the page).
let box;
const measure = async () => {
  await page.$eval("#plan canvas", c => c.scrollIntoView({ block: "center" }));
  box = await page.$eval("#plan", p => { const r = p.canvas.getBoundingClientRect();
    return { x: r.left, y: r.top, w: r.width, h: r.height, fw: p.size.width, fh: p.size.height }; });
};
const fx = x => box.x + x * box.w / box.fw, fy = y => box.y + y * box.h / box.fh;
await measure();
const unzoomed = await pixels("#plan canvas");
const fitted_width = await page.evaluate(() => document.querySelector("#plan").currentView().widthM);
await page.mouse.move(fx(370), fy(420));
for (let k = 0; k < 3; k++) { await page.mouse.wheel(0, -120); await page.waitForTimeout(50); }
const zoomed = await changed("#plan canvas", unzoomed);
const view = await page.evaluate(() => document.querySelector("#plan").view);
check(view && view.widthM < fitted_width / 1.9,
  `the wheel zooms the plan (${fitted_width.toFixed(1)} → ${view && view.widthM.toFixed(1)} m across)`);
await page.focus("#plan canvas");
await page.keyboard.press("ArrowLeft");
check((await changed("#plan canvas", zoomed)).hash !== zoomed.hash, "an arrow key pans the zoomed plan");
await page.keyboard.press("0");
check(await page.evaluate(() => document.querySelector("#plan").view === null), "0 fits the whole site again");
await page.screenshot({ path: path.join(shots, "index-zoomed.png") });

// A click on the plan picks the point whose sky view and day of sun and shade are shown.
const sky_before = await pixels("#sky canvas");
await measure();
await page.mouse.click(box.x + box.w * 0.5, box.y + box.h * 0.45);
const picked = await page.inputValue("#point");
check(picked !== "14,41,1.5" && picked.split(",").length === 3, `clicking the plan picks a point (${picked})`);
check((await pixels("#sky canvas")).hash !== sky_before.hash, "the sky widget shows the picked point's skyline");
check(/(sun|shade) \d\d:\d\d–\d\d:\d\d/.test(await page.textContent("#summary")), "the summary lists its sun and shade intervals");
await page.$eval("#point", el => { el.value = "14,41,1.5"; el.dispatchEvent(new Event("change")); });

// Editing: select the proposal, raise it, undo and redo; draw a new volume and see its shadow; move
// a vertex; delete the new volume.
const toFig = (x, y) => page.evaluate(([x, y]) => document.querySelector("#plan").toPx(x, y), [x, y]);
const site_now = () => page.evaluate(() => JSON.parse(localStorage.getItem("sunlot.site") || "null"));
const proposal = (await page.evaluate(() => JSON.parse(document.querySelector("#plan").state.site)))
  .volumes.find(v => v.status === "proposed");
const inner = proposal.outline.reduce((a, p) => [a[0] + p[0] / proposal.outline.length, a[1] + p[1] / proposal.outline.length], [0, 0]);
await measure();
let [px, py] = await toFig(inner[0], inner[1]);
const point_before_select = await page.inputValue("#point");
await page.mouse.click(fx(px), fy(py));
check(!(await page.isHidden("#feature")) && (await page.inputValue("#f-id")).length > 0,
  `clicking a volume selects it (${await page.inputValue("#f-id")})`);
check(await page.inputValue("#point") === point_before_select,
  `selecting a volume to edit leaves the sky point where it was (${point_before_select} → ${await page.inputValue("#point")})`);
// The shaded area in plan m² (the plan's frame grows with long shadows, so its ink is no measure).
const shade_m2 = () => page.evaluate(() => {
  const fc = JSON.parse(document.querySelector("#plan").shadowsGeojson());
  const ring = r => r.reduce((a, p, i) => { const q = r[(i + 1) % r.length]; return a + p[0] * q[1] - q[0] * p[1]; }, 0) / 2;
  const poly = rings => Math.abs(ring(rings[0])) - rings.slice(1).reduce((a, r) => a + Math.abs(ring(r)), 0);
  return fc.features.filter(f => f.properties.layer === "feature_shadow")
    .reduce((a, f) => a + (f.geometry.type === "Polygon" ? poly(f.geometry.coordinates)
      : f.geometry.type === "MultiPolygon" ? f.geometry.coordinates.reduce((b, p) => b + poly(p), 0) : 0), 0);
});
const before_raise = await pixels("#plan canvas");
const shade_before = await shade_m2();
await page.fill("#f-top", "30");
await page.click("#feature button[type=submit]");
const raised = await changed("#plan canvas", before_raise);
const shade_raised = await shade_m2();
check(shade_raised > shade_before * 1.05,
  `raising the selected volume lengthens its shadow (${shade_before.toFixed(0)} → ${shade_raised.toFixed(0)} m² of shade features)`);
check(!(await page.isDisabled("#undo")), "the edit can be undone");
await page.click("#undo");
check((await changed("#plan canvas", raised)).hash === before_raise.hash, "undo restores the plan");
await page.click("#redo");
check((await changed("#plan canvas", before_raise)).hash === raised.hash, "redo repeats the edit");
await page.click("#undo");
await changed("#plan canvas", raised);

const before_draw = await pixels("#plan canvas");
await page.click("#draw-volume");
await measure();
for (const [x, y] of [[-30, 45], [-20, 45], [-20, 55], [-30, 55]]) {
  [px, py] = await toFig(x, y);
  await page.mouse.click(fx(px), fy(py));
}
await page.keyboard.press("Enter");
const drawn = await changed("#plan canvas", before_draw);
const saved = await site_now();
const added = saved && saved.volumes.find(v => v.id === "volume-1");
check(added && added.outline.length === 4 && Math.abs(added.outline[0][0] + 30) < 0.5,
  `drawing a volume adds it to the site (${added && JSON.stringify(added.outline)})`);
check(drawn.ink > before_draw.ink + 2000, `the new volume casts a shadow (${before_draw.ink} → ${drawn.ink} inked pixels)`);
await page.screenshot({ path: path.join(shots, "index-drawn.png") });
await measure();
[px, py] = await toFig(-20, 55);
await page.mouse.move(fx(px), fy(py));
await page.mouse.down();
const [qx, qy] = await toFig(-14, 60);
await page.mouse.move(fx(qx), fy(qy), { steps: 5 });
await page.mouse.up();
const moved = (await site_now()).volumes.find(v => v.id === "volume-1");
check(moved && moved.outline.some(p => Math.abs(p[0] + 14) < 0.6 && Math.abs(p[1] - 60) < 0.6),
  `dragging a vertex moves it (${moved && JSON.stringify(moved.outline)})`);
await page.click("#f-delete");
check(!(await site_now()).volumes.some(v => v.id === "volume-1"), "the drawn volume can be deleted");

// A site-plan image under the plan, placed by two reference points.
const before_under = await pixels("#plan canvas");
await page.click(".underlay summary");
await page.setInputFiles("#u-file", path.join(shots, "map.png"));
await page.waitForFunction(() => /click A/.test(document.querySelector("#u-status").textContent));
await page.$eval("#u-preview", c => c.scrollIntoView({ block: "center" }));
const ub = await page.$eval("#u-preview", c => { const r = c.getBoundingClientRect(); return { x: r.left, y: r.top }; });
await page.mouse.click(ub.x + 60, ub.y + 200);
await page.mouse.click(ub.x + 300, ub.y + 200);
await page.fill("#u-distance", "40");
await page.fill("#u-plan-a", "-10,10");
await page.click("#u-place");
check((await changed("#plan canvas", before_under)).hash !== before_under.hash && await page.isHidden("#error"),
  "a site-plan image is placed under the plan by two reference points");
await page.screenshot({ path: path.join(shots, "index-underlay.png") });
await page.click("#u-remove");

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
check(/^Saved in this browser at/.test(await page.textContent("#autosave")), `the page says the site is saved: ${await page.textContent("#autosave")}`);
await page.reload();
await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 30000 });
check((await page.textContent("#site-name")).includes("Imported test site"), "the imported site is restored on reload");
check(/^Restored your site/.test(await page.textContent("#autosave")), `the page says the site was restored: ${await page.textContent("#autosave")}`);
const [dl] = await Promise.all([page.waitForEvent("download"), page.click("#export-site")]);
await dl.saveAs(path.join(shots, "site.sunlot.json"));
check(JSON.parse(readFileSync(path.join(shots, "site.sunlot.json"), "utf8")).name === good.name, "the site file saves and parses");
await page.click("#reset-demo");
await page.waitForFunction(n => document.querySelector("#site-name").textContent === n, name_before, { timeout: 10000 });
check(true, "the demo site comes back");
check(!(await page.isHidden("#demo-note")), "the caution says the demo site is invented while it is shown");

// Plain building footprints (no sunlot members, heights as OpenStreetMap gives them): the page asks
// for the zone, offering the longitude's fixed offset; a building with no height is named, nothing is
// lost; with the heights given the buildings replace the site and what was assumed is listed.
const box_at = (lon, lat, d) => [[[lon, lat], [lon + d, lat], [lon + d, lat + d / 1.6], [lon, lat + d / 1.6], [lon, lat]]];
const footprints = (second) => JSON.stringify({ type: "FeatureCollection", features: [
  { type: "Feature", id: "way/10", properties: { building: "yes", height: "14 m" },
    geometry: { type: "Polygon", coordinates: box_at(-1.5, 53.8, 0.0002) } },
  { type: "Feature", id: "way/11", properties: second,
    geometry: { type: "Polygon", coordinates: box_at(-1.5, 53.8004, 0.0003) } }] });
const plan_demo = await pixels("#plan canvas");
await page.setInputFiles("#import", { name: "town-blocks.geojson", mimeType: "application/geo+json",
  buffer: Buffer.from(footprints({ building: "house" })) });
await page.waitForFunction(() => !document.querySelector("#footprints").hidden, null, { timeout: 10000 });
check(await page.inputValue("#fp-zone") === "Etc/GMT", `plain footprints ask for the zone, offering ${await page.inputValue("#fp-zone")}`);
await page.fill("#fp-zone", "Europe/London");
await page.click("#fp-import");
await page.waitForFunction(() => !document.querySelector("#error").hidden, null, { timeout: 10000 });
const no_height = await page.textContent("#error");
check(no_height.includes("way/11") && no_height.includes("has no height") && await page.textContent("#site-name") === name_before
  && !(await page.isHidden("#footprints")) && await page.inputValue("#fp-zone") === "Europe/London",
  `a footprint with no height is named and nothing is lost: ${no_height}`);
await page.fill("#fp-storey", "3.2");
await page.click("#fp-cancel");
await page.setInputFiles("#import", { name: "town-blocks.geojson", mimeType: "application/geo+json",
  buffer: Buffer.from(footprints({ building: "house", "building:levels": "5" })) });
await page.waitForFunction(() => !document.querySelector("#footprints").hidden, null, { timeout: 10000 });
await page.fill("#fp-zone", "Europe/London");
await page.click("#fp-import");
await page.waitForFunction(() => document.querySelector("#site-name").textContent.startsWith("town-blocks")
  && document.querySelector("#footprints").hidden, null, { timeout: 10000 });
const said = await page.textContent("#assumptions");
check(await page.isHidden("#footprints") && await page.isHidden("#error") && said.includes("2 footprint(s) read as existing buildings")
  && said.includes("given by storeys, at 3.2 m a storey"), `the footprints are imported and what was assumed is said: ${said}`);
check(await page.isHidden("#demo-note"), "an imported site's caution does not call it the invented demo");
await changed("#plan canvas", plan_demo);
check(true, "the plan shows the imported buildings");
await page.click("#reset-demo");
await page.waitForFunction(n => document.querySelector("#site-name").textContent === n, name_before, { timeout: 10000 });
check(await page.isHidden("#assumptions") && !(await page.isHidden("#demo-note")), "back on the demo, the notes are the demo's");

// Readable at 1366×768: each figure is laid out for the width it is shown at, so its smallest text
// (13 px labels in the figure) shows at 9.5 CSS px or more; exports keep the design size.
await page.setViewportSize({ width: 1366, height: 768 });
await page.waitForTimeout(500);
const text_px = await page.evaluate(() => ["#plan", "#sky", "#map"].map(id => {
  const el = document.querySelector(id), shown = el.canvas.getBoundingClientRect().width;
  return [id, 13 * shown / el.size.width, el.size.width, Math.round(shown)];
}));
check(text_px.every(([, px]) => px >= 9.5), `at 1366×768 the figures' smallest text shows at ${text_px.map(([id, px, w, shown]) =>
  `${id} ${px.toFixed(1)} px (drawn ${w} px wide, shown ${shown})`).join(", ")}`);
await page.screenshot({ path: path.join(shots, "index-1366.png") });
const [sky_dl] = await Promise.all([page.waitForEvent("download"), page.click('[data-export="sky-png"]')]);
await sky_dl.saveAs(path.join(shots, "sky-1366.png"));
const sky_png = readFileSync(path.join(shots, "sky-1366.png"));
check(sky_png.readUInt32BE(16) === 900 * (await page.evaluate(() => document.querySelector("#sky").ratio)),
  `a figure shown small still exports at its design size (${sky_png.readUInt32BE(16)} px wide)`);
await page.setViewportSize({ width: 1400, height: 1000 });
await page.waitForTimeout(300);

// Print: one landscape sheet on A4 and on US Letter — the title block, the plan and the map, the
// caution, no controls; every text at 7 pt or more, in the figures too (laid out at the print width
// of the smaller sheet, 259 × 190 mm inside 10 mm margins = 979 × 718 CSS px).
await page.setViewportSize({ width: 979, height: 718 });
await page.emulateMedia({ media: "print" });
await page.waitForTimeout(500);
check(await page.isHidden("#controls") && await page.isVisible("#plan canvas") && await page.isVisible("#map canvas")
  && await page.isVisible(".caution") && await page.isVisible("#title-block"),
  "the print sheet shows the title block, the figures and the caution without the controls");
const title_block = await page.textContent("#title-block");
check(title_block.includes("Hollin Vale") && /Study: \d{4}-\d\d-\d\d at \d\d:\d\d/.test(title_block)
  && title_block.includes("proposal as drawn") && title_block.includes("true north"),
  `the title block names the site, the moment, the massing, scale and north: ${title_block.replace(/\s+/g, " ").trim()}`);
const print_pt = await page.evaluate(() => {
  const figures = ["#plan", "#map"].map(id => { const el = document.querySelector(id);
    return [id, 0.75 * 13 * el.canvas.getBoundingClientRect().width / el.size.width]; });
  let least = Infinity, where = "";
  for (const el of document.querySelectorAll("body *")) {
    const own = Array.from(el.childNodes).some(n => n.nodeType === 3 && n.textContent.trim());
    if (!own || !el.getClientRects().length) continue;
    const pt = 0.75 * parseFloat(getComputedStyle(el).fontSize);
    if (pt < least) { least = pt; where = el.tagName.toLowerCase() + (el.id ? `#${el.id}` : el.className ? `.${el.className}` : ""); }
  }
  return { figures, least, where };
});
check(print_pt.figures.every(([, pt]) => pt >= 6.95) && print_pt.least >= 6.95, // 7 pt, within rounding
  `printed text is 7 pt or more: figures ${print_pt.figures.map(([id, pt]) => `${id} ${pt.toFixed(1)} pt`).join(", ")}; ` +
  `page text from ${print_pt.least.toFixed(1)} pt (${print_pt.where})`);
await page.screenshot({ path: path.join(shots, "index-print.png"), fullPage: true });
for (const format of ["A4", "Letter"]) {
  const pdf = await page.pdf({ format, landscape: true, printBackground: true });
  writeFileSync(path.join(shots, `index-print-${format}.pdf`), pdf);
  const pages = (pdf.toString("latin1").match(/\/Type\s*\/Page(?![s\w])/g) || []).length;
  check(pages === 1, `printed on ${format} landscape the sheet is one page (${pages})`);
}
await page.emulateMedia({ media: "screen" });
await page.setViewportSize({ width: 1400, height: 1000 });
await page.waitForTimeout(300);

// Embedding: a page of its own with one script tag for the module and the widgets, attributes and CSS
// custom properties; the paper colour reaches the figure.
const embed = path.join(shots, "embed.html");
writeFileSync(embed, `<!doctype html><html><head><meta charset="utf-8">
<style>sunlot-plan { --sunlot-paper: #fdf6e3; --sunlot-ink: #073642; width: 640px; display: block; }</style></head><body>
<sunlot-plan id="p" date="2026-06-21" time="09:00" layer="sun-hours"><script type="application/json">${
  readFileSync(path.join(root, "demo-site", "hollin-vale.site.json"), "utf8")}</script></sunlot-plan>
<sunlot-sky id="s" date="2026-06-21" time="09:00" point="14,41,1.5" projection="rectangular"></sunlot-sky>
<script src="${pathToFileURL(path.join(root, "www", "build", "sunlot-widgets.bundle.js")).href}"></script>
<script>document.addEventListener("sunlot-layer", () => { document.body.dataset.layer = "yes"; });
document.querySelector("#p").addEventListener("sunlot-drawn", () => {
  document.querySelector("#s").setSite(document.querySelector("#p").state.site); }, { once: true });</script>
</body></html>`);
const page3 = await context.newPage();
page3.on("pageerror", e => errors.push(String(e)));
await page3.goto(pathToFileURL(embed).href);
await page3.waitForFunction(() => document.body.dataset.layer === "yes", null, { timeout: 30000 });
const corner = await page3.evaluate(() => {
  const c = document.querySelector("#p canvas");
  return Array.from(c.getContext("2d").getImageData(2, 2, 1, 1).data.slice(0, 3));
});
check(corner.join(",") === "253,246,227", `an embedded plan draws on the page's --sunlot-paper (${corner})`);
await page3.waitForFunction(() => document.querySelector("#s canvas").getAttribute("aria-label"), null, { timeout: 10000 });
check(true, "an embedded sky widget draws from its attributes");
await page3.screenshot({ path: path.join(shots, "embed.png"), fullPage: true });
await page3.close();

// High-DPI: at a device pixel ratio of 2 the canvases carry twice the pixels each way, fully drawn.
const hidpi = await browser.newContext({ deviceScaleFactor: 2, viewport: { width: 1400, height: 1000 } });
await hidpi.route("**/*", route => route.request().url().startsWith("file:") ? route.continue() : route.abort());
const page2 = await hidpi.newPage();
await page2.goto(page_url);
await page2.waitForFunction(() => document.body.dataset.ready, null, { timeout: 30000 });
const sky2 = await page2.evaluate(() => {
  const el = document.querySelector("#sky"), c = el.canvas;
  const d = c.getContext("2d").getImageData(0, 0, c.width, c.height).data;
  let ink = 0;
  for (let i = 0; i < d.length; i += 4) if (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200) ink++;
  return { width: c.width, figure: el.size.width, ink };
});
check(sky2.width === 2 * sky2.figure && sky2.ink > 2.5 * sky.ink,
  `high-DPI canvases are drawn at full resolution (${sky2.width} px wide for a ${sky2.figure}-px figure, ${sky2.ink} inked)`);
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

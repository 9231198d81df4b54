// Page speed, measured as a user meets it: www/index.html opened from disk in Debian's headless
// Chromium (no network). Reports medians of several runs: the time from navigation to both widgets
// drawn (and the part spent drawing), the animation's frame time on the demo site, and the annual
// sun-hours map of the demo site (1 m cells, 15-minute steps, every area) in the page's Web Worker
// against the same computation natively (`sunlot hours`, process start included), as a ratio.
// Run from the repository root after ./dev wasm and cargo build --release: node benches/page_speed.mjs
import { launch } from "../e2e/chromium.mjs";
import { execFileSync } from "node:child_process";
import { pathToFileURL } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), "..");
const url = pathToFileURL(path.join(root, "www", "index.html")).href;
const median = v => { const s = [...v].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };

const browser = await launch();
const loads = [], drawing = [], scripts = [], frames = [], year = [], turns = [], steps = [];
for (let run = 0; run < 7; run++) {
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  await context.route("**/*", r => (r.request().url().startsWith("file:") ? r.continue() : r.abort()));
  const page = await context.newPage();
  await page.goto(url);
  await page.waitForFunction(() => document.body.dataset.ready === "yes", null, { timeout: 60000 });
  const t = await page.evaluate(() => ({ ready: window.sunlot.measured.readyMs, draw: window.sunlot.measured.firstDrawMs,
    scripts: window.sunlot.measured.scripts }));
  loads.push(t.ready);
  scripts.push(t.scripts);
  drawing.push(t.draw);
  if (run < 3) {
    await page.click("#play");
    await page.waitForTimeout(2000);
    await page.click("#play");
    frames.push(median(await page.evaluate(() => window.sunlot.measured.frameTimes)));
    steps.push(median(await page.evaluate(() => window.sunlot.measured.massingFrameTimes)));
    // The 3-D view turned a degree at a time (the light kept: the view only redrawn).
    turns.push(await page.evaluate(() => {
      const m = document.querySelector("#massing"), times = [];
      for (let k = 0; k < 40; k++) {
        const t0 = performance.now();
        m.setView({ fromDeg: m.view.fromDeg + 1 });
        m.render();
        times.push(performance.now() - t0);
      }
      return times.sort((a, b) => a - b)[20];
    }));
    await page.waitForFunction(() => /cells, mean/.test(document.querySelector("#map-status").textContent));
    await page.selectOption("#layer", "year-hours");
    await page.waitForFunction(() => /over the year: \d+ cells/.test(document.querySelector("#map-status").textContent),
      null, { timeout: 120000 });
    year.push(await page.evaluate(() => window.sunlot.measured.lastMapMs));
  }
  await context.close();
}
await browser.close();

const native = [];
for (let run = 0; run < 5; run++) {
  const t = process.hrtime.bigint();
  execFileSync(path.join(root, "target", "release", "sunlot"), ["hours", path.join(root, "demo-site", "hollin-vale.site.json"),
    "--cell-m", "1", "--date", "2026-01-01", "--to", "2026-12-31", "--step-min", "15", "--format", "json", "--quiet"]);
  native.push(Number(process.hrtime.bigint() - t) / 1e6);
}
console.log(`page from disk to both widgets drawn: median ${median(loads).toFixed(0)} ms ` +
  `(the page's scripts start at ${median(scripts).toFixed(0)} ms, drawing takes ${median(drawing).toFixed(0)} ms; ` +
  `target 300 ms), ${loads.length} loads`);
console.log(`animation frame (plan redrawn at the next moment): median ${median(frames).toFixed(2)} ms`);
console.log(`3-D view (demo site, as shown on the page): turning it median ${median(turns).toFixed(2)} ms a frame, ` +
  `the next moment (shadows on every face recomputed) median ${median(steps).toFixed(2)} ms a frame ` +
  `(${(1000 / median(steps)).toFixed(0)} frames a second; target ≥ 30)`);
console.log(`annual sun-hours map of the demo site, 1 m cells, 15 min: browser worker ${median(year).toFixed(0)} ms, ` +
  `native CLI ${median(native).toFixed(0)} ms, ratio ${(median(year) / median(native)).toFixed(1)}× (worker start-up included)`);

// End to end: every page of the demo proposal site (demo-site/*.html) opened from disk (file://) in
// Debian's headless Chromium with every request to anything but a local file blocked. Each page
// loads without console errors, every widget draws (pixels checked), every export button gives a file
// that parses, and the rule-check table shows the figures of the CLI's `check` on the same site file.
// A screenshot of each page goes to target/e2e/ as a test artefact.
// Run: node e2e/demo_site.test.mjs (after ./dev wasm and a cargo build of the CLI).
import { launch } from "./chromium.mjs";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { execFileSync, spawn } from "node:child_process";
import { fileURLToPath, pathToFileURL } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const shots = path.join(root, "target", "e2e", "demo-site");
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

function parses(kind, bytes) {
  const text = bytes.toString();
  if (kind === "png") return bytes.subarray(1, 4).toString() === "PNG";
  if (kind === "svg") return text.startsWith("<svg") && text.trim().endsWith("</svg>");
  if (kind === "geojson") { const fc = JSON.parse(text); return fc.type === "FeatureCollection" && fc.features.length > 0; }
  if (kind === "csv") {
    const cells = l => l.split(/,(?=(?:[^"]*"[^"]*")*[^"]*$)/).length; // commas outside quotes
    const lines = text.trim().split("\n");
    return lines.length > 1 && lines.every(l => cells(l) === cells(lines[0]));
  }
  return false;
}

const pages = process.argv.length > 2 ? process.argv.slice(2)
  : ["index", "sun", "shadows", "gardens", "windows", "envelope", "interactive"];
let ruleRows = null;
const windowVerdicts = {};
for (const name of pages) {
  const page = await context.newPage();
  const errors = [];
  page.on("console", m => { if (m.type() === "error") errors.push(m.text()); });
  page.on("pageerror", e => errors.push(String(e)));
  await page.goto(pathToFileURL(path.join(root, "demo-site", `${name}.html`)).href);
  await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 120000 });
  check(await page.evaluate(() => document.body.dataset.ready) === "yes" && await page.isHidden("#error"),
    `${name}: loads from file:// and starts`);
  const inks = await page.evaluate(() => Array.from(document.querySelectorAll("sunlot-sky, sunlot-plan, sunlot-map, sunlot-massing, canvas.facade, canvas.rule-plan")).map(w => {
    const c = w.canvas || w, d = c.getContext("2d").getImageData(0, 0, c.width, c.height).data;
    let ink = 0;
    for (let i = 0; i < d.length; i += 4) if (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200) ink++;
    return [w.id, ink];
  }));
  check(inks.length > 0 && inks.every(([, ink]) => ink > 20000),
    `${name}: every widget draws (${inks.map(([id, ink]) => `${id} ${ink}`).join(", ")})`);
  // Each widget laid out for the width it is shown at: its 13-px labels show at 9.5 CSS px or more.
  const small = await page.evaluate(() => Array.from(document.querySelectorAll("sunlot-sky, sunlot-plan, sunlot-map, sunlot-massing"))
    .map(w => [w.id, 13 * w.canvas.getBoundingClientRect().width / w.size.width]).filter(([, px]) => px < 9.5));
  check(small.length === 0, `${name}: figure text readable as shown (${small.map(([id, px]) => `${id} ${px.toFixed(1)} px`).join(", ") || "all ≥ 9.5 px"})`);
  const buttons = await page.$$eval("[data-export]", bs => bs.map(b => b.dataset.export));
  let good = 0;
  const bad = [];
  for (const stem of buttons) {
    if (process.env.SUNLOT_E2E_VERBOSE) console.log(`     export ${stem}`);
    const [dl] = await Promise.all([page.waitForEvent("download"), page.click(`[data-export="${stem}"]`)]);
    const file = path.join(shots, `${name}-${stem}`);
    await dl.saveAs(file);
    if (parses(stem.split(".").pop(), readFileSync(file))) good++; else bad.push(stem);
    // Chromium drops a download that follows another too closely; a person clicks slower than this.
    await page.waitForTimeout(300);
  }
  check(buttons.length > 0 && bad.length === 0, `${name}: ${good} of ${buttons.length} exports parse${bad.length ? ` (not: ${bad.join(", ")})` : ""}`);
  if (name === "index") {
    // The one-page summary prints as one landscape sheet on A4 and US Letter, every text at 7 pt or
    // more, figures included (laid out at the smaller sheet's print area, 263 × 196 mm = 994 × 741 px).
    await page.setViewportSize({ width: 994, height: 741 });
    await page.emulateMedia({ media: "print" });
    await page.waitForTimeout(500);
    const printed = await page.evaluate(() => {
      const figures = Array.from(document.querySelectorAll("sunlot-plan, sunlot-map"))
        .map(w => 0.75 * 13 * w.canvas.getBoundingClientRect().width / w.size.width);
      let least = Infinity;
      for (const el of document.querySelectorAll("body *")) {
        const own = Array.from(el.childNodes).some(n => n.nodeType === 3 && n.textContent.trim());
        if (own && el.getClientRects().length) least = Math.min(least, 0.75 * parseFloat(getComputedStyle(el).fontSize));
      }
      return { figures, least };
    });
    const sheets = [];
    for (const format of ["A4", "Letter"]) {
      const pdf = await page.pdf({ format, landscape: true, printBackground: true });
      writeFileSync(path.join(shots, `index-print-${format}.pdf`), pdf);
      sheets.push(`${format} ${(pdf.toString("latin1").match(/\/Type\s*\/Page(?![s\w])/g) || []).length}`);
    }
    check(sheets.every(s => s.endsWith(" 1")) && printed.figures.length === 2 && printed.figures.every(pt => pt >= 6.95)
      && printed.least >= 6.95, `index: the summary prints on one sheet (${sheets.join(", ")} page), text from ` +
      `${printed.least.toFixed(1)} pt, figures' smallest ${printed.figures.map(pt => pt.toFixed(1)).join(" and ")} pt`);
    await page.emulateMedia({ media: "screen" });
    await page.setViewportSize({ width: 1400, height: 1000 });
    check((await page.textContent(".caution")).includes("licensed professional"), "index: the caution is shown beside the pass/fail table");
    ruleRows = await page.$$eval("#table-rule-check tbody tr", rows => rows.map(r => Array.from(r.cells).map(c => c.textContent)));
  }
  if (name === "gardens") {
    check(await page.isVisible("canvas.rule-plan") && (await page.textContent("#rule figcaption")).includes("pass)"),
      "gardens: the plan of verdicts is drawn beside the rule table");
  }
  if (name === "index" || name === "windows") {
    for (const preset of ["bre-br209-window-sky", "bre-br209-window-sun"]) {
      windowVerdicts[`${name} ${preset}`] = await page.$$eval(`#table-windows-${preset} tbody tr`,
        rows => rows.map(r => { const c = Array.from(r.cells).map(x => x.textContent); return [c[0], c[c.length - 2]]; }));
    }
    const cautions = await page.$$eval("#windows .caution, #verdicts .caution", ps => ps.map(p => p.textContent).join(" "));
    check(cautions.includes("licensed professional") && cautions.includes("from memory") && cautions.includes("probable sunlight"),
      `${name}: the window verdicts show the caution, the numbers from memory and the clear-sky caveat`);
  }
  if (name === "interactive") {
    const before = await page.evaluate(() => document.querySelector("#plan").state.site);
    await page.fill("#top", "24");
    await page.click("#raise");
    const after = await page.evaluate(() => JSON.parse(document.querySelector("#plan").state.site).volumes.find(v => v.id === "proposal-upper").top_m);
    check(after === 24 && before !== await page.evaluate(() => document.querySelector("#plan").state.site),
      "interactive: the reader can raise the proposal");
  }
  await page.screenshot({ path: path.join(shots, `${name}.png`), fullPage: true });
  check(errors.length === 0, `${name}: no console errors (${errors.join(" | ") || "none"})`);
  await page.close();
}

// The rule-check table against the CLI on the same site file (when the summary page was run).
if (ruleRows !== null || pages.includes("index")) {
const exe = ["release", "debug"].map(p => path.join(root, "target", p, "sunlot")).find(existsSync);
const cli = JSON.parse(execFileSync(exe, ["check", path.join(root, "demo-site", "hollin-vale.site.json"), "--year", "2026",
  "--format", "json"]).toString());
const signed = (v, d) => `${v >= 0 ? "+" : ""}${v.toFixed(d)}`;
const want = cli.areas.map(a => [a.id, a.name, (100 * a.before_share).toFixed(1), (100 * a.after_share).toFixed(1),
  a.ratio.toFixed(3), signed(100 * a.share_margin, 1), a.ratio_margin === null ? "—" : signed(a.ratio_margin, 2), `±${(100 * a.share_error).toFixed(1)}`,
  (a.passes ? "passes" : "fails") + (a.near_threshold ? " (near threshold)" : "")]);
check(JSON.stringify(ruleRows) === JSON.stringify(want),
  `the rule-check table equals \`sunlot check\` on demo-site/hollin-vale.site.json (${want.length} areas)`);
}

// The window verdicts against the CLI's window checks on the same site file and step.
if (Object.keys(windowVerdicts).length) {
  const exe = ["release", "debug"].map(p => path.join(root, "target", p, "sunlot")).find(existsSync);
  const cli = JSON.parse(execFileSync(exe, ["check", path.join(root, "demo-site", "hollin-vale.site.json"), "--year", "2026",
    "--rule", "bre-br209-window-sky,bre-br209-window-sun", "--step-min", "10", "--quiet", "--format", "json"]).toString());
  for (const [key, rows] of Object.entries(windowVerdicts)) {
    const report = cli.find(r => key.endsWith(r.rule.id));
    const want = report.windows.map(w => [w.name, w.passes === null ? "not tested" : w.passes ? "passes" : "fails"]);
    check(rows.length > 0 && JSON.stringify(rows) === JSON.stringify(want),
      `${key}: the window verdicts equal \`sunlot check --rule ${report.rule.id}\` (${want.map(w => w[1]).join(", ")})`);
  }
}

// Served over HTTP on localhost as `./dev demo` serves it (Python's http.server): the pages work there too.
const port = 8700 + Math.floor(Math.random() * 200);
const server = spawn("python3", ["-m", "http.server", String(port), "--bind", "127.0.0.1", "--directory", root],
  { stdio: "ignore" });
try {
  const served = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  await served.route("**/*", r => (r.request().url().startsWith(`http://127.0.0.1:${port}/`) || r.request().url().startsWith("blob:")
    ? r.continue() : r.abort()));
  const page = await served.newPage();
  const errors = [];
  page.on("pageerror", e => errors.push(String(e)));
  for (let k = 0; k < 50; k++) {
    try { await page.goto(`http://127.0.0.1:${port}/demo-site/gardens.html`); break; } catch (e) { await page.waitForTimeout(100); }
  }
  await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 120000 });
  check(await page.evaluate(() => document.body.dataset.ready) === "yes" && errors.length === 0,
    `served on localhost, a page works as from disk (${errors.join(" | ") || "no errors"})`);
  await served.close();
} finally { server.kill(); }

check(blocked.length === 0, `no request leaves the disk (${blocked.join(", ") || "none"})`);
await browser.close();
if (failures.length) {
  console.error(`${failures.length} demo-site check(s) failed`);
  process.exit(1);
}
console.log("all demo-site checks passed");

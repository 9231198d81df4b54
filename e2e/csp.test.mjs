// The page (www/index.html) and every demo-site page under a strict Content-Security-Policy:
// served on 127.0.0.1 by a small Node server that sends
//   Content-Security-Policy: default-src 'self'; script-src 'self' 'wasm-unsafe-eval'
// with every response (the pages' own <meta> policy applies as well), and opened from disk (file://,
// where only the <meta> policy applies). Each page must start and draw with no policy violation
// (securitypolicyviolation events and console reports), and on www/index.html the year's map must run
// in its worker (served: the worker script file, which loads the workers' speed-built module; from
// disk: a Blob URL given that module). Run: node e2e/csp.test.mjs
// (after ./dev wasm).
import { launch } from "./chromium.mjs";
import { createServer } from "node:http";
import { readFile } from "node:fs/promises";
import { readdirSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const POLICY = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'";
const TYPES = { ".html": "text/html", ".js": "text/javascript", ".css": "text/css", ".json": "application/json",
                ".png": "image/png", ".svg": "image/svg+xml" };

const asked = [];
const server = createServer(async (req, res) => {
  const rel = decodeURIComponent(new URL(req.url, "http://x").pathname);
  asked.push(rel);
  const file = path.join(root, rel);
  if (!file.startsWith(root)) { res.writeHead(403).end(); return; }
  try {
    const body = await readFile(file);
    res.writeHead(200, { "Content-Type": TYPES[path.extname(file)] || "application/octet-stream",
                         "Content-Security-Policy": POLICY });
    res.end(body);
  } catch { res.writeHead(404, { "Content-Security-Policy": POLICY }).end("not found"); }
});
await new Promise(r => server.listen(0, "127.0.0.1", r));
const base = `http://127.0.0.1:${server.address().port}`;

const browser = await launch();
const context = await browser.newContext({ viewport: { width: 1366, height: 768 } });
await context.route("**/*", route => {
  const url = route.request().url();
  return url.startsWith(base) || url.startsWith("file:") || url.startsWith("blob:") || url.startsWith("data:")
    ? route.continue() : route.abort();
});
await context.addInitScript(() => {
  window.__violations = [];
  document.addEventListener("securitypolicyviolation",
    e => window.__violations.push(`${e.violatedDirective} blocked ${e.blockedURI || "inline"}`));
});

let passed = 0;
const failures = [];
const check = (ok, what) => { console.log(`${ok ? "ok  " : "FAIL"} ${what}`); if (ok) passed++; else failures.push(what); };

const pages = ["www/index.html", ...readdirSync(path.join(root, "demo-site")).filter(f => f.endsWith(".html"))
  .sort().map(f => `demo-site/${f}`)];
for (const [how, urlOf] of [["served with the strict policy", p => `${base}/${p}`],
                            ["from disk", p => pathToFileURL(path.join(root, p)).href]]) {
  for (const p of pages) {
    const page = await context.newPage();
    const reports = [];
    page.on("console", m => { if (/Content Security Policy|Refused to/i.test(m.text())) reports.push(m.text()); });
    page.on("pageerror", e => reports.push(String(e)));
    await page.goto(urlOf(p));
    await page.waitForFunction(() => document.body.dataset.ready, null, { timeout: 120000 });
    const ready = await page.evaluate(() => document.body.dataset.ready);
    if (p === "www/index.html") {
      // The year's map runs in the worker.
      await page.selectOption("#layer", "year-hours");
      await page.waitForFunction(() => /over the year: \d+ cells/.test(document.querySelector("#map-status").textContent),
        null, { timeout: 120000 }).catch(() => {});
      check(/over the year: \d+ cells/.test(await page.textContent("#map-status")),
        `${p} ${how}: the year's map ran in its worker (${(await page.textContent("#map-status")).slice(0, 80)})`);
      const ran = await page.evaluate(() => window.sunlot.workerRuns.last);
      if (how === "from disk") check(ran === "fast", `${p} ${how}: the worker ran the workers' module (${ran})`);
      else {
        check(ran === "served" && asked.includes("/www/build/sunlot-worker.js") && asked.includes("/www/build/sunlot-fast.js")
          && !asked.includes("/www/build/sunlot.bundle.js"),
          `${p} ${how}: the worker script loaded the workers' module, not the page's (${ran}; ${asked.filter(a => a.includes("/build/")).join(", ")})`);
      }
    }
    const violations = await page.evaluate(() => window.__violations);
    check(ready === "yes" && violations.length === 0 && reports.length === 0,
      `${p} ${how}: starts (${ready}) with no policy violation ${[...violations, ...reports].join("; ").slice(0, 400)}`);
    await page.close();
  }
}

await browser.close();
server.close();
console.log(`${passed} passed, ${failures.length} failed`);
process.exit(failures.length ? 1 : 0);

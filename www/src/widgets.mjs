// sunlot widgets: <sunlot-sky> (the sun-path diagram with a point's skyline), <sunlot-plan> (the site
// plan with its shadows at a moment, a map layer, pan and zoom, editing), <sunlot-map> (a map as a
// heat-map figure) and <sunlot-massing> (the 3-D view of the massing and its shadows, orbiting).
// They draw through the wasm module's canvas back end, the same drawing code as the PNG and SVG
// exports. Built by tools/bundle.py into www/build/sunlot-widgets.bundle.js with the
// module: one classic script that works from file://.
//
// Embedding: <sunlot-plan site-src="lot.site.json" date="2026-06-21" time="15:00" layer="sun-hours">
// (or the site file as <script type="application/json"> inside the element). Attributes: site-src,
// date, time, layer (plan, map: a kind of the module's mapKinds()), point ("x,y,height" in metres),
// projection and massing ("existing" or "withProposed") (sky), editable (plan).
// Events (bubbling CustomEvents): sunlot-drawn, sunlot-point {xM, yM}, sunlot-time {date, time},
// sunlot-view {xM, yM, widthM}, sunlot-select {kind, id}, sunlot-edit {site, action},
// sunlot-layer {kind}, sunlot-error {message}. CSS custom properties on the element or above it:
// --sunlot-ink, --sunlot-paper, --sunlot-proposed (colours) and --sunlot-figure-font (font family).
// In the namespace `sunlot` besides the module: download, runInWorker, computeMap, CancelledError,
// serveWorker, readSiteShared (the module's readSite, remembered for the last text), workerModule
// (loads the workers' speed-built module), startWorkersAhead(n) (keeps n workers booted for the
// next long calls) and workerRuns.last (which module the last worker ran).
import { download, readSiteShared } from "./figure.mjs";
import { computeMap, SunlotMap } from "./maps.mjs";
import { SunlotMassing } from "./massing.mjs";
import { SunlotPlan } from "./plan.mjs";
import { serveWorker } from "./serve.mjs";
import { SunlotSky } from "./sky.mjs";
import { CancelledError, runInWorker, startWorkersAhead, workerModule, workerRuns } from "./worker.mjs";

// Printing lays every figure out for the sheet (see printSize); the page's print button, the
// browser's print and print emulation all pass through one of these.
const forPrint = on => document.querySelectorAll("sunlot-sky, sunlot-plan, sunlot-map, sunlot-massing").forEach(el => el.printSize(on));
self.addEventListener("beforeprint", () => forPrint(true));
self.addEventListener("afterprint", () => forPrint(false));
if (self.matchMedia) self.matchMedia("print").addEventListener("change", e => forPrint(e.matches));
customElements.define("sunlot-sky", SunlotSky);
customElements.define("sunlot-map", SunlotMap);
customElements.define("sunlot-plan", SunlotPlan);
customElements.define("sunlot-massing", SunlotMassing);

export { CancelledError, computeMap, download, readSiteShared, runInWorker, serveWorker, startWorkersAhead, workerModule, workerRuns };

// Maps by kind (the core's table: the module's mapKinds and mapOfKind) computed in a worker, the
// mixin of a widget that shows one, and <sunlot-map>, a map as a heat-map figure.
import { mapCsv } from "./helpers.mjs";
import { FIGURE, SunlotFigure } from "./figure.mjs";
import { CancelledError, runInWorker } from "./worker.mjs";

/** The most workers one map is split over (each computes a part of it; more gains little). */
const MAX_WORKERS = 4;
const KINDS = new WeakMap();

/** How many workers compute the map `kind`: one per core up to MAX_WORKERS, when the kind splits. */
function workersFor(module, kind) {
  if (!KINDS.has(module)) KINDS.set(module, new Map(module.mapKinds().map(k => [k.id, k])));
  const info = KINDS.get(module).get(kind);
  const cores = (typeof navigator !== "undefined" && navigator.hardwareConcurrency) || 1;
  return info && info.parts ? Math.max(1, Math.min(MAX_WORKERS, cores)) : 1;
}

/**
 * Computes the map `kind` (one of the module's mapKinds) of `site` for `date` in Web Workers (a kind
 * with `parts` in parts — shares of its time steps or bands of rows, as the module decides — one
 * worker per core, joined exactly by the module's joinMapParts);
 * returns { promise, cancel } with promise → the module's KindMap (kind, title, label, unit, column,
 * caption, grid, values, rangeTop, stats, openValue) and `layer`, a PlanLayer of it;
 * `onProgress(fraction)` is called as it goes.
 */
export function computeMap(module, kind, site, date, onProgress) {
  const n = workersFor(module, kind);
  const done = new Array(n).fill(0);
  const progress = index => f => {
    done[index] = f;
    if (onProgress) onProgress(done.reduce((a, b) => a + b, 0) / n);
  };
  const jobs = n === 1 ? [runInWorker("mapOfKind", { kind, site, date }, onProgress)]
    : done.map((_, index) => runInWorker("mapOfKind", { kind, site, date, part: { index, of: n } }, progress(index)));
  const cancel = () => jobs.forEach(j => j.cancel());
  const whole = Promise.all(jobs.map(j => j.promise)).then(parts => {
    if (n === 1) return parts[0];
    const values = new Float64Array(parts.reduce((a, p) => a + p.values.length, 0));
    let at = 0;
    for (const p of parts) { values.set(p.values, at); at += p.values.length; }
    return module.joinMapParts({ kind, site, date, openValue: parts[0].openValue }, values);
  }, e => { cancel(); throw e; });
  const promise = whole.then(map => ({
    ...map,
    layer: new module.PlanLayer({ grid: map.grid, label: map.label, unit: map.unit, rangeLo: 0, rangeHi: map.rangeTop },
      map.values),
  }));
  return { promise, cancel };
}

/** Mixin: a widget that shows a map it computes for its `layer` attribute, or one it is given. */
export const MapHolder = Base => class extends Base {
  #map = null;
  #job = null;
  #kind = null;

  connectedCallback() {
    super.connectedCallback();
    this.ready.then(() => { if (this.hasAttribute("layer")) this.showLayer(this.getAttribute("layer")); });
  }
  siteChanged() { if (this.#kind) this.showLayer(this.#kind); }
  attributeChanged(name, value) { if (name === "layer") this.showLayer(value); }
  /** The map shown (from computeMap), or null. */
  get map() { return this.#map; }
  /** Shows a computed map (from computeMap), or none with null. */
  setMap(map) {
    this.#map = map;
    this.render();
  }
  /** Computes and shows the map `kind` for the widget's site and date ("" or "none": no map). */
  showLayer(kind) {
    this.#kind = kind && kind !== "none" ? kind : null;
    if (this.#job) { this.#job.cancel(); this.#job = null; }
    if (!this.#kind) { this.setMap(null); return Promise.resolve(null); }
    if (!this.module || !this.state.site) return Promise.resolve(null);
    const job = this.#job = computeMap(this.module, this.#kind, this.state.site, this.state.date);
    return job.promise.then(map => {
      if (this.#job !== job) return null;
      this.#job = null;
      this.setMap(map);
      this.dispatchEvent(new CustomEvent("sunlot-layer", { bubbles: true, detail: { kind: map.kind } }));
      return map;
    }).catch(e => { if (!(e instanceof CancelledError)) this.fail(`layer ${this.#kind}: ${e.message}`); return null; });
  }
  csv() { return this.#map ? mapCsv(this.#map.grid, this.#map.values, this.#map.column) : ""; }
  geojson() {
    const m = this.#map;
    if (!m) return "";
    return this.module.mapGeojson({ site: this.state.site, grid: m.grid, name: m.column, title: m.title,
      period: m.caption }, m.values);
  }
};

export class SunlotMap extends MapHolder(SunlotFigure) {
  constructor() { super(FIGURE); }
  input() {
    return { site: this.state.site, title: this.map.title, subtitle: this.map.caption, palette: this.palette() };
  }
  draw() {
    if (!this.map) return;
    this.map.layer.drawMap(this.canvas, this.input());
    this.canvas.setAttribute("aria-label", `Map of ${this.map.label} (${this.map.unit}), ${this.map.caption}`);
    this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "map", kind: this.map.kind } }));
  }
  svg(size = this.base) { return this.map ? this.map.layer.mapSvg(this.input(), size.width, size.height) : ""; }
}

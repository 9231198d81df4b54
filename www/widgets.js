// sunlot widgets: <sunlot-sky> (the sun-path diagram with a point's skyline), <sunlot-plan> (the site
// plan with its shadows at a moment, a map layer, pan and zoom, editing) and <sunlot-map> (a map as a
// heat-map figure). They draw through the wasm module's canvas back end, the same drawing code as the
// PNG and SVG exports. Classic script: works from file:// after build/sunlot.bundle.js.
//
// Embedding: <sunlot-plan site-src="lot.site.json" date="2026-06-21" time="15:00" layer="sun-hours">
// (or the site file as <script type="application/json"> inside the element). Attributes: site-src,
// date, time, layer (plan, map), point ("x,y,height" in metres), projection and massing ("existing" or
// "withProposed") (sky), editable (plan).
// Events (bubbling CustomEvents): sunlot-drawn, sunlot-point {xM, yM}, sunlot-time {date, time},
// sunlot-view {xM, yM, widthM}, sunlot-select {kind, id}, sunlot-edit {site, action},
// sunlot-layer {kind}, sunlot-error {message}. CSS custom properties on the element or above it:
// --sunlot-ink, --sunlot-paper, --sunlot-proposed (colours) and --sunlot-figure-font (font family).
(function () {
  "use strict";

  const FIGURE = { width: 960, height: 760 };
  /** The worker script beside this bundle (www/build/sunlot-worker.js), for pages served over http(s). */
  const BUNDLE = typeof document !== "undefined"
    && document.querySelector('script[src$="sunlot.bundle.js"], script[src$="sunlot-widgets.bundle.js"]');
  const WORKER_URL = BUNDLE ? new URL("sunlot-worker.js", BUNDLE.src).href : null;
  const SKY = { width: 900, height: 720 };
  // Shown narrower than its design size, a figure is laid out at most this many times the width it is
  // shown at (and never under MIN_FIGURE_WIDTH), so its 13-14 px text reads at 10 px or more on the
  // page; exports keep the design size.
  const READING_SCALE = 1.3, MIN_FIGURE_WIDTH = 640, PRINT_ASPECT = 0.84;

  /** The maps a plan or map widget can show: which call makes them and how they read. */
  const MAPS = {
    "sun-hours": { fn: "sunHoursMap", title: "Hours of direct sun", label: "hours of direct sun", unit: "h",
      column: "sun_hours", input: (site, date) => ({ site, date, cellM: 0.5, stepMin: 5 }),
      values: o => o.hours, top: o => o.openHours },
    "sun-hours-existing": { fn: "sunHoursMap", title: "Hours of direct sun, existing massing only",
      label: "hours of direct sun", unit: "h", column: "sun_hours",
      input: (site, date) => ({ site, date, cellM: 0.5, stepMin: 5, massing: "existing" }),
      values: o => o.hours, top: o => o.openHours },
    "lost": { fn: "compareMap", title: "Hours of direct sun lost to the proposal", label: "hours of sun lost",
      unit: "h", column: "lost_h", input: (site, date) => ({ site, date, cellM: 0.5, stepMin: 5 }),
      values: o => o.lostH, top: o => largest(o.lostH, 0.5) },
    "insolation": { fn: "insolationMap", title: "Clear-sky insolation on the ground", label: "insolation",
      unit: "kWh/m²", column: "insolation_kwh_m2", input: (site, date) => ({ site, date, cellM: 1, stepMin: 10 }),
      values: o => o.totalKwhM2, top: o => o.open.totalKwhM2 },
    "year-hours": { fn: "sunHoursMap", title: "Hours of direct sun over the year", label: "hours of direct sun",
      unit: "h", column: "sun_hours",
      input: (site, date) => ({ site, date: `${date.slice(0, 4)}-01-01`, to: `${date.slice(0, 4)}-12-31`,
        cellM: 1, stepMin: 15 }),
      values: o => o.hours, top: o => o.openHours },
    "envelope": { fn: "solarEnvelope", title: "Solar envelope of the lot (09:00–15:00)", label: "envelope height",
      unit: "m", column: "envelope_height_m",
      input: (site, date, module) => ({ site, lot: envelopeLot(module.readSite(site)), date, window: "09:00-15:00",
        stepMin: 15 }),
      values: o => o.heightM, top: o => largest(o.heightM, 1) },
  };

  function envelopeLot(info) {
    const lots = info.areas.filter(a => a.kind === "lot");
    const withProposal = lots.find(a => a.status === "proposed") || lots[0] || info.areas[0];
    if (!withProposal) throw new Error("envelope: the site has no lot");
    return withProposal.id;
  }

  /** The largest finite value (at least `floor`); no spread, so large maps do not overflow the stack. */
  function largest(values, floor) {
    let top = floor;
    for (const v of values) if (Number.isFinite(v) && v > top) top = v;
    return top;
  }

  const pad = n => String(n).padStart(2, "0");
  const minutesOf = t => { const [h, m] = t.split(":").map(Number); return h * 60 + m; };
  const timeOf = m => `${pad(Math.floor(m / 60))}:${pad(m % 60)}`;

  /** Hands `blob` to the browser as a download called `name`. */
  function download(name, blob) {
    const a = document.createElement("a");
    a.href = URL.createObjectURL(blob);
    a.download = name;
    document.body.appendChild(a);
    a.click();
    a.remove();
  }

  /** A CSS colour as #rrggbb (any CSS colour syntax), or undefined. One scratch context: figures ask
   * on every frame. */
  let scratch = null;
  function hex(css) {
    if (!css || !css.trim()) return undefined;
    const c = scratch || (scratch = document.createElement("canvas").getContext("2d"));
    c.fillStyle = "#000000";
    c.fillStyle = css.trim();
    return /^#[0-9a-f]{6}$/i.test(c.fillStyle) ? c.fillStyle : undefined;
  }

  class SunlotFigure extends HTMLElement {
    constructor(size) {
      super();
      this.base = size;          // the design size: exports are drawn at it
      this.size = { ...size };   // the size drawn on the page, from the width it is shown at
      this.wrap = document.createElement("div");
      this.wrap.className = "sunlot-frame";
      this.canvas = document.createElement("canvas");
      // Crisp on high-DPI screens: as many canvas pixels as device pixels, drawn at the figure's size.
      this.ratio = Math.min(Math.max(window.devicePixelRatio || 1, 1), 4);
      this.canvas.dataset.scale = String(this.ratio);
      this.sizeCanvases();
      this.canvas.setAttribute("role", "img");
      this.canvas.tabIndex = 0;
      // Sized by its container (set through the CSSOM, which a strict style-src allows).
      Object.assign(this.wrap.style, { position: "relative" });
      Object.assign(this.canvas.style, { display: "block", width: "100%", height: "auto" });
      this.wrap.appendChild(this.canvas);
      this.state = { site: null, date: "2026-03-21", time: "12:00" };
    }

    /** Sizes the canvas (and any canvas over it) to `this.size` at the device pixel ratio. */
    sizeCanvases() {
      this.canvas.width = Math.round(this.size.width * this.ratio);
      this.canvas.height = Math.round(this.size.height * this.ratio);
    }

    /** Fits the figure's drawing size to the width it is shown at; true if it changed. */
    fitSize() {
      if (this.printing) return false;
      const shown = this.wrap.getBoundingClientRect().width;
      if (!(shown > 0)) return false;
      const width = Math.round(Math.min(this.base.width, Math.max(MIN_FIGURE_WIDTH, shown * READING_SCALE)));
      if (width === this.size.width) return false;
      this.size = { width, height: Math.round(width * this.base.height / this.base.width) };
      this.sizeCanvases();
      return true;
    }

    /** For print (`on`), the figure is laid out at its smallest width, so its text prints large
     * enough wherever the sheet puts it (at least 122 mm wide gives 7 pt); afterwards, as shown. */
    printSize(on) {
      this.printing = on;
      if (on) {
        // A little flatter than on screen (the sheet is short); the figures lay out for any size.
        this.size = { width: MIN_FIGURE_WIDTH, height: Math.round(PRINT_ASPECT * MIN_FIGURE_WIDTH * this.base.height / this.base.width) };
        this.sizeCanvases();
      } else if (!this.fitSize()) return;
      this.render();
    }

    connectedCallback() {
      if (!this.wrap.isConnected) this.appendChild(this.wrap);
      this.fitSize();
      if (this.started) return;
      this.started = true;
      if (window.ResizeObserver) {
        new ResizeObserver(() => { if (this.fitSize()) this.render(); }).observe(this.wrap);
      }
      for (const a of ["date", "time"]) if (this.hasAttribute(a)) this.state[a] = this.getAttribute(a);
      this.ready = window.sunlot.then(m => { this.module = m; return m; });
      const inline = this.querySelector('script[type="application/json"]');
      if (inline) this.setSite(inline.textContent);
      else if (this.hasAttribute("site-src")) this.loadSite(this.getAttribute("site-src"));
    }

    static get observedAttributes() { return ["date", "time", "site-src", "layer", "point", "projection", "massing"]; }
    attributeChangedCallback(name, old, value) {
      if (!this.started || old === value) return;
      if (name === "site-src") this.loadSite(value);
      else if (name === "date" || name === "time") { this.state[name] = value; this.render(); }
      else this.attributeChanged(name, value);
    }
    attributeChanged() { this.render(); }

    /** Loads a site file or GeoJSON from a URL (pages served over HTTP; file:// pages refuse it). */
    async loadSite(url) {
      try {
        const r = await fetch(url);
        if (!r.ok) throw new Error(`${r.status} ${r.statusText}`);
        this.setSite(await r.text());
      } catch (e) { this.fail(`site-src ${url}: ${e.message}`); }
    }

    /** Uses a site (site-file or GeoJSON text), drawn at once unless `draw` is false; throws,
     * naming the feature, and keeps the old one. */
    async setSite(text, draw = true) {
      const m = await this.ready;
      try {
        const info = m.readSite(text);
        this.state.site = info.siteJson;
        this.info = info;
        this.siteChanged();
        if (draw) this.render();
      } catch (e) { this.fail(e.message); throw e; }
    }
    siteChanged() {}

    /** Sets the moment shown: `date` YYYY-MM-DD, `time` HH:MM local to the site. */
    setMoment(date, time) {
      this.state.date = date || this.state.date;
      this.state.time = time || this.state.time;
      this.render();
    }

    /** The page's colours and font for the figure, from the CSS custom properties. */
    palette() {
      const css = getComputedStyle(this);
      const font = css.getPropertyValue("--sunlot-figure-font").trim();
      if (font) this.canvas.dataset.font = font; else delete this.canvas.dataset.font;
      const p = {};
      for (const [key, prop] of [["ink", "--sunlot-ink"], ["paper", "--sunlot-paper"], ["proposed", "--sunlot-proposed"]]) {
        const v = hex(css.getPropertyValue(prop));
        if (v) p[key] = v;
      }
      return p;
    }

    fail(message) {
      this.dispatchEvent(new CustomEvent("sunlot-error", { bubbles: true, detail: { message } }));
    }

    /** Draws now if the module and a site are there; errors become sunlot-error events. */
    render() {
      if (!this.module || !this.state.site) return;
      try { this.draw(); } catch (e) { this.fail(e.message); }
    }

    /** The figure as a PNG blob, drawn at its design size whatever size the page shows it at. */
    png() {
      if (this.size.width === this.base.width) return new Promise(resolve => this.canvas.toBlob(resolve, "image/png"));
      const shown = this.size;
      this.size = { ...this.base };
      this.sizeCanvases();
      this.render();
      // toBlob copies the bitmap at once: the page's own size is back before anything is painted.
      const blob = new Promise(resolve => this.canvas.toBlob(resolve, "image/png"));
      this.size = shown;
      this.sizeCanvases();
      this.render();
      return blob;
    }

    /** The figure as a file of `kind`: "png" or "svg"; for maps also "csv" and "geojson" (the
     * cells); for the plan "geojson" (its shadows). */
    async blob(kind) {
      if (kind === "png") return this.png();
      const types = { svg: "image/svg+xml", csv: "text/csv", geojson: "application/geo+json" };
      if (!types[kind] || !this[kind]) throw new Error(`export: this figure has no ${kind}`);
      return new Blob([this[kind]()], { type: types[kind] });
    }

    /** Saves the figure as `kind` (see blob) to a file called `name`, as the browser downloads. */
    async save(kind, name) { download(name, await this.blob(kind)); }

    /** Figure pixels of a pointer event. */
    figurePx(e) {
      const r = this.canvas.getBoundingClientRect();
      return [(e.clientX - r.left) * (this.size.width / r.width), (e.clientY - r.top) * (this.size.height / r.height)];
    }
  }

  class SunlotSky extends SunlotFigure {
    constructor() {
      super(SKY);
      this.point = { xM: 14, yM: 41, zM: 1.5 };
      this.projection = "stereographic";
      this.massing = "withProposed";
    }
    connectedCallback() {
      if (this.hasAttribute("point")) this.setPointText(this.getAttribute("point"));
      if (this.hasAttribute("projection")) this.projection = this.getAttribute("projection");
      if (this.hasAttribute("massing")) this.massing = this.getAttribute("massing");
      super.connectedCallback();
    }
    attributeChanged(name, value) {
      if (name === "point") this.setPointText(value);
      if (name === "projection") this.projection = value;
      if (name === "massing") this.massing = value;
      this.render();
    }
    setPointText(text) {
      const v = String(text).split(",").map(s => Number(s.trim()));
      if (v.length === 3 && v.every(Number.isFinite) && v[2] >= 0) this.point = { xM: v[0], yM: v[1], zM: v[2] };
      else this.fail(`point: "${text}" is not x, y, height in metres (e.g. 14,41,1.5)`);
    }
    /** Sets the point whose skyline is drawn, plan metres. */
    setPoint(xM, yM, zM) { this.point = { xM, yM, zM }; this.render(); }
    setProjection(p) { this.projection = p; this.render(); }
    input() {
      const s = this.state;
      return { site: s.site, year: Number(s.date.slice(0, 4)), localTime: `${s.date}T${s.time}`,
        ...this.point, projection: this.projection, massing: this.massing, palette: this.palette() };
    }
    draw() {
      this.module.drawSkyChart(this.canvas, this.input());
      this.canvas.setAttribute("aria-label", `Sun-path diagram for ${this.state.date.slice(0, 4)} with the skyline ` +
        `seen from (${this.point.xM}, ${this.point.yM}) at ${this.point.zM} m`);
      this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "sky" } }));
    }
    svg(size = this.base) { return this.module.skyChartSvg(this.input(), size.width, size.height); }
  }

  /**
   * Computes one map (`kind` of MAPS) of `site` for `date` in a Web Worker; returns { promise, cancel }
   * with promise → { kind, result, values, layer: PlanLayer } and `onProgress(fraction)` called as it goes.
   */
  function computeMap(module, kind, site, date, onProgress) {
    const spec = MAPS[kind];
    if (!spec) throw new Error(`layer: "${kind}" is not one of ${Object.keys(MAPS).join(", ")}`);
    const input = spec.input(site, date, module);
    const job = runInWorker(spec.fn, input, onProgress);
    const promise = job.promise.then(result => {
      const values = spec.values(result);
      const layer = new module.PlanLayer({ grid: result.grid, label: spec.label, unit: spec.unit,
        rangeLo: 0, rangeHi: Math.max(spec.top(result), 1e-6) }, values);
      return { kind, spec, date, input, result, values, layer };
    });
    return { promise, cancel: job.cancel };
  }

  /** The map's cells as CSV: x_m, y_m (cell centres, plan metres) and the value, cells with a value. */
  function mapCsv(map) {
    const g = map.result.grid, v = map.values;
    const rows = [`x_m,y_m,${map.spec.column}`];
    for (let r = 0; r < g.rows; r++) {
      for (let c = 0; c < g.cols; c++) {
        const x = v[r * g.cols + c];
        if (Number.isFinite(x)) {
          rows.push(`${(g.originXM + (g.col0 + c + 0.5) * g.cellM).toFixed(3)},` +
            `${(g.originYM + (g.row0 + r + 0.5) * g.cellM).toFixed(3)},${x.toFixed(4)}`);
        }
      }
    }
    return rows.join("\n") + "\n";
  }

  /** The period (in the core's words) and the cells of a computed map. */
  function describeMap(map) {
    return `${map.result.period}, ${map.input.cellM || 1} m cells`;
  }

  /** Mixin: a widget that shows a map it computes for its `layer` attribute, or one it is given. */
  const MapHolder = Base => class extends Base {
    connectedCallback() {
      super.connectedCallback();
      this.ready.then(() => { if (this.hasAttribute("layer")) this.showLayer(this.getAttribute("layer")); });
    }
    siteChanged() { if (this.layerKind) this.showLayer(this.layerKind); }
    attributeChanged(name, value) { if (name === "layer") this.showLayer(value); }
    /** Shows a computed map (from computeMap), or none with null. */
    setMap(map) {
      this.map = map;
      this.render();
    }
    /** Computes and shows the map `kind` for the widget's site and date ("" or "none": no map). */
    showLayer(kind) {
      this.layerKind = kind && kind !== "none" ? kind : null;
      if (this.job) { this.job.cancel(); this.job = null; }
      if (!this.layerKind) { this.setMap(null); return Promise.resolve(null); }
      if (!this.module || !this.state.site) return Promise.resolve(null);
      this.job = computeMap(this.module, this.layerKind, this.state.site, this.state.date);
      const job = this.job;
      return job.promise.then(map => {
        if (this.job !== job) return null;
        this.job = null;
        this.setMap(map);
        this.dispatchEvent(new CustomEvent("sunlot-layer", { bubbles: true, detail: { kind: map.kind } }));
        return map;
      }).catch(e => { if (e.message !== "cancelled") this.fail(`layer ${this.layerKind}: ${e.message}`); return null; });
    }
    csv() { return this.map ? mapCsv(this.map) : ""; }
    geojson() {
      if (!this.map) return "";
      return this.module.mapGeojson({ site: this.state.site, grid: this.map.result.grid, name: this.map.spec.column,
        title: this.map.spec.title, period: describeMap(this.map) }, this.map.values);
    }
  };

  class SunlotMap extends MapHolder(SunlotFigure) {
    constructor() { super(FIGURE); }
    input() {
      return { site: this.state.site, title: this.map.spec.title, subtitle: describeMap(this.map), palette: this.palette() };
    }
    draw() {
      if (!this.map) return;
      this.map.layer.drawMap(this.canvas, this.input());
      this.canvas.setAttribute("aria-label", `Map of ${this.map.spec.label} (${this.map.spec.unit}), ${describeMap(this.map)}`);
      this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "map", kind: this.map.kind } }));
    }
    svg(size = this.base) { return this.map ? this.map.layer.mapSvg(this.input(), size.width, size.height) : ""; }
  }

  /** Even-odd point-in-polygon on [[x, y], …]. */
  function inside(pt, ring) {
    let hit = false;
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const [xi, yi] = ring[i], [xj, yj] = ring[j];
      if ((yi > pt[1]) !== (yj > pt[1]) && pt[0] < (xj - xi) * (pt[1] - yi) / (yj - yi) + xi) hit = !hit;
    }
    return hit;
  }
  function ringArea(r) {
    let a = 0;
    for (let i = 0, j = r.length - 1; i < r.length; j = i++) a += (r[j][0] + r[i][0]) * (r[j][1] - r[i][1]);
    return Math.abs(a / 2);
  }
  /** A feature's outline without a repeated closing vertex. */
  function openRing(outline) {
    const r = outline.map(p => [p[0], p[1]]);
    const [a, b] = [r[0], r[r.length - 1]];
    if (r.length > 1 && a[0] === b[0] && a[1] === b[1]) r.pop();
    return r;
  }
  const round = v => Math.round(v * 100) / 100;

  class SunlotPlan extends MapHolder(SunlotFigure) {
    constructor() {
      super(FIGURE);
      this.overlay = document.createElement("canvas");
      this.overlay.className = "sunlot-overlay";
      this.sizeCanvases();
      this.overlay.setAttribute("aria-hidden", "true");
      Object.assign(this.overlay.style, { position: "absolute", left: "0", top: "0", width: "100%", height: "100%",
        touchAction: "none", cursor: "crosshair" });
      this.wrap.appendChild(this.overlay);
      this.view = null;          // { xM, yM, widthM } or null: the whole site
      this.selected = null;      // { kind: "volumes" | "areas", id }
      this.vertex = -1;          // selected vertex of the selected feature
      this.drawing = null;       // { kind, points: [[x, y], …] } while drawing a new feature
      this.history = [];         // site texts before each edit (undo)
      this.future = [];          // site texts undone (redo)
      this.underlay = null;      // { image, placement, opacity }
      this.listen();
    }

    sizeCanvases() {
      super.sizeCanvases();
      if (!this.overlay) return;
      this.overlay.width = this.canvas.width;
      this.overlay.height = this.canvas.height;
    }

    siteChanged() {
      if (this.selected && !this.feature()) this.selected = null;
      super.siteChanged();
    }
    get editable() { return this.hasAttribute("editable"); }

    input() {
      const s = this.state;
      const o = { site: s.site, localTime: `${s.date}T${s.time}`, palette: this.palette() };
      if (this.view) o.view = this.view;
      return o;
    }

    draw() {
      const input = this.input();
      this.frame = this.map ? this.map.layer.drawPlan(this.canvas, input) : this.module.drawShadowPlan(this.canvas, input);
      if (this.underlay) this.drawUnderlay();
      this.drawOverlay();
      this.canvas.setAttribute("aria-label", `Site plan with shadows at ${input.localTime}` +
        (this.map ? ` over a map of ${this.map.spec.label}` : "") + ". Arrow keys pan, + and − zoom, 0 fits the site, " +
        "[ and ] step the time by 15 minutes.");
      this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "plan", localTime: input.localTime } }));
    }
    svg(size = this.base) {
      return this.map ? this.map.layer.planSvg(this.input(), size.width, size.height)
        : this.module.shadowPlanSvg(this.input(), size.width, size.height);
    }
    shadowsGeojson() { return this.module.shadowsGeojson(this.input()); }
    /** The plan's GeoJSON export is its shadows (the map layer's cells export from the map widget). */
    geojson() { return this.shadowsGeojson(); }

    // ---- plan ↔ figure pixels, view -------------------------------------------------------------
    toPlan(px, py) { const f = this.frame; return [f.xAtLeftM + px / f.pxPerM, f.yAtTopM - py / f.pxPerM]; }
    toPx(x, y) { const f = this.frame; return [(x - f.xAtLeftM) * f.pxPerM, (f.yAtTopM - y) * f.pxPerM]; }
    currentView() {
      if (this.view) return { ...this.view };
      const f = this.frame, [bx, by, bw, bh] = f.box;
      const [xM, yM] = this.toPlan(bx + bw / 2, by + bh / 2);
      return { xM, yM, widthM: bw / f.pxPerM };
    }
    setView(view) {
      this.view = view;
      this.render();
      this.dispatchEvent(new CustomEvent("sunlot-view", { bubbles: true, detail: view ? { ...view } : null }));
    }
    /** Zooms by `factor` (> 1 closer) keeping the plan point under figure pixel (px, py) in place. */
    zoom(factor, px, py) {
      if (!this.frame) return;
      const v = this.currentView(), [bx, by, bw, bh] = this.frame.box;
      const [cx, cy] = px === undefined ? [bx + bw / 2, by + bh / 2] : [px, py];
      const [x, y] = this.toPlan(cx, cy);
      const widthM = Math.min(Math.max(v.widthM / factor, 2), 2000);
      const k = widthM / v.widthM;
      this.setView({ xM: x + (v.xM - x) * k, yM: y + (v.yM - y) * k, widthM });
    }
    pan(dxPx, dyPx) {
      if (!this.frame) return;
      const v = this.currentView();
      this.setView({ xM: v.xM - dxPx / this.frame.pxPerM, yM: v.yM + dyPx / this.frame.pxPerM, widthM: v.widthM });
    }
    fit() { this.setView(null); }

    // ---- underlay -------------------------------------------------------------------------------
    /** Puts `image` (an HTMLImageElement or ImageBitmap) under the plan, placed by `placement`
     * (from underlayPlacement); null removes it. Drawn on screen and in the PNG, not in the SVG. */
    setUnderlay(image, placement, opacity = 0.45) {
      this.underlay = image ? { image, placement, opacity } : null;
      this.render();
    }
    drawUnderlay() {
      const ctx = this.canvas.getContext("2d"), u = this.underlay, p = u.placement, f = this.frame, s = f.pxPerM;
      const r = this.ratio;
      ctx.save();
      ctx.setTransform(r, 0, 0, r, 0, 0);
      ctx.beginPath();
      ctx.rect(...f.box);
      ctx.clip();
      ctx.globalAlpha = u.opacity;
      ctx.globalCompositeOperation = "multiply";
      // Image pixels → plan metres (placement) → figure pixels (the frame) → canvas pixels (ratio).
      ctx.setTransform(r * s * p.a, -r * s * p.b, r * s * p.c, -r * s * p.d,
        r * s * (p.e - f.xAtLeftM), r * s * (f.yAtTopM - p.f));
      ctx.drawImage(u.image, 0, 0);
      ctx.restore();
    }

    // ---- editing --------------------------------------------------------------------------------
    siteObject() { return JSON.parse(this.state.site); }
    feature(site = this.siteObject()) {
      if (!this.selected) return null;
      return (site[this.selected.kind] || []).find(f => f.id === this.selected.id) || null;
    }
    /** Applies `change(site)` to a copy of the site; keeps it only if it reads back (else an error
     * event and nothing changes). Records it for undo and fires sunlot-edit. */
    edit(action, change) {
      const before = this.state.site;
      const site = this.siteObject();
      change(site);
      let info;
      try { info = this.module.readSite(JSON.stringify(site)); } catch (e) {
        this.fail(`${action}: ${e.message} — the site is unchanged.`);
        return false;
      }
      this.history.push(before);
      if (this.history.length > 200) this.history.shift();
      this.future = [];
      this.commit(info, action);
      return true;
    }
    commit(info, action) {
      this.state.site = info.siteJson;
      this.info = info;
      this.siteChanged();
      this.render();
      this.dispatchEvent(new CustomEvent("sunlot-edit", { bubbles: true, detail: { site: info.siteJson, action } }));
    }
    undo() { this.step(this.history, this.future, "undo"); }
    redo() { this.step(this.future, this.history, "redo"); }
    step(from, to, action) {
      if (!from.length) return;
      const text = from.pop();
      to.push(this.state.site);
      this.commit(this.module.readSite(text), action);
    }
    /** Forgets the edits to undo and redo (a new site was opened). */
    clearHistory() { this.history = []; this.future = []; }
    get canUndo() { return this.history.length > 0; }
    get canRedo() { return this.future.length > 0; }

    select(kind, id) {
      this.selected = kind ? { kind, id } : null;
      this.vertex = -1;
      this.drawOverlay();
      this.dispatchEvent(new CustomEvent("sunlot-select", { bubbles: true, detail: this.selected ? { ...this.selected } : null }));
    }
    /** Sets fields of the selected feature, e.g. { top_m: 12, status: "proposed" }. */
    setFields(fields) {
      if (!this.selected) return false;
      const id = fields.id !== undefined && fields.id !== this.selected.id ? fields.id : null;
      const ok = this.edit("set fields", site => { Object.assign(this.feature(site) || {}, fields); });
      if (ok && id) this.selected = { kind: this.selected.kind, id };
      return ok;
    }
    deleteSelected() {
      if (!this.selected) return false;
      const { kind, id } = this.selected;
      if (this.vertex >= 0) {
        const v = this.vertex;
        const ok = this.edit("delete vertex", site => {
          const f = this.feature(site), r = openRing(f.outline);
          if (r.length <= 3) throw new Error("a footprint needs three vertices");
          r.splice(v, 1);
          f.outline = r;
        });
        this.vertex = -1;
        return ok;
      }
      const ok = this.edit(`delete ${id}`, site => { site[kind] = site[kind].filter(f => f.id !== id); });
      if (ok) this.select(null);
      return ok;
    }
    /** Starts drawing a new volume or area: clicks add vertices, Enter, a double-click or a click on
     * the first vertex finishes, Escape cancels. */
    startDrawing(kind) {
      this.drawing = { kind, points: [] };
      this.drawOverlay();
    }
    finishDrawing() {
      const d = this.drawing;
      this.drawing = null;
      if (!d || d.points.length < 3) { this.drawOverlay(); return false; }
      const site = this.siteObject();
      const taken = new Set([...(site.volumes || []), ...(site.areas || [])].map(f => f.id));
      let n = 1;
      const stem = d.kind === "volumes" ? "volume" : "area";
      while (taken.has(`${stem}-${n}`)) n++;
      const id = `${stem}-${n}`;
      const outline = d.points.map(p => [round(p[0]), round(p[1])]);
      const ok = this.edit(`draw ${id}`, s => {
        if (d.kind === "volumes") {
          (s.volumes = s.volumes || []).push({ id, status: "proposed", base_m: 0, top_m: 9, outline });
        } else {
          (s.areas = s.areas || []).push({ id, name: `Area ${n}`, kind: "garden", status: "existing", outline });
        }
      });
      if (ok) this.select(d.kind, id); else this.drawOverlay();
      return ok;
    }

    /** The feature under a plan point: volumes before areas, the smallest first. */
    hit(pt) {
      const site = this.siteObject();
      for (const kind of ["volumes", "areas"]) {
        const found = (site[kind] || []).map(f => ({ f, r: openRing(f.outline) })).filter(o => inside(pt, o.r))
          .sort((a, b) => ringArea(a.r) - ringArea(b.r));
        if (found.length) return { kind, id: found[0].f.id };
      }
      return null;
    }
    /** Handles of the selected feature in figure pixels: vertices, then edge midpoints. */
    handles() {
      const f = this.feature();
      if (!f || !this.frame) return { vertices: [], mids: [] };
      const r = openRing(f.outline).map(p => this.toPx(p[0], p[1]));
      return { vertices: r, mids: r.map((p, i) => { const q = r[(i + 1) % r.length]; return [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2]; }) };
    }

    drawOverlay() {
      const ctx = this.overlay.getContext("2d"), r = this.ratio;
      ctx.setTransform(1, 0, 0, 1, 0, 0);
      ctx.clearRect(0, 0, this.overlay.width, this.overlay.height);
      if (!this.frame) return;
      ctx.setTransform(r, 0, 0, r, 0, 0);
      const accent = getComputedStyle(this).getPropertyValue("--sunlot-edit").trim() || "#0a5fd0";
      ctx.strokeStyle = accent;
      ctx.fillStyle = "#ffffff";
      ctx.lineWidth = 1.5;
      if (this.editable && this.selected) {
        const h = this.handles();
        if (h.vertices.length) {
          ctx.setLineDash([5, 4]);
          ctx.beginPath();
          h.vertices.forEach((p, i) => (i ? ctx.lineTo(...p) : ctx.moveTo(...p)));
          ctx.closePath();
          ctx.stroke();
          ctx.setLineDash([]);
        }
        h.mids.forEach(p => { ctx.beginPath(); ctx.arc(p[0], p[1], 3.5, 0, 2 * Math.PI); ctx.fill(); ctx.stroke(); });
        h.vertices.forEach((p, i) => {
          ctx.fillStyle = i === this.vertex ? accent : "#ffffff";
          ctx.fillRect(p[0] - 5, p[1] - 5, 10, 10);
          ctx.strokeRect(p[0] - 5, p[1] - 5, 10, 10);
        });
      }
      if (this.drawing) {
        const pts = this.drawing.points.map(p => this.toPx(p[0], p[1]));
        if (this.hoverPx) pts.push(this.hoverPx);
        ctx.beginPath();
        pts.forEach((p, i) => (i ? ctx.lineTo(...p) : ctx.moveTo(...p)));
        ctx.stroke();
        ctx.fillStyle = accent;
        pts.forEach(p => ctx.fillRect(p[0] - 3, p[1] - 3, 6, 6));
      }
    }

    // ---- pointer and keyboard -------------------------------------------------------------------
    listen() {
      const target = this.overlay;
      let press = null;
      const near = (a, b, d = 8) => Math.hypot(a[0] - b[0], a[1] - b[1]) <= d;
      // Keep the keyboard on the plan: a press on the overlay would otherwise move focus to the page.
      target.addEventListener("mousedown", e => { e.preventDefault(); this.canvas.focus({ preventScroll: true }); });
      target.addEventListener("pointerdown", e => {
        if (!this.frame) return;
        this.canvas.focus({ preventScroll: true });
        const px = this.figurePx(e);
        press = { start: px, last: px, moved: false, drag: null };
        if (this.editable && this.selected && !this.drawing) {
          const h = this.handles();
          const v = h.vertices.findIndex(p => near(p, px));
          const m = h.mids.findIndex(p => near(p, px));
          if (v >= 0) press.drag = { vertex: v, before: this.state.site };
          else if (m >= 0) press.drag = { insert: m + 1, before: this.state.site };
        }
        target.setPointerCapture(e.pointerId);
      });
      target.addEventListener("pointermove", e => {
        const px = this.figurePx(e);
        if (this.drawing) { this.hoverPx = px; this.drawOverlay(); }
        if (!press) return;
        if (!near(px, press.start, 4)) press.moved = true;
        if (!press.moved) return;
        if (press.drag) this.dragVertex(press.drag, this.toPlan(...px));
        else if (!this.drawing) { this.pan(px[0] - press.last[0], px[1] - press.last[1]); }
        press.last = px;
      });
      target.addEventListener("pointerup", e => {
        const p = press;
        press = null;
        if (!p) return;
        if (p.drag && p.moved) { this.endDrag(p.drag); return; }
        if (p.moved) return;
        const px = this.figurePx(e), pt = this.toPlan(...px);
        if (this.drawing) {
          const first = this.drawing.points[0];
          if (first && this.drawing.points.length >= 3 && near(this.toPx(...first), px)) this.finishDrawing();
          else { this.drawing.points.push(pt); this.drawOverlay(); }
          return;
        }
        if (this.editable) {
          if (p.drag && p.drag.vertex !== undefined) { this.vertex = p.drag.vertex; this.drawOverlay(); return; }
          const h = this.hit(pt);
          this.select(h && h.kind, h && h.id);
          // A click that picks a volume to edit leaves the sky point where it was: a point inside a
          // building has no sky, and the planner asked to edit, not to look.
          if (h && h.kind === "volumes") return;
        }
        this.dispatchEvent(new CustomEvent("sunlot-point", { bubbles: true, detail: { xM: pt[0], yM: pt[1] } }));
      });
      target.addEventListener("dblclick", e => { if (this.drawing) { e.preventDefault(); this.drawing.points.pop(); this.finishDrawing(); } });
      target.addEventListener("wheel", e => {
        e.preventDefault();
        this.zoom(e.deltaY < 0 ? 1.25 : 1 / 1.25, ...this.figurePx(e));
      }, { passive: false });
      this.canvas.addEventListener("keydown", e => this.key(e));
    }

    dragVertex(drag, pt) {
      const site = JSON.parse(drag.before);
      const f = this.feature(site);
      if (!f) return;
      const r = openRing(f.outline);
      const p = [round(pt[0]), round(pt[1])];
      if (drag.insert !== undefined) r.splice(drag.insert, 0, p); else r[drag.vertex] = p;
      f.outline = r;
      try {
        const info = this.module.readSite(JSON.stringify(site));
        this.state.site = info.siteJson;
        this.info = info;
        this.render();
        drag.ok = true;
      } catch (e) { drag.ok = false; }
    }
    endDrag(drag) {
      const after = this.state.site;
      if (!drag.ok) {
        this.state.site = drag.before;
        this.info = this.module.readSite(drag.before);
        this.render();
        this.fail("move vertex: that shape does not read as a footprint — the site is unchanged.");
        return;
      }
      this.history.push(drag.before);
      this.future = [];
      this.vertex = drag.insert !== undefined ? drag.insert : drag.vertex;
      this.commit(this.module.readSite(after), drag.insert !== undefined ? "add vertex" : "move vertex");
    }

    key(e) {
      const k = e.key, mod = e.ctrlKey || e.metaKey;
      const step = 40;
      const acts = {
        ArrowLeft: () => this.pan(step, 0), ArrowRight: () => this.pan(-step, 0),
        ArrowUp: () => this.pan(0, step), ArrowDown: () => this.pan(0, -step),
        "+": () => this.zoom(1.25), "=": () => this.zoom(1.25), "-": () => this.zoom(1 / 1.25), "0": () => this.fit(),
        "[": () => this.shiftTime(-15), "]": () => this.shiftTime(15),
        Escape: () => { if (this.drawing) { this.drawing = null; this.drawOverlay(); } else this.select(null); },
        Enter: () => { if (this.drawing) this.finishDrawing(); },
        Delete: () => this.editable && this.deleteSelected(), Backspace: () => this.editable && this.deleteSelected(),
      };
      if (mod && (k === "z" || k === "Z")) { e.preventDefault(); if (e.shiftKey) this.redo(); else this.undo(); return; }
      if (mod && (k === "y" || k === "Y")) { e.preventDefault(); this.redo(); return; }
      if (mod || !acts[k]) return;
      e.preventDefault();
      acts[k]();
    }
    shiftTime(minutes) {
      const t = (minutesOf(this.state.time) + minutes + 1440) % 1440;
      this.state.time = timeOf(t);
      this.render();
      this.dispatchEvent(new CustomEvent("sunlot-time", { bubbles: true, detail: { date: this.state.date, time: this.state.time } }));
    }
  }

  /**
   * Runs one long call (`sunHoursMap`, `compareMap`, `insolationMap`, `solarEnvelope`) in a Web
   * Worker made from a Blob URL, so the page stays responsive. Returns { promise, cancel }:
   * `onProgress(fraction)` is called as the work goes; `cancel()` stops the worker at once and
   * rejects with "cancelled".
   */
  function runInWorker(fn, input, onProgress) {
    const source = `const ready = (${self.sunlotBoot.toString()})();
      self.onmessage = async e => {
        const m = await ready;
        try {
          const out = m[e.data.fn](e.data.input, f => { self.postMessage({ progress: f }); return true; });
          self.postMessage({ result: out });
        } catch (err) { self.postMessage({ error: String(err && err.message ? err.message : err) }); }
      };`;
    // From disk (file://) a worker can only be made from a Blob URL; served over http(s), the worker is
    // the script file beside the bundle (same origin), so a strict Content-Security-Policy without
    // blob: in worker-src (script-src 'self') allows it.
    const served = location.protocol !== "file:" && WORKER_URL && new URL(WORKER_URL).origin === location.origin;
    const url = served ? WORKER_URL : URL.createObjectURL(new Blob([source], { type: "text/javascript" }));
    const worker = new Worker(url);
    let reject, done = false;
    const promise = new Promise((res, rej) => {
      reject = rej;
      worker.onmessage = e => {
        if (e.data.progress !== undefined) { if (onProgress) onProgress(e.data.progress); return; }
        done = true;
        worker.terminate();
        if (!served) URL.revokeObjectURL(url);
        if (e.data.error !== undefined) rej(new Error(e.data.error)); else res(e.data.result);
      };
      worker.onerror = e => { done = true; worker.terminate(); rej(new Error(e.message || "worker failed")); };
    });
    worker.postMessage({ fn, input });
    return { promise, cancel() { if (done) return; done = true; worker.terminate(); if (!served) URL.revokeObjectURL(url); reject(new Error("cancelled")); } };
  }

  self.sunlotRunInWorker = runInWorker;
  self.sunlotDownload = download;
  // Printing lays every figure out for the sheet (see printSize); the page's print button, the
  // browser's print and print emulation all pass through one of these.
  const forPrint = on => document.querySelectorAll("sunlot-sky, sunlot-plan, sunlot-map").forEach(el => el.printSize(on));
  self.addEventListener("beforeprint", () => forPrint(true));
  self.addEventListener("afterprint", () => forPrint(false));
  if (self.matchMedia) self.matchMedia("print").addEventListener("change", e => forPrint(e.matches));
  self.sunlotComputeMap = computeMap;
  self.sunlotMaps = MAPS;
  customElements.define("sunlot-sky", SunlotSky);
  customElements.define("sunlot-map", SunlotMap);
  customElements.define("sunlot-plan", SunlotPlan);
})();

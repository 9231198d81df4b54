// The base of every sunlot widget: a canvas sized to the width it is shown at (crisp at the device
// pixel ratio), the site and moment it shows, the page's colours from CSS custom properties, errors as
// sunlot-error events, and exports (PNG at the design size, SVG, CSV, GeoJSON) through the module's
// drawing code.
import { fittedSize, printedSize } from "./helpers.mjs";

/** Design sizes, pixels: exports are drawn at them. */
export const FIGURE = { width: 960, height: 760 };
export const SKY = { width: 900, height: 720 };
export const MASSING = { width: 960, height: 720 };

/** Hands `blob` to the browser as a download called `name`. */
export function download(name, blob) {
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

/** `module.readSite(text)`, remembered for the last text read: the page and its widgets read the same
 * site text one after another (a read is a parse and a check in wasm). The result is shared by every
 * caller: read it, never change it. Errors are thrown, not remembered. */
let lastRead = null;
export function readSiteShared(module, text) {
  if (lastRead && lastRead.module === module && lastRead.text === text) return lastRead.info;
  const info = module.readSite(text);
  lastRead = { module, text, info };
  return info;
}

export class SunlotFigure extends HTMLElement {
  #started = false;
  #printing = false;

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
    if (this.#printing) return false;
    const size = fittedSize(this.base, this.wrap.getBoundingClientRect().width);
    if (!size || size.width === this.size.width) return false;
    this.size = size;
    this.sizeCanvases();
    return true;
  }

  /** For print (`on`), the figure is laid out at its printed size (see printedSize); afterwards, as
   * shown. */
  printSize(on) {
    this.#printing = on;
    if (on) {
      this.size = printedSize(this.base);
      this.sizeCanvases();
    } else if (!this.fitSize()) return;
    this.render();
  }

  connectedCallback() {
    if (!this.wrap.isConnected) this.appendChild(this.wrap);
    this.fitSize();
    if (this.#started) return;
    this.#started = true;
    if (window.ResizeObserver) {
      new ResizeObserver(() => { if (this.fitSize()) this.render(); }).observe(this.wrap);
    }
    for (const a of ["date", "time"]) if (this.hasAttribute(a)) this.state[a] = this.getAttribute(a);
    this.ready = self.sunlot.ready.then(m => { this.module = m; return m; });
    const inline = this.querySelector('script[type="application/json"]');
    if (inline) this.setSite(inline.textContent);
    else if (this.hasAttribute("site-src")) this.loadSite(this.getAttribute("site-src"));
  }

  static get observedAttributes() { return ["date", "time", "site-src", "layer", "point", "projection", "massing"]; }
  attributeChangedCallback(name, old, value) {
    if (!this.#started || old === value) return;
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
      const info = readSiteShared(m, text);
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

// <sunlot-massing>: the 3-D view of the site's massing at a moment — faces shaded by the sun, the
// shadows exact on the ground, roofs and walls — drawn by the module without a GPU. Drag or use the
// arrow keys to walk round it and look higher or lower; [ and ] step the time by 15 minutes.
// Attributes: site-src, date, time, view-from (degrees clockwise from the plan's north the viewer
// stands at, default 210), view-elevation (degrees above the horizon, 5–90, default 35),
// perspective (metres from the site's centre; absent: a parallel view), envelope-lot (an area id, or
// "auto" for the proposal's lot: its solar envelope on the date shown, 09:00–15:00, as translucent steps).
// Events: sunlot-drawn, sunlot-orbit {fromDeg, elevationDeg}, sunlot-time {date, time}, sunlot-error.
import { minutesOf, timeOf } from "./helpers.mjs";
import { MASSING, SunlotFigure } from "./figure.mjs";

const clamp = (v, lo, hi) => Math.min(Math.max(v, lo), hi);

export class SunlotMassing extends SunlotFigure {
  #viewer = null;
  #fromDeg = 210;
  #elevationDeg = 35;
  #perspectiveM = null;
  #frame = 0;
  #envelopeLot = null;   // an area id, "" for the site's subject lot, or null
  #envelopeFor = null;   // what the viewer's envelope was made for: "lot/date"

  constructor() {
    super(MASSING);
    this.canvas.style.cursor = "grab";
    this.canvas.style.touchAction = "none";
    this.#listen();
  }

  static get observedAttributes() {
    return [...super.observedAttributes, "view-from", "view-elevation", "perspective", "envelope-lot"];
  }
  connectedCallback() {
    for (const name of ["view-from", "view-elevation", "perspective", "envelope-lot"]) {
      if (this.hasAttribute(name)) this.#attribute(name, this.getAttribute(name));
    }
    super.connectedCallback();
  }
  attributeChanged(name, value) {
    this.#attribute(name, value);
    this.render();
  }
  #attribute(name, value) {
    if (name === "envelope-lot") { this.#envelopeLot = value === null ? null : value === "auto" ? "" : value; return; }
    const v = value === null || value === "" ? null : Number(value);
    if (v !== null && !Number.isFinite(v)) { this.fail(`${name}: "${value}" is not a number`); return; }
    if (name === "view-from" && v !== null) this.#fromDeg = v;
    if (name === "view-elevation" && v !== null) this.#elevationDeg = clamp(v, 5, 90);
    if (name === "perspective") this.#perspectiveM = v;
  }

  siteChanged() {
    if (this.#viewer) this.#viewer.free();
    this.#viewer = null;
    this.#envelopeFor = null;
    try { this.#viewer = new this.module.MassingViewer(this.state.site); } catch (e) { this.fail(e.message); }
  }

  /** Shows the solar envelope of lot `lot` (an area id, "" for the proposal's lot) on the date
   * shown, or none with null. */
  setEnvelopeLot(lot) {
    this.#envelopeLot = lot;
    this.render();
  }
  /** The lot whose envelope is shown ("" the proposal's), or null. */
  get envelopeLot() { return this.#envelopeLot; }

  /** The viewer: { fromDeg, elevationDeg, perspectiveM (null: parallel) }. */
  get view() { return { fromDeg: this.#fromDeg, elevationDeg: this.#elevationDeg, perspectiveM: this.#perspectiveM }; }
  /** Moves the viewer (any of fromDeg, elevationDeg 5–90, perspectiveM or null for parallel). */
  setView({ fromDeg = this.#fromDeg, elevationDeg = this.#elevationDeg, perspectiveM = this.#perspectiveM } = {}) {
    this.#fromDeg = ((fromDeg % 360) + 360) % 360;
    this.#elevationDeg = clamp(elevationDeg, 5, 90);
    this.#perspectiveM = perspectiveM;
    this.#soon();
    this.dispatchEvent(new CustomEvent("sunlot-orbit", { bubbles: true,
      detail: { fromDeg: this.#fromDeg, elevationDeg: this.#elevationDeg } }));
  }
  /** Faces the view draws after the visibility splits. */
  get fragments() { return this.#viewer ? this.#viewer.fragments : 0; }

  input() {
    const s = this.state;
    const o = { localTime: `${s.date}T${s.time}`, fromDeg: this.#fromDeg, elevationDeg: this.#elevationDeg,
      palette: this.palette() };
    if (this.#perspectiveM !== null) o.perspectiveM = this.#perspectiveM;
    return o;
  }
  /** Makes the viewer's envelope the one asked for, for the date shown. */
  #envelope() {
    const want = this.#envelopeLot === null ? "" : `${this.#envelopeLot}/${this.state.date}`;
    if (want === (this.#envelopeFor || "")) return;
    this.#envelopeFor = want;
    this.#viewer.setEnvelope(this.#envelopeLot, this.state.date);
  }
  draw() {
    if (!this.#viewer) return;
    this.#envelope();
    this.#viewer.draw(this.canvas, this.input());
    this.canvas.setAttribute("aria-label", `3-D view of the massing and its shadows at ${this.state.date} ` +
      `${this.state.time}, seen from ${Math.round(this.#fromDeg)}° at ${Math.round(this.#elevationDeg)}° above the ` +
      "horizon. Arrow keys walk round and look higher or lower; [ and ] step the time by 15 minutes.");
    this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "massing" } }));
  }
  svg(size = this.base) {
    if (!this.#viewer) return "";
    this.#envelope();
    return this.#viewer.svg(this.input(), size.width, size.height);
  }

  /** Draws at the next animation frame (a drag moves many times a frame). */
  #soon() {
    if (this.#frame) return;
    this.#frame = requestAnimationFrame(() => { this.#frame = 0; this.render(); });
  }

  #listen() {
    let drag = null;
    this.canvas.addEventListener("pointerdown", e => {
      drag = { x: e.clientX, y: e.clientY };
      this.canvas.setPointerCapture(e.pointerId);
      this.canvas.style.cursor = "grabbing";
    });
    this.canvas.addEventListener("pointermove", e => {
      if (!drag) return;
      const [dx, dy] = [e.clientX - drag.x, e.clientY - drag.y];
      drag = { x: e.clientX, y: e.clientY };
      this.setView({ fromDeg: this.#fromDeg - 0.4 * dx, elevationDeg: this.#elevationDeg + 0.3 * dy });
    });
    const end = () => { drag = null; this.canvas.style.cursor = "grab"; };
    this.canvas.addEventListener("pointerup", end);
    this.canvas.addEventListener("pointercancel", end);
    this.canvas.addEventListener("keydown", e => {
      const acts = {
        ArrowLeft: () => this.setView({ fromDeg: this.#fromDeg + 10 }),
        ArrowRight: () => this.setView({ fromDeg: this.#fromDeg - 10 }),
        ArrowUp: () => this.setView({ elevationDeg: this.#elevationDeg + 5 }),
        ArrowDown: () => this.setView({ elevationDeg: this.#elevationDeg - 5 }),
        "[": () => this.shiftTime(-15), "]": () => this.shiftTime(15),
      };
      if (e.ctrlKey || e.metaKey || !acts[e.key]) return;
      e.preventDefault();
      acts[e.key]();
    });
  }

  /** Moves the time shown by `minutes` (wrapping at midnight); fires sunlot-time. */
  shiftTime(minutes) {
    this.state.time = timeOf((minutesOf(this.state.time) + minutes + 1440) % 1440);
    this.render();
    this.dispatchEvent(new CustomEvent("sunlot-time", { bubbles: true, detail: { date: this.state.date, time: this.state.time } }));
  }
}

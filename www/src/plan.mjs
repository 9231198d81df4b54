// <sunlot-plan>: the site plan with its shadows at a moment, a map layer under them, pan and zoom
// (pointer, wheel, keyboard), an image underlay, and editing (plan_edit.mjs).
import { minutesOf, timeOf } from "./helpers.mjs";
import { FIGURE, SunlotFigure } from "./figure.mjs";
import { MapHolder } from "./maps.mjs";
import { PlanEditing } from "./plan_edit.mjs";

export class SunlotPlan extends PlanEditing(MapHolder(SunlotFigure)) {
  #view = null;      // { xM, yM, widthM } or null: the whole site
  #underlay = null;  // { image, placement, opacity }

  constructor() {
    super(FIGURE);
    this.overlay = document.createElement("canvas");
    this.overlay.className = "sunlot-overlay";
    this.sizeCanvases();
    this.overlay.setAttribute("aria-hidden", "true");
    Object.assign(this.overlay.style, { position: "absolute", left: "0", top: "0", width: "100%", height: "100%",
      touchAction: "none", cursor: "crosshair" });
    this.wrap.appendChild(this.overlay);
    this.#listen();
  }

  sizeCanvases() {
    super.sizeCanvases();
    if (!this.overlay) return;
    this.overlay.width = this.canvas.width;
    this.overlay.height = this.canvas.height;
  }

  get editable() { return this.hasAttribute("editable"); }

  input() {
    const s = this.state;
    const o = { site: s.site, localTime: `${s.date}T${s.time}`, palette: this.palette() };
    if (this.#view) o.view = this.#view;
    return o;
  }

  draw() {
    const input = this.input();
    this.frame = this.map ? this.map.layer.drawPlan(this.canvas, input) : this.module.drawShadowPlan(this.canvas, input);
    if (this.#underlay) this.#drawUnderlay();
    this.drawOverlay();
    this.canvas.setAttribute("aria-label", `Site plan with shadows at ${input.localTime}` +
      (this.map ? ` over a map of ${this.map.label}` : "") + ". Arrow keys pan, + and − zoom, 0 fits the site, " +
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

  // ---- plan ↔ figure pixels, view ---------------------------------------------------------------
  toPlan(px, py) { const f = this.frame; return [f.xAtLeftM + px / f.pxPerM, f.yAtTopM - py / f.pxPerM]; }
  toPx(x, y) { const f = this.frame; return [(x - f.xAtLeftM) * f.pxPerM, (f.yAtTopM - y) * f.pxPerM]; }
  /** The view shown, { xM, yM, widthM } (plan metres at the centre, width shown). */
  currentView() {
    if (this.#view) return { ...this.#view };
    const f = this.frame, [bx, by, bw, bh] = f.box;
    const [xM, yM] = this.toPlan(bx + bw / 2, by + bh / 2);
    return { xM, yM, widthM: bw / f.pxPerM };
  }
  /** The view set, { xM, yM, widthM }, or null while the plan fits the whole site. */
  get view() { return this.#view ? { ...this.#view } : null; }
  /** Shows `view` ({ xM, yM, widthM }), or the whole site with null; fires sunlot-view. */
  setView(view) {
    this.#view = view;
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

  // ---- underlay ---------------------------------------------------------------------------------
  /** Puts `image` (an HTMLImageElement or ImageBitmap) under the plan, placed by `placement`
   * (from underlayPlacement); null removes it. Drawn on screen and in the PNG, not in the SVG. */
  setUnderlay(image, placement, opacity = 0.45) {
    this.#underlay = image ? { image, placement, opacity } : null;
    this.render();
  }
  /** The underlay, { image, placement, opacity }, or null. */
  get underlay() { return this.#underlay ? { ...this.#underlay } : null; }
  /** Sets the underlay's opacity (0–1), if there is one. */
  setUnderlayOpacity(opacity) {
    if (this.#underlay) this.setUnderlay(this.#underlay.image, this.#underlay.placement, opacity);
  }
  #drawUnderlay() {
    const ctx = this.canvas.getContext("2d"), u = this.#underlay, p = u.placement, f = this.frame, s = f.pxPerM;
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

  // ---- pointer and keyboard ---------------------------------------------------------------------
  #listen() {
    const target = this.overlay;
    let press = null;
    const near = (a, b, d) => Math.hypot(a[0] - b[0], a[1] - b[1]) <= d;
    // Keep the keyboard on the plan: a press on the overlay would otherwise move focus to the page.
    target.addEventListener("mousedown", e => { e.preventDefault(); this.canvas.focus({ preventScroll: true }); });
    target.addEventListener("pointerdown", e => {
      if (!this.frame) return;
      this.canvas.focus({ preventScroll: true });
      const px = this.figurePx(e);
      press = { start: px, last: px, moved: false, drag: this.grab(px) };
      target.setPointerCapture(e.pointerId);
    });
    target.addEventListener("pointermove", e => {
      const px = this.figurePx(e);
      this.hover(px);
      if (!press) return;
      if (!near(px, press.start, 4)) press.moved = true;
      if (!press.moved) return;
      if (press.drag) this.dragVertex(press.drag, this.toPlan(...px));
      else if (!this.isDrawing) this.pan(px[0] - press.last[0], px[1] - press.last[1]);
      press.last = px;
    });
    target.addEventListener("pointerup", e => {
      const p = press;
      press = null;
      if (!p) return;
      if (p.drag && p.moved) { this.endDrag(p.drag); return; }
      if (p.moved) return;
      const px = this.figurePx(e), pt = this.toPlan(...px);
      if (this.editClick(px, pt, p.drag)) return;
      this.dispatchEvent(new CustomEvent("sunlot-point", { bubbles: true, detail: { xM: pt[0], yM: pt[1] } }));
    });
    target.addEventListener("dblclick", e => this.editDoubleClick(e));
    target.addEventListener("wheel", e => {
      e.preventDefault();
      this.zoom(e.deltaY < 0 ? 1.25 : 1 / 1.25, ...this.figurePx(e));
    }, { passive: false });
    this.canvas.addEventListener("keydown", e => this.#key(e));
  }

  #key(e) {
    const k = e.key, mod = e.ctrlKey || e.metaKey;
    const step = 40;
    const acts = {
      ArrowLeft: () => this.pan(step, 0), ArrowRight: () => this.pan(-step, 0),
      ArrowUp: () => this.pan(0, step), ArrowDown: () => this.pan(0, -step),
      "+": () => this.zoom(1.25), "=": () => this.zoom(1.25), "-": () => this.zoom(1 / 1.25), "0": () => this.fit(),
      "[": () => this.shiftTime(-15), "]": () => this.shiftTime(15),
      Escape: () => this.cancelEdit(),
      Enter: () => { if (this.isDrawing) this.finishDrawing(); },
      Delete: () => this.editable && this.deleteSelected(), Backspace: () => this.editable && this.deleteSelected(),
    };
    if (mod && (k === "z" || k === "Z")) { e.preventDefault(); if (e.shiftKey) this.redo(); else this.undo(); return; }
    if (mod && (k === "y" || k === "Y")) { e.preventDefault(); this.redo(); return; }
    if (mod || !acts[k]) return;
    e.preventDefault();
    acts[k]();
  }
  /** Moves the time shown by `minutes` (wrapping at midnight); fires sunlot-time. */
  shiftTime(minutes) {
    const t = (minutesOf(this.state.time) + minutes + 1440) % 1440;
    this.state.time = timeOf(t);
    this.render();
    this.dispatchEvent(new CustomEvent("sunlot-time", { bubbles: true, detail: { date: this.state.date, time: this.state.time } }));
  }
}

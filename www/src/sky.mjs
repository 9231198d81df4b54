// <sunlot-sky>: the sun-path diagram with a point's skyline.
import { SKY, SunlotFigure } from "./figure.mjs";

export class SunlotSky extends SunlotFigure {
  #point = { xM: 14, yM: 41, zM: 1.5 };
  #projection = "stereographic";
  #massing = "withProposed";

  constructor() { super(SKY); }
  connectedCallback() {
    if (this.hasAttribute("point")) this.#setPointText(this.getAttribute("point"));
    if (this.hasAttribute("projection")) this.#projection = this.getAttribute("projection");
    if (this.hasAttribute("massing")) this.#massing = this.getAttribute("massing");
    super.connectedCallback();
  }
  attributeChanged(name, value) {
    if (name === "point") this.#setPointText(value);
    if (name === "projection") this.#projection = value;
    if (name === "massing") this.#massing = value;
    this.render();
  }
  #setPointText(text) {
    const v = String(text).split(",").map(s => Number(s.trim()));
    if (v.length === 3 && v.every(Number.isFinite) && v[2] >= 0) this.#point = { xM: v[0], yM: v[1], zM: v[2] };
    else this.fail(`point: "${text}" is not x, y, height in metres (e.g. 14,41,1.5)`);
  }
  /** The point whose skyline is drawn, plan metres ({xM, yM, zM}). */
  get point() { return { ...this.#point }; }
  /** Sets the point whose skyline is drawn, plan metres; drawn at once unless `draw` is false. */
  setPoint(xM, yM, zM, draw = true) { this.#point = { xM, yM, zM }; if (draw) this.render(); }
  /** The projection: "stereographic", "equidistant" or "rectangular". */
  get projection() { return this.#projection; }
  /** Sets the projection; drawn at once unless `draw` is false. */
  setProjection(p, draw = true) { this.#projection = p; if (draw) this.render(); }
  input() {
    const s = this.state;
    return { site: s.site, year: Number(s.date.slice(0, 4)), localTime: `${s.date}T${s.time}`,
      ...this.#point, projection: this.#projection, massing: this.#massing, palette: this.palette() };
  }
  draw() {
    this.module.drawSkyChart(this.canvas, this.input());
    const p = this.#point;
    this.canvas.setAttribute("aria-label", `Sun-path diagram for ${this.state.date.slice(0, 4)} with the skyline ` +
      `seen from (${p.xM}, ${p.yM}) at ${p.zM} m`);
    this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { figure: "sky" } }));
  }
  svg(size = this.base) { return this.module.skyChartSvg(this.input(), size.width, size.height); }
}

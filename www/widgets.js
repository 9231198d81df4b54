// sunlot widgets: <sunlot-sky> (the sun-path diagram with a point's skyline) and <sunlot-plan>
// (the site plan with its shadows at a moment). Both draw through the wasm module's canvas back end,
// the same drawing code as the PNG and SVG exports. Classic script: works from file://.
(function () {
  "use strict";

  class SunlotFigure extends HTMLElement {
    constructor(width, height) {
      super();
      this.canvas = document.createElement("canvas");
      this.canvas.width = width;
      this.canvas.height = height;
      this.canvas.setAttribute("role", "img");
      this.appendChild(this.canvas);
    }
    /** The figure as a PNG blob. */
    png() {
      return new Promise(resolve => this.canvas.toBlob(resolve, "image/png"));
    }
  }

  class SunlotSky extends SunlotFigure {
    constructor() { super(900, 720); }
    /** Draws the diagram: `opts` = { site, year, localTime, xM, yM, zM }. */
    draw(module, opts) {
      this.opts = opts;
      module.drawSkyChart(this.canvas, opts);
      this.canvas.setAttribute("aria-label", `Sun-path diagram for ${opts.year}`);
    }
    svg(module) { return module.skyChartSvg(this.opts, 900, 720); }
  }

  class SunlotPlan extends SunlotFigure {
    constructor() { super(960, 760); }
    /** Draws the plan: `opts` = { site, localTime }. */
    draw(module, opts) {
      this.opts = opts;
      module.drawShadowPlan(this.canvas, opts);
      this.canvas.setAttribute("aria-label", `Site plan with shadows at ${opts.localTime}`);
      this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { localTime: opts.localTime } }));
    }
    svg(module) { return module.shadowPlanSvg(this.opts, 960, 760); }
  }

  class SunlotMap extends SunlotFigure {
    constructor() { super(960, 760); }
    /** Computes and draws a day's map: `opts` = { site, date, show: "hours" | "lost", cellM, stepMin }. */
    draw(module, opts) {
      this.opts = opts;
      const out = module.drawMapFigure(this.canvas, opts);
      this.canvas.setAttribute("aria-label", `Map of ${opts.show === "lost" ? "hours of sun lost" : "hours of sun"} on ${opts.date}`);
      return out;
    }
  }

  customElements.define("sunlot-sky", SunlotSky);
  customElements.define("sunlot-map", SunlotMap);
  customElements.define("sunlot-plan", SunlotPlan);
})();

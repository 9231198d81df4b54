// sunlot widgets: <sunlot-sky> (the sun-path diagram with a point's skyline) and <sunlot-plan>
// (the site plan with its shadows at a moment). Both draw through the wasm module's canvas back end,
// the same drawing code as the PNG and SVG exports. Classic script: works from file://.
(function () {
  "use strict";

  class SunlotFigure extends HTMLElement {
    constructor(width, height) {
      super();
      this.canvas = document.createElement("canvas");
      // Crisp on high-DPI screens: as many canvas pixels as device pixels, drawn at the figure's size.
      const ratio = Math.min(Math.max(window.devicePixelRatio || 1, 1), 4);
      this.canvas.width = Math.round(width * ratio);
      this.canvas.height = Math.round(height * ratio);
      this.canvas.dataset.scale = String(ratio);
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
    /** Draws the plan: `opts` = { site, localTime }. A click on the plan fires `sunlot-point` with
     * the plan point (metres) under it. */
    draw(module, opts) {
      this.opts = opts;
      this.frame = module.drawShadowPlan(this.canvas, opts);
      if (!this.listening) {
        this.listening = true;
        this.canvas.addEventListener("click", e => {
          const r = this.canvas.getBoundingClientRect();
          const px = (e.clientX - r.left) * (960 / r.width), py = (e.clientY - r.top) * (760 / r.height);
          const f = this.frame;
          const detail = { xM: f.xAtLeftM + px / f.pxPerM, yM: f.yAtTopM - py / f.pxPerM };
          this.dispatchEvent(new CustomEvent("sunlot-point", { bubbles: true, detail }));
        });
      }
      this.canvas.setAttribute("aria-label", `Site plan with shadows at ${opts.localTime}`);
      this.dispatchEvent(new CustomEvent("sunlot-drawn", { bubbles: true, detail: { localTime: opts.localTime } }));
    }
    svg(module) { return module.shadowPlanSvg(this.opts, 960, 760); }
    geojson(module) { return module.shadowsGeojson(this.opts); }
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
    /** The map's cells as CSV: x_m, y_m (cell centres, plan metres) and the value, cells inside only. */
    csv(module) {
      const o = this.opts;
      const out = o.show === "lost" ? module.compareMap(o) : module.sunHoursMap(o);
      const values = o.show === "lost" ? out.lostH : out.hours;
      const g = out.grid;
      const rows = [`x_m,y_m,${o.show === "lost" ? "lost_h" : "sun_hours"}`];
      for (let r = 0; r < g.rows; r++) {
        for (let c = 0; c < g.cols; c++) {
          const v = values[r * g.cols + c];
          if (Number.isFinite(v)) {
            const x = g.originXM + (g.col0 + c + 0.5) * g.cellM, y = g.originYM + (g.row0 + r + 0.5) * g.cellM;
            rows.push(`${x.toFixed(3)},${y.toFixed(3)},${v.toFixed(4)}`);
          }
        }
      }
      return rows.join("\n") + "\n";
    }
  }

  /**
   * Runs one long call (`sunHoursMap`, `compareMap`, `solarEnvelope`) in a Web Worker made from a
   * Blob URL, so the page stays responsive. Returns { promise, cancel }: `onProgress(fraction)` is
   * called as the work goes; `cancel()` stops the worker at once and rejects with "cancelled".
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
    const url = URL.createObjectURL(new Blob([source], { type: "text/javascript" }));
    const worker = new Worker(url);
    let reject;
    const promise = new Promise((res, rej) => {
      reject = rej;
      worker.onmessage = e => {
        if (e.data.progress !== undefined) { if (onProgress) onProgress(e.data.progress); return; }
        worker.terminate();
        URL.revokeObjectURL(url);
        if (e.data.error !== undefined) rej(new Error(e.data.error)); else res(e.data.result);
      };
      worker.onerror = e => { worker.terminate(); rej(new Error(e.message || "worker failed")); };
    });
    worker.postMessage({ fn, input });
    return { promise, cancel() { worker.terminate(); URL.revokeObjectURL(url); reject(new Error("cancelled")); } };
  }
  self.sunlotRunInWorker = runInWorker;

  customElements.define("sunlot-sky", SunlotSky);
  customElements.define("sunlot-map", SunlotMap);
  customElements.define("sunlot-plan", SunlotPlan);
})();

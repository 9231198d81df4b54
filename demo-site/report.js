// The demo proposal site: pages of an architect's sun and shadow report on the invented Hollin Vale
// scenario, built from the sunlot widgets and the module's calls. Classic script after
// ../www/build/sunlot-widgets.bundle.js; each page names itself in <body data-page="…">. Works from
// file:// with no network, and served over HTTP.
(function () {
  "use strict";
  const $ = id => document.getElementById(id);
  const el = (tag, attrs = {}, ...children) => {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs)) {
      if (k === "text") e.textContent = v; else if (v !== false && v !== undefined) e.setAttribute(k, v === true ? "" : v);
    }
    for (const c of children) e.append(c);
    return e;
  };
  const hhmm = t => (t ? t.slice(11, 16) : "—");
  const fixed = (v, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : "—");

  /** Export buttons for a widget or a table. */
  function exports(target, stem, kinds) {
    const span = el("span", { class: "exports" });
    for (const kind of kinds) {
      const b = el("button", { type: "button", "data-export": `${stem}.${kind}`, text: kind.toUpperCase() });
      b.addEventListener("click", async () => {
        const name = `hollin-vale-${stem}.${kind}`;
        if (target instanceof HTMLTableElement) {
          window.sunlot.download(name, new Blob([tableCsv(target)], { type: "text/csv" }));
        } else await target.save(kind, name);
      });
      span.append(" ", b);
    }
    return span;
  }

  function tableCsv(table) {
    const q = s => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
    return Array.from(table.rows).map(r => Array.from(r.cells).map(c => q(c.textContent.trim())).join(",")).join("\n") + "\n";
  }

  /** A table with a header row, rows of cells, a caption and a CSV export. */
  function table(stem, caption, head, rows) {
    const t = el("table", { id: `table-${stem}` });
    t.append(el("caption", { text: caption }));
    t.append(el("thead", {}, el("tr", {}, ...head.map(h => el("th", { scope: "col", text: h })))));
    t.append(el("tbody", {}, ...rows.map(r => el("tr", {}, ...r.map(c => el("td", { text: String(c) }))))));
    const wrap = el("div", { class: "table" }, t);
    wrap.append(el("p", { class: "table-exports" }, "Table as", exports(t, stem, ["csv"])));
    return wrap;
  }

  /** A widget in a figure with its caption and exports; resolves when it has drawn. */
  function figure(parent, tag, attrs, caption, kinds, site) {
    const w = el(tag, attrs);
    const f = el("figure", {}, w, el("figcaption", {}, caption, exports(w, attrs.id, kinds)));
    parent.append(f);
    const drawn = new Promise(res => w.addEventListener(attrs.layer ? "sunlot-layer" : "sunlot-drawn", res, { once: true }));
    w.addEventListener("sunlot-error", e => showError(`${attrs.id}: ${e.detail.message}`));
    w.ready.then(() => w.setSite(site));
    return { widget: w, drawn };
  }

  function showError(message) {
    const e = $("error");
    e.hidden = false;
    e.textContent = message;
  }

  /** The seasons of the site's year, as local dates and RFC 3339 instants. */
  function seasons(m, info, year) {
    const s = m.seasonInstants(year, info.zone);
    return [["March equinox", s.marchEquinox], ["June solstice", s.juneSolstice],
      ["September equinox", s.septemberEquinox], ["December solstice", s.decemberSolstice]]
      .map(([name, t]) => ({ name, instant: t, date: t.slice(0, 10) }));
  }

  const PAGES = {
    // The one-page summary for a planning file.
    async summary(m, site, info) {
      // The date of the garden rule's test (BR 209: 21 March), so the figures and the table agree.
      const [march] = seasons(m, info, 2026);
      const date = "2026-03-21";
      const figs = $("figures");
      const plan = figure(figs, "sunlot-plan", { id: "summary-plan", date, time: "15:00" },
        `Shadows at 15:00 on ${date}, the date of the garden test (the March equinox is ${march.date})`, ["png", "svg", "geojson"], site);
      const lost = figure(figs, "sunlot-map", { id: "summary-lost", date, layer: "lost" },
        `Hours of direct sun lost to the proposal on ${date}`, ["png", "svg", "csv", "geojson"], site);
      ruleTable(m, site, $("rule"));
      windowVerdicts(m, site, $("windows"), ["bre-br209-window-sky", "bre-br209-window-sun"]);
      // The printed sheet's title block line (print only): study date, massing, print date.
      $("print-meta").textContent = `Study date ${date} · existing buildings and the proposal as drawn · ` +
        `graphic scale and true north on each plan · printed ${new Date().toISOString().slice(0, 10)}`;
      await Promise.all([plan.drawn, lost.drawn]);
      $("print").addEventListener("click", () => window.print());
    },

    async sun(m, site, info) {
      const year = 2026;
      const all = seasons(m, info, year);
      const sky = figure($("figures"), "sunlot-sky", { id: "sun-sky", date: all[0].date, time: "12:00",
        point: "31.5,26,1.5" }, "Sun path over the year and the skyline from the middle of 16's garden (1.5 m up)",
      ["png", "svg"], site);
      // Local clock time with the zone's abbreviation, for reading; the RFC 3339 instant for exact use.
      const local = new Intl.DateTimeFormat("en-GB", { timeZone: info.zone, dateStyle: "medium", timeStyle: "short" });
      const abbr = new Intl.DateTimeFormat("en-GB", { timeZone: info.zone, timeZoneName: "short" });
      const zoneOf = t => (abbr.formatToParts(new Date(t)).find(p => p.type === "timeZoneName") || {}).value || "";
      $("tables").append(table("seasons", `Equinoxes and solstices ${year} (${info.zone})`,
        ["Event", "Local time", "Instant (RFC 3339)"],
        all.map(s => [s.name, `${local.format(new Date(s.instant))} ${zoneOf(s.instant)}`, s.instant])));
      const rows = all.map(s => {
        const d = m.dayEvents({ latitudeDeg: info.latitudeDeg, longitudeDeg: info.longitudeDeg, date: s.date, zone: info.zone });
        return [s.date, s.name, hhmm(d.civilDawn), hhmm(d.sunrise), hhmm(d.solarNoon), fixed(d.noonAltitudeDeg),
          hhmm(d.sunset), hhmm(d.civilDusk), fixed(d.dayLengthH, 2)];
      });
      $("tables").append(table("day-events", "Sun on the season days at the site (NREL SPA; sunrise and sunset at the upper limb with standard refraction)",
        ["Date", "Day", "Civil dawn", "Sunrise", "Solar noon", "Noon altitude °", "Sunset", "Civil dusk", "Day length h"], rows));
      const point = { site, xM: 31.5, yM: 26, zM: 1.5, year, stepMin: 30 };
      const before = m.yearProfile({ ...point, massing: "existing" });
      const after = m.yearProfile({ ...point, massing: "withProposed" });
      const months = before.months.map((b, k) => {
        const a = after.months[k];
        return [b.month, fixed(b.openHours, 0), fixed(b.sunHours, 0), fixed(a.sunHours, 0), fixed(b.kwhM2, 1), fixed(a.kwhM2, 1)];
      });
      $("tables").append(table("year-profile",
        `The year at the middle of 16's garden (31.5, 26, 1.5 m): sky view ${fixed(before.skyView, 2)} before, ${fixed(after.skyView, 2)} with the proposal (30-minute steps, Bird clear sky)`,
        ["Month", "Sun up h", "Direct sun now h", "With proposal h", "Insolation now kWh/m²", "With proposal kWh/m²"], months));
      await sky.drawn;
    },

    async shadows(m, site, info) {
      const all = seasons(m, info, 2026);
      const days = [all[0], all[1], all[3]];
      const grid = $("figures");
      const drawn = [];
      for (const d of days) {
        for (const time of ["09:00", "12:00", "15:00"]) {
          drawn.push(figure(grid, "sunlot-plan", { id: `plan-${d.date}-${time.replace(":", "")}`, date: d.date, time },
            `${d.name} (${d.date}), ${time}`, ["png", "svg", "geojson"], site).drawn);
        }
      }
      // A row in 3-D: the same days at 15:00, seen from the south-west, the shadows on the neighbours'
      // walls and roofs as well as on the ground.
      const views = $("views");
      for (const d of days) {
        drawn.push(figure(views, "sunlot-massing", { id: `massing-${d.date}`, date: d.date, time: "15:00" },
          `${d.name} (${d.date}), 15:00, in 3-D (drag to walk round)`, ["png", "svg"], site).drawn);
      }
      for (const d of days) {
        const rows = m.shadowTable({ site, date: d.date, stepMin: 60 }).map(r => [hhmm(r.time), fixed(r.altitudeDeg),
          fixed(r.azimuthDeg), fixed(r.shadowLengthMPerM, 2), fixed(r.shadowAzimuthDeg), fixed(r.tipsM["proposal-upper"], 1),
          fixed(r.tipsM["proposal-podium"], 1)]);
        $("tables").append(table(`shadow-lengths-${d.date}`, `${d.name} (${d.date}): the sun and shadow lengths on the hour`,
          ["Time", "Altitude °", "Azimuth °", "Shadow length per m of height, m", "Shadow azimuth °", "Upper block tip m", "Podium tip m"], rows));
      }
      await Promise.all(drawn);
    },

    async gardens(m, site) {
      const date = "2026-03-21";
      const figs = $("figures");
      const drawn = [
        figure(figs, "sunlot-map", { id: "gardens-before", date, layer: "sun-hours-existing" },
          `Before: hours of direct sun on ${date}, existing buildings`, ["png", "svg", "csv", "geojson"], site).drawn,
        figure(figs, "sunlot-map", { id: "gardens-after", date, layer: "sun-hours" },
          `After: hours of direct sun on ${date} with the proposal`, ["png", "svg", "csv", "geojson"], site).drawn,
        figure(figs, "sunlot-map", { id: "gardens-lost", date, layer: "lost" },
          `Difference: hours of direct sun lost on ${date}`, ["png", "svg", "csv", "geojson"], site).drawn,
      ];
      ruleTable(m, site, $("rule"), true);
      await Promise.all(drawn);
    },

    async windows(m, site, info) {
      const all = seasons(m, info, 2026);
      windowVerdicts(m, site, $("verdicts"), ["bre-br209-window-sky", "bre-br209-window-sun", "en17037-window-sun"]);
      windowTable(m, site, info, $("tables"), [all[0], all[3]]);
      for (const [volume, show] of [["terrace-east", "hours"], ["terrace-east", "lost"], ["house-9", "lost"]]) {
        facadeFigure(m, site, $("facades"), { volume, date: all[0].date, show });
      }
      const drawn = info.windows.map(w => figure($("figures"), "sunlot-sky", { id: `sky-${w.id}`, date: all[0].date, time: "12:00",
        point: `${w.xM},${w.yM},${w.zM}`, projection: "rectangular" },
      `${w.name}: sun paths and the skyline with the proposal (rectangular projection)`, ["png", "svg"], site).drawn);
      await Promise.all(drawn);
    },

    async envelope(m, site) {
      const date = "2026-03-21";
      const figs = $("figures");
      const map = figure(figs, "sunlot-map", { id: "envelope-map", date, layer: "envelope" },
        `The solar envelope of the lot: the greatest height at each point that keeps the neighbours' gardens in sun from 09:00 to 15:00 on ${date}`,
        ["png", "svg", "csv", "geojson"], site);
      const plan = figure(figs, "sunlot-plan", { id: "envelope-plan", date, time: "12:00", layer: "envelope" },
        `The envelope under the proposal's shadows at 12:00 on ${date}`, ["png", "svg", "geojson"], site);
      await Promise.all([map.drawn, plan.drawn]);
    },

    async interactive(m, site) {
      const plan = $("plan"), sky = $("sky"), massing = $("massing");
      const moment = () => {
        const t = Number($("time").value);
        return [$("date").value, `${String(Math.floor(t / 60)).padStart(2, "0")}:${String(t % 60).padStart(2, "0")}`];
      };
      const redraw = () => {
        const [d, t] = moment();
        $("time-label").textContent = t;
        for (const w of [plan, sky, massing]) w.setMoment(d, t);
      };
      for (const id of ["date", "time"]) $(id).addEventListener("input", redraw);
      plan.addEventListener("sunlot-edit", e => {
        sky.setSite(e.detail.site);
        massing.setSite(e.detail.site);
        $("undo").disabled = !plan.canUndo;
        $("redo").disabled = !plan.canRedo;
      });
      massing.addEventListener("sunlot-error", e => showError(e.detail.message));
      plan.addEventListener("sunlot-point", e => { sky.setPoint(Number(e.detail.xM.toFixed(1)), Number(e.detail.yM.toFixed(1)), 1.5); });
      plan.addEventListener("sunlot-error", e => showError(e.detail.message));
      $("undo").addEventListener("click", () => plan.undo());
      $("redo").addEventListener("click", () => plan.redo());
      $("draw").addEventListener("click", () => { plan.startDrawing("volumes"); plan.canvas.focus(); });
      $("raise").addEventListener("click", () => { plan.select("volumes", "proposal-upper"); plan.setFields({ top_m: Number($("top").value) }); });
      for (const [w, kinds] of [[plan, ["png", "svg", "geojson"]], [sky, ["png", "svg"]], [massing, ["png", "svg"]]]) {
        w.parentElement.querySelector("figcaption").append(exports(w, w.id, kinds));
      }
      await Promise.all([plan.ready, sky.ready, massing.ready]);
      await Promise.all([plan.setSite(site, false), sky.setSite(site, false), massing.setSite(site, false)]);
      redraw();
    },
  };

  /** The rule check against the BRE BR 209 amenity preset, with its citation and the caution. */
  function ruleTable(m, site, parent, withPlan = false) {
    const input = { site, preset: "bre-br209-amenity", year: 2026 };
    let r;
    if (withPlan) {
      // One computation draws the plan of verdicts and gives the table's figures.
      const canvas = el("canvas", { id: "rule-plan", class: "rule-plan" });
      r = m.drawRuleCheck(canvas, input);
      const target = {
        save: async (kind, name) => {
          if (kind === "png") window.sunlot.download(name, await new Promise(res => canvas.toBlob(res, "image/png")));
          else window.sunlot.download(name, new Blob([m.ruleCheckSvg(input)], { type: "image/svg+xml" }));
        },
      };
      const caption = `The gardens by their verdict (${r.areas.filter(a => a.passes).length} of ${r.areas.length} pass), each labelled with its margin in share points`;
      parent.append(el("figure", {}, canvas, el("figcaption", {}, caption, exports(target, "rule-plan", ["png", "svg"]))));
    } else {
      r = m.checkRule(input);
    }
    const signed = (v, d) => (Number.isFinite(v) ? `${v >= 0 ? "+" : ""}${v.toFixed(d)}` : "—");
    const rows = r.areas.map(a => [a.id, a.name, fixed(100 * a.beforeShare, 1), fixed(100 * a.afterShare, 1),
      fixed(a.ratio, 3), signed(100 * a.shareMargin, 1), signed(a.ratioMargin, 2), `±${fixed(100 * a.shareError, 1)}`,
      (a.passes ? "passes" : "fails") + (a.nearThreshold ? " (near threshold)" : "")]);
    parent.append(table("rule-check", `${r.rule.title} — checked on ${r.date}, ${r.cellM} m cells, ${r.stepMin}-minute steps`,
      ["Area", "Name", "In 2 h+ sun now %", "With proposal %", "Ratio after / before", "Share margin, points",
        "Ratio margin", "Share error, points", "Result"], rows));
    parent.append(el("p", { class: "citation", text: "Margins: how far each test is passed (+) or failed (−). Share error: the share of the area in cells cut by its edge or by the edge of the sunlit part, within which a share near its threshold could move." }));
    parent.append(el("p", { class: "citation", text: `Rule: ${r.rule.source}.` }));
    parent.append(el("p", { class: "caution", text: r.caution }));
  }

  /** Window rule checks: per rule a table of each window's figures before and with the proposal, the
   *  verdict and why, the source, and the cautions (numbers from memory are said so). */
  function windowVerdicts(m, site, parent, presets) {
    const said = new Set(); // each caution once, however many rules carry it
    for (const preset of presets) {
      const r = m.checkWindows({ site, preset, year: 2026, stepMin: 10 });
      const names = [...new Set(r.windows.flatMap(w => w.figures.map(f => f.name)))];
      const label = { vsc_pct: "VSC %", sun_h: "Sun h", annual_share: "Year's sun %", winter_share: "Winter's sun %" };
      const scale = n => (n.endsWith("_share") ? 100 : 1);
      const head = ["Window"];
      for (const n of names) head.push(`${label[n] || n} now`, `${label[n] || n} with proposal`);
      head.push("Result", "Why");
      const rows = r.windows.map(w => {
        const cells = [w.name];
        for (const n of names) {
          const f = w.figures.find(x => x.name === n);
          const d = n.endsWith("_h") ? 2 : 1;
          cells.push(f && f.before !== null ? fixed(scale(n) * f.before, d) : "—", f ? fixed(scale(n) * f.after, d) : "—");
        }
        cells.push(w.passes === null ? "not tested" : w.passes ? "passes" : "fails", w.reason);
        return cells;
      });
      const tested = r.windows.filter(w => w.passes !== null);
      const passing = tested.filter(w => w.passes).length;
      parent.append(table(`windows-${preset}`, `${r.rule.title} — ${passing} of ${tested.length} windows pass; the rule ${r.passes ? "passes" : "fails"}`, head, rows));
      if (names.some(n => n.endsWith("_share"))) {
        parent.append(el("p", { class: "citation definition", text: "Year's and winter's sun: hours of direct sun on the window, as a percent of the year's sun-up hours at the site." }));
      }
      parent.append(el("p", { class: "citation source", text: `Rule: ${r.rule.source}.` }));
      for (const c of r.cautions.filter(c => !said.has(c))) {
        said.add(c);
        // The general caution is also the page's footer; the printed sheet shows it there only.
        parent.append(el("p", { class: /licensed professional/.test(c) ? "caution general" : "caution", text: c }));
      }
    }
  }

  /** A building's faces unfolded, hours of direct sun with the proposal, the site's windows marked;
   *  exports PNG (the canvas), SVG and CSV (each cell) from the same computation's drawing code. */
  function facadeFigure(m, site, parent, { volume, date, show }) {
    const input = { site, volume, date, stepMin: 10, cellM: 0.5, show };
    const stem = `facade-${volume}-${show}`;
    const canvas = el("canvas", { id: stem, class: "facade" });
    m.drawFacade(canvas, input);
    const target = {
      save: async (kind, name) => {
        if (kind === "png") {
          const blob = await new Promise(res => canvas.toBlob(res, "image/png"));
          window.sunlot.download(name, blob);
        } else if (kind === "svg") {
          window.sunlot.download(name, new Blob([m.facadeSvg(input)], { type: "image/svg+xml" }));
        } else {
          const lost = show === "lost";
          const rows = [`face,facing_deg,col,row,sun_hours,beam_kwh_m2${lost ? ",sun_hours_existing,lost_h" : ""}`];
          const after = m.facadeMap({ ...input, show: undefined }).faces;
          const before = lost ? m.facadeMap({ ...input, show: undefined, massing: "existing" }).faces : null;
          after.forEach((f, n) => {
            for (let k = 0; k < f.sunHours.length; k++) {
              const cells = [f.number, f.facingDeg, k % f.cols, Math.floor(k / f.cols), f.sunHours[k].toFixed(4), f.beamKwhM2[k].toFixed(4)];
              if (lost) cells.push(before[n].sunHours[k].toFixed(4), Math.max(0, before[n].sunHours[k] - f.sunHours[k]).toFixed(4));
              rows.push(cells.join(","));
            }
          });
          window.sunlot.download(name, new Blob([rows.join("\n") + "\n"], { type: "text/csv" }));
        }
      },
    };
    const what = show === "lost" ? "hours of direct sun lost to the proposal" : "hours of direct sun with the proposal";
    const caption = `The faces of ${volume} unfolded: ${what} on ${date}, the site's windows outlined (cells of 0.5 m, sampled 1 cm in front of each face)`;
    parent.append(el("figure", {}, canvas, el("figcaption", {}, caption, exports(target, stem, ["png", "svg", "csv"]))));
  }

  /** Hours of direct sun at each window before and after, on the given season days, and sky view. */
  function windowTable(m, site, info, parent, days) {
    const rows = info.windows.map(w => {
      const cells = [w.name];
      for (const d of days) {
        const light = m.windowLight({ site, id: w.id, date: d.date });
        cells.push(fixed(light.existing.sunH, 2), fixed(light.withProposed.sunH, 2));
      }
      cells.push(fixed(m.skyView({ site, xM: w.xM, yM: w.yM, zM: w.zM, massing: "existing" }), 3));
      cells.push(fixed(m.skyView({ site, xM: w.xM, yM: w.yM, zM: w.zM, massing: "withProposed" }), 3));
      return cells;
    });
    const head = ["Window"];
    for (const d of days) head.push(`${d.date} now h`, `${d.date} with proposal h`);
    head.push("Sky view now", "Sky view with proposal");
    parent.append(table("windows", "Direct sun on the neighbours' ground-floor windows (hours in the day with the sun in front of the glazing and unblocked) and the sky-view factor at each (cosine-weighted share of the sky seen)", head, rows));
  }

  window.sunlot.ready.then(async m => {
    const site = m.demoSiteText();
    const info = m.readSite(site);
    for (const n of document.querySelectorAll("[data-site-name]")) n.textContent = info.name;
    await PAGES[document.body.dataset.page](m, site, info);
    document.body.dataset.ready = "yes";
  }).catch(e => {
    showError(`sunlot could not start: ${e && e.message ? e.message : e}`);
    document.body.dataset.ready = "error";
  });
})();

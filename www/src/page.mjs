// The page www/index.html: the invented demo site's sun path, shadows and maps, with date and time
// controls, editing, a site-plan underlay and exports. Built by tools/bundle.py into
// www/build/sunlot-page.js (a classic script: works from file:// with no server and no network). The
// widgets do the drawing; this module wires the page's controls to them.
import { pad } from "./helpers.mjs";

const $ = id => document.getElementById(id);
const STORE = "sunlot.site";
const sunlot = self.sunlot;
// What the page measured (milliseconds since navigation began, first drawing, frames, the last map),
// for the end-to-end tests and benches/page_speed.mjs.
const measured = sunlot.measured = { scripts: performance.now(), frameTimes: [] };

function showError(e) {
  $("error").hidden = false;
  $("error").textContent = String(e && e.message ? e.message : e);
}
const hideError = () => { $("error").hidden = true; };

sunlot.ready.then(async module => {
  measured.module = performance.now();
  const plan = $("plan"), sky = $("sky"), mapEl = $("map"), massing = $("massing");
  await Promise.all([plan, sky, mapEl, massing].map(el => el.ready));
  // The menu of maps: the core's kinds that offer themselves there.
  const kinds = new Map(module.mapKinds().map(k => [k.id, k]));
  $("layer").replaceChildren(...[...kinds.values()].filter(k => k.menu)
    .map(k => Object.assign(document.createElement("option"), { value: k.id, textContent: k.menu })));

  // The site: restored from the browser's storage when a valid one was saved, else the demo.
  // Read through the widgets' shared read: they read the same text next.
  const read = text => sunlot.readSiteShared(module, text);
  let site = module.demoSiteText();
  // The demo's caution ("invented") is shown only while the site is the demo.
  const demoName = read(site).name;
  let restored = false;
  try {
    const saved = localStorage.getItem(STORE);
    if (saved) { site = module.readSite(saved).siteJson; restored = true; }
  } catch (e) { /* a saved site that no longer reads: keep the demo */ }
  let savedOk = true;
  try { localStorage.setItem(`${STORE}-probe`, "1"); localStorage.removeItem(`${STORE}-probe`); } catch (e) { savedOk = false; }
  const stamp = () => new Date().toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" });
  /** Saves the site in the browser's storage and says so (or says it cannot). */
  const keep = text => {
    try { localStorage.setItem(STORE, text); $("autosave").textContent = `Saved in this browser at ${stamp()}: ` +
      "your site comes back when you reopen the page."; } catch (e) {
      $("autosave").textContent = "This browser does not keep the site (storage full or off): save it as a file to keep it.";
    }
  };
  $("autosave").textContent = !savedOk
    ? "This browser does not keep the site (storage off): save it as a file to keep it."
    : restored ? "Restored your site from this browser's storage (saved there at every change)."
      : "Your site is kept in this browser: every change is saved here and comes back when you reopen the page.";
  let info = read(site);
  const showSiteName = source => {
    $("site-name").textContent = `${info.name || "Unnamed site"}${source ? ` (from ${source})` : ""}`;
    $("demo-note").hidden = info.name !== demoName;
  };

  const moment = () => {
    const minutes = Number($("time").value);
    return { date: $("date").value, time: `${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}` };
  };
  const point = () => {
    const v = $("point").value.split(",").map(s => Number(s.trim()));
    if (v.length !== 3 || v.some(x => !Number.isFinite(x)) || v[2] < 0) {
      throw new Error(`Sky from: "${$("point").value}" is not x, y, height in metres (e.g. 14,41,1.5)`);
    }
    return v;
  };

  /** Makes `text` the page's site (throws, naming the feature, before anything changes). */
  async function useSite(text, source, footprints) {
    const next = module.readSite(text, footprints);
    site = next.siteJson;
    info = next;
    keep(site);
    showSiteName(source);
    const said = $("assumptions");
    said.replaceChildren(...next.assumptions.map(a => Object.assign(document.createElement("li"), { textContent: a })));
    said.hidden = next.assumptions.length === 0;
    await Promise.all([plan.setSite(site), sky.setSite(site), mapEl.setSite(site), massing.setSite(site)]);
    refreshMap();
  }

  // The summary depends on the site, date and point, not the time: kept until one of them changes.
  let summaryKey = null;
  function summary() {
    const { date } = moment();
    const [xM, yM, zM] = point();
    const key = `${date}/${xM},${yM},${zM}\n${site}`;
    if (key === summaryKey) return;
    summaryKey = key;
    const day = module.dayEvents({ latitudeDeg: info.latitudeDeg, longitudeDeg: info.longitudeDeg, date, zone: info.zone });
    const line = module.pointTimeline({ site, xM, yM, zM, date });
    const spans = line.intervals.map(i =>
      `${i.sunlit ? "sun" : "shade"} ${i.from.slice(11, 16)}–${i.to.slice(11, 16)}${i.by ? ` (${i.by})` : ""}`);
    $("summary").textContent =
      `${date}: sunrise ${(day.sunrise || "—").slice(11, 16)}, sunset ${(day.sunset || "—").slice(11, 16)}; ` +
      `the point (${xM}, ${yM}, ${zM} m) gets ${line.sunHours.toFixed(2)} h of direct sun of ` +
      `${line.dayHours.toFixed(2)} h: ${spans.join(", ") || "no sun"}.`;
  }

  /** The print sheet's title block: the site, the moment studied, the massing, the print date. */
  function titleBlock(date, time) {
    const deg = (v, pos, neg) => `${Math.abs(v).toFixed(4)}° ${v >= 0 ? pos : neg}`;
    $("tb-site").textContent = info.name || "Unnamed site";
    $("tb-where").textContent = `${deg(info.latitudeDeg, "N", "S")}, ${deg(info.longitudeDeg, "E", "W")}; ` +
      `clock times ${info.zone}`;
    $("tb-when").textContent = `${date} at ${time} local time; the map as titled on it`;
    const proposed = info.volumes.filter(v => v.status === "proposed").length;
    $("tb-massing").textContent = proposed
      ? `existing buildings and the proposal as drawn (${proposed} proposed volume${proposed > 1 ? "s" : ""})`
      : "existing buildings only (no proposal drawn)";
    $("tb-printed").textContent = new Date().toISOString().slice(0, 10);
  }

  /** Draws the figures at the page's moment, and the point's day summary unless `summaryLater`. */
  function redraw(summaryLater = false) {
    hideError();
    const { date, time } = moment();
    $("time-label").textContent = time;
    try {
      const [xM, yM, zM] = point();
      sky.setPoint(xM, yM, zM, false);
      sky.setProjection($("projection").value, false);
      plan.setMoment(date, time);
      sky.setMoment(date, time);
      massing.setMoment(date, time);
      if (!summaryLater) summary();
      titleBlock(date, time);
    } catch (e) { showError(e); }
  }

  // ---- maps: computed in a worker with progress and cancel, shown in the map widget and, if
  // asked, under the plan's shadows -------------------------------------------------------------
  let job = null, mapKey = null;
  function refreshMap(force) {
    const kind = $("layer").value, { date } = moment();
    const yearly = kinds.get(kind).span === "year";
    const key = `${kind}/${yearly ? date.slice(0, 4) : date}\n${site}`;
    if (!force && key === mapKey) return;
    mapKey = key;
    if (job) job.cancel();
    $("map-progress").hidden = false;
    $("map-progress").value = 0;
    $("map-cancel").hidden = false;
    $("map-status").textContent = "computing…";
    const t0 = performance.now();
    const mine = sunlot.computeMap(module, kind, site, date, f => { $("map-progress").value = f; });
    job = mine;
    mine.promise.then(map => {
      const ms = performance.now() - t0;
      measured.lastMapMs = ms;
      mapEl.setMap(map);
      plan.setMap($("on-plan").checked ? map : null);
      // The core's figures of the map (cells with a value, mean, least), not recomputed here.
      const f = map.stats, u = map.unit;
      $("map-status").textContent = f
        ? `${map.title}: ${f.cells} cells, mean ${f.mean.toFixed(2)} ${u}, least ${f.min.toFixed(2)} ${u} (${(ms / 1000).toFixed(2)} s).`
        : `${map.title}: no cells (${(ms / 1000).toFixed(2)} s).`;
    }).catch(e => {
      if (mapKey === key) mapKey = null;
      const cancelled = e instanceof sunlot.CancelledError;
      $("map-status").textContent = cancelled ? "cancelled" : "";
      if (!cancelled) showError(`map: ${e.message}`);
    }).finally(() => {
      if (job !== mine) return;
      job = null;
      $("map-progress").hidden = true;
      $("map-cancel").hidden = true;
    });
  }
  $("map-cancel").addEventListener("click", () => { if (job) job.cancel(); });
  $("layer").addEventListener("change", () => refreshMap());
  $("on-plan").addEventListener("change", () => plan.setMap($("on-plan").checked ? mapEl.map || null : null));

  // ---- controls -------------------------------------------------------------------------------
  for (const id of ["date", "time", "point", "projection"]) {
    $(id).addEventListener("input", redraw);
    $(id).addEventListener("change", redraw);
  }
  $("date").addEventListener("change", () => refreshMap());
  $("fit").addEventListener("click", () => plan.fit());

  // A click on the plan moves the point whose sky and day are shown; keys on the plan step the time.
  plan.addEventListener("sunlot-point", e => {
    const z = ($("point").value.split(",")[2] || "1.5").trim();
    $("point").value = `${e.detail.xM.toFixed(1)},${e.detail.yM.toFixed(1)},${z}`;
    redraw();
  });
  for (const el of [plan, massing]) {
    el.addEventListener("sunlot-time", e => {
      $("time").value = String(Number(e.detail.time.slice(0, 2)) * 60 + Number(e.detail.time.slice(3, 5)));
      redraw();
    });
  }
  $("massing-envelope").addEventListener("change", () => massing.setEnvelopeLot($("massing-envelope").checked ? "" : null));
  $("massing-perspective").addEventListener("change", () =>
    massing.setView({ perspectiveM: $("massing-perspective").checked ? 120 : null }));
  for (const el of [plan, sky, mapEl, massing]) el.addEventListener("sunlot-error", e => showError(e.detail.message));

  document.querySelectorAll("[data-export]").forEach(b => b.addEventListener("click", async () => {
    const [which, kind] = b.dataset.export.split("-");
    const el = $(which);
    const { date, time } = moment();
    const name = `sunlot-${which}-${date}T${time.replace(":", "")}.${kind}`;
    try { await el.save(kind, name); } catch (e) { showError(`export: ${e.message}`); }
  }));

  // Plain building footprints say no time zone: the page asks for it, offering the longitude's
  // fixed offset, and for a storey height, before anything changes.
  let pending = null;
  const openSite = async (text, source, footprints) => {
    try {
      await useSite(text, source, footprints);
      plan.clearHistory();
      hideError();
      redraw();
      return true;
    } catch (e) {
      showError(`${source}: ${e.message} — the current site is unchanged.`);
      return false;
    } finally { updateEditButtons(); }
  };
  $("import").addEventListener("change", async () => {
    const file = $("import").files[0];
    $("import").value = "";
    if (!file) return;
    const text = await file.text();
    let kind = { kind: "unknown" };
    try { kind = module.siteTextKind(text); } catch (e) { /* the reader names the problem below */ }
    if (kind.kind !== "footprints") { await openSite(text, file.name); return; }
    pending = { text, source: file.name };
    $("fp-what").textContent = `${file.name} holds building footprints with no sunlot members. Give the ` +
      "site's time zone: the one offered is a fixed offset from the longitude with no daylight saving; " +
      "replace it with the local zone (such as Europe/London) where there is one.";
    $("fp-zone").value = kind.suggestedZone || "";
    $("footprints").hidden = false;
    $("fp-zone").focus();
  });
  $("footprints").addEventListener("submit", async e => {
    e.preventDefault();
    if (!pending) return;
    const fp = { zone: $("fp-zone").value.trim(), storeyHeightM: Number($("fp-storey").value),
      name: pending.source.replace(/\.(geo)?json$/i, "") };
    if ($("fp-default").value !== "") fp.defaultHeightM = Number($("fp-default").value);
    if (await openSite(pending.text, pending.source, fp)) { pending = null; $("footprints").hidden = true; }
  });
  $("fp-cancel").addEventListener("click", () => { pending = null; $("footprints").hidden = true; });
  $("reset-demo").addEventListener("click", async () => { await useSite(module.demoSiteText(), ""); redraw(); });
  $("export-site").addEventListener("click", () =>
    sunlot.download("site.sunlot.json", new Blob([site], { type: "application/json" })));

  // ---- editing --------------------------------------------------------------------------------
  const updateEditButtons = () => { $("undo").disabled = !plan.canUndo; $("redo").disabled = !plan.canRedo; };
  const setEditable = () => plan.toggleAttribute("editable", $("edit-on").checked);
  $("edit-on").addEventListener("change", setEditable);
  setEditable();
  $("draw-volume").addEventListener("click", () => { plan.startDrawing("volumes"); plan.canvas.focus(); });
  $("draw-area").addEventListener("click", () => { plan.startDrawing("areas"); plan.canvas.focus(); });
  $("undo").addEventListener("click", () => plan.undo());
  $("redo").addEventListener("click", () => plan.redo());
  plan.addEventListener("sunlot-edit", async e => {
    site = e.detail.site;
    info = read(site);
    keep(site);
    await Promise.all([sky.setSite(site), mapEl.setSite(site), massing.setSite(site)]);
    showFeature();
    updateEditButtons();
    try { summary(); } catch (err) { showError(err); }
    refreshMap();
  });
  function showFeature() {
    const f = plan.feature();
    $("feature").hidden = !f;
    if (!f) return;
    const volume = plan.selection.kind === "volumes";
    $("feature-title").textContent = volume ? "Volume" : "Area";
    document.querySelectorAll(".volume-only").forEach(el => { el.hidden = !volume; });
    document.querySelectorAll(".area-only").forEach(el => { el.hidden = volume; });
    $("f-id").value = f.id;
    $("f-status").value = f.status || "existing";
    if (volume) { $("f-base").value = f.base_m ?? 0; $("f-top").value = f.top_m; } else {
      $("f-name").value = f.name || "";
      $("f-kind").value = f.kind || "other";
    }
  }
  plan.addEventListener("sunlot-select", showFeature);
  $("feature").addEventListener("submit", e => {
    e.preventDefault();
    hideError();
    const volume = plan.selection?.kind === "volumes";
    const fields = { id: $("f-id").value.trim(), status: $("f-status").value };
    if (volume) { fields.base_m = Number($("f-base").value); fields.top_m = Number($("f-top").value); } else {
      fields.name = $("f-name").value;
      fields.kind = $("f-kind").value;
    }
    plan.setFields(fields);
  });
  $("f-delete").addEventListener("click", () => { plan.deleteFeature(); showFeature(); });

  // ---- underlay -------------------------------------------------------------------------------
  const under = { image: null, a: null, b: null, scale: 1 };
  function drawPreview() {
    const c = $("u-preview"), ctx = c.getContext("2d");
    ctx.clearRect(0, 0, c.width, c.height);
    if (!under.image) return;
    under.scale = Math.min(c.width / under.image.width, c.height / under.image.height);
    ctx.drawImage(under.image, 0, 0, under.image.width * under.scale, under.image.height * under.scale);
    for (const [p, label] of [[under.a, "A"], [under.b, "B"]]) {
      if (!p) continue;
      const [x, y] = [p[0] * under.scale, p[1] * under.scale];
      ctx.strokeStyle = "#0a5fd0"; ctx.lineWidth = 2;
      ctx.beginPath(); ctx.arc(x, y, 6, 0, 2 * Math.PI); ctx.stroke();
      ctx.fillStyle = "#0a5fd0"; ctx.font = "14px sans-serif"; ctx.fillText(label, x + 8, y - 8);
    }
  }
  $("u-file").addEventListener("change", () => {
    const file = $("u-file").files[0];
    if (!file) return;
    // Decoded straight from the file: no blob: URL, so a strict Content-Security-Policy (img-src
    // 'self') does not block it.
    createImageBitmap(file).then(img => {
      under.image = img; under.a = under.b = null; drawPreview(); $("u-status").textContent = "click A on the image";
    }, () => showError(`${file.name}: not an image the browser can read`));
  });
  $("u-preview").addEventListener("click", e => {
    if (!under.image) return;
    const r = e.target.getBoundingClientRect();
    const px = [(e.clientX - r.left) * (e.target.width / r.width) / under.scale,
      (e.clientY - r.top) * (e.target.height / r.height) / under.scale];
    if (!under.a || under.b) { under.a = px; under.b = null; $("u-status").textContent = "now click B"; } else {
      under.b = px; $("u-status").textContent = "A and B set: place it";
    }
    drawPreview();
  });
  $("u-place").addEventListener("click", () => {
    hideError();
    try {
      if (!under.image || !under.a || !under.b) throw new Error("open an image and click A and B on it first");
      const planA = $("u-plan-a").value.split(",").map(s => Number(s.trim()));
      const bearing = $("u-bearing").value.trim();
      const placement = module.underlayPlacement({ imageA: under.a, imageB: under.b, planA,
        distanceM: Number($("u-distance").value), ...(bearing === "" ? {} : { bearingDeg: Number(bearing) }) });
      plan.setUnderlay(under.image, placement, Number($("u-opacity").value));
      $("u-status").textContent = "placed";
    } catch (e) { showError(`underlay: ${e.message}`); }
  });
  $("u-opacity").addEventListener("input", () => {
    plan.setUnderlayOpacity(Number($("u-opacity").value));
  });
  $("u-remove").addEventListener("click", () => { plan.setUnderlay(null); $("u-status").textContent = ""; });

  // ---- animation: the shadows through the day, 5 minutes a frame; the sky follows when it stops --
  let playing = false;
  const frame = () => {
    if (!playing) return;
    const t = (Number($("time").value) + 5) % 1440;
    $("time").value = String(t);
    const { date, time } = moment();
    $("time-label").textContent = time;
    const t0 = performance.now();
    plan.setMoment(date, time);
    measured.frameTimes.push(performance.now() - t0);
    const t1 = performance.now();
    massing.setMoment(date, time);
    (measured.massingFrameTimes ||= []).push(performance.now() - t1);
    requestAnimationFrame(frame);
  };
  $("play").addEventListener("click", () => {
    playing = !playing;
    $("play").setAttribute("aria-pressed", String(playing));
    $("play").textContent = playing ? "Stop" : "Play the day";
    if (playing) requestAnimationFrame(frame); else redraw();
  });

  showSiteName("");
  const t0 = performance.now();
  await Promise.all([plan.setSite(site, false), sky.setSite(site, false), mapEl.setSite(site, false)]);
  redraw(true);
  measured.firstDrawMs = performance.now() - t0;
  measured.readyMs = performance.now(); // since navigation began
  // The browser paints the two figures before the rest is worked out: the day summary, the 3-D
  // view, the map.
  // (A hidden tab runs no animation frames: then it goes on after a tenth of a second.)
  await new Promise(resolve => { requestAnimationFrame(() => setTimeout(resolve, 0)); setTimeout(resolve, 100); });
  try { summary(); } catch (e) { showError(e); }
  // Workers for the maps, booted ahead (one per part a map is split into), so a change of map or
  // date skips their start-up.
  sunlot.startWorkersAhead(Math.min(4, navigator.hardwareConcurrency || 1));
  // The 3-D view (below the plan) after the first drawing: its scene is built once per site.
  await massing.setSite(site, false);
  const now = moment();
  massing.setMoment(now.date, now.time);
  refreshMap();
  document.body.dataset.ready = "yes";
}).catch(e => {
  document.body.dataset.ready = "error";
  const el = document.getElementById("error");
  el.hidden = false;
  el.textContent = `sunlot could not start: ${e}`;
});

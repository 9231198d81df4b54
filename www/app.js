// The demo page: the invented demo site's sun path and shadows, with date and time controls and
// exports. Classic script: works from file:// with no server and no network.
(function () {
  "use strict";
  const $ = id => document.getElementById(id);
  const pad = n => String(n).padStart(2, "0");

  function download(name, blob) {
    const a = document.createElement("a");
    a.href = URL.createObjectURL(blob);
    a.download = name;
    document.body.appendChild(a);
    a.click();
    a.remove();
  }

  const STORE = "sunlot.site";

  window.sunlot.then(module => {
    // The site: restored from the browser's storage when a valid one was saved, else the demo.
    let site = module.demoSiteText();
    let info = module.readSite(site);
    try {
      const saved = localStorage.getItem(STORE);
      if (saved) { info = module.readSite(saved); site = info.siteJson; }
    } catch (e) { /* a saved site that no longer reads: keep the demo */ }
    const state = {};
    const useSite = (text, source) => {
      const next = module.readSite(text); // throws, naming the feature, before anything changes
      site = next.siteJson;
      info = next;
      try { localStorage.setItem(STORE, site); } catch (e) { /* storage full or off: the page still works */ }
      state.mapKey = null;
      $("site-name").textContent = `${info.name}${source ? ` (from ${source})` : ""}`;
    };
    $("site-name").textContent = info.name;

    function showError(e) {
      $("error").hidden = false;
      $("error").textContent = String(e && e.message ? e.message : e);
    }

    function redraw() {
      $("error").hidden = true;
      const date = $("date").value;
      const minutes = Number($("time").value);
      const time = `${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}`;
      $("time-label").textContent = time;
      const localTime = `${date}T${time}`;
      const point = $("point").value.split(",").map(s => Number(s.trim()));
      if (point.length !== 3 || point.some(v => !Number.isFinite(v)) || point[2] < 0) {
        showError(`Sky from: "${$("point").value}" is not x, y, height in metres (e.g. 14,41,1.5)`);
        return;
      }
      const [xM, yM, zM] = point;
      try {
        $("plan").draw(module, { site, localTime });
        $("sky").draw(module, { site, year: Number(date.slice(0, 4)), localTime, xM, yM, zM });
        const day = module.dayEvents({ latitudeDeg: info.latitudeDeg, longitudeDeg: info.longitudeDeg, date,
          zone: info.zone });
        const line = module.pointTimeline({ site, xM, yM, zM, date });
        const spans = line.intervals.map(i =>
          `${i.sunlit ? "sun" : "shade"} ${i.from.slice(11, 16)}–${i.to.slice(11, 16)}${i.by ? ` (${i.by})` : ""}`);
        $("summary").textContent =
          `${date}: sunrise ${(day.sunrise || "—").slice(11, 16)}, sunset ${(day.sunset || "—").slice(11, 16)}; ` +
          `the point (${xM}, ${yM}, ${zM} m) gets ${line.sunHours.toFixed(2)} h of direct sun of ` +
          `${line.dayHours.toFixed(2)} h: ${spans.join(", ") || "no sun"}.`;
        if (state.mapKey !== `${date}/${$("layer").value}`) {
          state.mapKey = `${date}/${$("layer").value}`;
          $("map").draw(module, { site, date, show: $("layer").value, cellM: 0.5, stepMin: 5 });
        }
        state.localTime = localTime;
      } catch (e) {
        showError(e);
      }
    }

    // A click on the plan moves the point whose sky and day are shown.
    $("plan").addEventListener("sunlot-point", e => {
      const z = ($("point").value.split(",")[2] || "1.5").trim();
      $("point").value = `${e.detail.xM.toFixed(1)},${e.detail.yM.toFixed(1)},${z}`;
      redraw();
    });

    for (const id of ["date", "time", "point", "layer"]) {
      $(id).addEventListener("input", redraw);
      $(id).addEventListener("change", redraw);
    }
    document.querySelectorAll("[data-export]").forEach(b => b.addEventListener("click", async () => {
      const [which, kind] = b.dataset.export.split("-");
      const el = $(which);
      const name = `sunlot-${which}-${state.localTime || "figure"}.${kind}`;
      if (kind === "png") download(name, await el.png());
      else if (kind === "csv") download(name, new Blob([el.csv(module)], { type: "text/csv" }));
      else if (kind === "geojson") download(name, new Blob([el.geojson(module)], { type: "application/geo+json" }));
      else download(name, new Blob([el.svg(module)], { type: "image/svg+xml" }));
    }));
    $("import").addEventListener("change", async () => {
      const file = $("import").files[0];
      if (!file) return;
      try {
        useSite(await file.text(), file.name);
        redraw();
      } catch (e) {
        showError(`${file.name}: ${e.message} — the current site is unchanged.`);
      }
      $("import").value = "";
    });
    $("reset-demo").addEventListener("click", () => { useSite(module.demoSiteText(), ""); redraw(); });
    $("export-site").addEventListener("click", () =>
      download("site.sunlot.json", new Blob([site], { type: "application/json" })));

    // Animation: the shadows through the day, 5 minutes a frame; the sky chart follows when it stops.
    let playing = false;
    window.sunlotFrameTimes = [];
    const frame = () => {
      if (!playing) return;
      const t = (Number($("time").value) + 5) % 1440;
      $("time").value = String(t);
      const time = `${pad(Math.floor(t / 60))}:${pad(t % 60)}`;
      $("time-label").textContent = time;
      const t0 = performance.now();
      try {
        $("plan").draw(module, { site, localTime: `${$("date").value}T${time}` });
      } catch (e) { showError(e); playing = false; }
      window.sunlotFrameTimes.push(performance.now() - t0);
      requestAnimationFrame(frame);
    };
    $("play").addEventListener("click", () => {
      playing = !playing;
      $("play").setAttribute("aria-pressed", String(playing));
      $("play").textContent = playing ? "Stop" : "Play the day";
      if (playing) requestAnimationFrame(frame); else redraw();
    });

    // The year's sun hours on every area, in a worker, with progress and cancel.
    let job = null;
    $("year-run").addEventListener("click", () => {
      if (job) return;
      const year = $("date").value.slice(0, 4);
      $("year-progress").hidden = false;
      $("year-cancel").hidden = false;
      $("year-result").textContent = "computing…";
      job = window.sunlotRunInWorker("sunHoursMap",
        { site, cellM: 1, date: `${year}-01-01`, to: `${year}-12-31`, stepMin: 15 },
        f => { $("year-progress").value = f; });
      job.promise.then(out => {
        const v = Array.from(out.hours).filter(Number.isFinite);
        const mean = v.reduce((a, b) => a + b, 0) / v.length;
        $("year-result").textContent = `${year}: ${v.length} cells of 1 m; mean ${mean.toFixed(0)} h of direct sun ` +
          `(an open site: ${out.openHours.toFixed(0)} h), least ${Math.min(...v).toFixed(0)} h.`;
      }).catch(e => { $("year-result").textContent = e.message === "cancelled" ? "cancelled" : `error: ${e.message}`; })
        .finally(() => { job = null; $("year-progress").hidden = true; $("year-cancel").hidden = true; });
    });
    $("year-cancel").addEventListener("click", () => { if (job) job.cancel(); });

    redraw();
    document.body.dataset.ready = "yes";
  }).catch(e => {
    document.body.dataset.ready = "error";
    const el = document.getElementById("error");
    el.hidden = false;
    el.textContent = `sunlot could not start: ${e}`;
  });
})();

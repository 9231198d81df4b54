// Editing of <sunlot-plan>'s site, as a mixin over the plan view: select a footprint, move, add and
// delete its vertices, draw new volumes and areas, set fields; every edit is read back by the module
// (an edit that does not read is refused and nothing changes), recorded for undo and announced with a
// sunlot-edit event. The plan view supplies `frame`, `toPx`, `toPlan`, `overlay` and `editable`.
import { inside, openRing, ringArea, round } from "./helpers.mjs";

const near = (a, b, d = 8) => Math.hypot(a[0] - b[0], a[1] - b[1]) <= d;

export const PlanEditing = Base => class extends Base {
  #history = [];     // site texts before each edit (undo)
  #future = [];      // site texts undone (redo)
  #selected = null;  // { kind: "volumes" | "areas", id }
  #vertex = -1;      // selected vertex of the selected feature
  #drawing = null;   // { kind, points: [[x, y], …] } while drawing a new feature
  #hoverPx = null;   // the pointer while drawing, figure pixels

  siteChanged() {
    if (this.#selected && !this.feature()) this.#selected = null;
    super.siteChanged();
  }

  siteObject() { return JSON.parse(this.state.site); }
  /** The selected feature as it stands in `site` (default: the plan's site), or null. */
  feature(site = this.siteObject()) {
    if (!this.#selected) return null;
    return (site[this.#selected.kind] || []).find(f => f.id === this.#selected.id) || null;
  }
  /** The selection, { kind: "volumes" | "areas", id }, or null. */
  get selection() { return this.#selected ? { ...this.#selected } : null; }
  /** Whether a new feature is being drawn. */
  get isDrawing() { return this.#drawing !== null; }

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
    this.#remember(before);
    this.#commit(info, action);
    return true;
  }
  #remember(before) {
    this.#history.push(before);
    if (this.#history.length > 200) this.#history.shift();
    this.#future = [];
  }
  #commit(info, action) {
    this.state.site = info.siteJson;
    this.info = info;
    this.siteChanged();
    this.render();
    this.dispatchEvent(new CustomEvent("sunlot-edit", { bubbles: true, detail: { site: info.siteJson, action } }));
  }
  undo() { this.#step(this.#history, this.#future, "undo"); }
  redo() { this.#step(this.#future, this.#history, "redo"); }
  #step(from, to, action) {
    if (!from.length) return;
    const text = from.pop();
    to.push(this.state.site);
    this.#commit(this.module.readSite(text), action);
  }
  /** Forgets the edits to undo and redo (a new site was opened). */
  clearHistory() { this.#history = []; this.#future = []; }
  get canUndo() { return this.#history.length > 0; }
  get canRedo() { return this.#future.length > 0; }

  select(kind, id) {
    this.#selected = kind ? { kind, id } : null;
    this.#vertex = -1;
    this.drawOverlay();
    this.dispatchEvent(new CustomEvent("sunlot-select", { bubbles: true, detail: this.selection }));
  }
  /** Sets fields of the selected feature, e.g. { top_m: 12, status: "proposed" }. */
  setFields(fields) {
    if (!this.#selected) return false;
    const id = fields.id !== undefined && fields.id !== this.#selected.id ? fields.id : null;
    const ok = this.edit("set fields", site => { Object.assign(this.feature(site) || {}, fields); });
    if (ok && id) this.#selected = { kind: this.#selected.kind, id };
    return ok;
  }
  /** Deletes the selected vertex, or the selected feature when no vertex is selected. */
  deleteSelected() {
    if (!this.#selected) return false;
    if (this.#vertex < 0) return this.deleteFeature();
    const v = this.#vertex;
    const ok = this.edit("delete vertex", site => {
      const f = this.feature(site), r = openRing(f.outline);
      if (r.length <= 3) throw new Error("a footprint needs three vertices");
      r.splice(v, 1);
      f.outline = r;
    });
    this.#vertex = -1;
    return ok;
  }
  /** Deletes the selected feature (whatever vertex is selected). */
  deleteFeature() {
    if (!this.#selected) return false;
    const { kind, id } = this.#selected;
    const ok = this.edit(`delete ${id}`, site => { site[kind] = site[kind].filter(f => f.id !== id); });
    if (ok) this.select(null);
    return ok;
  }
  /** Starts drawing a new volume or area: clicks add vertices, Enter, a double-click or a click on
   * the first vertex finishes, Escape cancels. */
  startDrawing(kind) {
    this.#drawing = { kind, points: [] };
    this.drawOverlay();
  }
  finishDrawing() {
    const d = this.#drawing;
    this.#drawing = null;
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
  /** Escape: stops drawing, else clears the selection. */
  cancelEdit() {
    if (this.#drawing) { this.#drawing = null; this.drawOverlay(); } else this.select(null);
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

  // ---- the pointer, as the plan view passes it on ------------------------------------------------
  /** A press at figure pixel `px`: the vertex or edge midpoint handle it grabs, or null. */
  grab(px) {
    if (!this.editable || !this.#selected || this.#drawing) return null;
    const h = this.handles();
    const v = h.vertices.findIndex(p => near(p, px));
    const m = h.mids.findIndex(p => near(p, px));
    if (v >= 0) return { vertex: v, before: this.state.site };
    if (m >= 0) return { insert: m + 1, before: this.state.site };
    return null;
  }
  /** The pointer moved to `px` (figure pixels). */
  hover(px) { if (this.#drawing) { this.#hoverPx = px; this.drawOverlay(); } }
  /** A click (no drag) at figure pixel `px`, plan point `pt`, after a press that grabbed `drag`;
   * true when editing took it (else the plan announces the point). */
  editClick(px, pt, drag) {
    if (this.#drawing) {
      const first = this.#drawing.points[0];
      if (first && this.#drawing.points.length >= 3 && near(this.toPx(...first), px)) this.finishDrawing();
      else { this.#drawing.points.push(pt); this.drawOverlay(); }
      return true;
    }
    if (!this.editable) return false;
    if (drag && drag.vertex !== undefined) { this.#vertex = drag.vertex; this.drawOverlay(); return true; }
    const h = this.hit(pt);
    this.select(h && h.kind, h && h.id);
    // A click that picks a volume to edit leaves the sky point where it was: a point inside a
    // building has no sky, and the planner asked to edit, not to look.
    return Boolean(h && h.kind === "volumes");
  }
  /** A double-click: finishes a drawing (its second click added a vertex too many). */
  editDoubleClick(e) {
    if (!this.#drawing) return;
    e.preventDefault();
    this.#drawing.points.pop();
    this.finishDrawing();
  }
  /** Moves (or inserts) the grabbed vertex to plan point `pt`, drawn at once if the shape reads. */
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
  /** The drag ended: kept (and recorded for undo) if its last shape read, else undone. */
  endDrag(drag) {
    const after = this.state.site;
    if (!drag.ok) {
      this.state.site = drag.before;
      this.info = this.module.readSite(drag.before);
      this.render();
      this.fail("move vertex: that shape does not read as a footprint — the site is unchanged.");
      return;
    }
    this.#remember(drag.before);
    this.#vertex = drag.insert !== undefined ? drag.insert : drag.vertex;
    this.#commit(this.module.readSite(after), drag.insert !== undefined ? "add vertex" : "move vertex");
  }

  /** Draws the selection's handles and the feature being drawn on the overlay canvas. */
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
    if (this.editable && this.#selected) {
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
        ctx.fillStyle = i === this.#vertex ? accent : "#ffffff";
        ctx.fillRect(p[0] - 5, p[1] - 5, 10, 10);
        ctx.strokeRect(p[0] - 5, p[1] - 5, 10, 10);
      });
    }
    if (this.#drawing) {
      const pts = this.#drawing.points.map(p => this.toPx(p[0], p[1]));
      if (this.#hoverPx) pts.push(this.#hoverPx);
      ctx.beginPath();
      pts.forEach((p, i) => (i ? ctx.lineTo(...p) : ctx.moveTo(...p)));
      ctx.stroke();
      ctx.fillStyle = accent;
      pts.forEach(p => ctx.fillRect(p[0] - 3, p[1] - 3, 6, 6));
    }
  }
};

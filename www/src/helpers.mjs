// Pure helpers of the widgets and the page: clock times, rings, a map's cells as CSV, figure sizes.
// No DOM: node --test runs them (www/src/helpers.test.mjs).

export const pad = n => String(n).padStart(2, "0");
/** Minutes since midnight of a clock time "HH:MM". */
export const minutesOf = t => { const [h, m] = t.split(":").map(Number); return h * 60 + m; };
/** The clock time "HH:MM" of minutes since midnight (0–1439). */
export const timeOf = m => `${pad(Math.floor(m / 60))}:${pad(m % 60)}`;
/** Plan metres rounded to the centimetre, as the editor stores vertices. */
export const round = v => Math.round(v * 100) / 100;

/** Even-odd point-in-polygon on [[x, y], …]. */
export function inside(pt, ring) {
  let hit = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i], [xj, yj] = ring[j];
    if ((yi > pt[1]) !== (yj > pt[1]) && pt[0] < (xj - xi) * (pt[1] - yi) / (yj - yi) + xi) hit = !hit;
  }
  return hit;
}

/** The area of a ring (shoelace formula), in its units squared. */
export function ringArea(r) {
  let a = 0;
  for (let i = 0, j = r.length - 1; i < r.length; j = i++) a += (r[j][0] + r[i][0]) * (r[j][1] - r[i][1]);
  return Math.abs(a / 2);
}

/** A feature's outline without a repeated closing vertex. */
export function openRing(outline) {
  const r = outline.map(p => [p[0], p[1]]);
  const [a, b] = [r[0], r[r.length - 1]];
  if (r.length > 1 && a[0] === b[0] && a[1] === b[1]) r.pop();
  return r;
}

/** A map's cells as CSV: x_m, y_m (cell centres, plan metres) and the value in `column`, for the
 * cells with a value; `grid` as the module gives it (row-major from the bottom row). */
export function mapCsv(grid, values, column) {
  const g = grid, rows = [`x_m,y_m,${column}`];
  for (let r = 0; r < g.rows; r++) {
    for (let c = 0; c < g.cols; c++) {
      const x = values[r * g.cols + c];
      if (Number.isFinite(x)) {
        rows.push(`${(g.originXM + (g.col0 + c + 0.5) * g.cellM).toFixed(3)},` +
          `${(g.originYM + (g.row0 + r + 0.5) * g.cellM).toFixed(3)},${x.toFixed(4)}`);
      }
    }
  }
  return rows.join("\n") + "\n";
}

// Shown narrower than its design size, a figure is laid out at most this many times the width it is
// shown at (and never under MIN_FIGURE_WIDTH), so its 13-14 px text reads at 10 px or more on the
// page; exports keep the design size. For print, a little flatter than on screen (the sheet is short).
export const READING_SCALE = 1.3, MIN_FIGURE_WIDTH = 640, PRINT_ASPECT = 0.84;

/** The drawing size of a figure of design size `base` shown `shownPx` wide (null: nothing shown). */
export function fittedSize(base, shownPx) {
  if (!(shownPx > 0)) return null;
  const width = Math.round(Math.min(base.width, Math.max(MIN_FIGURE_WIDTH, shownPx * READING_SCALE)));
  return { width, height: Math.round(width * base.height / base.width) };
}

/** The drawing size of a figure of design size `base` on a printed sheet: its smallest width, so its
 * text prints large enough wherever the sheet puts it (at least 122 mm wide gives 7 pt). */
export function printedSize(base) {
  return { width: MIN_FIGURE_WIDTH, height: Math.round(PRINT_ASPECT * MIN_FIGURE_WIDTH * base.height / base.width) };
}

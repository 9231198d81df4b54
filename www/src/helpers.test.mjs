// Unit tests of the pure helpers (node --test www/src/). Expected values are worked by hand.
import { test } from "node:test";
import assert from "node:assert/strict";
import { fittedSize, inside, mapCsv, minutesOf, openRing, printedSize, ringArea, round, timeOf } from "./helpers.mjs";

test("clock times go to minutes and back, wrapping nothing", () => {
  assert.equal(minutesOf("00:00"), 0);
  assert.equal(minutesOf("15:05"), 905);
  assert.equal(timeOf(905), "15:05");
  for (let m = 0; m < 1440; m += 7) assert.equal(minutesOf(timeOf(m)), m);
});

test("vertices round to the centimetre", () => {
  assert.equal(round(12.3456), 12.35);
  assert.equal(round(-0.004), -0);
});

test("rings: point in polygon, area and the closing vertex", () => {
  const square = [[0, 0], [4, 0], [4, 4], [0, 4]];
  assert.equal(ringArea(square), 16);
  assert.equal(ringArea([...square].reverse()), 16);
  assert.ok(inside([2, 2], square));
  assert.ok(!inside([5, 2], square));
  // An L shape: the notch is outside.
  const ell = [[0, 0], [4, 0], [4, 1], [1, 1], [1, 4], [0, 4]];
  assert.equal(ringArea(ell), 7);
  assert.ok(inside([0.5, 3], ell) && !inside([3, 3], ell));
  assert.deepEqual(openRing([[0, 0], [1, 0], [1, 1], [0, 0]]), [[0, 0], [1, 0], [1, 1]]);
  assert.deepEqual(openRing([[0, 0], [1, 0], [1, 1]]), [[0, 0], [1, 0], [1, 1]]);
});

test("a map's CSV lists the cells with a value at their centres", () => {
  const grid = { cols: 2, rows: 2, originXM: 10, originYM: 20, col0: 1, row0: 0, cellM: 0.5 };
  const csv = mapCsv(grid, new Float64Array([1, NaN, 2.25, 3]), "sun_hours");
  assert.equal(csv, "x_m,y_m,sun_hours\n10.750,20.250,1.0000\n10.750,20.750,2.2500\n11.250,20.750,3.0000\n");
});

test("figures lay out at 1.3 times their shown width, between 640 px and the design width", () => {
  const base = { width: 960, height: 760 };
  assert.equal(fittedSize(base, 0), null);
  assert.deepEqual(fittedSize(base, 400), { width: 640, height: 507 });
  assert.deepEqual(fittedSize(base, 600), { width: 780, height: 618 });
  assert.deepEqual(fittedSize(base, 2000), base);
  assert.deepEqual(printedSize(base), { width: 640, height: 426 });
});

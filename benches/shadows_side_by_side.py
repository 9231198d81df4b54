"""Side by side: the shadow union of 200 volumes at one sun position, sunlot (geo) against shapely (GEOS).

Two layouts (see examples/shadow_union_timing.rs): a 20 x 10 grid town, and the first 200 volumes of
tests/fixtures/shadows_shapely.json heaped together as a stress case. The sun is at azimuth 200 deg and
altitude 25 deg; both sides build each volume's face shadows (underside, top, one quadrilateral per wall) and union
everything. sunlot's side is `examples/shadow_union_timing.rs` (median of 30 in-process runs); shapely's
is the same construction with shapely.union_all, median of 30 runs. Prints both, the ratio and the areas.

Run: ./dev bench   (or: cargo build --release --example shadow_union_timing && python3 benches/shadows_side_by_side.py)
"""
import json
import math
import os
import statistics
import subprocess
import time

import shapely
from shapely.geometry import Polygon

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
AZ, ALT = 200.0, 25.0


def faces(c, ox, oy):
    foot = Polygon(c["outer"], c["holes"])
    b, t = c["base_m"], c["top_m"]
    out = [shapely.affinity.translate(foot, ox * b, oy * b), shapely.affinity.translate(foot, ox * t, oy * t)]
    for ring in [c["outer"]] + c["holes"]:
        for i in range(len(ring)):
            (x0, y0), (x1, y1) = ring[i], ring[(i + 1) % len(ring)]
            q = Polygon([(x0 + ox * b, y0 + oy * b), (x1 + ox * b, y1 + oy * b), (x1 + ox * t, y1 + oy * t), (x0 + ox * t, y0 + oy * t)])
            if q.area > 1e-9:
                out.append(q.buffer(0))
    return out


def grid():
    """The same 20 x 10 town as examples/shadow_union_timing.rs."""
    out = []
    for i in range(20):
        for j in range(10):
            x, y = i * 18.0, j * 16.0
            h = 6.0 + (i * 7 + j * 13) % 25
            if (i + j) % 3 == 0:
                ring = [[x, y], [x + 12, y], [x + 12, y + 4], [x + 5, y + 4], [x + 5, y + 10], [x, y + 10]]
            else:
                ring = [[x, y], [x + 12, y], [x + 12, y + 10], [x, y + 10]]
            out.append({"outer": ring, "holes": [], "base_m": 0.0, "top_m": h})
    return out


def shapely_median(cases, ox, oy):
    runs = []
    for _ in range(30):
        t = time.perf_counter()
        u = shapely.union_all([f for c in cases for f in faces(c, ox, oy)])
        runs.append(time.perf_counter() - t)
    return statistics.median(runs), u.area


def main():
    pile = json.load(open(os.path.join(ROOT, "tests", "fixtures", "shadows_shapely.json")))["cases"][:200]
    k = 1 / math.tan(math.radians(ALT))
    ox, oy = -math.sin(math.radians(AZ)) * k, -math.cos(math.radians(AZ)) * k
    exe = os.path.join(ROOT, "target", "release", "examples", "shadow_union_timing")
    ours = json.loads(subprocess.run([exe], check=True, capture_output=True, text=True).stdout)
    print(f"200 volumes, sun azimuth {AZ} deg, altitude {ALT} deg; shapely {shapely.__version__} (GEOS {'.'.join(map(str, shapely.geos_version))})")
    for name, cases in (("grid", grid()), ("pile", pile)):
        theirs, area = shapely_median(cases, ox, oy)
        o = ours[name]
        print(f"{name}: sunlot (geo) median {o['median_s'] * 1e3:.2f} ms, area {o['area_m2']:.3f} m2; "
              f"shapely union_all median {theirs * 1e3:.2f} ms, area {area:.3f} m2; "
              f"ratio shapely / sunlot {theirs / o['median_s']:.2f}x")


if __name__ == "__main__":
    main()

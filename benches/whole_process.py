"""Whole processes side by side, in one run (`./dev bench`): each side started as a user would start
it, from reading the site to writing the result, so start-up and input costs count.

1. Sun hours: `sunlot hours` on the 50-block benchmark town (benches/data/town50.site.json, 500 x 500
   cells of 0.2 m, one equinox day at 5-minute steps) against benches/peer_sun_hours.py (pvlib SPA +
   shapely unions + contains_xy per cell). Prints the medians, the ratio, and how far the two maps
   differ (they should agree but for cells a step's boundary decides).
2. Shadow union: 1000 overlapping random boxes (seeded; invented) at one sun position, `sunlot
   shadows --format geojson` against a Python process building the same faces and calling
   shapely.union_all, writing GeoJSON; also shapely's union alone inside its process.

Run from the repository root after `cargo build --release`: python3 benches/whole_process.py
"""
import json
import math
import os
import random
import statistics
import subprocess
import sys
import tempfile
import time

import numpy as np
import pvlib
import shapely

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
EXE = os.path.join(ROOT, "target", "release", "sunlot")
TOWN = os.path.join(ROOT, "benches", "data", "town50.site.json")


def median_s(cmd, n):
    runs = []
    for _ in range(n):
        t = time.perf_counter()
        subprocess.run(cmd, check=True, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        runs.append(time.perf_counter() - t)
    return statistics.median(runs)


def sun_hours(work):
    ours = [EXE, "hours", TOWN, "--cell-m", "0.2", "--date", "2026-03-20", "--step-min", "5", "--format", "json", "--quiet"]
    peer = [sys.executable, os.path.join(ROOT, "benches", "peer_sun_hours.py"), TOWN, "0.2", "2026-03-20", "5", os.path.join(work, "peer.npy")]
    t_ours, t_peer = median_s(ours, 11), median_s(peer, 3)
    csv = os.path.join(work, "ours.csv")
    subprocess.run(ours + ["--cells-csv", csv], check=True, capture_output=True)
    cells = np.loadtxt(csv, delimiter=",", skiprows=1, usecols=(0, 1, 2))
    theirs = np.load(os.path.join(work, "peer.npy"))
    col = np.floor(cells[:, 0] / 0.2).astype(int)
    row = np.floor(cells[:, 1] / 0.2).astype(int)
    diff = np.abs(cells[:, 2] - theirs[row, col])
    print(f"sun hours, 500 x 500 cells, 50 volumes, equinox at 5 min, whole process: sunlot median {t_ours * 1e3:.0f} ms, "
          f"peer (pvlib {pvlib.__version__} + shapely {shapely.__version__} contains_xy) {t_peer:.2f} s: ratio {t_peer / t_ours:.0f}x")
    print(f"  maps: mean |difference| {diff.mean() * 60:.2f} min, {100 * (diff >= 1 / 60).mean():.2f} % of cells differ by a minute or more, "
          f"largest {diff.max() * 60:.1f} min (a step counted on one side only at a shadow's edge or the horizon)")


PEER_UNION = r'''
import json, math, sys, time
import shapely
from shapely.geometry import Polygon
site = json.load(open(sys.argv[1]))
az, alt = float(sys.argv[2]), float(sys.argv[3])
k = 1 / math.tan(math.radians(alt))
ox, oy = -math.sin(math.radians(az)) * k, -math.cos(math.radians(az)) * k
t = time.perf_counter()
faces = []
for v in site["volumes"]:
    ring, b, h = v["outline"], v["base_m"], v["top_m"]
    faces += [Polygon([(x + ox * z, y + oy * z) for x, y in ring]) for z in (b, h)]
    for i in range(len(ring)):
        (x0, y0), (x1, y1) = ring[i], ring[(i + 1) % len(ring)]
        faces.append(Polygon([(x0 + ox * b, y0 + oy * b), (x1 + ox * b, y1 + oy * b), (x1 + ox * h, y1 + oy * h), (x0 + ox * h, y0 + oy * h)]).buffer(0))
u = shapely.union_all(faces)
inside = time.perf_counter() - t
open(sys.argv[4], "w").write(shapely.to_geojson(u))
print(json.dumps({"union_s": inside, "area_m2": u.area}))
'''


def union(work):
    rnd = random.Random(1000)
    volumes = []
    for i in range(1000):
        x, y = rnd.uniform(0, 300), rnd.uniform(0, 300)
        w, d = rnd.uniform(4, 30), rnd.uniform(4, 30)
        volumes.append({"id": f"box{i}", "status": "existing", "base_m": 0, "top_m": round(rnd.uniform(3, 40), 2),
                        "outline": [[x, y], [x + w, y], [x + w, y + d], [x, y + d]]})
    site = {"sunlot_site": 2, "name": "1000 random boxes (invented)", "plan_rotation_deg": 0,
            "location": {"latitude_deg": 51.9, "longitude_deg": -1.2, "elevation_m": 80, "zone": "Europe/London"},
            "areas": [{"id": "all", "name": "the square", "kind": "other", "status": "existing",
                       "outline": [[0, 0], [330, 0], [330, 330], [0, 330]]}], "volumes": volumes, "walls": []}
    path = os.path.join(work, "boxes.site.json")
    json.dump(site, open(path, "w"))
    instant = "2026-03-20T14:00:00Z"
    sun = json.loads(subprocess.run([EXE, "position", "--lat", "51.9", "--lon", "-1.2", "--time", instant, "--format", "json"],
                                    check=True, capture_output=True, text=True).stdout)
    az, alt = sun["azimuth_deg"], 90 - sun["zenith_deg"]
    peer_py = os.path.join(work, "peer_union.py")
    open(peer_py, "w").write(PEER_UNION)
    ours = [EXE, "shadows", path, "--time", instant, "--format", "geojson"]
    peer = [sys.executable, peer_py, path, str(az), str(alt), os.path.join(work, "peer.geojson")]
    t_ours, t_peer = median_s(ours, 7), median_s(peer, 7)
    inside = json.loads(subprocess.run(peer, check=True, capture_output=True, text=True).stdout)
    print(f"shadow union, 1000 overlapping random boxes, whole process: sunlot median {t_ours * 1e3:.0f} ms, "
          f"python + shapely {t_peer * 1e3:.0f} ms (its union alone {inside['union_s'] * 1e3:.0f} ms): ratio {t_peer / t_ours:.2f}x")


if __name__ == "__main__":
    with tempfile.TemporaryDirectory() as work:
        sun_hours(work)
        union(work)

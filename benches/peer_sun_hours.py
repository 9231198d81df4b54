"""The peer of `sunlot hours` for benches/whole_process.py: the approach a Python GIS user would take.
pvlib-python's NREL SPA (`solarposition.get_solarposition`, method 'nrel_numpy') for the sun at each
step's midpoint, shapely (GEOS) for each step's exact shadow union (every volume's footprint at its
base and top heights and one quadrilateral per wall, `union_all`), and `shapely.contains_xy` for the
cells' centres, vectorised with numpy. Run as its own process:

    python3 benches/peer_sun_hours.py SITE CELL_M DATE STEP_MIN OUT.npy
"""
import json
import math
import sys

import numpy as np
import pandas as pd
import pvlib
import shapely
from shapely.geometry import Polygon

# The sun counts from its upper limb at the apparent horizon: -0.8333 deg for the centre (refraction
# and semi-diameter; common practice). Shadows are cast no lower than 0.01 deg, as sunlot does.
HORIZON_DEG, MIN_CAST_DEG = -0.8333, 0.01


def shadow(v, ox, oy):
    ring = v["outline"]
    faces = [Polygon([(x + ox * h, y + oy * h) for x, y in ring]) for h in (v["base_m"], v["top_m"])]
    b, t = v["base_m"], v["top_m"]
    for i in range(len(ring)):
        (x0, y0), (x1, y1) = ring[i], ring[(i + 1) % len(ring)]
        q = Polygon([(x0 + ox * b, y0 + oy * b), (x1 + ox * b, y1 + oy * b), (x1 + ox * t, y1 + oy * t), (x0 + ox * t, y0 + oy * t)])
        if q.area > 1e-9:
            faces.append(q.buffer(0))
    return faces


def main(site, cell_m, date, step_min, out):
    s = json.load(open(site))
    loc = s["location"]
    (x0, y0), (x1, y1) = s["areas"][0]["outline"][0], s["areas"][0]["outline"][2]
    xs = np.arange(math.floor(x0 / cell_m), math.ceil(x1 / cell_m)) * cell_m + cell_m / 2
    ys = np.arange(math.floor(y0 / cell_m), math.ceil(y1 / cell_m)) * cell_m + cell_m / 2
    gx, gy = np.meshgrid(xs, ys)
    start = pd.Timestamp(date, tz=loc["zone"])
    mids = pd.date_range(start, start + pd.Timedelta(days=1), freq=f"{step_min}min", inclusive="left") + pd.Timedelta(minutes=step_min / 2)
    sun = pvlib.solarposition.get_solarposition(mids, loc["latitude_deg"], loc["longitude_deg"], altitude=loc["elevation_m"], method="nrel_numpy")
    hours = np.zeros(gx.shape)
    for alt, az in zip(sun["apparent_elevation"], sun["azimuth"]):
        if alt <= HORIZON_DEG:
            continue
        k = 1 / math.tan(math.radians(max(alt, MIN_CAST_DEG)))
        ox, oy = -math.sin(math.radians(az)) * k, -math.cos(math.radians(az)) * k
        union = shapely.union_all([f for v in s["volumes"] for f in shadow(v, ox, oy)])
        shapely.prepare(union)
        hours += np.where(shapely.contains_xy(union, gx, gy), 0.0, step_min / 60)
    np.save(out, hours)


if __name__ == "__main__":
    main(sys.argv[1], float(sys.argv[2]), sys.argv[3], int(sys.argv[4]), sys.argv[5])

"""Side by side: 100,000 solar positions from one CSV file to a CSV of results, through sunlot's batch
command line and through pvlib-python's `solarposition.spa_python` (how='numpy'), in one run; prints the times and the ratio.

Both sides read the same input file (lat,lon,time,elevation_m,pressure_hpa,temperature_c) and write
zenith, altitude and azimuth per row; both use the same ΔT model (Espenak & Meeus). The accuracy of the
two outputs is compared row by row. Each side runs `--repeat` times and the median is reported.

Run: ./dev bench   (or python3 benches/side_by_side.py --rows 100000 --repeat 5 after `cargo build --release`)
"""
import argparse
import os
import statistics
import subprocess
import sys
import tempfile
import time

import numpy as np
import pandas as pd
import pvlib

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SUNLOT = os.path.join(ROOT, "target", "release", "sunlot")


def make_input(path, rows, rng):
    start = pd.Timestamp("2026-01-01T00:00:00Z").value // 10**9
    unix = rng.integers(start, start + 365 * 86400, rows)
    df = pd.DataFrame({
        "lat": np.round(rng.uniform(-60, 70, rows), 6),
        "lon": np.round(rng.uniform(-180, 180, rows), 6),
        "time": pd.to_datetime(unix, unit="s", utc=True).strftime("%Y-%m-%dT%H:%M:%SZ"),
        "elevation_m": np.round(rng.uniform(0, 2000, rows), 1),
        "pressure_hpa": np.round(rng.uniform(800, 1030, rows), 1),
        "temperature_c": np.round(rng.uniform(-10, 35, rows), 1),
    })
    df.to_csv(path, index=False)


def run_sunlot(src, dst):
    with open(src) as fin, open(dst, "w") as fout:
        subprocess.run([SUNLOT, "position", "--format", "csv"], stdin=fin, stdout=fout, check=True)


def run_pvlib(src, dst):
    df = pd.read_csv(src)
    times = pd.DatetimeIndex(pd.to_datetime(df["time"], utc=True))
    # delta_t=None: pvlib's Espenak & Meeus polynomials, as sunlot's default. Pressure in pascals.
    sp = pvlib.solarposition.spa_python(
        times, df["lat"].values, df["lon"].values, altitude=df["elevation_m"].values,
        pressure=df["pressure_hpa"].values * 100.0, temperature=df["temperature_c"].values,
        delta_t=None, atmos_refract=0.5667, how="numpy", numthreads=1)
    out = df.copy()
    out["zenith_deg"] = sp["apparent_zenith"].values
    out["altitude_deg"] = sp["apparent_elevation"].values
    out["azimuth_deg"] = sp["azimuth"].values
    out.to_csv(dst, index=False)


def timed(fn, *args, repeat):
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn(*args)
        times.append(time.perf_counter() - t)
    return statistics.median(times), times


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--rows", type=int, default=100_000)
    ap.add_argument("--repeat", type=int, default=5)
    a = ap.parse_args()
    if not os.path.exists(SUNLOT):
        sys.exit("build first: cargo build --release")
    rng = np.random.default_rng(7)
    with tempfile.TemporaryDirectory() as d:
        src = os.path.join(d, "in.csv")
        make_input(src, a.rows, rng)
        ours, theirs = os.path.join(d, "sunlot.csv"), os.path.join(d, "pvlib.csv")
        t_ours, all_ours = timed(run_sunlot, src, ours, repeat=a.repeat)
        t_theirs, all_theirs = timed(run_pvlib, src, theirs, repeat=a.repeat)
        x, y = pd.read_csv(ours), pd.read_csv(theirs)
        dz = np.abs(x["zenith_deg"] - y["zenith_deg"]).max()
        da = np.abs(((x["azimuth_deg"] - y["azimuth_deg"] + 540) % 360) - 180).max()
    print(f"rows: {a.rows}, repeats: {a.repeat}, pvlib {pvlib.__version__}, numpy {np.__version__}, pandas {pd.__version__}")
    print(f"sunlot position --format csv : median {t_ours:.3f} s  ({a.rows / t_ours:,.0f} rows/s)  runs {[round(t, 3) for t in all_ours]}")
    print(f"pvlib spa_python (numpy)     : median {t_theirs:.3f} s  ({a.rows / t_theirs:,.0f} rows/s)  runs {[round(t, 3) for t in all_theirs]}")
    print(f"ratio pvlib / sunlot: {t_theirs / t_ours:.1f}x")
    print(f"largest difference: zenith {dz:.2e} deg, azimuth {da:.2e} deg")


if __name__ == "__main__":
    main()

"""CLI benchmark of the sun-hours map: `sunlot hours` on the 50-block benchmark town
(benches/data/town50.site.json, a 500 x 500 grid of 0.2 m cells), one equinox day at 5-minute steps
and a full year at 15-minute steps, run as a user would (file in, JSON out). Prints the median wall
time of several runs and the peak resident memory of the year run.
Run from the repository root after `cargo build --release`: python3 benches/exposure_cli.py
"""
import json
import resource
import statistics
import subprocess
import time

EXE = "target/release/sunlot"
SITE = "benches/data/town50.site.json"
BASE = [EXE, "hours", SITE, "--cell-m", "0.2", "--format", "json", "--quiet"]


def run(extra, n):
    times = []
    for _ in range(n):
        t = time.perf_counter()
        out = subprocess.run(BASE + extra, check=True, capture_output=True, text=True).stdout
        times.append(time.perf_counter() - t)
    json.loads(out)
    return statistics.median(times)


day = run(["--date", "2026-03-20", "--step-min", "5"], 7)
print(f"sunlot hours, day (equinox, 5 min), 500 x 500 cells, 50 volumes: median {day * 1e3:.0f} ms (process included)")
year = run(["--date", "2026-01-01", "--to", "2026-12-31", "--step-min", "15"], 3)
peak_mb = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024
print(f"sunlot hours, year (15 min): median {year:.2f} s; peak resident memory {peak_mb:.0f} MB")

"""CLI benchmark of the sun-hours map: `sunlot hours` on the 50-block benchmark town
(benches/data/town50.site.json, a 500 x 500 grid of 0.2 m cells), one equinox day at 5-minute steps
and a full year at 15-minute steps, run as a user would (file in, JSON out). Prints the median wall
time of several runs and the peak resident memory of the year run; then the peak resident memory of
a 2000 x 2000 map (5 cm cells, the equinox at 5-minute steps) in bytes a cell.
Run from the repository root after `cargo build --release`: python3 benches/exposure_cli.py
"""
import json
import os
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


def peak_rss_bytes(cmd):
    """Peak resident memory of one run of `cmd`, bytes (its own, from wait4)."""
    p = subprocess.Popen(cmd, stdout=subprocess.DEVNULL)
    _, status, usage = os.wait4(p.pid, 0)
    if status != 0:
        raise SystemExit(f"{cmd[0]} failed")
    return usage.ru_maxrss * 1024


BIG = [EXE, "hours", SITE, "--cell-m", "0.05", "--date", "2026-03-20", "--step-min", "5", "--format", "json", "--quiet"]
peaks = sorted(peak_rss_bytes(BIG) for _ in range(3))
cells = 2000 * 2000
print(f"sunlot hours, 2000 x 2000 cells (5 cm), equinox at 5 min: peak resident memory {peaks[1] / 1e6:.1f} MB "
      f"(median of 3) = {peaks[1] / cells:.1f} bytes a cell")

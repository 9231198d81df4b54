"""A town's sun-hours map computed tile by tile on a Dask distributed cluster, each tile by the `sunlot`
binary in a worker process, stitched, and compared with the same map computed in one run.

Why Dask distributed (PyPI `distributed`): it is the engine a planning authority's GIS staff already
meet in the Python stack, it runs the same script on a laptop's local cluster of worker processes or on
a shared scheduler (`--scheduler tcp://host:8786`) without code changes, and it needs nothing of sunlot
but the binary on each worker's PATH. Every tile is independent (`sunlot tiles --index N`) and writes a
file of 32-bit floats; `sunlot stitch` refuses gaps and disagreeing overlaps, so a lost or repeated
task shows.

Run from the repository root after `cargo build --release`:

    python3 examples/city_tiles/run_tiles.py --blocks 20 --tile-cells 100 --workers 1 2

It prints one JSON line per worker count (tiles, seconds, tiles per second, equal to the single run)
and one for the halo's cost; `examples/city_tiles/test_run_tiles.py` (in `./dev test`) runs it small.
"""
import argparse
import json
import os
import subprocess
import sys
import tempfile
import time

from dask.distributed import Client, LocalCluster

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import make_town  # noqa: E402


def run_tile(exe, common, index, out):
    """One tile in a worker process: the sunlot binary, its report as JSON."""
    done = subprocess.run([exe, "tiles", *common, "--index", str(index), "--out", out, "--format", "json"],
                          check=True, capture_output=True, text=True)
    return json.loads(done.stdout)


def timed(cmd):
    t = time.perf_counter()
    done = subprocess.run(cmd, check=True, capture_output=True, text=True)
    return time.perf_counter() - t, done.stdout


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    p.add_argument("--sunlot", default=os.path.join(os.getcwd(), "target", "release", "sunlot"))
    p.add_argument("--blocks", type=int, default=20, help="blocks along each side of the invented town")
    p.add_argument("--cell-m", default="1")
    p.add_argument("--tile-cells", default="100")
    p.add_argument("--date", default="2026-03-20")
    p.add_argument("--to", default=None)
    p.add_argument("--window", default="09:00-15:00")
    p.add_argument("--workers", type=int, nargs="+", default=[2])
    p.add_argument("--scheduler", default=None, help="address of a running Dask scheduler instead of a local cluster")
    p.add_argument("--dir", default=None, help="where the tiles go (default: a temporary folder)")
    a = p.parse_args(argv)
    work = a.dir or tempfile.mkdtemp(prefix="sunlot-tiles-")
    site = os.path.join(work, "town.site.json")
    with open(site, "w") as f:
        json.dump(make_town.town(a.blocks), f)
    common = [site, "--date", a.date, "--window", a.window, "--cell-m", a.cell_m, "--tile-cells", a.tile_cells]
    if a.to:
        common += ["--to", a.to]
    plan = json.loads(subprocess.run([a.sunlot, "tiles", *common, "--format", "json"],
                                     check=True, capture_output=True, text=True).stdout)
    plan = plan if isinstance(plan, list) else [plan]
    whole = os.path.join(work, "whole.f32")
    whole_s, report = timed([a.sunlot, "tiles", *common, "--whole", "--out", whole, "--format", "json"])
    results = []
    for workers in a.workers:
        outs = [os.path.join(work, f"w{workers}-tile-{t['index']}.f32") for t in plan]
        if a.scheduler:
            client, cluster = Client(a.scheduler), None
        else:
            cluster = LocalCluster(n_workers=workers, threads_per_worker=1, processes=True,
                                   dashboard_address=None, host="127.0.0.1")
            client = Client(cluster)
        try:
            t = time.perf_counter()
            futures = client.map(run_tile, [a.sunlot] * len(plan), [common] * len(plan),
                                 [x["index"] for x in plan], outs, pure=False)
            client.gather(futures)
            tiles_s = time.perf_counter() - t
        finally:
            client.close()
            if cluster:
                cluster.close()
        stitched = os.path.join(work, f"w{workers}-stitched.f32")
        subprocess.run([a.sunlot, "stitch", *outs, "--out", stitched], check=True, capture_output=True)
        with open(stitched, "rb") as f1, open(whole, "rb") as f2:
            equal = f1.read() == f2.read()
        results.append({"workers": workers, "tiles": len(plan), "seconds": round(tiles_s, 3),
                        "tiles_per_s": round(len(plan) / tiles_s, 2), "single_run_s": round(whole_s, 3),
                        "equal_to_single_run": equal, "stitched": stitched})
        print(json.dumps(results[-1]))
    volumes = json.loads(report)["casting"]
    casting = [t["casting"] for t in plan]
    cells = sum(t["cols"] * t["rows"] for t in plan)
    # The halo's cost: each tile casts the volumes within its halo, not only those on it; summed over
    # the tiles that is this many times the one run's volumes.
    print(json.dumps({"halo": "cost", "volumes": volumes, "tile_casting_mean": round(sum(casting) / len(casting), 1),
                      "casting_sum_over_single_run": round(sum(casting) / volumes, 2), "cells": cells, "dir": work}))
    return results


if __name__ == "__main__":
    ok = all(r["equal_to_single_run"] for r in main())
    sys.exit(0 if ok else 1)

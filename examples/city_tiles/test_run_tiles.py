"""The city-scale example on a local Dask cluster of two worker processes: the stitched tiles equal
the map computed in one run, byte for byte, and a missing tile is refused. Run from the repository
root after `cargo build --release` (in `./dev test`): python3 -m unittest examples/city_tiles/test_run_tiles.py
"""
import os
import subprocess
import sys
import unittest

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import run_tiles  # noqa: E402

EXE = os.path.join(os.getcwd(), "target", "release", "sunlot")


class LocalCluster(unittest.TestCase):
    def test_tiles_on_two_workers_equal_the_single_run(self):
        # 8 x 8 blocks at 1 m cells, 40-cell tiles: 16 tiles, each cast on by the blocks in its halo.
        results = run_tiles.main(["--sunlot", EXE, "--blocks", "8", "--tile-cells", "40", "--workers", "2"])
        self.assertEqual(len(results), 1)
        r = results[0]
        self.assertEqual(r["tiles"], 16)
        self.assertTrue(r["equal_to_single_run"], r)
        # The check can fail: leave one tile out and the stitch is refused, naming the gap.
        folder = os.path.dirname(r["stitched"])
        tiles = sorted(f for f in os.listdir(folder) if f.startswith("w2-tile-"))
        done = subprocess.run([EXE, "stitch", *[os.path.join(folder, t) for t in tiles[1:]], "--out",
                               os.path.join(folder, "partial.f32")], capture_output=True, text=True)
        self.assertNotEqual(done.returncode, 0)
        self.assertIn("uncovered", done.stderr)


if __name__ == "__main__":
    unittest.main()

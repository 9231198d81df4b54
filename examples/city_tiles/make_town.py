"""Writes an invented town of blocks on a square layout as a sunlot site file, for the city-scale tile
example (examples/city_tiles/run_tiles.py): `python3 make_town.py OUT.site.json [BLOCKS_PER_SIDE]`.
Blocks are 12 m x 10 m (every third L-shaped), 6-30 m tall, on an 18 m x 16 m pitch; one area covers
the town. Invented data, as the demo's: no real place.
"""
import json
import sys


def town(n):
    volumes = []
    for i in range(n):
        for j in range(n):
            x, y = 3.0 + i * 18.0, 3.0 + j * 16.0
            h = 6.0 + (i * 7 + j * 13) % 25
            if (i + j) % 3 == 0:
                ring = [[x, y], [x + 12, y], [x + 12, y + 4], [x + 5, y + 4], [x + 5, y + 10], [x, y + 10]]
            else:
                ring = [[x, y], [x + 12, y], [x + 12, y + 10], [x, y + 10]]
            volumes.append({"id": f"b{i}-{j}", "status": "existing", "base_m": 0, "top_m": h, "outline": ring})
    w, d = n * 18.0 + 3.0, n * 16.0 + 3.0
    return {
        "sunlot_site": 2,
        "name": f"Invented town of {n * n} blocks",
        "location": {"latitude_deg": 51.9, "longitude_deg": -1.2, "elevation_m": 80, "zone": "Europe/London"},
        "plan_rotation_deg": 0,
        "areas": [{"id": "town", "name": "the whole town", "kind": "other", "status": "existing",
                   "outline": [[0, 0], [w, 0], [w, d], [0, d]]}],
        "volumes": volumes,
        "walls": [],
    }


if __name__ == "__main__":
    n = int(sys.argv[2]) if len(sys.argv) > 2 else 20
    with open(sys.argv[1], "w") as f:
        json.dump(town(n), f, indent=1)
        f.write("\n")

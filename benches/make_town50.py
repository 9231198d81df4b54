"""Writes benches/data/town50.site.json: the exposure benchmark's invented site, 50 blocks (every
fourth L-shaped, heights 6-24 m) on a 10 x 5 layout over a 100 m x 100 m area. Run from the
repository root: python3 benches/make_town50.py
"""
import json

volumes = []
for i in range(10):
    for j in range(5):
        x, y = 2.0 + i * 10.0, 5.0 + j * 20.0
        h = 6.0 + (i * 7 + j * 11) % 19
        if (i + 2 * j) % 4 == 0:
            ring = [[x, y], [x + 6, y], [x + 6, y + 4], [x + 3, y + 4], [x + 3, y + 10], [x, y + 10]]
        else:
            ring = [[x, y], [x + 6, y], [x + 6, y + 10], [x, y + 10]]
        volumes.append({"id": f"b{i}-{j}", "status": "existing" if (i + j) % 5 else "proposed",
                        "base_m": 0, "top_m": h, "outline": ring})
site = {
    "sunlot_site": 1,
    "name": "Benchmark town of 50 blocks (invented)",
    "location": {"latitude_deg": 51.9, "longitude_deg": -1.2, "elevation_m": 80, "zone": "Europe/London"},
    "plan_rotation_deg": 0,
    "areas": [{"id": "square", "name": "the whole 100 m square", "kind": "other", "status": "existing",
               "outline": [[0, 0], [100, 0], [100, 100], [0, 100]]}],
    "volumes": volumes,
    "walls": [],
}
with open("benches/data/town50.site.json", "w") as f:
    json.dump(site, f, indent=1)
    f.write("\n")

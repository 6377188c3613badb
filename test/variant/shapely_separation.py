"""Independent reference: do placed plates overlap? Shapely (Debian python3-shapely).

stdin: {"groups": [{"polygons": [[[x, y], ...], ...], "discs": [[x, y, r], ...],
                    "pairs": [[i, j], ...], "discPairs": [[polygon i, disc k], ...]}]}
stdout: {"groups": [{"pairs": [{"area": float, "distance": float}], "discPairs": [...]}]}
"""
import json
import sys

from shapely.geometry import Point, Polygon

req = json.load(sys.stdin)
out = []
for g in req["groups"]:
    polys = [Polygon(p) for p in g["polygons"]]
    discs = [Point(d[0], d[1]).buffer(d[2], resolution=64) for d in g.get("discs", [])]

    def measure(a, b):
        return {"area": a.intersection(b).area, "distance": a.distance(b)}

    out.append({
        "pairs": [measure(polys[i], polys[j]) for i, j in g["pairs"]],
        "discPairs": [measure(polys[i], discs[k]) for i, k in g.get("discPairs", [])],
    })
json.dump({"groups": out}, sys.stdout)

"""Independent reference for the web-width and edge-distance checks, by Shapely (Debian python3-shapely).

stdin: {"rings": [[[x, y], ...], ...]            contours as polygons (closed, first point not repeated),
        "pairs": [[i, j], ...]                   ring-to-ring distances wanted,
        "points": [{"p": [x, y], "rings": [k, ...]}, ...]  point to nearest of the rings,
        "necks": [{"ring": k, "hi": float}]       narrowest neck of a ring's polygon: the smallest width w
                                                  whose erosion by w/2 disconnects it, by bisection on
                                                  negative buffers (a method independent of framewright's)}
stdout: {"pairs": [float, ...], "points": [float, ...], "necks": [float, ...]}
"""
import json
import sys

from shapely.geometry import LinearRing, Point, Polygon

req = json.load(sys.stdin)
rings = [LinearRing(r) for r in req["rings"]]
pairs = [rings[i].distance(rings[j]) for i, j in req.get("pairs", [])]
points = [min(Point(q["p"]).distance(rings[k]) for k in q["rings"]) for q in req.get("points", [])]


def parts(geom):
    if geom.is_empty:
        return 0
    return len(getattr(geom, "geoms", [geom]))


necks = []
for n in req.get("necks", []):
    poly = Polygon(req["rings"][n["ring"]])
    lo, hi = 0.0, n["hi"]
    for _ in range(40):
        mid = (lo + hi) / 2
        if parts(poly.buffer(-mid / 2, resolution=256)) >= 2:
            hi = mid
        else:
            lo = mid
    necks.append((lo + hi) / 2)

json.dump({"pairs": pairs, "points": points, "necks": necks}, sys.stdout)

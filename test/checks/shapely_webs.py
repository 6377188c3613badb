"""Independent reference for the web-width and edge-distance checks, by Shapely (Debian python3-shapely).

stdin: {"rings": [[[x, y], ...], ...]            contours as polygons (closed, first point not repeated),
        "pairs": [[i, j], ...]                   ring-to-ring distances wanted,
        "points": [{"p": [x, y], "rings": [k, ...]}, ...]  point to nearest of the rings,
        "necks": [{"ring": k, "hi": float, "step": float}]       narrowest neck of a ring's polygon: the smallest width w
                                                  whose erosion by w/2 disconnects it, by bisection on
                                                  negative buffers (a method independent of framewright's):
                                                  a scan in steps of "step" (default 0.5) up to "hi", then
                                                  bisection; null when nothing splits up to "hi" (or the
                                                  shape vanishes whole instead of splitting)}
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

    def split(w):
        # Split into pieces, or already gone: the neck is narrower than w.
        k = parts(poly.buffer(-w / 2, resolution=256))
        return k >= 2 or k == 0

    # Splitting is not monotone in w (a piece may vanish later), so scan for the first split in
    # steps of `step`, then bisect inside that step.
    step = n.get("step", 0.5)
    lo, hi = 0.0, None
    w = step
    while w <= n["hi"] + 1e-12:
        if split(w):
            hi = w
            break
        lo = w
        w += step
    if hi is None:
        necks.append(None)
        continue
    for _ in range(30):
        mid = (lo + hi) / 2
        if split(mid):
            hi = mid
        else:
            lo = mid
    # A shape that only vanishes (its widest inscribed disc goes last) has no neck.
    gone = parts(poly.buffer(-hi / 2, resolution=256)) == 0
    necks.append(None if gone else (lo + hi) / 2)

json.dump({"pairs": pairs, "points": points, "necks": necks}, sys.stdout)

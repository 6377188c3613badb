"""Independent figures for the assembly fit checks, computed with Shapely (GEOS).

stdin: {"overlaps": [{"a": [rings], "b": [rings]}], "distances": [{"point": [x, y], "rings": [rings]}],
        "outside": [{"inner": [rings], "outer": [rings]}],
        "overhangs": [{"centres": [[x, y]], "radius": r, "arm": [rings], "body": [rings]}]}
Each "rings" list is an outer ring followed by hole rings, as [[x, y], ...].
stdout: {"overlaps": [area], "distances": [signed distance, negative inside],
         "outside": [[area outside, largest distance of an inner vertex outside]],
         "overhangs": [area of the arm under the convex hull of the head discs that lies outside the body]}
"""
import json
import sys

from shapely.geometry import Point, Polygon
from shapely.ops import unary_union


def poly(rings):
    return Polygon(rings[0], rings[1:]).buffer(0)


def main():
    data = json.load(sys.stdin)
    out = {"overlaps": [], "distances": [], "outside": [], "overhangs": []}
    for case in data.get("overlaps", []):
        out["overlaps"].append(poly(case["a"]).intersection(poly(case["b"])).area)
    for case in data.get("distances", []):
        p = poly(case["rings"])
        pt = Point(case["point"])
        d = p.exterior.distance(pt)
        out["distances"].append(-d if p.contains(pt) else p.distance(pt))
    for case in data.get("outside", []):
        inner = poly(case["inner"])
        outer = poly(case["outer"])
        reach = max(outer.distance(Point(v)) for v in case["inner"][0])
        out["outside"].append([inner.difference(outer).area, reach])
    for case in data.get("overhangs", []):
        heads = unary_union([Point(c).buffer(case["radius"], 256) for c in case["centres"]])
        clamped = heads.convex_hull.intersection(poly(case["arm"]))
        out["overhangs"].append(clamped.difference(poly(case["body"])).area)
    json.dump(out, sys.stdout)


main()

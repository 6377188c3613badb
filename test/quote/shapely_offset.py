"""Independent tool-centre path lengths for framewright's quote tests, by Shapely (GEOS) buffers.

stdin: {"cases": [{"points": [[x, y], ...], "dist": r, "inward": bool}]}, each polygon counter-clockwise.
stdout: {"lengths": [...], "areas": [...]} — for an outline (inward false) the exterior of the polygon
grown by r; for a hole (inward true) the boundary of the hole shrunk by r (0 when nothing is left).
"""
import json
import sys

from shapely.geometry import Polygon

data = json.load(sys.stdin)
lengths = []
areas = []
for case in data["cases"]:
    poly = Polygon(case["points"])
    if case["inward"]:
        shape = poly.buffer(-case["dist"], resolution=512)
    else:
        shape = poly.buffer(case["dist"], resolution=512)
    if shape.is_empty:
        lengths.append(0.0)
        areas.append(0.0)
        continue
    geoms = list(shape.geoms) if hasattr(shape, "geoms") else [shape]
    lengths.append(sum(g.exterior.length for g in geoms))
    areas.append(sum(Polygon(g.exterior).area for g in geoms))
json.dump({"lengths": lengths, "areas": areas}, sys.stdout)

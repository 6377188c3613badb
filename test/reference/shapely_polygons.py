"""Independent reference: validity, area and point containment of polygons by Shapely (Debian python3-shapely).

stdin: {"polygons": [{"shell": [[x, y], ...], "holes": [[[x, y], ...], ...]}],
        "points": [[x, y], ...]   (optional, tested against every polygon),
        "union": [[[x, y], ...], ...] (optional, polygons to union)}
stdout: {"polygons": [{"valid": bool, "reason": str, "area": float, "contains": [bool, ...]}], "unionArea": float | null}
"""
import json
import sys

from shapely.geometry import Point, Polygon
from shapely.ops import unary_union
from shapely.validation import explain_validity

req = json.load(sys.stdin)
pts = [Point(p) for p in req.get("points", [])]
out = []
for p in req.get("polygons", []):
    poly = Polygon(p["shell"], p.get("holes", []))
    out.append({
        "valid": bool(poly.is_valid),
        "reason": explain_validity(poly),
        "area": poly.area,
        "contains": [bool(poly.contains(q)) for q in pts],
    })
union_area = None
if req.get("union"):
    union_area = unary_union([Polygon(s) for s in req["union"]]).area
json.dump({"polygons": out, "unionArea": union_area}, sys.stdout)

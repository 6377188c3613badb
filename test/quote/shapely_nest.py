"""Independent check of a nested sheet layout with Shapely (GEOS).

stdin: {"spacing": s, "margin": m, "sheets": [{"width": W, "height": H, "parts": [part, ...]}]}
(each part its outline polygon [[x, y], ...] in sheet coordinates, or {"shell": outline, "holes": [inner
contour, ...]} when other parts may sit in its windows; the material is then the outline minus holes).
"inWindows" counts parts that lie inside the outline of another part (in one of its windows).
stdout: {"minGap": smallest distance between the material of two parts on one sheet (null with < 2 parts),
         "overlaps": pairs whose interiors intersect, "outside": parts not inside the margin box,
         "minEdge": smallest distance from a part to the sheet edge, "parts": count, "inWindows": n}
"""
import json
import sys

from shapely.geometry import Polygon, box

data = json.load(sys.stdin)
s = data["spacing"]
m = data["margin"]
min_gap = None
overlaps = 0
outside = 0
min_edge = None
count = 0
in_windows = 0
for sheet in data["sheets"]:
    polys = [Polygon(p["shell"], p.get("holes", [])) if isinstance(p, dict) else Polygon(p) for p in sheet["parts"]]
    shells = [Polygon(p.exterior) for p in polys]
    count += len(polys)
    inner = box(m, m, sheet["width"] - m, sheet["height"] - m)
    for p in polys:
        if not inner.buffer(1e-6).contains(p):
            outside += 1
        minx, miny, maxx, maxy = p.bounds
        e = min(minx, miny, sheet["width"] - maxx, sheet["height"] - maxy)
        min_edge = e if min_edge is None else min(min_edge, e)
    bounds = [p.bounds for p in polys]
    for i, p in enumerate(polys):
        a = bounds[i]
        for j in range(i + 1, len(polys)):
            b = bounds[j]
            # Parts whose boxes are more than 2 spacings apart cannot set the minimum gap.
            if a[0] > b[2] + 2 * s or b[0] > a[2] + 2 * s or a[1] > b[3] + 2 * s or b[1] > a[3] + 2 * s:
                continue
            if p.intersection(polys[j]).area > 1e-9:
                overlaps += 1
            if shells[i].contains(polys[j]) or shells[j].contains(p):
                in_windows += 1
            d = p.distance(polys[j])
            min_gap = d if min_gap is None else min(min_gap, d)
json.dump({"minGap": min_gap, "overlaps": overlaps, "outside": outside, "minEdge": min_edge, "parts": count, "inWindows": in_windows}, sys.stdout)

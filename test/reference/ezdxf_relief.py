"""Independent reference for corner reliefs: read a DXF with ezdxf (Debian python3-ezdxf), audit it,
and ask Shapely (python3-shapely) which drawn corners a round tool can reach.

stdin: {"path": str, "toolRadius": float, "corners": [[x, y], ...]}
stdout: {"errors": int, "fixes": int, "innerContours": int, "minArcRadius": float | null,
         "reached": [bool, ...], "gap": [float, ...]}
A corner is reached when it lies within 0.01 mm of the void's opening by the tool (the union of every
tool disc that fits inside an inner contour): erode by the radius, grow back by it.
"""
import json
import math
import sys

import ezdxf
from ezdxf import path as ezpath
from shapely.geometry import Point, Polygon
from shapely.ops import unary_union

req = json.load(sys.stdin)
doc = ezdxf.readfile(req["path"])
auditor = doc.audit()
r = req["toolRadius"]
voids = []
min_arc = None
for e in doc.modelspace():
    if e.dxf.layer != "CUT_INSIDE" or e.dxftype() not in ("LWPOLYLINE", "POLYLINE"):
        continue
    pts = [(p.x, p.y) for p in ezpath.make_path(e).flattening(0.0005)]
    voids.append(Polygon(pts))
    # Radii of the bulged spans: r = chord / (2 sin(sweep / 2)), sweep = 4 atan(bulge).
    verts = list(e.get_points("xyb")) if e.dxftype() == "LWPOLYLINE" else [(v.dxf.location.x, v.dxf.location.y, v.dxf.bulge) for v in e.vertices]
    for i, (x, y, b) in enumerate(verts):
        if abs(b) < 1e-12:
            continue
        nx, ny = verts[(i + 1) % len(verts)][:2]
        sweep = 4 * math.atan(b)
        rad = math.hypot(nx - x, ny - y) / (2 * math.sin(abs(sweep) / 2))
        min_arc = rad if min_arc is None else min(min_arc, rad)
opened = unary_union([v.buffer(-r, resolution=64).buffer(r, resolution=64) for v in voids])
gaps = [opened.distance(Point(c)) for c in req["corners"]]
json.dump({
    "errors": len(auditor.errors),
    "fixes": len(auditor.fixes),
    "innerContours": len(voids),
    "minArcRadius": min_arc,
    "reached": [g <= 0.01 for g in gaps],
    "gap": gaps,
}, sys.stdout)

#!/usr/bin/python3
"""Ground truth for imported DXF parts, from two tools framewright did not write: ezdxf reads the
drawing, explodes blocks (ezdxf.disassemble) and polylines (virtual_entities) and gives points on
every curve (the entities' own flattening: points on the true circle, ellipse or NURBS, chords
within 1e-4 mm; not ezdxf.path, whose Bezier arcs stray by 2.7e-4 of the radius); Shapely nodes
the lines, finds the faces and measures them.

stdin: {"file": path, "mmPerUnit": k}
stdout: {"polygons": [{area, length, bounds, interiors, minHoleEdgeWeb, minHoleHoleWeb, minEdgeRatio,
         holes: [[cx, cy, d]...]}]}, sorted by bounds (min x, then min y).
"""
import json
import math
import sys
from functools import reduce

import ezdxf
from ezdxf import disassemble
from shapely.geometry import LineString, Point, Polygon
from shapely.ops import polygonize, unary_union

CURVES = {"LINE", "ARC", "CIRCLE", "LWPOLYLINE", "POLYLINE", "ELLIPSE", "SPLINE"}


def main():
    req = json.load(sys.stdin)
    k = req["mmPerUnit"]
    doc = ezdxf.readfile(req["file"])
    lines = []
    def points(e):
        t = e.dxftype()
        if t == "LINE":
            return [e.dxf.start, e.dxf.end]
        if t in ("LWPOLYLINE", "POLYLINE"):
            return None
        sagitta = 1e-4 / k
        return list(e.flattening(sagitta)) if t != "CIRCLE" else list(e.flattening(sagitta)) + [list(e.flattening(sagitta))[0]]

    todo = [e for e in disassemble.recursive_decompose(doc.modelspace()) if e.dxftype() in CURVES]
    while todo:
        e = todo.pop()
        pts = points(e)
        if pts is None:
            todo.extend(e.virtual_entities())
            continue
        pts = [(round(v[0] * k, 6), round(v[1] * k, 6)) for v in pts]
        if len(pts) >= 2:
            lines.append(LineString(pts))
    faces = list(polygonize(unary_union(lines)))
    rings = [Polygon(f.exterior) for f in faces]
    material = reduce(lambda a, b: a.symmetric_difference(b), rings)
    polys = list(material.geoms) if material.geom_type == "MultiPolygon" else [material]
    out = []
    for poly in polys:
        ext = poly.exterior
        interiors = list(poly.interiors)
        holes = []
        free = [ext]
        for r in interiors:
            c = Polygon(r).centroid
            ds = [math.dist((c.x, c.y), q) for q in r.coords]
            # Round: every vertex at one distance from the centroid and the area of that circle.
            rad = sum(ds) / len(ds)
            if max(ds) - min(ds) < 1e-3 and abs(Polygon(r).area - math.pi * rad * rad) < 1e-3 * Polygon(r).area:
                holes.append((r, c, 2 * sum(ds) / len(ds)))
            else:
                free.append(r)
        hole_edge = min((r.distance(ext) for r in interiors), default=None)
        hole_hole = None
        for i in range(len(interiors)):
            for j in range(i + 1, len(interiors)):
                d = interiors[i].distance(interiors[j])
                hole_hole = d if hole_hole is None else min(hole_hole, d)
        free_union = unary_union(free)
        ratios = [c.distance(free_union) / d for (_, c, d) in holes]
        out.append({
            "area": poly.area,
            "length": ext.length + sum(r.length for r in interiors),
            "bounds": list(poly.bounds),
            "interiors": len(interiors),
            "minHoleEdgeWeb": hole_edge,
            "minHoleHoleWeb": hole_hole,
            "minEdgeRatio": min(ratios) if ratios else None,
            "holes": sorted([[c.x, c.y, d] for (_, c, d) in holes]),
        })
    out.sort(key=lambda p: (round(p["bounds"][0], 6), round(p["bounds"][1], 6)))
    json.dump({"polygons": out}, sys.stdout)


main()

#!/usr/bin/python3
"""Independent reference for framewright's plate modes: the same plate meshed by gmsh (second-order
triangles) and solved by CalculiX (ccx) with S6 shell elements, woven orthotropic material rotated by
the weave angle, the same supports and point masses.

stdin: JSON {
  "loops": [[segment, ...], ...]   outline first, then holes; segment = {"kind": "line", "start", "end"}
                                   or {"kind": "arc", "center", "radius", "startRad", "sweepRad"} (mm, rad)
  "thicknessMm", "weaveRad", "material": {"e1Gpa", "e2Gpa", "g12Gpa", "nu12", "densityGPerCm3"},
  "sizeMm": element size, "modes": number of modes,
  "fixedLoops": [loop index, ...]  nodes on these loops held in translation (ccx DOFs 1-3)
  "masses": [{"loops": [loop index, ...], "massG": g}]  spread evenly over the nodes on those loops
  "clampFootprints": [{"centre": [x, y], "radiusMm": r}]  every node within r held in all six DOFs
  "rigidMasses": [{"footprints": [{"centre", "radiusMm"} or {"loop": index}], "massG", "cgMm": [x, y, z], "diameterMm", "heightMm"}]
                                   a solid cylinder's mass and inertia at cg, rigid with the footprint nodes
}
stdout: JSON {"frequenciesHz": [...], "nodes": n, "elements": m}
Units in the deck: mm, N, tonne, s (so MPa and t/mm^3). Set FW_CCX_KEEP=DIR to keep the gmsh and ccx files.
Through-thickness constants are not given by the woven sheet's data: E3 = 10 GPa, nu13 = nu23 = 0.3,
G13 = G23 = G12 (typical for a woven carbon/epoxy laminate; from memory).
"""
import json
import math
import os
import re
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from ccx_deck import Deck, cylinder_inertia, read_inp_mesh, run_frequencies  # noqa: E402


def arc_pieces(seg):
    """Split an arc into pieces of at most 90 degrees (gmsh circle arcs must be below 180)."""
    n = max(1, math.ceil(abs(seg["sweepRad"]) / (math.pi / 2) - 1e-9))
    out = []
    for i in range(n):
        a0 = seg["startRad"] + seg["sweepRad"] * i / n
        a1 = seg["startRad"] + seg["sweepRad"] * (i + 1) / n
        out.append((a0, a1))
    return out


def write_geo(spec, path, rings=()):
    """rings: [(cx, cy, r)] circles of points embedded in the surface (a screw head's edge), only where
    the point lies inside the material (tested by the caller through `inside`)."""
    lines = [f"Mesh.CharacteristicLengthMax = {spec['sizeMm']};", f"Mesh.CharacteristicLengthMin = {spec['sizeMm'] / 4};",
             "Mesh.ElementOrder = 2;", "Mesh.SecondOrderLinear = 0;", "Mesh.Algorithm = 6;",
             "Mesh.CharacteristicLengthExtendFromBoundary = 0;", "Mesh.MinimumCirclePoints = 8;"]
    pid = [0]
    cid = [0]
    points = {}

    def point(x, y):
        key = (round(x, 7), round(y, 7))
        if key in points:
            return points[key]
        pid[0] += 1
        lines.append(f"Point({pid[0]}) = {{{x!r}, {y!r}, 0, {spec['sizeMm']}}};")
        points[key] = pid[0]
        return pid[0]

    loop_ids = []
    for li, loop in enumerate(spec["loops"]):
        curves = []
        for seg in loop:
            if seg["kind"] == "line":
                a = point(*seg["start"])
                b = point(*seg["end"])
                if a == b:
                    continue
                cid[0] += 1
                lines.append(f"Line({cid[0]}) = {{{a}, {b}}};")
                curves.append(cid[0])
            else:
                cx, cy = seg["center"]
                r = seg["radius"]
                for a0, a1 in arc_pieces(seg):
                    a = point(cx + r * math.cos(a0), cy + r * math.sin(a0))
                    b = point(cx + r * math.cos(a1), cy + r * math.sin(a1))
                    if a == b:
                        continue
                    c = point(cx, cy)
                    cid[0] += 1
                    lines.append(f"Circle({cid[0]}) = {{{a}, {c}, {b}}};")
                    curves.append(cid[0])
        lines.append(f"Curve Loop({li + 1}) = {{{', '.join(map(str, curves))}}};")
        loop_ids.append(li + 1)
    lines.append(f"Plane Surface(1) = {{{', '.join(map(str, loop_ids))}}};")
    embedded = []
    for cx, cy, r in rings:
        n = max(12, math.ceil(2 * math.pi * r / spec["sizeMm"] - 1e-9))
        for k in range(n):
            x, y = cx + r * math.cos(2 * math.pi * k / n), cy + r * math.sin(2 * math.pi * k / n)
            if inside(spec["loops"], (x, y)) and boundary_distance(spec["loops"], (x, y)) > 0.35 * 2 * math.pi * r / n:
                embedded.append(point(x, y))
    if embedded:
        lines.append(f"Point{{{', '.join(map(str, embedded))}}} In Surface{{1}};")
    lines.append("Physical Surface(1) = {1};")
    with open(path, "w") as f:
        f.write("\n".join(lines) + "\n")


def flatten(loop, step=0.05):
    """Points along a loop (for inside tests), arcs at about `step` radians."""
    pts = []
    for seg in loop:
        if seg["kind"] == "line":
            pts.append(tuple(seg["start"]))
        else:
            n = max(2, math.ceil(abs(seg["sweepRad"]) / step))
            for i in range(n):
                a = seg["startRad"] + seg["sweepRad"] * i / n
                pts.append((seg["center"][0] + seg["radius"] * math.cos(a), seg["center"][1] + seg["radius"] * math.sin(a)))
    return pts


def inside(loops, p):
    """Even-odd rule over all loops: inside the outline and outside every hole."""
    x, y = p
    c = False
    for loop in loops:
        pts = flatten(loop)
        for i in range(len(pts)):
            (x1, y1), (x2, y2) = pts[i], pts[i - 1]
            if (y1 > y) != (y2 > y) and x < (x2 - x1) * (y - y1) / (y2 - y1) + x1:
                c = not c
    return c


def boundary_distance(loops, p):
    return min(seg_distance(s, p) for loop in loops for s in loop)


def mesh_plate(spec, workdir, name, rings=()):
    """gmsh second-order triangles of one plate: ({node id: (x, y)}, [[6 node ids], ...])."""
    geo = os.path.join(workdir, f"{name}.geo")
    inp = os.path.join(workdir, f"{name}.inp")
    write_geo(spec, geo, rings)
    subprocess.run(["gmsh", "-2", "-order", "2", geo, "-format", "inp", "-o", inp], check=True, capture_output=True)
    return read_inp(inp)


def read_inp(path):
    return read_inp_mesh(path, ("CPS6", "STRI65", "S6"), 2, 6)


def seg_distance(seg, p):
    x, y = p
    if seg["kind"] == "line":
        (ax, ay), (bx, by) = seg["start"], seg["end"]
        dx, dy = bx - ax, by - ay
        l2 = dx * dx + dy * dy
        t = 0 if l2 == 0 else max(0, min(1, ((x - ax) * dx + (y - ay) * dy) / l2))
        return math.hypot(x - ax - t * dx, y - ay - t * dy)
    cx, cy = seg["center"]
    ang = math.atan2(y - cy, x - cx)
    sweep = seg["sweepRad"]
    rel = (ang - seg["startRad"]) % (2 * math.pi) if sweep >= 0 else (seg["startRad"] - ang) % (2 * math.pi)
    if rel <= abs(sweep) + 1e-9:
        return abs(math.hypot(x - cx, y - cy) - seg["radius"])
    ends = [seg["startRad"], seg["startRad"] + sweep]
    return min(math.hypot(x - cx - seg["radius"] * math.cos(a), y - cy - seg["radius"] * math.sin(a)) for a in ends)


def nodes_on(spec, nodes, loop_indices):
    tol = 1e-4 * spec["sizeMm"]
    out = []
    for nid, p in nodes.items():
        if any(min(seg_distance(s, p) for s in spec["loops"][li]) < tol for li in loop_indices):
            out.append(nid)
    return out


def within(nodes, centre, radius):
    """Node ids within radius of a point (a screw head's footprint)."""
    tol = 1e-6 * max(1.0, radius)
    return [n for n, (x, y) in nodes.items() if math.hypot(x - centre[0], y - centre[1]) <= radius + tol]


def main():
    spec = json.load(sys.stdin)
    m = spec["material"]
    with tempfile.TemporaryDirectory(prefix="fw-ccx-") as d:
        d = os.environ.get("FW_CCX_KEEP", d)
        os.makedirs(d, exist_ok=True)
        rings = [(f["centre"][0], f["centre"][1], f["radiusMm"]) for f in spec.get("clampFootprints", [])]
        rings += [(f["centre"][0], f["centre"][1], f["radiusMm"]) for b in spec.get("rigidMasses", []) for f in b["footprints"] if "centre" in f]
        nodes, elems = mesh_plate(spec, d, "plate", rings)
        deck = Deck()
        deck.nodes = [(n, x, y, 0.0) for n, (x, y) in nodes.items()]
        deck.next_node = max(nodes) + 1
        deck.woven("WOVEN", m)
        deck.woven("WOVENS", m, stiffen=1000.0)
        c, s = math.cos(spec["weaveRad"]), math.sin(spec["weaveRad"])
        tied_nodes = {n for b in spec.get("rigidMasses", []) for f in b["footprints"] if "centre" in f for n in within(nodes, f["centre"], f["radiusMm"])}
        deck.shells_with_patches(elems, "WOVEN", spec["thicknessMm"], (c, s, 0), (-s, c, 0), tied_nodes)
        fixed = nodes_on(spec, nodes, spec.get("fixedLoops", []))
        if fixed:
            deck.lines.append("*BOUNDARY")
            deck.lines += [f"{n}, 1, 3" for n in fixed]
        clamped = sorted({n for f in spec.get("clampFootprints", []) for n in within(nodes, f["centre"], f["radiusMm"])})
        if clamped:
            deck.lines.append("*BOUNDARY")
            deck.lines += [f"{n}, 1, 6" for n in clamped]
        for mass in spec.get("masses", []):
            on = nodes_on(spec, nodes, mass["loops"])
            if not on:
                raise SystemExit(f"no nodes on mass loops {mass['loops']}")
            deck.point_masses([(n, mass["massG"] * 1e-6 / len(on)) for n in on])
        for body in spec.get("rigidMasses", []):
            tied = sorted({n for f in body["footprints"] for n in (within(nodes, f["centre"], f["radiusMm"]) if "centre" in f else nodes_on(spec, nodes, [f["loop"]]))})
            mt = body["massG"] * 1e-6
            deck.rigid_mass(tied, mt, body["cgMm"], cylinder_inertia(mt, body["diameterMm"], body["heightMm"]))
        deck.write(os.path.join(d, "job.inp"), spec["modes"])
        freqs = run_frequencies(d)
    json.dump({"frequenciesHz": freqs, "nodes": len(nodes), "elements": len(elems)}, sys.stdout)


if __name__ == "__main__":
    main()

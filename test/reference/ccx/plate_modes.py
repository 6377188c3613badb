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


def arc_pieces(seg):
    """Split an arc into pieces of at most 90 degrees (gmsh circle arcs must be below 180)."""
    n = max(1, math.ceil(abs(seg["sweepRad"]) / (math.pi / 2) - 1e-9))
    out = []
    for i in range(n):
        a0 = seg["startRad"] + seg["sweepRad"] * i / n
        a1 = seg["startRad"] + seg["sweepRad"] * (i + 1) / n
        out.append((a0, a1))
    return out


def write_geo(spec, path):
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
    lines.append("Physical Surface(1) = {1};")
    with open(path, "w") as f:
        f.write("\n".join(lines) + "\n")


def read_inp(path):
    nodes = {}
    elems = []
    mode = None
    with open(path) as f:
        for raw in f:
            line = raw.strip()
            if not line:
                continue
            if line.startswith("*"):
                up = line.upper()
                if up.startswith("*NODE"):
                    mode = "node"
                elif up.startswith("*ELEMENT") and ("CPS6" in up or "STRI65" in up or "S6" in up):
                    mode = "elem"
                else:
                    mode = None
                continue
            parts = [p for p in line.split(",") if p.strip()]
            if mode == "node":
                nodes[int(parts[0])] = (float(parts[1]), float(parts[2]))
            elif mode == "elem":
                elems.append([int(p) for p in parts[1:7]])
    used = sorted({n for e in elems for n in e})
    return {n: nodes[n] for n in used}, elems


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


def main():
    spec = json.load(sys.stdin)
    m = spec["material"]
    with tempfile.TemporaryDirectory(prefix="fw-ccx-") as d:
        d = os.environ.get("FW_CCX_KEEP", d)
        os.makedirs(d, exist_ok=True)
        geo = os.path.join(d, "plate.geo")
        inp = os.path.join(d, "mesh.inp")
        write_geo(spec, geo)
        subprocess.run(["gmsh", "-2", "-order", "2", geo, "-format", "inp", "-o", inp], check=True, capture_output=True)
        nodes, elems = read_inp(inp)
        deck = ["*NODE"]
        deck += [f"{n}, {x:.12g}, {y:.12g}, 0" for n, (x, y) in nodes.items()]
        deck.append("*ELEMENT, TYPE=S6, ELSET=EPLATE")
        deck += [f"{i + 1}, " + ", ".join(map(str, e)) for i, e in enumerate(elems)]
        e1, e2, g12 = m["e1Gpa"] * 1000, m["e2Gpa"] * 1000, m["g12Gpa"] * 1000
        deck += ["*MATERIAL, NAME=WOVEN", "*ELASTIC, TYPE=ENGINEERING CONSTANTS",
                 f"{e1}, {e2}, 10000, {m['nu12']}, 0.3, 0.3, {g12}, {g12},", f"{g12}, 0",
                 "*DENSITY", f"{m['densityGPerCm3'] * 1e-9:.10g}"]
        c, s = math.cos(spec["weaveRad"]), math.sin(spec["weaveRad"])
        deck += ["*ORIENTATION, NAME=WEAVE", f"{c:.12g}, {s:.12g}, 0, {-s:.12g}, {c:.12g}, 0"]
        deck += ["*SHELL SECTION, ELSET=EPLATE, MATERIAL=WOVEN, ORIENTATION=WEAVE", f"{spec['thicknessMm']}"]
        fixed = nodes_on(spec, nodes, spec.get("fixedLoops", []))
        if fixed:
            deck.append("*BOUNDARY")
            deck += [f"{n}, 1, 3" for n in fixed]
        eid = len(elems)
        for k, mass in enumerate(spec.get("masses", [])):
            on = nodes_on(spec, nodes, mass["loops"])
            if not on:
                raise SystemExit(f"no nodes on mass loops {mass['loops']}")
            deck.append(f"*ELEMENT, TYPE=MASS, ELSET=EMASS{k}")
            for n in on:
                eid += 1
                deck.append(f"{eid}, {n}")
            deck += [f"*MASS, ELSET=EMASS{k}", f"{mass['massG'] * 1e-6 / len(on):.10g}"]
        deck += ["*STEP", "*FREQUENCY", f"{spec['modes']}", "*END STEP"]
        with open(os.path.join(d, "job.inp"), "w") as f:
            f.write("\n".join(deck) + "\n")
        subprocess.run(["ccx", "job"], cwd=d, check=True, capture_output=True, env={**os.environ, "OMP_NUM_THREADS": "1"})
        with open(os.path.join(d, "job.dat")) as f:
            dat = f.read()
    block = dat.split("E I G E N V A L U E   O U T P U T")[1]
    freqs = []
    for line in block.splitlines():
        mm = re.match(r"\s*(\d+)\s+(\S+)\s+(\S+)\s+(\S+)\s+(\S+)", line)
        if mm:
            freqs.append(float(mm.group(4)))
        elif freqs and line.strip() == "":
            break
    json.dump({"frequenciesHz": freqs, "nodes": len(nodes), "elements": len(elems)}, sys.stdout)


if __name__ == "__main__":
    main()

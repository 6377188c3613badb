#!/usr/bin/python3
"""Independent CalculiX reference for the assembled frame's modes, written from the cut files and the
design file alone (nothing from framewright's source): the plate DXFs that `framewright build` writes
(read with ezdxf), what its assembly.json says things weigh and where (components: masses, boxes,
mount points; each joint's screw, nut and washer; each spacer), the design YAML (read with PyYAML,
the schema's defaults applied here), meshed with gmsh (second-order triangles), solved by ccx with S6
shells.

The idealisation is the one framewright states (README, "Stiffness and resonance"):
  - plates are shells at their mid-planes; stacking from the bottom up: braces, arms, bottom plate
    (arms under the body, the default) or bottom plate, arms, braces; the top plate on the standoffs;
    camera side plates stand either side of the camera between the bottom and top plate;
  - a screw makes the material within its head radius rigid through every plate it passes (a rigid
    body, and stiff patch elements so the footprint turns as one through the thickness)
    (socket heads ISO 4762 dk from below; button heads ISO 7380-1 dk on the top plate and camera
    plates, the hardware the assembly lists);
  - standoffs and camera spacers: solid round rods of their outside size (ten-node tetrahedra; CalculiX's
    beams are expanded to solids whose end rotations a rigid body does not hold), mid-plane to
    mid-plane, end faces in the screws' rigid bodies; aluminium 6061 E 68.9 GPa, 7075 71.7 GPa, nu 0.33 (ASM handbook);
    as heavy as the spacer (assembly.json: its massG; a hex with a threaded bore weighs less than the solid rod);
  - each motor a solid cylinder (bell diameter, height from the design, else 0.6 x the bell diameter
    but not into the prop band) on
    the arm's top face, rigid with its screws' head footprints (a slotted hole: the slot end nearer
    the motor axis);
  - camera side plate edges resting on a plate follow the plate under them (a linear constraint that
    rigid motion satisfies exactly; see rest_on);
  - components (assembly.json: mass, boxes, what carries them, mount points) are rigid masses, with the
    box inertia, tied to the screws at their mount points (head footprints), or to the stack's screws
    when they sit on a stack, or else to the plate under their footprint (a strapped battery);
  - each joint's screw, nut and washer (assembly.json: hardwareMassG, hardwareCgMm, hardwareInertiaGMm2)
    a rigid mass at its centre of mass, in the rigid body of that screw's head footprint (for a motor
    screw, the motor's body).

stdin: JSON {"design": path, "dxfDir": dir (what `framewright build` wrote), "sizeMm": element size, "modes": count}
stdout: JSON {"frequenciesHz": [...] (elastic modes above 1 Hz), "nodes": n}
"""
import json
import math
import os
import sys
import tempfile

import ezdxf
import yaml

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from ccx_deck import Deck, cylinder_inertia, run_frequencies  # noqa: E402
from plate_modes import mesh_plate  # noqa: E402

# ISO 273 clearance holes (fine / medium / coarse), mm (reference-values.md).
ISO_273 = {"M2": (2.2, 2.4, 2.6), "M2.5": (2.7, 2.9, 3.1), "M3": (3.2, 3.4, 3.6), "M4": (4.3, 4.5, 4.8), "M5": (5.3, 5.5, 5.8)}
SERIES = {"fine": 0, "medium": 1, "coarse": 2}
# Head diameters dk: ISO 4762 socket, ISO 7380-1 button (M2, M2.5: no button head, socket used).
SOCKET_DK = {"M2": 3.8, "M2.5": 4.5, "M3": 5.5, "M4": 7.0, "M5": 8.5}
BUTTON_DK = {"M2": 3.8, "M2.5": 4.5, "M3": 5.7, "M4": 7.6, "M5": 9.5}
YOUNG = {"aluminium-6061": 68900.0, "aluminium-7075": 71700.0}  # MPa
CAMERA_WIDTH = {"nano": 14, "micro": 19, "mini": 21.5}
COAXIAL = 0.05


def bulge_segment(p, q, b):
    if abs(b) < 1e-12:
        return {"kind": "line", "start": p, "end": q}
    theta = 4 * math.atan(b)
    dx, dy = q[0] - p[0], q[1] - p[1]
    c = math.hypot(dx, dy)
    mid = ((p[0] + q[0]) / 2, (p[1] + q[1]) / 2)
    off = (c / 2) / math.tan(theta / 2)
    centre = (mid[0] - dy / c * off, mid[1] + dx / c * off)
    r = math.hypot(p[0] - centre[0], p[1] - centre[1])
    return {"kind": "arc", "center": centre, "radius": r, "startRad": math.atan2(p[1] - centre[1], p[0] - centre[0]), "sweepRad": theta}


def read_plate(path):
    """Outline loop, inner loops (slots, cut-outs) and round holes [(x, y, d)] of one part DXF."""
    doc = ezdxf.readfile(path)
    outline, inner, holes = None, [], []
    for e in doc.modelspace():
        if e.dxftype() == "CIRCLE":
            c = e.dxf.center
            holes.append((c[0], c[1], 2 * e.dxf.radius))
        elif e.dxftype() in ("POLYLINE", "LWPOLYLINE"):
            if e.dxftype() == "POLYLINE":
                pts = [(v.dxf.location[0], v.dxf.location[1], v.dxf.bulge) for v in e.vertices]
            else:
                pts = [(x, y, b) for x, y, _s, _e, b in e.get_points("xyseb")]
            loop = [bulge_segment(pts[i][:2], pts[(i + 1) % len(pts)][:2], pts[i][2]) for i in range(len(pts))]
            loop = [s for s in loop if s["kind"] == "arc" or math.hypot(s["end"][0] - s["start"][0], s["end"][1] - s["start"][1]) > 1e-9]
            if e.dxf.layer.upper().startswith("CUT_OUTSIDE"):
                outline = loop
            else:
                inner.append(loop)
    circles = [[{"kind": "arc", "center": (x, y), "radius": d / 2, "startRad": 0.0, "sweepRad": 2 * math.pi}] for x, y, d in holes]
    return {"loops": [outline] + inner + circles, "holes": holes, "inner": inner}


class Placed:
    """A plate copy: part (u, v) -> frame, its thickness and z range (horizontal) or y range (vertical)."""

    def __init__(self, name, plate, t, mat, weave, to_frame, vertical=False, z_low=0.0, y_mid=0.0):
        self.name, self.plate, self.t, self.mat, self.weave = name, plate, t, mat, weave
        self.to_frame, self.vertical, self.z_low, self.y_mid = to_frame, vertical, z_low, y_mid

    def at(self, u, v):
        """Mid-plane point of part point (u, v)."""
        if self.vertical:
            return (u, self.y_mid, v)
        x, y = self.to_frame(u, v)
        return (x, y, self.z_low + self.t / 2)

    def holes_frame(self):
        return [(self.to_frame(x, y) if not self.vertical else (x, y), d, (x, y)) for x, y, d in self.plate["holes"]]


def rigid2d(theta, mirror, tx, ty):
    c, s = math.cos(theta), math.sin(theta)

    def f(u, v):
        v = -v if mirror else v
        return (c * u - s * v + tx, s * u + c * v + ty)
    return f


def main():
    spec = json.load(sys.stdin)
    with open(spec["design"]) as f:
        d = yaml.safe_load(f)
    size = spec["sizeMm"]
    mats = d.get("materials") or {"woven-cf": {"e1Gpa": 65, "e2Gpa": 65, "g12Gpa": 4, "nu12": 0.07, "densityGPerCm3": 1.57}}
    first_mat = next(iter(mats))
    sec = lambda k: d.get(k) or {}  # noqa: E731
    mat_of = lambda k: sec(k).get("material", first_mat)  # noqa: E731
    weave_of = lambda k: math.radians(sec(k).get("weaveDeg", 0))  # noqa: E731
    body, arms, top = sec("body"), sec("arms"), sec("topPlate")
    tb = body.get("thicknessMm", 2.5)
    # A one-piece frame's arms are the bottom plate (no thickness of their own).
    ta = arms.get("thicknessMm", tb)
    tt = top.get("thicknessMm", 2)
    so = body["standoffs"]
    gap = so.get("heightMm", 25)
    series = SERIES[(d.get("cutting") or {}).get("holeSeries", "medium")]
    screw_of = lambda dia: min(ISO_273, key=lambda s: abs(ISO_273[s][series] - dia))  # noqa: E731
    unibody = arms.get("construction", "separate") == "unibody"
    stacking = (d.get("assembly") or {}).get("armStacking", "under-body")
    lay = d["layout"]
    if lay["kind"] != "x":
        raise SystemExit("reference handles layout kind x only")
    half = lay["wheelbaseMm"] / 2
    ang = math.radians(lay.get("armAngleDeg", 45))
    sites = {"front-right": (half * math.cos(ang), -half * math.sin(ang)), "front-left": (half * math.cos(ang), half * math.sin(ang)),
             "rear-left": (-half * math.cos(ang), half * math.sin(ang)), "rear-right": (-half * math.cos(ang), -half * math.sin(ang))}
    dxf = lambda name: read_plate(os.path.join(spec["dxfDir"], f"{name}.dxf"))  # noqa: E731
    ident = rigid2d(0, False, 0, 0)
    bottom = dxf("bottom-plate")
    plates = [Placed("bottom-plate", bottom, tb, mat_of("body"), weave_of("body"), ident, z_low=0.0)]
    if unibody:
        arm_top = tb
    else:
        arm_z = -ta if stacking == "under-body" else tb
        arm_top = arm_z + ta
        motor_d = d["motor"].get("boreMm", 7)
        for site, (mx, my) in sites.items():
            name = "arm" if os.path.exists(os.path.join(spec["dxfDir"], "arm.dxf")) else ("arm-front" if site.startswith("front") else "arm-rear")
            part = dxf(name)
            bore = min(part["holes"], key=lambda h: abs(h[2] - motor_d))
            mirror = my > 0
            theta = math.atan2(my, mx)
            f0 = rigid2d(theta, mirror, 0, 0)
            bx, by = f0(bore[0], bore[1])
            plates.append(Placed(f"arm {site}", part, ta, mat_of("arms"), weave_of("arms"), rigid2d(theta, mirror, mx - bx, my - by), z_low=arm_z))
        if d.get("braces"):
            tbr = d["braces"].get("thicknessMm", 1.5)
            brace_z = arm_z - tbr if stacking == "under-body" else arm_z + ta
            names = ["brace"] if os.path.exists(os.path.join(spec["dxfDir"], "brace.dxf")) else ["brace-front", "brace-rear"]
            root = [(x, y) for x, y, _d in bottom["holes"]]
            for front in (True, False):
                part = dxf(names[0] if len(names) == 1 else names[0 if front else 1])
                theta = 0.0 if front else math.pi
                targets = [p for p in root if (p[0] > 0) == front]
                f0 = rigid2d(theta, False, 0, 0)
                pts = [f0(x, y) for x, y, _d in part["holes"]]
                cx = sum(p[0] for p in pts) / len(pts)
                cy = sum(p[1] for p in pts) / len(pts)
                # Translate the brace so its holes land on bottom-plate holes of its half.
                best = None
                for t in targets:
                    dx, dy = t[0] - pts[0][0], t[1] - pts[0][1]
                    if all(any(math.hypot(p[0] + dx - q[0], p[1] + dy - q[1]) < COAXIAL for q in targets) for p in pts):
                        best = (dx, dy)
                        break
                if best is None:
                    raise SystemExit("brace holes do not meet the bottom plate's holes")
                del cx, cy
                plates.append(Placed(f"brace {'front' if front else 'rear'}", part, tbr, mat_of("braces"), weave_of("braces"), rigid2d(theta, False, *best), z_low=brace_z))
    plates.append(Placed("top-plate", dxf("top-plate"), tt, mat_of("topPlate"), weave_of("topPlate"), ident, z_low=tb + gap))
    cam = d.get("camera")
    if cam:
        tc = cam.get("thicknessMm", 2)
        w = cam.get("widthMm", "micro")
        w = CAMERA_WIDTH[w] if isinstance(w, str) else w
        part = dxf("camera-side")
        plates.append(Placed("camera-side left", part, tc, mat_of("camera"), weave_of("camera"), None, vertical=True, y_mid=w / 2 + tc / 2))
        plates.append(Placed("camera-side right", part, tc, mat_of("camera"), weave_of("camera"), None, vertical=True, y_mid=-w / 2 - tc / 2))
    # Components (stack, boards, battery, camera), fasteners and spacers as `framewright build` placed and
    # weighed them (assembly.json); how they are tied is decided here.
    if any("softMountNPerMm" in c for c in d.get("components") or []):
        raise SystemExit("reference models hard-mounted components only")
    with open(os.path.join(spec["dxfDir"], "assembly.json")) as f:
        placed = json.load(f)
    components = placed["components"]

    standoff_xy = [tuple(p) for p in so["positionsMm"]]

    def head_dk(pl, uv, screw):
        """Button heads on the top plate's standoff screws and on the camera plates; socket heads elsewhere."""
        if pl.vertical or (pl.name == "top-plate" and any(math.hypot(uv[0] - x, uv[1] - y) < COAXIAL for x, y in standoff_xy)):
            return BUTTON_DK[screw]
        return SOCKET_DK[screw]

    deck = Deck()
    for name, m in mats.items():
        deck.woven(f"W{list(mats).index(name)}", m)
        deck.woven(f"W{list(mats).index(name)}S", m, stiffen=1000.0)
    pending_shells = []
    meshes = {}
    nodes_of = []  # per plate: {node id: (u, v)}
    for k, pl in enumerate(plates):
        # Rings at every head radius the plate will need (all round holes: cheap, and the same for both models' footprints).
        rings = [(x, y, head_dk(pl, (x, y), screw_of(dd)) / 2) for x, y, dd in pl.plate["holes"] if dd < 6]
        key = (id(pl.plate), tuple(rings))
        with tempfile.TemporaryDirectory(prefix="fw-frame-") as tmp:
            if key not in meshes:
                meshes[key] = mesh_plate({"loops": pl.plate["loops"], "sizeMm": size}, tmp, f"p{k}", rings)
        local, elems = meshes[key]
        ids = {}
        for n, (u, v) in local.items():
            ids[n] = deck.node(pl.at(u, v))
        uvs = {ids[n]: uv for n, uv in local.items()}
        nodes_of.append(uvs)
        if pl.vertical:
            a1 = (math.cos(pl.weave), 0, math.sin(pl.weave))
            a2 = (-math.sin(pl.weave), 0, math.cos(pl.weave))
        else:
            o = pl.to_frame(0, 0)
            pu = pl.to_frame(math.cos(pl.weave), math.sin(pl.weave))
            pv = pl.to_frame(-math.sin(pl.weave), math.cos(pl.weave))
            a1 = (pu[0] - o[0], pu[1] - o[1], 0)
            a2 = (pv[0] - o[0], pv[1] - o[1], 0)
        pending_shells.append(([[ids[n] for n in e] for e in elems], f"W{list(mats).index(pl.mat)}", pl.t, a1, a2))
        pl.ids = ids

    rigid_nodes = set()

    def footprint(k, u, v, r, patch=True):
        tol = 1e-6 * max(1.0, r)
        found = [n for n, (x, y) in nodes_of[k].items() if math.hypot(x - u, y - v) <= r + tol]
        if patch:
            rigid_nodes.update(found)
        return found

    horizontal = [k for k, pl in enumerate(plates) if not pl.vertical]
    # Standoffs: rods between the bottom and top plate mid-planes, ends rigid with their screws' footprints.
    young = YOUNG[so.get("material", "aluminium-7075")]
    radius = so.get("acrossFlatsMm", 5) / 2
    screw = so.get("boltSize", "M3")
    work = tempfile.mkdtemp(prefix="fw-rods-")
    rod_size = min(size, radius * 0.8)
    for x, y in standoff_xy:
        zb, zt = tb / 2, tb + gap + tt / 2
        low, high = deck.rod(work, (x, y, zb), (x, y, zt), radius, young, 0.33, spacer_density(placed, (x, y, None), zt - zb, radius), rod_size)
        for end, z_face, dk in ((low, tb, SOCKET_DK[screw]), (high, tb + gap, BUTTON_DK[screw])):
            tied = []
            for k in horizontal:
                pl = plates[k]
                below = pl.z_low + pl.t <= z_face + 1e-6 if end is low else pl.z_low >= z_face - 1e-6
                for (fx, fy), dd, (u, v) in pl.holes_frame():
                    if below and math.hypot(fx - x, fy - y) < COAXIAL:
                        tied += footprint(k, u, v, dk / 2)
            deck.rigid(tied + end, (x, y, zb if end is low else zt))
    # Other screws: coaxial holes through two or more horizontal plates (arm roots), rigid through the stack.
    groups = []
    for k in horizontal:
        for (fx, fy), dd, (u, v) in plates[k].holes_frame():
            if any(math.hypot(fx - x, fy - y) < COAXIAL for x, y in standoff_xy):
                continue
            g = next((g for g in groups if math.hypot(g["xy"][0] - fx, g["xy"][1] - fy) < COAXIAL), None)
            if g is None:
                groups.append({"xy": (fx, fy), "members": [(k, u, v, dd)]})
            else:
                g["members"].append((k, u, v, dd))
    for g in groups:
        if len({k for k, *_ in g["members"]}) < 2:
            continue
        tied = [n for k, u, v, dd in g["members"] for n in footprint(k, u, v, SOCKET_DK[screw_of(dd)] / 2)]
        zs = [plates[k].z_low + plates[k].t / 2 for k, *_ in g["members"]]
        deck.rigid(tied, (g["xy"][0], g["xy"][1], sum(zs) / len(zs)))
    # Motors: rigid cylinders on the arm top, tied over their screws' footprints.
    motor = d["motor"]
    props = d["props"]
    bell = motor.get("bellDiameterMm", 28)
    # The stated height, else 0.6 x the bell diameter but not into the prop band (README, design reference).
    height = motor.get("heightMm", min(0.6 * bell, props.get("heightAboveArmMm", 14) - props.get("bandMm", 6) / 2))
    motor_tonnes = motor["massG"] / 1e6  # g to t (the deck works in t, mm, s)
    motor_screw = motor.get("boltSize", "M3")
    for site, (mx, my) in sites.items():
        k = next(i for i, pl in enumerate(plates) if pl.name == (f"arm {site}" if not unibody else "bottom-plate"))
        pl = plates[k]
        tied = []
        for (fx, fy), dd, (u, v) in pl.holes_frame():
            if math.hypot(fx - mx, fy - my) <= bell / 2 and abs(dd - ISO_273[motor_screw][series]) < 0.01:
                tied += footprint(k, u, v, SOCKET_DK[motor_screw] / 2)
        for loop in pl.plate["inner"]:
            arcs = [s for s in loop if s["kind"] == "arc"]
            ends = [pl.to_frame(*s["center"]) + (s["center"],) for s in arcs]
            ends = [e for e in ends if math.hypot(e[0] - mx, e[1] - my) <= bell / 2]
            if len(ends) >= 2:
                inner_end = min(ends, key=lambda e: math.hypot(e[0] - mx, e[1] - my))
                tied += footprint(k, inner_end[2][0], inner_end[2][1], SOCKET_DK[motor_screw] / 2)
        if not tied:
            raise SystemExit(f"no motor screws found for {site}")
        deck.rigid_mass(tied, motor_tonnes, (mx, my, arm_top + height / 2), cylinder_inertia(motor_tonnes, bell, height))
    if cam:
        left = next(k for k, pl in enumerate(plates) if pl.name == "camera-side left")
        right = next(k for k, pl in enumerate(plates) if pl.name == "camera-side right")
        front_x = max(p[0] for p in standoff_xy)
        pivot = (front_x + cam["forwardOffsetMm"], cam["pivotHeightMm"])
        for x, z, dd in plates[left].plate["holes"]:
            dk = BUTTON_DK[screw_of(dd)]
            if math.hypot(x - pivot[0], z - pivot[1]) < COAXIAL:
                for k in (left, right):
                    deck.rigid(footprint(k, x, z, dk / 2), (x, plates[k].y_mid, z))
            else:
                # A spacer across the camera between the two plates' mount holes.
                span = plates[left].y_mid - plates[right].y_mid
                ends = deck.rod(work, (x, plates[right].y_mid, z), (x, plates[left].y_mid, z), radius, young, 0.33, spacer_density(placed, (x, None, z), span, radius), rod_size)
                for k, end in zip((right, left), ends):
                    deck.rigid(footprint(k, x, z, dk / 2) + end, (x, plates[k].y_mid, z))
        # Side plate edges resting on the bottom and top plates follow the plate under them.
        top_k = next(k for k, pl in enumerate(plates) if pl.name == "top-plate")
        for k in (left, right):
            pl = plates[k]
            outline = pl.plate["loops"][0]
            for n, (u, v) in nodes_of[k].items():
                if min(seg_dist(s, (u, v)) for s in outline) > 1e-6:
                    continue
                for hk, face in ((0, tb), (top_k, tb + gap)):
                    if abs(v - face) > pl.t / 2:
                        continue
                    rest_on(deck, n, pending_shells[hk][0])
    # A component is a rigid mass on its mounts: the screws at its mount points (their head footprints),
    # or the stack's screws when it sits on a stack, or else the plate under its footprint.
    by_name = {pl.name: k for k, pl in enumerate(plates)}
    stack_ties = {}
    for c in components:
        on = [by_name[n] for n in c["mountedOn"] if n in by_name]
        stack = next((n for n in c["mountedOn"] if n.startswith("stack mount")), None)
        tied = []
        for p in c["mountPointsMm"]:
            for k in on if c["kind"] != "stack" else [by_name["bottom-plate"]]:
                pl = plates[k]
                q = (p[0], p[2]) if pl.vertical else (p[0], p[1])
                for (fx, fy), dd, (u, v) in pl.holes_frame():
                    if dd < 6 and math.hypot(fx - q[0], fy - q[1]) < 0.5:
                        tied += footprint(k, u, v, head_dk(pl, (u, v), screw_of(dd)) / 2)
        if not tied and stack in stack_ties:
            tied = stack_ties[stack]
        if tied and stack:
            stack_ties.setdefault(stack, tied)
        if not tied:
            for k in on:
                if not plates[k].vertical:
                    under = [n for n in nodes_of[k] if in_box_plan(c["boxes"][0], deck_xyz(deck, n))]
                    rigid_nodes.update(under)
                    tied += under
        if not tied:
            ids = on or list(range(len(plates)))
            p = c["mountPointsMm"][0]
            tied = [min((n for k in ids for n in nodes_of[k]), key=lambda n: math.dist(deck_xyz(deck, n), p))]
        mass_t = c["massG"] * 1e-6
        deck.rigid_mass_tensor(tied, mass_t, c["cgMm"], boxes_inertia(c["boxes"], mass_t, c["cgMm"]))
    # Fasteners: a rigid mass in the body of the head footprint on the first plate the screw passes.
    for j in placed["joints"]:
        if j["hardwareMassG"] <= 0:
            continue
        k = by_name[j["clamps"][0]]
        reach = max(SOCKET_DK[j["screw"]], BUTTON_DK[j["screw"]]) / 2 + 1e-6
        near = [(axis_distance(j, deck_xyz(deck, n)), n) for n in nodes_of[k] if n in rigid_nodes]
        dist, n = min(near, default=(math.inf, None))
        if dist > reach:
            raise SystemExit(f"joint {j['id']}: no head footprint on {j['clamps'][0]}")
        mass_t = j["hardwareMassG"] * 1e-6
        deck.rigid_mass_tensor([n], mass_t, j["hardwareCgMm"], [[x * 1e-6 for x in row] for row in j["hardwareInertiaGMm2"]])
    for elems, mat, t, a1, a2 in pending_shells:
        deck.shells_with_patches(elems, mat, t, a1, a2, rigid_nodes)
    with tempfile.TemporaryDirectory(prefix="fw-ccx-frame-") as tmp:
        tmp = os.environ.get("FW_CCX_KEEP", tmp)
        os.makedirs(tmp, exist_ok=True)
        deck.write(os.path.join(tmp, "job.inp"), spec["modes"], lowest_hz=1.0)
        freqs = run_frequencies(tmp)
    json.dump({"frequenciesHz": freqs, "nodes": len(deck.nodes)}, sys.stdout)


def rest_on(deck, n, elems):
    """Node n (on a vertical plate's edge) follows the point of a horizontal plate below or above it as
    if rigidly attached: u_n = u_P + theta x r, with u_P and the tilt theta from the linear field over the
    corners of the plate's element under n, and r the vertical offset from the plate's mid-plane. A linear
    constraint that rigid motion satisfies exactly (a translation-only tie would resist rigid rotation; a
    two-node CalculiX rigid body leaves its rotation node free about the line through the nodes)."""
    x, y, z = deck_xyz(deck, n)
    best = None
    for e in elems:
        a, b, c = (deck_xyz(deck, m) for m in e[:3])
        det = (b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1])
        l1 = ((b[0] - x) * (c[1] - y) - (c[0] - x) * (b[1] - y)) / det
        l2 = ((c[0] - x) * (a[1] - y) - (a[0] - x) * (c[1] - y)) / det
        lam = (l1, l2, 1 - l1 - l2)
        outside = -min(lam)
        if best is None or outside < best[0]:
            bx = [(b[1] - c[1]) / det, (c[1] - a[1]) / det, (a[1] - b[1]) / det]
            by = [(c[0] - b[0]) / det, (a[0] - c[0]) / det, (b[0] - a[0]) / det]
            best = (outside, e[:3], lam, bx, by, z - a[2])
    _, corners, lam, bx, by, rz = best
    # u_n = sum lam u_k - rz sum bx_k w_k ; v_n = sum lam v_k - rz sum by_k w_k ; w_n = sum lam w_k
    rows = {1: [(m, 1, lam[k]) for k, m in enumerate(corners)] + [(m, 3, -rz * bx[k]) for k, m in enumerate(corners)],
            2: [(m, 2, lam[k]) for k, m in enumerate(corners)] + [(m, 3, -rz * by[k]) for k, m in enumerate(corners)],
            3: [(m, 3, lam[k]) for k, m in enumerate(corners)]}
    for dof, terms in rows.items():
        deck.equation([(n, dof, 1.0)] + [(m, d, -c) for m, d, c in terms if abs(c) > 1e-12])


def spacer_density(placed, at, length, radius):
    """Density (t/mm^3) that gives a solid rod of this length and radius the mass of the spacer that
    assembly.json places at `at` (x, y, None for an upright standoff; x, None, z for a camera spacer)."""
    for s in placed["standoffs"]:
        p = s["startMm"]
        if all(c is None or abs(p[i] - c) < COAXIAL for i, c in enumerate(at)) and abs(s["axis"][2 if at[2] is None else 1]) > 0.5:
            return s["massG"] * 1e-6 / (math.pi * radius * radius * length)
    raise SystemExit(f"no spacer in assembly.json at {at}")


def axis_distance(joint, p):
    """Distance from point p to a joint's screw axis (through headAtMm along axis)."""
    h, a = joint["headAtMm"], joint["axis"]
    r = [p[i] - h[i] for i in range(3)]
    along = sum(r[i] * a[i] for i in range(3))
    return math.hypot(*(r[i] - along * a[i] for i in range(3)))


def in_box_plan(box, p):
    """Whether point p lies within a box's footprint in plan."""
    ax, ay = box["axes"][0], box["axes"][1]
    d = (p[0] - box["centreMm"][0], p[1] - box["centreMm"][1])
    return abs(d[0] * ax[0] + d[1] * ax[1]) <= box["sizeMm"][0] / 2 + 1e-6 and abs(d[0] * ay[0] + d[1] * ay[1]) <= box["sizeMm"][1] / 2 + 1e-6


def boxes_inertia(boxes, mass_t, cg):
    """Inertia tensor (t mm^2, about cg, frame axes) of uniform boxes sharing the mass by volume."""
    import numpy as np
    vols = [b["sizeMm"][0] * b["sizeMm"][1] * b["sizeMm"][2] for b in boxes]
    total = np.zeros((3, 3))
    for b, vol in zip(boxes, vols):
        m = mass_t * vol / sum(vols)
        a, w, h = b["sizeMm"]
        local = np.diag([m * (w * w + h * h) / 12, m * (a * a + h * h) / 12, m * (a * a + w * w) / 12])
        rot = np.array(b["axes"]).T  # columns: the box's length, width and height directions
        dvec = np.array(b["centreMm"]) - np.array(cg)
        total += rot @ local @ rot.T + m * (dvec @ dvec * np.eye(3) - np.outer(dvec, dvec))
    return total


def deck_xyz(deck, n):
    nid, x, y, z = deck.nodes[n - 1]
    return (x, y, z)


def seg_dist(seg, p):
    from plate_modes import seg_distance
    return seg_distance(seg, p)


if __name__ == "__main__":
    main()

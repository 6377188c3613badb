"""Pieces of CalculiX input decks shared by the reference scripts (plate_modes.py, frame_modes.py).

Written for the tests from the CalculiX 2.20 keyword set: S6 shells with *SHELL SECTION and an
*ORIENTATION for the weave, *RIGID BODY for bolted footprints, MASS elements, B32 beams with a
circular *BEAM SECTION, *FREQUENCY. Units: mm, N, tonne, s (MPa, t/mm^3). CalculiX 2.20 has no rotary
inertia keyword, so a rigid mass with an inertia tensor is six point masses on the body's principal
axes (m/6 each at +-a, +-b, +-c about the centre of mass), all in the rigid body: with
A = (Iyy + Izz - Ixx) / 2 (and cyclically), a = sqrt(3A/m) reproduces a diagonal tensor exactly.
"""
import math
import os
import re
import subprocess


class Deck:
    """Collects nodes, elements and keyword lines; numbers nodes and elements."""

    def __init__(self):
        self.nodes = []  # (id, x, y, z)
        self.lines = []
        self.next_node = 1
        self.next_elem = 1
        self.sets = 0

    def node(self, p):
        nid = self.next_node
        self.next_node += 1
        self.nodes.append((nid, p[0], p[1], p[2]))
        return nid

    def elem_ids(self, count):
        first = self.next_elem
        self.next_elem += count
        return range(first, first + count)

    def name(self, prefix):
        self.sets += 1
        return f"{prefix}{self.sets}"

    def nset(self, nodes):
        name = self.name("N")
        self.lines.append(f"*NSET, NSET={name}")
        ids = sorted(set(nodes))
        for i in range(0, len(ids), 12):
            self.lines.append(", ".join(map(str, ids[i:i + 12])))
        return name

    def woven(self, name, m):
        """Woven laminate: E1, E2 and G12 from the material; E3 = 10 GPa, nu13 = nu23 = 0.3, G13 = G23 = G12 (from memory)."""
        e1, e2, g12 = m["e1Gpa"] * 1000, m["e2Gpa"] * 1000, m["g12Gpa"] * 1000
        self.lines += [f"*MATERIAL, NAME={name}", "*ELASTIC, TYPE=ENGINEERING CONSTANTS",
                       f"{e1}, {e2}, 10000, {m['nu12']}, 0.3, 0.3, {g12}, {g12},", f"{g12}, 0",
                       "*DENSITY", f"{m['densityGPerCm3'] * 1e-9:.10g}"]

    def shells(self, elems, material, thickness, axis1, axis2):
        """S6 elements (lists of 6 node ids) with their section; axis1/axis2: the weave's 1 and 2 directions."""
        ids = self.elem_ids(len(elems))
        es = self.name("E")
        self.lines.append(f"*ELEMENT, TYPE=S6, ELSET={es}")
        self.lines += [f"{i}, " + ", ".join(map(str, e)) for i, e in zip(ids, elems)]
        orient = self.name("O")
        a, b = axis1, axis2
        self.lines += [f"*ORIENTATION, NAME={orient}", ", ".join(f"{v:.12g}" for v in (*a, *b))]
        self.lines += [f"*SHELL SECTION, ELSET={es}, MATERIAL={material}, ORIENTATION={orient}", f"{thickness}"]

    def rigid(self, nodes, ref_point):
        """A rigid body of the given nodes about a new reference node (and its rotation node)."""
        ref = self.node(ref_point)
        rot = self.node(ref_point)
        self.lines += [f"*RIGID BODY, NSET={self.nset(nodes)}, REF NODE={ref}, ROT NODE={rot}"]
        return ref

    def point_masses(self, nodes_masses):
        for n, m in nodes_masses:
            (eid,) = self.elem_ids(1)
            es = self.name("M")
            self.lines += [f"*ELEMENT, TYPE=MASS, ELSET={es}", f"{eid}, {n}", f"*MASS, ELSET={es}", f"{m:.10g}"]

    def rigid_mass(self, tied_nodes, mass_t, cg, inertia_diag):
        """Mass and principal inertia (frame axes, t mm^2) at cg, rigidly tied to the given nodes."""
        ixx, iyy, izz = inertia_diag
        half = [(iyy + izz - ixx) / 2, (izz + ixx - iyy) / 2, (ixx + iyy - izz) / 2]
        arms = [math.sqrt(max(3 * h / mass_t, 0.0)) for h in half]
        pts = []
        for axis in range(3):
            for sign in (1, -1):
                p = list(cg)
                p[axis] += sign * arms[axis]
                pts.append(self.node(p))
        self.point_masses([(n, mass_t / 6) for n in pts])
        return self.rigid(list(tied_nodes) + pts, cg)

    def beams(self, points, radius, young, poisson, density):
        """B32 beams along a polyline of 2k+1 points (quadratic elements), solid circular section."""
        name = self.name("AL")
        self.lines += [f"*MATERIAL, NAME={name}", "*ELASTIC", f"{young}, {poisson}", "*DENSITY", f"{density:.10g}"]
        ids = [self.node(p) for p in points]
        count = (len(ids) - 1) // 2
        es = self.name("B")
        self.lines.append(f"*ELEMENT, TYPE=B32, ELSET={es}")
        for k, eid in enumerate(self.elem_ids(count)):
            self.lines.append(f"{eid}, {ids[2 * k]}, {ids[2 * k + 1]}, {ids[2 * k + 2]}")
        d = [points[-1][i] - points[0][i] for i in range(3)]
        ref = [0, 0, 1] if abs(d[2]) < 0.9 * math.hypot(*d) else [1, 0, 0]
        self.lines += [f"*BEAM SECTION, ELSET={es}, MATERIAL={name}, SECTION=CIRC", f"{radius}", ", ".join(map(str, ref))]
        return ids

    def write(self, path, modes):
        out = ["*NODE"] + [f"{n}, {x:.12g}, {y:.12g}, {z:.12g}" for n, x, y, z in self.nodes]
        out += self.lines + ["*STEP", "*FREQUENCY", f"{modes}", "*END STEP"]
        with open(path, "w") as f:
            f.write("\n".join(out) + "\n")


def run_frequencies(workdir, job="job"):
    """Run ccx on workdir/job.inp; the frequencies (Hz) from the eigenvalue table of job.dat."""
    env = {**os.environ, "OMP_NUM_THREADS": "1", "CCX_NPROC_EQUATION_SOLVER": "1"}
    subprocess.run(["ccx", job], cwd=workdir, check=True, capture_output=True, env=env)
    with open(os.path.join(workdir, f"{job}.dat")) as f:
        dat = f.read()
    block = dat.split("E I G E N V A L U E   O U T P U T")[1]
    freqs = []
    for line in block.splitlines():
        mm = re.match(r"\s*(\d+)\s+(\S+)\s+(\S+)\s+(\S+)\s+(\S+)", line)
        if mm:
            freqs.append(float(mm.group(4)))
        elif freqs and line.strip() == "":
            break
    return freqs


def cylinder_inertia(mass_t, diameter, height):
    """Solid cylinder about its centre, axis z: Ixx = Iyy = m(3r^2 + h^2)/12, Izz = m r^2/2 (t mm^2)."""
    r = diameter / 2
    ixx = mass_t * (3 * r * r + height * height) / 12
    return (ixx, ixx, mass_t * r * r / 2)

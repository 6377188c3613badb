"""Pieces of CalculiX input decks shared by the reference scripts (plate_modes.py, frame_modes.py).

Written for the tests from the CalculiX 2.20 keyword set: S6 shells with *SHELL SECTION and an
*ORIENTATION for the weave, *RIGID BODY for bolted footprints (with stiff patch elements so the
footprint turns as one), MASS elements, C3D10 solid rods for standoffs, *FREQUENCY. Units: mm, N, tonne, s (MPa, t/mm^3). CalculiX 2.20 has no rotary
inertia keyword, so a rigid mass with an inertia tensor is six point masses on the body's principal
axes (m/6 each at +-a, +-b, +-c about the centre of mass), all in the rigid body: with
A = (Iyy + Izz - Ixx) / 2 (and cyclically), a = sqrt(3A/m) reproduces a diagonal tensor exactly.
"""
import math
import os
import re
import subprocess


def read_inp_mesh(path, element_types, dims, nodes_per_element):
    """Nodes (first `dims` coordinates) and elements of the given types from a gmsh Abaqus-format
    mesh; only the nodes the elements use are returned."""
    nodes, elems, mode = {}, [], None
    with open(path) as f:
        for raw in f:
            line = raw.strip()
            if not line:
                continue
            if line.startswith("*"):
                up = line.upper()
                mode = "node" if up.startswith("*NODE") else ("elem" if up.startswith("*ELEMENT") and any(t in up for t in element_types) else None)
                continue
            parts = [p for p in line.split(",") if p.strip()]
            if mode == "node":
                nodes[int(parts[0])] = tuple(float(v) for v in parts[1 : 1 + dims])
            elif mode == "elem":
                elems.append([int(v) for v in parts[1 : 1 + nodes_per_element]])
    used = sorted({n for e in elems for n in e})
    return {n: nodes[n] for n in used}, elems


class Deck:
    """Collects nodes, elements and keyword lines; numbers nodes and elements."""

    def __init__(self):
        self.nodes = []  # (id, x, y, z)
        self.lines = []
        self.next_node = 1
        self.next_elem = 1
        self.sets = 0
        self.bodies = []

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

    def woven(self, name, m, stiffen=1.0):
        """Woven laminate: E1, E2 and G12 from the material; E3 = 10 GPa, nu13 = nu23 = 0.3, G13 = G23 = G12
        (from memory). stiffen multiplies the moduli (a rigid footprint patch, same density)."""
        e1, e2, g12 = (m["e1Gpa"] * 1000 * stiffen, m["e2Gpa"] * 1000 * stiffen, m["g12Gpa"] * 1000 * stiffen)
        self.lines += [f"*MATERIAL, NAME={name}", "*ELASTIC, TYPE=ENGINEERING CONSTANTS",
                       f"{e1}, {e2}, {10000 * stiffen}, {m['nu12']}, 0.3, 0.3, {g12}, {g12},", f"{g12}, 0",
                       "*DENSITY", f"{m['densityGPerCm3'] * 1e-9:.10g}"]

    def shells_with_patches(self, elems, material, thickness, axis1, axis2, rigid_nodes):
        """Shells, with the elements lying wholly inside rigid footprints given the stiffened material
        (material + "S"). A CalculiX rigid body holds the translations of a shell's mid-surface nodes but
        lets the fibres through the thickness turn; stiff patch elements make the whole footprint move as
        one body, rotations included, as the idealisation says."""
        patch = [e for e in elems if all(n in rigid_nodes for n in e)]
        rest = [e for e in elems if not all(n in rigid_nodes for n in e)]
        if rest:
            self.shells(rest, material, thickness, axis1, axis2)
        if patch:
            self.shells(patch, material + "S", thickness, axis1, axis2)

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

    def rigid(self, nodes, ref_point, ref_node=None):
        """A rigid body of the given nodes about a reference point (translations of the nodes; see
        shells_with_patches for the rotations of shell footprints). Bodies that share a node are one body
        (a node may follow only one in CalculiX): they are merged when the deck is written. ref_node: an
        existing node (made with node()) to be the body's reference node, so that other constraints can
        name it; otherwise one is made."""
        self.bodies.append((list(nodes), ref_point, ref_node))

    def _write_bodies(self):
        parent = {}

        def find(x):
            while parent.setdefault(x, x) != x:
                parent[x] = parent[parent[x]]
                x = parent[x]
            return x
        for k, (nodes, _p, _r) in enumerate(self.bodies):
            for n in nodes:
                a, b = find(("b", k)), find(n)
                if a != b:
                    parent[b] = a
        merged = {}
        for k, (nodes, p, r) in enumerate(self.bodies):
            g = merged.setdefault(find(("b", k)), {"nodes": set(), "p": p, "ref": None})
            g["nodes"].update(nodes)
            if r is not None and g["ref"] is None:
                g["ref"] = r
            elif r is not None:
                raise ValueError("two reference nodes in one merged rigid body")
        for g in merged.values():
            ref = g["ref"] if g["ref"] is not None else self.node(g["p"])
            rot = self.node(g["p"])
            self.lines += [f"*RIGID BODY, NSET={self.nset(sorted(g['nodes']))}, REF NODE={ref}, ROT NODE={rot}"]

    def equation(self, terms):
        """A linear constraint sum c * u(node, dof) = 0 (*EQUATION); the first term's DOF is the dependent one."""
        self.lines += ["*EQUATION", str(len(terms))]
        flat = [f"{n}, {d}, {c:.12g}" for n, d, c in terms]
        for i in range(0, len(flat), 4):
            self.lines.append(", ".join(flat[i:i + 4]))

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
        self.rigid(list(tied_nodes) + pts, cg)

    def rigid_mass_tensor(self, tied_nodes, mass_t, cg, inertia):
        """Like rigid_mass with a full inertia tensor (3x3, frame axes, t mm^2, about cg): six point
        masses on its principal axes."""
        import numpy as np
        values, vectors = np.linalg.eigh(np.asarray(inertia, dtype=float))
        half = [(values[1] + values[2] - values[0]) / 2, (values[2] + values[0] - values[1]) / 2, (values[0] + values[1] - values[2]) / 2]
        pts = []
        for axis in range(3):
            arm = math.sqrt(max(3 * half[axis] / mass_t, 0.0))
            for sign in (1, -1):
                pts.append(self.node([cg[i] + sign * arm * vectors[i, axis] for i in range(3)]))
        self.point_masses([(n, mass_t / 6) for n in pts])
        self.rigid(list(tied_nodes) + pts, cg)

    def rod(self, workdir, start, end, radius, young, poisson, density, size):
        """A solid round rod from start to end (gmsh, ten-node tetrahedra C3D10): returns the node ids
        on its start face and on its end face. Used for standoffs instead of beam elements: CalculiX
        expands beams into solids whose end rotations a rigid body does not hold."""
        tag = self.name("ROD")
        geo = os.path.join(workdir, f"{tag}.geo")
        inp = os.path.join(workdir, f"{tag}.inp")
        d = [end[i] - start[i] for i in range(3)]
        with open(geo, "w") as f:
            f.write('SetFactory("OpenCASCADE");\n')
            f.write(f"Cylinder(1) = {{{start[0]}, {start[1]}, {start[2]}, {d[0]}, {d[1]}, {d[2]}, {radius}}};\n")
            f.write(f"Mesh.CharacteristicLengthMax = {size};\nMesh.ElementOrder = 2;\nPhysical Volume(1) = {{1}};\n")
        subprocess.run(["gmsh", "-3", "-order", "2", geo, "-format", "inp", "-o", inp], check=True, capture_output=True)
        local, elems = read_inp_mesh(inp, ("C3D10",), 3, 10)
        used = sorted(local)
        ids = {n: self.node(local[n]) for n in used}
        length = math.hypot(*d)
        axis = [v / length for v in d]
        along = {n: sum((local[n][i] - start[i]) * axis[i] for i in range(3)) for n in used}
        tol = 1e-6 * length
        name = self.name("AL")
        self.lines += [f"*MATERIAL, NAME={name}", "*ELASTIC", f"{young}, {poisson}", "*DENSITY", f"{density:.10g}"]
        es = self.name("R")
        self.lines.append(f"*ELEMENT, TYPE=C3D10, ELSET={es}")
        for eid, e in zip(self.elem_ids(len(elems)), elems):
            self.lines.append(f"{eid}, " + ", ".join(str(ids[n]) for n in e))
        self.lines += [f"*SOLID SECTION, ELSET={es}, MATERIAL={name}"]
        return [ids[n] for n in used if along[n] < tol], [ids[n] for n in used if along[n] > length - tol]

    def write(self, path, modes, lowest_hz=None):
        """lowest_hz: the low end of the requested range; CalculiX then shifts the eigen solver there
        (useful for a free model with stiff patches, whose singular stiffness upsets the unshifted solve)."""
        self._write_bodies()
        out = ["*NODE"] + [f"{n}, {x:.12g}, {y:.12g}, {z:.12g}" for n, x, y, z in self.nodes]
        out += self.lines + ["*STEP", "*FREQUENCY", f"{modes}" if lowest_hz is None else f"{modes}, {lowest_hz}", "*END STEP"]
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

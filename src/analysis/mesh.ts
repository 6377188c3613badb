import cdt2d from 'cdt2d';
import { lengthOf, pointAt, type Loop, type Part, type Vec2 } from '../geometry/index.js';

/**
 * A triangulation of a plate's material (outline minus holes) in part coordinates.
 * `loops[0]` lists the outline's boundary nodes in order, `loops[k + 1]` those of feature k.
 */
export type PlateMesh = Readonly<{
  /** x, y per node, mm. */
  xy: Float64Array;
  /** Three node indices per triangle, counter-clockwise. */
  triangles: Uint32Array;
  loops: readonly (readonly number[])[];
  sizeMm: number;
}>;

export const nodeCount = (m: PlateMesh): number => m.xy.length / 2;
export const triangleCount = (m: PlateMesh): number => m.triangles.length / 3;

/** Smallest number of pieces a full circle is cut into, so small bolt holes stay round enough to load. */
const MIN_PIECES_PER_TURN = 12;
/** Interior lattice points keep this fraction of the target size away from any boundary edge. */
const BOUNDARY_CLEARANCE = 0.55;

/**
 * Triangulate the material of a part: boundary nodes on the exact loops at the target spacing
 * (arcs get at least 12 pieces per turn), interior nodes on an equilateral lattice of the same
 * spacing, a constrained Delaunay triangulation (cdt2d, robust predicates) that keeps every
 * boundary edge and drops the holes, then a few guarded Laplacian smoothing passes.
 * @param sizeMm target element edge length, mm (> 0)
 * @throws RangeError when sizeMm is not positive or the mesh would exceed 200 000 nodes
 */
export function meshPart(part: Pick<Part, 'outline' | 'features'>, sizeMm: number): PlateMesh {
  if (!(sizeMm > 0)) throw new RangeError(`mesh size must be positive (got ${sizeMm} mm)`);
  const pts: Vec2[] = [];
  const edges: Array<[number, number]> = [];
  const loops: number[][] = [];
  const boundaryLoops = [part.outline, ...part.features.map((f) => f.loop)];
  for (const loop of boundaryLoops) {
    const ids: number[] = [];
    for (const p of discretise(loop, sizeMm)) {
      ids.push(pts.length);
      pts.push(p);
    }
    for (let i = 0; i < ids.length; i++) edges.push([ids[i], ids[(i + 1) % ids.length]]);
    loops.push(ids);
  }
  const polys = loops.map((ids) => ids.map((i) => pts[i]));
  const grid = new EdgeGrid(polys, sizeMm);
  const [minX, minY, maxX, maxY] = bbox(polys[0]);
  const dy = (sizeMm * Math.sqrt(3)) / 2;
  const estimate = ((maxX - minX) / sizeMm + 1) * ((maxY - minY) / dy + 1);
  if (estimate > 200_000) throw new RangeError(`mesh size ${sizeMm} mm is too fine for a ${(maxX - minX).toFixed(0)} × ${(maxY - minY).toFixed(0)} mm part (about ${estimate.toFixed(0)} nodes; limit 200000)`);
  const interiorStart = pts.length;
  for (let j = 0, y = minY + dy / 2; y < maxY; j++, y += dy) {
    for (let x = minX + (j % 2 ? sizeMm / 2 : 0) + sizeMm / 4; x < maxX; x += sizeMm) {
      const p: Vec2 = [x, y];
      if (!inMaterial(polys, p)) continue;
      if (grid.distance(p) < BOUNDARY_CLEARANCE * sizeMm) continue;
      pts.push(p);
    }
  }
  const tris = cdt2d(pts, edges, { exterior: false });
  const xy = new Float64Array(pts.length * 2);
  pts.forEach((p, i) => {
    xy[2 * i] = p[0];
    xy[2 * i + 1] = p[1];
  });
  const triangles = new Uint32Array(tris.length * 3);
  tris.forEach((t, k) => {
    const ccw = area2(xy, t[0], t[1], t[2]) > 0;
    triangles[3 * k] = t[0];
    triangles[3 * k + 1] = ccw ? t[1] : t[2];
    triangles[3 * k + 2] = ccw ? t[2] : t[1];
  });
  smooth(xy, triangles, interiorStart, 4);
  return { xy, triangles, loops, sizeMm };
}

/** Points along a closed loop (closing point not repeated), spaced at most sizeMm apart. */
function discretise(loop: Loop, sizeMm: number): Vec2[] {
  const out: Vec2[] = [];
  for (const s of loop) {
    const len = lengthOf(s);
    if (len < 1e-9) continue;
    let n = Math.max(1, Math.ceil(len / sizeMm - 1e-9));
    if (s.kind === 'arc') n = Math.max(n, Math.ceil((Math.abs(s.sweepRad) / (2 * Math.PI)) * MIN_PIECES_PER_TURN - 1e-9));
    for (let i = 0; i < n; i++) {
      const p = pointAt(s, i / n);
      const last = out[out.length - 1];
      if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) < 1e-7) continue;
      out.push(p);
    }
  }
  const first = out[0];
  const last = out[out.length - 1];
  if (out.length > 1 && Math.hypot(first[0] - last[0], first[1] - last[1]) < 1e-7) out.pop();
  return out;
}

const area2 = (xy: Float64Array, a: number, b: number, c: number): number =>
  (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * c] - xy[2 * a]) * (xy[2 * b + 1] - xy[2 * a + 1]);

function bbox(poly: readonly Vec2[]): [number, number, number, number] {
  let b: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const p of poly) b = [Math.min(b[0], p[0]), Math.min(b[1], p[1]), Math.max(b[2], p[0]), Math.max(b[3], p[1])];
  return b;
}

/** Even–odd test over all loops: inside the outline and outside every hole. */
function inMaterial(polys: readonly (readonly Vec2[])[], p: Vec2): boolean {
  let inside = false;
  for (const poly of polys) {
    for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
      const a = poly[i];
      const b = poly[j];
      if (a[1] > p[1] !== b[1] > p[1] && p[0] < ((b[0] - a[0]) * (p[1] - a[1])) / (b[1] - a[1]) + a[0]) inside = !inside;
    }
  }
  return inside;
}

/** Boundary edges bucketed on a square grid, for the distance from lattice points to the boundary. */
class EdgeGrid {
  private readonly cells = new Map<number, Array<[Vec2, Vec2]>>();
  constructor(
    polys: readonly (readonly Vec2[])[],
    private readonly cell: number,
  ) {
    for (const poly of polys) {
      for (let i = 0; i < poly.length; i++) {
        const a = poly[i];
        const b = poly[(i + 1) % poly.length];
        const [i0, i1] = [Math.floor(Math.min(a[0], b[0]) / cell), Math.floor(Math.max(a[0], b[0]) / cell)];
        const [j0, j1] = [Math.floor(Math.min(a[1], b[1]) / cell), Math.floor(Math.max(a[1], b[1]) / cell)];
        for (let ci = i0; ci <= i1; ci++) for (let cj = j0; cj <= j1; cj++) this.bucket(ci, cj).push([a, b]);
      }
    }
  }
  private key = (i: number, j: number): number => (i + 50_000) * 100_000 + (j + 50_000);
  private bucket(i: number, j: number): Array<[Vec2, Vec2]> {
    const k = this.key(i, j);
    let b = this.cells.get(k);
    if (!b) this.cells.set(k, (b = []));
    return b;
  }
  /** Distance to the nearest boundary edge, exact when it is below one cell size. */
  distance(p: Vec2): number {
    const ci = Math.floor(p[0] / this.cell);
    const cj = Math.floor(p[1] / this.cell);
    let d = Infinity;
    for (let i = ci - 1; i <= ci + 1; i++) {
      for (let j = cj - 1; j <= cj + 1; j++) {
        for (const [a, b] of this.cells.get(this.key(i, j)) ?? []) d = Math.min(d, segDist(p, a, b));
      }
    }
    return d;
  }
}

function segDist(p: Vec2, a: Vec2, b: Vec2): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2));
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
}

/**
 * Laplacian smoothing of interior nodes (boundary nodes stay on the exact outline). A pass that
 * would make any triangle lose more than 80 % of its area, or turn over, is undone and smoothing stops.
 */
function smooth(xy: Float64Array, tris: Uint32Array, firstFree: number, passes: number): void {
  const n = xy.length / 2;
  const nbr: Array<Set<number>> = Array.from({ length: n }, () => new Set());
  for (let k = 0; k < tris.length; k += 3) {
    for (let e = 0; e < 3; e++) {
      const a = tris[k + e];
      const b = tris[k + ((e + 1) % 3)];
      nbr[a].add(b);
      nbr[b].add(a);
    }
  }
  for (let pass = 0; pass < passes; pass++) {
    const before = new Float64Array(xy);
    const areas = new Float64Array(tris.length / 3);
    for (let k = 0; k < tris.length; k += 3) areas[k / 3] = area2(xy, tris[k], tris[k + 1], tris[k + 2]);
    for (let i = firstFree; i < n; i++) {
      if (nbr[i].size === 0) continue;
      let sx = 0;
      let sy = 0;
      for (const j of nbr[i]) {
        sx += before[2 * j];
        sy += before[2 * j + 1];
      }
      xy[2 * i] = sx / nbr[i].size;
      xy[2 * i + 1] = sy / nbr[i].size;
    }
    let ok = true;
    for (let k = 0; k < tris.length && ok; k += 3) if (area2(xy, tris[k], tris[k + 1], tris[k + 2]) < 0.2 * areas[k / 3]) ok = false;
    if (!ok) {
      xy.set(before);
      return;
    }
  }
}

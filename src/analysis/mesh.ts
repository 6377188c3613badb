import ConstrainautorImport from '@kninnug/constrainautor';
import Delaunator from 'delaunator';
import { lengthOf, pointAt, type Loop, type Part, type Vec2 } from '../geometry/index.js';

// The package's types are its TypeScript source, which NodeNext reads as CommonJS (a namespace with
// `default`); at run time the ESM build's default export is the class itself.
const Constrainautor = ConstrainautorImport as unknown as typeof ConstrainautorImport.default;

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
  /** The rings of nodes laid at a given radius about a point (a screw head's edge), in the order given. */
  rings: readonly MeshRing[];
  sizeMm: number;
}>;

/** A circle of nodes laid inside the material, so a region of that radius is resolved by the mesh. */
export type RingRequest = Readonly<{ centreMm: Vec2; radiusMm: number }>;
export type MeshRing = RingRequest & Readonly<{ nodes: readonly number[]; whole: boolean }>;

export const nodeCount = (m: PlateMesh): number => m.xy.length / 2;
export const triangleCount = (m: PlateMesh): number => m.triangles.length / 3;

/** Smallest number of pieces a full circle is cut into, so small bolt holes stay round enough to load. */
const MIN_PIECES_PER_TURN = 12;
/** Interior lattice points keep this fraction of the target size away from any boundary edge. */
const BOUNDARY_CLEARANCE = 0.55;
/** A ring node keeps this fraction of the ring's node spacing away from the part's boundary. */
const RING_CLEARANCE = 0.35;

/**
 * Triangulate the material of a part: boundary nodes on the exact loops at the target spacing
 * (arcs get at least 12 pieces per turn), optional rings of nodes (the edge of a screw head about
 * a bolt hole, so the clamped footprint is resolved where it matters), interior nodes on an
 * equilateral lattice of the same spacing, a Delaunay triangulation (`delaunator`, robust
 * predicates) with every boundary edge and whole ring enforced (`@kninnug/constrainautor`),
 * triangles outside the material dropped, then a few guarded Laplacian smoothing passes.
 * Deterministic: the same part and options give the same mesh.
 * @param sizeMm target element edge length, mm (> 0)
 * @throws RangeError when sizeMm is not positive, the mesh would exceed 200 000 nodes, or the
 *   triangulation cannot be made to follow the boundary
 */
export function meshPart(part: Pick<Part, 'outline' | 'features'>, sizeMm: number, options: Readonly<{ rings?: readonly RingRequest[] }> = {}): PlateMesh {
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
  const [minX, minY, maxX, maxY] = bbox(polys[0]);
  const dy = (sizeMm * Math.sqrt(3)) / 2;
  const estimate = ((maxX - minX) / sizeMm + 1) * ((maxY - minY) / dy + 1);
  if (estimate > 200_000) throw new RangeError(`mesh size ${sizeMm} mm is too fine for a ${(maxX - minX).toFixed(0)} × ${(maxY - minY).toFixed(0)} mm part (about ${estimate.toFixed(0)} nodes; limit 200000)`);
  const grid = new EdgeGrid(sizeMm);
  for (const poly of polys) grid.addLoop(poly);
  const rings: MeshRing[] = [];
  for (const r of options.rings ?? []) {
    const n = Math.max(MIN_PIECES_PER_TURN, Math.ceil((2 * Math.PI * r.radiusMm) / sizeMm - 1e-9));
    const spacing = (2 * Math.PI * r.radiusMm) / n;
    const circle: Vec2[] = Array.from({ length: n }, (_, k) => [r.centreMm[0] + r.radiusMm * Math.cos((2 * Math.PI * k) / n), r.centreMm[1] + r.radiusMm * Math.sin((2 * Math.PI * k) / n)] as Vec2);
    const ok = circle.map((p) => inMaterial(polys, p) && grid.distance(p) >= RING_CLEARANCE * spacing);
    const ids: number[] = [];
    circle.forEach((p, k) => {
      if (!ok[k]) return;
      ids.push(pts.length);
      pts.push(p);
    });
    const whole = ok.every(Boolean);
    if (whole) for (let i = 0; i < ids.length; i++) edges.push([ids[i], ids[(i + 1) % ids.length]]);
    if (ids.length) grid.addLoop(ids.map((i) => pts[i]), whole);
    rings.push({ ...r, nodes: ids, whole });
  }
  const interiorStart = pts.length;
  for (let j = 0, y = minY + dy / 2; y < maxY; j++, y += dy) {
    for (let x = minX + (j % 2 ? sizeMm / 2 : 0) + sizeMm / 4; x < maxX; x += sizeMm) {
      const p: Vec2 = [x, y];
      if (!inMaterial(polys, p)) continue;
      if (grid.distance(p) < BOUNDARY_CLEARANCE * sizeMm) continue;
      pts.push(p);
    }
  }
  const nodes = pts.length;
  const all = [...pts, ...enclosingRectangle(minX, minY, maxX, maxY, sizeMm)];
  const xyAll = new Float64Array(all.length * 2);
  all.forEach((p, i) => {
    xyAll[2 * i] = p[0];
    xyAll[2 * i + 1] = p[1];
  });
  const del = new Delaunator(xyAll);
  try {
    new Constrainautor(del, edges);
  } catch (e) {
    // The constraining step's own floating-point tests can still fail on boundaries that nearly
    // touch or run nearly collinear (a slightly different size usually avoids it), and it cannot
    // follow two contours drawn on top of each other (the checks name those): a clear refusal.
    throw new RangeError(`the mesh at ${sizeMm} mm could not follow the part's edges (${(e as Error).message}); contours that coincide, touch or nearly line up cause this: check the drawing for them, or try a slightly different mesh size (--mesh-size)`);
  }
  const xy = xyAll.slice(0, 2 * nodes);
  const t = del.triangles;
  const kept: number[] = [];
  for (let k = 0; k < t.length; k += 3) {
    const [a, b, c] = [t[k], t[k + 1], t[k + 2]];
    if (a >= nodes || b >= nodes || c >= nodes) continue;
    // Collinear boundary points (a straight run, the convex hull) can form triangles of no area.
    const twice = area2(xy, a, b, c);
    if (Math.abs(twice) < 1e-9 * sizeMm * sizeMm) continue;
    const centroid: Vec2 = [(xy[2 * a] + xy[2 * b] + xy[2 * c]) / 3, (xy[2 * a + 1] + xy[2 * b + 1] + xy[2 * c + 1]) / 3];
    if (!inMaterial(polys, centroid)) continue;
    if (twice > 0) kept.push(a, b, c);
    else kept.push(a, c, b);
  }
  const triangles = Uint32Array.from(kept);
  smooth(xy, triangles, interiorStart, 4);
  return { xy, triangles, loops, rings, sizeMm };
}

/**
 * Points on a rectangle two element sizes outside the part's box, triangulated with the part and
 * then dropped. They make the triangulation's hull this rectangle instead of the part's own
 * boundary: a long straight edge on the hull is a run of nearly collinear points, whose slivers the
 * constraining step could not flip (it failed on a 1 m drawn edge with "no further intersect").
 */
function enclosingRectangle(minX: number, minY: number, maxX: number, maxY: number, sizeMm: number): Vec2[] {
  const m = 2 * sizeMm;
  const [x0, y0, x1, y1] = [minX - m, minY - m, maxX + m, maxY + m];
  const nx = Math.max(1, Math.ceil((x1 - x0) / (2 * sizeMm)));
  const ny = Math.max(1, Math.ceil((y1 - y0) / (2 * sizeMm)));
  const out: Vec2[] = [];
  for (let i = 0; i < nx; i++) out.push([x0 + ((x1 - x0) * i) / nx, y0], [x1 - ((x1 - x0) * i) / nx, y1]);
  for (let j = 0; j < ny; j++) out.push([x1, y0 + ((y1 - y0) * j) / ny], [x0, y1 - ((y1 - y0) * j) / ny]);
  return out;
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

/** Boundary edges bucketed on a square grid, for the distance from candidate nodes to the boundary. */
class EdgeGrid {
  private readonly cells = new Map<number, Array<[Vec2, Vec2]>>();
  constructor(private readonly cell: number) {}
  /** Add the edges of a polygon (closed, or an open chain of points when `closed` is false). */
  addLoop(poly: readonly Vec2[], closed = true): void {
    const last = closed ? poly.length : poly.length - 1;
    for (let i = 0; i < last; i++) this.addEdge(poly[i], poly[(i + 1) % poly.length]);
    if (!closed) for (const p of poly) this.addEdge(p, p);
  }
  private addEdge(a: Vec2, b: Vec2): void {
    const cell = this.cell;
    const [i0, i1] = [Math.floor(Math.min(a[0], b[0]) / cell), Math.floor(Math.max(a[0], b[0]) / cell)];
    const [j0, j1] = [Math.floor(Math.min(a[1], b[1]) / cell), Math.floor(Math.max(a[1], b[1]) / cell)];
    for (let ci = i0; ci <= i1; ci++) for (let cj = j0; cj <= j1; cj++) this.bucket(ci, cj).push([a, b]);
  }
  private key = (i: number, j: number): number => (i + 50_000) * 100_000 + (j + 50_000);
  private bucket(i: number, j: number): Array<[Vec2, Vec2]> {
    const k = this.key(i, j);
    let b = this.cells.get(k);
    if (!b) this.cells.set(k, (b = []));
    return b;
  }
  /** Distance to the nearest edge, exact when it is below one cell size. */
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
 * Laplacian smoothing of interior nodes (boundary and ring nodes stay put). A pass that would make
 * any triangle lose more than 80 % of its area, or turn over, is undone and smoothing stops.
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

import { FillRule, Minkowski, triangulate, union, type Path64, type Paths64 } from 'clipper2-ts';
import { loopLength, signedArea, transformLoop, type Loop, type Part } from '../geometry/index.js';
import { offsetRight } from './offset.js';

/**
 * The shapes the sheet nesting works with: every part grown by half the spacing ("dilated"), as
 * integer polygons that contain the exact grown outline, cut into convex pieces, and the no-fit
 * polygons of pairs of them. Two dilated parts whose interiors do not overlap are at least the spacing
 * apart, so the nesting only has to keep polygons from overlapping: no raster, no padding.
 */

/** Integer units per millimetre of the nesting polygons (0.1 µm): sums and quarter turns are exact. */
export const NEST_SCALE = 1e4;

/** Largest distance between an arc and the polygon edges that stand in for it. mm. */
export const NEST_SAG_MM = 0.01;

/** Added to half the spacing so that rounding vertices to the integer grid never brings parts closer. mm. */
export const NEST_ROUNDING_MM = 0.001;

/** Added when an offset had to fall back to its polygon form (within 0.002 mm of the exact one). mm. */
const POLYGON_OFFSET_SLACK_MM = 0.005;

export type IBox = readonly [number, number, number, number];

/** A dilated part in one orientation: integer rings (outer counter-clockwise, windows clockwise). */
export type NestShape = Readonly<{
  /** rings[0] is the outline, the rest are windows other parts may sit in. */
  rings: Paths64;
  /** Bounding box of rings[0], integer units. */
  box: IBox;
  /** Convex pieces (counter-clockwise) whose union is the shape (windows left out). */
  pieces: Paths64;
}>;

/**
 * Polygon of a loop that never cuts into its material (material on the left of travel): arcs that
 * bulge out of the material are replaced by tangent lines outside them (a circumscribed polygon),
 * arcs that bulge into it by chords; both within sagMm of the arc. Integer units, closing vertex not
 * repeated. For an outline the polygon contains the part; for a hole it lies inside the hole.
 */
export function materialPolygon(loop: Loop, sagMm: number): Path64 {
  const pts: Path64 = [];
  const push = (x: number, y: number) => {
    const p = { x: Math.round(x * NEST_SCALE), y: Math.round(y * NEST_SCALE) };
    const q = pts[pts.length - 1];
    if (!q || q.x !== p.x || q.y !== p.y) pts.push(p);
  };
  for (const s of loop) {
    if (s.kind === 'line') {
      push(s.start[0], s.start[1]);
      continue;
    }
    const [cx, cy] = s.center;
    const r = s.radius;
    push(cx + r * Math.cos(s.startRad), cy + r * Math.sin(s.startRad));
    if (s.sweepRad > 0) {
      // Tangents at n + 1 equally spaced points meet at radius r / cos(α/2): at most sagMm outside.
      const maxStep = Math.min(Math.PI / 2, 2 * Math.acos(1 / (1 + sagMm / r)));
      const n = Math.max(1, Math.ceil(s.sweepRad / maxStep));
      const a = s.sweepRad / n;
      const R = r / Math.cos(a / 2);
      for (let j = 0; j < n; j++) push(cx + R * Math.cos(s.startRad + (j + 0.5) * a), cy + R * Math.sin(s.startRad + (j + 0.5) * a));
    } else {
      const maxStep = sagMm >= r ? Math.PI / 2 : Math.min(Math.PI / 2, 2 * Math.acos(1 - sagMm / r));
      const n = Math.max(1, Math.ceil(-s.sweepRad / maxStep));
      const a = s.sweepRad / n;
      for (let j = 1; j < n; j++) push(cx + r * Math.cos(s.startRad + j * a), cy + r * Math.sin(s.startRad + j * a));
    }
  }
  const first = pts[0];
  const last = pts[pts.length - 1];
  if (pts.length > 1 && first.x === last.x && first.y === last.y) pts.pop();
  return dropCollinear(pts);
}

/** Twice the signed area of an integer ring (positive counter-clockwise). */
export function ringArea2(p: Path64): number {
  let a = 0;
  for (let i = 0, j = p.length - 1; i < p.length; j = i++) a += (p[j].x - p[i].x) * (p[j].y + p[i].y);
  return a;
}

/** The ring without vertices where it goes straight on or doubles back (zero turn). */
export function dropCollinear(p: Path64): Path64 {
  let cur = p;
  for (let changed = true; changed && cur.length > 3; ) {
    changed = false;
    const out: Path64 = [];
    for (let i = 0; i < cur.length; i++) {
      const a = out.length ? out[out.length - 1] : cur[cur.length - 1];
      const b = cur[i];
      const c = cur[(i + 1) % cur.length];
      if ((b.x - a.x) * (c.y - b.y) - (b.y - a.y) * (c.x - b.x) === 0) {
        changed = true;
        continue;
      }
      out.push(b);
    }
    cur = out;
  }
  return cur;
}

/**
 * The exact offset of a loop to the right of travel by distMm (outward for an outline, into the hole
 * for a hole), or null when a hole closes up. A polygon fallback is offset a little further so the
 * result still contains the exact offset.
 */
function grown(loop: Loop, distMm: number): Loop | null {
  const r = offsetRight(loop, distMm);
  if (r.kind === 'collapsed') return null;
  if (r.kind === 'exact') return r.loop;
  const again = offsetRight(loop, distMm + POLYGON_OFFSET_SLACK_MM);
  return again.kind === 'collapsed' ? null : again.loop;
}

/**
 * A part grown by half the spacing and turned by rotRad about its origin, with the windows (inner
 * contours shrunk by half the spacing) that `keepWindow` accepts; the others are filled.
 */
export function dilatedShape(part: Part, halfSpacingMm: number, rotRad: number, keepWindow: (ring: Path64) => boolean = () => false): NestShape {
  const d = halfSpacingMm + NEST_ROUNDING_MM;
  const turn = { rotateRad: rotRad, translate: [0, 0] as const };
  const outline = grown(part.outline, d);
  if (!outline) throw new Error(`nesting: the outline of ${part.name} vanished when grown`);
  const rings: Paths64 = [orient(materialPolygon(transformLoop(outline, turn), NEST_SAG_MM), true)];
  for (const f of part.features) {
    const w = grown(f.loop, d);
    if (!w) continue;
    const ring = orient(materialPolygon(transformLoop(w, turn), NEST_SAG_MM), false);
    if (ring.length >= 3 && keepWindow(ring)) rings.push(ring);
  }
  return shapeOf(rings);
}

function orient(p: Path64, ccw: boolean): Path64 {
  return ringArea2(p) > 0 === ccw ? p : [...p].reverse();
}

/** Bounding box of a ring, integer units. */
export function ringBox(p: Path64): IBox {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const q of p) {
    if (q.x < x0) x0 = q.x;
    if (q.y < y0) y0 = q.y;
    if (q.x > x1) x1 = q.x;
    if (q.y > y1) y1 = q.y;
  }
  return [x0, y0, x1, y1];
}

function shapeOf(rings: Paths64): NestShape {
  return { rings, box: ringBox(rings[0]), pieces: convexPieces(rings) };
}

/** The shape turned by k quarter turns about the origin: exact on the integer grid. */
export function quarterTurn(s: NestShape, k: number): NestShape {
  const q = ((k % 4) + 4) % 4;
  if (q === 0) return s;
  const turn = (ps: Paths64) => ps.map((p) => p.map((v) => turnPoint(v, q)));
  return { rings: turn(s.rings), box: ringBox(turn([s.rings[0]])[0]), pieces: turn(s.pieces) };
}

/** (x, y) turned by q quarter turns counter-clockwise. */
export function turnPoint(v: { x: number; y: number }, q: number): { x: number; y: number } {
  switch (q) {
    case 1:
      return { x: -v.y, y: v.x };
    case 2:
      return { x: -v.x, y: -v.y };
    case 3:
      return { x: v.y, y: -v.x };
    default:
      return { x: v.x, y: v.y };
  }
}

/** Do two shapes coincide after a translation? (A part with a half-turn symmetry needs one orientation, not two.) */
export function sameShape(a: NestShape, b: NestShape): boolean {
  if (a.rings.length !== b.rings.length) return false;
  const norm = (s: NestShape) => s.rings.map((r) => canonicalRing(r, s.box[0], s.box[1])).sort();
  const x = norm(a);
  const y = norm(b);
  return x.every((r, i) => r === y[i]);
}

function canonicalRing(r: Path64, ox: number, oy: number): string {
  const pts = r.map((p) => [p.x - ox, p.y - oy] as const);
  let k = 0;
  for (let i = 1; i < pts.length; i++) if (pts[i][0] < pts[k][0] || (pts[i][0] === pts[k][0] && pts[i][1] < pts[k][1])) k = i;
  return [...pts.slice(k), ...pts.slice(0, k)].map((p) => `${p[0]},${p[1]}`).join(' ');
}

/**
 * Convex pieces covering the shape exactly: a triangulation (clipper2's, checked by area: the
 * triangles' integer areas must add up to the polygon's) merged greedily across shared edges while
 * both ends of the edge stay convex (Hertel–Mehlhorn; at most four times the fewest pieces).
 * Returns an empty list when the triangulation does not check out (the no-fit polygon then takes
 * the slower edge-by-edge route).
 */
export function convexPieces(rings: Paths64): Paths64 {
  const tri = triangulate(rings, false);
  if (tri.result !== 0) return [];
  const tris = tri.solution.map((t) => orient(t, true)).filter((t) => t.length === 3 && ringArea2(t) !== 0);
  const want = rings.reduce((a, r) => a + ringArea2(r), 0);
  const got = tris.reduce((a, t) => a + ringArea2(t), 0);
  if (Math.abs(got - want) > 1e-9 * Math.abs(want) + 4) return [];
  // Vertices by coordinate, pieces as index cycles, edges to their piece.
  const ids = new Map<string, number>();
  const verts: Array<{ x: number; y: number }> = [];
  const id = (p: { x: number; y: number }) => {
    const k = `${p.x},${p.y}`;
    let v = ids.get(k);
    if (v === undefined) {
      v = verts.length;
      ids.set(k, v);
      verts.push({ x: p.x, y: p.y });
    }
    return v;
  };
  const pieces: Array<number[] | null> = tris.map((t) => t.map(id));
  const owner = new Map<string, number>();
  pieces.forEach((p, k) => p!.forEach((v, i) => owner.set(`${v},${p![(i + 1) % p!.length]}`, k)));
  const convexAt = (a: number, b: number, c: number) => {
    const A = verts[a];
    const B = verts[b];
    const C = verts[c];
    return (B.x - A.x) * (C.y - B.y) - (B.y - A.y) * (C.x - B.x) >= 0;
  };
  for (let changed = true; changed; ) {
    changed = false;
    for (let k = 0; k < pieces.length; k++) {
      const P = pieces[k];
      if (!P) continue;
      for (let i = 0; i < P.length; i++) {
        const u = P[i];
        const v = P[(i + 1) % P.length];
        const m = owner.get(`${v},${u}`);
        if (m === undefined || m === k || !pieces[m]) continue;
        const Q = pieces[m]!;
        // Walk P from v round to u, then Q from u round to v: the merged cycle without the edge u–v.
        const merged: number[] = [];
        for (let s = 0; s < P.length; s++) merged.push(P[(i + 1 + s) % P.length]);
        const j = Q.indexOf(u);
        for (let s = 1; s < Q.length - 1; s++) merged.push(Q[(j + s) % Q.length]);
        const n = merged.length;
        const ok = merged.every((x, t) => convexAt(merged[(t - 1 + n) % n], x, merged[(t + 1) % n]));
        if (!ok) continue;
        pieces[k] = merged;
        pieces[m] = null;
        merged.forEach((x, t) => owner.set(`${x},${merged[(t + 1) % n]}`, k));
        changed = true;
        break;
      }
    }
  }
  return pieces.filter((p): p is number[] => p !== null).map((p) => dropCollinear(p.map((v) => verts[v])));
}

/** Order of two edge directions by angle in [0, 2π): negative when (ax, ay) comes first. Exact on integers. */
function compareAngle(ax: number, ay: number, bx: number, by: number): number {
  const half = (x: number, y: number) => (y < 0 || (y === 0 && x < 0) ? 1 : 0);
  const h = half(ax, ay) - half(bx, by);
  if (h !== 0) return h;
  const c = ax * by - ay * bx;
  return c > 0 ? -1 : c < 0 ? 1 : 0;
}

/** Minkowski sum of two convex counter-clockwise polygons (edges merged by angle, from the lowest vertices). */
export function convexSum(P: Path64, Q: Path64): Path64 {
  const start = (R: Path64) => {
    let k = 0;
    for (let i = 1; i < R.length; i++) if (R[i].y < R[k].y || (R[i].y === R[k].y && R[i].x < R[k].x)) k = i;
    return k;
  };
  const i0 = start(P);
  const j0 = start(Q);
  const out: Path64 = [];
  let i = 0;
  let j = 0;
  while (i < P.length || j < Q.length) {
    const p = P[(i0 + i) % P.length];
    const q = Q[(j0 + j) % Q.length];
    out.push({ x: p.x + q.x, y: p.y + q.y });
    const pn = P[(i0 + i + 1) % P.length];
    const qn = Q[(j0 + j + 1) % Q.length];
    const order = i >= P.length ? 1 : j >= Q.length ? -1 : compareAngle(pn.x - p.x, pn.y - p.y, qn.x - q.x, qn.y - q.y);
    if (order <= 0) i++;
    if (order >= 0) j++;
  }
  return out;
}

/**
 * No-fit polygon of B around A: the positions of B's origin (A's at the origin) where the two shapes
 * overlap, i.e. A ⊕ (−B). Its outer boundary is where B touches A from outside; holes in it are places
 * where B fits inside a window of A. B's own windows are ignored (B is treated as solid).
 * Method: A's convex pieces, each convolved with −B's outline; for a convex polygon and a simple one the
 * Minkowski sum is exactly the region of positive winding of their convolution cycle (Guibas, Ramshaw
 * and Stolfi, "A kinetic framework for computational geometry", 1983), so the union of those regions
 * under the positive fill rule is the no-fit polygon. Without pieces (a triangulation that did not
 * check out) A's edges are swept by −B one by one, which is exact and slower.
 */
export function noFitPolygon(A: NestShape, B: NestShape): Paths64 {
  const nb = B.rings[0].map((v) => ({ x: -v.x, y: -v.y }));
  if (A.pieces.length) return union(A.pieces.map((a) => convolution(a, nb)), FillRule.Positive);
  // Edge by edge: A's boundary swept by −B, plus A moved by a point of −B and −B moved by a point of A.
  const parts: Paths64 = [];
  for (const ring of A.rings) parts.push(...Minkowski.sum(nb, ring, true));
  parts.push(...A.rings.map((r) => r.map((v) => ({ x: v.x + nb[0].x, y: v.y + nb[0].y }))));
  parts.push(nb.map((v) => ({ x: v.x + A.rings[0][0].x, y: v.y + A.rings[0][0].y })));
  return union(parts, FillRule.NonZero);
}

/**
 * The convolution cycle of a convex polygon P and a simple polygon Q (both counter-clockwise): Q's
 * edges, each moved by the vertex of P that supports it, joined at every vertex of Q by the edges of P
 * whose directions lie in the turn (walked backwards at a reflex vertex). Exact on integers.
 */
export function convolution(P: Path64, Q: Path64): Path64 {
  const m = P.length;
  const n = Q.length;
  const e = (k: number) => {
    const a = P[((k % m) + m) % m];
    const b = P[(((k + 1) % m) + m) % m];
    return { x: b.x - a.x, y: b.y - a.y };
  };
  const f = (j: number) => {
    const a = Q[j % n];
    const b = Q[(j + 1) % n];
    return { x: b.x - a.x, y: b.y - a.y };
  };
  const cross = (a: { x: number; y: number }, b: { x: number; y: number }) => a.x * b.y - a.y * b.x;
  const dot = (a: { x: number; y: number }, b: { x: number; y: number }) => a.x * b.x + a.y * b.y;
  // Is d after a and not after b, turning counter-clockwise by less than half a turn from a?
  const within = (a: { x: number; y: number }, d: { x: number; y: number }, b: { x: number; y: number }) => cross(a, d) > 0 && (cross(d, b) > 0 || (cross(d, b) === 0 && dot(d, b) > 0));
  // P's edges rise in angle from its lowest vertex; p_k supports f_0 when e_{k−1} ≤ f_0 < e_k.
  let low = 0;
  for (let i = 1; i < m; i++) if (P[i].y < P[low].y || (P[i].y === P[low].y && P[i].x < P[low].x)) low = i;
  const f0 = f(0);
  let k = low;
  for (let i = 0; i < m; i++) {
    if (compareAngle(e(low + i).x, e(low + i).y, f0.x, f0.y) > 0) {
      k = low + i;
      break;
    }
    if (i === m - 1) k = low + m;
  }
  const out: Path64 = [];
  let x = Q[0].x + P[((k % m) + m) % m].x;
  let y = Q[0].y + P[((k % m) + m) % m].y;
  out.push({ x, y });
  const step = (d: { x: number; y: number }, sign: number) => {
    x += sign * d.x;
    y += sign * d.y;
    out.push({ x, y });
  };
  for (let j = 0; j < n; j++) {
    const fj = f(j);
    step(fj, 1);
    const g = f(j + 1);
    const turn = cross(fj, g);
    if (turn > 0 || (turn === 0 && dot(fj, g) > 0)) {
      for (let guard = 0; guard < m && within(fj, e(k), g); guard++) step(e(k++), 1);
    } else {
      for (let guard = 0; guard < m && within(g, e(k - 1), fj); guard++) step(e(--k), -1);
    }
  }
  out.pop();
  // Where an edge of P runs parallel to an edge of Q the cycle doubles back on itself; clipper's fill
  // rules misread such zero-width spikes, so they are removed (they enclose nothing).
  return dropCollinear(out);
}

/**
 * Area a part takes from a sheet at the least: the part grown by half the spacing (exact lines and
 * arcs), minus what is left of each inner contour shrunk by half the spacing that could hold another
 * part. Two parts' grown shapes never overlap and all of them lie in the sheet's usable area grown by
 * half the spacing, so the sum of these areas over that area is a true lower bound on the sheets
 * needed. A part set inside a window keeps the spacing from its rim, so its grown outline (filled) lies
 * inside the window shrunk by half the spacing: a window whose shrunk area is below
 * `smallestGuestMm2` (the least filled grown outline of the parts that share the sheets) holds none,
 * and its area stays with its part. mm².
 */
export function occupiedAreaMm2(part: Part, halfSpacingMm: number, smallestGuestMm2 = 0): number {
  // A polygon fallback lies within 0.002 mm of the exact offset: stay below the exact area.
  const slack = (r: { kind: string; loop: Loop }) => (r.kind === 'polygon' ? 0.002 * loopLength(r.loop) : 0);
  const out = offsetRight(part.outline, halfSpacingMm);
  if (out.kind === 'collapsed') return 0;
  let a = Math.abs(signedArea(out.loop)) - slack(out);
  for (const f of part.features) {
    const w = offsetRight(f.loop, halfSpacingMm);
    if (w.kind === 'collapsed') continue;
    // Upper estimate of the window's free area, so "too small to hold a guest" is never claimed wrongly.
    const free = Math.abs(signedArea(w.loop)) + slack(w);
    if (free >= smallestGuestMm2) a -= free;
  }
  return Math.max(0, a);
}

/** A part's outline grown by half the spacing, filled (its windows ignored): what a guest needs of a window. mm², a lower estimate. */
export function filledGrownAreaMm2(part: Part, halfSpacingMm: number): number {
  return occupiedAreaMm2({ ...part, features: [] }, halfSpacingMm);
}

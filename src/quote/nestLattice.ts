import { PointInPolygonResult, pointInPolygon, type Paths64 } from 'clipper2-ts';
import type { IBox } from './nestShapes.js';

/**
 * Lattice layouts of one kind of part: copies repeated by two translation vectors, as a single copy
 * or as a pair (a copy and its half-turned twin, arms tip to root) repeated together. The classic way
 * to pack many identical shapes: a vector a along the rows, the shortest that keeps a copy clear of the
 * next (found on the no-fit polygon of the shape with itself), then a vector b to the next row, for each
 * of a range of sideways offsets the shortest that keeps every copy clear of every row below. The
 * lattice is then laid on the sheet at the offset that fits the most copies inside the margins.
 *
 * Everything is in the nesting's integer units. A lattice only proposes positions: the nesting checks
 * each against the no-fit polygons of the parts already placed before it puts a copy there.
 */

type Pt = Readonly<{ x: number; y: number }>;

/** What the search needs from the nesting: each orientation's box of reference points on the sheet, and no-fit polygons. */
export type LatticeSource = Readonly<{
  /** Reference-point box where orientation oi stays on the sheet, or null when it does not fit. */
  ifp: (oi: number) => IBox | null;
  /** Positions of b's reference point, relative to a's, where the two overlap (windows of a are holes). */
  nfp: (a: number, b: number) => Paths64;
}>;

/** One copy of a lattice layout: orientation and reference point. */
export type LatticePoint = Readonly<{ oi: number; x: number; y: number }>;

export type Lattice = Readonly<{
  /** Copies that fit on an empty sheet, in the order they should be placed (rows from the bottom). */
  points: readonly LatticePoint[];
  /** Row vector, second vector, and the motif's members (orientation, offset), in sheet axes. */
  a: Pt;
  b: Pt;
  motif: readonly Member[];
}>;

type Member = Readonly<{ oi: number; d: Pt }>;

/** Straight edges of a no-fit polygon, sorted into slabs so that a line meets only a few of them. */
class EdgeIndex {
  readonly box: IBox;
  private readonly x0: Float64Array;
  private readonly y0: Float64Array;
  private readonly x1: Float64Array;
  private readonly y1: Float64Array;
  /** Edges by slab of the coordinate across the line (x for vertical lines, y for horizontal ones). */
  private readonly slabs: [number[][], number[][]];
  private readonly slabSize: [number, number];

  constructor(readonly paths: Paths64) {
    const n = paths.reduce((a, p) => a + p.length, 0);
    this.x0 = new Float64Array(n);
    this.y0 = new Float64Array(n);
    this.x1 = new Float64Array(n);
    this.y1 = new Float64Array(n);
    let bx0 = Infinity;
    let by0 = Infinity;
    let bx1 = -Infinity;
    let by1 = -Infinity;
    let e = 0;
    for (const p of paths) {
      for (let i = 0; i < p.length; i++) {
        const a = p[i];
        const b = p[(i + 1) % p.length];
        this.x0[e] = a.x;
        this.y0[e] = a.y;
        this.x1[e] = b.x;
        this.y1[e] = b.y;
        e++;
        bx0 = Math.min(bx0, a.x);
        by0 = Math.min(by0, a.y);
        bx1 = Math.max(bx1, a.x);
        by1 = Math.max(by1, a.y);
      }
    }
    this.box = [bx0, by0, bx1, by1];
    const count = Math.max(1, Math.min(256, Math.ceil(n / 8)));
    const make = (lo: number, hi: number, c0: Float64Array, c1: Float64Array): [number[][], number] => {
      const size = Math.max(1, (hi - lo) / count);
      const slabs: number[][] = Array.from({ length: count }, () => []);
      for (let k = 0; k < n; k++) {
        const s0 = Math.max(0, Math.min(count - 1, Math.floor((Math.min(c0[k], c1[k]) - lo) / size)));
        const s1 = Math.max(0, Math.min(count - 1, Math.floor((Math.max(c0[k], c1[k]) - lo) / size)));
        for (let s = s0; s <= s1; s++) slabs[s].push(k);
      }
      return [slabs, size];
    };
    const [vx, sx] = make(bx0, bx1, this.x0, this.x1);
    const [hy, sy] = make(by0, by1, this.y0, this.y1);
    this.slabs = [vx, hy];
    this.slabSize = [sx, sy];
  }

  /**
   * Open intervals along the line where it is inside the polygons: along y on the vertical line x = c
   * (axis 0), along x on the horizontal line y = c (axis 1). An edge counts when its ends lie on either
   * side of the line, the lower end included (half-open), so vertices are never counted twice.
   */
  inside(axis: 0 | 1, c: number): number[] {
    const lo = this.box[axis];
    const hi = this.box[axis + 2];
    if (c <= lo || c >= hi) return [];
    const s = Math.min(this.slabs[axis].length - 1, Math.floor((c - lo) / this.slabSize[axis]));
    const [u0, u1, v0, v1] = axis === 0 ? [this.x0, this.x1, this.y0, this.y1] : [this.y0, this.y1, this.x0, this.x1];
    const hits: number[] = [];
    for (const k of this.slabs[axis][s]) {
      const a = u0[k];
      const b = u1[k];
      if (a <= c !== b <= c) hits.push(v0[k] + ((c - a) / (b - a)) * (v1[k] - v0[k]));
    }
    hits.sort((p, q) => p - q);
    return hits;
  }

  /** Is the point strictly inside (not on the boundary)? Exact on integers. */
  contains(p: Pt): boolean {
    if (p.x <= this.box[0] || p.x >= this.box[2] || p.y <= this.box[1] || p.y >= this.box[3]) return false;
    let odd = false;
    for (const ring of this.paths) {
      const r = pointInPolygon(p, ring);
      if (r === PointInPolygonResult.IsOn) return false;
      if (r === PointInPolygonResult.IsInside) odd = !odd;
    }
    return odd;
  }
}

/** A view of the source with x and y swapped, so that one search finds rows along x and along y. */
type View = Readonly<{ ifp: (oi: number) => IBox | null; nfp: (a: number, b: number) => EdgeIndex }>;

function viewOf(src: LatticeSource, swap: boolean, cache: Map<string, EdgeIndex>): View {
  const sw = (b: IBox | null): IBox | null => (b && swap ? [b[1], b[0], b[3], b[2]] : b);
  return {
    ifp: (oi) => sw(src.ifp(oi)),
    nfp: (a, b) => {
      const key = `${a}|${b}|${swap ? 1 : 0}`;
      let idx = cache.get(key);
      if (!idx) {
        const p = src.nfp(a, b);
        idx = new EdgeIndex(swap ? p.map((r) => r.map((v) => ({ x: v.y, y: v.x }))) : p);
        cache.set(key, idx);
      }
      return idx;
    },
  };
}

/** One ordered pair of motif members and how far the second sits from the first. */
type PairConstraint = Readonly<{ nfp: EdgeIndex; cx: number; cy: number; same: boolean }>;

function pairConstraints(view: View, motif: readonly Member[]): PairConstraint[] {
  const out: PairConstraint[] = [];
  for (const m of motif) for (const n of motif) out.push({ nfp: view.nfp(m.oi, n.oi), cx: n.d.x - m.d.x, cy: n.d.y - m.d.y, same: m === n });
  return out;
}

/**
 * The shortest row vector (ax, 0) for which no two copies of the motif in the row overlap: for every
 * pair and every k ≠ 0, (cx + k·ax, cy) stays out of the no-fit polygon's interior. Null when the
 * motif's own members overlap.
 */
function rowPeriod(pairs: readonly PairConstraint[]): number | null {
  const lines = pairs.map((p) => ({ p, hits: p.nfp.inside(1, p.cy) }));
  for (const { p, hits } of lines) {
    if (p.same) continue;
    for (let i = 0; i + 1 < hits.length; i += 2) if (p.cx > hits[i] && p.cx < hits[i + 1]) return null;
  }
  // Start past each copy's own no-fit interval through its reference point (the first neighbour can
  // sit no closer), so the search below steps over few multiples.
  let ax = 1;
  for (const { p, hits } of lines) {
    if (!p.same) continue;
    for (let i = 0; i + 1 < hits.length; i += 2) if (p.cx > hits[i] && p.cx < hits[i + 1]) ax = Math.max(ax, Math.ceil(hits[i + 1] - p.cx) + 1);
  }
  for (let changed = true; changed; ) {
    changed = false;
    for (const { p, hits } of lines) {
      for (let i = 0; i + 1 < hits.length; i += 2) {
        const l = hits[i];
        const h = hits[i + 1];
        // k with cx + k·ax inside (l, h): bump ax until each such k sits at an end.
        const kLo = Math.ceil((l - p.cx) / ax + 1e-12);
        const kHi = Math.floor((h - p.cx) / ax - 1e-12);
        for (let k = kLo; k <= kHi; k++) {
          if (k === 0) continue;
          const v = p.cx + k * ax;
          if (!(v > l && v < h)) continue;
          const next = k > 0 ? Math.ceil((h - p.cx) / k) + 1 : Math.ceil((l - p.cx) / k) + 1;
          if (next > ax) {
            ax = next;
            changed = true;
          }
        }
      }
    }
  }
  return ax;
}

/**
 * The shortest by > 0 for which rows spaced by (bx, by) keep clear of each other (every pair, every
 * copy along the row, every multiple of b that still reaches a neighbour). Null when none is found.
 */
function rowSpacing(pairs: readonly PairConstraint[], ax: number, bx: number): number | null {
  let by = 1;
  for (let guard = 0; guard < 64; guard++) {
    let bumped = false;
    for (let j = 1; ; j++) {
      let reach = false;
      const forbidden: Array<[number, number]> = [];
      for (const p of pairs) {
        if (p.cy + j * by >= p.nfp.box[3]) continue;
        reach = true;
        // Copies of the row whose vertical line crosses the no-fit polygon.
        const base = p.cx + j * bx;
        const kLo = Math.ceil((p.nfp.box[0] - base) / ax);
        const kHi = Math.floor((p.nfp.box[2] - base) / ax);
        for (let k = kLo; k <= kHi; k++) {
          const hits = p.nfp.inside(0, base + k * ax);
          for (let i = 0; i + 1 < hits.length; i += 2) forbidden.push([(hits[i] - p.cy) / j, (hits[i + 1] - p.cy) / j]);
        }
      }
      if (!reach) break;
      forbidden.sort((u, v) => u[0] - v[0]);
      let y = by;
      for (const [l, h] of forbidden) if (y > l && y < h) y = Math.ceil(h) + 1;
      if (y !== by) {
        by = y;
        bumped = true;
        break;
      }
    }
    if (!bumped) return by;
  }
  return null;
}

/** Each member's rows inside its box of reference points for a lattice at offset (ox, oy): copies s + k·ax, k from k0 to k1. */
function rowsOf(motif: readonly Member[], B: readonly IBox[], ax: number, bx: number, by: number, ox: number, oy: number): Array<{ oi: number; y: number; s: number; k0: number; k1: number }> {
  const rows: Array<{ oi: number; y: number; s: number; k0: number; k1: number }> = [];
  motif.forEach((m, i) => {
    const b = B[i];
    const j0 = Math.ceil((b[1] - oy - m.d.y) / by);
    const j1 = Math.floor((b[3] - oy - m.d.y) / by);
    for (let j = j0; j <= j1; j++) {
      const s = ox + m.d.x + j * bx;
      rows.push({ oi: m.oi, y: oy + m.d.y + j * by, s, k0: Math.ceil((b[0] - s) / ax), k1: Math.floor((b[2] - s) / ax) });
    }
  });
  return rows;
}

/** Where the lattice fits most copies on the sheet: the positions, bottom row first. */
function layOut(view: View, motif: readonly Member[], ax: number, bx: number, by: number): LatticePoint[] {
  const boxes = motif.map((m) => view.ifp(m.oi));
  if (boxes.some((b) => !b)) return [];
  const B = boxes as IBox[];
  const countFor = (ox: number, oy: number): number => rowsOf(motif, B, ax, bx, by, ox, oy).reduce((n, r) => n + Math.max(0, r.k1 - r.k0 + 1), 0);
  let best: { n: number; ox: number; oy: number } | null = null;
  for (const [i, m] of motif.entries()) {
    for (const oy of [B[i][1] - m.d.y, B[i][3] - m.d.y]) {
      motif.forEach((q, k) => {
        const j0 = Math.ceil((B[k][1] - oy - q.d.y) / by);
        const j1 = Math.floor((B[k][3] - oy - q.d.y) / by);
        for (let j = j0; j <= j1; j++) {
          for (const ox of [B[k][0] - q.d.x - j * bx, B[k][2] - q.d.x - j * bx]) {
            const n = countFor(ox, oy);
            if (!best || n > best.n) best = { n, ox, oy };
          }
        }
      });
    }
  }
  // (best is set inside a callback, which the compiler does not follow.)
  const at = best as { n: number; ox: number; oy: number } | null;
  if (!at) return [];
  const pts: LatticePoint[] = [];
  for (const r of rowsOf(motif, B, ax, bx, by, at.ox, at.oy)) for (let k = r.k0; k <= r.k1; k++) pts.push({ oi: r.oi, x: r.s + k * ax, y: r.y });
  return pts;
}

/** Candidate offsets of a pair's second member: vertices of the no-fit polygon where the pair's box is smallest. */
function pairOffsets(view: View, a: number, b: number, boxOf: (oi: number) => IBox, keep: number): Pt[] {
  const nfp = view.nfp(a, b);
  const A = boxOf(a);
  const Bb = boxOf(b);
  const seen = new Set<string>();
  const scored: Array<{ d: Pt; s: number }> = [];
  for (const ring of nfp.paths) {
    for (const v of ring) {
      const k = `${v.x},${v.y}`;
      if (seen.has(k)) continue;
      seen.add(k);
      const w = Math.max(A[2], Bb[2] + v.x) - Math.min(A[0], Bb[0] + v.x);
      const h = Math.max(A[3], Bb[3] + v.y) - Math.min(A[1], Bb[1] + v.y);
      scored.push({ d: v, s: w * h });
    }
  }
  scored.sort((p, q) => p.s - q.s || p.d.x - q.d.x || p.d.y - q.d.y);
  return scored.slice(0, keep).map((x) => x.d);
}

export type LatticeOptions = Readonly<{
  /** Orientations of the kind (indices the source understands). */
  orients: readonly number[];
  /** The half-turned orientation of each, when the weave and the shop allow it (may be itself). */
  halfTurn: (oi: number) => number | null;
  /** Bounding box of each orientation's shape about its reference point (for choosing pair offsets). */
  box: (oi: number) => IBox;
  /** Sideways offsets tried for the second vector per motif. */
  samples?: number;
  /** Pair offsets tried per pair of orientations. */
  pairOffsets?: number;
}>;

/**
 * The lattice of one kind of part that fits the most copies on an empty sheet: single copies in each
 * orientation and pairs (a copy with its half-turned twin, or two alike), rows along x and along y.
 * Deterministic. Returns null when no lattice fits two copies.
 */
export function bestLattice(src: LatticeSource, options: LatticeOptions): Lattice | null {
  const samples = options.samples ?? 24;
  const cache = new Map<string, EdgeIndex>();
  let best: Lattice | null = null;
  // More copies win; then the smaller box round them (a larger strip left for the other rules to fill).
  let bestSpan = Infinity;
  const spanOf = (pts: readonly LatticePoint[], boxOf: (oi: number) => IBox): number => {
    let x0 = Infinity;
    let y0 = Infinity;
    let x1 = -Infinity;
    let y1 = -Infinity;
    for (const p of pts) {
      const b = boxOf(p.oi);
      x0 = Math.min(x0, p.x + b[0]);
      y0 = Math.min(y0, p.y + b[1]);
      x1 = Math.max(x1, p.x + b[2]);
      y1 = Math.max(y1, p.y + b[3]);
    }
    return (x1 - x0) * (y1 - y0);
  };
  for (const swap of [false, true]) {
    const view = viewOf(src, swap, cache);
    const boxOf = (oi: number): IBox => {
      const b = options.box(oi);
      return swap ? [b[1], b[0], b[3], b[2]] : b;
    };
    const motifs: Member[][] = options.orients.map((oi) => [{ oi, d: { x: 0, y: 0 } }]);
    for (const oi of options.orients) {
      const twin = options.halfTurn(oi);
      if (twin === null || twin < oi) continue;
      for (const d of pairOffsets(view, oi, twin, boxOf, options.pairOffsets ?? 12)) motifs.push([{ oi, d: { x: 0, y: 0 } }, { oi: twin, d }]);
    }
    for (const motif of motifs) {
      const pairs = pairConstraints(view, motif);
      const ax = rowPeriod(pairs);
      if (ax === null) continue;
      for (let s = 0; s < samples; s++) {
        const bx = Math.floor((ax * s) / samples);
        const by = rowSpacing(pairs, ax, bx);
        if (by === null) continue;
        const pts = layOut(view, motif, ax, bx, by);
        if (pts.length < 2 || (best && pts.length < best.points.length)) continue;
        const span = spanOf(pts, boxOf);
        if (!best || pts.length > best.points.length || span < bestSpan) {
          bestSpan = span;
          const un = (p: Pt): Pt => (swap ? { x: p.y, y: p.x } : p);
          const points = pts.map((p) => ({ oi: p.oi, ...un(p) })).sort((p, q) => p.y - q.y || p.x - q.x);
          best = { points, a: un({ x: ax, y: 0 }), b: un({ x: bx, y: by }), motif: motif.map((m) => ({ oi: m.oi, d: un(m.d) })) };
        }
      }
    }
  }
  return best;
}

/** No-fit polygons indexed for point tests, by pair of orientations (kept by the caller for reuse). */
export type NfpIndexCache = Map<string, EdgeIndex>;

/**
 * Does a copy at p keep clear of a copy at q? Exact on the integer no-fit polygons (touching counts as
 * clear: the shapes already carry the spacing). Either polygon may prove it: the one around q sees q's
 * windows, the one around p sees p's.
 */
export function clearOf(src: LatticeSource, cache: NfpIndexCache, q: LatticePoint, p: LatticePoint): boolean {
  const idx = (a: number, b: number) => {
    const key = `${a}|${b}|0`;
    let e = cache.get(key);
    if (!e) {
      e = new EdgeIndex(src.nfp(a, b));
      cache.set(key, e);
    }
    return e;
  };
  return !idx(q.oi, p.oi).contains({ x: p.x - q.x, y: p.y - q.y }) || !idx(p.oi, q.oi).contains({ x: q.x - p.x, y: q.y - p.y });
}

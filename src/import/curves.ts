import { arc, closestPoint, line, pointAt, reverseSegment } from '../geometry/segment.js';
import type { Segment, Vec2 } from '../geometry/types.js';
import { add, cross, dist, dot, len, perp, scale, sub } from '../geometry/vec.js';

/** A smooth plane curve over [t0, t1]: position and (not necessarily unit) derivative. */
export type ParamCurve = Readonly<{
  point: (t: number) => Vec2;
  derivative: (t: number) => Vec2;
  t0: number;
  t1: number;
  /** Parameters where the curve may not be smooth (spline knots); fitting splits there first. */
  breaks?: readonly number[];
}>;

const MAX_DEPTH = 18;
const SAMPLES = 8;
/** Spans one curve may be split into before it is refused (keeps a wild spline from taking seconds). */
const MAX_SPANS = 20_000;

/**
 * Replace a smooth curve by tangent-continuous arcs (biarcs) within tolMm of it: each span gets
 * two arcs meeting with a common tangent; spans whose samples stray further are halved. Cusps or
 * spans below the depth limit fall back to a straight line. Result in curve order, start to end.
 */
export function fitArcs(c: ParamCurve, tolMm: number): Segment[] {
  const cuts = [c.t0, ...(c.breaks ?? []).filter((t) => t > c.t0 && t < c.t1), c.t1];
  // At least four spans so that no biarc has to turn through more than about a quadrant.
  const spans: Array<[number, number]> = [];
  for (let i = 0; i + 1 < cuts.length; i++) spans.push([cuts[i], cuts[i + 1]]);
  const minSpans = 4;
  const pieces: Array<[number, number]> = [];
  for (const [a, b] of spans) {
    const k = Math.max(1, Math.ceil((minSpans * (b - a)) / (c.t1 - c.t0)));
    for (let j = 0; j < k; j++) pieces.push([a + ((b - a) * j) / k, a + ((b - a) * (j + 1)) / k]);
  }
  if (pieces.length > MAX_SPANS) throw new Error(`the curve has more than ${MAX_SPANS} pieces`);
  const out: Segment[] = [];
  const budget = { spans: MAX_SPANS };
  for (const [a, b] of pieces) fitSpan(c, a, b, tolMm, 0, out, budget);
  return out;
}

function unitTangent(c: ParamCurve, t: number, fromRight: boolean): Vec2 | null {
  let d = c.derivative(t);
  let l = len(d);
  if (!(l > 1e-12)) {
    // A cusp or a stationary point: look a little way into the span instead.
    const h = (c.t1 - c.t0) * 1e-6 * (fromRight ? 1 : -1);
    d = sub(c.point(t + h), c.point(t));
    l = len(d);
    if (!(l > 0)) return null;
    if (!fromRight) d = scale(d, -1);
  }
  return [d[0] / l, d[1] / l];
}

function fitSpan(c: ParamCurve, ta: number, tb: number, tol: number, depth: number, out: Segment[], budget: { spans: number }): void {
  if (--budget.spans < 0) throw new Error(`the curve needs more than ${MAX_SPANS} arcs to stay within ${tol} mm`);
  const p0 = c.point(ta);
  const p1 = c.point(tb);
  const t0 = unitTangent(c, ta, true);
  const t1 = unitTangent(c, tb, false);
  const candidate = t0 && t1 && dist(p0, p1) > 0 ? biarc(p0, t0, p1, t1) : null;
  const within = (segs: Segment[]): boolean => {
    for (let k = 1; k < SAMPLES; k++) {
      const q = c.point(ta + ((tb - ta) * k) / SAMPLES);
      let d = Infinity;
      for (const s of segs) d = Math.min(d, closestPoint(s, q).distance);
      if (d > tol) return false;
    }
    // The arcs must not bulge away between the samples either.
    for (const s of segs) if (distanceToCurve(c, pointAt(s, 0.5), ta, tb) > tol) return false;
    return true;
  };
  if (candidate && within(candidate)) {
    out.push(...candidate);
    return;
  }
  if (depth >= MAX_DEPTH || dist(p0, p1) <= tol) {
    if (dist(p0, p1) > 0) out.push(line(p0, p1));
    return;
  }
  const tm = (ta + tb) / 2;
  fitSpan(c, ta, tm, tol, depth + 1, out, budget);
  fitSpan(c, tm, tb, tol, depth + 1, out, budget);
}

/** Distance from q to the curve between ta and tb: coarse samples, then a ternary search. */
function distanceToCurve(c: ParamCurve, q: Vec2, ta: number, tb: number): number {
  const n = 4 * SAMPLES;
  let best = 0;
  let bestD = Infinity;
  for (let k = 0; k <= n; k++) {
    const d = dist(q, c.point(ta + ((tb - ta) * k) / n));
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  let lo = ta + ((tb - ta) * Math.max(0, best - 1)) / n;
  let hi = ta + ((tb - ta) * Math.min(n, best + 1)) / n;
  for (let i = 0; i < 40; i++) {
    const m1 = lo + (hi - lo) / 3;
    const m2 = hi - (hi - lo) / 3;
    if (dist(q, c.point(m1)) < dist(q, c.point(m2))) hi = m2;
    else lo = m1;
  }
  return Math.min(bestD, dist(q, c.point((lo + hi) / 2)));
}

/**
 * Two arcs from p0 (tangent t0) to p1 (tangent t1) with equal tangent lengths d, meeting at the
 * midpoint of the tangent points (the classic equal-d biarc). Null when no positive d exists.
 */
export function biarc(p0: Vec2, t0: Vec2, p1: Vec2, t1: Vec2): Segment[] | null {
  const v = sub(p1, p0);
  const t = add(t0, t1);
  const vt = dot(v, t);
  const vv = dot(v, v);
  const denom = 2 * (1 - dot(t0, t1));
  const root = Math.sqrt(vt * vt + denom * vv);
  const d = vv / (vt + root);
  if (!(d > 0) || !Number.isFinite(d)) return null;
  const q0 = add(p0, scale(t0, d));
  const q1 = sub(p1, scale(t1, d));
  const j: Vec2 = [(q0[0] + q1[0]) / 2, (q0[1] + q1[1]) / 2];
  const first = arcFrom(p0, t0, j);
  const second = reverseSegment(arcFrom(p1, [-t1[0], -t1[1]], j));
  return [first, second].filter((s) => s.kind === 'arc' || dist(s.start, s.end) > 0);
}

/** The arc (or line) leaving p with unit tangent t and passing through q. */
export function arcFrom(p: Vec2, t: Vec2, q: Vec2): Segment {
  const w = sub(q, p);
  const sweep = 2 * Math.atan2(cross(t, w), dot(t, w));
  const wl = len(w);
  if (Math.abs(sweep) < 1e-9 || wl === 0) return line(p, q);
  const r = wl / (2 * Math.sin(Math.abs(sweep) / 2));
  const centre = add(p, scale(perp(t), Math.sign(sweep) * r));
  return arc(centre, r, Math.atan2(p[1] - centre[1], p[0] - centre[0]), sweep);
}

/** Ellipse (or elliptical arc) centre + u cos t + v sin t over [t0, t1]; u, v need not be perpendicular. */
export function ellipseCurve(centre: Vec2, u: Vec2, v: Vec2, t0: number, t1: number): ParamCurve {
  return {
    point: (t) => [centre[0] + u[0] * Math.cos(t) + v[0] * Math.sin(t), centre[1] + u[1] * Math.cos(t) + v[1] * Math.sin(t)],
    derivative: (t) => [-u[0] * Math.sin(t) + v[0] * Math.cos(t), -u[1] * Math.sin(t) + v[1] * Math.cos(t)],
    t0,
    t1,
  };
}

/**
 * Non-uniform rational B-spline from control points, weights and knots (degree = knots − points − 1),
 * evaluated by de Boor's algorithm in homogeneous coordinates. Throws on inconsistent data.
 */
export function nurbsCurve(ctrl: readonly Vec2[], weights: readonly number[], knots: readonly number[], degree: number): ParamCurve {
  const n = ctrl.length;
  const p = degree;
  if (knots.length !== n + p + 1) throw new Error(`needs ${n + p + 1} knots for ${n} control points of degree ${p}, has ${knots.length}`);
  for (let i = 1; i < knots.length; i++) if (knots[i] < knots[i - 1]) throw new Error('knots must not decrease');
  const t0 = knots[p];
  const t1 = knots[n];
  if (!(t1 > t0)) throw new Error('the knot vector spans no parameter range');
  const w = weights.length === n ? weights : ctrl.map(() => 1);
  if (w.some((x) => !(x > 0))) throw new Error('weights must be positive');
  const point = (tRaw: number): Vec2 => {
    const t = Math.min(t1, Math.max(t0, tRaw));
    // Knot span by bisection: the largest k in [p, n − 1] with knots[k] <= t.
    let lo = p;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (knots[mid] <= t) lo = mid;
      else hi = mid - 1;
    }
    const k = lo;
    const dx: number[] = [];
    const dy: number[] = [];
    const dw: number[] = [];
    for (let j = 0; j <= p; j++) {
      const idx = j + k - p;
      dx.push(ctrl[idx][0] * w[idx]);
      dy.push(ctrl[idx][1] * w[idx]);
      dw.push(w[idx]);
    }
    for (let r = 1; r <= p; r++) {
      for (let j = p; j >= r; j--) {
        const lo = knots[j + k - p];
        const hi = knots[j + 1 + k - r];
        const alpha = hi === lo ? 0 : (t - lo) / (hi - lo);
        dx[j] = (1 - alpha) * dx[j - 1] + alpha * dx[j];
        dy[j] = (1 - alpha) * dy[j - 1] + alpha * dy[j];
        dw[j] = (1 - alpha) * dw[j - 1] + alpha * dw[j];
      }
    }
    return [dx[p] / dw[p], dy[p] / dw[p]];
  };
  const h = (t1 - t0) * 1e-7;
  const derivative = (t: number): Vec2 => {
    const a = Math.max(t0, t - h);
    const b = Math.min(t1, t + h);
    const pa = point(a);
    const pb = point(b);
    return [(pb[0] - pa[0]) / (b - a), (pb[1] - pa[1]) / (b - a)];
  };
  const breaks = [...new Set(knots.filter((k) => k > t0 && k < t1))];
  return { point, derivative, t0, t1, breaks };
}

/**
 * A curve through fit points when a SPLINE carries no control points: cubic Hermite pieces with
 * Catmull–Rom tangents (uniform), tangent-continuous at every fit point. An approximation of the drawing program's own
 * interpolation, which the DXF file does not define.
 */
export function fitPointCurve(pts: readonly Vec2[]): ParamCurve {
  const n = pts.length;
  const tangents: Vec2[] = pts.map((q, i) => {
    const a = pts[Math.max(0, i - 1)];
    const b = pts[Math.min(n - 1, i + 1)];
    return scale(sub(b, a), i === 0 || i === n - 1 ? 1 : 0.5);
  });
  const seg = (t: number): [number, number] => {
    const i = Math.min(n - 2, Math.max(0, Math.floor(t)));
    return [i, t - i];
  };
  const point = (t: number): Vec2 => {
    const [i, s] = seg(t);
    const h00 = 2 * s ** 3 - 3 * s ** 2 + 1;
    const h10 = s ** 3 - 2 * s ** 2 + s;
    const h01 = -2 * s ** 3 + 3 * s ** 2;
    const h11 = s ** 3 - s ** 2;
    const a = pts[i];
    const b = pts[i + 1];
    return [
      h00 * a[0] + h10 * tangents[i][0] + h01 * b[0] + h11 * tangents[i + 1][0],
      h00 * a[1] + h10 * tangents[i][1] + h01 * b[1] + h11 * tangents[i + 1][1],
    ];
  };
  const derivative = (t: number): Vec2 => {
    const [i, s] = seg(t);
    const d00 = 6 * s ** 2 - 6 * s;
    const d10 = 3 * s ** 2 - 4 * s + 1;
    const d01 = -6 * s ** 2 + 6 * s;
    const d11 = 3 * s ** 2 - 2 * s;
    const a = pts[i];
    const b = pts[i + 1];
    return [
      d00 * a[0] + d10 * tangents[i][0] + d01 * b[0] + d11 * tangents[i + 1][0],
      d00 * a[1] + d10 * tangents[i][1] + d01 * b[1] + d11 * tangents[i + 1][1],
    ];
  };
  const breaks = pts.slice(1, -1).map((_, i) => i + 1);
  return { point, derivative, t0: 0, t1: n - 1, breaks };
}

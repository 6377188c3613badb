import { CHORD_TOL_MM } from './tolerance.js';
import { assertNever, type Arc, type BBox, type Line, type Segment, type Vec2 } from './types.js';
import { add, cross, dist, dot, len, normAngle, polar, sub } from './vec.js';

/** A straight segment from start to end (mm). */
export const line = (start: Vec2, end: Vec2): Line => ({ kind: 'line', start, end });

/** A circular arc (mm, rad; positive sweep counter-clockwise). */
export const arc = (center: Vec2, radius: number, startRad: number, sweepRad: number): Arc => ({
  kind: 'arc',
  center,
  radius,
  startRad,
  sweepRad,
});

/** Point at parameter t ∈ [0, 1] along the segment. */
export function pointAt(s: Segment, t: number): Vec2 {
  switch (s.kind) {
    case 'line':
      return [s.start[0] + (s.end[0] - s.start[0]) * t, s.start[1] + (s.end[1] - s.start[1]) * t];
    case 'arc':
      return add(s.center, polar(s.radius, s.startRad + s.sweepRad * t));
    default:
      return assertNever(s);
  }
}

/** Where the segment starts. */
export const startOf = (s: Segment): Vec2 => (s.kind === 'line' ? s.start : pointAt(s, 0));
/** Where the segment ends. */
export const endOf = (s: Segment): Vec2 => (s.kind === 'line' ? s.end : pointAt(s, 1));

/** Length along the segment (mm). */
export function lengthOf(s: Segment): number {
  switch (s.kind) {
    case 'line':
      return dist(s.start, s.end);
    case 'arc':
      return Math.abs(s.sweepRad) * s.radius;
    default:
      return assertNever(s);
  }
}

/** Unit tangent in the direction of travel at parameter t. */
export function tangentAt(s: Segment, t: number): Vec2 {
  switch (s.kind) {
    case 'line': {
      const d = sub(s.end, s.start);
      const l = len(d);
      return [d[0] / l, d[1] / l];
    }
    case 'arc': {
      const a = s.startRad + s.sweepRad * t;
      const k = Math.sign(s.sweepRad) || 1;
      return [-Math.sin(a) * k, Math.cos(a) * k];
    }
    default:
      return assertNever(s);
  }
}

/** The same segment walked the other way. */
export function reverseSegment(s: Segment): Segment {
  switch (s.kind) {
    case 'line':
      return line(s.end, s.start);
    case 'arc':
      return arc(s.center, s.radius, s.startRad + s.sweepRad, -s.sweepRad);
    default:
      return assertNever(s);
  }
}

/** Sub-segment between parameters t0 < t1 (or t0 > t1 for a reversed piece). */
export function subSegment(s: Segment, t0: number, t1: number): Segment {
  switch (s.kind) {
    case 'line':
      return line(pointAt(s, t0), pointAt(s, t1));
    case 'arc':
      return arc(s.center, s.radius, s.startRad + s.sweepRad * t0, s.sweepRad * (t1 - t0));
    default:
      return assertNever(s);
  }
}

/**
 * Parameter t of the point on the arc at absolute angle rad, or NaN when the angle lies outside the
 * sweep by more than tolRad.
 */
export function arcParamOfAngle(a: Arc, rad: number, tolRad = 1e-9): number {
  const sweep = Math.abs(a.sweepRad);
  const rel = a.sweepRad >= 0 ? normAngle(rad - a.startRad) : normAngle(a.startRad - rad);
  if (rel <= sweep + tolRad) return Math.min(1, rel / sweep);
  if (2 * Math.PI - rel <= tolRad) return 0;
  return Number.NaN;
}

/** Exact bounding box (arc extremes included). */
export function segmentBBox(s: Segment): BBox {
  switch (s.kind) {
    case 'line':
      return [
        Math.min(s.start[0], s.end[0]),
        Math.min(s.start[1], s.end[1]),
        Math.max(s.start[0], s.end[0]),
        Math.max(s.start[1], s.end[1]),
      ];
    case 'arc': {
      // The same sums as startOf / endOf / polar, in scalars: a check indexes every hole of a plate,
      // and the temporary points of each box cost more in garbage collection than the sums.
      const [cx, cy] = s.center;
      const r = s.radius;
      const a1 = s.startRad + s.sweepRad;
      const x0 = cx + r * Math.cos(s.startRad);
      const y0 = cy + r * Math.sin(s.startRad);
      const x1 = cx + r * Math.cos(a1);
      const y1 = cy + r * Math.sin(a1);
      let minX = Math.min(x0, x1);
      let minY = Math.min(y0, y1);
      let maxX = Math.max(x0, x1);
      let maxY = Math.max(y0, y1);
      for (let k = 0; k < 4; k++) {
        const ang = (k * Math.PI) / 2;
        if (!Number.isNaN(arcParamOfAngle(s, ang, 0))) {
          const x = cx + r * Math.cos(ang);
          const y = cy + r * Math.sin(ang);
          minX = Math.min(minX, x);
          minY = Math.min(minY, y);
          maxX = Math.max(maxX, x);
          maxY = Math.max(maxY, y);
        }
      }
      return [minX, minY, maxX, maxY];
    }
    default:
      return assertNever(s);
  }
}

/** ∮ x dy contribution of the segment (Green's theorem), exact for lines and arcs. */
export function greenTerm(s: Segment): number {
  switch (s.kind) {
    case 'line':
      return 0.5 * cross(s.start, s.end);
    case 'arc': {
      // ½∮(x dy − y dx) over the arc, with x = cx + r cos θ, y = cy + r sin θ.
      const [cx, cy] = s.center;
      const r = s.radius;
      const a0 = s.startRad;
      const a1 = s.startRad + s.sweepRad;
      const term =
        r * r * (a1 - a0) + cx * r * (Math.sin(a1) - Math.sin(a0)) - cy * r * (Math.cos(a1) - Math.cos(a0));
      return 0.5 * term;
    }
    default:
      return assertNever(s);
  }
}

/** Closest point on the segment to p, with its parameter and distance. */
export function closestPoint(s: Segment, p: Vec2): { point: Vec2; t: number; distance: number } {
  switch (s.kind) {
    case 'line': {
      const d = sub(s.end, s.start);
      const l2 = dot(d, d);
      const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, dot(sub(p, s.start), d) / l2));
      const q = pointAt(s, t);
      return { point: q, t, distance: dist(p, q) };
    }
    case 'arc': {
      const v = sub(p, s.center);
      if (len(v) > 0) {
        const t = arcParamOfAngle(s, Math.atan2(v[1], v[0]), 0);
        if (!Number.isNaN(t)) {
          const q = pointAt(s, t);
          return { point: q, t, distance: dist(p, q) };
        }
      }
      const a = startOf(s);
      const b = endOf(s);
      return dist(p, a) <= dist(p, b) ? { point: a, t: 0, distance: dist(p, a) } : { point: b, t: 1, distance: dist(p, b) };
    }
    default:
      return assertNever(s);
  }
}

/** Number of chords needed so no chord departs from the arc by more than chordTolMm. */
export function chordCount(a: Arc, chordTolMm = CHORD_TOL_MM): number {
  const tol = Math.min(chordTolMm, a.radius);
  const maxStep = 2 * Math.acos(1 - tol / a.radius);
  return Math.max(1, Math.ceil(Math.abs(a.sweepRad) / maxStep));
}

/** Points along the segment (start included, end excluded) within the chord tolerance. */
export function flattenSegment(s: Segment, chordTolMm = CHORD_TOL_MM): Vec2[] {
  if (s.kind === 'line') return [s.start];
  const n = chordCount(s, chordTolMm);
  const pts: Vec2[] = [];
  for (let i = 0; i < n; i++) pts.push(pointAt(s, i / n));
  return pts;
}

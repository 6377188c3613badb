import type { Finding } from '../checks/types.js';
import { arc, lengthOf, line, pointAt, segmentBBox } from '../geometry/segment.js';
import type { Arc, Line, Segment, Vec2 } from '../geometry/types.js';
import { dist, normAngle } from '../geometry/vec.js';
import type { DrawnSegment, SourceRef } from './explode.js';
import { overlappingPairs } from './spatial.js';

export type CleanOptions = Readonly<{
  /** Segments no longer than this vanish when their ends are joined: reported as zero-length. mm. */
  gapTolMm: number;
  /** Segments shorter than this are reported as tiny (they slow the cutter and hint at sloppy joins). mm. */
  tinySegmentMm: number;
}>;

/**
 * Remove what a cutter would trip over, reporting each kind once with a count and a place:
 * zero-length segments, exact duplicates and overlapping pieces (merged into one, so nothing is
 * cut twice); tiny segments are kept and reported.
 */
export function cleanSegments(input: readonly DrawnSegment[], opts: CleanOptions): { segments: DrawnSegment[]; findings: Finding[] } {
  const findings: Finding[] = [];
  const segs: Array<DrawnSegment | null> = [];
  let zero = 0;
  let zeroAt: Vec2 | null = null;
  let zeroSrc: SourceRef | null = null;
  let tiny = 0;
  let tinyMin = Infinity;
  let tinyAt: Vec2 | null = null;
  for (const d of input) {
    const l = lengthOf(d.seg);
    if (l <= opts.gapTolMm) {
      if (zero++ === 0) {
        zeroAt = pointAt(d.seg, 0);
        zeroSrc = d.source;
      }
      continue;
    }
    if (l < opts.tinySegmentMm && !d.approximated) {
      tiny++;
      if (l < tinyMin) {
        tinyMin = l;
        tinyAt = pointAt(d.seg, 0.5);
      }
    }
    segs.push(d);
  }
  if (zero) {
    findings.push(f('dxf-zero-length', 'warning', `${zero} segment${zero === 1 ? '' : 's'} of zero length (no longer than ${opts.gapTolMm} mm; first: ${zeroSrc!.entity} on layer ${zeroSrc!.layer}, line ${zeroSrc!.line}) were dropped; some CAM programs stop on them`, zeroAt, zero, 'segments'));
  }
  if (tiny) {
    findings.push(f('dxf-tiny-segment', 'info', `${tiny} segment${tiny === 1 ? '' : 's'} shorter than ${opts.tinySegmentMm} mm (shortest ${tinyMin.toFixed(4)} mm); they slow the machine and often mark a badly joined corner`, tinyAt, tinyMin, 'mm', opts.tinySegmentMm));
  }
  mergeOverlaps(segs, opts.gapTolMm, findings);
  return { segments: segs.filter((s): s is DrawnSegment => s !== null), findings };
}

function f(rule: string, severity: Finding['severity'], message: string, at: Vec2 | null, measured: number | null, unit: string, limit: number | null = null): Finding {
  return { rule, severity, part: '', measured, limit, unit, atMm: at ? [at[0], at[1]] : null, message };
}

/**
 * How segment b repeats part of segment a: an exact duplicate, or a shared stretch longer than tol.
 * `rest` is what is left of b once the shared stretch is taken away (a is kept whole).
 */
type Overlap = { kind: 'duplicate' | 'overlap'; rest: Segment[]; lengthMm: number };

function mergeOverlaps(segs: Array<DrawnSegment | null>, tol: number, findings: Finding[]): void {
  const boxes = segs.map((s) => segmentBBox(s!.seg));
  let dup = 0;
  let over = 0;
  let dupFirst: { at: Vec2; a: SourceRef; b: SourceRef } | null = null;
  let overFirst: { at: Vec2; a: SourceRef; b: SourceRef; len: number } | null = null;
  for (const [i, j] of overlappingPairs(boxes, tol)) {
    const a = segs[i];
    const b = segs[j];
    if (!a || !b) continue;
    const o = overlap(a.seg, b.seg, tol);
    if (!o) continue;
    const at = pointAt(b.seg, 0.5);
    if (o.kind === 'duplicate') {
      dup++;
      dupFirst ??= { at, a: a.source, b: b.source };
    } else {
      over++;
      overFirst ??= { at, a: a.source, b: b.source, len: o.lengthMm };
    }
    // The earlier entity (file order) stays whole; the later one keeps only what it adds.
    segs[j] = null;
    for (const r of o.rest) segs.push({ ...b, seg: r });
  }
  if (dup && dupFirst) {
    findings.push(
      f('dxf-duplicate-entity', 'warning', `${dup} duplicate segment${dup === 1 ? '' : 's'} (first: ${dupFirst.b.entity} line ${dupFirst.b.line} repeats ${dupFirst.a.entity} line ${dupFirst.a.line}); the cutter would cut them twice. Duplicates were dropped for the checks; delete them in the drawing`, dupFirst.at, dup, 'segments'),
    );
  }
  if (over && overFirst) {
    findings.push(
      f('dxf-overlapping-entities', 'warning', `${over} overlapping segment pair${over === 1 ? '' : 's'} (first: ${overFirst.b.entity} line ${overFirst.b.line} runs over ${overFirst.a.entity} line ${overFirst.a.line} for ${overFirst.len.toFixed(3)} mm); the cutter would cut the shared stretch twice. The shared stretch was counted once for the checks; trim it in the drawing`, overFirst.at, over, 'pairs'),
    );
  }
}

/** How two segments share a stretch of path longer than tol, and the single segment covering both. */
export function overlap(a: Segment, b: Segment, tol: number): Overlap | null {
  if (a.kind === 'line' && b.kind === 'line') return lineOverlap(a, b, tol);
  if (a.kind === 'arc' && b.kind === 'arc') return arcOverlap(a, b, tol);
  return null;
}

function lineOverlap(a: Line, b: Line, tol: number): Overlap | null {
  const la = dist(a.start, a.end);
  const ux = (a.end[0] - a.start[0]) / la;
  const uy = (a.end[1] - a.start[1]) / la;
  const off = (p: Vec2) => Math.abs((p[0] - a.start[0]) * uy - (p[1] - a.start[1]) * ux);
  if (off(b.start) > tol || off(b.end) > tol) return null;
  const proj = (p: Vec2) => (p[0] - a.start[0]) * ux + (p[1] - a.start[1]) * uy;
  const s0 = Math.min(proj(b.start), proj(b.end));
  const s1 = Math.max(proj(b.start), proj(b.end));
  const shared = Math.min(la, s1) - Math.max(0, s0);
  if (shared <= tol) return null;
  const duplicate = (dist(a.start, b.start) <= tol && dist(a.end, b.end) <= tol) || (dist(a.start, b.end) <= tol && dist(a.end, b.start) <= tol);
  if (duplicate) return { kind: 'duplicate', rest: [], lengthMm: shared };
  // Keep b's direction for its leftover pieces.
  const at = (s: number): Vec2 => [a.start[0] + ux * s, a.start[1] + uy * s];
  const sb = proj(b.start);
  const eb = proj(b.end);
  const rest: Segment[] = [];
  const piece = (from: number, to: number) => {
    if (Math.abs(to - from) > tol) rest.push(line(at(from), at(to)));
  };
  if (sb <= eb) {
    if (sb < 0) piece(sb, 0);
    if (eb > la) piece(la, eb);
  } else {
    if (sb > la) piece(sb, la);
    if (eb < 0) piece(0, eb);
  }
  return { kind: 'overlap', rest, lengthMm: shared };
}

function arcOverlap(a: Arc, b: Arc, tol: number): Overlap | null {
  if (dist(a.center, b.center) > tol || Math.abs(a.radius - b.radius) > tol) return null;
  const r = a.radius;
  // Counter-clockwise intervals [start, start + sweep].
  const ccw = (s: Arc) => (s.sweepRad >= 0 ? { s: s.startRad, w: s.sweepRad } : { s: s.startRad + s.sweepRad, w: -s.sweepRad });
  const A = ccw(a);
  const B = ccw(b);
  const full = 2 * Math.PI;
  const d = normAngle(B.s - A.s); // where B starts, measured from A's start
  let shared = Math.max(0, Math.min(A.w, d + B.w) - d);
  if (d + B.w > full) shared += Math.min(A.w, d + B.w - full);
  if (shared * r <= tol) return null;
  const tolRad = tol / r;
  const sameStart = Math.min(d, full - d) <= tolRad;
  const bothFull = A.w >= full - tolRad && B.w >= full - tolRad;
  if ((sameStart && Math.abs(A.w - B.w) <= tolRad) || bothFull) return { kind: 'duplicate', rest: [], lengthMm: shared * r };
  // B's angular interval minus A's, as CCW pieces measured from A's start; then back to B's direction.
  const pieces: Array<[number, number]> = [];
  const cut = (lo: number, hi: number) => {
    // [lo, hi] relative to A.s, possibly beyond 2π; remove [0, A.w] and [2π, 2π + A.w].
    const spans: Array<[number, number]> = [[lo, hi]];
    for (const [x0, x1] of [[0, A.w], [full, full + A.w]] as const) {
      const next: Array<[number, number]> = [];
      for (const [p0, p1] of spans) {
        if (p1 <= x0 || p0 >= x1) next.push([p0, p1]);
        else {
          if (p0 < x0) next.push([p0, x0]);
          if (p1 > x1) next.push([x1, p1]);
        }
      }
      spans.splice(0, spans.length, ...next);
    }
    for (const sp of spans) if ((sp[1] - sp[0]) * r > tol) pieces.push(sp);
  };
  cut(d, d + B.w);
  const rest: Segment[] = pieces.map(([p0, p1]) => {
    const ccwArc = arc(a.center, r, A.s + p0, p1 - p0);
    return b.sweepRad >= 0 ? ccwArc : arc(a.center, r, A.s + p1, -(p1 - p0));
  });
  return { kind: 'overlap', rest, lengthMm: shared * r };
}

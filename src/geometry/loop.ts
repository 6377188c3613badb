import { CHAIN_GAP_MM, CHORD_TOL_MM } from './tolerance.js';
import { assertNever, type BBox, type Loop, type Segment, type Vec2 } from './types.js';
import { arc, endOf, flattenSegment, greenTerm, lengthOf, reverseSegment, segmentBBox, startOf } from './segment.js';
import { add, dist, rotate as rotVec } from './vec.js';

/** Signed area by Green's theorem, exact on lines and arcs: positive when counter-clockwise. mm². */
export function signedArea(loop: Loop): number {
  let a = 0;
  for (const s of loop) a += greenTerm(s);
  return a;
}

/** Length of the whole loop (mm). */
export const loopLength = (loop: Loop): number => loop.reduce((acc, s) => acc + lengthOf(s), 0);

/** Exact bounding box of the loop, arc extremes included (mm). */
export const loopBBox = (loop: Loop): BBox => boxesBBox(loop.map(segmentBBox));

/** Smallest box holding boxes[from] .. boxes[to - 1] ([∞, ∞, −∞, −∞] for none). */
export function boxesBBox(boxes: readonly BBox[], from = 0, to = boxes.length): BBox {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (let i = from; i < to; i++) {
    const b = boxes[i];
    if (b[0] < x0) x0 = b[0];
    if (b[1] < y0) y0 = b[1];
    if (b[2] > x1) x1 = b[2];
    if (b[3] > y1) y1 = b[3];
  }
  return [x0, y0, x1, y1];
}

/** Smallest box holding both boxes. */
export function unionBBox(a: BBox, b: BBox): BBox {
  return [Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[2], b[2]), Math.max(a[3], b[3])];
}

/** The loop walked the other way (orientation flips). */
export function reverseLoop(loop: Loop): Loop {
  return loop.map(reverseSegment).reverse();
}

/** The loop with the requested orientation (counter-clockwise for outer loops, clockwise for holes). */
export function oriented(loop: Loop, ccw: boolean): Loop {
  return signedArea(loop) > 0 === ccw ? loop : reverseLoop(loop);
}

/** Largest gap between the end of a segment and the start of the next, including last → first. mm. */
export function maxChainGap(loop: Loop): { gapMm: number; at: Vec2 } {
  let worst = { gapMm: 0, at: loop.length ? startOf(loop[0]) : ([0, 0] as Vec2) };
  for (let i = 0; i < loop.length; i++) {
    const e = endOf(loop[i]);
    const s = startOf(loop[(i + 1) % loop.length]);
    const g = dist(e, s);
    if (g > worst.gapMm) worst = { gapMm: g, at: e };
  }
  return worst;
}

/** Does every segment end where the next starts, within gapMm? */
export const isClosed = (loop: Loop, gapMm = CHAIN_GAP_MM): boolean => loop.length > 0 && maxChainGap(loop).gapMm <= gapMm;

/** A full circle stored as one arc: its centre and radius, else null. */
export function asCircle(loop: Loop): { center: Vec2; radius: number } | null {
  if (loop.length !== 1) return null;
  const s = loop[0];
  if (s.kind !== 'arc' || Math.abs(Math.abs(s.sweepRad) - 2 * Math.PI) > 1e-9) return null;
  return { center: s.center, radius: s.radius };
}

/** Polygon through the loop within the chord tolerance (closing vertex not repeated). */
export function flattenLoop(loop: Loop, chordTolMm = CHORD_TOL_MM): Vec2[] {
  const pts: Vec2[] = [];
  for (const s of loop) pts.push(...flattenSegment(s, chordTolMm));
  return pts;
}

export type Transform = Readonly<{ rotateRad: number; translate: Vec2; mirrorY?: boolean }>;

/** Apply mirror (y → −y, before rotation), rotation about the origin, then translation. */
export function transformPoint(p: Vec2, t: Transform): Vec2 {
  const m: Vec2 = t.mirrorY ? [p[0], -p[1]] : p;
  return add(rotVec(m, t.rotateRad), t.translate);
}

/** The segment mirrored, rotated and moved by t (see transformPoint). */
export function transformSegment(s: Segment, t: Transform): Segment {
  switch (s.kind) {
    case 'line':
      return { kind: 'line', start: transformPoint(s.start, t), end: transformPoint(s.end, t) };
    case 'arc': {
      const start = t.mirrorY ? -s.startRad : s.startRad;
      const sweep = t.mirrorY ? -s.sweepRad : s.sweepRad;
      return arc(transformPoint(s.center, t), s.radius, start + t.rotateRad, sweep);
    }
    default:
      return assertNever(s);
  }
}

/** Transformed loop; a mirror reverses orientation, so the loop is re-oriented to keep its sense. */
export function transformLoop(loop: Loop, t: Transform): Loop {
  const moved = loop.map((s) => transformSegment(s, t));
  return t.mirrorY ? reverseLoop(moved) : moved;
}

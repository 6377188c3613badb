import type { Arc, Loop, Vec2 } from './types.js';
import { closestPoint, endOf, pointAt, startOf } from './segment.js';

/**
 * Winding number of the loop around p, exact on lines and arcs. Each arc is replaced by its chord
 * (a polygon whose winding is counted with the usual half-open crossing rule) and the circular
 * segment between arc and chord is added back: ±1 when p lies in it. This keeps the count right
 * when the ray passes through an arc's end, where a direct ray–arc count is fragile.
 * Points on the boundary give an arbitrary answer; use distanceToLoop first when that matters.
 */
export function windingNumber(loop: Loop, p: Vec2): number {
  // A point on an arc's chord sits on the seam between the chord polygon and the circular segment,
  // where neither count includes it. The chord is not the real boundary, so the winding is the
  // same a hair away: move off the seam and count there.
  if (onSomeChord(loop, p)) return windingNumber(loop, [p[0] + 3e-8, p[1] + 7e-8]);
  let w = 0;
  const [px, py] = p;
  for (let k = 0; k < loop.length; k++) {
    const s = loop[k];
    if (s.kind === 'arc' && Math.abs(s.sweepRad) >= 2 * Math.PI - 1e-12) {
      // A full circle has no chord; its ends differ only by rounding.
      if (inCircularSegment(s, p)) w += Math.sign(s.sweepRad);
      continue;
    }
    // The polygon's vertices are the segments' starts: an arc's computed end may differ from the next
    // start in the last bit, and a ray through that vertex would then cross twice or not at all.
    const a = startOf(s);
    const b = loop.length > 1 ? startOf(loop[(k + 1) % loop.length]) : endOf(s);
    if (a[1] <= py && b[1] > py) {
      if ((b[0] - a[0]) * (py - a[1]) - (px - a[0]) * (b[1] - a[1]) > 0) w++;
    } else if (b[1] <= py && a[1] > py) {
      if ((b[0] - a[0]) * (py - a[1]) - (px - a[0]) * (b[1] - a[1]) < 0) w--;
    }
    if (s.kind === 'arc' && inCircularSegment(s, p)) w += Math.sign(s.sweepRad);
  }
  return w;
}

function onSomeChord(loop: Loop, p: Vec2): boolean {
  for (const s of loop) {
    if (s.kind !== 'arc' || Math.abs(s.sweepRad) >= 2 * Math.PI - 1e-12) continue;
    const a = startOf(s);
    const b = endOf(s);
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const l2 = dx * dx + dy * dy;
    if (l2 === 0) continue;
    const t = ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2;
    if (t < -1e-9 || t > 1 + 1e-9) continue;
    const off = Math.abs(dx * (p[1] - a[1]) - dy * (p[0] - a[0])) / Math.sqrt(l2);
    if (off < 1e-9) return true;
  }
  return false;
}

/** Is p inside the region between the arc and its chord? */
function inCircularSegment(s: Arc, p: Vec2): boolean {
  const dx = p[0] - s.center[0];
  const dy = p[1] - s.center[1];
  if (dx * dx + dy * dy >= s.radius * s.radius) return false;
  if (Math.abs(s.sweepRad) >= 2 * Math.PI - 1e-12) return true;
  const a = startOf(s);
  const b = endOf(s);
  const m = pointAt(s, 0.5);
  const side = (q: Vec2) => (b[0] - a[0]) * (q[1] - a[1]) - (b[1] - a[1]) * (q[0] - a[0]);
  return side(p) * side(m) > 0;
}

/** Is p inside the loop (non-zero winding)? Boundary points: either answer. */
export const isInside = (loop: Loop, p: Vec2): boolean => windingNumber(loop, p) !== 0;

/** Shortest distance from p to the loop's boundary. mm. */
export function distanceToLoop(loop: Loop, p: Vec2): number {
  let d = Infinity;
  for (const s of loop) d = Math.min(d, closestPoint(s, p).distance);
  return d;
}

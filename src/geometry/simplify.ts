import type { Loop, Segment } from './types.js';
import { arc, endOf, line, startOf } from './segment.js';
import { cross, dist, sub } from './vec.js';
import { COINCIDENT_MM } from './tolerance.js';

/** Join consecutive collinear lines and consecutive arcs of one circle turning the same way. */
export function mergeCollinear(loop: Loop): Loop {
  if (loop.length < 2) return loop;
  const out: Segment[] = [];
  for (const s of loop) {
    const prev = out[out.length - 1];
    const merged = prev ? tryMerge(prev, s) : null;
    if (merged) out[out.length - 1] = merged;
    else out.push(s);
  }
  while (out.length > 1) {
    const merged = tryMerge(out[out.length - 1], out[0]);
    if (!merged) break;
    out[0] = merged;
    out.pop();
  }
  return out;
}

function tryMerge(a: Segment, b: Segment): Segment | null {
  if (a.kind === 'line' && b.kind === 'line') {
    const d1 = sub(a.end, a.start);
    const d2 = sub(b.end, b.start);
    const l1 = Math.hypot(d1[0], d1[1]);
    const l2 = Math.hypot(d2[0], d2[1]);
    if (Math.abs(cross(d1, d2)) <= 1e-9 * l1 * l2 && d1[0] * d2[0] + d1[1] * d2[1] > 0) return line(a.start, b.end);
    return null;
  }
  if (a.kind === 'arc' && b.kind === 'arc') {
    if (dist(a.center, b.center) > COINCIDENT_MM || Math.abs(a.radius - b.radius) > COINCIDENT_MM) return null;
    if (Math.sign(a.sweepRad) !== Math.sign(b.sweepRad)) return null;
    if (dist(endOf(a), startOf(b)) > 1e-4) return null;
    const sweep = a.sweepRad + b.sweepRad;
    if (Math.abs(sweep) > 2 * Math.PI + 1e-9) return null;
    return arc(a.center, a.radius, a.startRad, sweep);
  }
  return null;
}

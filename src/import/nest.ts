import type { Feature } from '../geometry/part.js';
import { isInside } from '../geometry/inside.js';
import { loopBBox, oriented, signedArea } from '../geometry/loop.js';
import { arc, pointAt } from '../geometry/segment.js';
import type { BBox, Loop, Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';
import { CHAIN_GAP_MM } from '../geometry/tolerance.js';
import type { ChainedLoop } from './chain.js';
import { overlappingPairs } from './spatial.js';

/** One plate found in the drawing: its outline (counter-clockwise) and inner contours (clockwise). */
export type NestedPart = Readonly<{ outline: Loop; features: Feature[]; source: ChainedLoop['source'] }>;

/**
 * Nest closed loops by containment: a loop inside no other is a part's outline; a loop directly
 * inside an outline is one of its holes or cut-outs; a loop inside a hole is again a part (a small
 * plate drawn in a big one's window), and so on. Parts come out in a stable order (left to right,
 * then bottom to top).
 */
export function nestLoops(loops: readonly ChainedLoop[]): NestedPart[] {
  const items = loops
    .map((l) => ({ l, area: Math.abs(signedArea(l.loop)), box: loopBBox(l.loop) }))
    .filter((x) => x.area > 0)
    .sort((a, b) => b.area - a.area || a.box[0] - b.box[0] || a.box[1] - b.box[1]);
  // Candidate containers: boxes that overlap (sweep and prune), then the box must hold the loop's box.
  const containers: number[][] = items.map(() => []);
  for (const [a, b] of overlappingPairs(items.map((x) => x.box), 0)) {
    // Items are sorted by area, largest first: only an earlier item can contain a later one.
    if (boxInside(items[b].box, items[a].box)) containers[b].push(a);
  }
  const depth: number[] = [];
  const parentOf: number[] = [];
  for (let i = 0; i < items.length; i++) {
    let parent = -1;
    // The container found last in area order (the smallest) is the innermost one.
    const cands = containers[i].sort((x, y) => y - x);
    for (const j of cands) {
      if (insideByVote(items[j].l.loop, items[i].l.loop)) {
        parent = j;
        break;
      }
    }
    parentOf.push(parent);
    depth.push(parent < 0 ? 0 : depth[parent] + 1);
  }
  const partIndex = new Map<number, number>();
  const parts: Array<{ outline: Loop; features: Feature[]; source: ChainedLoop['source']; box: BBox }> = [];
  items.forEach((it, i) => {
    if (depth[i] % 2 === 0) {
      partIndex.set(i, parts.length);
      parts.push({ outline: oriented(it.l.loop, true), features: [], source: it.l.source, box: it.box });
    }
  });
  items.forEach((it, i) => {
    if (depth[i] % 2 === 1) parts[partIndex.get(parentOf[i])!].features.push(feature(it.l.loop));
  });
  parts.sort((a, b) => a.box[0] - b.box[0] || a.box[1] - b.box[1]);
  return parts.map(({ outline, features, source }) => {
    const keyed = features.map((f) => ({ f, box: loopBBox(f.loop) }));
    keyed.sort((a, b) => a.box[0] - b.box[0] || a.box[1] - b.box[1]);
    return { outline, features: keyed.map((k) => k.f), source };
  });
}

/**
 * Is the inner loop inside the outer one? Three probe points on the inner loop vote, so that a
 * probe landing exactly on a boundary or on an arc's chord (a hole at the centre of a
 * half-round arm end) cannot decide alone. Probe parameters avoid 0.5: symmetric drawings put
 * midpoints on axes.
 */
function insideByVote(outer: Loop, inner: Loop): boolean {
  const n = inner.length;
  const probes = [pointAt(inner[0], 0.3), pointAt(inner[Math.floor(n / 2)], 0.61), pointAt(inner[n - 1], 0.83)];
  let votes = 0;
  for (const p of probes) if (isInside(outer, p)) votes++;
  return votes >= 2;
}

function boxInside(inner: BBox, outer: BBox): boolean {
  const e = 1e-9;
  return inner[0] >= outer[0] - e && inner[1] >= outer[1] - e && inner[2] <= outer[2] + e && inner[3] <= outer[3] + e;
}

/**
 * An inner contour as a feature: a circle (one full arc, or arcs of one circle adding up to a turn)
 * is a round hole with centre and diameter; a stadium or an arc-shaped slot is a slot; anything
 * else a cut-out. Purpose 'imported': the drawing does not say what a hole is for.
 */
export function feature(loop: Loop): Feature {
  const circle = asWholeCircle(loop);
  if (circle) {
    return { loop: [arc(circle.center, circle.radius, 0, -2 * Math.PI)], kind: 'hole', purpose: 'imported', centerMm: circle.center, diameterMm: 2 * circle.radius };
  }
  return { loop: oriented(loop, false), kind: isSlot(loop) ? 'slot' : 'cutout', purpose: 'imported' };
}

function asWholeCircle(loop: Loop): { center: Vec2; radius: number } | null {
  const first = loop[0];
  if (first.kind !== 'arc') return null;
  let turn = 0;
  for (const s of loop) {
    if (s.kind !== 'arc') return null;
    // 1e-5 mm: arcs fitted to a spline that is a circle (rational B-spline) agree to about 1e-7.
    if (dist(s.center, first.center) > 1e-5 || Math.abs(s.radius - first.radius) > 1e-5) return null;
    turn += s.sweepRad;
  }
  return Math.abs(Math.abs(turn) - 2 * Math.PI) < 1e-6 ? { center: first.center, radius: loop.reduce((a, s) => a + (s as { radius: number }).radius, 0) / loop.length } : null;
}

/** Two half-circle end caps of one radius joined by two lines (straight slot) or two concentric arcs (arc slot). */
function isSlot(loop: Loop): boolean {
  if (loop.length !== 4) return false;
  const caps = loop.filter((s) => s.kind === 'arc' && Math.abs(Math.abs(s.sweepRad) - Math.PI) < 1e-6);
  if (caps.length < 2) return false;
  for (let k = 0; k < 4; k++) {
    const a = loop[k];
    const c = loop[(k + 2) % 4];
    const b = loop[(k + 1) % 4];
    const d = loop[(k + 3) % 4];
    const capPair =
      a.kind === 'arc' && c.kind === 'arc' && Math.abs(Math.abs(a.sweepRad) - Math.PI) < 1e-6 && Math.abs(Math.abs(c.sweepRad) - Math.PI) < 1e-6 && Math.abs(a.radius - c.radius) < 1e-6;
    if (!capPair) continue;
    if (b.kind === 'line' && d.kind === 'line') return true;
    // Concentric sides (an arc slot): centres recomputed from rounded DXF bulges agree within the chain gap.
    if (b.kind === 'arc' && d.kind === 'arc' && dist(b.center, d.center) < CHAIN_GAP_MM) return true;
  }
  return false;
}

import { intersectSegments } from '../geometry/intersect.js';
import type { Feature, Member } from '../geometry/part.js';
import { closestPoint, line } from '../geometry/segment.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { segmentDistance } from '../geometry/distance.js';
import { add, dist, dot, perp, scale, sub, unit } from '../geometry/vec.js';
import { radToDeg } from '../params/units.js';
import { finding, mid, mm } from './finding.js';
import { heywoodKtn, lekhnitskiiKt } from './laminate.js';
import type { CheckOptions } from './options.js';
import { edgeFirst, type PartIndex } from './partIndex.js';
import { buildBoxGrid, queryBoxGrid, type BoxGrid } from './spatial.js';
import type { Finding } from './types.js';

export const EDGE_RULE = 'hole-edge-distance';
export const STRESS_RULE = 'hole-stress';

const UNLOADED: ReadonlySet<Feature['purpose']> = new Set(['stack-bolt', 'accessory']);

/**
 * A hole the edge-distance rule applies to: a round bolt hole (or any round hole of an imported
 * part), or a bolt slot (a slot with a screw size), whose bolt may sit anywhere along its centre
 * line. `center` is the round hole's centre, or the middle of the slot's bounding box.
 */
export type BoltHole = Readonly<{ contour: number; feature: Feature; center: Vec2; diameterMm: number; slot: boolean }>;

/** Width of a slot: twice the radius of its end caps (arcs turning by half a turn). Null when it has none. */
export function slotWidthMm(loop: Loop): number | null {
  let r: number | null = null;
  for (const s of loop) if (s.kind === 'arc' && Math.abs(Math.abs(s.sweepRad) - Math.PI) < 1e-6) r = r === null ? s.radius : Math.min(r, s.radius);
  return r === null ? null : 2 * r;
}

export function boltHoles(ix: PartIndex): BoltHole[] {
  const out: BoltHole[] = [];
  for (const c of ix.contours) {
    const f = c.feature;
    if (!f) continue;
    if (f.centerMm !== undefined && f.diameterMm !== undefined) {
      if (f.screw === undefined && f.purpose !== 'imported') continue;
      out.push({ contour: c.index, feature: f, center: f.centerMm, diameterMm: f.diameterMm, slot: false });
    } else if (f.kind === 'slot' && f.screw !== undefined) {
      const w = slotWidthMm(c.loop);
      if (w === null) continue;
      out.push({ contour: c.index, feature: f, center: [(c.bbox[0] + c.bbox[2]) / 2, (c.bbox[1] + c.bbox[3]) / 2], diameterMm: w, slot: true });
    }
  }
  return out;
}

/** A contour that is a free edge for the edge distance: the outline or any inner contour that is not a round hole. */
const isFreeEdge = (ix: PartIndex, k: number): boolean => k === 0 || ix.contours[k].feature?.diameterMm === undefined;

/** The free-edge segments of a part (ids into ix.segs) with their own grid, so hole queries skip the holes. */
export type FreeEdges = Readonly<{ ids: readonly number[]; grid: BoxGrid }>;

export function freeEdges(ix: PartIndex): FreeEdges {
  const ids = ix.segs.map((_, i) => i).filter((i) => isFreeEdge(ix, ix.segs[i].contour));
  return { ids, grid: buildBoxGrid(ids.map((i) => ix.segs[i].box)) };
}

/**
 * e: distance from the bolt centre to the nearest free edge, searching outward with a doubling
 * radius (exact on lines and arcs). For a slot the bolt may sit anywhere on its centre line, and
 * since the slot is that line grown by D/2, e = (slot contour to free edge) + D/2. mm.
 * With `capMm`, the search stops there: null means e > capMm (or no free edge at all).
 */
export function edgeDistance(ix: PartIndex, h: BoltHole, free: FreeEdges = freeEdges(ix), capMm = Infinity): { eMm: number; at: Vec2; edge: number } | null {
  const own = ix.contours[h.contour];
  const box = h.slot ? own.bbox : ([h.center[0], h.center[1], h.center[0], h.center[1]] as const);
  // The cap on e as a cap on the searched distance (a slot's contour lies D/2 nearer the edge).
  const capGap = h.slot ? capMm - h.diameterMm / 2 : capMm;
  if (capGap < 0) return null;
  for (let r = h.diameterMm; ; r *= 2) {
    const reach = Math.min(r, capGap);
    let best: { eMm: number; at: Vec2; edge: number } | null = null;
    for (const k of queryBoxGrid(free.grid, box, reach)) {
      const s = ix.segs[free.ids[k]];
      if (s.contour === h.contour) continue;
      if (h.slot) {
        for (const seg of own.loop) {
          const c = segmentDistance(seg, s.s);
          const e = c.distance + h.diameterMm / 2;
          if (c.distance <= reach && (!best || e < best.eMm)) best = { eMm: e, at: c.p, edge: s.contour };
        }
      } else {
        const c = closestPoint(s.s, h.center);
        if (c.distance <= reach && (!best || c.distance < best.eMm)) best = { eMm: c.distance, at: c.point, edge: s.contour };
      }
    }
    if (best) return best;
    if (reach >= capGap || r > 2 * ix.spanMm) return null;
  }
}

/**
 * Rule 2: e/D for every bolt hole (error and warning bands) and pitch/D between neighbouring bolt
 * holes (D the larger of the two). Returns the smallest e/D for the part metrics.
 */
export function holeEdgeRule(ix: PartIndex, o: CheckOptions, holes: readonly BoltHole[]): { findings: Finding[]; minEdgeRatio: number | null } {
  const lim = o.limits['hole-edge-distance'];
  const name = ix.part.name;
  const findings: Finding[] = [];
  let minRatio: number | null = null;
  const free = freeEdges(ix);
  // Holes nearest the edge first; each search stops at the larger of the warning level and the
  // smallest e/D so far (a hole beyond both neither warns nor lowers the metric): linear in holes.
  const order = edgeFirst(ix);
  const rank = new Map(order.map((k, i) => [k, i]));
  const byEdge = [...holes].sort((a, b) => (rank.get(a.contour) ?? 0) - (rank.get(b.contour) ?? 0));
  for (const h of byEdge) {
    const capRatio = Math.max(lim.enabled ? lim.warnEdgeRatio : 0, minRatio ?? Infinity);
    const e = edgeDistance(ix, h, free, capRatio * h.diameterMm);
    if (!e) continue;
    const ratio = e.eMm / h.diameterMm;
    minRatio = minRatio === null ? ratio : Math.min(minRatio, ratio);
    if (!lim.enabled || ratio >= lim.warnEdgeRatio) continue;
    const error = ratio < lim.errorEdgeRatio;
    const lm = error ? lim.errorEdgeRatio : lim.warnEdgeRatio;
    findings.push(
      finding(EDGE_RULE, error ? 'error' : 'warning', name, ratio, lm, 'e/D', h.slot ? e.at : h.center,
        `${ix.contours[h.contour].label}: e/D ${ratio.toFixed(2)} is below ${lm.toFixed(2)} (e ${mm(e.eMm)} to the ${ix.contours[e.edge].label}, web ${mm(e.eMm - h.diameterMm / 2)}); move the ${h.slot ? 'slot' : 'hole'} ${mm(lm * h.diameterMm - e.eMm)} away from the ${ix.contours[e.edge].label} or add material there`),
    );
  }
  // Pitch matters where bolts share a load; stack and accessory screws carry none, and a stack's
  // concentric patterns are alternatives (only one is used). FAA AC 43.13-1B spacing is for joints.
  const round = holes.filter((h) => !h.slot && !UNLOADED.has(h.feature.purpose));
  if (lim.enabled && round.length > 1) {
    const grid = buildBoxGrid(round.map((h) => [h.center[0], h.center[1], h.center[0], h.center[1]] as const));
    const maxD = Math.max(...round.map((h) => h.diameterMm));
    round.forEach((h, i) => {
      for (const j of queryBoxGrid(grid, [h.center[0], h.center[1], h.center[0], h.center[1]], lim.warnPitchRatio * maxD)) {
        if (j <= i) continue;
        const g = round[j];
        const s = dist(h.center, g.center);
        const D = Math.max(h.diameterMm, g.diameterMm);
        if (s === 0 || s / D >= lim.warnPitchRatio) continue;
        findings.push(
          finding(EDGE_RULE, 'warning', name, s / D, lim.warnPitchRatio, 'pitch/D', mid(h.center, g.center),
            `${ix.contours[h.contour].label} and ${ix.contours[g.contour].label}: pitch/D ${(s / D).toFixed(2)} is below ${lim.warnPitchRatio.toFixed(2)} (pitch ${mm(s)}); space the two holes ${mm(lim.warnPitchRatio * D)} apart`),
        );
      }
    });
  }
  return { findings, minEdgeRatio: minRatio };
}

/** A part's members with a grid over their centrelines, for finding the member a hole belongs to. */
type MemberIndex = Readonly<{ members: readonly Member[]; grid: BoxGrid; halfWidthMm: number; spanMm: number }>;

function indexMembers(members: readonly Member[], spanMm: number): MemberIndex {
  const boxes = members.map((m) => [Math.min(m.startMm[0], m.endMm[0]), Math.min(m.startMm[1], m.endMm[1]), Math.max(m.startMm[0], m.endMm[0]), Math.max(m.startMm[1], m.endMm[1])] as const);
  return { members, grid: buildBoxGrid(boxes), halfWidthMm: Math.max(0, ...members.map((m) => m.widthMm / 2)), spanMm };
}

/**
 * The member whose stress concentration a bolt hole adds to: the nearest member whose band (width
 * plus the hole) holds the hole, or for a motor bolt (at a strut's tip) the nearest member at all.
 * Ties go to the member listed first.
 */
function memberOf(h: BoltHole, mi: MemberIndex): Member | null {
  const atTip = h.feature.purpose === 'motor-bolt';
  const pt = [h.center[0], h.center[1], h.center[0], h.center[1]] as const;
  for (let r = mi.halfWidthMm + h.diameterMm / 2; ; r *= 2) {
    let best: { m: Member; d: number } | null = null;
    for (const k of queryBoxGrid(mi.grid, pt, r).sort((a, b) => a - b)) {
      const m = mi.members[k];
      const d = closestPoint(line(m.startMm, m.endMm), h.center).distance;
      const inBand = d <= m.widthMm / 2 + h.diameterMm / 2;
      if ((inBand || (atTip && d <= r)) && (!best || d < best.d)) best = { m, d };
    }
    // Every band that can hold the hole lies within the first radius; a motor bolt searches on.
    if (best || !atTip || r > 2 * mi.spanMm + 1) return best?.m ?? null;
  }
}

/**
 * Distance from the hole edge to the first boundary along direction dir. mm. The ray grows from the
 * hole in doubling steps, so finding the nearest wall costs about what lies near the hole.
 */
function ligament(ix: PartIndex, h: BoltHole, dir: Vec2): number | null {
  const r = h.diameterMm / 2;
  const a = add(h.center, scale(dir, r * (1 + 1e-6)));
  for (let reach = 2 * h.diameterMm; ; reach *= 2) {
    const len = Math.min(reach, ix.spanMm + r);
    const b = add(a, scale(dir, len));
    const ray = line(a, b);
    const box = [Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1])] as const;
    let best: number | null = null;
    for (const id of queryBoxGrid(ix.segGrid, box)) {
      const s = ix.segs[id];
      if (s.contour === h.contour) continue;
      for (const hit of intersectSegments(ray, s.s, 1e-9)) {
        const d = dot(sub(hit.point, h.center), dir) - r;
        if (best === null || d < best) best = d;
      }
    }
    if (best !== null || len >= ix.spanMm + r) return best;
  }
}

/**
 * Rule 5 (information): for bolt holes in members, the net-section factor of a centred hole in a
 * strip (Heywood) with W = D + 2 × the smaller ligament across the member, and the orthotropic
 * infinite-plate factor (Lekhnitskii) for the laminate turned to the member direction.
 */
export function holeStressRule(ix: PartIndex, o: CheckOptions, holes: readonly BoltHole[]): Finding[] {
  if (!o.limits['hole-stress'].enabled) return [];
  const part = ix.part;
  const out: Finding[] = [];
  const mi = indexMembers(part.members, ix.spanMm);
  for (const h of holes) {
    if (h.slot || !['motor-bolt', 'arm-root-bolt', 'imported'].includes(h.feature.purpose)) continue;
    const m = memberOf(h, mi);
    if (!m) continue;
    const along = unit(sub(m.endMm, m.startMm));
    const across = perp(along);
    const l1 = ligament(ix, h, across);
    const l2 = ligament(ix, h, scale(across, -1));
    if (l1 === null || l2 === null) continue;
    const W = h.diameterMm + 2 * Math.min(l1, l2);
    const ktn = heywoodKtn(h.diameterMm, W);
    const theta = Math.atan2(along[1], along[0]) - part.weaveRad;
    const ktOrtho = lekhnitskiiKt(part.material, theta);
    out.push(
      finding(STRESS_RULE, 'info', part.name, ktn, null, 'Ktn', h.center,
        `${ix.contours[h.contour].label} in the ${m.name}: net-section Ktn ${ktn.toFixed(3)} (Heywood, d/W ${(h.diameterMm / W).toFixed(3)}, W ${mm(W)}), orthotropic Kt ${ktOrtho.toFixed(3)} at ${radToDeg(theta).toFixed(1)}° to the weave (Lekhnitskii, infinite plate); information only, no limit: a wider strut round the hole lowers both`),
    );
  }
  return out;
}

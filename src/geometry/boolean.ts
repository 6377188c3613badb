import { FillRule, areaPathsD, unionD, type PathsD } from 'clipper2-ts';
import { CHAIN_GAP_MM, COINCIDENT_MM, SIDE_PROBE_MM } from './tolerance.js';
import type { BBox, Loop, Segment, Vec2 } from './types.js';
import { endOf, lengthOf, pointAt, segmentBBox, startOf, subSegment, tangentAt } from './segment.js';
import { intersectSegments } from './intersect.js';
import { windingNumber } from './inside.js';
import { loopBBox, signedArea } from './loop.js';
import { dist } from './vec.js';
import { mergeCollinear } from './simplify.js';

export class BooleanGuardError extends Error {
  constructor(
    message: string,
    /** 'disjoint': the operands do not all touch; 'mismatch': the independent union disagrees; 'open': a dangling chain. */
    readonly kind: 'disjoint' | 'mismatch' | 'open',
  ) {
    super(message);
  }
}

/**
 * Union of simple counter-clockwise loops, exact on lines and arcs. Result: outer loops
 * counter-clockwise, enclosed holes clockwise. Every segment of every operand is split where it
 * meets another operand; a piece is kept when the point just outside it (on its right) lies
 * outside every other operand. Shared edges running the same way are kept once, opposite ones dropped.
 *
 * The result is guarded: its exact area must match an independent polygon union (clipper2) of the
 * flattened operands within guardRelTol, or BooleanGuardError is thrown. Our own union and the one
 * we started from have both been seen to lose operands silently; a loud failure is the only safe answer.
 */
export function unionLoops(loops: readonly Loop[], guardRelTol = 1e-3): Loop[] {
  const bboxes = loops.map(loopBBox);
  const segBoxes = loops.map((l) => l.map(segmentBBox));
  const pieces: Segment[] = [];
  for (let i = 0; i < loops.length; i++) {
    for (const [n, seg] of loops[i].entries()) {
      const sb = segBoxes[i][n];
      const cuts: number[] = [0, 1];
      for (let k = 0; k < loops.length; k++) {
        if (k === i || !overlaps(sb, bboxes[k])) continue;
        for (const [m, other] of loops[k].entries()) {
          if (!overlaps(sb, segBoxes[k][m])) continue;
          for (const h of intersectSegments(seg, other, COINCIDENT_MM)) cuts.push(h.t);
        }
      }
      cuts.sort((a, b) => a - b);
      for (let c = 0; c + 1 < cuts.length; c++) {
        if (cuts[c + 1] - cuts[c] <= 0) continue;
        const piece = subSegment(seg, cuts[c], cuts[c + 1]);
        if (lengthOf(piece) <= COINCIDENT_MM) continue;
        if (keepsOutside(piece, i, loops, bboxes)) pieces.push(piece);
      }
    }
  }
  const unique = dedupePieces(pieces);
  const result = chainPieces(unique).map(mergeCollinear);
  guardAgainstPolygonUnion(loops, result, guardRelTol);
  return result;
}

function keepsOutside(piece: Segment, own: number, loops: readonly Loop[], bboxes: readonly BBox[]): boolean {
  const m = pointAt(piece, 0.5);
  const t = tangentAt(piece, 0.5);
  const probe: Vec2 = [m[0] + t[1] * SIDE_PROBE_MM, m[1] - t[0] * SIDE_PROBE_MM];
  for (let k = 0; k < loops.length; k++) {
    if (k === own) continue;
    const b = bboxes[k];
    if (probe[0] < b[0] || probe[0] > b[2] || probe[1] < b[1] || probe[1] > b[3]) continue;
    if (windingNumber(loops[k], probe) !== 0) return false;
  }
  return true;
}

function dedupePieces(pieces: Segment[]): Segment[] {
  const out: Segment[] = [];
  const seen = new Map<string, Segment[]>();
  const key = (p: Vec2) => `${Math.round(p[0] * 1e4)},${Math.round(p[1] * 1e4)}`;
  for (const p of pieces) {
    const k = key(pointAt(p, 0.5));
    const same = seen.get(k) ?? [];
    const dup = same.some(
      (q) => dist(startOf(q), startOf(p)) <= CHAIN_GAP_MM && dist(endOf(q), endOf(p)) <= CHAIN_GAP_MM,
    );
    if (dup) continue;
    same.push(p);
    seen.set(k, same);
    out.push(p);
  }
  return out;
}

/** Join pieces end to start into closed loops; a piece left dangling means the union failed. */
export function chainPieces(pieces: readonly Segment[], gapMm = CHAIN_GAP_MM): Loop[] {
  const used = new Array<boolean>(pieces.length).fill(false);
  const loops: Loop[] = [];
  for (let first = 0; first < pieces.length; first++) {
    if (used[first]) continue;
    used[first] = true;
    const loop: Segment[] = [pieces[first]];
    const origin = startOf(pieces[first]);
    for (;;) {
      const end = endOf(loop[loop.length - 1]);
      if (loop.length > 1 && dist(end, origin) <= gapMm) break;
      let best = -1;
      let bestD = gapMm;
      for (let j = 0; j < pieces.length; j++) {
        if (used[j]) continue;
        const d = dist(startOf(pieces[j]), end);
        if (d <= bestD) {
          best = j;
          bestD = d;
        }
      }
      if (best < 0) {
        if (loop.length === 1 && dist(end, origin) <= gapMm) break;
        throw new BooleanGuardError(`union left an open chain near (${end[0].toFixed(3)}, ${end[1].toFixed(3)})`, 'open');
      }
      used[best] = true;
      loop.push(pieces[best]);
    }
    loops.push(loop);
  }
  return loops;
}

/** Chord tolerance of the guard's polygons, mm: well under the guard's 0.1 % of any plate's area. */
const GUARD_CHORD_TOL_MM = 0.01;

/**
 * The guard's polygon of a loop: lines by their end points; an arc by its end points and the
 * points of a fixed angular grid around its centre (a step with sagitta ≤ tolMm for its radius,
 * dividing the full turn). An operand's arc and any piece of it in the union then share their
 * vertices, so the polygon of our union and the polygon union of the operands differ only where
 * operands cross: both can use a coarse tolerance and still compare to within far less than
 * the guard's margin.
 */
function guardPolygon(loop: Loop, tolMm: number): PathsD[number] {
  const out: PathsD[number] = [];
  for (const seg of loop) {
    const [x0, y0] = startOf(seg);
    out.push({ x: x0, y: y0 });
    if (seg.kind !== 'arc') continue;
    const { center, radius } = seg;
    const step = (2 * Math.PI) / Math.max(8, Math.ceil(Math.PI / Math.acos(Math.max(-1, 1 - tolMm / radius))));
    const a0 = seg.startRad / step;
    const a1 = (seg.startRad + seg.sweepRad) / step;
    const at = (k: number) => out.push({ x: center[0] + radius * Math.cos(k * step), y: center[1] + radius * Math.sin(k * step) });
    // Grid points strictly inside the arc (those within 1e-9 of a step of an end are the end itself).
    if (a1 > a0) for (let k = Math.floor(a0 + 1e-9) + 1; k < a1 - 1e-9; k++) at(k);
    else for (let k = Math.ceil(a0 - 1e-9) - 1; k > a1 + 1e-9; k--) at(k);
  }
  return out;
}

/**
 * Exported for tests: throws unless `result` is the union of `operands` (see unionLoops): the
 * area of our union's polygon against the area of clipper2's union of the operands' polygons,
 * both from `guardPolygon`, and exactly one outer loop.
 */
export function guardAgainstPolygonUnion(operands: readonly Loop[], result: readonly Loop[], relTol: number): void {
  const reference = areaPathsD(unionD(operands.map((l) => guardPolygon(l, GUARD_CHORD_TOL_MM)), [], FillRule.NonZero, 4));
  const ours = areaPathsD(result.map((l) => guardPolygon(l, GUARD_CHORD_TOL_MM)));
  if (!(Math.abs(ours - reference) <= relTol * Math.abs(reference))) {
    throw new BooleanGuardError(
      `outline union disagrees with the independent polygon union: ${ours.toFixed(3)} mm² against ${reference.toFixed(3)} mm²`,
      'mismatch',
    );
  }
  if (result.filter((l) => signedArea(l) > 0).length !== 1) {
    throw new BooleanGuardError(`its pieces do not join: the union gave ${result.filter((l) => signedArea(l) > 0).length} separate outlines, expected one`, 'disjoint');
  }
}

const overlaps = (a: BBox, b: BBox): boolean =>
  a[0] <= b[2] + COINCIDENT_MM && b[0] <= a[2] + COINCIDENT_MM && a[1] <= b[3] + COINCIDENT_MM && b[1] <= a[3] + COINCIDENT_MM;

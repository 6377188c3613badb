import {
  loopLength,
  partArea,
  partBBox,
  partCutLength,
  partMassG,
  startOf,
  type BBox,
  type Feature,
  type Loop,
  type Part,
  type Vec2,
} from '../geometry/index.js';
import { offsetRight } from './offset.js';

/** How one contour is made: profiled along a tool-centre path, drilled, or not makeable with this tool. */
export type ContourCut =
  | Readonly<{ kind: 'profile'; role: 'outline' | 'inner'; drawnMm: number; toolPathMm: number; method: 'exact' | 'polygon'; path: Loop; startMm: Vec2 }>
  | Readonly<{ kind: 'drill'; role: 'inner'; diameterMm: number; startMm: Vec2 }>
  | Readonly<{ kind: 'too-narrow'; role: 'outline' | 'inner'; purpose: string; startMm: Vec2 }>;

/** One row of a hole table: round holes of one diameter and finish. */
export type HoleRow = Readonly<{ diameterMm: number; count: number; screw: string | null; finish: 'through' | 'countersunk'; countersinkHeadMm: number | null }>;

/** Everything a shop needs to cost one copy of a part. Lengths mm, areas mm², mass g. */
export type PartCutData = Readonly<{
  name: string;
  quantity: number;
  thicknessMm: number;
  material: string;
  weaveDeg: number;
  toolDiameterMm: number;
  areaMm2: number;
  massG: number;
  bboxMm: BBox;
  /** Total length of every contour as drawn. */
  drawnLengthMm: number;
  /** Total tool-centre path of the profiled contours, one pass. */
  toolPathMm: number;
  /** Contours profiled plus holes drilled: each starts with a plunge. */
  pierces: number;
  profiled: number;
  drilled: number;
  tooNarrow: number;
  holes: readonly HoleRow[];
  contours: readonly ContourCut[];
}>;

/**
 * Cut data of one part for a tool of the given diameter: tool-centre paths (outline offset outward
 * by the tool radius, inner contours inward), plunges, drilled holes (round holes no wider than the
 * tool) and contours the tool cannot follow at all (a slot narrower than the tool).
 * Inner contours come first, the outline last, the order a shop cuts so the part stays held.
 * @param toolDiameterMm end mill diameter, mm, > 0.
 */
export function partCutData(part: Part, toolDiameterMm: number): PartCutData {
  const r = toolDiameterMm / 2;
  const contours: ContourCut[] = [...part.features.map((f) => featureCut(f, r, toolDiameterMm)), outlineCut(part.outline, r)];
  let toolPathMm = 0;
  let profiled = 0;
  let drilled = 0;
  let tooNarrow = 0;
  for (const c of contours) {
    if (c.kind === 'profile') {
      toolPathMm += c.toolPathMm;
      profiled++;
    } else if (c.kind === 'drill') drilled++;
    else tooNarrow++;
  }
  return {
    name: part.name,
    quantity: part.quantity,
    thicknessMm: part.thicknessMm,
    material: part.material.name,
    weaveDeg: (part.weaveRad * 180) / Math.PI,
    toolDiameterMm,
    areaMm2: partArea(part),
    massG: partMassG(part),
    bboxMm: partBBox(part),
    drawnLengthMm: partCutLength(part),
    toolPathMm,
    pierces: profiled + drilled,
    profiled,
    drilled,
    tooNarrow,
    holes: holeRows(part),
    contours,
  };
}

function outlineCut(outline: Loop, r: number): ContourCut {
  const o = offsetRight(outline, r);
  const start = startOf(outline[0]);
  if (o.kind === 'collapsed') return { kind: 'too-narrow', role: 'outline', purpose: 'outline', startMm: start };
  return { kind: 'profile', role: 'outline', drawnMm: loopLength(outline), toolPathMm: loopLength(o.loop), method: o.kind, path: o.loop, startMm: startOf(o.loop[0]) };
}

function featureCut(f: Feature, r: number, toolDiameterMm: number): ContourCut {
  const start = f.centerMm ?? startOf(f.loop[0]);
  // A round hole no wider than the tool is drilled (or plunged with the end mill when equal).
  if (f.kind === 'hole' && f.diameterMm !== undefined && f.diameterMm <= toolDiameterMm + 1e-9) {
    return { kind: 'drill', role: 'inner', diameterMm: f.diameterMm, startMm: start };
  }
  const o = offsetRight(f.loop, r);
  if (o.kind === 'collapsed') return { kind: 'too-narrow', role: 'inner', purpose: f.purpose, startMm: start };
  return { kind: 'profile', role: 'inner', drawnMm: loopLength(f.loop), toolPathMm: loopLength(o.loop), method: o.kind, path: o.loop, startMm: startOf(o.loop[0]) };
}

/** Round holes grouped by diameter and finish, ascending diameter, through before countersunk. */
export function holeRows(part: Part): HoleRow[] {
  const rows = new Map<string, { diameterMm: number; count: number; screw: string | null; finish: 'through' | 'countersunk'; countersinkHeadMm: number | null }>();
  for (const f of part.features) {
    if (f.kind !== 'hole' || f.diameterMm === undefined) continue;
    const finish = f.countersink ? 'countersunk' : 'through';
    const head = f.countersink?.headDiameterMm ?? null;
    const key = `${f.diameterMm.toFixed(3)}|${finish}|${head ?? ''}`;
    const row = rows.get(key) ?? { diameterMm: f.diameterMm, count: 0, screw: f.screw ?? null, finish, countersinkHeadMm: head };
    row.count++;
    rows.set(key, row);
  }
  return [...rows.values()].sort((a, b) => a.diameterMm - b.diameterMm || (a.finish === b.finish ? 0 : a.finish === 'through' ? -1 : 1));
}

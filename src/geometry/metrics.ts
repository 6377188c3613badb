import type { Part } from './part.js';
import { loopBBox, loopLength, signedArea, unionBBox } from './loop.js';
import type { BBox } from './types.js';

/** Material area: outline minus every inner contour. mm². */
export const partArea = (p: Part): number => signedArea(p.outline) + p.features.reduce((a, f) => a + signedArea(f.loop), 0);

/** Total length of every contour as drawn (not the tool-centre path). mm. */
export const partCutLength = (p: Part): number => loopLength(p.outline) + p.features.reduce((a, f) => a + loopLength(f.loop), 0);

/** Bounding box of the part, every contour included (mm). */
export const partBBox = (p: Part): BBox => p.features.reduce((b, f) => unionBBox(b, loopBBox(f.loop)), loopBBox(p.outline));

/** Mass of one copy: area × thickness × density. g. */
export const partMassG = (p: Part): number => (partArea(p) * p.thicknessMm * p.material.densityGPerCm3) / 1000;

/** Holes grouped by diameter (round holes only), ascending. */
export function holeTable(p: Part): Array<{ diameterMm: number; count: number; screw?: string }> {
  const m = new Map<string, { diameterMm: number; count: number; screw?: string }>();
  for (const f of p.features) {
    if (f.kind !== 'hole' || f.diameterMm === undefined) continue;
    const key = f.diameterMm.toFixed(3);
    const e = m.get(key) ?? { diameterMm: f.diameterMm, count: 0, ...(f.screw ? { screw: f.screw } : {}) };
    e.count++;
    m.set(key, e);
  }
  return [...m.values()].sort((a, b) => a.diameterMm - b.diameterMm);
}

import type { Design } from '../params/design.js';
import type { Assembly, BoltedJoint, HardwareItem, HardwareList } from './types.js';

const SCREW_ITEM: Record<BoltedJoint['headStandard'], string> = {
  'ISO 4762': 'socket head cap screw',
  'ISO 7380-1': 'button head screw',
  'ISO 10642': 'countersunk screw',
  'ISO 14581': 'countersunk screw',
};

const NUT_ITEM = { 'ISO 4032': 'hex nut', 'ISO 4035': 'thin hex nut', 'ISO 7040': 'prevailing-torque nut' } as const;

const USE: Record<BoltedJoint['kind'], string> = {
  'arm-root': 'arm root clamp',
  'standoff-bottom': 'standoff to bottom plate',
  'standoff-top': 'top plate to standoff',
  stack: 'stack mount',
  motor: 'motor to arm',
  'camera-mount': 'camera side plate to spacer',
  'camera-pivot': 'camera pivot',
  accessory: 'accessory mount',
};

/**
 * Every fastener and spacer the frame needs, counted from the assembly: screws (ISO 4762 socket
 * heads, ISO 7380-1 button heads on the top plate and camera plates, ISO 10642 / 14581 countersunk
 * where the holes are countersunk), nuts (the design's choice: ISO 4032, 4035 or 7040), standoffs,
 * camera spacers and press nuts for accessory holes. Lines are grouped by item, standard, size,
 * length and use, in a stable order; counts per frame and per batch (`assembly.batchSize`).
 * @example hardwareList(assembly, design).items.find((i) => i.use === 'motor to arm')?.lengthMm
 */
export function hardwareList(a: Assembly, d: Design): HardwareList {
  const batch = d.assembly.batchSize;
  const lines = new Map<string, Omit<HardwareItem, 'countPerBatch'>>();
  const add = (item: string, standard: string, size: string, lengthMm: number | null, use: string): void => {
    const key = [item, standard, size, lengthMm ?? '', use].join('|');
    const l = lines.get(key);
    lines.set(key, l ? { ...l, count: l.count + 1 } : { item, standard, size, lengthMm, count: 1, use });
  };
  for (const j of a.joints) {
    if (!j.stud && j.screwLengthMm > 0) add(SCREW_ITEM[j.headStandard], j.headStandard, j.screw, j.screwLengthMm, USE[j.kind]);
    if (j.nut) add(NUT_ITEM[j.nut.standard], j.nut.standard, j.screw, null, USE[j.kind]);
    if (j.washer) add('plain washer', j.washer.standard, j.screw, null, USE[j.kind]);
  }
  for (const s of a.standoffs) add(`standoff, ${s.shape} ${s.acrossFlatsMm} mm, ${s.ends}, ${s.material}`, 'none', s.screw, s.lengthMm, 'bottom plate to top plate');
  for (const s of a.cameraSpacers) add(`spacer, ${s.shape} ${s.acrossFlatsMm} mm, ${s.ends}, ${s.material}`, 'none', s.screw, s.lengthMm, 'between the camera side plates');
  d.topPlate.accessoryHoles.forEach((h) => add('press nut', 'none', h.boltSize, null, 'accessory mount on the top plate'));
  const items = [...lines.values()]
    .sort((p, q) => cmp(p.use, q.use) || cmp(p.item, q.item) || cmp(p.size, q.size) || (p.lengthMm ?? 0) - (q.lengthMm ?? 0))
    .map((l) => ({ ...l, countPerBatch: l.count * batch }));
  return { batchSize: batch, items };
}

const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

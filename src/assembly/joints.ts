import { transformPoint } from '../geometry/loop.js';
import type { Feature, FeaturePurpose } from '../geometry/part.js';
import type { Vec2 } from '../geometry/types.js';
import type { Design } from '../params/design.js';
import type { ScrewSize } from '../params/types.js';
import { nut as nutOf, pitchMm, screwHead, shortestPreferredLength, washer as washerOf, type HeadStyle, type Washer } from './standards.js';
import type { BoltedJoint, JointKind, JointLayout, PlacedPlate, Standoff, Vec3 } from './types.js';

/** Holes of different plates whose centres are this close in plan take one screw. mm. */
export const COAXIAL_MM = 0.05;

/** One round screw hole of a placed horizontal plate, in frame plan coordinates. */
export type PlacedHole = Readonly<{ plate: PlacedPlate; feature: Feature; atMm: Vec2; screw: ScrewSize; purpose: FeaturePurpose }>;

/** Round screw holes of every horizontal plate copy, in frame plan coordinates. */
export function placedHoles(plates: readonly PlacedPlate[]): PlacedHole[] {
  const out: PlacedHole[] = [];
  for (const plate of plates) {
    if (plate.orientation !== 'horizontal') continue;
    const pl = plate.placement;
    for (const f of plate.part.features) {
      if (f.kind !== 'hole' || !f.centerMm || !f.screw) continue;
      out.push({ plate, feature: f, atMm: transformPoint(f.centerMm, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY }), screw: f.screw, purpose: f.purpose });
    }
  }
  return out;
}

/** Holes grouped by plan position and screw size (a screw passes through each group). */
export function coaxialGroups(holes: readonly PlacedHole[]): PlacedHole[][] {
  const groups: PlacedHole[][] = [];
  for (const h of holes) {
    const g = groups.find((g) => g[0].screw === h.screw && Math.hypot(g[0].atMm[0] - h.atMm[0], g[0].atMm[1] - h.atMm[1]) <= COAXIAL_MM);
    if (g) g.push(h);
    else groups.push([h]);
  }
  for (const g of groups) g.sort((a, b) => a.plate.zLowMm - b.plate.zLowMm);
  return groups;
}

/** Least thread engagement in a tapped part (standoff, motor base, camera body). mm. */
export const engagementMm = (d: Design, screw: ScrewSize): number => d.assembly.standoffEngagementD * Number(screw.slice(1));

type JointInput = Readonly<{
  id: string;
  kind: JointKind;
  screw: ScrewSize;
  planMm: Vec2;
  /** Plates in order from the head. */
  clamps: readonly PlacedPlate[];
  /** +1: head below, screw points up; −1: head above. */
  up: 1 | -1;
  style: HeadStyle;
  endsIn: BoltedJoint['endsIn'];
  standoffEnds?: BoltedJoint['standoffEnds'];
  /** Length beyond the grip that the screw needs (nut + a pitch, or thread engagement). mm. */
  beyondGripMm: number;
  nut: ReturnType<typeof nutOf> | null;
  /** Distance from the last plate to the nut's face (boards stacked between them). mm. */
  nutOffsetMm?: number;
  /** A washer under the nut: its thickness adds to what lies beyond the grip. */
  washer?: Washer | null;
}>;

/** A joint record from its plates and what the screw ends in. Screw length: shortest preferred length covering grip + what lies beyond. */
export function makeJoint(j: JointInput): JointLayout {
  const head = screwHead(j.screw, j.style);
  const grip = j.clamps.reduce((a, p) => a + p.thicknessMm, 0);
  const washerMm = j.nut && j.washer ? j.washer.thicknessMm : 0;
  // A countersunk screw's nominal length includes its head, which sits inside the first plate.
  const need = grip + j.beyondGripMm + washerMm;
  const length = shortestPreferredLength(need) ?? Math.ceil(need);
  const first = j.clamps[0];
  const headZ = j.up === 1 ? first.zLowMm : first.zLowMm + first.thicknessMm;
  const headAt: Vec3 = [j.planMm[0], j.planMm[1], headZ];
  return {
    id: j.id,
    kind: j.kind,
    screw: j.screw,
    planMm: j.planMm,
    headAtMm: headAt,
    axis: [0, 0, j.up],
    headStandard: head.standard,
    headDiameterMm: head.diameterMm,
    headHeightMm: head.heightMm,
    headRadiusMm: head.diameterMm / 2,
    clamps: j.clamps.map((p) => p.id),
    standoffEnds: j.standoffEnds ?? [],
    gripMm: grip,
    screwLengthMm: length,
    nut: j.nut,
    ...(j.nut ? { nutAtMm: [headAt[0], headAt[1], headZ + j.up * (grip + (j.nutOffsetMm ?? 0) + washerMm)] as Vec3 } : {}),
    ...(j.nut && j.washer ? { washer: j.washer } : {}),
    endsIn: j.endsIn,
  };
}

/** The washer under a nut when the design asks for washers (`assembly.washers`), else null. */
export const washerFor = (d: Design, screw: ScrewSize): Washer | null => (d.assembly.washers ? washerOf(screw) : null);

/** Nut plus one full thread beyond it (domain.md: full engagement means thread through the nut). mm. */
export const beyondNutMm = (screw: ScrewSize, nutHeightMm: number): number => nutHeightMm + pitchMm(screw);

/**
 * The bolted joints between plates and standoffs: arm-root bolts (through every plate with a hole
 * there, nut on the far side), standoff screws (through the plates into the standoff's thread, or
 * the standoff's own stud and a nut). Motor, stack and camera screws are in `build.ts`. Heads go where nothing is stacked on them: under the sandwich for
 * arm roots and standoff bottoms, on top for standoff tops.
 */
export function plateJoints(d: Design, plates: readonly PlacedPlate[], standoffs: readonly Standoff[]): JointLayout[] {
  const out: JointLayout[] = [];
  const groups = coaxialGroups(placedHoles(plates));
  const nutChoice = d.assembly.nut;
  let rootN = 0;
  for (const g of groups) {
    const purpose = g[0].purpose;
    const screw = g[0].screw;
    const at = g[0].atMm;
    if (purpose === 'arm-root-bolt') {
      const n = nutOf(screw, nutChoice);
      out.push(makeJoint({ id: `arm-root ${++rootN}`, kind: 'arm-root', screw, planMm: at, clamps: g.map((h) => h.plate), up: 1, style: g[0].feature.countersink ? 'countersunk' : 'socket', endsIn: 'nut', beyondGripMm: beyondNutMm(screw, n.heightMm), nut: n, washer: washerFor(d, screw) }));
    } else if (purpose === 'standoff') {
      const so = standoffs.find((s) => Math.hypot(s.planMm[0] - at[0], s.planMm[1] - at[1]) <= COAXIAL_MM);
      if (!so) continue;
      const below = g.filter((h) => h.plate.zLowMm + h.plate.thicknessMm <= so.zBottomMm + 1e-9);
      const above = g.filter((h) => h.plate.zLowMm >= so.zTopMm - 1e-9);
      if (below.length) out.push(standoffBottom(d, so, below.map((h) => h.plate)));
      if (above.length) {
        const clamps = above.map((h) => h.plate).reverse();
        out.push(makeJoint({ id: `${so.id} top`, kind: 'standoff-top', screw, planMm: at, clamps, up: -1, style: 'button', endsIn: 'standoff', standoffEnds: [{ standoff: so.id, end: 'top' }], beyondGripMm: engagementMm(d, screw), nut: null }));
      }
    }
  }
  return out;
}

function standoffBottom(d: Design, so: Standoff, platesUp: readonly PlacedPlate[]): JointLayout {
  const screw = so.screw;
  if (so.ends === 'male-female') {
    // The standoff's own stud passes down through the plates into a nut underneath.
    const n = nutOf(screw, d.assembly.nut);
    const j = makeJoint({ id: `${so.id} bottom`, kind: 'standoff-bottom', screw, planMm: so.planMm, clamps: [...platesUp].reverse(), up: -1, style: 'socket', endsIn: 'nut', standoffEnds: [{ standoff: so.id, end: 'bottom' }], beyondGripMm: beyondNutMm(screw, n.heightMm), nut: n, washer: washerFor(d, screw) });
    return { ...j, screwLengthMm: 0, stud: so.id };
  }
  const countersunk = platesUp.some((p) => p.part.features.some((f) => f.purpose === 'standoff' && f.countersink));
  return makeJoint({ id: `${so.id} bottom`, kind: 'standoff-bottom', screw, planMm: so.planMm, clamps: platesUp, up: 1, style: countersunk ? 'countersunk' : 'socket', endsIn: 'standoff', standoffEnds: [{ standoff: so.id, end: 'bottom' }], beyondGripMm: engagementMm(d, screw), nut: null });
}

/** Whether the screw's head stands proud of its first plate (countersunk heads sit inside it; a stud has none). */
export const jointStandsProud = (j: BoltedJoint): boolean => !j.stud && j.headStandard !== 'ISO 10642' && j.headStandard !== 'ISO 14581';

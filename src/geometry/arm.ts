import type { Design } from '../params/design.js';
import { unionLoops } from './boolean.js';
import { filletCorners, filletInsideCorners } from './fillet.js';
import { signedArea } from './loop.js';
import { motorHoles, motorPadRadius, screwHole, type SourcedFeature } from './holes.js';
import type { Member } from './part.js';
import { circle, polygon, roundedRect, slot } from './primitives.js';
import { assertNever, type Loop, type Vec2 } from './types.js';
import { lerp } from './vec.js';

/** Outline pieces, holes and members of one arm in its own frame: root end at x = 0, motor on +x. */
export type ArmShape = Readonly<{
  /** Counter-clockwise loops whose union is the arm (before fillets). */
  pieces: readonly Loop[];
  members: readonly Member[];
  features: readonly SourcedFeature[];
  lengthMm: number;
  rootLengthMm: number;
}>;

/** Width of the arm where it is clamped: the truss spread, or the (root) width of a bar arm. mm. */
export const armRootWidthMm = (d: Design): number => (d.arms.style === 'truss' ? d.arms.truss!.spreadMm : (d.arms.widthMm ?? 0));

/**
 * Length of the arm's root block: for separate arms the root bolts with their edge margins; a
 * unibody arm's block lies inside the body and only needs to hold the struts' ends (two bit widths). mm.
 */
export const rootBlockLength = (d: Design): number =>
  d.arms.construction === 'separate'
    ? 2 * d.arms.root.edgeMarginMm + (d.arms.root.boltCount - 1) * d.arms.root.boltSpacingMm
    : 2 * d.cutting.toolDiameterMm;

/**
 * Arm in its own frame. `lengthMm` is root end to motor centre. Separate arms carry their root
 * bolts; a unibody arm has none.
 */
export function armShape(d: Design, lengthMm: number, sourcePath = 'arms'): ArmShape {
  const a = d.arms;
  const L = lengthMm;
  const padR = motorPadRadius(d);
  const rootLen = rootBlockLength(d);
  const pieces: Loop[] = [circle([L, 0], padR)];
  const members: Member[] = [];
  // Straight and tapered arms have a width (validated in params); a truss takes its widths from arms.truss.
  const width = a.widthMm ?? 0;
  switch (a.style) {
    case 'straight':
      pieces.push(roundedRect([L / 2, 0], L, width, Math.min(2, width / 2 - 0.01)));
      members.push({ name: 'arm', startMm: [0, 0], endMm: [L, 0], widthMm: width });
      break;
    case 'tapered': {
      const w0 = width / 2;
      const w1 = (a.tipWidthMm ?? width) / 2;
      pieces.push(filletCorners(polygon([[0, -w0], [L, -w1], [L, w1], [0, w0]]), Math.min(2, w0 * 0.9, w1 * 0.9), 'outside'));
      members.push({ name: 'arm', startMm: [0, 0], endMm: [L, 0], widthMm: (width + (a.tipWidthMm ?? width)) / 2 });
      break;
    }
    case 'truss': {
      const t = a.truss!;
      const spread = t.spreadMm;
      // Strut ends sit 1 mm inside the root block so no strut edge runs along a block edge.
      const mainStart: Vec2 = [rootLen / 2, spread / 2 - t.mainWidthMm / 2 - 1];
      const secStart: Vec2 = [rootLen / 2, -(spread / 2 - t.secondaryWidthMm / 2 - 1)];
      const meet = lerp(mainStart, [L, 0], t.meetFraction);
      pieces.push(roundedRect([rootLen / 2, 0], rootLen, spread, Math.min(2, spread / 2 - 0.01)));
      pieces.push(slot(mainStart, [L, 0], t.mainWidthMm));
      pieces.push(slot(secStart, meet, t.secondaryWidthMm));
      members.push({ name: 'main strut', startMm: mainStart, endMm: [L, 0], widthMm: t.mainWidthMm });
      members.push({ name: 'secondary strut', startMm: secStart, endMm: meet, widthMm: t.secondaryWidthMm });
      break;
    }
    default:
      return assertNever(a.style);
  }
  const features: SourcedFeature[] = [];
  if (a.construction === 'separate') {
    for (let i = 0; i < a.root.boltCount; i++) {
      features.push(screwHole(d, [a.root.edgeMarginMm + i * a.root.boltSpacingMm, 0], a.root.boltSize, 'arm-root-bolt', `${sourcePath}.root`));
    }
  }
  features.push(...motorHoles(d, [L, 0], 0, 'motor'));
  return { pieces, members, features, lengthMm: L, rootLengthMm: rootLen };
}

/**
 * Union of the pieces with inside corners rounded; enclosed windows come back as clockwise loops.
 */
export function filletedUnion(pieces: readonly Loop[], filletMm: number): { outline: Loop; windows: Loop[] } {
  const loops = unionLoops(pieces).map((l) => filletInsideCorners(l, filletMm));
  const outer = loops.filter((l) => isCcw(l));
  return { outline: outer[0], windows: loops.filter((l) => !isCcw(l)) };
}

const isCcw = (l: Loop): boolean => signedArea(l) > 0;

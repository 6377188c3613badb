import type { ScrewSize } from '../params/types.js';
import { addBodies, cylinderBody, hexPrismBody, placeBody, scaleBody, type MassBody } from './massProps.js';
import { pitchDiameterMm, socketSizeMm } from './standards.js';
import type { BoltedJoint, JointLayout, Vec3 } from './types.js';

/**
 * Mass bodies of screws and nuts from their dimensions and density. A screw is its head (a cylinder
 * dk × k less the hex socket, half as deep as the head — an approximation; a countersunk head as a
 * 90° cone frustum from dk to d) and a shank of the pitch diameter (ISO 724 d2: about the volume of
 * a threaded shank). A nut is a hex prism s × m less a bore of the pitch diameter.
 */

/** Frame axes with the given unit vector as the third (w) axis. */
function axesAlong(w: Vec3): [Vec3, Vec3, Vec3] {
  const u: Vec3 = Math.abs(w[2]) > 0.5 ? [1, 0, 0] : [0, 0, 1];
  const v: Vec3 = [w[1] * u[2] - w[2] * u[1], w[2] * u[0] - w[0] * u[2], w[0] * u[1] - w[1] * u[0]];
  return [u, v, w];
}

const d = (s: ScrewSize): number => Number(s.slice(1));

/** A screw of a joint placed in the frame. g, mm. */
export function screwBody(j: JointLayout, densityGPerCm3: number): MassBody {
  if (j.stud || j.screwLengthMm <= 0) return { massG: 0, firstGMm: [0, 0, 0], secondGMm2: [0, 0, 0, 0, 0, 0, 0, 0, 0] };
  const rho = densityGPerCm3 / 1000;
  const countersunk = j.headStandard === 'ISO 10642' || j.headStandard === 'ISO 14581';
  const axes = axesAlong(j.axis);
  const at = j.headAtMm;
  const shankLength = countersunk ? j.screwLengthMm - j.headHeightMm : j.screwLengthMm;
  const shankStart: Vec3 = countersunk ? [at[0] + j.axis[0] * j.headHeightMm, at[1] + j.axis[1] * j.headHeightMm, at[2] + j.axis[2] * j.headHeightMm] : at;
  const shank = placeBody(cylinderBody(pitchDiameterMm(j.screw), shankLength, rho), shankStart, axes);
  let head: MassBody;
  if (countersunk) {
    // Frustum volume π k (D² + D d + d²) / 12, centred on the head for the moments (the head is small).
    const D = j.headDiameterMm;
    const v = (Math.PI * j.headHeightMm * (D * D + D * d(j.screw) + d(j.screw) ** 2)) / 12;
    const eq = Math.sqrt((4 * v) / (Math.PI * j.headHeightMm));
    head = placeBody(cylinderBody(eq, j.headHeightMm, rho), at, axes);
  } else {
    const back: Vec3 = [at[0] - j.axis[0] * j.headHeightMm, at[1] - j.axis[1] * j.headHeightMm, at[2] - j.axis[2] * j.headHeightMm];
    const cyl = cylinderBody(j.headDiameterMm, j.headHeightMm, rho);
    const socket = scaleBody(hexPrismBody(socketSizeMm(j.screw), j.headHeightMm / 2, rho), -1);
    head = placeBody(addBodies([cyl, socket]), back, axes);
  }
  return addBodies([head, shank]);
}

/** The washer under a joint's nut (zero when there is none): an annulus d1–d2 of thickness h. g, mm. */
export function washerBody(j: JointLayout, densityGPerCm3: number): MassBody {
  if (!j.washer || !j.nutAtMm) return { massG: 0, firstGMm: [0, 0, 0], secondGMm2: [0, 0, 0, 0, 0, 0, 0, 0, 0] };
  const h = j.washer.thicknessMm;
  const at: Vec3 = [j.nutAtMm[0] - j.axis[0] * h, j.nutAtMm[1] - j.axis[1] * h, j.nutAtMm[2] - j.axis[2] * h];
  return placeBody(cylinderBody(j.washer.outerMm, h, densityGPerCm3 / 1000, j.washer.innerMm), at, axesAlong(j.axis));
}

/** The nut of a joint placed in the frame (zero when the joint has none). g, mm. */
export function nutBody(j: JointLayout, densityGPerCm3: number): MassBody {
  if (!j.nut || !j.nutAtMm) return { massG: 0, firstGMm: [0, 0, 0], secondGMm2: [0, 0, 0, 0, 0, 0, 0, 0, 0] };
  return placeBody(hexPrismBody(j.nut.acrossFlatsMm, j.nut.heightMm, densityGPerCm3 / 1000, pitchDiameterMm(j.screw)), j.nutAtMm, axesAlong(j.axis));
}

/** Screw, nut and washer of a joint as one body. g, mm. */
export function jointHardwareBody(j: JointLayout, densityGPerCm3: number): MassBody {
  return addBodies([screwBody(j, densityGPerCm3), nutBody(j, densityGPerCm3), washerBody(j, densityGPerCm3)]);
}

/** The joint with its fastener weighed (`BoltedJoint.hardwareMass`). */
export function weighJoint(j: JointLayout, densityGPerCm3: number): BoltedJoint {
  return { ...j, hardwareMass: jointHardwareBody(j, densityGPerCm3) };
}

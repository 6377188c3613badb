import { stackCentre } from '../geometry/frame.js';
import { windingNumber } from '../geometry/inside.js';
import { loopBBox } from '../geometry/loop.js';
import type { Vec2 } from '../geometry/types.js';
import type { ComponentSpec } from '../params/assemblySchema.js';
import type { Design } from '../params/design.js';
import { designError } from '../params/errors.js';
import { degToRad } from '../params/units.js';
import { addBodies, boxBody, centreOfMass, placeBody, type MassBody } from './massProps.js';
import { stackCorners } from './parts.js';
import type { Component, OrientedBox, PlacedPlate, StackUp, Vec3 } from './types.js';

/**
 * Uptilt step of the camera sweep. Between two sampled poses a point at distance r from the pivot
 * strays at most r (1 − cos(step / 2)) outside them; the fit checks add that to their clearance. rad.
 */
export const CAMERA_SWEEP_STEP_RAD = degToRad(2.5);

const AXES: readonly [Vec3, Vec3, Vec3] = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];

const box = (centre: Vec3, size: Vec3, axes = AXES): OrientedBox => ({ centreMm: centre, halfSizeMm: [size[0] / 2, size[1] / 2, size[2] / 2], axes });

const boxVolume = (b: OrientedBox): number => 8 * b.halfSizeMm[0] * b.halfSizeMm[1] * b.halfSizeMm[2];

/** Mass body of a component: its mass spread over its boxes by volume, each box uniform. */
export function componentMassBody(c: Pick<Component, 'boxes' | 'massG'>): MassBody {
  const total = c.boxes.reduce((a, b) => a + boxVolume(b), 0);
  return addBodies(
    c.boxes.map((b) => {
      const m = (c.massG * boxVolume(b)) / total;
      return placeBody(boxBody([2 * b.halfSizeMm[0], 2 * b.halfSizeMm[1], 2 * b.halfSizeMm[2]], m), b.centreMm, b.axes);
    }),
  );
}

type Ctx = Readonly<{ d: Design; plates: readonly PlacedPlate[]; stackUp: StackUp }>;

/**
 * Place every component of the design. Boards on a stack mount pile up from the bottom plate in
 * file order; a board on a plate sits on (or hangs under) that face at `atMm`.
 * Throws DesignError naming `components.N...` when a component has nowhere to go (its centre is not
 * over the plate it names).
 */
export function placeComponents(d: Design, plates: readonly PlacedPlate[], stackUp: StackUp): Component[] {
  const ctx: Ctx = { d, plates, stackUp };
  const piled = new Map<number, number>();
  const counts = new Map<string, number>();
  return d.components.map((spec, i) => {
    const n = (counts.get(spec.kind) ?? 0) + 1;
    counts.set(spec.kind, n);
    const id = spec.name ?? `${spec.kind} ${n}`;
    const placed = place(ctx, spec, i, piled);
    const body = componentMassBody({ boxes: placed.boxes, massG: spec.massG });
    const soft = 'softMountNPerMm' in spec && spec.softMountNPerMm !== undefined ? { softMountNPerMm: spec.softMountNPerMm } : {};
    return { id, kind: spec.kind, sourcePath: `components.${i}`, massG: spec.massG, cgMm: centreOfMass(body), ...placed, ...soft };
  });
}

type Placed = Omit<Component, 'id' | 'kind' | 'sourcePath' | 'massG' | 'cgMm'>;

function place(ctx: Ctx, spec: ComponentSpec, i: number, piled: Map<number, number>): Placed {
  const { d, stackUp } = ctx;
  const path = `components.${i}`;
  switch (spec.kind) {
    case 'stack': {
      const pattern = spec.patternMm ?? d.stacks[spec.stack].patternsMm[0];
      const c = stackCentre(d, spec.stack);
      const z0 = piled.get(spec.stack) ?? stackUp.bottomPlateTopMm;
      piled.set(spec.stack, z0 + spec.heightMm);
      return {
        boxes: [box([c[0], c[1], z0 + spec.heightMm / 2], [spec.boardMm[0], spec.boardMm[1], spec.heightMm])],
        mountedOn: ['bottom-plate', `stack mount ${spec.stack}`],
        mountPointsMm: stackCorners(d, spec.stack, pattern).map((p) => [p[0], p[1], stackUp.bottomPlateTopMm] as Vec3),
        stack: { mount: spec.stack, patternMm: pattern, boardMm: spec.boardMm, heightMm: spec.heightMm },
      };
    }
    case 'video-transmitter':
    case 'receiver': {
      const [l, w, h] = spec.sizeMm;
      if (spec.on === 'stack') {
        const c = spec.atMm ?? stackCentre(d, spec.stack);
        const z0 = piled.get(spec.stack) ?? stackUp.bottomPlateTopMm;
        piled.set(spec.stack, z0 + h);
        return { boxes: [box([c[0], c[1], z0 + h / 2], [l, w, h])], mountedOn: ['bottom-plate', `stack mount ${spec.stack}`], mountPointsMm: [[c[0], c[1], z0]] };
      }
      const at = spec.atMm!;
      const plateName = spec.on === 'bottom-plate' ? 'bottom-plate' : 'top-plate';
      requireOver(ctx, plateName, at, `${path}.atMm`);
      const z0 = spec.on === 'bottom-plate' ? stackUp.bottomPlateTopMm : spec.on === 'top-plate' ? stackUp.topPlateTopMm : stackUp.topPlateLowMm - h;
      return { boxes: [box([at[0], at[1], z0 + h / 2], [l, w, h])], mountedOn: [plateName], mountPointsMm: [[at[0], at[1], spec.on === 'under-top-plate' ? z0 + h : z0]] };
    }
    case 'battery': {
      const [l, w, h] = spec.sizeMm;
      const at: Vec2 = [spec.xMm, 0];
      const plateName = spec.side === 'top' ? 'top-plate' : 'bottom-plate';
      requireOver(ctx, plateName, at, `${path}.xMm`);
      const zTop = spec.side === 'top' ? stackUp.topPlateTopMm : lowestUnder(ctx, at, l, w);
      const z0 = spec.side === 'top' ? zTop : zTop - h;
      const slots = spec.side === 'top' ? d.topPlate.strapSlots.xPositionsMm : [];
      return {
        boxes: [box([at[0], at[1], z0 + h / 2], [l, w, h])],
        mountedOn: [plateName],
        mountPointsMm: slots.map((x) => [x, 0, zTop] as Vec3),
        straps: { slotsXMm: slots, strapLengthMm: spec.strapLengthMm, strapWidthMm: d.topPlate.strapSlots.strapWidthMm, side: spec.side },
      };
    }
    case 'camera':
      return placeCamera(ctx, spec);
    case 'antenna': {
      const dir = degToRad(spec.directionDeg);
      const el = degToRad(spec.elevationDeg);
      const f: Vec3 = [Math.cos(dir) * Math.cos(el), Math.sin(dir) * Math.cos(el), Math.sin(el)];
      const side: Vec3 = [-Math.sin(dir), Math.cos(dir), 0];
      const up: Vec3 = [f[1] * side[2] - f[2] * side[1], f[2] * side[0] - f[0] * side[2], f[0] * side[1] - f[1] * side[0]];
      const start: Vec3 = [spec.atMm[0], spec.atMm[1], spec.zMm];
      const centre: Vec3 = [start[0] + (f[0] * spec.lengthMm) / 2, start[1] + (f[1] * spec.lengthMm) / 2, start[2] + (f[2] * spec.lengthMm) / 2];
      return { boxes: [box(centre, [spec.lengthMm, spec.diameterMm, spec.diameterMm], [f, side, up])], mountedOn: [], mountPointsMm: [start] };
    }
  }
}

/** The camera's pivot: `camera.forwardOffsetMm` ahead of the front standoffs, at `camera.pivotHeightMm`. mm. */
export function cameraPivotMm(d: Design): Vec3 {
  const frontX = Math.max(...d.body.standoffs.positionsMm.map((p) => p[0]));
  return [frontX + d.camera!.forwardOffsetMm, 0, d.camera!.pivotHeightMm];
}

/**
 * Camera body and lens boxes at an uptilt (nose up positive): the view axis turns from +x towards
 * +z about the pivot's y axis. The front face is `pivotBehindFaceMm` ahead of the pivot.
 */
export function cameraBoxes(d: Design, spec: Extract<ComponentSpec, { kind: 'camera' }>, tiltRad: number): OrientedBox[] {
  const p = cameraPivotMm(d);
  const width = spec.widthMm ?? d.camera!.cameraWidthMm;
  const height = spec.heightMm ?? width;
  const face = spec.pivotBehindFaceMm ?? spec.depthMm / 2;
  const f: Vec3 = [Math.cos(tiltRad), 0, Math.sin(tiltRad)];
  const up: Vec3 = [-Math.sin(tiltRad), 0, Math.cos(tiltRad)];
  const at = (k: number): Vec3 => [p[0] + f[0] * k, p[1], p[2] + f[2] * k];
  const out = [box(at(face - spec.depthMm / 2), [spec.depthMm, width, height], [f, [0, 1, 0], up])];
  if (spec.lensLengthMm > 0) out.push(box(at(face + spec.lensLengthMm / 2), [spec.lensLengthMm, spec.lensDiameterMm, spec.lensDiameterMm], [f, [0, 1, 0], up]));
  return out;
}

function placeCamera(ctx: Ctx, spec: Extract<ComponentSpec, { kind: 'camera' }>): Placed {
  const c = ctx.d.camera!;
  const lo = degToRad(c.uptiltMinDeg);
  const hi = degToRad(c.uptiltMaxDeg);
  const steps = Math.max(1, Math.ceil((hi - lo) / CAMERA_SWEEP_STEP_RAD));
  const sweep = Array.from({ length: steps + 1 }, (_, k) => cameraBoxes(ctx.d, spec, lo + ((hi - lo) * k) / steps));
  const pivot = cameraPivotMm(ctx.d);
  const width = spec.widthMm ?? c.cameraWidthMm;
  return {
    boxes: cameraBoxes(ctx.d, spec, degToRad(c.uptiltDeg)),
    mountedOn: ctx.plates.filter((p) => p.part.role === 'camera-side').map((p) => p.id),
    mountPointsMm: [[pivot[0], width / 2, pivot[2]], [pivot[0], -width / 2, pivot[2]]],
    sweep,
    pivot: { atMm: pivot, minRad: lo, maxRad: hi, setRad: degToRad(c.uptiltDeg) },
  };
}

function requireOver(ctx: Ctx, plateName: string, at: Vec2, path: string): void {
  const plate = ctx.plates.find((p) => p.id === plateName);
  if (!plate?.planOutline) return;
  if (windingNumber(plate.planOutline, at) !== 0) return;
  const b = loopBBox(plate.planOutline);
  throw designError(path, at.length === 2 && path.endsWith('xMm') ? at[0] : at, `puts the component's centre outside the ${plateName} (which spans x ${b[0].toFixed(1)} to ${b[2].toFixed(1)}, y ${b[1].toFixed(1)} to ${b[3].toFixed(1)} mm); it fits nowhere there`);
}

/** Lowest face of the plates above a footprint (a battery under the frame hangs below it). mm. */
function lowestUnder(ctx: Ctx, at: Vec2, l: number, w: number): number {
  const over = ctx.plates.filter((p) => p.orientation === 'horizontal' && p.bounds.minMm[0] < at[0] + l / 2 && p.bounds.maxMm[0] > at[0] - l / 2 && p.bounds.minMm[1] < at[1] + w / 2 && p.bounds.maxMm[1] > at[1] - w / 2 && p.zLowMm < ctx.stackUp.bottomPlateTopMm);
  return over.length ? Math.min(...over.map((p) => p.zLowMm)) : 0;
}

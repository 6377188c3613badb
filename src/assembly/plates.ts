import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformLoop, transformPoint } from '../geometry/loop.js';
import type { Part, Placement } from '../geometry/part.js';
import type { Loop, Vec2 } from '../geometry/types.js';
import { centreOfMass, loopMoments, placeBody, plateBody, sumMoments, type AreaMoments, type MassBody } from './massProps.js';
import type { Box3, PlacedPlate, Pose, Vec3 } from './types.js';

/** The pose of a placement (see `Pose`). */
export function poseOf(pl: Placement): Pose {
  if (pl.vertical) {
    return { originMm: [pl.translateMm[0], pl.translateMm[1], pl.zMm], uAxis: [1, 0, 0], vAxis: [0, 0, 1], normal: [0, -1, 0], mirrored: false };
  }
  const c = Math.cos(pl.rotateRad);
  const s = Math.sin(pl.rotateRad);
  return {
    originMm: [pl.translateMm[0], pl.translateMm[1], pl.zMm],
    uAxis: [c, s, 0],
    vAxis: pl.mirrorY ? [s, -c, 0] : [-s, c, 0],
    normal: [0, 0, 1],
    mirrored: pl.mirrorY,
  };
}

/** A part-coordinate point at depth w through the plate, in frame coordinates. mm. */
export function poseApply(pose: Pose, p: Vec2, w = 0): Vec3 {
  const o = pose.originMm;
  return [0, 1, 2].map((i) => o[i] + p[0] * pose.uAxis[i] + p[1] * pose.vAxis[i] + w * pose.normal[i]) as unknown as Vec3;
}

const momentCache = new WeakMap<Part, AreaMoments>();

/** The part's exact area moments in its own coordinates (outline less every feature), computed once per part. */
export function partMoments(part: Part): AreaMoments {
  let m = momentCache.get(part);
  if (!m) {
    m = sumMoments([loopMoments(part.outline), ...part.features.map((f) => loopMoments(f.loop))]);
    momentCache.set(part, m);
  }
  return m;
}

/** Mass body of one plate copy: the part's exact area moments extruded over its thickness, placed by the pose. */
export function plateMassBody(part: Part, pose: Pose): MassBody {
  const m = partMoments(part);
  const local = plateBody(m, part.thicknessMm, part.material.densityGPerCm3 / 1000);
  return placeBody(local, pose.originMm, [pose.uAxis, pose.vAxis, pose.normal]);
}

/**
 * Every copy of every plate of the frame, in part order then copy order. Arm copies are named by
 * the motor site they carry (their motor centre lands on the site), camera sides by side, braces
 * front and rear.
 */
export function placePlates(frame: Frame): PlacedPlate[] {
  const out: PlacedPlate[] = [];
  frame.parts.forEach((part, partIndex) => {
    part.placements.forEach((pl, copy) => {
      const pose = poseOf(pl);
      const site = part.role === 'arm' ? siteOfArmCopy(frame, pl) : null;
      const id = plateId(part, pl, copy, site);
      const body = plateMassBody(part, pose);
      const planOutline: Loop | null = pl.vertical ? null : transformLoop(part.outline, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });
      out.push({
        id,
        part,
        partIndex,
        copy,
        placement: pl,
        pose,
        orientation: pl.vertical ? 'vertical' : 'horizontal',
        zLowMm: pl.vertical ? pl.zMm + loopBBox(part.outline)[1] : pl.zMm,
        thicknessMm: part.thicknessMm,
        planOutline,
        site,
        bounds: plateBounds(part, pl, planOutline),
        massG: body.massG,
        cgMm: centreOfMass(body),
      });
    });
  });
  return out;
}

function plateId(part: Part, pl: Placement, copy: number, site: PlacedPlate['site']): string {
  if (part.placements.length === 1) return part.name;
  if (site) return `${part.name} ${site}`;
  if (part.role === 'camera-side') return `${part.name} ${pl.translateMm[1] > 0 ? 'left' : 'right'}`;
  if (part.role === 'brace') return `${part.name} ${Math.cos(pl.rotateRad) > 0 ? 'front' : 'rear'}`;
  return `${part.name} ${copy + 1}`;
}

/** The site this arm copy carries: placed by the site's own arm line, its motor lands on the site. */
function siteOfArmCopy(frame: Frame, pl: Placement): PlacedPlate['site'] {
  const a = frame.design.arms;
  // Arm copies exist only for separate arms.
  const start = a.construction === 'separate' ? a.root.reachMm - a.root.edgeMarginMm : 0;
  let best: { id: PlacedPlate['site']; d: number } = { id: null, d: Infinity };
  for (const s of frame.sites) {
    const at = transformPoint([s.motorAlongMm - start, 0], { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY });
    const d = Math.hypot(s.motorMm[0] - at[0], s.motorMm[1] - at[1]);
    if (d < best.d) best = { id: s.id, d };
  }
  return best.id;
}

function plateBounds(part: Part, pl: Placement, planOutline: Loop | null): Box3 {
  if (planOutline) {
    const b = loopBBox(planOutline);
    return { minMm: [b[0], b[1], pl.zMm], maxMm: [b[2], b[3], pl.zMm + part.thicknessMm] };
  }
  const b = loopBBox(part.outline);
  const y = pl.translateMm[1];
  return { minMm: [pl.translateMm[0] + b[0], y - part.thicknessMm, pl.zMm + b[1]], maxMm: [pl.translateMm[0] + b[2], y, pl.zMm + b[3]] };
}

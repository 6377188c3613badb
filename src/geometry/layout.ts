import type { Design } from '../params/design.js';
import { degToRad } from '../params/units.js';
import type { Vec2 } from './types.js';

export type SiteId = 'front-left' | 'front-right' | 'rear-left' | 'rear-right';

/**
 * One motor and the arm that carries it, in frame coordinates (x forward, y left, origin at the
 * frame centre). The arm runs along `armDirRad` through `armLineOrigin`; distances along it
 * (`motorAlongMm`, root bolt reach) are measured from that origin.
 */
export type MotorSite = Readonly<{
  id: SiteId;
  front: boolean;
  left: boolean;
  motorMm: Vec2;
  armDirRad: number;
  armLineOriginMm: Vec2;
  motorAlongMm: number;
}>;

export const SITE_ORDER: readonly SiteId[] = ['front-right', 'front-left', 'rear-left', 'rear-right'];

/** Motor sites of the layout, in the fixed order front-right, front-left, rear-left, rear-right. */
export function motorSites(d: Design): MotorSite[] {
  const L = d.layout;
  const place = (front: boolean, left: boolean): MotorSite => {
    let reach: number;
    let angle: number;
    if (L.kind === 'asymmetric') {
      const p = front ? L.front : L.rear;
      reach = p.reachMm;
      angle = degToRad(p.angleDeg);
    } else {
      reach = L.wheelbaseMm / 2;
      angle = degToRad(L.armAngleDeg);
    }
    const x = (front ? 1 : -1) * reach * Math.cos(angle);
    const y = (left ? 1 : -1) * reach * Math.sin(angle);
    const id = `${front ? 'front' : 'rear'}-${left ? 'left' : 'right'}` as SiteId;
    if (L.kind === 'h') {
      // H: each arm runs from its start on the body (mirrored in y for the right side) to its motor;
      // a start level with the motor gives an arm parallel to the body axis.
      const start = front ? L.frontArmStartMm : L.rearArmStartMm;
      const origin: Vec2 = [start[0], left ? start[1] : -start[1]];
      const dx = x - origin[0];
      const dy = y - origin[1];
      return { id, front, left, motorMm: [x, y], armDirRad: Math.atan2(dy, dx), armLineOriginMm: origin, motorAlongMm: Math.hypot(dx, dy) };
    }
    return { id, front, left, motorMm: [x, y], armDirRad: Math.atan2(y, x), armLineOriginMm: [0, 0], motorAlongMm: reach };
  };
  return SITE_ORDER.map((id) => place(id.startsWith('front'), id.endsWith('left')));
}

/** Point at distance `along` on the site's arm line. */
export function alongArm(site: MotorSite, along: number): Vec2 {
  return [site.armLineOriginMm[0] + along * Math.cos(site.armDirRad), site.armLineOriginMm[1] + along * Math.sin(site.armDirRad)];
}

/** Diagonal motor-to-motor distance (front-left to rear-right), the trade's "wheelbase". mm. */
export function wheelbaseOf(sites: readonly MotorSite[]): number {
  const fl = sites.find((s) => s.id === 'front-left')!;
  const rr = sites.find((s) => s.id === 'rear-right')!;
  return Math.hypot(fl.motorMm[0] - rr.motorMm[0], fl.motorMm[1] - rr.motorMm[1]);
}

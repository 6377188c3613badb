import type { Material, Member } from '../geometry/part.js';
import type { Vec2 } from '../geometry/types.js';
import { degToRad, radToDeg } from '../params/units.js';
import { finding, mid } from './finding.js';
import { exAt } from './laminate.js';
import type { CheckOptions } from './options.js';
import type { Finding } from './types.js';
import type { Part } from '../geometry/part.js';

export const WEAVE_RULE = 'weave-direction';

export const memberAngleRad = (m: Member): number => Math.atan2(m.endMm[1] - m.startMm[1], m.endMm[0] - m.startMm[0]);

/** Angle from a direction to the nearest fibre direction of a 0/90 weave, in [0, π/4]. rad. */
export function angleToFibre(thetaRad: number): number {
  const q = Math.PI / 2;
  const r = ((thetaRad % q) + q) % q;
  return Math.min(r, q - r);
}

/**
 * The weave angle (part coordinates, degrees in [−45, 45) for a balanced weave, else [−90, 90)) that maximises the smallest Ex over the
 * members, by a 0.25° scan refined by golden-section search, and that smallest Ex (GPa).
 */
export function bestWeave(mat: Material, members: readonly Member[]): { weaveDeg: number; minExGpa: number } {
  const score = (wDeg: number): number => Math.min(...members.map((m) => exAt(mat, memberAngleRad(m) - degToRad(wDeg))));
  let best = { w: -90, s: -Infinity };
  for (let w = -90; w < 90; w += 0.25) {
    const s = score(w);
    if (s > best.s + 1e-12) best = { w, s };
  }
  let a = best.w - 0.25;
  let b = best.w + 0.25;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 40; i++) {
    const c = b - g * (b - a);
    const d = a + g * (b - a);
    if (score(c) >= score(d)) b = d;
    else a = c;
  }
  let w = (a + b) / 2;
  if (score(w) < best.s) w = best.w;
  // A balanced weave (E1 = E2) repeats every 90°, otherwise every 180°: report the smallest turn.
  const period = mat.e1Gpa === mat.e2Gpa ? 90 : 180;
  let wn = ((((w + period / 2) % period) + period) % period) - period / 2;
  if (Math.abs(wn) < 1e-9) wn = 0;
  return { weaveDeg: Math.round(wn * 100) / 100, minExGpa: score(wn) };
}

/**
 * Rule 4: each member's angle to the nearest fibre direction and its axial modulus Ex(θ) (classical
 * laminate theory); a warning below minModulusFraction of the on-axis modulus max(E1, E2), with the
 * weave angle that maximises the weakest member. Parts without members have nothing to check.
 */
export function weaveRule(part: Part, o: CheckOptions): Finding[] {
  const lim = o.limits['weave-direction'];
  if (!lim.enabled || part.members.length === 0) return [];
  const mat = part.material;
  const onAxis = Math.max(mat.e1Gpa, mat.e2Gpa);
  const out: Finding[] = [];
  const rows = part.members.map((m) => {
    const theta = memberAngleRad(m) - part.weaveRad;
    const ex = exAt(mat, theta);
    return { m, theta, ex, frac: ex / onAxis };
  });
  // The advice for a weak strut: the weave angle that raises the weakest member most.
  const best = rows.some((r) => r.frac < lim.minModulusFraction) ? bestWeave(mat, part.members) : null;
  const key = part.role === 'imported' ? 'weaveDeg' : `${part.sourcePath}.weaveDeg`;
  for (const r of rows) {
    const at: Vec2 = mid(r.m.startMm, r.m.endMm);
    const off = radToDeg(angleToFibre(r.theta));
    const warn = r.frac < lim.minModulusFraction;
    const facts = `${off.toFixed(1)}° from the nearest fibre direction, Ex ${r.ex.toFixed(1)} of ${onAxis.toFixed(1)} GPa on axis`;
    const advice =
      best && best.minExGpa / onAxis > r.frac + 0.005
        ? `lay the weave at ${best.weaveDeg.toFixed(2)}° (${key}) to raise the weakest strut to Ex/E ${(best.minExGpa / onAxis).toFixed(2)}, or run the strut along a fibre direction`
        : 'run the strut along a fibre direction (0° or 90° to the weave)';
    out.push(
      finding(WEAVE_RULE, warn ? 'warning' : 'info', part.name, r.frac, lim.minModulusFraction, 'Ex/E', at,
        warn
          ? `${r.m.name}: Ex/E ${r.frac.toFixed(2)} is below ${lim.minModulusFraction.toFixed(2)} (${facts}); ${advice}`
          : `${r.m.name}: Ex/E ${r.frac.toFixed(2)} meets ${lim.minModulusFraction.toFixed(2)} (${facts}); no change needed`),
    );
  }
  return out;
}

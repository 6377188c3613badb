import { degToRad, radToDeg } from '../params/units.js';
import type { Change } from '../variant/changes.js';

/**
 * Changing `layout.kind` alone would leave the layout with the other kind's keys (x and h take a
 * wheelbase and an arm angle; asymmetric a front and a rear reach and angle), which no schema
 * accepts. The page's kind change therefore rewrites the layout's keys so the frame keeps its size:
 * x ↔ h keep wheelbase and angle (the same motor rectangle); an h layout's arms start at the frame
 * centre when it is made (the same arms as the x layout; move the starts along the body from there)
 * and lose their starts when it is left; x/h → asymmetric keep every motor where it was;
 * asymmetric → x/h keep the wheelbase (front-left to rear-right) and its direction.
 */

const r1 = (x: number): number => Math.round(x * 10) / 10;

type Rec = Record<string, unknown>;
const rec = (v: unknown): Rec => (v !== null && typeof v === 'object' && !Array.isArray(v) ? (v as Rec) : {});
const num = (v: unknown, fallback: number): number => (typeof v === 'number' && Number.isFinite(v) ? v : fallback);

/** The changes with a kind change expanded into the layout keys it needs (other changes as they are). */
export function convertLayoutKind(changes: readonly Change[], raw: unknown): Change[] {
  const layout = rec(rec(raw).layout);
  const i = changes.findIndex((c) => c.path.length === 2 && c.path[0] === 'layout' && c.path[1] === 'kind');
  if (i < 0) return [...changes];
  const from = layout.kind;
  const to = changes[i].new;
  if (from === to || typeof to !== 'string') return [...changes];
  const set = (key: string, v: unknown): Change => ({ path: ['layout', key], old: layout[key], new: v, why: `layout kind ${String(from)} → ${to}` });
  const out: Change[] = [];
  const starts = (kind: unknown): Change[] =>
    kind === 'h' ? [set('frontArmStartMm', layout.frontArmStartMm ?? [0, 0]), set('rearArmStartMm', layout.rearArmStartMm ?? [0, 0])] : from === 'h' ? [set('frontArmStartMm', undefined), set('rearArmStartMm', undefined)] : [];
  if (to === 'asymmetric' && (from === 'x' || from === 'h')) {
    const half = r1(num(layout.wheelbaseMm, 200) / 2);
    const angle = num(layout.armAngleDeg, 45);
    out.push(set('kind', to), set('wheelbaseMm', undefined), set('armAngleDeg', undefined), set('front', { reachMm: half, angleDeg: angle }), set('rear', { reachMm: half, angleDeg: angle }), ...starts(to));
  } else if ((to === 'x' || to === 'h') && from === 'asymmetric') {
    const f = rec(layout.front);
    const r = rec(layout.rear);
    const rf = num(f.reachMm, 100);
    const rr = num(r.reachMm, 100);
    const af = degToRad(num(f.angleDeg, 45));
    const ar = degToRad(num(r.angleDeg, 45));
    // Front-left minus rear-right: the diagonal the wheelbase is measured along.
    const dx = rf * Math.cos(af) + rr * Math.cos(ar);
    const dy = rf * Math.sin(af) + rr * Math.sin(ar);
    out.push(set('kind', to), set('front', undefined), set('rear', undefined), set('wheelbaseMm', r1(Math.hypot(dx, dy))), set('armAngleDeg', r1(radToDeg(Math.atan2(dy, dx)))), ...starts(to));
  } else {
    out.push(set('kind', to), ...starts(to));
  }
  return [...changes.slice(0, i), ...out, ...changes.slice(i + 1)];
}

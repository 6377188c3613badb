import { readFileSync } from 'node:fs';
import YAML from 'yaml';

/** A demo design's text (the lead's designs/ folder). */
export const demoText = (name: string): string => readFileSync(new URL(`../../designs/${name}.yaml`, import.meta.url), 'utf8');

/** A copy of a design text with some top-level sections replaced (comments dropped; for test inputs only). */
export function withSections(text: string, patch: Record<string, unknown>): string {
  const raw = YAML.parse(text) as Record<string, unknown>;
  return YAML.stringify({ ...raw, ...patch });
}

type Pt = [number, number];

/**
 * Motor centres written out from the trade's layout definitions, independently of src/geometry:
 * x forward, y left; x and h put the motors on a rectangle whose diagonal is the wheelbase at
 * armAngle from the forward axis; asymmetric puts front and rear pairs at their own reach and angle.
 */
export function motorsFromRaw(layout: any): { fl: Pt; fr: Pt; rl: Pt; rr: Pt } {
  const rad = (d: number) => (d * Math.PI) / 180;
  if (layout.kind === 'asymmetric') {
    const f = layout.front;
    const r = layout.rear;
    const fx = f.reachMm * Math.cos(rad(f.angleDeg));
    const fy = f.reachMm * Math.sin(rad(f.angleDeg));
    const rx = r.reachMm * Math.cos(rad(r.angleDeg));
    const ry = r.reachMm * Math.sin(rad(r.angleDeg));
    return { fl: [fx, fy], fr: [fx, -fy], rl: [-rx, ry], rr: [-rx, -ry] };
  }
  const a = rad(layout.armAngleDeg ?? 45);
  const h = layout.wheelbaseMm / 2;
  const x = h * Math.cos(a);
  const y = h * Math.sin(a);
  return { fl: [x, y], fr: [x, -y], rl: [-x, y], rr: [-x, -y] };
}

/** Smallest adjacent prop tip gap, g = |ri − rj| − P (domain.md), from raw design data. mm. */
export function adjacentGapFromRaw(layout: any, propMm: number): number {
  const m = motorsFromRaw(layout);
  const d = (p: Pt, q: Pt) => Math.hypot(p[0] - q[0], p[1] - q[1]);
  return Math.min(d(m.fl, m.fr), d(m.fl, m.rl), d(m.fr, m.rr), d(m.rl, m.rr)) - propMm;
}

/** Inches or mm text → mm, written out here rather than taken from src/params (1 in = 25.4 mm exactly). */
export function propMmFromRaw(v: string | number): number {
  if (typeof v === 'number') return v;
  const m = /^\s*([0-9.]+)\s*(in|mm)?\s*$/.exec(v)!;
  return m[2] === 'mm' ? Number(m[1]) : Number(m[1]) * 25.4;
}

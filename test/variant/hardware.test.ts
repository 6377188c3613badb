import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import type { Frame } from '../../src/geometry/frame.js';
import { loopBBox } from '../../src/geometry/loop.js';
import type { Feature, FeaturePurpose } from '../../src/geometry/part.js';
import type { Loop } from '../../src/geometry/types.js';
import { fmt } from '../../src/export/format.js';
import { makeVariant } from '../../src/variant/index.js';
import { demoText } from './helpers.js';

// Hardware that must not scale (domain.md "New size from an existing design"): bolt sizes, motor
// circle, stack squares, camera width, strap width.
const HARDWARE: FeaturePurpose[] = ['motor-bolt', 'motor-bore', 'stack-bolt', 'standoff', 'arm-root-bolt', 'camera-pivot', 'camera-tilt-slot', 'camera-mount', 'strap-slot', 'accessory'];

const centre = (l: Loop): [number, number] => {
  const b = loopBBox(l);
  return [(b[0] + b[2]) / 2, (b[1] + b[3]) / 2];
};

/** A feature's shape with its position taken out, as text: equal text = byte-identical hole or slot. */
function shape(f: Feature): string {
  const [cx, cy] = centre(f.loop);
  const n = (x: number) => fmt(x, 6);
  return f.loop
    .map((s) => (s.kind === 'line' ? `L ${n(s.start[0] - cx)} ${n(s.start[1] - cy)} ${n(s.end[0] - cx)} ${n(s.end[1] - cy)}` : `A ${n(s.center[0] - cx)} ${n(s.center[1] - cy)} ${n(s.radius)} ${n(s.startRad)} ${n(s.sweepRad)}`))
    .join(';');
}

function shapes(frame: Frame, purpose: FeaturePurpose): string[] {
  return frame.parts.flatMap((p) => p.features.filter((f) => f.purpose === purpose).map(shape)).sort();
}

/** Motor bolt positions relative to the motor bore, for every motor on every part. */
function motorPatterns(frame: Frame): string[] {
  const out: string[] = [];
  for (const p of frame.parts) {
    for (const bore of p.features.filter((f) => f.purpose === 'motor-bore')) {
      const c = bore.centerMm!;
      const bolts = p.features.filter((f) => f.purpose === 'motor-bolt').map((f) => centre(f.loop)).filter((q) => Math.hypot(q[0] - c[0], q[1] - c[1]) < 20);
      out.push(bolts.map((q) => `${fmt(q[0] - c[0], 6)},${fmt(q[1] - c[1], 6)}`).sort().join(' '));
    }
  }
  return out.sort();
}

/** Stack squares: every pairwise distance between the stack bolts of one pattern size. */
function stackSquares(frame: Frame): string[] {
  const bottom = frame.parts.find((p) => p.role === 'bottom')!;
  const pts = bottom.features.filter((f) => f.purpose === 'stack-bolt').map((f) => ({ c: f.centerMm!, d: f.diameterMm! }));
  const out: string[] = [];
  for (let i = 0; i < pts.length; i++) for (let j = i + 1; j < pts.length; j++) out.push(`${fmt(pts[i].d, 6)}-${fmt(pts[j].d, 6)}:${fmt(Math.hypot(pts[i].c[0] - pts[j].c[0], pts[i].c[1] - pts[j].c[1]), 6)}`);
  return out.sort();
}

/** Gap between the two camera side plates (the camera width): from their placements. */
function cameraGap(frame: Frame): string {
  const side = frame.parts.find((p) => p.role === 'camera-side');
  if (!side) return 'none';
  const ys = side.placements.map((pl) => pl.translateMm[1]).sort((a, b) => a - b);
  return fmt(ys[1] - ys[0] - side.thicknessMm, 6);
}

const CASES: Array<[string, string]> = [
  ['tessel-5', '7in'],
  ['tessel-5', '4in'],
  ['farline-7', '6in'],
  ['mote-3', '4in'],
];

// ISO 273 medium series clearance holes (reference-values.md), written out here.
const ISO273_MEDIUM: Record<string, number> = { M2: 2.4, 'M2.5': 2.9, M3: 3.4 };

/** Motor bolt holes: every round one has the ISO 273 clearance of the file's bolt and sits on one of the file's circles. */
function motorHolesMatch(frame: Frame, raw: any): void {
  let n = 0;
  for (const p of frame.parts) {
    for (const bore of p.features.filter((f) => f.purpose === 'motor-bore')) {
      const c = bore.centerMm!;
      for (const f of p.features.filter((x) => x.purpose === 'motor-bolt' && x.centerMm && Math.hypot(x.centerMm[0] - c[0], x.centerMm[1] - c[1]) < 20)) {
        expect(f.diameterMm).toBeCloseTo(ISO273_MEDIUM[raw.motor.boltSize], 12);
        const r = 2 * Math.hypot(f.centerMm![0] - c[0], f.centerMm![1] - c[1]);
        expect(raw.motor.boltCircleMm.some((d: number) => Math.abs(d - r) < 1e-9)).toBe(true);
        n++;
      }
    }
  }
  expect(n).toBeGreaterThan(0);
}

describe('hardware does not scale', () => {
  for (const [demo, props] of CASES) {
    it(`${demo} → ${props}: holes, squares, slots and camera width byte-identical; motor holes as the motor class says`, () => {
      const v = makeVariant(demoText(demo), { props });
      for (const purpose of HARDWARE.filter((p) => !p.startsWith('motor'))) expect(shapes(v.frame, purpose), purpose).toEqual(shapes(v.sourceFrame, purpose));
      expect(stackSquares(v.frame)).toEqual(stackSquares(v.sourceFrame));
      expect(cameraGap(v.frame)).toBe(cameraGap(v.sourceFrame));
      const a = YAML.parse(demoText(demo));
      const b = YAML.parse(v.text);
      motorHolesMatch(v.frame, b);
      // a motor mount the new class already takes keeps its holes exactly
      if (JSON.stringify(a.motor.boltCircleMm) === JSON.stringify(b.motor.boltCircleMm) && a.motor.boltSize === b.motor.boltSize && !!a.motor.slotted === !!b.motor.slotted) {
        expect(motorPatterns(v.frame)).toEqual(motorPatterns(v.sourceFrame));
      }
      // and in the file: the hardware sections are the same values
      expect(b.stacks).toEqual(a.stacks);
      expect(b.camera).toEqual(a.camera);
      if (a.arms.root) for (const k of ['boltCount', 'boltSpacingMm', 'boltSize', 'edgeMarginMm']) expect(b.arms.root[k]).toEqual(a.arms.root[k]);
      expect(b.body.standoffs).toEqual(a.body.standoffs);
      expect(b.topPlate.strapSlots).toEqual(a.topPlate.strapSlots);
    });
  }

  it('a named motor class swaps only the motor pattern (motor table, domain.md common practice)', () => {
    const v = makeVariant(demoText('tessel-5'), { props: '3in', motor: '1404' });
    // domain.md: 12xx–18xx motors take 9 or 12 mm circles with M2; a one-circle design gets one circle
    const raw = YAML.parse(v.text);
    expect(raw.motor.boltSize).toBe('M2');
    expect([9, 12]).toContain(raw.motor.boltCircleMm[0]);
    expect(raw.motor.boltCircleMm).toHaveLength(1);
    expect(shapes(v.frame, 'motor-bolt')).not.toEqual(shapes(v.sourceFrame, 'motor-bolt'));
    for (const purpose of HARDWARE.filter((p) => !p.startsWith('motor'))) expect(shapes(v.frame, purpose), purpose).toEqual(shapes(v.sourceFrame, purpose));
  });
});

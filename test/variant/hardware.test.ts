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

describe('hardware does not scale', () => {
  for (const [demo, props] of CASES) {
    it(`${demo} → ${props}: holes, circles, squares, slots and camera width byte-identical`, () => {
      const v = makeVariant(demoText(demo), { props });
      for (const purpose of HARDWARE) expect(shapes(v.frame, purpose), purpose).toEqual(shapes(v.sourceFrame, purpose));
      expect(motorPatterns(v.frame)).toEqual(motorPatterns(v.sourceFrame));
      expect(motorPatterns(v.frame).length).toBeGreaterThan(0);
      expect(stackSquares(v.frame)).toEqual(stackSquares(v.sourceFrame));
      expect(cameraGap(v.frame)).toBe(cameraGap(v.sourceFrame));
      // and in the file: the hardware sections are the same values
      const a = YAML.parse(demoText(demo));
      const b = YAML.parse(v.text);
      expect(b.motor).toEqual(a.motor);
      expect(b.stacks).toEqual(a.stacks);
      expect(b.camera).toEqual(a.camera);
      expect(b.arms.root).toEqual(a.arms.root);
      expect(b.body.standoffs.boltSize).toEqual(a.body.standoffs.boltSize);
      expect(b.body.standoffs.heightMm).toEqual(a.body.standoffs.heightMm);
      expect(b.topPlate.strapSlots.strapWidthMm).toEqual(a.topPlate.strapSlots.strapWidthMm);
    });
  }

  it('a motor class change swaps only the motor pattern (motor table, domain.md common practice)', () => {
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

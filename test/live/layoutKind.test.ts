import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { motorSites, wheelbaseOf } from '../../src/geometry/layout.js';
import { parseDesignText } from '../../src/params/design.js';
import { convertLayoutKind } from '../../src/live/layoutKind.js';
import { editDesignText, setDesignValues } from '../../src/variant/changes.js';
import { demoText } from '../helpers/demo.js';

/** A kind change from the page, applied as the live session applies it. */
function switchKind(text: string, kind: string): string {
  return editDesignText(text, convertLayoutKind([{ path: ['layout', 'kind'], old: null, new: kind, why: 'page' }], YAML.parse(text)));
}

/** Motor centres, and the hand formula for a rectangle: (±W/2 cos θ, ±W/2 sin θ). */
const motors = (text: string) => motorSites(parseDesignText(text)).map((s) => s.motorMm);

describe('changing layout.kind keeps the frame where it was', () => {
  it('x → asymmetric: every motor stays put (to the 0.1 mm the file is written in)', () => {
    const src = setDesignValues(demoText('tessel-5.yaml'), { 'layout.wheelbaseMm': 224, 'layout.armAngleDeg': 45 });
    const out = switchKind(src, 'asymmetric');
    expect(YAML.parse(out).layout).toEqual({ kind: 'asymmetric', front: { reachMm: 112, angleDeg: 45 }, rear: { reachMm: 112, angleDeg: 45 } });
    const a = motors(src);
    const b = motors(out);
    const r = 224 / 2;
    const c = r * Math.cos(Math.PI / 4);
    for (const [i, p] of b.entries()) {
      expect(p[0]).toBeCloseTo(a[i][0], 6);
      expect(p[1]).toBeCloseTo(a[i][1], 6);
      expect(Math.abs(p[0])).toBeCloseTo(c, 6); // hand geometry
    }
    // Nothing else in the file moved: the header comment and the other sections are as they were.
    expect(out.split('layout:')[0]).toBe(src.split('layout:')[0]);
    expect(out.slice(out.indexOf('props:'))).toBe(src.slice(src.indexOf('props:')));
  });

  it('asymmetric → x: the wheelbase (front-left to rear-right) and its direction are kept', () => {
    const src = demoText('farline-7.yaml');
    const asym = switchKind(src, 'asymmetric');
    const edited = asym.replace(/front: \{ reachMm: [\d.]+, angleDeg: [\d.]+ \}/, 'front: { reachMm: 140, angleDeg: 55 }');
    const d = parseDesignText(edited);
    const back = switchKind(edited, 'x');
    const layout = YAML.parse(back).layout;
    expect(layout.kind).toBe('x');
    expect(layout.front).toBeUndefined();
    // By hand: FL = 140 (cos 55°, sin 55°); RR = −r (cos θr, sin θr); W = |FL − RR|, angle = atan2.
    const rear = d.layout.kind === 'asymmetric' ? d.layout.rear : null;
    const dx = 140 * Math.cos((55 * Math.PI) / 180) + rear!.reachMm * Math.cos((rear!.angleDeg * Math.PI) / 180);
    const dy = 140 * Math.sin((55 * Math.PI) / 180) + rear!.reachMm * Math.sin((rear!.angleDeg * Math.PI) / 180);
    expect(layout.wheelbaseMm).toBeCloseTo(Math.hypot(dx, dy), 1);
    expect(layout.armAngleDeg).toBeCloseTo((Math.atan2(dy, dx) * 180) / Math.PI, 1);
    expect(wheelbaseOf(motorSites(parseDesignText(back)))).toBeCloseTo(wheelbaseOf(motorSites(d)), 0);
  });

  it('x → h keeps wheelbase and angle (the same motor rectangle), its arms starting at the centre; h → x drops the starts', () => {
    const src = demoText('tessel-5.yaml');
    const out = switchKind(src, 'h');
    expect(YAML.parse(out).layout).toEqual({ ...YAML.parse(src).layout, kind: 'h', frontArmStartMm: [0, 0], rearArmStartMm: [0, 0] });
    // the same motors, the same arm lines (from the centre to each motor)
    const a = motorSites(parseDesignText(src));
    motorSites(parseDesignText(out)).forEach((s, i) => {
      expect(s.motorMm[0]).toBeCloseTo(a[i].motorMm[0], 9);
      expect(s.armDirRad).toBeCloseTo(a[i].armDirRad, 9);
    });
    expect(YAML.parse(switchKind(out, 'x')).layout).toEqual(YAML.parse(src).layout);
  });
});

import { describe, expect, it } from 'vitest';
import {
  buildFrame,
  flattenLoop,
  loopProblem,
  motorSites,
  partArea,
  signedArea,
  wheelbaseOf,
  type Part,
} from '../../src/geometry/index.js';
import { clearanceHoleMm, DesignError, validateDesign, type HoleSeries } from '../../src/params/index.js';
import { DEMO_FILES, demoFrame, designWith } from '../helpers/demo.js';
import { pythonModuleAvailable, requireTool, runPythonJson } from '../helpers/reference.js';

const dist = (a: readonly number[], b: readonly number[]) => Math.hypot(a[0] - b[0], a[1] - b[1]);

describe('every demo design builds into valid parts', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: every contour closed and simple, outer CCW, holes CW, holes inside`, () => {
      const frame = demoFrame(file);
      expect(frame.parts.length).toBeGreaterThanOrEqual(3);
      for (const p of frame.parts) {
        expect(loopProblem(p.outline), p.name).toBeNull();
        expect(signedArea(p.outline)).toBeGreaterThan(0);
        for (const f of p.features) {
          expect(loopProblem(f.loop)).toBeNull();
          expect(signedArea(f.loop)).toBeLessThan(0);
        }
        expect(partArea(p)).toBeGreaterThan(0);
      }
    });
  }

  it('outlines are valid polygons with the same area for Shapely (independent library)', () => {
    if (!requireTool(pythonModuleAvailable('shapely'), 'python3-shapely')) return;
    const parts: Part[] = DEMO_FILES.flatMap((f) => demoFrame(f).parts);
    const polygons = parts.map((p) => ({
      shell: flattenLoop(p.outline, 0.0005),
      holes: p.features.map((f) => flattenLoop(f.loop, 0.0005)),
    }));
    const res = runPythonJson<{ polygons: { valid: boolean; reason: string; area: number }[] }>('test/reference/shapely_polygons.py', { polygons });
    res.polygons.forEach((r, i) => {
      expect(r.valid, `${parts[i].name}: ${r.reason}`).toBe(true);
      // exact (arc) area vs polygon area: chord error 0.0005 mm keeps the difference far below 0.01 %
      expect(Math.abs(r.area - partArea(parts[i])) / partArea(parts[i])).toBeLessThan(1e-4);
    });
  });
});

describe('layout: motors where the design says', () => {
  it('true X: motor centres exactly on the wheelbase circle, square', () => {
    const frame = demoFrame('tessel-5.yaml');
    const wb = (frame.design.layout as { wheelbaseMm: number }).wheelbaseMm;
    expect(wheelbaseOf(frame.sites)).toBeCloseTo(wb, 9);
    for (const s of frame.sites) expect(Math.hypot(...s.motorMm)).toBeCloseTo(wb / 2, 9);
    const fr = frame.sites.find((s) => s.id === 'front-right')!;
    const fl = frame.sites.find((s) => s.id === 'front-left')!;
    const rr = frame.sites.find((s) => s.id === 'rear-right')!;
    expect(dist(fr.motorMm, fl.motorMm)).toBeCloseTo(dist(fr.motorMm, rr.motorMm), 9);
  });

  it('square X 220 mm with 5-inch props: adjacent tip gap 220/√2 − 127 = 28.6 mm', () => {
    // reference-values.md, trade facts [CALC]; 5 in = 127.0 mm (international inch)
    const d = validateDesign(designWith('tessel-5.yaml', { layout: { kind: 'x', wheelbaseMm: 220, armAngleDeg: 45 }, props: { diameter: '5in' } }));
    expect(d.props.diameterMm).toBe(127);
    const sites = motorSites(d);
    const fr = sites.find((s) => s.id === 'front-right')!;
    const fl = sites.find((s) => s.id === 'front-left')!;
    expect(dist(fr.motorMm, fl.motorMm) - d.props.diameterMm).toBeCloseTo(28.56, 2);
  });

  it('stretched X (arm angle below 45°) spaces motors further front to rear than side to side; H arms run from their starts', () => {
    const d = validateDesign(designWith('farline-7.yaml', {}));
    const s = motorSites(d);
    const fr = s.find((x) => x.id === 'front-right')!;
    const rr = s.find((x) => x.id === 'rear-right')!;
    const fl = s.find((x) => x.id === 'front-left')!;
    // 320 mm diagonal at 40°: front–rear 320 cos 40°, side–side 320 sin 40° (trigonometry)
    expect(dist(fr.motorMm, rr.motorMm)).toBeCloseTo(320 * Math.cos((40 * Math.PI) / 180), 9);
    expect(dist(fr.motorMm, fl.motorMm)).toBeCloseTo(320 * Math.sin((40 * Math.PI) / 180), 9);
    // H with its arm starts level with the motors (y = 160 sin 40°): every arm runs fore and aft
    const y = 160 * Math.sin((40 * Math.PI) / 180);
    const level = motorSites(validateDesign(designWith('farline-7.yaml', { layout: { kind: 'h', wheelbaseMm: 320, armAngleDeg: 40, frontArmStartMm: [40, y], rearArmStartMm: [-40, y] }, body: { widthMm: 2 * y + 10 } })));
    for (const site of level) {
      expect(Math.abs(Math.sin(site.armDirRad))).toBeLessThan(1e-12);
      expect(site.motorAlongMm).toBeCloseTo(160 * Math.cos((40 * Math.PI) / 180) - 40, 9);
    }
    // starts on a narrow body: each arm runs from its start (mirrored in y on the right) to its motor
    const narrow = motorSites(validateDesign(designWith('farline-7.yaml', { layout: { kind: 'h', wheelbaseMm: 320, armAngleDeg: 40, frontArmStartMm: [50, 20], rearArmStartMm: [-45, 18] } })));
    const hfr = narrow.find((x) => x.id === 'front-right')!;
    expect(hfr.armLineOriginMm).toEqual([50, -20]);
    const [mx, my] = hfr.motorMm;
    expect(hfr.armDirRad).toBeCloseTo(Math.atan2(my + 20, mx - 50), 12);
    expect(hfr.motorAlongMm).toBeCloseTo(Math.hypot(mx - 50, my + 20), 12);
  });

  it('asymmetric layout: front and rear reach and angle as given, two arm parts', () => {
    const raw = designWith('tessel-5.yaml', { layout: { kind: 'asymmetric', front: { reachMm: 105, angleDeg: 55 }, rear: { reachMm: 120, angleDeg: 40 } } });
    delete (raw.layout as Record<string, unknown>).wheelbaseMm;
    delete (raw.layout as Record<string, unknown>).armAngleDeg;
    const frame = buildFrame(validateDesign(raw));
    const fl = frame.sites.find((s) => s.id === 'front-left')!;
    expect(Math.hypot(...fl.motorMm)).toBeCloseTo(105, 9);
    expect(Math.atan2(fl.motorMm[1], fl.motorMm[0])).toBeCloseTo((55 * Math.PI) / 180, 12);
    const armNames = frame.parts.filter((p) => p.role === 'arm').map((p) => `${p.name}×${p.quantity}`);
    expect(armNames.sort()).toEqual(['arm-front×2', 'arm-rear×2']);
  });
});

describe('other layouts and arm styles build', () => {
  it('H layout: arms start along a long body of its own width, motors where the layout puts them', () => {
    const raw = designWith('tessel-5.yaml', {
      layout: { kind: 'h', wheelbaseMm: 260, armAngleDeg: 30, frontArmStartMm: [40, 16], rearArmStartMm: [-40, 16] },
      body: { lengthMm: 150, widthMm: 44 },
      arms: { root: { reachMm: 12 } },
      camera: { forwardOffsetMm: 6 },
    });
    const frame = buildFrame(validateDesign(raw));
    for (const p of frame.parts) expect(loopProblem(p.outline)).toBeNull();
    const arm = frame.parts.find((p) => p.role === 'arm')!;
    expect(arm.quantity).toBe(4);
    // 260 mm diagonal at 30°: motors at x = ±130 cos 30°, y = ±65 (trigonometry), though the body is 44 mm wide
    for (const s of frame.sites) {
      expect(Math.abs(s.motorMm[0])).toBeCloseTo(130 * Math.cos(Math.PI / 6), 9);
      expect(Math.abs(s.motorMm[1])).toBeCloseTo(65, 9);
    }
    // every arm copy's root end lies on the body plate's outline region (|x| ≤ 75, |y| ≤ 22)
    for (const pl of arm.placements) {
      expect(Math.abs(pl.translateMm[0])).toBeLessThanOrEqual(75);
      expect(Math.abs(pl.translateMm[1])).toBeLessThanOrEqual(22);
    }
  });
  it('straight, tapered and guarded arms build; an H arm start off the body is refused naming it', () => {
    for (const arms of [{ style: 'straight', widthMm: 12, truss: undefined }, { style: 'tapered', widthMm: 12, tipWidthMm: 10, truss: undefined }, { tipGuardMm: 4 }]) {
      const f = buildFrame(validateDesign(designWith('tessel-5.yaml', { arms })));
      for (const p of f.parts) expect(loopProblem(p.outline)).toBeNull();
    }
    expect(() => validateDesign(designWith('farline-7.yaml', { layout: { kind: 'h', wheelbaseMm: 320, armAngleDeg: 40, frontArmStartMm: [50, 40], rearArmStartMm: [-50, 20] } }))).toThrow(/layout\.frontArmStartMm: \[50,40\] must lie on the body \(\|x\| ≤ 75 mm, \|y\| ≤ 28 mm/);
  });
});

describe('hardware does what the trade expects', () => {
  const series: HoleSeries[] = ['fine', 'medium', 'coarse'];
  // ISO 273 clearance holes, fine / medium / coarse series
  const iso273: Record<string, [number, number, number]> = { M2: [2.2, 2.4, 2.6], 'M2.5': [2.7, 2.9, 3.1], M3: [3.2, 3.4, 3.6] };
  for (const s of series) {
    it(`ISO 273 ${s} series: M2, M2.5 and M3 holes as built`, () => {
      const frame = buildFrame(
        validateDesign(
          designWith('tessel-5.yaml', {
            cutting: { toolDiameterMm: 3.175, holeSeries: s },
            stacks: [{ place: 'middle', patternsMm: [30.5, 25.5, 20], boltSize: ['M3', 'M2.5', 'M2'] }],
          }),
        ),
      );
      const bottom = frame.parts.find((p) => p.name === 'bottom-plate')!;
      const stack = bottom.features.filter((f) => f.purpose === 'stack-bolt');
      const idx = series.indexOf(s);
      for (const screw of ['M2', 'M2.5', 'M3'] as const) {
        const holes = stack.filter((f) => f.screw === screw);
        expect(holes).toHaveLength(4);
        for (const h of holes) expect(h.diameterMm).toBe(iso273[screw][idx]);
        expect(clearanceHoleMm(screw, s)).toBe(iso273[screw][idx]);
      }
    });
  }

  it('stack squares have the pattern side between neighbouring holes; motor holes sit on the bolt circle', () => {
    // 30.5 × 30.5 and 20 × 20 stack squares, 16 mm motor bolt circle: common practice, no source
    const frame = demoFrame('tessel-5.yaml');
    const bottom = frame.parts.find((p) => p.name === 'bottom-plate')!;
    const m3 = bottom.features.filter((f) => f.purpose === 'stack-bolt' && f.screw === 'M3').map((f) => f.centerMm!);
    const sides = m3.map((p, i) => dist(p, m3[(i + 1) % 4]));
    for (const s of sides) expect(s).toBeCloseTo(30.5, 9);
    const arm = frame.parts.find((p) => p.role === 'arm')!;
    const bore = arm.features.find((f) => f.purpose === 'motor-bore')!;
    const bolts = arm.features.filter((f) => f.purpose === 'motor-bolt');
    expect(bolts).toHaveLength(4);
    for (const b of bolts) expect(dist(b.centerMm!, bore.centerMm!)).toBeCloseTo(8, 9);
  });

  it('16×19 pattern: one opposite pair 16 mm apart, the other 19 mm; slotted holes span both circles', () => {
    const round = buildFrame(validateDesign(designWith('farline-7.yaml', { motor: { slotted: false } })));
    const bolts = round.parts.find((p) => p.role === 'arm')!.features.filter((f) => f.purpose === 'motor-bolt').map((f) => f.centerMm!);
    // bolts at 45°, 135°, 225°, 315°: pairs (0, 2) and (1, 3) are opposite
    expect(dist(bolts[0], bolts[2])).toBeCloseTo(16, 9);
    expect(dist(bolts[1], bolts[3])).toBeCloseTo(19, 9);
    const slotted = demoFrame('farline-7.yaml').parts.find((p) => p.role === 'arm')!;
    expect(slotted.features.filter((f) => f.purpose === 'motor-bolt' && f.kind === 'slot')).toHaveLength(4);
  });

  it('three motor bolts leave out one hole', () => {
    const f = buildFrame(validateDesign(designWith('tessel-5.yaml', { motor: { boltCount: 3 } })));
    expect(f.parts.find((p) => p.role === 'arm')!.features.filter((x) => x.purpose === 'motor-bolt')).toHaveLength(3);
  });

  it('symmetric X: one arm part, quantity 4; unibody: the arms are part of the bottom plate', () => {
    const t = demoFrame('tessel-5.yaml');
    expect(t.parts.filter((p) => p.role === 'arm').map((p) => p.quantity)).toEqual([4]);
    const m = demoFrame('mote-3.yaml');
    expect(m.parts.some((p) => p.role === 'arm')).toBe(false);
    const bottom = m.parts.find((p) => p.role === 'bottom')!;
    expect(bottom.features.filter((f) => f.purpose === 'motor-bolt')).toHaveLength(16);
    expect(bottom.members).toHaveLength(4);
  });

  it('truss arms have open windows between the struts', () => {
    const arm = demoFrame('tessel-5.yaml').parts.find((p) => p.role === 'arm')!;
    expect(arm.features.filter((f) => f.purpose === 'truss-window').length).toBeGreaterThanOrEqual(1);
    expect(arm.members.map((m) => m.name)).toEqual(['main strut', 'secondary strut']);
  });
});

describe('bad designs are refused with the parameter named', () => {
  it('a stack pattern too big for the body names stacks.0.patternsMm', () => {
    expect(() => buildFrame(validateDesign(designWith('tessel-5.yaml', { stacks: [{ place: 'front', patternsMm: [50], boltSize: 'M3' }], components: undefined })))).toThrowError(
      /stacks\.0\.patternsMm/,
    );
  });
  it('a negative arm width names arms.widthMm and the allowed range', () => {
    try {
      validateDesign(designWith('tessel-5.yaml', { arms: { widthMm: -3 } }));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DesignError);
      expect((e as Error).message).toMatch(/arms\.widthMm: -3 is below the allowed range 4 to 60 mm/);
    }
  });
  it('a missing wheelbase is reported as missing', () => {
    const raw = designWith('tessel-5.yaml', {});
    delete (raw.layout as Record<string, unknown>).wheelbaseMm;
    expect(() => validateDesign(raw)).toThrowError(/layout\.wheelbaseMm: \(missing\) is required/);
  });
  it('prop diameters accept inches and millimetres', () => {
    expect(validateDesign(designWith('tessel-5.yaml', { props: { diameter: '5.1in' } })).props.diameterMm).toBeCloseTo(129.54, 12);
    expect(validateDesign(designWith('tessel-5.yaml', { props: { diameter: 130 } })).props.diameterMm).toBe(130);
    expect(() => validateDesign(designWith('tessel-5.yaml', { props: { diameter: '5 furlongs' } }))).toThrowError(/props\.diameter/);
  });
});

describe('countersunk stack holes', () => {
  it('carry the flush-head diameter of the screw (ISO 10642 M3 dk 6.72)', () => {
    const bottom = demoFrame('farline-7.yaml').parts.find((p) => p.role === 'bottom')!;
    const sunk = bottom.features.filter((f) => f.countersink);
    expect(sunk).toHaveLength(4);
    // ISO 10642, M3 countersunk head: dk (theoretical) 6.72 mm
    for (const f of sunk) expect(f.countersink).toEqual({ headDiameterMm: 6.72, face: 'bottom' });
  });
});

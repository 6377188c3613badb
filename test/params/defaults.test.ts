import { describe, expect, it } from 'vitest';
import { checkFrame } from '../../src/checks/index.js';
import { buildFrame } from '../../src/geometry/frame.js';
import { DesignError } from '../../src/params/errors.js';
import { validateDesign } from '../../src/params/design.js';

// ISO 273 clearance holes, medium series (reference-values.md), written out here.
const ISO273_MEDIUM = { M2: 2.4, M3: 3.4 };
// The hole-edge rule's default warning level e/D (checks schema; Polymers 2024, 16(6), 847).
const WARN_E_OVER_D = 2.0;
const EIGHTH_INCH = 25.4 / 8;

/** Only the required fields of a 5-inch X frame with separate straight arms: typical values a designer would type. */
const minimalSeparate = () => ({
  name: 'Bare 5',
  layout: { kind: 'x', wheelbaseMm: 245 },
  props: { diameter: '5in' },
  motor: { boltCircleMm: [16] },
  arms: { widthMm: 14, thicknessMm: 5, root: { boltCount: 2, boltSpacingMm: 12, reachMm: 32 } },
  body: { lengthMm: 110, widthMm: 46, standoffs: { positionsMm: [[45, 16], [45, -16], [-45, 16], [-45, -16]] } },
});

/** Only the required fields of a 3-inch unibody X frame on a 9 mm M2 motor pattern. */
const minimalUnibody = () => ({
  name: 'Bare 3',
  layout: { kind: 'x', wheelbaseMm: 165 },
  props: { diameter: '3in' },
  motor: { boltCircleMm: [9], boltSize: 'M2' },
  arms: { construction: 'unibody', widthMm: 10 },
  body: { lengthMm: 70, widthMm: 40, thicknessMm: 3, standoffs: { positionsMm: [[28, 13], [28, -13], [-28, 13], [-28, -13]] } },
});

const errorsOf = (raw: unknown) => checkFrame(buildFrame(validateDesign(raw))).findings.filter((f) => f.severity === 'error');

describe('a design with only the required fields passes its own checks', () => {
  it('separate arms (X)', () => {
    expect(errorsOf(minimalSeparate())).toEqual([]);
  });
  it('unibody arms (X), no root section', () => {
    expect(errorsOf(minimalUnibody())).toEqual([]);
  });
  it('H: arms starting on a long, narrow body', () => {
    const raw = { ...minimalSeparate(), layout: { kind: 'h', wheelbaseMm: 300, armAngleDeg: 30, frontArmStartMm: [60, 16], rearArmStartMm: [-60, 16] }, body: { lengthMm: 150, widthMm: 44, standoffs: { positionsMm: [[45, 15], [45, -15], [-45, 15], [-45, -15]] } }, arms: { widthMm: 14, thicknessMm: 5, root: { boltCount: 2, boltSpacingMm: 12, reachMm: 8 } } };
    expect(errorsOf(raw)).toEqual([]);
  });
  it('with a camera whose pivot is an M2 bolt cut by a 1/8" bit', () => {
    const raw = { ...minimalSeparate(), camera: { forwardOffsetMm: 8, pivotHeightMm: 15, tiltSlotRadiusMm: 7, plateMarginMm: 3.5 } };
    expect(errorsOf(raw)).toEqual([]);
  });
});

describe('defaults derive from each other', () => {
  it('root edge margin: the hole-edge warning e/D times the ISO 273 hole, up to 0.5 mm', () => {
    const d = validateDesign(minimalSeparate());
    if (d.arms.construction !== 'separate') throw new Error('separate expected');
    // 2.0 × 3.4 = 6.8 → 7 (M3); 2.0 × 2.4 = 4.8 → 5 (M2)
    expect(d.arms.root.edgeMarginMm).toBe(Math.ceil((WARN_E_OVER_D * ISO273_MEDIUM.M3) / 0.5) * 0.5);
    const m2 = validateDesign({ ...minimalSeparate(), arms: { ...minimalSeparate().arms, root: { ...minimalSeparate().arms.root, boltSize: 'M2' } } });
    if (m2.arms.construction !== 'separate') throw new Error('separate expected');
    expect(m2.arms.root.edgeMarginMm).toBe(5);
    // and it follows the design's own rule level
    const strict = validateDesign({ ...minimalSeparate(), checks: { 'hole-edge-distance': { warnEdgeRatio: 3 } } });
    if (strict.arms.construction !== 'separate') throw new Error('separate expected');
    expect(strict.arms.root.edgeMarginMm).toBe(10.5); // 3 × 3.4 = 10.2 → 10.5
  });

  it('tip pad: the motor holes sit at the warning e/D from the pad edge', () => {
    const d = validateDesign(minimalSeparate());
    // e = D/2 + margin ≥ 2.0 D → margin = 2.0 × 3.4 − 1.7 = 5.1 → 5.5
    expect(d.arms.tipPadMarginMm).toBe(5.5);
    expect(d.arms.tipPadMarginMm + ISO273_MEDIUM.M3 / 2).toBeGreaterThanOrEqual(WARN_E_OVER_D * ISO273_MEDIUM.M3);
  });

  it('slots are cut wider than the bit: strap slots and an M2 camera tilt slot', () => {
    const d = validateDesign({ ...minimalSeparate(), camera: { forwardOffsetMm: 8, pivotHeightMm: 15, pivotBoltSize: 'M2' } });
    // 1/8" bit (3.175 mm) + 0.2 mm, up to 0.1 mm: 3.4 mm; an M2 clearance hole (2.4 mm) could not be cut
    expect(d.topPlate.strapSlots.slotWidthMm).toBeCloseTo(3.4, 9);
    expect(d.camera!.tiltSlotWidthMm).toBeCloseTo(3.4, 9);
    expect(d.camera!.tiltSlotWidthMm).toBeGreaterThan(EIGHTH_INCH);
    // a 2 mm bit: the strap needs 3 mm anyway; the M2 slot is its clearance hole (2.4 ≥ 2.2)
    const small = validateDesign({ ...minimalSeparate(), cutting: { toolDiameterMm: 2 }, camera: { forwardOffsetMm: 8, pivotHeightMm: 15, pivotBoltSize: 'M2' } });
    expect(small.topPlate.strapSlots.slotWidthMm).toBe(3);
    expect(small.camera!.tiltSlotWidthMm).toBeCloseTo(ISO273_MEDIUM.M2, 9);
    // a 6 mm bit: 6.2 mm slots
    expect(validateDesign({ ...minimalSeparate(), cutting: { toolDiameterMm: 6 } }).topPlate.strapSlots.slotWidthMm).toBeCloseTo(6.2, 9);
    // the bit-reach rule finds nothing to say about the tilt slot
    const findings = checkFrame(buildFrame(d)).findings.filter((f) => f.rule === 'bit-reach' && /tilt-slot/.test(f.message));
    expect(findings).toEqual([]);
  });

  it('motor bore and bell from the motor table for the pattern; a 9 mm circle gets no 7 mm bore', () => {
    const u = validateDesign(minimalUnibody());
    // 9 mm circle, M2 (2.4 mm holes): 9 − 2.4 − 2 × (1.5 × 1.25) = 2.85 → 2.5 mm leaves the web rule's warning web
    expect(u.motor.boreMm).toBe(2.5);
    expect(u.motor.boreMm / 2 + ISO273_MEDIUM.M2 / 2).toBeLessThan(9 / 2);
    expect(u.motor.bellDiameterMm).toBe(14);
    const s = validateDesign(minimalSeparate());
    expect(s.motor.boreMm).toBe(7); // the 20xx-24xx class bore; 16 − 3.4 − 2 × (2.0 × 1.25) = 7.6 leaves room
    expect(s.motor.bellDiameterMm).toBe(28);
    expect(errorsOf(minimalUnibody()).filter((f) => f.rule === 'web-width')).toEqual([]);
  });
});

describe('parameters that do not apply to the construction are refused, not ignored', () => {
  const refused = (arms: Record<string, unknown>): DesignError => {
    try {
      validateDesign({ ...minimalUnibody(), arms: { ...minimalUnibody().arms, ...arms } });
    } catch (e) {
      if (e instanceof DesignError) return e;
      throw e;
    }
    throw new Error('not refused');
  };
  it('a unibody design refuses arms.thicknessMm, naming the field to set instead', () => {
    const e = refused({ thicknessMm: 4 });
    expect(e.message).toMatch(/^arms\.thicknessMm: 4 does not apply to unibody arms \(unibody arms are cut from the bottom plate: set body\.thicknessMm\); remove it$/m);
  });
  it('a unibody design refuses a root section, material and weave of its own', () => {
    expect(refused({ root: { boltCount: 1, boltSpacingMm: 10, reachMm: 20 } }).message).toMatch(/arms\.root: .* does not apply to unibody arms \(unibody arms have no root bolts/);
    expect(refused({ weaveDeg: 45 }).message).toMatch(/arms\.weaveDeg: 45 does not apply to unibody arms \(.*set body\.weaveDeg\)/);
    expect(refused({ material: 'woven-cf' }).message).toMatch(/arms\.material: "woven-cf" does not apply to unibody arms/);
  });
  it('separate arms still need their thickness and root bolts', () => {
    const raw = minimalSeparate() as Record<string, any>;
    delete raw.arms.root;
    expect(() => validateDesign(raw)).toThrow(/arms\.root: \(missing\) is required/);
  });
});

import { describe, expect, it } from 'vitest';
import { partArea } from '../../src/geometry/index.js';
import { importFixture, rules } from './helpers.js';

/** Each hygiene rule triggered by a planted file (make_fixtures.py, written by python3-ezdxf). */
describe('file hygiene findings', () => {
  it('open contour: the 0.5 mm gap, where it is, and no part from the open outline', () => {
    const r = importFixture('open-contour.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-open-contour')!;
    expect(f.severity).toBe('error');
    expect(f.measured).toBeCloseTo(0.5, 9);
    expect(f.message).toContain('(0.000, 0.500)');
    expect(f.part).toBe('');
    // Only the hole closes on its own.
    expect(r.parts).toHaveLength(1);
    expect(partArea(r.parts[0])).toBeCloseTo(Math.PI * 4, 9);
  });

  it('a gap within the tolerance is joined and noted; a wider tolerance closes the 0.5 mm gap', () => {
    const r = importFixture('open-contour.dxf', { gapTolMm: 0.6 });
    expect(rules(r)).not.toContain('dxf-open-contour');
    expect(rules(r)).toContain('dxf-gap-closed');
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].features).toHaveLength(1);
  });

  it('duplicate and overlapping entities are reported once each and counted once in the geometry', () => {
    const r = importFixture('duplicate.dxf');
    const dup = r.findings.find((x) => x.rule === 'dxf-duplicate-entity')!;
    expect(dup.measured).toBe(2); // the repeated bottom line and the repeated circle
    const over = r.findings.find((x) => x.rule === 'dxf-overlapping-entities')!;
    expect(over.message).toContain('40.000 mm');
    // The rectangle survives with its hole; the part of the stray line beyond the corner is left over.
    expect(r.parts).toHaveLength(1);
    expect(partArea(r.parts[0])).toBeCloseTo(50 * 30 - Math.PI * 4, 9);
    expect(rules(r)).toContain('dxf-branching-contour');
    expect(r.findings.find((x) => x.rule === 'dxf-open-contour')!.measured).toBeCloseTo(20, 9);
  });

  it('zero-length and tiny segments', () => {
    const r = importFixture('zero-tiny.dxf');
    expect(r.findings.find((x) => x.rule === 'dxf-zero-length')!.measured).toBe(1);
    const tiny = r.findings.find((x) => x.rule === 'dxf-tiny-segment')!;
    expect(tiny.measured).toBeCloseTo(0.02 * Math.SQRT2, 9);
    expect(r.parts).toHaveLength(1);
  });

  it('a self-intersecting loop is reported and left out; the other part stays', () => {
    const r = importFixture('self-intersecting.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-self-intersecting')!;
    expect(f.severity).toBe('error');
    expect(f.atMm![0]).toBeCloseTo(20, 9);
    expect(f.atMm![1]).toBeCloseTo(15, 9);
    expect(r.parts).toHaveLength(1);
    expect(partArea(r.parts[0])).toBeCloseTo(1200, 9);
  });

  it('contours crossing each other', () => {
    const r = importFixture('crossing.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-contours-cross')!;
    expect(f.severity).toBe('error');
    expect(f.atMm![0]).toBeCloseTo(50, 6);
    // circle (49, 15) r 3 meets x = 50 at y = 15 ± √8
    expect(Math.abs(Math.abs(f.atMm![1] - 15) - Math.sqrt(8))).toBeLessThan(1e-6);
  });

  it('text on a cut layer; frozen, off and annotation layers skipped', () => {
    const r = importFixture('annotation.dxf');
    const text = r.findings.find((x) => x.rule === 'dxf-annotation-on-cut-layer')!;
    expect(text.severity).toBe('warning');
    expect(text.message).toContain('layer CUT');
    expect(text.message).toContain('(DIMENSION, TEXT)');
    expect(text.measured).toBe(2);
    const skipped = r.findings.filter((x) => x.rule === 'dxf-layer-skipped').map((x) => x.message);
    expect(skipped.some((m) => m.startsWith('layer NOTES') && m.includes('annotation'))).toBe(true);
    expect(skipped.some((m) => m.startsWith('layer OLD') && m.includes('frozen'))).toBe(true);
    expect(skipped.some((m) => m.startsWith('layer SPARE') && m.includes('off'))).toBe(true);
    expect(r.cutLayers).toEqual(['CUT']);
  });

  it('--layers chooses the cut layers, even a frozen one, and refuses a layer the file lacks', () => {
    const r = importFixture('annotation.dxf', { layers: ['old'] });
    expect(r.cutLayers).toEqual(['OLD']);
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].features).toHaveLength(0);
    expect(() => importFixture('annotation.dxf', { layers: ['NOPE'] })).toThrow(/--layers: "NOPE" not in the file; its layers are .*CUT/);
  });

  it('a part far from the origin', () => {
    const r = importFixture('far-origin.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-far-from-origin')!;
    expect(f.part).toBe('far-origin');
    expect(f.measured).toBeCloseTo(5000 * Math.SQRT2, 6);
  });

  it('unit doubt: an inch-sized plate in a file that says mm', () => {
    const r = importFixture('unit-doubt.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-unit-doubt')!;
    expect(f.measured).toBeCloseTo(3, 9);
    expect(f.message).toContain('76.2 mm'); // 3 in × 25.4 mm/in
  });

  it('unitless file: millimetres assumed with a warning', () => {
    const r = importFixture('unitless.dxf');
    expect(r.units).toEqual({ unit: 'mm', from: 'assumed' });
    expect(r.findings.find((x) => x.rule === 'dxf-units-assumed')!.severity).toBe('warning');
  });

  it('several parts, one inside another part\'s window, each with its own holes', () => {
    const r = importFixture('multi-part.dxf');
    expect(r.parts.map((p) => p.name)).toEqual(['multi-part-1', 'multi-part-2', 'multi-part-3', 'multi-part-4']);
    const areas = r.parts.map((p) => partArea(p));
    expect(areas[0]).toBeCloseTo(1500, 9);
    expect(areas[1]).toBeCloseTo(100 * 70 - 80 * 50, 9);
    expect(areas[2]).toBeCloseTo(400 - Math.PI * 4, 9);
    expect(areas[3]).toBeCloseTo(600, 9);
    expect(r.parts.map((p) => p.features.map((f) => f.kind))).toEqual([[], ['cutout'], ['hole'], []]);
    expect(r.parts[2].features[0].diameterMm).toBe(4);
  });

  it('branching: three ends at one point', () => {
    const r = importFixture('branching.dxf');
    const f = r.findings.find((x) => x.rule === 'dxf-branching-contour')!;
    expect(f.atMm).toEqual([50, 30]);
  });

  it('no thickness: 2 mm assumed and said', () => {
    const r = importFixture('unitless.dxf', { thicknessMm: undefined });
    expect(r.parts[0].thicknessMm).toBe(2);
    expect(rules(r)).toContain('dxf-thickness-assumed');
  });

  it('every rule name starts with dxf-', () => {
    for (const f of ['annotation.dxf', 'duplicate.dxf', 'splines.dxf', 'blocks.dxf']) for (const rule of rules(importFixture(f))) expect(rule.startsWith('dxf-')).toBe(true);
  });
});

import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { makeVariant, planVariant, VariantRefusal } from '../../src/variant/index.js';
import { buildFrame } from '../../src/geometry/frame.js';
import { validateDesign } from '../../src/params/index.js';
import { checkFrame } from '../../src/checks/index.js';
import { batteryHold } from '../../src/variant/body.js';
import { designWith } from '../helpers/demo.js';
import { demoText, motorsFromRaw, propMmFromRaw } from './helpers.js';

/**
 * Plan-view clearance between the prop discs and the standoffs, read from a design file: motor
 * centre to standoff centre, minus the prop radius, minus the standoff radius (M3 standoff ≈ 6 mm
 * across, taken as the thread diameter as radius: common practice, from memory). mm.
 */
function standoffClearance(raw: any, bodyScale = 1): number {
  const P = propMmFromRaw(raw.props.diameter);
  const m = motorsFromRaw(raw.layout);
  const r = Number(String(raw.body.standoffs.boltSize ?? 'M3').slice(1));
  let best = Infinity;
  for (const c of [m.fl, m.fr, m.rl, m.rr]) {
    for (const [x, y] of raw.body.standoffs.positionsMm as [number, number][]) best = Math.min(best, Math.hypot(c[0] - x * bodyScale, c[1] - y) - P / 2 - r);
  }
  return best;
}

describe('body length: only what the new clearances need', () => {
  it('auto wheelbase keeps the body and the source clearance', () => {
    const src = YAML.parse(demoText('tessel-5'));
    const v = makeVariant(demoText('tessel-5'), { props: '7in' });
    const raw = YAML.parse(v.text);
    expect(raw.body).toEqual(src.body);
    expect(standoffClearance(raw)).toBeGreaterThanOrEqual(Math.min(standoffClearance(src), src.props.minTipGapMm) - 1e-6);
  });

  it('a given wheelbase that crowds the standoffs shortens the body just enough; sizes stay', () => {
    const src = YAML.parse(demoText('tessel-5'));
    const auto = makeVariant(demoText('tessel-5'), { props: '7in' });
    const given = Math.ceil((auto.wheelbase.minimumMm + auto.wheelbase.bodyKeptMm) / 2);
    expect(given).toBeLessThan(auto.wheelbase.bodyKeptMm);
    const v = planVariant(demoText('tessel-5'), { props: '7in', wheelbase: given });
    const raw = YAML.parse(v.text);
    const need = Math.min(standoffClearance(src), src.props.minTipGapMm);
    expect(raw.layout.wheelbaseMm).toBe(given);
    expect(raw.body.lengthMm).toBeLessThan(src.body.lengthMm);
    expect(standoffClearance(raw)).toBeGreaterThanOrEqual(need - 0.01); // positions written to 0.01 mm
    // just enough: half a millimetre more body (positions scaled alike) would crowd them again
    const longer = (raw.body.lengthMm + 0.5) / raw.body.lengthMm;
    expect(standoffClearance(raw, longer)).toBeLessThan(need);
    // positions scale with the length; widths, patterns and sizes stay
    const k = raw.body.lengthMm / src.body.lengthMm;
    raw.body.standoffs.positionsMm.forEach((p: number[], i: number) => {
      expect(p[0]).toBeCloseTo(src.body.standoffs.positionsMm[i][0] * k, 2);
      expect(p[1]).toBe(src.body.standoffs.positionsMm[i][1]);
    });
    expect(raw.body.widthMm).toBe(src.body.widthMm);
    expect(raw.stacks).toEqual(src.stacks);
    expect(raw.topPlate.strapSlots.strapWidthMm).toBe(src.topPlate.strapSlots.strapWidthMm);
  });

  it('a shortened body keeps the battery between its strap slots (they keep their distance from it) and the slots on the top plate', () => {
    const src = YAML.parse(demoText('tessel-5'));
    const auto = makeVariant(demoText('tessel-5'), { props: '7in' });
    const given = Math.ceil((auto.wheelbase.minimumMm + auto.wheelbase.bodyKeptMm) / 2);
    const raw = YAML.parse(planVariant(demoText('tessel-5'), { props: '7in', wheelbase: given }).text);
    const k = raw.body.lengthMm / src.body.lengthMm;
    expect(k).toBeLessThan(1);
    const battery = src.components.find((c: { kind: string }) => c.kind === 'battery');
    const b = raw.components.find((c: { kind: string }) => c.kind === 'battery');
    const L = battery.sizeMm[0];
    const w = src.topPlate.strapSlots.slotWidthMm ?? 3;
    const spacing = (xs: number[]) => Math.max(...xs) - Math.min(...xs);
    // By hand, from the files: the source's slots scaled with the body would leave less room between
    // them than the battery is long (the strap could not pass: what the battery-fit check reports) ...
    expect(k * spacing(src.topPlate.strapSlots.xPositionsMm) - w).toBeLessThan(L);
    // ... so they keep their distance from the battery's centre, and the battery fits between them.
    raw.topPlate.strapSlots.xPositionsMm.forEach((x: number, i: number) => expect(x - (b.xMm ?? 0)).toBeCloseTo(src.topPlate.strapSlots.xPositionsMm[i] - (battery.xMm ?? 0), 1));
    expect(spacing(raw.topPlate.strapSlots.xPositionsMm) - w).toBeGreaterThanOrEqual(L);
    // The slots stay on the top plate.
    const plate = raw.topPlate.lengthMm ?? raw.body.lengthMm;
    for (const x of raw.topPlate.strapSlots.xPositionsMm) expect(Math.abs(x) + w / 2).toBeLessThanOrEqual(plate / 2);
    const report = checkFrame(buildFrame(validateDesign(raw)));
    expect(report.findings.filter((f) => f.rule === 'battery-fit')).toEqual([]);
  });

  it('a body shortened that much no longer holds its parts clear of the props: refused, pointing to --wheelbase auto', () => {
    const auto = makeVariant(demoText('tessel-5'), { props: '7in' });
    const given = Math.ceil((auto.wheelbase.minimumMm + auto.wheelbase.bodyKeptMm) / 2);
    let refusal: VariantRefusal | null = null;
    try {
      makeVariant(demoText('tessel-5'), { props: '7in', wheelbase: given });
    } catch (e) {
      refusal = e as VariantRefusal;
    }
    expect(refusal).toBeInstanceOf(VariantRefusal);
    expect(refusal!.constraint).toMatch(/every check \(\d+ errors? on the lightest arm that meets the size rule: /);
    // The alternative names the wheelbase auto picks, and that variant is the one made without --wheelbase.
    expect(refusal!.alternative).toContain(`--wheelbase auto (${auto.design.layout.kind === 'asymmetric' ? '' : auto.design.layout.wheelbaseMm} mm)`);
    expect(refusal!.attempt!.errors).toBeGreaterThan(0);
  });

  it('a body shortened further than the strap slots allow grows back until the outer slot keeps its web to the plate end', () => {
    // Battery at x 0, slots moved out to ±40 mm on the 116 mm top plate (source margin 58 − 40 − w/2).
    const d = validateDesign(designWith('tessel-5.yaml', { topPlate: { strapSlots: { xPositionsMm: [-40, 40] } } }));
    const plate = d.topPlate.lengthMm ?? d.body.lengthMm;
    const w = d.topPlate.strapSlots.slotWidthMm ?? 3;
    const web = d.checks['web-width'];
    const m = Math.min(plate / 2 - 40 - w / 2, Math.max(web.minMm, web.perThickness * d.topPlate.thicknessMm) * web.warnFactor);
    const hold = batteryHold(d, 0.5);
    // By hand: the plate's half length f × plate / 2 must reach 40 + w/2 + m.
    expect(hold.factor).toBeCloseTo((2 * (40 + w / 2 + m)) / plate, 9);
    expect(hold.factor).toBeGreaterThan(0.5);
    expect([...hold.slots.values()]).toEqual([-40, 40]);
    // A factor that already holds them is kept.
    expect(batteryHold(d, 0.95).factor).toBe(0.95);
  });
});

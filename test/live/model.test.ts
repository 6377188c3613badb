import { describe, expect, it } from 'vitest';
import { checkFrame, type PartCheckCache } from '../../src/checks/report.js';
import { designJsonSchema } from '../../src/params/jsonSchema.js';
import type { SchemaNode } from '../../src/live/form.js';
import { liveModel } from '../../src/live/model.js';
import { setDesignValues } from '../../src/variant/changes.js';
import { DEMO_FILES, demoFrame, demoText } from '../helpers/demo.js';

const schema = designJsonSchema() as SchemaNode;
const model = (text: string) => liveModel(text, { version: 1, file: 'x.yaml', schema, previous: null }).model;

describe('the live model', () => {
  for (const file of DEMO_FILES) {
    it(`${file}: findings, parts and figures are the check report's and the frame's`, () => {
      const m = model(demoText(file));
      const frame = demoFrame(file);
      const report = checkFrame(frame);
      expect(m.state).toBe('ok');
      expect(m.findings.map((f) => [f.rule, f.severity, f.part, f.message])).toEqual(report.findings.map((f) => [f.rule, f.severity, f.part, f.message]));
      expect(m.summary.errors).toBe(report.summary.errors);
      expect(m.parts.map((p) => [p.name, p.quantity, p.thicknessMm])).toEqual(frame.parts.map((p) => [p.name, p.quantity, p.thicknessMm]));
      expect(m.views?.parts.map((p) => p.name)).toEqual(frame.parts.map((p) => p.name));
    });
  }

  it('a part finding points at the part and at every copy in plan view, both front (+x) up: (−y, −x)', () => {
    const m = model(demoText('tessel-5.yaml'));
    const frame = demoFrame('tessel-5.yaml');
    const f = m.findings.find((x) => x.part === 'arm' && x.targets.length > 0)!;
    const raw = checkFrame(frame).findings[f.id];
    const arm = frame.parts.find((p) => p.name === 'arm')!;
    const at = raw.atMm!;
    // The part's own picture has its +x up like the exported part SVG: screen (−y, −x).
    expect(f.targets[0]).toEqual({ view: 'part:arm', at: [-at[1] + 0, -at[0] + 0] });
    // Each copy by hand: mirror y if the copy is mirrored, rotate by its angle, move to its place.
    const byHand = arm.placements.map((pl) => {
      const y = pl.mirrorY ? -at[1] : at[1];
      const c = Math.cos(pl.rotateRad);
      const s = Math.sin(pl.rotateRad);
      const X = c * at[0] - s * y + pl.translateMm[0];
      const Y = s * at[0] + c * y + pl.translateMm[1];
      return [-Y, -X];
    });
    const plan = f.targets.filter((t) => t.view === 'plan').map((t) => t.at);
    expect(plan).toHaveLength(arm.placements.length);
    plan.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(byHand[i][0], 9);
      expect(p[1]).toBeCloseTo(byHand[i][1], 9);
    });
  });

  it('a frame finding points at plan view only', () => {
    const m = model(demoText('tessel-5.yaml'));
    for (const f of m.findings.filter((x) => x.part === 'frame')) expect(f.targets.every((t) => t.view === 'plan')).toBe(true);
  });

  it('tip gaps are the prop centres’ distance less the diameter (square X of wheelbase W: W sin 45° − D)', () => {
    const m = model(setDesignValues(demoText('tessel-5.yaml'), { 'layout.wheelbaseMm': 224, 'layout.armAngleDeg': 45 }));
    const D = 5.1 * 25.4;
    for (const g of m.figures!.tipGaps) expect(g.gapMm).toBeCloseTo(224 * Math.SQRT1_2 - D, 2);
    expect(m.figures!.wheelbaseMm).toBe(224);
  });

  it('a design that cannot be built keeps the last pictures and says why', () => {
    const good = model(demoText('tessel-5.yaml'));
    const bad = liveModel(setDesignValues(demoText('tessel-5.yaml'), { 'layout.wheelbaseMm': 20 }), { version: 2, file: 'x.yaml', schema, previous: good }).model;
    expect(bad.state).toBe('invalid');
    expect(bad.problems[0].path).toBe('layout.wheelbaseMm');
    expect(bad.views).toEqual(good.views);
    expect(bad.form.length).toBe(good.form.length);
  });

  it('the part-check cache gives the same report as checking afresh, edit after edit', () => {
    const cache: PartCheckCache = new Map();
    for (const wb of [224, 230, 224, 236]) {
      const text = setDesignValues(demoText('tessel-5.yaml'), { 'layout.wheelbaseMm': wb });
      const a = liveModel(text, { version: 1, file: 'x', schema, previous: null, cache }).evaluation.report;
      const b = liveModel(text, { version: 1, file: 'x', schema, previous: null }).evaluation.report;
      expect(a).toEqual(b);
    }
    expect(cache.size).toBeGreaterThan(5);
  });
});

import { describe, expect, it } from 'vitest';
import { checkOptions, checkParts, type CheckReport } from '../../src/checks/index.js';
import { partToDxf } from '../../src/export/index.js';
import type { Part } from '../../src/geometry/index.js';
import { importDxf } from '../../src/import/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';

/**
 * Every demo part written by framewright's DXF writer (R12 and R2000, closed polylines and loose
 * LINE/ARC entities), read back by the importer: the same geometry metrics and the same design-rule
 * findings as the part itself, once the part is reduced to what a DXF can carry (no hole purposes,
 * screw sizes or strut centrelines).
 */
const parts = DEMO_FILES.flatMap((f) => demoFrame(f).parts.map((p) => ({ file: f, part: p })));

/** The part as a DXF file describes it. */
function asDrawn(p: Part): Part {
  return {
    ...p,
    role: 'imported',
    members: [],
    placements: [],
    features: p.features.map((f) => ({
      loop: f.loop,
      kind: f.kind,
      purpose: 'imported' as const,
      ...(f.centerMm ? { centerMm: f.centerMm, diameterMm: f.diameterMm } : {}),
    })),
  };
}

function comparable(r: CheckReport) {
  return r.findings.map((f) => ({ rule: f.rule, severity: f.severity, part: f.part, measured: f.measured, at: f.atMm }));
}

describe('round trip: demo parts → DXF → import → checks', () => {
  const options = checkOptions({ toolDiameterMm: 3.175 });
  for (const version of ['R12', 'R2000'] as const) {
    for (const contours of ['polyline', 'entities'] as const) {
      for (const { file, part } of parts) {
        it(`${version} ${contours} ${file} ${part.name}`, () => {
          const text = partToDxf(part, { version, contours });
          const r = importDxf(text, { name: part.name, thicknessMm: part.thicknessMm, material: part.material, weaveRad: part.weaveRad });
          expect(r.units).toEqual({ unit: 'mm', from: 'header' });
          expect(r.parts).toHaveLength(1);
          // Only notes about the label layer; nothing wrong with framewright's own files.
          expect(r.findings.filter((f) => f.severity !== 'info')).toEqual([]);
          const back = r.parts[0];
          expect(back.features.map((f) => f.kind).sort()).toEqual(part.features.map((f) => f.kind).sort());
          const want = checkParts([asDrawn(part)], options);
          const got = checkParts([back], options);
          // Metrics: the writer rounds coordinates to 1e-6 mm, the report to 1e-4.
          const [w] = want.parts;
          const [g] = got.parts;
          expect(g.contours).toBe(w.contours);
          expect(g.holes).toBe(w.holes);
          expect(Math.abs(g.areaMm2 - w.areaMm2)).toBeLessThan(1e-3);
          expect(Math.abs(g.cutLengthMm - w.cutLengthMm)).toBeLessThan(1e-3);
          g.bboxMm.forEach((v, k) => expect(Math.abs(v - w.bboxMm[k])).toBeLessThan(1e-3));
          for (const key of ['minWebMm', 'minHoleEdgeWebMm', 'minHoleHoleWebMm', 'minEdgeRatio'] as const) {
            const a = g.metrics[key];
            const b = w.metrics[key];
            expect(a === null).toBe(b === null);
            if (a !== null && b !== null) expect(Math.abs(a - b)).toBeLessThan(1e-3);
          }
          // Findings: same rules, severities and places; measured values to the writer's rounding.
          const fw = comparable(want);
          const fg = comparable(got);
          expect(fg.map((f) => `${f.severity} ${f.rule}`)).toEqual(fw.map((f) => `${f.severity} ${f.rule}`));
          fg.forEach((f, k) => {
            if (f.measured !== null) expect(Math.abs(f.measured - fw[k].measured!)).toBeLessThan(1e-3);
            if (f.at) f.at.forEach((v, j) => expect(Math.abs(v - fw[k].at![j])).toBeLessThan(1e-3));
          });
        });
      }
    }
  }
});

import { copyFileSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CheckReport } from '../../src/checks/index.js';
import { runCli, STACK_LINE, outputNames } from '../helpers/cli.js';
import { fixturePath, fixtureText } from './helpers.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fw-import-'));
const json = (stdout: string) => JSON.parse(stdout) as CheckReport;

describe('framewright check FILE.dxf (the built CLI)', () => {
  it('a clean plate: exit 0, the report contract, text with the cautions', () => {
    const r = runCli(['check', fixturePath('line-arc-plate.dxf'), '--json', '--thickness', '2.5']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const rep = json(r.stdout);
    expect(rep.units).toBe('mm');
    expect(rep.parts).toHaveLength(1);
    const p = rep.parts[0];
    expect(p.name).toBe('line-arc-plate');
    expect(p.thicknessMm).toBe(2.5);
    expect(p.contours).toBe(7);
    // 80 × 40 with R6 corners, minus four Ø3.4 holes, a 20 × 4 slot with round ends and an 8 × 10 cut-out (exact)
    const area = 80 * 40 - (4 - Math.PI) * 36 - 4 * Math.PI * 1.7 ** 2 - (20 * 4 + Math.PI * 4) - 80;
    expect(p.areaMm2).toBeCloseTo(area, 3);
    expect(Object.keys(rep.summary)).toEqual(['errors', 'warnings']);
    const t = runCli(['check', fixturePath('line-arc-plate.dxf'), '--thickness', '2.5']);
    expect(t.code).toBe(0);
    expect(t.stdout).toContain('framewright check: line-arc-plate.dxf (DXF, mm from $INSUNITS');
    expect(t.stdout).toMatch(/respirator/);
  });

  it('file findings and design findings in one report; errors give exit 1', () => {
    const r = runCli(['check', fixturePath('open-contour.dxf'), '--json']);
    expect(r.code).toBe(1);
    const rep = json(r.stdout);
    const open = rep.findings.find((f) => f.rule === 'dxf-open-contour')!;
    expect(open.part).toBe('');
    expect(open.measured).toBeCloseTo(0.5, 9);
    expect(rep.summary.errors).toBeGreaterThan(0);
  });

  it('is deterministic', () => {
    const a = runCli(['check', fixturePath('blocks.dxf'), '--json']);
    const b = runCli(['check', fixturePath('blocks.dxf'), '--json']);
    expect(a.stdout).toBe(b.stdout);
  });

  it('--units and --layers', () => {
    const doubt = json(runCli(['check', fixturePath('unit-doubt.dxf'), '--json']).stdout);
    expect(doubt.findings.some((f) => f.rule === 'dxf-unit-doubt')).toBe(true);
    const inch = json(runCli(['check', fixturePath('unit-doubt.dxf'), '--json', '--units', 'in']).stdout);
    expect(inch.findings.some((f) => f.rule === 'dxf-unit-doubt')).toBe(false);
    expect(inch.parts[0].bboxMm).toEqual([0, 0, 76.2, 38.1]); // 3 × 1.5 in
    const layered = json(runCli(['check', fixturePath('annotation.dxf'), '--json', '--layers', 'CUT,OLD']).stdout);
    expect(layered.parts).toHaveLength(1);
    expect(layered.parts[0].holes).toBe(1); // the frozen layer's circle, chosen explicitly
  });

  it('a sidecar file gives thickness and material; flags win over it', () => {
    const dir = tmp();
    const dxf = join(dir, 'arm.dxf');
    copyFileSync(fixturePath('bulge-arm.dxf'), dxf);
    writeFileSync(`${dxf}.yaml`, 'thicknessMm: 5\nmaterial: stiff\nmaterials:\n  stiff: { e1Gpa: 70, e2Gpa: 70, g12Gpa: 5, nu12: 0.1, densityGPerCm3: 1.6 }\n');
    expect(json(runCli(['check', dxf, '--json']).stdout).parts[0].thicknessMm).toBe(5);
    expect(json(runCli(['check', dxf, '--json', '--thickness', '4']).stdout).parts[0].thicknessMm).toBe(4);
    writeFileSync(`${dxf}.yaml`, 'thicknessMm: 50\nunits: furlong\n');
    const bad = runCli(['check', dxf]);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('thicknessMm: 50 is above the allowed range 0.1 to 20 mm');
    expect(bad.stderr).toContain('units: "furlong" must be one of mm, cm, m, in');
    expect(bad.stderr).not.toMatch(STACK_LINE);
  });

  it('bad input: exit 2, a clear message, no stack trace, nothing written', () => {
    const dir = tmp();
    const notDxf = join(dir, 'notes.dxf');
    writeFileSync(notDxf, 'hello, this is not a drawing\n');
    const truncated = join(dir, 'cut.dxf');
    writeFileSync(truncated, fixtureText('line-arc-plate.dxf').slice(0, 9000));
    const out = join(dir, 'annotated');
    const cases: Array<[string[], RegExp]> = [
      [['check', fixturePath('binary.dxf')], /binary DXF/],
      [['check', notDxf], /not a DXF file/],
      [['check', truncated, '--annotate', out], /truncated/],
      [['check', join(dir, 'missing.dxf')], /cannot read .*ENOENT/],
      [['check', fixturePath('line-arc-plate.dxf'), '--thickness', 'thick'], /--thickness: "thick" must be a number \(mm\), 0.1 to 20/],
      [['check', fixturePath('line-arc-plate.dxf'), '--units', 'cubits'], /--units: "cubits" must be one of/],
      [['check', fixturePath('line-arc-plate.dxf'), '--layers', 'NOPE'], /--layers: "NOPE" not in the file/],
      [['check', fixturePath('line-arc-plate.dxf'), '--material', 'balsa'], /--material: "balsa" is not defined/],
    ];
    for (const [args, msg] of cases) {
      const r = runCli(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr).toMatch(msg);
      expect(r.stderr).not.toMatch(STACK_LINE);
      expect(r.stdout).toBe('');
    }
    expect(readdirSync(dir).sort()).toEqual(['cut.dxf', 'notes.dxf']);
  });

  it('a part built by framewright, cut file and design give the same geometry metrics', () => {
    const dir = tmp();
    expect(runCli(['build', 'designs/tessel-5.yaml', '--out', dir]).code).toBe(0);
    const design = json(runCli(['check', 'designs/tessel-5.yaml', '--json']).stdout);
    const top = design.parts.find((p) => p.name === 'top-plate')!;
    const back = json(runCli(['check', join(dir, 'top-plate.dxf'), '--json', '--thickness', String(top.thicknessMm)]).stdout);
    expect(back.parts).toHaveLength(1);
    const p = back.parts[0];
    for (const k of ['thicknessMm', 'contours', 'holes', 'areaMm2', 'cutLengthMm'] as const) expect(p[k]).toBe(top[k]);
    expect(p.bboxMm).toEqual(top.bboxMm);
    expect(p.metrics.minHoleEdgeWebMm).toBe(top.metrics.minHoleEdgeWebMm);
    expect(p.metrics.minHoleHoleWebMm).toBe(top.metrics.minHoleHoleWebMm);
    expect(readFileSync(join(dir, 'top-plate.dxf'), 'utf8')).toContain('$INSUNITS');
  });

  it('--annotate writes one SVG per imported part', () => {
    const out = join(tmp(), 'svg');
    const r = runCli(['check', fixturePath('multi-part.dxf'), '--annotate', out]);
    expect(r.code).toBe(0);
    expect(outputNames(out)).toEqual(['multi-part-1.check.svg', 'multi-part-2.check.svg', 'multi-part-3.check.svg', 'multi-part-4.check.svg']);
  });
});

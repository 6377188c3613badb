import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { describe, expect, it } from 'vitest';
import { DESIGNS_DIR, designWith } from '../helpers/demo.js';
import { runCli, STACK_LINE, outputNames } from '../helpers/cli.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fw-check-'));
const tessel = join(DESIGNS_DIR, 'tessel-5.yaml');

function writeDesign(patch: Record<string, unknown>): string {
  const file = join(tmp(), 'planted.yaml');
  writeFileSync(file, YAML.stringify(designWith('tessel-5.yaml', patch)));
  return file;
}

function expectBadInput(r: { code: number; stdout: string; stderr: string }, ...parts: RegExp[]): void {
  expect(r.code).toBe(2);
  expect(r.stderr).not.toMatch(STACK_LINE);
  for (const p of parts) expect(r.stderr).toMatch(p);
}

describe('framewright check (the built CLI)', () => {
  it('a demo design: text report by part, counts and cautions, exit 0', () => {
    const r = runCli(['check', tessel]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    for (const name of ['bottom-plate', 'arm', 'top-plate', 'brace', 'camera-side', 'frame']) expect(r.stdout).toMatch(new RegExp(`^${name}`, 'm'));
    expect(r.stdout).toMatch(/^0 errors, \d+ warnings, \d+ notes\.$/m);
    expect(r.stdout).toMatch(/Caution: .*respirator/);
    expect(r.stdout).toMatch(/props off/);
  });

  it('--json follows the report contract and is deterministic', () => {
    const a = runCli(['check', tessel, '--json']);
    const b = runCli(['check', tessel, '--json']);
    expect(a.code).toBe(0);
    expect(a.stdout).toBe(b.stdout);
    const j = JSON.parse(a.stdout);
    expect(Object.keys(j).sort()).toEqual(['findings', 'parts', 'summary', 'units']);
    expect(j.units).toBe('mm');
    for (const p of j.parts) {
      expect(Object.keys(p).sort()).toEqual(['areaMm2', 'bboxMm', 'contours', 'cutLengthMm', 'holes', 'metrics', 'name', 'thicknessMm'].sort());
      expect(Object.keys(p.metrics).sort()).toEqual(['minEdgeRatio', 'minHoleEdgeWebMm', 'minHoleHoleWebMm', 'minWebMm']);
      expect(p.bboxMm.length).toBe(4);
    }
    for (const f of j.findings) {
      expect(Object.keys(f).sort()).toEqual(['atMm', 'limit', 'measured', 'message', 'part', 'rule', 'severity', 'unit']);
      expect(['error', 'warning', 'info']).toContain(f.severity);
    }
    expect(j.summary).toEqual({ errors: 0, warnings: j.findings.filter((f: { severity: string }) => f.severity === 'warning').length });
  });

  it('a design with errors exits 1', () => {
    const r = runCli(['check', writeDesign({ body: { standoffs: { shape: 'round', positionsMm: [[52, 21], [52, -21], [-52, 21], [-52, -21]] } } })]);
    expect(r.code).toBe(1);
    // Grouped by rule, errors first: the prop-clearance rule heads the list with its errors.
    expect(r.stdout).toMatch(/^Summary: [1-9]\d* errors?/m);
    expect(r.stdout).toMatch(/\n\nprop-clearance: \d+ errors?/);
    expect(r.stdout).toMatch(/ERROR +frame/);
  });

  it('--limit overrides the design and can turn a pass into a failure', () => {
    const r = runCli(['check', tessel, '--limit', 'hole-edge-distance.errorEdgeRatio=2.2', '--limit', 'hole-edge-distance.warnEdgeRatio=2.5', '--json']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout).findings.some((f: { severity: string; limit: number }) => f.severity === 'error' && f.limit === 2.2)).toBe(true);
  });

  it('bad input: a limit out of range names the path, the value and the range (exit 2)', () => {
    expectBadInput(runCli(['check', tessel, '--limit', 'web-width.minMm=50']), /checks\.web-width\.minMm: 50 is above the allowed range 0\.1 to 20 mm/);
    expectBadInput(runCli(['check', tessel, '--limit', 'weave-direction.minModulusFraction=0']), /checks\.weave-direction\.minModulusFraction: 0 is below the allowed range 0\.05 to 1/);
    expectBadInput(runCli(['check', writeDesign({ checks: { 'hole-edge-distance': { errorEdgeRatio: 3 } } })]), /checks\.hole-edge-distance\.errorEdgeRatio: 3 must not exceed warnEdgeRatio/);
    expectBadInput(runCli(['check', tessel, '--tool', '0.1']), /--tool: "0\.1" must be a router bit diameter from 0\.3 to 12 mm/);
  });

  it('bad input: an unknown rule or limit name, or a malformed --limit (exit 2)', () => {
    expectBadInput(runCli(['check', tessel, '--limit', 'web-thickness.minMm=2']), /unknown rule/, /web-thickness/, /known rules: web-width, hole-edge-distance, bit-reach/);
    expectBadInput(runCli(['check', tessel, '--limit', 'web-width.minimum=2']), /checks\.web-width: \["minimum"\] unknown limit/);
    expectBadInput(runCli(['check', tessel, '--limit', 'web-width=2']), /expected RULE\.KEY=VALUE/);
    expectBadInput(runCli(['check', tessel, '--limit', 'web-width.minMm=wide']), /"wide" is not a number/);
    expectBadInput(runCli(['check', writeDesign({ checks: { 'prop-gap': {} } })]), /checks: \["prop-gap"\] unknown key/);
  });

  it('--annotate writes an SVG per part and the overview, all renderable (librsvg rsvg-convert)', () => {
    const dir = join(tmp(), 'ann');
    const r = runCli(['check', tessel, '--annotate', dir]);
    expect(r.code).toBe(0);
    const files = outputNames(dir);
    expect(files).toEqual(['arm.check.svg', 'bottom-plate.check.svg', 'brace.check.svg', 'camera-side.check.svg', 'overview.check.svg', 'top-plate.check.svg']);
    const overview = readFileSync(join(dir, 'overview.check.svg'), 'utf8');
    expect(overview).toMatch(/camera view in the prop plane/);
    expect(overview).toMatch(/front-left prop visible to the camera/);
    expect(readFileSync(join(dir, 'arm.check.svg'), 'utf8')).toMatch(/class="finding (warning|info)"/);
    if (requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert (librsvg2-bin)')) {
      for (const f of files) {
        const out = spawnSync('rsvg-convert', ['-o', join(dir, `${f}.png`), join(dir, f)], { encoding: 'utf8' });
        expect(out.status, `${f}: ${out.stderr}`).toBe(0);
      }
    }
  });

  it('--annotate into a path that cannot be a directory is bad input, nothing written (exit 2)', () => {
    const file = join(tmp(), 'plain-file');
    writeFileSync(file, 'x');
    expectBadInput(runCli(['check', tessel, '--annotate', join(file, 'sub')]), /cannot write into .*sub: .*plain-file is not a folder; nothing was written/);
  });

  it('--relieve-corners reports the reliefs and re-checks', () => {
    const r = runCli(['check', tessel, '--relieve-corners']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Corner relief: \d+ dogbones? added/m);
  });
});

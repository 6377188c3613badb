import * as DxfParserModule from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { checkOptions, checkParts, formatCheckReport, makeReport, partMarkers } from '../../src/checks/index.js';
import { partToDxf, partToSvg } from '../../src/export/index.js';
import { markersAnnotation } from '../../src/export/svgFindings.js';
import { defaultMeshSizeMm, partModes } from '../../src/analysis/index.js';
import { refuseLargeMeshes } from '../../src/analysis/meshLimit.js';
import { DxfReadError, importDxf } from '../../src/import/index.js';
import { rng } from '../helpers/random.js';
import { xmlProblem } from '../helpers/xml.js';
import type { Part } from '../../src/geometry/index.js';
import { FUZZ_SOURCES, mutateDxfLines } from '../import/helpers.js';

// dxf-parser's default export under NodeNext (library-notes.md)
const DxfParser = ((DxfParserModule as unknown as { default?: unknown }).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities?: unknown[] } | null };

/** What `check FILE.dxf --annotate` computes, as text: the report, annotated SVGs and the parts written back as DXF. */
function checkPipeline(text: string): { report: string; files: string[]; parts: Part[]; drawingErrors: string[] } | { refused: DxfReadError } {
  let imported;
  try {
    imported = importDxf(text, { name: 'fuzz', thicknessMm: 2 });
  } catch (e) {
    if (e instanceof DxfReadError) return { refused: e };
    throw e;
  }
  const design = checkParts(imported.parts, checkOptions({ toolDiameterMm: 1 }));
  const report = makeReport(design.parts, [...imported.findings, ...design.findings]);
  const files = imported.parts.flatMap((p) => [partToSvg(p, { annotation: markersAnnotation(partMarkers(report, p.name)) }), partToDxf(p)]);
  return { report: `${JSON.stringify(report)}\n${formatCheckReport(report, 'fuzz')}`, files, parts: imported.parts, drawingErrors: imported.findings.filter((f) => f.severity === 'error' && f.rule.startsWith('dxf-')).map((f) => f.part) };
}

/**
 * What `modes FILE.dxf` does with each part the drawing forms without a drawing error (the command
 * refuses the others): the mesh-size guard, then the free plate's modes. Frequencies in Hz, or the
 * guard's RangeError; any other throw is a crash.
 */
function modesPipeline(part: Part): number[] | { refused: RangeError } {
  try {
    refuseLargeMeshes([part], defaultMeshSizeMm);
    return partModes(part, { modes: 4 }).modes.map((m) => m.frequencyHz);
  } catch (e) {
    // The command turns a RangeError (mesh limit, a mesh that cannot follow the edges) into one line, exit 2.
    if (e instanceof RangeError) return { refused: e };
    throw e;
  }
}

describe('fuzz: mutated DXF files through the whole check, never a crash (FUZZ_CASES=n for more)', () => {
  const CASES = Number(process.env.FUZZ_CASES ?? 300);
  // FUZZ_FROM=n starts a campaign at another seed (the suite always runs the same first cases).
  const FIRST = Number(process.env.FUZZ_FROM ?? 1);

  it(`${CASES} seeded files: a report or a DxfReadError; annotated SVGs well-formed, parts written back readable; reruns identical; plate modes of every fourth file finite and ascending, or the mesh limit`, () => {
    const parser = new DxfParser();
    const seen = { refused: 0, checked: 0, parts: 0, modes: 0, modesRefused: 0 };
    const why: string[] = [];
    for (let seed = FIRST; seed < FIRST + CASES; seed++) {
      const r = rng(seed * 104729);
      const text = mutateDxfLines(FUZZ_SOURCES[seed % FUZZ_SOURCES.length].split('\n'), r).join('\n');
      const label = `seed ${seed}`;
      let result;
      try {
        result = checkPipeline(text);
      } catch (e) {
        throw new Error(`${label}: not a DxfReadError: ${(e as Error).stack}`);
      }
      if ('refused' in result) {
        seen.refused++;
        expect(result.refused.message.length, label).toBeGreaterThan(10);
        continue;
      }
      seen.checked++;
      seen.parts += result.files.length / 2;
      result.files.forEach((f, i) => {
        if (i % 2 === 0) expect(xmlProblem(f), label).toBeNull();
        else expect(parser.parseSync(f)?.entities?.length, label).toBeGreaterThan(0);
      });
      if (seen.checked % 5 === 1) expect(checkPipeline(text), label).toEqual(result);
      // Every fourth checked file: the plate modes of each part without a drawing error.
      if (seen.checked % 4 === 1) {
        for (const p of result.parts.filter((q) => !result.drawingErrors.includes(q.name))) {
          let hz;
          try {
            hz = modesPipeline(p);
          } catch (e) {
            throw new Error(`${label} part ${p.name}: modes crashed: ${(e as Error).stack}`);
          }
          if (!Array.isArray(hz)) {
            seen.modesRefused++;
            if (why.length < 5) why.push(`${label}: ${hz.refused.message}`);
            expect(hz.refused.message, label).not.toMatch(/\n/);
            continue;
          }
          seen.modes++;
          for (const [i, f] of hz.entries()) {
            expect(Number.isFinite(f) && f > 0, `${label} ${p.name} mode ${i + 1}: ${f} Hz`).toBe(true);
            if (i > 0) expect(f, `${label} ${p.name} modes ascending`).toBeGreaterThanOrEqual(hz[i - 1]);
          }
        }
      }
    }
    if (process.env.FUZZ_CASES) console.log(JSON.stringify({ ...seen, why }));
    // Both outcomes occur: the mutations reach past the reader's first checks into the design rules.
    expect(seen.refused, JSON.stringify(seen)).toBeGreaterThan(CASES / 20);
    expect(seen.parts, JSON.stringify(seen)).toBeGreaterThan(CASES / 5);
    expect(seen.modes, JSON.stringify(seen)).toBeGreaterThan(CASES / 40);
  }, Math.max(300_000, CASES * 1000));
});

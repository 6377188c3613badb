import * as DxfParserModule from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { checkOptions, checkParts, formatCheckReport, makeReport, partMarkers } from '../../src/checks/index.js';
import { partToDxf, partToSvg } from '../../src/export/index.js';
import { markersAnnotation } from '../../src/export/svgFindings.js';
import { DxfReadError, importDxf } from '../../src/import/index.js';
import { rng } from '../helpers/random.js';
import { xmlProblem } from '../helpers/xml.js';
import { FUZZ_SOURCES, mutateDxfLines } from '../import/helpers.js';

// dxf-parser's default export under NodeNext (library-notes.md)
const DxfParser = ((DxfParserModule as unknown as { default?: unknown }).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities?: unknown[] } | null };

/** What `check FILE.dxf --annotate` computes, as text: the report, annotated SVGs and the parts written back as DXF. */
function checkPipeline(text: string): { report: string; files: string[] } | { refused: DxfReadError } {
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
  return { report: `${JSON.stringify(report)}\n${formatCheckReport(report, 'fuzz')}`, files };
}

describe('fuzz: mutated DXF files through the whole check, never a crash (FUZZ_CASES=n for more)', () => {
  const CASES = Number(process.env.FUZZ_CASES ?? 300);

  it(`${CASES} seeded files: a report or a DxfReadError; annotated SVGs well-formed, parts written back readable; reruns identical`, () => {
    const parser = new DxfParser();
    const seen = { refused: 0, checked: 0, parts: 0 };
    for (let seed = 1; seed <= CASES; seed++) {
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
    }
    if (process.env.FUZZ_CASES) console.log(JSON.stringify(seen));
    // Both outcomes occur: the mutations reach past the reader's first checks into the design rules.
    expect(seen.refused, JSON.stringify(seen)).toBeGreaterThan(CASES / 20);
    expect(seen.parts, JSON.stringify(seen)).toBeGreaterThan(CASES / 5);
  }, 300_000);
});

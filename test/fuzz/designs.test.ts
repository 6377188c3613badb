import * as DxfParserModule from 'dxf-parser';
import YAML from 'yaml';
import { describe, expect, it } from 'vitest';
import { checkFrame } from '../../src/checks/index.js';
import { buildOutputs } from '../../src/cli/commands/build.js';
import { buildFrame } from '../../src/geometry/index.js';
import { DesignError, parseDesignText } from '../../src/params/index.js';
import { DEMO_FILES, demoText } from '../helpers/demo.js';
import { rng } from '../helpers/random.js';
import { xmlProblem } from '../helpers/xml.js';

// dxf-parser's default export under NodeNext (library-notes.md)
const DxfParser = ((DxfParserModule as unknown as { default?: unknown }).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities?: unknown[] } | null };

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

const STRINGS = ['', 'x', 'Tessel -- 5 <&> "q"', 'M3', 'M2.5', 'in', '5in', '130mm', '7.5in', 'nano', 'front', 'rear', 'auto', 'ünïcødé 🛩', 'a\u001bb', 'tab\there', '1e400', '.nan'];
const NUMBERS = [0, -1, 1, 0.001, 1e-9, 1e9, -1e9, 3, 45, 90, 180, 360, 2.5, 16, 30.5, 1000, 5e5];

/** Every path to a leaf or collection in a JSON tree. */
function paths(v: Json, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(at);
  if (Array.isArray(v)) v.forEach((x, i) => paths(x, [...at, i], out));
  else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) paths(x, [...at, k], out);
  return out;
}

function getAt(v: Json, at: readonly (string | number)[]): Json {
  return at.reduce<Json>((x, k) => (x as Record<string | number, Json>)[k], v);
}

function setAt(root: Json, at: readonly (string | number)[], value: Json | undefined): void {
  const parent = getAt(root, at.slice(0, -1)) as Record<string | number, Json> | Json[];
  const k = at[at.length - 1];
  if (value === undefined) {
    if (Array.isArray(parent)) parent.splice(Number(k), 1);
    else delete (parent as Record<string, Json>)[k];
  } else (parent as Record<string | number, Json>)[k] = value;
}

/** One to four random edits of a demo design: numbers scaled or replaced, keys dropped, types changed, strings hostile. */
function mutate(design: Json, r: () => number): Json {
  const d = structuredClone(design);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
  for (let n = 1 + Math.floor(r() * 4); n > 0; n--) {
    const all = paths(d).filter((p) => p.length > 0);
    const at = pick(all);
    const cur = getAt(d, at);
    const op = Math.floor(r() * 10);
    if (typeof cur === 'number' && op < 5) setAt(d, at, op < 3 ? cur * (0.3 + 2.7 * r()) : op === 3 ? pick(NUMBERS) : cur + (r() - 0.5));
    else if (op === 5) setAt(d, at, undefined);
    else if (op === 6) setAt(d, at, pick<Json>([null, true, 'x', [], {}, pick(NUMBERS), [1, 2]]));
    else if (op === 7 || typeof cur === 'string') setAt(d, at, pick(STRINGS));
    else if (op === 8 && Array.isArray(cur) && cur.length) cur.push(structuredClone(cur[Math.floor(r() * cur.length)]));
    else if (op === 9 && cur !== null && typeof cur === 'object' && !Array.isArray(cur)) cur[pick(['extra', 'widthMm', 'material', 'weaveDeg'])] = pick(NUMBERS);
  }
  return d;
}

/** The text of a mutated design: YAML or JSON, sometimes with a few characters damaged. */
function designText(d: Json, r: () => number): string {
  let text = r() < 0.5 ? YAML.stringify(d) : JSON.stringify(d, null, 1);
  if (r() < 0.15) {
    const i = Math.floor(r() * text.length);
    text = text.slice(0, i) + ['', '{', ']', ':', '"', '\n  - ', '&a ', '*a', '!!str ', '\t'][Math.floor(r() * 10)] + text.slice(i + Math.floor(r() * 3));
  }
  return text;
}

/** What build would write, as text, for a design text; or the DesignError that refuses it. */
async function pipeline(text: string): Promise<{ files: Array<{ path: string; data: string }>; frameParts: number } | { refused: DesignError }> {
  try {
    const frame = buildFrame(parseDesignText(text, 'fuzz.yaml'));
    const { files } = await buildOutputs(frame, 'out', { r2000: text.length % 2 === 0 });
    return { files: files.map((f) => ({ path: f.path, data: String(f.data) })), frameParts: frame.parts.length };
  } catch (e) {
    if (e instanceof DesignError) return { refused: e };
    throw e;
  }
}

describe('fuzz: random designs give outputs or a clear DesignError, never a crash (FUZZ_CASES=n for more)', () => {
  const CASES = Number(process.env.FUZZ_CASES ?? 200);
  const sources = DEMO_FILES.map((f) => YAML.parse(demoText(f)) as Json);

  it(`${CASES} seeded designs: valid XML, DXF an independent reader takes, byte-identical reruns`, async () => {
    const parser = new DxfParser();
    const seen = { refused: 0, built: 0, checked: 0 };
    for (let seed = 1; seed <= CASES; seed++) {
      const r = rng(seed * 7919);
      const text = designText(mutate(sources[seed % sources.length], r), r);
      const label = `seed ${seed}`;
      let result;
      try {
        result = await pipeline(text);
      } catch (e) {
        throw new Error(`${label}: not a DesignError: ${(e as Error).stack}\n--- design ---\n${text}`);
      }
      if ('refused' in result) {
        seen.refused++;
        // One line per problem, each naming a path (or the file) and never a stack trace.
        for (const line of result.refused.message.split('\n')) expect(line, label).toMatch(/^[^\s]+: .+/);
        continue;
      }
      seen.built++;
      for (const f of result.files) {
        if (f.path.endsWith('.svg')) expect(xmlProblem(f.data), `${label} ${f.path}`).toBeNull();
        else expect(parser.parseSync(f.data)?.entities?.length, `${label} ${f.path}`).toBeGreaterThan(0);
      }
      // Every fifth built design: the whole pipeline again gives the same bytes, and the checks run.
      if (seen.built % 5 === 1) {
        const again = await pipeline(text);
        expect(again, label).toEqual(result);
        const report = checkFrame(buildFrame(parseDesignText(text)));
        expect(report.summary.errors + report.summary.warnings, label).toBe(report.findings.filter((f) => f.severity !== 'info').length);
        seen.checked++;
      }
    }
    if (process.env.FUZZ_CASES) console.log(JSON.stringify(seen));
    // The mutations reach both sides: some designs are refused, some are built and checked.
    expect(seen.refused, JSON.stringify(seen)).toBeGreaterThan(CASES / 10);
    expect(seen.built, JSON.stringify(seen)).toBeGreaterThan(CASES / 10);
  }, 300_000);
});

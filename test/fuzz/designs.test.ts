import * as DxfParserModule from 'dxf-parser';
import { parse as parseCsv } from 'csv-parse/sync';
import YAML from 'yaml';
import { describe, expect, it } from 'vitest';
import { FloatingPartError, defaultMeshSizeMm, frameModes } from '../../src/analysis/index.js';
import { refuseLargeMeshes } from '../../src/analysis/meshLimit.js';
import { buildAssembly, hardwareList } from '../../src/assembly/index.js';
import { drawingFonts } from '../../src/cli/fonts.js';
import { quotePackage } from '../../src/export/quotePackage.js';
import { parseShopText } from '../../src/params/shop.js';
import { quoteParts } from '../../src/quote/index.js';
import { VariantRefusal, VariantRequestError } from '../../src/variant/errors.js';
import { makeVariant } from '../../src/variant/variant.js';
import { checkFrame } from '../../src/checks/index.js';
import { assemblyOutputs } from '../../src/cli/commands/assemblyFiles.js';
import { buildOutputs } from '../../src/cli/commands/build.js';
import { buildFrame } from '../../src/geometry/index.js';
import { DesignError, parseDesignText } from '../../src/params/index.js';
import { DEMO_FILES, demoText } from '../helpers/demo.js';
import { rng } from '../helpers/random.js';
import { xmlProblem } from '../helpers/xml.js';

// dxf-parser's default export under NodeNext (library-notes.md)
const DxfParser = ((DxfParserModule as unknown as { default?: unknown }).default ?? DxfParserModule) as new () => { parseSync(s: string): { entities?: unknown[] } | null };

const SHOP = parseShopText(demoText('hollin-row-shop.yaml'), 'hollin-row-shop.yaml');
const FONTS = drawingFonts();

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

/**
 * What build would write, as text, for a design text (with --force, so a design with errors is
 * written too); or the DesignError that refuses it. The same steps as `runBuild`: plates, the
 * assembly, the checks on both, the cut files and the assembly files.
 */
async function pipeline(text: string): Promise<{ files: Array<{ path: string; data: string }>; frameParts: number; errors: number; warnings: number } | { refused: DesignError }> {
  try {
    const design = parseDesignText(text, 'fuzz.yaml');
    const frame = buildFrame(design);
    const assembly = buildAssembly(design, frame);
    const report = checkFrame(frame, {}, assembly);
    const { files } = await buildOutputs(frame, 'out', { r2000: text.length % 2 === 0 });
    files.push(...assemblyOutputs(frame, assembly, report, 'out').files);
    return { files: files.map((f) => ({ path: f.path, data: String(f.data) })), frameParts: frame.parts.length, ...report.summary };
  } catch (e) {
    if (e instanceof DesignError) return { refused: e };
    throw e;
  }
}

describe('fuzz: random designs give outputs or a clear DesignError, never a crash (FUZZ_CASES=n for more)', () => {
  const CASES = Number(process.env.FUZZ_CASES ?? 200);
  // FUZZ_FROM=n starts a campaign at another seed (the suite always runs the same first cases).
  const FIRST = Number(process.env.FUZZ_FROM ?? 1);
  const sources = DEMO_FILES.map((f) => YAML.parse(demoText(f)) as Json);

  it(`${CASES} seeded designs: valid XML, DXF an independent reader takes, JSON and CSV that parse, byte-identical reruns, modes, a quote and a size variant of every twentieth frame`, async () => {
    const parser = new DxfParser();
    const seen = { refused: 0, built: 0, checked: 0, modes: 0, modesRefused: 0, quoted: 0, quoteRefused: 0, variants: 0, variantsRefused: 0 };
    const why: string[] = [];
    for (let seed = FIRST; seed < FIRST + CASES; seed++) {
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
        else if (f.path.endsWith('.dxf')) expect(parser.parseSync(f.data)?.entities?.length, `${label} ${f.path}`).toBeGreaterThan(0);
        else if (f.path.endsWith('.json')) expect(() => JSON.parse(f.data), `${label} ${f.path}`).not.toThrow();
        else {
          // csv-parse (strict: every row as many fields as the header) reads the hardware list.
          const rows = parseCsv(f.data) as string[][];
          expect(rows.length, `${label} ${f.path}`).toBeGreaterThan(1);
          expect(rows[0], `${label} ${f.path}`).toEqual(['item', 'standard', 'size', 'lengthMm', 'count', 'countPerBatch', 'use']);
        }
      }
      // Every twentieth built design: what `modes` runs (mesh limits, each part, the arms, the assembled
      // frame): finite, positive, ascending frequencies, or a refusal the command words in one line.
      if (seen.built % 20 === 1) {
        let all: number[][];
        try {
          const frame = buildFrame(parseDesignText(text, 'fuzz.yaml'));
          refuseLargeMeshes(frame.parts, defaultMeshSizeMm, true);
          const fm = frameModes(frame, { modes: 3, assembledModes: 4 });
          all = [...fm.parts.map((r) => r.modes), ...fm.arms.map((a) => a.modal.modes), fm.assembled?.modes ?? []].map((ms) => ms.map((m) => m.frequencyHz));
          seen.modes++;
        } catch (e) {
          if (!(e instanceof RangeError || e instanceof FloatingPartError)) throw new Error(`${label}: modes crashed: ${(e as Error).stack}\n--- design ---\n${text}`);
          expect((e as Error).message, label).not.toMatch(/\n/);
          seen.modesRefused++;
          all = [];
        }
        for (const hz of all) {
          hz.forEach((f, i) => {
            expect(Number.isFinite(f) && f > 0, `${label}: ${f} Hz`).toBe(true);
            if (i > 0) expect(f, `${label}: ascending`).toBeGreaterThanOrEqual(hz[i - 1]);
          });
        }
      }
      // Another twentieth of the built designs: what `quote --qty 2` writes:
      // quote.json, the drawing as SVG and PDF, each nested sheet as DXF and SVG; or a DesignError
      // (a part larger than every sheet).
      if (seen.built % 20 === 11) {
        let pkg;
        try {
          const design = parseDesignText(text, 'fuzz.yaml');
          const frame = buildFrame(design);
          const quote = quoteParts(frame.parts, { quantity: 2, shop: SHOP, toolDiameterMm: SHOP.toolDiameterMm ?? design.cutting.toolDiameterMm });
          const assembly = buildAssembly(design, frame);
          const checks = checkFrame(frame, { toolDiameterMm: quote.toolDiameterMm }, assembly).summary;
          pkg = await quotePackage(frame.parts, quote, { design: design.name, revision: design.revision, date: null, checks, hardware: hardwareList(assembly, design), fonts: FONTS });
        } catch (e) {
          if (!(e instanceof DesignError)) throw new Error(`${label}: quote crashed: ${(e as Error).stack}\n--- design ---\n${text}`);
          seen.quoteRefused++;
          pkg = null;
        }
        if (pkg) {
          seen.quoted++;
          for (const f of pkg.files) {
            const data = f.data;
            if (f.name.endsWith('.svg')) expect(xmlProblem(String(data)), `${label} ${f.name}`).toBeNull();
            else if (f.name.endsWith('.dxf')) expect(parser.parseSync(String(data))?.entities?.length, `${label} ${f.name}`).toBeGreaterThan(0);
            else if (f.name.endsWith('.json')) expect(() => JSON.parse(String(data)), `${label} ${f.name}`).not.toThrow();
            else {
              // A whole PDF: its header, and the end-of-file marker in its last bytes.
              const pdf = Buffer.from(data as Uint8Array);
              expect(pdf.subarray(0, 5).toString('latin1'), `${label} ${f.name}`).toBe('%PDF-');
              expect(pdf.subarray(-32).toString('latin1'), `${label} ${f.name}`).toContain('%%EOF');
            }
          }
        }
      }
      // A third twentieth: a size variant for other props (taking turns through four sizes), as `variant`
      // makes it: a design that parses, builds and passes its checks, or a refusal in words.
      if (seen.built % 20 === 6) {
        const props = ['3in', '5in', '7in', '10in'][Math.floor(seen.built / 20) % 4];
        try {
          const v = makeVariant(text, { props, wheelbase: 'auto', wheelbaseStepMm: 1, motor: 'auto' }, 'fuzz.yaml');
          const again = buildFrame(parseDesignText(v.text, 'variant.yaml'));
          expect(checkFrame(again).summary.errors, `${label} variant ${props}`).toBe(0);
          seen.variants++;
        } catch (e) {
          if (!(e instanceof VariantRefusal || e instanceof VariantRequestError || e instanceof DesignError)) throw new Error(`${label}: variant ${props} crashed: ${(e as Error).stack}\n--- design ---\n${text}`);
          expect((e as Error).message.length, label).toBeGreaterThan(10);
          seen.variantsRefused++;
          if (why.length < 8) why.push(`${label} variant ${props}: ${(e as Error).message.split('\n').slice(0, 2).join(' | ')}`);
        }
      }
      // Every fifth built design: the whole pipeline again gives the same bytes and the same counts.
      if (seen.built % 5 === 1) {
        const again = await pipeline(text);
        expect(again, label).toEqual(result);
        seen.checked++;
      }
    }
    if (process.env.FUZZ_CASES) console.log(JSON.stringify({ ...seen, why }, null, 1));
    // The mutations reach both sides: some designs are refused, some are built and checked.
    expect(seen.refused, JSON.stringify(seen)).toBeGreaterThan(CASES / 10);
    expect(seen.built, JSON.stringify(seen)).toBeGreaterThan(CASES / 10);
    expect(seen.modes, JSON.stringify(seen)).toBeGreaterThan(CASES / 200);
    expect(seen.quoted, JSON.stringify(seen)).toBeGreaterThan(CASES / 200);
    expect(seen.variants + seen.variantsRefused, JSON.stringify(seen)).toBeGreaterThan(CASES / 200);
  }, Math.max(300_000, CASES * 1000));
});

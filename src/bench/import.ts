import { checkOptions, checkParts } from '../checks/index.js';
import { importDxf } from '../import/index.js';
import type { BenchCase } from './types.js';

/**
 * A 10,000-entity drawing as a CAD program exports it: a 1,000 mm plate outline of LINEs and a
 * 50 × 50 grid of strap slots, each two LINEs and two ARCs in scrambled order, so that chaining
 * has to search (ASCII DXF, R12 entities, mm).
 */
export function manyEntityDxf(cells = 50, pitchMm = 20): string {
  const out: string[] = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES'];
  const ents: string[][] = [];
  const lineE = (x1: number, y1: number, x2: number, y2: number) => ['0', 'LINE', '8', 'CUT', '10', `${x1}`, '20', `${y1}`, '11', `${x2}`, '21', `${y2}`];
  const arcE = (cx: number, cy: number, r: number, a0: number, a1: number) => ['0', 'ARC', '8', 'CUT', '10', `${cx}`, '20', `${cy}`, '40', `${r}`, '50', `${a0}`, '51', `${a1}`];
  const size = cells * pitchMm + 10;
  ents.push(lineE(-10, -10, size, -10), lineE(size, -10, size, size), lineE(size, size, -10, size), lineE(-10, size, -10, -10));
  for (let i = 0; i < cells; i++) {
    for (let j = 0; j < cells; j++) {
      const x = i * pitchMm + 6;
      const y = j * pitchMm + 6;
      ents.push(lineE(x, y - 2, x + 8, y - 2), arcE(x + 8, y, 2, 270, 90), lineE(x + 8, y + 2, x, y + 2), arcE(x, y, 2, 90, 270));
    }
  }
  // A fixed shuffle (linear congruential) so the file is the same every run.
  let s = 12345;
  for (let k = ents.length - 1; k > 0; k--) {
    s = (s * 1103515245 + 12345) % 2147483648;
    const m = s % (k + 1);
    [ents[k], ents[m]] = [ents[m], ents[k]];
  }
  for (const e of ents) out.push(...e);
  out.push('0', 'ENDSEC', '0', 'EOF', '');
  return out.join('\n');
}

/**
 * A 10,000-entity sheet as a shop receives it: 10 × 10 plates 200 × 120 mm, each a rounded outline
 * of 4 LINEs and 4 ARCs and 92 M2 clearance holes (ISO 273 fine, 2.2 mm) (CIRCLEs) in a 23 × 4 grid, 100 entities per plate.
 */
export function sheetDxf(): string {
  const out: string[] = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES'];
  const push = (...xs: Array<string | number>) => out.push(...xs.map(String));
  for (let i = 0; i < 10; i++) {
    for (let j = 0; j < 10; j++) {
      const x0 = i * 210;
      const y0 = j * 130;
      const r = 5;
      const [x1, y1] = [x0 + 200, y0 + 120];
      push('0', 'LINE', '8', 'CUT', '10', x0 + r, '20', y0, '11', x1 - r, '21', y0);
      push('0', 'LINE', '8', 'CUT', '10', x1, '20', y0 + r, '11', x1, '21', y1 - r);
      push('0', 'LINE', '8', 'CUT', '10', x1 - r, '20', y1, '11', x0 + r, '21', y1);
      push('0', 'LINE', '8', 'CUT', '10', x0, '20', y1 - r, '11', x0, '21', y0 + r);
      push('0', 'ARC', '8', 'CUT', '10', x1 - r, '20', y0 + r, '40', r, '50', 270, '51', 0);
      push('0', 'ARC', '8', 'CUT', '10', x1 - r, '20', y1 - r, '40', r, '50', 0, '51', 90);
      push('0', 'ARC', '8', 'CUT', '10', x0 + r, '20', y1 - r, '40', r, '50', 90, '51', 180);
      push('0', 'ARC', '8', 'CUT', '10', x0 + r, '20', y0 + r, '40', r, '50', 180, '51', 270);
      for (let a = 0; a < 23; a++) for (let b = 0; b < 4; b++) push('0', 'CIRCLE', '8', 'CUT', '10', x0 + 10 + a * 8, '20', y0 + 22 + b * 25, '40', 1.1);
    }
  }
  out.push('0', 'ENDSEC', '0', 'EOF', '');
  return out.join('\n');
}

export const cases: BenchCase[] = [
  {
    name: 'import: 10,000-entity DXF read, chained, hygiene-checked',
    target: 'read + chain + file findings < 1 s',
    budgetMs: 1000,
    setup: () => manyEntityDxf(),
    run: (text) => importDxf(text as string, { name: 'grid', thicknessMm: 2 }),
    note: (r) => {
      const res = r as ReturnType<typeof importDxf>;
      return `${res.parts.length} part, ${res.parts[0]?.features.length ?? 0} slots, ${res.findings.length} findings`;
    },
  },
  {
    name: 'import: 10,000-entity sheet (100 plates) read, chained and checked (design rules)',
    target: 'import + checkParts < 1 s',
    budgetMs: 1000,
    setup: () => sheetDxf(),
    run: (text) => {
      const res = importDxf(text as string, { name: 'sheet', thicknessMm: 2 });
      return { parts: res.parts.length, report: checkParts(res.parts, checkOptions({ toolDiameterMm: 1 })) };
    },
    note: (r) => {
      const x = r as { parts: number; report: ReturnType<typeof checkParts> };
      return `${x.parts} parts, ${x.report.findings.length} design findings`;
    },
  },
];

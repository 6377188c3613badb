import * as DxfParserModule from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { arc, dist, distanceToLoop, lengthOf, line, pointAt, signedArea, tangentAt, type Segment } from '../../src/geometry/index.js';
import { overlap } from '../../src/import/clean.js';
import { overlappingPairs } from '../../src/import/spatial.js';
import { headerValue, parseDocument } from '../../src/import/document.js';
import { bulgeSegment, DEFAULT_LIMITS, DxfReadError, ellipseCurve, fitArcs, importDxf, nurbsCurve, parseDrawingUnit, unitFromInsunits } from '../../src/import/index.js';
import { fixtureText } from './helpers.js';

/** A minimal R12-style ASCII DXF around the given ENTITIES pairs. */
function dxf(entities: string, header = '0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n'): string {
  return `${header}0\nSECTION\n2\nENTITIES\n${entities}0\nENDSEC\n0\nEOF\n`;
}
const rect = (x0: number, y0: number, x1: number, y1: number, layer = '0'): string =>
  `0\nLWPOLYLINE\n8\n${layer}\n90\n4\n70\n1\n10\n${x0}\n20\n${y0}\n10\n${x1}\n20\n${y0}\n10\n${x1}\n20\n${y1}\n10\n${x0}\n20\n${y1}\n`;

describe('bulges (DXF Reference: bulge = tan(θ/4), negative clockwise)', () => {
  it('90° → 0.414213562, 180° → 1; radius R = c(1 + b²)/(4b)', () => {
    const quarter = bulgeSegment([10, 0], [0, 10], 0.414213562) as Extract<Segment, { kind: 'arc' }>;
    expect(quarter.sweepRad).toBeCloseTo(Math.PI / 2, 8);
    expect(quarter.radius).toBeCloseTo((Math.hypot(10, 10) * (1 + 0.414213562 ** 2)) / (4 * 0.414213562), 9);
    expect(quarter.center[0]).toBeCloseTo(0, 7);
    expect(quarter.center[1]).toBeCloseTo(0, 7);
    const half = bulgeSegment([0, 0], [10, 0], 1) as Extract<Segment, { kind: 'arc' }>;
    expect(half.sweepRad).toBeCloseTo(Math.PI, 12);
    expect(half.radius).toBeCloseTo(5, 12);
    // counter-clockwise from (0,0) to (10,0) bulges below the chord
    expect(pointAt(half, 0.5)[1]).toBeCloseTo(-5, 12);
    const cw = bulgeSegment([0, 0], [10, 0], -1);
    expect(pointAt(cw, 0.5)[1]).toBeCloseTo(5, 12);
  });
});

describe('units ($INSUNITS per the DXF Reference)', () => {
  it('maps 1 inch, 4 mm, 5 cm, 6 m; 0 is unitless', () => {
    expect(unitFromInsunits(1)).toBe('in');
    expect(unitFromInsunits(4)).toBe('mm');
    expect(unitFromInsunits(5)).toBe('cm');
    expect(unitFromInsunits(6)).toBe('m');
    expect(unitFromInsunits(0)).toBeNull();
    expect(parseDrawingUnit('Inches')).toBe('in');
    expect(parseDrawingUnit('parsec')).toBeNull();
  });

  it('cm file: a 5 × 3 cm rectangle is 1500 mm²', () => {
    const r = importDxf(dxf(rect(0, 0, 5, 3), '0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n5\n0\nENDSEC\n'), { name: 'p', thicknessMm: 2 });
    expect(signedArea(r.parts[0].outline)).toBeCloseTo(1500, 9);
  });
});

describe('curves fitted by arcs', () => {
  it('an ellipse 10 × 4: within the tolerance of the implicit equation, area πab (Archimedes), tangent-continuous', () => {
    const tol = 0.002;
    const segs = fitArcs(ellipseCurve([0, 0], [10, 0], [0, 4], 0, 2 * Math.PI), tol);
    for (const s of segs) {
      for (const t of [0, 0.25, 0.5, 0.75, 1]) {
        const [x, y] = pointAt(s, t);
        // distance to the ellipse ≈ |F| / |∇F| for F = x²/a² + y²/b² − 1
        const F = (x * x) / 100 + (y * y) / 16 - 1;
        const g = Math.hypot((2 * x) / 100, (2 * y) / 16);
        expect(Math.abs(F) / g).toBeLessThan(tol * 1.01);
      }
    }
    const area = signedArea(segs);
    expect(Math.abs(area - Math.PI * 40) / (Math.PI * 40)).toBeLessThan(1e-4);
    // Ramanujan's second perimeter approximation, error ~1e-10 relative at this eccentricity
    const h = (10 - 4) ** 2 / (10 + 4) ** 2;
    const perimeter = Math.PI * 14 * (1 + (3 * h) / (10 + Math.sqrt(4 - 3 * h)));
    expect(Math.abs(segs.reduce((a, s) => a + lengthOf(s), 0) - perimeter) / perimeter).toBeLessThan(1e-4);
  });

  it('a rational quadratic B-spline circle (Piegl & Tiller, The NURBS Book, 9-point circle) is exact', () => {
    const w = Math.SQRT1_2;
    const c = nurbsCurve(
      [[1, 0], [1, 1], [0, 1], [-1, 1], [-1, 0], [-1, -1], [0, -1], [1, -1], [1, 0]],
      [1, w, 1, w, 1, w, 1, w, 1],
      [0, 0, 0, 1, 1, 2, 2, 3, 3, 4, 4, 4],
      2,
    );
    for (let t = 0; t <= 4; t += 0.137) expect(Math.hypot(...c.point(t))).toBeCloseTo(1, 12);
  });

  it('refuses inconsistent spline data with a finding, not a crash', () => {
    const bad = '0\nSPLINE\n8\n0\n71\n3\n40\n0\n40\n1\n10\n0\n20\n0\n10\n1\n20\n1\n';
    const r = importDxf(dxf(bad + rect(0, 0, 50, 30)), { name: 'p', thicknessMm: 2 });
    expect(r.findings.find((f) => f.rule === 'dxf-bad-entity')?.message).toMatch(/SPLINE .*knots/);
    expect(r.parts).toHaveLength(1);
  });
});

describe('robust reading: a clear DxfReadError, never a crash or a hang', () => {
  const read = (text: string) => () => importDxf(text, { name: 'p', thicknessMm: 2 });

  it('binary DXF (written by ezdxf) is refused by its sentinel', () => {
    expect(read(fixtureText('binary.dxf'))).toThrow(/binary DXF/);
  });

  it('text that is not DXF', () => {
    expect(read('<svg xmlns="http://www.w3.org/2000/svg"></svg>\n')).toThrow(/not a DXF file/);
    expect(read('')).toThrow(/empty/);
    expect(read('%PDF-1.4\n1 0 obj\n')).toThrow(DxfReadError);
  });

  it('truncated files: mid-pair, mid-section, mid-block', () => {
    const full = fixtureText('line-arc-plate.dxf');
    const lines = full.split('\n');
    const entitiesAt = lines.findIndex((l) => l.trim() === 'ENTITIES');
    expect(read(lines.slice(0, entitiesAt + 40).join('\n'))).toThrow(/truncated/);
    expect(read(lines.slice(0, entitiesAt + 41).join('\n'))).toThrow(/truncated/);
    const blocksAt = lines.findIndex((l) => l.trim() === 'BLOCKS');
    expect(read(lines.slice(0, blocksAt + 10).join('\n'))).toThrow(/truncated/);
  });

  it('a non-number where a coordinate belongs names the line', () => {
    expect(read(dxf('0\nLINE\n8\n0\n10\nabc\n20\n0\n11\n1\n21\n1\n'))).toThrow(/line \d+: group code 10 needs a number, found "abc"/);
  });

  it('absurd coordinates and entity counts hit the limits', () => {
    expect(read(dxf('0\nLINE\n8\n0\n10\n1e300\n20\n0\n11\n1\n21\n1\n'))).toThrow(/beyond the reader's limit/);
    const many = '0\nLINE\n8\n0\n10\n0\n20\n0\n11\n1\n21\n1\n'.repeat(50);
    expect(() => importDxf(dxf(many), { name: 'p', limits: { ...DEFAULT_LIMITS, maxEntities: 20 } })).toThrow(/more than 20 entities/);
  });

  it('contour and segment limits refuse before the slow steps, naming the limit (and a caller\'s reason)', () => {
    // 30 circles: 30 contours by themselves, known right after exploding.
    const circles = Array.from({ length: 30 }, (_, i) => `0\nCIRCLE\n8\n0\n10\n${10 * i}\n20\n0\n40\n2\n`).join('');
    expect(() => importDxf(dxf(circles), { name: 'p', limits: { ...DEFAULT_LIMITS, maxContours: 20 } })).toThrow(/at least \d+ closed contours \(outlines and holes\), more than 20, the reader's limit/);
    // 30 squares of 4 lines: 30 contours once chained.
    const sq = (x: number) => [[x, 0, x + 5, 0], [x + 5, 0, x + 5, 5], [x + 5, 5, x, 5], [x, 5, x, 0]].map(([a, b, c, d]) => `0\nLINE\n8\n0\n10\n${a}\n20\n${b}\n11\n${c}\n21\n${d}\n`).join('');
    const squares = Array.from({ length: 30 }, (_, i) => sq(10 * i)).join('');
    expect(() => importDxf(dxf(squares), { name: 'p', limits: { ...DEFAULT_LIMITS, maxContours: 20 } })).toThrow(/has 30 closed contours/);
    expect(() => importDxf(dxf(squares), { name: 'p', limits: { ...DEFAULT_LIMITS, maxSegments: 100, reason: 'a test allows 100' } })).toThrow(/more than 100 lines and arcs, the limit here: a test allows 100/);
    expect(importDxf(dxf(squares), { name: 'p' }).parts.length).toBe(30);
  });

  it('a block that inserts itself, and an array insert of absurd size', () => {
    const blocks = '0\nSECTION\n2\nBLOCKS\n0\nBLOCK\n2\nLOOP\n10\n0\n20\n0\n0\nINSERT\n8\n0\n2\nLOOP\n10\n1\n20\n0\n0\nENDBLK\n0\nENDSEC\n';
    const text = `0\nSECTION\n2\nHEADER\n0\nENDSEC\n${blocks}0\nSECTION\n2\nENTITIES\n0\nINSERT\n8\n0\n2\nLOOP\n10\n0\n20\n0\n0\nENDSEC\n0\nEOF\n`;
    expect(read(text)).toThrow(/inserts itself/);
    const arrayed = text.replace('0\nINSERT\n8\n0\n2\nLOOP\n10\n0\n20\n0\n0\nENDSEC\n0\nEOF', '0\nINSERT\n8\n0\n2\nLOOP\n70\n100000\n71\n100000\n10\n0\n20\n0\n0\nENDSEC\n0\nEOF');
    expect(read(arrayed)).toThrow(/beyond the reader's limit/);
  });

  it('a missing block is an error finding, the rest is read', () => {
    const r = importDxf(dxf('0\nINSERT\n8\n0\n2\nGHOST\n10\n0\n20\n0\n' + rect(0, 0, 50, 30)), { name: 'p', thicknessMm: 2 });
    expect(r.findings.find((f) => f.rule === 'dxf-missing-block')!.severity).toBe('error');
    expect(r.parts).toHaveLength(1);
  });

  it('an empty drawing has no parts and says so', () => {
    const r = importDxf(dxf(''), { name: 'p', thicknessMm: 2 });
    expect(r.parts).toHaveLength(0);
    expect(r.findings.find((f) => f.rule === 'dxf-no-parts')!.severity).toBe('error');
  });

  it('a (0, 0, −1) extrusion mirrors x (arbitrary axis algorithm): a circle drawn at OCS x = 10 lands at x = −10', () => {
    const r = importDxf(dxf('0\nCIRCLE\n8\n0\n10\n10\n20\n5\n40\n20\n210\n0\n220\n0\n230\n-1\n'), { name: 'p', thicknessMm: 2 });
    const outline = r.parts[0].outline[0] as Extract<Segment, { kind: 'arc' }>;
    expect(outline.center).toEqual([-10, 5]);
  });
});

describe('the reader agrees with the independent npm dxf-parser on every fixture', () => {
  // dxf-parser's default export under NodeNext (library-notes.md)
  type Parsed = { header: Record<string, unknown>; blocks: Record<string, unknown>; entities: Array<Record<string, any>> };
  const Parser = ((DxfParserModule as any).default ?? DxfParserModule) as new () => { parseSync(s: string): Parsed };
  for (const f of ['line-arc-plate.dxf', 'bulge-arm.dxf', 'bulge-arm-r12.dxf', 'blocks.dxf', 'splines.dxf', 'annotation.dxf', 'inch-plate.dxf']) {
    it(f, () => {
      const text = fixtureText(f);
      const theirs = new Parser().parseSync(text);
      const ours = parseDocument(text, 1e7);
      const count = (types: string[]) => types.reduce<Record<string, number>>((m, t) => ({ ...m, [t]: (m[t] ?? 0) + 1 }), {});
      expect(count(ours.entities.map((e) => e.type))).toEqual(count(theirs.entities.map((e) => e.type)));
      expect([...ours.blocks.keys()].sort()).toEqual(Object.keys(theirs.blocks).sort());
      expect(headerValue(ours, '$INSUNITS', 70) === undefined ? undefined : Number(headerValue(ours, '$INSUNITS', 70))).toBe(theirs.header.$INSUNITS);
      // Circle centres and radii, and polyline vertices with their bulges, value for value.
      const circles = ours.entities.filter((e) => e.type === 'CIRCLE');
      const theirCircles = theirs.entities.filter((e) => e.type === 'CIRCLE');
      circles.forEach((c, i) => {
        const v = (code: number) => Number(c.pairs.find((p) => p.code === code)!.value);
        expect([v(10), v(20), v(40)]).toEqual([theirCircles[i].center.x, theirCircles[i].center.y, theirCircles[i].radius]);
      });
      const polys = theirs.entities.filter((e) => e.type === 'LWPOLYLINE');
      ours.entities.filter((e) => e.type === 'LWPOLYLINE').forEach((e, i) => {
        const xs = e.pairs.filter((p) => p.code === 10).map((p) => Number(p.value));
        expect(xs).toEqual(polys[i].vertices.map((v: { x: number }) => v.x));
        const bulges = e.pairs.filter((p) => p.code === 42).map((p) => Number(p.value));
        expect(bulges.filter((b) => b !== 0)).toEqual(polys[i].vertices.map((v: { bulge?: number }) => v.bulge ?? 0).filter((b: number) => b !== 0));
      });
    });
  }
});

describe('more entity cases', () => {
  it('fitted arcs meet with a common tangent (G1): no false corners for the bit-reach rule', () => {
    const w = 0.7;
    const c = nurbsCurve([[0, 0], [10, 20], [30, -10], [40, 10], [60, 0]], [1, w, 1, 2, 1], [0, 0, 0, 0, 0.5, 1, 1, 1, 1], 3);
    const segs = fitArcs(c, 0.002);
    expect(segs.length).toBeGreaterThan(4);
    for (let i = 0; i + 1 < segs.length; i++) {
      const a = tangentAt(segs[i], 1);
      const b = tangentAt(segs[i + 1], 0);
      expect(Math.abs(a[0] * b[1] - a[1] * b[0])).toBeLessThan(1e-6);
      expect(dist(pointAt(segs[i], 1), pointAt(segs[i + 1], 0))).toBeLessThan(1e-9);
    }
  });

  it('a SPLINE with fit points only passes through them and is flagged', () => {
    const fit = [[0, 0], [20, 15], [40, 0], [20, -15]];
    const spline = `0\nSPLINE\n8\n0\n70\n8\n71\n3\n74\n${fit.length + 1}\n${[...fit, fit[0]].map(([x, y]) => `11\n${x}\n21\n${y}\n`).join('')}`;
    const r = importDxf(dxf(spline), { name: 'p', thicknessMm: 2 });
    expect(r.findings.some((f) => f.rule === 'dxf-curve-approximated' && f.message.includes('SPLINE'))).toBe(true);
    expect(r.parts).toHaveLength(1);
    for (const p of fit) expect(distanceToLoop(r.parts[0].outline, p as [number, number])).toBeLessThan(1e-9);
  });

  it('an INSERT array (3 columns × 2 rows) gives six copies; block entities on layer 0 take the INSERT layer', () => {
    const blocks = '0\nSECTION\n2\nBLOCKS\n0\nBLOCK\n8\n0\n2\nHOLE\n70\n0\n10\n0\n20\n0\n0\nCIRCLE\n8\n0\n10\n0\n20\n0\n40\n1\n0\nENDBLK\n0\nENDSEC\n';
    const entities = `${rect(0, 0, 60, 40, 'CUT')}0\nINSERT\n8\nCUT\n2\nHOLE\n10\n10\n20\n10\n70\n3\n71\n2\n44\n20\n45\n20\n`;
    const text = `0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n${blocks}0\nSECTION\n2\nENTITIES\n${entities}0\nENDSEC\n0\nEOF\n`;
    const r = importDxf(text, { name: 'p', thicknessMm: 2, layers: ['CUT'] });
    const centres = r.parts[0].features.map((f) => f.centerMm);
    expect(centres).toEqual([[10, 10], [10, 30], [30, 10], [30, 30], [50, 10], [50, 30]]);
  });
});

describe('overlaps on one circle', () => {
  it('an arc over 0°–180° and one over 90°–270°: the second keeps only 180°–270°', () => {
    const first = arc([0, 0], 5, 0, Math.PI);
    const second = arc([0, 0], 5, Math.PI / 2, Math.PI);
    const o = overlap(first, second, 0.01)!;
    expect(o.kind).toBe('overlap');
    expect(o.lengthMm).toBeCloseTo((5 * Math.PI) / 2, 9);
    expect(o.rest).toHaveLength(1);
    const rest = o.rest[0] as Extract<Segment, { kind: 'arc' }>;
    expect(rest.startRad).toBeCloseTo(Math.PI, 12);
    expect(rest.sweepRad).toBeCloseTo(Math.PI / 2, 12);
  });

  it('a clockwise arc keeps its direction; a line inside another vanishes', () => {
    const o = overlap(arc([0, 0], 5, 0, Math.PI), arc([0, 0], 5, (3 * Math.PI) / 2, -Math.PI), 0.01)!;
    expect(o.rest).toHaveLength(1);
    expect((o.rest[0] as Extract<Segment, { kind: 'arc' }>).sweepRad).toBeCloseTo(-Math.PI / 2, 12);
    expect(overlap(line([0, 0], [10, 0]), line([2, 0], [8, 0]), 0.01)!.rest).toEqual([]);
  });
});

describe('entities that cannot be cut geometry', () => {
  it('unsupported types, tilted planes and paper space: reported or ignored, the plate still read', () => {
    const face = '0\n3DFACE\n8\n0\n10\n0\n20\n0\n30\n0\n11\n1\n21\n0\n31\n0\n12\n1\n22\n1\n32\n0\n13\n0\n23\n1\n33\n0\n';
    const tilted = '0\nCIRCLE\n8\n0\n10\n5\n20\n5\n40\n1\n210\n1\n220\n0\n230\n0\n';
    const paper = '0\nCIRCLE\n67\n1\n8\n0\n10\n500\n20\n500\n40\n3\n';
    const r = importDxf(dxf(face + tilted + paper + rect(0, 0, 50, 30)), { name: 'p', thicknessMm: 2 });
    const byRule = (rule: string) => r.findings.filter((f) => f.rule === rule);
    expect(byRule('dxf-unsupported-entity')[0].message).toContain('3DFACE');
    expect(byRule('dxf-not-planar')[0].message).toContain('extrusion 1, 0, 0');
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].features).toHaveLength(0); // neither the tilted nor the paper-space circle
  });
});

describe('pathological drawings end in a clear error, not a hang', () => {
  it('30,000 lines through one point', () => {
    const star = Array.from({ length: 30000 }, (_, i) => `0\nLINE\n8\n0\n10\n0\n20\n0\n11\n${Math.cos(i) * 50}\n21\n${Math.sin(i) * 50}\n`).join('');
    expect(() => importDxf(dxf(star), { name: 'p', thicknessMm: 2 })).toThrow(/extents overlap/);
  });
});

describe('spatial index', () => {
  it('overlappingPairs finds exactly the pairs a brute-force comparison finds (seeded random boxes, some huge)', () => {
    let s = 7;
    const r = () => ((s = (s * 16807) % 2147483647) / 2147483647);
    const boxes: Array<[number, number, number, number]> = [];
    for (let i = 0; i < 600; i++) {
      const x = r() * 500;
      const y = r() * 300;
      const w = i % 97 === 0 ? 400 * r() : 8 * r();
      const h = i % 89 === 0 ? 300 * r() : 8 * r();
      boxes.push([x, y, x + w, y + h]);
    }
    const pad = 0.5;
    const brute: Array<[number, number]> = [];
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i];
        const b = boxes[j];
        if (a[0] <= b[2] + pad && b[0] <= a[2] + pad && a[1] <= b[3] + pad && b[1] <= a[3] + pad) brute.push([i, j]);
      }
    }
    expect(brute.length).toBeGreaterThan(100);
    expect(overlappingPairs(boxes, pad)).toEqual(brute);
  });
});

describe('line endings and byte-order mark', () => {
  it('CRLF line endings and a UTF-8 byte-order mark read the same as the original', () => {
    const text = fixtureText('line-arc-plate.dxf');
    const plain = importDxf(text, { name: 'p', thicknessMm: 2 });
    const windows = importDxf(`\uFEFF${text.replace(/\r?\n/g, '\r\n')}`, { name: 'p', thicknessMm: 2 });
    expect(windows.parts).toEqual(plain.parts);
    expect(windows.findings).toEqual(plain.findings);
  });
});

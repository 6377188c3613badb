import { rng } from '../helpers/random.js';
import { describe, expect, it } from 'vitest';
import { segmentDistance } from '../../src/geometry/distance.js';
import { arc, line, pointAt } from '../../src/geometry/segment.js';
import type { BBox, Segment } from '../../src/geometry/types.js';
import { dist } from '../../src/geometry/vec.js';
import { buildBoxGrid, queryBoxGrid } from '../../src/checks/spatial.js';


function randomSegment(r: () => number): Segment {
  if (r() < 0.4) return line([r() * 40 - 20, r() * 40 - 20], [r() * 40 - 20, r() * 40 - 20]);
  return arc([r() * 40 - 20, r() * 40 - 20], 0.5 + r() * 12, r() * 2 * Math.PI, (r() * 2 - 1) * 2 * Math.PI);
}

/** Dense sampling of both segments: an independent upper bound on the distance. */
function sampledDistance(a: Segment, b: Segment, n: number): number {
  const pb = Array.from({ length: n + 1 }, (_, j) => pointAt(b, j / n));
  let best = Infinity;
  for (let i = 0; i <= n; i++) {
    const p = pointAt(a, i / n);
    for (const q of pb) best = Math.min(best, dist(p, q));
  }
  return best;
}

describe('segmentDistance against dense sampling (300 seeded random line/arc pairs)', () => {
  it('is never above the sampled minimum and within the sampling error of it', () => {
    const r = rng(20261201);
    for (let k = 0; k < 300; k++) {
      const a = randomSegment(r);
      const b = randomSegment(r);
      const exact = segmentDistance(a, b);
      const n = 300;
      const sampled = sampledDistance(a, b, n);
      // Sampling misses the minimum by at most half the larger sample spacing (curves of length ≤ 2π·12.5).
      const spacing = Math.max(lengthOf(a), lengthOf(b)) / n;
      expect(exact.distance, `case ${k}`).toBeLessThanOrEqual(sampled + 1e-9);
      expect(sampled - exact.distance, `case ${k}`).toBeLessThanOrEqual(spacing + 1e-9);
      // The reported pair really is that far apart and lies on the segments.
      expect(dist(exact.p, exact.q)).toBeCloseTo(exact.distance, 9);
      expect(dist(pointAt(a, exact.t), exact.p)).toBeLessThan(1e-6);
      expect(dist(pointAt(b, exact.u), exact.q)).toBeLessThan(1e-6);
    }
  });
});

const lengthOf = (s: Segment): number => (s.kind === 'line' ? dist(s.start, s.end) : Math.abs(s.sweepRad) * s.radius);

describe('box grid', () => {
  it('returns exactly the boxes a brute-force scan finds (seeded, with large and tiny boxes)', () => {
    const r = rng(7);
    const boxes: BBox[] = Array.from({ length: 500 }, () => {
      const x = r() * 200;
      const y = r() * 200;
      const w = r() < 0.05 ? r() * 200 : r() * 4;
      const h = r() < 0.05 ? r() * 200 : r() * 4;
      return [x, y, x + w, y + h];
    });
    const g = buildBoxGrid(boxes);
    for (let k = 0; k < 200; k++) {
      const x = r() * 220 - 10;
      const y = r() * 220 - 10;
      const q: BBox = [x, y, x + r() * 30, y + r() * 30];
      const pad = r() * 5;
      const brute = boxes
        .map((b, i) => (b[0] > q[2] + pad || q[0] > b[2] + pad || b[1] > q[3] + pad || q[1] > b[3] + pad ? -1 : i))
        .filter((i) => i >= 0);
      expect(queryBoxGrid(g, q, pad).sort((a, b) => a - b)).toEqual(brute);
    }
  });

  it('keeps long thin items (member centrelines) in cells of their own neighbourhood', () => {
    // 200 horizontal centrelines 10 mm apart across a 2,000 mm plate, as the bench's drilled plate has:
    // sized by their length, one cell held them all and every query met all 200.
    const lines: BBox[] = Array.from({ length: 200 }, (_, j) => [0, 10 * j, 2000, 10 * j]);
    const g = buildBoxGrid(lines);
    expect(g.cellMm).toBeLessThan(200);
    let met = 0;
    for (let j = 0; j < 200; j += 7) {
      const q: BBox = [1000, 10 * j + 5, 1000, 10 * j + 5];
      const got = queryBoxGrid(g, q, 8).sort((a, b) => a - b);
      expect(got).toEqual([j, j + 1].filter((k) => k < 200)); // the two lines within 8 mm of a point 5 mm off a line
      met += got.length;
    }
    expect(met).toBeLessThan(60);
  });
});

import { EndType, JoinType, inflatePathsD } from 'clipper2-ts';
import { describe, expect, it } from 'vitest';
import { vanishesForTool } from '../../src/checks/bitReach.js';
import { flattenLoop, reverseLoop, roundedRect, slot, type Loop } from '../../src/geometry/index.js';
import { rng } from '../helpers/random.js';

/** The void eroded by r with clipper2 (an independent polygon library) directly: empty or not. */
function clipperVanishes(hole: Loop, r: number): boolean {
  const pts = flattenLoop(reverseLoop(hole), 0.001).map(([x, y]) => ({ x, y }));
  return inflatePathsD([pts], -r, JoinType.Round, EndType.Polygon, 2, 6, 0.001).length === 0;
}

describe('bit reach: a cut-out the tool cannot enter', () => {
  it('the exact shortcut (a point deeper than the tool radius) agrees with a clipper2 erosion on 400 seeded slots and rounded cut-outs', () => {
    const random = rng(2026);
    const R = 3.175 / 2;
    let vanished = 0;
    for (let i = 0; i < 400; i++) {
      // Widths around the tool diameter, so both answers occur; outside the ±0.05 mm band where the 0.02 mm margin decides.
      let w = 2 * R * (0.6 + 0.8 * random());
      if (Math.abs(w - 2 * R) < 0.05) w += 0.1;
      const len = w + 20 * random();
      const at: [number, number] = [100 * random(), 100 * random()];
      const shape = i % 2 ? slot(at, [at[0] + len, at[1] + 3 * random()], w) : roundedRect(at, len, w, (w / 2) * random());
      const hole = reverseLoop(shape);
      const ours = vanishesForTool(hole, R);
      expect(ours, `case ${i}: width ${w.toFixed(3)}`).toBe(clipperVanishes(hole, R));
      if (ours) vanished++;
    }
    expect(vanished).toBeGreaterThan(50);
    expect(vanished).toBeLessThan(350);
  });
});

import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { frameOverviewSvg, partToSvg } from '../../src/export/index.js';
import { partBBox } from '../../src/geometry/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';

/** Fraction of pixels that are not transparent/white. */
function inkFraction(svg: string, widthPx: number): number {
  const img = new Resvg(svg, { fitTo: { mode: 'width', value: widthPx }, background: 'white' }).render();
  const px = img.pixels;
  let ink = 0;
  for (let i = 0; i < px.length; i += 4) if (px[i] < 200 || px[i + 1] < 200 || px[i + 2] < 200) ink++;
  return ink / (px.length / 4);
}

describe('SVG', () => {
  for (const file of DEMO_FILES) {
    const frame = demoFrame(file);
    for (const part of frame.parts) {
      it(`${file} ${part.name}: size in mm equals the bounding box; renders to a non-blank image`, () => {
        const svg = partToSvg(part);
        const b = partBBox(part);
        const w = Number(/width="([0-9.]+)mm"/.exec(svg)![1]);
        const h = Number(/height="([0-9.]+)mm"/.exec(svg)![1]);
        expect(w).toBeCloseTo(b[2] - b[0], 3);
        expect(h).toBeCloseTo(b[3] - b[1], 3);
        // viewBox in the same numbers: one user unit is one millimetre (CSS Values 3, SVG 2)
        expect(svg).toContain(`viewBox="0 0 ${/width="([0-9.]+)mm"/.exec(svg)![1]} ${/height="([0-9.]+)mm"/.exec(svg)![1]}"`);
        const ink = inkFraction(svg, 400);
        expect(ink).toBeGreaterThan(0.002);
        expect(ink).toBeLessThan(0.5);
      });
    }
    it(`${file} overview renders with plates and prop discs`, () => {
      const svg = frameOverviewSvg(frame);
      expect((svg.match(/<circle[^>]*stroke-dasharray/g) ?? []).length).toBe(4);
      if (frame.design.camera) expect(svg).toContain('<title>camera</title>');
      expect(inkFraction(svg, 500)).toBeGreaterThan(0.1);
    });
  }
});

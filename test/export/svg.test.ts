import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { frameOverviewSvg, partToSvg } from '../../src/export/index.js';
import { partBBox } from '../../src/geometry/index.js';
import { DEMO_FILES, demoFrame } from '../helpers/demo.js';
import { viewBoxOf } from '../helpers/render.js';

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
      it(`${file} ${part.name}: front up, 1 unit = 1 mm, the whole part and its stroke in the viewBox; renders`, () => {
        const svg = partToSvg(part);
        const b = partBBox(part);
        const vb = viewBoxOf(svg);
        // width and height in mm equal the viewBox: one user unit is one millimetre (CSS Values 3, SVG 2)
        expect(Number(/width="([0-9.]+)mm"/.exec(svg)![1])).toBeCloseTo(vb.w, 3);
        expect(Number(/height="([0-9.]+)mm"/.exec(svg)![1])).toBeCloseTo(vb.h, 3);
        // Plan-view convention: screen x = −y, screen y = −x; the 0.2 mm stroke's outer half included.
        expect(vb.x).toBeLessThanOrEqual(-b[3] - 0.1);
        expect(vb.y).toBeLessThanOrEqual(-b[2] - 0.1);
        expect(vb.x + vb.w).toBeGreaterThanOrEqual(-b[1] + 0.1);
        expect(vb.y + vb.h).toBeGreaterThanOrEqual(-b[0] + 0.1);
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

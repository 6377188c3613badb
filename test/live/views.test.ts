import { describe, expect, it } from 'vitest';
import { designJsonSchema } from '../../src/params/jsonSchema.js';
import type { SchemaNode } from '../../src/live/form.js';
import { liveModel } from '../../src/live/model.js';
import type { SvgView } from '../../src/live/views.js';
import { DEMO_FILES, demoText } from '../helpers/demo.js';
import { commandAvailable, requireTool } from '../helpers/reference.js';
import { chromiumTextBoxes, drawnExtent, ONE_PIXEL_MM, overlappingTexts } from '../helpers/render.js';

const schema = designJsonSchema() as SchemaNode;

/** Every picture of the live page for the demo designs, each as a stand-alone SVG file (no page style sheet). */
function livePictures(): Array<{ name: string; view: SvgView; svg: string }> {
  const out: Array<{ name: string; view: SvgView; svg: string }> = [];
  for (const file of DEMO_FILES) {
    const views = liveModel(demoText(file), { version: 1, file, schema, previous: null }).model.views!;
    const all: Array<[string, SvgView]> = [['plan', views.plan], ...(views.side ? [['side', views.side] as [string, SvgView]] : []), ...views.parts.map((p): [string, SvgView] => [`part ${p.name}`, p.view])];
    for (const [name, view] of all) {
      const [x, y, w, h] = view.viewBox;
      const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}mm" height="${h}mm" viewBox="${x} ${y} ${w} ${h}" font-family="sans-serif">${view.markup}</svg>`;
      out.push({ name: `${file} ${name}`, view, svg });
    }
  }
  return out;
}

const pictures = livePictures();

describe('the live page draws its views in the shared picture convention', () => {
  it('a front arrow, a scale bar and a legend in every view; a part view says where its +x points', () => {
    for (const p of pictures) {
      expect(p.view.markup, p.name).toContain('class="front-arrow"');
      expect(p.view.markup, p.name).toContain('class="scale-bar"');
      expect(p.view.markup, p.name).toContain('class="legend"');
    }
    // Arms point their motor end up, as in the exported part pictures (src/export/svgPart.ts).
    expect(pictures.find((p) => /tessel-5.yaml part arm$/.test(p.name))!.view.markup).toContain('>motor end</text>');
    // Tip gaps and stack-up heights are placed labels.
    expect(pictures.find((p) => p.name === 'tessel-5.yaml plan')!.view.markup).toMatch(/<text class="tip-gap"/);
    expect(pictures.find((p) => p.name === 'tessel-5.yaml side')!.view.markup).toMatch(/<text class="dimension-label"/);
  });

  it('rsvg-convert: everything drawn lies inside the view box, which keeps at most 5 mm round it', () => {
    if (!requireTool(commandAvailable('rsvg-convert'), 'rsvg-convert')) return;
    for (const p of pictures) {
      const { drawn, viewBox } = drawnExtent(p.svg);
      expect(drawn, p.name).not.toBeNull();
      // One pixel of anti-aliasing; 4 mm margin (2 mm for parts) plus 1 mm for text widths.
      const slack = [drawn!.x - viewBox.x, drawn!.y - viewBox.y, viewBox.x + viewBox.w - drawn!.x - drawn!.w, viewBox.y + viewBox.h - drawn!.y - drawn!.h];
      for (const s of slack) {
        expect(s, `${p.name}: margins ${slack.map((v) => v.toFixed(2)).join(' ')}`).toBeGreaterThanOrEqual(-ONE_PIXEL_MM);
        expect(s, `${p.name}: margins ${slack.map((v) => v.toFixed(2)).join(' ')}`).toBeLessThanOrEqual(5);
      }
    }
  }, 240_000);

  it('chromium: no two texts overlap', () => {
    if (!requireTool(commandAvailable('chromium'), 'chromium')) return;
    chromiumTextBoxes(pictures.map((p) => p.svg)).forEach((b, i) => {
      expect(b.texts.length, pictures[i].name).toBeGreaterThan(1);
      expect(overlappingTexts(b.texts).map(([x, y]) => `"${x.text}" / "${y.text}"`), pictures[i].name).toEqual([]);
    });
  });
});

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inflateSync } from 'node:zlib';

/**
 * Pictures checked in real renderers: rsvg-convert (librsvg) for what is drawn outside the viewBox,
 * chromium for the boxes of the text as laid out with real fonts.
 */

type ViewBox = { x: number; y: number; w: number; h: number };

export function viewBoxOf(svg: string): ViewBox {
  const m = /<svg[^>]*viewBox="([-0-9.e]+) ([-0-9.e]+) ([-0-9.e]+) ([-0-9.e]+)"/.exec(svg);
  if (!m) throw new Error('no viewBox');
  return { x: Number(m[1]), y: Number(m[2]), w: Number(m[3]), h: Number(m[4]) };
}

/** RGBA pixels of an 8-bit RGBA, non-interlaced PNG (what rsvg-convert writes). PNG spec, filters 0–4. */
export function decodePng(buf: Buffer): { width: number; height: number; rgba: Uint8Array } {
  let off = 8;
  let width = 0;
  let height = 0;
  const idat: Buffer[] = [];
  while (off < buf.length) {
    const len = buf.readUInt32BE(off);
    const type = buf.toString('ascii', off + 4, off + 8);
    const data = buf.subarray(off + 8, off + 8 + len);
    if (type === 'IHDR') {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      if (data[8] !== 8 || data[9] !== 6 || data[12] !== 0) throw new Error('expected 8-bit RGBA, not interlaced');
    } else if (type === 'IDAT') idat.push(data);
    off += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * 4;
  const out = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++) {
    const f = raw[y * (stride + 1)];
    for (let x = 0; x < stride; x++) {
      const v = raw[y * (stride + 1) + 1 + x];
      const a = x >= 4 ? out[y * stride + x - 4] : 0;
      const b = y > 0 ? out[(y - 1) * stride + x] : 0;
      const c = x >= 4 && y > 0 ? out[(y - 1) * stride + x - 4] : 0;
      let p = 0;
      if (f === 1) p = a;
      else if (f === 2) p = b;
      else if (f === 3) p = (a + b) >> 1;
      else if (f === 4) {
        const pa = Math.abs(b - c);
        const pb = Math.abs(a - c);
        const pc = Math.abs(a + b - 2 * c);
        p = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      out[y * stride + x] = (v + p) & 255;
    }
  }
  return { width, height, rgba: out };
}

/**
 * Renders the picture with rsvg-convert inside a frame `padFraction` larger on every side, and
 * returns the bounding box (in the picture's user units) of every pixel drawn, and the viewBox.
 * Content inside the viewBox means nothing was clipped.
 */
/**
 * Resolution of the extent renders: 4 px per mm. Pictures keep a 4 mm margin round what they draw,
 * so a clipped stroke or text shows by millimetres; a quarter millimetre finds it at a quarter of the
 * pixels of 8 px/mm (the render checks were the suite's slowest test).
 */
export const RENDER_PX_PER_MM = 4;
/** One pixel of the extent render, in mm: the anti-aliasing allowance of the checks. */
export const ONE_PIXEL_MM = 1 / RENDER_PX_PER_MM;

export function drawnExtent(svg: string, pxPerUnit = RENDER_PX_PER_MM, padFraction = 0.1): { drawn: ViewBox | null; viewBox: ViewBox } {
  const vb = viewBoxOf(svg);
  const pad = Math.max(vb.w, vb.h) * padFraction;
  const outer = { x: vb.x - pad, y: vb.y - pad, w: vb.w + 2 * pad, h: vb.h + 2 * pad };
  // The picture's own content inside a larger canvas; its root attributes (font) move to a group.
  const open = /<svg[^>]*>/.exec(svg)![0];
  const font = /font-family="([^"]*)"/.exec(open)?.[1] ?? 'sans-serif';
  // The background rectangle fills the viewBox exactly; without it only real content is measured.
  const inner = svg.slice(svg.indexOf(open) + open.length, svg.lastIndexOf('</svg>')).replace(/<rect class="background"[^>]*\/>/, '');
  const wrapped = `<svg xmlns="http://www.w3.org/2000/svg" width="${outer.w * pxPerUnit}" height="${outer.h * pxPerUnit}" viewBox="${outer.x} ${outer.y} ${outer.w} ${outer.h}"><g font-family="${font}">${inner}</g></svg>`;
  const dir = mkdtempSync(join(tmpdir(), 'fw-render-'));
  try {
    writeFileSync(join(dir, 'in.svg'), wrapped);
    const r = spawnSync('rsvg-convert', ['-f', 'png', '-o', join(dir, 'out.png'), join(dir, 'in.svg')], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`rsvg-convert failed: ${r.stderr}`);
    const png = decodePng(readFileSync(join(dir, 'out.png')));
    let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
    for (let y = 0; y < png.height; y++) {
      for (let x = 0; x < png.width; x++) {
        if (png.rgba[(y * png.width + x) * 4 + 3] === 0) continue;
        x0 = Math.min(x0, x);
        y0 = Math.min(y0, y);
        x1 = Math.max(x1, x + 1);
        y1 = Math.max(y1, y + 1);
      }
    }
    const k = png.width / outer.w;
    const drawn = x1 < 0 ? null : { x: outer.x + x0 / k, y: outer.y + y0 / k, w: (x1 - x0) / k, h: (y1 - y0) / k };
    return { drawn, viewBox: vb };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export type TextBox = { text: string; x0: number; y0: number; x1: number; y1: number; cls: string };

/**
 * Lays every picture out in headless chromium and returns, per picture, the boxes of its text
 * elements in the picture's user units (getBoundingClientRect, so transforms and real glyph widths
 * count) and the picture's own box. Chromium resolves the generic `sans-serif` to its own default
 * (a narrower face than fontconfig's); `family` forces a face for a worst-case layout.
 */
export function chromiumTextBoxes(svgs: readonly string[], options: { family?: string } = {}): Array<{ texts: TextBox[]; svg: { x0: number; y0: number; x1: number; y1: number } }> {
  const dir = mkdtempSync(join(tmpdir(), 'fw-chromium-'));
  try {
    const body = svgs.map((s, i) => `<div id="p${i}">${s.replace(/<\?xml[^>]*>/, '').replace(/<!--[\s\S]*?-->/g, '')}</div>`).join('\n');
    const script = `
const out = [];
document.querySelectorAll('body > div').forEach((div) => {
  const svg = div.querySelector('svg');
  const r = svg.getBoundingClientRect();
  const vb = svg.viewBox.baseVal;
  const k = vb.width / r.width;
  const conv = (b) => ({ x0: vb.x + (b.left - r.left) * k, y0: vb.y + (b.top - r.top) * k, x1: vb.x + (b.right - r.left) * k, y1: vb.y + (b.bottom - r.top) * k });
  const texts = [...svg.querySelectorAll('text')].filter((t) => t.textContent.length).map((t) => ({ text: t.textContent, cls: t.getAttribute('class') || '', ...conv(t.getBoundingClientRect()) }));
  out.push({ texts, svg: conv(r) });
});
document.getElementById('out').textContent = JSON.stringify(out);`;
    const style = options.family ? `<style>svg text { font-family: "${options.family}" !important; }</style>` : '';
    writeFileSync(join(dir, 'page.html'), `<!DOCTYPE html><html><head>${style}</head><body style="margin:0">${body}<pre id="out"></pre><script>${script}</script></body></html>`);
    const r = spawnSync('chromium', ['--headless', '--no-sandbox', '--disable-gpu', '--dump-dom', `file://${join(dir, 'page.html')}`], { encoding: 'utf8', maxBuffer: 512 * 1024 * 1024, timeout: 120_000 });
    const m = /<pre id="out">([^<]*)<\/pre>/.exec(r.stdout ?? '');
    if (!m) throw new Error(`chromium gave no result (${r.status}): ${r.stderr?.slice(0, 500)}`);
    return JSON.parse(m[1].replace(/&quot;/g, '"').replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>'));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Pairs of text boxes that overlap by more than tolMm in both directions. */
export function overlappingTexts(texts: readonly TextBox[], tolMm = 0.05): Array<[TextBox, TextBox]> {
  const out: Array<[TextBox, TextBox]> = [];
  for (let i = 0; i < texts.length; i++) {
    for (let j = i + 1; j < texts.length; j++) {
      const a = texts[i];
      const b = texts[j];
      const ox = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
      const oy = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
      if (ox > tolMm && oy > tolMm) out.push([a, b]);
    }
  }
  return out;
}

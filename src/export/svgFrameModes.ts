import type { FrameModeShape, RestAndMoved } from '../analysis/frameShape.js';
import type { Vec3 } from '../assembly/types.js';
import { fmt, xmlEscape } from './format.js';

/** What a picture of one assembled-frame mode shows (the analysis computed the shape). */
export type FrameModePlot = Readonly<{
  title: string;
  frequencyHz: number;
  /** The mode's name, e.g. "body twist (diagonal motor pairs in opposition)". */
  name: string;
  /** Extra lines under the name (what the gyro and camera feel, the stiffest part to change). */
  notes?: readonly string[];
  shape: FrameModeShape;
}>;

type View = Readonly<{ caption: string; project: (p: Vec3) => [number, number]; frontArrow: 'up' | 'right' }>;

/** Plan view: front (+x) up, left (+y) to the left. Side view from the right: front to the right, up (+z) up. SVG y runs down. */
const VIEWS: readonly View[] = [
  { caption: 'plan, from above', project: (p) => [-p[1], -p[0]], frontArrow: 'up' },
  { caption: 'side, from the right', project: (p) => [p[0], -p[2]], frontArrow: 'right' },
];

const REST = '#9a9a9a';
const MOVED = '#c0262d';
const CAUTION = 'Estimate from a finite-element model of the assembled frame, not a certification. Test a new frame with props off first.';
const MARGIN = 8;
const TEXT = 5;

/** A round scale-bar length near a quarter of the span: 1, 2 or 5 × 10ⁿ mm. */
function scaleBarMm(span: number): number {
  const target = span / 4;
  const p = 10 ** Math.floor(Math.log10(target));
  return [5, 2, 1].map((k) => k * p).find((v) => v <= target) ?? p;
}

const path = (pts: readonly [number, number][], closed: boolean) => `M${pts.map((q) => `${fmt(q[0], 2)} ${fmt(q[1], 2)}`).join('L')}${closed ? 'Z' : ''}`;

/**
 * One frame mode as SVG: a plan view (front up, with a front arrow) and a side view (front to the
 * right), each with the frame at rest in grey and moved by the mode in red (exaggerated, the scale
 * stated), the motors marked and named, a scale bar, the frequency, the mode's name and notes, and a
 * caution line. One user unit is one millimetre; deterministic output.
 */
export function frameModeSvg(plot: FrameModePlot): string {
  const { shape } = plot;
  const lines: RestAndMoved[] = [...shape.outlines, ...shape.connectors];
  const header = (2 + (plot.notes?.length ?? 0)) * TEXT + 4;
  const panels: string[] = [];
  let x = MARGIN;
  let height = 0;
  for (const view of VIEWS) {
    let [u0, v0, u1, v1] = [Infinity, Infinity, -Infinity, -Infinity];
    for (const l of [...lines, ...shape.motors]) {
      for (const p of [...l.rest, ...l.moved]) {
        const [u, v] = view.project(p);
        [u0, v0, u1, v1] = [Math.min(u0, u), Math.min(v0, v), Math.max(u1, u), Math.max(v1, v)];
      }
    }
    const ox = x - u0;
    const oy = header + 2 * TEXT - v0;
    const at = (p: Vec3): [number, number] => {
      const [u, v] = view.project(p);
      return [u + ox, v + oy];
    };
    const drawn = (which: 'rest' | 'moved', colour: string, width: number) => [
      `<g id="${view.frontArrow === 'up' ? 'plan' : 'side'}-${which}" fill="none" stroke="${colour}" stroke-width="${width}" stroke-linejoin="round">`,
      ...shape.outlines.map((o) => `<path d="${path(o[which].map(at), true)}"${o.hole ? ' stroke-width="' + fmt(width * 0.6, 2) + '"' : ''}/>`),
      ...shape.connectors.map((c) => `<path d="${path(c[which].map(at), false)}"/>`),
      ...shape.motors.map((m) => {
        const [b, c] = m[which].map(at);
        return `<path d="${path([b, c], false)}" stroke-width="${fmt(2 * width, 2)}"/><circle cx="${fmt(b[0], 2)}" cy="${fmt(b[1], 2)}" r="2"/>`;
      }),
      '</g>',
    ];
    const w = u1 - u0;
    const bar = scaleBarMm(Math.max(w, v1 - v0));
    const barY = oy + v1 + 6;
    // The plan view's front arrow stands just right of the drawing, clear of the motors.
    const ax = x + w + 6;
    const arrow =
      view.frontArrow === 'up'
        ? `<path d="M${fmt(ax, 2)} ${fmt(header + 2 * TEXT + 16, 2)}V${fmt(header + 2 * TEXT, 2)}l-2.5 5M${fmt(ax, 2)} ${fmt(header + 2 * TEXT, 2)}l2.5 5"/><text x="${fmt(ax, 2)}" y="${fmt(header + 2 * TEXT + 21, 2)}" text-anchor="middle" stroke="none" fill="#000000" font-size="3.5">front</text>`
        : `<path d="M${fmt(x + w - 16, 2)} ${fmt(barY, 2)}H${fmt(x + w, 2)}l-5 -2.5M${fmt(x + w, 2)} ${fmt(barY, 2)}l-5 2.5"/><text x="${fmt(x + w - 18, 2)}" y="${fmt(barY + 1.2, 2)}" text-anchor="end" stroke="none" fill="#000000" font-size="3.5">front</text>`;
    panels.push(
      `<g id="${view.frontArrow === 'up' ? 'plan' : 'side'}-view" font-family="sans-serif">`,
      `<text x="${fmt(x, 2)}" y="${fmt(header + TEXT, 2)}" font-size="3.5">${xmlEscape(view.caption)}</text>`,
      ...drawn('rest', REST, 0.35),
      ...drawn('moved', MOVED, 0.5),
      ...(view.frontArrow === 'up'
        ? shape.motors.map((m) => {
            // The motor's vertical motion, which the plan view cannot show: up or down, relative to the largest motion.
            const dz = (m.moved[0][2] - m.rest[0][2]) / shape.exaggeration;
            const p = at(m.rest[0]);
            return `<text x="${fmt(p[0], 2)}" y="${fmt(p[1] + 6, 2)}" font-size="3" text-anchor="middle" stroke="#ffffff" stroke-width="0.8" paint-order="stroke">${xmlEscape(`${m.site}, ${dz >= 0 ? 'up' : 'down'} ${fmt(Math.abs(dz), 2)}`)}</text>`;
          })
        : []),
      `<g stroke="#000000" stroke-width="0.5" fill="none">${arrow}</g>`,
      `<g id="scale-bar" stroke="#000000" stroke-width="0.6"><path d="M${fmt(x, 2)} ${fmt(barY, 2)}h${fmt(bar, 2)}M${fmt(x, 2)} ${fmt(barY - 1.5, 2)}v3M${fmt(x + bar, 2)} ${fmt(barY - 1.5, 2)}v3"/></g>`,
      `<text x="${fmt(x + bar / 2, 2)}" y="${fmt(barY + 5, 2)}" font-size="3" text-anchor="middle">${bar} mm</text>`,
      '</g>',
    );
    x += w + 4 * MARGIN;
    height = Math.max(height, barY + 8);
  }
  const width = Math.max(x - 2 * MARGIN, 160);
  height += 3 * TEXT;
  const head = [`${fmt(plot.frequencyHz, 1)} Hz — ${plot.title}`, plot.name, ...(plot.notes ?? [])];
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(width, 2)}mm" height="${fmt(height, 2)}mm" viewBox="0 0 ${fmt(width, 2)} ${fmt(height, 2)}" font-family="sans-serif">`,
    `<title>${xmlEscape(`${plot.title}: ${fmt(plot.frequencyHz, 1)} Hz`)}</title>`,
    ...head.map((t, i) => `<text x="${MARGIN}" y="${fmt((i + 1) * TEXT, 2)}" font-size="${i === 0 ? 4 : 3.2}">${xmlEscape(t)}</text>`),
    ...panels,
    `<text x="${MARGIN}" y="${fmt(height - TEXT - 1, 2)}" font-size="3">${xmlEscape(`grey: at rest; red: moved by the mode, exaggerated (the largest motion drawn as ${fmt(shape.exaggeration, 0)} mm)`)}</text>`,
    `<text x="${MARGIN}" y="${fmt(height - 1.5, 2)}" font-size="2.8">${xmlEscape(CAUTION)}</text>`,
    '</svg>',
    '',
  ].join('\n');
}

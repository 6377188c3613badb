import type { FrameModeShape } from '../analysis/frameShape.js';
import type { Vec3 } from '../assembly/types.js';
import type { Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, frontArrow, legend, niceLengthMm, padBox, placeLabels, labelsSvg, scaleBar, svgDocument, svgText, textBox, unionBox, PLAN_VIEW, type Box } from './picture.js';

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

type View = Readonly<{ id: 'plan' | 'side'; caption: string; project: (p: Vec3) => Vec2; front: 'up' | 'right' }>;

/** The picture convention (src/export/picture.ts): plan front up and left to the left; the side view from the right, front to the right. */
const VIEWS: readonly View[] = [
  { id: 'plan', caption: 'plan, from above', project: (p) => PLAN_VIEW.map([p[0], p[1]]), front: 'up' },
  { id: 'side', caption: 'side, from the right', project: (p) => [p[0] + 0, -p[2] + 0], front: 'right' },
];

const REST = '#9a9a9a';
const MOVED = '#c0262d';
const CAUTION = 'Estimate from a finite-element model of the assembled frame, not a certification. Test a new frame with props off first.';
const GAP = 20;
const HEAD_MM = 4;
const LINE_MM = 3.2;

const path = (pts: readonly Vec2[], closed: boolean) => `M${pts.map((q) => `${fmt(q[0], 2)} ${fmt(q[1], 2)}`).join('L')}${closed ? 'Z' : ''}`;

/**
 * One frame mode as SVG: a plan view (front up) and a side view (front to the right), each with the
 * frame at rest in grey and moved by the mode in red (exaggerated, the scale stated in the legend),
 * the motors marked, named with their vertical motion in the plan view, a front arrow and a scale bar
 * under each view, the frequency, the mode's name and notes, and a caution. One user unit is one
 * millimetre; the viewBox holds every stroke and label; deterministic output.
 */
export function frameModeSvg(plot: FrameModePlot): string {
  const { shape } = plot;
  const head = [`${fmt(plot.frequencyHz, 1)} Hz — ${plot.title}`, plot.name, ...(plot.notes ?? [])];
  const top = head.length * LINE_MM * 1.4 + 8;
  const body: string[] = [];
  let all: Box = EMPTY_BOX;
  head.forEach((t, i) => {
    const size = i === 0 ? HEAD_MM : LINE_MM;
    const y = (i + 1) * LINE_MM * 1.4;
    body.push(svgText(0, y, t, size, { bold: i === 0 }));
    all = unionBox(all, textBox(0, y, t, size, 'start', i === 0));
  });
  let x = 0;
  let footTop = 0;
  const feet: Array<(y: number) => void> = [];
  for (const view of VIEWS) {
    let box: Box = EMPTY_BOX;
    for (const l of [...shape.outlines, ...shape.connectors, ...shape.motors]) {
      for (const p of [...l.rest, ...l.moved]) {
        const [u, v] = view.project(p);
        box = unionBox(box, { x0: u, y0: v, x1: u, y1: v });
      }
    }
    const dx = x - box.x0;
    const dy = top - box.y0;
    const at = (p: Vec3): Vec2 => {
      const [u, v] = view.project(p);
      return [u + dx, v + dy];
    };
    const drawn = (which: 'rest' | 'moved', colour: string, width: number) => [
      `<g id="${view.id}-${which}" fill="none" stroke="${colour}" stroke-width="${width}" stroke-linejoin="round">`,
      ...shape.outlines.map((o) => `<path d="${path(o[which].map(at), true)}"${o.hole ? ` stroke-width="${fmt(width * 0.6, 2)}"` : ''}/>`),
      ...shape.connectors.map((c) => `<path d="${path(c[which].map(at), false)}"/>`),
      ...shape.motors.map((m) => {
        const [b, c] = m[which].map(at);
        return `<path d="${path([b, c], false)}" stroke-width="${fmt(2 * width, 2)}"/><circle cx="${fmt(b[0], 2)}" cy="${fmt(b[1], 2)}" r="2"/>`;
      }),
      '</g>',
    ];
    const viewBox: Box = padBox({ x0: box.x0 + dx, y0: box.y0 + dy, x1: box.x1 + dx, y1: box.y1 + dy }, 2.5);
    const caption = svgText(viewBox.x0, top - 3, view.caption, LINE_MM);
    body.push(`<g id="${view.id}-view">`, caption, ...drawn('rest', REST, 0.35), ...drawn('moved', MOVED, 0.5));
    let covered = unionBox(viewBox, textBox(viewBox.x0, top - 3, view.caption, LINE_MM));
    if (view.front === 'up') {
      // The motors' vertical motion, which a plan view cannot show: up or down, relative to the largest motion.
      const labels = placeLabels(
        shape.motors.map((m) => {
          const dz = (m.moved[0][2] - m.rest[0][2]) / shape.exaggeration;
          return { anchor: at(m.rest[0]), text: `${m.site}, ${dz >= 0 ? 'up' : 'down'} ${fmt(Math.abs(dz), 2)}`, sizeMm: 3, clearMm: 2.5, cls: 'motor-label' };
        }),
      );
      body.push(labelsSvg(labels));
      for (const l of labels) covered = unionBox(covered, l.box);
    }
    body.push('</g>');
    all = unionBox(all, covered);
    footTop = Math.max(footTop, covered.y1 + 5);
    const left = viewBox.x0;
    const span = Math.max(box.x1 - box.x0, box.y1 - box.y0);
    feet.push((y) => {
      const arrow = view.front === 'up' ? frontArrow(left + 3, y) : frontArrow(left, y, 'front', 3, 'right');
      const bar = scaleBar(arrow.box.x1 + 8, y + 2, niceLengthMm(Math.max(1, Math.min(span / 3, 100))));
      body.push(`<g id="${view.id}-foot">`, arrow.svg, bar.svg, '</g>');
      all = unionBox(all, unionBox(arrow.box, bar.box));
    });
    x = covered.x1 + GAP;
  }
  for (const foot of feet) foot(footTop);
  const key = legend(
    all.x0,
    all.y1 + 4,
    [
      { symbol: 'line', colour: REST, label: 'at rest' },
      { symbol: 'line', colour: MOVED, label: `moved by the mode, exaggerated: the largest motion drawn as ${fmt(shape.exaggeration, 0)} mm` },
    ],
    all.x1 - all.x0,
  );
  body.push(key.svg);
  all = unionBox(all, key.box);
  const noteY = all.y1 + 4;
  body.push(svgText(all.x0, noteY, CAUTION, 2.8, { fill: '#444444' }));
  all = unionBox(all, textBox(all.x0, noteY, CAUTION, 2.8));
  return svgDocument(padBox(all, 4), `${plot.title}: ${fmt(plot.frequencyHz, 1)} Hz`, body);
}

import type { Part } from '../geometry/part.js';
import { partBBox } from '../geometry/metrics.js';
import { fmt } from './format.js';
import { padBox, pictureSvg, placeLabels, PLAN_VIEW, unionBox, type Box, type LabelRequest, type LegendEntry } from './picture.js';
import { loopPathData } from './svgPath.js';

/** Extra content for a picture, already in screen space (mapped with PLAN_VIEW): markers, their labels and legend rows. */
export type Annotation = Readonly<{
  body: readonly string[];
  /** Labels still to be placed (with the picture's other labels, so none overlap). */
  labels: readonly LabelRequest[];
  legend: readonly LegendEntry[];
  /** What the body covers, strokes included. */
  box: Box;
  /** Boxes that labels must keep off (the markers themselves). */
  obstacles: readonly Box[];
  notes?: readonly string[];
}>;

export type SvgPartOptions = Readonly<{
  outlineColor?: string;
  innerColor?: string;
  strokeMm?: number;
  /** Markers and labels drawn over the part (see svgFindings). */
  annotation?: Annotation;
  /** A note in the file's description (`<desc>`, e.g. the finding count of a forced build). */
  comment?: string;
}>;

/** The word under a part picture's up arrow: where the part's +x points once assembled. */
export function frontWord(part: Part): string {
  switch (part.role) {
    case 'arm':
      return 'motor end';
    case 'imported':
      return 'drawing +x';
    default:
      return 'front';
  }
}

/**
 * One part as an SVG picture, 1 user unit = 1 mm, in the plan-view convention (part +x up, +y left;
 * for plates that is the frame's front up): outline black, inner contours red, a front arrow, a scale
 * bar, a legend, and any annotation. The cut file is the DXF; this is for people.
 */
export function partToSvg(part: Part, options: SvgPartOptions = {}): string {
  const view = PLAN_VIEW;
  const stroke = options.strokeMm ?? 0.2;
  const outline = options.outlineColor ?? '#000000';
  const inner = options.innerColor ?? '#d00000';
  const a = options.annotation;
  const contentBox = unionBox(padBox(view.mapBox(partBBox(part)), stroke / 2), a?.box ?? padBox(view.mapBox(partBBox(part)), 0));
  const body = [
    `<g class="part" fill="none" stroke-width="${fmt(stroke, 3)}">`,
    `<path id="outline" stroke="${outline}" d="${loopPathData(part.outline, view.map)}"/>`,
    ...part.features.map((f, i) => `<path id="${f.purpose}-${i}" stroke="${inner}" d="${loopPathData(f.loop, view.map)}"/>`),
    '</g>',
    ...(a?.body ?? []),
  ];
  const legend: LegendEntry[] = [
    { symbol: 'line', colour: outline, label: 'outline' },
    ...(part.features.length ? [{ symbol: 'line' as const, colour: inner, label: 'holes, slots, cut-outs' }] : []),
    ...(a?.legend ?? []),
  ];
  return pictureSvg({
    title: part.name,
    heading: `${part.name} — ${fmt(part.thicknessMm, 2)} mm, ×${part.quantity}`,
    body,
    contentBox,
    labels: placeLabels(a?.labels ?? [], a?.obstacles ?? []),
    front: frontWord(part),
    legend,
    notes: [`Part coordinates: +x up, +y left (the DXF has +x to the right).`, ...(a?.notes ?? [])],
    ...(options.comment ? { comment: options.comment } : {}),
  });
}

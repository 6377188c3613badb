import { wrapText } from '../params/textWidth.js';
import { fmt, xmlEscape } from './format.js';
import { EMPTY_BOX, legend, padBox, svgDocument, svgText, textBox, unionBox, type Box, type LegendEntry } from './picture.js';

/** One frame of a size range on the chart. Props in inches; wheelbase mm; mass g; frequencies Hz. */
export type RangeChartPoint = Readonly<{
  label: string;
  propsIn: number;
  wheelbaseMm: number;
  massG: number;
  armFrequencyHz: number;
  requiredHz: number;
  /** The source design (drawn hollow). */
  source: boolean;
}>;

/** The motors' rotation band (low to top) sampled against prop size (from ../analysis/rotation.ts). */
export type RangeChartBandSample = Readonly<{ propsIn: number; lowHz: number; highHz: number }>;

export type RangeChartOptions = Readonly<{ title: string; footer?: readonly string[] }>;

/** Plot area of one panel and the margins round it. mm (one user unit = 1 mm). */
const PLOT_W = 150;
const PLOT_H = 60;
const LEFT = 24;
const RIGHT = 8;
const TOP = 16;
const PANEL_GAP = 26;
const FONT = 3.5;

/**
 * Round tick values covering [lo, hi]: steps of 1, 2 or 5 × 10^n giving about `count` intervals.
 * The axis runs from the tick at or below lo to the tick at or above hi.
 */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
    return niceTicks(lo - pad, hi + pad, count);
  }
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw * 0.999)!;
  const first = Math.floor(lo / step + 1e-9) * step;
  const out: number[] = [];
  for (let v = first; v < hi + step - 1e-9 * step; v += step) out.push(Number(v.toFixed(10)));
  return out;
}

type Series = Readonly<{ name: string; key: string; values: readonly number[]; colour: string; dashed?: boolean }>;

/**
 * The size-range chart: wheelbase, frame mass, and arm first bending frequency with the motors'
 * rotation band, each against prop size, one panel under the other, at one shared prop axis.
 * Every point carries data-series / data-x / data-y attributes so a reader (or a test) can
 * recover the plotted values. Data in, SVG text out; deterministic.
 */
export function rangeChartSvg(points: readonly RangeChartPoint[], band: readonly RangeChartBandSample[], options: RangeChartOptions): string {
  if (points.length === 0) throw new Error('a range chart needs at least one frame');
  const sorted = [...points].sort((a, b) => a.propsIn - b.propsIn || Number(b.source) - Number(a.source));
  const xs = sorted.map((p) => p.propsIn);
  const xTicks = niceTicks(Math.min(...xs, ...band.map((b) => b.propsIn)), Math.max(...xs, ...band.map((b) => b.propsIn)), 6);
  const x0 = xTicks[0];
  const x1 = xTicks[xTicks.length - 1];
  const textW = PLOT_W + LEFT + RIGHT - 2 * 6;
  const title = wrapText(options.title, textW, 5);
  const footer = (options.footer ?? []).flatMap((f) => wrapText(f, textW, FONT - 0.5));
  const head = 8 + title.length * 6;
  const panels: Array<{ title: string; unit: string; series: Series[]; band?: readonly RangeChartBandSample[] }> = [
    { title: 'Wheelbase', unit: 'mm', series: [{ name: 'wheelbase', key: 'wheelbase', values: sorted.map((p) => p.wheelbaseMm), colour: '#1f5fa8' }] },
    { title: 'Frame mass (plates)', unit: 'g', series: [{ name: 'mass', key: 'mass', values: sorted.map((p) => p.massG), colour: '#8a4b08' }] },
    {
      title: 'Arm first bending frequency and the motors\u2019 rotation band',
      unit: 'Hz',
      series: [
        { name: 'arm f1', key: 'arm-f1', values: sorted.map((p) => p.armFrequencyHz), colour: '#0b7a3b' },
        { name: 'f1 the size rule asks', key: 'required-f1', values: sorted.map((p) => p.requiredHz), colour: '#555555', dashed: true },
      ],
      band,
    },
  ];
  const panelH = TOP + PLOT_H + PANEL_GAP;
  // Everything drawn widens `drawn`; the viewBox is that box plus a margin (the picture convention).
  let drawn: Box = EMPTY_BOX;
  const out: string[] = [];
  const text = (x: number, y: number, t: string, size: number, anchor: 'start' | 'middle' | 'end' = 'start', bold = false): void => {
    out.push(svgText(x, y, t, size, { anchor, bold }));
    drawn = unionBox(drawn, textBox(x, y, t, size, anchor, bold));
  };
  title.forEach((t, i) => text(6, 9 + i * 6, t, 5));
  panels.forEach((panel, pi) => {
    const top = head + pi * panelH + TOP;
    const bottom = top + PLOT_H;
    const all = [...panel.series.flatMap((s) => s.values), ...(panel.band ?? []).flatMap((b) => [b.lowHz, b.highHz])];
    const yTicks = niceTicks(Math.min(...all), Math.max(...all), 5);
    const y0 = yTicks[0];
    const y1 = yTicks[yTicks.length - 1];
    const X = (v: number) => LEFT + ((v - x0) / (x1 - x0)) * PLOT_W;
    const Y = (v: number) => bottom - ((v - y0) / (y1 - y0)) * PLOT_H;
    out.push(`<g id="panel-${pi + 1}">`);
    text(LEFT, top - 5, `${panel.title} [${panel.unit}]`, FONT + 0.5, 'start', true);
    for (const t of yTicks) {
      out.push(`<line class="grid-y" data-value="${fmt(t, 6)}" x1="${fmt(LEFT, 3)}" y1="${fmt(Y(t), 3)}" x2="${fmt(LEFT + PLOT_W, 3)}" y2="${fmt(Y(t), 3)}" stroke="#dddddd" stroke-width="0.2"/>`);
      out.push(`<text class="tick-y" data-value="${fmt(t, 6)}" x="${fmt(LEFT - 1.5, 3)}" y="${fmt(Y(t) + 1.2, 3)}" font-size="${FONT}" text-anchor="end">${fmt(t, 6)}</text>`);
      drawn = unionBox(drawn, textBox(LEFT - 1.5, Y(t) + 1.2, fmt(t, 6), FONT, 'end'));
    }
    for (const t of xTicks) {
      out.push(`<line class="grid-x" data-value="${fmt(t, 6)}" x1="${fmt(X(t), 3)}" y1="${fmt(top, 3)}" x2="${fmt(X(t), 3)}" y2="${fmt(bottom, 3)}" stroke="#eeeeee" stroke-width="0.2"/>`);
      out.push(`<text class="tick-x" data-value="${fmt(t, 6)}" x="${fmt(X(t), 3)}" y="${fmt(bottom + 5, 3)}" font-size="${FONT}" text-anchor="middle">${fmt(t, 6)}</text>`);
      drawn = unionBox(drawn, textBox(X(t), bottom + 5, fmt(t, 6), FONT, 'middle'));
    }
    text(LEFT + PLOT_W / 2, bottom + 10, 'prop diameter [in]', FONT, 'middle');
    if (panel.band && panel.band.length > 1) {
      const upper = panel.band.map((b) => `${fmt(X(b.propsIn), 3)},${fmt(Y(b.highHz), 3)}`);
      const lower = [...panel.band].reverse().map((b) => `${fmt(X(b.propsIn), 3)},${fmt(Y(b.lowHz), 3)}`);
      out.push(`<polygon class="band" points="${[...upper, ...lower].join(' ')}" fill="#f4a261" fill-opacity="0.35" stroke="none"><title>motors' rotation band (30 % of the top speed up to the top)</title></polygon>`);
    }
    for (const s of panel.series) {
      const pts = sorted.map((p, i) => [X(p.propsIn), Y(s.values[i])] as const);
      out.push(`<polyline points="${pts.map((q) => `${fmt(q[0], 3)},${fmt(q[1], 3)}`).join(' ')}" fill="none" stroke="${s.colour}" stroke-width="0.5"${s.dashed ? ' stroke-dasharray="2 1.5"' : ''}/>`);
      sorted.forEach((p, i) => {
        const [cx, cy] = pts[i];
        out.push(`<circle class="point" data-series="${s.key}" data-x="${fmt(p.propsIn, 6)}" data-y="${fmt(s.values[i], 6)}" cx="${fmt(cx, 3)}" cy="${fmt(cy, 3)}" r="1.2" fill="${p.source ? '#ffffff' : s.colour}" stroke="${s.colour}" stroke-width="0.4"><title>${xmlEscape(`${p.label}: ${s.name} ${fmt(s.values[i], 1)} ${panel.unit}`)}</title></circle>`);
      });
    }
    // Legend under the axis title: a row per series and the band (the shared legend of every picture).
    const rows: LegendEntry[] = [
      ...panel.series.map((s) => ({ symbol: 'line' as const, colour: s.colour, label: s.name, ...(s.dashed ? { dash: '2 1.5' } : {}) })),
      ...(panel.band ? [{ symbol: 'fill' as const, colour: '#f4a261', opacity: 0.35, label: "motors' rotation band" }] : []),
      ...(sorted.some((p) => p.source) ? [{ symbol: 'ring' as const, colour: '#555555', opacity: 0, label: 'hollow point: the source design' }] : []),
    ];
    const lg = legend(LEFT, bottom + 12.5, rows, PLOT_W, FONT - 0.5);
    out.push(lg.svg);
    out.push(`<rect x="${fmt(LEFT, 3)}" y="${fmt(top, 3)}" width="${fmt(PLOT_W, 3)}" height="${fmt(PLOT_H, 3)}" fill="none" stroke="#000000" stroke-width="0.3"/>`);
    out.push('</g>');
    // The plot frame, and the points on its edges (radius 1.2 mm, stroke 0.4 mm).
    drawn = unionBox(unionBox(drawn, lg.box), padBox({ x0: LEFT, y0: top, x1: LEFT + PLOT_W, y1: bottom }, 1.4));
  });
  let fy = drawn.y1 + 2 + FONT;
  for (const line of footer) {
    text(6, fy, line, FONT - 0.5);
    fy += 4.2;
  }
  return svgDocument(padBox(drawn, 4), options.title, out);
}

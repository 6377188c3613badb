import { fmt, xmlEscape } from './format.js';

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

/** The motors' top rotation band sampled against prop size (from ../analysis/rotation.ts). */
export type RangeChartBandSample = Readonly<{ propsIn: number; lowHz: number; highHz: number }>;

export type RangeChartOptions = Readonly<{ title: string; footer?: readonly string[] }>;

/** Plot area of one panel and the margins round it. mm (one user unit = 1 mm). */
const PLOT_W = 150;
const PLOT_H = 60;
const LEFT = 24;
const RIGHT = 8;
const TOP = 16;
const PANEL_GAP = 22;
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

/** Average advance of a sans-serif character, as a fraction of the font size (about half an em). */
const CHAR_EM = 0.55;

/** Break text at spaces into lines that fit `widthMm` at `fontMm` (a word longer than a line keeps its own line). */
export function wrapText(text: string, widthMm: number, fontMm: number): string[] {
  const max = Math.max(10, Math.floor(widthMm / (CHAR_EM * fontMm)));
  return (text.match(new RegExp(`\\S.{0,${max - 1}}(?=\\s|$)|\\S+`, 'g')) ?? []).map((l) => l.trim());
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
  const W = LEFT + PLOT_W + RIGHT;
  const H = head + panels.length * panelH + footer.length * 4.2 + 6;
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(W, 3)}mm" height="${fmt(H, 3)}mm" viewBox="0 0 ${fmt(W, 3)} ${fmt(H, 3)}" font-family="sans-serif">`,
    `<title>${xmlEscape(options.title)}</title>`,
    `<rect width="${fmt(W, 3)}" height="${fmt(H, 3)}" fill="#ffffff"/>`,
    ...title.map((t, i) => `<text x="6" y="${fmt(9 + i * 6, 3)}" font-size="5">${xmlEscape(t)}</text>`),
  ];
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
    out.push(`<text x="${fmt(LEFT, 3)}" y="${fmt(top - 5, 3)}" font-size="${FONT + 0.5}" font-weight="bold">${xmlEscape(`${panel.title} [${panel.unit}]`)}</text>`);
    for (const t of yTicks) {
      out.push(`<line class="grid-y" data-value="${fmt(t, 6)}" x1="${fmt(LEFT, 3)}" y1="${fmt(Y(t), 3)}" x2="${fmt(LEFT + PLOT_W, 3)}" y2="${fmt(Y(t), 3)}" stroke="#dddddd" stroke-width="0.2"/>`);
      out.push(`<text class="tick-y" data-value="${fmt(t, 6)}" x="${fmt(LEFT - 1.5, 3)}" y="${fmt(Y(t) + 1.2, 3)}" font-size="${FONT}" text-anchor="end">${fmt(t, 6)}</text>`);
    }
    for (const t of xTicks) {
      out.push(`<line class="grid-x" data-value="${fmt(t, 6)}" x1="${fmt(X(t), 3)}" y1="${fmt(top, 3)}" x2="${fmt(X(t), 3)}" y2="${fmt(bottom, 3)}" stroke="#eeeeee" stroke-width="0.2"/>`);
      out.push(`<text class="tick-x" data-value="${fmt(t, 6)}" x="${fmt(X(t), 3)}" y="${fmt(bottom + 5, 3)}" font-size="${FONT}" text-anchor="middle">${fmt(t, 6)}</text>`);
    }
    out.push(`<text x="${fmt(LEFT + PLOT_W / 2, 3)}" y="${fmt(bottom + 10, 3)}" font-size="${FONT}" text-anchor="middle">prop diameter [in]</text>`);
    if (panel.band && panel.band.length > 1) {
      const upper = panel.band.map((b) => `${fmt(X(b.propsIn), 3)},${fmt(Y(b.highHz), 3)}`);
      const lower = [...panel.band].reverse().map((b) => `${fmt(X(b.propsIn), 3)},${fmt(Y(b.lowHz), 3)}`);
      out.push(`<polygon class="band" points="${[...upper, ...lower].join(' ')}" fill="#f4a261" fill-opacity="0.35" stroke="none"><title>motors' top rotation band</title></polygon>`);
    }
    for (const s of panel.series) {
      const pts = sorted.map((p, i) => [X(p.propsIn), Y(s.values[i])] as const);
      out.push(`<polyline points="${pts.map((q) => `${fmt(q[0], 3)},${fmt(q[1], 3)}`).join(' ')}" fill="none" stroke="${s.colour}" stroke-width="0.5"${s.dashed ? ' stroke-dasharray="2 1.5"' : ''}/>`);
      sorted.forEach((p, i) => {
        const [cx, cy] = pts[i];
        out.push(`<circle class="point" data-series="${s.key}" data-x="${fmt(p.propsIn, 6)}" data-y="${fmt(s.values[i], 6)}" cx="${fmt(cx, 3)}" cy="${fmt(cy, 3)}" r="1.2" fill="${p.source ? '#ffffff' : s.colour}" stroke="${s.colour}" stroke-width="0.4"><title>${xmlEscape(`${p.label}: ${s.name} ${fmt(s.values[i], 1)} ${panel.unit}`)}</title></circle>`);
      });
    }
    // Legend, top right of the plot.
    const legend = [...panel.series.map((s) => ({ text: s.name, colour: s.colour, dashed: s.dashed ?? false, box: false })), ...(panel.band ? [{ text: "motors' top rotation band", colour: '#f4a261', dashed: false, box: true }] : [])];
    legend.forEach((l, i) => {
      const ly = top + 4 + i * 4.5;
      const lx = LEFT + PLOT_W - 62;
      out.push(l.box
        ? `<rect x="${fmt(lx, 3)}" y="${fmt(ly - 2, 3)}" width="6" height="3" fill="${l.colour}" fill-opacity="0.35"/>`
        : `<line x1="${fmt(lx, 3)}" y1="${fmt(ly - 0.5, 3)}" x2="${fmt(lx + 6, 3)}" y2="${fmt(ly - 0.5, 3)}" stroke="${l.colour}" stroke-width="0.5"${l.dashed ? ' stroke-dasharray="2 1.5"' : ''}/>`);
      out.push(`<text x="${fmt(lx + 8, 3)}" y="${fmt(ly + 0.7, 3)}" font-size="${FONT - 0.5}">${xmlEscape(l.text)}</text>`);
    });
    out.push(`<rect x="${fmt(LEFT, 3)}" y="${fmt(top, 3)}" width="${fmt(PLOT_W, 3)}" height="${fmt(PLOT_H, 3)}" fill="none" stroke="#000000" stroke-width="0.3"/>`);
    out.push('</g>');
  });
  footer.forEach((line, i) => out.push(`<text x="6" y="${fmt(H - 4 - (footer.length - 1 - i) * 4.2, 3)}" font-size="${FONT - 0.5}">${xmlEscape(line)}</text>`));
  out.push('</svg>', '');
  return out.join('\n');
}

import type { Frame } from '../geometry/frame.js';
import { loopBBox, transformLoop, unionBBox } from '../geometry/loop.js';
import { partBBox } from '../geometry/metrics.js';
import type { Part } from '../geometry/part.js';
import type { BBox, Loop, Vec2 } from '../geometry/types.js';
import { fmt, xmlEscape } from './format.js';
import { loopPathData } from './svgPath.js';

/** One column of the range sheet: a frame and the text printed under its plan view. */
export type RangeSheetMember = Readonly<{ label: string; notes: readonly string[]; frame: Frame }>;

export type RangeSheetOptions = Readonly<{
  title: string;
  /** Gap between columns and rows. mm. */
  gapMm?: number;
  /** Lines printed at the foot of the sheet (cautions). */
  footer?: readonly string[];
}>;

const FONT_MM = 4;
const LINE_MM = 5.5;

/** Plan-view loops of every flat plate copy, in frame coordinates (x forward, y left). */
function planLoops(frame: Frame): Loop[] {
  const out: Loop[] = [];
  for (const part of frame.parts) {
    for (const pl of part.placements) {
      if (pl.vertical) continue;
      out.push(transformLoop(part.outline, { rotateRad: pl.rotateRad, translate: pl.translateMm, mirrorY: pl.mirrorY }));
    }
  }
  return out;
}

/** Plates drawn flat under the plan view: one copy of each, largest first. */
const flatParts = (frame: Frame): Part[] => [...frame.parts].filter((p) => p.role !== 'camera-side');

/**
 * The range sheet: every size of a size range side by side at one scale (one user unit = 1 mm), each column
 * holding the plan view of the assembled frame (forward up, prop discs dashed), its notes, and each
 * flat plate drawn in its own coordinates below. Data in, SVG text out; deterministic.
 */
export function rangeSheetSvg(members: readonly RangeSheetMember[], options: RangeSheetOptions): string {
  const gap = options.gapMm ?? 15;
  type Column = { member: RangeSheetMember; plan: Loop[]; planBox: BBox; parts: Array<{ part: Part; box: BBox }>; width: number; height: number };
  const columns: Column[] = members.map((member) => {
    const plan = planLoops(member.frame);
    const r = member.frame.propDiameterMm / 2;
    let box: BBox = [Infinity, Infinity, -Infinity, -Infinity];
    for (const l of plan) box = unionBBox(box, loopBBox(l));
    for (const s of member.frame.sites) box = unionBBox(box, [s.motorMm[0] - r, s.motorMm[1] - r, s.motorMm[0] + r, s.motorMm[1] + r]);
    const parts = flatParts(member.frame).map((part) => ({ part, box: partBBox(part) }));
    // Plan view is drawn forward-up: its screen width is the frame's y extent.
    const width = Math.max(box[3] - box[1], ...parts.map((p) => p.box[2] - p.box[0]));
    const height = box[2] - box[0] + (member.notes.length + 1) * LINE_MM + parts.reduce((a, p) => a + (p.box[3] - p.box[1]) + LINE_MM + gap / 2, 0);
    return { member, plan, planBox: box, parts, width, height };
  });
  const headerH = 12;
  const footer = options.footer ?? [];
  const W = columns.reduce((a, c) => a + c.width + gap, gap);
  const H = headerH + Math.max(0, ...columns.map((c) => c.height)) + gap + footer.length * LINE_MM + gap;
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(W, 3)}mm" height="${fmt(H, 3)}mm" viewBox="0 0 ${fmt(W, 3)} ${fmt(H, 3)}" font-family="sans-serif">`,
    `<title>${xmlEscape(options.title)}</title>`,
    `<rect width="${fmt(W, 3)}" height="${fmt(H, 3)}" fill="#ffffff"/>`,
    `<text x="${fmt(gap, 3)}" y="${fmt(headerH - 3, 3)}" font-size="6">${xmlEscape(options.title)} — one scale, 1 unit = 1 mm</text>`,
  ];
  let x = gap;
  for (const c of columns) {
    const box = c.planBox;
    const cx = x + c.width / 2;
    const planW = box[3] - box[1];
    const left = cx - planW / 2;
    let y = headerH + gap / 2;
    // Screen X = left + (maxY − y), screen Y = top + (maxX − x): forward up, left on the left.
    const top = y;
    const map = (p: Vec2): Vec2 => [left + (box[3] - p[1]), top + (box[2] - p[0])];
    const r = c.member.frame.propDiameterMm / 2;
    out.push(`<g id="${xmlEscape(slugId(c.member.label))}">`);
    for (const s of c.member.frame.sites) {
      const p = map(s.motorMm);
      out.push(`<circle cx="${fmt(p[0], 3)}" cy="${fmt(p[1], 3)}" r="${fmt(r, 3)}" fill="#9ecbff" fill-opacity="0.2" stroke="#3b82c4" stroke-width="0.4" stroke-dasharray="3 2"/>`);
    }
    out.push(`<path d="${c.plan.map((l) => loopPathData(l, map)).join(' ')}" fill="#3a3f47" fill-opacity="0.8" stroke="#000000" stroke-width="0.25"/>`);
    y = top + (box[2] - box[0]) + LINE_MM;
    out.push(`<text x="${fmt(cx, 3)}" y="${fmt(y, 3)}" font-size="${FONT_MM + 1}" text-anchor="middle" font-weight="bold">${xmlEscape(c.member.label)}</text>`);
    for (const n of c.member.notes) {
      y += LINE_MM;
      out.push(`<text x="${fmt(cx, 3)}" y="${fmt(y, 3)}" font-size="${FONT_MM}" text-anchor="middle">${xmlEscape(n)}</text>`);
    }
    for (const { part, box: pb } of c.parts) {
      y += gap / 2 + LINE_MM;
      out.push(`<text x="${fmt(cx, 3)}" y="${fmt(y - 1.5, 3)}" font-size="${FONT_MM - 0.5}" text-anchor="middle">${xmlEscape(`${part.name} ×${part.quantity}, ${fmt(part.thicknessMm, 2)} mm`)}</text>`);
      const pw = pb[2] - pb[0];
      const px = cx - pw / 2;
      const py = y;
      const pmap = (p: Vec2): Vec2 => [px + (p[0] - pb[0]), py + (pb[3] - p[1])];
      const d = [part.outline, ...part.features.map((f) => f.loop)].map((l) => loopPathData(l, pmap)).join(' ');
      out.push(`<path d="${d}" fill="#566070" fill-opacity="0.85" fill-rule="evenodd" stroke="#000000" stroke-width="0.2"><title>${xmlEscape(part.name)}</title></path>`);
      y += pb[3] - pb[1];
    }
    out.push('</g>');
    x += c.width + gap;
  }
  let fy = H - gap / 2 - (footer.length - 1) * LINE_MM;
  for (const line of footer) {
    out.push(`<text x="${fmt(gap, 3)}" y="${fmt(fy, 3)}" font-size="${FONT_MM - 0.5}">${xmlEscape(line)}</text>`);
    fy += LINE_MM;
  }
  out.push('</svg>', '');
  return out.join('\n');
}

const slugId = (s: string): string => `size-${s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '')}`;

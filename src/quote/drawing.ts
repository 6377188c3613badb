import { partBBox, type BBox, type Part, type Vec2 } from '../geometry/index.js';
import type { HardwareList } from '../assembly/types.js';
import type { Quote } from './quote.js';

/**
 * Everything the drawing sheets show, computed here so the PDF and SVG writers only lay it out:
 * the scale, the dimension values and where they attach, the hole tables, the cost tables, the notes.
 */

/** The area a part view may fill on an A4 landscape sheet, in paper mm; both writers use it. */
export const DRAWING_VIEW_MM = { width: 140, height: 95 } as const;

/** Preferred drawing scales (ISO 5455), largest first: paper mm per part mm. */
export const DRAWING_SCALES: readonly { factor: number; label: string }[] = [
  { factor: 5, label: '5:1' },
  { factor: 2, label: '2:1' },
  { factor: 1, label: '1:1' },
  { factor: 0.5, label: '1:2' },
  { factor: 0.2, label: '1:5' },
  { factor: 0.1, label: '1:10' },
];

/**
 * A linear dimension between two points of the part, measured along one axis, drawn on a dimension
 * line `level` steps away from the part (side: below for x, left for y; negative levels go above / right).
 */
export type Dimension = Readonly<{
  axis: 'x' | 'y';
  fromMm: Vec2;
  toMm: Vec2;
  valueMm: number;
  text: string;
  level: number;
}>;

export type TableRow = readonly string[];
export type Table = Readonly<{ title: string; header: TableRow; rows: readonly TableRow[] }>;

export type PartSheet = Readonly<{
  kind: 'part';
  part: Part;
  title: string;
  bboxMm: BBox;
  scale: { factor: number; label: string };
  dimensions: readonly Dimension[];
  facts: readonly (readonly [string, string])[];
  holeTable: Table;
  cutTable: Table;
  /** Angle of the 0° fibre direction on the drawing (part coordinates). deg. */
  weaveDeg: number;
}>;

export type SummarySheet = Readonly<{
  kind: 'summary';
  title: string;
  tables: readonly Table[];
  /** One row per nested sheet: its utilisation (part area / sheet area). */
  sheetRows: Table;
  lines: readonly string[];
}>;

/** The hardware list of the assembled frame, counted for the quoted batch. */
export type HardwareSheet = Readonly<{ kind: 'hardware'; title: string; table: Table; lines: readonly string[] }>;

export type DrawingSheet = PartSheet | SummarySheet | HardwareSheet;

export type DrawingSet = Readonly<{
  design: string;
  revision: string;
  /** As given on the command line or in the design; never read from the clock here. */
  date: string | null;
  shop: string;
  generalTolerance: string;
  /** The design-rule check summary, or null when the checks were not run. */
  checks: Readonly<{ errors: number; warnings: number }> | null;
  safetyNotes: readonly string[];
  sheets: readonly DrawingSheet[];
}>;

export const SAFETY_NOTES: readonly string[] = [
  'Carbon dust is respirable and conducts electricity: cut wet or with on-tool extraction (H-class/HEPA), wear a P3/P100 respirator and eye protection, seal nearby electronics, vacuum - never blow - clean.',
  'Test a new frame with the props off first; inspect plates after every crash.',
  'Times, prices, masses and structural figures are estimates, not a certification; local regulations and the shop\'s own practice apply.',
];

export type DrawingOptions = Readonly<{
  design: string;
  revision: string;
  date: string | null;
  generalTolerance?: string;
  checks: Readonly<{ errors: number; warnings: number }> | null;
  /** The frame's hardware list; when given, a sheet lists it counted for the quoted batch. */
  hardware?: HardwareList;
}>;

const mm = (x: number, d = 1): string => {
  const s = x.toFixed(d);
  return s === `-${(0).toFixed(d)}` ? (0).toFixed(d) : s;
};
const money = (x: number): string => x.toFixed(2);
const minutes = (x: number): string => x.toFixed(1);

function hardwareSheet(list: HardwareList, frames: number): HardwareSheet {
  return {
    kind: 'hardware',
    title: 'hardware',
    table: {
      title: `Hardware for ${frames} frame${frames === 1 ? '' : 's'}`,
      header: ['item', 'standard', 'size', 'length mm', 'per frame', 'batch', 'use'],
      rows: list.items.map((i) => [i.item, i.standard, i.size, i.lengthMm === null ? '-' : String(i.lengthMm), String(i.count), String(i.count * frames), i.use]),
    },
    lines: ['Screw lengths from the ISO 4762 preferred series; see hardware.csv from framewright build for the same list.'],
  };
}

/**
 * The drawing sheets for a quote: one per part (view at a stated scale, overall dimensions, key
 * hole positions from the lower-left corner of the part's extent, hole table, cut data and its cost)
 * and a summary sheet (parts, sheets and utilisation, time and cost breakdown, per frame and batch).
 */
export function drawingSet(parts: readonly Part[], quote: Quote, options: DrawingOptions): DrawingSet {
  const cur = quote.currency;
  const partSheets: PartSheet[] = parts.map((part, i) => {
    const q = quote.parts[i];
    const bbox = partBBox(part);
    const w = bbox[2] - bbox[0];
    const h = bbox[3] - bbox[1];
    const holeRows: TableRow[] = q.cut.holes.map((r) => [
      `${r.count} x`,
      `${mm(r.diameterMm, 2)}`,
      r.screw ?? '-',
      r.finish === 'countersunk' ? `countersunk to ${mm(r.countersinkHeadMm ?? 0, 2)}, 90 deg` : 'through',
    ]);
    const others = part.features.filter((f) => f.kind !== 'hole' || f.diameterMm === undefined);
    if (others.length) holeRows.push([`${others.length} x`, '-', '-', 'slots and cut-outs as drawn']);
    const copies = part.quantity * quote.frames;
    return {
      kind: 'part',
      part,
      title: part.name,
      bboxMm: bbox,
      scale: chooseScale(w, h),
      dimensions: partDimensions(part, bbox),
      facts: [
        ['material', `${part.material.name}, woven 0/90 carbon/epoxy`],
        ['thickness', `${mm(part.thicknessMm, 2)} mm`],
        ['weave', `0 deg fibres at ${mm(q.cut.weaveDeg, 0)} deg to part x (arrow)`],
        ['quantity', `${part.quantity} per frame, ${copies} for ${quote.frames} frame${quote.frames === 1 ? '' : 's'}`],
        ['size', `${mm(w)} x ${mm(h)} mm`],
        ['area, mass', `${mm(q.cut.areaMm2, 0)} mm2, ${mm(q.cut.massG, 1)} g each`],
      ],
      holeTable: { title: 'Hole table', header: ['count', 'diameter mm', 'screw', 'finish'], rows: holeRows },
      cutTable: {
        title: `Cut data and cost per copy (${q.cut.toolDiameterMm} mm tool)`,
        header: ['item', 'value'],
        rows: [
          ['contour length as drawn', `${mm(q.cut.drawnLengthMm)} mm`],
          ['tool-centre path', `${mm(q.cut.toolPathMm)} mm x ${q.time.passes} pass${q.time.passes === 1 ? '' : 'es'}`],
          ['pierces (profiled + drilled)', `${q.cut.pierces} (${q.cut.profiled} + ${q.cut.drilled})`],
          ...(q.cut.tooNarrow ? [['narrower than the tool', `${q.cut.tooNarrow} (not priced)`]] : []),
          ['machine time', `${minutes(q.time.totalMin)} min`],
          ['machine / material / tool wear', `${money(q.cost.machine)} / ${money(q.cost.material)} / ${money(q.cost.tooling)} ${cur}`],
          ['direct cost', `${money(q.cost.total)} ${cur}`],
        ],
      },
      weaveDeg: q.cut.weaveDeg,
    };
  });
  const t = quote.batchTime;
  const c = quote.batchCost;
  const summary: SummarySheet = {
    kind: 'summary',
    title: 'summary',
    tables: [
      {
        title: 'Parts',
        header: ['part', 'per frame', 'total', 'thickness mm', 'tool path mm', 'pierces', 'time min', `direct each ${cur}`, `direct all ${cur}`],
        rows: quote.parts.map((p) => {
          const n = p.cut.quantity * quote.frames;
          return [p.cut.name, String(p.cut.quantity), String(n), mm(p.cut.thicknessMm, 2), mm(p.cut.toolPathMm), String(p.cut.pierces), minutes(p.time.totalMin), money(p.cost.total), money(p.cost.total * n)];
        }),
      },
      {
        title: 'Sheets',
        header: ['thickness mm', 'sheet mm', 'sheets', 'fewest possible', 'utilisation', `price each ${cur}`, `material ${cur}`],
        rows: quote.sheetCosts.map((s) => {
          const g = quote.nesting.groups.find((x) => x.thicknessMm === s.thicknessMm && x.material === s.material)!;
          return [mm(s.thicknessMm, 2), `${mm(s.widthMm, 0)} x ${mm(s.heightMm, 0)}`, String(s.sheets), String(g.lowerBoundSheets), `${mm(g.utilisation * 100, 1)} %`, money(s.pricePerSheet), money(s.cost)];
        }),
      },
      {
        title: `Batch of ${quote.frames} frame${quote.frames === 1 ? '' : 's'}`,
        header: ['item', 'time min', `cost ${cur}`],
        rows: [
          ['cutting', minutes(t.cutMin), ''],
          ['plunges', minutes(t.plungeMin), ''],
          ['rapids', minutes(t.rapidMin), ''],
          ['non-cutting allowance', minutes(t.allowanceMin), ''],
          ['machine time', minutes(t.cutMin + t.plungeMin + t.rapidMin + t.allowanceMin), money(c.machine)],
          ['setup and sheet handling', minutes(t.setupMin), ''],
          [`tool changes (${quote.toolChanges})`, minutes(t.toolChangeMin), ''],
          ['setup and tool changes', minutes(t.setupMin + t.toolChangeMin), money(c.setup)],
          ['material (whole sheets)', '', money(c.material)],
          ['tool wear', '', money(c.tooling)],
          ['subtotal', minutes(t.totalMin), money(c.subtotal)],
          ['margin', '', money(c.margin)],
          ['total', minutes(t.totalMin), money(c.total)],
          ['per frame', minutes(quote.perFrame.timeMin), money(quote.perFrame.cost)],
          [
            'per frame: material / machine / setup',
            '',
            `${money(quote.perFrame.breakdown.material)} / ${money(quote.perFrame.breakdown.machine)} / ${money(quote.perFrame.breakdown.setup)}`,
          ],
        ],
      },
    ],
    sheetRows: {
      title: 'Sheet layouts (files sheets/sheet-NN-*)',
      header: ['sheet', 'thickness mm', 'parts', 'utilisation'],
      rows: quote.nesting.sheets.map((sh, i) => [String(i + 1).padStart(2, '0'), mm(sh.thicknessMm, 2), String(sh.placements.length), `${mm(sh.utilisation * 100, 1)} %`]),
    },
    lines: [
      `Quoted for ${quote.shopName}; ${quote.toolDiameterMm} mm end mill; part spacing ${mm(quote.nesting.spacingMm, 2)} mm, sheet margin ${mm(quote.nesting.marginMm, 1)} mm.`,
      `Frame mass (plates only): ${mm(quote.perFrame.massG, 1)} g.`,
      ...quote.warnings.map((w) => `Note: ${w}`),
    ],
  };
  const all: DrawingSheet[] = [summary, ...(options.hardware ? [hardwareSheet(options.hardware, quote.frames)] : []), ...partSheets];
  return {
    design: options.design,
    revision: options.revision,
    date: options.date,
    shop: quote.shopName,
    generalTolerance: options.generalTolerance ?? 'ISO 2768-m unless stated',
    checks: options.checks,
    safetyNotes: SAFETY_NOTES,
    sheets: all,
  };
}

/** The largest preferred scale at which the part fits the view area. */
export function chooseScale(widthMm: number, heightMm: number): { factor: number; label: string } {
  for (const s of DRAWING_SCALES) {
    if (widthMm * s.factor <= DRAWING_VIEW_MM.width && heightMm * s.factor <= DRAWING_VIEW_MM.height) return s;
  }
  return DRAWING_SCALES[DRAWING_SCALES.length - 1];
}

/** Most key positions shown per axis; beyond that, evenly chosen ones including both extremes. */
const MAX_KEY_POSITIONS = 6;

/**
 * Overall width and height, and the positions of the round holes' centres measured from the lower
 * left corner of the part's extent (x positions above the part, y positions to its right).
 */
export function partDimensions(part: Part, bbox: BBox = partBBox(part)): Dimension[] {
  const [x0, y0, x1, y1] = bbox;
  const dims: Dimension[] = [
    { axis: 'x', fromMm: [x0, y0], toMm: [x1, y0], valueMm: x1 - x0, text: mm(x1 - x0), level: 1 },
    { axis: 'y', fromMm: [x0, y0], toMm: [x0, y1], valueMm: y1 - y0, text: mm(y1 - y0), level: 1 },
  ];
  const centres = part.features.filter((f) => f.kind === 'hole' && f.centerMm).map((f) => f.centerMm!);
  const pick = (values: number[]): number[] => {
    const uniq = [...new Set(values.map((v) => Math.round(v * 100) / 100))].sort((a, b) => a - b);
    if (uniq.length <= MAX_KEY_POSITIONS) return uniq;
    return Array.from({ length: MAX_KEY_POSITIONS }, (_, k) => uniq[Math.round((k * (uniq.length - 1)) / (MAX_KEY_POSITIONS - 1))]);
  };
  pick(centres.map((c) => c[0])).forEach((x, k) => {
    const c = centres.find((p) => Math.abs(p[0] - x) < 0.006)!;
    dims.push({ axis: 'x', fromMm: [x0, y1], toMm: [c[0], c[1]], valueMm: c[0] - x0, text: mm(c[0] - x0), level: -(k + 1) });
  });
  pick(centres.map((c) => c[1])).forEach((y, k) => {
    const c = centres.find((p) => Math.abs(p[1] - y) < 0.006)!;
    dims.push({ axis: 'y', fromMm: [x1, y0], toMm: [c[0], c[1]], valueMm: c[1] - y0, text: mm(c[1] - y0), level: -(k + 1) });
  });
  return dims;
}
